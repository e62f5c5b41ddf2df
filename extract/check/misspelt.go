package check

import (
	"bytes"
	"fmt"
	"strings"
	"sync"
	"unicode"

	"glossmith/tagger/doc"
	"glossmith/tagger/spelling"
)

// Lexicon tells words from non-words: a word it does not know may be a
// misspelling. The tagger's model is one (hmm.Model.UnknownWord: in none
// of its treebank, WordNet and general English).
type Lexicon interface {
	UnknownWord(w string) bool
}

// minMisspeltLen is the shortest word taken for a misspelling of a term's
// word, and the shortest term word read so: among shorter words one edit
// leads from a word to too many others ("pump", "dump", "pimp").
const minMisspeltLen = 5

// Misspellings finds uses of a glossary's terms with one word misspelt:
// "solenoid vavle", "set piont", "thermistr". A word is taken for a
// misspelling of a term's word when it has at least five letters, is one
// edit from the term's word (spelling.OneEdit: a letter left out, one too
// many, one wrong, two neighbours swapped, never the first letter) — with
// a final -s, -es or -ies (for -y) set aside, "vavles" for "valves" — and
// is neither a word the lexicon knows ("value" is not "valve") nor a word
// of the glossary. The tagger's lemma of the word is tried too. A word is
// read so in lower case, or with capitals the writing gave it and not the
// word — a sentence's first word, a heading's, a heading or line in
// capitals — in lower case then, unless the document's running text
// writes it with capitals of its own (a name, an acronym; see
// docCapitals). Elsewhere a capitalized word is mostly a name.
//
// Only such words cost more than a glance: a word passes a filter on its
// first letter and length, then a memo holds what it reads as; the
// sentences that have one are scanned again around it, with the word read
// as the term's. Make one per run; it is safe for concurrent use.
type Misspellings struct {
	m   *Matcher
	lex Lexicon
	// dict holds the glossary's words of letters a–z, at least
	// minMisspeltLen long, weighted by the number of forms that use them
	// (an allowed form counting twice: "thermistr" is one edit from both
	// the preferred "thermistor" and the deprecated "thermister").
	dict *spelling.Dictionary
	// shape[c] has bit n set when a word n letters long that starts with
	// letter 'a'+c may be a misspelling of a glossary word: one edit, and
	// a plural ending, from its length (bit 63: longer).
	shape [26]uint64
	// reach is how many tokens before a word a span holding it may start:
	// every token a walk takes feeds the key a byte, but for a hyphen
	// between words, and a key has at most 3/2 the bytes of its form.
	reach int

	// memos holds *memo: one for each worker in practice (a sync.Pool
	// keeps one per processor), so that a look-up takes no lock. A memo
	// shared by the workers took a read lock per word, and the workers'
	// cores passed the lock's cache line back and forth.
	memos sync.Pool
}

// memo is a worker's memo of readings, with the corrector that works
// them out.
type memo struct {
	readings  map[string]reading
	corrector spelling.Corrector
}

// reading is what the memo holds of a word: the glossary word it is a
// misspelling of, or none; known words are no misspellings of anything,
// and their lemmas need no look.
type reading struct {
	fix   string
	known bool
}

// maxMisspeltMemo bounds a memo: a run's distinct words are bounded by
// its size, not by the glossary's.
const maxMisspeltMemo = 1 << 16

// NewMisspellings prepares the misspelling pass over the glossary m,
// telling words from non-words with lex.
func NewMisspellings(m *Matcher, lex Lexicon) *Misspellings {
	ms := &Misspellings{m: m, lex: lex}
	words := map[string]float64{}
	for _, e := range m.g.Entries {
		for _, f := range e.Forms {
			ms.reach = max(ms.reach, 3*len(f.Text))
			for w := range strings.FieldsFuncSeq(f.Text, notLetter) {
				// Words of other letters ("café") are not read: the
				// spelling package knows a–z only.
				if len(w) < minMisspeltLen || !lowerASCII(w) {
					if w = strings.ToLower(w); len(w) < minMisspeltLen || !lowerASCII(w) {
						continue
					}
				}
				words[w]++
				if f.Status.allowed() {
					words[w]++
				}
			}
		}
	}
	for w := range words {
		c := w[0] - 'a'
		for n := len(w) - 1; n <= len(w)+len("ies"); n++ {
			ms.shape[c] |= 1 << min(n, 63)
		}
	}
	ms.dict = spelling.NewDictionary(words)
	ms.memos.New = func() any {
		return &memo{readings: map[string]reading{}, corrector: spelling.Corrector{Dict: ms.dict}}
	}
	return ms
}

