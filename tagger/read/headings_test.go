package read

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/internal/docxtest"
	"glossmith/tagger/doc"
)

// headingLines returns the text of each heading range of d, its lines
// joined by "|": what the reader marked, checked against the source.
func headingLines(d *doc.Document) []string {
	lines := strings.Split(d.Text, "\n")
	var out []string
	for _, h := range d.Headings {
		if h.First < 1 || int(h.Last) > len(lines) || h.First > h.Last {
			out = append(out, "bad range")
			continue
		}
		out = append(out, strings.Join(lines[h.First-1:h.Last], "|"))
	}
	return out
}

// headingLinesCase is a text and the heading lines a reader should find in it.
type headingLinesCase struct {
	name, text string
	want       []string
}

// checkHeadings reads each case's text as a file of the given name.
func checkHeadings(t *testing.T, file string, tests []headingLinesCase) {
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			d, ps := readFile(t, file, tt.text, Options{})
			require.NotNil(t, d, "%v", ps)
			assert.Equal(t, tt.want, headingLines(d))
		})
	}
}

func TestTextHeadings(t *testing.T) {
	checkHeadings(t, "notes.txt", []headingLinesCase{
		{"title case between blank lines", "Cleaning the Drip Emitters\n\nUse a soft brush.\n", []string{"Cleaning the Drip Emitters"}},
		{"capitals", "intro words.\n\nCLEANING THE DRIP EMITTERS\n\nUse a soft brush.\n", []string{"CLEANING THE DRIP EMITTERS"}},
		{"numbered", "3.2 Replacing the Humidity Sensor\n\nText.\n", []string{"3.2 Replacing the Humidity Sensor"}},
		{"small words after the first", "Notes on Valves of the HV-25 Series\n\nText.\n", []string{"Notes on Valves of the HV-25 Series"}},
		{"one word", "Maintenance\n\nText.\n", []string{"Maintenance"}},
		{"CRLF and trailing spaces", "Cleaning the Drip Emitters  \r\n\r\nText.\r\n", []string{"Cleaning the Drip Emitters  "}},
		{"blank line of spaces", "Cleaning the Drip Emitters\n \t\nText.\n", []string{"Cleaning the Drip Emitters"}},
		{"sentence case is running text", "Cleaning the drip emitters\n\nText.\n", nil},
		{"a sentence", "Clean the Drip Emitters.\n\nText.\n", nil},
		{"a lead-in", "Tools Needed:\n\nA brush.\n", nil},
		{"a question", "Why Does the Valve Hum?\n\nText.\n", nil},
		{"no blank line after", "Cleaning the Drip Emitters\nUse a soft brush.\n", nil},
		{"no blank line before", "Some text here\nCleaning the Drip Emitters\n\nText.\n", nil},
		{"last line", "Text.\n\nCleaning the Drip Emitters", nil},
		{"a bullet", "- Drip Emitters\n\nText.\n", nil},
		{"too many words", "The Quick Maintenance Guide to All the Valves and Emitters and Sensors and Pipes of the Greenhouse\n\nText.\n", nil},
		{"a capitalized first word only", "Drip emitters\n\nText.\n", nil},
		{"digits only", "2024\n\nText.\n", nil},
		{"a line of no-break spaces (white space to TrimSpace, not blank)", "Text.\n\n\u00A0\u00A0\n\nText.\n", nil},
		{"two headings", "Maintenance\n\nCleaning the Drip Emitters\n\nText.\n", []string{"Maintenance", "Cleaning the Drip Emitters"}},
	})
}

