package read

import (
	"bufio"
	"bytes"
	"compress/gzip"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"unicode/utf16"
	"unicode/utf8"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/internal/docxtest"
	"glossmith/internal/testenv"
	"glossmith/tagger/doc"
)

// writeFile creates dir/name with content and returns its path.
func writeFile(t testing.TB, dir, name string, content []byte) string {
	t.Helper()
	p := filepath.Join(dir, name)
	require.NoError(t, os.MkdirAll(filepath.Dir(p), 0o755))
	require.NoError(t, os.WriteFile(p, content, 0o644))
	return p
}

// readFile writes content to a temp file called name and reads it.
func readFile(t testing.TB, name, content string, opt Options) (*doc.Document, []Problem) {
	t.Helper()
	p := writeFile(t, t.TempDir(), name, []byte(content))
	return Read(Input{Name: name, Path: p}, opt)
}

func fixture(t *testing.T, name string) string {
	t.Helper()
	p := filepath.Join(testenv.Root(t), "testdata", "formats", name)
	_, err := os.Stat(p)
	require.NoError(t, err, "fixture %s is part of the repository", name)
	return p
}

func severities(ps []Problem, sev Severity) []Problem {
	var out []Problem
	for _, p := range ps {
		if p.Severity == sev {
			out = append(out, p)
		}
	}
	return out
}

func TestProblemError(t *testing.T) {
	assert.Equal(t, "a.txt:3: bad", Problem{File: "a.txt", Line: 3, Msg: "bad"}.Error())
	assert.Equal(t, "a.txt: bad", Problem{File: "a.txt", Msg: "bad"}.Error())
	assert.Equal(t, "warning", Warning.String())
}

func TestFormats(t *testing.T) {
	assert.Equal(t, []string{"txt", "md", "html", "docx", "pdf", "conllu"}, Formats())
	for name, want := range map[string]string{
		"a.TXT": "txt", "b.md": "md", "c.Markdown": "md", "d.htm": "html", "e.html.gz": "html",
		"manual.md.gz": "md", "f.docx": "docx", "g.pdf": "pdf", "h.conllu": "conllu",
		"i.png": "", "README": "", "j.gz": "",
	} {
		assert.Equal(t, want, formatByName(name), name)
	}
}

func TestPlainText(t *testing.T) {
	d, ps := readFile(t, "a.txt", "Line one.\r\nLine two.\rLine three.\n", Options{})
	require.NotNil(t, d, "%v", ps)
	assert.Empty(t, ps)
	assert.Equal(t, "txt", d.Format)
	assert.Equal(t, "a.txt", d.Name)
	assert.Equal(t, "Line one.\nLine two.\nLine three.\n", d.Text)
	assert.False(t, d.Pretokenized)
}

func TestUTF8BOMStripped(t *testing.T) {
	d, _ := readFile(t, "a.txt", "\xEF\xBB\xBFValve", Options{})
	require.NotNil(t, d)
	assert.Equal(t, "Valve", d.Text)
}

// The fixtures' UTF-16 files are decoded against the standard library's
// unicode/utf16.Decode as the reference.
func TestUTF16Fixtures(t *testing.T) {
	for _, tc := range []struct {
		name string
		be   bool
	}{{"utf16le-bom.txt", false}, {"utf16be-bom.txt", true}} {
		raw, err := os.ReadFile(fixture(t, tc.name))
		require.NoError(t, err)
		units := make([]uint16, (len(raw)-2)/2)
		for i := range units {
			a, b := raw[2+2*i], raw[3+2*i]
			if tc.be {
				units[i] = uint16(a)<<8 | uint16(b)
			} else {
				units[i] = uint16(b)<<8 | uint16(a)
			}
		}
		want := normalizeNewlines(string(utf16.Decode(units))) // the LE fixture has CRLF line ends
		d, ps := Read(Input{Name: tc.name, Path: fixture(t, tc.name)}, Options{})
		require.NotNil(t, d, "%v", ps)
		assert.Empty(t, ps, tc.name)
		assert.Equal(t, want, d.Text, tc.name)
		assert.NotContains(t, d.Text, "\uFFFD", tc.name)
	}
}

