package check

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"golang.org/x/net/html"
	"golang.org/x/text/encoding/charmap"
	"golang.org/x/text/encoding/unicode"
)

// Columns are those of the text as read: characters that normalization
// removes (soft hyphens, zero-width and bidirectional marks) or composes
// (e + U+0301) still count before a finding, whether the column comes
// from the source line (UTF-8 text), from the text as read (a
// Windows-1252 file, no source) or from where the HTML reader found the
// text in the file. want is each line of the file as a
// person counts its characters, where "magnet valve" is looked for.
func TestColumnsOfTheTextAsRead(t *testing.T) {
	cases := []struct {
		name, file, content string
		noSource            bool
		lines               []string // the lines as read, in characters
	}{
		{name: "windows-1252, CRLF", file: "a.txt",
			content: "The pres\xADsure gauge and the magnet valve.\r\nA\xAD magnet\xAD valve, then\xAD a magnet valve.\r\n",
			lines:   []string{"The pres\u00ADsure gauge and the magnet valve.", "A\u00AD magnet\u00AD valve, then\u00AD a magnet valve."}},
		{name: "decomposed, no source", file: "b.txt", noSource: true,
			content: "The cafe\u0301 has a magnet valve.\nZero\u200B\u200Bwidth \u200Ethe magnet valve\u200F, a magnet valve.\n",
			lines:   []string{"The cafe\u0301 has a magnet valve.", "Zero\u200B\u200Bwidth \u200Ethe magnet valve\u200F, a magnet valve."}},
		{name: "decomposed, source", file: "c.txt",
			content: "The cafe\u0301 has a magnet valve.\r\nZero\u200B\u200Bwidth \u200Ethe magnet valve\u200F, a magnet valve.\r\n",
			lines:   []string{"The cafe\u0301 has a magnet valve.", "Zero\u200B\u200Bwidth \u200Ethe magnet valve\u200F, a magnet valve."}},
		// The file's bytes as read differ from the text: a byte-order mark,
		// an "é" of two bytes in UTF-8 and one in Windows-1252, UTF-16
		// (two bytes a character, four for U+1D706 MATHEMATICAL ITALIC
		// SMALL LAMDA). Columns count characters, as read.
		{name: "utf-8 byte-order mark, CRLF", file: "e.txt",
			content: "\uFEFFThe café has a magnet valve.\r\nThe 𝜆 sensor, a magnet valve.\r\n",
			lines:   []string{"The café has a magnet valve.", "The 𝜆 sensor, a magnet valve."}},
		{name: "latin-1 café", file: "f.txt",
			content: "The caf\xE9 has a magnet valve.\nNa\xEFve caf\xE9s, a magnet valve.\n",
			lines:   []string{"The café has a magnet valve.", "Naïve cafés, a magnet valve."}},
		{name: "utf-16 LE, CRLF", file: "g.txt",
			content: utf16File(t, unicode.LittleEndian, "The café has a magnet valve.\r\nThe 𝜆 sensor, a pres\u00ADsure magnet valve.\r\n"),
			lines:   []string{"The café has a magnet valve.", "The 𝜆 sensor, a pres\u00ADsure magnet valve."}},
		{name: "utf-16 BE", file: "h.txt",
			content: utf16File(t, unicode.BigEndian, "The café has a magnet valve.\nThe 𝜆 sensor, a magnet valve.\n"),
			lines:   []string{"The café has a magnet valve.", "The 𝜆 sensor, a magnet valve."}},
		// Markdown and HTML: the file's own lines, markup and references included.
		{name: "markdown", file: "m.md",
			content: "The **pres\u00ADsure** gauge &amp; the magnet valve.\r\n<b>cafe\u0301</b> \\* a magnet valve.\r\n",
			lines:   []string{"The **pres\u00ADsure** gauge &amp; the magnet valve.", "<b>cafe\u0301</b> \\* a magnet valve."}},
		{name: "html, invisible characters as they are", file: "i.html",
			content: "<p>The <i>pres\u00ADsure</i> gauge and \u200Bthe magnet valve.</p>\n",
			lines:   []string{"<p>The <i>pres\u00ADsure</i> gauge and \u200Bthe magnet valve.</p>"}},
		{name: "html", file: "d.html",
			content: "<p>The pres&shy;sure gauge and the magnet valve.</p>\n<p>The cafe&#x301; has a magnet valve.</p>\n",
			lines:   []string{"<p>The pres&shy;sure gauge and the magnet valve.</p>", "<p>The cafe&#x301; has a magnet valve.</p>"}},
	}
	m := Compile(pumpGlossary())
	for _, tc := range cases {
		d, src := annotate(t, tc.file, tc.content)
		if tc.noSource {
			src = nil
		}
		res := Check(d, src, Options{Glossary: m})
		var want, got [][2]int // start and end column ("just past")
		for _, line := range tc.lines {
			for from := 0; ; {
				i := strings.Index(line[from:], "magnet")
				if i < 0 {
					break
				}
				end := from + i + strings.Index(line[from+i:], "valve") + len("valve")
				want = append(want, [2]int{utf8.RuneCountInString(line[:from+i]) + 1, utf8.RuneCountInString(line[:end]) + 1})
				from += i + 1
			}
		}
		for _, f := range res.Findings {
			require.Equal(t, "magnet valve", f.Text, tc.name)
			got = append(got, [2]int{f.Column, f.EndColumn})
		}
		assert.Equal(t, want, got, tc.name)
		require.NotEmpty(t, want, tc.name)

		// SARIF carries the same columns (columnKind unicodeCodePoints).
		var buf bytes.Buffer
		require.NoError(t, Write(&buf, "sarif", res.Findings, WriteOptions{}))
		var log struct {
			Runs []struct {
				Results []struct {
					Locations []struct {
						PhysicalLocation struct {
							Region struct {
								StartColumn int `json:"startColumn"`
							} `json:"region"`
						} `json:"physicalLocation"`
					} `json:"locations"`
				} `json:"results"`
			} `json:"runs"`
		}
		require.NoError(t, json.Unmarshal(buf.Bytes(), &log))
		require.Len(t, log.Runs[0].Results, len(want), tc.name)
		for k, r := range log.Runs[0].Results {
			assert.Equal(t, want[k][0], r.Locations[0].PhysicalLocation.Region.StartColumn, tc.name)
		}
	}
}

