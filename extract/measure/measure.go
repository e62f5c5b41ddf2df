// Package measure computes association measures for word pairs from a 2×2
// contingency table, the statistics glossmith ranks collocations by.
//
// A pair (x, y) observed over some relation (adjacent words, words in a
// window, head and dependent) is described by four counts:
//
//	f12 = f(x, y)  how often x and y occur together as a pair
//	f1  = f(x)     how often x occurs as the first element of any pair
//	f2  = f(y)     how often y occurs as the second element of any pair
//	n              how many pairs there are in total
//
// From these follow the observed cells and the cells expected if x and y
// were independent (the notation of Evert 2005, "The Statistics of Word
// Cooccurrences", which most of the literature shares):
//
//	         y          ¬y
//	x     O11 = f12    O12 = f1 − f12           row total f1
//	¬x    O21 = f2−f12 O22 = n − f1 − f2 + f12  row total n − f1
//
//	E11 = f1·f2/n, E12 = f1·(n−f2)/n, E21 = (n−f1)·f2/n, E22 = (n−f1)·(n−f2)/n
//
// Every measure is a plain function of a [Table], so scoring a pair costs a
// few floating-point operations and no allocation; [Table.Scores] computes
// all of them at once, and [Lookup] finds one by the short name a command
// line flag uses.
//
// # Values that are not numbers
//
// No measure ever returns NaN or ±Inf, because one such value silently
// poisons a sort. Where the mathematics has no finite answer the functions
// return these documented stand-ins instead:
//
//   - An invalid table (see [Table.Check]: negative counts, f12 > f1 or
//     f12 > f2, f1 > n, f1 + f2 − f12 > n, n ≤ 0, NaN or infinite counts)
//     scores 0 under every measure: it carries no evidence of anything.
//     Callers that want to report bad input call [Table.Check] themselves.
//   - The significance statistics (G², t, χ²) return 0 where the statistic
//     is 0/0: a table with a zero margin for χ², f12 = 0 for t.
//   - The logarithmic measures (PMI, MI³, logDice) are −∞ for a pair never
//     seen together (f12 = 0); they return [LogFloor] instead, and any
//     smaller value (reachable only with fractional counts far below 1) is
//     raised to [LogFloor] as well, so the floor sorts below every ordinary
//     score.
//   - Counts near the float64 limit (≈1e308) could overflow an intermediate;
//     a result that would be infinite saturates at ±math.MaxFloat64. With
//     real corpus counts this never happens.
package measure

import (
	"fmt"
	"math"
)

// LogFloor is the finite stand-in for −∞ returned by the logarithmic
// measures (PMI, MI³, logDice) when the pair was never seen together
// (f12 = 0). It lies far below any value those measures reach with counts
// of at least 1 in a corpus of fewer than 2^900 pairs, so it ranks last.
const LogFloor = -1000.0

// Table is the 2×2 contingency table of a pair, given by its four marginal
// counts (see the package comment). Counts are float64 so that weighted or
// fractional counts can be scored too; ordinary counts are whole numbers.
type Table struct {
	F12 float64 // f(x, y): joint frequency of the pair
	F1  float64 // f(x): frequency of x as first element
	F2  float64 // f(y): frequency of y as second element
	N   float64 // total number of pairs
}

// Valid reports whether the counts form a contingency table: all four cells
// are non-negative, n is positive and every count is finite.
func (t Table) Valid() bool {
	// Written so that NaN fails every comparison and so counts as invalid.
	return t.N > 0 && t.N <= math.MaxFloat64 &&
		t.F12 >= 0 && t.F12 <= t.F1 && t.F12 <= t.F2 &&
		t.F1 <= t.N && t.F2 <= t.N &&
		t.N-t.F1 >= t.F2-t.F12
}

