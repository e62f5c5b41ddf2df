package tokenize

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
	"unicode"
	"unicode/utf8"

	"glossmith/internal/testenv"
	"glossmith/tagger/conllu"
	"glossmith/tagger/doc"
)

// This file scores the tokenizer against the gold segmentation of the UD
// English Web Treebank 2.15 (../shared/data/ud-en-ewt, CC BY-SA 4.0) with
// the method of the CoNLL 2018 shared task on UD parsing (Zeman et al.
// 2018, "CoNLL 2018 Shared Task: Multilingual Parsing from Raw Text to
// Universal Dependencies", section 4.1): tokens, words and sentences are
// character spans over the text with all white space removed, and F1
// counts the spans that match exactly. "Tokens" are surface tokens (a
// multiword token such as "don't" is one span); "words" are syntactic
// words ("do" + "n't"; in EWT their forms spell the surface token exactly,
// so they have spans of their own).

// span is a [start, end) range of non-space characters.
type span struct{ start, end int }

// goldText is a treebank file rebuilt as raw text, with its gold spans.
type goldText struct {
	text                 string
	tokens, words, sents []span
	nonSpace             int // number of non-space characters
}

// readGold rebuilds the raw text of a CoNLL-U file from its "# text"
// lines: the sentences of a paragraph joined by a space, a blank line at
// "# newpar" and "# newdoc".
// goldSentences reads a treebank file whole.
func goldSentences(t testing.TB, path string) []*conllu.Sentence {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	sents, err := conllu.ReadAll(f, filepath.Base(path))
	if err != nil {
		t.Fatal(err)
	}
	return sents
}

func readGold(t testing.TB, path string) goldText {
	t.Helper()
	var (
		g   goldText
		b   strings.Builder
		pos int // non-space characters so far
	)
	for _, s := range goldSentences(t, path) {
		if b.Len() > 0 {
			if s.NewPar || s.NewDoc {
				b.WriteString("\n\n")
			} else {
				b.WriteString(" ")
			}
		}
		b.WriteString(s.Text)
		if countNonSpace(s.Text) != countWordChars(s.Tokens) {
			t.Fatalf("%s line %d: # text and the word forms differ in their characters", path, s.Line)
		}
		sentStart, tokStart := pos, pos
		for _, w := range s.Tokens {
			n := countNonSpace(w.Form)
			g.words = append(g.words, span{pos, pos + n})
			pos += n
			if !w.FusedNext {
				g.tokens = append(g.tokens, span{tokStart, pos})
				tokStart = pos
			}
		}
		g.sents = append(g.sents, span{sentStart, pos})
	}
	g.text = b.String()
	g.nonSpace = pos
	return g
}

func countNonSpace(s string) int {
	n := 0
	for _, r := range s {
		if !unicode.IsSpace(r) {
			n++
		}
	}
	return n
}

func countWordChars(ws []doc.Token) int {
	n := 0
	for _, w := range ws {
		n += countNonSpace(w.Form)
	}
	return n
}

// systemSpans converts tokenizer output to spans over the non-space
// characters of text.
func systemSpans(text string, sents []doc.Sentence) (tokens, words, ss []span, nonSpace int) {
	// at[b] is the number of non-space characters before byte b.
	at := make([]int, len(text)+1)
	n := 0
	for i := 0; i < len(text); {
		r, size := utf8.DecodeRuneInString(text[i:])
		for k := 0; k < size; k++ {
			at[i+k] = n
		}
		if !unicode.IsSpace(r) {
			n++
		}
		i += size
	}
	at[len(text)] = n
	for _, s := range sents {
		tokStart := -1
		for _, tk := range s.Tokens {
			words = append(words, span{at[tk.Start], at[tk.End]})
			if tokStart < 0 {
				tokStart = at[tk.Start]
			}
			if !tk.FusedNext {
				tokens = append(tokens, span{tokStart, at[tk.End]})
				tokStart = -1
			}
		}
		if len(s.Tokens) > 0 {
			ss = append(ss, span{at[s.Start()], at[s.End()]})
		}
	}
	return tokens, words, ss, n
}

// f1 returns the F1 score of the system spans against the gold spans.
func f1(gold, sys []span) float64 {
	in := make(map[span]bool, len(gold))
	for _, s := range gold {
		in[s] = true
	}
	match := 0
	for _, s := range sys {
		if in[s] {
			match++
		}
	}
	if match == 0 {
		return 0
	}
	p := float64(match) / float64(len(sys))
	r := float64(match) / float64(len(gold))
	return 2 * p * r / (p + r)
}

type scores struct{ tokens, words, sents float64 }

func evaluate(t testing.TB, path string) scores {
	t.Helper()
	g := readGold(t, path)
	sents := Sentences(g.text)
	tokens, words, ss, n := systemSpans(g.text, sents)
	if n != g.nonSpace {
		t.Fatalf("%s: rebuilt text has %d non-space characters, gold %d", path, n, g.nonSpace)
	}
	return scores{f1(g.tokens, tokens), f1(g.words, words), f1(g.sents, ss)}
}

// TestEWTSegmentation checks the targets on the EWT test file and logs the
// dev and test figures (tuning was done on dev only).
func TestEWTSegmentation(t *testing.T) {
	dir := testenv.SharedDir(t, "data/ud-en-ewt")
	dev := evaluate(t, filepath.Join(dir, "en_ewt-ud-dev.conllu"))
	test := evaluate(t, filepath.Join(dir, "en_ewt-ud-test.conllu"))
	t.Logf("EWT 2.15 dev:  tokens F1 %.4f  words F1 %.4f  sentences F1 %.4f", dev.tokens, dev.words, dev.sents)
	t.Logf("EWT 2.15 test: tokens F1 %.4f  words F1 %.4f  sentences F1 %.4f", test.tokens, test.words, test.sents)
	// Targets set in the project's issue: a naive full-stop-and-capital
	// rule on gold tokens reaches a sentence F1 of 0.76 on this file.
	if test.tokens < 0.985 {
		t.Errorf("test token F1 %.4f, want >= 0.985", test.tokens)
	}
	if test.sents < 0.78 {
		t.Errorf("test sentence F1 %.4f, want >= 0.78", test.sents)
	}
}

