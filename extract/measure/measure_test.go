package measure

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
)

// The "new companies" example of Manning and Schütze (1999), Foundations of
// Statistical Natural Language Processing, section 5.3.1 (the t test) and
// section 5.3.3 (Pearson's χ² test, table 5.8), counted in a newswire
// corpus of N = 14,307,668 bigrams. Each test below also derives the
// expected value independently of the book's rounded figure.
var newCompanies = Table{F12: 8, F1: 15828, F2: 4675, N: 14307668}

func TestManningSchutzeTScore(t *testing.T) {
	// Manning and Schütze (1999), section 5.3.1: t ≈ 0.999932 for "new
	// companies", and they conclude that H0 (independence) cannot be rejected at α = 0.005.
	got := TScore(newCompanies)
	assert.InDelta(t, 0.999932, got, 5e-7, "TScore(new companies); Manning and Schütze 5.3.1 print 0.999932")
	// The book's own derivation, in probabilities rather than counts:
	// x̄ = c12/N, μ = P(new)·P(companies) = (c1/N)(c2/N), s² ≈ x̄,
	// t = (x̄ − μ)/√(s²/N). It is the count form (O11 − E11)/√O11 divided
	// through by N, so the two must agree to rounding.
	n := newCompanies.N
	xbar := newCompanies.F12 / n
	mu := (newCompanies.F1 / n) * (newCompanies.F2 / n)
	book := (xbar - mu) / math.Sqrt(xbar/n)
	assert.InDelta(t, book, got, 1e-12, "TScore against the probability form")
	// With the exact Bernoulli variance x̄(1−x̄) instead of x̄ the value
	// would be 0.9999322 — indistinguishable at the book's six decimals, so
	// the printed value cannot tell the two variants apart; we keep s² = x̄
	// as the book states it.
	exact := (xbar - mu) / math.Sqrt(xbar*(1-xbar)/n)
	assert.InDelta(t, 0.999932, exact, 5e-7, "exact-variance t at six decimals")
}

func TestManningSchutzeChiSquare(t *testing.T) {
	// Manning and Schütze (1999), section 5.3.3: χ² ≈ 1.55 for "new
	// companies" (below the 3.841 critical value at α = 0.05).
	got := ChiSquare(newCompanies)
	assert.InDelta(t, 1.55, got, 0.005, "ChiSquare(new companies); Manning and Schütze 5.3.3 print 1.55")
	// The book's table 5.8 lists 14,287,181 for the
	// (¬new, ¬companies) cell, which is N − O12 − O21 and so 8 larger than
	// a table consistent with N (14,287,173). Scoring that table (N + 8)
	// changes χ² only in the sixth digit; both print as 1.55.
	bookCells := newCompanies
	bookCells.N += 8
	if v := ChiSquare(bookCells); math.Abs(v-1.55) > 0.005 || math.Abs(v-got) > 1e-4 {
		t.Errorf("ChiSquare with the book's O22 = %.9f, consistent table %.9f", v, got)
	}
	// Pearson's sum Σ (O−E)²/E must equal the closed form of eq. 5.7.
	if s := pearsonSum(newCompanies); math.Abs(s-got) > 1e-9*got {
		t.Errorf("Σ(O−E)²/E = %.12f, closed form %.12f", s, got)
	}
}

func TestManningSchutzePMI(t *testing.T) {
	// Manning and Schütze (1999), section 5.4 (mutual information), give
	// I(Ayatollah, Ruhollah) ≈ 18.38 bits with c1 = 42, c2 = 20, c12 = 20 in
	// the same N = 14,307,668. By hand: log2(20·N/(42·20)) = log2(N/42)
	// = log2(340658.76) = 18 + log2(1.29951) = 18.3780.
	tab := Table{F12: 20, F1: 42, F2: 20, N: 14307668}
	got := PMI(tab)
	assert.InDelta(t, 18.38, got, 0.005, "PMI(Ayatollah Ruhollah); Manning and Schütze 5.4 print 18.38")
	assert.InDelta(t, math.Log2(tab.N/42), got, 1e-12, "PMI against log2(N/42)")
}