// Check returns nil for a valid table and otherwise an error naming the
// first inconsistency found, for callers that want to report bad counts
// rather than score them as 0.
func (t Table) Check() error {
	switch {
	case math.IsNaN(t.F12) || math.IsNaN(t.F1) || math.IsNaN(t.F2) || math.IsNaN(t.N):
		return fmt.Errorf("measure: count is NaN in %v", t)
	case math.IsInf(t.F12, 0) || math.IsInf(t.F1, 0) || math.IsInf(t.F2, 0) || math.IsInf(t.N, 0):
		return fmt.Errorf("measure: count is infinite in %v", t)
	case t.N <= 0:
		return fmt.Errorf("measure: total n=%g is not positive", t.N)
	case t.F12 < 0:
		return fmt.Errorf("measure: pair count f12=%g is negative", t.F12)
	case t.F12 > t.F1:
		return fmt.Errorf("measure: pair count f12=%g exceeds f1=%g", t.F12, t.F1)
	case t.F12 > t.F2:
		return fmt.Errorf("measure: pair count f12=%g exceeds f2=%g", t.F12, t.F2)
	case t.F1 > t.N:
		return fmt.Errorf("measure: f1=%g exceeds total n=%g", t.F1, t.N)
	case t.F2 > t.N:
		return fmt.Errorf("measure: f2=%g exceeds total n=%g", t.F2, t.N)
	case t.N-t.F1 < t.F2-t.F12:
		return fmt.Errorf("measure: f1+f2-f12=%g exceeds total n=%g", t.F1+t.F2-t.F12, t.N)
	}
	return nil
}

// String formats the table's counts for messages.
func (t Table) String() string {
	return fmt.Sprintf("{f12=%g f1=%g f2=%g n=%g}", t.F12, t.F1, t.F2, t.N)
}

// Observed returns the four observed cells O11, O12, O21, O22.
func (t Table) Observed() (o11, o12, o21, o22 float64) {
	return t.F12, t.F1 - t.F12, t.F2 - t.F12, (t.N - t.F1) - (t.F2 - t.F12)
}

// Expected returns the four cells expected under independence,
// E11 = f1·f2/n, E12 = f1·(n−f2)/n, E21 = (n−f1)·f2/n, E22 = (n−f1)·(n−f2)/n.
// It is meaningful for valid tables only.
func (t Table) Expected() (e11, e12, e21, e22 float64) {
	p2 := t.F2 / t.N         // P(y)
	q2 := (t.N - t.F2) / t.N // P(¬y)
	return t.F1 * p2, t.F1 * q2, (t.N - t.F1) * p2, (t.N - t.F1) * q2
}

// excess returns D = O11 − E11 = (O11·O22 − O12·O21)/n. The same D, with
// the sign flipped for the off-diagonal cells, is O − E in every cell, so
// computing it once and exactly is what keeps G², t and χ² accurate for
// pairs close to independence, where O11 − E11 would otherwise be the
// difference of two nearly equal numbers.
//
// The determinant is evaluated with Kahan's fused-multiply-add algorithm,
// whose relative error is at most about two units of roundoff (Jeannerod,
// Louvet and Muller 2013, "Further analysis of Kahan's algorithm for the
// accurate computation of 2×2 determinants", Mathematics of Computation 82).
func (t Table) excess() float64 {
	o11, o12, o21, o22 := t.Observed()
	d := Det2(o11, o22, o12, o21) / t.N
	if math.IsInf(d, 0) || math.IsNaN(d) {
		// Products beyond the float64 range: fall back to the direct
		// (overflow-free, slightly less accurate) difference.
		d = t.F12 - t.F1*(t.F2/t.N)
	}
	return d
}

// Det2 returns x·y − z·w with Kahan's fused-multiply-add algorithm, with a
// relative error of at most about two units of roundoff (Jeannerod, Louvet
// and Muller 2013, Mathematics of Computation 82).
func Det2(x, y, z, w float64) float64 {
	p := z * w
	e := math.FMA(-z, w, p) // rounding error of p, exactly
	f := math.FMA(x, y, -p)
	return f + e
}

// Finite maps the rare overflow result to a finite value: +Inf and −Inf
// saturate at ±math.MaxFloat64, NaN becomes 0 (no evidence).
func Finite(x float64) float64 {
	switch {
	case x > math.MaxFloat64:
		return math.MaxFloat64
	case x < -math.MaxFloat64:
		return -math.MaxFloat64
	case x != x: // NaN
		return 0
	}
	return x
}

// logFloored applies LogFloor to a base-2 logarithmic score.
func logFloored(x float64) float64 {
	if !(x >= LogFloor) { // also catches NaN
		return LogFloor
	}
	return Finite(x)
}