// CommonMark 0.31.2, sections 4.2 (ATX headings) and 4.3 (setext
// headings): what is a heading and what is not.
func TestMarkdownHeadings(t *testing.T) {
	checkHeadings(t, "manual.md", []headingLinesCase{
		{"ATX", "# Cleaning the Drip Emitters\n\nText.\n", []string{"Cleaning the Drip Emitters"}},
		{"ATX with closing hashes", "## Valves ##\nText.\n", []string{"Valves"}},
		{"setext over two lines", "Cleaning the\nDrip Emitters\n=============\n\nText.\n", []string{"Cleaning the|Drip Emitters"}},
		{"setext level 2", "Valves\n------\nText.\n", []string{"Valves"}},
		{"in a list item and a quote", "- # Valves\n\n> ## Sensors\n", []string{"Valves", "Sensors"}},
		{"seven hashes is a paragraph", "####### Valves\n", nil},
		{"no space is a paragraph", "#Valves\n", nil},
		{"in a code fence", "```\n# Valves\n```\nText.\n", nil},
		{"empty heading", "#\n\nText.\n", nil},
		{"a paragraph", "Cleaning the Drip Emitters\n", nil},
	})
}

func TestHTMLHeadings(t *testing.T) {
	page := `<html><head><title>Service Manual</title></head><body>
<h1>Cleaning the Drip Emitters</h1><p>Use a soft brush.</p>
<h2>Valves<br>and Sensors</h2>
<h3 hidden>Hidden Heading</h3>
<div>Intro <h4>Inner <em>Heading</em></h4> after</div>
<table><caption>Flow Rates</caption><tr><td>2 l/h</td></tr></table>
<figure><img alt="x"><figcaption>Emitter Layout</figcaption></figure>
<h5></h5><p>End.</p></body></html>`
	d, ps := readFile(t, "manual.html", page, Options{})
	require.NotNil(t, d, "%v", ps)
	assert.Equal(t, []string{"Cleaning the Drip Emitters", "Valves|and Sensors", "Inner Heading", "Flow Rates", "Emitter Layout"}, headingLines(d))

	// A page the tree parser refuses is read tag by tag; its headings too.
	deep := "<h1>Cleaning the Drip Emitters</h1>" + strings.Repeat("<div>", 600) + "<p>Text.</p>"
	d, ps = readFile(t, "deep.html", deep, Options{})
	require.NotNil(t, d, "%v", ps)
	assert.Equal(t, []string{"Cleaning the Drip Emitters"}, headingLines(d))
}

