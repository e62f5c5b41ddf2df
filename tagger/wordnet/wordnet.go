// Package wordnet tells which parts of speech WordNet 3.0 lists for an
// English word form, directly or through its base forms: an open lexicon of
// word classes that the tagger reads as features of words its treebank
// seldom or never showed it ("vortices" is a noun, "closes" a noun or a
// verb, "union" a noun or an adjective).
//
// WordNet (Miller 1995, "WordNet: a lexical database for English",
// Communications of the ACM 38(11); Fellbaum, ed., 1998, "WordNet: an
// electronic lexical database", MIT Press) lists nouns, verbs, adjectives
// and adverbs by their base forms, with exception lists for irregular
// inflections ("vortices" → "vortex", "went" → "go"). The table this package
// reads is derived from it by Generate (see the table's format there) and
// travels inside the tagger model; it is small enough to search by binary
// search, so that reading a model builds no map of it.
package wordnet

import (
	"fmt"
	"sort"
	"strings"
)

// POS is a set of WordNet parts of speech.
type POS uint8

// The four parts of speech of WordNet (satellite adjectives count as
// adjectives).
const (
	Noun POS = 1 << iota
	Verb
	Adj
	Adv
)

// posLetters are WordNet's letters for the parts of speech, in bit order.
const posLetters = "nvar"

// String returns the set as WordNet's letters ("nv").
func (p POS) String() string {
	var b []byte
	for i := range len(posLetters) {
		if p&(1<<i) != 0 {
			b = append(b, posLetters[i])
		}
	}
	return string(b)
}

// Classes is what the table says of one lower-cased word form.
type Classes struct {
	// Lemma holds the parts of speech the form itself is listed with.
	Lemma POS
	// Inflected holds the parts of speech of other listed words the form
	// is an inflection of, through the exception lists or WordNet's
	// detachment rules ("closes" → "close": noun plural or verb).
	Inflected POS
	// Major is the part of speech whose senses were tagged most often in
	// the semantic concordance WordNet ships counts of (cntlist), over the
	// form's readings as a lemma and as an inflection; 0 when none was.
	Major POS
}

// Listed reports whether WordNet knows the form in any way.
func (c Classes) Listed() bool { return c.Lemma|c.Inflected != 0 }

// entry is one line of the table. It holds no pointers — its form and
// exceptions are spans of Table.text — so that the garbage collector
// need not scan the 87,000 entries of the table the tagger carries.
type entry struct {
	form, exc span     // exc: "n:base v:base …", the form is an irregular inflection
	counts    [4]int32 // tagged-sense counts per part of speech, bit order
	pos       POS
}

// span locates a string in Table.text.
type span struct{ off, n uint32 }

// Table is a parsed table. The zero Table knows no words.
type Table struct {
	text    string
	entries []entry // sorted by form
}

// str returns the string a span locates.
func (t *Table) str(s span) string { return t.text[s.off : s.off+s.n] }

// Len returns the number of forms of the table.
func (t *Table) Len() int { return len(t.entries) }

// Parse reads a table written by Generate. Lines starting with '#' are
// comments. An error names the line.
func Parse(text string) (*Table, error) {
	if len(text) >= 1<<31 {
		return nil, fmt.Errorf("word-class table of %d bytes: too large", len(text))
	}
	t := &Table{text: text, entries: make([]entry, 0, strings.Count(text, "\n"))}
	line := 0
	for at := 0; at < len(text); {
		l, _, _ := strings.Cut(text[at:], "\n")
		start := uint32(at)
		at += len(l) + 1
		line++
		if l == "" || l[0] == '#' {
			continue
		}
		e, err := parseLine(l, start)
		if err != nil {
			return nil, fmt.Errorf("word-class table line %d: %v", line, err)
		}
		if n := len(t.entries); n > 0 && t.str(t.entries[n-1].form) >= t.str(e.form) {
			return nil, fmt.Errorf("word-class table line %d: %q is out of order", line, t.str(e.form))
		}
		t.entries = append(t.entries, e)
	}
	return t, nil
}

// parseLine reads "form<TAB>n12 v130<TAB>n:base …", a line that starts at
// offset start of the table's text.
func parseLine(l string, start uint32) (entry, error) {
	form, rest, ok1 := strings.Cut(l, "\t")
	pos, exc, ok2 := strings.Cut(rest, "\t")
	if !ok1 || !ok2 || form == "" || strings.Contains(exc, "\t") {
		return entry{}, fmt.Errorf("want 3 tab-separated fields and a form, got %q", l)
	}
	e := entry{form: span{start, uint32(len(form))}, exc: span{start + uint32(len(l)-len(exc)), uint32(len(exc))}}
	for pos != "" {
		var pc string
		pc, pos, _ = strings.Cut(pos, " ")
		if pc == "" {
			continue
		}
		i := strings.IndexByte(posLetters, pc[0])
		n, ok := count(pc[1:])
		if i < 0 || !ok {
			return entry{}, fmt.Errorf("bad part of speech and count %q", pc)
		}
		e.pos |= 1 << i
		e.counts[i] = int32(n)
	}
	for x := range strings.FieldsSeq(exc) {
		p, base, ok := strings.Cut(x, ":")
		if !ok || len(p) != 1 || !strings.Contains(posLetters, p) || base == "" {
			return entry{}, fmt.Errorf("bad exception %q", x)
		}
	}
	if e.pos == 0 && exc == "" {
		return entry{}, fmt.Errorf("%q has neither a part of speech nor an exception", form)
	}
	return e, nil
}

