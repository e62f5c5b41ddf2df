package pattern

import (
	"strings"
	"testing"

	"glossmith/grammar"
)

func TestStockExamplesWithFakeTagger(t *testing.T) {
	for _, name := range grammar.StockNames() {
		rs, err := grammar.LoadStock(name)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		n, fails := CheckExamples(rs, fakeAnalyze)
		if len(fails) > 0 {
			t.Errorf("%s: %d of %d examples fail:\n%s", name, len(fails), n, fails.Format())
		}
		// Every rule commands report has at least one expect and one
		// reject example.
		for _, r := range rs.Rules {
			if strings.HasPrefix(r.Name, "_") {
				continue
			}
			var exp, rej int
			for _, ex := range r.Examples {
				if ex.Expect {
					exp++
				} else {
					rej++
				}
			}
			if exp == 0 || rej == 0 {
				t.Errorf("%s: rule %s has %d expect and %d reject examples", name, r.Name, exp, rej)
			}
		}
	}
}

func TestCheckExamplesReportsFailures(t *testing.T) {
	rs := mustSet(t, `
term = ADJ* NOUN ;
expect term: "Inspect the [stainless steel valve body] for cracks." ;
expect term: "Inspect [the valve] now." ;
reject term: "Flush the drip line weekly." ;
expect term: "Inspect the [stainless st]eel valve." ;
`)
	n, fails := CheckExamples(rs, fakeAnalyze)
	if n != 4 {
		t.Fatalf("checked %d examples, want 4", n)
	}
	if len(fails) != 4 {
		t.Fatalf("want 4 failures, got %d:\n%s", len(fails), fails.Format())
	}
	// ADJ* NOUN takes "stainless steel" and then each noun on its own.
	want := []struct {
		line int
		has  []string
	}{
		{3, []string{"expect term: wanted [stainless steel valve body]", "matched [stainless steel], [valve], [body], [cracks]", "stainless/ADJ/JJ"}},
		{4, []string{`no tags for "now"`}},
		{5, []string{"reject term: matched [drip], [line]"}},
		{6, []string{"[stainless st] does not begin and end on token boundaries"}},
	}
	for i, w := range want {
		f := fails[i]
		if f.Pos.Line != w.line || f.Pos.Col != 1 || f.Pos.File != "test.gsr" {
			t.Errorf("failure %d at %v, want test.gsr:%d:1", i, f.Pos, w.line)
		}
		for _, h := range w.has {
			if !strings.Contains(f.Msg, h) {
				t.Errorf("failure %d: %q lacks %q", i, f.Msg, h)
			}
		}
		if f.Caret() == "" {
			t.Errorf("failure %d has no source line", i)
		}
	}
}