func TestUTF16Broken(t *testing.T) {
	// LE: "a", newline, an unpaired high surrogate, "b", then an odd byte.
	in := []byte{0xFF, 0xFE, 'a', 0, '\n', 0, 0x00, 0xD8, 'b', 0, 'c'}
	d, ps := readFile(t, "u.txt", string(in), Options{})
	require.NotNil(t, d)
	assert.Equal(t, "a\n\uFFFDb\uFFFD", d.Text)
	require.Len(t, ps, 1)
	assert.Equal(t, Warning, ps[0].Severity)
	assert.Equal(t, 2, ps[0].Line)
	assert.Contains(t, ps[0].Msg, "2 code units")
}

// The fixture is Latin-1 text ("15 °C", "m³/h"): not UTF-8, but clean
// Windows-1252 (a superset of Latin-1's printable characters), so it is
// read as such with a note rather than with U+FFFD.
func TestLatin1FixtureReadAsWindows1252(t *testing.T) {
	p := fixture(t, "invalid-utf8.txt")
	raw, err := os.ReadFile(p)
	require.NoError(t, err)
	d, ps := Read(Input{Name: "invalid-utf8.txt", Path: p}, Options{})
	require.NotNil(t, d)
	require.Len(t, ps, 1)
	assert.Equal(t, Note, ps[0].Severity)
	assert.Contains(t, ps[0].Msg, "Windows-1252")
	assert.True(t, utf8.ValidString(d.Text))
	assert.Contains(t, d.Text, "water temperature 15 °C, flow rate 2.4 m³/h ÿ\n")
	assert.NotContains(t, d.Text, "\uFFFD")
	// The rest of the file is read: same number of lines as the source,
	// and its last line intact.
	srcLines := strings.Split(string(raw), "\n")
	gotLines := strings.Split(d.Text, "\n")
	require.Equal(t, len(srcLines), len(gotLines))
	assert.Equal(t, srcLines[len(srcLines)-2], gotLines[len(gotLines)-2])
}

// A UTF-8 file with a damaged byte stays UTF-8: the byte becomes U+FFFD
// with a warning naming its line — never silently.
func TestDamagedUTF8Warns(t *testing.T) {
	d, ps := readFile(t, "damaged.txt", "Le café ouvre.\nLa vanne caf\xe9 ferme.\n", Options{})
	require.NotNil(t, d)
	assert.Equal(t, "Le café ouvre.\nLa vanne caf\uFFFD ferme.\n", d.Text)
	require.Len(t, ps, 1)
	assert.Equal(t, Warning, ps[0].Severity)
	assert.Equal(t, 2, ps[0].Line)
}

func TestInvalidUTF8WarningsCapped(t *testing.T) {
	var b strings.Builder
	for i := 0; i < 25; i++ {
		b.WriteString("bad \xC3\x28 and \xFF here – UTF-8 elsewhere\n")
	}
	d, ps := readFile(t, "bad.txt", b.String(), Options{})
	require.NotNil(t, d)
	require.Len(t, ps, maxEncodingWarnings+1)
	for i := 0; i < maxEncodingWarnings; i++ {
		assert.Equal(t, i+1, ps[i].Line)
		assert.Contains(t, ps[i].Msg, "2 bytes")
	}
	assert.Contains(t, ps[maxEncodingWarnings].Msg, "15 more lines (30 replacements")
	assert.Equal(t, strings.Count(b.String(), "\n"), strings.Count(d.Text, "\n"))
}

