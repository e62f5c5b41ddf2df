package conllu

import (
	"bytes"
	"errors"
	"io"
	"strings"
	"testing"
)

// FuzzConllu feeds arbitrary bytes to the reader. It must never panic,
// must report every problem with the file name and a line inside the
// input, and what it accepts must survive a write and a second read.
func FuzzConllu(f *testing.F) {
	f.Add([]byte("# sent_id = 1\n# text = The valve opens.\n1\tThe\tthe\tDET\tDT\t_\t2\tdet\t_\t_\n2\tvalve\tvalve\tNOUN\tNN\t_\t3\tnsubj\t_\t_\n3\topens\topen\tVERB\tVBZ\t_\t0\troot\t_\tSpaceAfter=No\n4\t.\t.\tPUNCT\t.\t_\t3\tpunct\t_\t_\n\n"))
	f.Add([]byte("1-2\tdon't\t_\t_\t_\t_\t_\t_\t_\t_\n1\tdo\tdo\tAUX\tVBP\t_\t0\troot\t_\t_\n2\tn't\tnot\tPART\tRB\t_\t1\tadvmod\t_\t_\n\n"))
	f.Add([]byte("1\ta\n\n1.1\tb\tb\tX\tX\t_\t_\t_\t_\t_\n"))
	f.Add([]byte("# newdoc id = d\n# newpar\n1\tx\tx\tX\tX\t_\t0\troot\t_\t_\r\n\r\n\xff\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		lines := bytes.Count(data, []byte("\n")) + 1
		r := NewReader(bytes.NewReader(data), "fuzz.conllu")
		var sents []*Sentence
		for {
			s, err := r.Next()
			if errors.Is(err, io.EOF) {
				break
			}
			if err != nil {
				t.Fatalf("unexpected I/O error: %v", err)
			}
			if len(s.Tokens) == 0 {
				t.Fatal("sentence without tokens accepted")
			}
			sents = append(sents, s)
		}
		for _, e := range r.Errors() {
			if e.File != "fuzz.conllu" || e.Line < 1 || e.Line > lines {
				t.Fatalf("error %q has no valid file:line (input has %d lines)", e, lines)
			}
		}
		if len(sents) == 0 {
			return
		}
		var out bytes.Buffer
		w := NewWriter(&out)
		if err := w.WriteDocument(Document("fuzz", sents)); err != nil {
			t.Fatal(err)
		}
		if err := w.Flush(); err != nil {
			t.Fatal(err)
		}
		again, err := ReadAll(bytes.NewReader(out.Bytes()), "rewritten.conllu")
		if err != nil {
			t.Fatalf("written CoNLL-U does not read back: %v\n%s", err, out.String())
		}
		if len(again) != len(sents) {
			t.Fatalf("%d sentences written, %d read back", len(sents), len(again))
		}
		for i := range sents {
			a, b := sents[i].Tokens, again[i].Tokens
			if len(a) != len(b) {
				t.Fatalf("sentence %d: %d tokens, %d after rewriting", i, len(a), len(b))
			}
			for j := range a {
				if a[j].Form != b[j].Form && !strings.ContainsAny(a[j].Form, "\t\n\r") {
					t.Fatalf("sentence %d token %d: form %q became %q", i, j, a[j].Form, b[j].Form)
				}
			}
		}
	})
}
