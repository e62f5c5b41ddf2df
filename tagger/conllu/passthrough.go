package conllu

import (
	"bufio"
	"strconv"
	"strings"

	"glossmith/tagger/doc"
)

// passThrough reports whether a document's sentences all carry the lines
// a CoNLL-U input gave them.
func passThrough(d *doc.Document) bool {
	if !d.Pretokenized || len(d.Sentences) == 0 {
		return false
	}
	for i := range d.Sentences {
		if d.Sentences[i].Rows == nil {
			return false
		}
	}
	return true
}

// writeRows writes a sentence read from CoNLL-U as it was given: every
// comment, multiword-token and empty-node row and every column unchanged,
// except that an empty ("_") LEMMA, UPOS or XPOS cell of a word row gets
// the token's annotation, and a sent_id that an earlier sentence of this
// Writer's output already used is prefixed with the document name.
func (w *Writer) writeRows(bw *bufio.Writer, d *doc.Document, s *doc.Sentence) {
	k := 0 // the token of the next word row
	for _, row := range s.Rows {
		if strings.HasPrefix(row, "#") {
			if id, ok := sentID(row); ok {
				bw.WriteString("# sent_id = ")
				bw.WriteString(w.uniqueID(d, id))
				bw.WriteByte('\n')
				continue
			}
			bw.WriteString(row)
			bw.WriteByte('\n')
			continue
		}
		id, rest, _ := strings.Cut(row, "\t")
		if !isWordID(id) || k >= len(s.Tokens) {
			bw.WriteString(row)
			bw.WriteByte('\n')
			continue
		}
		t := &s.Tokens[k]
		k++
		cols := strings.SplitN(rest, "\t", 5) // FORM LEMMA UPOS XPOS rest
		if len(cols) == 5 {
			fill(&cols[1], t.Lemma)
			fill(&cols[2], t.UPOS)
			fill(&cols[3], t.XPOS)
		}
		bw.WriteString(id)
		for _, c := range cols {
			bw.WriteByte('\t')
			bw.WriteString(c)
		}
		bw.WriteByte('\n')
	}
	bw.WriteByte('\n')
}

// fill puts v into an empty cell.
func fill(cell *string, v string) {
	if *cell == "_" && v != "" {
		*cell = strings.Map(func(r rune) rune {
			if r == '\t' || r == '\n' || r == '\r' {
				return ' '
			}
			return r
		}, v)
	}
}

// isWordID reports an integer ID: a word row, not a range or empty node.
func isWordID(id string) bool {
	if id == "" {
		return false
	}
	for i := 0; i < len(id); i++ {
		if id[i] < '0' || id[i] > '9' {
			return false
		}
	}
	return true
}

// sentID returns the id of a "# sent_id = ..." comment.
func sentID(row string) (string, bool) {
	key, val, ok := strings.Cut(strings.TrimSpace(row[1:]), "=")
	if !ok || strings.TrimSpace(key) != "sent_id" {
		return "", false
	}
	return strings.TrimSpace(val), true
}

// uniqueID returns id, or, when this Writer has written it before (another
// input used the same ids), the id prefixed with the document name, then
// numbered if that too was taken.
func (w *Writer) uniqueID(d *doc.Document, id string) string {
	if w.seen == nil {
		w.seen = map[string]bool{}
	}
	out := id
	if w.seen[out] {
		prefix := strings.Join(strings.Fields(d.Name), "_") + "-"
		out = prefix + id
		for n := 2; w.seen[out]; n++ {
			out = prefix + id + "-" + strconv.Itoa(n)
		}
	}
	w.seen[out] = true
	return out
}
