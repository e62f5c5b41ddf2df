package tabular

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"os/exec"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/internal/testenv"
)

// awkward holds the fields that break naive TSV/CSV writers: a bare quote
// (the one that shifted columns), quotes at both ends, tabs, commas, line
// breaks of every kind, an empty field and plain text.
var awkward = [][]string{
	{"term", "note", "count"},
	{`the "dry" valve`, "a\tb", "3"},
	{`"quoted"`, "line one\nline two", ""},
	{"crlf\r\ninside", "lone\rcr", "x,y"},
	{`"`, `""`, "plain"},
}

func encode(t *testing.T, w *Writer, out *bytes.Buffer) string {
	t.Helper()
	for _, r := range awkward {
		require.NoError(t, w.Write(r...))
	}
	require.NoError(t, w.Flush())
	return out.String()
}

// RFC 4180, section 2: fields with the separator, quotes or line breaks are
// enclosed in double quotes, an inner quote doubled; the Go CSV reader
// implements that grammar and must give back every field unchanged.
func TestTSVReadsBackWithRFC4180Reader(t *testing.T) {
	var out bytes.Buffer
	s := encode(t, NewTSV(&out), &out)
	r := csv.NewReader(strings.NewReader(s))
	r.Comma = '\t'
	got, err := r.ReadAll()
	require.NoError(t, err)
	// encoding/csv folds \r\n inside a quoted field to \n (RFC 4180 readers
	// may); compare with that one difference.
	want := fold(awkward)
	assert.Equal(t, want, got)
	assert.True(t, strings.HasPrefix(s, "term\tnote\tcount\n"), "plain fields stay unquoted")
	assert.Contains(t, s, "\"the \"\"dry\"\" valve\"\t\"a\tb\"\t3\n")
}

func fold(rows [][]string) [][]string {
	out := make([][]string, len(rows))
	for i, r := range rows {
		out[i] = make([]string, len(r))
		for j, c := range r {
			out[i][j] = strings.ReplaceAll(c, "\r\n", "\n")
		}
	}
	return out
}

func TestCSVIsRFC4180(t *testing.T) {
	var out bytes.Buffer
	s := encode(t, NewCSV(&out, false), &out)
	// RFC 4180 section 2 rule 1: each record ends in CRLF; a line break
	// inside a field is data and is kept as given.
	assert.True(t, strings.HasPrefix(s, "term,note,count\r\n"))
	assert.Contains(t, s, "\"line one\nline two\",\r\n")
	assert.Contains(t, s, "\"crlf\r\ninside\",\"lone\rcr\",\"x,y\"\r\n")
	got, err := csv.NewReader(strings.NewReader(s)).ReadAll()
	require.NoError(t, err)
	assert.Equal(t, fold(awkward), got)
}

func TestCSVByteOrderMark(t *testing.T) {
	var out bytes.Buffer
	w := NewCSV(&out, true)
	require.NoError(t, w.Write("café", "1"))
	require.NoError(t, w.Flush())
	assert.Equal(t, "\uFEFFcafé,1\r\n", out.String())

	out.Reset()
	require.NoError(t, NewCSV(&out, true).Flush())
	assert.Equal(t, "\uFEFF", out.String(), "an empty table still carries the mark")
}

// Python's csv module is the reader most users load TSV with; its
// "excel-tab" dialect is the TSV that spreadsheets write (quote char ",
// quotes doubled).
func TestTSVReadsBackInPython(t *testing.T) {
	py, err := exec.LookPath("python3")
	if err != nil {
		t.Skip("python3 not installed")
	}
	var out bytes.Buffer
	s := encode(t, NewTSV(&out), &out)
	cmd := exec.Command(py, "-c", `import csv, io, json, sys
rows = list(csv.reader(io.StringIO(sys.stdin.read(), newline=""), dialect="excel-tab"))
print(json.dumps(rows))`)
	cmd.Stdin = strings.NewReader(s)
	b, err := cmd.Output()
	require.NoError(t, err)
	var got [][]string
	require.NoError(t, json.Unmarshal(b, &got))
	assert.Equal(t, awkward, got, "Python reads every field back unchanged, CR LF included")
}

