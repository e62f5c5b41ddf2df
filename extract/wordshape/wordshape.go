// Package wordshape answers questions about the written shape of a word
// that the term and collocation counters both ask: does the token carry a
// letter or a digit (a word rather than punctuation), and is it an
// acronym, whose case must survive lower-casing ("PLC", "EC-3")?
package wordshape

import (
	"strings"
	"unicode"
	"unicode/utf8"
)

// IsWord reports whether s contains a letter or a digit.
func IsWord(s string) bool {
	for i := 0; i < len(s); i++ { // most tokens: a decision on the first byte
		switch c := s[i]; {
		case 'a' <= c && c <= 'z', 'A' <= c && c <= 'Z', '0' <= c && c <= '9':
			return true
		case c >= utf8.RuneSelf:
			return isWordRunes(s[i:])
		}
	}
	return false
}

func isWordRunes(s string) bool {
	for _, r := range s {
		if unicode.IsLetter(r) || unicode.IsDigit(r) {
			return true
		}
	}
	return false
}

// IsAcronym reports whether s has at least two upper-case letters and no
// lower-case one ("PLC", "EC-3", "NTC"): a form whose case carries meaning
// and is kept when other words are lower-cased.
func IsAcronym(s string) bool {
	upper := 0
	for _, r := range s {
		if unicode.IsLower(r) {
			return false
		}
		if unicode.IsUpper(r) {
			upper++
		}
	}
	return upper >= 2
}

// KeepsCase reports whether the case of s carries meaning, so that
// lower-casing would lose it: an upper-case letter right after another
// letter, as in acronyms and units or mixed-case words ("PLC", "kPa",
// "pH", "MWh", "HAWTs", "EC-3", and "°C" after a degree sign), or right
// before a digit, as in codes (error "E1", terminal "Q12", screw "M6"). A capital that starts a word
// ("Valve" at the start of a sentence, "Drip-Line" in a heading) carries
// none.
func KeepsCase(s string) bool {
	// Most words are lower-case ASCII: a comparison or two a byte says so.
	// The first byte cannot be a capital after a letter.
	for i := 1; i < len(s); i++ {
		c := s[i]
		if c-'A' < 26 || c >= utf8.RuneSelf {
			return keepsCaseRunes(s)
		}
		if c-'0' < 10 && s[i-1]-'A' < 26 {
			return true
		}
	}
	return false
}

// keepsCaseRunes is KeepsCase for any text.
func keepsCaseRunes(s string) bool {
	prevLetter, prevUpper := false, false
	for _, r := range s {
		upper := unicode.IsUpper(r)
		if prevLetter && upper || prevUpper && unicode.IsDigit(r) {
			return true
		}
		// A degree sign counts as a letter before a capital: "°C".
		prevLetter, prevUpper = unicode.IsLetter(r) || r == '°', upper
	}
	return false
}

// IsAddress reports whether s, a piece of text without white space, is a
// URL ("https://…", "www.…"), an e-mail address or a file path ("/etc/x",
// "C:\dir\file", "docs/setup/a.md"): text to copy, not words of a term.
// A reference such as "ECB/2004/11" or "and/or" is no path: a relative path
// needs a file extension.
func IsAddress(s string) bool {
	if strings.Contains(s, "://") || len(s) > 4 && strings.EqualFold(s[:4], "www.") {
		return true
	}
	if at := strings.IndexByte(s, '@'); at > 0 {
		if dot := strings.LastIndexByte(s, '.'); dot > at+1 && dot < len(s)-1 {
			return true
		}
	}
	switch {
	case strings.HasPrefix(s, "/") && len(s) > 1, strings.HasPrefix(s, "~/"), strings.HasPrefix(s, "./"), strings.HasPrefix(s, "../"):
		return true
	case len(s) > 2 && s[1] == ':' && (s[2] == '\\' || s[2] == '/'): // C:\file
		return true
	}
	sep := strings.LastIndexAny(s, `/\`)
	if sep <= 0 {
		return false
	}
	// dir/name.ext: an extension of one to five letters or digits.
	name := s[sep+1:]
	dot := strings.LastIndexByte(name, '.')
	if dot <= 0 || len(name)-dot-1 < 1 || len(name)-dot-1 > 5 {
		return false
	}
	for _, c := range []byte(name[dot+1:]) {
		if !('a' <= c && c <= 'z' || 'A' <= c && c <= 'Z' || '0' <= c && c <= '9') {
			return false
		}
	}
	return true
}
