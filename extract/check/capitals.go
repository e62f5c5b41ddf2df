package check

import (
	"glossmith/tagger/doc"
	"glossmith/tagger/titlecase"
)

// docCapitals is what the misspelling pass knows of one document's
// capitals: a capitalized word is read as a misspelling only where its
// capital is the writing's — a sentence's first word ("Vavle seat worn"),
// the words of a heading the reader marked ("Replacing the Solenoid
// Vavle"), the words of a heading or line in capitals ("SOLENOID VAVLE")
// — and never when the document's running text writes the word with
// capitals of its own: a name ("Vavleco pumps") or an acronym.
type docCapitals struct {
	sents []doc.Sentence
	// own holds the words the running text writes with capitals of their
	// own (titlecase.OwnCapitals), built when a capitalized word first
	// reads as a misspelling or a term's plural; nil before.
	own map[string]struct{}
	// keep tells the lower-case words own is to record: those that may be
	// misspellings or plurals of the glossary's words at all.
	keep func([]byte) bool
	buf  []byte // the lower case of the word being read
	// capsLine tells whether the heading sentence, or the tokens of
	// sentence on line (-1 for a heading), are in capitals: worked out once
	// for all their words. sentence is -1 before.
	sentence int
	line     int32
	capsLine bool
}

// lowered puts into c.buf the lower case of the capitalized word toks[k]
// of sentence si (two letters or more), and reports whether the word's
// capitals are the writing's: a word in title case ("Vavle") that is a
// heading's or whose capital any word would have there
// (titlecase.CapitalOfWriting), or a word in capitals ("VAVLE") in a
// heading or line in capitals (titlecase.AllCaps, CapsLine). A word in
// capitals in a line with lower case may be an acronym, and mixed shapes
// ("VaVle") are no writing's. Only the letters A–Z and a–z are read. The
// word's place is looked at first: most capitalized words are names
// inside sentences.
func (c *docCapitals) lowered(si, k int) bool {
	s := &c.sents[si]
	form := s.Tokens[k].Form
	lo, hi := byte('a'), byte('z') // the letters after the first: title case
	switch {
	case form[1] > 'Z':
		if !s.Heading && !titlecase.CapitalOfWriting(s.Tokens, k) {
			return false
		}
	case s.Heading:
		lo, hi = 'A', 'Z'
		if c.sentence != si {
			c.sentence, c.line, c.capsLine = si, -1, titlecase.AllCaps(s.Tokens)
		}
		if !c.capsLine {
			return false
		}
	default:
		lo, hi = 'A', 'Z'
		if line := s.Tokens[k].Line; c.sentence != si || c.line != line {
			c.sentence, c.line, c.capsLine = si, line, titlecase.CapsLine(s.Tokens, k)
		}
		if !c.capsLine {
			return false
		}
	}
	for i := 1; i < len(form); i++ {
		if form[i] < lo || form[i] > hi {
			return false
		}
	}
	c.buf = append(c.buf[:0], form...)
	for i, b := range c.buf {
		c.buf[i] = b | 0x20 // A–Z to a–z; a–z stay
	}
	return true
}

// ownCapitals reports whether the document's running text writes the
// lower-cased word w, one that c.keep keeps, with capitals of its own.
func (c *docCapitals) ownCapitals(w []byte) bool {
	if c.own == nil {
		c.own = titlecase.OwnCapitals(c.sents, c.keep)
	}
	_, ok := c.own[string(w)]
	return ok
}
