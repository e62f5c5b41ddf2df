// Package doc is glossmith's small data model: a document's plain text and
// the sentences of tokens cut from it. Every other package imports it, so it
// holds data only — no reading, tokenizing or tagging logic.
//
// A token always knows its way back to the source: its byte offsets into the
// document's Text and the line on which it starts. Rebuilding the text from
// the tokens and the white space between them gives the text back exactly;
// this is what lets CoNLL-U output carry SpaceAfter=No and what lets a
// concordance or a glossary context quote the original words.
package doc

import (
	"cmp"
	"math"
	"slices"
	"unicode/utf8"
)

// Token is one word or punctuation mark of a sentence.
type Token struct {
	// Form is the token as written. For text read from a document it equals
	// Text[Start:End] of the document; for CoNLL-U input it is the FORM column.
	Form string
	// Start and End are byte offsets into Document.Text (End exclusive),
	// 32-bit: a document's text is at most MaxText bytes. (Tokens are the
	// bulk of what annotation writes and reads; at 80 bytes a token rather
	// than 96 the tokenizer's and collector's shares of a terms run fell
	// by a point and a half between them, in four alternated pairs.)
	Start, End int32
	// Line is the 1-based line of the source on which the token starts: the
	// line of the extracted text for prose formats, the token's own row for
	// CoNLL-U input, so that a user can find it again in the file they have.
	Line int32
	// SpaceAfter reports whether white space follows the token in the text.
	SpaceAfter bool
	// FusedNext marks a token that is written together with the next one as a
	// single orthographic word and was split only for analysis, as UD splits
	// clitics: "don't" = "do" + "n't", "valve's" = "valve" + "'s". CoNLL-U
	// writes such a group under one multiword-token range line.
	FusedNext bool

	// Annotation. Empty until a tagger (or a pre-tagged CoNLL-U file) fills it.
	Lemma string
	UPOS  string
	XPOS  string
}

// UPOSTags are the 17 Universal Dependencies part-of-speech tags
// (universaldependencies.org/u/pos/), in the order of that page: the
// values a token's UPOS may take.
var UPOSTags = []string{
	"ADJ", "ADP", "ADV", "AUX", "CCONJ", "DET", "INTJ", "NOUN", "NUM",
	"PART", "PRON", "PROPN", "PUNCT", "SCONJ", "SYM", "VERB", "X",
}

// MaxText is the largest Document.Text, in bytes, that token offsets can
// address. Readers refuse larger documents with an error (their default
// cap is far lower); tokenizing a longer text stops at this length.
const MaxText = math.MaxInt32

// Sentence is a run of tokens that patterns and counts never cross.
type Sentence struct {
	// ID is the sentence's identifier: the CoNLL-U "sent_id" when the input
	// carried one, otherwise empty (writers then number sentences themselves).
	ID string
	// Index is the sentence's position in its document, counted from 0.
	Index int
	// Tokens in text order.
	Tokens []Token
	// NewPar marks the first sentence of a paragraph (blank line, heading,
	// block element or "# newpar").
	NewPar bool
	// Heading marks a sentence of a heading or caption, as the document's
	// markup or layout showed it (Document.Headings). Title case is the
	// norm there, so a capital says less than in running text: the tagger
	// weighs such a sentence's capitalized words differently. A sentence
	// of CoNLL-U input is one when it carries the comment that
	// `glossmith tag` writes for headings (conllu.HeadingComment).
	Heading bool
	// Rows are the sentence's lines as a CoNLL-U input gave them (comments,
	// token rows, multiword-token and empty-node rows, without line
	// breaks), so that CoNLL-U output can pass them through and fill only
	// the empty annotation cells; nil for sentences cut from text.
	Rows []string
}

// Start returns the byte offset of the sentence's first token, or -1 for an
// empty sentence.
func (s *Sentence) Start() int {
	if len(s.Tokens) == 0 {
		return -1
	}
	return int(s.Tokens[0].Start)
}

// End returns the byte offset just past the sentence's last token, or -1.
func (s *Sentence) End() int {
	if len(s.Tokens) == 0 {
		return -1
	}
	return int(s.Tokens[len(s.Tokens)-1].End)
}

// Line returns the line on which the sentence starts, or 0 when it is empty.
func (s *Sentence) Line() int {
	if len(s.Tokens) == 0 {
		return 0
	}
	return int(s.Tokens[0].Line)
}

// Tagged reports whether every token of the sentence carries a UPOS tag.
func (s *Sentence) Tagged() bool {
	for i := range s.Tokens {
		if s.Tokens[i].UPOS == "" {
			return false
		}
	}
	return len(s.Tokens) > 0
}

