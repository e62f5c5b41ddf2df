package tokenize

import (
	"testing"
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