// count reads a non-negative decimal count below 2³¹ (strconv.ParseInt
// took a fifth of the table's parsing, which every run that tags pays).
func count(s string) (int64, bool) {
	if s == "" || len(s) > 9 {
		return 0, false
	}
	var n int64
	for i := 0; i < len(s); i++ {
		if s[i] < '0' || s[i] > '9' {
			return 0, false
		}
		n = n*10 + int64(s[i]-'0')
	}
	return n, true
}

// find returns the entry of a form, or nil.
func (t *Table) find(form string) *entry {
	if t == nil {
		return nil
	}
	i := sort.Search(len(t.entries), func(i int) bool { return t.str(t.entries[i].form) >= form })
	if i < len(t.entries) && t.str(t.entries[i].form) == form {
		return &t.entries[i]
	}
	return nil
}

// findBytes is find for a form in a byte slice; it allocates nothing (the
// tagger asks for base forms of words once per distinct word it meets).
func (t *Table) findBytes(form []byte) *entry {
	if t == nil {
		return nil
	}
	lo, hi := 0, len(t.entries)
	for lo < hi {
		m := int(uint(lo+hi) >> 1)
		if t.str(t.entries[m].form) < string(form) {
			lo = m + 1
		} else {
			hi = m
		}
	}
	if lo < len(t.entries) && t.str(t.entries[lo].form) == string(form) {
		return &t.entries[lo]
	}
	return nil
}

// eachExc calls fn with every part of speech and base form of an
// entry's exceptions ("n:base v:base"; Parse checked their syntax).
func eachExc(exc string, fn func(POS, string)) {
	for exc != "" {
		var x string
		x, exc, _ = strings.Cut(exc, " ")
		if len(x) > 2 {
			fn(POS(1)<<strings.IndexByte(posLetters, x[0]), x[2:])
		}
	}
}

// rule is one of WordNet's detachment rules: a form of a part of speech in
// pos ending in suffix may be the base form ending in ending instead.
type rule struct {
	pos            POS
	suffix, ending string
}

// rules are the detachment rules of WordNet's morphy (morph.c of WordNet
// 3.0; the manual page morphy(7WN) lists them): nouns "s" → "", "ses" →
// "s", "xes" → "x", "zes" → "z", "ches" → "ch", "shes" → "sh", "men" →
// "man", "ies" → "y"; verbs "s" → "", "ies" → "y", "es" → "e", "es" → "",
// "ed" → "e", "ed" → "", "ing" → "e", "ing" → ""; adjectives "er" → "",
// "est" → "", "er" → "e", "est" → "e". A rule of nouns and verbs alike is
// listed once, so that its base form is looked up once.
var rules = []rule{
	{Noun | Verb, "s", ""}, {Noun, "ses", "s"}, {Noun, "xes", "x"}, {Noun, "zes", "z"},
	{Noun, "ches", "ch"}, {Noun, "shes", "sh"}, {Noun, "men", "man"}, {Noun | Verb, "ies", "y"},
	{Verb, "es", "e"}, {Verb, "es", ""},
	{Verb, "ed", "e"}, {Verb, "ed", ""}, {Verb, "ing", "e"}, {Verb, "ing", ""},
	{Adj, "er", ""}, {Adj, "est", ""}, {Adj, "er", "e"}, {Adj, "est", "e"},
}

// Classes returns what the table says of a lower-cased word form.
func (t *Table) Classes(form string) Classes { return t.ClassesBytes([]byte(form)) }

// ClassesBytes is Classes for a form in a byte slice; it allocates
// nothing, for the tagger, which asks once per distinct word it meets.
func (t *Table) ClassesBytes(form []byte) Classes {
	var c Classes
	var best [4]int32
	note := func(e *entry, p POS) {
		for i := range best {
			if p&(1<<i) != 0 && e.pos&(1<<i) != 0 {
				best[i] = max(best[i], e.counts[i])
			}
		}
	}
	if e := t.findBytes(form); e != nil {
		c.Lemma = e.pos
		note(e, e.pos)
		eachExc(t.str(e.exc), func(p POS, base string) {
			if b := t.find(base); b != nil && b.pos&p != 0 {
				c.Inflected |= p
				note(b, p)
			}
		})
	}
	t.eachBase(form, func(b *entry, p POS) {
		c.Inflected |= p
		note(b, p)
	})
	var top int32
	for i, n := range best {
		if n > top {
			top, c.Major = n, 1<<i
		}
	}
	return c
}

// eachBase calls fn with every listed base form the detachment rules find
// for form, and the part of speech of the rule.
func (t *Table) eachBase(form []byte, fn func(*entry, POS)) {
	var buf [64]byte
	for _, r := range rules {
		n := len(form) - len(r.suffix)
		if n <= 0 || string(form[n:]) != r.suffix || n+len(r.ending) > len(buf) {
			continue
		}
		base := append(append(buf[:0], form[:n]...), r.ending...)
		if string(base) == string(form) {
			continue
		}
		if b := t.findBytes(base); b != nil && b.pos&r.pos != 0 {
			fn(b, b.pos&r.pos)
		}
	}
}

// Bases returns the base forms WordNet gives a lower-cased word form of the
// parts of speech in p: those of the exception lists first, then those the
// detachment rules reach, without repeats. The form itself is one when it
// is listed with such a part of speech.
func (t *Table) Bases(form string, p POS) []string {
	var out []string
	add := func(s string) {
		for _, o := range out {
			if o == s {
				return
			}
		}
		out = append(out, s)
	}
	if e := t.find(form); e != nil {
		eachExc(t.str(e.exc), func(xp POS, base string) {
			if xp&p != 0 {
				add(base)
			}
		})
		if e.pos&p != 0 {
			add(form)
		}
	}
	t.eachBase([]byte(form), func(b *entry, rp POS) {
		if rp&p != 0 {
			add(t.str(b.form))
		}
	})
	return out
}
