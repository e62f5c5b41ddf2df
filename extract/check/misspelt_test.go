package check

import (
	"strings"
	"sync"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// misspeltGlossary is pumpGlossary with a term that has a deprecated
// variant one edit from it, and terms whose words take -ies and -es in
// the plural.
func misspeltGlossary() Glossary {
	g := pumpGlossary()
	g.Entries = append(g.Entries, Entry{ID: "e7", Forms: []Form{
		{Text: "thermistor", Status: Preferred, POS: "noun"}, {Text: "thermister", Status: Deprecated, POS: "noun"}}},
		Entry{ID: "e8", Forms: []Form{{Text: "valve assembly", Status: Preferred, POS: "noun"}}},
		Entry{ID: "e9", Forms: []Form{{Text: "float switch", Status: Preferred, POS: "noun"}}})
	return g
}

// countingLexicon is the tagger's lexicon, counting the words asked about.
type countingLexicon struct {
	mu    sync.Mutex
	asked map[string]int
}

func (c *countingLexicon) UnknownWord(w string) bool {
	c.mu.Lock()
	c.asked[w]++
	c.mu.Unlock()
	return tagger.UnknownWord(w)
}

func TestMisspeltTerms(t *testing.T) {
	m := Compile(misspeltGlossary())
	tests := []struct {
		text      string
		found     []string // the texts found, in order; none for nothing
		preferred string   // of the first
		entry     string   // of the first
		message   string   // of the first
	}{
		{"Open the solenoid vavle first.", []string{"solenoid vavle"}, "solenoid valve", "e2",
			`"solenoid vavle" looks like a misspelling of the term "solenoid valve"`},
		{"Both solenoid vavles stick.", []string{"solenoid vavles"}, "solenoid valve", "e2", ""},
		{"Adjust the set piont slowly.", []string{"set piont"}, "set point", "e1", ""},
		{"Adjust the set-piont slowly.", []string{"set-piont"}, "set-point", "e1",
			`"set-piont" looks like a misspelling of the term "set-point"`},
		{"Open the magnet vavle first.", []string{"magnet vavle"}, "solenoid valve", "e2",
			`"magnet vavle" looks like a misspelling of the deprecated term "magnet valve": use "solenoid valve"`},
		{"The dry running gaurd trips.", []string{"dry running gaurd"}, "dry-run protection", "e4",
			`"dry running gaurd" looks like a misspelling of the forbidden term "dry running guard": use "dry-run protection"`},
		{"Read the thermistr now.", []string{"thermistr"}, "thermistor", "e7", ""},
		{"Replace both valve asemblies.", []string{"valve asemblies"}, "valve assembly", "e8", ""},
		{"Test both float swithces.", []string{"float swithces"}, "float switch", "e9", ""},
		{"Open the solenoid vavle and the magnet vavle.", []string{"solenoid vavle", "magnet vavle"}, "solenoid valve", "e2", ""},
		// Not misspellings: words are words, short, capitalized, two
		// edits away, wrong in the first letter, or terms themselves.
		{"Read the solenoid value first.", nil, "", "", ""},
		{"Read the flow rtae now.", nil, "", "", ""},
		{"Ask Thermistr now.", nil, "", "", ""},
		{"Open the solenoid vlaev first.", nil, "", "", ""},
		{"Open the solenoid balve first.", nil, "", "", ""},
		{"Open the sollenoid vavle first.", nil, "", "", ""},
		{"Open the solenoid valve first.", nil, "", "", ""},
		{"Set the dry-run protection.", nil, "", "", ""},
		{"Keep the old thermister.", nil, "", "", ""},
	}
	for _, tc := range tests {
		t.Run(tc.text, func(t *testing.T) {
			d, src := annotate(t, "a.txt", tc.text+"\n")
			ms := NewMisspellings(m, tagger)
			res := Check(d, src, Options{Glossary: m, Misspellings: ms})
			var got []string
			for _, f := range res.Findings {
				if f.Kind == KindMisspelt {
					got = append(got, f.Text)
				}
			}
			assert.Equal(t, tc.found, got)
			if len(tc.found) == 0 || len(got) == 0 {
				return
			}
			f := res.Findings[0]
			assert.Equal(t, Warning, f.Level())
			assert.Equal(t, tc.preferred, f.Preferred)
			assert.Equal(t, tc.entry, f.Entry)
			if tc.message != "" {
				assert.Equal(t, tc.message, f.Message)
			}
			assert.Equal(t, 1, f.Line)
			assert.Equal(t, strings.Index(tc.text, tc.found[0])+1, f.Column)
		})
	}
}

// The lexicon is asked about a word once a run, and only about words that
// may be misspellings of a glossary word: lower case, five letters or
// more, a first letter and a length some glossary word has, not a word of
// the glossary ("solenoid").
func TestMisspeltLookUps(t *testing.T) {
	m := Compile(misspeltGlossary())
	lex := &countingLexicon{asked: map[string]int{}}
	ms := NewMisspellings(m, lex)
	for range 2 {
		d, src := annotate(t, "a.txt", "The pump runs well. Open the solenoid vavle, then the Solenoid Vavle and the vavle.\n")
		res := Check(d, src, Options{Glossary: m, Misspellings: ms})
		require.Len(t, res.Findings, 1)
	}
	assert.Equal(t, map[string]int{"vavle": 1}, lex.asked)
}