// TestHandWorked checks every measure on a small table worked out by hand:
// f12 = 10, f1 = 20, f2 = 20, n = 100, so
//
//	O = [10 10; 10 70],  E = [20·20/100 = 4, 20·80/100 = 16; 16, 80·80/100 = 64]
//	G²    = 2(10 ln(10/4) + 10 ln(10/16) + 10 ln(10/16) + 70 ln(70/64))
//	      = 2(9.162907 − 4.700036 − 4.700036 + 6.272851) = 2·6.035686 = 12.071372
//	χ²    = 100·(10·70 − 10·10)² / (20·20·80·80) = 36,000,000/2,560,000 = 14.0625
//	t     = (10 − 4)/√10 = 1.897367
//	PMI   = log2(10·100/(20·20)) = log2 2.5 = 1.321928
//	MI³   = log2(1000·100/400) = log2 250 = 7.965784
//	Dice  = 2·10/(20+20) = 0.5,  logDice = 14 + log2 0.5 = 13
func TestHandWorked(t *testing.T) {
	tab := Table{F12: 10, F1: 20, F2: 20, N: 100}
	for _, c := range []struct {
		name      string
		got, want float64
		tol       float64
	}{
		{"G2", G2(tab), 12.071372, 1e-6},
		{"G2Entropy", G2Entropy(tab), 12.071372, 1e-6},
		{"SignedG2", SignedG2(tab), 12.071372, 1e-6},
		{"ChiSquare", ChiSquare(tab), 14.0625, 1e-12},
		{"TScore", TScore(tab), 1.897367, 1e-6},
		{"PMI", PMI(tab), 1.321928, 1e-6},
		{"MI3", MI3(tab), 7.965784, 1e-6},
		{"Dice", Dice(tab), 0.5, 0},
		{"LogDice", LogDice(tab), 13, 0},
	} {
		if math.Abs(c.got-c.want) > c.tol {
			t.Errorf("%s = %.9f, hand-worked %.9f", c.name, c.got, c.want)
		}
	}
}

// TestRepulsion: a pair seen together less often than chance. Same margins
// as TestHandWorked with f12 = 1: E11 = 4 > O11, so SignedG2 and t are
// negative and G² positive; PMI = log2(100/400) = −2.
func TestRepulsion(t *testing.T) {
	tab := Table{F12: 1, F1: 20, F2: 20, N: 100}
	if g := G2(tab); !(g > 0) {
		t.Errorf("G2 = %g, want > 0", g)
	}
	if s := SignedG2(tab); s != -G2(tab) {
		t.Errorf("SignedG2 = %g, want −G2 = %g", s, -G2(tab))
	}
	if v := TScore(tab); math.Abs(v-(1-4)/1.0) > 1e-12 {
		t.Errorf("TScore = %g, want (1−4)/√1 = −3", v)
	}
	if v := PMI(tab); math.Abs(v+2) > 1e-12 {
		t.Errorf("PMI = %g, want −2", v)
	}
}

// TestIndependence: when f12·n = f1·f2 the observed table equals the
// expected one, and every test statistic and PMI are exactly 0.
func TestIndependence(t *testing.T) {
	for _, tab := range []Table{
		{F12: 5, F1: 100, F2: 50, N: 1000},
		{F12: 1, F1: 1000, F2: 1000, N: 1e6},
		{F12: 3, F1: 3, F2: 7, N: 7},
	} {
		s := tab.Scores()
		if s.G2 != 0 || s.SignedG2 != 0 || s.Chi2 != 0 || s.T != 0 || s.PMI != 0 || G2Entropy(tab) > 1e-9 {
			t.Errorf("%v: not zero at independence: %+v, G2Entropy %g", tab, s, G2Entropy(tab))
		}
	}
}

// dunningBinomial is G² in the form Dunning (1993) derives it, as a ratio
// of binomial likelihoods: the pair count k1 out of n1 occurrences of y,
// k2 out of n2 non-y positions, p1 = k1/n1, p2 = k2/n2, p = (k1+k2)/(n1+n2):
//
//	−2 log λ = 2[log L(p1,k1,n1) + log L(p2,k2,n2) − log L(p,k1,n1) − log L(p,k2,n2)]
//
// with log L(p,k,n) = k log p + (n−k) log(1−p). A third, independent
// formulation to check G2 against.
func dunningBinomial(t Table) float64 {
	o11, o12, o21, o22 := t.Observed()
	k1, n1 := o11, o11+o21
	k2, n2 := o12, o12+o22
	logL := func(p, k, n float64) float64 {
		var s float64
		if k > 0 {
			s += k * math.Log(p)
		}
		if n-k > 0 {
			s += (n - k) * math.Log(1-p)
		}
		return s
	}
	p1, p2, p := k1/n1, k2/n2, (k1+k2)/(n1+n2)
	return 2 * (logL(p1, k1, n1) + logL(p2, k2, n2) - logL(p, k1, n1) - logL(p, k2, n2))
}

