package printable

import (
	"testing"

	"github.com/stretchr/testify/assert"
)

func TestEscape(t *testing.T) {
	for in, want := range map[string]string{
		"solenoid valve":          "solenoid valve",
		"tab\tkept":               "tab\tkept",
		"\x1b[2J\x1b]0;owned\x07": `\x1b[2J\x1b]0;owned\x07`, // clear screen, set title (ECMA-48 CSI, OSC)
		"line\nbreak\r":           `line\x0abreak\x0d`,
		"del\x7f":                 `del\x7f`,
		"c1\u009b31m":             `c1\u009b31m`, // the one-byte CSI of ECMA-48
		"abc\u202edcba":           `abc\u202edcba`,
		"\u2066isolate\u2069":     `\u2066isolate\u2069`,
		"café – 24 V ± 10 %":      "café – 24 V ± 10 %",
		"":                        "",
	} {
		assert.Equal(t, want, Escape(in), "%q", in)
	}
}

func BenchmarkEscapeClean(b *testing.B) {
	s := "The solenoid valve opens the irrigation zone when the controller asks for water."
	for b.Loop() {
		Escape(s)
	}
}
