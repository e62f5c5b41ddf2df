package read

import (
	"bytes"
	"strings"

	"golang.org/x/net/html"

	"glossmith/tagger/doc"
)

// htmlDropped are elements whose content is not visible page text.
var htmlDropped = map[string]bool{
	"script": true, "style": true, "noscript": true, "template": true,
	"title": true, "svg": true, "math": true, "iframe": true, "object": true,
	"select": true, "textarea": true, "datalist": true, "canvas": true,
	"audio": true, "video": true, "noembed": true, "noframes": true,
}

// htmlBlocks end a paragraph where they start and where they end.
var htmlBlocks = map[string]bool{
	"address": true, "article": true, "aside": true, "blockquote": true,
	"body": true, "caption": true, "dd": true, "details": true, "dialog": true,
	"div": true, "dl": true, "dt": true, "fieldset": true, "figcaption": true,
	"figure": true, "footer": true, "form": true, "h1": true, "h2": true,
	"h3": true, "h4": true, "h5": true, "h6": true, "header": true,
	"hgroup": true, "hr": true, "html": true, "legend": true, "li": true,
	"main": true, "menu": true, "nav": true, "ol": true, "p": true, "pre": true,
	"section": true, "summary": true, "table": true, "tbody": true, "td": true,
	"tfoot": true, "th": true, "thead": true, "tr": true, "ul": true,
	"center": true, "option": true, "optgroup": true, "frameset": true,
}

// htmlHeadings are the elements whose text is a heading or a caption:
// title case is the norm there. (The title is not read; see htmlDropped.)
var htmlHeadings = map[string]bool{
	"h1": true, "h2": true, "h3": true, "h4": true, "h5": true, "h6": true,
	"caption": true, "figcaption": true,
}

// html extracts the visible text of an HTML page; see the package comment.
// The page is parsed into a tree by the HTML5 parsing algorithm
// (html.Parse), so end tags that HTML lets an author leave out — </li>,
// </p>, </td>, </head> — close their elements where a browser closes
// them, and hidden content ends where the browser ends it. s is the page
// as decoded, line ends as LF; the document's Origins point into it.
func (r *reader) html(s string) *doc.Document {
	src := newHTMLSource(s)
	e := textEmitter{o: newOrigins(s)}
	root, err := html.Parse(strings.NewReader(s))
	if err != nil {
		// The parser refuses elements nested more than 512 deep (its guard
		// against a stack of unbounded size); such a page is read as a
		// flat run of tags instead, so that its text is not lost.
		r.warnf(0, "HTML not parsed as a tree (%v); its text is read tag by tag, so the content of hidden elements may be kept", err)
		return htmlFlat(s, src, &e)
	}
	// An explicit stack rather than recursion: a page of a million nested
	// tags must not grow the goroutine stack by as many frames.
	type frame struct {
		n    *html.Node
		exit bool // the element's end, after its children
	}
	stack := []frame{{n: root}}
	pre, hidden := 0, 0
	for len(stack) > 0 {
		f := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		n := f.n
		if n.Type == html.ElementNode && f.exit {
			if hidden > 0 { // the end of the outermost hidden element
				hidden--
				continue
			}
			if htmlBlocks[n.Data] {
				e.para()
			}
			if htmlHeadings[n.Data] {
				e.headingEnd()
			}
			if n.Data == "pre" {
				pre--
			}
			continue
		}
		switch n.Type {
		case html.TextNode:
			// Hidden text is looked for too, so that the visible text
			// after it is looked for after it.
			if src.find(n.Data) || hidden > 0 {
				if hidden == 0 {
					e.text(n.Data, src.found, pre > 0)
				}
				continue
			}
			e.text(n.Data, src.notFound(len(n.Data)), pre > 0)
			continue
		case html.ElementNode:
			if hidden > 0 || n.Namespace != "" || htmlDropped[n.Data] || n.Data == "head" || hiddenByAttr(n.Attr) {
				if hidden == 0 {
					hidden++
					stack = append(stack, frame{n: n, exit: true})
				}
				break
			}
			switch {
			case n.Data == "br":
				e.lineBreak()
				continue
			case htmlBlocks[n.Data]:
				e.para()
			}
			if n.Data == "pre" {
				pre++
			}
			if htmlHeadings[n.Data] {
				e.headingStart()
			}
			stack = append(stack, frame{n: n, exit: true})
		case html.DocumentNode:
		default: // comments, doctype
			continue
		}
		// children pushed last first, so the first is handled next
		for c := n.LastChild; c != nil; c = c.PrevSibling {
			stack = append(stack, frame{n: c})
		}
	}
	return e.document()
}

