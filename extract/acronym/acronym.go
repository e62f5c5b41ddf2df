// Package acronym finds short forms and the long forms they stand for where
// a text defines them — "vapour pressure deficit (VPD)", "VPD (vapour
// pressure deficit)" — with the algorithm of Schwartz and Hearst (2003), "A
// simple algorithm for identifying abbreviation definitions in biomedical
// text", Pacific Symposium on Biocomputing 8:451–462:
//
//   - a candidate pair is "long form (short form)", or "short form (long
//     form)" when the parentheses hold more than two words or more text than
//     precedes them (then the short form is the word before the parenthesis);
//     text in the parentheses after ", " or "; " is left out;
//   - a short form has at most two words and 2 to 10 characters, at least one
//     of them a letter, the first a letter or a digit;
//   - the long form is looked for in the min(|A|+5, 2·|A|) words before the
//     parenthesis (|A| the short form's letters and digits): its characters
//     are matched right to left, case ignored, every letter and digit of the
//     short form in order in the long form, the first one at the start of a
//     word; the long form starts at the word holding that match;
//   - a pair is dropped when the long form is shorter than the short form,
//     holds it as a word, or has more words (split at white space and
//     hyphens) than the window.
//
// Two additions of ours: a short form must hold a capital letter, so that an
// ordinary word in or before a parenthetical remark ("the parliamentary
// term (parliament)", "valves (three of them)") is not taken for one; and a
// long form must not start with its short form, which makes a nickname or
// a qualified name ("Angelika (Angel)", "EU27 (EU)") no definition.
//
// Find looks at one sentence's text at a time, in one pass over its
// parentheses: each closing parenthesis pairs with the nearest opening one,
// and the text searched around it is bounded, so the cost is linear in the
// text whatever it holds.
package acronym

import (
	"strings"
	"unicode"
	"unicode/utf8"
)

// Span is a byte range [Start, End) of the text searched.
type Span struct{ Start, End int }

// Pair is a short form and its long form, both as ranges of the text.
type Pair struct {
	Short, Long Span
}

// Limits of the paper's definition of a short form.
const (
	minShort = 2  // characters
	maxShort = 10 // characters
)

// maxLongBytes bounds the text looked at for a long form, so that one
// parenthesis costs a bounded amount of work: the longest window, 15 words,
// of words longer than any in a term glossary.
const maxLongBytes = 300

// Find returns the short and long forms defined in text, a sentence, in
// order of their parentheses.
func Find(text string) []Pair {
	var f Finder
	return f.Append(nil, text)
}

// Finder finds pairs with buffers it reuses from call to call. Its zero
// value is ready; it is not safe for concurrent use.
type Finder struct {
	short, long []rune
	starts      []int // byte offset of each rune of long in the text
}

// Append appends the pairs defined in text to dst. Each closing
// parenthesis pairs with the last opening one since the closing one before
// it, so the text is scanned about twice, with the byte searches of the
// strings package.
func (f *Finder) Append(dst []Pair, text string) []Pair {
	for from := 0; from < len(text); {
		c := strings.IndexByte(text[from:], ')')
		if c < 0 {
			break
		}
		c += from
		if o := strings.LastIndexByte(text[from:c], '('); o >= 0 {
			if p, ok := f.pair(text, from+o, c); ok {
				dst = append(dst, p)
			}
		}
		from = c + 1
	}
	return dst
}

// pair looks at the parentheses text[open] and text[close].
func (f *Finder) pair(text string, open, close int) (Pair, bool) {
	in := Span{open + 1, close}
	if k := strings.Index(text[in.Start:in.End], ", "); k >= 0 {
		in.End = in.Start + k
	}
	if k := strings.Index(text[in.Start:in.End], "; "); k >= 0 {
		in.End = in.Start + k
	}
	in = trim(text, in)
	start := max(0, open-maxLongBytes)
	for start < open && !utf8.RuneStart(text[start]) {
		start++
	}
	before := trim(text, Span{start, open})
	if in.End-in.Start < 2 || before.End-before.Start < 2 {
		return Pair{}, false
	}
	if words(text[in.Start:in.End], false) <= 2 && in.End-in.Start <= before.End-before.Start {
		// long form (short form)
		if s := text[in.Start:in.End]; !validShort(s) || !hasUpper(s) {
			return Pair{}, false
		}
		return f.match(text, in, before, start > 0)
	}
	// short form (long form): the short form is the word before "(".
	if in.End-in.Start > maxLongBytes {
		return Pair{}, false
	}
	sf := Span{before.Start, before.End}
	for i := before.End; i > before.Start; {
		r, size := utf8.DecodeLastRuneInString(text[:i])
		if unicode.IsSpace(r) {
			break
		}
		i -= size
		sf.Start = i
	}
	if s := text[sf.Start:sf.End]; !validShort(s) || !hasUpper(s) {
		return Pair{}, false
	}
	return f.match(text, sf, in, false)
}