// Document is one input: its name, its plain text and, once tokenized, its
// sentences.
type Document struct {
	// Name is the path as the user gave it (or "-" for standard input); for a
	// file found inside a directory, the path below that directory joined to it.
	Name string
	// Format is the reader that produced Text: txt, md, html, docx, pdf, conllu.
	Format string
	// Text is the document's plain text, valid UTF-8, with markup removed.
	Text string
	// Sentences, filled by the tokenizer or taken as given from CoNLL-U.
	Sentences []Sentence
	// Pretokenized is true when the sentences came with the input (CoNLL-U)
	// and must not be re-tokenized.
	Pretokenized bool
	// Headings are the lines of Text that hold headings and captions, as
	// the reader saw them in the markup (a Markdown "#" heading, an HTML
	// <h2>, a DOCX paragraph in a heading style) or the layout of plain
	// text; in line order, not overlapping. The tokenizer marks the
	// sentences inside them (Sentence.Heading). Lines, not offsets, since
	// normalization never adds or removes a line break.
	Headings []LineRange
	// Shifts map offsets of Text back to the text as the reader extracted
	// it, before Unicode normalization removed invisible characters and
	// composed others (see Shift); nil when normalization changed nothing,
	// as for ASCII text. ReadOffset, ReadEnd and ColumnShift read them.
	Shifts []Shift
	// Origins map offsets of the text as the reader extracted it on to
	// its source, the file as decoded with its markup and line ends as
	// LF, for formats whose text is extracted from markup (md, html):
	// markup removed, references and escapes decoded, white space
	// collapsed, breaks added (see Origin). Nil when the text is its
	// source (txt) or none is kept (docx, pdf, conllu). ReadOffset and ReadEnd go through them
	// after Shifts, and SourcePosition reads their lines and columns.
	Origins []Origin
	// Source maps offsets of the source (the text as read, or what
	// Origins point into) on to bytes of the file (after gzip) where they
	// differ: a byte-order mark, CRLF line ends, an encoding other than
	// UTF-8, bytes replaced or dropped (see SourceRun). Nil when the
	// source is the file's bytes. ReadOffset and ReadEnd go through it
	// last.
	Source []SourceRun
}

// Origin is a point of the text as read from which it stands for its
// source at a new place or a new rate, as a SourceRun stands for the
// file: a copy (Width = FileWidth = 1), an entity ("&amp;": 1 byte of
// text for 5 of source), white space collapsed or a paragraph break
// added (FileWidth 0: every character stands at Start). Line and Col are
// the 1-based line and column, in characters, of Start in the source. A
// copy never runs past a line break (one starts a new Origin), so a
// copied character's column is Col plus the characters before it.
type Origin struct {
	SourceRun
	Line, Col int32
}

// copied reports whether the text from the origin on is its source as it is.
func (o *Origin) copied() bool { return o.Width == o.FileWidth }

// SourceRun is a point of the text as read from which its characters
// stand for the file's bytes at a new place or a new rate: from offset At
// on, every Width bytes of text are FileWidth bytes of the file, starting
// at file offset Start (a UTF-16 file: 1 byte of ASCII text for 2 of the
// file; a Windows-1252 file: 2 bytes of "é" for 1). End is the file offset
// just past the character before At: Start and End differ where bytes were
// dropped between the two (a byte-order mark, the CR of a CRLF, a NUL).
// Width and FileWidth are in lowest terms, so a run of characters of
// different widths at one rate (UTF-8 read as is) is one run.
type SourceRun struct {
	At, Start, End   int32
	Width, FileWidth uint8
}

// runAt returns the index of the last run of runs at or before offset
// off (-1 when there is none); run gives the SourceRun of an element.
func runAt[R any](runs []R, off int, run func(*R) *SourceRun) int {
	k, _ := slices.BinarySearchFunc(runs, off+1, func(r R, x int) int { return cmp.Compare(int(run(&r).At), x) })
	return k - 1
}

// mapped returns where offset off, in the run's stretch, stands: the
// start of the character there or (end) the end of the one before.
func (s *SourceRun) mapped(off int, end bool) int {
	if end && int(s.At) == off {
		return int(s.End)
	}
	return int(s.Start) + int(int64(off-int(s.At))*int64(s.FileWidth)/int64(s.Width))
}

func sourceRun(s *SourceRun) *SourceRun { return s }
func originRun(o *Origin) *SourceRun    { return &o.SourceRun }

// sourceAt returns the file offset of offset off of the source.
func (d *Document) sourceAt(off int, end bool) int {
	if k := runAt(d.Source, off, sourceRun); k >= 0 {
		return d.Source[k].mapped(off, end)
	}
	return off
}

// originAt returns the source offset of offset off of the text as read.
func (d *Document) originAt(off int, end bool) int {
	if k := runAt(d.Origins, off, originRun); k >= 0 {
		return d.Origins[k].mapped(off, end)
	}
	return off
}

// LineRange is a run of lines of a document's Text, First to Last, both
// 1-based and inclusive.
type LineRange struct{ First, Last int32 }

// Shift is a point of Text from which its offsets stop lining up with the
// text as read: after a removed soft hyphen, say, every later byte of Text
// stands one character and two bytes further on in the text as read.
// Between two shifts (and before the first) the offsets differ by the
// same amount, so only the points where that amount changes are kept.
type Shift struct {
	// At is the offset in Text.
	At int32
	// Start is the offset in the text as read of the character at At,
	// End the offset just past the character before it: they differ when
	// characters were removed between the two.
	Start, End int32
	// Runes is how many characters more the text as read has than Text
	// before At (Start).
	Runes int32
}

