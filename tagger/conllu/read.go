// Package conllu reads and writes the CoNLL-U format of Universal
// Dependencies (https://universaldependencies.org/format.html).
//
// glossmith reads CoNLL-U in two roles: as training and evaluation data for
// the tagger, and as user input that is already tokenized (and perhaps
// hand-annotated), whose tokens and sentence breaks must be kept as given.
// It writes CoNLL-U as one of the outputs of `glossmith tag`.
//
// Only the columns glossmith uses are interpreted (ID, FORM, LEMMA, UPOS,
// XPOS and SpaceAfter in MISC); the others are checked for presence only.
// Of the comments, "sent_id", "text", "newdoc", "newpar" and our own
// HeadingComment are read; every comment is kept for passing through.
// Multiword tokens (ID "3-4") are read as their syntactic words, marked with
// doc.Token.FusedNext; empty nodes (ID "8.1") are skipped.
package conllu

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"
	"unicode/utf8"

	"glossmith/tagger/doc"
)

// Error is a problem at one line of a CoNLL-U file.
type Error struct {
	File string
	Line int
	Msg  string
}

func (e *Error) Error() string { return fmt.Sprintf("%s:%d: %s", e.File, e.Line, e.Msg) }

// ErrorList collects the problems of one file; reading goes on after each.
type ErrorList []*Error

func (l ErrorList) Error() string {
	switch len(l) {
	case 0:
		return "no errors"
	case 1:
		return l[0].Error()
	}
	return fmt.Sprintf("%s (and %d more errors)", l[0], len(l)-1)
}

// Err returns nil for an empty list, so callers can write `return list.Err()`.
func (l ErrorList) Err() error {
	if len(l) == 0 {
		return nil
	}
	return l
}

// Sentence is one CoNLL-U sentence with the comments glossmith uses.
type Sentence struct {
	doc.Sentence
	// Text is the "# text" comment, or empty when the sentence had none.
	Text string
	// NewDoc is set by a "# newdoc" comment before the sentence; DocID is its id.
	NewDoc bool
	DocID  string
	// Line is the file line of the sentence's first line (comment or token).
	Line int
	// surface holds, per token, the orthographic form it is part of when it
	// belongs to a multiword token, for rebuilding the text.
	surface []mwt
}

type mwt struct {
	first, last int // token indices in the sentence
	form        string
	spaceAfter  bool
}

// MaxLine is the longest line the reader accepts; longer lines are an error
// for that sentence rather than a reason to exhaust memory.
const MaxLine = 1 << 20

// Reader reads sentences one at a time from a CoNLL-U stream.
type Reader struct {
	// KeepRows keeps each sentence's lines in Sentence.Rows, for writing
	// the sentence back as given (ReadAllRows sets it).
	KeepRows bool

	r     *bufio.Reader
	name  string
	line  int
	errs  ErrorList
	eof   bool
	inBad bool // the current sentence already has an error
}

// NewReader returns a reader; name is used in error messages.
func NewReader(r io.Reader, name string) *Reader {
	return &Reader{r: bufio.NewReaderSize(r, 64<<10), name: name}
}

// Errors returns the problems met so far. Malformed sentences are skipped,
// so the sentences Next returns are always well formed.
func (r *Reader) Errors() ErrorList { return r.errs }

func (r *Reader) errorf(line int, format string, args ...any) {
	if r.inBad {
		return // one error per sentence: the rest would only follow from it
	}
	r.inBad = true
	r.errs = append(r.errs, &Error{File: r.name, Line: line, Msg: fmt.Sprintf(format, args...)})
}

// readLine returns the next line without its line break. Overlong lines are
// consumed and reported as too long (ok=false).
func (r *Reader) readLine() (line string, ok bool, err error) {
	var b []byte
	tooLong := false
	for {
		frag, isPrefix, e := r.r.ReadLine()
		if e != nil {
			if e == io.EOF && (len(b) > 0 || tooLong) {
				break
			}
			return "", false, e
		}
		if !tooLong {
			if len(b)+len(frag) > MaxLine {
				tooLong = true
				b = nil
			} else {
				b = append(b, frag...)
			}
		}
		if !isPrefix {
			break
		}
	}
	r.line++
	if tooLong {
		return "", false, nil
	}
	return string(b), true, nil
}

