package read

import (
	"math/rand/v2"
	"strings"
	"testing"
	"unsafe"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"golang.org/x/text/unicode/norm"
)

func TestNormalizeText(t *testing.T) {
	for _, tc := range []struct{ name, in, want string }{
		{"ascii", "pressure sensor\n", "pressure sensor\n"},
		{"nfc already", "café – 15 °C\n", "café – 15 °C\n"},
		// Unicode Standard Annex #15: e + U+0301 COMBINING ACUTE ACCENT
		// composes to U+00E9 in Normalization Form C.
		{"decomposed", "cafe\u0301 and café", "café and café"},
		{"soft hyphen", "pres\u00ADsure sensor", "pressure sensor"},
		{"zero width", "set\u200Bpoint zero\u200C\u200Dwidth\u2060joiner\uFEFFnbsp", "setpoint zerowidthjoinernbsp"},
		// UAX #9 marks and controls
		{"bidi", "\u202Bvalve\u202C \u200Epump\u200F \u2067ab\u2069 \u061Cx", "valve pump ab x"},
		{"lines kept", "a\u00AD\nb\u200B\n\nc", "a\nb\n\nc"},
		{"both", "re\u00ADsume\u0301", "resumé"},
		{"after latin", "naïve cafe\u0301", "naïve café"},
		{"latin then mark", "ü\u0301 ä\u0308", "\u01D8 ä\u0308"}, // U+01D8 is ü with acute
		// UAX #15: U+212B ANGSTROM SIGN is a singleton, NFC U+00C5
		{"singleton", "5 \u212B", "5 Å"},
		{"hangul jamo", "\u1100\u1161", "\uAC00"},
	} {
		assert.Equal(t, tc.want, normalizeText(tc.in), tc.name)
	}
}

// The fast paths agree with the plain definition (drop the invisible
// characters, then norm.NFC) on random text drawn from scripts and marks
// that compose.
func TestNormalizeTextMatchesDefinition(t *testing.T) {
	pool := []rune("aeouAEnc ßéüÅϕλΩ;·Йカが各각\uF8EF\uF900–—’€→≠\u0300\u0301\u0308\u0338\u00AD\u200B\u202E\u212B\u2000\u1100\u1161\u11A8\u0391\u0301\u3099\u304B\n")
	rng := rand.New(rand.NewPCG(1, 2))
	for range 20000 {
		var b strings.Builder
		for range rng.IntN(12) {
			b.WriteRune(pool[rng.IntN(len(pool))])
		}
		s := b.String()
		want := norm.NFC.String(strings.Map(func(r rune) rune {
			if invisible(r) {
				return -1
			}
			return r
		}, s))
		require.Equal(t, want, normalizeText(s), "%+q", s)
	}
}

// Text that needs no change is returned without a copy.
func TestNormalizeTextNoCopy(t *testing.T) {
	for _, s := range []string{strings.Repeat("valve ", 100), strings.Repeat("Ventil für 15 °C ", 100)} {
		got := normalizeText(s)
		assert.Equal(t, unsafe.StringData(s), unsafe.StringData(got))
	}
}

func TestReadNormalizes(t *testing.T) {
	for _, tc := range []struct{ file, content, want string }{
		{"a.html", "<p>The pres&shy;sure sensor and the cafe&#x301;.</p>", "The pressure sensor and the café."},
		{"a.md", "The **pres\u00ADsure** sensor.\n\nThe cafe\u0301.", "The pressure sensor.\n\nThe café."},
		{"a.txt", "cafe\u0301\u200B\n", "café\n"},
	} {
		d, ps := readFile(t, tc.file, tc.content, Options{})
		require.NotNil(t, d, tc.file)
		assert.Empty(t, ps)
		assert.Equal(t, tc.want, d.Text, tc.file)
	}
}

func BenchmarkNormalizeText(b *testing.B) {
	for _, tc := range []struct{ name, s string }{
		{"ascii", strings.Repeat("The solenoid valve opens at 3 bar. ", 30000)},
		{"nfc", strings.Repeat("Das Magnetventil öffnet bei 3 bar – 15 °C. ", 30000)},
		{"changed", strings.Repeat("The pres\u00ADsure at the cafe\u0301. ", 30000)},
	} {
		b.Run(tc.name, func(b *testing.B) {
			b.SetBytes(int64(len(tc.s)))
			for b.Loop() {
				normalizeText(tc.s)
			}
		})
	}
}
