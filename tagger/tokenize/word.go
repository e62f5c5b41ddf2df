package tokenize

import (
	"strings"
	"unicode"
	"unicode/utf8"
)

// word scans the word starting at i in the chunk text[cs:e] and emits it
// as one or more tokens (a number split from its unit, a clitic split from
// its host, an abbreviation with its period). It returns the end offset.
func (t *tokenizer) word(i, e, cs int) int {
	text := t.text
	j := i
	if r, n := decode(text, j); isApostrophe(r) { // "'90s"
		j += n
	}
	email := false
	quoted := false // an apostrophe joins the word: it may end in a clitic
	for j < e {
		if c := text[j]; c < utf8.RuneSelf && asciiWord[c] { // fast path
			j++
			continue
		}
		r, n := decode(text, j)
		if isWord(r) {
			j += n
			continue
		}
		if j+n >= e || j == i {
			break
		}
		if r == '.' && strings.HasPrefix(text[j:e], "...@") && j+4 < e && startsWord(text, j+4) {
			// An address shortened by a mail archive: "name...@example.com".
			j += 3
			continue
		}
		nr, _ := decode(text, j+n)
		pr, _ := decodeLast(text, j)
		if !t.joins(r, pr, nr, i, j, e, email) {
			break
		}
		switch r {
		case '@':
			email = true
		case '\'', '’', '`':
			quoted = true
		}
		j += n
	}

	// A plural possessive apostrophe ("parents'") is a clitic of its own,
	// unless the chunk opened with a single quote that it closes.
	apos := 0
	if j < e && !email {
		if r, n := decode(text, j); (r == '\'' || r == '’') && (j+n == e || !startsWord(text, j+n)) {
			if last, _ := decodeLast(text, j); last == 's' || last == 'S' {
				if open, _ := decode(text, cs); !(cs < i && (open == '\'' || open == '‘' || open == '`')) {
					apos = n
				}
			}
		}
	}

	// A number followed by a unit: "5kg" = "5" + "kg", "11:30am" = "11:30" + "am".
	if isDigitByte(text[i]) {
		if k := numberEnd(text, i, j); k < j && splitsUnit(text[k:j]) {
			t.emit(i, k, false)
			i = k
		}
	}

	// Clitics: "don't" = "do" + "n't", "it's" = "it" + "'s", "cannot" = "can" + "not".
	if !email {
		if p := cliticSplit(text, i, j, quoted); p > i {
			t.emit(i, p, true)
			i = p
		}
	}

	if apos > 0 {
		t.emit(i, j, true)
		t.emit(j, j+apos, false)
		return j + apos
	}

	// An abbreviation keeps its period: "Dr.", "e.g.", "U.S.", "J.".
	// Of two periods the first is the abbreviation's: "Inc.." = "Inc." + ".".
	if j < e && text[j] == '.' && (j+1 == e || text[j+1] != '.' || j+2 == e || text[j+2] != '.') && isAbbrev(text, i, j) {
		t.emit(i, j+1, false)
		return j + 1
	}
	t.emit(i, j, false)
	return j
}

// joins reports whether the non-word rune r between pr and nr continues the
// word text[i:j] (it is at j) rather than ending it.
func (t *tokenizer) joins(r, pr, nr rune, i, j, e int, email bool) bool {
	text := t.text
	switch r {
	case '.':
		return isWord(nr)
	case ',', ':':
		return isDigit(pr) && isDigit(nr)
	case '/':
		return isDigit(pr) && isDigit(nr) && t.keepDigits(i, j, e, '/')
	case '-', '‐':
		switch {
		case email:
			return isWord(nr)
		case isLetter(nr) && hyphenPrefix(text[i:j]):
			return true
		case isDigit(pr) && isDigit(nr):
			return t.keepDigits(i, j, e, '-')
		}
		return false
	case '\'', '’', '`':
		return isLetter(nr)
	case '&', '·':
		return isLetter(pr) && isLetter(nr)
	case '@':
		return isWord(nr) && !email
	}
	return false
}