// Next returns the next well-formed sentence, or io.EOF at the end. Problems
// are collected in Errors; a malformed sentence is skipped whole.
func (r *Reader) Next() (*Sentence, error) {
	for !r.eof {
		s, bad, err := r.readSentence()
		if err != nil {
			return nil, err
		}
		if s == nil {
			continue
		}
		if bad {
			continue
		}
		return s, nil
	}
	return nil, io.EOF
}

// readSentence reads up to the next blank line. It returns nil when there
// was nothing but blank lines.
func (r *Reader) readSentence() (s *Sentence, bad bool, err error) {
	var (
		expectID = 1
		mwtEnd   = 0 // last word ID covered by an open multiword token
	)
	r.inBad = false
	for {
		line, ok, e := r.readLine()
		if e == io.EOF {
			r.eof = true
			break
		}
		if e != nil {
			return nil, false, fmt.Errorf("%s: %w", r.name, e)
		}
		if !ok {
			if s == nil {
				s = &Sentence{Line: r.line}
			}
			r.errorf(r.line, "line longer than %d bytes", MaxLine)
			bad = true
			continue
		}
		line = strings.TrimRight(line, "\r")
		if strings.TrimSpace(line) == "" {
			if s != nil {
				break
			}
			continue
		}
		if s == nil {
			s = &Sentence{Line: r.line}
		}
		if r.KeepRows {
			s.Rows = append(s.Rows, line)
		}
		if !utf8.ValidString(line) {
			r.errorf(r.line, "invalid UTF-8")
			bad = true
			continue
		}
		if line[0] == '#' {
			r.comment(s, line)
			continue
		}
		cols := strings.Split(line, "\t")
		if len(cols) != 10 {
			r.errorf(r.line, "%d columns, want 10 tab-separated columns", len(cols))
			bad = true
			continue
		}
		id := cols[0]
		switch {
		case strings.Contains(id, "."):
			if _, err := strconv.ParseFloat(id, 64); err != nil {
				r.errorf(r.line, "bad ID %q", id)
				bad = true
			}
			continue // empty node: not a token
		case strings.Contains(id, "-"):
			a, b, ok := parseRange(id)
			if !ok || a != expectID || b <= a {
				r.errorf(r.line, "bad multiword token range %q (expected it to start at %d)", id, expectID)
				bad = true
				continue
			}
			s.surface = append(s.surface, mwt{first: len(s.Tokens), last: len(s.Tokens) + b - a,
				form: cols[1], spaceAfter: spaceAfter(cols[9])})
			mwtEnd = b
			continue
		}
		n, err := strconv.Atoi(id)
		if err != nil || n < 1 {
			r.errorf(r.line, "bad ID %q", id)
			bad = true
			continue
		}
		if n != expectID {
			r.errorf(r.line, "ID %d out of sequence, want %d", n, expectID)
			bad = true
			expectID = n + 1
			continue
		}
		expectID++
		if cols[1] == "" {
			r.errorf(r.line, "empty FORM")
			bad = true
			continue
		}
		t := doc.Token{
			Form:       cols[1],
			Line:       int32(r.line),
			SpaceAfter: spaceAfter(cols[9]),
			Lemma:      field(cols[2]),
			UPOS:       field(cols[3]),
			XPOS:       field(cols[4]),
		}
		if n < mwtEnd {
			t.FusedNext = true
			t.SpaceAfter = false
		}
		s.Tokens = append(s.Tokens, t)
	}
	if s != nil && !bad && len(s.Tokens) == 0 {
		r.errorf(s.Line, "sentence without tokens")
		bad = true
	}
	// The space after a multiword token belongs to its last word.
	if s != nil && !bad {
		for _, m := range s.surface {
			if m.last < len(s.Tokens) {
				s.Tokens[m.last].SpaceAfter = m.spaceAfter
			} else {
				r.errorf(s.Line, "multiword token %q runs past the end of the sentence", m.form)
				bad = true
			}
		}
	}
	return s, bad, nil
}

func (r *Reader) comment(s *Sentence, line string) {
	key, val, ok := strings.Cut(strings.TrimSpace(line[1:]), "=")
	key = strings.TrimSpace(key)
	val = strings.TrimSpace(val)
	switch {
	case key == "sent_id" && ok:
		s.ID = val
	case key == "text" && ok:
		s.Text = val
	case key == "heading" && ok:
		// Only our own value marks a heading: a comment of another
		// tool that happens to use the key with other values is kept
		// as a comment and changes nothing.
		s.Heading = val == "yes"
	case strings.HasPrefix(key, "newdoc"):
		s.NewDoc, s.NewPar = true, true
		s.DocID = val
	case strings.HasPrefix(key, "newpar"):
		s.NewPar = true
	}
}

