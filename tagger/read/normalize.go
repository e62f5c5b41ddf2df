package read

import (
	"strings"
	"unicode/utf8"

	"golang.org/x/text/unicode/norm"
)

// invisible reports the format characters that are removed from the text
// before tokenizing: they do not show, yet split or disguise words.
//
//   - U+00AD SOFT HYPHEN, a hyphenation hint ("pres&shy;sure");
//   - U+200B ZERO WIDTH SPACE, U+200C ZERO WIDTH NON-JOINER, U+200D ZERO
//     WIDTH JOINER, U+2060 WORD JOINER, and U+FEFF (a zero width no-break
//     space when not at the start);
//   - the bidirectional marks and controls of UAX #9: U+200E, U+200F,
//     U+061C, U+202A–U+202E, U+2066–U+2069.
func invisible(r rune) bool {
	switch {
	case r == 0xAD, r == 0x061C, r == 0x2060, r == 0xFEFF:
		return true
	case r >= 0x200B && r <= 0x200F, r >= 0x202A && r <= 0x202E, r >= 0x2066 && r <= 0x2069:
		return true
	}
	return false
}

// normalizeText puts text in Unicode Normalization Form C, so that "café"
// typed with a precomposed é and with e + U+0301 is one word, and removes
// the invisible format characters. Neither touches a line break, so lines
// stay the file's; within a line, a column after a removed or composed
// character moves left by the bytes it lost.
//
// Most text is ASCII or already NFC without those characters: it is
// returned as it is after one scan (a byte loop to the first non-ASCII
// byte, then norm's quick check), without copying.
func normalizeText(s string) string {
	i := asciiPrefix(s)
	if i == len(s) {
		return s
	}
	i = max(i-1, 0) // the ASCII character before may compose with what follows
	if !needsNormalizing(s[i:]) {
		return s
	}
	var b strings.Builder
	b.Grow(len(s))
	b.WriteString(s[:i])
	rest := s[i:]
	if hasInvisible(rest) {
		rest = strings.Map(func(r rune) rune {
			if invisible(r) {
				return -1
			}
			return r
		}, rest)
	}
	b.WriteString(norm.NFC.String(rest))
	return b.String()
}

// asciiPrefix returns the length of the ASCII run at the start of s,
// reading eight bytes at a step (the loads combine into one).
func asciiPrefix(s string) int {
	i := 0
	for ; i+8 <= len(s); i += 8 {
		w := uint64(s[i]) | uint64(s[i+1])<<8 | uint64(s[i+2])<<16 | uint64(s[i+3])<<24 |
			uint64(s[i+4])<<32 | uint64(s[i+5])<<40 | uint64(s[i+6])<<48 | uint64(s[i+7])<<56
		if w&0x8080808080808080 != 0 {
			break
		}
	}
	for i < len(s) && s[i] < utf8.RuneSelf {
		i++
	}
	return i
}

// needsNormalizing reports whether s holds an invisible character or is
// not in NFC. Characters that are NFC starters which never compose with
// what follows them are passed over by a loop of its own; norm's check
// (some 50 MB/s, ten times slower on Latin text) runs only from the first
// other character on.
func needsNormalizing(s string) bool {
	last := 0 // the start of the last character passed over
	for i := 0; i < len(s); {
		c := s[i]
		if c < utf8.RuneSelf {
			n := asciiPrefix(s[i:])
			i += n
			last = i - 1
			continue
		}
		r, n := utf8.DecodeRuneInString(s[i:])
		if invisible(r) {
			return true
		}
		if !nfcStable(r) {
			return hasInvisible(s[i:]) || !norm.NFC.IsNormalString(s[last:])
		}
		last = i
		i += n
	}
	return false
}

// nfcStable reports characters whose NFC quick check is Yes and that
// combine with nothing after them but combining marks or conjoining jamo
// (which are not stable, so a check starts at the character before one):
// Latin-1, the Latin extensions and IPA up to U+02FF, Greek from U+0388
// (the singletons U+0374, U+037E and U+0387 are below it), Cyrillic,
// general punctuation but for the singletons U+2000 and U+2001, currency
// signs, arrows, mathematical operators, box drawing and geometric shapes,
// kana, CJK unified ideographs, Hangul syllables and the private use area
// (Unicode Character Database, DerivedNormalizationProps.txt, NFC_QC). It
// covers the letters and symbols of technical prose, so text with Greek
// symbols or in those scripts is judged by this loop alone.
func nfcStable(r rune) bool {
	switch {
	case r < 0x300:
		return r != 0xAD
	case r < 0x2000:
		return r >= 0x388 && r <= 0x4FF
	case r < 0x3000:
		return r >= 0x2010 && r <= 0x205E && !invisible(r) || r >= 0x20A0 && r <= 0x20C0 ||
			r >= 0x2190 && r <= 0x22FF || r >= 0x2500 && r <= 0x25FF
	}
	return r >= 0x3041 && r <= 0x3096 || r >= 0x30A1 && r <= 0x30FA || r >= 0x4E00 && r <= 0x9FFF ||
		r >= 0xAC00 && r <= 0xD7A3 || r >= 0xE000 && r <= 0xF8FF
}

// hasInvisible reports whether s holds an invisible format character. Every
// one is encoded with a lead byte of 0xC2 (U+00AD), 0xD8 (U+061C), 0xE2
// (U+200B–U+2069) or 0xEF (U+FEFF): a vectorized search for each lead
// byte passes over the rest of the text.
func hasInvisible(s string) bool {
	for _, lead := range [...]byte{0xE2, 0xC2, 0xEF, 0xD8} {
		for i := 0; ; {
			j := strings.IndexByte(s[i:], lead)
			if j < 0 {
				break
			}
			i += j
			if r, _ := utf8.DecodeRuneInString(s[i:]); invisible(r) {
				return true
			}
			i++
		}
	}
	return false
}
