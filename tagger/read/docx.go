package read

import (
	"archive/zip"
	"bytes"
	"encoding/xml"
	"errors"
	"io"
	"strings"
	"unicode/utf8"

	"glossmith/tagger/doc"
)

// Limits on .docx archives, checked before anything is unpacked. A Word
// document has a few dozen entries and unpacks to a few times its size;
// these are far beyond that and far below what would hurt the machine.
const (
	// MaxZipEntries is the most entries a .docx archive may list.
	MaxZipEntries = 10000
	// MaxZipTotal caps the sum of the uncompressed sizes the archive
	// declares for all its entries.
	MaxZipTotal = 1 << 30
)

// wordNS is the WordprocessingML main namespace (ECMA-376 Part 1, 17).
const wordNS = "http://schemas.openxmlformats.org/wordprocessingml/2006/main"

// mcNS is the Markup Compatibility namespace (ECMA-376 Part 3), whose
// mc:Fallback repeats the content of mc:Choice for older readers.
const mcNS = "http://schemas.openxmlformats.org/markup-compatibility/2006"

// docx reads the body text of word/document.xml; see the package comment.
func (r *reader) docx(data []byte, limit int64) *doc.Document {
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		r.skipf("not a .docx file (not a zip archive: %v)", err)
		return nil
	}
	if len(zr.File) > MaxZipEntries {
		r.errorf(0, "refused: the archive lists %d entries, more than the %d a .docx may have here", len(zr.File), MaxZipEntries)
		return nil
	}
	var total uint64
	var body *zip.File
	for _, f := range zr.File {
		total += f.UncompressedSize64
		if f.Name == "word/document.xml" {
			body = f
		}
	}
	if total > MaxZipTotal {
		r.errorf(0, "refused: the archive declares %s unpacked, more than the %s limit", size(int64(min(total, 1<<62))), size(MaxZipTotal))
		return nil
	}
	if body == nil {
		r.skipf("not a .docx file (a zip archive without word/document.xml)")
		return nil
	}
	if body.UncompressedSize64 > uint64(limit) {
		r.errorf(0, "refused: word/document.xml declares %s unpacked, more than the %s limit on one document", size(int64(min(body.UncompressedSize64, 1<<62))), size(limit))
		return nil
	}
	rc, err := body.Open()
	if err != nil {
		r.errorf(0, "cannot unpack word/document.xml: %v", err)
		return nil
	}
	defer rc.Close()
	// Declared sizes can lie: cap what is actually inflated as well.
	lr := &limitedReader{r: rc, n: limit}
	text, err := docxText(lr)
	if lr.exceeded {
		r.errorf(0, "refused: word/document.xml unpacks to more than the %s limit on one document", size(limit))
		return nil
	}
	switch {
	case errors.Is(err, zip.ErrFormat), errors.Is(err, zip.ErrChecksum):
		r.errorf(0, "refused: word/document.xml does not match the size or checksum the archive declares (a damaged file or a zip bomb)")
		return nil
	case err != nil:
		r.errorf(0, "word/document.xml: %v", err)
		return nil
	}
	return &doc.Document{Text: text}
}

// limitedReader is io.LimitReader that remembers hitting the limit, so
// a cut-off stream is told apart from a short one.
type limitedReader struct {
	r        io.Reader
	n        int64
	exceeded bool
}

var errTooBig = errors.New("size limit exceeded")

func (l *limitedReader) Read(p []byte) (int, error) {
	if l.n <= 0 {
		var one [1]byte
		if k, _ := l.r.Read(one[:]); k > 0 {
			l.exceeded = true
			return 0, errTooBig
		}
		return 0, io.EOF
	}
	if int64(len(p)) > l.n {
		p = p[:l.n]
	}
	k, err := l.r.Read(p)
	l.n -= int64(k)
	return k, err
}

// docxText walks WordprocessingML: each w:p is a paragraph (a blank line
// between non-empty ones), w:t its text, w:tab a tab, w:br and w:cr a line
// break, w:noBreakHyphen a hyphen. Deleted text (w:delText), field codes
// (w:instrText) and mc:Fallback copies are not w:t or are skipped.
func docxText(rd io.Reader) (string, error) {
	dec := xml.NewDecoder(rd)
	dec.Strict = true
	var b strings.Builder
	inText := 0   // depth inside w:t
	fallback := 0 // depth inside mc:Fallback
	paraHasText := false
	pendingPara := false
	emit := func(s string) {
		if s == "" {
			return
		}
		if pendingPara && b.Len() > 0 {
			b.WriteString("\n\n")
		}
		pendingPara = false
		paraHasText = true
		b.WriteString(s)
	}
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			return "", err
		}
		switch t := tok.(type) {
		case xml.StartElement:
			if t.Name.Space == mcNS && t.Name.Local == "Fallback" || fallback > 0 {
				fallback++
				continue
			}
			if t.Name.Space != wordNS {
				continue
			}
			switch t.Name.Local {
			case "p":
				if paraHasText {
					pendingPara = true
				}
				paraHasText = false
			case "t":
				inText++
			case "tab", "ptab":
				emit("\t")
			case "br", "cr":
				emit("\n")
			case "noBreakHyphen":
				emit("-")
			}
		case xml.EndElement:
			if fallback > 0 {
				fallback--
				continue
			}
			if t.Name.Space == wordNS {
				switch t.Name.Local {
				case "t":
					inText--
				case "p":
					if paraHasText {
						pendingPara = true
					}
				}
			}
		case xml.CharData:
			if inText > 0 && fallback == 0 {
				emit(cleanXMLText(string(t)))
			}
		}
	}
	return strings.TrimRight(b.String(), "\n\t "), nil
}

// cleanXMLText keeps line and paragraph breaks out of w:t text (Word puts
// them in w:br and w:p) and guarantees valid UTF-8.
func cleanXMLText(s string) string {
	if !utf8.ValidString(s) {
		s = strings.ToValidUTF8(s, "\uFFFD")
	}
	return strings.Map(func(r rune) rune {
		switch r {
		case '\n', '\r', '\u2028', '\u2029', '\u0085':
			return ' '
		}
		return r
	}, s)
}
