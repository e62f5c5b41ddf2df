package check

import (
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/doc"
	"glossmith/tagger/tokenize"
)

// FuzzInflects checks inflects against a brute-force search: toks spell
// want when one of the 2^n ways of taking each token as written or as its
// lemma (lemmaWord), joined with the text's separators (a space where the
// text has white space, nothing where tokens touch, a hyphen token as
// "-"), is want up to case where the form ignores case. The tokens are
// the first sentence of text, at most 8; lemmas gives their lemmas, one
// a "|"-separated field ("" for none). Besides the fuzzed want, the
// spelling of the combination pick must always be found, in capitals too
// where the form ignores case.
func FuzzInflects(f *testing.F) {
	f.Add("bills of materials", "bill||material", "bill of materials", uint16(1), false)
	f.Add("Steps of several degrees", "step||||", "step of several degrees", uint16(3), false)
	f.Add("two set-points", "|set|‐|point", "set-point", uint16(0), true)
	f.Add("PLCs don't", "PLC|do|not", "PLC don't", uint16(5), true)
	f.Add("K valves", "k|valve", "k valve", uint16(2), false)
	f.Add("K valves", "|valve", "k valve", uint16(2), false) // KELVIN SIGN folds to k
	f.Fuzz(func(t *testing.T, text, lemmas, want string, pick uint16, caseSensitive bool) {
		// Documents are valid UTF-8 once read (read.Read); invalid bytes
		// fold as U+FFFD in strings.EqualFold whatever their length.
		if !utf8.ValidString(text) || !utf8.ValidString(lemmas) || !utf8.ValidString(want) {
			return
		}
		sents := tokenize.Sentences(text)
		if len(sents) == 0 || len(sents[0].Tokens) == 0 {
			return
		}
		toks := sents[0].Tokens
		toks = append([]doc.Token(nil), toks[:min(len(toks), 8)]...)
		for i, l := range strings.Split(lemmas, "|") {
			if i < len(toks) {
				toks[i].Lemma = l
			}
		}
		spellings := everySpelling(toks)
		found := false
		for _, s := range spellings {
			found = found || same(s, want, caseSensitive)
		}
		assert.Equal(t, found, inflects(toks, want, caseSensitive), "%q of %q (lemmas %q, case-sensitive %v)", want, text, lemmas, caseSensitive)

		s := spellings[int(pick)%len(spellings)]
		require.True(t, inflects(toks, s, caseSensitive), "%q of %q (lemmas %q)", s, text, lemmas)
		if up := strings.ToUpper(s); !caseSensitive && strings.EqualFold(up, s) {
			assert.True(t, inflects(toks, up, false), "%q of %q (lemmas %q)", up, text, lemmas)
		}
	})
}

// everySpelling returns the spelling of toks for each of the 2^n choices
// of every token as written (bit clear) or as its lemma (bit set).
func everySpelling(toks []doc.Token) []string {
	var out []string
	for mask := range 1 << len(toks) {
		var b strings.Builder
		for i := range toks {
			w := toks[i].Form
			if mask&(1<<i) != 0 {
				w = lemmaWord(&toks[i])
			}
			if isHyphen(w) {
				w = "-"
			}
			b.WriteString(w)
			if i+1 < len(toks) && !glued(&toks[i], &toks[i+1]) {
				b.WriteByte(' ')
			}
		}
		out = append(out, b.String())
	}
	return out
}