// htmlFlat extracts text from a page without building its tree: the text
// between tags, less the contents of the dropped elements, blocks as
// paragraphs, and the lines of the headings.
func htmlFlat(s string, src *htmlSource, e *textEmitter) *doc.Document {
	z := html.NewTokenizer(strings.NewReader(s))
	skip := ""
	pre := 0
	for {
		tt := z.Next()
		switch tt {
		case html.ErrorToken:
			return e.document()
		case html.TextToken:
			text := string(z.Text())
			found := src.find(text)
			switch {
			case skip != "":
			case found:
				e.text(text, src.found, pre > 0)
			default:
				e.text(text, src.notFound(len(text)), pre > 0)
			}
		case html.StartTagToken, html.EndTagToken, html.SelfClosingTagToken:
			name, _ := z.TagName()
			tag := string(name)
			switch {
			case skip != "":
				if tt == html.EndTagToken && tag == skip {
					skip = ""
				}
			case tt == html.StartTagToken && (htmlDropped[tag] || tag == "head"):
				skip = tag
			case tag == "br":
				e.lineBreak()
			case htmlBlocks[tag]:
				e.para()
				if tag == "pre" && tt == html.StartTagToken {
					pre++
				} else if tag == "pre" && tt == html.EndTagToken && pre > 0 {
					pre--
				}
			}
			if skip == "" && htmlHeadings[tag] {
				switch tt {
				case html.StartTagToken:
					e.headingStart()
				case html.EndTagToken:
					e.headingEnd()
				}
			}
		}
	}
}

// htmlSource is a page's source as its tokenizer splits it, kept so that
// the text nodes of the parsed tree can be found in it again: the parser
// gives a tree without source positions. The tree holds the text in the
// order of the source but for text that it moves (a table's stray text
// goes before the table), so each node is looked for where the last one
// ended — its text as it is, character references standing for
// themselves, white space the parser dropped passed over — and, when not
// there, in the stretches of text after, then before.
type htmlSource struct {
	src  string
	segs []htmlSegment
	k, p int // where the next node is looked for: a segment, an offset in it
	// found maps the text of the last node found onto the source.
	found pieces
}

// htmlSegment is the source of one text token: offsets [start, end);
// refs when it holds an "&".
type htmlSegment struct {
	start, end int32
	refs       bool
}

// htmlSearch bounds how many segments are tried either way for a node not
// found where the last one ended.
const htmlSearch = 256

func newHTMLSource(s string) *htmlSource {
	h := &htmlSource{src: s}
	z := html.NewTokenizer(strings.NewReader(s))
	off, foreign := 0, 0
	for {
		tt := z.Next()
		if tt == html.ErrorToken {
			break
		}
		raw := z.Raw()
		switch tt {
		case html.TextToken:
			h.segs = append(h.segs, htmlSegment{int32(off), int32(off + len(raw)), bytes.IndexByte(raw, '&') >= 0})
		case html.StartTagToken, html.EndTagToken:
			// Inside svg and math, the parser reads <style>, <title> ...
			// as elements, not as raw text; so does this pass.
			if foreign == 0 && !foreignTag(raw) {
				break
			}
			name, _ := z.TagName()
			if string(name) == "svg" || string(name) == "math" {
				if tt == html.StartTagToken {
					foreign++
				} else {
					foreign = max(foreign-1, 0)
				}
			} else if foreign > 0 && tt == html.StartTagToken {
				z.NextIsNotRawText()
			}
		}
		off += len(raw)
	}
	if len(h.segs) > 0 {
		h.p = int(h.segs[0].start)
	}
	return h
}

// foreignTag reports whether a raw start or end tag may be <svg> or <math>.
func foreignTag(raw []byte) bool {
	raw = bytes.TrimPrefix(raw[1:], []byte{'/'})
	return len(raw) >= 3 && (raw[0]|0x20 == 's' || raw[0]|0x20 == 'm')
}

// find looks for the text of a node (see htmlSource) and maps it in
// found; it reports false, leaving the place to look from as it was, when
// the text is nowhere near.
func (h *htmlSource) find(text string) bool {
	if h.match(text, h.k, h.p) {
		return true
	}
	for k := h.k + 1; k < len(h.segs) && k <= h.k+htmlSearch; k++ {
		if h.match(text, k, int(h.segs[k].start)) {
			return true
		}
	}
	for k := h.k - 1; k >= 0 && k >= h.k-htmlSearch; k-- {
		if h.match(text, k, int(h.segs[k].start)) {
			return true
		}
	}
	return false
}

// notFound maps a text of n bytes that was not found to the place where
// the next text is looked for.
func (h *htmlSource) notFound(n int) pieces {
	h.found = append(h.found[:0], piece{0, n, h.p, 0})
	return h.found
}

// match maps text onto the source from offset p of segment k on, and
// moves the place to look from past it when it is all there.
func (h *htmlSource) match(text string, k, p int) bool {
	h.found = h.found[:0]
	for i := 0; i < len(text); {
		if k >= len(h.segs) {
			return false
		}
		if p >= int(h.segs[k].end) {
			if k++; k < len(h.segs) {
				p = int(h.segs[k].start)
			}
			continue
		}
		end := int(h.segs[k].end)
		if i, p = h.found.align(text, i, h.src, p, end, false); i < len(text) && p < end {
			return false
		}
	}
	h.k, h.p = k, p
	return true
}