func startsWord(text string, i int) bool {
	r, _ := decode(text, i)
	return isWord(r)
}

// hyphenPrefix reports whether w is a prefix that keeps its hyphen.
func hyphenPrefix(w string) bool { return lowerIn(w, 7, hyphenPrefixes) }

// lowerIn reports whether w, an ASCII word of at most maxLen (≤ 8) letters,
// is in set once lower-cased. It lower-cases into a stack buffer, so the
// tokenizer's hot path does not allocate.
func lowerIn(w string, maxLen int, set map[string]bool) bool {
	if len(w) > maxLen {
		return false
	}
	var buf [8]byte
	for k := 0; k < len(w); k++ {
		c := w[k]
		switch {
		case 'a' <= c && c <= 'z':
		case 'A' <= c && c <= 'Z':
			c += 'a' - 'A'
		default:
			return false
		}
		buf[k] = c
	}
	return set[string(buf[:len(w)])]
}

// digitGroups reads groups of digits separated by sep from i on and returns
// their number and the lengths of the first two. ok is false when the
// groups do not cover text[i:j] (something other than digits and sep).
func digitGroups(text string, i, j, e int, sep byte) (n, first, second int, ok bool) {
	k := i
	for k < e {
		s := k
		for k < e && isDigitByte(text[k]) {
			k++
		}
		if k == s {
			break
		}
		switch n {
		case 0:
			first = k - s
		case 1:
			second = k - s
		}
		n++
		if k+1 < e && text[k] == sep && isDigitByte(text[k+1]) {
			k++
			continue
		}
		break
	}
	return n, first, second, k >= j
}

// keepDigits decides whether the separator sep at j joins the digit groups
// of the word starting at i: keepNumberHyphen for '-', keepSlash for '/'.
// The answer is the same for every separator of a word, so it is kept for
// the next one; this keeps a long run like "1-2-3-…" linear.
func (t *tokenizer) keepDigits(i, j, e int, sep byte) bool {
	if t.digits.start == i+1 && t.digits.sep == sep && j < t.digits.end {
		return t.digits.keep
	}
	n, a, b, ok := digitGroups(t.text, i, j, e, sep)
	keep := false
	if ok {
		if sep == '-' {
			keep = keepNumberHyphen(n, a, b)
		} else {
			keep = keepSlash(n, b)
		}
	}
	t.digits.start, t.digits.sep, t.digits.keep = i+1, sep, keep
	t.digits.end = e // not digit groups up to j: nor up to any later j
	if ok {
		t.digits.end = groupsEnd(t.text, i, e, sep)
	}
	return keep
}

// groupsEnd returns the end of the digit groups separated by sep from i.
func groupsEnd(text string, i, e int, sep byte) int {
	k := i
	for k < e && (isDigitByte(text[k]) || text[k] == sep && k+1 < e && isDigitByte(text[k+1])) {
		k++
	}
	return k
}

// keepNumberHyphen decides whether hyphens join n digit groups (the first
// two of lengths a and b) as in a phone number or code ("713-853-3989",
// "345-9945") rather than a range ("1969 - 1970", "3 - 4"), as EWT 2.15
// writes them.
func keepNumberHyphen(n, a, b int) bool {
	return n >= 3 || n == 2 && b >= 3 && !(a == 4 && b == 4)
}

// keepSlash decides whether slashes join n digit groups (the second of
// length b) as in a date ("11/28/2000", "9/11") rather than a fraction or
// ratio ("1 / 2"), as in EWT 2.15.
func keepSlash(n, b int) bool {
	return n >= 3 || n == 2 && b >= 2
}

// numberEnd returns the end of the number at the start of text[i:j]:
// digits with inner separators.
func numberEnd(text string, i, j int) int {
	k := i
	for k < j {
		c := text[k]
		if isDigitByte(c) || (c == '.' || c == ',' || c == ':' || c == '/' || c == '-') && k+1 < j && isDigitByte(text[k+1]) {
			k++
			continue
		}
		break
	}
	return k
}

