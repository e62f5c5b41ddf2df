// Package concord builds concordance lines — a match in the middle, its
// left and right context around it — and frequency lists of matched text.
package concord

import (
	"bufio"
	"fmt"
	"io"
	"sort"
	"strconv"
	"strings"
	"unicode/utf8"

	"glossmith/extract/wordshape"
	"glossmith/internal/printable"
	"glossmith/internal/tabular"
	"glossmith/tagger/doc"
)

// Hit is one match in its sentence.
type Hit struct {
	Doc      string            `json:"doc"`
	Sentence int               `json:"sentence"` // counted from 1 within the document
	Line     int               `json:"line"`
	Start    int               `json:"start"` // token index in the sentence, from 0
	End      int               `json:"end"`   // exclusive
	Text     string            `json:"text"`
	Rule     string            `json:"rule"`
	Slots    map[string]string `json:"slots,omitempty"`
	Left     string            `json:"left"`  // context before, ending in a space when the text has one
	Right    string            `json:"right"` // context after, starting with a space when the text has one
}

// NewHit describes the match [start, end) of sentence si of d. Text and
// contexts are quoted from the document text, white space folded.
func NewHit(d *doc.Document, si, start, end int, rule string, slots map[string][2]int) Hit {
	s := &d.Sentences[si]
	toks := s.Tokens
	h := Hit{Doc: d.Name, Sentence: si + 1, Line: int(toks[start].Line), Start: start, End: end, Rule: rule}
	h.Text = span(d, toks, start, end)
	h.Left = span(d, toks, 0, start)
	h.Right = span(d, toks, end, len(toks))
	// Keep the spacing at the edges of the match as it is in the text, so
	// that "[technical room]." is not printed as "[technical room] .".
	if start > 0 && toks[start-1].SpaceAfter {
		h.Left += " "
	}
	if end < len(toks) && toks[end-1].SpaceAfter {
		h.Right = " " + h.Right
	}
	if len(slots) > 0 {
		h.Slots = make(map[string]string, len(slots))
		for k, v := range slots {
			if v[0] < v[1] && v[1] <= len(toks) {
				h.Slots[k] = span(d, toks, v[0], v[1])
			}
		}
	}
	return h
}

// span returns the text of tokens [a, b), white space folded to single
// spaces; empty when a >= b.
func span(d *doc.Document, toks []doc.Token, a, b int) string {
	if a >= b {
		return ""
	}
	x, y := int(toks[a].Start), int(toks[b-1].End)
	if x >= 0 && y <= len(d.Text) && x < y {
		return strings.Join(strings.Fields(d.Text[x:y]), " ")
	}
	var sb strings.Builder
	for i := a; i < b; i++ {
		sb.WriteString(toks[i].Form)
		if i < b-1 && toks[i].SpaceAfter {
			sb.WriteByte(' ')
		}
	}
	return sb.String()
}

// Style tells the text writer how to print.
type Style struct {
	Width     int  // terminal columns of context on each side (default 40)
	Highlight bool // mark the match with terminal colours
	BOM       bool // csv: start with a UTF-8 byte order mark, for spreadsheet programs
}

// HitFormats are the formats a HitWriter writes.
var HitFormats = []string{"text", "tsv", "csv", "jsonl"}

// HitWriter writes concordance lines as they are found, a batch (one
// document's hits) at a time, so that a long search shows its first lines
// at once and holds no more than one document's hits.
type HitWriter struct {
	format string
	style  Style
	text   *bufio.Writer
	table  *tabular.Writer
	jsonl  *tabular.JSONL
}

// NewHitWriter returns a writer of hits in format (one of HitFormats):
//
//   - text: concordance lines — the document and line, the left context
//     right-aligned, the match, the right context — with control
//     characters escaped (package printable) so that neither a document
//     nor a file name can drive the terminal or break a line in two; the
//     location column is aligned within each batch;
//   - tsv, csv: a header row, then doc, sentence, line, start, end, rule,
//     left, match, right (quoted as package tabular documents);
//   - jsonl: one object per hit with the same fields (match as "text").
func NewHitWriter(w io.Writer, format string, st Style) (*HitWriter, error) {
	if st.Width <= 0 {
		st.Width = 40
	}
	h := &HitWriter{format: format, style: st}
	switch format {
	case "text":
		h.text = bufio.NewWriter(w)
	case "tsv", "csv":
		if format == "tsv" {
			h.table = tabular.NewTSV(w)
		} else {
			h.table = tabular.NewCSV(w, st.BOM)
		}
		h.table.Write("doc", "sentence", "line", "start", "end", "rule", "left", "match", "right")
	case "jsonl":
		h.jsonl = tabular.NewJSONL(w)
	default:
		return nil, fmt.Errorf("unknown output format %q (want one of %s)", format, strings.Join(HitFormats, ", "))
	}
	return h, nil
}