// hiddenByAttr reports a "hidden" attribute or an inline style
// "display: none" or "visibility: hidden".
func hiddenByAttr(attrs []html.Attribute) bool {
	for _, a := range attrs {
		switch a.Key {
		case "hidden":
			return true
		case "style":
			v := strings.ToLower(strings.Join(strings.Fields(a.Val), ""))
			if strings.Contains(v, "display:none") || strings.Contains(v, "visibility:hidden") {
				return true
			}
		}
	}
	return false
}

// textEmitter builds extracted text: white space collapsed to single
// spaces, a blank line between paragraphs, none at the ends; and, as it
// goes, where the text stands in the source (o).
type textEmitter struct {
	b            strings.Builder
	pendingPara  bool // a paragraph break is due before the next text
	pendingSpace bool // a space is due before the next text on this line
	spaceAt      int  // the source offset of that space when it is a space there, else -1
	lineStart    bool
	breaks       int32 // the line breaks written: the line is breaks+1
	o            *origins

	// heading counts the heading elements open; headFirst is the line
	// of the first text written in the outermost one (0: none yet), and
	// headings the lines of those finished.
	heading   int
	headFirst int32
	headings  []doc.LineRange
}

// document returns the text extracted and where it came from.
func (e *textEmitter) document() *doc.Document {
	text := e.b.String()
	return &doc.Document{Text: text, Headings: e.headings, Origins: e.o.finish(len(text))}
}

// headingStart and headingEnd bracket the content of a heading element.
// A heading is a block, so it has lines of its own (see para).
func (e *textEmitter) headingStart() {
	if e.heading == 0 {
		e.headFirst = 0
	}
	e.heading++
}

func (e *textEmitter) headingEnd() {
	if e.heading == 0 {
		return // an end tag without its start, read tag by tag
	}
	e.heading--
	if e.heading == 0 && e.headFirst > 0 {
		e.headings = append(e.headings, doc.LineRange{First: e.headFirst, Last: e.breaks + 1})
	}
}

// wrote notes text written on the current line.
func (e *textEmitter) wrote() {
	if e.heading > 0 && e.headFirst == 0 {
		e.headFirst = e.breaks + 1
	}
}

func (e *textEmitter) para() {
	if e.b.Len() > 0 {
		e.pendingPara = true
	}
	e.pendingSpace = false
}

func (e *textEmitter) lineBreak() {
	if e.b.Len() == 0 || e.pendingPara {
		return
	}
	e.o.fill(e.b.Len())
	e.b.WriteByte('\n')
	e.breaks++
	e.lineStart, e.pendingSpace = true, false
}

func (e *textEmitter) flushPending() {
	switch {
	case e.pendingPara:
		e.o.fill(e.b.Len())
		if !e.lineStart {
			e.b.WriteByte('\n')
			e.breaks++
		}
		e.b.WriteByte('\n')
		e.breaks++
	case e.pendingSpace && !e.lineStart:
		if e.spaceAt >= 0 {
			e.o.add(e.b.Len(), e.spaceAt, 1, 1, false)
			e.o.end = e.spaceAt + 1
		} else {
			e.o.fill(e.b.Len())
		}
		e.b.WriteByte(' ')
	}
	e.pendingPara, e.pendingSpace, e.lineStart = false, false, false
}

// text adds a run of text mapped onto the source by ps; in <pre> its
// white space and line breaks are kept, elsewhere runs of HTML white
// space become one space.
func (e *textEmitter) text(s string, ps pieces, pre bool) {
	if pre {
		if s == "" {
			return
		}
		if e.b.Len() > 0 || strings.TrimSpace(s) != "" {
			e.flushPending()
			if lead := len(s) - len(strings.TrimLeft(s, " \t\n\f")); lead < len(s) && e.heading > 0 && e.headFirst == 0 {
				e.headFirst = e.breaks + 1 + int32(strings.Count(s[:lead], "\n"))
			}
			e.o.write(s, ps, 0, len(s), e.b.Len(), 0)
			e.b.WriteString(s)
			e.breaks += int32(strings.Count(s, "\n"))
			e.lineStart = strings.HasSuffix(s, "\n")
		}
		return
	}
	k := 0 // the piece reached
	for i := 0; i < len(s); {
		j := i
		if isHTMLSpace(rune(s[i])) {
			for j < len(s) && isHTMLSpace(rune(s[j])) {
				j++
			}
			if e.b.Len() > 0 && !e.pendingPara {
				e.pendingSpace = true
				e.spaceAt = -1
				if at, k2 := ps.srcAt(i, k, false); j == i+1 && s[i] == ' ' && ps[k2].n == ps[k2].srcN {
					e.spaceAt = at
				}
			}
			i = j
			continue
		}
		// words with single spaces between them are written as they are,
		// in one go
		for j < len(s) && (!isHTMLSpace(rune(s[j])) || s[j] == ' ' && j+1 < len(s) && !isHTMLSpace(rune(s[j+1]))) {
			j++
		}
		e.flushPending()
		e.wrote()
		k = e.o.write(s, ps, i, j, e.b.Len(), k)
		e.b.WriteString(s[i:j])
		i = j
	}
}

func isHTMLSpace(r rune) bool {
	return r == ' ' || r == '\t' || r == '\n' || r == '\r' || r == '\f'
}
