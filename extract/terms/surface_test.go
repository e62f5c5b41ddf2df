package terms

import (
	"math/rand/v2"
	"strings"
	"testing"

	"glossmith/tagger/doc"
	"glossmith/tagger/tokenize"
)

// scratch.surface finds most spans by a check made once per sentence; it
// must give every span of every sentence the very text appendSurface
// gives, whatever the white space, the letters and the byte offsets.
func TestSurfaceIsAppendSurface(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	pieces := []string{"valve", "Drip", "é", "Überdruck", "-", "‐", ".", ",", " ", "  ", "\t", "\n", "\u00a0",
		"\u2028", "\u3000", "\xff", "\xe2\x80", "°C", "x", "\x00", "’s"}
	var docs []*doc.Document
	for n := 0; n < 400; n++ {
		var b strings.Builder
		for k := rng.IntN(40); k > 0; k-- {
			b.WriteString(pieces[rng.IntN(len(pieces))])
			if rng.IntN(3) == 0 {
				b.WriteByte(' ')
			}
		}
		d := &doc.Document{Text: b.String()}
		tokenize.Document(d)
		docs = append(docs, d)
	}
	// Pretokenized text may come with offsets that do not follow the text.
	odd := &doc.Document{Text: "ab cd ef", Sentences: []doc.Sentence{{Tokens: []doc.Token{
		{Form: "ab", Start: 0, End: 2}, {Form: "cd", Start: 6, End: 8}, {Form: "ef", Start: 3, End: 5}}}}}
	short := &doc.Document{Text: "ab", Sentences: []doc.Sentence{{Tokens: []doc.Token{
		{Form: "ab", Start: 0, End: 2}, {Form: "cd", Start: 3, End: 5}}}}}
	// and with white space inside a token
	blank := &doc.Document{Text: "a\tb c  d", Sentences: []doc.Sentence{{Tokens: []doc.Token{
		{Form: "a\tb", Start: 0, End: 3}, {Form: "c", Start: 4, End: 5}, {Form: "d", Start: 7, End: 8}}}}}
	docs = append(docs, odd, short, blank)
	sc := &scratch{}
	spans := 0
	for _, d := range docs {
		sc.doc = d
		for _, s := range d.Sentences {
			sc.toks, sc.spans = s.Tokens, spansUnknown
			for i := range s.Tokens {
				for j := i + 1; j <= len(s.Tokens); j++ {
					want, _, _ := appendSurface(nil, d, s.Tokens[i:j])
					want = strings.Clone(want)
					if got, _ := sc.surface(i, j); got != want {
						t.Fatalf("%q, tokens [%d, %d): surface %q, appendSurface %q", d.Text, i, j, got, want)
					}
					spans++
				}
			}
		}
	}
	if spans < 10000 {
		t.Fatalf("only %d spans checked", spans)
	}
}
