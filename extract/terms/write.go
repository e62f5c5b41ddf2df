package terms

import (
	"bufio"
	"fmt"
	"io"
	"slices"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"

	"glossmith/extract/tbx"
	"glossmith/internal/tabular"
)

// Formats lists the output formats of a term list.
var Formats = []string{"text", "tsv", "csv", "jsonl", "tbx", "tbx-basic"}

// WriteOptions tune the writers.
type WriteOptions struct {
	// Contexts is the number of example sentences written per term, in
	// every format that carries them (text, JSON Lines, TBX).
	Contexts int
	// Highlight marks the term in the text format's example sentences
	// (bold, for a terminal).
	Highlight bool
	Source    string // TBX header: what the list was made from
	Lang      string // TBX: the documents' language (BCP 47), "" for English
	BOM       bool   // csv: start with a UTF-8 byte order mark, for spreadsheet programs
	// Sort is the measure the list is sorted by (RankOptions.Sort): text
	// adds it as a column when it is not one already (cvalue, weirdness),
	// so that the order can be read.
	Sort string
	// TermStatus, with a termbase, is what it holds of a term's text: a
	// TBX-Basic administrative status (tbx.PreferredStatus …; "" for none)
	// and whether it rejected the text. The TBX writers use it (writeTBX).
	TermStatus func(text string) (adminStatus string, rejected bool)
}

// columns are the measure columns of tsv, csv and text output, in order.
var columns = []string{"rank", "term", "score", "freq", "docs", "words", "keyness", "weirdness", "cvalue", "dp", "variants", "within", "acronym", "full_form"}

func (t *Term) cells() []string {
	vs := make([]string, len(t.Variants))
	for i, v := range t.Variants {
		vs[i] = v.Form + " (" + strconv.Itoa(v.Count) + ")"
	}
	return []string{strconv.Itoa(t.Rank), t.Term, num(t.Score), strconv.Itoa(t.Freq), strconv.Itoa(t.Docs),
		strconv.Itoa(t.Words), num(t.Keyness), num(t.Weirdness), num(t.CValue), num(t.DP), strings.Join(vs, "; "), t.Within, t.Acronym, t.FullForm}
}

// num formats a measure with four significant decimals, never NaN or Inf
// (the measures are finite by construction; this is the last guard).
func num(x float64) string {
	if x != x || x > 1e300 || x < -1e300 {
		x = 0
	}
	return strconv.FormatFloat(x, 'f', 4, 64)
}

// Write writes the ranked terms in the named format.
func Write(w io.Writer, format string, terms []*Term, opt WriteOptions) error {
	terms = withContexts(terms, opt.Contexts)
	bw := bufio.NewWriter(w)
	var err error
	switch format {
	case "text":
		err = writeText(bw, terms, opt)
	case "tsv":
		err = writeTSV(bw, terms)
	case "csv":
		err = writeCSV(bw, terms, opt.BOM)
	case "jsonl":
		err = writeJSONL(bw, terms)
	case "tbx", "tbx-basic":
		err = writeTBX(bw, terms, opt, map[string]string{"tbx": tbx.Core, "tbx-basic": tbx.Basic}[format])
	default:
		return fmt.Errorf("unknown output format %q (want one of %s)", format, strings.Join(Formats, ", "))
	}
	if err != nil {
		return err
	}
	return bw.Flush()
}

// writeTSV and writeCSV use the quoting documented in internal/tabular.
func writeTSV(w *bufio.Writer, terms []*Term) error {
	return writeTable(tabular.NewTSV(w), terms)
}

func writeCSV(w *bufio.Writer, terms []*Term, bom bool) error {
	return writeTable(tabular.NewCSV(w, bom), terms)
}

func writeTable(tw *tabular.Writer, terms []*Term) error {
	labelled := hasStatus(terms)
	if labelled {
		tw.Write(append(columns[:len(columns):len(columns)], "status", "entry")...)
	} else {
		tw.Write(columns...)
	}
	for _, t := range terms {
		if labelled {
			tw.Write(append(t.cells(), t.Status, t.Entry)...)
		} else {
			tw.Write(t.cells()...)
		}
	}
	return tw.Flush()
}

func writeJSONL(w *bufio.Writer, terms []*Term) error {
	enc := tabular.NewJSONL(w)
	for _, t := range terms {
		if err := enc.Encode(t); err != nil {
			return err
		}
	}
	return enc.Flush()
}