// Write writes a batch of hits (buffered; see Flush).
func (h *HitWriter) Write(hits []Hit) error {
	switch {
	case h.text != nil:
		return h.writeText(hits)
	case h.table != nil:
		for _, x := range hits {
			h.table.Write(x.Doc, strconv.Itoa(x.Sentence), strconv.Itoa(x.Line), strconv.Itoa(x.Start), strconv.Itoa(x.End),
				x.Rule, strings.TrimSpace(x.Left), x.Text, strings.TrimSpace(x.Right))
		}
		return nil
	}
	for _, x := range hits {
		if err := h.jsonl.Encode(x); err != nil {
			return err
		}
	}
	return nil
}

// writeText prints hits as aligned concordance lines.
func (h *HitWriter) writeText(hits []Hit) error {
	locs := make([]string, len(hits))
	where := 0
	for i, x := range hits {
		locs[i] = printable.Escape(fmt.Sprintf("%s:%d", x.Doc, x.Line))
		where = max(where, tabular.Width(locs[i]))
	}
	w := h.style.Width
	for i, x := range hits {
		left := lastColumns(printable.Escape(x.Left), w)
		right := firstColumns(printable.Escape(x.Right), w)
		match := printable.Escape(x.Text)
		if h.style.Highlight {
			match = "\x1b[1;33m" + match + "\x1b[0m"
		} else {
			match = "[" + match + "]"
		}
		// Padded by hand: fmt pads to a count of characters, not columns.
		fmt.Fprintf(h.text, "%s%s  %s%s%s%s\n", locs[i], pad(where-tabular.Width(locs[i])),
			pad(w-tabular.Width(left)), left, match, right)
	}
	return nil
}

// Flush writes out what is buffered and reports the first error of any
// write so far.
func (h *HitWriter) Flush() error {
	switch {
	case h.text != nil:
		return h.text.Flush()
	case h.table != nil:
		return h.table.Flush()
	}
	return h.jsonl.Flush()
}

// lastColumns keeps the last n terminal columns of s (tabular.Width),
// marking a cut with "…"; a wide character is never split.
func lastColumns(s string, n int) string {
	s = strings.TrimLeft(s, " ")
	if tabular.Width(s) <= n {
		return s
	}
	used, cut := 1, len(s) // "…" takes one column
	for cut > 0 {
		_, size := utf8.DecodeLastRuneInString(s[:cut])
		w := tabular.Width(s[cut-size : cut])
		if used+w > n {
			break
		}
		used += w
		cut -= size
	}
	return "…" + s[cut:]
}

// pad is n spaces (none for n <= 0).
func pad(n int) string { return strings.Repeat(" ", max(n, 0)) }

// firstColumns keeps the first n terminal columns of s, marking a cut
// with "…".
func firstColumns(s string, n int) string {
	if tabular.Width(s) <= n {
		return s
	}
	used, cut := 1, 0
	for cut < len(s) {
		_, size := utf8.DecodeRuneInString(s[cut:])
		w := tabular.Width(s[cut : cut+size])
		if used+w > n {
			break
		}
		used += w
		cut += size
	}
	return s[:cut] + "…"
}

// Counter is a frequency list of matched strings.
type Counter struct {
	counts map[string]int
	total  int
}

// NewCounter returns an empty frequency list.
func NewCounter() *Counter { return &Counter{counts: map[string]int{}} }

// Add counts one matched string.
func (c *Counter) Add(s string) { c.counts[s]++; c.total++ }

// Merge adds o's counts.
func (c *Counter) Merge(o *Counter) {
	for k, v := range o.counts {
		c.counts[k] += v
	}
	c.total += o.total
}

// Entry is one line of a frequency list.
type Entry struct {
	Text  string `json:"text"`
	Count int    `json:"count"`
}