// notLetter splits a term into its words ("dry-run" is "dry" and "run").
func notLetter(r rune) bool { return !unicode.IsLetter(r) }

// lowerASCII reports whether w is made of the letters a–z only.
func lowerASCII(w string) bool {
	for i := 0; i < len(w); i++ {
		if w[i] < 'a' || w[i] > 'z' {
			return false
		}
	}
	return true
}

// candidate reports whether w may be a misspelling of a glossary word at
// all: a lower-case word long enough whose first letter and length some
// glossary word has. It costs no look-up.
func (ms *Misspellings) candidate(w string) bool {
	if len(w) < minMisspeltLen || w[0] < 'a' || w[0] > 'z' {
		return false
	}
	return ms.shape[w[0]-'a']&(1<<min(len(w), 63)) != 0 && lowerASCII(w)
}

// reading returns what w reads as, from the memo.
func (ms *Misspellings) reading(w string) reading {
	mm := ms.memos.Get().(*memo)
	defer ms.memos.Put(mm)
	r, ok := mm.readings[w]
	if ok {
		return r
	}
	r = ms.read(w, &mm.corrector)
	if len(mm.readings) >= maxMisspeltMemo {
		clear(mm.readings)
	}
	mm.readings[strings.Clone(w)] = r
	return r
}

// plurals are the endings set aside, and what replaces them, to read a
// plural: "vavles" is "vavle" + s, "asemblies" "asembly" + ies.
var plurals = [...]struct{ end, base string }{{"s", ""}, {"es", ""}, {"ies", "y"}}

// read works out reading's answer with the corrector c: the most used
// glossary word one edit from w (or from w without a plural ending), when
// w is no word the lexicon knows and no word or term of the glossary.
func (ms *Misspellings) read(w string, c *spelling.Corrector) reading {
	if ms.dict.Contains(w) || ms.m.hasKey(w) || !ms.lex.UnknownWord(w) {
		return reading{known: true}
	}
	if r := correct(c, w); r != "" {
		return reading{fix: r}
	}
	for _, p := range plurals {
		if stem, ok := strings.CutSuffix(w, p.end); ok && len(stem)+len(p.base) >= spelling.MinEditLen {
			if r := correct(c, stem+p.base); r != "" {
				return reading{fix: r}
			}
		}
	}
	return reading{}
}

// pluralOfWord reports whether w is a glossary word with a plural ending
// ("travers" of a term "traver"): a form of that word, not a misspelling.
// In lower case the tagger's lemma tells so, and the plain scan finds the
// term; a capital at a sentence's start or in a heading may keep the
// tagger from giving the word's lemma ("Travers", taken for a name).
func (ms *Misspellings) pluralOfWord(w []byte) bool {
	for _, p := range plurals {
		if stem, ok := bytes.CutSuffix(w, []byte(p.end)); ok && ms.dict.Contains(string(stem)+p.base) {
			return true
		}
	}
	return false
}

// correct returns the glossary word one edit from w, or "". (Correct also
// squeezes repeated letters, "vallvve": one edit only.)
func correct(c *spelling.Corrector, w string) string {
	if r, ok := c.Correct(w); ok && spelling.OneEdit(w, r) {
		return r
	}
	return ""
}

// fix returns the glossary word a token is a misspelling of, by its form
// or else by its lemma, or "".
func (ms *Misspellings) fix(t *doc.Token) string {
	if !ms.candidate(t.Form) {
		return ""
	}
	r := ms.reading(t.Form)
	if r.fix == "" && !r.known && t.Lemma != t.Form && ms.candidate(t.Lemma) {
		r = ms.reading(t.Lemma)
	}
	return r.fix
}

// misspelt is a span of a sentence's tokens [i, j) that is a form's key
// once token k is read as the glossary word fix.
type misspelt struct {
	span
	k   int
	fix string
}

// fixCapitalized returns the glossary word the capitalized word k of
// sentence si is a misspelling of, or "": read in lower case, and only
// where its capitals are the writing's, not the word's (docCapitals).
func (ms *Misspellings) fixCapitalized(dc *docCapitals, si, k int) string {
	f := dc.sents[si].Tokens[k].Form
	if ms.shape[f[0]-'A']&(1<<min(len(f), 63)) == 0 || !dc.lowered(si, k) {
		return ""
	}
	r := ms.readingOf(dc.buf)
	if r.fix == "" || ms.pluralOfWord(dc.buf) || dc.ownCapitals(dc.buf) {
		return ""
	}
	return r.fix
}

// mayBeMisspelt is candidate for a word in a buffer.
func (ms *Misspellings) mayBeMisspelt(w []byte) bool { return ms.candidate(string(w)) }