func pearsonSum(t Table) float64 {
	o11, o12, o21, o22 := t.Observed()
	e11, e12, e21, e22 := t.Expected()
	sq := func(o, e float64) float64 { return (o - e) * (o - e) / e }
	return sq(o11, e11) + sq(o12, e12) + sq(o21, e21) + sq(o22, e22)
}

// randomTable draws a valid table with integer counts; scale sets n's order
// of magnitude.
func randomTable(r *rand.Rand, maxN int64) Table {
	n := 2 + r.Int64N(maxN)
	f1 := 1 + r.Int64N(n-1)
	f2 := 1 + r.Int64N(n-1)
	lo := max(0, f1+f2-n) // O22 ≥ 0
	hi := min(f1, f2)
	f12 := lo + r.Int64N(hi-lo+1)
	return Table{F12: float64(f12), F1: float64(f1), F2: float64(f2), N: float64(n)}
}

// TestG2Forms checks the cell form G2 against the entropy form and against
// Dunning's binomial form on many random tables (fixed seed). Dunning's
// G² in all three forms is the same number, so they must agree to 1e-9
// relative. The entropy form subtracts terms of size n·ln n, so
// its absolute error is a few n·ln n·2^-52 (the binomial form's likewise);
// for tables so close to independence that this exceeds 1e-9·G², that
// absolute bound is used instead. Such tables are counted and must stay a
// small minority, so the relative check is the one that normally applies.
func TestG2Forms(t *testing.T) {
	r := rand.New(rand.NewPCG(1993, 19))
	const trials = 20000
	loose := 0
	for i := range trials {
		maxN := int64(100)
		switch i % 3 {
		case 1:
			maxN = 100000
		case 2:
			maxN = 100000000
		}
		tab := randomTable(r, maxN)
		g := G2(tab)
		ent := G2Entropy(tab)
		bin := dunningBinomial(tab)
		abs := 64 * tab.N * math.Log(tab.N) * 0x1p-52 // rounding of the n·ln n terms
		for _, other := range []struct {
			name string
			v    float64
		}{{"entropy", ent}, {"binomial", bin}} {
			diff := math.Abs(g - other.v)
			if diff <= 1e-9*g {
				continue
			}
			if diff <= abs {
				loose++
				continue
			}
			t.Fatalf("%v: G2 = %.17g, %s form = %.17g (rel diff %.3g)", tab, g, other.name, other.v, diff/g)
		}
	}
	if loose > trials/20 {
		t.Errorf("%d of %d comparisons needed the absolute bound", loose, 2*trials)
	}
	t.Logf("%d of %d comparisons were near independence and used the absolute bound", loose, 2*trials)
}

// TestG2NearIndependence: near independence, with u = (O−E)/E per cell,
// each G² term 2·(O ln(O/E) − (O−E)) = 2E·((1+u)ln(1+u) − u) expands as
// E·(u² − u³/3 + u⁴/6 − u⁵/10 + …) (the Taylor series of (1+u)ln(1+u)), so
// G² = χ² − (1/3)ΣEu³ + (1/6)ΣEu⁴ − (1/10)ΣEu⁵ + O(ΣEu⁶), and G² and χ²
// agree to second order. G2 must match this expansion with full relative
// accuracy even when n is huge and u tiny, where a naive Σ O ln(O/E) or the
// entropy form loses most of its digits to cancellation.
func TestG2NearIndependence(t *testing.T) {
	for _, n := range []float64{1e4, 1e6, 1e8, 1e10, 1e13} {
		f1, f2 := n/10, n/20
		indep := f1 * f2 / n // E11, a whole number here
		tab := Table{F12: indep + 1, F1: f1, F2: f2, N: n}
		o11, o12, o21, o22 := tab.Observed()
		e11, e12, e21, e22 := tab.Expected()
		var taylor float64
		maxU := 0.0
		for _, c := range [][2]float64{{o11, e11}, {o12, e12}, {o21, e21}, {o22, e22}} {
			u := (c[0] - c[1]) / c[1]
			maxU = math.Max(maxU, math.Abs(u))
			taylor += c[1] * (u*u - u*u*u/3 + u*u*u*u/6 - u*u*u*u*u/10)
		}
		g, chi := G2(tab), ChiSquare(tab)
		// Truncation error of the expansion ≈ u⁴/15 relative, plus rounding.
		tol := (maxU*maxU*maxU*maxU/10 + 1e-12) * g
		if math.Abs(g-taylor) > tol {
			t.Errorf("n=%g: G2 = %.17g, Taylor expansion %.17g (u ≤ %.2g)", n, g, taylor, maxU)
		}
		if math.Abs(g/chi-1) > maxU {
			t.Errorf("n=%g: G2 = %.17g, χ² = %.17g differ by more than O(u)", n, g, chi)
		}
		tab.F12 = indep
		if g := G2(tab); g != 0 {
			t.Errorf("n=%g: G2 at independence = %g", n, g)
		}
	}
}

