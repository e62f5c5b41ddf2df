package main

import (
	"encoding/csv"
	"encoding/json"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"golang.org/x/text/encoding"
	"golang.org/x/text/encoding/charmap"
	"golang.org/x/text/encoding/unicode"

	"glossmith/internal/testenv"
)

// tsvOutputs are the TSV outputs of every command that writes TSV, on the
// demo corpus; the find runs meet quotation marks as tokens and in
// contexts, the bare quote that shifted the columns of naive readers.
var tsvOutputs = [][]string{
	{"find", "-q", "--to", "tsv", "PUNCT", "testdata/demo"},
	{"find", "-q", "--count", "--to", "tsv", "PUNCT _", "testdata/demo"},
	{"terms", "-q", "--to", "tsv", "testdata/demo"},
	{"collocations", "-q", "--to", "tsv", "testdata/demo"},
	{"tag", "-q", "--to", "tsv", "testdata/demo"},
}

// Every row has the header's number of fields for an RFC 4180 reader with
// a tab for the comma (Go's encoding/csv), and the fields holding a quote
// come back with it.
func TestTSVOutputsReadBack(t *testing.T) {
	for _, args := range tsvOutputs {
		r := run(t, "", args...)
		require.Equal(t, 0, r.code, "%v: %s", args, r.stderr)
		cr := csv.NewReader(strings.NewReader(r.stdout))
		cr.Comma = '\t'
		rows, err := cr.ReadAll() // FieldsPerRecord: every row as long as the first
		require.NoError(t, err, "%v", args)
		require.Greater(t, len(rows), 1, "%v", args)
		if args[0] == "find" && len(args) == 6 {
			quoted := 0
			for _, row := range rows[1:] {
				if row[7] == `"` {
					quoted++
				}
			}
			assert.Positive(t, quoted, "the demo's quotation marks are matched and read back as \"")
		}
	}
}

// Python's csv module, dialect excel-tab, reads the same rows.
func TestTSVOutputsReadBackInPython(t *testing.T) {
	py, err := exec.LookPath("python3")
	if err != nil {
		t.Skip("python3 not installed")
	}
	for _, args := range tsvOutputs {
		r := run(t, "", args...)
		require.Equal(t, 0, r.code, "%v: %s", args, r.stderr)
		cmd := exec.Command(py, "-c", `import csv, io, json, sys
rows = list(csv.reader(io.StringIO(sys.stdin.read(), newline=""), dialect="excel-tab"))
print(json.dumps(rows))`)
		cmd.Stdin = strings.NewReader(r.stdout)
		out, err := cmd.Output()
		require.NoError(t, err)
		var rows [][]string
		require.NoError(t, json.Unmarshal(out, &rows))
		cr := csv.NewReader(strings.NewReader(r.stdout))
		cr.Comma = '\t'
		want, err := cr.ReadAll()
		require.NoError(t, err)
		assert.Equal(t, want, rows, "%v", args)
	}
}

// pandas.read_csv, the data-frame reader, reads the TSV and CSV output of
// every command that writes them (the termbase's export and diff from a
// termbase made here) to the cells an RFC 4180 reader (Go's encoding/csv)
// reads, header included; the demo's quotation marks are among them.
func TestTablesReadBackInPandas(t *testing.T) {
	tb := filepath.Join(t.TempDir(), "glossary.gtb")
	for _, args := range [][]string{
		{"termbase", "--termbase", tb, "import", "testdata/demo-glossary.csv"},
		{"terms", "-q", "--termbase", tb, "--record", "v1", "testdata/demo/gc48-installation-manual.md"},
		{"terms", "-q", "--termbase", tb, "--record", "v2", "testdata/demo"},
	} {
		r := run(t, "", args...)
		require.Equal(t, 0, r.code, "%v: %s", args, r.stderr)
	}
	outputs := [][]string{
		{"termbase", "--termbase", tb, "export", "--to", "tsv"},
		{"termbase", "--termbase", tb, "export", "--to", "csv"},
		{"termbase", "--termbase", tb, "diff", "--to", "tsv", "v1", "v2"},
	}
	for _, args := range tsvOutputs {
		outputs = append(outputs, args)
		if args[0] != "tag" { // tag writes no CSV
			asCSV := slices.Clone(args)
			asCSV[slices.Index(asCSV, "--to")+1] = "csv"
			outputs = append(outputs, asCSV)
		}
	}
	quoted := 0
	for _, args := range outputs {
		sep := ","
		if args[slices.Index(args, "--to")+1] == "tsv" {
			sep = "\t"
		}
		r := run(t, "", args...)
		require.Equal(t, 0, r.code, "%v: %s", args, r.stderr)
		cr := csv.NewReader(strings.NewReader(r.stdout))
		cr.Comma = rune(sep[0])
		want, err := cr.ReadAll()
		require.NoError(t, err, "%v", args)
		require.Greater(t, len(want), 1, "%v", args)
		assert.Equal(t, want, testenv.PandasRows(t, []byte(r.stdout), sep), "%v", args)
		for _, row := range want {
			for _, cell := range row {
				if strings.Contains(cell, `"`) {
					quoted++
				}
			}
		}
	}
	assert.Positive(t, quoted, "fields holding a quotation mark")
}

