package read

import (
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
// them, and hidden content ends where the browser ends it.
func (r *reader) html(s string) *doc.Document {
	root, err := html.Parse(strings.NewReader(s))
	if err != nil {
		// The parser refuses elements nested more than 512 deep (its guard
		// against a stack of unbounded size); such a page is read as a
		// flat run of tags instead, so that its text is not lost.
		r.warnf(0, "HTML not parsed as a tree (%v); its text is read tag by tag, so the content of hidden elements may be kept", err)
		text, heads := htmlFlat(s)
		return &doc.Document{Text: text, Headings: heads}
	}
	var e textEmitter
	// An explicit stack rather than recursion: a page of a million nested
	// tags must not grow the goroutine stack by as many frames.
	type frame struct {
		n    *html.Node
		exit bool // the element's end, after its children
	}
	stack := []frame{{n: root}}
	pre := 0
	for len(stack) > 0 {
		f := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		n := f.n
		if n.Type == html.ElementNode && f.exit {
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
			e.text(n.Data, pre > 0)
			continue
		case html.ElementNode:
			if n.Namespace != "" || htmlDropped[n.Data] || n.Data == "head" || hiddenByAttr(n.Attr) {
				continue
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
	return &doc.Document{Text: e.String(), Headings: e.headings}
}

// htmlFlat extracts text from a page without building its tree: the text
// between tags, less the contents of the dropped elements, blocks as
// paragraphs, and the lines of the headings.
func htmlFlat(s string) (string, []doc.LineRange) {
	z := html.NewTokenizer(strings.NewReader(s))
	var e textEmitter
	skip := ""
	pre := 0
	for {
		tt := z.Next()
		switch tt {
		case html.ErrorToken:
			return e.String(), e.headings
		case html.TextToken:
			if skip == "" {
				e.text(string(z.Text()), pre > 0)
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
// spaces, a blank line between paragraphs, none at the ends.
type textEmitter struct {
	b            strings.Builder
	pendingPara  bool // a paragraph break is due before the next text
	pendingSpace bool // a space is due before the next text on this line
	lineStart    bool
	breaks       int32 // the line breaks written: the line is breaks+1

	// heading counts the heading elements open; headFirst is the line
	// of the first text written in the outermost one (0: none yet), and
	// headings the lines of those finished.
	heading   int
	headFirst int32
	headings  []doc.LineRange
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
	e.b.WriteByte('\n')
	e.breaks++
	e.lineStart, e.pendingSpace = true, false
}

func (e *textEmitter) flushPending() {
	switch {
	case e.pendingPara:
		if !e.lineStart {
			e.b.WriteByte('\n')
			e.breaks++
		}
		e.b.WriteByte('\n')
		e.breaks++
	case e.pendingSpace && !e.lineStart:
		e.b.WriteByte(' ')
	}
	e.pendingPara, e.pendingSpace, e.lineStart = false, false, false
}

// text adds a run of text; in <pre> its white space and line breaks are
// kept, elsewhere runs of HTML white space become one space.
func (e *textEmitter) text(s string, pre bool) {
	if pre {
		s = normalizeNewlines(s)
		if s == "" {
			return
		}
		if e.b.Len() > 0 || strings.TrimSpace(s) != "" {
			e.flushPending()
			if lead := len(s) - len(strings.TrimLeft(s, " \t\n\f")); lead < len(s) && e.heading > 0 && e.headFirst == 0 {
				e.headFirst = e.breaks + 1 + int32(strings.Count(s[:lead], "\n"))
			}
			e.b.WriteString(s)
			e.breaks += int32(strings.Count(s, "\n"))
			e.lineStart = strings.HasSuffix(s, "\n")
		}
		return
	}
	for len(s) > 0 {
		i := strings.IndexFunc(s, isHTMLSpace)
		if i != 0 {
			word := s
			if i > 0 {
				word = s[:i]
			}
			e.flushPending()
			e.wrote()
			e.b.WriteString(word)
			s = s[len(word):]
			continue
		}
		j := strings.IndexFunc(s, func(r rune) bool { return !isHTMLSpace(r) })
		if j < 0 {
			j = len(s)
		}
		if e.b.Len() > 0 && !e.pendingPara {
			e.pendingSpace = true
		}
		s = s[j:]
	}
}

func isHTMLSpace(r rune) bool {
	return r == ' ' || r == '\t' || r == '\n' || r == '\r' || r == '\f'
}

func (e *textEmitter) String() string { return e.b.String() }
