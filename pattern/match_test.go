package pattern

import (
	"fmt"
	"maps"
	"slices"
	"strings"
	"sync"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/grammar"
)

func render(ms []Match) string {
	var parts []string
	for _, m := range ms {
		s := fmt.Sprintf("%s[%d,%d)", m.Rule, m.Start, m.End)
		if m.Slots != nil {
			var ls []string
			for _, k := range slices.Sorted(maps.Keys(m.Slots)) {
				v := m.Slots[k]
				ls = append(ls, fmt.Sprintf("%s=%d:%d", k, v[0], v[1]))
			}
			s += "{" + strings.Join(ls, ",") + "}"
		}
		parts = append(parts, s)
	}
	return strings.Join(parts, " ")
}

const greenhouse = "the/DET/DT stainless/ADJ/JJ steel/NOUN/NN valve/NOUN/NN body/NOUN/NN of/ADP/IN the/DET/DT north/ADJ/JJ greenhouse/NOUN/NN cracked/VERB/VBD ./PUNCT/."

func TestFindAllLeftmostLongest(t *testing.T) {
	m := mustCompile(t, `
modifier = ADJ | NOUN ;
term = modifier* NOUN ;
of_term = term "of" DET? term ;
`, "term", "of_term")
	got := render(m.FindAll(toks(greenhouse)))
	// term: [1,5) "stainless steel valve body" is the longest at 1; then
	// [7,9) "north greenhouse". of_term: [1,9). Sorted by start, then
	// rule order.
	want := "term[1,5) of_term[1,9) term[7,9)"
	assert.Equal(t, want, got)
}

func TestFindNestedEverySpan(t *testing.T) {
	m := mustCompile(t, "term = (ADJ | NOUN)* NOUN ;")
	got := render(m.FindNested(toks("stainless/ADJ steel/NOUN valve/NOUN cracked/VERB")))
	// Every span that ends in a noun and holds only ADJ/NOUN before it.
	want := "term[0,2) term[0,3) term[1,2) term[1,3) term[2,3)"
	assert.Equal(t, want, got)
	assert.Equal(t, "term[0,3)", render(m.FindAll(toks("stainless/ADJ steel/NOUN valve/NOUN cracked/VERB"))), "FindAll")
}

func TestNoEmptyMatches(t *testing.T) {
	m := mustCompile(t, "r = ADJ* ;")
	got := render(m.FindAll(toks("a/NOUN b/ADJ c/ADJ d/NOUN e/ADJ")))
	assert.Equal(t, "r[1,3) r[4,5)", got)
	assert.Nil(t, m.FindNested(toks("a/NOUN")), "nested on no ADJ")
}

func TestLabels(t *testing.T) {
	m := mustCompile(t, `verb_obj = @verb VERB DET? ADJ* @object NOUN ;`)
	got := render(m.FindAll(toks("we/PRON flushed/VERB the/DET long/ADJ line/NOUN and/CCONJ fixed/VERB valves/NOUN")))
	want := "verb_obj[1,5){object=4:5,verb=1:2} verb_obj[6,8){object=7:8,verb=6:7}"
	assert.Equal(t, want, got)
	assert.Equal(t, []string{"verb", "object"}, m.Labels("verb_obj"))
}

func TestLabelChoice(t *testing.T) {
	// The span "a b" (ADJ NOUN) parses as @x ADJ @y NOUN or, through the
	// second alternative, as @z (ADJ NOUN). The first alternative in
	// written order wins.
	m := mustCompile(t, `r = @x ADJ @y NOUN | @z (ADJ NOUN) ;`)
	assert.Equal(t, "r[0,2){x=0:1,y=1:2}", render(m.FindAll(toks("a/ADJ b/NOUN"))))
	m = mustCompile(t, `r = @z (ADJ NOUN) | @x ADJ @y NOUN ;`)
	assert.Equal(t, "r[0,2){z=0:2}", render(m.FindAll(toks("a/ADJ b/NOUN"))))
	// Greedy repetition: @first takes as many tokens as the span allows.
	m = mustCompile(t, `r = @first NOUN* @rest NOUN* ;`)
	assert.Equal(t, "r[0,3){first=0:3,rest=3:3}", render(m.FindAll(toks("a/NOUN b/NOUN c/NOUN"))))
	// A label inside a repetition holds the last round.
	m = mustCompile(t, `r = (@n NOUN ",")+ ;`)
	assert.Equal(t, "r[0,4){n=2:3}", render(m.FindAll(toks("a/NOUN ,/PUNCT b/NOUN ,/PUNCT"))))
	// A label in an alternative not taken is absent.
	m = mustCompile(t, `r = @a ADJ | @n NOUN ;`)
	assert.Equal(t, "r[0,1){n=0:1}", render(m.FindAll(toks("x/NOUN"))))
	// Labels of referenced rules stay inside them.
	m = mustCompile(t, "np = @node NOUN ; r = @obj np ;", "r")
	assert.Equal(t, "r[0,1){obj=0:1}", render(m.FindAll(toks("x/NOUN"))))
}