// specials are the awkward values every measure must survive.
var specials = []float64{
	0, 1, 2, 8, 1e6, 1e15, -1, 0.5, 5e-324, 1e-300, 1e300, math.MaxFloat64,
	math.Inf(1), math.Inf(-1), math.NaN(),
}

// TestNoNaNOrInf runs every measure on every combination of special values
// and checks the documented stand-ins: no NaN or ±Inf anywhere, 0 for
// invalid tables, and Check agrees with Valid.
func TestNoNaNOrInf(t *testing.T) {
	for _, f12 := range specials {
		for _, f1 := range specials {
			for _, f2 := range specials {
				for _, n := range specials {
					tab := Table{F12: f12, F1: f1, F2: f2, N: n}
					checkTable(t, tab)
				}
			}
		}
	}
}

func checkTable(t *testing.T, tab Table) {
	t.Helper()
	valid := tab.Valid()
	if err := tab.Check(); (err == nil) != valid {
		t.Fatalf("%v: Valid() = %v but Check() = %v", tab, valid, err)
	}
	s := tab.Scores()
	for _, m := range measures {
		v := m.Score(tab)
		if math.IsNaN(v) || math.IsInf(v, 0) {
			t.Fatalf("%v: %s = %g", tab, m.Name, v)
		}
		if f := m.Field(s); f != v {
			t.Fatalf("%v: %s = %g but Scores gives %g", tab, m.Name, v, f)
		}
		if !valid && v != 0 {
			t.Fatalf("invalid %v: %s = %g, want 0", tab, m.Name, v)
		}
	}
	if g := G2Entropy(tab); math.IsNaN(g) || math.IsInf(g, 0) {
		t.Fatalf("%v: G2Entropy = %g", tab, g)
	}
	if valid {
		if s.G2 < 0 || s.Chi2 < 0 || s.Dice < 0 || s.Dice > 1 || s.LogDice > 14 {
			t.Fatalf("%v: out of range: %+v", tab, s)
		}
		if tab.F12 == 0 && (s.PMI != LogFloor || s.MI3 != LogFloor || s.LogDice != LogFloor || s.T != 0) {
			t.Fatalf("%v: f12 = 0 should give LogFloor/0: %+v", tab, s)
		}
	}
}

// TestEdgeCases names the degenerate tables one by one: empty cells, the
// marginals at their bounds, and tables that are not contingency tables.
func TestEdgeCases(t *testing.T) {
	cases := []struct {
		name  string
		tab   Table
		valid bool
	}{
		{"f12=0", Table{0, 10, 10, 100}, true},
		{"f1=0", Table{0, 0, 10, 100}, true},
		{"f1=f2=0", Table{0, 0, 0, 100}, true},
		{"zero O22 cell", Table{5, 10, 10, 15}, true},
		{"all cells but O11 zero", Table{7, 7, 7, 7}, true},
		{"n=0", Table{0, 0, 0, 0}, false},
		{"f12>f1", Table{11, 10, 20, 100}, false},
		{"f12>f2", Table{11, 20, 10, 100}, false},
		{"f1+f2-f12>n", Table{1, 60, 60, 100}, false},
		{"negative", Table{-1, 10, 10, 100}, false},
	}
	for _, c := range cases {
		if c.tab.Valid() != c.valid {
			t.Errorf("%s: Valid() = %v, want %v", c.name, c.tab.Valid(), c.valid)
		}
		checkTable(t, c.tab)
	}
	// A table whose only pair is the perfect collocation: Dice = 1, logDice 14.
	if v := LogDice(Table{7, 7, 7, 7}); v != 14 {
		t.Errorf("LogDice of a perfect pair = %g, want 14", v)
	}
	// f1 = 0: χ² has a zero margin and is documented as 0.
	if v := ChiSquare(Table{0, 0, 10, 100}); v != 0 {
		t.Errorf("ChiSquare with zero margin = %g, want 0", v)
	}
	if err := (Table{11, 10, 20, 100}).Check(); err == nil || !strings.Contains(err.Error(), "exceeds f1") {
		t.Errorf("Check(f12>f1) = %v", err)
	}
}