// TestEWTRoundTrip checks on the whole EWT test text that the tokens and the
// white space between them give the text back exactly.
func TestEWTRoundTrip(t *testing.T) {
	dir := testenv.SharedDir(t, "data/ud-en-ewt")
	g := readGold(t, filepath.Join(dir, "en_ewt-ud-test.conllu"))
	d := &doc.Document{Name: "en_ewt-ud-test", Text: g.text}
	Document(d)
	if err := checkRoundTrip(d.Text, d.Sentences); err != "" {
		t.Fatal(err)
	}
}

// wrapLines hard-wraps every paragraph of text at width bytes, as plain
// text files often are, and one-per-line puts each gold sentence on a line.
func wrapLines(text string, width int) string {
	var b strings.Builder
	for p, par := range strings.Split(text, "\n\n") {
		if p > 0 {
			b.WriteString("\n\n")
		}
		col := 0
		for w, word := range strings.Fields(par) {
			if w > 0 {
				if col+1+len(word) > width {
					b.WriteString("\n")
					col = 0
				} else {
					b.WriteString(" ")
					col++
				}
			}
			b.WriteString(word)
			col += len(word)
		}
	}
	return b.String()
}

// TestEWTLineBreaks measures the heading rule (a line break after a short
// line without final punctuation ends a sentence) on the EWT dev text in
// two layouts the plain rebuild lacks: hard-wrapped at 72 columns, where
// the rule must not cut sentences at wrapped lines, and one sentence per
// line, where it should find the sentences that end without punctuation.
// It fails when the rule costs more than 0.005 on wrapped text.
func TestEWTLineBreaks(t *testing.T) {
	dir := testenv.SharedDir(t, "data/ud-en-ewt")
	g := readGold(t, filepath.Join(dir, "en_ewt-ud-dev.conllu"))
	perLine := perLineText(t, filepath.Join(dir, "en_ewt-ud-dev.conllu"))
	layouts := []struct{ name, text string }{
		{"wrapped at 72", wrapLines(g.text, 72)},
		{"wrapped at 50", wrapLines(g.text, 50)},
		{"one sentence per line", perLine},
	}
	defer func() { headingBreaks = true }()
	for _, l := range layouts {
		var f [2]float64
		for i, on := range []bool{false, true} {
			headingBreaks = on
			_, _, ss, n := systemSpans(l.text, Sentences(l.text))
			if n != g.nonSpace {
				t.Fatalf("%s: %d non-space characters, gold %d", l.name, n, g.nonSpace)
			}
			f[i] = f1(g.sents, ss)
		}
		t.Logf("EWT dev %s: sentence F1 %.4f without the heading rule, %.4f with it", l.name, f[0], f[1])
		if strings.HasPrefix(l.name, "wrapped") && f[1] < f[0]-0.005 {
			t.Errorf("heading rule costs %.4f sentence F1 on hard-wrapped text", f[0]-f[1])
		}
	}
}

// perLineText rebuilds a treebank file with one sentence per line and a
// blank line between paragraphs.
func perLineText(t *testing.T, path string) string {
	var b strings.Builder
	for _, s := range goldSentences(t, path) {
		if b.Len() > 0 {
			b.WriteString("\n")
			if s.NewPar || s.NewDoc {
				b.WriteString("\n")
			}
		}
		b.WriteString(s.Text)
	}
	return b.String()
}

// TestEWTNaiveBaseline scores, for comparison, a naive splitter on the gold
// tokens of the EWT test file: a sentence ends at a paragraph break or
// after ".", "!" or "?" followed by a capital. The project's issue quotes
// 0.76 for such a rule; our splitter, which starts from raw text, must beat
// it.
func TestEWTNaiveBaseline(t *testing.T) {
	dir := testenv.SharedDir(t, "data/ud-en-ewt")
	path := filepath.Join(dir, "en_ewt-ud-test.conllu")
	type word struct {
		form   string
		newPar bool // first word of a paragraph
	}
	var (
		words []word
		gold  []span
		pos   int
	)
	for _, s := range goldSentences(t, path) {
		start := pos
		for i, w := range s.Tokens {
			words = append(words, word{w.Form, i == 0 && (s.NewPar || s.NewDoc)})
			pos += countNonSpace(w.Form)
		}
		gold = append(gold, span{start, pos})
	}
	var naive []span
	start, pos := 0, 0
	for i, w := range words {
		if i > 0 && w.newPar && pos > start {
			naive = append(naive, span{start, pos})
			start = pos
		}
		pos += countNonSpace(w.form)
		stop := w.form == "." || w.form == "!" || w.form == "?"
		if stop && i+1 < len(words) && startsUpper(words[i+1].form) {
			naive = append(naive, span{start, pos})
			start = pos
		}
	}
	naive = append(naive, span{start, pos})
	base := f1(gold, naive)
	ours := evaluate(t, path).sents
	t.Logf("EWT 2.15 test sentences F1: naive rule on gold tokens %.4f, tokenize on raw text %.4f", base, ours)
	if ours <= base {
		t.Errorf("sentence F1 %.4f does not beat the naive baseline %.4f", ours, base)
	}
}