// Sorted returns the list, most frequent first, ties in byte order.
// Strings that differ only in case are one line: written in lower case
// when that spelling was counted, else in their most frequent spelling
// (ties: the byte-wise smallest). Deciding here, on the merged counts,
// makes the list the same however the input was split among workers.
func (c *Counter) Sorted() []Entry {
	type line struct {
		text      string
		n, textN  int
		lowerSeen bool
	}
	lines := map[string]*line{}
	for k, v := range c.counts {
		low := strings.ToLower(k)
		l := lines[low]
		if l == nil {
			l = &line{}
			lines[low] = l
		}
		l.n += v
		switch {
		case l.lowerSeen:
		case k == low:
			l.text, l.lowerSeen = k, true
		case v > l.textN || v == l.textN && (l.text == "" || k < l.text):
			l.text, l.textN = k, v
		}
	}
	out := make([]Entry, 0, len(lines))
	for _, l := range lines {
		out = append(out, Entry{l.text, l.n})
	}
	sort.Slice(out, func(i, j int) bool {
		if out[i].Count != out[j].Count {
			return out[i].Count > out[j].Count
		}
		return out[i].Text < out[j].Text
	})
	return out
}

// Total returns the number of strings counted.
func (c *Counter) Total() int { return c.total }

// Key returns the string counted for tokens [a, b): the words, or the
// lemmas, joined by a space where the text has white space between them
// and run together where it has none ("GC-48", "don't", as the
// concordance shows them, not "GC - 48"; lemmas "do not", see sameWord), and lower-cased except where
// case carries meaning (acronyms, units, mixed-case words:
// wordshape.KeepsCase), as in "3 MW", "kPa". A lemma keeps the case of
// such a form ("HAWTs" → "HAWT"). Sorted folds the spellings of one
// lower-cased string.
func Key(toks []doc.Token, a, b int, lemma bool) string {
	var sb strings.Builder
	for i := a; i < b; i++ {
		if i > a && (toks[i-1].SpaceAfter || lemma && !sameWord(toks[i].Form, toks[i].Lemma)) {
			sb.WriteByte(' ')
		}
		f := toks[i].Form
		keep := wordshape.KeepsCase(f) || wordshape.IsAcronym(f)
		w := f
		if lemma && toks[i].Lemma != "" {
			w = toks[i].Lemma
			if keep {
				switch {
				case strings.EqualFold(f, w):
					w = f
				case strings.HasSuffix(f, "s") && strings.EqualFold(f[:len(f)-1], w):
					w = f[:len(f)-1]
				default:
					keep = false
				}
			}
		}
		if !keep {
			w = strings.ToLower(w)
		}
		sb.WriteString(w)
	}
	return sb.String()
}

// sameWord reports whether a lemma writes the same word as its form, one
// a prefix of the other up to case ("points" → "point", "ca" → "can"), so
// that lemmas are run together where the forms are ("set-point"), while a
// clitic whose lemma is another word stands apart as a word of its own
// ("doesn't" → "do not", "gonna" → "go to").
func sameWord(form, lemma string) bool {
	n := min(len(form), len(lemma))
	return lemma == "" || strings.EqualFold(form[:n], lemma[:n])
}

// WriteCounts prints a frequency list as text (aligned, control
// characters escaped), tsv, csv or jsonl; bom starts a CSV file with a
// UTF-8 byte order mark.
func WriteCounts(w io.Writer, format string, list []Entry, bom bool) error {
	switch format {
	case "tsv", "csv":
		tw := tabular.NewTSV(w)
		if format == "csv" {
			tw = tabular.NewCSV(w, bom)
		}
		tw.Write("count", "text")
		for _, e := range list {
			tw.Write(strconv.Itoa(e.Count), e.Text)
		}
		return tw.Flush()
	case "jsonl":
		enc := tabular.NewJSONL(w)
		for _, e := range list {
			if err := enc.Encode(e); err != nil {
				return err
			}
		}
		return enc.Flush()
	}
	rows := make([][]string, len(list))
	for i, e := range list {
		rows[i] = []string{strconv.Itoa(e.Count), printable.Escape(e.Text)}
	}
	bw := bufio.NewWriter(w)
	for _, line := range tabular.Align(rows, []bool{true}) {
		bw.WriteString(line + "\n")
	}
	return bw.Flush()
}
