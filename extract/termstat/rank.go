package termstat

import (
	"errors"
	"fmt"
	"math"
	"sort"
)

// CombineMethod chooses how [Combine] merges several scores.
type CombineMethod int

const (
	// MeanRank averages normalised ranks: in each column the highest value
	// gets 1, the lowest 0, tied values share the mean of their ranks
	// (fractional ranking), and the combined score is the mean over the
	// columns. It ignores the scale of each measure, so a measure with a
	// long tail (G², frequency) does not outweigh a bounded one (logDice).
	MeanRank CombineMethod = iota
	// MeanZ averages z-scores: each column is centred on its mean and
	// divided by its (population) standard deviation; a constant column
	// contributes 0. It keeps how far apart the values are, at the price of
	// sensitivity to outliers.
	MeanZ
)

// Combine merges several score columns, each with one value per candidate
// and oriented so that higher is better (negate a measure such as DP where
// lower is better), into one combined score per candidate, higher better.
// Both methods are common practice for combining term-ranking measures
// rather than a single published method; they are deterministic. Columns
// must be equally long and hold finite values.
func Combine(columns [][]float64, method CombineMethod) ([]float64, error) {
	if len(columns) == 0 {
		return nil, errors.New("termstat: no score columns to combine")
	}
	n := len(columns[0])
	for j, col := range columns {
		if len(col) != n {
			return nil, fmt.Errorf("termstat: score column %d has %d values, column 0 has %d", j, len(col), n)
		}
		for i, x := range col {
			if math.IsNaN(x) || math.IsInf(x, 0) {
				return nil, fmt.Errorf("termstat: score column %d, row %d is %g", j, i, x)
			}
		}
	}
	out := make([]float64, n)
	tmp := make([]float64, n)
	order := make([]int, n)
	for _, col := range columns {
		switch method {
		case MeanRank:
			normalRanks(col, tmp, order)
		case MeanZ:
			zScores(col, tmp)
		default:
			return nil, fmt.Errorf("termstat: unknown combine method %d", method)
		}
		for i := range out {
			out[i] += tmp[i]
		}
	}
	for i := range out {
		out[i] /= float64(len(columns))
	}
	return out, nil
}

// normalRanks writes to dst the normalised fractional rank of each value:
// 1 for the highest, 0 for the lowest, ties sharing their mean rank.
func normalRanks(col, dst []float64, order []int) {
	n := len(col)
	if n == 1 {
		dst[0] = 1
		return
	}
	for i := range order {
		order[i] = i
	}
	sort.Slice(order, func(x, y int) bool { return col[order[x]] > col[order[y]] })
	for i := 0; i < n; {
		j := i + 1
		for j < n && col[order[j]] == col[order[i]] {
			j++
		}
		rank := float64(i+j-1) / 2 // mean 0-based rank of the tie group
		for _, k := range order[i:j] {
			dst[k] = 1 - rank/float64(n-1)
		}
		i = j
	}
}

func zScores(col, dst []float64) {
	var mean float64
	for _, x := range col {
		mean += x
	}
	mean /= float64(len(col))
	var ss float64
	for _, x := range col {
		ss += (x - mean) * (x - mean)
	}
	sd := math.Sqrt(ss / float64(len(col)))
	for i, x := range col {
		if sd == 0 {
			dst[i] = 0
		} else {
			dst[i] = (x - mean) / sd
		}
	}
}

// Order returns the candidate indices sorted by score, highest first, with
// ties broken by key in ascending byte order and then by index, so the
// output is the same on every run and platform. keys and scores must be
// equally long; NaN scores sort last.
func Order(keys []string, scores []float64) []int {
	idx := make([]int, len(scores))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(x, y int) bool {
		a, b := idx[x], idx[y]
		sa, sb := scores[a], scores[b]
		nanA, nanB := math.IsNaN(sa), math.IsNaN(sb)
		switch {
		case nanA != nanB:
			return nanB // the NaN goes last
		case !nanA && sa != sb:
			return sa > sb
		case keys[a] != keys[b]:
			return keys[a] < keys[b]
		}
		return a < b
	})
	return idx
}
