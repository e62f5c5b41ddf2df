package read

import (
	"errors"
	"strings"
	"unicode/utf16"
	"unicode/utf8"

	"golang.org/x/text/encoding"
	"golang.org/x/text/encoding/charmap"
	"golang.org/x/text/transform"

	"glossmith/tagger/doc"
)

// coding says how the bytes of a text file became the text the reader
// decoded, so that the offsets of a plain-text document can be mapped
// back to the file's bytes (doc.Document.Source): the length of a
// byte-order mark, then how each character is encoded. Decoding fills it;
// altered is set when the decoded text is not the file's bytes as they
// are, which is all that plain UTF-8 text (nearly every file) costs.
type coding struct {
	altered bool
	skip    int      // byte-order mark
	kind    unitKind // how characters are encoded after it
	enc     encoding.Encoding
}

type unitKind int

const (
	unitUTF8    unitKind = iota // UTF-8; a byte not part of a valid sequence is one U+FFFD
	unitUTF16LE                 // 2 bytes a character, 4 for a surrogate pair
	unitUTF16BE
	unitByte  // a single-byte encoding of golang.org/x/text: one byte a character
	unitOther // another encoding of golang.org/x/text: decoded one character at a time
)

// setEncoding records that the text was decoded from e.
func (c *coding) setEncoding(e encoding.Encoding) {
	c.altered, c.enc, c.kind = true, e, unitOther
	if _, ok := e.(*charmap.Charmap); ok {
		c.kind = unitByte
	}
}

// sourceRuns maps text, the decoded file data as the plain-text reader
// made it (line ends turned into LF, NULs and overlong lines dropped), on
// to the bytes of data: the runs of doc.Document.Source. It walks both in
// step, decoding data one character at a time the way decoding did; a
// character of data that the text does not have at that point was dropped
// (a byte-order mark, the CR of a CRLF, a NUL, the characters of a line
// left out for its length). Runs are only recorded where the offsets stop
// lining up, so a file with CRLF line ends gets one a line and an English
// UTF-16 file one at each character outside ASCII.
func sourceRuns(data []byte, text string, c coding) []doc.SourceRun {
	u := unitReader{kind: c.kind}
	if c.enc != nil {
		u.dec = c.enc.NewDecoder()
	}
	var runs []doc.SourceRun
	s, lastEnd, t := c.skip, 0, 0
	// lines up reports whether the character at t, s and of the rate
	// w:fw, continues the last run (or the identity before any).
	linesUp := func(w, fw int) bool {
		if len(runs) == 0 {
			return s == t && w == fw
		}
		r := runs[len(runs)-1]
		return int(r.Width) == w && int(r.FileWidth) == fw &&
			int64(r.Start)+int64(t-int(r.At))*int64(r.FileWidth)/int64(r.Width) == int64(s)
	}
	for t < len(text) && s < len(data) {
		// Runs of characters the text has as they are, at the last run's
		// rate, are passed over a byte or a UTF-16 unit at a time: in
		// UTF-8 any character but CR and NUL; otherwise ASCII.
		if k := u.same(data[s:], text[t:]); k > 0 {
			if w := u.width(); linesUp(1, w) {
				t, s = t+k, s+k*w
				lastEnd = s
				continue
			}
		}
		ch, n := u.next(data[s:])
		if n == 0 {
			break
		}
		keep := false
		switch {
		case ch == "\r" && text[t] == '\n':
			// a lone CR became LF; the CR of a CRLF was dropped
			keep = u.nextNonNUL(data[s+n:]) != "\n"
			if keep {
				ch = "\n"
			}
		case ch != "" && ch != "\x00":
			keep = strings.HasPrefix(text[t:], ch)
		}
		if !keep {
			s += n
			continue
		}
		w, fw := len(ch), n
		g := gcd(w, fw)
		w, fw = w/g, fw/g
		if !linesUp(w, fw) {
			runs = append(runs, doc.SourceRun{At: int32(t), Start: int32(s), End: int32(lastEnd), Width: uint8(w), FileWidth: uint8(fw)})
		}
		t, s, lastEnd = t+len(ch), s+n, s+n
	}
	if t < len(text) {
		return runs // the walk lost its way: a reader bug; offsets up to here hold
	}
	if s = len(data); !linesUp(1, 1) {
		runs = append(runs, doc.SourceRun{At: int32(t), Start: int32(s), End: int32(lastEnd), Width: 1, FileWidth: 1})
	}
	return runs
}

