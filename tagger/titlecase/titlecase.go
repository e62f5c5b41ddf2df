// Package titlecase decides how the tagger should see the words of a
// heading. Manual headings are written in title case ("Cleaning the Drip
// Emitters") or in capitals, where every word has the capital that in
// running text marks a name; a tagger trained on running text then reads
// "Drip Emitters" as proper nouns, and the term list gets a name that is
// none. Taking the capitals off every title-case sentence is no cure: a
// treebank's title-case sentences are mostly names. So only sentences the
// document's markup or layout shows to be headings (doc.Sentence.Heading)
// get this view, and in them only the capitals that general English would
// not write: a word goes to lower case when general English writes it in
// lower case at least half of the time (the shares of package genfreq),
// or, missing there, when WordNet lists it (package wordnet, whose entries
// are mostly common words). Names ("Berlin", mostly capitalized in general
// English) and words neither table knows — a product's invented name
// ("Aquavent", "GC-48") — keep their form, and so does the heading's
// first word, which is capitalized in any sentence, unless it is the
// heading's only word. A heading in capitals is seen as one in title
// case would be ("CLEANING THE DRIP EMITTERS": "Cleaning the drip
// emitters").
//
// Names made of common words ("Climate Master") and acronyms that are
// also words ("PAN") the tables cannot tell; the document's running text
// can (see Evidence), and where it speaks it decides.
//
// The view is only what the tagger reads: the tokens' forms stay as
// written.
package titlecase

import (
	"bytes"
	"strings"
	"unicode"
	"unicode/utf8"

	"glossmith/tagger/doc"
	"glossmith/tagger/genfreq"
	"glossmith/tagger/wordnet"
)

// Viewer holds the tables a view consults. A nil table is not consulted;
// with neither, headings are seen as written. Doc, when not nil, is the
// evidence of the heading's document (Gather).
type Viewer struct {
	Freq    *genfreq.Table
	WordNet *wordnet.Table
	Doc     *Evidence
}

// View returns toks as the tagger should see them when they form a
// heading: a copy in dst (reused when large enough) with the forms of
// common words taken out of title case or capitals. It returns toks itself
// when nothing changes.
func (v Viewer) View(dst, toks []doc.Token) []doc.Token {
	if v.Freq == nil && v.WordNet == nil {
		return toks
	}
	caps := AllCaps(toks)
	alone := words(toks) == 1
	names, buf := v.Doc.nameTokens(toks, nil)
	out, copied := toks, false
	first := true // no word seen yet: the next one is the sentence's first
	for i := range toks {
		form := toks[i].Form
		r, _ := utf8.DecodeRuneInString(form)
		if !unicode.IsLetter(r) {
			continue
		}
		initial := first
		first = false
		if !unicode.IsUpper(r) {
			continue
		}
		var ok bool
		buf, ok = lowered(buf[:0], form, caps)
		if !ok {
			continue
		}
		name := i < 64 && names&(1<<i) != 0
		seen := v.Doc.seen(buf) & (seenLower | seenCaps)
		switch {
		case caps && seen == seenCaps, name && !caps:
			continue // an acronym ("PAN") or a name ("Climate Master") as running text writes it
		case name && !isSmallWord(string(buf)):
			buf = titled(buf) // "CLIMATE MASTER": "Climate Master"
		case seen != seenLower && !v.common(buf):
			continue // a word running text writes in lower case is common in any case
		case alone:
			// A heading of one word ("Storm", "Implementation") has no
			// context that tells a name from a noun; the tagger took 5 of
			// 15 such common nouns for names, and none in lower case.
		case initial && !caps:
			continue // capitalized as the first word anyway
		case initial:
			buf = titled(buf)
		}
		if !copied {
			out, copied = append(dst[:0], toks...), true
		}
		out[i].Form = string(buf)
	}
	return out
}

// words counts the tokens that start with a letter.
func words(toks []doc.Token) int {
	n := 0
	for i := range toks {
		if r, _ := utf8.DecodeRuneInString(toks[i].Form); unicode.IsLetter(r) {
			n++
		}
	}
	return n
}

// common reports whether general English writes the lower-cased word
// mostly in lower case: by its share in the frequency table, or, for a
// word the table lacks, by WordNet listing it. A hyphenated word the
// tables lack is common when each of its parts is ("anti-corrosion").
func (v Viewer) common(lower []byte) bool {
	if v.Freq != nil {
		if c := v.Freq.LookupBytes(lower); c != 0 {
			return c.Share() >= 3 // 50 % or more in lower case
		}
	}
	if v.WordNet != nil && v.WordNet.ClassesBytes(lower).Listed() {
		return true
	}
	if bytes.IndexByte(lower, '-') < 0 {
		return false
	}
	for part := range bytes.SplitSeq(lower, []byte{'-'}) {
		if !v.common(part) {
			return false
		}
	}
	return true
}

// lowered appends the lower case of form to buf and reports whether form
// is a word that title case or capitals could have given its capitals:
// letters only, at least two, in title case ("Drip") or — in a heading
// written in capitals — all in capitals ("DRIP"); or such words joined
// by hyphens ("Anti-Corrosion", "ANTI-CORROSION"). Other shapes ("GC-48",
// "iPhone", "McKinley", a lone "A") are not.
func lowered(buf []byte, form string, caps bool) ([]byte, bool) {
	n := 0
	for part := range strings.SplitSeq(form, "-") {
		if n > 0 {
			buf = append(buf, '-')
		}
		k := 0
		for i, r := range part {
			switch {
			case !unicode.IsLetter(r):
				return buf, false
			case i > 0 && !caps && !unicode.IsLower(r), (i == 0 || caps) && !unicode.IsUpper(r):
				return buf, false
			}
			buf = utf8.AppendRune(buf, unicode.ToLower(r))
			k++
		}
		if k < 2 {
			return buf, false
		}
		n++
	}
	return buf, n > 0
}

// titled gives the first letter of a lower-cased word its capital back.
func titled(b []byte) []byte {
	r, size := utf8.DecodeRune(b)
	u := unicode.ToUpper(r)
	if u == r {
		return b
	}
	return append(utf8.AppendRune(nil, u), b[size:]...)
}

// AllCaps reports a heading (or any line of tokens) written in capitals:
// it has letters, at least two, and none of them in lower case. There a
// word's capitals are the writing's, not the word's.
func AllCaps(toks []doc.Token) bool {
	letters := 0
	for i := range toks {
		n, ok := capitals(toks[i].Form)
		if !ok {
			return false
		}
		letters += n
	}
	return letters >= 2
}

// capitals counts the letters of s and reports whether none of them is in
// lower case.
func capitals(s string) (letters int, ok bool) {
	for _, r := range s {
		switch {
		case unicode.IsLower(r):
			return 0, false
		case unicode.IsLetter(r):
			letters++
		}
	}
	return letters, true
}
