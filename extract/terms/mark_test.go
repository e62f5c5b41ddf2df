package terms

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The term is marked at its first use as a whole word, by any of its
// spellings, in characters (not bytes) of the sentence.
func TestMarkTerm(t *testing.T) {
	term := &Term{Term: "set point", Variants: []Variant{{"setpoints", 2}, {"Set Point", 1}, {"set-point", 1}}}
	for _, c := range []struct {
		text       string
		start, end int
	}{
		{"Raise the set point slowly.", 10, 19},
		{"Two Set Point values: the setpoints differ.", 4, 13},
		{"The reset point is not it; the set-point is.", 31, 40},
		{"Température: the set point.", 17, 26}, // 'é' is one character, two bytes
		{"No such thing here.", -1, -1},
	} {
		s, e := MarkTerm(term, c.text)
		assert.Equal(t, [2]int{c.start, c.end}, [2]int{s, e}, c.text)
		if s >= 0 {
			assert.True(t, strings.EqualFold(string([]rune(c.text)[s:e]), "set point") || strings.EqualFold(string([]rune(c.text)[s:e]), "set-point"))
		}
	}
}

// --contexts is the number of example sentences in every format that
// carries them, and the text format marks the term in bold when asked.
func TestContextsSameInEveryFormat(t *testing.T) {
	term := &Term{Rank: 1, Term: "valve", Variants: []Variant{{"valves", 2}}, Contexts: []Context{
		{Doc: "a.md", Line: 1, Text: "Open the valve."},
		{Doc: "b.md", Line: 2, Text: "Both valves close."},
		{Doc: "c.md", Line: 3, Text: "A valve again."},
	}}
	for _, n := range []int{0, 1, 2} {
		var buf bytes.Buffer
		require.NoError(t, Write(&buf, "jsonl", []*Term{term}, WriteOptions{Contexts: n}))
		var got struct{ Contexts []Context }
		require.NoError(t, json.Unmarshal(buf.Bytes(), &got))
		assert.Len(t, got.Contexts, n, "jsonl, --contexts %d", n)
		buf.Reset()
		require.NoError(t, Write(&buf, "text", []*Term{term}, WriteOptions{Contexts: n}))
		assert.Equal(t, n, strings.Count(buf.String(), ".md:"), "text, --contexts %d", n)
		buf.Reset()
		require.NoError(t, Write(&buf, "tbx-basic", []*Term{term}, WriteOptions{Contexts: n}))
		assert.Equal(t, n, strings.Count(buf.String(), `type="context"`), "tbx-basic, --contexts %d", n)
	}
	var buf bytes.Buffer
	require.NoError(t, Write(&buf, "jsonl", []*Term{term}, WriteOptions{Contexts: 2}))
	assert.Contains(t, buf.String(), `"text":"Both valves close.","start":5,"end":11`)
	buf.Reset()
	require.NoError(t, Write(&buf, "text", []*Term{term}, WriteOptions{Contexts: 1, Highlight: true}))
	assert.Contains(t, buf.String(), "Open the \x1b[1mvalve\x1b[22m.")
	assert.Equal(t, 3, len(term.Contexts), "the writer does not change the terms it writes")
}
