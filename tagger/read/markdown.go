package read

import (
	"bufio"
	"bytes"
	"html"
	"regexp"
	"slices"
	"strings"

	"github.com/yuin/goldmark"
	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/extension"
	east "github.com/yuin/goldmark/extension/ast"
	mdhtml "github.com/yuin/goldmark/renderer/html"
	"github.com/yuin/goldmark/text"
	xhtml "golang.org/x/net/html"

	"glossmith/tagger/doc"
)

// paraSep is U+2029 PARAGRAPH SEPARATOR. The Markdown reader puts it where a
// block (heading, paragraph, list item, table cell, quote, footnote) begins
// on the line of, or the line right after, other text, since it may not add
// the blank line that would otherwise mark the break without shifting the
// line numbers of everything below. Unicode defines it as a paragraph
// break (The Unicode Standard, section 5.8 "Newline Guidelines"; UAX #29
// rule SB4 ends a sentence after it).
const paraSep = "\u2029"

var (
	mdFrontYAML = regexp.MustCompile(`^(---|\.\.\.)[ \t]*$`)
	mdFrontTOML = regexp.MustCompile(`^\+\+\+[ \t]*$`)
)

// mdParser is goldmark's CommonMark parser with the GitHub extensions
// (tables, strikethrough, task lists, autolinked URLs) and footnotes. A
// hand-written line reader got CommonMark's many context rules wrong
// (wrapped link text, "2019." at a line start taken for a list item, tags
// and link definitions over several lines); goldmark passes the
// specification's examples. Parsers are safe for concurrent use.
var mdParser = goldmark.New(goldmark.WithExtensions(extension.GFM, extension.Footnote)).Parser()

// markdown keeps the text a renderer would show, each piece on the line of
// the source where it stands; see the package comment for the rules. The
// text has exactly the source's lines.
func (r *reader) markdown(s string) *doc.Document {
	if c := r.capLines(normalizeNewlines(s)); c != s {
		r.coding.altered = true // Source maps the lines on to the file's
		s = c
	}
	r.mdSource = s
	src := []byte(s)
	blankFrontMatter(src)
	hid := hideDeepNesting(src)
	root := mdParser.Parse(text.NewReader(src))
	for _, h := range hid { // the tree points into src: its texts get them back
		src[h.at] = h.c
	}
	m := &mdText{src: src, source: s, lineStart: lineStarts(src)}
	m.walk(root)
	text, origins := m.assemble()
	return &doc.Document{Text: text, Headings: m.headings, Origins: origins}
}

// lineStarts returns the byte offset of the start of each line of src.
func lineStarts(src []byte) []int {
	starts := make([]int, 1, bytes.Count(src, []byte{'\n'})+1)
	for i, c := range src {
		if c == '\n' {
			starts = append(starts, i+1)
		}
	}
	return starts
}

// blankFrontMatter replaces a YAML ("---") or TOML ("+++") front matter
// block at the top of the file by spaces, keeping its line breaks, so that
// the parser sees blank lines and every offset stays where it was.
func blankFrontMatter(src []byte) {
	first, _, _ := bytes.Cut(src, []byte{'\n'})
	var closer *regexp.Regexp
	switch strings.TrimRight(string(first), " \t") {
	case "---":
		closer = mdFrontYAML
	case "+++":
		closer = mdFrontTOML
	default:
		return
	}
	off := len(first) + 1
	for off < len(src) {
		line, _, _ := bytes.Cut(src[off:], []byte{'\n'})
		end := off + len(line)
		if closer.Match(line) {
			for i := 0; i < end; i++ {
				if src[i] != '\n' {
					src[i] = ' '
				}
			}
			return
		}
		off = end + 1
	}
	// not closed: a thematic break, not front matter
}

// maxNesting bounds the nesting the parser sees, for three constructs
// whose cost in goldmark grows with the square of their number: nested
// "[" (its link parser spends time in proportion to the text after an
// open bracket at each "]": 100,000 pairs took 10 s), "](" inside a run
// of text without spaces that never closes its "(" (each starts a link
// destination that is scanned to the end of the run: 50,000 took 51 s),
// and ">" quote markers at a line start (50,000 took 4 s). No prose nests
// any of them this deep; CommonMark lets implementations limit nesting
// for this reason (section 6.3 on parentheses in link destinations).
const maxNesting = 32

// hiddenByte stands for a markup character hidden from the parser:
// 0xFF is never part of UTF-8 text, so it cannot be mistaken for anything
// else; once the tree is built, each goes back to the character it
// replaced (hideDeepNesting records which).
const hiddenByte = 0xFF

