package termstat

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"glossmith/extract/measure"
)

func TestLLHandWorked(t *testing.T) {
	// Rayson and Garside (2000): E1 = c(a+b)/(c+d), E2 = d(a+b)/(c+d),
	// LL = 2(a ln(a/E1) + b ln(b/E2)). Hand arithmetic:
	//
	// a=100, b=50, c=10,000, d=20,000: E1 = 10,000·150/30,000 = 50,
	// E2 = 20,000·150/30,000 = 100; LL = 2(100 ln 2 + 50 ln ½) = 2·50 ln 2
	// = 100 ln 2 = 69.314718; a/c = 1 % > b/d = 0.25 %, so positive.
	//
	// a=10, b=90, same sizes: E1 = 10,000·100/30,000 = 33.333333,
	// E2 = 66.666667; LL = 2(10 ln 0.3 + 90 ln 1.35)
	// = 2(−12.039728 + 27.009413) = 2·14.969685 = 29.939371;
	// a/c = 0.1 % < b/d = 0.45 %, so reported as −29.939371.
	//
	// a=0, b=30, c=10,000, d=20,000: E2 = 20,000·30/30,000 = 20;
	// LL = 2(0 + 30 ln 1.5) = 60·0.405465 = 24.327906, negative.
	for _, c := range []struct {
		k    Contrast
		want float64
	}{
		{Contrast{100, 50, 10000, 20000}, 69.314718},
		{Contrast{10, 90, 10000, 20000}, -29.939371},
		{Contrast{0, 30, 10000, 20000}, -24.327906},
		{Contrast{50, 100, 10000, 20000}, 0}, // equal relative frequencies
		{Contrast{0, 0, 10000, 20000}, 0},
	} {
		if got := c.k.LL(); math.Abs(got-c.want) > 1e-6 {
			t.Errorf("%+v: LL = %.9f, hand-worked %.6f", c.k, got, c.want)
		}
	}
}

// TestLLAgainstG2 checks how the two-cell keyness LL relates to Dunning's
// G² of the full table [a, b; c−a, d−b] computed by package measure.
//
// They are NOT equal in general: G² sums over all four cells, LL over the
// word's row only. Since each row's observed and expected counts have the
// same total, each row contributes a non-negative amount, so exactly
//
//	G² = LL + 2((c−a) ln((c−a)/(c−E1)) + (d−b) ln((d−b)/(d−E2)))
//
// (with LL unsigned), hence |G²| ≥ |LL|, with the same sign. The extra row
// is small for a word that is rare in both corpora: to leading order its
// share of G² is the word's pooled relative frequency p = (a+b)/(c+d).
func TestLLAgainstG2(t *testing.T) {
	r := rand.New(rand.NewPCG(2000, 1))
	for range 20000 {
		c := float64(1 + r.IntN(1_000_000))
		d := float64(1 + r.IntN(1_000_000))
		a := math.Floor(r.Float64() * r.Float64() * c)
		b := math.Floor(r.Float64() * r.Float64() * d)
		k := Contrast{a, b, c, d}
		ll, g := k.LL(), k.G2()
		if (ll > 0 && g <= 0) || (ll < 0 && g >= 0) || math.Abs(g) < math.Abs(ll)*(1-1e-12) {
			t.Fatalf("%+v: LL = %.17g, G² = %.17g; want same sign and |G²| ≥ |LL|", k, ll, g)
		}
		n := c + d
		e1, e2 := c*(a+b)/n, d*(a+b)/n
		// The other-words row in deviance form (Σ(O−E) = 0 there too):
		// O21 − E21 = (c−a) − (c−E1) = E1 − a.
		extra := 2 * (measure.DevianceTerm(c-a, c-e1, e1-a) + measure.DevianceTerm(d-b, d-e2, a-e1))
		if diff := math.Abs(g) - math.Abs(ll); math.Abs(diff-extra) > 1e-9*math.Abs(g)+1e-9 {
			t.Fatalf("%+v: |G²| − |LL| = %.17g, other-words row = %.17g", k, diff, extra)
		}
	}
	// Rare words (a, b < 200 in corpora of 10^5 to 10^7 tokens): the
	// other-words row is close to its expectation, so its second-order
	// expansion (a−E1)²·(1/(c−E1) + 1/(d−E2)) must match |G²| − |LL| to
	// 1 %, and LL and G² must agree to within the word's larger relative
	// frequency max(a/c, b/d) (observed, not a theorem; about 1e-3 here).
	worst := 0.0
	for range 20000 {
		c := float64(100_000 + r.IntN(10_000_000))
		d := float64(100_000 + r.IntN(10_000_000))
		a := float64(r.IntN(200))
		b := float64(r.IntN(200))
		k := Contrast{a, b, c, d}
		ll, g := k.LL(), k.G2()
		e1, e2 := c*(a+b)/(c+d), d*(a+b)/(c+d)
		approx := (a - e1) * (a - e1) * (1/(c-e1) + 1/(d-e2))
		if diff := math.Abs(g) - math.Abs(ll); math.Abs(diff-approx) > 0.01*approx+1e-9 {
			t.Fatalf("%+v: |G²| − |LL| = %.17g, second-order estimate %.17g", k, diff, approx)
		}
		if g != 0 {
			rel := math.Abs(g-ll) / math.Abs(g)
			if rel > max(a/c, b/d) {
				t.Fatalf("%+v: LL = %.17g, G² = %.17g differ by %.3g relative", k, ll, g, rel)
			}
			worst = max(worst, rel)
		}
	}
	t.Logf("rare words: largest relative difference between LL and G² %.3g", worst)
	// The mapping to a measure.Table puts a in O11, b in O12, c−a in O21,
	// d−b in O22.
	o11, o12, o21, o22 := Contrast{3, 5, 100, 200}.Table().Observed()
	if o11 != 3 || o12 != 5 || o21 != 97 || o22 != 195 {
		t.Errorf("Table() cells = %v %v %v %v, want 3 5 97 195", o11, o12, o21, o22)
	}
	if err := (Contrast{3, 5, 100, 200}).Table().Check(); err != nil {
		t.Error(err)
	}
}

