package read

import (
	"strings"
	"testing"
)

func md(t *testing.T, src string) string {
	t.Helper()
	r := &reader{in: Input{Name: "t.md"}}
	d := r.markdown(src)
	if got, want := strings.Count(d.Text, "\n"), strings.Count(normalizeNewlines(src), "\n"); got != want {
		t.Fatalf("markdown changed the number of lines: %d, want %d\n%q", got, want, d.Text)
	}
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
		{"note[^1] here", "note here"},
		{"a <!-- hidden --> b", "a  b"},
		{"[not a link] and [brackets]", "[not a link] and [brackets]"},
		{"line with hard break\\", "line with hard break"},
		{"A line break &#10; inside", "A line break   inside"},
	} {
		if got := md(t, tc.in); got != tc.want {
			t.Errorf("%q\n got %q\nwant %q", tc.in, got, tc.want)
		}
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
			"Steps:\n" + P + "Close the valve\n" + P + "Bleed the line\n  which takes time\n" + P + "First\n" + P + "Second\n" + P + "done task\n" + P + "open task"},
		{"quotes",
			"Before.\n> Quoted line\n> > nested\ncontinued\n\n> new quote",
			"Before.\n" + P + "Quoted line\nnested\ncontinued\n\nnew quote"},
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
			"Text.\n\n\n\n\n" + "item\n\n    continued item text"},
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
			"One.\n\n\nTwo.\nThree."},
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
		if got := md(t, tc.in); got != tc.want {
			t.Errorf("%s:\n got %q\nwant %q", tc.name, got, tc.want)
		}
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
