package read

import (
	"bytes"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"golang.org/x/net/html"
	"golang.org/x/text/encoding"
	"golang.org/x/text/encoding/charmap"
	"golang.org/x/text/encoding/japanese"
	"golang.org/x/text/encoding/unicode"

	"glossmith/tagger/doc"
	"glossmith/tagger/tokenize"
)

// sourceText is an invented manual page with what shifts offsets: accents
// ("é" of "café", "Zürich"), a typographic apostrophe and a euro sign
// (three bytes in UTF-8, one in Windows-1252), a character outside the
// Basic Multilingual Plane (four bytes in UTF-8 and in UTF-16), a soft
// hyphen that normalization removes, and a decomposed accent it composes.
const sourceText = "The café valve’s set point is 15 °C.\n" +
	"Zürich greenhouse: pres\u00ADsure 3 bar, cost 40 €.\n" +
	"\n" +
	"The 𝜆 sensor and the cafe\u0301 pump.\n"

// slicedFile is a file built from sourceText and how to decode a slice of
// it again, by a decoder other than the reader's.
type slicedFile struct {
	name   string
	data   []byte
	opt    Options
	decode func([]byte) string
}

func encodedWith(t *testing.T, e encoding.Encoding, s string) []byte {
	t.Helper()
	b, err := e.NewEncoder().Bytes([]byte(s))
	require.NoError(t, err)
	return b
}

func decodedWith(e encoding.Encoding) func([]byte) string {
	return func(b []byte) string {
		out, _ := e.NewDecoder().Bytes(b)
		return string(out)
	}
}

// perByte decodes UTF-8 with each byte outside a valid sequence as one
// U+FFFD, as the reader does.
func perByte(b []byte) string {
	var out strings.Builder
	for len(b) > 0 {
		r, n := utf8.DecodeRune(b)
		out.WriteRune(r)
		b = b[n:]
	}
	return out.String()
}

func slicedFiles(t *testing.T) []slicedFile {
	plain := perByte
	crlf := strings.ReplaceAll(sourceText, "\n", "\r\n")
	latin1 := strings.NewReplacer("’", "'", "𝜆", "L", "\u00AD", "", "cafe\u0301", "café").Replace(sourceText) // what Windows-1252 can hold
	utf16le := unicode.UTF16(unicode.LittleEndian, unicode.IgnoreBOM)
	utf16be := unicode.UTF16(unicode.BigEndian, unicode.IgnoreBOM)
	sjis := strings.NewReplacer("’", "'", "𝜆", "L", "\u00AD", "", "cafe\u0301", "cafe", "é", "e", "ü", "u", "°", "", "€", "円").Replace(sourceText)
	return []slicedFile{
		{"utf-8, LF (the file's own offsets)", []byte(sourceText), Options{}, plain},
		{"CRLF", []byte(crlf), Options{}, plain},
		{"lone CR", []byte(strings.ReplaceAll(sourceText, "\n", "\r")), Options{}, plain},
		{"UTF-8 byte-order mark, CRLF", append([]byte("\xEF\xBB\xBF"), crlf...), Options{}, plain},
		{"Latin-1 (read as Windows-1252)", encodedWith(t, charmap.Windows1252, latin1), Options{}, decodedWith(charmap.Windows1252)},
		{"Windows-1252 named, CRLF", encodedWith(t, charmap.Windows1252, strings.ReplaceAll(latin1, "\n", "\r\n")), Options{Encoding: "windows-1252"}, decodedWith(charmap.Windows1252)},
		{"UTF-16 LE with byte-order mark", append([]byte{0xFF, 0xFE}, encodedWith(t, utf16le, crlf)...), Options{}, decodedWith(utf16le)},
		{"UTF-16 BE with byte-order mark", append([]byte{0xFE, 0xFF}, encodedWith(t, utf16be, sourceText)...), Options{}, decodedWith(utf16be)},
		{"Shift_JIS named", encodedWith(t, japanese.ShiftJIS, sjis), Options{Encoding: "shift_jis"}, decodedWith(japanese.ShiftJIS)},
		// a NUL in the first 8 KiB marks a file as binary: this one is further on
		{"invalid UTF-8 and a NUL", []byte(strings.Replace(crlf, "valve", "va\xFFlve", 1) + strings.Repeat("The vent opens.\r\n", 600) + "The sen\x00sor\x00 reads.\r\n"), Options{}, plain},
	}
}

