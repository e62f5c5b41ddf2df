package terms

import (
	"math"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/doc"
)

// A word a label mostly follows is a document-structure word: on invented
// greenhouse-controller text, "figure" (always before a number) and
// "table" (before a number or a letter) fall far below the default
// list's cut-off, while "dripper", as frequent and as rare in general
// language but never before a label, stays in it; a word before a label
// now and then ("valve 2", one use in ten) keeps its whole score.
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
	assert.InDelta(t, math.Log1p(float64(valve.Freq))*math.Log(valve.Weirdness), valve.Score, 1e-9)
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
		{"structure word", Term{Term: "figure", Words: 1, Freq: 5, Weirdness: e2, labelShare: StructureShare}, 0},
		{"numbered now and then", Term{Term: "zone", Words: 1, Freq: 5, Weirdness: e2, labelShare: StructureShare - 0.01}, math.Log(6) * 2},
	} {
		assert.InDelta(t, c.want, Score(&c.t), 1e-12, c.name)
	}
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
