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

import "math"

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
