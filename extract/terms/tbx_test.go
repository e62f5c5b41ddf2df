package terms

import (
	"bytes"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/extract/tbx"
)

func TestSpellingVariants(t *testing.T) {
	term := &Term{Term: "set point", Variants: []Variant{
		{"set point", 40}, {"set points", 10}, {"Set points", 3}, {"set-point", 3}, {"Set-Point", 1},
		{"setpoint", 3}, {"Setpoints", 1}, {"Set point", 2},
	}}
	assert.Equal(t, []Variant{{"set-point", 4}, {"setpoint", 3}}, SpellingVariants(term),
		"hyphen and closed spellings are variants; plurals and capitals are not")
	assert.Empty(t, SpellingVariants(&Term{Term: "valve", Variants: []Variant{{"valves", 9}, {"Valve", 2}}}))
}

// Candidates become TBX entries whose ids follow the canonical form, not
// the rank, and whose terms are the canonical form and its spellings.
func TestWriteTBXEntries(t *testing.T) {
	a := &Term{Rank: 1, Term: "solenoid valve", POS: "NOUN NOUN", Variants: []Variant{{"solenoid valves", 5}, {"solenoid-valve", 1}},
		Contexts: []Context{{Doc: "manual.md", Line: 3, Text: "Close the solenoid valve."}}}
	b := &Term{Rank: 2, Term: "emitter", POS: "NOUN", Variants: []Variant{{"emitters", 4}}}
	read := func(ts ...*Term) *tbx.Document {
		var buf bytes.Buffer
		require.NoError(t, Write(&buf, "tbx-basic", ts, WriteOptions{Lang: "en-GB", Contexts: 3}))
		doc, err := tbx.Read(&buf, "out.tbx")
		require.NoError(t, err)
		return doc
	}
	doc := read(a, b)
	assert.Equal(t, "TBX-Basic", doc.Dialect)
	assert.Equal(t, "en-GB", doc.Lang)
	require.Len(t, doc.Entries, 2)
	e := doc.Entries[0]
	require.Len(t, e.Terms, 2)
	assert.Equal(t, "solenoid valve", e.Terms[0].Text)
	assert.Equal(t, "noun", e.Terms[0].POS)
	assert.Equal(t, "en-GB", e.Terms[0].Lang)
	assert.Equal(t, []tbx.Context{{Text: "Close the solenoid valve.", Source: "manual.md, line 3"}}, e.Terms[0].Contexts)
	assert.Equal(t, "solenoid-valve", e.Terms[1].Text)
	assert.Equal(t, "noun", e.Terms[1].POS)
	// Ranked the other way round, the ids stay with their terms.
	a.Rank, b.Rank = 2, 1
	again := read(b, a)
	assert.Equal(t, doc.Entries[0].ID, again.Entries[1].ID)
	assert.Equal(t, doc.Entries[1].ID, again.Entries[0].ID)
	// An empty list is a valid file with no entries.
	assert.Empty(t, read().Entries)
}
