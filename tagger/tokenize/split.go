package tokenize

import (
	"slices"
	"unicode"
	"unicode/utf8"

	"glossmith/tagger/doc"
)

// Line breaks inside a paragraph. A single line break ends a sentence
// when the line looks like a heading (at most headingMaxTokens tokens) or
// when it ended early: the next line's first word would have fitted within
// the text's wrap width, estimated as the wrapPercentile-th percentile of
// its line lengths. Tuned on EWT dev (TestEWTLineBreaks logs the figures):
// with these values the rule costs little on text hard-wrapped at 72 or
// 50 columns (sentence F1 0.8654 and 0.8653, against 0.8657 and 0.8664
// without it) and helps on text with one sentence per line (0.9162
// against 0.8664).
// Counting lines of up to 8 tokens as headings cost 0.017 at 50 columns;
// the maximum line length instead of a percentile cost 0.08 at 72.
const (
	headingMaxTokens = 4
	wrapPercentile   = 95
)

// headingBreaks switches the heading rule on; tests switch it off to
// measure what it does.
var headingBreaks = true

// split groups the scanned tokens into sentences. It cuts the period off an
// abbreviation that ends a sentence ("etc." -> "etc" + "."), as EWT does,
// so it may add tokens; it does so in place, in the scanner's array, and
// the sentences' token slices share that one backing array.
func (t *tokenizer) split() []doc.Sentence {
	toks := t.toks
	n := len(toks)
	if n == 0 {
		return nil
	}
	// First decide, left to right, where sentences end and which
	// abbreviation periods are cut off (both in input token indices).
	var (
		ends      []int  // exclusive end of each sentence
		pars      []bool // NewPar per sentence
		cuts      []int  // abbreviation tokens whose period becomes a token
		last      = 0    // end of the last sentence
		newPar    = true
		lineStart = 0
	)
	closeAt := func(end int) {
		if end > last {
			ends = append(ends, end)
			pars = append(pars, newPar)
			last = end
			newPar = false
		}
	}
	for k := 0; k < n; k++ {
		if k > 0 && t.breaks[k] != breakNone {
			switch {
			case t.breaks[k] == breakPar:
				closeAt(k)
				newPar = true
			case headingBreaks && t.headingBreak(lineStart, k):
				closeAt(k)
				newPar = true
			}
			lineStart = k
		}
		form := toks[k].Form
		switch {
		case isAbbrevToken(form):
			endsPar := k+1 == n || t.breaks[k+1] == breakPar
			if endsPar || startsUpper(toks[k+1].Form) && abbrevMayEnd(form) {
				cuts = append(cuts, k)
				closeAt(k + 1)
			}
		case isTerminal(form):
			stop := k
			for k+1 < n && t.breaks[k+1] == breakNone && isCloser(toks[k+1].Form, toks[k].SpaceAfter) {
				k++
			}
			// After a closing quote a lower-case word goes on the sentence:
			// "Stop!" he said.
			quoted := k > stop && isQuote(toks[k].Form)
			if k+1 == n || startsUpper(toks[k+1].Form) || strongStop(form) && !(quoted && startsLower(toks[k+1].Form)) {
				closeAt(k + 1)
			}
		case isEmoticon(form):
			if k+1 < n && startsUpper(toks[k+1].Form) {
				closeAt(k + 1)
			}
		}
	}
	closeAt(n)

	// Then cut the periods, moving tokens right from the back.
	if m := len(cuts); m > 0 {
		toks = append(toks, make([]doc.Token, m)...)
		ci, dst := m-1, n+m-1
		// Tokens before the first cut stay where they are.
		for k := n - 1; ci >= 0; k-- {
			tk := toks[k]
			if cuts[ci] == k {
				stop := tk
				stop.Form = tk.Form[len(tk.Form)-1:]
				stop.Start = tk.End - 1
				tk.Form = tk.Form[:len(tk.Form)-1]
				tk.End--
				tk.SpaceAfter = false
				toks[dst] = stop
				dst--
				ci--
			}
			toks[dst] = tk
			dst--
		}
		// Shift the sentence ends by the cuts before them.
		ci = 0
		for s, e := range ends {
			for ci < m && cuts[ci] < e {
				ci++
			}
			ends[s] = e + ci
		}
	}

	sents := make([]doc.Sentence, len(ends))
	start := 0
	for s, e := range ends {
		sents[s] = doc.Sentence{Index: s, Tokens: toks[start:e:e], NewPar: pars[s]}
		start = e
	}
	return sents
}

