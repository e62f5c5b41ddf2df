// Package tabular holds the one encoding of tabular output that every
// command's writers share, so that a file of glossmith's reads back the
// same way whichever command wrote it:
//
//   - TSV: fields separated by a tab, records ended by "\n". A field that
//     holds a tab, a double quote, CR or LF is enclosed in double quotes and
//     each double quote inside is doubled — the quoting of RFC 4180, with a
//     tab for the comma. Python's csv module (dialect "excel-tab") and
//     data-frame readers read it back field for field; a field without
//     those characters is written as it is, so ordinary rows stay plain.
//   - CSV: RFC 4180 — fields separated by commas, records ended by CRLF,
//     the same quoting (for a comma instead of a tab). An optional UTF-8
//     byte order mark first, for spreadsheet programs that need it to take
//     the file as UTF-8.
//   - JSON Lines: one JSON object per line, HTML characters not escaped;
//     a float64 is always written as a JSON number with a fraction or an
//     exponent (3.0, not 3), so a field has the same type on every line for
//     readers that infer types from the values.
//   - Aligned text tables for the terminal (Table).
//
// encoding/csv is not used for writing: with UseCRLF it also rewrites line
// breaks inside fields, changing the data, and it has no TSV quoting rule.
package tabular

import (
	"bufio"
	"io"
	"strings"
)

// Writer writes records as TSV or CSV.
type Writer struct {
	w    *bufio.Writer
	sep  byte
	eol  string
	err  error
	bom  bool
	wrot bool
}

// NewTSV returns a writer of tab-separated values (see the package comment).
func NewTSV(w io.Writer) *Writer { return &Writer{w: bufio.NewWriter(w), sep: '\t', eol: "\n"} }

// NewCSV returns a writer of RFC 4180 comma-separated values; with bom the
// output starts with a UTF-8 byte order mark.
func NewCSV(w io.Writer, bom bool) *Writer {
	return &Writer{w: bufio.NewWriter(w), sep: ',', eol: "\r\n", bom: bom}
}

// Write writes one record.
func (t *Writer) Write(fields ...string) error {
	if t.err != nil {
		return t.err
	}
	if !t.wrot {
		t.wrot = true
		if t.bom {
			t.w.WriteString("\uFEFF")
		}
	}
	for i, f := range fields {
		if i > 0 {
			t.w.WriteByte(t.sep)
		}
		t.field(f)
	}
	_, t.err = t.w.WriteString(t.eol)
	return t.err
}

func (t *Writer) field(f string) {
	special := "\t\"\r\n"
	if t.sep == ',' {
		special = ",\"\r\n"
	}
	if !strings.ContainsAny(f, special) {
		t.w.WriteString(f)
		return
	}
	t.w.WriteByte('"')
	for {
		i := strings.IndexByte(f, '"')
		if i < 0 {
			break
		}
		t.w.WriteString(f[:i+1])
		t.w.WriteByte('"')
		f = f[i+1:]
	}
	t.w.WriteString(f)
	t.w.WriteByte('"')
}

// Flush writes what is buffered and returns the first error met.
func (t *Writer) Flush() error {
	if t.err != nil {
		return t.err
	}
	if t.bom && !t.wrot { // an empty table still says how it is encoded
		t.wrot = true
		t.w.WriteString("\uFEFF")
	}
	t.err = t.w.Flush()
	return t.err
}
