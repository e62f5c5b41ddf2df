package pattern

import (
	"strings"
	"testing"
	"time"

	"glossmith/grammar"
)

// FuzzCompileMatch parses, checks and compiles arbitrary rule files and
// runs them over a tagged sentence in both modes: nothing may panic, and
// every match must lie inside the sentence with slots inside the match.
func FuzzCompileMatch(f *testing.F) {
	for _, s := range []string{
		"term = (ADJ | NOUN)* NOUN ;",
		"r = (_*)*NOUN ;",
		"a = @h VERB DET? ADJ* @d NOUN | ^ PROPN+ $ ;",
		"m = ADJ | NOUN ; t = m{2,4} (\"of\" m+)? ;",
		"x = !PUNCT & /^[a-z]+$/ xpos:/^N/ lemma:valve begins:dr ends:s chars:a+ ;",
		"a0 = NOUN | ADJ ; a1 = a0 | a0 ; a2 = a1 | a1 ; a3 = a2 a2 | a2 ;",
	} {
		f.Add(s)
	}
	sentence := toks(greenhouse + " EC/PROPN/NNP drip-line/NOUN/NN ,/PUNCT/,")
	f.Fuzz(func(t *testing.T, src string) {
		file, err := grammar.ParseString("fuzz.gsr", src)
		if err != nil || len(file.Uses) > 0 {
			return
		}
		rs, err := grammar.LoadFiles(file)
		if err != nil || len(rs.Rules) == 0 {
			return
		}
		t0 := time.Now()
		m, err := Compile(rs, rs.Names()...)
		if err != nil {
			if !strings.HasPrefix(err.Error(), "pattern: ") {
				t.Fatalf("error without prefix: %v", err)
			}
			return
		}
		for _, ms := range [][]Match{m.FindAll(sentence), m.FindNested(sentence)} {
			for _, mt := range ms {
				if mt.Start < 0 || mt.End > len(sentence) || mt.End <= mt.Start {
					t.Fatalf("match %+v outside the sentence", mt)
				}
				for l, sp := range mt.Slots {
					if sp[0] < mt.Start || sp[1] > mt.End || sp[1] < sp[0] {
						t.Fatalf("slot %s %v outside match %+v", l, sp, mt)
					}
				}
			}
		}
		if d := time.Since(t0); d > 5*time.Second {
			t.Fatalf("compiling and matching took %v", d)
		}
	})
}
