package terms

import (
	"cmp"
	"os"
	"path/filepath"
	"slices"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/internal/testenv"
	"glossmith/pattern"
	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
	"glossmith/tagger/pipeline"
)

// treebankRef is the model's treebank counts alone, the default
// reference before ModelReference pooled them with WordNet's concordance.
type treebankRef struct{ m *hmm.Model }

func (r treebankRef) Freq(w string) int { return r.m.RefLemmaFreq(w) }
func (r treebankRef) Size() int         { return r.m.RefSize() }

// defaultSetup returns the embedded model and a collector with the stock
// terms rules: the default extraction.
func defaultSetup(t testing.TB) (*hmm.Model, *Collector) {
	t.Helper()
	return stockSetup(t, Options{})
}

// stockSetup returns the embedded model and a collector with the stock
// terms rules and the given options.
func stockSetup(t testing.TB, opt Options) (*hmm.Model, *Collector) {
	t.Helper()
	m, err := hmm.Default()
	if err != nil {
		t.Fatal(err)
	}
	mt, err := pattern.CompileStock("terms")
	if err != nil {
		t.Fatal(err)
	}
	return m, NewCollector(mt, opt)
}

// extractDomain runs the default extraction (stock terms rules, embedded
// model, treebank reference) over one ACTER domain's texts.
func extractDomain(t *testing.T, dir string) (full, def []*Term) {
	t.Helper()
	corpus, m := collectDomain(t, dir)
	full, err := Rank(corpus.Terms(ModelReference(m)), RankOptions{All: true})
	require.NoError(t, err)
	def, err = Rank(full, RankOptions{})
	require.NoError(t, err)
	return full, def
}

// collectDomain tags one ACTER domain's texts and collects their
// candidates with the stock terms rules.
func collectDomain(t *testing.T, dir string) (*Corpus, *hmm.Model) {
	t.Helper()
	m, col := defaultSetup(t)
	corpus := NewCorpus(0)
	st := pipeline.Run([]string{filepath.Join(dir, "texts")}, pipeline.Options{Tagger: m}, col.Collect,
		func(_ *doc.Document, dc *DocCounts) { corpus.Add(dc) })
	require.NotZero(t, st.Documents, "no documents read in %s", dir)
	return corpus, m
}

// readDomainGold reads a domain's gold list, terms with named entities.
func readDomainGold(t *testing.T, dir, domain string) Gold {
	t.Helper()
	f, err := os.Open(filepath.Join(dir, "terms_with_named_entities.tsv"))
	require.NoError(t, err)
	defer f.Close()
	gold, err := ReadGold(f, domain)
	require.NoError(t, err)
	return gold
}

// The gold term lists of the Annotated Corpora for Term Extraction Research
// 1.5 (Rigouts Terryn, Hoste and Lefever, "In no uncertain terms: a dataset
// for monolingual and multilingual automatic term extraction from comparable
// corpora", Language Resources and Evaluation 54, 2020), English, terms with
// named entities, scored the way that work scores: lower-cased surface forms
// compared as sets. Bounds a little under the figures the README gives
// (0.450 and 0.444), so that a retrained tagger may move them a little:
// mean best F1 over the three domains ≥ 0.435 with none below 0.36; mean
// F1 of the default list ≥ 0.425.
func TestACTERGoldLists(t *testing.T) {
	root := testenv.SharedDir(t, "data/term-gold-en")
	var sumBest, sumDef float64
	for _, domain := range []string{"corp", "equi", "wind"} {
		dir := filepath.Join(root, domain)
		gold := readDomainGold(t, dir, domain)
		full, def := extractDomain(t, dir)
		best := Evaluate(full, -1, gold).Best
		dflt := Evaluate(def, len(def), gold).Default
		t.Logf("%s: best F1 %.3f at rank %d (P %.3f R %.3f); default list %d terms: P %.3f R %.3f F1 %.3f",
			domain, best.F1, best.Rank, best.Precision, best.Recall, len(def), dflt.Precision, dflt.Recall, dflt.F1)
		if best.F1 < 0.36 {
			t.Errorf("%s: best F1 %.3f below 0.36", domain, best.F1)
		}
		sumBest += best.F1
		sumDef += dflt.F1
	}
	t.Logf("mean best F1 %.3f, mean default F1 %.3f", sumBest/3, sumDef/3)
	if sumBest/3 < 0.435 {
		t.Errorf("mean best F1 %.3f below 0.435", sumBest/3)
	}
	if sumDef/3 < 0.425 {
		t.Errorf("mean default-list F1 %.3f below 0.425", sumDef/3)
	}
}

