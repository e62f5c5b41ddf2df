package grammar

import (
	"strings"
	"unicode"
	"unicode/utf8"
)

// CharClasses returns what a `chars:` test compares: the word written in
// the character-class alphabet of the rule language. An upper-case letter
// is A, any other letter a (letters without case, as in many scripts,
// count as lower case), a digit 9, and any other character stands for
// itself; a run of two or more of one class is written once followed by
// '+'. A '+' or '\' of the word itself is escaped with '\' so that it
// cannot be read as a run. Examples: "Valve" → "Aa+", "PLC-12" → "A+-9+",
// "kPa" → "aAa", "24V" → "9+A", "C++" → `A\+\+`.
//
// Runs collapse so that one short string covers words of any length (all
// capitalized words are Aa+), while the order of classes, which tells an
// acronym from a unit or a part number, is kept.
func CharClasses(s string) string {
	var b strings.Builder
	b.Grow(len(s))
	last, run := rune(-1), 0
	flush := func() {
		if run == 0 {
			return
		}
		if last == '+' || last == '\\' {
			for range run { // escaped characters are written one by one
				b.WriteByte('\\')
				b.WriteRune(last)
			}
			return
		}
		b.WriteRune(last)
		if run > 1 {
			b.WriteByte('+')
		}
	}
	for _, r := range s {
		c := charClass(r)
		if c == last {
			run++
			continue
		}
		flush()
		last, run = c, 1
	}
	flush()
	return b.String()
}

func charClass(r rune) rune {
	switch {
	case r < utf8.RuneSelf:
		switch {
		case 'A' <= r && r <= 'Z':
			return 'A'
		case 'a' <= r && r <= 'z':
			return 'a'
		case '0' <= r && r <= '9':
			return '9'
		}
		return r
	case unicode.IsUpper(r):
		return 'A'
	case unicode.IsLetter(r):
		return 'a'
	case unicode.IsDigit(r):
		return '9'
	}
	return r
}

// checkChars returns why the `chars:` value v can never be the
// CharClasses of a word, or "" when it can.
func checkChars(v string) string {
	var prev string // the previous symbol (class, or escaped character), "" at the start
	prevRun := false
	for i := 0; i < len(v); {
		r, n := utf8.DecodeRuneInString(v[i:])
		sym := v[i : i+n]
		switch {
		case r == '+':
			if prev == "" || prevRun || strings.HasPrefix(prev, `\`) {
				return `has a '+' that follows no class: '+' marks a run of the class before it (write \+ for the character '+')`
			}
			prevRun = true
			i += n
			continue
		case r == '\\':
			if i+1 >= len(v) || (v[i+1] != '+' && v[i+1] != '\\') {
				return `has a '\' that escapes neither '+' nor '\'`
			}
			sym, n = v[i:i+2], 2
		case r != 'A' && r != 'a' && r != '9' && (unicode.IsLetter(r) || unicode.IsDigit(r)):
			return "can never match: letters and digits are written A (upper case), a (lower case) and 9 (digit), as in chars:Aa+ for \"Valve\""
		}
		if sym == prev && !strings.HasPrefix(sym, `\`) {
			return "can never match: a run of one class is written once with '+' (" + sym + "+, not " + sym + sym + " or " + sym + "+" + sym + ")"
		}
		prev, prevRun = sym, false
		i += n
	}
	return ""
}
