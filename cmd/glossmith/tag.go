package main

import (
	"context"
	"strings"

	"github.com/spf13/cobra"

	"glossmith/tagger/doc"
	"glossmith/tagger/emit"
)

// tagOptions are the flags of the tag command.
type tagOptions struct {
	in      inputFlags
	to      string
	tagset  string
	outPath string
}

func newTagCmd() *cobra.Command {
	o := &tagOptions{}
	cmd := &cobra.Command{
		Use:   "tag [flags] INPUT...",
		Short: "Tokenize, sentence-split and tag documents",
		Long: `Tokenizes, sentence-splits and tags documents with the embedded model (or --model),
filling lemma, UPOS and XPOS. CoNLL-U input written as CoNLL-U keeps every
row, column and comment as given; only lemma, UPOS and XPOS cells left "_"
are filled (a fully annotated file comes back unchanged), and a sent_id that
an earlier input already used gets the document name as prefix.

Output formats (--to):
  conllu  CoNLL-U with # sent_id and # text; SpaceAfter=No in MISC
  tsv     one row per token with a header row; a field holding a tab, quote
          or line break is quoted as in RFC 4180
  jsonl   one JSON object per sentence with its tokens
  text    one sentence per line as word/TAG pairs (--tagset xpos|upos)

A token's start and end (TSV, JSON Lines) are byte offsets of the file
(after gzip) for plain text, Markdown and HTML: slicing the file there gives
the token with its markup; for DOCX and PDF, of the extracted text.

Sentences of headings and captions are marked: "# heading = yes" in
CoNLL-U (read back from CoNLL-U input), a heading column (TSV) or field
(JSON Lines) true or false, a line starting "# " in text.`,
		Example: `  glossmith tag --to conllu testdata/demo
  glossmith tag --to text --tagset upos manual.md
  glossmith tag --from conllu --to tsv annotated.conllu
  glossmith tag -o corpus.conllu manuals/`,
		RunE: validateThenRun(o.validate, o.run),
	}
	o.register(cmd)
	return cmd
}

// tagsets are the values of tag --tagset.
var tagsets = []string{"xpos", "upos"}

func (o *tagOptions) register(cmd *cobra.Command) {
	o.in.register(cmd, true)
	fl := cmd.Flags()
	fl.StringVar(&o.to, "to", "conllu", "output format: "+strings.Join(emit.Formats, ", ")+" (default: from the -o extension, else conllu)")
	fl.StringVar(&o.tagset, "tagset", "xpos", "tag shown by --to text: "+strings.Join(tagsets, " or "))
	fl.StringVarP(&o.outPath, "output", "o", "", "write to this file (complete or not at all) instead of standard output")
	completeChoices(cmd, "to", emit.Formats)
	completeChoices(cmd, "tagset", tagsets)
}

// validate checks every flag value before any input is read.
func (o *tagOptions) validate(cmd *cobra.Command, args []string) error {
	if err := o.in.validateWithOutput(cmd, &o.to, o.outPath, emit.Formats); err != nil {
		return err
	}
	if err := checkChoice("tagset", o.tagset, tagsets); err != nil {
		return err
	}
	return needInputs(args)
}

func (o *tagOptions) run(args []string) error {
	tagger, err := loadTagger(o.in.model)
	if err != nil {
		return err
	}
	out, err := openOutput(o.outPath)
	if err != nil {
		return err
	}
	defer out.abort()
	w, err := emit.New(o.to, out, emit.Options{Tagset: o.tagset})
	if err != nil {
		return err
	}
	var werr error
	o.in.reuseTokens = true // each document is written out before the next
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	o.in.ctx = ctx // a failed write (a full disk) stops reading
	st, runErr := runDocs(&o.in, args, tagger, nil, func(d *doc.Document, _ struct{}) {
		if werr == nil {
			werr = w.Write(d)
		}
		if werr != nil {
			cancel()
		}
	})
	if err := w.Flush(); err != nil && werr == nil {
		werr = err
	}
	if werr == nil && st.Documents == 0 {
		return runErr // nothing read: an existing output file is kept
	}
	if err := out.commit(werr); err != nil {
		return err
	}
	return runErr
}
