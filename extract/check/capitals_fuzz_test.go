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
	return findingsOfDoc(tokenized(text), m, ms)
}

// findingsOfDoc is findingsOf for a tokenized document.
func findingsOfDoc(d *doc.Document, m *Matcher, ms *Misspellings) []Finding {
	res := Check(d, []byte(d.Text), Options{Glossary: m, Misspellings: ms})
	for i := range res.Findings {
		res.Findings[i].Text, res.Findings[i].Message = "", ""
	}
	return res.Findings
}

// FuzzCapitalizedPlural checks that a text's first word, a glossary
// word's plural in title case that a tagger took for a name (its lemma
// the word itself), has the findings of the same word in lower case with
// its singular as lemma, as a tagger gives a lower-case plural (the same
// kinds, terms and places): the capital is the writing's, and the rest of
// the text, without capitals, writes no name. The singular is the one
// the check picks among -s, -es and -ies (singularOf); words with none
// are not compared.
func FuzzCapitalizedPlural(f *testing.F) {
	f.Add("valves", " of the solenoid; magnet valves.")
	f.Add("setpoints", " drift; set points too.")
	f.Add("magnets", " valve")
	f.Add("plcs", " and PLC")
	m, _ := fuzzGlossary()
	f.Fuzz(func(t *testing.T, word, rest string) {
		if len(word) < 2 || len(rest) > 4096 ||
			strings.IndexFunc(word, func(r rune) bool { return r < 'a' || r > 'z' }) >= 0 ||
			strings.IndexFunc(rest, func(r rune) bool { return unicode.IsUpper(r) || unicode.IsTitle(r) }) >= 0 {
			return
		}
		end, base, ok := m.singularOf([]byte(word))
		if !ok {
			return
		}
		lower := tokenized(word + rest)
		upper := tokenized(strings.ToUpper(word[:1]) + word[1:] + rest)
		if len(lower.Sentences) == 0 || len(upper.Sentences) != len(lower.Sentences) ||
			lower.Sentences[0].Tokens[0].Form != word || upper.Sentences[0].Tokens[0].Form != upper.Text[:len(word)] {
			return // the word is not a token of its own
		}
		lower.Sentences[0].Tokens[0].Lemma = word[:len(word)-len(end)] + base
		upper.Sentences[0].Tokens[0].Lemma = upper.Sentences[0].Tokens[0].Form
		assert.Equal(t, findingsOfDoc(lower, m, nil), findingsOfDoc(upper, m, nil), "%q", word+rest)
	})
}

// tokenized returns text as a tokenized document, untagged.
func tokenized(text string) *doc.Document {
	d := &doc.Document{Name: "fuzz.txt", Text: text}
	tokenize.Document(d)
	return d
}
