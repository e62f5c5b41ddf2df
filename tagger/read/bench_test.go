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
