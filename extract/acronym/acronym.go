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
// Additions of ours: a short form must hold a capital letter, so that an
// ordinary word in or before a parenthetical remark ("the parliamentary
// term (parliament)", "valves (three of them)") is not taken for one; and a
// long form must not start with its short form, which makes a nickname or
// a qualified name ("Angelika (Angel)", "EU27 (EU)") no definition. Then,
// from the wrong pairs found in the ACTER texts (corruption, dressage, wind
// energy): the short form may not stand in the long form as a word between
// any punctuation ("the Anti-Fraud Office (hereinafter the 'Office')"); a
// long form holds no parenthesis ("Oy (Finland), Gasum Oy (Finland)") and
// does not start with a function word ("the International Federation for
// Equestrian Sports (FEI)" gave "for Equestrian Sports"); and a
// two-character short form is the initials of two words ("upon the ECB
// under Regulation (EU) No 1024/2013" gave "ECB under Regulation"), unless
// it is a unit's symbol beside its name ("400 kilowatt (kW)").
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
	if strings.ContainsAny(long, "()[]") || functionWord(long) || n == 2 && !initials(short, long) && !isUnit(short, long) {
		return Pair{}, false
	}
	return Pair{Short: sf, Long: lf}, true
}

// functionWords are English articles, prepositions and conjunctions: a
// long form starting with one ("for Equestrian Sports (FEI)", "the
// Functioning of the European Union (TFEU)") matched a letter on a word
// that only joins the words of the real one, which starts further left.
var functionWords = map[string]bool{
	"a": true, "an": true, "and": true, "as": true, "at": true, "by": true, "for": true, "from": true,
	"in": true, "into": true, "of": true, "on": true, "or": true, "per": true, "than": true, "the": true,
	"to": true, "under": true, "upon": true, "via": true, "with": true,
}

// functionWord reports whether long starts with a function word.
func functionWord(long string) bool {
	end := strings.IndexFunc(long, func(r rune) bool { return !isAlnum(r) })
	if end < 0 {
		end = len(long)
	}
	return functionWords[strings.ToLower(long[:end])]
}

// initials reports whether the letters and digits of short are the
// initials of the words of long (split at white space, hyphens and
// slashes), one a word. Asked of two-character short forms only: with two
// letters a match inside a word, or a word left without one, is mostly
// chance ("the ECB under Regulation (EU) No 1024/2013": E of ECB, U inside
// Regulation), while two-letter acronyms of terms are their two words'
// initials ("electrical conductivity (EC)", "quality assurance (QA)").
func initials(short, long string) bool {
	var want []rune
	for _, r := range short {
		if isAlnum(r) {
			want = append(want, unicode.ToLower(r))
		}
	}
	start := true
	for _, r := range long {
		if unicode.IsSpace(r) || r == '-' || r == '/' {
			start = true
			continue
		}
		if start {
			if len(want) == 0 || unicode.ToLower(r) != want[0] {
				return false
			}
			want = want[1:]
		}
		start = false
	}
	return len(want) == 0
}

// unitPrefixes are the SI prefixes of units met in technical text, with
// their names (The International System of Units, BIPM, 9th edition
// 2019, table 7).
var unitPrefixes = map[string]string{"k": "kilo", "M": "mega", "G": "giga", "T": "tera", "m": "milli", "µ": "micro", "μ": "micro", "n": "nano"}

// unitSymbols are unit symbols that take a prefix (SI Brochure, tables 2
// and 4; the watt hour and the bar, units in use with the SI).
var unitSymbols = map[string]bool{"W": true, "Wh": true, "V": true, "A": true, "Hz": true, "Pa": true, "J": true, "N": true, "g": true, "m": true, "s": true, "bar": true, "VA": true, "F": true, "Ω": true}

// isUnit reports whether short is a prefixed unit symbol and long starts
// with the prefix's name: "400 kilowatt (kW)", "four megawatts (MW)". Such
// a pair is right (the symbol abbreviates the name), though not made of
// initials, and a glossary of the field lists the unit: on the ACTER wind
// energy list, which holds "kilowatt" and "megawatt", dropping these pairs
// lowered the best F1 from 0.414 to 0.412. "Gutter Alarm (GA)" is no
// giga-ampere.
func isUnit(short, long string) bool {
	for sym, name := range unitPrefixes {
		if strings.HasPrefix(short, sym) && unitSymbols[short[len(sym):]] && strings.HasPrefix(strings.ToLower(long), name) {
			return true
		}
	}
	return false
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

// containsWord tells whether long holds short as a word, between
// characters that are not letters or digits (or the ends): a long form
// that spells out its short form is no definition ("the 'Office'", "Heat
// Oy (Finland), Gasum Oy (Finland)").
func containsWord(long, short string) bool {
	for from := 0; ; {
		i := strings.Index(long[from:], short)
		if i < 0 {
			return false
		}
		i += from
		before, _ := utf8.DecodeLastRuneInString(long[:i])
		after, _ := utf8.DecodeRuneInString(long[i+len(short):])
		if (i == 0 || !isAlnum(before)) && (i+len(short) == len(long) || !isAlnum(after)) {
			return true
		}
		from = i + 1
	}
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
