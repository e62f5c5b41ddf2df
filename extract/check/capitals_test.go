package check

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A capitalized word is read as a misspelling where the writing gave it
// its capital — a sentence's start, a heading's words, a heading or line
// in capitals — and nowhere the word's own capital may be meant: inside
// running text (a name), in capitals among lower-case words (an acronym),
// or where the document's running text writes the word so elsewhere.
// A capitalized word whose lower case is a word, or a glossary word with a
// plural ending, is none. The scenario is
// an invented maker of solar water pumps.
func TestCapitalizedMisspellings(t *testing.T) {
	m := Compile(misspeltGlossary())
	type at struct {
		text           string
		line, col, end int // end: the column just past the text in the file
	}
	tests := []struct {
		name, file, text string
		want             []at
	}{
		{"a sentence's first word", "a.txt", "Thermistr leads were loose.\n",
			[]at{{"Thermistr", 1, 1, 10}}},
		{"a second sentence's first word", "a.txt", "The pump ran. Thermistr leads were loose.\n",
			[]at{{"Thermistr", 1, 15, 24}}},
		{"after a colon", "a.txt", "Found: Thermistr leads were loose.\n",
			[]at{{"Thermistr", 1, 8, 17}}},
		{"the first word of a term", "a.txt", "Flaot switches stick in winter.\n",
			[]at{{"Flaot switches", 1, 1, 15}}},
		{"a Markdown heading in title case", "a.md", "# Replacing the Solenoid Vavle\n\nThe seat is worn.\n",
			[]at{{"Solenoid Vavle", 1, 17, 31}}},
		{"a Markdown heading in capitals", "a.md", "## SOLENOID VAVLE FAULTS\n\nThe seat is worn.\n",
			[]at{{"SOLENOID VAVLE", 1, 4, 18}}},
		{"an HTML heading", "a.html", "<h2>Cleaning the Float <b>Swicth</b></h2>\n<p>The seat is worn.</p>\n",
			[]at{{"Float Swicth", 1, 18, 33}}},
		{"a line in capitals", "a.txt", "The pump ran.\n\nSOLENOID VAVLE REPLACED ON TANK 2\nThe seat was worn.\n",
			[]at{{"SOLENOID VAVLE", 3, 1, 15}}},
		{"a heading and running text", "a.md", "# The Thermistr\n\nRead the thermistr daily.\n",
			[]at{{"Thermistr", 1, 7, 16}, {"thermistr", 3, 10, 19}}},

		{"inside running text", "a.txt", "Ask Thermistr now.\n", nil},
		{"a title-case line that is no heading", "a.txt", "See Flaot Switch.\n", nil},
		{"a name the text writes inside a sentence", "a.txt", "Flaot switches stick. They are sold by Flaot Systems.\n", nil},
		{"a name in a heading", "a.md", "# Visit of the Thermistr Crew\n\nThe Thermistr crew tested the valves.\n", nil},
		{"an acronym in running text", "a.txt", "Wire the FLAOT switch now.\n", nil},
		{"an acronym first in running text", "a.txt", "FLAOT switch inputs are wired.\n", nil},
		{"an acronym in a heading in capitals", "a.md", "# FLAOT SWITCH WIRING\n\nWire the FLAOT switch to terminal 4.\n", nil},
		{"a word alone in capitals", "a.txt", "The pump ran.\n\nTHERMISTR\nThe seat was worn.\n", nil},
		{"capitals in a line with lower case", "a.txt", "The pump ran.\n\nTHERMISTR leads were loose.\n", nil},
		{"capitals in a heading in title case", "a.md", "# Wiring the FLAOT Switch\n\nThe seat is worn.\n", nil},
		{"a known word", "a.md", "# Solenoid Value Readings\n\nThe readings drift.\n", nil},
		{"a plural of a glossary word", "a.txt", "Thermisters stuck in the heat.\n", nil}, // a deprecated term's use: TestCapitalizedPluralsOfTerms
		{"a word of another shape", "a.txt", "ThermIstr leads were loose.\n", nil},
		{"a term itself", "a.txt", "Thermistor leads were loose. Thermister leads too.\n", nil},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			var got []at
			for _, f := range checkText(t, m, tc.file, tc.text) {
				if f.Kind == KindMisspelt {
					got = append(got, at{f.Text, f.Line, f.Column, f.EndColumn})
					require.Contains(t, f.Message, "looks like a misspelling of the term")
				}
			}
			assert.Equal(t, tc.want, got)
		})
	}
}

