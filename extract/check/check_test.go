package check

import (
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"unicode/utf8"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
	"glossmith/tagger/pipeline"
	"glossmith/tagger/read"
)

var (
	taggerOnce sync.Once
	tagger     *hmm.Model
	taggerErr  error
)

// annotate writes text to a file named name in a temporary directory and
// reads, tokenizes and tags it as the command does; it returns the
// document and the file's bytes.
func annotate(t *testing.T, name, text string) (*doc.Document, []byte) {
	t.Helper()
	taggerOnce.Do(func() { tagger, taggerErr = hmm.Default() })
	require.NoError(t, taggerErr)
	path := filepath.Join(t.TempDir(), name)
	require.NoError(t, os.WriteFile(path, []byte(text), 0o644))
	d, probs := pipeline.Annotate(read.Input{Name: name, Path: path}, read.Options{}, tagger)
	for _, p := range probs {
		require.NotEqual(t, read.Error, p.Severity, p.Error())
	}
	require.NotNil(t, d)
	return d, []byte(text)
}

// pumpGlossary is a small glossary of an invented maker of solar water
// pumps.
func pumpGlossary() Glossary {
	return Glossary{Entries: []Entry{
		{ID: "e1", Forms: []Form{{Text: "set point", Status: Preferred, POS: "noun"}, {Text: "set-point", Status: Admitted, POS: "noun"}}},
		{ID: "e2", Forms: []Form{{Text: "solenoid valve", Status: Preferred, POS: "noun"}, {Text: "magnet valve", Status: Deprecated, POS: "noun"}}},
		{ID: "e3", Forms: []Form{{Text: "PLC", Status: Preferred, POS: "noun", CaseSensitive: true}}},
		{ID: "e4", Forms: []Form{{Text: "dry-run protection", Status: Preferred}, {Text: "dry running guard", Status: Forbidden}}},
		{ID: "e5", Forms: []Form{{Text: "flow rate", Status: Preferred, POS: "noun"}}},
		{ID: "e6", Forms: []Form{{Text: "power-up", Status: Preferred, POS: "noun"}}},
		{ID: "e7", Forms: []Form{{Text: "bill of materials", Status: Preferred, POS: "noun"}}},
		{ID: "e8", Forms: []Form{{Text: "heat seal", Status: Preferred, POS: "noun"}, {Text: "hot seal", Status: Deprecated}}},
	}}
}

func TestClassify(t *testing.T) {
	m := Compile(pumpGlossary())
	tests := []struct {
		text      string
		found     string // "" when nothing is to be found
		kind      Kind
		preferred string
		entry     string
	}{
		{"Adjust the set point slowly.", "", 0, "", ""},
		{"Adjust the set points slowly.", "", 0, "", ""},
		{"Adjust the set-point slowly.", "", 0, "", ""},
		{"Adjust the setpoint slowly.", "setpoint", KindSpelling, "set point", "e1"},
		{"Adjust the setpoints slowly.", "setpoints", KindSpelling, "set point", "e1"},
		{"Open the magnet valve first.", "magnet valve", KindDeprecated, "solenoid valve", "e2"},
		{"Open both magnet valves first.", "magnet valves", KindDeprecated, "solenoid valve", "e2"},
		{"Open both magnet-valves first.", "magnet-valves", KindDeprecated, "solenoid valve", "e2"},
		{"Open the solenoid valves first.", "", 0, "", ""},
		{"Restart the plc now.", "plc", KindSpelling, "PLC", "e3"},
		{"Restart the PLCs now.", "", 0, "", ""},
		{"The dry running guard trips.", "dry running guard", KindDeprecated, "dry-run protection", "e4"},
		{"The dry run protection trips.", "dry run protection", KindSpelling, "dry-run protection", "e4"},
		{"Read the flowrate here.", "flowrate", KindSpelling, "flow rate", "e5"},
		// A dash whose lemma is "-" is no hyphen inside a term.
		{"Fault 3 – Solenoid valve sticks.", "", 0, "", ""},
		// A wrong lemma of a word before the head ("solenoid" taken for a
		// verb) does not make a spelling.
		{"It opens the fogging and solenoid valves accordingly.", "", 0, "", ""},
		// A verb is no use of a noun term.
		{"Before you power up the pump, read this.", "", 0, "", ""},
		{"Wait for the power up of the pump.", "power up", KindSpelling, "power-up", "e6"},
		// A word the form itself inflects stays inflected while another
		// is: a use of the term, not another spelling of it.
		{"Both bills of materials list the pump.", "", 0, "", ""},
		{"The bill of materials lists the pump.", "", 0, "", ""},
		{"Both bills-of-materials list the pump.", "bills-of-materials", KindSpelling, "bill of materials", "e7"},
		// A verb's past or participle read through its lemma is the verb,
		// not the noun term ("heat-sealed" is no spelling of the noun "heat
		// seal"); the noun's own inflections still are the term.
		{"The pouches are heat-sealed at the top.", "", 0, "", ""},
		{"The pouches are heatsealed at the top.", "", 0, "", ""},
		{"The pouches were hot sealed by hand.", "", 0, "", ""},
		{"The pouches were hot-sealed by hand.", "", 0, "", ""},
		{"Check each heat seal for leaks.", "", 0, "", ""},
		{"Two heat seals failed.", "", 0, "", ""},
		{"Two hot seals failed.", "hot seals", KindDeprecated, "heat seal", "e8"},
		{"Check the hot seal first.", "hot seal", KindDeprecated, "heat seal", "e8"},
		{"Check the heatseal first.", "heatseal", KindSpelling, "heat seal", "e8"},
	}
	for _, tc := range tests {
		t.Run(tc.text, func(t *testing.T) {
			d, src := annotate(t, "a.txt", tc.text+"\n")
			res := Check(d, src, Options{Glossary: m})
			if tc.found == "" {
				assert.Empty(t, res.Findings)
				return
			}
			require.Len(t, res.Findings, 1)
			f := res.Findings[0]
			assert.Equal(t, tc.found, f.Text)
			assert.Equal(t, tc.kind, f.Kind)
			assert.Equal(t, tc.preferred, f.Preferred)
			assert.Equal(t, tc.entry, f.Entry)
		})
	}
}