func TestJSONLFloatsKeepTheirType(t *testing.T) {
	type variant struct {
		Form string `json:"form"`
	}
	type rec struct {
		Name     string            `json:"name"`
		Count    int               `json:"count"`
		Score    float64           `json:"score"`
		Small    float64           `json:"small"`
		Big      float64           `json:"big"`
		Skip     float64           `json:"-"`
		Empty    float64           `json:"empty,omitempty"`
		Variants []variant         `json:"variants"`
		Slots    map[string]string `json:"slots,omitempty"`
		Per      map[string]float64
		hidden   int
	}
	var out bytes.Buffer
	j := NewJSONL(&out)
	require.NoError(t, j.Encode(rec{Name: "<a&b>", Count: 2, Score: 3, Small: 1e-7, Big: 2.5, Per: map[string]float64{"b": 1, "a": 0.5}, hidden: 1}))
	require.NoError(t, j.Encode(rec{Name: "x", Score: -0.25, Variants: []variant{{"y"}}, Slots: map[string]string{"h": "v"}}))
	require.NoError(t, j.Flush())
	lines := strings.Split(strings.TrimSuffix(out.String(), "\n"), "\n")
	require.Len(t, lines, 2)
	assert.Equal(t, `{"name":"<a&b>","count":2,"score":3.0,"small":1e-7,"big":2.5,"variants":[],"Per":{"a":0.5,"b":1.0}}`, lines[0])
	assert.Equal(t, `{"name":"x","count":0,"score":-0.25,"small":0.0,"big":0.0,"variants":[{"form":"y"}],"slots":{"h":"v"},"Per":null}`, lines[1])
	for _, l := range lines {
		var m map[string]any
		require.NoError(t, json.Unmarshal([]byte(l), &m), l)
	}
}

func TestJSONLRefusesNaN(t *testing.T) {
	var out bytes.Buffer
	nan := 0.0
	nan /= nan
	assert.Error(t, NewJSONL(&out).Encode(struct{ X float64 }{nan}))
}

func TestAlign(t *testing.T) {
	lines := Align([][]string{{"#", "term", "freq", "note"}, {"10", "café", "7", ""}, {"9", "drip line", "123", "x"}}, []bool{true, false, true})
	assert.Equal(t, []string{
		" #  term       freq  note",
		"10  café          7",
		" 9  drip line   123  x",
	}, lines)
}

// Wide characters take two columns of a terminal and combining marks
// none (East Asian Width, Unicode Standard Annex #11: 蒸, コ, 😀 are W;
// U+0308 is Mn, U+200B Cf): a table of Japanese terms, or of an accent
// written as a combining mark, lines up.
func TestAlignWideAndCombining(t *testing.T) {
	for _, c := range []struct {
		cell  string
		width int
	}{
		{"drip line", 9},
		{"Kältetechnik", 12},
		{"Ka\u0308ltetechnik", 12},
		{"蒸発器コイル", 12},
		{"ｺｲﾙ", 3}, // halfwidth katakana: H
		{"صمام التمدد", 11},
		{"😀 button", 9},
		{"zero\u200bwidth", 9},
	} {
		t.Run(c.cell, func(t *testing.T) {
			assert.Equal(t, c.width, Width(c.cell))
			lines := Align([][]string{{c.cell, "status"}, {"x", "preferred"}}, nil)
			pad := strings.Repeat(" ", c.width-1)
			assert.Equal(t, []string{c.cell + "  status", "x" + pad + "  preferred"}, lines)
		})
	}
}

// pandas.read_csv, the data-frame reader, reads TSV (sep "\t") and CSV
// (sep ",", CRLF records, with and without a byte-order mark) back to the
// very fields written — quotes, tabs, commas and line breaks inside fields,
// an empty field — when told the rule the README documents: RFC 4180
// quoting, every cell a string (keep_default_na=False).
func TestTablesReadBackInPandas(t *testing.T) {
	cases := []struct {
		name string
		w    func(*bytes.Buffer) *Writer
		sep  string
	}{
		{"tsv", func(b *bytes.Buffer) *Writer { return NewTSV(b) }, "\t"},
		{"csv", func(b *bytes.Buffer) *Writer { return NewCSV(b, false) }, ","},
		{"csv with BOM", func(b *bytes.Buffer) *Writer { return NewCSV(b, true) }, ","},
	}
	for _, c := range cases {
		var out bytes.Buffer
		s := encode(t, c.w(&out), &out)
		assert.Equal(t, awkward, testenv.PandasRows(t, []byte(s), c.sep), c.name)
	}
}
