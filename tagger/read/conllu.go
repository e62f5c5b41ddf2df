package read

import (
	"errors"
	"strings"

	"glossmith/tagger/conllu"
	"glossmith/tagger/doc"
)

// conllu reads pre-tokenized CoNLL-U with the conllu package: tokens and
// sentence breaks as given, annotation columns kept, "_" left empty for the
// tagger, each sentence's lines kept for CoNLL-U output to pass through. A
// malformed sentence is left out with an Error at its line.
func (r *reader) conllu(text string) *doc.Document {
	sents, err := conllu.ReadAllRows(strings.NewReader(text), r.in.Name)
	var list conllu.ErrorList
	switch {
	case errors.As(err, &list):
		for _, e := range list {
			r.errorf(e.Line, "%s; sentence left out", e.Msg)
		}
	case err != nil:
		r.errorf(0, "%v", err)
		return nil
	}
	if len(sents) == 0 {
		if len(list) == 0 {
			r.notef(0, "no sentences")
		}
		return nil
	}
	return conllu.Document(r.in.Name, sents)
}
