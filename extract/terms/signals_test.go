package terms

import (
	"math"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/extract/termstat"
	"glossmith/extract/wordfreq"
	"glossmith/tagger/doc"
	"glossmith/tagger/tokenize"
)

// A word a label mostly follows is a document-structure word: on invented
// greenhouse-controller text, "figure" (always before a number) and
// "table" (before a number or a letter) fall far below the default
// list's cut-off, while "dripper", as frequent and as rare in general
// language but never before a label, stays in it; a word before a label
// now and then ("valve 2") keeps most of its score.
func TestStructureWordsAreDemoted(t *testing.T) {
	var b strings.Builder
	for i := range 8 {
		n := string(rune('1' + i))
		b.WriteString("The dripper of the greenhouse is shown in figure " + n + ". ")
		b.WriteString("The dripper spacing is listed in table " + n + ". ")
		b.WriteString("The valve opens when the dripper runs dry. ")
	}
	b.WriteString("The fittings in table B are brass. Close valve 2 before the flush. ")
	ts := extractTexts(t, b.String())
	ranked, err := Rank(ts, RankOptions{All: true})
	require.NoError(t, err)
	figure, table, dripper, valve := find(ranked, "figure"), find(ranked, "table"), find(ranked, "dripper"), find(ranked, "valve")
	for name, x := range map[string]*Term{"figure": figure, "table": table, "dripper": dripper, "valve": valve} {
		require.NotNil(t, x, "%s: %v", name, names(ts))
	}
	assert.InDelta(t, 8.0/9, figure.labelShare, 1e-9, "8 uses, all before a number (one use added)")
	assert.InDelta(t, 9.0/10, table.labelShare, 1e-9, "before a number or a capital letter")
	assert.Zero(t, dripper.labelShare)
	assert.InDelta(t, 1.0/10, valve.labelShare, 1e-9)
	assert.Less(t, figure.Score, 0.01, "figure: nothing left of its specificity")
	assert.Less(t, table.Score, 0.01)
	assert.Greater(t, dripper.Score, Cutoff)
	// Weirdness is still the word's own: the damping acts on the score.
	assert.Greater(t, figure.Weirdness, 1.0)
	assert.InDelta(t, math.Log1p(float64(valve.Freq))*math.Log(valve.Weirdness)*math.Pow(0.9, 16), valve.Score, 1e-9)
}

// isLabel: numbers, single capitals (not the article "A" or the pronoun
// "I"), and short Roman numerals.
func TestIsLabel(t *testing.T) {
	for _, c := range []struct {
		form, upos string
		want       bool
	}{
		{"3", "NUM", true}, {"4.1", "NUM", true}, {"2a", "NUM", true},
		{"B", "PROPN", true}, {"IV", "PROPN", true}, {"xii", "NUM", true},
		{"A", "DET", false}, {"I", "PRON", false}, {"I", "NUM", true},
		{"valve", "NOUN", false}, {"AC", "PROPN", false}, {"XIIII", "X", false}, {"", "X", false},
	} {
		tok := doc.Token{Form: c.form, UPOS: c.upos}
		assert.Equal(t, c.want, isLabel(&tok), "%q/%s", c.form, c.upos)
	}
}

// The blend's relative frequency of a word is the geometric mean of its
// two smoothed relative frequencies, and the weirdness Corpus.Terms
// computes against it follows: ((a + α)/c) / √(((f₁ + α)/N₁)·((f₂ + α)/N₂)).
// Invented counts: "ratio", rare in a small written reference and
// frequent in a large general one, comes out less specific with the blend
// than with the small reference alone, by √(r_small/r_large).
func TestBlendIsGeometricMean(t *testing.T) {
	small := &Counts{Words: map[string]int{"ratio": 1, "emitter": 0}, Total: 200_000}
	large := &Counts{Words: map[string]int{"ratio": 2_000, "emitter": 3}, Total: 50_000_000}
	bl := Blend(small, large)
	assert.Equal(t, int(math.Round(math.Sqrt(200_000.0*50_000_000))), bl.Size())
	c := NewCorpus(0)
	c.words.add("ratio", 30, 0)
	c.words.add("emitter", 30, 0)
	c.words.total = 50_000
	for _, w := range []string{"ratio", "emitter"} {
		f1, f2 := float64(small.Freq(w)), float64(large.Freq(w))
		r := math.Sqrt((f1 + Alpha) / 200_000 * (f2 + Alpha) / 50_000_000)
		_, weird, _ := c.specificity([]string{w}, bl, Alpha)
		assert.InDelta(t, (30+Alpha)/50_000/r, weird, 1e-9*weird, w)
		assert.InDelta(t, math.Sqrt((f1+Alpha)*(f2+Alpha))-Alpha, float64(bl.Freq(w)), 0.5, w)
	}
	_, ratioBlend, _ := c.specificity([]string{"ratio"}, bl, Alpha)
	_, ratioSmall, _ := c.specificity([]string{"ratio"}, small, Alpha)
	rSmall, rLarge := (1+Alpha)/200_000, (2_000+Alpha)/50_000_000
	assert.InDelta(t, ratioSmall*math.Sqrt(rSmall/rLarge), ratioBlend, 1e-9*ratioBlend)
	assert.Less(t, ratioBlend, ratioSmall/2)
	_, emBlend, _ := c.specificity([]string{"emitter"}, bl, Alpha)
	assert.Greater(t, emBlend, ratioBlend*50)
	// LL keeps its sign: positive for a word the documents use more.
	ll, _, _ := c.specificity([]string{"emitter"}, bl, Alpha)
	assert.Positive(t, ll)
}

