package tbx

import (
	"bufio"
	"encoding/xml"
	"fmt"
	"hash/fnv"
	"io"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// StableID derives an entry id from a key (a canonical form): the same key
// gives the same id in every run, whatever the entry's rank.
func StableID(key string) string {
	h := fnv.New64a()
	h.Write([]byte(key))
	return fmt.Sprintf("c%016x", h.Sum64())
}

// Write writes doc in its dialect (Core unless Basic). Entry ids that are
// missing, not XML names or repeated are replaced by ones that are.
func Write(w io.Writer, doc *Document) error {
	bw := bufio.NewWriter(w)
	basic := doc.Dialect == Basic
	lang := doc.Lang
	if lang == "" {
		lang = "en"
	}
	dialect := Core
	if basic {
		dialect = Basic
	}
	bw.WriteString(xml.Header)
	fmt.Fprintf(bw, "<tbx type=%q style=\"dca\" xml:lang=\"%s\" xmlns=\"%s\">\n", dialect, attr(lang), Namespace)
	bw.WriteString("  <tbxHeader>\n    <fileDesc>\n      <sourceDesc>\n        <p>")
	text(bw, doc.Source)
	bw.WriteString("</p>\n      </sourceDesc>\n    </fileDesc>\n  </tbxHeader>\n  <text>\n    <body>\n")
	entries := doc.Entries
	if len(entries) == 0 {
		entries = []Entry{{ID: EmptyID, Notes: []string{"This glossary has no entries."}, Terms: []Term{{Lang: lang}}}}
	}
	used := map[string]bool{}
	ids := make([]string, len(entries))
	kept := map[string]bool{} // ids written as given: what a cross-reference may point to
	for i, e := range entries {
		id := e.ID
		if !isName(id) || used[id] {
			id = "c" + strconv.Itoa(i+1)
			for used[id] {
				id += "x"
			}
		}
		used[id], ids[i] = true, id
		if id == e.ID {
			kept[id] = true
		}
	}
	for i, e := range entries {
		writeEntry(bw, &e, ids[i], lang, basic, kept)
	}
	bw.WriteString("    </body>\n  </text>\n</tbx>\n")
	return bw.Flush()
}

// writeEntry writes one entry; kept holds the ids a cross-reference can
// point to (a TBX-Basic ref whose target is no entry would not validate: it
// is written as a note instead, as it is under TBX-Core).
func writeEntry(w *bufio.Writer, e *Entry, id, lang string, basic bool, kept map[string]bool) {
	fmt.Fprintf(w, "      <conceptEntry id=\"%s\">\n", attr(id))
	const in1 = "        "
	if e.Subject != "" {
		if basic {
			element(w, in1, `descrip type="subjectField"`, e.Subject)
		} else {
			element(w, in1, "note", noteSubject+e.Subject)
		}
	}
	for _, n := range e.Notes {
		element(w, in1, "note", n)
	}
	for _, r := range e.CrossRefs {
		if basic && kept[r.Target] {
			element(w, in1, `ref type="crossReference" target="`+attr(r.Target)+`"`, r.Text)
		} else {
			element(w, in1, "note", noteCrossRef+r.Text)
		}
	}
	// Languages in order of first appearance, the document's first.
	langs := []string{}
	seen := map[string]bool{}
	add := func(l string) {
		if l == "" {
			l = lang
		}
		if !seen[l] {
			seen[l] = true
			langs = append(langs, l)
		}
	}
	for _, t := range e.Terms {
		add(t.Lang)
	}
	for _, d := range e.Definitions {
		add(d.Lang)
	}
	for _, l := range langs {
		var terms []Term
		for _, t := range e.Terms {
			if t.Lang == l || (t.Lang == "" && l == lang) {
				terms = append(terms, t)
			}
		}
		if len(terms) == 0 {
			// A definition without a term of its language stays with the
			// entry as a note (a language section needs a term).
			for _, d := range e.Definitions {
				if d.Lang == l {
					element(w, in1, "note", noteDefinition+"("+l+") "+withSource(d.Text, d.Source))
				}
			}
			continue
		}
		fmt.Fprintf(w, "        <langSec xml:lang=\"%s\">\n", attr(l))
		const in2 = "          "
		for _, d := range e.Definitions {
			if d.Lang != l && !(d.Lang == "" && l == lang) {
				continue
			}
			if basic {
				sourced(w, in2, "definition", d.Text, d.Source)
			} else {
				element(w, in2, "note", noteDefinition+withSource(d.Text, d.Source))
			}
		}
		for _, t := range terms {
			writeTerm(w, &t, basic)
		}
		w.WriteString("        </langSec>\n")
	}
	w.WriteString("      </conceptEntry>\n")
}

func writeTerm(w *bufio.Writer, t *Term, basic bool) {
	const in3 = "            "
	w.WriteString("          <termSec>\n")
	element(w, in3, "term", t.Text)
	pos := BasicPOS(t.POS)
	if basic {
		// termNotes first: the core structure wants them right after <term>.
		if pos != "" {
			element(w, in3, `termNote type="partOfSpeech"`, pos)
		}
		if t.Status != "" {
			element(w, in3, `termNote type="administrativeStatus"`, t.Status)
		}
		if t.Type != "" {
			element(w, in3, `termNote type="termType"`, t.Type)
		}
		for _, c := range t.Contexts {
			sourced(w, in3, "context", c.Text, c.Source)
		}
	} else {
		if pos != "" {
			element(w, in3, "note", notePOS+pos)
		}
		if t.Status != "" {
			element(w, in3, "note", noteStatus+t.Status)
		}
		if t.Type != "" {
			element(w, in3, "note", noteTermType+t.Type)
		}
		for _, c := range t.Contexts {
			element(w, in3, "note", noteContext+withSource(c.Text, c.Source))
		}
	}
	for _, n := range t.Notes {
		element(w, in3, "note", n)
	}
	w.WriteString("          </termSec>\n")
}

// sourced writes a TBX-Basic description (definition, context) grouped
// with its source.
func sourced(w *bufio.Writer, indent, category, s, source string) {
	w.WriteString(indent + "<descripGrp>\n")
	element(w, indent+"  ", `descrip type="`+category+`"`, s)
	if source != "" {
		element(w, indent+"  ", `admin type="source"`, source)
	}
	w.WriteString(indent + "</descripGrp>\n")
}

func withSource(s, src string) string {
	if src == "" {
		return s
	}
	return s + " (source: " + src + ")"
}

// element writes <tag>text</tag> on a line of its own; tag may carry
// attributes.
func element(w *bufio.Writer, indent, tag, s string) {
	name, _, _ := strings.Cut(tag, " ")
	w.WriteString(indent + "<" + tag + ">")
	text(w, s)
	w.WriteString("</" + name + ">\n")
}

// text writes s escaped as XML character data, leaving out what XML 1.0
// cannot carry (control characters other than tab and newline, invalid
// UTF-8).
func text(w *bufio.Writer, s string) {
	var b strings.Builder
	xml.EscapeText(&b, []byte(clean(s)))
	w.WriteString(b.String())
}

func attr(s string) string {
	var b strings.Builder
	xml.EscapeText(&b, []byte(clean(s)))
	return strings.ReplaceAll(b.String(), `"`, "&#34;")
}

func clean(s string) string {
	ok := true
	for _, r := range s {
		if !xmlChar(r) {
			ok = false
			break
		}
	}
	if ok && utf8.ValidString(s) {
		return s
	}
	var b strings.Builder
	for _, r := range s {
		if r != utf8.RuneError && xmlChar(r) {
			b.WriteRune(r)
		}
	}
	return b.String()
}

func xmlChar(r rune) bool {
	return r == 0x09 || r == 0x0A || r == 0x0D || (r >= 0x20 && r <= 0xD7FF) ||
		(r >= 0xE000 && r <= 0xFFFD) || (r >= 0x10000 && r <= 0x10FFFF)
}

// isName reports whether s can be an XML ID (an NCName, simplified to
// letters, digits and . - _ after a letter or _).
func isName(s string) bool {
	if s == "" {
		return false
	}
	for i, r := range s {
		switch {
		case r == '_' || unicode.IsLetter(r):
		case i > 0 && (unicode.IsDigit(r) || r == '.' || r == '-'):
		default:
			return false
		}
	}
	return true
}
