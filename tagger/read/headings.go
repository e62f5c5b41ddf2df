package read

import (
	"cmp"
	"slices"
	"strings"
	"unicode"
	"unicode/utf8"

	"glossmith/tagger/doc"
)

// Headings in plain text have no markup; a line counts as one only when
// its layout and its capitals both say so (see textHeadings). The limits
// keep out the short paragraphs of running text.
const (
	maxHeadingBytes = 120 // a heading line is at most this long
	maxHeadingWords = 12  // and has at most this many words
)

// textHeadings finds the lines of plain text that are headings: a line
// that stands alone — after a blank line or at the start of the text, and
// before a blank line — is short (maxHeadingBytes, maxHeadingWords), does
// not end in punctuation that ends or continues a sentence (. ! ? : ; ,),
// does not start with a bullet, and is written in title case or in
// capitals (see headingCase). A heading over two lines, or one run
// straight into its paragraph, is not found: the rule would rather miss a
// heading than take a short line of prose for one.
func textHeadings(s string) []doc.LineRange {
	var heads []doc.LineRange
	prevBlank := true
	line := int32(1)
	for start := 0; start < len(s); line++ {
		end := strings.IndexByte(s[start:], '\n')
		if end < 0 {
			end = len(s)
		} else {
			end += start
		}
		l := s[start:end]
		blank := isBlankLine(l)
		if prevBlank && !blank && len(l) <= maxHeadingBytes && end < len(s) {
			next := s[end+1:]
			if k := strings.IndexByte(next, '\n'); k >= 0 {
				next = next[:k]
			}
			if isBlankLine(next) && isTextHeading(l) {
				heads = append(heads, doc.LineRange{First: line, Last: line})
			}
		}
		prevBlank = blank
		start = end + 1
	}
	return heads
}

// mergeRanges sorts line ranges and joins those that overlap.
func mergeRanges(rs []doc.LineRange) []doc.LineRange {
	slices.SortFunc(rs, func(a, b doc.LineRange) int { return cmp.Compare(a.First, b.First) })
	out := rs[:0]
	for _, r := range rs {
		if n := len(out); n > 0 && r.First <= out[n-1].Last {
			out[n-1].Last = max(out[n-1].Last, r.Last)
			continue
		}
		out = append(out, r)
	}
	return out
}

// withinLines cuts heading ranges to the lines text has: the DOCX reader
// trims the end of its text and may have counted a line break it cut.
func withinLines(rs []doc.LineRange, text string) []doc.LineRange {
	if len(rs) == 0 {
		return rs
	}
	lines := int32(strings.Count(text, "\n") + 1)
	for len(rs) > 0 && rs[len(rs)-1].First > lines {
		rs = rs[:len(rs)-1]
	}
	if n := len(rs); n > 0 {
		rs[n-1].Last = min(rs[n-1].Last, lines)
	}
	return rs
}

// isBlankLine reports a line of nothing but spaces and tabs.
func isBlankLine(l string) bool {
	for i := 0; i < len(l); i++ {
		if l[i] != ' ' && l[i] != '\t' {
			return false
		}
	}
	return true
}

// isTextHeading applies textHeadings' rules to one line.
func isTextHeading(l string) bool {
	l = strings.TrimSpace(l)
	last, _ := utf8.DecodeLastRuneInString(l)
	if strings.ContainsRune(".!?:;,…", last) {
		return false
	}
	words := strings.Fields(l)
	if len(words) == 0 || len(words) > maxHeadingWords || isBulletWord(words[0]) {
		return false
	}
	return headingCase(words)
}

// isBulletWord reports a list item's bullet.
func isBulletWord(w string) bool {
	switch w {
	case "-", "*", "+", "•", "‣", "◦", "–", "—", ">", "o":
		return true
	}
	return false
}

// headingCase reports words written as a heading is and running text is
// not: every word in capitals (at least two letters in all), or in title
// case — each word that starts with a letter starts with a capital,
// except the small words that title case leaves in lower case (articles,
// conjunctions, prepositions; see minorWords) after the first. Words that
// start with a digit or a symbol ("3.2", "(see") count by their first
// letter, or not at all.
func headingCase(words []string) bool {
	upper, lower := 0, 0
	for _, w := range words {
		for _, r := range w {
			switch {
			case unicode.IsUpper(r):
				upper++
			case unicode.IsLower(r):
				lower++
			}
		}
	}
	letters := upper + lower
	if letters == 0 {
		return false
	}
	if lower == 0 {
		return letters >= 2
	}
	first := true
	for _, w := range words {
		w = strings.TrimLeftFunc(w, func(r rune) bool { return !unicode.IsLetter(r) && !unicode.IsDigit(r) })
		r, _ := utf8.DecodeRuneInString(w)
		if !unicode.IsLetter(r) {
			continue
		}
		switch {
		case unicode.IsUpper(r) || unicode.IsTitle(r):
		case !first && minorWords[strings.TrimRightFunc(w, func(r rune) bool { return !unicode.IsLetter(r) })]:
		default:
			return false
		}
		first = false
	}
	return true
}

// minorWords are the words that title case writes in lower case inside a
// heading: articles, coordinating conjunctions and prepositions, which
// the headline style of The Chicago Manual of Style lower-cases whatever
// their length.
var minorWords = map[string]bool{
	"a": true, "an": true, "the": true,
	"and": true, "but": true, "or": true, "nor": true, "for": true, "so": true, "yet": true,
	"about": true, "above": true, "across": true, "after": true, "against": true, "along": true,
	"among": true, "around": true, "as": true, "at": true, "before": true, "behind": true,
	"below": true, "beneath": true, "beside": true, "between": true, "beyond": true, "by": true,
	"despite": true, "down": true, "during": true, "except": true, "from": true, "in": true,
	"inside": true, "into": true, "like": true, "near": true, "of": true, "off": true, "on": true,
	"onto": true, "out": true, "outside": true, "over": true, "past": true, "per": true,
	"since": true, "than": true, "through": true, "throughout": true, "to": true, "toward": true,
	"towards": true, "under": true, "until": true, "up": true, "upon": true, "via": true,
	"vs": true, "with": true, "within": true, "without": true,
}