// match finds the long form of the short form text[sf] at the end of
// text[window] (findBestLongForm of the paper) and checks the pair. cut
// tells that the window was cut from longer text.
func (f *Finder) match(text string, sf, window Span, cut bool) (Pair, bool) {
	short := text[sf.Start:sf.End]
	f.short = appendRunes(f.short[:0], short)
	f.long, f.starts = f.long[:0], f.starts[:0]
	for i, r := range text[window.Start:window.End] {
		f.long = append(f.long, r)
		f.starts = append(f.starts, window.Start+i)
	}
	l := len(f.long) - 1
	for s := len(f.short) - 1; s >= 0; s-- {
		c := unicode.ToLower(f.short[s])
		if !isAlnum(c) {
			continue
		}
		for l >= 0 && (unicode.ToLower(f.long[l]) != c || s == 0 && l > 0 && isAlnum(f.long[l-1])) {
			l--
		}
		if l < 0 {
			return Pair{}, false
		}
		l--
	}
	// The long form starts at the word holding the first match; that word
	// must start in the window.
	for l >= 0 && !unicode.IsSpace(f.long[l]) {
		l--
	}
	if l < 0 && cut {
		if r, _ := utf8.DecodeLastRuneInString(text[:window.Start]); !unicode.IsSpace(r) {
			return Pair{}, false
		}
	}
	lf := Span{f.starts[l+1], window.End}
	long := text[lf.Start:lf.End]
	n := 0
	for _, r := range short {
		if isAlnum(r) {
			n++
		}
	}
	if len(long) < len(short) || containsWord(long, short) || words(long, true) > min(n+5, 2*n) ||
		len(long) > len(short) && strings.EqualFold(long[:len(short)], short) {
		return Pair{}, false
	}
	return Pair{Short: sf, Long: lf}, true
}

// validShort tells whether s may be a short form: at most two words, 2 to
// 10 characters, a letter among them, the first a letter or a digit.
func validShort(s string) bool {
	n := utf8.RuneCountInString(s)
	if n < minShort || n > maxShort || words(s, false) > 2 {
		return false
	}
	first, _ := utf8.DecodeRuneInString(s)
	return isAlnum(first) && strings.IndexFunc(s, unicode.IsLetter) >= 0
}

func hasUpper(s string) bool { return strings.IndexFunc(s, unicode.IsUpper) >= 0 }

func isAlnum(r rune) bool { return unicode.IsLetter(r) || unicode.IsDigit(r) }

// words counts the words of s, split at white space and, when hyphens is
// set, at hyphens too (the paper counts a long form's words so).
func words(s string, hyphens bool) int {
	n, in := 0, false
	for _, r := range s {
		if unicode.IsSpace(r) || hyphens && r == '-' {
			in = false
		} else if !in {
			in = true
			n++
		}
	}
	return n
}

// containsWord tells whether long holds short followed by a space, or ends
// with it: a long form that spells out its short form is no definition.
func containsWord(long, short string) bool {
	return strings.Contains(long, short+" ") || strings.HasSuffix(long, short)
}

// trim returns sp without the white space at its ends.
func trim(text string, sp Span) Span {
	for sp.Start < sp.End {
		r, size := utf8.DecodeRuneInString(text[sp.Start:sp.End])
		if !unicode.IsSpace(r) {
			break
		}
		sp.Start += size
	}
	for sp.End > sp.Start {
		r, size := utf8.DecodeLastRuneInString(text[sp.Start:sp.End])
		if !unicode.IsSpace(r) {
			break
		}
		sp.End -= size
	}
	return sp
}

func appendRunes(dst []rune, s string) []rune {
	for _, r := range s {
		dst = append(dst, r)
	}
	return dst
}
