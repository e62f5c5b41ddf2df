package concord

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"

	"glossmith/tagger/doc"
	"glossmith/tagger/tokenize"
)

// FuzzKeyJoinsAsTheText checks that a count's key is the text of its
// tokens up to case, as the concordance quotes it (span: white space
// folded to one space), for every stretch [a, b) of a sentence's tokens;
// with lemmas that are the forms, the lemma key is the same key.
func FuzzKeyJoinsAsTheText(f *testing.F) {
	f.Add("Connect the GC-48 now; it doesn't close.")
	f.Add("two  set-points\tat 200 kPa (3 MW), HAWTs")
	f.Add("«İSTANBUL» ǅemal's \"valve\"—pump… 24V/12V")
	f.Fuzz(func(t *testing.T, text string) {
		if len(text) > 4096 {
			return // longer text finds nothing new and is slow to check
		}
		d := &doc.Document{Name: "fuzz", Text: text}
		tokenize.Document(d)
		for _, s := range d.Sentences {
			toks := s.Tokens
			for a := range toks {
				for b := a + 1; b <= len(toks) && b <= a+4; b++ {
					key := Key(toks, a, b, false)
					quoted := span(d, toks, a, b)
					assert.Equal(t, strings.ToLower(quoted), strings.ToLower(key), "tokens [%d, %d) of %q", a, b, text)
				}
			}
			lemmas := append([]doc.Token(nil), toks...)
			for i := range lemmas {
				lemmas[i].Lemma = lemmas[i].Form
			}
			assert.Equal(t, Key(toks, 0, len(toks), false), Key(lemmas, 0, len(lemmas), true), "lemmas that are the forms")
		}
	})
}
