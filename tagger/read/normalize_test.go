package read

import (
	"math/rand/v2"
	"strings"
	"testing"
	"unicode/utf8"
	"unsafe"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"golang.org/x/text/unicode/norm"

	"glossmith/tagger/doc"
	"glossmith/tagger/tokenize"
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
		got, shifts := normalizeText(tc.in)
		assert.Equal(t, tc.want, got, tc.name)
		checkShifts(t, tc.in, got, shifts)
	}
}

// The fast paths agree with the plain definition (drop the invisible
// characters, then norm.NFC) on random text drawn from scripts and marks
// that compose.
func TestNormalizeTextMatchesDefinition(t *testing.T) {
	pool := []rune("aeouAEnc ßéüÅϕλΩ;·Йカが各각\uF8EF\uF900–—’€→≠\u0300\u0301\u0308\u0338\u00AD\u200B\u202E\u212B\u212A\uFEFF\u2060\u061C\u2000\u1100\u1161\u11A8\u0391\u0301\u3099\u304B\n")
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
		got, shifts := normalizeText(s)
		require.Equal(t, want, got, "%+q", s)
		checkShifts(t, s, got, shifts)
	}
}

// checkShifts checks the shifts normalizeText gave for text, normalized
// from orig, at every character boundary of text that is one of orig too:
// before an ASCII character and at the end (nothing composes into ASCII
// but the singleton U+212A KELVIN SIGN, itself a boundary). From there,
// the text as read, orig[ReadOffset(x):ReadEnd(y)], normalizes to
// text[x:y] without the invisible characters around it, and a column
// counted in text plus ColumnShift is the column counted in orig.
func checkShifts(t *testing.T, orig, text string, shifts []doc.Shift) {
	t.Helper()
	d := &doc.Document{Text: text, Shifts: shifts}
	var at []int
	for x := 0; x <= len(text); x++ {
		if x == len(text) || text[x] < utf8.RuneSelf {
			at = append(at, x)
		}
	}
	for i, x := range at {
		for _, y := range at[i+1:] {
			from, to := d.ReadOffset(x), d.ReadEnd(y)
			require.LessOrEqual(t, from, to, "%+q [%d:%d]", orig, x, y)
			got, _ := normalizeText(orig[from:to])
			require.Equal(t, text[x:y], got, "%+q [%d:%d] read as [%d:%d]", orig, x, y, from, to)
			first, _ := utf8.DecodeRuneInString(orig[from:to])
			last, _ := utf8.DecodeLastRuneInString(orig[from:to])
			require.False(t, invisible(first) || invisible(last), "%+q [%d:%d] read as [%d:%d]: invisible characters around", orig, x, y, from, to)
		}
		lineStart := strings.LastIndexByte(text[:x], '\n') + 1
		col := utf8.RuneCountInString(text[lineStart:x]) + d.ColumnShift(lineStart, x)
		o := d.ReadOffset(x)
		want := utf8.RuneCountInString(orig[strings.LastIndexByte(orig[:o], '\n')+1 : o])
		require.Equal(t, want, col, "%+q: column of %d (%d as read)", orig, x, o)
	}
}

// Text that needs no change is returned without a copy.
func TestNormalizeTextNoCopy(t *testing.T) {
	for _, s := range []string{strings.Repeat("valve ", 100), strings.Repeat("Ventil für 15 °C ", 100)} {
		got, shifts := normalizeText(s)
		assert.Equal(t, unsafe.StringData(s), unsafe.StringData(got))
		assert.Nil(t, shifts)
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

// Tokens after a removed or composed character keep the line and column
// they have in the file (columns in characters, as a person counts them),
// and their offsets as read find them in it: a soft hyphen, a decomposed
// accent, several removed marks on one line, CRLF line ends.
func TestTokenColumnsOfTheFile(t *testing.T) {
	file := "The pres\u00ADsure sensor failed.\r\nThe cafe\u0301 valve leaks.\r\n" +
		"\u200BA \u200Ezero\u200F-width\u2060 mark, then the sensor.\r\n"
	lines := strings.Split(file, "\r\n") // the file's lines
	d, ps := readFile(t, "a.txt", file, Options{})
	require.NotNil(t, d)
	require.Empty(t, ps)
	tokenize.Document(d)
	want := map[string][]int{"sensor": {1, 15, 3, 33}, "valve": {2, 11}, "failed": {1, 22}, "zero": {3, 5}} // counted by hand
	got := map[string][]int{}
	for _, s := range d.Sentences {
		for _, tok := range s.Tokens {
			if _, ok := want[tok.Form]; !ok {
				continue
			}
			lineStart := strings.LastIndexByte(d.Text[:tok.Start], '\n') + 1
			col := utf8.RuneCountInString(d.Text[lineStart:tok.Start]) + d.ColumnShift(lineStart, int(tok.Start)) + 1
			got[tok.Form] = append(got[tok.Form], int(tok.Line), col)
			// the column is where the word stands in the file's line
			line := lines[tok.Line-1]
			assert.Equal(t, utf8.RuneCountInString(line[:d.ReadOffset(int(tok.Start))-crlfLineOffset(lines, int(tok.Line))])+1, col, tok.Form)
		}
	}
	assert.Equal(t, want, got)
}

// crlfLineOffset returns the offset of line n (1-based) in the text made
// of lines joined by CRLF.
func crlfLineOffset(lines []string, n int) int {
	off := 0
	for _, l := range lines[:n-1] {
		off += len(l) + 2
	}
	return off
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

// FuzzNormalizeShifts checks the shifts of any valid UTF-8 text as
// checkShifts does (short texts: it looks at every pair of boundaries).
func FuzzNormalizeShifts(f *testing.F) {
	f.Add("The pres\u00ADsure at the cafe\u0301.\n\u200Bx")
	f.Add("e\u00AD\u0301 \u212A \u1100\u1161\u11A8 a\u0338\u0300")
	f.Fuzz(func(t *testing.T, s string) {
		if len(s) > 64 || !utf8.ValidString(s) {
			return
		}
		got, shifts := normalizeText(s)
		checkShifts(t, s, got, shifts)
	})
}
