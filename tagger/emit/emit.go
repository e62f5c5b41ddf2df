// Package emit writes annotated documents in the formats of `glossmith tag`:
// CoNLL-U (through package conllu), TSV with a header row, JSON Lines with
// one object per sentence, and plain text with word/TAG pairs. Every format
// shows which sentences are headings or captions (doc.Sentence.Heading), so
// that a reader of the output can set them apart from running text.
package emit

import (
	"bufio"
	"fmt"
	"io"
	"strconv"
	"strings"

	"glossmith/internal/tabular"
	"glossmith/tagger/conllu"
	"glossmith/tagger/doc"
)

// Formats lists the output formats by name.
var Formats = []string{"conllu", "tsv", "jsonl", "text"}

// Writer writes documents one after the other in one format.
type Writer interface {
	Write(d *doc.Document) error
	Flush() error
}

// Options tune the writers.
type Options struct {
	// Tagset chooses the tag of the text format: "xpos" (default) or "upos".
	Tagset string
}

// New returns a writer for the named format.
func New(format string, w io.Writer, opt Options) (Writer, error) {
	switch format {
	case "conllu":
		return conllUWriter{conllu.NewWriter(w)}, nil
	case "tsv":
		return &tsvWriter{w: tabular.NewTSV(w)}, nil
	case "jsonl":
		return &jsonWriter{w: tabular.NewJSONL(w)}, nil
	case "text":
		return &textWriter{w: bufio.NewWriter(w), upos: opt.Tagset == "upos"}, nil
	}
	return nil, fmt.Errorf("unknown output format %q (want one of %s)", format, strings.Join(Formats, ", "))
}

type conllUWriter struct{ *conllu.Writer }

func (c conllUWriter) Write(d *doc.Document) error { return c.WriteDocument(d) }

type tsvWriter struct {
	w      *tabular.Writer
	header bool
}

// TSV columns: one row per token; sentence numbers count from 1 within
// each document, token numbers from 1 within each sentence; start and end
// are byte offsets of the text as read, before Unicode normalization —
// of the file's bytes for plain text and HTML (see
// doc.Document.ReadOffset) — as in JSON Lines. Fields are quoted as
// internal/tabular documents. heading, a sentence's as the other formats
// give it once per sentence, is repeated on each of its rows, as doc and
// sentence are; it comes last so that the earlier columns keep their
// places.
var tsvHeader = []string{"doc", "sentence", "token", "form", "lemma", "upos", "xpos", "line", "start", "end", "space_after", "heading"}

func (t *tsvWriter) Write(d *doc.Document) error {
	if !t.header {
		t.w.Write(tsvHeader...)
		t.header = true
	}
	for si := range d.Sentences {
		heading := strconv.FormatBool(d.Sentences[si].Heading)
		for ti, tok := range d.Sentences[si].Tokens {
			if err := t.w.Write(d.Name, strconv.Itoa(si+1), strconv.Itoa(ti+1), tok.Form, tok.Lemma, tok.UPOS, tok.XPOS,
				strconv.Itoa(int(tok.Line)), strconv.Itoa(d.ReadOffset(int(tok.Start))), strconv.Itoa(d.ReadEnd(int(tok.End))),
				strconv.FormatBool(tok.SpaceAfter), heading); err != nil {
				return err
			}
		}
	}
	return nil
}

func (t *tsvWriter) Flush() error { return t.w.Flush() }

type jsonWriter struct{ w *tabular.JSONL }

type jsonToken struct {
	Form       string `json:"form"`
	Lemma      string `json:"lemma"`
	UPOS       string `json:"upos"`
	XPOS       string `json:"xpos"`
	Start      int    `json:"start"`
	End        int    `json:"end"`
	SpaceAfter bool   `json:"space_after"`
}

// jsonSentence is one line of JSON Lines. Every field is always there, as
// space_after of a token is: heading is false for running text.
type jsonSentence struct {
	Doc      string      `json:"doc"`
	Sentence int         `json:"sentence"`
	Line     int         `json:"line"`
	Text     string      `json:"text"`
	Heading  bool        `json:"heading"`
	Tokens   []jsonToken `json:"tokens"`
}

func (j *jsonWriter) Write(d *doc.Document) error {
	enc := j.w
	for si := range d.Sentences {
		s := &d.Sentences[si]
		js := jsonSentence{Doc: d.Name, Sentence: si + 1, Line: s.Line(), Text: conllu.SentenceText(d, s),
			Heading: s.Heading, Tokens: make([]jsonToken, len(s.Tokens))}
		for i, t := range s.Tokens {
			js.Tokens[i] = jsonToken{t.Form, t.Lemma, t.UPOS, t.XPOS, d.ReadOffset(int(t.Start)), d.ReadEnd(int(t.End)), t.SpaceAfter}
		}
		if err := enc.Encode(js); err != nil {
			return err
		}
	}
	return nil
}

func (j *jsonWriter) Flush() error { return j.w.Flush() }

type textWriter struct {
	w    *bufio.Writer
	upos bool
}

// textHeading starts the line of a heading's sentence in the text format,
// as a Markdown heading starts: a "#" alone, which no token prints as
// (every token of tagged output carries its tag, a "#" of the text too).
const textHeading = "# "

// Write prints one sentence per line as word/TAG pairs separated by spaces,
// a heading's after textHeading; untagged tokens print as the bare word.
func (x *textWriter) Write(d *doc.Document) error {
	for si := range d.Sentences {
		if d.Sentences[si].Heading {
			x.w.WriteString(textHeading)
		}
		for i, t := range d.Sentences[si].Tokens {
			if i > 0 {
				x.w.WriteByte(' ')
			}
			x.w.WriteString(strings.ReplaceAll(t.Form, " ", "_"))
			tag := t.XPOS
			if x.upos || tag == "" {
				tag = t.UPOS
			}
			if tag != "" {
				x.w.WriteByte('/')
				x.w.WriteString(tag)
			}
		}
		x.w.WriteByte('\n')
	}
	return nil
}

func (x *textWriter) Flush() error { return x.w.Flush() }