// The score's settings are chosen leave-one-domain-out: for each of the
// three ACTER domains, the setting with the best mean best F1 on the two
// others (reference, structure share, repeated-phrase bonus, fragment
// penalty),
// then the cut-off with the best mean default-list F1 there, is
// tested on the held-out domain: the README's folds table is this test's
// log, and the held-out figures must meet the bounds of TestACTERGoldLists.
// The program ships the same choice made on all three domains.
func TestACTERLeaveOneDomainOut(t *testing.T) {
	if testing.Short() || testenv.Race {
		// Rankings one after another: nothing the race detector could
		// find that TestACTERGoldLists does not show it.
		t.Skip("tags three domains and ranks them 96 ways each")
	}
	root := testenv.SharedDir(t, "data/term-gold-en")
	saved := settings
	defer func() { settings = saved }()
	// pooled: ModelReference; otherwise the treebank counts alone.
	type point struct {
		pooled                bool
		share, bonus, penalty float64
	}
	var grid []point
	for _, pooled := range []bool{false, true} {
		for _, e := range []float64{1, 0.5, 0.3, 0.2} { // 1: off
			for _, b := range []float64{0, 1, 1.5} {
				for _, p := range []float64{0, 3, 4, 6} {
					grid = append(grid, point{pooled, e, b, p})
				}
			}
		}
	}
	cuts := []float64{2.5, 3, 3.5, 4}
	type figures struct {
		best float64
		def  []float64 // default-list F1 per cut-off
	}
	domains := []string{"corp", "equi", "wind"}
	res := map[point]map[string]figures{}
	for _, domain := range domains {
		dir := filepath.Join(root, domain)
		gold := readDomainGold(t, dir, domain)
		corpus, m := collectDomain(t, dir)
		for _, p := range grid {
			settings = scoreSettings{p.share, p.bonus, p.penalty, Cutoff}
			var ref Reference = treebankRef{m}
			if p.pooled {
				ref = ModelReference(m)
			}
			full, err := Rank(corpus.Terms(ref), RankOptions{All: true})
			require.NoError(t, err)
			f := figures{best: Evaluate(full, -1, gold).Best.F1}
			for _, c := range cuts {
				n, _ := slices.BinarySearchFunc(full, c, func(x *Term, c float64) int { return cmp.Compare(c, x.Score) })
				for n < len(full) && full[n].Score >= c {
					n++
				}
				f.def = append(f.def, Evaluate(full, n, gold).Default.F1)
			}
			if res[p] == nil {
				res[p] = map[string]figures{}
			}
			res[p][domain] = f
		}
	}
	shipped := point{true, StructureShare, RepeatedPhraseBonus, FragmentPenalty}
	shippedCut := slices.Index(cuts, Cutoff)
	require.GreaterOrEqual(t, shippedCut, 0, "the shipped cut-off is on the grid")
	require.Contains(t, res, shipped, "the shipped setting is on the grid")
	var meanBest, meanDef float64
	for _, held := range domains {
		train := slices.DeleteFunc(slices.Clone(domains), func(d string) bool { return d == held })
		sumBest := func(p point) float64 { return res[p][train[0]].best + res[p][train[1]].best }
		chosen := grid[0]
		for _, p := range grid {
			if sumBest(p) > sumBest(chosen) {
				chosen = p
			}
		}
		sumDef := func(p point, c int) float64 { return res[p][train[0]].def[c] + res[p][train[1]].def[c] }
		cut := 0
		for c := range cuts {
			if sumDef(chosen, c) > sumDef(chosen, cut) {
				cut = c
			}
		}
		test := res[chosen][held]
		t.Logf("held out %s: chosen pooled=%v share=%g bonus=%g penalty=%g cut-off=%g; training best F1 %.3f, default %.3f; held-out best F1 %.3f, default %.3f",
			held, chosen.pooled, chosen.share, chosen.bonus, chosen.penalty, cuts[cut], sumBest(chosen)/2, sumDef(chosen, cut)/2, test.best, test.def[cut])
		assert.GreaterOrEqual(t, test.best, 0.36, "held out %s", held)
		meanBest += test.best / 3
		meanDef += test.def[cut] / 3
	}
	t.Logf("held-out mean best F1 %.3f, default %.3f", meanBest, meanDef)
	// The program ships the choice on all three domains; the folds above
	// are the estimate of how well choosing this way carries over.
	sumAll := func(p point) (s float64) {
		for _, d := range domains {
			s += res[p][d].best
		}
		return s / 3
	}
	defAll := func(p point, c int) (s float64) {
		for _, d := range domains {
			s += res[p][d].def[c]
		}
		return s / 3
	}
	all := grid[0]
	for _, p := range grid {
		if sumAll(p) > sumAll(all) {
			all = p
		}
	}
	allCut := 0
	for c := range cuts {
		if defAll(all, c) > defAll(all, allCut) {
			allCut = c
		}
	}
	t.Logf("all three domains: chosen pooled=%v share=%g bonus=%g penalty=%g cut-off=%g: best F1 %.3f, default %.3f; shipped: best F1 %.3f, default %.3f",
		all.pooled, all.share, all.bonus, all.penalty, cuts[allCut], sumAll(all), defAll(all, allCut), sumAll(shipped), defAll(shipped, shippedCut))
	// A flat optimum: settings within 0.002 of the best count as chosen,
	// so that a retrained tagger moving the figures a little does not
	// demand new constants.
	assert.InDelta(t, sumAll(all), sumAll(shipped), 0.002, "the shipped setting is not the choice on all three domains")
	bestCut := 0
	for c := range cuts {
		if defAll(shipped, c) > defAll(shipped, bestCut) {
			bestCut = c
		}
	}
	assert.InDelta(t, defAll(shipped, bestCut), defAll(shipped, shippedCut), 0.002, "the shipped cut-off is not the choice on all three domains")
	assert.GreaterOrEqual(t, meanBest, 0.435)
	assert.GreaterOrEqual(t, meanDef, 0.425)
}
