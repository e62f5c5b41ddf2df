package conllu

import (
	"bytes"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/doc"
)

// A heading written as CoNLL-U comes back a heading: the writer adds
// HeadingComment to the heading's sentence only, the reader restores
// Sentence.Heading from it and Document gives the sentence's line of the
// rebuilt text as a heading line; the rest of the round trip is unchanged.
func TestHeadingRoundTrip(t *testing.T) {
	text := "Cleaning the Drip Emitters\n\nFlush them weekly."
	d := &doc.Document{Name: "care.md", Text: text, Headings: []doc.LineRange{{First: 1, Last: 1}}}
	tok := func(form string, line int32, space bool) doc.Token {
		at := int32(strings.Index(text, form))
		require.GreaterOrEqual(t, at, int32(0), form)
		return doc.Token{Form: form, Start: at, End: at + int32(len(form)), Line: line, SpaceAfter: space, Lemma: strings.ToLower(form), UPOS: "X", XPOS: "FW"}
	}
	d.Sentences = []doc.Sentence{
		{Index: 0, NewPar: true, Heading: true, Tokens: []doc.Token{tok("Cleaning", 1, true), tok("the", 1, true), tok("Drip", 1, true), tok("Emitters", 1, true)}},
		{Index: 1, NewPar: true, Tokens: []doc.Token{tok("Flush", 3, true), tok("them", 3, true), tok("weekly", 3, false), tok(".", 3, true)}},
	}
	var buf bytes.Buffer
	w := NewWriter(&buf)
	require.NoError(t, w.WriteDocument(d))
	out := buf.String()
	assert.Equal(t, 1, strings.Count(out, "\n"+HeadingComment+"\n"), "one heading, one comment:\n%s", out)
	assert.Contains(t, out, "# text = Cleaning the Drip Emitters\n"+HeadingComment+"\n1\tCleaning\t")

	sents, err := ReadAllRows(strings.NewReader(out), "care.conllu")
	require.NoError(t, err)
	require.Len(t, sents, 2)
	assert.True(t, sents[0].Heading)
	assert.False(t, sents[1].Heading)
	back := Document("care.conllu", sents)
	assert.Equal(t, "Cleaning the Drip Emitters\n\nFlush them weekly.", back.Text)
	assert.Equal(t, []doc.LineRange{{First: 1, Last: 1}}, back.Headings, "the heading's line of the rebuilt text")
	assert.True(t, back.Sentences[0].Heading)
	assert.False(t, back.Sentences[1].Heading)

	// Read back and written again, the file passes through byte for byte.
	var again bytes.Buffer
	w2 := NewWriter(&again)
	require.NoError(t, w2.WriteDocument(back))
	require.NoError(t, w2.Flush())
	assert.Equal(t, out, again.String())
}

// Only the value "yes" marks a heading: the key in a comment of another
// tool, with other values, leaves the sentence running text.
func TestHeadingCommentValues(t *testing.T) {
	row := "1\tValves\tvalve\tNOUN\tNNS\t_\t_\t_\t_\t_\n\n"
	for _, c := range []struct {
		comment string
		heading bool
	}{
		{"# heading = yes", true},
		{"#heading=yes", true},
		{"# heading = no", false},
		{"# heading = Valves", false},
		{"# heading", false},
		{"# headings = yes", false},
	} {
		sents, err := ReadAll(strings.NewReader(c.comment+"\n"+row), "h.conllu")
		require.NoError(t, err, c.comment)
		require.Len(t, sents, 1)
		assert.Equal(t, c.heading, sents[0].Heading, c.comment)
	}
}