// splitsUnit reports whether the letters after a number are a unit to
// split off ("kg", "am", "M") rather than a suffix ("th", "s").
func splitsUnit(suf string) bool { return lowerIn(suf, 8, units) }

// cliticSplit returns where the word text[i:j] splits into host and
// clitic, or i when it does not. quoted tells whether an apostrophe
// joins the word after its first character; only then may it have a
// clitic after one.
func cliticSplit(text string, i, j int, quoted bool) int {
	w := text[i:j]
	if n := contraction(w); n > 0 || !quoted {
		return i + n
	}
	// The last apostrophe, if any, with the letters after it.
	for k := len(w) - 1; k > 0; k-- {
		c := w[k]
		var n int
		switch {
		case c == '\'' || c == '`':
			n = 1
		case c == 0x99 && k >= 2 && w[k-2:k+1] == "’":
			k -= 2
			n = 3
		default:
			continue
		}
		if k == 0 {
			return i
		}
		suf := w[k+n:]
		if len(suf) > 2 {
			return i
		}
		var buf [2]byte
		for m := 0; m < len(suf); m++ {
			c := suf[m]
			if 'A' <= c && c <= 'Z' {
				c += 'a' - 'A'
			}
			buf[m] = c
		}
		lower := string(buf[:len(suf)])
		if cliticSuffixes[lower] {
			if lower == "s" && isDecade(w[:k]) {
				return i // "the 70's", "1980's": a plural, kept whole in EWT
			}
			return i + k
		}
		if lower == "t" && k >= 2 && (w[k-1] == 'n' || w[k-1] == 'N') {
			return i + k - 1
		}
		return i
	}
	return i
}

// isDecade reports whether w names a decade: "70", "1980".
func isDecade(w string) bool {
	if (len(w) != 2 && len(w) != 4) || w[len(w)-1] != '0' {
		return false
	}
	for k := 0; k < len(w); k++ {
		if !isDigitByte(w[k]) {
			return false
		}
	}
	return true
}

// isAbbrev reports whether the word text[i:j], followed by a period at j,
// is an abbreviation that keeps the period.
func isAbbrev(text string, i, j int) bool {
	w := text[i:j]
	if r, n := decode(text, i); n == len(w) && unicode.IsUpper(r) && afterNumber(text, i) {
		// A capital after a number is a unit symbol, not an initial
		// ("3 K.", "5K.", "12 V."): the period ends the sentence.
		return false
	}
	listed := abbrevShapes.has(w) // else neither look-up below can succeed
	if listed {
		if _, ok := abbrevs[text[i:j+1]]; ok {
			return true
		}
	}
	if r, n := decode(text, i); n == len(w) && unicode.IsUpper(r) {
		return true // an initial
	}
	if listed && len(w) < 16 {
		var buf [16]byte
		for k := 0; k < len(w); k++ {
			c := w[k]
			if 'A' <= c && c <= 'Z' {
				c += 'a' - 'A'
			}
			buf[k] = c
		}
		buf[len(w)] = '.'
		if _, ok := abbrevs[string(buf[:len(w)+1])]; ok {
			return true
		}
	}
	return isDotted(w)
}

// afterNumber reports whether the text before i, spaces skipped, ends in a
// digit.
func afterNumber(text string, i int) bool {
	for i > 0 {
		r, n := decodeLast(text, i)
		switch {
		case r == ' ' || r == '\u00a0' || r == '\u202f':
			i -= n
		default:
			return isDigitByte(text[i-1])
		}
	}
	return false
}

// isDotted reports whether w is letters in groups of one or two separated
// by periods, like "U.S", "e.g", "a.k.a", "Ph.D".
func isDotted(w string) bool {
	groups, run := 0, 0
	for k := 0; k < len(w); k++ {
		c := w[k]
		switch {
		case 'a' <= c && c <= 'z' || 'A' <= c && c <= 'Z':
			run++
			if run > 2 {
				return false
			}
		case c == '.' && run > 0:
			groups++
			run = 0
		default:
			return false
		}
	}
	return groups >= 1 && run > 0
}