// Every command that writes CSV takes --bom (RFC 4180 records, CRLF line
// ends, the byte order mark only when asked for).
func TestCSVLineEndsAndBOM(t *testing.T) {
	for _, args := range [][]string{
		{"terms", "testdata/demo"},
		{"collocations", "testdata/demo"},
		{"find", "NOUN", "testdata/demo"},
		{"find", "--count", "NOUN", "testdata/demo"},
	} {
		name := strings.Join(args, " ")
		r := run(t, "", append([]string{args[0], "-q", "--to", "csv", "--bom"}, args[1:]...)...)
		require.Equal(t, 0, r.code, r.stderr)
		assert.True(t, strings.HasPrefix(r.stdout, "\uFEFF"), name)
		assert.True(t, strings.HasSuffix(r.stdout, "\r\n"), name)
		assert.Equal(t, strings.Count(r.stdout, "\n"), strings.Count(r.stdout, "\r\n"), "%s: RFC 4180 records end in CRLF", name)
		r = run(t, "", append([]string{args[0], "-q", "--to", "csv"}, args[1:]...)...)
		assert.False(t, strings.HasPrefix(r.stdout, "\uFEFF"), name)
	}
	// Every command with CSV output has --bom.
	root := newRootCmd()
	for _, path := range commandPaths(root) {
		c, _, err := root.Find(path)
		require.NoError(t, err)
		if to := c.Flags().Lookup("to"); to != nil && strings.Contains(to.Usage, "csv") {
			assert.NotNil(t, c.Flags().Lookup("bom"), "%s writes CSV without --bom", strings.Join(path, " "))
		}
	}
}

// --encoding names the encoding of the inputs (WHATWG labels); an unknown
// name is a usage error before anything is read.
func TestEncodingFlag(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "greek.txt")
	// ISO 8859-7: 0xE2 0xE1 0xEB 0xE2 0xDF 0xE4 0xE1 is "βαλβίδα" (valve).
	require.NoError(t, os.WriteFile(p, []byte("\xe2\xe1\xeb\xe2\xdf\xe4\xe1\n"), 0o644))
	r := run(t, "", "tag", "-q", "--to", "text", "--encoding", "iso-8859-7", p)
	require.Equal(t, 0, r.code, r.stderr)
	assert.True(t, strings.HasPrefix(r.stdout, "βαλβίδα/"), r.stdout)

	r = run(t, "", "tag", "--encoding", "klingon-8", p)
	assert.Equal(t, 2, r.code)
	assert.Contains(t, r.stderr, `unknown encoding "klingon-8"`)
}

// "café" typed precomposed and as e + U+0301 is one term (NFC), and a
// soft hyphen inside a word does not split it.
func TestNormalizedTerms(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "kiosk.txt")
	text := "The café kiosk heats the pressure sensor.\nThe cafe\u0301 kiosk reads the pres\u00ADsure sensor.\n"
	require.NoError(t, os.WriteFile(p, []byte(text), 0o644))
	r := run(t, "", "terms", "-q", "--to", "tsv", "--min-freq", "1", p)
	require.Equal(t, 0, r.code, r.stderr)
	rows, err := readTSV(r.stdout)
	require.NoError(t, err)
	freq := map[string]string{}
	for _, row := range rows[1:] {
		freq[row[1]] = row[3]
		assert.NotContains(t, row[1], "\u0301")
		assert.NotContains(t, row[1], "\u00AD")
	}
	assert.Equal(t, "2", freq["café kiosk"], "%v", freq)
	assert.Equal(t, "2", freq["pressure sensor"], "%v", freq)
}