// utf16File returns text as a UTF-16 file with a byte-order mark.
func utf16File(t *testing.T, order unicode.Endianness, text string) string {
	t.Helper()
	b, err := unicode.UTF16(order, unicode.UseBOM).NewEncoder().Bytes([]byte(text))
	require.NoError(t, err)
	return string(b)
}

// An HTML finding's line and column are the file's: the characters of the
// decoded file from (Line, Column) to (EndLine, EndColumn), with their
// tags, comments and script left out and their character references
// resolved (by golang.org/x/net/html's tokenizer), are the text found;
// and the token offsets between them slice the same text out of the file.
func TestHTMLPositionsAreTheFiles(t *testing.T) {
	cases := []struct {
		name, content string
		windows1252   bool
		want          int // findings
	}{
		{name: "references", want: 3,
			content: "<p>Fit the magnet&#32;valve &amp; the <i>flowrate</i> &#8217;meter&#8217;.</p>\n<p>Caf&eacute; magnet valve.</p>"},
		{name: "nested inline tags", want: 2,
			content: "<div><p>The <b><i>magnet</i></b> <span><a href=\"x\">valve</a></span> and the <em>set<b>point</b></em>.</p></div>"},
		{name: "attributes holding >", want: 1,
			content: "<p title=\"a > b\" data-x='<b>magnet valve</b>'>Check the <img alt=\"1 > 0\" src=x>magnet valve.</p>"},
		{name: "comments", want: 2,
			content: "<p>One<!-- magnet valve --> magnet <!-- x -->valve.</p>\n<!-- a\nmulti-line\ncomment -->\n<p>Then the flowrate.</p>"},
		{name: "cdata, script and style skipped", want: 2,
			content: "<html><head><style>.magnet > .valve {}</style><script>var s = \"<p>magnet valve</p>\";</script></head>\n" +
				"<body><p>A <![CDATA[magnet valve]]> magnet valve.</p><script>magnet valve</script>\n<p>The flowrate.</p></body></html>"},
		{name: "windows-1252 declared", windows1252: true, want: 2,
			content: "<html><head><meta charset=\"windows-1252\"></head>\r\n<body><p>Caf\xE9 \x93magnet valve\x94 at 40 \x80.</p>\r\n<p>Na\xEFve flowrate.</p></body></html>"},
		{name: "CRLF and collapsed white space", want: 2,
			content: "<p>\r\n   The   magnet\r\n      valve\r\n</p>\r\n<ul>\r\n<li>Low   flowrate</li>\r\n</ul>\r\n"},
		// the text of <pre> is code, not reported
		{name: "pre and br", want: 1,
			content: "<p>Line one<br>magnet valve</p>\n<pre>\n  the flowrate\n</pre>"},
	}
	m := Compile(pumpGlossary())
	for _, tc := range cases {
		d, src := annotate(t, "page.html", tc.content)
		decoded := tc.content
		if tc.windows1252 {
			b, err := charmap.Windows1252.NewDecoder().Bytes(src)
			require.NoError(t, err)
			decoded = string(b)
		}
		lines := strings.Split(strings.NewReplacer("\r\n", "\n", "\r", "\n").Replace(decoded), "\n")
		res := Check(d, src, Options{Glossary: m})
		require.Len(t, res.Findings, tc.want, tc.name)
		for _, f := range res.Findings {
			require.True(t, f.Line >= 1 && f.EndLine >= f.Line && f.EndLine <= len(lines), "%s: %+v", tc.name, f)
			cut := cutLines(lines, f.Line, f.Column, f.EndLine, f.EndColumn)
			assert.Equal(t, f.Text, visibleText(cut), "%s: %d:%d-%d:%d %q", tc.name, f.Line, f.Column, f.EndLine, f.EndColumn, cut)
			if !tc.windows1252 {
				assert.Equal(t, f.Text, visibleText(tc.content[d.ReadOffset(f.Start):d.ReadEnd(f.End)]), tc.name)
			}
		}
	}
}