func TestEmptyFiles(t *testing.T) {
	p := fixture(t, "empty.txt")
	d, ps := Read(Input{Name: "empty.txt", Path: p}, Options{})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Equal(t, Problem{File: "empty.txt", Severity: Note, Msg: "no text"}, ps[0])

	for _, tc := range []struct{ name, content string }{
		{"blank.txt", " \n\t\n"},
		{"only-code.md", "```\ncode\n```\n"},
		{"only-script.html", "<html><head><title>T</title></head><body><script>x()</script></body></html>"},
	} {
		d, ps := readFile(t, tc.name, tc.content, Options{})
		assert.Nil(t, d, tc.name)
		require.Len(t, ps, 1, tc.name)
		assert.Equal(t, "no text", ps[0].Msg, tc.name)
		assert.Equal(t, Note, ps[0].Severity, tc.name)
	}
}

func TestBinaryFixture(t *testing.T) {
	p := fixture(t, "binary.dat")
	d, ps := Read(Input{Name: "binary.dat", Path: p}, Options{})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Equal(t, Error, ps[0].Severity, "named explicitly: an error")
	assert.Contains(t, ps[0].Msg, "not text")

	d, ps = Read(Input{Name: "dir/binary.dat", Path: p, Dir: "dir"}, Options{Format: "txt"})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Equal(t, Note, ps[0].Severity, "met in a directory: a note")
	assert.Contains(t, ps[0].Msg, "skipped: not text")
}

func TestBinaryDetection(t *testing.T) {
	ctrl := bytes.Repeat([]byte("ab\x01\x02\x03\x04cdefgh"), 100) // 4 of 12 bytes are controls
	for _, tc := range []struct {
		name    string
		content []byte
		want    string
	}{
		{"nul.txt", []byte("text\x00more text"), "NUL"},
		{"ctrl.txt", ctrl, "control characters"},
		{"img.txt", []byte("\x89PNG\r\n\x1A\nrest"), "PNG"},
		{"old.txt", []byte("\xD0\xCF\x11\xE0\xA1\xB1\x1A\xE1rest"), "OLE2"},
		{"elf.md", []byte("\x7FELF\x02\x01\x01"), "ELF"},
	} {
		d, ps := Read(Input{Name: tc.name, Path: writeFile(t, t.TempDir(), tc.name, tc.content)}, Options{})
		assert.Nil(t, d, tc.name)
		require.Len(t, ps, 1, tc.name)
		assert.Equal(t, Error, ps[0].Severity, tc.name)
		assert.Contains(t, ps[0].Msg, tc.want, tc.name)
	}
	// Text with an escape sequence or form feeds is still text.
	d, ps := readFile(t, "esc.txt", "Page one.\fPage two \x1B[1mbold\x1B[0m.\n", Options{})
	require.NotNil(t, d, "%v", ps)
}

func TestSniffFixtures(t *testing.T) {
	for name, want := range map[string]string{
		"notes-noext": "md", "page-noext": "html", "quick-reference.pdf": "",
	} {
		if want == "" {
			continue
		}
		raw, err := os.ReadFile(fixture(t, name))
		require.NoError(t, err)
		assert.Equal(t, want, sniffText(peekText(raw)), name)
	}
	d, ps := Read(Input{Name: "notes-noext", Path: fixture(t, "notes-noext")}, Options{})
	require.NotNil(t, d, "%v", ps)
	assert.Equal(t, "md", d.Format)
	assert.NotContains(t, d.Text, "#")
	d, ps = Read(Input{Name: "page-noext", Path: fixture(t, "page-noext")}, Options{})
	require.NotNil(t, d, "%v", ps)
	assert.Equal(t, "html", d.Format)
	assert.NotContains(t, d.Text, "<")
	assert.Contains(t, d.Text, "union nuts & the cable joints", "entity decoded")
}

func TestSniffText(t *testing.T) {
	for in, want := range map[string]string{
		"<!DOCTYPE html>\n<p>x":                       "html",
		"  <html lang=en>":                            "html",
		"<p>A valve.</p>":                             "html",
		"The <p> element.":                            "txt",
		"# Heading\n\ntext":                           "md",
		"Title\n=====\n":                              "md",
		"See [the manual](manual.html).":              "md",
		"A **strong** word.":                          "md",
		"1\tValve\tvalve\tNOUN\tNN\t_\t0\troot\t_\t_": "conllu",
		"# sent_id = 1\n# text = x\n":                 "conllu",
		"Plain words. And #hashtags, 5 * 3.":          "txt",
	} {
		assert.Equal(t, want, sniffText(in), in)
	}
}

