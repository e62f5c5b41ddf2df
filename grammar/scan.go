package grammar

import (
	"strings"
	"unicode/utf8"
)

// tokKind is the kind of one token of a rule file.
type tokKind uint8

const (
	tEOF          tokKind = iota
	tIdent                // modifier, NOUN, use
	tField                // xpos:NNS, lemma:/^valv/, chars:Aa+ (key, colon and value in one token)
	tLabel                // @node
	tString               // "valve"
	tRaw                  // 'Valve'
	tRegex                // /^[A-Z]+$/
	tNumber               // 12
	tPunct                // one of | & ! ? * + ( ) { } , : ; ^ $ =
	tUnterminated         // a quote or slash without its closing partner on the line
	tBad                  // any other character
)

// token is one token: its kind, its byte offset in the source and its text
// as written.
type token struct {
	kind tokKind
	off  int
	text string
}

// scanner splits a rule file into tokens, skipping white space and
// comments. It looks at each byte a bounded number of times, so scanning
// is linear in the size of the file.
type scanner struct {
	src string
	off int
}

const punctChars = "|&!?*+(){},:;^$="

func isIdentStart(c byte) bool {
	return c == '_' || 'a' <= c && c <= 'z' || 'A' <= c && c <= 'Z'
}

func isIdentChar(c byte) bool { return isIdentStart(c) || '0' <= c && c <= '9' }

// next returns the next token.
func (s *scanner) next() token {
	src := s.src
	for s.off < len(src) {
		c := src[s.off]
		if c == ' ' || c == '\t' || c == '\r' || c == '\n' {
			s.off++
			continue
		}
		if c == '#' {
			if i := strings.IndexByte(src[s.off:], '\n'); i >= 0 {
				s.off += i
			} else {
				s.off = len(src)
			}
			continue
		}
		break
	}
	start := s.off
	if start >= len(src) {
		return token{kind: tEOF, off: len(src)}
	}
	tok := func(kind tokKind, end int) token {
		s.off = end
		return token{kind: kind, off: start, text: src[start:end]}
	}
	c := src[start]
	switch {
	case isIdentStart(c):
		end := start + 1
		for end < len(src) && isIdentChar(src[end]) {
			end++
		}
		if end < len(src) && src[end] == ':' {
			if v := fieldValueEnd(src, end+1, src[start:end] == "chars"); v > end+1 {
				return tok(tField, v)
			}
		}
		return tok(tIdent, end)
	case c == '@':
		if start+1 < len(src) && isIdentStart(src[start+1]) {
			end := start + 2
			for end < len(src) && isIdentChar(src[end]) {
				end++
			}
			return tok(tLabel, end)
		}
	case c == '"' || c == '\'' || c == '/':
		if end := quotedEnd(src, start); end >= 0 {
			kind := tString
			switch c {
			case '\'':
				kind = tRaw
			case '/':
				kind = tRegex
			}
			return tok(kind, end)
		}
		end := len(src)
		if i := strings.IndexByte(src[start:], '\n'); i >= 0 {
			end = start + i
		}
		return tok(tUnterminated, end)
	case '0' <= c && c <= '9':
		end := start + 1
		for end < len(src) && '0' <= src[end] && src[end] <= '9' {
			end++
		}
		return tok(tNumber, end)
	case strings.IndexByte(punctChars, c) >= 0:
		return tok(tPunct, start+1)
	}
	_, n := utf8.DecodeRuneInString(src[start:])
	return tok(tBad, start+n)
}

// quotedEnd returns the offset just past the closing quote (or slash) of
// the quoted token starting at start, or -1 when the line ends first. A
// backslash escapes the character after it.
func quotedEnd(src string, start int) int {
	q := src[start]
	for i := start + 1; i < len(src); i++ {
		switch src[i] {
		case '\n':
			return -1
		case '\\':
			if i+1 >= len(src) || src[i+1] == '\n' {
				return -1
			}
			i++
		case q:
			return i + 1
		}
	}
	return -1
}

// fieldValueEnd returns the end of a field's value starting at p: a
// quoted string or a /regexp/, or a bare value up to white space or one of
// ; | & ( ) { } ! * + ? # " ' / @ [ ] (a chars: value may hold '+'). It
// returns p when there is no value.
func fieldValueEnd(src string, p int, plus bool) int {
	if p >= len(src) {
		return p
	}
	switch src[p] {
	case '"', '\'', '/':
		if end := quotedEnd(src, p); end >= 0 {
			return end
		}
		return p
	}
	i := p
	for ; i < len(src); i++ {
		c := src[i]
		if c == '+' && plus {
			continue
		}
		if c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '\f' || strings.IndexByte(";|&()!{}*+?#\"'/@[]", c) >= 0 {
			break
		}
	}
	return i
}
