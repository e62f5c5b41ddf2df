package emit

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/conllu"
	"glossmith/tagger/doc"
)

// headingDoc is a tagged document of a heading and a sentence of running
// text.
func headingDoc() *doc.Document {
	text := "Draining the Tank\nOpen the drain valve."
	d := &doc.Document{Name: "tank.md", Text: text}
	words := [][]string{{"Draining", "VERB", "VBG"}, {"the", "DET", "DT"}, {"Tank", "NOUN", "NN"},
		{"Open", "VERB", "VB"}, {"the", "DET", "DT"}, {"drain", "NOUN", "NN"}, {"valve", "NOUN", "NN"}, {".", "PUNCT", "."}}
	var toks []doc.Token
	at := 0
	for _, w := range words {
		at += strings.Index(text[at:], w[0])
		toks = append(toks, doc.Token{Form: w[0], Start: int32(at), End: int32(at + len(w[0])), Line: int32(1 + strings.Count(text[:at], "\n")),
			SpaceAfter: at+len(w[0]) < len(text) && text[at+len(w[0])] == ' ', Lemma: strings.ToLower(w[0]), UPOS: w[1], XPOS: w[2]})
		at += len(w[0])
	}
	d.Sentences = []doc.Sentence{{Index: 0, NewPar: true, Heading: true, Tokens: toks[:3]}, {Index: 1, NewPar: true, Tokens: toks[3:]}}
	return d
}

func write(t *testing.T, format string) string {
	t.Helper()
	var buf bytes.Buffer
	w, err := New(format, &buf, Options{})
	require.NoError(t, err)
	require.NoError(t, w.Write(headingDoc()))
	require.NoError(t, w.Flush())
	return buf.String()
}

// Every format tells a heading's sentence from running text.
func TestEveryFormatMarksHeadings(t *testing.T) {
	t.Run("conllu", func(t *testing.T) {
		out := write(t, "conllu")
		assert.Equal(t, 1, strings.Count(out, conllu.HeadingComment+"\n"))
		assert.Contains(t, out, "# text = Draining the Tank\n"+conllu.HeadingComment+"\n")
	})
	t.Run("tsv", func(t *testing.T) {
		cr := csv.NewReader(strings.NewReader(write(t, "tsv")))
		cr.Comma = '\t'
		rows, err := cr.ReadAll()
		require.NoError(t, err)
		require.Len(t, rows, 9, "a header and eight tokens")
		col := len(rows[0]) - 1
		require.Equal(t, "heading", rows[0][col])
		var got []string
		for _, r := range rows[1:] {
			got = append(got, r[1]+":"+r[col])
		}
		assert.Equal(t, []string{"1:true", "1:true", "1:true", "2:false", "2:false", "2:false", "2:false", "2:false"}, got)
	})
	t.Run("jsonl", func(t *testing.T) {
		lines := strings.Split(strings.TrimSpace(write(t, "jsonl")), "\n")
		require.Len(t, lines, 2)
		for i, want := range []bool{true, false} {
			var s map[string]any
			require.NoError(t, json.Unmarshal([]byte(lines[i]), &s))
			assert.Equal(t, want, s["heading"], "sentence %d: %s", i+1, lines[i])
		}
	})
	t.Run("text", func(t *testing.T) {
		assert.Equal(t, "# Draining/VBG the/DT Tank/NN\nOpen/VB the/DT drain/NN valve/NN ./.\n", write(t, "text"))
	})
}
