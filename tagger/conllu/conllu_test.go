package conllu

import (
	"errors"
	"io"
	"strings"
	"testing"
)

// row builds one CoNLL-U token line from its ten columns.
func row(cols ...string) string { return strings.Join(cols, "\t") + "\n" }

// Malformed lines are reported with the file name and the line number, in
// the file:line form of Go's own tools, and reading goes on with the next
// sentence.
func TestMalformedLinesNameFileAndLine(t *testing.T) {
	good := row("1", "Valves", "valve", "NOUN", "NNS", "_", "0", "root", "_", "_") + "\n"
	cases := []struct {
		name, input string
		line        int
		want        string
	}{
		{"too few columns", "# sent_id = a\n" + row("1", "Valve", "valve", "NOUN", "NN") + "\n", 2, "columns"},
		{"too many columns", row("1", "Valve", "valve", "NOUN", "NN", "_", "0", "root", "_", "_", "extra") + "\n", 1, "columns"},
		{"bad ID", "# text = x\n# sent_id = b\n" + row("one", "Valve", "valve", "NOUN", "NN", "_", "0", "root", "_", "_") + "\n", 3, "bad ID"},
		{"zero ID", row("0", "Valve", "valve", "NOUN", "NN", "_", "0", "root", "_", "_") + "\n", 1, "bad ID"},
		{"ID out of sequence", row("1", "The", "the", "DET", "DT", "_", "2", "det", "_", "_") +
			row("3", "valve", "valve", "NOUN", "NN", "_", "0", "root", "_", "_") + "\n", 2, "out of sequence"},
		{"bad range", row("2-1", "don't", "_", "_", "_", "_", "_", "_", "_", "_") + "\n", 1, "range"},
	}
	for _, c := range cases {
		r := NewReader(strings.NewReader(c.input+good), "manual.conllu")
		var got []*Sentence
		for {
			s, err := r.Next()
			if errors.Is(err, io.EOF) {
				break
			}
			if err != nil {
				t.Fatalf("%s: %v", c.name, err)
			}
			got = append(got, s)
		}
		errs := r.Errors()
		if len(errs) != 1 {
			t.Errorf("%s: %d errors (%v), want 1", c.name, len(errs), errs)
			continue
		}
		e := errs[0]
		if e.File != "manual.conllu" || e.Line != c.line || !strings.Contains(e.Msg, c.want) {
			t.Errorf("%s: got %q, want manual.conllu:%d mentioning %q", c.name, e.Error(), c.line, c.want)
		}
		if !strings.HasPrefix(e.Error(), "manual.conllu:") {
			t.Errorf("%s: message %q does not start with file:line", c.name, e.Error())
		}
		// The good sentence after the bad one is still read.
		if len(got) != 1 || got[0].Tokens[0].Form != "Valves" {
			t.Errorf("%s: sentences after the error: %v", c.name, got)
		}
	}
}

func TestReadAllReturnsErrorList(t *testing.T) {
	in := row("1", "Valve", "valve", "NOUN") + "\n" + row("1", "Valves", "valve", "NOUN", "NNS", "_", "0", "root", "_", "_")
	sents, err := ReadAll(strings.NewReader(in), "x.conllu")
	var list ErrorList
	if !errors.As(err, &list) || len(list) != 1 || list[0].Line != 1 {
		t.Fatalf("err = %v, want one error at line 1", err)
	}
	if len(sents) != 1 || sents[0].Tokens[0].UPOS != "NOUN" || sents[0].Tokens[0].XPOS != "NNS" {
		t.Errorf("sentences = %+v", sents)
	}
}
