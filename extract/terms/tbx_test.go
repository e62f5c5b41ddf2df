package terms

import (
	"bytes"
	"strings"
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

// An acronym and its full form are one entry, the full form's, with the
// terms typed as TBX-Basic allows (fullForm, acronym); an acronym whose full
// form is not listed still names it as the entry's full form.
func TestWriteTBXAcronyms(t *testing.T) {
	vpd := &Term{Rank: 1, Term: "VPD", POS: "PROPN", FullForm: "vapour pressure deficit", Freq: 23, Docs: 7,
		Contexts: []Context{{Doc: "manual.md", Line: 9, Text: "Keep the VPD low."}}}
	full := &Term{Rank: 2, Term: "vapour pressure deficit", POS: "NOUN NOUN NOUN", Acronym: "VPD", Freq: 32, Docs: 7}
	ec := &Term{Rank: 3, Term: "EC", POS: "PROPN", FullForm: "electrical conductivity"}
	var buf bytes.Buffer
	require.NoError(t, Write(&buf, "tbx-basic", []*Term{vpd, full, ec}, WriteOptions{Contexts: 3}))
	doc, err := tbx.Read(&buf, "out.tbx")
	require.NoError(t, err)
	require.Len(t, doc.Entries, 2)
	e := doc.Entries[0]
	assert.Equal(t, tbx.StableID("vapour pressure deficit"), e.ID)
	require.Len(t, e.Terms, 2)
	assert.Equal(t, "vapour pressure deficit", e.Terms[0].Text)
	assert.Equal(t, "fullForm", e.Terms[0].Type)
	assert.Equal(t, "VPD", e.Terms[1].Text)
	assert.Equal(t, "acronym", e.Terms[1].Type)
	assert.Equal(t, []tbx.Context{{Text: "Keep the VPD low.", Source: "manual.md, line 9"}}, e.Terms[1].Contexts)
	e = doc.Entries[1]
	assert.Equal(t, tbx.StableID("electrical conductivity"), e.ID)
	require.Len(t, e.Terms, 2)
	assert.Equal(t, []string{"electrical conductivity", "EC"}, []string{e.Terms[0].Text, e.Terms[1].Text})
	assert.Equal(t, []string{"fullForm", "acronym"}, []string{e.Terms[0].Type, e.Terms[1].Type})
}

// The longer candidate a term mostly occurs in is a cross-reference to its
// entry when it is listed, a note either way.
func TestWriteTBXWithin(t *testing.T) {
	drip := &Term{Rank: 1, Term: "drip", Within: "drip emitter"}
	emitter := &Term{Rank: 2, Term: "emitter", Within: "rotary emitter"}
	de := &Term{Rank: 3, Term: "drip emitter"}
	var buf bytes.Buffer
	require.NoError(t, Write(&buf, "tbx-basic", []*Term{drip, emitter, de}, WriteOptions{}))
	doc, err := tbx.Read(&buf, "out.tbx")
	require.NoError(t, err)
	require.Len(t, doc.Entries, 3)
	assert.Equal(t, []tbx.CrossRef{{Target: tbx.StableID("drip emitter"), Text: "drip emitter"}}, doc.Entries[0].CrossRefs)
	assert.Equal(t, doc.Entries[2].ID, doc.Entries[0].CrossRefs[0].Target)
	assert.Empty(t, doc.Entries[1].CrossRefs, "rotary emitter is not listed")
	assert.Contains(t, strings.Join(doc.Entries[1].Notes, "\n"), "rotary emitter")
}
