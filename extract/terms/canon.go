package terms

import (
	"strings"
	"unicode/utf8"

	"glossmith/extract/wordshape"
	"glossmith/tagger/doc"
)

// canonWriter works out the canonical form of a candidate span into
// buffers it reuses: the words of the span (hyphenated parts joined back),
// the canonical spelling, the lower-cased words and the group key. It
// allocates nothing: the counts copy out the few spellings that are new
// to the document.
type canonWriter struct {
	words []wordSpan // orthographic words of the span
	spell []byte     // hyphenated words spelled out, lemmatized hyphenated heads
	text  []byte     // canonical words, space-separated
	ends  []int      // end of each word in text
	lower []byte     // lower-cased canonical words, space-separated
	key   []byte     // group key: lower-cased, hyphens and spaces removed
	// firstEnd and lastStart delimit the first and the last word in lower.
	firstEnd, lastStart int
}

// wordSpan is an orthographic word: tokens [from, to) of the span.
type wordSpan struct{ from, to int }

// split divides a span into orthographic words, joining hyphenated parts
// ("root", "-", "zone" is one word), and returns their number; it returns
// 0 as soon as the span proves to have more than maxWords words or a word
// of more than maxWordTokens tokens, so that its cost is bounded by the
// limits, not by the span.
func (cw *canonWriter) split(toks []doc.Token, maxWords int) int {
	cw.words = cw.words[:0]
	for k := range toks {
		if len(cw.words) > 0 && k > 0 && glued(toks[k-1], toks[k]) && (isHyphen(toks[k].Form) || isHyphen(toks[k-1].Form)) {
			w := &cw.words[len(cw.words)-1]
			if w.to++; w.to-w.from > maxWordTokens {
				return 0
			}
			continue
		}
		if len(cw.words) == maxWords {
			return 0
		}
		cw.words = append(cw.words, wordSpan{k, k + 1})
	}
	return len(cw.words)
}

// maxWordTokens is the most tokens a word of a candidate may have: a
// hyphenated compound of up to eight parts ("state-of-the-art" has four).
// Longer hyphenated runs are codes and noise, not words of a term; without
// a bound, a run of 300,000 hyphenated parts would be one "word" and every
// span inside it a nested span to look at.
const maxWordTokens = 2*8 - 1

// SpanLimit is the most tokens a candidate of at most maxWords words can
// span (each word at most maxWordTokens tokens): the nested matcher never
// looks at longer spans, so collection costs at most the number of tokens
// times this limit, whatever the input.
func SpanLimit(maxWords int) int {
	if maxWords <= 0 {
		maxWords = DefaultMaxWords
	}
	return maxWords * maxWordTokens
}

// write normalizes the words split found: every word lower-cased except
// acronyms and proper nouns, the head replaced by its lemma.
func (cw *canonWriter) write(toks []doc.Token) {
	ws := cw.words
	// The head is the last word of the first noun phrase: the word before
	// the first preposition ("angles of attack" → "angle of attack"), or
	// else the last word.
	head := len(ws) - 1
	for n := 1; n < len(ws)-1; n++ {
		if toks[ws[n].to-1].UPOS == "ADP" {
			head = n - 1
			break
		}
	}
	cw.spell, cw.text, cw.ends, cw.lower, cw.key = cw.spell[:0], cw.text[:0], cw.ends[:0], cw.lower[:0], cw.key[:0]
	for n, w := range ws {
		last := &toks[w.to-1]
		text := last.Form
		if w.to-w.from > 1 {
			start := len(cw.spell)
			for k := w.from; k < w.to; k++ {
				cw.spell = append(cw.spell, toks[k].Form...)
			}
			text = view(cw.spell[start:])
		}
		// Proper nouns keep their case here; the corpus folds a group's case
		// when a lower-case spelling of it occurs too.
		keepCase := wordshape.KeepsCase(text) || wordshape.IsAcronym(text) || last.UPOS == "PROPN"
		if n == head && last.Lemma != "" && !strings.ContainsAny(text, "-") {
			text = headLemma(text, last.Lemma, keepCase)
		} else if n == head && last.Lemma != "" {
			// hyphenated head: lemmatize its last part ("set-points" -> "set-point")
			if cut := strings.LastIndexAny(text, "-"); cut >= 0 && strings.EqualFold(text[cut+1:], last.Form) {
				start := len(cw.spell)
				cw.spell = append(append(cw.spell, text[:cut+1]...), last.Lemma...)
				text = view(cw.spell[start:])
			}
		}
		if n > 0 {
			cw.text = append(cw.text, ' ')
			cw.lower = append(cw.lower, ' ')
		}
		cw.lastStart = len(cw.lower)
		cw.appendWord(text, keepCase)
		cw.ends = append(cw.ends, len(cw.text))
		if n == 0 {
			cw.firstEnd = len(cw.lower)
		}
	}
}

