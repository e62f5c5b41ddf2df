package check

import (
	"os"
	"path/filepath"
	"testing"
	"unicode/utf8"

	"glossmith/tagger/read"
	"glossmith/tagger/tokenize"
)

// FuzzCheck runs the check on arbitrary Markdown, HTML and text sources
// (tokenized, untagged): it must not panic, and every finding must lie
// inside the text with a position of at least line 1, column 1. Every word
// is taken for a word no lexicon knows, so that the misspelling pass runs
// wherever a word is one edit from a term's.
func FuzzCheck(f *testing.F) {
	f.Add("Check the **setpoint** of the `magnet valve`.\n<!-- glossmith:skip-next-line -->\nA magnet valve.\n", "md")
	f.Add("<p>The <code>setpoint</code> &amp; the magnet&nbsp;valve</p><pre>set point</pre>", "html")
	f.Add("See [magnet valve](x) and &#x41; \\*setpoint\\* ``a ` b``\r\n", "md")
	f.Add("glossmith:skip-next-line\n\nset-point /etc/set point.conf set–point\n", "txt")
	f.Add("The solenoid vavle, the set-piont and both solenoid vavles; `magnet vavle`.\n", "md")
	f.Add("# Replacing the Solenoid Vavle\n\nMagnte valves. SOLENOID VAVLE\nThe Magnte crew; the MAGNTE board.\n", "md")
	f.Add("<h2>SOLENOID <b>VAVLE</b></h2><p>Set-Piont: Magnte valve</p>", "html")
	// UTF-16 LE
	f.Add("\xff\xfe<\x00p\x00>\x00<\x00c\x00o\x00d\x00e\x00>\x00P\x00L\x00C\x00<\x00/\x00c\x00o\x00d\x00e\x00>\x00 \x00P\x00L\x00C\x00", "html")
	// UTF-16 BE, cut off in a surrogate pair
	f.Add("\xfe\xff\x00<\x00!\x00-\x00-\x00 \x00g\x00l\x00o\x00s\x00s\x00m\x00i\x00t\x00h\x00:\x00s\x00k\x00i\x00p\x00-\x00n\x00e\x00x\x00t\x00-\x00l\x00i\x00n\x00e\x00-\x00-\x00>\x00\n\x00P\x00L\x00C\xd8\x35", "html")
	m, ms := fuzzGlossary()
	dir := f.TempDir()
	f.Fuzz(func(t *testing.T, src, format string) {
		switch format {
		case "md", "html", "txt":
		default:
			return
		}
		path := filepath.Join(dir, "fuzz."+format)
		if err := os.WriteFile(path, []byte(src), 0o644); err != nil {
			t.Fatal(err)
		}
		d, _ := read.Read(read.Input{Name: path, Path: path}, read.Options{Format: format})
		if d == nil {
			return
		}
		tokenize.Document(d)
		res := Check(d, []byte(src), Options{Glossary: m, Misspellings: ms})
		for _, fd := range res.Findings {
			if fd.Line < 1 || fd.Column < 1 || fd.EndLine < fd.Line || fd.Start < 0 || fd.End > len(d.Text) || !utf8.ValidString(fd.Text) {
				t.Fatalf("finding out of range: %+v", fd)
			}
		}
	})
}

// fuzzGlossary is the fuzz targets' glossary, compiled, and its
// misspellings for a lexicon that knows no word, so that the misspelling
// pass runs wherever a word is one edit from a term's.
func fuzzGlossary() (*Matcher, *Misspellings) {
	m := Compile(Glossary{Entries: []Entry{
		{ID: "1", Forms: []Form{{Text: "set point"}, {Text: "setpoint", Status: Deprecated}}},
		{ID: "2", Forms: []Form{{Text: "solenoid valve"}, {Text: "magnet valve", Status: Forbidden}}},
		{ID: "3", Forms: []Form{{Text: "PLC", CaseSensitive: true}}},
	}})
	return m, NewMisspellings(m, noWordKnown{})
}

// noWordKnown is a lexicon that knows no word.
type noWordKnown struct{}

func (noWordKnown) UnknownWord(string) bool { return true }
