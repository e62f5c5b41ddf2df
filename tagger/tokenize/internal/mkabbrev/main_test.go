package main

import (
	"os"
	"path/filepath"
	"testing"

	"glossmith/internal/testenv"
)

// TestListIsCurrent regenerates the abbreviation list from the UD EWT 2.15
// training file and checks that the embedded tagger/tokenize/abbrev.txt
// matches it, so that the list never drifts from its stated source.
func TestListIsCurrent(t *testing.T) {
	train := filepath.Join(testenv.SharedDir(t, "data/ud-en-ewt"), "en_ewt-ud-train.conllu")
	f, err := os.Open(train)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	inside, final, err := count(f, train)
	if err != nil {
		t.Fatal(err)
	}
	if inside["Dr."] == 0 || final["etc."] == 0 {
		t.Fatalf("counts look wrong: Dr. %d inside, etc. %d final", inside["Dr."], final["etc."])
	}
	out := filepath.Join(t.TempDir(), "abbrev.txt")
	if err := write(out, inside, final); err != nil {
		t.Fatal(err)
	}
	got, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	want, err := os.ReadFile(filepath.Join(testenv.Root(t), "tagger", "tokenize", "abbrev.txt"))
	if err != nil {
		t.Fatal(err)
	}
	if string(got) != string(want) {
		t.Error("tagger/tokenize/abbrev.txt is out of date; run: go run ./tagger/tokenize/internal/mkabbrev")
	}
}
