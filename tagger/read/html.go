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

// htmlHeadContent are the elements allowed in <head>; any other start tag
// ends a head whose end tag was left out, as the HTML parser does.
var htmlHeadContent = map[string]bool{
	"title": true, "meta": true, "link": true, "style": true, "script": true,
	"base": true, "noscript": true, "template": true,
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

// htmlVoid elements have no content and no end tag.
var htmlVoid = map[string]bool{
	"area": true, "base": true, "br": true, "col": true, "embed": true,
	"hr": true, "img": true, "input": true, "link": true, "meta": true,
	"source": true, "track": true, "wbr": true, "param": true,
}

// html extracts the visible text of an HTML page; see the package comment.
func (r *reader) html(s string) *doc.Document {
	z := html.NewTokenizer(strings.NewReader(s))
	var e textEmitter
	skip, depth := "", 0 // the element whose content is being dropped
	inHead, pre := false, 0
	for {
		tt := z.Next()
		switch tt {
		case html.ErrorToken:
			return &doc.Document{Text: e.String()}
		case html.TextToken:
			if skip == "" && !inHead {
				e.text(string(z.Text()), pre > 0)
			}
		case html.StartTagToken, html.SelfClosingTagToken:
			name, hasAttr := z.TagName()
			tag := string(name)
			if skip != "" {
				if tag == skip && tt == html.StartTagToken {
					depth++
				}
				continue
			}
			if inHead && !htmlHeadContent[tag] {
				inHead = false
			}
			hidden := hasAttr && hiddenByAttr(z)
			switch {
			case tag == "head":
				inHead = tt == html.StartTagToken
			case (htmlDropped[tag] || hidden) && tt == html.StartTagToken && !htmlVoid[tag]:
				skip, depth = tag, 1
			case inHead:
			case tag == "br":
				e.lineBreak()
			case htmlBlocks[tag]:
				e.para()
				if tag == "pre" && tt == html.StartTagToken {
					pre++
				}
			}
		case html.EndTagToken:
			name, _ := z.TagName()
			tag := string(name)
			if skip != "" {
				if tag == skip {
					if depth--; depth == 0 {
						skip = ""
					}
				}
				continue
			}
			switch {
			case tag == "head":
				inHead = false
			case tag == "br": // "</br>" is read as <br> by browsers
				e.lineBreak()
			case htmlBlocks[tag]:
				e.para()
				if tag == "pre" && pre > 0 {
					pre--
				}
			}
		}
	}
}

// hiddenByAttr reports a "hidden" attribute or an inline style
// "display: none" on the current tag.
func hiddenByAttr(z *html.Tokenizer) bool {
	for {
		key, val, more := z.TagAttr()
		switch string(key) {
		case "hidden":
			return true
		case "style":
			v := strings.ToLower(strings.Join(strings.Fields(string(val)), ""))
			if strings.Contains(v, "display:none") || strings.Contains(v, "visibility:hidden") {
				return true
			}
		}
		if !more {
			return false
		}
	}
}

// textEmitter builds extracted text: white space collapsed to single
// spaces, a blank line between paragraphs, none at the ends.
type textEmitter struct {
	b            strings.Builder
	pendingPara  bool // a paragraph break is due before the next text
	pendingSpace bool // a space is due before the next text on this line
	lineStart    bool
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
	e.lineStart, e.pendingSpace = true, false
}

func (e *textEmitter) flushPending() {
	switch {
	case e.pendingPara:
		if !e.lineStart {
			e.b.WriteByte('\n')
		}
		e.b.WriteByte('\n')
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
			e.b.WriteString(s)
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