func TestInAddress(t *testing.T) {
	tests := []struct {
		text, word string
		want       bool
	}{
		{"see https://example.com/setpoint now", "setpoint", true},
		{"see www.example.com/setpoint.", "setpoint", true},
		{"mail setpoint@example.com today", "setpoint", true},
		{"edit /etc/sp40/setpoint.conf first", "setpoint", true},
		{"edit (docs/pumps/setpoint) first", "setpoint", true},
		{`open C:\SP40\setpoint now`, "setpoint", true},
		{"open setpoint.yaml now", "setpoint", true},
		{"the setpoint/flow rate pair", "setpoint", false},
		{"the setpoint, then", "setpoint", false},
		{"and/or the setpoint.", "setpoint", false},
	}
	for _, tc := range tests {
		i := strings.Index(tc.text, tc.word)
		assert.Equal(t, tc.want, inAddress(tc.text, i, i+len(tc.word)), tc.text)
	}
}

// The Markdown reader deletes markup within a line; each word's position
// must be that of the source characters it came from.
func TestMarkdownColumnsAreTheSources(t *testing.T) {
	tests := []struct{ src, word string }{
		{"Check the **setpoint** now.", "setpoint"},
		{"See [the magnet valve](https://x.example/magnet-valve) here.", "magnet valve"},
		{"Both valves &amp; the _drive box_ go.", "drive box"},
		{"<span title=\"drive box\">A drive box</span>", "drive box"},
		{"1. Connect the level float.", "level float"},
		{"A \\*starred\\* and *em*phasized `drive box`.", "drive box"},
	}
	for _, tc := range tests {
		d, _ := annotate(t, "a.md", tc.src)
		at := strings.Index(d.Text, tc.word)
		require.GreaterOrEqual(t, at, 0, tc.src)
		line, col, ok := d.SourcePosition(at, false)
		require.True(t, ok, tc.src)
		_, endCol, _ := d.SourcePosition(at+len(tc.word), true)
		si := strings.LastIndex(tc.src, tc.word)
		assert.Equal(t, [3]int{1, utf8.RuneCountInString(tc.src[:si]) + 1, utf8.RuneCountInString(tc.src[:si+len(tc.word)]) + 1}, [3]int{line, col, endCol}, tc.src)
	}
}

func TestCodeSpans(t *testing.T) {
	line := []rune("Run `setpoint` or ``a ` b`` and <code>x</code>, not `open")
	var got []string
	for _, c := range codeSpans(line) {
		got = append(got, string(line[c[0]:c[1]]))
	}
	assert.Equal(t, []string{"setpoint", "a ` b", "x"}, got)
}
