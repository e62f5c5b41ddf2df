package read

import (
	"archive/zip"
	"bytes"
	"compress/flate"
	"fmt"
	"hash/crc32"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/internal/docxtest"
	"glossmith/internal/testenv"
)

// The element meanings follow ECMA-376 Part 1 (WordprocessingML):
// w:p paragraph, w:t text, w:tab, w:br, w:delText deleted text inside a
// w:del revision, w:instrText field code, and Part 3 for mc:Fallback.
func TestDocx(t *testing.T) {
	body := `<w:p><w:pPr><w:pStyle w:val="Heading1"/></w:pPr><w:r><w:t>Solenoid valve</w:t></w:r></w:p>` +
		`<w:p><w:r><w:t xml:space="preserve">The valve </w:t></w:r><w:r><w:rPr><w:b/></w:rPr><w:t>opens</w:t></w:r>` +
		`<w:r><w:t xml:space="preserve"> at 3 bar &amp; more.</w:t></w:r><w:del><w:r><w:delText>deleted words</w:delText></w:r></w:del></w:p>` +
		`<w:p/><w:p><w:pPr/></w:p>` +
		`<w:p><w:r><w:t>Part</w:t><w:tab/><w:t>Flow</w:t><w:br/><w:t>Next line</w:t><w:noBreakHyphen/><w:t>x</w:t></w:r></w:p>` +
		`<w:tbl><w:tr><w:tc><w:p><w:r><w:t>Cell A</w:t></w:r></w:p></w:tc><w:tc><w:p><w:r><w:t>Cell B</w:t></w:r></w:p></w:tc></w:tr></w:tbl>` +
		`<w:p><w:r><w:fldChar w:fldCharType="begin"/></w:r><w:r><w:instrText xml:space="preserve"> PAGE </w:instrText></w:r><w:r><w:t>Field result</w:t></w:r></w:p>` +
		`<w:p><w:r><mc:AlternateContent><mc:Choice Requires="wps"><w:drawing><wps:txbx><w:txbxContent><w:p><w:r><w:t>Box text</w:t></w:r></w:p></w:txbxContent></wps:txbx></w:drawing></mc:Choice>` +
		`<mc:Fallback><w:pict><w:txbxContent><w:p><w:r><w:t>Box text</w:t></w:r></w:p></w:txbxContent></w:pict></mc:Fallback></mc:AlternateContent></w:r></w:p>`
	d, ps := readFile(t, "manual.docx", string(docxtest.Zip(t, docxtest.Files(body)...)), Options{})
	require.NotNil(t, d, "%v", ps)
	assert.Empty(t, ps)
	assert.Equal(t, "docx", d.Format)
	assert.Equal(t, "Solenoid valve\n\nThe valve opens at 3 bar & more.\n\nPart\tFlow\nNext line-x\n\nCell A\n\nCell B\n\nField result\n\nBox text", d.Text)
}

func TestDocxNotADocx(t *testing.T) {
	d, ps := readFile(t, "fake.docx", "plain words", Options{})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Equal(t, Error, ps[0].Severity)
	assert.Contains(t, ps[0].Msg, "not a .docx file (not a zip archive")

	d, ps = readFile(t, "other.docx", string(docxtest.Zip(t, "a.txt", "hello")), Options{})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Contains(t, ps[0].Msg, "without word/document.xml")

	d, ps = readFile(t, "broken.docx", string(docxtest.Zip(t, "word/document.xml", docxtest.Head+"<w:p><w:t>x</w:p>")), Options{})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Contains(t, ps[0].Msg, "word/document.xml: XML syntax error")
}

// A document part that honestly declares more than the cap is refused
// before it is inflated.
func TestDocxDeclaredTooBig(t *testing.T) {
	big := "<w:p><w:r><w:t>" + strings.Repeat("valve ", 400_000) + "</w:t></w:r></w:p>" // 2.4 MB
	data := docxtest.Zip(t, docxtest.Files(big)...)
	d, ps := readFile(t, "big.docx", string(data), Options{MaxBytes: 1 << 20})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Contains(t, ps[0].Msg, "refused: word/document.xml declares 2.3 MiB unpacked, more than the 1 MiB limit")
}

// rawZip stores one entry whose directory claims declared bytes while its
// deflate stream holds actual bytes: the size lie of a zip bomb.
func rawZip(t testing.TB, name string, actual []byte, declared uint64) []byte {
	var comp bytes.Buffer
	fw, err := flate.NewWriter(&comp, flate.BestCompression)
	require.NoError(t, err)
	_, err = fw.Write(actual)
	require.NoError(t, err)
	require.NoError(t, fw.Close())
	var b bytes.Buffer
	w := zip.NewWriter(&b)
	hw, err := w.CreateRaw(&zip.FileHeader{
		Name: name, Method: zip.Deflate, CRC32: crc32.ChecksumIEEE(actual),
		CompressedSize64: uint64(comp.Len()), UncompressedSize64: declared,
	})
	require.NoError(t, err)
	_, err = hw.Write(comp.Bytes())
	require.NoError(t, err)
	require.NoError(t, w.Close())
	return b.Bytes()
}