func parseRange(id string) (a, b int, ok bool) {
	x, y, found := strings.Cut(id, "-")
	if !found {
		return 0, 0, false
	}
	a, err1 := strconv.Atoi(x)
	b, err2 := strconv.Atoi(y)
	return a, b, err1 == nil && err2 == nil && a >= 1
}

func field(s string) string {
	if s == "_" {
		return ""
	}
	return s
}

// spaceAfter reads the SpaceAfter=No flag of a MISC column.
func spaceAfter(misc string) bool {
	if misc == "_" || misc == "" {
		return true
	}
	for _, kv := range strings.Split(misc, "|") {
		if kv == "SpaceAfter=No" {
			return false
		}
	}
	return true
}

// ReadAll reads every sentence of a stream. The error is an ErrorList of the
// malformed lines (their sentences are left out) or an I/O error.
func ReadAll(rd io.Reader, name string) ([]*Sentence, error) {
	return readAll(NewReader(rd, name))
}

// ReadAllRows is ReadAll keeping each sentence's lines in Rows, for input
// that is to be written back as given.
func ReadAllRows(rd io.Reader, name string) ([]*Sentence, error) {
	r := NewReader(rd, name)
	r.KeepRows = true
	return readAll(r)
}

func readAll(r *Reader) ([]*Sentence, error) {
	var out []*Sentence
	for {
		s, err := r.Next()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			return out, err
		}
		out = append(out, s)
	}
	return out, r.Errors().Err()
}

// Document builds a glossmith document from sentences read from one file.
// Its Text is rebuilt from the token forms and their SpaceAfter flags (a
// multiword token contributes its surface form once), sentences end with a
// line break and paragraphs ("# newpar", "# newdoc") with a blank line, so
// that every token's offsets point at its own characters. The lines of
// sentences marked as headings (HeadingComment) are the document's Headings.
func Document(name string, sents []*Sentence) *doc.Document {
	d := &doc.Document{Name: name, Format: "conllu", Pretokenized: true}
	var b strings.Builder
	line := int32(1) // of Text: every sentence is one line
	for i, s := range sents {
		if i > 0 {
			if s.NewPar {
				b.WriteString("\n\n")
				line += 2
			} else {
				b.WriteString("\n")
				line++
			}
		}
		if s.Heading {
			d.Headings = append(d.Headings, doc.LineRange{First: line, Last: line})
		}
		ds := s.Sentence
		ds.Index = i
		ds.Tokens = append([]doc.Token(nil), s.Tokens...)
		placeTokens(&b, &ds, s.surface)
		d.Sentences = append(d.Sentences, ds)
	}
	d.Text = b.String()
	return d
}

// placeTokens appends the sentence's surface text to b and sets each token's
// offsets. Words of a multiword token get consecutive pieces of its surface
// form when their forms spell it out (as in UD English, "do"+"n't"), and
// otherwise share its span: the first word gets the whole form and the
// others an empty span at its end, so spans never overlap.
func placeTokens(b *strings.Builder, s *doc.Sentence, surface []mwt) {
	k := 0
	for i := 0; i < len(s.Tokens); {
		if k < len(surface) && surface[k].first == i {
			m := surface[k]
			k++
			start := b.Len()
			b.WriteString(m.form)
			end := b.Len()
			var joined strings.Builder
			for j := m.first; j <= m.last; j++ {
				joined.WriteString(s.Tokens[j].Form)
			}
			pos := start
			spelled := joined.String() == m.form
			for j := m.first; j <= m.last; j++ {
				t := &s.Tokens[j]
				t.Start = int32(pos)
				if spelled {
					pos += len(t.Form)
				} else if j == m.first {
					pos = end
				}
				t.End = int32(pos)
			}
			if m.spaceAfter && m.last < len(s.Tokens)-1 {
				b.WriteByte(' ')
			}
			i = m.last + 1
			continue
		}
		t := &s.Tokens[i]
		t.Start = int32(b.Len())
		b.WriteString(t.Form)
		t.End = int32(b.Len())
		if t.SpaceAfter && i < len(s.Tokens)-1 {
			b.WriteByte(' ')
		}
		i++
	}
}
