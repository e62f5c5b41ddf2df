package terms

import (
	"strings"
	"sync"
	"unicode"
	"unicode/utf8"
	"unsafe"

	"glossmith/tagger/doc"
)

// appendSurface returns a span as written in the document, white space
// folded. Most spans are a slice of the text as they are; others are
// spelled into buf, and then inBuf is true and the result is valid only
// until buf is written again.
func appendSurface(buf []byte, d *doc.Document, toks []doc.Token) (s string, _ []byte, inBuf bool) {
	a, b := int(toks[0].Start), int(toks[len(toks)-1].End)
	if a >= 0 && b <= len(d.Text) && a < b && d.Text[a:b] != "" && utf8.ValidString(d.Text[a:b]) {
		span := d.Text[a:b]
		if singleSpaced(span) {
			return span, buf, false // most spans: no copy
		}
		buf = appendFields(buf, span)
		return view(buf), buf, true
	}
	for k, t := range toks {
		buf = append(buf, t.Form...)
		if k < len(toks)-1 && t.SpaceAfter {
			buf = append(buf, ' ')
		}
	}
	return view(buf), buf, true
}

// singleSpaced reports whether s is ASCII with single spaces between
// words only, so that folding its white space would not change it.
func singleSpaced(s string) bool {
	if s[0] == ' ' || s[len(s)-1] == ' ' {
		return false
	}
	for i := 0; i < len(s); i++ {
		c := s[i]
		if ' ' < c && c < utf8.RuneSelf {
			continue // most bytes: one test
		}
		switch {
		case c >= utf8.RuneSelf, c == '\t', c == '\n', c == '\v', c == '\f', c == '\r':
			return false
		case c == ' ' && s[i+1] == ' ':
			return false
		}
	}
	return true
}

// appendFields appends the words of s, split at white space as
// strings.Fields splits, joined by single spaces.
func appendFields(dst []byte, s string) []byte {
	start, inWord := len(dst), false
	for i := 0; i < len(s); {
		c, size := rune(s[i]), 1
		if c >= utf8.RuneSelf {
			c, size = utf8.DecodeRuneInString(s[i:])
		}
		if unicode.IsSpace(c) {
			inWord = false
		} else {
			if !inWord && len(dst) > start {
				dst = append(dst, ' ')
			}
			inWord = true
			dst = append(dst, s[i:i+size]...)
		}
		i += size
	}
	return dst
}

// needsLower reports whether strings.ToLower could change s.
func needsLower(s string) bool {
	for i := 0; i < len(s); i++ {
		if c := s[i]; c >= utf8.RuneSelf || 'A' <= c && c <= 'Z' {
			return true
		}
	}
	return false
}

// appendLower appends strings.ToLower(s) to dst, without an intermediate
// string when s is ASCII.
func appendLower(dst []byte, s string) []byte {
	for i := 0; i < len(s); i++ {
		if s[i] >= utf8.RuneSelf {
			return append(dst, strings.ToLower(s)...)
		}
	}
	for i := 0; i < len(s); i++ {
		c := s[i]
		if 'A' <= c && c <= 'Z' {
			c += 'a' - 'A'
		}
		dst = append(dst, c)
	}
	return dst
}

// view returns the bytes of b as a string without copying them; the
// string is valid only while b is not written again.
func view(b []byte) string {
	if len(b) == 0 {
		return ""
	}
	return unsafe.String(&b[0], len(b))
}

// arena copies short strings into shared blocks: one allocation for the
// keys and spellings of many candidates. A block is only appended to
// while the arena lives, so the strings handed out do not change; every
// string of an arena keeps its whole block alive, so a corpus copies what
// it keeps. When the counts that own the arena are released, so are its
// blocks (free), for the arenas of later documents: its strings must be
// dead by then (DocCounts.Release).
type arena struct {
	block []byte
	full  [][]byte // earlier blocks of standard size, for free
}

// arenaBlock is the size of an arena's blocks: a few hundred keys.
const arenaBlock = 8 << 10

// freeBlocks holds released arena blocks (*[]byte, standard size).
var freeBlocks sync.Pool

// str returns a copy of s.
func (a *arena) str(s string) string {
	if s == "" {
		return ""
	}
	if len(a.block)+len(s) > cap(a.block) {
		a.grow(len(s))
	}
	start := len(a.block)
	a.block = append(a.block, s...)
	return unsafe.String(&a.block[start], len(s))
}

// grow starts a new block with room for n bytes: a released one when
// one is free and n fits a standard block.
func (a *arena) grow(n int) {
	if cap(a.block) == arenaBlock {
		a.full = append(a.full, a.block)
	}
	if n <= arenaBlock {
		if b, _ := freeBlocks.Get().(*[]byte); b != nil {
			a.block = (*b)[:0]
			return
		}
	}
	a.block = make([]byte, 0, max(arenaBlock, n))
}

// free hands the arena's standard blocks to later arenas and empties it.
func (a *arena) free() {
	if cap(a.block) == arenaBlock {
		a.full = append(a.full, a.block)
	}
	for i, b := range a.full {
		freeBlocks.Put(&b)
		a.full[i] = nil
	}
	*a = arena{}
}