func TestConlluFixtures(t *testing.T) {
	for _, tc := range []struct {
		name   string
		tagged bool
	}{{"tagged.conllu", true}, {"untagged.conllu", false}} {
		p := fixture(t, tc.name)
		d, ps := Read(Input{Name: tc.name, Path: p}, Options{})
		require.NotNil(t, d, "%v", ps)
		assert.Empty(t, ps)
		assert.True(t, d.Pretokenized)
		assert.Equal(t, "conllu", d.Format)
		assert.Equal(t, tc.tagged, d.Tagged(), tc.name)
		// Count the word rows independently: lines whose first column is
		// a plain integer ID (not a range "3-4" or an empty node "8.1").
		f, err := os.Open(p)
		require.NoError(t, err)
		rows, sents, lineOf := 0, 0, map[int]bool{}
		sc := bufio.NewScanner(f)
		for n := 1; sc.Scan(); n++ {
			id, _, _ := strings.Cut(sc.Text(), "\t")
			if id != "" && !strings.ContainsAny(id, "-.#") {
				rows++
				lineOf[n] = true
			}
			if strings.HasPrefix(sc.Text(), "# text") {
				sents++
			}
		}
		f.Close()
		assert.Equal(t, rows, d.TokenCount(), tc.name)
		assert.Equal(t, sents, len(d.Sentences), tc.name)
		for _, s := range d.Sentences {
			for _, tok := range s.Tokens {
				assert.True(t, lineOf[int(tok.Line)], "token %q line %d is a word row", tok.Form, tok.Line)
				if !tc.tagged {
					assert.Empty(t, tok.UPOS)
				}
			}
		}
	}
}

func TestConlluErrorsNameLines(t *testing.T) {
	in := "1\tValve\t_\t_\t_\t_\t_\t_\t_\t_\n\n1\tbad row\n\n1\tPump\t_\t_\t_\t_\t_\t_\t_\t_\n"
	d, ps := readFile(t, "x.conllu", in, Options{})
	require.NotNil(t, d)
	assert.Len(t, d.Sentences, 2)
	require.Len(t, ps, 1)
	assert.Equal(t, Error, ps[0].Severity)
	assert.Equal(t, 3, ps[0].Line)
}

func TestFormatOverride(t *testing.T) {
	d, _ := readFile(t, "a.txt", "# Title\n\nSome *text*.\n", Options{Format: "md"})
	require.NotNil(t, d)
	assert.Equal(t, "md", d.Format)
	assert.Equal(t, "Title\n\nSome text.\n", strings.TrimLeft(d.Text, " "))

	d, ps := readFile(t, "a.txt", "x", Options{Format: "rtf"})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Contains(t, ps[0].Msg, `unknown format "rtf"`)
}

func TestStdin(t *testing.T) {
	d, ps := Read(Input{Name: "-", Path: "-"}, Options{Stdin: strings.NewReader("<p>Open the valve.</p><p>Close it.</p>")})
	require.NotNil(t, d, "%v", ps)
	assert.Equal(t, "html", d.Format)
	assert.Equal(t, "-", d.Name)
	assert.Equal(t, "Open the valve.\n\nClose it.", d.Text)

	d, ps = Read(Input{Name: "-", Path: "-"}, Options{Stdin: strings.NewReader("0123456789abcdef"), MaxBytes: 8})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Contains(t, ps[0].Msg, "more than the 8 bytes limit")
}

func gz(t testing.TB, data []byte) []byte {
	var b bytes.Buffer
	w := gzip.NewWriter(&b)
	_, err := w.Write(data)
	require.NoError(t, err)
	require.NoError(t, w.Close())
	return b.Bytes()
}