// cutLines returns the characters of lines from line l0, column c0 to line
// l1, column c1 (exclusive), all 1-based.
func cutLines(lines []string, l0, c0, l1, c1 int) string {
	runeAt := func(s string, col int) int { // byte offset of column col
		i := 0
		for n := 1; n < col && i < len(s); n++ {
			_, w := utf8.DecodeRuneInString(s[i:])
			i += w
		}
		return i
	}
	if l0 == l1 {
		s := lines[l0-1]
		return s[runeAt(s, c0):runeAt(s, c1)]
	}
	parts := []string{lines[l0-1][runeAt(lines[l0-1], c0):]}
	parts = append(parts, lines[l0:l1-1]...)
	return strings.Join(append(parts, lines[l1-1][:runeAt(lines[l1-1], c1)]), "\n")
}

// visibleText is the text of an HTML fragment as a page shows it: text
// tokens but those of script and style, white space runs as one space.
func visibleText(s string) string {
	z := html.NewTokenizer(strings.NewReader(s))
	var out strings.Builder
	skip := false
	for {
		switch tt := z.Next(); tt {
		case html.ErrorToken:
			return strings.Join(strings.Fields(out.String()), " ")
		case html.TextToken:
			if !skip {
				out.Write(z.Text())
			}
		case html.StartTagToken, html.EndTagToken:
			name, _ := z.TagName()
			if string(name) == "script" || string(name) == "style" {
				skip = tt == html.StartTagToken
			}
		}
	}
}

// A skip marker silences the next line with text, in the file's lines:
// a Markdown or HTML comment, read in the source; a line of its own in
// Markdown read from standard input (no source to read again).
func TestSkipMarkerLines(t *testing.T) {
	cases := []struct {
		name, file, content string
		noSource            bool
		lines               []int // lines of the findings left
	}{
		{name: "markdown comment", file: "a.md",
			content: "A magnet valve.\n<!-- glossmith:skip-next-line -->\n\nA magnet valve.\nA magnet valve.\n", lines: []int{1, 5}},
		{name: "markdown line, no source", file: "b.md", noSource: true,
			content: "A magnet valve.\nglossmith:skip-next-line\nA magnet valve.\nA magnet valve.\n", lines: []int{1, 4}},
		{name: "html comment", file: "c.html",
			content: "<p>A magnet valve.</p>\n<!-- glossmith:skip-next-line -->\n<p>\nA <b>magnet</b> valve.</p>\n<p>A magnet valve.</p>\n", lines: []int{1, 5}},
	}
	m := Compile(pumpGlossary())
	for _, tc := range cases {
		d, src := annotate(t, tc.file, tc.content)
		if tc.noSource {
			src = nil
		}
		var got []int
		for _, f := range Check(d, src, Options{Glossary: m}).Findings {
			got = append(got, f.Line)
		}
		assert.Equal(t, tc.lines, got, tc.name)
	}
}

