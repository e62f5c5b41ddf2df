// Package docxtest builds small .docx archives in tests, so that the
// reader's tests and those of the stages after it (headings tagged as
// such) write WordprocessingML bodies, not zip files.
package docxtest

import (
	"archive/zip"
	"bytes"
	"testing"

	"github.com/stretchr/testify/require"
)

// Head and Tail wrap a body of w:p paragraphs into word/document.xml,
// with the w:, mc: (Markup Compatibility) and wps: namespaces declared.
const (
	Head = `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<w:document xmlns:w="http://schemas.openxmlformats.org/wordprocessingml/2006/main" xmlns:mc="http://schemas.openxmlformats.org/markup-compatibility/2006" xmlns:wps="http://schemas.microsoft.com/office/word/2010/wordprocessingShape"><w:body>`
	Tail = `<w:sectPr/></w:body></w:document>`
)

// StylesHead and StylesTail wrap w:style elements into word/styles.xml.
const (
	StylesHead = `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<w:styles xmlns:w="http://schemas.openxmlformats.org/wordprocessingml/2006/main">`
	StylesTail = `</w:styles>`
)

// Zip packs name → content pairs, in order, into a zip archive.
func Zip(t testing.TB, files ...string) []byte {
	t.Helper()
	var b bytes.Buffer
	w := zip.NewWriter(&b)
	for i := 0; i+1 < len(files); i += 2 {
		f, err := w.Create(files[i])
		require.NoError(t, err)
		_, err = f.Write([]byte(files[i+1]))
		require.NoError(t, err)
	}
	require.NoError(t, w.Close())
	return b.Bytes()
}

// Files are the name → content pairs of a document whose body is body,
// for Zip; styles, when not empty, are the w:style elements of its
// word/styles.xml.
func Files(body string, styles ...string) []string {
	files := []string{
		"[Content_Types].xml", `<?xml version="1.0"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"/>`,
		"word/document.xml", Head + body + Tail,
	}
	if len(styles) > 0 {
		var s string
		for _, st := range styles {
			s += st
		}
		files = append(files, "word/styles.xml", StylesHead+s+StylesTail)
	}
	return files
}
