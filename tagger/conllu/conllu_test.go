package conllu

import (
	"errors"
	"io"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// row builds one CoNLL-U token line from its ten columns.
func row(cols ...string) string { return strings.Join(cols, "\t") + "\n" }

// Malformed lines are reported with the file name and the line number, in
// the file:line form of Go's own tools, and reading goes on with the next
// sentence.
func TestMalformedLinesNameFileAndLine(t *testing.T) {
	good := row("1", "Valves", "valve", "NOUN", "NNS", "_", "0", "root", "_", "_") + "\n"
	cases := []struct {
		name, input string
		line        int
		want        string
	}{
		{"too few columns", "# sent_id = a\n" + row("1", "Valve", "valve", "NOUN", "NN") + "\n", 2, "columns"},
		{"too many columns", row("1", "Valve", "valve", "NOUN", "NN", "_", "0", "root", "_", "_", "extra") + "\n", 1, "columns"},
		{"bad ID", "# text = x\n# sent_id = b\n" + row("one", "Valve", "valve", "NOUN", "NN", "_", "0", "root", "_", "_") + "\n", 3, "bad ID"},
		{"zero ID", row("0", "Valve", "valve", "NOUN", "NN", "_", "0", "root", "_", "_") + "\n", 1, "bad ID"},
		{"ID out of sequence", row("1", "The", "the", "DET", "DT", "_", "2", "det", "_", "_") +
			row("3", "valve", "valve", "NOUN", "NN", "_", "0", "root", "_", "_") + "\n", 2, "out of sequence"},
		{"bad range", row("2-1", "don't", "_", "_", "_", "_", "_", "_", "_", "_") + "\n", 1, "range"},
	}
	for _, c := range cases {
		r := NewReader(strings.NewReader(c.input+good), "manual.conllu")
		var got []*Sentence
		for {
			s, err := r.Next()
			if errors.Is(err, io.EOF) {
				break
			}
			require.NoError(t, err, c.name)
			got = append(got, s)
		}
		errs := r.Errors()
		if !assert.Len(t, errs, 1, c.name) {
			continue
		}
		e := errs[0]
		assert.Equal(t, "manual.conllu", e.File, c.name)
		assert.Equal(t, c.line, e.Line, c.name)
		assert.Contains(t, e.Msg, c.want, c.name)
		assert.True(t, strings.HasPrefix(e.Error(), "manual.conllu:"), "%s: %q does not start with file:line", c.name, e.Error())
		// The good sentence after the bad one is still read.
		if assert.Len(t, got, 1, c.name) {
			assert.Equal(t, "Valves", got[0].Tokens[0].Form, c.name)
		}
	}
}

func TestReadAllReturnsErrorList(t *testing.T) {
	in := row("1", "Valve", "valve", "NOUN") + "\n" + row("1", "Valves", "valve", "NOUN", "NNS", "_", "0", "root", "_", "_")
	sents, err := ReadAll(strings.NewReader(in), "x.conllu")
	var list ErrorList
	require.ErrorAs(t, err, &list)
	require.Len(t, list, 1)
	assert.Equal(t, 1, list[0].Line)
	require.Len(t, sents, 1)
	assert.Equal(t, "NOUN", sents[0].Tokens[0].UPOS)
	assert.Equal(t, "NNS", sents[0].Tokens[0].XPOS)
}