// readingOf is reading for a word in a scratch buffer, copied only when
// the memo lacks it.
func (ms *Misspellings) readingOf(w []byte) reading {
	mm := ms.memos.Get().(*memo)
	r, ok := mm.readings[string(w)]
	ms.memos.Put(mm)
	if ok {
		return r
	}
	return ms.reading(string(w))
}

// find appends to out the spans of sentence si of dc that are a glossary
// form with one misspelt word, given the spans the plain scan found (which
// keep their words: a misspelt word is none inside them, and a misspelt
// span may hold them but not cut them). sc is the caller's scanner; fixed
// is scratch space for the sentence with one word read as meant.
func (ms *Misspellings) find(out []misspelt, sc *scanner, dc *docCapitals, si int, found []span, fixed *[]doc.Token) []misspelt {
	toks := dc.sents[si].Tokens
	var buf []span
	copied := false
	inFound := 0 // found[inFound] is the first span that does not end before k
	for k := range toks {
		f := toks[k].Form
		if len(f) < minMisspeltLen {
			continue // most words, at a glance
		}
		// A word of a term found needs no look-up (found is in text order
		// and its spans do not overlap).
		for inFound < len(found) && found[inFound].j <= k {
			inFound++
		}
		if inFound < len(found) && found[inFound].i <= k {
			continue
		}
		var fix string
		switch {
		case 'a' <= f[0] && f[0] <= 'z':
			fix = ms.fix(&toks[k])
		case 'A' <= f[0] && f[0] <= 'Z':
			fix = ms.fixCapitalized(dc, si, k)
		}
		if fix == "" {
			continue
		}
		if !copied {
			*fixed = append((*fixed)[:0], toks...)
			copied = true
		}
		t := &(*fixed)[k]
		t.Form, t.Lemma = fix, fix
		buf = sc.findFrom(buf[:0], *fixed, max(0, k-ms.reach+1), k+1)
		(*fixed)[k] = toks[k]
		for _, sp := range buf {
			if sp.i <= k && k < sp.j && !cuts(found, sp) {
				out = append(out, misspelt{sp, k, fix})
			}
		}
	}
	return out
}

// cuts reports whether sp overlaps a span of spans without holding it.
func cuts(spans []span, sp span) bool {
	for _, s := range spans {
		if s.i < sp.j && sp.i < s.j && (s.i < sp.i || s.j > sp.j) {
			return true
		}
	}
	return false
}

// classifyMisspelt makes the finding of a misspelt span: the form meant is
// the one the text reads as with the word fixed, else the first allowed
// form under the key, else the first; forms whose part of speech the head
// word's tag contradicts are passed over, unless the head is the misspelt
// word. Nil when none is left.
func (m *Matcher) classifyMisspelt(d *doc.Document, toks []doc.Token, ms misspelt) *Finding {
	head := &toks[ms.j-1]
	start, end := toks[ms.i].Start, head.End
	meant := foldSpace(d.Text[start:toks[ms.k].Start] + ms.fix + d.Text[toks[ms.k].End:end])
	var pick *formRef
	for k := range ms.ends {
		r := &ms.ends[k]
		f := &m.g.Entries[r.entry].Forms[r.form]
		if ms.k != ms.j-1 && !posFits(f.POS, head.UPOS) {
			continue // a misspelt head's tag says nothing ("vavles" came out PART)
		}
		if strings.EqualFold(meant, m.folded[r.entry][r.form]) {
			pick = r
			break
		}
		if pick == nil || f.Status.allowed() && !m.g.Entries[pick.entry].Forms[pick.form].Status.allowed() {
			pick = r
		}
	}
	if pick == nil {
		return nil
	}
	e := &m.g.Entries[pick.entry]
	f := &e.Forms[pick.form]
	text := foldSpace(d.Text[start:end])
	preferred := f.Text
	if !f.Status.allowed() {
		preferred = e.Preferred()
	}
	return &Finding{
		Text:      text,
		Kind:      KindMisspelt,
		Preferred: preferred,
		Entry:     e.ID,
		Message:   misspeltMessage(text, f, preferred),
		Start:     int(start),
		End:       int(end),
	}
}

// misspeltMessage words a misspelt-term finding: the text, the term meant
// and, when that term is not to be used, its status and the term to use.
func misspeltMessage(text string, meant *Form, preferred string) string {
	if meant.Status.allowed() {
		return fmt.Sprintf("%q looks like a misspelling of the term %q", text, meant.Text)
	}
	msg := fmt.Sprintf("%q looks like a misspelling of the %s term %q", text, meant.Status, meant.Text)
	if preferred != "" {
		msg += fmt.Sprintf(": use %q", preferred)
	}
	return msg
}
