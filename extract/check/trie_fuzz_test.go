package check

import (
	"slices"
	"strconv"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/stretchr/testify/assert"

	"glossmith/tagger/tokenize"
)

// FuzzTrieIsAMapOfKeys checks the compiled trie against a plain map from
// key (appendKey) to forms: walking the tokens [a, b) of a text one after
// another from the root ends on a node whose forms are exactly those
// whose key is the key of the tokens' forms run together, and walking the
// tokens of a form's own text reaches that form. forms holds the
// glossary's forms, one a line, one entry each; many forms sharing first
// letters give nodes with a child table (denseFrom) as well as nodes
// with a list of edges.
func FuzzTrieIsAMapOfKeys(f *testing.F) {
	f.Add("set point\nsetpoint\nSet-Point\nsolenoid valve\nmagnet valve\nPLC\nsa\nsb\nsc\nsd\nse\nsf\nsg\nsh\nsi\nß\nİ", "Two set points; the SET-POINT, the solenoid valves and PLCs. İ ß")
	f.Add("a\u00adb\nx\u2010y\nöl\nÖL-pump\n24V", "ab xy Öl öl-pump ÖL PUMP 24 V 24V")
	f.Fuzz(func(t *testing.T, forms, text string) {
		if !utf8.ValidString(forms) || !utf8.ValidString(text) {
			return // documents and termbases are valid UTF-8 once read
		}
		lines := strings.Split(forms, "\n")
		if len(lines) > 64 {
			lines = lines[:64]
		}
		var g Glossary
		byKey := map[string][]formRef{}
		for i, l := range lines {
			g.Entries = append(g.Entries, Entry{ID: strconv.Itoa(i), Forms: []Form{{Text: l}}})
			if k := string(appendKey(nil, l)); k != "" {
				byKey[k] = append(byKey[k], formRef{int32(i), 0})
			}
		}
		m := Compile(g)
		var scratch []byte
		// reached returns the forms at the node the walk of words ends on.
		reached := func(words []string) []formRef {
			n := int32(0)
			for _, w := range words {
				if n = m.walk(n, w, &scratch); n < 0 {
					return nil
				}
			}
			if fin := m.nodes[n].final; fin > 0 {
				return m.ends[fin-1]
			}
			return nil
		}
		// walkable reports whether every word feeds the trie something: a
		// word with no key ends a walk by design (walk).
		walkable := func(words []string) bool {
			for _, w := range words {
				if len(appendKey(nil, w)) == 0 || strings.ContainsAny(w, "\t\n\v\f\r") {
					return false
				}
			}
			return true
		}
		for _, s := range tokenize.Sentences(text) {
			for a := range s.Tokens {
				var words []string
				for b := a; b < len(s.Tokens) && b < a+4; b++ {
					words = append(words, s.Tokens[b].Form)
					if !walkable(words) {
						break
					}
					want := byKey[string(appendKey(nil, strings.Join(words, "")))]
					assert.ElementsMatch(t, want, reached(words), "%q", words)
				}
			}
		}
		for i, l := range lines {
			var words []string
			for _, s := range tokenize.Sentences(l) {
				for _, tk := range s.Tokens {
					words = append(words, tk.Form)
				}
			}
			if len(words) == 0 || !walkable(words) {
				continue
			}
			assert.True(t, slices.Contains(reached(words), formRef{int32(i), 0}), "form %q as tokens %q", l, words)
		}
	})
}