// A term's plural written with a capital the writing gave it is a use of
// the term, read as the singular of its lower case (-s, -es, -ies for -y)
// where the tagger takes the word for a name and gives it no lemma
// ("Thermisters", PROPN): a deprecated or forbidden term is reported as
// in lower case, an allowed one is fine. Inside running text, or where
// the running text writes the word with its capital elsewhere, the word
// is a name and stays silent. The scenario is an invented maker of solar
// water pumps.
func TestCapitalizedPluralsOfTerms(t *testing.T) {
	g := misspeltGlossary()
	g.Entries = append(g.Entries,
		Entry{ID: "e10", Forms: []Form{{Text: "rotameter", Status: Preferred, POS: "noun"}, {Text: "rotometer", Status: Forbidden, POS: "noun"}}},
		Entry{ID: "e11", Forms: []Form{{Text: "flow cell", Status: Preferred, POS: "noun"}, {Text: "flowbox", Status: Deprecated, POS: "noun"}}},
		Entry{ID: "e12", Forms: []Form{{Text: "drip battery", Status: Preferred, POS: "noun"}, {Text: "dropper battery", Status: Deprecated, POS: "noun"}}})
	m := Compile(g)
	type at struct {
		kind           Kind
		text           string
		line, col, end int // end: the column just past the text in the file
		message        string
	}
	deprecated := func(text, use string, line, col, end int) at {
		return at{KindDeprecated, text, line, col, end, `"` + text + `" is a deprecated term: use "` + use + `"`}
	}
	tests := []struct {
		name, file, text string
		want             []at
	}{
		{"a sentence's first word", "a.txt", "Thermisters stuck in the heat after the update.\nReplace the thermisters every two years.\n",
			[]at{deprecated("Thermisters", "thermistor", 1, 1, 12), deprecated("thermisters", "thermistor", 2, 13, 24)}},
		{"a second sentence's first word", "a.txt", "The pump ran. Thermisters stuck in the heat.\n",
			[]at{deprecated("Thermisters", "thermistor", 1, 15, 26)}},
		{"a plural in -es", "a.txt", "Flowboxes leak at the seal.\n",
			[]at{deprecated("Flowboxes", "flow cell", 1, 1, 10)}},
		{"a forbidden term", "a.txt", "Rotometers drift in the heat.\n",
			[]at{{KindDeprecated, "Rotometers", 1, 1, 11, `"Rotometers" is a forbidden term: use "rotameter"`}}},
		{"a Markdown heading", "a.md", "# Cleaning Flowboxes\n\nThe pump ran.\n",
			[]at{deprecated("Flowboxes", "flow cell", 1, 12, 21)}},
		{"a Markdown heading in capitals", "a.md", "## THERMISTERS AND FLOWBOXES\n\nThe pump ran.\n",
			[]at{deprecated("THERMISTERS", "thermistor", 1, 4, 15), deprecated("FLOWBOXES", "flow cell", 1, 20, 29)}},
		{"a plural in -ies in a heading", "a.md", "# Spare Dropper Batteries\n\nThe pump ran.\n",
			[]at{deprecated("Dropper Batteries", "drip battery", 1, 9, 26)}},
		{"a line in capitals", "a.txt", "The pump ran.\n\nTHERMISTERS REPLACED ON TANK 2\nThe seat was worn.\n",
			[]at{deprecated("THERMISTERS", "thermistor", 3, 1, 12)}},

		{"a preferred term's plural", "a.txt", "Rotameters drift in the heat.\n", nil},
		{"a name inside running text", "a.txt", "We bought it from Rotometers Inc last year.\n", nil},
		{"a name the running text writes elsewhere", "a.txt", "Rotometers drift in the heat. We bought them from Rotometers Inc.\n", nil},
		{"a name in a heading the running text writes", "a.md", "# Visit of the Flowboxes Crew\n\nThe Flowboxes crew tested the pumps.\n", nil},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			var got []at
			for _, f := range checkText(t, m, tc.file, tc.text) {
				got = append(got, at{f.Kind, f.Text, f.Line, f.Column, f.EndColumn, f.Message})
			}
			assert.Equal(t, tc.want, got)
		})
	}
}

// checkText checks text, written to a file named file, against m with its
// misspellings, and returns the findings.
func checkText(t *testing.T, m *Matcher, file, text string) []Finding {
	t.Helper()
	d, src := annotate(t, file, text)
	return Check(d, src, Options{Glossary: m, Misspellings: NewMisspellings(m, tagger)}).Findings
}