// appendWord appends a canonical word to the spelling (lower-cased unless
// keepCase), its lower-cased form to lower and that without hyphens to the
// key: for ASCII, the usual case, in one pass.
func (cw *canonWriter) appendWord(text string, keepCase bool) {
	for i := 0; i < len(text); i++ {
		if text[i] >= utf8.RuneSelf {
			start := len(cw.text)
			if keepCase {
				cw.text = append(cw.text, text...)
			} else {
				cw.text = appendLower(cw.text, text)
			}
			low := len(cw.lower)
			cw.lower = appendLower(cw.lower, view(cw.text[start:]))
			cw.key = appendKey(cw.key, cw.lower[low:])
			return
		}
	}
	for i := 0; i < len(text); i++ {
		c := text[i]
		lc := c
		if 'A' <= c && c <= 'Z' {
			lc += 'a' - 'A'
		}
		if keepCase {
			cw.text = append(cw.text, c)
		} else {
			cw.text = append(cw.text, lc)
		}
		cw.lower = append(cw.lower, lc)
		if lc != '-' {
			cw.key = append(cw.key, lc)
		}
	}
}

// appendKey appends a lower-cased word to a group key: its runes but
// hyphens.
func appendKey(key, word []byte) []byte {
	for i := 0; i < len(word); {
		if c := word[i]; c < utf8.RuneSelf {
			if c != '-' {
				key = append(key, c)
			}
			i++
			continue
		}
		r, size := utf8.DecodeRune(word[i:])
		if r != '‐' && r != '‑' {
			key = utf8.AppendRune(key, r)
		}
		i += size
	}
	return key
}

// stopped reports whether the candidate begins or ends with a stop word or
// is one.
func (cw *canonWriter) stopped(stop map[string]bool) bool {
	return stop[string(cw.lower[:cw.firstEnd])] || stop[string(cw.lower[cw.lastStart:])] || stop[string(cw.lower)]
}

// hasTags reports whether pos is the UPOS tags of the words,
// space-separated, as appendTags would write them.
func (cw *canonWriter) hasTags(pos string, toks []doc.Token) bool {
	for n, w := range cw.words {
		if n > 0 {
			if pos == "" || pos[0] != ' ' {
				return false
			}
			pos = pos[1:]
		}
		u := toks[w.to-1].UPOS
		if !strings.HasPrefix(pos, u) {
			return false
		}
		pos = pos[len(u):]
	}
	return pos == ""
}

// appendTags appends the UPOS tags of the words, space-separated (a
// hyphenated word takes the tag of its last part).
func (cw *canonWriter) appendTags(b []byte, toks []doc.Token) []byte {
	for n, w := range cw.words {
		if n > 0 {
			b = append(b, ' ')
		}
		b = append(b, toks[w.to-1].UPOS...)
	}
	return b
}

// headLemma returns the canonical head word. Words that keep their case
// (acronyms, names) keep their spelling when the lemma only changes case or
// drops a plural s ("PLCs" → "PLC", "VPD" stays "VPD").
func headLemma(form, lemma string, keepCase bool) string {
	if !keepCase {
		return lemma
	}
	switch {
	case strings.EqualFold(form, lemma):
		return form
	case strings.HasSuffix(form, "s") && strings.EqualFold(form[:len(form)-1], lemma):
		return form[:len(form)-1]
	}
	return lemma
}

// WordKey is the key a word token is counted under for domain specificity:
// its lemma (or form) lower-cased.
func WordKey(t *doc.Token) string { return strings.ToLower(wordOf(t)) }

// wordOf is the word a token is counted as before lower-casing: its lemma,
// or its form when it has none.
func wordOf(t *doc.Token) string {
	if t.Lemma != "" {
		return t.Lemma
	}
	return t.Form
}

func glued(a, b doc.Token) bool { return !a.SpaceAfter && a.End == b.Start }

func isHyphen(s string) bool { return s == "-" || s == "‐" || s == "‑" }