// A zip bomb that lies about its size: 8 MiB of XML white space packed
// into some 8 KiB, declared as 1 KiB. It must be refused without
// inflating more than the cap (archive/zip itself stops at the declared
// size; the reader's own limit is the second guard).
func TestDocxZipBombLyingSize(t *testing.T) {
	actual := []byte(docxtest.Head + strings.Repeat(" ", 8<<20) + docxtest.Tail)
	data := rawZip(t, "word/document.xml", actual, 1024)
	require.Less(t, len(data), 1<<20)
	d, ps := readFile(t, "bomb.docx", string(data), Options{MaxBytes: 1 << 20})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Equal(t, "bomb.docx: refused: word/document.xml does not match the size or checksum the archive declares (a damaged file or a zip bomb)", ps[0].Error())
}

// The reader's own cap, on a stream that is longer than its limit.
func TestLimitedReader(t *testing.T) {
	lr := &limitedReader{r: strings.NewReader(strings.Repeat("x", 100)), n: 10}
	got, err := io.ReadAll(lr)
	assert.Equal(t, errTooBig, err)
	assert.Equal(t, 10, len(got))
	assert.True(t, lr.exceeded)

	lr = &limitedReader{r: strings.NewReader("0123456789"), n: 10}
	got, err = io.ReadAll(lr)
	assert.NoError(t, err)
	assert.Equal(t, "0123456789", string(got))
	assert.False(t, lr.exceeded)

	// And through docxText: a valid document part larger than the cap.
	lr = &limitedReader{r: strings.NewReader(docxtest.Head + "<w:p><w:r><w:t>" + strings.Repeat("a", 1000) + "</w:t></w:r></w:p>" + docxtest.Tail), n: 500}
	_, _, err = docxText(lr, nil)
	assert.True(t, lr.exceeded)
	assert.NotNil(t, err)
}

func TestDocxTooManyEntries(t *testing.T) {
	files := docxtest.Files("<w:p><w:r><w:t>x</w:t></w:r></w:p>")
	for i := 0; i < MaxZipEntries; i++ {
		files = append(files, fmt.Sprintf("word/media/e%05d", i), "")
	}
	d, ps := readFile(t, "many.docx", string(docxtest.Zip(t, files...)), Options{})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Equal(t, fmt.Sprintf("refused: the archive lists %d entries, more than the %d a .docx may have here", MaxZipEntries+2, MaxZipEntries), ps[0].Msg)
}

func TestDocxDeclaredTotalTooBig(t *testing.T) {
	var b bytes.Buffer
	w := zip.NewWriter(&b)
	for _, f := range []struct {
		name string
		size uint64
	}{{"word/document.xml", 10}, {"word/media/huge.bin", 2 << 30}} {
		hw, err := w.CreateRaw(&zip.FileHeader{Name: f.name, Method: zip.Store, UncompressedSize64: f.size})
		require.NoError(t, err)
		_, _ = hw.Write(nil)
	}
	require.NoError(t, w.Close())
	d, ps := readFile(t, "huge.docx", b.String(), Options{})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Contains(t, ps[0].Msg, "refused: the archive declares 2.0 GiB unpacked")
}

// The demo corpus's .docx is written by testdata/tools/mkdocx.py (Python's
// zipfile, not our code) from a marked-up source text. Undoing that
// script's documented markup on the source must give the text we extract:
// one paragraph per non-empty line, "#"/"##" heading marks, "**" bold
// marks and "^" run splits removed, "<br>" a line break.
func TestDocxDemoAgainstSource(t *testing.T) {
	root := testenv.Root(t)
	src, err := os.ReadFile(filepath.Join(root, "testdata", "tools", "hv-valve-service-manual.txt"))
	require.NoError(t, err)
	var paras []string
	for _, line := range strings.Split(string(src), "\n") {
		if strings.TrimSpace(line) == "" {
			continue
		}
		line = strings.TrimPrefix(strings.TrimPrefix(line, "## "), "# ")
		line = strings.NewReplacer("**", "", "^", "", "<br>", "\n").Replace(line)
		paras = append(paras, line)
	}
	p := filepath.Join(root, "testdata", "demo", "hv-valve-service-manual.docx")
	d, ps := Read(Input{Name: "manual.docx", Path: p}, Options{})
	require.NotNil(t, d, "%v", ps)
	assert.Empty(t, ps)
	assert.Equal(t, strings.Join(paras, "\n\n"), d.Text)
}
