// Package tokenize splits English text into sentences of tokens following
// the conventions of the Universal Dependencies English Web Treebank (EWT):
// punctuation apart from words, clitics as words of their own ("don't" =
// "do" + "n't", written as one orthographic word, see doc.Token.FusedNext),
// most hyphenated compounds split at the hyphen ("search - engine") but
// prefixes kept ("e-mail"), numbers, URLs, e-mail addresses, emoticons and
// abbreviations ("Dr.", "U.S.") kept whole.
//
// The tokenizer is a hand-written scanner over the bytes of the text; it
// never drops or adds a character: every non-space character belongs to
// exactly one token, and Form is always Text[Start:End].
//
// Sentences end at full stops, question and exclamation marks (and the
// quotes and brackets right after them), at blank lines, and at line breaks
// that were not made by hard wrapping: after a heading, before a bullet,
// after a line that stops short of the text's wrap width. Abbreviations and
// whether they may end a sentence are learned from the EWT training data
// (abbrev.txt, made by internal/mkabbrev).
package tokenize

import (
	"unicode"
	"unicode/utf8"

	"glossmith/tagger/doc"
)

// Document fills d.Sentences from d.Text, unless the document came
// pretokenized (CoNLL-U), whose sentences are kept as given.
func Document(d *doc.Document) {
	if d.Pretokenized {
		return
	}
	d.Sentences = Sentences(d.Text)
	markHeadings(d.Sentences, d.Headings)
}

// DocumentReusing is Document with the token array buf (from an earlier
// call; its contents do not matter) reused when it is large enough. It
// returns the array the tokens are in (buf itself when the document came
// pretokenized), for the caller to pass to a later call once nothing
// refers to this document's tokens any more. Reusing the array spares
// the allocation, zeroing and collection of some 15 bytes per byte of
// text (at 96 bytes a token, 40% of all the memory a `terms` run
// allocated).
func DocumentReusing(d *doc.Document, buf []doc.Token) []doc.Token {
	if d.Pretokenized {
		return buf[:0]
	}
	t := tokenizer{text: d.Text, toks: buf[:0]}
	t.scan()
	d.Sentences = t.split()
	markHeadings(d.Sentences, d.Headings)
	return t.toks[:0]
}

// markHeadings sets Heading on the sentences that lie wholly inside one
// of the line ranges (sorted, as readers give them). The readers end a
// paragraph before and after a heading, so a sentence is either in one
// or outside all; one that is not wholly inside is left unmarked.
func markHeadings(sents []doc.Sentence, heads []doc.LineRange) {
	h := 0
	for i := range sents {
		s := &sents[i]
		if len(s.Tokens) == 0 {
			continue
		}
		first, last := s.Tokens[0].Line, s.Tokens[len(s.Tokens)-1].Line
		for h < len(heads) && heads[h].Last < first {
			h++
		}
		if h == len(heads) {
			return
		}
		s.Heading = heads[h].First <= first && last <= heads[h].Last
	}
}

// Sentences tokenizes text and splits it into sentences. Token offsets are
// byte offsets into text; Line is the 1-based line of the token.
func Sentences(text string) []doc.Sentence {
	t := tokenizer{text: text}
	t.scan()
	return t.split()
}

// Break kinds recorded for the first token after white space that holds
// line breaks.
const (
	breakNone = iota
	breakLine // one line break
	breakPar  // a blank line, or the start of the text
)

type tokenizer struct {
	text   string
	toks   []doc.Token
	breaks []uint8 // per token: the break kind in the white space before it
	line   int
	// chunkEnd is the end of the white-space-delimited chunk being split.
	chunkEnd int
	// lineLens holds the length in characters of each line that ends in a
	// single line break, for estimating the width of hard-wrapped text.
	lineLens []int
	// wrapWidth is computed from lineLens when first needed.
	wrapWidth int
	// digits remembers the last decision of keepDigits: for the word
	// starting at start-1 (0: none yet), with separator sep, valid for
	// separators before end.
	digits struct {
		start, end int
		sep        byte
		keep       bool
	}
}