func gcd(a, b int) int {
	for b != 0 {
		a, b = b, a%b
	}
	return a
}

// unitReader decodes a file's bytes one character at a time, exactly as
// the reader's decoders do.
type unitReader struct {
	kind unitKind
	dec  *encoding.Decoder
	buf  [32]byte
}

// width is how many bytes of the file an ASCII character takes.
func (u *unitReader) width() int {
	if u.kind == unitUTF16LE || u.kind == unitUTF16BE {
		return 2
	}
	return 1
}

// same returns how many bytes of text, from its start, data holds as they
// are, one byte of text a width of data: characters that need no look at
// the encoding (in UTF-8, any character but CR and NUL and a byte left
// out; otherwise ASCII but CR and NUL), ending at a character boundary.
func (u *unitReader) same(data []byte, text string) int {
	k := 0
	switch u.kind {
	case unitUTF8:
		for k < len(data) && k < len(text) && data[k] == text[k] && data[k] != '\r' && data[k] != 0 {
			k++
		}
		for k > 0 && k < len(text) && !utf8.RuneStart(text[k]) {
			k-- // a character cut short: it is looked at by itself
		}
	case unitByte:
		for k < len(data) && k < len(text) && data[k] == text[k] && data[k] < utf8.RuneSelf && data[k] != '\r' && data[k] != 0 {
			k++
		}
	case unitUTF16LE, unitUTF16BE:
		lo, hi := 0, 1 // the bytes of a unit
		if u.kind == unitUTF16BE {
			lo, hi = 1, 0
		}
		for 2*k+1 < len(data) && k < len(text) && data[2*k+hi] == 0 && data[2*k+lo] == text[k] &&
			text[k] < utf8.RuneSelf && text[k] != '\r' && text[k] != 0 {
			k++
		}
	}
	return k
}

// next returns the text of the first character of data and the bytes it
// takes; for unitOther, whatever one step of the decoder gives (an escape
// sequence gives no text), and 0 bytes at the end of data.
func (u *unitReader) next(data []byte) (string, int) {
	if len(data) == 0 {
		return "", 0
	}
	switch u.kind {
	case unitByte:
		return u.other(data[:1])
	case unitUTF16LE, unitUTF16BE:
		if len(data) < 2 {
			return "\uFFFD", 1 // a cut-off last unit
		}
		unit := func(i int) rune {
			if u.kind == unitUTF16BE {
				return rune(data[i])<<8 | rune(data[i+1])
			}
			return rune(data[i+1])<<8 | rune(data[i])
		}
		r := unit(0)
		if !utf16.IsSurrogate(r) {
			return string(r), 2
		}
		if r < 0xDC00 && len(data) >= 4 {
			if p := utf16.DecodeRune(r, unit(2)); p != utf8.RuneError {
				return string(p), 4
			}
		}
		return "\uFFFD", 2
	case unitOther:
		return u.other(data)
	}
	r, n := utf8.DecodeRune(data)
	if r == utf8.RuneError && n == 1 {
		return "\uFFFD", 1
	}
	return string(data[:n]), n
}

// other decodes the first character of data with the decoder: the
// shortest output room in which one step succeeds holds one character.
func (u *unitReader) other(data []byte) (string, int) {
	for room := 1; room <= len(u.buf); room++ {
		nDst, nSrc, err := u.dec.Transform(u.buf[:room], data, true)
		if nDst > 0 || nSrc > 0 {
			return string(u.buf[:nDst]), nSrc
		}
		if !errors.Is(err, transform.ErrShortDst) {
			break
		}
	}
	return "\uFFFD", 1
}

// nextNonNUL returns the first character of data that is not NUL (NULs
// are dropped before line ends are joined).
func (u *unitReader) nextNonNUL(data []byte) string {
	for len(data) > 0 {
		ch, n := u.next(data)
		if n == 0 {
			return ""
		}
		if ch != "\x00" {
			return ch
		}
		data = data[n:]
	}
	return ""
}