func TestGzip(t *testing.T) {
	dir := t.TempDir()
	p := writeFile(t, dir, "manual.md.gz", gz(t, []byte("## Valve\n\nThe *valve* opens.\n")))
	d, ps := Read(Input{Name: "manual.md.gz", Path: p}, Options{})
	require.NotNil(t, d, "%v", ps)
	assert.Equal(t, "md", d.Format)
	assert.Equal(t, "manual.md.gz", d.Name)
	assert.Equal(t, "Valve\n\nThe valve opens.\n", strings.TrimLeft(d.Text, " "))

	// Sniffed by magic number when the name does not say gzip.
	p = writeFile(t, dir, "notes", gz(t, []byte("<p>Drip emitter</p>")))
	d, ps = Read(Input{Name: "notes", Path: p}, Options{})
	require.NotNil(t, d, "%v", ps)
	assert.Equal(t, "html", d.Format)

	p = writeFile(t, dir, "fake.txt.gz", []byte("not gzip"))
	d, ps = Read(Input{Name: "fake.txt.gz", Path: p}, Options{})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Contains(t, ps[0].Msg, "not gzip data")
}

// A gzip bomb: 4 MiB of zeros packs into about 4 KiB; with a 1 MiB cap the
// reader stops after inflating 1 MiB + 1 byte.
func TestGzipBomb(t *testing.T) {
	bomb := gz(t, make([]byte, 4<<20))
	require.Less(t, len(bomb), 64<<10)
	p := writeFile(t, t.TempDir(), "bomb.txt.gz", bomb)
	d, ps := Read(Input{Name: "bomb.txt.gz", Path: p}, Options{MaxBytes: 1 << 20})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Equal(t, Error, ps[0].Severity)
	assert.Contains(t, ps[0].Msg, "decompresses to more than the 1 MiB limit")
}

func TestOpenErrors(t *testing.T) {
	dir := t.TempDir()
	d, ps := Read(Input{Name: "missing.txt", Path: filepath.Join(dir, "missing.txt")}, Options{})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Equal(t, "missing.txt: cannot open: no such file or directory", ps[0].Error())

	f := writeFile(t, dir, "f.txt", []byte("x"))
	_, ps = Read(Input{Name: "f.txt/sub", Path: f + "/sub"}, Options{})
	require.Len(t, ps, 1)
	assert.Equal(t, "f.txt/sub: cannot open: not a directory", ps[0].Error())

	_, ps = Read(Input{Name: "dir", Path: dir}, Options{})
	require.Len(t, ps, 1)
	assert.Equal(t, "dir: is a directory", ps[0].Error())
}

func TestPermissionDenied(t *testing.T) {
	if os.Geteuid() == 0 {
		t.Skip("running as root, which may read any file; permission checks cannot be exercised")
	}
	p := writeFile(t, t.TempDir(), "locked.txt", []byte("secret"))
	require.NoError(t, os.Chmod(p, 0))
	d, ps := Read(Input{Name: "locked.txt", Path: p}, Options{})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Equal(t, "locked.txt: cannot open: permission denied", ps[0].Error())
}

func TestMaxBytes(t *testing.T) {
	d, ps := readFile(t, "big.txt", strings.Repeat("valve ", 300), Options{MaxBytes: 1 << 10})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Equal(t, "big.txt: file is 1800 bytes, larger than the 1 KiB limit on one document; split it", ps[0].Error())
}

