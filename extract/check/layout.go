package check

import (
	"bytes"
	"compress/gzip"
	"io"
	"sort"
	"strings"
	"unicode/utf8"

	"golang.org/x/net/html"
	"golang.org/x/text/encoding"
	"golang.org/x/text/encoding/charmap"
	"golang.org/x/text/encoding/htmlindex"

	"glossmith/tagger/doc"
)

// SkipMarker, anywhere in a line, silences the findings of the next line
// that has text. In Markdown and HTML it goes in a comment,
// "<!-- glossmith:skip-next-line -->" (the readers drop comments, so the
// check looks for it in the source); in plain text and DOCX it is a line
// of its own.
const SkipMarker = "glossmith:skip-next-line"

// layout turns byte offsets of a document's plain text into the lines and
// columns of its original file, and knows which parts of the text are not
// prose to check: code, silenced lines.
//
// Markdown and HTML: the readers keep where each piece of text came from
// in the file (doc.Document.Origins), so lines and columns are the
// file's, markup counted as written. Plain text: the text's lines are the
// file's. DOCX and PDF: lines of the extracted text. Where no origins say
// otherwise, a column counts the characters of the text line as read,
// those that normalization removed or composed included.
type layout struct {
	d         *doc.Document
	lineStart []int    // byte offset in the text of each line's start
	src       []string // source lines (Markdown, plain text), or nil
	srcCode   map[int][][2]int
	code      [][2]int     // byte ranges of the file that are code (HTML)
	skip      map[int]bool // silenced lines
	// The last offset position counted runes to, and its line and rune
	// count: uses come in text order, mostly, and counting on from there
	// keeps a long line from being counted again for each.
	lastOff, lastLine, lastRunes int
}

// newLayout reads what the check needs of a document's source file, src
// (nil when there is none to read, as for standard input: columns then
// count the text's characters), in encoding enc (see Options.Encoding).
func newLayout(d *doc.Document, src []byte, enc string) *layout {
	l := &layout{d: d, lineStart: []int{0}, skip: map[int]bool{}}
	for i := 0; ; {
		j := strings.IndexByte(d.Text[i:], '\n')
		if j < 0 {
			break
		}
		i += j + 1
		l.lineStart = append(l.lineStart, i)
	}
	src = gunzipped(src)
	switch d.Format {
	case "md", "txt":
		// A plain text's source lines serve only to find skip markers.
		if d.Format == "txt" && !bytes.Contains(src, []byte(SkipMarker)) {
			break
		}
		if src = decodeSource(src, enc); src != nil {
			l.src = strings.Split(strings.ReplaceAll(string(src), "\r\n", "\n"), "\n")
			for i, s := range l.src {
				l.src[i] = strings.TrimSuffix(s, "\r")
			}
			if len(l.src) < len(l.lineStart) {
				l.src = nil // not the file the text came from
			}
		}
	case "html":
		if u := newUTF16Source(src); u != nil {
			l.htmlMarks(u.decoded(), u.fileOffset)
		} else if src != nil {
			l.htmlMarks(src, nil) // tags are ASCII in any encoding but UTF-16
		}
	}
	if d.Format != "html" && strings.Contains(d.Text, SkipMarker) { // lines of the text are lines of the file (or all there is)
		l.markSkips(func(n int) string { return l.textLine(n) }, len(l.lineStart))
	}
	if l.src != nil {
		l.markSkips(func(n int) string { return l.src[n-1] }, len(l.src))
	}
	return l
}

// gunzipped returns a source file's bytes, decompressed when they are
// gzip data (the offsets of doc.Document.ReadOffset are of those); nil
// when they cannot be.
func gunzipped(src []byte) []byte {
	if len(src) > 2 && src[0] == 0x1f && src[1] == 0x8b {
		zr, err := gzip.NewReader(bytes.NewReader(src))
		if err != nil {
			return nil
		}
		src, err = io.ReadAll(io.LimitReader(zr, 256<<20))
		if err != nil {
			return nil
		}
	}
	return src
}

