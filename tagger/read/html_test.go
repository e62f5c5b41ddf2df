package read

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func htmlText(t *testing.T, src string) string {
	t.Helper()
	r := &reader{in: Input{Name: "t.html"}}
	d := r.html(src)
	require.NotNil(t, d)
	return d.Text
}

func TestHTML(t *testing.T) {
	for _, tc := range []struct{ name, in, want string }{
		{"page",
			`<!DOCTYPE html><html><head><title>Valve manual</title><meta charset="utf-8">
<style>p { color: red }</style><script>var a = "<p>no</p>";</script></head>
<body><h1>Solenoid   valve</h1>
<p>The valve
   opens at <b>3&nbsp;bar</b> &amp; closes at 1&#160;bar.</p>
<noscript>Enable scripts.</noscript><template><p>Template text</p></template>
<ul><li>Close the valve</li><li>Bleed the line</li></ul>
</body></html>`,
			"Solenoid valve\n\nThe valve opens at 3\u00a0bar & closes at 1\u00a0bar.\n\nClose the valve\n\nBleed the line"},
		{"head without end tag",
			"<html><head><title>T</title><body><p>Body text.</p>",
			"Body text."},
		{"inline elements do not split",
			"<p>An <em>inlet</em><span> valve</span>, <a href=x>see</a> <code>P1</code>.</p>",
			"An inlet valve, see P1."},
		{"table cells are paragraphs",
			"<table><tr><th>Part</th><th>Function</th></tr><tr><td>Valve</td><td>Opens</td></tr></table>",
			"Part\n\nFunction\n\nValve\n\nOpens"},
		{"br and pre",
			"<p>Line one<br>Line two</p><pre>  code  kept\n  as is</pre><p>After</p>",
			"Line one\nLine two\n\n  code  kept\n  as is\n\nAfter"},
		{"hidden content",
			`<p>Seen</p><div hidden><p>Not seen</p><div>deep</div></div><p style="display: none">Gone</p><svg><text>drawing</text></svg><p>Also seen</p>`,
			"Seen\n\nAlso seen"},
		{"images and forms",
			`<p>Fig: <img src="v.png" alt="valve"> <select><option>A</option></select><textarea>typed</textarea>done</p>`,
			"Fig: done"},
		{"unclosed p",
			"<p>First<p>Second<div>Third</div>",
			"First\n\nSecond\n\nThird"},
		{"comments",
			"<p>A<!-- no --> B</p>",
			"A B"},
		// HTML Living Standard 13.1.2.4 "Optional tags": an li element's end
		// tag may be omitted when another li follows, a p's when a block
		// follows; the hidden first item ends where the second begins.
		{"implied end tags close hidden elements",
			"<ul><li hidden>Secret<li>Visible</ul><p>Shown</p>",
			"Visible\n\nShown"},
		{"implied end of a hidden paragraph",
			"<p hidden>Secret<div>Visible</div>",
			"Visible"},
		{"implied end of a dropped cell",
			"<table><tr><td style='display:none'>Secret<td>Visible</table>",
			"Visible"},
		{"misnested inline tags",
			"<p><b>bold <i>both</b> italic</i> plain</p>",
			"bold both italic plain"},
	} {
		assert.Equal(t, tc.want, htmlText(t, tc.in), tc.name)
	}
}

// The HTML parser refuses pages nested more than 512 elements deep; such a
// page is still read, with a warning, and its text kept.
func TestHTMLDeepNesting(t *testing.T) {
	for _, n := range []int{500, 100_000} {
		src := "<p>Top.</p>" + strings.Repeat("<div>", n) + "Deep <script>x()</script>text." + strings.Repeat("</div>", n)
		r := &reader{in: Input{Name: "deep.html"}}
		d := r.html(src)
		require.NotNil(t, d)
		assert.Equal(t, "Top.\n\nDeep text.", d.Text, "depth %d", n)
		if n > 512 {
			require.Len(t, r.probs, 1)
			assert.Equal(t, Warning, r.probs[0].Severity)
		} else {
			assert.Empty(t, r.probs)
		}
	}
}
