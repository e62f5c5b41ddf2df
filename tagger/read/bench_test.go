package read

import (
	"fmt"
	"strings"
	"testing"
)

// Inputs built to defeat naive scanning: each would cost time quadratic in
// the line length if brackets, backtick runs or emphasis openers were
// searched for again at every position. The time per byte should stay flat
// from 64 KiB to 1 MiB.
func BenchmarkMarkdownPathological(b *testing.B) {
	patterns := map[string]string{
		"brackets":   "[a](",
		"opens":      "[[[[",
		"backticks":  "`a``b",
		"emphasis":   "*a _b ",
		"links":      "[a](b)",
		"angles":     "<a:b ",
		"references": "[a][",
	}
	for _, name := range []string{"brackets", "opens", "backticks", "emphasis", "links", "angles", "references"} {
		for _, size := range []int{64 << 10, 1 << 20} {
			line := strings.Repeat(patterns[name], size/len(patterns[name]))
			b.Run(fmt.Sprintf("%s/%dKiB", name, size>>10), func(b *testing.B) {
				b.SetBytes(int64(len(line)))
				for b.Loop() {
					r := &reader{in: Input{Name: "b.md"}}
					r.markdown(line)
				}
			})
		}
	}
}

func BenchmarkMarkdownManual(b *testing.B) {
	var sb strings.Builder
	for i := 0; i < 2000; i++ {
		fmt.Fprintf(&sb, "## Step %d\n\nClose the **isolating valve** and read the [pressure gauge](g.html) (`P%d`).\n- Bleed the line\n- Check the *solenoid* coil\n\n| Part | Value |\n|---|---|\n| coil | 24 V |\n\n", i, i)
	}
	src := sb.String()
	b.SetBytes(int64(len(src)))
	for b.Loop() {
		r := &reader{in: Input{Name: "b.md"}}
		r.markdown(src)
	}
}

func BenchmarkHTML(b *testing.B) {
	var sb strings.Builder
	sb.WriteString("<html><head><title>T</title><style>p{}</style></head><body>")
	for i := 0; i < 2000; i++ {
		fmt.Fprintf(&sb, "<h2>Step %d</h2><p>Close the <b>isolating valve</b> &amp; read the <a href=g>gauge</a>.</p><ul><li>Bleed</li><li>Check</li></ul>\n", i)
	}
	src := sb.String()
	b.SetBytes(int64(len(src)))
	for b.Loop() {
		r := &reader{in: Input{Name: "b.html"}}
		r.html(src)
	}
}

// BenchmarkSourceRuns measures the map from a plain-text file's text back
// to its bytes, which only files that are not UTF-8 with LF line ends pay
// for: CRLF line ends, UTF-16 and Windows-1252 (an accent in every line).
func BenchmarkSourceRuns(b *testing.B) {
	line := "The drip line feeds the café's tomato rows at 2 bar.\r\n"
	crlf := strings.Repeat(line, 20000)
	utf16 := []byte{0xFF, 0xFE}
	for _, r := range crlf {
		utf16 = append(utf16, byte(r), byte(r>>8))
	}
	cp1252 := []byte(strings.ReplaceAll(crlf, "é", "\xE9"))
	for _, tc := range []struct {
		name string
		data []byte
		c    coding
	}{
		{"crlf", []byte(crlf), coding{altered: true}},
		{"utf-16", utf16, coding{altered: true, skip: 2, kind: unitUTF16LE}},
		{"windows-1252", cp1252, coding{}},
	} {
		r := &reader{in: Input{Name: "a.txt"}}
		text := r.text(r.decode(tc.data, FormatText))
		c := r.coding
		if tc.name != "windows-1252" {
			c = tc.c
		}
		b.Run(tc.name, func(b *testing.B) {
			b.SetBytes(int64(len(tc.data)))
			for b.Loop() {
				sourceRuns(tc.data, text.Text, c)
			}
		})
	}
}
