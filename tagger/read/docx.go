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
	var body, stylePart *zip.File
	for _, f := range zr.File {
		total += f.UncompressedSize64
		switch f.Name {
		case "word/document.xml":
			body = f
		case "word/styles.xml":
			stylePart = f
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
	styles := r.docxStyles(stylePart, limit)
	rc, err := body.Open()
	if err != nil {
		r.errorf(0, "cannot unpack word/document.xml: %v", err)
		return nil
	}
	defer rc.Close()
	// Declared sizes can lie: cap what is actually inflated as well.
	lr := &limitedReader{r: rc, n: limit}
	text, heads, err := docxText(lr, styles)
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
	return &doc.Document{Text: text, Headings: heads}
}

// docxStyles reads the heading styles of word/styles.xml, or returns nil
// when the archive has none. A part that cannot be read costs only the
// headings it would have marked: a Warning, and the text is read.
func (r *reader) docxStyles(f *zip.File, limit int64) docxStyles {
	if f == nil {
		return nil
	}
	rc, err := f.Open()
	if err == nil {
		defer rc.Close()
		lr := &limitedReader{r: rc, n: limit}
		var styles docxStyles
		if styles, err = readDocxStyles(lr); err == nil {
			return styles
		}
	}
	r.warnf(0, "word/styles.xml not read (%v); headings are found by the built-in style names only", err)
	return nil
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
// (w:instrText) and mc:Fallback copies are not w:t or are skipped. The
// lines of the paragraphs that are headings (see docxStyles.heading) are
// returned with the text.
func docxText(rd io.Reader, styles docxStyles) (string, []doc.LineRange, error) {
	dec := xml.NewDecoder(rd)
	dec.Strict = true
	var b strings.Builder
	inText := 0   // depth inside w:t
	fallback := 0 // depth inside mc:Fallback
	paraHasText := false
	pendingPara := false
	breaks := int32(0) // line breaks written
	// The paragraphs open (a text box's paragraphs lie inside another's):
	// whether each is a heading, and the line of its first text.
	type para struct {
		heading bool
		first   int32
	}
	var paras []para
	var heads []doc.LineRange
	inPPr, inPPrChange := 0, 0 // depth inside w:pPr, and its record of a revision's old properties
	emit := func(s string) {
		if s == "" {
			return
		}
		if pendingPara && b.Len() > 0 {
			b.WriteString("\n\n")
			breaks += 2
		}
		pendingPara = false
		paraHasText = true
		if n := len(paras); n > 0 && paras[n-1].first == 0 && s != "\n" {
			paras[n-1].first = breaks + 1
		}
		b.WriteString(s)
		if s == "\n" {
			breaks++
		}
	}
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			return "", nil, err
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
				paras = append(paras, para{})
			case "pPr":
				inPPr++
			case "pPrChange":
				inPPrChange++
			case "pStyle", "outlineLvl":
				if n := len(paras); n > 0 && inPPr > 0 && inPPrChange == 0 {
					v := wordAttr(t, "val")
					if t.Name.Local == "pStyle" {
						paras[n-1].heading = styles.heading(v)
					} else {
						paras[n-1].heading = isOutlineLevel(v)
					}
				}
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
				case "pPr":
					inPPr--
				case "pPrChange":
					inPPrChange--
				case "p":
					if paraHasText {
						pendingPara = true
					}
					if n := len(paras); n > 0 {
						if p := paras[n-1]; p.heading && p.first > 0 {
							heads = append(heads, doc.LineRange{First: p.first, Last: breaks + 1})
						}
						paras = paras[:n-1]
					}
				}
			}
		case xml.CharData:
			if inText > 0 && fallback == 0 {
				emit(cleanXMLText(string(t)))
			}
		}
	}
	text := strings.TrimRight(b.String(), "\n\t ")
	return text, withinLines(mergeRanges(heads), text), nil
}

// wordAttr returns the value of the w: attribute local of an element.
func wordAttr(t xml.StartElement, local string) string {
	for _, a := range t.Attr {
		if a.Name.Space == wordNS && a.Name.Local == local {
			return a.Value
		}
	}
	return ""
}

// isOutlineLevel reports a w:outlineLvl value that puts a paragraph in
// the document's outline: 0 to 8 are the levels, 9 is body text
// (ECMA-376 Part 1, the outlineLvl element).
func isOutlineLevel(v string) bool { return len(v) == 1 && '0' <= v[0] && v[0] <= '8' }

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

// docxStyles are the paragraph styles of word/styles.xml that make a
// paragraph a heading: by style ID.
type docxStyles map[string]bool

// heading reports whether the paragraph style with this ID is a heading
// or caption style. Without word/styles.xml (which a package may leave
// out) the built-in IDs Word writes are taken at their word.
func (s docxStyles) heading(id string) bool {
	if s != nil {
		return s[id]
	}
	return isHeadingStyleName(id) || isHeadingStyleName(strings.TrimRight(id, "123456789"))
}

// isHeadingStyleName reports the names of Word's built-in heading,
// title and caption styles ("heading 1" to "heading 9", "Title",
// "Subtitle", "caption"), in any case and spacing ("Heading1" is the ID
// of "heading 1").
func isHeadingStyleName(name string) bool {
	n := strings.ToLower(strings.ReplaceAll(name, " ", ""))
	if rest, ok := strings.CutPrefix(n, "heading"); ok {
		return len(rest) == 1 && '1' <= rest[0] && rest[0] <= '9'
	}
	return n == "title" || n == "subtitle" || n == "caption"
}

// readDocxStyles reads the paragraph styles of word/styles.xml: a style
// is a heading when its name is that of a built-in heading, title or
// caption style, or when it puts paragraphs in the outline (w:outlineLvl
// 0 to 8), itself or through the styles it is based on.
func readDocxStyles(rd io.Reader) (docxStyles, error) {
	type style struct {
		heading bool
		level   string // w:outlineLvl, "" when not set
		basedOn string
	}
	styles := map[string]*style{}
	dec := xml.NewDecoder(rd)
	dec.Strict = true
	var cur *style
	depth, curDepth := 0, 0
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
		switch t := tok.(type) {
		case xml.StartElement:
			depth++
			if t.Name.Space != wordNS {
				continue
			}
			switch t.Name.Local {
			case "style":
				cur, curDepth = nil, depth
				if wordAttr(t, "type") == "paragraph" {
					cur = &style{}
					styles[wordAttr(t, "styleId")] = cur
				}
			case "name":
				if cur != nil && depth == curDepth+1 {
					cur.heading = isHeadingStyleName(wordAttr(t, "val"))
				}
			case "basedOn":
				if cur != nil && depth == curDepth+1 {
					cur.basedOn = wordAttr(t, "val")
				}
			case "outlineLvl":
				if cur != nil && depth == curDepth+2 { // in the style's w:pPr
					cur.level = wordAttr(t, "val")
				}
			}
		case xml.EndElement:
			if depth == curDepth {
				cur = nil
			}
			depth--
		}
	}
	out := docxStyles{}
	for id, st := range styles {
		// The nearest outline level set along the basedOn chain decides;
		// else a heading style's name on it. (The chain is followed at most len(styles) steps:
		// a file may make it a loop.)
		heading, named := false, false
		for s, steps := st, 0; ; s, steps = styles[s.basedOn], steps+1 {
			if s == nil || steps > len(styles) {
				heading = named
				break
			}
			if s.level != "" {
				heading = isOutlineLevel(s.level)
				break
			}
			named = named || s.heading
		}
		out[id] = heading
	}
	return out, nil
}
