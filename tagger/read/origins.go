package read

import (
	"sort"
	"strings"
	"unicode/utf8"

	"golang.org/x/net/html"

	"glossmith/tagger/doc"
)

// origins builds the doc.Origin list of a text extracted from markup as
// the text is written: where each stretch of it stands in the source.
// An origin is only added where the offsets stop lining up, so a run of
// words copied as they are costs one, and a text node between two tags
// one or two (the space or paragraph break before it, and its words).
type origins struct {
	lines lineCounter
	list  []doc.Origin
	// end is the source offset just past the last character written.
	end int
	// brk is the offset of the text just past the last line break, where
	// a copy may not go on from before it.
	brk int
}

// broke notes a line break written just before offset at.
func (o *origins) broke(at int) { o.brk = at }

func newOrigins(src string) *origins { return &origins{lines: lineCounter{s: src, line: 1, col: 1}} }

// add records that the text from offset at on stands for the source from
// offset src on, n bytes of text for srcN bytes of source (srcN 0: all of
// it at src). A copy (n == srcN) that goes on from the last origin at its
// rate is not recorded, unless newLine says a line break came between.
func (o *origins) add(at, src, n, srcN int, newLine bool) {
	w, fw := 1, 0
	switch {
	case srcN == n:
		fw = 1
	case srcN > 0:
		g := gcd(n, srcN)
		w, fw = n/g, srcN/g
		if w > 255 || fw > 255 {
			w, fw = 1, 0 // a rate a run cannot hold: the stretch stands at its start
		}
	}
	if k := len(o.list); k > 0 && !newLine && at != o.brk {
		l := &o.list[k-1]
		if int(l.Width) == w && int(l.FileWidth) == fw && int(l.Start)+(at-int(l.At))*fw/w == src {
			return
		}
		if int(l.At) == at { // nothing was written under the last one
			o.list = o.list[:k-1]
		}
	}
	line, col := o.lines.at(src)
	o.list = append(o.list, doc.Origin{
		SourceRun: doc.SourceRun{At: int32(at), Start: int32(src), End: int32(o.end), Width: uint8(w), FileWidth: uint8(fw)},
		Line:      int32(line), Col: int32(col),
	})
}

// fill records that the text from offset at on (a space, a paragraph
// break) stands for no source character: it is placed where the last
// character written ended.
func (o *origins) fill(at int) { o.add(at, o.end, 1, 0, false) }

// finish closes the list at the end of the text, so that the text's end
// maps to the source's; it returns nil for an empty text.
func (o *origins) finish(textLen int) []doc.Origin {
	if textLen == 0 {
		return nil
	}
	o.add(textLen, len(o.lines.s), 1, 1, true)
	return o.list
}

// lineCounter returns the 1-based line and column, in characters, of
// offsets of a source. Offsets mostly come in order, so it counts on from
// the last one; for a step back it counts from the mark at or before it,
// one being kept every 4 KiB, so that a page of one long line costs no
// more than one pass.
type lineCounter struct {
	s              string
	off, line, col int
	marks          []lineMark
}

type lineMark struct{ off, line, col int }

func (c *lineCounter) at(x int) (line, col int) {
	x = min(x, len(c.s))
	if x < c.off {
		k := sort.Search(len(c.marks), func(i int) bool { return c.marks[i].off > x }) - 1
		c.off, c.line, c.col = 0, 1, 1
		if k >= 0 {
			m := c.marks[k]
			c.off, c.line, c.col = m.off, m.line, m.col
		}
	}
	seg := c.s[c.off:x]
	for {
		i := strings.IndexByte(seg, '\n')
		if i < 0 {
			break
		}
		c.line, c.col = c.line+1, 1
		seg = seg[i+1:]
	}
	if n := asciiPrefix(seg); n == len(seg) {
		c.col += n
	} else {
		c.col += n + utf8.RuneCountInString(seg[n:])
	}
	c.off = x
	if last := len(c.marks); x >= 4096 && (last == 0 || x >= c.marks[last-1].off+4096) {
		c.marks = append(c.marks, lineMark{x, c.line, c.col})
	}
	return c.line, c.col
}

// piece is a stretch of a decoded text (an HTML text node, a Markdown
// run) and where it stands in the source: its n bytes from offset i on
// are the srcN bytes of source from offset src on; a copy when n ==
// srcN, else one character reference or escape (srcN 0: not found).
type piece struct{ i, n, src, srcN int }

// pieces is the way a decoded text maps onto its source, in text order.
type pieces []piece

// addCopy appends n copied bytes, joining them to a copy they continue.
func (ps *pieces) addCopy(i, src, n int) {
	if k := len(*ps); k > 0 {
		p := &(*ps)[k-1]
		if p.n == p.srcN && p.i+p.n == i && p.src+p.srcN == src {
			p.n += n
			p.srcN += n
			return
		}
	}
	*ps = append(*ps, piece{i, n, src, n})
}