// With the embedded general-language table, words the treebank hardly
// knows but speech uses ("heading", "ratio") lose specificity, while a
// greenhouse word neither knows ("dripper") gains.
func TestEmbeddedGeneralTableDemotesEverydayWords(t *testing.T) {
	m, col := defaultSetup(t)
	d := &doc.Document{Name: "a", Text: strings.Repeat("Check the heading and the ratio. The solenoid valve feeds the dripper. ", 10)}
	tokenize.Document(d)
	m.TagDocument(d)
	c := NewCorpus(0)
	c.Add(col.Collect(d))
	withTreebank := c.Terms(modelRef{m})
	blended := c.Terms(Blend(modelRef{m}, wordfreq.General()))
	w := func(ts []*Term, term string) float64 {
		x := find(ts, term)
		require.NotNil(t, x, term)
		return x.Weirdness
	}
	for _, word := range []string{"heading", "ratio"} {
		assert.Less(t, w(blended, word), w(withTreebank, word)/2, word)
	}
	assert.Greater(t, w(blended, "dripper"), 3*w(withTreebank, "dripper"))
	assert.Greater(t, w(blended, "dripper"), 50*w(blended, "heading"))
}

// The score's unit term: a repeated phrase gains RepeatedPhraseBonus, a
// fragment of a longer candidate loses FragmentPenalty, single words and
// phrases seen once get neither.
func TestScoreUnitTerm(t *testing.T) {
	e2 := math.Exp(2)
	for _, c := range []struct {
		name string
		t    Term
		want float64
	}{
		{"single word", Term{Term: "emitter", Words: 1, Freq: 5, Weirdness: e2}, math.Log(6) * 2},
		{"single word inside a phrase", Term{Term: "drip", Words: 1, Freq: 5, Weirdness: e2, Within: "drip emitter"}, math.Log(6) * 2},
		{"repeated phrase", Term{Term: "drip emitter", Words: 2, Freq: 5, Weirdness: e2}, math.Log(6) * (2 + RepeatedPhraseBonus)},
		{"phrase seen once", Term{Term: "drip emitter", Words: 2, Freq: 1, Weirdness: e2}, math.Log(2) * 2},
		{"fragment", Term{Term: "compensating drip", Words: 2, Freq: 5, Weirdness: e2, Within: "compensating drip emitter"}, math.Log(6) * (2 - FragmentPenalty)},
		{"structure word", Term{Term: "figure", Words: 1, Freq: 5, Weirdness: e2, labelShare: 0.5}, math.Log(6) * 2 * math.Pow(0.5, 16)},
	} {
		assert.InDelta(t, c.want, Score(&c.t), 1e-12, c.name)
	}
	// The blend's weirdness is a Contrast's: a Term built from it scores as any.
	k := termstat.Contrast{Study: 10, Reference: 0, StudySize: 1000, ReferenceSize: 1e6}
	assert.Positive(t, Score(&Term{Term: "valve", Words: 1, Freq: 10, Weirdness: k.SmoothedWeirdness(Alpha)}))
}

// labelStart lets through every first byte isLabel accepts.
func TestLabelStartCoversIsLabel(t *testing.T) {
	for c := range 256 {
		for _, f := range []string{string(rune(c)), string([]byte{byte(c), '1'}), string([]byte{byte(c), 'I'})} {
			tok := doc.Token{Form: f, UPOS: "NUM"}
			if isLabel(&tok) {
				assert.True(t, labelStart[f[0]], "%q", f)
			}
		}
	}
}