// hideDeepNesting replaces, by hiddenByte, each "[" nested more than
// maxNesting deep in a paragraph (the depth starts again after a blank
// line), each "]" of a "](" met when maxNesting "(" of the same
// space-free run are open, and each ">" after the first maxNesting of a
// line's quote markers. It returns the positions and characters replaced.
func hideDeepNesting(src []byte) []hidden {
	var hid []hidden
	hide := func(i int) {
		hid = append(hid, hidden{i, src[i]})
		src[i] = hiddenByte
	}
	depth, parens, quotes, lineStart := 0, 0, 0, true
	for i := 0; i < len(src); i++ {
		c := src[i]
		if lineStart {
			if c == '>' {
				if quotes++; quotes > maxNesting {
					hide(i)
				}
				continue
			}
			if c != ' ' && c != '\t' {
				lineStart = false
			}
		}
		switch c {
		case '\\':
			i++ // an escaped character is no markup
		case '[':
			if depth++; depth > maxNesting {
				hide(i)
			}
		case ']':
			if i+1 < len(src) && src[i+1] == '(' && parens >= maxNesting {
				hide(i)
				break
			}
			depth = max(depth-1, 0)
		case '(':
			parens++
		case ')':
			parens = max(parens-1, 0)
		case ' ', '\t':
			parens = 0
		case '\n':
			parens, quotes, lineStart = 0, 0, true
			if j := i + 1; j < len(src) && src[j] == '\n' {
				depth = 0
			}
		}
	}
	return hid
}

// hidden is a character hideDeepNesting replaced.
type hidden struct {
	at int
	c  byte
}

// mdPiece is a run of shown text and where it stands in the source.
type mdPiece struct {
	off   int // byte offset in the source
	line  int // 0-based source line
	text  string
	block bool // the first text of a block
}

// mdText collects the shown text of a parsed document.
type mdText struct {
	src       []byte
	source    string // src before front matter was blanked: what Origins point into
	lineStart []int
	pieces    []mdPiece
	newBlock  bool // the next piece starts a block
	buf       bytes.Buffer
	// headings are the source lines of the ATX and setext headings, which
	// are the text's lines too.
	headings []doc.LineRange
}

func (m *mdText) lineOf(off int) int {
	i, found := slices.BinarySearch(m.lineStart, off)
	if !found {
		i--
	}
	return i
}

// add records text found at source offset off; text over several lines
// (which only HTML blocks give) is split at its line breaks, each part on
// its own line.
func (m *mdText) add(off int, s string) {
	line := m.lineOf(off)
	for {
		part, rest, more := strings.Cut(s, "\n")
		if part != "" {
			// a line break decoded from an entity (&#10;) must not add a line
			part = strings.Map(func(r rune) rune {
				if r == '\r' {
					return ' '
				}
				return r
			}, part)
			m.pieces = append(m.pieces, mdPiece{off: off, line: line, text: part, block: m.newBlock})
			m.newBlock = false
		}
		if !more {
			return
		}
		s = rest
		line++
		if line < len(m.lineStart) {
			off = m.lineStart[line]
		}
	}
}

// unescaped resolves backslash escapes and entity references of an inline
// text as goldmark's HTML renderer does, then undoes the HTML escaping.
func (m *mdText) unescaped(v []byte) string {
	m.buf.Reset()
	w := bufio.NewWriter(&m.buf)
	mdhtml.DefaultWriter.Write(w, v)
	w.Flush()
	return strings.ReplaceAll(html.UnescapeString(m.buf.String()), "\n", " ")
}

// walk visits the tree in document order, without recursion (a list
// nested a thousand deep must not grow the stack as deep).
func (m *mdText) walk(root ast.Node) {
	stack := []ast.Node{root}
	for len(stack) > 0 {
		n := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		if !m.visit(n) {
			continue
		}
		for c := n.LastChild(); c != nil; c = c.PreviousSibling() {
			stack = append(stack, c)
		}
	}
}

// visit handles one node and reports whether its children are to be
// visited.
func (m *mdText) visit(n ast.Node) bool {
	switch n := n.(type) {
	case *ast.FencedCodeBlock, *ast.CodeBlock, *ast.ThematicBreak, *ast.RawHTML,
		*east.TaskCheckBox, *east.FootnoteLink, *east.FootnoteBacklink:
		return false // code is not prose; tags are not text
	case *ast.HTMLBlock:
		m.htmlBlock(n)
		return false
	case *ast.Text:
		v := n.Segment.Value(m.src)
		v = bytes.TrimSuffix(v, []byte{'\n'})
		if n.IsRaw() {
			m.add(n.Segment.Start, strings.ReplaceAll(string(v), "\n", " "))
		} else {
			m.add(n.Segment.Start, m.unescaped(v))
		}
		return false
	case *ast.String:
		if at := m.lastOff(); at >= 0 { // a String has no place in the source
			s := string(n.Value)
			if !n.IsCode() && !n.IsRaw() {
				s = m.unescaped(n.Value)
			}
			m.add(at, s)
		}
		return false
	case *ast.AutoLink:
		m.add(m.autolinkOff(n), string(n.Label(m.src)))
		return false
	case *ast.CodeSpan:
		for c := n.FirstChild(); c != nil; c = c.NextSibling() {
			if t, ok := c.(*ast.Text); ok {
				v := bytes.TrimSuffix(t.Segment.Value(m.src), []byte{'\n'})
				m.add(t.Segment.Start, string(v))
			}
		}
		return false
	}
	if h, ok := n.(*ast.Heading); ok && h.Lines().Len() > 0 {
		lines := h.Lines()
		first, last := m.lineOf(lines.At(0).Start), m.lineOf(max(lines.At(lines.Len()-1).Stop-1, lines.At(lines.Len()-1).Start))
		m.headings = append(m.headings, doc.LineRange{First: int32(first + 1), Last: int32(last + 1)})
	}
	if n.Type() == ast.TypeBlock {
		switch n.(type) {
		case *ast.Paragraph, *ast.TextBlock, *ast.Heading, *ast.ListItem, *ast.Blockquote,
			*east.TableCell, *east.Footnote:
			m.newBlock = true
		}
	}
	return true
}

