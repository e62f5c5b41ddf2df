package pattern

import (
	"path/filepath"
	"reflect"
	"testing"

	"glossmith/internal/testenv"
)

// AppendNested gives what FindNested gives, after whatever the slice held,
// whether the slice is new or reused from the last sentence. Checked with
// the stock rule sets (one with slots) over the UD English EWT dev
// sentences with their gold tags.
func TestAppendNestedIsFindNested(t *testing.T) {
	dir := testenv.SharedDir(t, "data/ud-en-ewt")
	sents := readTreebank(t, filepath.Join(dir, "en_ewt-ud-dev.conllu"))
	for _, set := range []string{"terms", "pairs"} {
		m, err := CompileStock(set)
		if err != nil {
			t.Fatal(err)
		}
		var reused []Match
		matches := 0
		for _, s := range sents {
			want := m.FindNested(s.tokens)
			matches += len(want)
			reused = m.AppendNested(reused[:0], s.tokens)
			if len(want) == 0 && len(reused) == 0 {
				continue
			}
			if !reflect.DeepEqual(reused, want) {
				t.Fatalf("%s: reused slice %+v, FindNested %+v", set, reused, want)
			}
			prefix := []Match{{Rule: "before", Start: -1, End: -1}}
			got := m.AppendNested(prefix, s.tokens)
			if !reflect.DeepEqual(got[0], prefix[0]) || !reflect.DeepEqual(got[1:], want) {
				t.Fatalf("%s: after a match, %+v; FindNested %+v", set, got, want)
			}
		}
		if matches < len(sents) {
			t.Fatalf("%s: only %d matches in %d sentences: the test would prove little", set, matches, len(sents))
		}
	}
}
