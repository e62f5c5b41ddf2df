package colloc

import (
	"math"
	"reflect"
	"testing"

	"glossmith/extract/measure"
	"glossmith/tagger/doc"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
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
	require.Len(t, rows, 4)
	byPair := map[string]Row{}
	for _, r := range rows {
		byPair[r.Relation+":"+r.W1+" "+r.W2] = r
		o11, o12, o21, o22 := r.Table().Observed()
		if o11 < 0 || o12 < 0 || o21 < 0 || o22 < 0 || o11+o12+o21+o22 != float64(r.N) {
			t.Errorf("%v: cells %v %v %v %v", r, o11, o12, o21, o22)
		}
	}
	fv := byPair["adj_noun:faulty valve"]
	assert.Equal(t, [4]int64{2, 5, 7, 10}, [4]int64{fv.F12, fv.F1, fv.F2, fv.N}, "faulty valve: f12, f1, f2, n")
	assert.Equal(t, "valve", fv.Node)
	rv := byPair["verb_obj:replace valve"]
	assert.Equal(t, [4]int64{4, 4, 4, 4}, [4]int64{rv.F12, rv.F1, rv.F2, rv.N},
		"replace valve: marginals must come from verb_obj alone")
	got := c.Rank(RankOptions{Measure: m, Node: "sensor"})
	if assert.Len(t, got, 1, "node filter") {
		assert.Equal(t, "faulty", got[0].W1, "node filter")
	}
	assert.Len(t, c.Rank(RankOptions{Measure: m, MinFreq: 4}), 2, "rows of frequency 4 or more")
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