// A token's offsets in tag output point into the file's bytes as read:
// slicing the file at them and decoding the slice (then putting it in
// NFC without invisible characters, as the reader does) gives the token.
func TestOffsetsPointIntoTheFile(t *testing.T) {
	for _, f := range slicedFiles(t) {
		d, _ := readFile(t, "a.txt", string(f.data), f.opt)
		require.NotNil(t, d, f.name)
		tokenize.Document(d)
		require.Greater(t, d.TokenCount(), 20, f.name)
		for _, s := range d.Sentences {
			for _, tok := range s.Tokens {
				from, to := d.ReadOffset(int(tok.Start)), d.ReadEnd(int(tok.End))
				require.True(t, 0 <= from && from <= to && to <= len(f.data), "%s: %q at [%d:%d]", f.name, tok.Form, from, to)
				got, _ := normalizeText(strings.ReplaceAll(f.decode(f.data[from:to]), "\x00", ""))
				assert.Equal(t, tok.Form, got, "%s: [%d:%d]", f.name, from, to)
			}
		}
	}
}

// The plain-text reader maps nothing when the file is the text: UTF-8
// with LF line ends and no byte-order mark (and then pays nothing).
func TestNoSourceMapForPlainUTF8(t *testing.T) {
	d, _ := readFile(t, "a.txt", sourceText, Options{})
	require.NotNil(t, d)
	assert.Nil(t, d.Source)
	d, _ = readFile(t, "a.txt", strings.ReplaceAll(sourceText, "\n", "\r\n"), Options{})
	require.NotNil(t, d)
	assert.Len(t, d.Source, strings.Count(sourceText, "\n"), "one run a CRLF")
}

// An English UTF-16 file needs a run at each change between ASCII and
// other characters, not one a character.
func TestSourceMapIsCompact(t *testing.T) {
	text := strings.Repeat("The drip emitter clogs at 2 bar; the café’s filter does not.\n", 50)
	data := append([]byte{0xFF, 0xFE}, encodedWith(t, unicode.UTF16(unicode.LittleEndian, unicode.IgnoreBOM), text)...)
	d, _ := readFile(t, "a.txt", string(data), Options{})
	require.NotNil(t, d)
	assert.LessOrEqual(t, len(d.Source), 4*50+1)
}

// Bytes dropped at the end of a file (a last line too long to read, NULs)
// and a capped line in the middle keep the offsets after them right.
func TestSourceMapAfterLeftOutLines(t *testing.T) {
	long := strings.Repeat("x", MaxLine+1)
	data := "valve one\r\n" + long + "\r\nvalve two\r\n" + long
	d, ps := readFile(t, "a.txt", data, Options{})
	require.NotNil(t, d)
	require.NotEmpty(t, ps)
	tokenize.Document(d)
	var got []string
	for _, s := range d.Sentences {
		for _, tok := range s.Tokens {
			got = append(got, data[d.ReadOffset(int(tok.Start)):d.ReadEnd(int(tok.End))])
		}
	}
	assert.Equal(t, []string{"valve", "one", "valve", "two"}, got)
	assert.Equal(t, len(data), d.ReadOffset(len(d.Text)))
}

// FuzzSourceOffsets reads any bytes as plain text, raw, behind a UTF-8
// byte-order mark, as UTF-16 and as Windows-1252, and checks every token
// as TestOffsetsPointIntoTheFile does.
func FuzzSourceOffsets(f *testing.F) {
	f.Add([]byte(sourceText), uint8(0))
	f.Add([]byte("a\r\n\r\rb\x00\r\x00\nc\xFF d"), uint8(1))
	f.Add([]byte("x\x00y\x00\r\x00\n\x00\x00\xD8z\x00"), uint8(2))
	f.Add([]byte("caf\xe9\r\n"), uint8(3))
	f.Fuzz(func(t *testing.T, data []byte, how uint8) {
		if len(data) > 256 {
			return
		}
		utf16le := unicode.UTF16(unicode.LittleEndian, unicode.IgnoreBOM)
		opt := Options{Format: FormatText}
		decode := perByte
		switch how % 4 {
		case 0:
			if !utf8.Valid(data) && looksWindows1252(data) {
				decode = decodedWith(charmap.Windows1252) // the reader's fallback
			}
		case 1:
			data = append([]byte("\xEF\xBB\xBF"), data...)
		case 2:
			data = append([]byte{0xFF, 0xFE}, data...)
			decode = decodedWith(utf16le)
		case 3:
			opt.Encoding = "windows-1252"
			decode = decodedWith(charmap.Windows1252)
		}
		if how%4 == 0 || how%4 == 3 {
			// A byte-order mark the input begins with decides first, over
			// the fallback and --encoding alike.
			switch {
			case bytes.HasPrefix(data, []byte("\xEF\xBB\xBF")):
				decode = perByte
			case bytes.HasPrefix(data, []byte{0xFF, 0xFE}):
				decode = decodedWith(utf16le)
			case bytes.HasPrefix(data, []byte{0xFE, 0xFF}):
				decode = decodedWith(unicode.UTF16(unicode.BigEndian, unicode.IgnoreBOM))
			}
		}
		opt.Stdin = bytes.NewReader(data)
		d, _ := Read(Input{Name: "-", Path: "-"}, opt)
		if d == nil {
			return
		}
		checkSource(t, d, data, func(b []byte) string {
			got, _ := normalizeText(strings.ReplaceAll(decode(b), "\x00", ""))
			return got
		})
	})
}

