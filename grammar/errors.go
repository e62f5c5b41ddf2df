package grammar

import (
	"fmt"
	"sort"
	"strings"
	"unicode/utf8"
)

// Pos is a place in a rule file. Line and Col are 1-based; Col counts
// characters (runes), not bytes, so that a caret lines up under the text a
// person sees. Offset is the byte offset, kept for tools.
type Pos struct {
	File   string
	Line   int
	Col    int
	Offset int
}

// String renders the position as file:line:col, the form editors jump to.
func (p Pos) String() string {
	if p.File == "" {
		return fmt.Sprintf("%d:%d", p.Line, p.Col)
	}
	return fmt.Sprintf("%s:%d:%d", p.File, p.Line, p.Col)
}

// IsValid reports whether the position points into a file.
func (p Pos) IsValid() bool { return p.Line > 0 }

// Error is one positioned problem in a rule file.
type Error struct {
	Pos Pos
	Msg string
	// Source is the text of the line Pos points at (without its newline),
	// empty when the line is unknown; Caret uses it.
	Source string
}

func (e *Error) Error() string {
	switch {
	case e.Pos.IsValid():
		return e.Pos.String() + ": " + e.Msg
	case e.Pos.File != "":
		return e.Pos.File + ": " + e.Msg
	}
	return e.Msg
}

// Caret returns the offending source line followed by a line with a caret
// under the column the error points at. Tabs in front of the column are
// copied so that the caret lines up in a terminal. It returns "" when the
// source line is unknown.
func (e *Error) Caret() string {
	if e.Source == "" || e.Pos.Col < 1 {
		return ""
	}
	var pad strings.Builder
	col := 1
	for _, r := range e.Source {
		if col >= e.Pos.Col {
			break
		}
		if r == '\t' {
			pad.WriteByte('\t')
		} else {
			pad.WriteByte(' ')
		}
		col++
	}
	for ; col < e.Pos.Col; col++ { // column just past the end of the line
		pad.WriteByte(' ')
	}
	return e.Source + "\n" + pad.String() + "^"
}

// ErrorList is a list of positioned errors, in the spirit of
// go/scanner.ErrorList. A nil or empty list is no error; use Err to turn a
// list into an error value.
type ErrorList []*Error

// Add appends an error at pos.
func (l *ErrorList) Add(pos Pos, source, format string, args ...any) {
	*l = append(*l, &Error{Pos: pos, Msg: fmt.Sprintf(format, args...), Source: source})
}

func (l ErrorList) Len() int      { return len(l) }
func (l ErrorList) Swap(i, j int) { l[i], l[j] = l[j], l[i] }
func (l ErrorList) Less(i, j int) bool {
	a, b := l[i].Pos, l[j].Pos
	if a.File != b.File {
		return a.File < b.File
	}
	if a.Line != b.Line {
		return a.Line < b.Line
	}
	if a.Col != b.Col {
		return a.Col < b.Col
	}
	return l[i].Msg < l[j].Msg
}

// Sort orders the list by file, line, column and message.
func (l ErrorList) Sort() { sort.Stable(l) }

// Error summarizes the list: the first error and how many follow.
func (l ErrorList) Error() string {
	switch len(l) {
	case 0:
		return "no errors"
	case 1:
		return l[0].Error()
	}
	return fmt.Sprintf("%s (and %d more errors)", l[0].Error(), len(l)-1)
}

// Err returns nil for an empty list and the list itself otherwise.
func (l ErrorList) Err() error {
	if len(l) == 0 {
		return nil
	}
	return l
}

// Format renders every error on its own line with the source line and a
// caret below it, the report `rules check` prints.
func (l ErrorList) Format() string {
	var b strings.Builder
	for _, e := range l {
		b.WriteString(e.Error())
		b.WriteByte('\n')
		if c := e.Caret(); c != "" {
			for _, line := range strings.Split(c, "\n") {
				b.WriteString("    ")
				b.WriteString(line)
				b.WriteByte('\n')
			}
		}
	}
	return b.String()
}

// lineTable maps byte offsets of one source text to positions.
type lineTable struct {
	name  string
	src   string
	start []int // byte offset at which each line starts
	// The last position computed: the parser asks for positions in
	// increasing order, so counting the characters of a line from there
	// keeps a long line from costing quadratic time.
	last Pos
}

func newLineTable(name, src string) *lineTable {
	t := &lineTable{name: name, src: src, start: []int{0}}
	for i := 0; i < len(src); i++ {
		if src[i] == '\n' {
			t.start = append(t.start, i+1)
		}
	}
	return t
}

// pos converts a byte offset into a position; offsets past the end land just
// after the last character.
func (t *lineTable) pos(off int) Pos {
	off = max(0, min(off, len(t.src)))
	line := sort.Search(len(t.start), func(i int) bool { return t.start[i] > off }) // first line starting after off
	from, col := t.start[line-1], 1
	if l := t.last; l.Line == line && l.Offset <= off && l.Offset >= from {
		from, col = l.Offset, l.Col
	}
	p := Pos{File: t.name, Line: line, Col: col + utf8.RuneCountInString(t.src[from:off]), Offset: off}
	t.last = p
	return p
}

// line returns the text of 1-based line n without its line ending.
func (t *lineTable) line(n int) string {
	if n < 1 || n > len(t.start) {
		return ""
	}
	s := t.src[t.start[n-1]:]
	if i := strings.IndexByte(s, '\n'); i >= 0 {
		s = s[:i]
	}
	return strings.TrimSuffix(s, "\r")
}

func (t *lineTable) errorf(l *ErrorList, off int, format string, args ...any) {
	p := t.pos(off)
	l.Add(p, t.line(p.Line), format, args...)
}
