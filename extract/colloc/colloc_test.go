package colloc

import (
	"math"
	"reflect"
	"testing"

	"glossmith/extract/measure"
	"glossmith/tagger/doc"
)

func toks(spec ...string) []doc.Token {
	// spec: form/UPOS/lemma triples
	var out []doc.Token
	for i := 0; i+2 < len(spec); i += 3 {
		out = append(out, doc.Token{Form: spec[i], UPOS: spec[i+1], Lemma: spec[i+2]})
	}
	return out
}

// The marginals of a relation count only that relation's pairs, so the four
// cells of every table are non-negative and sum to N.
func TestMarginalsPerRelation(t *testing.T) {
	c := NewCounter()
	add := func(rel, a, b string, n int) {
		for i := 0; i < n; i++ {
			c.Add(Pair{Relation: rel, W1: a, W2: b, NodeIsW2: true})
		}
	}
	add("adj_noun", "solenoid", "valve", 5)
	add("adj_noun", "faulty", "valve", 2)
	add("adj_noun", "faulty", "sensor", 3)
	add("verb_obj", "replace", "valve", 4)

	m, _ := measure.Lookup("g2")
	rows := c.Rank(RankOptions{Measure: m})
	if len(rows) != 4 {
		t.Fatalf("got %d rows", len(rows))
	}
	byPair := map[string]Row{}
	for _, r := range rows {
		byPair[r.Relation+":"+r.W1+" "+r.W2] = r
		o11, o12, o21, o22 := r.Table().Observed()
		if o11 < 0 || o12 < 0 || o21 < 0 || o22 < 0 || o11+o12+o21+o22 != float64(r.N) {
			t.Errorf("%v: cells %v %v %v %v", r, o11, o12, o21, o22)
		}
	}
	fv := byPair["adj_noun:faulty valve"]
	if fv.F12 != 2 || fv.F1 != 5 || fv.F2 != 7 || fv.N != 10 || fv.Node != "valve" {
		t.Errorf("faulty valve: %+v", fv)
	}
	rv := byPair["verb_obj:replace valve"]
	if rv.F12 != 4 || rv.F1 != 4 || rv.F2 != 4 || rv.N != 4 {
		t.Errorf("replace valve: %+v (marginals must come from verb_obj alone)", rv)
	}
	if got := c.Rank(RankOptions{Measure: m, Node: "sensor"}); len(got) != 1 || got[0].W1 != "faulty" {
		t.Errorf("node filter: %+v", got)
	}
	if got := c.Rank(RankOptions{Measure: m, MinFreq: 4}); len(got) != 2 {
		t.Errorf("min-freq 4 kept %d rows, want 2", len(got))
	}
}

// Counting in parts and merging gives what counting at once gives, in the
// same order, whatever the order of the parts (the parallel pipeline merges
// per-document counters).
func TestMergeDeterministic(t *testing.T) {
	pairs := []Pair{
		{"r", "a", "b", false}, {"r", "a", "c", false}, {"r", "d", "b", false},
		{"s", "a", "b", true}, {"r", "a", "b", false}, {"s", "x", "y", true},
	}
	whole := NewCounter()
	for _, p := range pairs {
		whole.Add(p)
	}
	left, right := NewCounter(), NewCounter()
	for i, p := range pairs {
		if i%2 == 0 {
			left.Add(p)
		} else {
			right.Add(p)
		}
	}
	m1, m2 := NewCounter(), NewCounter()
	m1.Merge(left)
	m1.Merge(right)
	m2.Merge(right)
	m2.Merge(left)
	mm, _ := measure.Lookup("logdice")
	want := whole.Rank(RankOptions{Measure: mm})
	for _, c := range []*Counter{m1, m2} {
		if got := c.Rank(RankOptions{Measure: mm}); !reflect.DeepEqual(got, want) {
			t.Fatalf("merged ranking differs:\n got %+v\nwant %+v", got, want)
		}
	}
}

// No input, a single pair seen once, and a pair that is the whole relation:
// no NaN or Inf reaches the output.
func TestEdgeCounts(t *testing.T) {
	m, _ := measure.Lookup("pmi")
	if rows := NewCounter().Rank(RankOptions{Measure: m}); len(rows) != 0 {
		t.Fatalf("empty counter gave %d rows", len(rows))
	}
	c := NewCounter()
	c.Add(Pair{Relation: "adj_noun", W1: "brass", W2: "fitting", NodeIsW2: true})
	for _, r := range c.Rank(RankOptions{Measure: m}) {
		s := r.Scores
		for _, v := range []float64{s.G2, s.PMI, s.T, s.Chi2, s.Dice, s.LogDice, s.MI3} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				t.Fatalf("non-finite score in %+v", r)
			}
		}
	}
}

func TestSlotAndWindowPairs(t *testing.T) {
	s := toks("Tighten", "VERB", "tighten", "the", "DET", "the", "union", "NOUN", "union", "nuts", "NOUN", "nut", ".", "PUNCT", ".")
	p, ok := SlotPair("verb_obj", s, map[string][2]int{"node": {2, 4}, "collocate": {0, 1}}, ByLemma)
	if !ok || p.W1 != "tighten" || p.W2 != "nut" || !p.NodeIsW2 {
		t.Fatalf("slot pair %+v %v", p, ok)
	}
	if _, ok := SlotPair("verb_obj", s, map[string][2]int{"node": {2, 4}}, ByLemma); ok {
		t.Fatal("a match without a dep slot made a pair")
	}
	var got [][2]string
	WindowPairs(s, 2, ByWord, nil, func(p Pair) { got = append(got, [2]string{p.W1, p.W2}) })
	want := [][2]string{{"tighten", "union"}, {"union", "nuts"}}
	if !reflect.DeepEqual(got, want) {
		t.Fatalf("window pairs %v, want %v", got, want)
	}
}
