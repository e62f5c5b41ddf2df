package conllu

import (
	"bufio"
	"io"
	"strconv"
	"strings"

	"glossmith/tagger/doc"
)

// HeadingComment is the sentence-level comment that marks a sentence of a
// heading or caption (doc.Sentence.Heading). UD defines no such comment,
// and CoNLL-U keeps any "# key = value" line, so other tools pass it on;
// the Reader sets Sentence.Heading from it, so tagged output read back
// (to be tagged again, counted or checked) keeps what the markup showed.
const HeadingComment = "# heading = yes"

// Writer writes documents as CoNLL-U. Sentence ids run on across all
// documents written through one Writer, so they stay unique in its output.
type Writer struct {
	w    *bufio.Writer
	next int
	seen map[string]bool // sentence ids written
}

// NewWriter returns a Writer on w. Call Flush when done.
func NewWriter(w io.Writer) *Writer { return &Writer{w: bufio.NewWriter(w), next: 1} }

// Flush writes any buffered data.
func (w *Writer) Flush() error { return w.w.Flush() }

// WriteDocument writes one document. A document read from CoNLL-U goes
// out as it came in: every comment ("# newdoc", "# newpar", "# sent_id",
// "# text", any other), multiword-token and empty-node row and every
// column as given, only the empty ("_") LEMMA, UPOS and XPOS cells filled.
// Other documents get a "# newdoc id" line, then for every
// sentence "# sent_id" (the input's id when it had one), "# text" (the
// sentence as it stands in the document, line breaks folded to spaces),
// HeadingComment for a sentence of a heading or caption, and one row per token with ID, FORM, LEMMA, UPOS, XPOS and MISC filled;
// FEATS, HEAD, DEPREL and DEPS are "_". Tokens marked FusedNext are written
// under a multiword-token range line, as UD does for clitics.
//
// A sentence id already written through this Writer (two inputs numbering
// their sentences alike) is prefixed with the document name, so that ids
// stay unique in the output.
func (w *Writer) WriteDocument(d *doc.Document) error {
	bw := w.w
	if passThrough(d) {
		for i := range d.Sentences {
			w.writeRows(bw, d, &d.Sentences[i])
		}
		return bw.Flush()
	}
	bw.WriteString("# newdoc id = ")
	bw.WriteString(oneLine(d.Name))
	bw.WriteByte('\n')
	for i := range d.Sentences {
		s := &d.Sentences[i]
		if len(s.Tokens) == 0 {
			continue
		}
		if s.NewPar && i > 0 {
			bw.WriteString("# newpar\n")
		}
		bw.WriteString("# sent_id = ")
		id := oneLine(s.ID)
		if id == "" {
			id = strconv.Itoa(w.next)
		}
		bw.WriteString(w.uniqueID(d, id))
		w.next++
		bw.WriteString("\n# text = ")
		bw.WriteString(SentenceText(d, s))
		bw.WriteByte('\n')
		if s.Heading {
			bw.WriteString(HeadingComment)
			bw.WriteByte('\n')
		}
		for j := 0; j < len(s.Tokens); j++ {
			if s.Tokens[j].FusedNext {
				k := j
				for k < len(s.Tokens)-1 && s.Tokens[k].FusedNext {
					k++
				}
				writeRange(bw, d, s, j, k)
			}
			writeToken(bw, d, s, j)
		}
		bw.WriteByte('\n')
	}
	return bw.Flush()
}

func writeRange(bw *bufio.Writer, d *doc.Document, s *doc.Sentence, j, k int) {
	bw.WriteString(strconv.Itoa(j + 1))
	bw.WriteByte('-')
	bw.WriteString(strconv.Itoa(k + 1))
	bw.WriteByte('\t')
	first, last := s.Tokens[j], s.Tokens[k]
	form := ""
	if first.Start >= 0 && int(last.End) <= len(d.Text) && first.Start < last.End {
		form = d.Text[first.Start:last.End]
	} else {
		for _, t := range s.Tokens[j : k+1] {
			form += t.Form
		}
	}
	bw.WriteString(cell(form))
	bw.WriteString("\t_\t_\t_\t_\t_\t_\t_\t")
	bw.WriteString(misc(spaceAfterOf(d, s, k)))
	bw.WriteByte('\n')
}

func writeToken(bw *bufio.Writer, d *doc.Document, s *doc.Sentence, j int) {
	t := &s.Tokens[j]
	bw.WriteString(strconv.Itoa(j + 1))
	bw.WriteByte('\t')
	bw.WriteString(cell(t.Form))
	bw.WriteByte('\t')
	bw.WriteString(cell(t.Lemma))
	bw.WriteByte('\t')
	bw.WriteString(cell(t.UPOS))
	bw.WriteByte('\t')
	bw.WriteString(cell(t.XPOS))
	bw.WriteString("\t_\t_\t_\t_\t")
	inRange := t.FusedNext || (j > 0 && s.Tokens[j-1].FusedNext)
	if inRange {
		bw.WriteString("_") // the range line carries SpaceAfter
	} else {
		bw.WriteString(misc(spaceAfterOf(d, s, j)))
	}
	bw.WriteByte('\n')
}

// spaceAfterOf tells whether white space follows token j. Inside a sentence
// the token's flag says it; after the last token the document text decides,
// so that a sentence ending flush against the next one ("valve.Then")
// still records SpaceAfter=No, as UD does.
func spaceAfterOf(d *doc.Document, s *doc.Sentence, j int) bool {
	t := &s.Tokens[j]
	if j < len(s.Tokens)-1 || d.Pretokenized {
		return t.SpaceAfter
	}
	if int(t.End) >= len(d.Text) {
		return true
	}
	return t.SpaceAfter
}

func misc(space bool) string {
	if space {
		return "_"
	}
	return "SpaceAfter=No"
}

// cell makes a value safe for a CoNLL-U column: empty becomes "_", tabs and
// line breaks become spaces.
func cell(s string) string {
	if s == "" {
		return "_"
	}
	if strings.ContainsAny(s, "\t\n\r") {
		s = strings.NewReplacer("\t", " ", "\n", " ", "\r", " ").Replace(s)
	}
	return s
}

func oneLine(s string) string {
	return strings.Join(strings.Fields(s), " ")
}

// SentenceText returns the sentence as it stands in the document text, with
// runs of white space (line breaks of wrapped text) folded to one space.
// When the offsets do not point into the text, it rebuilds the sentence from
// the forms and SpaceAfter flags.
func SentenceText(d *doc.Document, s *doc.Sentence) string {
	start, end := s.Start(), s.End()
	if start >= 0 && end <= len(d.Text) && start <= end && d.Text != "" {
		return oneLine(d.Text[start:end])
	}
	var b strings.Builder
	for i, t := range s.Tokens {
		b.WriteString(t.Form)
		if t.SpaceAfter && i < len(s.Tokens)-1 {
			b.WriteByte(' ')
		}
	}
	return b.String()
}
