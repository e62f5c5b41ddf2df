package pattern

import (
	"fmt"
	"math/rand"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/doc"
)

// within keeps the matches of at most maxLen tokens: what FindNestedWithin
// promises, worked out from FindNested's full result.
func within(ms []Match, maxLen int) []Match {
	var out []Match
	for _, mt := range ms {
		if maxLen <= 0 || mt.End-mt.Start <= maxLen {
			out = append(out, mt)
		}
	}
	return out
}

// TestNestedWithinIsNestedCut checks FindNestedWithin and EachNested
// against FindNested with the long spans removed afterwards, for random
// rule sets (labels, anchors, several rules) on random sentences and for
// limits from 1 to beyond the sentence.
func TestNestedWithinIsNestedCut(t *testing.T) {
	r := rand.New(rand.NewSource(18))
	for c := 0; c < 200; c++ {
		var src strings.Builder
		for k := 0; k < 1+c%3; k++ {
			g := &ruleGen{r: r, anchors: k == 2}
			ours, _ := g.expr(0)
			if k == 1 {
				ours = "@a (" + ours + ")"
			}
			fmt.Fprintf(&src, "r%d = %s ;\n", k, ours)
		}
		m := mustCompile(t, src.String())
		for s := 0; s < 5; s++ {
			toks, text := randomSentence(r)
			full := m.FindNested(toks)
			for _, maxLen := range []int{0, 1, 2, 3, 5, len(toks), len(toks) + 4} {
				want := render(within(full, maxLen))
				assert.Equal(t, want, render(m.FindNestedWithin(toks, maxLen)), "FindNestedWithin %d: rules\n%son %q", maxLen, src.String(), text)
				var each []Match
				m.EachNested(toks, maxLen, func(mt Match) { each = append(each, mt) })
				require.Equal(t, want, render(each), "EachNested %d: rules\n%son %q", maxLen, src.String(), text)
			}
		}
	}
}

// nounRun is a sentence of n nouns: every span of it is a match of NOUN+.
func nounRun(n int) []doc.Token {
	s := make([]doc.Token, n)
	for i := range s {
		s[i] = doc.Token{Form: "valve", Lemma: "valve", UPOS: "NOUN", XPOS: "NN"}
	}
	return s
}

// TestNestedWithinLongRun holds the cost of a limited nested search on a
// run of 100,000 nouns (about 5·10⁹ nested spans) to the number of tokens
// times the limit: it must report exactly that many spans, and a quadratic
// search would not finish within the test's time-out.
func TestNestedWithinLongRun(t *testing.T) {
	m := mustCompile(t, "r = NOUN+ ;")
	const n, maxLen = 100_000, 9
	s := nounRun(n)
	spans := 0
	m.EachNested(s, maxLen, func(Match) { spans++ })
	// Every start has maxLen spans, but the last maxLen-1 starts fewer.
	want := n*maxLen - maxLen*(maxLen-1)/2
	assert.Equal(t, want, spans)
	assert.Len(t, m.FindNestedWithin(s, maxLen), want)
}

// BenchmarkNestedWithinLongRun measures the limited nested search on one
// sentence of 100,000 nouns: tokens per second must not fall as the
// sentence grows (compare -bench with the sizes below).
func BenchmarkNestedWithinLongRun(b *testing.B) {
	m := mustCompile(b, "r = NOUN+ ;")
	for _, n := range []int{1_000, 10_000, 100_000} {
		s := nounRun(n)
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				m.EachNested(s, 9, func(Match) {})
			}
			b.ReportMetric(float64(n)*float64(b.N)/b.Elapsed().Seconds(), "tokens/s")
		})
	}
}