// TestSymmetry: every measure here is symmetric in x and y, i.e. invariant
// under swapping f1 and f2 (transposing the table).
func TestSymmetry(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 7))
	for range 5000 {
		tab := randomTable(r, 1e7)
		sw := Table{F12: tab.F12, F1: tab.F2, F2: tab.F1, N: tab.N}
		for _, m := range measures {
			a, b := m.Score(tab), m.Score(sw)
			if math.Abs(a-b) > 1e-12*math.Max(1, math.Abs(a)) {
				t.Fatalf("%s not symmetric: %v → %.17g, %v → %.17g", m.Name, tab, a, sw, b)
			}
		}
	}
}

func TestRegistry(t *testing.T) {
	want := []string{"g2", "g2signed", "pmi", "t", "chi2", "dice", "logdice", "mi3"}
	if got := strings.Join(Names(), ","); got != strings.Join(want, ",") {
		t.Errorf("Names() = %s", got)
	}
	tab := Table{F12: 10, F1: 20, F2: 20, N: 100}
	funcs := map[string]func(Table) float64{
		"g2": G2, "g2signed": SignedG2, "pmi": PMI, "t": TScore, "chi2": ChiSquare,
		"dice": Dice, "logdice": LogDice, "mi3": MI3,
	}
	for _, name := range want {
		m, err := Lookup(strings.ToUpper(name))
		if err != nil {
			t.Fatalf("Lookup(%q): %v", name, err)
		}
		if m.Score(tab) != funcs[name](tab) || m.Field(tab.Scores()) != funcs[name](tab) {
			t.Errorf("%s: registry and function disagree", name)
		}
	}
	if _, err := Lookup("mutual"); err == nil || !strings.Contains(err.Error(), "logdice") {
		t.Errorf("Lookup(unknown) error = %v, want one listing the names", err)
	}
}

func TestNoAllocs(t *testing.T) {
	tab := newCompanies
	var sink Scores
	if a := testing.AllocsPerRun(100, func() { sink = tab.Scores() }); a != 0 {
		t.Errorf("Scores allocates %v times per call", a)
	}
	_ = sink
}

func FuzzScores(f *testing.F) {
	f.Add(8.0, 15828.0, 4675.0, 14307668.0)
	f.Add(0.0, 0.0, 0.0, 0.0)
	f.Add(1e300, 1e300, 1e300, 1e300)
	f.Add(5e-324, 1.0, 1.0, 2.0)
	f.Fuzz(func(t *testing.T, f12, f1, f2, n float64) {
		checkTable(t, Table{F12: f12, F1: f1, F2: f2, N: n})
	})
}

var benchSink float64

func benchTables() []Table {
	r := rand.New(rand.NewPCG(1, 2))
	tabs := make([]Table, 1024)
	for i := range tabs {
		tabs[i] = randomTable(r, 1e7)
	}
	return tabs
}

func BenchmarkScores(b *testing.B) {
	tabs := benchTables()
	b.ReportAllocs()
	i := 0
	for b.Loop() {
		s := tabs[i&1023].Scores()
		benchSink += s.G2
		i++
	}
}

func BenchmarkMeasure(b *testing.B) {
	tabs := benchTables()
	for _, m := range measures {
		b.Run(m.Name, func(b *testing.B) {
			b.ReportAllocs()
			i := 0
			for b.Loop() {
				benchSink += m.Score(tabs[i&1023])
				i++
			}
		})
	}
}
