// Package printable makes text from documents and file names safe to
// print on a terminal.
//
// A document or a file name can hold control characters: an escape
// sequence (ESC [ …) would recolour, move the cursor or retitle the
// terminal of the person reading the output, and a newline in a file name
// would break output that promises one line per record. Escape writes
// every such character visibly instead: C0 controls and DEL as \xHH, C1
// controls and the bidirectional embedding, override and isolate
// characters (which reorder what is shown, U+202A–U+202E, U+2066–U+2069)
// as \uHHHH, and a backslash stays a backslash. Printable text, tabs
// included, is left as it is.
package printable

import (
	"fmt"
	"strings"
)

// needsEscape reports whether r is escaped by Escape. Tab is left alone:
// it only moves the cursor within the line.
func needsEscape(r rune) bool {
	switch {
	case r == '\t':
		return false
	case r < 0x20, r == 0x7f:
		return true
	case r >= 0x80 && r <= 0x9f:
		return true
	case r >= 0x202a && r <= 0x202e, r >= 0x2066 && r <= 0x2069:
		return true
	}
	return false
}

// Escape returns s with control characters written as escapes (see the
// package comment); s itself when it has none.
func Escape(s string) string {
	i := strings.IndexFunc(s, needsEscape)
	if i < 0 {
		return s
	}
	var b strings.Builder
	b.Grow(len(s) + 8)
	b.WriteString(s[:i])
	for _, r := range s[i:] {
		switch {
		case !needsEscape(r):
			b.WriteRune(r)
		case r < 0x80:
			fmt.Fprintf(&b, `\x%02x`, r)
		default:
			fmt.Fprintf(&b, `\u%04x`, r)
		}
	}
	return b.String()
}
