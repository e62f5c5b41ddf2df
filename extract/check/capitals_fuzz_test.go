package check

import (
	"strings"
	"testing"
	"unicode"

	"github.com/stretchr/testify/assert"

	"glossmith/tagger/doc"
	"glossmith/tagger/tokenize"
)

// FuzzFirstWordCapital checks that the capital of a text's first word is
// the writing's: "Vavle seat worn" has the findings of "vavle seat worn"
// (the same kinds, terms and places), the word read in lower case. The
// rest of the text has no capitals, so that no word of it writes the
// first with capitals of its own, and the first word is ASCII letters
// not ending in "s", which may be a glossary word's plural ending
// (a form of the word, which only a tagger's lemma tells in lower case).
func FuzzFirstWordCapital(f *testing.F) {
	f.Add("vavle", " seat worn; check the solenoid vavle.")
	f.Add("setpiont", " of the magnet vavle is 40.\nsolenoid valve")
	f.Add("magnte", " valve, set-piont and plc.")
	m, ms := fuzzGlossary()
	f.Fuzz(func(t *testing.T, word, rest string) {
		if len(word) < 2 || strings.HasSuffix(word, "s") || len(rest) > 4096 ||
			strings.IndexFunc(word, func(r rune) bool { return r < 'a' || r > 'z' }) >= 0 ||
			strings.IndexFunc(rest, func(r rune) bool { return unicode.IsUpper(r) || unicode.IsTitle(r) }) >= 0 {
			return
		}
		lower := findingsOf(word+rest, m, ms)
		upper := findingsOf(strings.ToUpper(word[:1])+word[1:]+rest, m, ms)
		assert.Equal(t, lower, upper, "%q", word+rest)
	})
}

// findingsOf returns the findings of text, without their text and message
// (which quote the text's case).
func findingsOf(text string, m *Matcher, ms *Misspellings) []Finding {
	d := &doc.Document{Name: "fuzz.txt", Text: text}
	tokenize.Document(d)
	res := Check(d, []byte(text), Options{Glossary: m, Misspellings: ms})
	for i := range res.Findings {
		res.Findings[i].Text, res.Findings[i].Message = "", ""
	}
	return res.Findings
}
