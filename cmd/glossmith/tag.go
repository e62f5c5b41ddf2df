package main

import (
	"os"
	"strings"

	"github.com/spf13/cobra"

	"glossmith/tagger/doc"
	"glossmith/tagger/emit"
)

func newTagCmd() *cobra.Command {
	var (
		in     inputFlags
		to     string
		tagset string
	)
	cmd := &cobra.Command{
		Use:   "tag [flags] INPUT...",
		Short: "Tokenize, sentence-split and tag documents",
		Long: `Tokenizes, sentence-splits and tags documents with the embedded model (or --model),
filling lemma, UPOS and XPOS. CoNLL-U input whose tag and lemma columns are
filled is passed through as it is; columns left "_" are filled.

Output formats (--to):
  conllu  CoNLL-U with # sent_id and # text; SpaceAfter=No in MISC
  tsv     one row per token with a header row
  jsonl   one JSON object per sentence with its tokens
  text    one sentence per line as word/TAG pairs (--tagset xpos|upos)`,
		Example: `  glossmith tag --to conllu testdata/demo
  glossmith tag --to text --tagset upos manual.md
  glossmith tag --from conllu --to tsv annotated.conllu`,
		RunE: func(cmd *cobra.Command, args []string) error {
			w, err := emit.New(to, os.Stdout, emit.Options{Tagset: tagset})
			if err != nil {
				return err
			}
			tagger, err := loadTagger(in.model)
			if err != nil {
				return err
			}
			var werr error
			in.reuseTokens = true // each document is written out before the next
			_, runErr := runDocs(&in, args, tagger, nil, func(d *doc.Document, _ struct{}) {
				if werr == nil {
					werr = w.Write(d)
				}
			})
			if err := w.Flush(); err != nil && werr == nil {
				werr = err
			}
			if werr != nil {
				return werr
			}
			return runErr
		},
	}
	in.register(cmd, true)
	cmd.Flags().StringVar(&to, "to", "conllu", "output format: "+strings.Join(emit.Formats, ", "))
	cmd.Flags().StringVar(&tagset, "tagset", "xpos", "tag shown by --to text: xpos or upos")
	return cmd
}
