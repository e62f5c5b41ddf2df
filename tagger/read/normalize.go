package read

import (
	"strings"
	"unicode/utf8"

	"golang.org/x/text/unicode/norm"

	"glossmith/tagger/doc"
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
// stay the file's; the shifts it returns (see doc.Shift) map the offsets
// of the result back to text, so that columns stay the file's too.
//
// Most text is ASCII or already NFC without those characters: it is
// returned as it is after one scan (a byte loop to the first non-ASCII
// byte, then norm's quick check), without copying, and with no shifts.
func normalizeText(s string) (string, []doc.Shift) {
	i := asciiPrefix(s)
	if i == len(s) {
		return s, nil
	}
	i = max(i-1, 0) // the ASCII character before may compose with what follows
	if !needsNormalizing(s[i:]) {
		return s, nil
	}
	var b strings.Builder
	b.Grow(len(s))
	b.WriteString(s[:i])
	rest, cuts := s[i:], []cut(nil)
	if hasInvisible(rest) {
		rest, cuts = dropInvisible(rest)
	}
	m := shiftMaker{cuts: cuts, base: i}
	var it norm.Iter
	it.InitString(norm.NFC, rest)
	for !it.Done() {
		p0 := it.Pos()
		m.cutsAt(p0, b.Len())
		seg := it.Next()
		p1 := it.Pos()
		m.segment(p1, rest[p0:p1], seg, b.Len())
		b.Write(seg)
	}
	m.cutsAt(len(rest), b.Len())
	return b.String(), m.shifts
}

// cut is a run of invisible characters dropInvisible removed: at offset
// at of its result, bytes bytes and runes characters of its input.
type cut struct{ at, bytes, runes int }

// dropInvisible returns s without its invisible characters, and where
// they were.
func dropInvisible(s string) (string, []cut) {
	var b strings.Builder
	b.Grow(len(s))
	var cuts []cut
	for k := 0; k < len(s); {
		r, n := utf8.DecodeRuneInString(s[k:])
		if !invisible(r) {
			b.WriteString(s[k : k+n])
			k += n
			continue
		}
		c := cut{at: b.Len()}
		for k < len(s) {
			if r, n = utf8.DecodeRuneInString(s[k:]); !invisible(r) {
				break
			}
			c.bytes, c.runes = c.bytes+n, c.runes+1
			k += n
		}
		cuts = append(cuts, c)
	}
	return b.String(), cuts
}

// shiftMaker works out the shifts of normalizeText as it writes its
// result: the invisible characters cut before NFC, then each NFC segment
// that came out other than it went in. base is the length of the part
// copied as it is before either.
type shiftMaker struct {
	cuts   []cut // the cuts not accounted for yet
	base   int
	cut    int // bytes cut so far
	runes  int // characters the input had more than the result so far
	shifts []doc.Shift
}

// cutsAt accounts for the cuts at offset p of the NFC input, which is
// offset out of the result: the character there stands after them, the
// one before it before them.
func (m *shiftMaker) cutsAt(p, out int) {
	if len(m.cuts) == 0 || m.cuts[0].at > p {
		return
	}
	end := m.base + p + m.cut
	for len(m.cuts) > 0 && m.cuts[0].at <= p {
		m.cut += m.cuts[0].bytes
		m.runes += m.cuts[0].runes
		m.cuts = m.cuts[1:]
	}
	m.add(doc.Shift{At: int32(out), Start: int32(m.base + p + m.cut), End: int32(end), Runes: int32(m.runes)})
}

// segment accounts for the NFC segment in, offsets [p0, p1) of the NFC
// input, that came out as seg at offset out of the result. Cuts inside it
// (a soft hyphen between a letter and its accent) count as part of it.
func (m *shiftMaker) segment(p1 int, in string, seg []byte, out int) {
	inside := len(m.cuts) > 0 && m.cuts[0].at < p1
	if !inside && in == string(seg) {
		return
	}
	for len(m.cuts) > 0 && m.cuts[0].at < p1 {
		m.cut += m.cuts[0].bytes
		m.runes += m.cuts[0].runes
		m.cuts = m.cuts[1:]
	}
	m.runes += utf8.RuneCountInString(in) - utf8.RuneCount(seg)
	at, start := out+len(seg), m.base+p1+m.cut
	last := doc.Shift{}
	if len(m.shifts) > 0 {
		last = m.shifts[len(m.shifts)-1]
	}
	if int(last.Start)+at-int(last.At) == start && int(last.Runes) == m.runes {
		return // the offsets line up as before: composing marks reordered
	}
	m.add(doc.Shift{At: int32(at), Start: int32(start), End: int32(start), Runes: int32(m.runes)})
}

// add appends a shift; one at the same offset as the last replaces it but
// keeps its End, the end of the character before.
func (m *shiftMaker) add(s doc.Shift) {
	if n := len(m.shifts); n > 0 && m.shifts[n-1].At == s.At {
		s.End = m.shifts[n-1].End
		m.shifts[n-1] = s
		return
	}
	m.shifts = append(m.shifts, s)
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
