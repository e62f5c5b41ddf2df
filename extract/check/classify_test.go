package check

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/tokenize"
)

// inflects takes each word as written or as its lemma, and compares up to
// case rune by rune: U+212A KELVIN SIGN is "k" up to case in Unicode's
// case folding (CaseFolding.txt: 212A; C; 006B), though three bytes long
// to its one.
func TestInflects(t *testing.T) {
	tests := []struct {
		text, lemmas, want string
		caseSensitive      bool
		ok                 bool
	}{
		{"bills of materials", "bill||material", "bill of materials", false, true},
		{"bills of materials", "bill||material", "bills of material", false, true},
		{"bills of materials", "bill||material", "bill materials", false, false},
		{"two set-points", "|set|-|point", "set-point", false, false}, // "two" is no part of it
		{"set-points", "set|-|point", "set-point", false, true},
		{"Set-Points", "set|-|point", "set-point", true, false},
		{"\u212a valves of pumps", "|valve||pump", "k valve of pumps", false, true},
		{"\u212a valves of pumps", "|valve||pump", "K valve of pumps", false, true},
		{"\u212a valves of pumps", "|valve||pump", "k valve of pumps", true, false},
		{"k valves of pumps", "|valve||pump", "\u212a valve of pumps", false, true},
	}
	for _, tc := range tests {
		t.Run(tc.text+"→"+tc.want, func(t *testing.T) {
			sents := tokenize.Sentences(tc.text)
			require.Len(t, sents, 1)
			toks := sents[0].Tokens
			lemmas := strings.Split(tc.lemmas, "|")
			require.Len(t, lemmas, len(toks), "one lemma field a token")
			for i := range toks {
				toks[i].Lemma = lemmas[i]
			}
			assert.Equal(t, tc.ok, inflects(toks, tc.want, tc.caseSensitive))
		})
	}
}