// A document in UTF-16 (with a byte order mark, little or big endian) has
// the findings of the same document in UTF-8, at the same lines and
// columns: its code (HTML code and pre elements, Markdown code spans) and
// the lines after its skip comments are left out as in UTF-8. The
// documents hold characters of two and four bytes in UTF-8 (one and two
// UTF-16 units) before findings and code, and CRLF line ends.
func TestUTF16FindingsAsUTF8(t *testing.T) {
	cases := []struct {
		name, file, content string
		lines               []int // of the findings in UTF-8
	}{
		{name: "html", file: "page.html", lines: []int{1, 7, 7, 9},
			content: "<p>Fit the magnet valve, not the <code>magnet valve</code>.</p>\r\n" +
				"<!-- glossmith:skip-next-line -->\r\n<p>A magnet valve.</p>\r\n" +
				"<pre>\r\nset magnet valve\r\n</pre>\r\n" +
				"<p>Café 𝛥T: a magnet valve; <kbd>𝛥 magnet valve</kbd>, the flowrate.</p>\r\n" +
				"<p>Then <!-- glossmith:skip-next-line --> the magnet valve</p>\n<p>and 𝛥 the magnet valve.</p>"},
		{name: "markdown", file: "page.md", lines: []int{1, 5, 5},
			content: "Fit the magnet valve, not the `magnet valve`.\r\n" +
				"<!-- glossmith:skip-next-line -->\r\nA magnet valve.\r\n\r\n" +
				"Café 𝛥T: a magnet valve; `𝛥 magnet valve`, the flowrate.\r\n"},
	}
	m := Compile(pumpGlossary())
	type at struct {
		text                       string
		line, col, endLine, endCol int
	}
	findings := func(name, content string) []at {
		d, src := annotate(t, name, content)
		var out []at
		for _, f := range Check(d, src, Options{Glossary: m}).Findings {
			out = append(out, at{f.Text, f.Line, f.Column, f.EndLine, f.EndColumn})
		}
		return out
	}
	for _, tc := range cases {
		want := findings(tc.file, tc.content)
		var lines []int
		for _, f := range want {
			lines = append(lines, f.line)
		}
		require.Equal(t, tc.lines, lines, "%s in UTF-8: %v", tc.name, want)
		for _, enc := range []struct {
			name  string
			order unicode.Endianness
		}{{"UTF-16 LE", unicode.LittleEndian}, {"UTF-16 BE", unicode.BigEndian}} {
			assert.Equal(t, want, findings(tc.file, utf16File(t, enc.order, tc.content)), "%s in %s", tc.name, enc.name)
		}
	}
}

// A Markdown document in Windows-1252, the reader's fallback for text that
// is not UTF-8, has the findings of the same document in UTF-8, at the
// same lines and columns: its code spans and the lines after its skip
// comments are left out as in UTF-8.
func TestWindows1252FindingsAsUTF8(t *testing.T) {
	content := "Fit the magnet valve, not the `magnet valve`.\r\n" +
		"<!-- glossmith:skip-next-line -->\r\nA magnet valve.\r\n\r\n" +
		"Café « a magnet valve » ; `é magnet valve`, the flowrate.\r\n"
	m := Compile(pumpGlossary())
	type at struct {
		text                       string
		line, col, endLine, endCol int
	}
	findings := func(content string) []at {
		d, src := annotate(t, "page.md", content)
		var out []at
		for _, f := range Check(d, src, Options{Glossary: m}).Findings {
			out = append(out, at{f.Text, f.Line, f.Column, f.EndLine, f.EndColumn})
		}
		return out
	}
	want := findings(content)
	require.Len(t, want, 3, "in UTF-8: %v", want)
	cp1252, err := charmap.Windows1252.NewEncoder().String(content)
	require.NoError(t, err)
	require.False(t, utf8.ValidString(cp1252), "the test needs bytes that are not UTF-8")
	assert.Equal(t, want, findings(cp1252))
}