// Read buffers are reused from one input to the next: a short file read
// after a long one (and after a gzip file and a .docx, whose buffers are
// handled apart) has exactly its own text, nothing left of the other.
func TestReadAfterLongerInput(t *testing.T) {
	long := strings.Repeat("The controller logs the valve state every minute.\n", 2000)
	short := "The valve opens.\n"
	var gz bytes.Buffer
	zw := gzip.NewWriter(&gz)
	_, err := zw.Write([]byte(long))
	require.NoError(t, err)
	require.NoError(t, zw.Close())
	for round := 0; round < 3; round++ {
		d, ps := readFile(t, "long.txt", long, Options{})
		require.NotNil(t, d)
		assert.Empty(t, ps)
		assert.Equal(t, long, d.Text)
		d, _ = readFile(t, "long.txt.gz", gz.String(), Options{})
		require.NotNil(t, d)
		assert.Equal(t, long, d.Text)
		docx := docxtest.Zip(t, docxtest.Files(`<w:p><w:r><w:t>Solenoid valve</w:t></w:r></w:p>`)...)
		d, _ = readFile(t, "manual.docx", string(docx), Options{})
		require.NotNil(t, d)
		assert.Equal(t, "Solenoid valve", d.Text)
		d, ps = readFile(t, "short.txt", short, Options{})
		require.NotNil(t, d)
		assert.Empty(t, ps)
		assert.Equal(t, short, d.Text)
	}
}

// Token offsets are 32-bit: a text longer than doc.MaxText (lowered here,
// as a 2 GiB file has no place in a test) is refused, naming the file,
// and so is a byte cap above it.
func TestMaxText(t *testing.T) {
	defer func(old int) { maxText = old }(maxText)
	maxText = 1000
	d, ps := readFile(t, "long.md", strings.Repeat("- valve\n", 200), Options{})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Equal(t, Error, ps[0].Severity)
	assert.Equal(t, "long.md: refused: 1797 bytes of text, more than the 1000 bytes one document may hold; split the file", ps[0].Error())
	d, ps = readFile(t, "short.md", strings.Repeat("- valve\n", 100), Options{})
	assert.NotNil(t, d)
	assert.Empty(t, ps)
	assert.Equal(t, int64(doc.MaxText), Options{MaxBytes: 1 << 40}.maxBytes())
}

// A 100 MB line without a newline, then a normal line: the long line is
// left out with an error naming file and line 1, the next line is read
// and keeps its number.
func TestHundredMegabyteLine(t *testing.T) {
	const n = 100_000_000
	p := filepath.Join(t.TempDir(), "long.txt")
	f, err := os.Create(p)
	require.NoError(t, err)
	chunk := bytes.Repeat([]byte("abcdefgh"), 1<<17) // 1 MiB
	for w := 0; w < n; w += len(chunk) {
		_, err := f.Write(chunk[:min(len(chunk), n-w)])
		require.NoError(t, err)
	}
	_, err = f.WriteString("\nThe valve opens.\n")
	require.NoError(t, err)
	require.NoError(t, f.Close())

	for _, format := range []string{"txt", "md"} {
		d, ps := Read(Input{Name: "long.txt", Path: p}, Options{Format: format})
		require.NotNil(t, d, format)
		assert.Equal(t, "\nThe valve opens.\n", d.Text, format)
		require.Len(t, ps, 1, format)
		assert.Equal(t, "long.txt:1: line is 95.4 MiB long, longer than the 1 MiB limit on one line; the line is left out", ps[0].Error())
		assert.Equal(t, Error, ps[0].Severity)
	}
}

func TestReadOutputIsValidUTF8(t *testing.T) {
	for _, name := range []string{"a.txt", "a.md", "a.html"} {
		d, _ := readFile(t, name, "x \xff y &#xD800; z\n", Options{})
		require.NotNil(t, d, name)
		assert.True(t, utf8.ValidString(d.Text), name)
	}
}

func TestLongLineInMiddle(t *testing.T) {
	src := "first\n" + strings.Repeat("x", MaxLine+1) + "\nthird\n" + strings.Repeat("y", MaxLine) + "\nlast"
	d, ps := readFile(t, "m.txt", src, Options{})
	require.NotNil(t, d)
	assert.Equal(t, "first\n\nthird\n"+strings.Repeat("y", MaxLine)+"\nlast", d.Text)
	require.Len(t, ps, 1)
	assert.Equal(t, 2, ps[0].Line)
}

