package tbx

import (
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"strings"
)

const xmlNS = "http://www.w3.org/XML/1998/namespace"

// node is a parsed element of one concept entry.
type node struct {
	space, local string
	attr         map[string]string // by local name; xml:lang as "lang"
	text         strings.Builder
	kids         []*node
}

// category returns the data category an element stands for: the type
// attribute of a DCA element, the name of a DCT element (one outside the
// TBX namespace), or "" for the structural elements.
func (n *node) category() string {
	if n.space != Namespace && n.space != "" {
		return n.local
	}
	switch n.local {
	case "admin", "adminNote", "descrip", "descripNote", "ref", "termNote", "transac", "transacNote", "xref":
		return n.attr["type"]
	}
	return ""
}

// value is the element's text with white space runs made one space.
func (n *node) value() string {
	return strings.Join(strings.Fields(n.text.String()), " ")
}

// Read reads a TBX document. name is used in error messages, which give
// the line.
func Read(r io.Reader, name string) (*Document, error) {
	dec := xml.NewDecoder(r)
	doc := &Document{}
	var stack []*node
	var entry *node
	sawTBX := false
	inSource := false
	for {
		tok, err := dec.Token()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			line, _ := dec.InputPos()
			var se *xml.SyntaxError
			if errors.As(err, &se) {
				line = se.Line
			}
			return nil, fmt.Errorf("%s:%d: not well-formed XML: %v", name, line, unwrapXML(err))
		}
		switch t := tok.(type) {
		case xml.StartElement:
			if !sawTBX {
				if t.Name.Local != "tbx" && t.Name.Local != "martif" {
					line, _ := dec.InputPos()
					return nil, fmt.Errorf("%s:%d: not a TBX file (root element <%s>)", name, line, t.Name.Local)
				}
				if t.Name.Local == "martif" {
					line, _ := dec.InputPos()
					return nil, fmt.Errorf("%s:%d: a TBX v2 (ISO 30042:2008) file; glossmith reads TBX v3 (<tbx>)", name, line)
				}
				sawTBX = true
				doc.Dialect = Core
				for _, a := range t.Attr {
					switch {
					case a.Name.Local == "type":
						doc.Dialect = a.Value
					case a.Name.Local == "lang" && a.Name.Space == xmlNS:
						doc.Lang = a.Value
					}
				}
				continue
			}
			if t.Name.Local == "sourceDesc" && entry == nil {
				inSource = true
			}
			if t.Name.Local == "conceptEntry" {
				entry = newNode(t)
				stack = []*node{entry}
				continue
			}
			if entry != nil {
				n := newNode(t)
				parent := stack[len(stack)-1]
				parent.kids = append(parent.kids, n)
				stack = append(stack, n)
			}
		case xml.EndElement:
			if t.Name.Local == "sourceDesc" {
				inSource = false
			}
			if entry == nil {
				continue
			}
			stack = stack[:len(stack)-1]
			if len(stack) == 0 {
				if e, ok := readEntry(entry, doc.Lang); ok {
					doc.Entries = append(doc.Entries, e)
				}
				entry = nil
			}
		case xml.CharData:
			switch {
			case entry != nil:
				// Text goes to every open element, so that a term
				// holding inline markup (<hi>) keeps its words.
				for _, n := range stack[1:] {
					n.text.Write(t)
				}
			case inSource:
				if s := strings.Join(strings.Fields(string(t)), " "); s != "" {
					doc.Source = strings.TrimSpace(doc.Source + " " + s)
				}
			}
		}
	}
	if !sawTBX {
		return nil, fmt.Errorf("%s: not a TBX file (no <tbx> element)", name)
	}
	if entry != nil {
		return nil, fmt.Errorf("%s: the file ends inside a concept entry (truncated?)", name)
	}
	return doc, nil
}

func unwrapXML(err error) string {
	var se *xml.SyntaxError
	if errors.As(err, &se) {
		return se.Msg
	}
	return err.Error()
}

func newNode(t xml.StartElement) *node {
	n := &node{space: t.Name.Space, local: t.Name.Local, attr: map[string]string{}}
	for _, a := range t.Attr {
		if a.Name.Local == "lang" && a.Name.Space == xmlNS {
			n.attr["lang"] = a.Value
		} else if a.Name.Space == "" {
			n.attr[a.Name.Local] = a.Value
		}
	}
	return n
}

// readEntry interprets a concept entry; false for the placeholder of an
// empty document.
func readEntry(n *node, lang string) (Entry, bool) {
	e := Entry{ID: n.attr["id"]}
	if e.ID == EmptyID {
		return e, false
	}
	for _, k := range n.kids {
		if k.local == "langSec" && k.category() == "" {
			l := k.attr["lang"]
			if l == "" {
				l = lang
			}
			readLangSec(&e, k, l)
			continue
		}
		readItem(&e, nil, k, "")
	}
	return e, true
}

func readLangSec(e *Entry, n *node, lang string) {
	for _, k := range n.kids {
		if k.local == "termSec" && k.category() == "" {
			if t, ok := readTermSec(k, lang); ok {
				e.Terms = append(e.Terms, t)
			}
			continue
		}
		readItem(e, nil, k, lang)
	}
}

