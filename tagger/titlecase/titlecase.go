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
// first word, which is capitalized in any sentence.
//
// The view is only what the tagger reads: the tokens' forms stay as
// written.
package titlecase

import (
	"unicode"
	"unicode/utf8"

	"glossmith/tagger/doc"
	"glossmith/tagger/genfreq"
	"glossmith/tagger/wordnet"
)

// Viewer holds the tables a view consults. A nil table is not consulted;
// with neither, headings are seen as written.
type Viewer struct {
	Freq    *genfreq.Table
	WordNet *wordnet.Table
}

// View returns toks as the tagger should see them when they form a
// heading: a copy in dst (reused when large enough) with the forms of
// common words taken out of title case or capitals. It returns toks itself
// when nothing changes.
func (v Viewer) View(dst, toks []doc.Token) []doc.Token {
	if v.Freq == nil && v.WordNet == nil {
		return toks
	}
	caps := allCaps(toks)
	var buf []byte
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
		if !ok || !v.common(buf) {
			continue
		}
		if initial {
			if !caps {
				continue // capitalized as the first word anyway
			}
			buf = titled(buf)
		}
		if !copied {
			out, copied = append(dst[:0], toks...), true
		}
		out[i].Form = string(buf)
	}
	return out
}

// common reports whether general English writes the lower-cased word
// mostly in lower case: by its share in the frequency table, or, for a
// word the table lacks, by WordNet listing it.
func (v Viewer) common(lower []byte) bool {
	if v.Freq != nil {
		if c := v.Freq.LookupBytes(lower); c != 0 {
			return c.Share() >= 3 // 50 % or more in lower case
		}
	}
	return v.WordNet != nil && v.WordNet.ClassesBytes(lower).Listed()
}

// lowered appends the lower case of form to buf and reports whether form
// is a word that title case or capitals could have given its capitals:
// letters only, at least two, in title case ("Drip") or — in a heading
// written in capitals — all in capitals ("DRIP"). Other shapes ("GC-48",
// "iPhone", "McKinley", a lone "A") are not.
func lowered(buf []byte, form string, caps bool) ([]byte, bool) {
	n := 0
	for i, r := range form {
		switch {
		case !unicode.IsLetter(r):
			return buf, false
		case i > 0 && !caps && !unicode.IsLower(r), caps && !unicode.IsUpper(r):
			return buf, false
		}
		buf = utf8.AppendRune(buf, unicode.ToLower(r))
		n++
	}
	return buf, n >= 2
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

// allCaps reports a heading written in capitals: it has letters, at
// least two, and none of them in lower case.
func allCaps(toks []doc.Token) bool {
	letters := 0
	for i := range toks {
		for _, r := range toks[i].Form {
			switch {
			case unicode.IsLower(r):
				return false
			case unicode.IsLetter(r):
				letters++
			}
		}
	}
	return letters >= 2
}
