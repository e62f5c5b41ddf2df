package check

import (
	"strings"
	"unicode"
	"unicode/utf8"

	"glossmith/tagger/doc"
)

// classify decides what a span whose key is a form's key is: nothing (ok
// false) when it is an allowed term as written (its preferred or an
// admitted form, or an inflection of one), else the finding, without its
// position. The finding comes as a value: a pointer made one allocation
// for each of the many findings of a large run.
//
// Among the entries whose forms share the key, in glossary order: a span
// written as an allowed form of any of them is fine; else one written as a
// deprecated or forbidden form is that (an error); else, when an entry has
// an allowed form under the key, the span is another spelling of it (a
// warning: hyphen, space, closed, case of a case-sensitive form); else it
// is a spelling of a deprecated term (an error). An entry whose part of
// speech the head word's tag contradicts is passed over.
func (m *Matcher) classify(d *doc.Document, toks []doc.Token, sp span) (Finding, bool) {
	head := &toks[sp.j-1]
	surface := foldSpace(d.Text[toks[sp.i].Start:head.End])
	// The text with its head word lemmatized ("magnet valves" → "magnet
	// valve"), and with every word lemmatized ("angles of attack"), made
	// when the text as written is no form: a wrong lemma of another word
	// ("solenoid" → "solenoy" when taken for a verb) spoils only the second.
	headLemma, lemmas := "", ""
	lemmasMade := false
	var bad, spell, worse *formRef
	caseOnly := false
	verbHead := verbInflection(head)
	for k := range sp.ends {
		r := &sp.ends[k]
		f := &m.g.Entries[r.entry].Forms[r.form]
		if !posFits(f.POS, head.UPOS) {
			continue
		}
		want := m.folded[r.entry][r.form]
		if verbHead && nounOrUnknown(f.POS) && !sameKey(surface, want) {
			continue // "heat-sealed", "hot sealed": the verb, not the noun "heat seal"
		}
		exact := same(surface, want, f.CaseSensitive)
		if !exact && !lemmasMade {
			headLemma, lemmas, lemmasMade = lemmaSurface(toks[sp.i:sp.j], true), lemmaSurface(toks[sp.i:sp.j], false), true
		}
		exact = exact || same(headLemma, want, f.CaseSensitive) || same(lemmas, want, f.CaseSensitive) ||
			inflects(toks[sp.i:sp.j], want, f.CaseSensitive)
		switch {
		case exact && f.Status.allowed():
			return Finding{}, false
		case exact:
			if bad == nil {
				bad = r
			}
		case f.Status.allowed():
			if spell == nil {
				spell = r
				caseOnly = f.CaseSensitive && (strings.EqualFold(surface, want) || strings.EqualFold(lemmas, want))
			}
		default:
			if worse == nil {
				worse = r
			}
		}
	}
	var r *formRef
	kind := KindDeprecated
	switch {
	case bad != nil:
		r = bad
	case spell != nil:
		r, kind = spell, KindSpelling
	case worse != nil:
		r = worse
	default:
		return Finding{}, false
	}
	e := &m.g.Entries[r.entry]
	f := &e.Forms[r.form]
	preferred := e.Preferred()
	if caseOnly && kind == KindSpelling {
		preferred = f.Text
	}
	return Finding{
		Text:      surface,
		Kind:      kind,
		Preferred: preferred,
		Entry:     e.ID,
		Message:   message(kind, f.Status, surface, preferred, caseOnly && kind == KindSpelling),
		Start:     int(toks[sp.i].Start),
		End:       int(head.End),
	}, true
}

// same compares a text with a form, in case or not.
func same(text, form string, caseSensitive bool) bool {
	if caseSensitive {
		return text == form
	}
	return strings.EqualFold(text, form)
}

// lemmaSurface writes tokens as they stand but with their words (only the
// last one when headOnly) replaced by their lemmas, kept in the case the
// word was written in where the lemma is a prefix of it ("PLCs" → "PLC",
// "magnet valves" → "magnet valve").
func lemmaSurface(toks []doc.Token, headOnly bool) string {
	var b strings.Builder
	for k := range toks {
		t := &toks[k]
		if k > 0 && !glued(&toks[k-1], t) {
			b.WriteByte(' ')
		}
		w := t.Form
		if !headOnly || k == len(toks)-1 {
			w = lemmaWord(t)
		}
		if isHyphen(w) {
			w = "-"
		}
		b.WriteString(w)
	}
	return b.String()
}

