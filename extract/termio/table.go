package termio

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"slices"
	"strings"

	"glossmith/extract/tbx"
	"glossmith/extract/termbase"
	"glossmith/internal/tabular"
)

// Columns is the header glossmith writes and reads first.
var Columns = []string{"concept", "term", "lang", "status", "pos", "subject", "definition", "source", "note", "concept_note"}

// ReadFile reads a file to import, by its extension: .tbx (or content
// starting with "<"), .csv, .tsv (also .tab, .txt) or .xlsx. lang is the
// language of terms that name none.
func ReadFile(path, lang string) (*Import, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	ext := strings.ToLower(filepath.Ext(path))
	switch {
	case ext == ".xlsx":
		return ReadReviewSheet(bytes.NewReader(data), path)
	case ext == ".tbx" || ext == ".xml" || bytes.HasPrefix(bytes.TrimLeft(bytes.TrimPrefix(data, []byte("\xef\xbb\xbf")), " \t\r\n"), []byte("<")):
		doc, err := tbx.Read(bytes.NewReader(data), path)
		if err != nil {
			return nil, err
		}
		if doc.Lang == "" {
			doc.Lang = lang
		}
		imp := &Import{}
		for _, e := range FromTBX(doc) {
			if len(e.Terms) == 0 {
				// An entry of empty <term> elements only: stored, it would
				// be an entry nothing lists, exports or checks.
				imp.Problems = append(imp.Problems, Problem{path, 0, fmt.Sprintf("concept entry %q has no term: left out", e.ExtID)})
				continue
			}
			imp.Entries = append(imp.Entries, e)
		}
		return imp, nil
	case ext == ".csv":
		return ReadTable(bytes.NewReader(data), path, ',', lang)
	case ext == ".tsv" || ext == ".tab" || ext == ".txt":
		return ReadTable(bytes.NewReader(data), path, '\t', lang)
	}
	return nil, fmt.Errorf("%s: cannot tell the format from the extension (want .tbx, .csv, .tsv or .xlsx)", path)
}

// ReadTable reads CSV (sep ',') or TSV (sep '\t', quoted as RFC 4180
// with a tab for the comma, as glossmith writes it) with a header row.
// Rows it cannot use are Problems with their line; the rest is read.
func ReadTable(r io.Reader, name string, sep rune, lang string) (*Import, error) {
	br := bytes.NewReader(nil)
	data, err := io.ReadAll(r)
	if err != nil {
		return nil, err
	}
	if data, err = plainText(data); err != nil {
		return nil, fmt.Errorf("%s: %w", name, err)
	}
	newReader := func(from []byte) *csv.Reader {
		br.Reset(from)
		cr := csv.NewReader(br)
		cr.Comma = sep
		cr.FieldsPerRecord = -1
		return cr
	}
	cr := newReader(data)
	base := 0 // lines of data before what cr reads
	header, err := cr.Read()
	if errors.Is(err, io.EOF) {
		return nil, fmt.Errorf("%s: empty file, no header", name)
	}
	if err != nil {
		return nil, fmt.Errorf("%s: header: %w", name, err)
	}
	var rows []row
	var problems []Problem
	for {
		rec, err := cr.Read()
		if errors.Is(err, io.EOF) {
			break
		}
		var pe *csv.ParseError
		if errors.As(err, &pe) && errors.Is(pe.Err, csv.ErrQuote) && pe.StartLine < pe.Line {
			// A quote opened and never closed took the rest of the file
			// for one field: name the line it opens on, then read the
			// lines after it as rows again.
			start := base + pe.StartLine
			problems = append(problems, Problem{name, start, `a quoted field starts here and is not closed (a '"' is missing); the lines after it are read as rows`})
			cr, base = newReader(afterLine(data, start)), start
			continue
		}
		if errors.As(err, &pe) {
			problems = append(problems, Problem{name, base + pe.Line, pe.Err.Error()})
			continue
		}
		if err != nil {
			return nil, fmt.Errorf("%s: %w", name, err)
		}
		line, _ := cr.FieldPos(0)
		rows = append(rows, row{base + line, rec})
	}
	imp, err := fromRows(header, rows, name, lang)
	if err != nil {
		return nil, err
	}
	imp.Problems = append(problems, imp.Problems...)
	return imp, nil
}

// afterLine returns data from the start of line n+1 (lines counted from 1).
func afterLine(data []byte, n int) []byte {
	for ; n > 0; n-- {
		i := bytes.IndexByte(data, '\n')
		if i < 0 {
			return nil
		}
		data = data[i+1:]
	}
	return data
}

type row struct {
	line  int
	cells []string
}

