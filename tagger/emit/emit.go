// Package emit writes annotated documents in the formats of `glossmith tag`:
// CoNLL-U (through package conllu), TSV with a header row, JSON Lines with
// one object per sentence, and plain text with word/TAG pairs.
package emit

import (
	"bufio"
	"encoding/json"
	"fmt"
	"io"
	"strings"

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
		return &tsvWriter{w: bufio.NewWriter(w)}, nil
	case "jsonl":
		return &jsonWriter{w: bufio.NewWriter(w)}, nil
	case "text":
		return &textWriter{w: bufio.NewWriter(w), upos: opt.Tagset == "upos"}, nil
	}
	return nil, fmt.Errorf("unknown output format %q (want one of %s)", format, strings.Join(Formats, ", "))
}

type conllUWriter struct{ *conllu.Writer }

func (c conllUWriter) Write(d *doc.Document) error { return c.WriteDocument(d) }

type tsvWriter struct {
	w      *bufio.Writer
	header bool
}

// TSV columns: one row per token; sentence numbers count from 1 within
// each document, token numbers from 1 within each sentence.
var tsvHeader = "doc\tsentence\ttoken\tform\tlemma\tupos\txpos\tline\tstart\tend\tspace_after\n"

func (t *tsvWriter) Write(d *doc.Document) error {
	if !t.header {
		t.w.WriteString(tsvHeader)
		t.header = true
	}
	name := tsvCell(d.Name)
	for si := range d.Sentences {
		for ti, tok := range d.Sentences[si].Tokens {
			fmt.Fprintf(t.w, "%s\t%d\t%d\t%s\t%s\t%s\t%s\t%d\t%d\t%d\t%t\n", name, si+1, ti+1,
				tsvCell(tok.Form), tsvCell(tok.Lemma), tsvCell(tok.UPOS), tsvCell(tok.XPOS),
				tok.Line, tok.Start, tok.End, tok.SpaceAfter)
		}
	}
	return nil
}

func (t *tsvWriter) Flush() error { return t.w.Flush() }

// tsvCell keeps a value on one TSV cell: tabs and line breaks become spaces.
func tsvCell(s string) string {
	if strings.ContainsAny(s, "\t\n\r") {
		return strings.NewReplacer("\t", " ", "\n", " ", "\r", " ").Replace(s)
	}
	return s
}

type jsonWriter struct{ w *bufio.Writer }

type jsonToken struct {
	Form       string `json:"form"`
	Lemma      string `json:"lemma"`
	UPOS       string `json:"upos"`
	XPOS       string `json:"xpos"`
	Start      int    `json:"start"`
	End        int    `json:"end"`
	SpaceAfter bool   `json:"space_after"`
}

type jsonSentence struct {
	Doc      string      `json:"doc"`
	Sentence int         `json:"sentence"`
	Line     int         `json:"line"`
	Text     string      `json:"text"`
	Tokens   []jsonToken `json:"tokens"`
}

func (j *jsonWriter) Write(d *doc.Document) error {
	enc := json.NewEncoder(j.w)
	enc.SetEscapeHTML(false)
	for si := range d.Sentences {
		s := &d.Sentences[si]
		js := jsonSentence{Doc: d.Name, Sentence: si + 1, Line: s.Line(), Text: conllu.SentenceText(d, s),
			Tokens: make([]jsonToken, len(s.Tokens))}
		for i, t := range s.Tokens {
			js.Tokens[i] = jsonToken{t.Form, t.Lemma, t.UPOS, t.XPOS, int(t.Start), int(t.End), t.SpaceAfter}
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

// Write prints one sentence per line as word/TAG pairs separated by spaces;
// untagged tokens print as the bare word.
func (x *textWriter) Write(d *doc.Document) error {
	for si := range d.Sentences {
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
