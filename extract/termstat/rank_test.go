package termstat

import (
	"math"
	"slices"
	"testing"

	"github.com/stretchr/testify/require"
)

func TestCombineMeanRank(t *testing.T) {
	// Hand-worked. Column 1 = [3, 1, 2]: ranks 0, 2, 1 of 0..2 → 1, 0, 0.5.
	// Column 2 = [1, 1, 5]: 5 has rank 0 → 1; the tied 1s share ranks 1 and
	// 2, mean 1.5 → 1 − 1.5/2 = 0.25. Means: 0.625, 0.125, 0.75.
	got, err := Combine([][]float64{{3, 1, 2}, {1, 1, 5}}, MeanRank)
	require.NoError(t, err)
	want := []float64{0.625, 0.125, 0.75}
	for i := range want {
		if math.Abs(got[i]-want[i]) > 1e-15 {
			t.Fatalf("Combine = %v, hand-worked %v", got, want)
		}
	}
	if o := Order([]string{"a", "b", "c"}, got); !slices.Equal(o, []int{2, 0, 1}) {
		t.Errorf("Order = %v, want [2 0 1]", o)
	}
}

func TestCombineMeanZ(t *testing.T) {
	// Column [1, 2, 3]: mean 2, population sd √(2/3) = 0.816497, so z =
	// −1.224745, 0, 1.224745. A constant column contributes 0; the mean of
	// the two columns halves the z-scores.
	got, err := Combine([][]float64{{1, 2, 3}, {7, 7, 7}}, MeanZ)
	require.NoError(t, err)
	want := []float64{-0.612372, 0, 0.612372}
	for i := range want {
		if math.Abs(got[i]-want[i]) > 1e-6 {
			t.Fatalf("Combine = %v, hand-worked %v", got, want)
		}
	}
}

func TestOrderDeterministic(t *testing.T) {
	keys := []string{"valve", "drip line", "zone", "sensor", "x"}
	scores := []float64{1, 2, 1, 2, math.NaN()}
	want := []int{1, 3, 0, 2, 4} // 2s by key, then 1s by key, NaN last
	for range 5 {
		if got := Order(keys, scores); !slices.Equal(got, want) {
			t.Fatalf("Order = %v, want %v", got, want)
		}
	}
}

func TestCombineErrors(t *testing.T) {
	if _, err := Combine(nil, MeanRank); err == nil {
		t.Error("no columns accepted")
	}
	if _, err := Combine([][]float64{{1, 2}, {1}}, MeanRank); err == nil {
		t.Error("ragged columns accepted")
	}
	if _, err := Combine([][]float64{{1, math.NaN()}}, MeanZ); err == nil {
		t.Error("NaN accepted")
	}
	if _, err := Combine([][]float64{{1}}, CombineMethod(9)); err == nil {
		t.Error("unknown method accepted")
	}
	if got, err := Combine([][]float64{{4}}, MeanRank); err != nil || got[0] != 1 {
		t.Errorf("single candidate: %v, %v", got, err)
	}
}
