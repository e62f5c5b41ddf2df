package termstat

import (
	"math"
	"testing"
)

// Hand-worked: a = 9.9, b = 0 with α = 0.1 in corpora of 1,000 and 100,000
// tokens: ((9.9+0.1)/1000) / ((0+0.1)/100000) = 0.01 / 0.000001 = 10,000.
// A word used at the same rate in both corpora (a = 1, b = 100) scores
// (1.1/1000)/(100.1/100000) ≈ 1.0989.
func TestSmoothedWeirdness(t *testing.T) {
	cases := []struct {
		k     Contrast
		alpha float64
		want  float64
	}{
		{Contrast{9.9, 0, 1000, 100000}, 0.1, 10000},
		{Contrast{1, 100, 1000, 100000}, 0.1, (1.1 / 1000) / (100.1 / 100000)},
		{Contrast{1, 100, 0, 100000}, 0.1, 0},
		{Contrast{1, 1, 10, 10}, 0, 0},
	}
	for _, c := range cases {
		if got := c.k.SmoothedWeirdness(c.alpha); math.Abs(got-c.want) > 1e-9*math.Max(1, c.want) {
			t.Errorf("%+v α=%g: got %g, want %g", c.k, c.alpha, got, c.want)
		}
	}
}