// decodeSource returns a source file's bytes as text, without a byte
// order mark, decoded as the reader decodes a text file: UTF-16 by its
// byte order mark; else in enc when one is named; else UTF-8 when valid,
// else Windows-1252. Nil when enc is unknown.
func decodeSource(src []byte, enc string) []byte {
	if u := newUTF16Source(src); u != nil {
		return u.decoded()
	}
	if bytes.HasPrefix(src, []byte("\xef\xbb\xbf")) {
		return src[3:]
	}
	if enc == "" && utf8.Valid(src) {
		return src
	}
	var e encoding.Encoding = charmap.Windows1252
	if enc != "" {
		var err error
		if e, err = htmlindex.Get(enc); err != nil {
			return nil
		}
	}
	out, err := e.NewDecoder().Bytes(src)
	if err != nil {
		return nil
	}
	return out
}

// textLine returns text line n (1-based) without its newline.
func (l *layout) textLine(n int) string {
	from := l.lineStart[n-1]
	to := len(l.d.Text)
	if n < len(l.lineStart) {
		to = l.lineStart[n] - 1
	}
	return l.d.Text[from:to]
}

// markSkips silences the line after each line holding SkipMarker: the next
// one with text.
func (l *layout) markSkips(line func(n int) string, lines int) {
	for n := 1; n <= lines; n++ {
		if !strings.Contains(line(n), SkipMarker) {
			continue
		}
		for m := n + 1; m <= lines; m++ {
			if strings.TrimSpace(strings.ReplaceAll(line(m), "\u2029", "")) != "" {
				l.skip[m] = true
				break
			}
		}
	}
}

// position returns the 1-based line and column of byte offset off of the
// text.
func (l *layout) position(off int) (line, col int) {
	if line, col, ok := l.d.SourcePosition(off, false); ok {
		return line, col
	}
	line, r := l.runeIndex(off)
	return line, l.column(line, r, off)
}

// runeIndex returns the line of byte offset off and the number of runes
// before it on its line.
func (l *layout) runeIndex(off int) (line, r int) {
	if l.lastLine > 0 && off >= l.lastOff && (l.lastLine == len(l.lineStart) || off < l.lineStart[l.lastLine]) {
		line = l.lastLine
		r = l.lastRunes + utf8.RuneCountInString(l.d.Text[l.lastOff:off])
	} else {
		line = sort.Search(len(l.lineStart), func(i int) bool { return l.lineStart[i] > off })
		r = utf8.RuneCountInString(l.d.Text[l.lineStart[line-1]:off])
	}
	l.lastOff, l.lastLine, l.lastRunes = off, line, r
	return line, r
}

// column turns the rune index r of text line n, at byte offset off of
// the text, into a 1-based column of the text as read, counting the
// characters normalization removed or composed (doc.Document.ColumnShift).
func (l *layout) column(n, r, off int) int {
	return r + 1 + l.d.ColumnShift(l.lineStart[n-1], off)
}

// span sets the finding's start and end (just past its last character).
// The end is counted on from the start, so that the spans of a sentence,
// which come in order of their starts, are counted once.
func (l *layout) span(f *Finding) {
	if line, col, ok := l.d.SourcePosition(f.Start, false); ok {
		f.Line, f.Column = line, col
		f.EndLine, f.EndColumn, _ = l.d.SourcePosition(f.End, true)
		return
	}
	line, r := l.runeIndex(f.Start)
	f.Line, f.Column = line, l.column(line, r, f.Start)
	_, last := utf8.DecodeLastRuneInString(l.d.Text[:f.End])
	endOff := f.End - last
	if between := l.d.Text[f.Start:endOff]; strings.IndexByte(between, '\n') < 0 {
		f.EndLine, f.EndColumn = line, l.column(line, r+utf8.RuneCountInString(between), endOff)+1
		return
	}
	f.EndLine, f.EndColumn = l.position(endOff)
	f.EndColumn++
}

// inCode reports whether any character of the finding is code: in an
// inline code span of a Markdown line ("`setpoint`", <code>, <kbd>,
// <samp>), or in an HTML code element (code, pre, kbd, samp, tt, var).
// (Fenced and indented code blocks never reach the text.)
func (l *layout) inCode(f *Finding) bool {
	if l.code != nil {
		from, to := l.d.ReadOffset(f.Start), l.d.ReadEnd(f.End)
		for _, c := range l.code {
			if from < c[1] && c[0] < to {
				return true
			}
		}
	}
	if l.src == nil || l.d.Format != "md" {
		return false
	}
	for line := f.Line; line <= f.EndLine; line++ {
		ranges, ok := l.srcCode[line]
		if !ok {
			ranges = codeSpans([]rune(l.src[line-1]))
			if l.srcCode == nil {
				l.srcCode = map[int][][2]int{}
			}
			l.srcCode[line] = ranges
		}
		from, to := 1, 1<<30
		if line == f.Line {
			from = f.Column
		}
		if line == f.EndLine {
			to = f.EndColumn
		}
		for _, c := range ranges {
			// c holds 0-based rune indexes [c0, c1); columns are 1-based.
			if from-1 < c[1] && c[0] < to-1 {
				return true
			}
		}
	}
	return false
}

