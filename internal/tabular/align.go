package tabular

import (
	"strings"
	"unicode/utf8"
)

// Align lays rows out as a text table for the terminal: columns separated
// by two spaces, each as wide as its widest cell (counted in characters),
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
			width[i] = max(width[i], utf8.RuneCountInString(c))
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
			pad := width[i] - utf8.RuneCountInString(c)
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
