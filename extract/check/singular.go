package check

import (
	"strings"
	"unicode"
	"unicode/utf8"

	"glossmith/tagger/doc"
)

// singular is a capitalized word that the scan reads as the singular of
// its lower case. The tagger takes a capitalized plural it does not know
// for a name and gives it no lemma ("Thermisters", PROPN, lemma
// "Thermisters"), so a term's plural at a sentence's start or in a heading
// would go unseen where its lower case is found by its lemma. Where the
// capital is the writing's (docCapitals) and the word's regular singular
// is a word of the glossary, the scan takes that singular for the word's
// lemma; where the document's running text writes the word with capitals
// of its own, it is a name ("bought from Thermisters Ltd") and is not read
// so.
type singular struct {
	k     int    // the word's index in its sentence
	lemma string // the tagger's lemma, put back when the word is a name
	// named is set once the word has been looked up among the words the
	// running text writes with capitals of their own (and was not).
	named bool
}

// minSingular is the length of the shortest singular read: shorter ones
// ("ga" of "Gas") are more often a name's end than a word.
const minSingular = 3

// readSingulars returns sentence si of dc as the scan reads it: its
// tokens, or a copy (sc.read) in which the capitalized words that may be
// a glossary word's plural have their singular as lemma — words in title
// case or (in a heading or line of capitals) in capitals, their capital
// the writing's, with no lemma of their own from the tagger; they are
// sc.singulars. Whether the running text writes one as a name is asked
// only of those in a finding (dropNames), as it takes a look at the whole
// document.
func (sc *scanner) readSingulars(dc *docCapitals, si int) []doc.Token {
	sc.singulars = sc.singulars[:0]
	toks := dc.sents[si].Tokens
	for k := range toks {
		f := toks[k].Form
		if len(f) <= minSingular || f[0]-'A' >= 26 || f[len(f)-1]|0x20 != 's' {
			continue // most words, at a glance
		}
		if l := toks[k].Lemma; l != f && !strings.EqualFold(l, f) {
			continue // the tagger read the word: the scan feeds its lemma
		}
		if !dc.lowered(si, k) {
			continue
		}
		end, base, ok := sc.m.singularOf(dc.buf)
		if !ok {
			continue
		}
		if len(sc.singulars) == 0 {
			sc.read = append(sc.read[:0], toks...)
		}
		sc.singulars = append(sc.singulars, singular{k: k, lemma: toks[k].Lemma})
		stem := f[:len(f)-len(end)]
		if base != "" {
			if f[1] <= 'Z' { // in capitals
				base = strings.ToUpper(base)
			}
			stem += base
		}
		sc.read[k].Lemma = stem
	}
	if len(sc.singulars) == 0 {
		return toks
	}
	return sc.read
}

// dropNames looks up the words of sc.singulars that span sp holds, and
// that have not been looked up, among the words the running text of dc
// writes with capitals of their own: names. It gives those back their
// lemmas in sc.read, drops them, and reports whether there were any.
// Only a span that makes a finding is asked about, as a look builds the
// document's set of such words.
func (sc *scanner) dropNames(dc *docCapitals, si int, sp span) (dropped bool) {
	kept := sc.singulars[:0]
	for _, sg := range sc.singulars {
		if !sg.named && sp.i <= sg.k && sg.k < sp.j {
			if dc.lowered(si, sg.k); dc.ownCapitals(dc.buf) {
				sc.read[sg.k].Lemma = sg.lemma
				dropped = true
				continue
			}
			sg.named = true
		}
		kept = append(kept, sg)
	}
	sc.singulars = kept
	return dropped
}

// singularOf returns the plural ending of the lower-case word w, and what
// replaces it, that makes the key of a glossary word (Matcher.wordKeys),
// ok false when none does. Endings are tried as English inflects: -ies
// for -y ("assemblies"), -es after s, x, z, ch, sh or o ("switches"), -s.
// A word ending in -ss, -is or -us ("Glass", "Axis", "Status") is no
// regular plural.
func (m *Matcher) singularOf(w []byte) (end, base string, ok bool) {
	n := len(w)
	if n < 2 || w[n-1] != 's' {
		return "", "", false
	}
	switch w[n-2] {
	case 's', 'i', 'u':
		return "", "", false
	}
	has := func(stem []byte, base string) bool {
		_, ok := m.wordKeys[keyHash(keyHash(fnvOffset, stem), []byte(base))]
		return len(stem)+len(base) >= minSingular && ok
	}
	if stem, ok := cutEnd(w, "ies"); ok && has(stem, "y") {
		return "ies", "y", true
	}
	if stem, ok := cutEnd(w, "es"); ok && sibilantOrO(stem) && has(stem, "") {
		return "es", "", true
	}
	if has(w[:n-1], "") {
		return "s", "", true
	}
	return "", "", false
}

// cutEnd returns w without the ending end, and whether it has it.
func cutEnd(w []byte, end string) ([]byte, bool) {
	if len(w) < len(end) || string(w[len(w)-len(end):]) != end {
		return nil, false
	}
	return w[:len(w)-len(end)], true
}

// sibilantOrO reports whether a stem ends as those whose plural takes -es:
// s, x, z, ch, sh or o ("boxes", "switches", "echoes").
func sibilantOrO(stem []byte) bool {
	n := len(stem)
	if n == 0 {
		return false
	}
	switch stem[n-1] {
	case 's', 'x', 'z', 'o':
		return true
	case 'h':
		return n >= 2 && (stem[n-2] == 'c' || stem[n-2] == 's')
	}
	return false
}

// hasSingular reports whether the lower-case word w may be read as the
// plural of a glossary word (singularOf).
func (m *Matcher) hasSingular(w []byte) bool {
	_, _, ok := m.singularOf(w)
	return ok
}

// The 64-bit FNV-1a hash of keys: wordKeys holds hashes, not strings, so
// that a large glossary's set is one block the garbage collector need not
// scan. Two keys that share a hash only make a word read as a singular
// that no form then has: the trie still decides.
const (
	fnvOffset = 14695981039346656037
	fnvPrime  = 1099511628211
)

// keyHash goes on hashing h with the bytes of key.
func keyHash(h uint64, key []byte) uint64 {
	for _, b := range key {
		h = (h ^ uint64(b)) * fnvPrime
	}
	return h
}

// addWordKeys records in keys the hash of the key of form, as appendKey
// makes it, and of the keys of each of its words (split where the key
// leaves characters out: "bill" of "bill of materials", "point" of
// "set-point").
func addWordKeys(keys map[uint64]struct{}, form string) {
	whole, word := uint64(fnvOffset), uint64(fnvOffset)
	for i := 0; i < len(form); {
		var r rune
		if c := form[i]; c < utf8.RuneSelf {
			r = rune(c)
			i++
		} else {
			var size int
			r, size = utf8.DecodeRuneInString(form[i:])
			i += size
		}
		if isKeySeparator(r) {
			if word != fnvOffset {
				keys[word] = struct{}{}
			}
			word = fnvOffset
			continue
		}
		if r < utf8.RuneSelf {
			if 'A' <= r && r <= 'Z' {
				r += 'a' - 'A'
			}
			whole, word = (whole^uint64(r))*fnvPrime, (word^uint64(r))*fnvPrime
			continue
		}
		var buf [utf8.UTFMax]byte
		b := utf8.AppendRune(buf[:0], unicode.ToLower(r))
		whole, word = keyHash(whole, b), keyHash(word, b)
	}
	if word != fnvOffset {
		keys[word] = struct{}{}
	}
	if whole != fnvOffset {
		keys[whole] = struct{}{}
	}
}