// lastOff returns the offset of the text before, for nodes that have no
// place of their own.
func (m *mdText) lastOff() int {
	if len(m.pieces) == 0 {
		return -1
	}
	return m.pieces[len(m.pieces)-1].off
}

// autolinkOff finds where an autolink's label stands: after the last
// piece, the first occurrence of the label.
func (m *mdText) autolinkOff(n *ast.AutoLink) int {
	from := 0
	if len(m.pieces) > 0 {
		from = m.pieces[len(m.pieces)-1].off
	}
	if i := bytes.Index(m.src[from:], n.Label(m.src)); i >= 0 {
		return from + i
	}
	return from
}

// mdDropped are the HTML elements whose content a Markdown page does not
// show as prose.
var mdDropped = map[string]bool{"script": true, "style": true, "textarea": true, "pre": true, "title": true, "template": true}

// htmlBlock keeps the text between the tags of a block of raw HTML, each
// run on its source line; comments and the content of script, style,
// textarea and pre are dropped.
func (m *mdText) htmlBlock(n *ast.HTMLBlock) {
	lines := n.Lines()
	if lines.Len() == 0 {
		return
	}
	start, stop := lines.At(0).Start, lines.At(lines.Len()-1).Stop
	if n.HasClosure() {
		stop = max(stop, n.ClosureLine.Stop)
	}
	m.newBlock = true
	z := xhtml.NewTokenizer(bytes.NewReader(m.src[start:stop]))
	off, skip := start, ""
	for {
		tt := z.Next()
		if tt == xhtml.ErrorToken {
			return
		}
		raw := z.Raw()
		switch tt {
		case xhtml.TextToken:
			if skip == "" {
				// decode line by line so that each run keeps its line
				at := off
				for _, part := range strings.Split(string(raw), "\n") {
					if part != "" {
						m.add(at, html.UnescapeString(part))
					}
					at += len(part) + 1
				}
			}
		case xhtml.StartTagToken:
			name, _ := z.TagName()
			if skip == "" && mdDropped[string(name)] {
				skip = string(name)
			}
		case xhtml.EndTagToken:
			name, _ := z.TagName()
			if string(name) == skip {
				skip = ""
			}
		}
		off += len(raw)
	}
}

// assemble lays the pieces out on their source lines: a block that starts
// on the line of other text, or on the line after one, starts with
// paraSep; a line with nothing but white space is empty. It returns the
// text and where it stands in the source (doc.Document.Origins): each
// piece where it was found, its references and escapes accounted for
// (pieces.align), each line break at the line break of its line.
func (m *mdText) assemble() (string, []doc.Origin) {
	slices.SortStableFunc(m.pieces, func(a, b mdPiece) int { return a.off - b.off })
	var out strings.Builder
	out.Grow(len(m.src))
	o := newOrigins(m.source)
	line := 0
	var cur strings.Builder
	// placed are the pieces of the current line: their offset in cur and
	// index (-1 for a paraSep)
	type placed struct{ at, piece int }
	var marks []placed
	var ps pieces
	prevHasText := false
	flush := func() {
		t := cur.String()
		has := strings.TrimSpace(strings.ReplaceAll(t, paraSep, "")) != ""
		if has {
			base := out.Len()
			for _, pl := range marks {
				if pl.piece < 0 {
					o.fill(base + pl.at)
					continue
				}
				p := &m.pieces[pl.piece]
				ps = ps[:0]
				if i, at := ps.align(p.text, 0, m.source, p.off, len(m.source), true); i < len(p.text) {
					ps = append(ps, piece{i, len(p.text) - i, at, 0}) // not found: a String, say
				}
				o.write(p.text, ps, 0, len(p.text), base+pl.at, 0)
			}
			out.WriteString(t)
		}
		prevHasText = has
		cur.Reset()
		marks = marks[:0]
	}
	newLine := func() {
		if at := m.lineStart[line+1] - 1; at < len(m.source) {
			o.add(out.Len(), at, 1, 1, false)
			o.end = at + 1
		}
		out.WriteByte('\n')
		o.broke(out.Len())
		line++
	}
	for k := range m.pieces {
		p := &m.pieces[k]
		for line < p.line {
			flush()
			newLine()
		}
		if p.block && (prevHasText || strings.TrimSpace(cur.String()) != "") {
			marks = append(marks, placed{cur.Len(), -1})
			cur.WriteString(paraSep)
		}
		marks = append(marks, placed{cur.Len(), k})
		cur.WriteString(p.text)
	}
	flush()
	for line < len(m.lineStart)-1 {
		newLine()
	}
	text := out.String()
	return text, o.finish(len(text))
}
