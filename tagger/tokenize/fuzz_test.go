package tokenize

import (
	"testing"

	"glossmith/tagger/doc"
)

// FuzzTokenize checks the tokenizer's promises on arbitrary input: no
// panic, offsets inside the text, tokens in order and not overlapping,
// Form == Text[Start:End], only white space between tokens (so the text is
// rebuilt exactly), SpaceAfter and Line right. Run it with
//
//	go test -fuzz=FuzzTokenize ./tagger/tokenize
func FuzzTokenize(f *testing.F) {
	for _, tt := range tokenTests {
		f.Add(tt.in)
	}
	for _, s := range []string{
		"Don't over-tighten the VX-220's union nut (approx. 3 N·m).",
		"etc.", "U.S..", "Inc..", "a...@b.c", "x...@", "...@", "http://", "www.", "www.x",
		"http://example.com/a_(b)).", "mailto:a@b.c>", "':)'", ":-))", "^_^", "<3<3",
		"'90s", "'", "’", "`", "n't", "'s", "can't'", "parents''", "s'", "'s'",
		"1-2-3-", "1/2/", "1,", ",1", "1:2:", "12-", "-12", "1.2.3.", "5kg.", "5KG", "10MMx",
		"#", "##", "#a#b", "$$", "\u00a0\u2028\u2029\u0085", "\r\n\r\n", "\n\n\n",
		"A.\nB.", "Title\nText starts here.", "- a\n- b", "•\n•", "Kurz\nÜber 日本\n\u00a0x", "a\nB\nc\nD\nee ff\nG",
		"\xff\xfe", "a\xffb", "\xe2\x80", "e\u0301te\u0301", "日本語。テスト", "x·", "·x", "a&", "&a",
		"O'Brien's", "rock'n'roll", "y'all", "Mr.\"", "\"Stop.\" \"Go.\"", "(a.) (b.)", "…", "?!?!...",
		"a-", "-a", "e-", "non-", "co--op", "a‐b", "x@y@z.com", "a@", "@a", "Ph.D.", "a.b.c.d.e.f.g.h.i.j.k.l.m.n.o.p.",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, text string) {
		sents := Sentences(text)
		if err := checkRoundTrip(text, sents); err != "" {
			t.Fatalf("Sentences(%q): %s", text, err)
		}
	})
}

// FuzzDocumentReusing tokenizes two texts into one reused token array, the
// second after the first's tokens were marked as a tagger marks them, and
// requires the second's sentences to be those of a fresh array.
func FuzzDocumentReusing(f *testing.F) {
	f.Add("Open the valve approx. two turns. Then stop.", "e.g.")
	f.Add("a", "Dr. Smith's valve, i.e. the V-2, opens at 3 bar. It closes.\n\nNext.")
	f.Add("", "x")
	f.Fuzz(func(t *testing.T, first, second string) {
		d1 := &doc.Document{Text: first}
		buf := DocumentReusing(d1, nil)
		for s := range d1.Sentences {
			for k := range d1.Sentences[s].Tokens {
				tk := &d1.Sentences[s].Tokens[k]
				tk.Lemma, tk.UPOS, tk.XPOS = "x", "X", "XX"
			}
		}
		d2 := &doc.Document{Text: second}
		DocumentReusing(d2, buf)
		want := Sentences(second)
		if len(d2.Sentences) != len(want) {
			t.Fatalf("%q after %q: %d sentences, want %d", second, first, len(d2.Sentences), len(want))
		}
		for s := range want {
			g, w := d2.Sentences[s], want[s]
			if g.Index != w.Index || g.NewPar != w.NewPar || len(g.Tokens) != len(w.Tokens) {
				t.Fatalf("%q after %q: sentence %d is %+v, want %+v", second, first, s, g, w)
			}
			for k := range w.Tokens {
				if g.Tokens[k] != w.Tokens[k] {
					t.Fatalf("%q after %q: token %+v, want %+v", second, first, g.Tokens[k], w.Tokens[k])
				}
			}
		}
	})
}