// The style and outline elements follow ECMA-376 Part 1 (WordprocessingML):
// w:pStyle names a style of word/styles.xml by w:styleId, whose w:name is
// "heading 1" for Word's built-in heading style; w:outlineLvl 0–8 puts a
// paragraph in the outline, 9 is body text; w:basedOn inherits a style's
// properties; w:pPrChange holds a revision's former paragraph properties.
func TestDocxHeadings(t *testing.T) {
	para := func(ppr, text string) string {
		return `<w:p><w:pPr>` + ppr + `</w:pPr><w:r><w:t>` + text + `</w:t></w:r></w:p>`
	}
	styles := []string{
		`<w:style w:type="paragraph" w:styleId="Normal"><w:name w:val="Normal"/></w:style>`,
		`<w:style w:type="paragraph" w:styleId="berschrift1"><w:name w:val="heading 1"/><w:basedOn w:val="Normal"/></w:style>`,
		`<w:style w:type="paragraph" w:styleId="H2"><w:name w:val="Section"/><w:pPr><w:outlineLvl w:val="1"/></w:pPr></w:style>`,
		`<w:style w:type="paragraph" w:styleId="Step"><w:name w:val="Step Title"/><w:basedOn w:val="H2"/></w:style>`,
		`<w:style w:type="paragraph" w:styleId="Heading3"><w:name w:val="Body Three"/></w:style>`,
		`<w:style w:type="character" w:styleId="Strong"><w:name w:val="heading 4"/></w:style>`,
		`<w:style w:type="paragraph" w:styleId="LoopA"><w:name w:val="Loop"/><w:basedOn w:val="LoopB"/></w:style>`,
		`<w:style w:type="paragraph" w:styleId="LoopB"><w:name w:val="Loop"/><w:basedOn w:val="LoopA"/></w:style>`,
	}
	body := para(`<w:pStyle w:val="berschrift1"/>`, "Cleaning the Drip Emitters") +
		para(``, "Use a soft brush.") +
		para(`<w:pStyle w:val="H2"/>`, "Valves") +
		para(`<w:pStyle w:val="Step"/>`, "Replacing the Humidity Sensor") +
		para(`<w:pStyle w:val="Heading3"/>`, "Not a Heading by Its Style") +
		para(`<w:pStyle w:val="LoopA"/>`, "Looped Style") +
		para(`<w:outlineLvl w:val="0"/>`, "Outline Level One") +
		para(`<w:pStyle w:val="H2"/><w:outlineLvl w:val="9"/>`, "Body Text Level") +
		para(`<w:pPrChange><w:pPr><w:pStyle w:val="H2"/></w:pPr></w:pPrChange>`, "Formerly a Heading") +
		`<w:p><w:pPr><w:pStyle w:val="H2"/></w:pPr><w:r><w:t>Two</w:t><w:br/><w:t>Lines</w:t></w:r></w:p>` +
		para(`<w:pStyle w:val="H2"/>`, "")
	d, ps := readFile(t, "manual.docx", string(docxtest.Zip(t, docxtest.Files(body, styles...)...)), Options{})
	require.NotNil(t, d, "%v", ps)
	assert.Empty(t, ps)
	assert.Equal(t, []string{"Cleaning the Drip Emitters", "Valves", "Replacing the Humidity Sensor", "Outline Level One", "Two|Lines"}, headingLines(d))

	// Without word/styles.xml, the IDs Word gives its built-in styles.
	body = para(`<w:pStyle w:val="Heading2"/>`, "Valves") + para(``, "Text.") +
		para(`<w:pStyle w:val="Title"/>`, "Service Manual") + para(`<w:pStyle w:val="Heading10"/>`, "No Such Level") +
		para(`<w:pStyle w:val="Caption"/>`, "Emitter Layout")
	d, ps = readFile(t, "plain.docx", string(docxtest.Zip(t, docxtest.Files(body)...)), Options{})
	require.NotNil(t, d, "%v", ps)
	assert.Equal(t, []string{"Valves", "Service Manual", "Emitter Layout"}, headingLines(d))

	// A broken styles part costs the headings it would have given, no text.
	files := append(docxtest.Files(para(`<w:pStyle w:val="Heading1"/>`, "Valves")), "word/styles.xml", "<w:styles")
	d, ps = readFile(t, "broken-styles.docx", string(docxtest.Zip(t, files...)), Options{})
	require.NotNil(t, d, "%v", ps)
	require.Len(t, ps, 1)
	assert.Equal(t, Warning, ps[0].Severity)
	assert.Contains(t, ps[0].Msg, "word/styles.xml not read")
	assert.Equal(t, "Valves", d.Text)
	assert.Equal(t, []string{"Valves"}, headingLines(d))
}

// Normalization removes and composes characters but never a line break,
// so heading lines still hold their headings after it.
func TestHeadingLinesSurviveNormalization(t *testing.T) {
	d, ps := readFile(t, "manual.md", "Intro pres\u00adsure text.\n\n# Cleaning the Cafe\u0301 Emitters\n", Options{})
	require.NotNil(t, d, "%v", ps)
	assert.Equal(t, []string{"Cleaning the Café Emitters"}, headingLines(d))
}

func TestConlluHasNoHeadings(t *testing.T) {
	d, ps := readFile(t, "gold.conllu", "# text = Cleaning the Drip Emitters\n1\tCleaning\t_\t_\t_\t_\t_\t_\t_\t_\n2\tthe\t_\t_\t_\t_\t_\t_\t_\t_\n3\tDrip\t_\t_\t_\t_\t_\t_\t_\t_\n4\tEmitters\t_\t_\t_\t_\t_\t_\t_\t_\n\n", Options{})
	require.NotNil(t, d, "%v", ps)
	assert.Empty(t, d.Headings)
	for _, s := range d.Sentences {
		assert.False(t, s.Heading)
	}
}