func TestAnchors(t *testing.T) {
	s := toks("Valves/NOUN leak/VERB and/CCONJ pumps/NOUN fail/VERB")
	for _, c := range []struct{ rule, want string }{
		{"r = ^ NOUN ;", "r[0,1)"},
		{"r = NOUN $ ;", ""},
		{"r = VERB $ ;", "r[4,5)"},
		{"r = ^ _* $ ;", "r[0,5)"},
		{"r = (^ | CCONJ) NOUN ;", "r[0,1) r[2,4)"},
		{"r = NOUN ^ ;", ""},
		{"r = _ (VERB $ | NOUN) ;", "r[2,4)"},
	} {
		m := mustCompile(t, c.rule)
		assert.Equal(t, c.want, render(m.FindAll(s)), c.rule)
	}
}

func TestSentenceBoundary(t *testing.T) {
	// "valve ." ends one sentence, "Body cracked" starts the next: a rule
	// for two nouns in a row must not join "valve" and "Body".
	m := mustCompile(t, "pair = NOUN NOUN ;")
	first, second := toks("the/DET valve/NOUN"), toks("body/NOUN cracked/VERB")
	assert.Empty(t, append(m.FindAll(first), m.FindAll(second)...), "matched across sentences")
	assert.Equal(t, "pair[1,3)", render(m.FindAll(append(first, second...))))
}

func TestTokenTests(t *testing.T) {
	s := toks("The/DET/DT Turbine-2/PROPN/NNP unsealed/VERB/VBN EC/PROPN/NNP valves/NOUN/NNS sealing/VERB/VBG Valve/NOUN/NN")
	s[4].Lemma = "valve"
	for _, c := range []struct{ rule, want string }{
		{`r = xpos:NNS ;`, "r[4,5)"},
		{`r = xpos:/^VB/ ;`, "r[2,3) r[5,6)"},
		{`r = "valve" ;`, "r[6,7)"},
		{`r = 'Valve' ;`, "r[6,7)"},
		{`r = 'valve' ;`, ""},
		{`r = "the" | "ec" ;`, "r[0,1) r[3,4)"},
		{`r = lemma:valve ;`, "r[4,5) r[6,7)"},
		{`r = lemma:/^val/ & NOUN ;`, "r[4,5) r[6,7)"},
		{`r = /^[A-Z]{2,5}$/ ;`, "r[3,4)"},
		{`r = begins:un ;`, "r[2,3)"},
		{`r = ends:ING ;`, "r[5,6)"},
		{`r = chars:Aa+-9 ;`, "r[1,2)"},
		{`r = chars:Aa+ ;`, "r[0,1) r[6,7)"},
		{`r = chars:/^A\+$/ ;`, "r[3,4)"},
		{`r = _ ;`, "r[0,7)"},
		{`r = _+ ;`, "r[0,7)"},
		{`r = !NOUN & !DET ;`, "r[1,4) r[5,6)"},
		{`r = !(NOUN | DET) ;`, "r[1,4) r[5,6)"},
		{`r = !!NOUN ;`, "r[4,5) r[6,7)"},
		{`r = VERB & xpos:VBN | DET ;`, "r[0,1) r[2,3)"},
		{`r = PROPN{2} ;`, ""},
		{`r = (PROPN VERB?){2,} ;`, "r[1,4)"},
		{`r = "unsealed ec" ;`, "r[2,4)"},
	} {
		m := mustCompile(t, c.rule)
		var got []string
		for _, mt := range m.FindAll(s) {
			got = append(got, fmt.Sprintf("r[%d,%d)", mt.Start, mt.End))
		}
		// _ and ! rules match runs; compare their merged form.
		g := strings.Join(got, " ")
		if c.rule == `r = _ ;` || strings.HasPrefix(c.rule, `r = !`) {
			g = mergeRuns(m.FindAll(s))
		}
		assert.Equal(t, c.want, g, c.rule)
	}
}