// writeText prints an aligned table: rank, term (with its acronym or full
// form, see displayTerm), score, freq, docs, the sort measure when it is
// cvalue or weirdness, keyness, dp, the longer candidate it mostly occurs in (when any term of
// the list has one) and the most frequent other spellings; with Contexts > 0
// the example sentences follow each row, indented.
func writeText(w *bufio.Writer, terms []*Term, opt WriteOptions) error {
	within := hasWithin(terms)
	head := []string{"#", "term", "score", "freq", "docs", "keyness", "dp", "variants"}
	right := []bool{0: true, 2: true, 3: true, 4: true, 5: true, 6: true}
	sortCol := opt.Sort == "cvalue" || opt.Sort == "weirdness"
	if sortCol {
		head = slices.Insert(head, 5, opt.Sort)
		right = append(right, true)
	}
	if within {
		head = slices.Insert(head, len(head)-1, "within")
	}
	rows := [][]string{head}
	for _, t := range terms {
		var other []string
		for _, v := range t.Variants {
			if v.Form != t.Term && len(other) < 3 {
				other = append(other, v.Form)
			}
		}
		if len(t.Variants) > 3+1 {
			other = append(other, "…")
		}
		row := []string{strconv.Itoa(t.Rank), displayTerm(t), strconv.FormatFloat(t.Score, 'f', 2, 64),
			strconv.Itoa(t.Freq), strconv.Itoa(t.Docs), strconv.FormatFloat(t.Keyness, 'f', 1, 64),
			strconv.FormatFloat(t.DP, 'f', 2, 64), strings.Join(other, ", ")}
		switch {
		case sortCol && opt.Sort == "cvalue":
			row = slices.Insert(row, 5, strconv.FormatFloat(t.CValue, 'f', 2, 64))
		case sortCol:
			row = slices.Insert(row, 5, strconv.FormatFloat(t.Weirdness, 'f', 1, 64))
		}
		if within {
			row = slices.Insert(row, len(row)-1, t.Within)
		}
		rows = append(rows, row)
	}
	if hasStatus(terms) {
		addStatusColumn(rows, terms)
	}
	for ri, line := range tabular.Align(rows, right) {
		w.WriteString(line + "\n")
		if ri > 0 && opt.Contexts > 0 {
			for k, cx := range terms[ri-1].Contexts {
				if k >= opt.Contexts {
					break
				}
				text := cx.Text
				if opt.Highlight {
					text = highlight(text, cx.Start, cx.End)
				}
				fmt.Fprintf(w, "      %s:%d: %s\n", cx.Doc, cx.Line, text)
			}
		}
	}
	return nil
}

// displayTerm is the term as the text format shows it: with the acronym
// the documents define for it, "vapour pressure deficit (VPD)", or, for an
// acronym, its full form, "VPD (vapour pressure deficit)".
func displayTerm(t *Term) string {
	switch {
	case t.Acronym != "":
		return t.Term + " (" + t.Acronym + ")"
	case t.FullForm != "":
		return t.Term + " (" + t.FullForm + ")"
	}
	return t.Term
}

// hasWithin reports whether a term of the list names a longer candidate
// it mostly occurs in.
func hasWithin(terms []*Term) bool {
	return slices.ContainsFunc(terms, func(t *Term) bool { return t.Within != "" })
}

// withContexts returns terms with at most n contexts each, every one with
// the term marked (MarkTerm). The terms are copied, not changed.
func withContexts(terms []*Term, n int) []*Term {
	out := make([]*Term, len(terms))
	for i, t := range terms {
		c := *t
		c.Contexts = make([]Context, min(n, len(t.Contexts)))
		for k := range c.Contexts {
			cx := t.Contexts[k]
			cx.Start, cx.End = MarkTerm(t, cx.Text)
			c.Contexts[k] = cx
		}
		if len(c.Contexts) == 0 {
			c.Contexts = nil
		}
		out[i] = &c
	}
	return out
}

// MarkTerm returns the character offsets in text of the first use of t:
// the earliest of its spellings (the canonical form and every surface
// form) found whole — not inside a longer word — ignoring case, the
// longest where several start there; -1, -1 when none is.
func MarkTerm(t *Term, text string) (start, end int) {
	bs, be := -1, -1
	try := func(form string) {
		if form == "" {
			return
		}
		for i := 0; i+len(form) <= len(text); i++ {
			if bs >= 0 && i > bs {
				return
			}
			if !strings.EqualFold(text[i:i+len(form)], form) || !wordEdge(text, i, i+len(form)) {
				continue
			}
			if bs < 0 || i < bs || i+len(form) > be {
				bs, be = i, i+len(form)
			}
			return
		}
	}
	try(t.Term)
	for _, v := range t.Variants {
		try(v.Form)
	}
	if bs < 0 {
		return -1, -1
	}
	return utf8.RuneCountInString(text[:bs]), utf8.RuneCountInString(text[:be])
}

// wordEdge reports whether text[i:j] starts and ends at word boundaries.
func wordEdge(text string, i, j int) bool {
	if i > 0 {
		r, _ := utf8.DecodeLastRuneInString(text[:i])
		if isWordRune(r) {
			return false
		}
	}
	if j < len(text) {
		r, _ := utf8.DecodeRuneInString(text[j:])
		if isWordRune(r) {
			return false
		}
	}
	return true
}

func isWordRune(r rune) bool { return unicode.IsLetter(r) || unicode.IsDigit(r) }

// highlight wraps the characters [start, end) of text in bold.
func highlight(text string, start, end int) string {
	if start < 0 || end <= start {
		return text
	}
	bs, be := -1, len(text)
	n := 0
	for i := range text {
		if n == start {
			bs = i
		}
		if n == end {
			be = i
			break
		}
		n++
	}
	if bs < 0 {
		return text
	}
	return text[:bs] + "\x1b[1m" + text[bs:be] + "\x1b[22m" + text[be:]
}
