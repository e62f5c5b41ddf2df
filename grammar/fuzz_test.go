package grammar

import (
	"strings"
	"testing"
	"unicode/utf8"
)

var fuzzSeeds = []string{
	"term = modifier* NOUN ;\nmodifier = ADJ | NOUN | PROPN | VERB & xpos:VBN ;\n",
	"# doc\nof_term = term \"of\" DET? term ;\nterm = NOUN+ ;\nexpect of_term: \"the [rate of flow] fell\" ;\n",
	"verb_obj = @verb VERB DET? ADJ* @object NOUN ;\nreject verb_obj: \"they left quickly\" ;\n",
	"use \"units.gsr\"\nuse stock terms\nx = ^ /^[A-Z]{2,5}$/ $ ;",
	"a = (ADJ | NOUN){2,3} !PUNCT & _ lemma:/^val/ begins:un ends:ing chars:Aa+-9 'Valve' ;",
	"a = \"open ;\nb = NOUN % ;\nc = NOUN{3,1} ;",
	"a = b ; b = a ;",
	"x = xpos:PRP$ xpos:\"#\" (@h NOUN | @h PROPN) ;",
	"expect x:\"the [a]\" ;",
	"a = (((( ;",
	"ä = NOUN ;\n\t r = \"größe\" ;",
}

// FuzzParse feeds arbitrary text to the parser and the set checks: they
// must never panic, and every error must point into the file.
func FuzzParse(f *testing.F) {
	for _, s := range fuzzSeeds {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, src string) {
		file, err := ParseString("fuzz.gsr", src)
		checkPositions(t, src, err)
		if file == nil {
			t.Fatal("ParseString returned no file")
		}
		if err == nil && len(file.Uses) == 0 {
			_, err := LoadFiles(file)
			checkPositions(t, src, err)
		}
		if !strings.ContainsAny(src, "\n\r") {
			_, err := ParsePattern(src, nil)
			checkPositions(t, src, err)
		}
	})
}

func checkPositions(t *testing.T, src string, err error) {
	t.Helper()
	if err == nil {
		return
	}
	el, ok := err.(ErrorList)
	if !ok {
		t.Fatalf("error %v is a %T, not an ErrorList", err, err)
	}
	lines := strings.Split(src, "\n")
	for _, e := range el {
		if e.Msg == "" {
			t.Errorf("empty message at %v", e.Pos)
		}
		if e.Pos.File != "fuzz.gsr" && e.Pos.File != "pattern" {
			t.Errorf("error %q names file %q", e.Msg, e.Pos.File)
			continue
		}
		if e.Pos.Line < 1 || e.Pos.Line > len(lines)+1 {
			t.Errorf("error %q at line %d of a %d-line file", e.Msg, e.Pos.Line, len(lines))
			continue
		}
		line := ""
		if e.Pos.Line <= len(lines) {
			line = lines[e.Pos.Line-1]
		}
		if n := utf8.RuneCountInString(line); e.Pos.Col < 1 || e.Pos.Col > n+2 {
			t.Errorf("error %q at column %d of a %d-character line", e.Msg, e.Pos.Col, n)
		}
		if e.Pos.Offset < 0 || e.Pos.Offset > len(src)+1 {
			t.Errorf("error %q at offset %d of %d bytes", e.Msg, e.Pos.Offset, len(src))
		}
	}
}