// mergeRuns joins adjacent one-token matches into runs, to keep the table
// above short.
func mergeRuns(ms []Match) string {
	var out []string
	for i := 0; i < len(ms); {
		j := i
		for j+1 < len(ms) && ms[j+1].Start == ms[j].End {
			j++
		}
		out = append(out, fmt.Sprintf("r[%d,%d)", ms[i].Start, ms[j].End))
		i = j + 1
	}
	return strings.Join(out, " ")
}

func TestCompilePattern(t *testing.T) {
	rs := mustSet(t, "term = ADJ* NOUN ;")
	m, err := CompilePattern(`term "of" term`, rs)
	require.NoError(t, err)
	got := render(m.FindAll(toks("rate/NOUN of/ADP dry/ADJ air/NOUN")))
	assert.Equal(t, "pattern[0,4)", got)
	_, err = CompilePattern(`term NUON`, rs)
	var el grammar.ErrorList
	require.ErrorAs(t, err, &el)
	require.Len(t, el, 1)
	e := el[0]
	assert.Equal(t, [2]int{1, 6}, [2]int{e.Pos.Line, e.Pos.Col})
	assert.Contains(t, e.Msg, `did you mean "NOUN"?`)
	assert.Equal(t, "term NUON", e.Source)
	_, err = CompilePattern(`NOUN (`, nil)
	assert.Error(t, err, "a broken pattern")
}

func TestCompileErrors(t *testing.T) {
	rs := mustSet(t, "term = NOUN ; _helper = ADJ ;")
	_, err := Compile(rs, "trem")
	assert.ErrorContains(t, err, `did you mean "term"?`)
	m, err := Compile(rs)
	require.NoError(t, err)
	assert.Equal(t, []string{"term"}, m.Rules(), "helpers named _… are left out")
}

func TestConcurrentUse(t *testing.T) {
	m, err := CompileStock("terms")
	require.NoError(t, err)
	corpus := syntheticCorpus(300)
	want := make([]string, len(corpus))
	for i, s := range corpus {
		want[i] = render(m.FindAll(s)) + "|" + render(m.FindNested(s))
	}
	var wg sync.WaitGroup
	errs := make(chan string, 8)
	for g := 0; g < 8; g++ {
		wg.Add(1)
		go func(g int) {
			defer wg.Done()
			for k := range corpus {
				i := (k + g*37) % len(corpus)
				if got := render(m.FindAll(corpus[i])) + "|" + render(m.FindNested(corpus[i])); got != want[i] {
					errs <- fmt.Sprintf("goroutine %d, sentence %d: %s != %s", g, i, got, want[i])
					return
				}
			}
		}(g)
	}
	wg.Wait()
	close(errs)
	for e := range errs {
		assert.Fail(t, e)
	}
}

func TestCacheResetKeepsResults(t *testing.T) {
	m, err := CompileStock("terms", "pairs")
	require.NoError(t, err)
	corpus := syntheticCorpus(200)
	var want []string
	for _, s := range corpus {
		want = append(want, render(m.FindAll(s)))
	}
	defer func(c, s int) { maxClasses, maxDFAStates = c, s }(maxClasses, maxDFAStates)
	maxClasses, maxDFAStates = 2, 2 // drop the caches before almost every sentence
	m2, _ := CompileStock("terms", "pairs")
	for i, s := range corpus {
		require.Equal(t, want[i], render(m2.FindAll(s)), "sentence %d", i)
	}
}

func TestPairsLabels(t *testing.T) {
	m, err := CompileStock("pairs")
	require.NoError(t, err)
	for _, name := range m.Rules() {
		assert.ElementsMatch(t, []string{"node", "collocate"}, m.Labels(name), name)
	}
	got := render(m.FindNested(toks("flush/VERB/VB the/DET/DT drip/NOUN/NN line/NOUN/NN")))
	want := "verb_obj[0,3){collocate=2:3,node=0:1} verb_obj[0,4){collocate=3:4,node=0:1} noun_noun[2,4){collocate=2:3,node=3:4}"
	assert.Equal(t, want, got)
}

func TestCompileStockRefusesUnknownSet(t *testing.T) {
	_, err := CompileStock("no-such-set")
	assert.Error(t, err)
}
