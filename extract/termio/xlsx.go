package termio

import (
	"fmt"
	"io"
	"slices"
	"strings"

	"github.com/xuri/excelize/v2"

	"glossmith/extract/termbase"
)

// ReviewColumns is the header of the review sheet.
var ReviewColumns = []string{"concept", "term", "status", "pos", "variants", "contexts", "definition", "decision", "comment"}

const reviewSheet = "Review"

// WriteReviewSheet writes an XLSX workbook for a subject expert: one row a
// concept (its preferred term), its other terms and surface forms, part of
// speech, contexts, status and definition, then an empty decision and
// comment column to fill in. ReadReviewSheet reads the filled-in sheet back
// as verdicts.
func WriteReviewSheet(w io.Writer, entries []*termbase.Entry, lang string) error {
	f := excelize.NewFile()
	defer f.Close()
	if err := f.SetSheetName("Sheet1", reviewSheet); err != nil {
		return err
	}
	bold, err := f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true}, Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{"DDEBDA"}}})
	if err != nil {
		return err
	}
	wrap, err := f.NewStyle(&excelize.Style{Alignment: &excelize.Alignment{WrapText: true, Vertical: "top"}})
	if err != nil {
		return err
	}
	sw, err := f.NewStreamWriter(reviewSheet)
	if err != nil {
		return err
	}
	for i, wd := range []float64{12, 28, 12, 10, 30, 70, 40, 12, 40} {
		if err := sw.SetColWidth(i+1, i+1, wd); err != nil {
			return err
		}
	}
	if err := sw.SetPanes(&excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft"}); err != nil {
		return err
	}
	head := make([]any, len(ReviewColumns))
	for i, c := range ReviewColumns {
		head[i] = excelize.Cell{StyleID: bold, Value: c}
	}
	if err := sw.SetRow("A1", head, excelize.RowOpts{}); err != nil {
		return err
	}
	r := 2
	for _, e := range entries {
		p := e.Head(lang)
		if p == nil {
			continue
		}
		var variants, contexts []string
		for _, t := range e.Terms {
			if t != p {
				variants = append(variants, t.Text+" ("+statusCell(t)+")")
			}
			for _, f := range t.Forms {
				if f != t.Text && !slices.Contains(variants, f) {
					variants = append(variants, f)
				}
			}
			for _, c := range t.Contexts {
				s := c.Text
				if src := contextSource(c); src != "" {
					s += " [" + src + "]"
				}
				contexts = append(contexts, s)
			}
		}
		cells := []any{conceptID(e), p.Text, statusCell(p), p.POS, strings.Join(variants, "; "), strings.Join(contexts, "\n"), e.Definition, "", ""}
		for i := range cells {
			cells[i] = excelize.Cell{StyleID: wrap, Value: cells[i]}
		}
		cell, _ := excelize.CoordinatesToCellName(1, r)
		if err := sw.SetRow(cell, cells, excelize.RowOpts{}); err != nil {
			return err
		}
		r++
	}
	if err := sw.Flush(); err != nil {
		return err
	}
	if r > 2 {
		// A list box in the decision column offers the verdicts.
		dv := excelize.NewDataValidation(true)
		dv.Sqref = fmt.Sprintf("H2:H%d", r-1)
		if err := dv.SetDropList([]string{"accept", "reject", "defer", "admitted", "deprecated"}); err != nil {
			return err
		}
		if err := f.AddDataValidation(reviewSheet, dv); err != nil {
			return err
		}
	}
	_, err = f.WriteTo(w)
	return err
}

// ReadReviewSheet reads the first sheet of an XLSX workbook with a header
// row: with a decision column, as verdicts; otherwise as entries under the
// table columns (see the package documentation).
func ReadReviewSheet(r io.Reader, name string) (*Import, error) {
	f, err := excelize.OpenReader(r)
	if err != nil {
		return nil, fmt.Errorf("%s: not a readable XLSX workbook: %w", name, err)
	}
	defer f.Close()
	sheets := f.GetSheetList()
	if len(sheets) == 0 {
		return nil, fmt.Errorf("%s: the workbook has no sheet", name)
	}
	all, err := f.GetRows(sheets[0])
	if err != nil {
		return nil, fmt.Errorf("%s: %w", name, err)
	}
	if len(all) == 0 {
		return nil, fmt.Errorf("%s: the sheet %q is empty, no header", name, sheets[0])
	}
	rows := make([]row, 0, len(all)-1)
	for i, cells := range all[1:] {
		if len(cells) == 0 {
			continue
		}
		rows = append(rows, row{line: i + 2, cells: cells})
	}
	return fromRows(all[0], rows, name, "")
}