// checkSource checks the tokens of d against data, the file, where shown
// gives the text a slice of the file shows: those that start before an
// ASCII character and end before one or at the end, for a token may end
// inside what NFC made of one character (U+2ADC FORKING is U+2ADD U+0338
// in NFC, and U+0338 may be a token of its own), and only the ends of
// such a piece map back to the file.
func checkSource(t *testing.T, d *doc.Document, data []byte, shown func([]byte) string) {
	t.Helper()
	tokenize.Document(d)
	for _, s := range d.Sentences {
		for _, tok := range s.Tokens {
			from, to := d.ReadOffset(int(tok.Start)), d.ReadEnd(int(tok.End))
			require.True(t, 0 <= from && from <= to && to <= len(data), "%q at [%d:%d] of %q", tok.Form, from, to, data)
			if d.Text[tok.Start] >= utf8.RuneSelf || int(tok.End) < len(d.Text) && d.Text[tok.End] >= utf8.RuneSelf {
				continue
			}
			require.Equal(t, tok.Form, shown(data[from:to]), "%q at [%d:%d] of %q", tok.Form, from, to, data)
		}
	}
}

// htmlSourceCase is a small page with what moves HTML text away from its
// source, and how to decode a slice of the file (nil: UTF-8).
type htmlSourceCase struct {
	name, data string
	decode     func([]byte) string
}

// htmlSourceCases: character references, tags inside and between words,
// attributes holding ">", comments, CDATA, script and style, collapsed
// white space, <br>, blocks, <pre>, CRLF, a declared Windows-1252 charset,
// a byte-order mark, UTF-16.
func htmlSourceCases(t *testing.T) []htmlSourceCase {
	utf16le := unicode.UTF16(unicode.LittleEndian, unicode.IgnoreBOM)
	return []htmlSourceCase{
		{name: "references", data: "<p>Drip &amp; spray emitters at 3&nbsp;bar, the valve&#8217;s seat, caf&eacute; &#x20AC;5 &notit; &amp</p>"},
		{name: "nested inline tags", data: "<p>The <b>set<i>point</i></b> of the <a href=\"v.html\"><em>magnet</em> valve</a> is <span><span>15</span></span>&#176;C.</p>"},
		{name: "attributes holding >", data: "<p title=\"a > b\" data-x='<p>x</p>'>Inlet <img alt=\"1 > 0\" src=x>pressure <a href=\"?a=1&b=2\">gauge</a>.</p>"},
		{name: "comments", data: "<p>Flow<!-- a comment with <p>tags</p> --> meter<!----> and <!-- glossmith:skip-next-line -->filter.</p>"},
		{name: "cdata, script and style", data: "<html><head><style>p > b { color: red }</style><script>if (a < b && c) { x = \"<p>no</p>\" }</script></head>" +
			"<body><p>Valve <![CDATA[ hidden ]]>body</p><script>var valve = 1;</script><p>Seat ring.</p><svg><title>valve</title><style><p>x</style></svg><p>Last valve.</p></body></html>"},
		{name: "white space, br and blocks", data: "<div>\n  <h1>  Solenoid\n    valve </h1>\n\t<p>Opens   at\n\n 3 bar<br>closes<br/>\n at 1 bar.</p><ul><li>Bleed<li>Check</ul>\n</div>"},
		{name: "pre", data: "<p>Before</p><pre>\n  valve  open\n  &lt;seat&gt;\n</pre><p>After</p>"},
		{name: "CRLF", data: "<p>First\r\nline of the\r\n  valve text.</p>\r\n<pre>a\r\nb\rc</pre>\r\n<p>Last &amp;\r\nend.</p>\r\n"},
		{name: "tables and implied ends", data: "<table><tr><td>Valve<td>Seat</tr><tr><th>Ring</table><p>Text<p>More<li>item"},
		{name: "stray table text", data: "<table><tr><td>Cell one</td></tr>stray words<tr><td>Cell two</td></tr></table><p>After the table.</p>"},
		{name: "hidden", data: "<p hidden>Valve</p><div style=\"display:none\">Valve seat</div><p>Valve seat ring.</p>"},
		{name: "soft hyphen and decomposed accents", data: "<p>pres&shy;sure cafe\u0301 and cafe&#x301; pres\u00ADsure</p>"},
		{name: "windows-1252 declared", data: "<html><head><meta charset=\"windows-1252\"></head><body><p>The caf\xE9\x92s valve costs 40 \x80.\r\n<b>Na\xEFve</b> seat&nbsp;ring.</p></body></html>",
			decode: decodedWith(charmap.Windows1252)},
		{name: "nested too deep for the tree, read tag by tag", data: "<p>Top valve.</p>" + strings.Repeat("<div>", 600) + "Deep <b>set</b>point &amp;\n  <script>x()</script>seat." + strings.Repeat("</div>", 600)},
		{name: "utf-8 byte-order mark", data: "\xEF\xBB\xBF<p>Caf\u00e9 valve &amp; seat.</p>\n<p>Zürich pump.</p>"},
		{name: "utf-16 LE", data: string(append([]byte{0xFF, 0xFE}, encodedWith(t, utf16le, "<p>Caf\u00e9 valve &amp; seat\r\nring. The \U0001D706 sensor.</p>")...)),
			decode: decodedWith(utf16le)},
	}
}

