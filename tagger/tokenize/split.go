package tokenize

import (
	"unicode"

	"glossmith/tagger/doc"
)

// headingMaxTokens is the longest line (in tokens) that may be taken for a
// heading when it lacks final punctuation and the next line starts with a
// capital. Longer lines are more likely hard-wrapped prose.
const headingMaxTokens = 10

// split groups the scanned tokens into sentences. It cuts the period off an
// abbreviation that ends a sentence ("etc." -> "etc" + "."), as EWT does,
// so it may add tokens.
func (t *tokenizer) split() []doc.Sentence {
	toks := t.toks
	n := len(toks)
	if n == 0 {
		return nil
	}
	// Without abbreviations no token is split, so the output can be written
	// over the input in place.
	out := toks[:0]
	if t.nAbbrev > 0 {
		out = make([]doc.Token, 0, n+t.nAbbrev)
	}
	var (
		starts    []int  // sentence start indices in out
		pars      []bool // NewPar per sentence
		sentStart = 0
		newPar    = true
		lineStart = 0
	)
	closeSentence := func() {
		if len(out) > sentStart {
			starts = append(starts, sentStart)
			pars = append(pars, newPar)
			sentStart = len(out)
			newPar = false
		}
	}
	for k := 0; k < n; k++ {
		if k > 0 && t.breaks[k] != breakNone {
			switch {
			case t.breaks[k] == breakPar:
				closeSentence()
				newPar = true
			case t.headingBreak(lineStart, k):
				closeSentence()
				newPar = true
			}
			lineStart = k
		}
		tk := toks[k]
		endsPar := k+1 == n || t.breaks[k+1] == breakPar
		switch {
		case isAbbrevToken(tk.Form):
			nextCap := !endsPar && startsUpper(toks[k+1].Form)
			if endsPar || nextCap && abbrevMayEnd(tk.Form) {
				// The sentence's full stop is written as its own token.
				word := tk
				word.Form = tk.Form[:len(tk.Form)-1]
				word.End--
				word.SpaceAfter = false
				stop := tk
				stop.Form = tk.Form[len(tk.Form)-1:]
				stop.Start = tk.End - 1
				out = append(out, word, stop)
				closeSentence()
				continue
			}
			out = append(out, tk)
		case isTerminal(tk.Form):
			out = append(out, tk)
			for k+1 < n && t.breaks[k+1] == breakNone && isCloser(toks[k+1].Form, toks[k].SpaceAfter) {
				k++
				out = append(out, toks[k])
			}
			if k+1 == n || strongStop(tk.Form) || startsUpper(toks[k+1].Form) {
				closeSentence()
			}
		case isEmoticon(tk.Form):
			out = append(out, tk)
			if k+1 < n && startsUpper(toks[k+1].Form) {
				closeSentence()
			}
		default:
			out = append(out, tk)
		}
	}
	closeSentence()

	sents := make([]doc.Sentence, len(starts))
	for s := range starts {
		end := len(out)
		if s+1 < len(starts) {
			end = starts[s+1]
		}
		sents[s] = doc.Sentence{Index: s, Tokens: out[starts[s]:end:end], NewPar: pars[s]}
	}
	return sents
}

// headingBreak reports whether the line break before token k ends a
// heading or list item: the line toks[ls:k] is short, starts with a capital
// or digit and lacks final punctuation, and the next line starts like a
// sentence; or the next line starts with a bullet.
func (t *tokenizer) headingBreak(ls, k int) bool {
	prev, next := t.toks[k-1].Form, t.toks[k].Form
	if isBullet(next) {
		return true
	}
	if k-ls > headingMaxTokens {
		return false
	}
	r := lastRune(prev)
	if !isWord(r) && r != ')' && r != ']' && r != '"' && r != '”' {
		return false // ends in a comma, colon, hyphen, …
	}
	first := firstRune(t.toks[ls].Form)
	startsLine := unicode.IsUpper(first) || isDigit(first) || isBullet(t.toks[ls].Form)
	n := firstRune(next)
	return startsLine && (unicode.IsUpper(n) || isDigit(n))
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