// Encodings as the WHATWG Encoding Standard names them; the byte values
// are those of the published code page tables (windows-1251 0xCF 0xF0 0xE8
// = "При", ISO 8859-2 0xB3 = "ł", ISO 8859-7 0xE2 0xE1 0xEB 0xE2 0xDF 0xE4
// 0xE1 = "βαλβίδα", Windows-1252 0xE9 = "é").
func TestEncodings(t *testing.T) {
	for _, tc := range []struct {
		name, file, content string
		opt                 Options
		want                string
		sev                 []Severity
	}{
		{"windows-1252 fallback", "a.txt", "Le caf\xe9 ferme \x80 5.\n", Options{}, "Le café ferme € 5.\n", []Severity{Note}},
		{"meta charset", "p.html", `<html><head><meta charset="windows-1251"></head><body><p>` + "\xcf\xf0\xe8" + `</p></body></html>`, Options{}, "При", nil},
		{"meta http-equiv", "p.html", `<html><head><meta http-equiv="Content-Type" content="text/html; charset=ISO-8859-2"></head><body><p>` + "Wroc\xb3aw" + `</p>`, Options{}, "Wrocław", nil},
		{"xml declaration", "p.xhtml", `<?xml version="1.0" encoding="ISO-8859-2"?>` + "\n<html><body><p>Wroc\xb3aw</p></body></html>", Options{}, "Wrocław", nil},
		{"meta utf-16 means utf-8", "p.html", `<meta charset="utf-16"><p>café</p>`, Options{}, "café", nil},
		{"unknown charset", "p.html", `<meta charset="x-nonesuch"><p>café</p>`, Options{}, "café", []Severity{Warning}},
		{"--encoding", "g.txt", "\xe2\xe1\xeb\xe2\xdf\xe4\xe1", Options{Encoding: "iso-8859-7"}, "βαλβίδα", nil},
		{"--encoding over meta", "p.html", `<meta charset="windows-1251"><p>` + "\xe9" + `</p>`, Options{Encoding: "latin1"}, "é", nil},
		{"--encoding utf-8 keeps U+FFFD", "u.txt", "caf\xe9", Options{Encoding: "utf-8"}, "caf\uFFFD", []Severity{Warning}},
		{"byte order mark over meta", "p.html", "\xef\xbb\xbf" + `<meta charset="windows-1251"><p>café</p>`, Options{}, "café", nil},
	} {
		d, ps := readFile(t, tc.file, tc.content, tc.opt)
		if assert.NotNil(t, d, tc.name) {
			assert.Equal(t, tc.want, d.Text, tc.name)
		}
		var sevs []Severity
		for _, p := range ps {
			sevs = append(sevs, p.Severity)
		}
		assert.Equal(t, tc.sev, sevs, "%s: %v", tc.name, ps)
	}
}

func TestLookupEncoding(t *testing.T) {
	name, err := LookupEncoding("Latin1")
	require.NoError(t, err)
	assert.Equal(t, "windows-1252", name, "WHATWG Encoding Standard: latin1 is a label of windows-1252")
	_, err = LookupEncoding("klingon-8")
	assert.ErrorContains(t, err, `unknown encoding "klingon-8"`)
}

// A NUL byte past the first 8 KiB (which the binary check looks at) is
// dropped with a warning naming its line; in the first 8 KiB it marks the
// file as binary.
func TestNULAnywhere(t *testing.T) {
	head := strings.Repeat("The valve opens.\n", 1000) // 17,000 bytes
	d, ps := readFile(t, "late-nul.txt", head+"Pres\x00sure drops.\x00\n", Options{})
	require.NotNil(t, d)
	assert.NotContains(t, d.Text, "\x00")
	assert.True(t, strings.HasSuffix(d.Text, "Pressure drops.\n"))
	require.Len(t, ps, 1)
	assert.Equal(t, Warning, ps[0].Severity)
	assert.Equal(t, 1001, ps[0].Line)
	assert.Contains(t, ps[0].Msg, "2 NUL")

	d, ps = readFile(t, "early-nul.txt", "The\x00valve.\n"+head, Options{})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Equal(t, Error, ps[0].Severity)
	assert.Contains(t, ps[0].Msg, "NUL")
}