// A token's offsets point into the HTML file: the slice of the file
// between them, decoded, with its tags, comments and script left out and
// its character references resolved (by golang.org/x/net/html's
// tokenizer, not the reader), is the token.
func TestHTMLOffsetsPointIntoTheFile(t *testing.T) {
	for _, tc := range htmlSourceCases(t) {
		d, _ := readFile(t, "a.html", tc.data, Options{})
		require.NotNil(t, d, tc.name)
		require.NotNil(t, d.Origins, tc.name)
		tokenize.Document(d)
		require.Positive(t, d.TokenCount(), tc.name)
		for _, s := range d.Sentences {
			for _, tok := range s.Tokens {
				from, to := d.ReadOffset(int(tok.Start)), d.ReadEnd(int(tok.End))
				require.True(t, 0 <= from && from <= to && to <= len(tc.data), "%s: %q at [%d:%d]", tc.name, tok.Form, from, to)
				assert.Equal(t, tok.Form, htmlSliceText(tc.data[from:to], tc.decode), "%s: [%d:%d] %q", tc.name, from, to, tc.data[from:to])
			}
		}
	}
}

// htmlSliceText is the text a slice of an HTML file shows: its text
// tokens, less the raw text of the elements the reader drops, character
// references resolved, white space runs as one space, in the reader's
// normal form.
func htmlSliceText(b string, decode func([]byte) string) string {
	if decode != nil {
		b = decode([]byte(b))
	}
	b = strings.TrimPrefix(b, "\uFEFF")
	z := html.NewTokenizer(strings.NewReader(b))
	var out strings.Builder
	skip := ""
	for {
		switch tt := z.Next(); tt {
		case html.ErrorToken:
			got, _ := normalizeText(strings.Join(strings.Fields(out.String()), " "))
			return got
		case html.TextToken:
			if skip == "" {
				out.Write(z.Text())
			}
		case html.StartTagToken, html.EndTagToken:
			name, _ := z.TagName()
			switch {
			case tt == html.StartTagToken && skip == "" && htmlDropped[string(name)]:
				skip = string(name)
			case tt == html.EndTagToken && string(name) == skip:
				skip = ""
			}
		}
	}
}