// align maps text[i:], decoded from markup, onto src[p:stop] as far as
// the two go together, appending to ps, and returns where it stopped in
// each: copies; character references ("&amp;"), whose "&" is itself where
// the text has it (raw text, CommonMark's "&#1" without ";"); with
// escapes, a backslash before ASCII punctuation (CommonMark) and a line
// break or tab that the text has as a space; white space the text does
// not have.
func (ps *pieces) align(text string, i int, src string, p, stop int, escapes bool) (int, int) {
	markup := "&"
	if escapes {
		markup = "&\\\n\r\t"
	}
	for i < len(text) && p < stop {
		rest := text[i:]
		if p+len(rest) <= stop && src[p:p+len(rest)] == rest {
			ps.addCopy(i, p, len(rest)) // the usual case: all of it, as it is
			return len(text), p + len(rest)
		}
		plain := min(stop, p+len(rest))
		if a := strings.IndexAny(src[p:plain], markup); a >= 0 {
			plain = p + a
		}
		if n := commonPrefix(rest, src[p:plain]); n > 0 {
			ps.addCopy(i, p, n)
			i, p = i+n, p+n
			continue
		}
		c := src[p]
		if c == '&' {
			if t, n := charRef(src[p:stop]); n > 0 && strings.HasPrefix(text[i:], t) {
				*ps = append(*ps, piece{i, len(t), p, n})
				i, p = i+len(t), p+n
				continue
			} else if n > 0 && strings.Trim(t, " \t\n\f\r") == "" && text[i] != '&' {
				p += n // white space the parser dropped, written as a reference
				continue
			}
		}
		switch {
		case c == text[i]:
			ps.addCopy(i, p, 1)
			i++
		case escapes && c == '\\' && p+1 < stop && isASCIIPunct(src[p+1]) && src[p+1] == text[i]:
			*ps = append(*ps, piece{i, 1, p, 2})
			i, p = i+1, p+1
		case escapes && text[i] == ' ' && (c == '\n' || c == '\r' || c == '\t'):
			*ps = append(*ps, piece{i, 1, p, 0})
			i++
		case !isHTMLSpace(rune(c)):
			return i, p
		}
		p++ // white space the parser dropped: after <pre>, before <body>, in a table
	}
	return i, p
}

// commonPrefix returns the length of the longest common prefix of a and b.
func commonPrefix(a, b string) int {
	n := min(len(a), len(b))
	for i := 0; i < n; i++ {
		if a[i] != b[i] {
			return i
		}
	}
	return n
}

func isASCIIPunct(c byte) bool {
	return '!' <= c && c <= '/' || ':' <= c && c <= '@' || '[' <= c && c <= '`' || '{' <= c && c <= '~'
}

// srcAt returns the source offset of byte j of the text, the start of the
// character there, or (end) the end of the one before; k is the index of
// the piece to start looking from (pieces are looked up in text order),
// and the index of the piece found is returned with it.
func (ps pieces) srcAt(j, k int, end bool) (int, int) {
	for k+1 < len(ps) && ps[k+1].i <= j && !(end && ps[k+1].i == j) {
		k++
	}
	if k >= len(ps) {
		return 0, k
	}
	p := ps[k]
	switch {
	case j >= p.i+p.n:
		return p.src + p.srcN, k
	case p.n == p.srcN:
		return p.src + j - p.i, k
	case p.srcN == 0 || j == p.i:
		return p.src, k
	}
	return p.src + (j-p.i)*p.srcN/p.n, k
}

// write records the origins of text[a:b] of a text mapped by ps, written
// at offset at of the extracted text: a new origin at each piece, and
// after each line break. It returns the piece index reached (see srcAt).
func (o *origins) write(text string, ps pieces, a, b, at, k int) int {
	for j := a; j < b; {
		src, k2 := ps.srcAt(j, k, false)
		k = k2
		p := ps[k]
		next := b
		if k+1 < len(ps) {
			next = min(next, ps[k+1].i)
		}
		copied := p.n == p.srcN
		newLine := j > a && text[j-1] == '\n'
		if copied {
			if nl := strings.IndexByte(text[j:next], '\n'); nl >= 0 && j+nl+1 < next {
				next = j + nl + 1 // a copy stops after a line break
			}
			o.add(at+j-a, src, 1, 1, newLine)
		} else {
			o.add(at+j-a, src, p.n, p.srcN, newLine)
		}
		j = next
		o.end, _ = ps.srcAt(j, k, true)
	}
	return k
}

// charRef returns the text that a character reference at the start of s
// (s[0] == '&') stands for, as the HTML tokenizer decodes one in text
// (HTML Living Standard 13.2.5.72 "Character reference state", as
// golang.org/x/net/html implements it), and its length in s; n is 0 when
// s starts with none.
func charRef(s string) (text string, n int) {
	j := 1
	if j < len(s) && s[j] == '#' {
		j++
		hex := j < len(s) && s[j]|0x20 == 'x'
		if hex {
			j++
		}
		d := j
		for j < len(s) && (isDigit(s[j]) || hex && isHexLetter(s[j])) {
			j++
		}
		if j == d {
			return "", 0
		}
	} else {
		for j < len(s) && (isDigit(s[j]) || isHexLetter(s[j]) || s[j]|0x20 >= 'g' && s[j]|0x20 <= 'z') {
			j++
		}
	}
	if j < len(s) && s[j] == ';' {
		j++
	}
	u := html.UnescapeString(s[:j])
	if u == s[:j] {
		return "", 0
	}
	if s[1] != '#' {
		// a name without ";" may be read as its longest prefix that is a
		// name of its own ("&notit" is "¬it"): the rest stays as it is
		for k := 2; k < j && k <= 7; k++ {
			p := html.UnescapeString(s[:k])
			if p != s[:k] && len(p)+j-k == len(u) && strings.HasPrefix(u, p) && strings.HasSuffix(u, s[k:j]) {
				return p, k
			}
		}
	}
	return u, j
}

func isDigit(c byte) bool     { return '0' <= c && c <= '9' }
func isHexLetter(c byte) bool { return 'a' <= c|0x20 && c|0x20 <= 'f' }