// fromRows interprets a header and rows (a table file or a sheet).
func fromRows(header []string, rows []row, name, lang string) (*Import, error) {
	col := map[string]int{}
	for i, h := range header {
		k := strings.ToLower(strings.TrimSpace(h))
		k = strings.ReplaceAll(k, " ", "_")
		if _, dup := col[k]; !dup {
			col[k] = i
		}
	}
	if _, ok := col["term"]; !ok {
		return nil, fmt.Errorf("%s:1: the header has no column \"term\" (found: %s)", name, strings.Join(header, ", "))
	}
	known := map[string]bool{}
	for _, c := range append(Columns, "decision", "comment", "variants", "contexts") {
		known[c] = true
	}
	imp := &Import{}
	_, review := col["decision"]
	byConcept := map[string]*termbase.Entry{}
	for _, r := range rows {
		get := func(k string) string {
			if i, ok := col[k]; ok && i < len(r.cells) {
				return strings.TrimSpace(r.cells[i])
			}
			return ""
		}
		bad := func(format string, a ...any) {
			imp.Problems = append(imp.Problems, Problem{name, r.line, fmt.Sprintf(format, a...)})
		}
		if len(r.cells) == 1 && strings.TrimSpace(r.cells[0]) == "" {
			continue // a blank line
		}
		if len(r.cells) > len(header) {
			bad("%d fields, the header has %d", len(r.cells), len(header))
			continue
		}
		term := get("term")
		if term == "" {
			bad("no term")
			continue
		}
		if review {
			st, ok := ParseVerdict(get("decision"))
			if !ok {
				bad("unknown decision %q (want accept, reject, defer, admitted or deprecated)", get("decision"))
				continue
			}
			if st != "" || get("comment") != "" {
				imp.Verdicts = append(imp.Verdicts, termbase.Verdict{Term: term, Status: st, Comment: get("comment")})
			}
			continue
		}
		st, deferred, stNote, ok := parseStatus(get("status"))
		if !ok {
			bad("unknown status %q (want preferred, admitted, deprecated, candidate, deferred or rejected)", get("status"))
			continue
		}
		t := &termbase.Term{Lang: get("lang"), Text: term, Status: st, Deferred: deferred, POS: get("pos"), Notes: lines(get("note"))}
		if t.Lang == "" {
			t.Lang = lang
		}
		if stNote != "" {
			t.Notes = append(t.Notes, stNote)
		}
		for i, h := range header {
			k := strings.ToLower(strings.ReplaceAll(strings.TrimSpace(h), " ", "_"))
			if !known[k] && i < len(r.cells) && strings.TrimSpace(r.cells[i]) != "" {
				t.Notes = append(t.Notes, strings.TrimSpace(h)+": "+strings.TrimSpace(r.cells[i]))
			}
		}
		concept := get("concept")
		e := byConcept[concept]
		if e == nil || concept == "" {
			e = &termbase.Entry{ExtID: concept}
			imp.Entries = append(imp.Entries, e)
			if concept != "" {
				byConcept[concept] = e
			}
		}
		if e.Subject == "" {
			e.Subject = get("subject")
		}
		if e.Definition == "" {
			e.Definition, e.DefSource = get("definition"), get("source")
		}
		for _, n := range lines(get("concept_note")) {
			if !slices.Contains(e.Notes, n) {
				e.Notes = append(e.Notes, n)
			}
		}
		e.Terms = append(e.Terms, t)
	}
	return imp, nil
}

func lines(s string) []string {
	var out []string
	for _, l := range strings.Split(s, "\n") {
		if l = strings.TrimSpace(l); l != "" {
			out = append(out, l)
		}
	}
	return out
}

// tableRows lays the entries out one term a row under Columns. The
// entry's own fields are on each of its rows, so that any row alone says
// what it belongs to.
func tableRows(entries []*termbase.Entry) [][]string {
	var out [][]string
	for _, e := range entries {
		for _, t := range e.Terms {
			out = append(out, []string{conceptID(e), t.Text, t.Lang, statusCell(t), t.POS, e.Subject,
				e.Definition, e.DefSource, strings.Join(t.Notes, "\n"), strings.Join(e.Notes, "\n")})
		}
	}
	return out
}

// WriteTable writes the entries as CSV (sep ',') or TSV under Columns.
func WriteTable(w io.Writer, entries []*termbase.Entry, sep rune, bom bool) error {
	tw := tabular.NewTSV(w)
	if sep == ',' {
		tw = tabular.NewCSV(w, bom)
	}
	if err := tw.Write(Columns...); err != nil {
		return err
	}
	for _, r := range tableRows(entries) {
		if err := tw.Write(r...); err != nil {
			return err
		}
	}
	return tw.Flush()
}

// WriteJSONL writes one entry a line, as termbase.Entry encodes.
func WriteJSONL(w io.Writer, entries []*termbase.Entry) error {
	j := tabular.NewJSONL(w)
	for _, e := range entries {
		if err := j.Encode(e); err != nil {
			return err
		}
	}
	return j.Flush()
}
