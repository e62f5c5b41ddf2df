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
	Left     string            `json:"-"` // context before, ending in a space when the text has one
	Right    string            `json:"-"` // context after, starting with a space when the text has one
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
	Width     int  // characters of context on each side (default 40)
	Highlight bool // mark the match with terminal colours
}

// WriteText prints hits as aligned concordance lines: the document and
// line, the left context right-aligned, the match, the right context.
func WriteText(w io.Writer, hits []Hit, st Style) error {
	if st.Width <= 0 {
		st.Width = 40
	}
	bw := bufio.NewWriter(w)
	where := 0
	for _, h := range hits {
		where = max(where, utf8.RuneCountInString(fmt.Sprintf("%s:%d", h.Doc, h.Line)))
	}
	for _, h := range hits {
		loc := fmt.Sprintf("%s:%d", h.Doc, h.Line)
		left := lastRunes(h.Left, st.Width)
		right := firstRunes(h.Right, st.Width)
		match := h.Text
		if st.Highlight {
			match = "\x1b[1;33m" + match + "\x1b[0m"
		} else {
			match = "[" + match + "]"
		}
		fmt.Fprintf(bw, "%-*s  %*s%s%s\n", where, loc, st.Width, left, match, right)
	}
	return bw.Flush()
}

// lastRunes keeps the last n characters of s, marking a cut with "…".
func lastRunes(s string, n int) string {
	s = strings.TrimLeft(s, " ")
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return "…" + string(r[len(r)-n+1:])
}

// firstRunes keeps the first n characters of s, marking a cut with "…".
func firstRunes(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n-1]) + "…"
}

// WriteTSV prints hits with a header row, quoting as internal/tabular
// documents.
func WriteTSV(w io.Writer, hits []Hit) error {
	tw := tabular.NewTSV(w)
	tw.Write("doc", "sentence", "line", "start", "end", "rule", "left", "match", "right")
	for _, h := range hits {
		tw.Write(h.Doc, strconv.Itoa(h.Sentence), strconv.Itoa(h.Line), strconv.Itoa(h.Start), strconv.Itoa(h.End),
			h.Rule, strings.TrimSpace(h.Left), h.Text, strings.TrimSpace(h.Right))
	}
	return tw.Flush()
}

// WriteJSONL prints one JSON object per hit.
func WriteJSONL(w io.Writer, hits []Hit) error {
	enc := tabular.NewJSONL(w)
	for _, h := range hits {
		if err := enc.Encode(h); err != nil {
			return err
		}
	}
	return enc.Flush()
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
func (c *Counter) Sorted() []Entry {
	out := make([]Entry, 0, len(c.counts))
	for k, v := range c.counts {
		out = append(out, Entry{k, v})
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
// lemmas, lower-cased and joined by spaces.
func Key(toks []doc.Token, a, b int, lemma bool) string {
	var sb strings.Builder
	for i := a; i < b; i++ {
		if i > a {
			sb.WriteByte(' ')
		}
		w := toks[i].Form
		if lemma && toks[i].Lemma != "" {
			w = toks[i].Lemma
		}
		sb.WriteString(strings.ToLower(w))
	}
	return sb.String()
}

// WriteCounts prints a frequency list as text (aligned), tsv or jsonl.
func WriteCounts(w io.Writer, format string, list []Entry) error {
	switch format {
	case "tsv":
		tw := tabular.NewTSV(w)
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
		rows[i] = []string{strconv.Itoa(e.Count), e.Text}
	}
	bw := bufio.NewWriter(w)
	for _, line := range tabular.Align(rows, []bool{true}) {
		bw.WriteString(line + "\n")
	}
	return bw.Flush()
}
