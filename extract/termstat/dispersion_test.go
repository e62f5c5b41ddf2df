package termstat

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"
)

func mustParts(t testing.TB, sizes ...float64) *Parts {
	t.Helper()
	p, err := NewParts(sizes)
	require.NoError(t, err)
	return p
}

func TestDPGriesEqualParts(t *testing.T) {
	// DP as Gries (2008), IJCL 13(4), defines it, worked by hand on five
	// equal parts, s_i = 0.2, a word occurring 1, 2, 3, 4, 5 times, so
	// v_i = 1/15 … 5/15:
	//   |1/15−3/15| + |2/15−3/15| + |3/15−3/15| + |4/15−3/15| + |5/15−3/15|
	//   = (2 + 1 + 0 + 1 + 2)/15 = 6/15;  DP = ½·6/15 = 0.2
	//   DPnorm = 0.2/(1 − 0.2) = 0.25   (Lijffijt and Gries 2012)
	p := mustParts(t, 100, 100, 100, 100, 100)
	checkDP(t, p, []float64{1, 2, 3, 4, 5}, 0.2, 0.25)
}

func TestDPGriesUnequalParts(t *testing.T) {
	// Gries (2008) illustrates DP on a toy corpus of five parts with 9, 10,
	// 10, 10 and 11 words (50 in all) in which the word "a" occurs 1, 2, 3,
	// 4 and 5 times. The expected values are worked by hand from the
	// definition, not taken from the paper:
	//   s = 0.18, 0.2, 0.2, 0.2, 0.22;  v = 1/15, 2/15, 3/15, 4/15, 5/15
	//   |0.0667−0.18| + |0.1333−0.2| + |0.2−0.2| + |0.2667−0.2| + |0.3333−0.22|
	//   = 0.11333 + 0.06667 + 0 + 0.06667 + 0.11333 = 0.36;  DP = 0.18
	//   DPnorm = 0.18/(1 − 0.18) = 0.219512
	p := mustParts(t, 9, 10, 10, 10, 11)
	checkDP(t, p, []float64{1, 2, 3, 4, 5}, 0.18, 0.219512)
}

func TestDPSkewed(t *testing.T) {
	// Hand-worked, parts of 10, 20, 30, 40 tokens: s = 0.1, 0.2, 0.3, 0.4.
	p := mustParts(t, 10, 20, 30, 40)
	// All 8 occurrences in the largest part: v = 0, 0, 0, 1
	//   DP = ½(0.1 + 0.2 + 0.3 + 0.6) = 0.6;  DPnorm = 0.6/0.9 = 0.666667
	checkDP(t, p, []float64{0, 0, 0, 8}, 0.6, 0.666667)
	// All in the smallest part, the most uneven case: v = 1, 0, 0, 0
	//   DP = ½(0.9 + 0.2 + 0.3 + 0.4) = 0.9 = 1 − min s;  DPnorm = 1
	checkDP(t, p, []float64{3, 0, 0, 0}, 0.9, 1)
	// Frequencies proportional to part sizes: v = s, DP = 0.
	checkDP(t, p, []float64{1, 2, 3, 4}, 0, 0)
}

func checkDP(t *testing.T, p *Parts, freqs []float64, wantDP, wantNorm float64) {
	t.Helper()
	dp, err := p.DP(freqs)
	require.NoError(t, err)
	norm, err := p.DPNorm(freqs)
	require.NoError(t, err)
	if math.Abs(dp-wantDP) > 1e-6 || math.Abs(norm-wantNorm) > 1e-6 {
		t.Errorf("freqs %v: DP = %.9f, DPnorm = %.9f; hand-worked %.6f, %.6f", freqs, dp, norm, wantDP, wantNorm)
	}
}

func TestDPRange(t *testing.T) {
	r := rand.New(rand.NewPCG(2008, 4))
	for range 2000 {
		n := 1 + r.IntN(12)
		sizes := make([]float64, n)
		freqs := make([]float64, n)
		for i := range sizes {
			sizes[i] = float64(1 + r.IntN(1000))
			freqs[i] = float64(r.IntN(5))
		}
		freqs[r.IntN(n)]++ // at least one occurrence
		p := mustParts(t, sizes...)
		dp, err1 := p.DP(freqs)
		norm, err2 := p.DPNorm(freqs)
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		if dp < 0 || dp > 1-p.minShare+1e-12 || norm < 0 || norm > 1 || norm+1e-15 < dp {
			t.Fatalf("sizes %v freqs %v: DP %g, DPnorm %g out of range", sizes, freqs, dp, norm)
		}
	}
	// One part: nothing to disperse over.
	if v, err := mustParts(t, 7).DPNorm([]float64{3}); err != nil || v != 0 {
		t.Errorf("single part DPNorm = %g, %v", v, err)
	}
}

func TestDPErrors(t *testing.T) {
	p := mustParts(t, 1, 1)
	for _, c := range []struct {
		freqs []float64
		want  string
	}{
		{[]float64{1}, "1 frequencies for 2 corpus parts"},
		{[]float64{0, 0}, "at least one occurrence"},
		{[]float64{-1, 2}, "frequency -1 in part 0"},
		{[]float64{1, math.NaN()}, "frequency NaN in part 1"},
	} {
		if _, err := p.DP(c.freqs); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("DP(%v) error = %v, want %q", c.freqs, err, c.want)
		}
	}
	for _, sizes := range [][]float64{nil, {0, 0}, {1, -1}, {math.Inf(1)}} {
		if _, err := NewParts(sizes); err == nil {
			t.Errorf("NewParts(%v) accepted bad sizes", sizes)
		}
	}
}

func TestDPNoAllocs(t *testing.T) {
	p := mustParts(t, 9, 10, 10, 10, 11)
	freqs := []float64{1, 2, 3, 4, 5}
	if a := testing.AllocsPerRun(100, func() { _, _ = p.DPNorm(freqs) }); a != 0 {
		t.Errorf("DPNorm allocates %v times per call", a)
	}
}

func BenchmarkDP(b *testing.B) {
	sizes := make([]float64, 50)
	freqs := make([]float64, 50)
	for i := range sizes {
		sizes[i] = float64(1000 + 37*i)
		freqs[i] = float64(i % 7)
	}
	p := mustParts(b, sizes...)
	b.ReportAllocs()
	for b.Loop() {
		v, _ := p.DPNorm(freqs)
		benchDP += v
	}
}

var benchDP float64
