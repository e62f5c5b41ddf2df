package colloc

import (
	"fmt"
	"testing"
)

// skewed adds pairs the way text yields them: a few pairs many times, most
// pairs once or twice, over a vocabulary much smaller than the pairs.
func skewed(c *Counter) {
	for i := range 6000 {
		w1 := fmt.Sprintf("w%d", i%97)
		w2 := fmt.Sprintf("v%d", (i*7)%401)
		if i%50 == 0 {
			w2 = fmt.Sprintf("common%d", i%7)
		}
		c.Add(Pair{Relation: "adj_noun", W1: w1, W2: w2})
		if i%3 == 0 {
			c.Add(Pair{Relation: "verb_obj", W1: w2, W2: w1, NodeIsW2: true})
		}
	}
}

func TestBudgetKeepsMarginalsExact(t *testing.T) {
	full := NewCounter()
	skewed(full)
	small := NewCounter()
	small.SetBudget(full.Size() / 2)
	skewed(small)
	p := small.Pruned()
	if p.Pairs == 0 || p.Times == 0 || p.MaxFreq < 1 {
		t.Fatalf("half the needed budget pruned nothing: %+v", p)
	}
	if small.Size() > full.Size()/2 {
		t.Errorf("size %d after pruning, budget %d", small.Size(), full.Size()/2)
	}
	if small.Total() != full.Total() {
		t.Errorf("N changed: %d vs %d", small.Total(), full.Total())
	}
	want := map[string]Row{}
	for _, r := range full.Rank(RankOptions{}) {
		want[r.Relation+" "+r.W1+" "+r.W2] = r
	}
	rows := small.Rank(RankOptions{})
	if len(rows) == 0 || len(rows) >= len(want) {
		t.Fatalf("kept %d of %d pairs", len(rows), len(want))
	}
	for _, r := range rows {
		w, ok := want[r.Relation+" "+r.W1+" "+r.W2]
		if !ok {
			t.Fatalf("pair %v kept but never counted", r)
		}
		// Evert (2005, ch. 3): the marginals of the contingency table are
		// the relation's totals, whatever pairs the table lists.
		if r.F1 != w.F1 || r.F2 != w.F2 || r.N != w.N || r.Node != w.Node {
			t.Errorf("%s %s %s: marginals %d/%d/%d, want %d/%d/%d", r.Relation, r.W1, r.W2, r.F1, r.F2, r.N, w.F1, w.F2, w.N)
		}
		if r.F12 > w.F12 || r.F12 < w.F12-p.MaxFreq*int64(p.Times) {
			t.Errorf("%s %s %s: f(x,y) %d, true %d (pruned %+v)", r.Relation, r.W1, r.W2, r.F12, w.F12, p)
		}
	}
	for _, w := range want {
		if w.F12 > p.MaxFreq*int64(p.Times+1) {
			found := false
			for _, r := range rows {
				if r.Relation == w.Relation && r.W1 == w.W1 && r.W2 == w.W2 {
					found = true
					break
				}
			}
			if !found {
				t.Errorf("frequent pair %s %s %s (f=%d) dropped (pruned %+v)", w.Relation, w.W1, w.W2, w.F12, p)
			}
		}
	}
}

func TestBudgetDeterministic(t *testing.T) {
	run := func() ([]Row, Pruned) {
		c := NewCounter()
		c.SetBudget(40 << 10)
		for range 3 {
			d := NewCounter()
			skewed(d)
			c.Merge(d)
		}
		return c.Rank(RankOptions{}), c.Pruned()
	}
	r1, p1 := run()
	for range 3 {
		r2, p2 := run()
		if p1 != p2 || fmt.Sprint(r1) != fmt.Sprint(r2) {
			t.Fatalf("budgeted counting differs between runs: %+v vs %+v", p1, p2)
		}
	}
	if p1.Pairs == 0 {
		t.Fatal("budget too large for the test to say anything")
	}
}

func TestBudgetNeverDropsEveryPair(t *testing.T) {
	c := NewCounter()
	c.SetBudget(64 << 10) // less than the words and marginals alone take
	for i := range 5000 {
		c.Add(Pair{Relation: "adj_noun", W1: fmt.Sprintf("a%d", i), W2: fmt.Sprintf("n%d", i)}) // new words each time
		c.Add(Pair{Relation: "adj_noun", W1: "hydraulic", W2: "valve"})
	}
	if c.Pruned().Pairs == 0 {
		t.Fatal("nothing pruned; the test says nothing")
	}
	rows := c.Rank(RankOptions{})
	if len(rows) == 0 {
		t.Fatal("every pair dropped")
	}
	// Only the pairs seen once need to go; the frequent pair is never hit.
	if p := c.Pruned(); p.MaxFreq != 1 {
		t.Errorf("pruned pairs seen up to %d times, want only pairs seen once (%+v)", p.MaxFreq, p)
	}
	if rows[0].W1 != "hydraulic" || rows[0].F12 != 5000 {
		t.Errorf("frequent pair lost or undercounted: %+v (pruned %+v)", rows[0], c.Pruned())
	}
}