// lemmaWord returns a token's lemma as lemmaSurface writes it: in the
// case the word was written in where the lemma is a prefix of it.
func lemmaWord(t *doc.Token) string {
	w, l := t.Form, t.Lemma
	if l == "" || l == w {
		return w
	}
	if len(l) <= len(w) && strings.EqualFold(w[:len(l)], l) {
		return w[:len(l)]
	}
	return l
}

// inflects reports whether toks, each word either as written or as its
// lemma, spell want with the separators of the text (a space where the
// text has white space, a hyphen token as "-"): a form some of whose
// words are inflected in the form itself, written with others inflected
// too ("steps of several degrees" of "step of several degrees", "bills of
// materials" of "bill of materials"), where lemmatizing the last word or
// every word spells no form. Each token has at most two readings, and a
// term a few words, so the search stays small; it runs only for spans
// not written as a form.
func inflects(toks []doc.Token, want string, caseSensitive bool) bool {
	if len(toks) == 0 {
		return want == ""
	}
	t := &toks[0]
	sep := ""
	if len(toks) > 1 && !glued(t, &toks[1]) {
		sep = " "
	}
	for r, w := range [2]string{t.Form, lemmaWord(t)} {
		if r == 1 && w == t.Form {
			break
		}
		if isHyphen(w) {
			w = "-"
		}
		rest, ok := cutSame(want, w, caseSensitive)
		if !ok {
			continue
		}
		if rest, ok = strings.CutPrefix(rest, sep); ok && inflects(toks[1:], rest, caseSensitive) {
			return true
		}
	}
	return false
}

// cutSame returns text without its prefix that is w (up to case unless
// caseSensitive, as same compares), and whether it has one. The prefix is
// read rune by rune: a word and its other case can differ in length
// ("K", KELVIN SIGN, is "k" up to case), so w's length in bytes need
// not be the prefix's.
func cutSame(text, w string, caseSensitive bool) (string, bool) {
	if caseSensitive {
		return strings.CutPrefix(text, w)
	}
	for _, r := range w {
		c, size := utf8.DecodeRuneInString(text)
		if size == 0 || !sameUpToCase(c, r) {
			return "", false
		}
		text = text[size:]
	}
	return text, true
}

// sameUpToCase reports whether two runes are one up to case, as
// strings.EqualFold compares runes: b is in a's orbit under
// unicode.SimpleFold.
func sameUpToCase(a, b rune) bool {
	if a == b {
		return true
	}
	for f := unicode.SimpleFold(a); f != a; f = unicode.SimpleFold(f) {
		if f == b {
			return true
		}
	}
	return false
}

// posFits reports whether a head word tagged upos can be the head of a term
// of the glossary's part of speech pos. Only a function word contradicts a
// noun, verb, adjective or adverb, and an adverb a noun ("before you power
// up" is no use of the noun "power-up"): the tagger takes a rare noun for
// a verb or an adjective often enough ("both magnet valves" came out VERB)
// that content-word tags cannot veto, and an untagged word fits anything.
// verbInflection reports whether the tagger read t as a verb's past or
// participle (VBD, VBN, VBG) and gave it a lemma of its own: a span that
// reaches a noun term's key only through that lemma ("heat-sealed",
// "hot sealed" through "seal") is the verb, whose -ed and -ing forms are
// no inflection of the noun.
func verbInflection(t *doc.Token) bool {
	if t.UPOS != "VERB" || t.Lemma == "" || strings.EqualFold(t.Lemma, t.Form) {
		return false
	}
	switch t.XPOS {
	case "VBD", "VBN", "VBG":
		return true
	}
	return false
}

// nounOrUnknown reports whether a form's part of speech is a noun's or not
// given (glossaries are mostly nouns, and mostly say so by leaving it out).
func nounOrUnknown(pos string) bool {
	switch strings.ToLower(pos) {
	case "", "noun", "n", "propn", "proper noun", "propernoun":
		return true
	}
	return strings.HasSuffix(strings.ToUpper(pos), "NOUN") // a UPOS sequence: "ADJ NOUN"
}

// sameKey reports whether two texts have the same key (appendKey): the
// same letters but for case, spaces and hyphens.
func sameKey(a, b string) bool {
	var ka, kb [64]byte
	return string(appendKey(ka[:0], a)) == string(appendKey(kb[:0], b))
}

func posFits(pos, upos string) bool {
	if pos == "" || upos == "" {
		return true
	}
	switch upos {
	case "ADP", "DET", "PRON", "CCONJ", "SCONJ", "PART", "INTJ", "ADV":
	default:
		return true
	}
	switch strings.ToLower(pos) {
	case "noun", "n", "propn", "proper noun", "propernoun":
		return false
	case "verb", "v", "adjective", "adj", "a", "adverb", "adv":
		return upos == "ADV"
	}
	return true
}