// tag's start and end are byte offsets of the file as read: each token is
// found in the file with its soft hyphens, zero-width characters and
// decomposed accents, and none of those around it, whatever the line ends,
// byte-order mark or encoding (the slice decoded as the file is).
func TestTagOffsetsOfTheFile(t *testing.T) {
	text := "The pres\u00ADsure sensor failed.\nThe cafe\u0301 valve\u200B\u200B leaks at \u200Enight\u200F.\n"
	want := []string{"The", "pres\u00ADsure", "sensor", "failed", ".", "The", "cafe\u0301", "valve", "leaks", "at", "night", "."}
	crlf := strings.ReplaceAll(text, "\n", "\r\n")
	latin1 := "The pres\xADsure sensor failed.\r\nThe caf\xE9 valve leaks at night.\r\n"
	utf16 := func(order unicode.Endianness, s string) string {
		b, err := unicode.UTF16(order, unicode.UseBOM).NewEncoder().Bytes([]byte(s))
		require.NoError(t, err)
		return string(b)
	}
	asIs := func(b []byte) string { return string(b) }
	from := func(e encoding.Encoding) func([]byte) string {
		return func(b []byte) string {
			out, err := e.NewDecoder().Bytes(b)
			require.NoError(t, err)
			return string(out)
		}
	}
	for _, tc := range []struct {
		name, file string
		decode     func([]byte) string
		want       []string
	}{
		{"utf-8, LF", text, asIs, want},
		{"utf-8, CRLF", crlf, asIs, want},
		{"utf-8 with byte-order mark", "\uFEFF" + crlf, asIs, want},
		{"latin-1", latin1, from(charmap.Windows1252), []string{"The", "pres\u00ADsure", "sensor", "failed", ".", "The", "café", "valve", "leaks", "at", "night", "."}},
		{"utf-16 LE", utf16(unicode.LittleEndian, crlf), from(unicode.UTF16(unicode.LittleEndian, unicode.IgnoreBOM)), want},
		{"utf-16 BE", utf16(unicode.BigEndian, text), from(unicode.UTF16(unicode.BigEndian, unicode.IgnoreBOM)), want},
	} {
		p := filepath.Join(t.TempDir(), "kiosk.txt")
		require.NoError(t, os.WriteFile(p, []byte(tc.file), 0o644))
		r := run(t, "", "tag", "-q", "--to", "tsv", p)
		require.Equal(t, 0, r.code, r.stderr)
		rows, err := readTSV(r.stdout)
		require.NoError(t, err)
		require.Equal(t, []string{"form", "start", "end"}, []string{rows[0][3], rows[0][8], rows[0][9]})
		var got []string
		for _, row := range rows[1:] {
			start, err := strconv.Atoi(row[8])
			require.NoError(t, err)
			end, err := strconv.Atoi(row[9])
			require.NoError(t, err)
			require.True(t, 0 <= start && start <= end && end <= len(tc.file), "%s: %v", tc.name, row)
			got = append(got, tc.decode([]byte(tc.file[start:end])))
		}
		assert.Equal(t, tc.want, got, tc.name)
	}
}

func readTSV(s string) ([][]string, error) {
	cr := csv.NewReader(strings.NewReader(s))
	cr.Comma = '\t'
	return cr.ReadAll()
}

// tag --from conllu --to conllu passes a fully annotated treebank through
// unchanged (UD English EWT 2.15 test file: multiword tokens, empty nodes,
// newdoc/newpar, sent_id, every column), and keeps sentence ids unique
// when two inputs use the same ones.
func TestTagConlluPassThrough(t *testing.T) {
	p := filepath.Join(testenv.SharedDir(t, "data/ud-en-ewt"), "en_ewt-ud-test.conllu")
	src, err := os.ReadFile(p)
	require.NoError(t, err)
	r := run(t, "", "tag", "-q", "--from", "conllu", "--to", "conllu", p)
	require.Equal(t, 0, r.code, r.stderr)
	assert.True(t, r.stdout == string(src), "the EWT test file does not come back byte for byte")

	dir := t.TempDir()
	one := "# sent_id = s1\n1\tOpen\t_\t_\t_\t_\t0\troot\t0:root\t_\n2\tthe\t_\t_\t_\t_\t3\tdet\t3:det\t_\n3\tvalve\t_\t_\t_\t_\t1\tobj\t1:obj\tSpaceAfter=No\n4\t.\t_\t_\t_\t_\t1\tpunct\t1:punct\t_\n\n"
	a, b := filepath.Join(dir, "a.conllu"), filepath.Join(dir, "b.conllu")
	require.NoError(t, os.WriteFile(a, []byte(one), 0o644))
	require.NoError(t, os.WriteFile(b, []byte(one), 0o644))
	r = run(t, "", "tag", "-q", "--workers", "1", "--to", "conllu", a, b)
	require.Equal(t, 0, r.code, r.stderr)
	ids := regexp.MustCompile(`(?m)^# sent_id = (.*)$`).FindAllStringSubmatch(r.stdout, -1)
	require.Len(t, ids, 2)
	assert.Equal(t, "s1", ids[0][1])
	assert.Equal(t, b+"-s1", ids[1][1])
	// the dependency columns stay, the empty tag cells are filled
	assert.Contains(t, r.stdout, "\tvalve\tvalve\tNOUN\tNN\t_\t1\tobj\t1:obj\tSpaceAfter=No\n")
}
