package terms_test

import (
	"runtime"
	"testing"

	"glossmith/extract/terms"
	"glossmith/internal/testenv"
	"glossmith/pattern"
	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
	"glossmith/tagger/pipeline"
)

// demoCounts collects the demo corpus's per-document counts in input order.
func demoCounts(t *testing.T) []*terms.DocCounts {
	t.Helper()
	model, err := hmm.Default()
	if err != nil {
		t.Fatal(err)
	}
	m, err := pattern.CompileStock("terms")
	if err != nil {
		t.Fatal(err)
	}
	col := terms.NewCollector(m, terms.Options{Contexts: 3})
	var out []*terms.DocCounts
	pipeline.Run([]string{testenv.Demo(t)}, pipeline.Options{Tagger: model}, col.Collect,
		func(_ *doc.Document, dc *terms.DocCounts) { out = append(out, dc) })
	if len(out) < 5 {
		t.Fatalf("only %d demo documents", len(out))
	}
	return out
}

func byKey(ts []*terms.Term) map[string]*terms.Term {
	m := map[string]*terms.Term{}
	for _, t := range ts {
		m[t.Term] = t
	}
	return m
}

func TestBudgetDropsRareCandidatesOnly(t *testing.T) {
	counts := demoCounts(t)
	full := terms.NewCorpus(3)
	for _, dc := range counts {
		full.Add(dc)
	}
	all := byKey(full.Terms(nil))

	small := terms.NewCorpus(3)
	small.SetBudget(150 << 10) // far below what the demo's tables need
	for _, dc := range counts {
		small.Add(dc)
	}
	p := small.Pruned()
	if p.Candidates == 0 || p.Times == 0 || p.MaxFreq < 1 {
		t.Fatalf("a budget far too small pruned nothing: %+v", p)
	}
	kept := small.Terms(nil)
	if len(kept) == 0 || len(kept) >= len(all) {
		t.Fatalf("kept %d of %d candidates", len(kept), len(all))
	}
	// Word counts stay exact whatever is dropped.
	if small.Tokens() != full.Tokens() || small.Documents() != full.Documents() ||
		small.WordFreq("valve") != full.WordFreq("valve") {
		t.Errorf("word counts changed: %d/%d tokens, %d/%d valve", small.Tokens(), full.Tokens(), small.WordFreq("valve"), full.WordFreq("valve"))
	}
	// A kept count is never higher than the true one, and at most the
	// threshold lower for each pruning.
	for _, k := range kept {
		f := all[k.Term]
		if f == nil {
			t.Errorf("%q kept but not a candidate without budget", k.Term)
			continue
		}
		if k.Freq > f.Freq || k.Freq < f.Freq-p.MaxFreq*p.Times {
			t.Errorf("%q: freq %d with budget, %d without (pruned %+v)", k.Term, k.Freq, f.Freq, p)
		}
	}
	// Every candidate seen more often than the highest threshold times the
	// number of prunings survives.
	keptSet := byKey(kept)
	for name, f := range all {
		if f.Freq > p.MaxFreq*(p.Times+1) && keptSet[name] == nil {
			t.Errorf("%q (freq %d) dropped, though above every threshold %+v", name, f.Freq, p)
		}
	}
}

func TestBudgetLargeEnoughChangesNothing(t *testing.T) {
	counts := demoCounts(t)
	a, b := terms.NewCorpus(3), terms.NewCorpus(3)
	b.SetBudget(1 << 30)
	for _, dc := range counts {
		a.Add(dc)
		b.Add(dc)
	}
	if p := b.Pruned(); p != (terms.Pruned{}) {
		t.Fatalf("pruned under an ample budget: %+v", p)
	}
	ta, tb := a.Terms(nil), b.Terms(nil)
	if len(ta) != len(tb) {
		t.Fatalf("%d vs %d candidates", len(ta), len(tb))
	}
	for i := range ta {
		if ta[i].Term != tb[i].Term || ta[i].Freq != tb[i].Freq || ta[i].DP != tb[i].DP {
			t.Fatalf("candidate %d differs: %+v vs %+v", i, ta[i], tb[i])
		}
	}
}

// The estimate drives every pruning decision, so it must be of the right
// order: compared with the heap the tables really hold (measured after a
// collection, with the per-document counts already in memory), it may be
// off by a modest factor but not by an order of magnitude.
func TestBudgetEstimateIsOfTheRightOrder(t *testing.T) {
	demoCounts(t) // load the model and rules first: they stay in memory
	var before, after runtime.MemStats
	// Two collections each time: what a sync.Pool caches (the collector's
	// working memory) survives one, and a varying number of automatic
	// collections would otherwise decide whether it is counted.
	runtime.GC()
	runtime.GC()
	runtime.ReadMemStats(&before)
	c := terms.NewCorpus(3)
	c.SetBudget(1 << 40) // track the estimate without pruning
	for _, dc := range demoCounts(t) {
		c.Add(dc)
	}
	// the per-document counts are garbage now; the corpus is not
	runtime.GC()
	runtime.GC()
	runtime.ReadMemStats(&after)
	est := terms.TableBytes(c)
	real := int64(after.HeapAlloc) - int64(before.HeapAlloc)
	runtime.KeepAlive(c)
	t.Logf("estimate %d bytes, heap growth %d bytes", est, real)
	if real <= 0 || est < real/3 || est > real*3 {
		t.Errorf("estimate %d bytes, heap growth %d bytes: off by more than 3×", est, real)
	}
}