// urlLen returns the length of the URL at the start of s, up to the end of
// the chunk, or 0 when s does not start with one.
func urlLen(s string) int {
	if len(s) < 5 {
		return 0
	}
	// This runs at every token: one test of the first four bytes, with
	// the case bit set (which also lets through a few other bytes), rules
	// out nearly every word before the exact comparisons.
	switch uint32(s[0]) | uint32(s[1])<<8 | uint32(s[2])<<16 | uint32(s[3])<<24 | 0x20202020 {
	case 'h' | 't'<<8 | 't'<<16 | 'p'<<24, 'f' | 't'<<8 | 'p'<<16 | ':'<<24,
		'm' | 'a'<<8 | 'i'<<16 | 'l'<<24, 'w' | 'w'<<8 | 'w'<<16 | '.'<<24:
	default:
		return 0
	}
	for _, p := range [...]string{"http://", "https://", "ftp://", "mailto:"} {
		if len(s) > len(p) && strings.EqualFold(s[:len(p)], p) {
			return len(s)
		}
	}
	if len(s) > 4 && strings.EqualFold(s[:4], "www.") && startsWord(s, 4) {
		return len(s)
	}
	return 0
}

// trimURL drops trailing punctuation from the URL text[s:e]: sentence
// punctuation, quotes, and closing brackets that have no opening one
// inside the URL.
func trimURL(text string, s, e int) int {
	var open, closed [3]int // (), [], {}
	for k := s; k < e; k++ {
		if b := strings.IndexByte("([{", text[k]); b >= 0 {
			open[b]++
		} else if b := strings.IndexByte(")]}", text[k]); b >= 0 {
			closed[b]++
		}
	}
	for e > s+1 {
		r, n := decodeLast(text, e)
		switch r {
		case '.', ',', ';', ':', '!', '?', '\'', '"', '>', '”', '’', '»':
		case ')', ']', '}':
			b := strings.IndexRune(")]}", r)
			if open[b] >= closed[b] {
				return e
			}
			closed[b]--
		default:
			return e
		}
		e -= n
	}
	return e
}

// punct emits the punctuation token at i, whose first rune is r (n bytes).
func (t *tokenizer) punct(i, e int, r rune, n int) int {
	text := t.text
	switch r {
	case ':', ';', '=', '^', '<':
		for _, em := range emoticons {
			if strings.HasPrefix(text[i:e], em) && (i+len(em) == e || !startsWord(text, i+len(em))) {
				t.emit(i, i+len(em), false)
				return i + len(em)
			}
		}
	}
	j := i + n
	switch r {
	case '°':
		// A temperature unit is one token: "°C", "°F" (common practice;
		// EWT has no example).
		if j < e && (text[j] == 'C' || text[j] == 'F') && (j+1 == e || !startsWord(text, j+1)) {
			j++
		}
	case '.', '!', '?', '…':
		// Runs of sentence punctuation are one token: "...", "?!", "!!!".
		for j < e {
			r2, n2 := decode(text, j)
			if r2 != '.' && r2 != '!' && r2 != '?' && r2 != '…' {
				break
			}
			j += n2
		}
	case '#':
		if j < e && isLetter(firstRune(text[j:e])) { // a hashtag: "#audiobooks"
			j = i + n
			for j < e {
				r2, n2 := decode(text, j)
				if !isWord(r2) {
					break
				}
				j += n2
			}
			break
		}
		for j < e && text[j] == '#' {
			j++
		}
	case '-', '=', '*', '~', '<', '>', '`', '\'', '+', '$':
		// Runs of one character are one token: "--", "<<", "''", "***".
		for j < e && text[j] == byte(r) {
			j++
		}
	}
	t.emit(i, j, false)
	return j
}
