package terms

import (
	"bufio"
	"fmt"
	"io"
	"strconv"
	"strings"

	"glossmith/extract/tbx"
	"glossmith/internal/tabular"
)

// Formats lists the output formats of a term list.
var Formats = []string{"text", "tsv", "csv", "jsonl", "tbx", "tbx-basic"}

// WriteOptions tune the writers.
type WriteOptions struct {
	Contexts int    // text format: example sentences printed under each term
	Source   string // TBX header: what the list was made from
	Lang     string // TBX: the documents' language (BCP 47), "" for English
	BOM      bool   // csv: start with a UTF-8 byte order mark, for spreadsheet programs
}

// columns are the measure columns of tsv, csv and text output, in order.
var columns = []string{"rank", "term", "score", "freq", "docs", "words", "keyness", "weirdness", "cvalue", "dp", "variants"}

func (t *Term) cells() []string {
	vs := make([]string, len(t.Variants))
	for i, v := range t.Variants {
		vs[i] = v.Form + " (" + strconv.Itoa(v.Count) + ")"
	}
	return []string{strconv.Itoa(t.Rank), t.Term, num(t.Score), strconv.Itoa(t.Freq), strconv.Itoa(t.Docs),
		strconv.Itoa(t.Words), num(t.Keyness), num(t.Weirdness), num(t.CValue), num(t.DP), strings.Join(vs, "; ")}
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

// writeText prints an aligned table: rank, term, score, freq, docs and the
// most frequent other spellings; with Contexts > 0 the example sentences
// follow each row, indented.
func writeText(w *bufio.Writer, terms []*Term, opt WriteOptions) error {
	head := []string{"#", "term", "score", "freq", "docs", "keyness", "dp", "variants"}
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
		rows = append(rows, []string{strconv.Itoa(t.Rank), t.Term, strconv.FormatFloat(t.Score, 'f', 2, 64),
			strconv.Itoa(t.Freq), strconv.Itoa(t.Docs), strconv.FormatFloat(t.Keyness, 'f', 1, 64),
			strconv.FormatFloat(t.DP, 'f', 2, 64), strings.Join(other, ", ")})
	}
	if hasStatus(terms) {
		addStatusColumn(rows, terms)
	}
	right := []bool{0: true, 2: true, 3: true, 4: true, 5: true, 6: true}
	for ri, line := range tabular.Align(rows, right) {
		w.WriteString(line + "\n")
		if ri > 0 && opt.Contexts > 0 {
			for k, cx := range terms[ri-1].Contexts {
				if k >= opt.Contexts {
					break
				}
				fmt.Fprintf(w, "      %s:%d: %s\n", cx.Doc, cx.Line, cx.Text)
			}
		}
	}
	return nil
}
