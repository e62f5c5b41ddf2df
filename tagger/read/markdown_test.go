package read

import (
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func md(t *testing.T, src string) string {
	t.Helper()
	r := &reader{in: Input{Name: "t.md"}}
	d := r.markdown(src)
	require.Equal(t, strings.Count(normalizeNewlines(src), "\n"), strings.Count(d.Text, "\n"), "markdown changed the number of lines:\n%q", d.Text)
	return d.Text
}

// P is the paragraph separator as written in the expectations below.
const P = paraSep

// The expectations follow the CommonMark Spec 0.31.2 (commonmark.org) and
// the GitHub Flavored Markdown Spec 0.29 (tables, task lists,
// strikethrough): what a renderer shows as text is what must remain.
func TestMarkdownInline(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{"Open the *inlet* valve.", "Open the inlet valve."},
		{"Open the **inlet** valve.", "Open the inlet valve."},
		{"Open the __inlet__ valve.", "Open the inlet valve."},
		{"Open the ***inlet*** valve.", "Open the inlet valve."},
		{"~~old~~ new", "old new"},
		// Not emphasis: a * followed by white space cannot open (CommonMark
		// 6.2, left-flanking delimiter run), an intraword _ cannot open or
		// close, so these stay as written.
		{"5 * 3 = 15", "5 * 3 = 15"},
		{"set snake_case_name here", "set snake_case_name here"},
		{"an *unclosed star", "an *unclosed star"},
		{"Use `P_1 * 2` here", "Use P_1 * 2 here"},
		{"Use ``a ` tick`` here", "Use a ` tick here"},
		{"See [the manual](http://example.com/m \"Manual\") now.", "See the manual now."},
		{"See [the *manual*](m.html).", "See the manual."},
		{"![Valve body, cut open](img/valve.png)", "Valve body, cut open"},
		{"[![alt text](i.png)](link)", "alt text"},
		{"Mail <service@example.com> or <https://example.com/help>.", "Mail service@example.com or https://example.com/help."},
		{"A <span class=\"x\">red</span> tag<br/>.", "A red tag."},
		{"Tom &amp; Jerry &copy; &#169; &#xA9; &bogus;", "Tom & Jerry © © © &bogus;"},
		{"Escaped \\*stars\\* and \\_under\\_", "Escaped *stars* and _under_"},
		{"note[^1] here.\n\n[^1]: The note.", "note here.\n\nThe note."},
		// GFM: a footnote reference without a definition is literal text.
		{"note[^9] here", "note[^9] here"},
		{"a <!-- hidden --> b", "a  b"},
		{"[not a link] and [brackets]", "[not a link] and [brackets]"},
		{"line with hard break\\\nnext", "line with hard break\nnext"},
		// CommonMark 6.7: a backslash at the end of a block is no hard break.
		{"last line\\", "last line\\"},
		{"A line break &#10; inside", "A line break   inside"},
	} {
		assert.Equal(t, tc.want, md(t, tc.in), "%q", tc.in)
	}
}

func TestMarkdownBlocks(t *testing.T) {
	for _, tc := range []struct{ name, in, want string }{
		{"atx headings",
			"# Valves\n## Solenoid valve ##\nThe valve opens.\n#hashtag is text",
			"Valves\n" + P + "Solenoid valve\n" + P + "The valve opens.\n#hashtag is text"},
		{"setext heading",
			"Valves\n======\nText.\n\nPumps\n-----\nMore.",
			"Valves\n\nText.\n\nPumps\n\nMore."},
		{"lists",
			"Steps:\n- Close the valve\n- Bleed the line\n  which takes time\n1. First\n2) Second\n* [x] done task\n+ [ ] open task",
			"Steps:\n" + P + "Close the valve\n" + P + "Bleed the line\nwhich takes time\n" + P + "First\n" + P + "Second\n" + P + "done task\n" + P + "open task"},
		{"quotes",
			"Before.\n> Quoted line\n> > nested\ncontinued\n\n> new quote",
			"Before.\n" + P + "Quoted line\n" + P + "nested\ncontinued\n\nnew quote"},
		{"table",
			"Parts:\n| Part | Function |\n|------|:--------:|\n| Valve | Opens \\| shuts |\n| *Sensor* | Measures |\nAfter.",
			"Parts:\n" + P + "Part" + P + "Function\n\nValve" + P + "Opens | shuts\n" + P + "Sensor" + P + "Measures\n" + P + "After."},
		{"table without outer pipes",
			"Part | Function\n--- | ---\nValve | Opens",
			"Part" + P + "Function\n\nValve" + P + "Opens"},
		{"fenced code dropped",
			"Text.\n```go\nfunc main() {}\n```\n~~~~\n``` not a closer\n~~~~\nAfter.",
			"Text.\n\n\n\n\n\n\nAfter."},
		{"unclosed fence runs to the end",
			"Text.\n```\ncode\nmore",
			"Text.\n\n\n"},
		{"indented code dropped, list continuation kept",
			"Text.\n\n    code line\n    more code\n\n- item\n\n    continued item text",
			"Text.\n\n\n\n\n" + "item\n\ncontinued item text"},
		{"front matter",
			"---\ntitle: Valves\nauthor: x\n---\n# Heading\nBody.",
			"\n\n\n\nHeading\n" + P + "Body."},
		{"toml front matter",
			"+++\ntitle = \"x\"\n+++\nBody.",
			"\n\n\nBody."},
		{"thematic break, not front matter",
			"---\nText.\n***\nMore.",
			"\nText.\n\nMore."},
		{"html comment across lines",
			"One.\n<!-- start\nhidden\nend -->Two.\nThree.",
			"One.\n\n\nTwo.\n" + P + "Three."}, // the HTML block ends on the line with "-->"
		{"script block",
			"One.\n<script>\nvar x = 1;\n</script>\nTwo.",
			"One.\n\n\n\nTwo."},
		{"reference links",
			"Read [the guide][g] and [Guide] and [g][].\n\n[g]: https://example.com/guide\n[guide]: /guide \"Title\"",
			"Read the guide and Guide and g.\n\n\n"},
		{"footnote definition",
			"Text[^n].\n[^n]: The note.",
			"Text.\n" + P + "The note."},
		{"CRLF",
			"# A\r\nB\r\n",
			"A\n" + P + "B\n"},
	} {
		assert.Equal(t, tc.want, md(t, tc.in), tc.name)
	}
}

