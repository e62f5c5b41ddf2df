package read

import (
	"os"
	"os/exec"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// needPdftotext skips the test when pdftotext is missing, except under CI
// (CI=true), whose setup installs poppler-utils, where it fails.
func needPdftotext(t *testing.T) {
	t.Helper()
	if _, err := exec.LookPath("pdftotext"); err != nil {
		if os.Getenv("CI") == "true" {
			t.Fatal("pdftotext is not on PATH; CI must install poppler-utils")
		}
		t.Skip("pdftotext is not on PATH; install poppler-utils to run this test")
	}
}

func TestPDFWithoutPdftotext(t *testing.T) {
	t.Setenv("PATH", t.TempDir())
	d, ps := Read(Input{Name: "card.pdf", Path: fixture(t, "quick-reference.pdf")}, Options{})
	if d != nil {
		t.Fatal("read a PDF without pdftotext")
	}
	require.Len(t, ps, 1)
	assert.Equal(t, Error, ps[0].Severity)
	assert.Equal(t, "card.pdf: reading PDF needs the pdftotext program, which is not on PATH; install it with the poppler-utils package (Debian/Ubuntu: apt-get install poppler-utils)", ps[0].Error())
}

func TestPDF(t *testing.T) {
	needPdftotext(t)
	p := fixture(t, "quick-reference.pdf")
	d, ps := Read(Input{Name: "card.pdf", Path: p}, Options{})
	require.NotNil(t, d, "%v", ps)
	assert.Empty(t, ps)
	assert.Equal(t, "pdf", d.Format)

	// The words are those of pdftotext's plain output, in the same order:
	// the -bbox-layout route only adds paragraph breaks.
	plain, err := exec.Command("pdftotext", "-enc", "UTF-8", p, "-").Output()
	require.NoError(t, err)
	assert.Equal(t, strings.Fields(string(plain)), strings.Fields(d.Text))
	assert.Equal(t, strings.Count(string(plain), "\f"), 2, "the fixture has two pages")

	// Blocks are paragraphs: the title does not run into the next line, and
	// the second page starts a paragraph.
	paras := strings.Split(d.Text, "\n\n")
	assert.Equal(t, "HV-25 Solenoid Valve: Quick Reference", paras[0])
	found := false
	for _, para := range paras {
		found = found || strings.HasPrefix(para, "PR-150 Pressure Regulator")
	}
	assert.True(t, found, "page 2 starts a paragraph: %q", d.Text)

	// The same PDF gzipped and from standard input gives the same text.
	raw, err := os.ReadFile(p)
	require.NoError(t, err)
	gzPath := writeFile(t, t.TempDir(), "card.pdf.gz", gz(t, raw))
	d2, ps := Read(Input{Name: "card.pdf.gz", Path: gzPath}, Options{})
	require.NotNil(t, d2, "%v", ps)
	assert.Equal(t, d.Text, d2.Text)
	gzPath = writeFile(t, t.TempDir(), "card", gz(t, raw)) // gzip and PDF both found by content
	d2, ps = Read(Input{Name: "card", Path: gzPath}, Options{})
	require.NotNil(t, d2, "%v", ps)
	assert.Equal(t, d.Text, d2.Text)
	f, err := os.Open(p)
	require.NoError(t, err)
	defer f.Close()
	d3, ps := Read(Input{Name: "-", Path: "-"}, Options{Stdin: f})
	require.NotNil(t, d3, "%v", ps)
	assert.Equal(t, "pdf", d3.Format)
	assert.Equal(t, d.Text, d3.Text)

	// A limit smaller than the text stops the reading of the markup.
	out, err := exec.Command("pdftotext", "-enc", "UTF-8", "-bbox-layout", p, "-").Output()
	require.NoError(t, err)
	text, tooBig := bboxText(strings.NewReader(string(out)), 100)
	assert.True(t, tooBig)
	assert.Nil(t, text)
	text, tooBig = bboxText(strings.NewReader(string(out)), int64(len(d.Text)))
	assert.False(t, tooBig)
	assert.Equal(t, d.Text, string(text))
}

func TestPDFBroken(t *testing.T) {
	needPdftotext(t)
	dir := t.TempDir()
	p := writeFile(t, dir, "bad.pdf", []byte("%PDF-1.4\ngarbage\n"))
	d, ps := Read(Input{Name: "bad.pdf", Path: p}, Options{})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Equal(t, Error, ps[0].Severity)
	assert.Contains(t, ps[0].Msg, "pdftotext failed: ")

	p = writeFile(t, dir, "notes.pdf", []byte("just text"))
	d, ps = Read(Input{Name: "notes.pdf", Path: p}, Options{})
	assert.Nil(t, d)
	require.Len(t, ps, 1)
	assert.Equal(t, "notes.pdf: not a PDF file (no %PDF- header)", ps[0].Error())

	// A file whose name starts with "-" is not taken for an option.
	raw, err := os.ReadFile(fixture(t, "quick-reference.pdf"))
	require.NoError(t, err)
	writeFile(t, dir, "-card.pdf", raw)
	t.Chdir(dir)
	d, ps = Read(Input{Name: "-card.pdf", Path: "-card.pdf"}, Options{})
	require.NotNil(t, d, "%v", ps)
}
