package colloc

import (
	"bufio"
	"fmt"
	"io"
	"strconv"
	"strings"

	"glossmith/extract/measure"
	"glossmith/internal/tabular"
)

// Formats lists the output formats of a collocation list.
var Formats = []string{"text", "tsv", "csv", "jsonl"}

var header = []string{"w1", "w2", "relation", "node", "f12", "f1", "f2", "n", "g2", "pmi", "t", "chi2", "dice", "logdice", "mi3"}

func (r Row) cells() []string {
	s := r.Scores
	f := func(x float64) string { return strconv.FormatFloat(x, 'f', 4, 64) }
	return []string{r.W1, r.W2, r.Relation, r.Node,
		strconv.FormatInt(r.F12, 10), strconv.FormatInt(r.F1, 10), strconv.FormatInt(r.F2, 10), strconv.FormatInt(r.N, 10),
		f(s.G2), f(s.PMI), f(s.T), f(s.Chi2), f(s.Dice), f(s.LogDice), f(s.MI3)}
}

type jsonRow struct {
	W1       string  `json:"w1"`
	W2       string  `json:"w2"`
	Relation string  `json:"relation"`
	Node     string  `json:"node,omitempty"`
	F12      int64   `json:"f12"`
	F1       int64   `json:"f1"`
	F2       int64   `json:"f2"`
	N        int64   `json:"n"`
	G2       float64 `json:"g2"`
	PMI      float64 `json:"pmi"`
	T        float64 `json:"t"`
	Chi2     float64 `json:"chi2"`
	Dice     float64 `json:"dice"`
	LogDice  float64 `json:"logdice"`
	MI3      float64 `json:"mi3"`
}

// Write writes ranked rows in the named format. sortedBy names the measure
// the rows are sorted by; the text table shows it first.
func Write(w io.Writer, format string, rows []Row, sortedBy string) error {
	return WriteOptions(w, format, rows, sortedBy, false)
}

// WriteOptions is Write with a choice for CSV: bom starts the file with a
// UTF-8 byte order mark, for spreadsheet programs. TSV and CSV quote as
// internal/tabular documents.
func WriteOptions(w io.Writer, format string, rows []Row, sortedBy string, bom bool) error {
	bw := bufio.NewWriter(w)
	switch format {
	case "tsv", "csv":
		tw := tabular.NewTSV(bw)
		if format == "csv" {
			tw = tabular.NewCSV(bw, bom)
		}
		tw.Write(header...)
		for _, r := range rows {
			tw.Write(r.cells()...)
		}
		if err := tw.Flush(); err != nil {
			return err
		}
	case "jsonl":
		enc := tabular.NewJSONL(bw)
		for _, r := range rows {
			s := r.Scores
			if err := enc.Encode(jsonRow{r.W1, r.W2, r.Relation, r.Node, r.F12, r.F1, r.F2, r.N,
				s.G2, s.PMI, s.T, s.Chi2, s.Dice, s.LogDice, s.MI3}); err != nil {
				return err
			}
		}
		if err := enc.Flush(); err != nil {
			return err
		}
	case "text":
		writeText(bw, rows, sortedBy)
	default:
		return fmt.Errorf("unknown output format %q (want one of %s)", format, strings.Join(Formats, ", "))
	}
	return bw.Flush()
}

// textMeasures are the measures the text table always shows, with the
// decimals each is printed with; the measure the rows are sorted by comes
// first, so that a list sorted by dice or chi2 shows why it is in that
// order.
var textMeasures = []string{"g2", "logdice", "pmi", "t"}

// textDecimals are the decimals of a measure in the text table: one for
// the large test statistics, three for Dice's coefficient (0 to 1), two
// for the others.
var textDecimals = map[string]int{"g2": 1, "g2signed": 1, "chi2": 1, "dice": 3}

// writeText prints an aligned table: the pair, its relation, the counts
// and the main measures, the one the rows are sorted by first.
func writeText(w *bufio.Writer, rows []Row, sortedBy string) {
	shown := []measure.Measure{}
	if m, err := measure.Lookup(sortedBy); err == nil {
		shown = append(shown, m)
	}
	for _, name := range textMeasures {
		if name != sortedBy {
			m, _ := measure.Lookup(name)
			shown = append(shown, m)
		}
	}
	head := []string{"pair", "relation", "f12", "f1", "f2"}
	right := []bool{false, false, true, true, true}
	for _, m := range shown {
		head, right = append(head, m.Name), append(right, true)
	}
	tab := [][]string{head}
	for _, r := range rows {
		row := []string{r.W1 + " " + r.W2, r.Relation,
			strconv.FormatInt(r.F12, 10), strconv.FormatInt(r.F1, 10), strconv.FormatInt(r.F2, 10)}
		for _, m := range shown {
			d, ok := textDecimals[m.Name]
			if !ok {
				d = 2
			}
			row = append(row, strconv.FormatFloat(m.Field(r.Scores), 'f', d, 64))
		}
		tab = append(tab, row)
	}
	for _, line := range tabular.Align(tab, right) {
		w.WriteString(line + "\n")
	}
	if len(rows) > 0 {
		fmt.Fprintf(w, "(%d pairs, sorted by %s)\n", len(rows), sortedBy)
	}
}
