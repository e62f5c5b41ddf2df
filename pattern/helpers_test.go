package pattern

import (
	"strings"
	"testing"

	"glossmith/grammar"
	"glossmith/tagger/doc"
)

// toks builds a sentence from "word/UPOS" or "word/UPOS/XPOS" items.
func toks(s string) []doc.Token {
	var out []doc.Token
	for _, f := range strings.Fields(s) {
		parts := strings.Split(f, "/")
		t := doc.Token{Form: parts[0], Lemma: strings.ToLower(parts[0])}
		if len(parts) > 1 {
			t.UPOS = parts[1]
		}
		if len(parts) > 2 {
			t.XPOS = parts[2]
		}
		out = append(out, t)
	}
	return out
}

func mustSet(t testing.TB, src string) *grammar.RuleSet {
	t.Helper()
	f, err := grammar.ParseString("test.gsr", src)
	if err != nil {
		t.Fatalf("parse: %v\n%s", err, err.(grammar.ErrorList).Format())
	}
	rs, err := grammar.LoadFiles(f)
	if err != nil {
		t.Fatalf("load: %v", err)
	}
	return rs
}

func mustCompile(t testing.TB, src string, names ...string) *Matcher {
	t.Helper()
	m, err := Compile(mustSet(t, src), names...)
	if err != nil {
		t.Fatal(err)
	}
	return m
}
