package titlecase

import (
	"strings"
	"testing"
	"unicode"
	"unicode/utf8"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/doc"
)

// FuzzLinesAndCapitals checks LineOf, CapsLine, CapitalOfWriting and
// OwnCapitals on tokenized text (lines starting "# " are headings) against
// what their doc comments promise, never against their own code:
//   - LineOf returns the run of the sentence's tokens on the line of k;
//   - CapsLine answers alike for every token of a line, and is true just
//     when the line has two tokens starting with a letter and no letter in
//     lower case;
//   - a sentence's first word takes a capital from the writing;
//   - OwnCapitals records only lower-cased words of running text that
//     start with a capital, never a heading's, none at all in text without
//     capitals, and keep only filters what it records.
func FuzzLinesAndCapitals(f *testing.F) {
	f.Add("# SOLENOID VAVLE REPLACED\nSOLENOID VAVLE REPLACED ON TANK 2\nThe Vavleco pumps feed the PLC.")
	f.Add("Check the valve.\nMAGNET VALVE\nthen the Pump, the DRIP EMITTER and X Y.")
	f.Add("A\nB C\nd E F G\n\n# Ǆ-ǅ İSTANBUL\nthe İSTANBUL Pan Of, pan and ǅemal Ǆ")
	f.Add("Open the valve on\nTANK\nand the PLC then.")
	f.Add("Year 2008 Year 2009: Table 5.2 Blade geometry, Ministry of Water Supply \xff\xfeA.")
	f.Fuzz(func(t *testing.T, text string) {
		if len(text) > 4096 {
			return // longer text finds nothing new and is slow to check
		}
		d := document(t, text)
		for _, s := range d.Sentences {
			toks := s.Tokens
			if len(toks) > 0 {
				assert.True(t, CapitalOfWriting(toks, 0), "a sentence's first word: %q", toks[0].Form)
			}
			// The lines of the sentence, each a run of tokens of one line:
			// LineOf and CapsLine are asked at a line's first, middle and last
			// token (every token would make a long line quadratic).
			for i := 0; i < len(toks); {
				j := i
				words, lower := 0, false
				for ; j < len(toks) && toks[j].Line == toks[i].Line; j++ {
					if r, _ := utf8.DecodeRuneInString(toks[j].Form); unicode.IsLetter(r) {
						words++
					}
					lower = lower || strings.IndexFunc(toks[j].Form, unicode.IsLower) >= 0
				}
				caps := words >= 2 && !lower
				for _, k := range []int{i, (i + j) / 2, j - 1} {
					from, to := LineOf(toks, k)
					require.Equal(t, [2]int{i, j}, [2]int{from, to}, "LineOf(%d) of %d tokens", k, len(toks))
					assert.Equal(t, caps, CapsLine(toks, k), "CapsLine(%d) of the line %q", k, d.Text[toks[i].Start:toks[j-1].End])
				}
				i = j
			}
		}

		// Every lower-cased word of running text that starts with a capital:
		// what OwnCapitals may record.
		capitalized := map[string]bool{}
		for _, s := range d.Sentences {
			for _, tk := range s.Tokens {
				if r, _ := utf8.DecodeRuneInString(tk.Form); !s.Heading && unicode.IsUpper(r) {
					capitalized[strings.Map(unicode.ToLower, tk.Form)] = true
				}
			}
		}
		all := OwnCapitals(d.Sentences, func([]byte) bool { return true })
		for w := range all {
			assert.True(t, capitalized[w], "%q is no capitalized word of running text, lower-cased", w)
		}
		// keep is a filter: keeping only the words of even length gives
		// those of the full set.
		even := OwnCapitals(d.Sentences, func(w []byte) bool { return len(w)%2 == 0 })
		for w := range all {
			_, ok := even[w]
			assert.Equal(t, len(w)%2 == 0, ok, "%q with keep of even lengths", w)
		}
		assert.LessOrEqual(t, len(even), len(all))

		headings := make([]doc.Sentence, len(d.Sentences))
		copy(headings, d.Sentences)
		for i := range headings {
			headings[i].Heading = true
		}
		assert.Empty(t, OwnCapitals(headings, func([]byte) bool { return true }), "headings only")

		// A few capitals have no lower case (ϒ): only text without any
		// capital left is sure to have no word with capitals of its own.
		if lowered := strings.Map(unicode.ToLower, text); strings.IndexFunc(lowered, unicode.IsUpper) < 0 {
			assert.Empty(t, OwnCapitals(document(t, lowered).Sentences, func([]byte) bool { return true }), "text in lower case")
		}
	})
}
