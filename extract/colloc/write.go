package colloc

import (
	"bufio"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"strconv"
	"strings"
	"unicode/utf8"
)

// Formats lists the output formats of a collocation list.
var Formats = []string{"text", "tsv", "csv", "jsonl"}

var header = []string{"w1", "w2", "relation", "head", "f12", "f1", "f2", "n", "g2", "pmi", "t", "chi2", "dice", "logdice", "mi3"}

func (r Row) cells() []string {
	s := r.Scores
	f := func(x float64) string { return strconv.FormatFloat(x, 'f', 4, 64) }
	return []string{r.W1, r.W2, r.Relation, r.Head,
		strconv.FormatInt(r.F12, 10), strconv.FormatInt(r.F1, 10), strconv.FormatInt(r.F2, 10), strconv.FormatInt(r.N, 10),
		f(s.G2), f(s.PMI), f(s.T), f(s.Chi2), f(s.Dice), f(s.LogDice), f(s.MI3)}
}

type jsonRow struct {
	W1       string  `json:"w1"`
	W2       string  `json:"w2"`
	Relation string  `json:"relation"`
	Head     string  `json:"head,omitempty"`
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
	bw := bufio.NewWriter(w)
	switch format {
	case "tsv":
		bw.WriteString(strings.Join(header, "\t") + "\n")
		for _, r := range rows {
			bw.WriteString(strings.Join(r.cells(), "\t") + "\n")
		}
	case "csv":
		cw := csv.NewWriter(bw)
		cw.Write(header)
		for _, r := range rows {
			cw.Write(r.cells())
		}
		cw.Flush()
		if err := cw.Error(); err != nil {
			return err
		}
	case "jsonl":
		enc := json.NewEncoder(bw)
		enc.SetEscapeHTML(false)
		for _, r := range rows {
			s := r.Scores
			if err := enc.Encode(jsonRow{r.W1, r.W2, r.Relation, r.Head, r.F12, r.F1, r.F2, r.N,
				s.G2, s.PMI, s.T, s.Chi2, s.Dice, s.LogDice, s.MI3}); err != nil {
				return err
			}
		}
	case "text":
		writeText(bw, rows, sortedBy)
	default:
		return fmt.Errorf("unknown output format %q (want one of %s)", format, strings.Join(Formats, ", "))
	}
	return bw.Flush()
}

// writeText prints an aligned table: the pair, its relation, the counts
// and the main measures.
func writeText(w *bufio.Writer, rows []Row, sortedBy string) {
	tab := [][]string{{"pair", "relation", "f12", "f1", "f2", "g2", "logdice", "pmi", "t"}}
	for _, r := range rows {
		s := r.Scores
		tab = append(tab, []string{r.W1 + " " + r.W2, r.Relation,
			strconv.FormatInt(r.F12, 10), strconv.FormatInt(r.F1, 10), strconv.FormatInt(r.F2, 10),
			strconv.FormatFloat(s.G2, 'f', 1, 64), strconv.FormatFloat(s.LogDice, 'f', 2, 64),
			strconv.FormatFloat(s.PMI, 'f', 2, 64), strconv.FormatFloat(s.T, 'f', 2, 64)})
	}
	width := make([]int, len(tab[0]))
	for _, r := range tab {
		for i, c := range r {
			width[i] = max(width[i], utf8.RuneCountInString(c))
		}
	}
	for _, r := range tab {
		var b strings.Builder
		for i, c := range r {
			pad := strings.Repeat(" ", width[i]-utf8.RuneCountInString(c))
			if i > 0 {
				b.WriteString("  ")
			}
			if i < 2 {
				b.WriteString(c + pad)
			} else {
				b.WriteString(pad + c)
			}
		}
		w.WriteString(strings.TrimRight(b.String(), " ") + "\n")
	}
	if len(rows) > 0 {
		fmt.Fprintf(w, "(%d pairs, sorted by %s)\n", len(rows), sortedBy)
	}
}
