package read

import (
	"bytes"
	"strings"
	"testing"
	"unicode/utf8"

	"glossmith/internal/docxtest"
	"glossmith/tagger/doc"
)

// fuzzRead reads data as format through Read (standard input route) and
// checks what must hold for any input: no panic, valid UTF-8 text, and
// problem lines within the input.
func fuzzRead(t *testing.T, format string, data []byte) *doc.Document {
	in := Input{Name: "fuzz", Path: "-"}
	d, ps := Read(in, Options{Format: format, Stdin: bytes.NewReader(data)})
	maxLine := bytes.Count(data, []byte("\n")) + bytes.Count(data, []byte("\r")) + 1
	for _, p := range ps {
		if p.Line != 0 && (p.Line < 1 || p.Line > maxLine+1) {
			t.Fatalf("problem line %d outside 1..%d: %v", p.Line, maxLine+1, p)
		}
		if p.File != "fuzz" || p.Msg == "" {
			t.Fatalf("bad problem %#v", p)
		}
	}
	if d == nil {
		return nil
	}
	if !utf8.ValidString(d.Text) {
		t.Fatalf("text is not valid UTF-8: %q", d.Text)
	}
	if d.Format != format || d.Name != "fuzz" {
		t.Fatalf("format %q name %q", d.Format, d.Name)
	}
	lines := int32(strings.Count(d.Text, "\n") + 1)
	for i, h := range d.Headings {
		if h.First < 1 || h.First > h.Last || h.Last > lines || i > 0 && h.First <= d.Headings[i-1].Last {
			t.Fatalf("heading lines %v out of order or outside 1..%d: %v", h, lines, d.Headings)
		}
	}
	return d
}

// plainUTF8 reports whether data is UTF-8 without a byte order mark, for
// which the text's lines can be counted against the input's.
func plainUTF8(data []byte) bool {
	return utf8.Valid(data) && !bytes.HasPrefix(data, bomUTF8) && !bytes.HasPrefix(data, bomUTF16LE) && !bytes.HasPrefix(data, bomUTF16BE)
}

func FuzzText(f *testing.F) {
	f.Add([]byte("Line one.\r\nLine two.\n"))
	f.Add([]byte("\xEF\xBB\xBFbom"))
	f.Add([]byte{0xFF, 0xFE, 'a', 0, '\n', 0, 0x00, 0xD8, 'b'})
	f.Add([]byte{0xFE, 0xFF, 0, 'a', 0xD8, 0x3D, 0xDE, 0x00, 0})
	f.Add([]byte("bad \xC3\x28 and \xFF\n\xE2\x82"))
	f.Fuzz(func(t *testing.T, data []byte) {
		d := fuzzRead(t, FormatText, data)
		if d != nil && plainUTF8(data) && !bytes.Contains(data, []byte{0}) {
			if got, want := strings.Count(d.Text, "\n"), strings.Count(normalizeNewlines(string(data)), "\n"); got != want {
				t.Fatalf("text has %d line breaks, input %d", got, want)
			}
		}
	})
}

func FuzzMarkdown(f *testing.F) {
	f.Add([]byte("---\ntitle: x\n---\n# Heading *x*\n\nText with [a link](u) and `code`.\n- item\n| a | b |\n|---|---|\n| c | d |\n```\ncode\n```\n"))
	f.Add([]byte("> quote <!-- c\n--> ![alt](i.png) **b** _i_ ~~s~~ \\* &amp; [^1]\n[^1]: note\n[r]: /x\n[r] [t][r]"))
	f.Add([]byte("    code\n\n1. one\n   2) two\n<script>\nx\n</script>\nSetext\n===\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		d := fuzzRead(t, FormatMarkdown, data)
		if d != nil && plainUTF8(data) {
			if got, want := strings.Count(d.Text, "\n"), strings.Count(normalizeNewlines(string(data)), "\n"); got != want {
				t.Fatalf("markdown text has %d line breaks, input %d", got, want)
			}
		}
	})
}

func FuzzHTML(f *testing.F) {
	f.Add([]byte("<!DOCTYPE html><html><head><title>T</title></head><body><h1>H</h1><p>A &amp; B<br>C</p><pre> x\n y</pre><table><tr><td>1</td></tr></table></body></html>"))
	f.Add([]byte("<div hidden><p>x<div>y</div></div><script>a<b</script><p style='display:none'>z"))
	f.Add([]byte("<svg><svg></svg><p>q</svg>text</br><head><p>"))
	f.Fuzz(func(t *testing.T, data []byte) {
		d := fuzzRead(t, FormatHTML, data)
		if d != nil && strings.Contains(d.Text, "\n\n\n") && !strings.Contains(string(data), "pre") && !strings.Contains(string(data), "PRE") {
			t.Fatalf("more than one blank line between paragraphs outside <pre>: %q", d.Text)
		}
	})
}

func FuzzDocx(f *testing.F) {
	body := `<w:p><w:r><w:t>Solenoid valve</w:t><w:tab/><w:br/></w:r></w:p><w:p><mc:AlternateContent><mc:Choice/><mc:Fallback><w:p><w:t>x</w:t></w:p></mc:Fallback></mc:AlternateContent></w:p>`
	f.Add(docxtest.Zip(f, docxtest.Files(body)...))
	f.Add(docxtest.Zip(f, "word/document.xml", "<w:p><w:t>x"))
	f.Add(docxtest.Zip(f, "a.txt", "hello"))
	f.Add([]byte("PK\x03\x04"))
	f.Fuzz(func(t *testing.T, data []byte) {
		fuzzRead(t, FormatDocx, data)
	})
}

func FuzzConllu(f *testing.F) {
	f.Add([]byte("# sent_id = 1\n# text = The valve opens.\n1\tThe\tthe\tDET\tDT\t_\t_\t_\t_\t_\n2\tvalve\t_\t_\t_\t_\t_\t_\t_\t_\n3\topens\t_\t_\t_\t_\t_\t_\t_\tSpaceAfter=No\n4\t.\t_\t_\t_\t_\t_\t_\t_\t_\n\n"))
	f.Add([]byte("1-2\tdon't\t_\t_\t_\t_\t_\t_\t_\t_\n1\tdo\t_\t_\t_\t_\t_\t_\t_\t_\n2\tn't\t_\t_\t_\t_\t_\t_\t_\t_\n2.1\tx\t_\t_\t_\t_\t_\t_\t_\t_\n\n# newpar\n1\tx\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		d := fuzzRead(t, FormatConllu, data)
		if d == nil {
			return
		}
		if !d.Pretokenized {
			t.Fatal("CoNLL-U document not marked pretokenized")
		}
		maxLine := bytes.Count(data, []byte("\n")) + 1
		for _, s := range d.Sentences {
			for _, tok := range s.Tokens {
				if tok.Start < 0 || tok.End < tok.Start || int(tok.End) > len(d.Text) {
					t.Fatalf("token %q offsets %d..%d outside text of %d bytes", tok.Form, tok.Start, tok.End, len(d.Text))
				}
				if tok.Line < 1 || int(tok.Line) > maxLine {
					t.Fatalf("token %q line %d outside 1..%d", tok.Form, tok.Line, maxLine)
				}
			}
		}
	})
}