// shiftAt returns the last shift at or before offset off of Text, or the
// zero Shift (offsets the same) when there is none.
func (d *Document) shiftAt(off int) Shift {
	k, _ := slices.BinarySearchFunc(d.Shifts, off+1, func(s Shift, x int) int { return cmp.Compare(int(s.At), x) })
	if k == 0 {
		return Shift{}
	}
	return d.Shifts[k-1]
}

// ReadOffset returns the offset in the text as read (before
// normalization; in the source where Origins map it, in the file's bytes
// where Source maps them) of the character that starts at offset off of
// Text.
func (d *Document) ReadOffset(off int) int {
	if d.Shifts != nil {
		s := d.shiftAt(off)
		off = int(s.Start) + off - int(s.At)
	}
	if d.Origins != nil {
		off = d.originAt(off, false)
	}
	if d.Source != nil {
		off = d.sourceAt(off, false)
	}
	return off
}

// ReadEnd returns the offset in the text as read (in the source, in the
// file's bytes where Origins and Source map them) just past the character that ends at offset off
// of Text: characters removed right after it are not included, as
// ReadOffset skips those right before a character.
func (d *Document) ReadEnd(off int) int {
	if d.Shifts != nil {
		s := d.shiftAt(off)
		if int(s.At) == off {
			off = int(s.End)
		} else {
			off = int(s.Start) + off - int(s.At)
		}
	}
	if d.Origins != nil {
		off = d.originAt(off, true)
	}
	if d.Source != nil {
		off = d.sourceAt(off, true)
	}
	return off
}

// ColumnShift returns what turns a column counted in the characters of
// Text into one of the text as read, for offset off on the line that
// starts at offset lineStart: the characters normalization removed or
// composed on that line before off. (Lines are never joined or split by
// normalization.)
func (d *Document) ColumnShift(lineStart, off int) int {
	if d.Shifts == nil {
		return 0
	}
	before := 0
	if lineStart > 0 { // from the line break on: what was cut at the line's start counts
		before = int(d.shiftAt(lineStart - 1).Runes)
	}
	return int(d.shiftAt(off).Runes) - before
}

// SourcePosition returns the 1-based line and column, in characters, in
// the source (see Origins) of the character that starts at offset off of
// Text or, with end, of the point just past the one that ends there; ok is
// false for a document without Origins, whose lines and columns are those
// of Text (see ColumnShift). Markup a character stands for (an entity) is
// ASCII, so its columns are its bytes.
func (d *Document) SourcePosition(off int, end bool) (line, col int, ok bool) {
	if d.Origins == nil {
		return 0, 0, false
	}
	r := off // in the text as read
	if d.Shifts != nil {
		if s := d.shiftAt(off); end && int(s.At) == off {
			r = int(s.End)
		} else {
			r = int(s.Start) + off - int(s.At)
		}
	}
	at := r
	if end && r > 0 {
		at = r - 1 // the origin of the character before
	}
	k := runAt(d.Origins, at, originRun)
	if k < 0 {
		return 1, 1, true // before the first origin: nothing extracted
	}
	o := &d.Origins[k]
	if !o.copied() {
		return int(o.Line), int(o.Col) + max(o.mapped(r, end)-int(o.Start), 0), true
	}
	return int(o.Line), int(o.Col) + d.readRunes(int(o.At), r, off), true
}

// readRunes returns how many characters the text as read has from offset
// a to offset r, where r is offset off of Text, counting those that
// normalization removed or composed (see Shift).
func (d *Document) readRunes(a, r, off int) int {
	if d.Shifts == nil {
		return utf8.RuneCountInString(d.Text[min(a, off):off])
	}
	// the offset of Text where a stands: the last shift starting at or
	// before it, and no further than the next shift
	k, _ := slices.BinarySearchFunc(d.Shifts, a+1, func(s Shift, x int) int { return cmp.Compare(int(s.Start), x) })
	ta := a
	if k > 0 {
		s := d.Shifts[k-1]
		ta = int(s.At) + a - int(s.Start)
	}
	if k < len(d.Shifts) {
		ta = min(ta, int(d.Shifts[k].At))
	}
	ta = min(ta, off)
	return utf8.RuneCountInString(d.Text[ta:off]) + int(d.shiftAt(off).Runes) - int(d.shiftAt(ta).Runes)
}

// Tagged reports whether every sentence of the document carries tags, so a
// tagger can leave it alone (hand-annotated CoNLL-U input).
func (d *Document) Tagged() bool {
	for i := range d.Sentences {
		if !d.Sentences[i].Tagged() {
			return false
		}
	}
	return len(d.Sentences) > 0
}

// TokenCount returns the number of tokens in all sentences.
func (d *Document) TokenCount() int {
	n := 0
	for i := range d.Sentences {
		n += len(d.Sentences[i].Tokens)
	}
	return n
}

// LineAt returns the 1-based line number of byte offset off in Text.
func (d *Document) LineAt(off int) int {
	line := 1
	if off > len(d.Text) {
		off = len(d.Text)
	}
	for i := 0; i < off; i++ {
		if d.Text[i] == '\n' {
			line++
		}
	}
	return line
}