// codeSpans returns the rune ranges of a Markdown line that are code: the
// insides of backtick code spans (a run of n backticks closed by the next
// run of exactly n) and of inline <code>, <kbd>, <samp> and <tt> elements.
func codeSpans(s []rune) [][2]int {
	var out [][2]int
	for x := 0; x < len(s); {
		if s[x] != '`' || x > 0 && s[x-1] == '\\' {
			x++
			continue
		}
		n := 0
		for x+n < len(s) && s[x+n] == '`' {
			n++
		}
		closed := false
		for y := x + n; y < len(s); {
			if s[y] != '`' {
				y++
				continue
			}
			m := 0
			for y+m < len(s) && s[y+m] == '`' {
				m++
			}
			if m == n {
				out = append(out, [2]int{x + n, y})
				x, closed = y+n, true
				break
			}
			y += m
		}
		if !closed {
			x += n
		}
	}
	line := strings.ToLower(string(s))
	for _, tag := range []string{"code", "kbd", "samp", "tt"} {
		for from := 0; ; {
			i := strings.Index(line[from:], "<"+tag+">")
			if i < 0 {
				break
			}
			open := from + i + len(tag) + 2
			j := strings.Index(line[open:], "</"+tag+">")
			if j < 0 {
				break
			}
			out = append(out, [2]int{utf8.RuneCountInString(line[:open]), utf8.RuneCountInString(line[:open+j])})
			from = open + j
		}
	}
	return out
}

// htmlMarks finds, in an HTML file's text src, the code elements and the
// skip comments: code is a range of the file's bytes, which the reader's
// offsets (doc.Document.ReadOffset) are compared with; a skip comment
// silences the line of the first text after it. fileOffset turns offsets
// of src into the file's bytes, for a text decoded from the file (UTF-16);
// nil when src is the file's bytes.
func (l *layout) htmlMarks(src []byte, fileOffset func(int) int) {
	at := func(off int) int {
		if fileOffset == nil {
			return off
		}
		return fileOffset(off)
	}
	z := html.NewTokenizer(bytes.NewReader(src))
	off, codeDepth, codeStart := 0, 0, 0
	for {
		tt := z.Next()
		if tt == html.ErrorToken {
			break
		}
		n := len(z.Raw())
		switch tt {
		case html.CommentToken:
			if strings.Contains(string(z.Text()), SkipMarker) {
				l.skipAfter(at(off + n))
			}
		case html.StartTagToken, html.EndTagToken:
			name, _ := z.TagName()
			if !htmlCode[string(name)] {
				break
			}
			if tt == html.StartTagToken {
				if codeDepth == 0 {
					codeStart = at(off + n)
				}
				codeDepth++
			} else if codeDepth > 0 {
				if codeDepth--; codeDepth == 0 {
					l.code = append(l.code, [2]int{codeStart, at(off)})
				}
			}
		}
		off += n
	}
	if codeDepth > 0 {
		l.code = append(l.code, [2]int{codeStart, at(off)})
	}
}

// skipAfter silences the line of the first text at or after byte offset
// at of the file.
func (l *layout) skipAfter(at int) {
	text := l.d.Text
	t := sort.Search(len(text), func(t int) bool { return l.d.ReadOffset(t) >= at })
	for t < len(text) && (text[t] == ' ' || text[t] == '\n' || !utf8.RuneStart(text[t])) {
		t++
	}
	if t < len(text) {
		line, _ := l.position(t)
		l.skip[line] = true
	}
}

// htmlCode are the elements whose text is code, not prose.
var htmlCode = map[string]bool{"code": true, "pre": true, "kbd": true, "samp": true, "tt": true, "var": true}