func readTermSec(n *node, lang string) (Term, bool) {
	t := Term{Lang: lang}
	for _, k := range n.kids {
		if k.local == "term" && k.category() == "" {
			t.Text = k.value()
			continue
		}
		readItem(nil, &t, k, lang)
	}
	return t, t.Text != ""
}

// readItem reads one datum of an entry (t nil; lang set at language
// level) or of a term.
func readItem(e *Entry, t *Term, n *node, lang string) {
	cat := n.category()
	addNote := func(s string) {
		if s == "" {
			return
		}
		if t != nil {
			t.Notes = append(t.Notes, s)
		} else {
			e.Notes = append(e.Notes, s)
		}
	}
	switch {
	case n.local == "transacGrp" && cat == "":
		return // who changed the entry when: not kept
	case strings.HasSuffix(n.local, "Grp") && cat == "":
		// A group: its first datum with the source that goes with it.
		var main *node
		source := ""
		var rest []*node
		for _, k := range n.kids {
			switch {
			case main == nil && k.category() != "" && k.category() != "source":
				main = k
			case k.category() == "source" && source == "":
				source = k.value()
			default:
				rest = append(rest, k)
			}
		}
		if main != nil {
			readSourced(e, t, main, source, lang, addNote)
		} else if source != "" {
			addNote("source: " + source)
		}
		for _, k := range rest {
			readItem(e, t, k, lang)
		}
		return
	case n.local == "note" && cat == "":
		if t != nil && readGlossmithNote(t, n.value()) {
			return
		}
		if t == nil && readGlossmithEntryNote(e, lang, n.value()) {
			return
		}
		addNote(n.value())
		return
	}
	readSourced(e, t, n, "", lang, addNote)
}

// readSourced reads a datum that may have a source.
func readSourced(e *Entry, t *Term, n *node, source, lang string, addNote func(string)) {
	v := n.value()
	cat := n.category()
	with := func(s string) string {
		if source != "" {
			return s + " (source: " + source + ")"
		}
		return s
	}
	switch {
	case cat == "partOfSpeech" && t != nil:
		t.POS = v
	case cat == "administrativeStatus" && t != nil:
		t.Status = v
	case cat == "termType" && t != nil && t.Type == "":
		t.Type = v
	case cat == "context" && t != nil:
		t.Contexts = append(t.Contexts, Context{Text: v, Source: source})
	case cat == "definition" && e != nil:
		e.Definitions = append(e.Definitions, Definition{Lang: lang, Text: v, Source: source})
	case cat == "subjectField" && e != nil && e.Subject == "":
		e.Subject = v
	case cat == "crossReference" && e != nil && n.attr["target"] != "":
		e.CrossRefs = append(e.CrossRefs, CrossRef{Target: n.attr["target"], Text: v})
	case cat == "":
		if v != "" {
			addNote(with(n.local + ": " + v))
		}
	default:
		if v == "" {
			v = n.attr["target"]
		}
		addNote(with(cat + ": " + v))
	}
}

// readGlossmithNote reads back what the TBX-Core writer puts in notes
// (Core has no data categories): "part of speech: …", "administrative
// status: …", "term type: …", "context: …". It reports whether the note was one.
func readGlossmithNote(t *Term, s string) bool {
	switch {
	case strings.HasPrefix(s, notePOS):
		t.POS = strings.TrimPrefix(s, notePOS)
	case strings.HasPrefix(s, noteStatus):
		t.Status = strings.TrimPrefix(s, noteStatus)
	case strings.HasPrefix(s, noteTermType) && t.Type == "":
		t.Type = strings.TrimPrefix(s, noteTermType)
	case strings.HasPrefix(s, noteContext):
		c, src := splitSource(strings.TrimPrefix(s, noteContext))
		t.Contexts = append(t.Contexts, Context{Text: c, Source: src})
	default:
		return false
	}
	return true
}

// readGlossmithEntryNote reads back the entry notes of the TBX-Core
// writer: "subject field: …", "definition: … (source: …)".
func readGlossmithEntryNote(e *Entry, lang, s string) bool {
	switch {
	case strings.HasPrefix(s, noteSubject) && e.Subject == "":
		e.Subject = strings.TrimPrefix(s, noteSubject)
	case strings.HasPrefix(s, noteDefinition):
		d, src := splitSource(strings.TrimPrefix(s, noteDefinition))
		e.Definitions = append(e.Definitions, Definition{Lang: lang, Text: d, Source: src})
	default:
		return false
	}
	return true
}

// splitSource splits "text (source: s)" into its two parts.
func splitSource(s string) (string, string) {
	if i := strings.LastIndex(s, " (source: "); i >= 0 && strings.HasSuffix(s, ")") {
		return s[:i], s[i+len(" (source: ") : len(s)-1]
	}
	return s, ""
}

// The notes of the TBX-Core writer.
const (
	noteSubject    = "subject field: "
	noteDefinition = "definition: "

	notePOS      = "part of speech: "
	noteStatus   = "administrative status: "
	noteContext  = "context: "
	noteTermType = "term type: "
	// noteCrossRef is a cross-reference written as a note of the entry.
	noteCrossRef = "see: "
)