// FuzzHTMLSourceOffsets reads any bytes as HTML, as UTF-8 and behind a
// UTF-16 byte-order mark, and checks every token as
// TestHTMLOffsetsPointIntoTheFile does, for pages the reader reads in
// source order: without elements whose text the parser moves (tables,
// "<plaintext>") or a page nested too deep for the tree.
func FuzzHTMLSourceOffsets(f *testing.F) {
	for _, tc := range htmlSourceCases(&testing.T{}) {
		if tc.decode == nil {
			f.Add([]byte(tc.data), false)
		}
	}
	f.Add([]byte("<p>a &amp b &#0000065; &#x; &#; &;x &ampx</p>"), true)
	f.Fuzz(func(t *testing.T, data []byte, utf16 bool) {
		if len(data) > 512 {
			return
		}
		decode := perByte
		if utf16 {
			data = append([]byte{0xFF, 0xFE}, data...)
			decode = decodedWith(unicode.UTF16(unicode.LittleEndian, unicode.IgnoreBOM))
		}
		lower := bytes.ToLower(data)
		for _, moves := range []string{"<table", "<plaintext", "<svg", "<math", "<frameset", "<select", "<template", "<noscript", "<xmp", "<textarea"} {
			if bytes.Contains(lower, []byte(moves)) {
				return
			}
		}
		if !utf16 && (!utf8.Valid(data) || bytes.HasPrefix(data, bomUTF16LE) || bytes.HasPrefix(data, bomUTF16BE) || strings.Contains(string(data), "charset") || strings.Contains(string(data), "encoding")) {
			return // decoded otherwise: TestHTMLOffsetsPointIntoTheFile covers Windows-1252
		}
		d, _ := Read(Input{Name: "-", Path: "-"}, Options{Format: FormatHTML, Stdin: bytes.NewReader(data)})
		if d == nil {
			return
		}
		checkSource(t, d, data, func(b []byte) string { return htmlSliceText(string(b), decode) })
	})
}

// A Markdown token's offsets point into the file: the slice of the file
// between them, decoded, its backslash escapes and character references
// resolved (CommonMark 0.31.2, 2.4 and 2.5) and, for a token that spans
// emphasis, its "*", "_" and "~" left out, is the token.
func TestMarkdownOffsetsPointIntoTheFile(t *testing.T) {
	utf16le := unicode.UTF16(unicode.LittleEndian, unicode.IgnoreBOM)
	page := "# The *set*point of a [magnet valve](https://example.com/v \"Valve\")\n\n" +
		"- Drip &amp; spray at 3&nbsp;bar, the valve&#8217;s seat, 5 \\* 3 \\_x\\_ and `P1 code`\n" +
		"- **Bold** ~~gone~~ <span title=\"a > b\">inline</span> <!-- a comment --> text\n\n" +
		"| Part | Value |\n|---|---|\n| coil | 24&#160;V |\n\n" +
		"> A quote with caf&eacute; and a [ref][r] link.\n\n[r]: /x\n\n" +
		"Setext heading\n===\n<p>An HTML block &amp; its\ntext.</p>\n| in | the |\n| block | too |\n"
	cases := []struct {
		name   string
		data   string
		opt    Options
		decode func([]byte) string
	}{
		{"UTF-8, LF", page, Options{}, perByte},
		{"CRLF", strings.ReplaceAll(page, "\n", "\r\n"), Options{}, perByte},
		{"byte-order mark, CRLF", "\xEF\xBB\xBF" + strings.ReplaceAll(page, "\n", "\r\n"), Options{}, perByte},
		{"Latin-1", strings.ReplaceAll(page, "caf&eacute;", "caf\xE9"), Options{}, decodedWith(charmap.Windows1252)},
		{"UTF-16 LE", string(append([]byte{0xFF, 0xFE}, encodedWith(t, utf16le, strings.ReplaceAll(page, "caf&eacute;", "café"))...)), Options{}, decodedWith(utf16le)},
	}
	for _, tc := range cases {
		d, _ := readFile(t, "a.md", tc.data, tc.opt)
		require.NotNil(t, d, tc.name)
		require.NotNil(t, d.Origins, tc.name)
		checkSource(t, d, []byte(tc.data), func(b []byte) string {
			var out strings.Builder
			for s := tc.decode(b); s != ""; s = s[1:] {
				switch {
				case s[0] == '\\' && len(s) > 1 && isASCIIPunct(s[1]):
					s = s[1:]
					out.WriteByte(s[0])
				case s[0] != '*' && s[0] != '_' && s[0] != '~':
					out.WriteByte(s[0])
				}
			}
			got, _ := normalizeText(strings.TrimPrefix(html.UnescapeString(out.String()), "\uFEFF"))
			return got
		})
	}
}