// Token.Line must lead back to the source line: every word of the source
// that survives is on the same line of the text.
func TestMarkdownLinesPointToSource(t *testing.T) {
	src := "---\ntitle: x\n---\n# Drip *irrigation*\n\nThe **emitter** gives 2 L/h.\n```\ncode\n```\n| Part | Flow |\n|---|---|\n| emitter | 2 L/h |\n- The [regulator](r.html) holds 1.5 bar.\n"
	got := strings.Split(md(t, src), "\n")
	for i, line := range strings.Split(src, "\n") {
		for _, w := range []string{"irrigation", "emitter", "regulator", "holds"} {
			if strings.Contains(line, w) && !strings.Contains(got[i], w) {
				t.Errorf("source line %d has %q, text line %d is %q", i+1, w, i+1, got[i])
			}
		}
	}
}

// Cases that the line-by-line reader got wrong, each against what
// CommonMark 0.31.2 renders.
func TestMarkdownWrappedConstructs(t *testing.T) {
	for _, tc := range []struct{ name, in, want string }{
		// 6.3: link text may span lines; the destination is not prose.
		{"wrapped link text", "See [the pressure\nsensor manual](https://example.com/m) now.",
			"See the pressure\nsensor manual now."},
		// 5.2: a line inside a paragraph cannot start an ordered list unless
		// the number is 1 (an interrupting list must start at 1).
		{"year at a line start", "The valve was introduced in\n2019. It replaced the old one.",
			"The valve was introduced in\n2019. It replaced the old one."},
		// 6.6: an HTML tag may span lines.
		{"tag over two lines", "Open the <span\nclass=\"x\">inlet</span> valve.",
			"Open the \ninlet valve."},
		// 4.7: a link reference definition may span lines.
		{"definition over lines", "Read [the guide].\n\n[the guide]:\n  https://example.com/guide\n  \"Guide\"",
			"Read the guide.\n\n\n\n"},
	} {
		assert.Equal(t, tc.want, md(t, tc.in), tc.name)
	}
}

// Nested brackets took quadratic time in the line reader (36 s for
// 100,000 pairs); goldmark's bracket matching is linear. A generous bound
// catches a hang; BenchmarkMarkdownNestedBrackets measures.
func TestMarkdownNestedBracketsLinear(t *testing.T) {
	const n = 100_000
	src := strings.Repeat("[", n) + "valve" + strings.Repeat("]", n)
	done := make(chan string, 1)
	go func() {
		r := &reader{in: Input{Name: "nested.md"}}
		done <- r.markdown(src).Text
	}()
	select {
	case text := <-done:
		// no link: every bracket is text, as CommonMark renders it
		assert.Equal(t, n, strings.Count(text, "["))
		assert.Equal(t, n, strings.Count(text, "]"))
		assert.Equal(t, len(src), len(text))
	case <-time.After(20 * time.Second):
		t.Fatal("nested brackets: not read within 20 s")
	}
}

func BenchmarkMarkdownNestedBrackets(b *testing.B) {
	for _, n := range []int{10_000, 100_000} {
		src := strings.Repeat("[", n) + "valve" + strings.Repeat("]", n)
		b.Run(strconv.Itoa(n), func(b *testing.B) {
			b.SetBytes(int64(len(src)))
			for b.Loop() {
				r := &reader{in: Input{Name: "nested.md"}}
				r.markdown(src)
			}
		})
	}
}