// headingBreak reports whether the single line break before token k ends
// a sentence. The line toks[ls:k] must end in a word or closing bracket
// and the next line start with a capital or digit, and then either the line
// is short (a heading: at most headingMaxTokens tokens, starting with a
// capital or digit) or it ended early: the next line's first word would
// have fitted on it, so the break was not made by hard wrapping. A line
// starting with a bullet always starts a sentence.
func (t *tokenizer) headingBreak(ls, k int) bool {
	prev, next := t.toks[k-1].Form, t.toks[k].Form
	if isBullet(next) {
		return true
	}
	r := lastRune(prev)
	if !isWord(r) && r != ')' && r != ']' && r != '"' && r != '”' {
		return false // ends in a comma, colon, hyphen, …
	}
	if n := firstRune(next); !unicode.IsUpper(n) && !isDigit(n) {
		return false
	}
	if k-ls <= headingMaxTokens {
		first := firstRune(t.toks[ls].Form)
		if unicode.IsUpper(first) || isDigit(first) || isBullet(t.toks[ls].Form) {
			return true
		}
	}
	if t.wrapWidth == 0 {
		t.wrapWidth = wrapWidth(t.lineLens)
	}
	text := t.text
	lineLen := utf8.RuneCountInString(text[t.toks[ls].Start:t.toks[k-1].End])
	word := int(t.toks[k].Start)
	for word < len(text) && (text[word] >= utf8.RuneSelf || !asciiSpace[text[word]]) {
		word++ // the next line's first chunk (up to ASCII white space suffices here)
	}
	wordLen := utf8.RuneCountInString(text[t.toks[k].Start:word])
	return lineLen+1+wordLen <= t.wrapWidth
}

// wrapWidth estimates the width at which the text is hard-wrapped: the
// wrapPercentile-th percentile of the lengths of lines that end in a single
// line break (a percentile, so that one long URL line does not count).
func wrapWidth(lens []int) int {
	if len(lens) == 0 {
		return 1
	}
	s := slices.Clone(lens)
	slices.Sort(s)
	return max(1, s[(len(s)-1)*wrapPercentile/100])
}

func firstRune(s string) rune {
	if s == "" {
		return 0
	}
	r, _ := decode(s, 0)
	return r
}

func lastRune(s string) rune {
	if s == "" {
		return 0
	}
	r, _ := decodeLast(s, len(s))
	return r
}

func startsUpper(s string) bool { return unicode.IsUpper(firstRune(s)) }

func startsLower(s string) bool { return unicode.IsLower(firstRune(s)) }

func isQuote(s string) bool {
	switch s {
	case `"`, "'", "''", "”", "’", "»":
		return true
	}
	return false
}

func isBullet(s string) bool {
	switch s {
	case "•", "-", "*", "–", "·", "‣", "◦", "▪", "■", "○", "●":
		return true
	}
	return false
}

// isAbbrevToken reports whether a token is a word with an attached
// abbreviation period (the scanner attaches a period only to those).
func isAbbrevToken(s string) bool {
	return len(s) > 1 && s[len(s)-1] == '.' && isWord(firstRune(s))
}

func abbrevMayEnd(s string) bool {
	if r, n := decode(s, 0); n == len(s)-1 && isLetter(r) {
		return false // an initial
	}
	if a, ok := abbrevs[s]; ok {
		return a.mayEnd
	}
	return false // "J.M.", "a.k.a."
}

func isEmoticon(s string) bool {
	switch s[0] {
	case ':', ';', '=', '^', '<':
	default:
		return false
	}
	for _, e := range emoticons {
		if s == e {
			return true
		}
	}
	return false
}

// isTerminal reports whether a token is sentence-final punctuation: a run
// of full stops, question and exclamation marks, or an ellipsis.
func isTerminal(s string) bool {
	switch s[0] {
	case '.', '!', '?':
		return true
	}
	return len(s) >= 3 && s[:3] == "…"
}

// strongStop reports whether a terminal ends a sentence whatever follows:
// a single full stop, or a run with ! or ?. An ellipsis ("...", "…") ends
// one only before a capital. Measured on EWT 2.15 dev (gold tokens): "."
// before a lower-case word ended the sentence in all 92 cases, "..." before
// a lower-case word in 1 of 32.
func strongStop(s string) bool {
	if s == "." {
		return true
	}
	for k := 0; k < len(s); k++ {
		if s[k] == '!' || s[k] == '?' {
			return true
		}
	}
	return false
}

// isCloser reports whether a token closes a quotation or bracket and so
// belongs to the sentence ending just before it. A straight quote counts
// only when written against the full stop.
func isCloser(s string, spaceBefore bool) bool {
	if isEmoticon(s) {
		return true
	}
	switch s {
	case ")", "]", "}", "”", "’", "»", "''":
		return true
	case `"`, "'":
		return !spaceBefore
	}
	return false
}