// scan cuts the text into tokens.
func (t *tokenizer) scan() {
	if len(t.text) > doc.MaxText { // offsets are 32-bit; readers refuse such texts
		end := doc.MaxText
		for end > 0 && !utf8.RuneStart(t.text[end]) {
			end--
		}
		t.text = t.text[:end]
	}
	text := t.text
	// English text runs at 5 to 6 bytes a token; the slack leaves room for
	// the periods that split may cut off abbreviations without a copy.
	est := len(text)/5 + 4
	if cap(t.toks) < est+est/32 {
		t.toks = make([]doc.Token, 0, est+est/32)
	}
	t.breaks = make([]uint8, 0, est)
	t.line = 1
	newlines := 2 // the start of the text opens a paragraph
	lineStart, lineEnd := 0, 0
	i := 0
	for i < len(text) {
		c := text[i]
		if c < utf8.RuneSelf {
			if asciiSpace[c] {
				if c == '\n' {
					t.line++
					newlines++
				}
				i++
				continue
			}
		} else if r, n := utf8.DecodeRuneInString(text[i:]); unicode.IsSpace(r) {
			// U+2029 PARAGRAPH SEPARATOR and U+2028 LINE SEPARATOR mark
			// breaks without a new line in the source; the Markdown reader
			// uses the first to end blocks (list items, table cells) while
			// keeping every token on its source line.
			switch r {
			case '\u2029':
				newlines = max(newlines, 2)
			case '\u2028':
				newlines = max(newlines, 1)
			}
			i += n
			continue
		}
		// A chunk: a run of characters without white space.
		j := i + 1
		for j < len(text) {
			c := text[j]
			if c < utf8.RuneSelf {
				if asciiSpace[c] {
					break
				}
				j++
				continue
			}
			r, n := utf8.DecodeRuneInString(text[j:])
			if unicode.IsSpace(r) {
				break
			}
			j += n
		}
		if newlines == 1 {
			t.lineLens = append(t.lineLens, utf8.RuneCountInString(text[lineStart:lineEnd]))
		}
		if newlines > 0 {
			lineStart = i
		}
		lineEnd = j
		first := len(t.toks)
		t.chunkEnd = j
		t.chunk(i, j)
		brk := uint8(breakNone)
		switch {
		case newlines >= 2:
			brk = breakPar
		case newlines == 1:
			brk = breakLine
		}
		for k := first; k < len(t.toks); k++ {
			t.breaks = append(t.breaks, brk)
			brk = breakNone
		}
		newlines = 0
		i = j
	}
}

var asciiSpace = [utf8.RuneSelf]bool{' ': true, '\t': true, '\n': true, '\v': true, '\f': true, '\r': true}

// emit appends the token text[s:e]. It fills the fields of a slot in the
// array rather than copying a whole struct in, which spares the garbage
// collector's bulk write barrier on every token; the annotation fields
// are zero in a new array and cleared in a reused one.
func (t *tokenizer) emit(s, e int, fused bool) {
	n := len(t.toks)
	if n < cap(t.toks) {
		t.toks = t.toks[:n+1]
	} else {
		t.toks = append(t.toks, doc.Token{})
	}
	tk := &t.toks[n]
	tk.Form = t.text[s:e]
	tk.Start = int32(s)
	tk.End = int32(e)
	tk.Line = int32(t.line)
	tk.SpaceAfter = e == t.chunkEnd && e < len(t.text)
	tk.FusedNext = fused
	if tk.UPOS != "" || tk.Lemma != "" || tk.XPOS != "" { // a reused array
		tk.Lemma, tk.UPOS, tk.XPOS = "", "", ""
	}
}

// chunk splits text[s:e], a run without white space, into tokens.
func (t *tokenizer) chunk(s, e int) {
	i := s
	for i < e {
		if n := urlLen(t.text[i:e]); n > 0 {
			end := trimURL(t.text, i, i+n)
			t.emit(i, end, false)
			i = end
			continue
		}
		r, n := decode(t.text, i)
		if isWord(r) || (isApostrophe(r) && i+n < e && isDigitByte(t.text[i+n])) {
			i = t.word(i, e, s)
			continue
		}
		i = t.punct(i, e, r, n)
	}
}

func decode(s string, i int) (rune, int) {
	if c := s[i]; c < utf8.RuneSelf {
		return rune(c), 1
	}
	return utf8.DecodeRuneInString(s[i:])
}

// decodeLast returns the rune ending just before byte offset i.
func decodeLast(s string, i int) (rune, int) {
	if c := s[i-1]; c < utf8.RuneSelf {
		return rune(c), 1
	}
	return utf8.DecodeLastRuneInString(s[:i])
}

func isWord(r rune) bool {
	if r < utf8.RuneSelf {
		return asciiWord[r]
	}
	return unicode.IsLetter(r) || unicode.IsNumber(r) || unicode.IsMark(r)
}

func isLetter(r rune) bool {
	if r < utf8.RuneSelf {
		return 'a' <= r && r <= 'z' || 'A' <= r && r <= 'Z'
	}
	return unicode.IsLetter(r)
}

func isDigit(r rune) bool { return '0' <= r && r <= '9' }

func isDigitByte(c byte) bool { return '0' <= c && c <= '9' }

func isApostrophe(r rune) bool { return r == '\'' || r == '’' || r == '`' }

var asciiWord = func() (t [utf8.RuneSelf]bool) {
	for c := '0'; c <= '9'; c++ {
		t[c] = true
	}
	for c := 'a'; c <= 'z'; c++ {
		t[c] = true
		t[c-'a'+'A'] = true
	}
	t['_'] = true
	return
}()
