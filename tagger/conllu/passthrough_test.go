package conllu

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/internal/testenv"
	"glossmith/tagger/doc"
)

// writeBack reads CoNLL-U keeping its rows and writes it again.
func writeBack(t *testing.T, w *Writer, name, src string, annotate func(*doc.Document)) {
	t.Helper()
	sents, err := ReadAllRows(strings.NewReader(src), name)
	require.NoError(t, err)
	d := Document(name, sents)
	if annotate != nil {
		annotate(d)
	}
	require.NoError(t, w.WriteDocument(d))
}

// The UD English EWT test file (UD 2.15), fully annotated, with multiword
// tokens, empty nodes, newdoc and newpar comments, comes back byte for
// byte.
func TestPassThroughEWT(t *testing.T) {
	p := filepath.Join(testenv.SharedDir(t, "data/ud-en-ewt"), "en_ewt-ud-test.conllu")
	src, err := os.ReadFile(p)
	require.NoError(t, err)
	var out bytes.Buffer
	w := NewWriter(&out)
	writeBack(t, w, "en_ewt-ud-test.conllu", string(src), nil)
	require.NoError(t, w.Flush())
	assert.True(t, bytes.Equal(src, out.Bytes()), "the output differs from the input")
}

// Only empty LEMMA, UPOS and XPOS cells of word rows are filled; every
// other cell, comment and row stays; a second input numbering its
// sentences alike gets its ids prefixed with its name.
func TestPassThroughFillsEmptyCells(t *testing.T) {
	src := "# newdoc id = a\n# sent_id = 1\n# text = Don't open it.\n# custom = kept\n" +
		"1-2\tDon't\t_\t_\t_\t_\t_\t_\t_\t_\n" +
		"1\tDo\tdo\t_\tVBP\tMood=Ind\t3\taux\t3:aux\t_\n" +
		"2\tn't\t_\tPART\t_\t_\t3\tadvmod\t3:advmod\t_\n" +
		"3\topen\t_\t_\t_\t_\t0\troot\t0:root\t_\n" +
		"3.1\tit\t_\t_\t_\t_\t_\t_\t3:obj\t_\n" +
		"4\tit\t_\t_\t_\t_\t3\tobj\t3:obj\tSpaceAfter=No\n" +
		"5\t.\t_\t_\t_\t_\t3\tpunct\t3:punct\t_\n\n" +
		"# newpar\n# sent_id = 2\n1\tClose\t_\t_\t_\t_\t0\troot\t0:root\t_\n\n"
	tag := func(d *doc.Document) {
		for i := range d.Sentences {
			for j := range d.Sentences[i].Tokens {
				tk := &d.Sentences[i].Tokens[j]
				tk.Lemma, tk.UPOS, tk.XPOS = "L"+tk.Form, "U", "X"
			}
		}
	}
	var out bytes.Buffer
	w := NewWriter(&out)
	writeBack(t, w, "a.conllu", src, tag)
	writeBack(t, w, "b.conllu", src, tag)
	require.NoError(t, w.Flush())
	want := "# newdoc id = a\n# sent_id = 1\n# text = Don't open it.\n# custom = kept\n" +
		"1-2\tDon't\t_\t_\t_\t_\t_\t_\t_\t_\n" +
		"1\tDo\tdo\tU\tVBP\tMood=Ind\t3\taux\t3:aux\t_\n" +
		"2\tn't\tLn't\tPART\tX\t_\t3\tadvmod\t3:advmod\t_\n" +
		"3\topen\tLopen\tU\tX\t_\t0\troot\t0:root\t_\n" +
		"3.1\tit\t_\t_\t_\t_\t_\t_\t3:obj\t_\n" +
		"4\tit\tLit\tU\tX\t_\t3\tobj\t3:obj\tSpaceAfter=No\n" +
		"5\t.\tL.\tU\tX\t_\t3\tpunct\t3:punct\t_\n\n" +
		"# newpar\n# sent_id = 2\n1\tClose\tLClose\tU\tX\t_\t0\troot\t0:root\t_\n\n"
	second := strings.Replace(strings.Replace(want, "# sent_id = 1", "# sent_id = b.conllu-1", 1), "# sent_id = 2", "# sent_id = b.conllu-2", 1)
	assert.Equal(t, want+second, out.String())
}