func TestWeirdness(t *testing.T) {
	// W = (a/c)/((b+1)/(d+1)), hand-worked:
	//   a=30, c=10,000, b=0, d=99,999: 0.003·100,000/1 = 300
	//   a=30, c=10,000, b=9, d=99,999: 0.003·100,000/10 = 30
	//   a=10, c=10,000, b=99, d=99,999: 0.001·100,000/100 = 1 (same rate)
	for _, c := range []struct {
		k    Contrast
		want float64
	}{
		{Contrast{30, 0, 10000, 99999}, 300},
		{Contrast{30, 9, 10000, 99999}, 30},
		{Contrast{10, 99, 10000, 99999}, 1},
		{Contrast{0, 9, 10000, 99999}, 0},
	} {
		if got := c.k.Weirdness(); math.Abs(got-c.want) > 1e-9*c.want+1e-12 {
			t.Errorf("%+v: Weirdness = %.12g, hand-worked %g", c.k, got, c.want)
		}
	}
}

func TestContrastInvalid(t *testing.T) {
	for _, c := range []struct {
		k    Contrast
		want string
	}{
		{Contrast{11, 0, 10, 100}, "exceeds study size"},
		{Contrast{1, 101, 10, 100}, "exceeds reference size"},
		{Contrast{-1, 0, 10, 100}, "study frequency -1"},
		{Contrast{0, 0, 0, 0}, "no usable total"},
		{Contrast{math.NaN(), 0, 10, 100}, "study frequency NaN"},
		{Contrast{1, 0, math.Inf(1), 100}, "study size +Inf"},
	} {
		err := c.k.Check()
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%+v: Check() = %v, want %q", c.k, err, c.want)
		}
		if c.k.LL() != 0 || c.k.G2() != 0 || c.k.Weirdness() != 0 {
			t.Errorf("%+v: invalid counts must score 0", c.k)
		}
	}
}

// TestContrastNoNaNOrInf: every combination of awkward values gives finite
// scores, and 0 for counts Check rejects.
func TestContrastNoNaNOrInf(t *testing.T) {
	specials := []float64{0, 1, 3, 1e6, -1, 0.5, 5e-324, 1e300, math.MaxFloat64, math.Inf(1), math.NaN()}
	for _, a := range specials {
		for _, b := range specials {
			for _, c := range specials {
				for _, d := range specials {
					k := Contrast{a, b, c, d}
					valid := k.Check() == nil
					for name, v := range map[string]float64{"LL": k.LL(), "G2": k.G2(), "Weirdness": k.Weirdness()} {
						if math.IsNaN(v) || math.IsInf(v, 0) || (!valid && v != 0) {
							t.Fatalf("%+v (valid %v): %s = %g", k, valid, name, v)
						}
					}
				}
			}
		}
	}
}

var sink float64

func BenchmarkLL(b *testing.B) {
	k := Contrast{Study: 37, Reference: 97, StudySize: 8318811, ReferenceSize: 598363}
	b.ReportAllocs()
	for b.Loop() {
		sink += k.LL()
		k.Study = float64(int(k.Study+1) % 1000)
	}
}
