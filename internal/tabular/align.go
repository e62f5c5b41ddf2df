package tabular

import (
	"strings"
	"unicode"

	"golang.org/x/text/width"
)

// Align lays rows out as a text table for the terminal: columns separated
// by two spaces, each as wide as its widest cell (in terminal columns, see
// Width),
// numbers right-aligned where right[i] is true, trailing spaces trimmed.
// It returns one line per row, without line breaks, so that a writer can
// print more under a row (the term list's contexts).
func Align(rows [][]string, right []bool) []string {
	var width []int
	for _, r := range rows {
		for i, c := range r {
			if i == len(width) {
				width = append(width, 0)
			}
			width[i] = max(width[i], Width(c))
		}
	}
	lines := make([]string, len(rows))
	var b strings.Builder
	for ri, r := range rows {
		b.Reset()
		for i, c := range r {
			if i > 0 {
				b.WriteString("  ")
			}
			pad := width[i] - Width(c)
			if i < len(right) && right[i] {
				b.WriteString(strings.Repeat(" ", pad))
				b.WriteString(c)
			} else {
				b.WriteString(c)
				if i < len(r)-1 {
					b.WriteString(strings.Repeat(" ", pad))
				}
			}
		}
		lines[ri] = strings.TrimRight(b.String(), " ")
	}
	return lines
}

// Width is how many columns a terminal gives s: two for a wide or
// fullwidth character (East Asian Width W or F, Unicode Standard Annex
// #11: CJK ideographs, kana, hangul, most emoji), none for a combining
// mark, a variation selector or a zero-width format character, one for
// the rest — so that a table of Japanese or Chinese terms, or of accents
// written as combining marks, lines up.
func Width(s string) int {
	n := 0
	for _, r := range s {
		switch {
		case r < 0x300:
			n++ // ASCII and Latin-1, the common case
		case unicode.In(r, unicode.Mn, unicode.Me, unicode.Cf):
		default:
			if k := width.LookupRune(r).Kind(); k == width.EastAsianWide || k == width.EastAsianFullwidth {
				n += 2
			} else {
				n++
			}
		}
	}
	return n
}
