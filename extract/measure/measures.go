package measure

import "math"

// G2 returns the log-likelihood ratio statistic G² (−2 log λ) of the table,
// Dunning (1993), "Accurate methods for the statistics of surprise and
// coincidence", Computational Linguistics 19(1):
//
//	G² = 2 · Σ_ij O_ij · ln(O_ij / E_ij)   over the four cells, 0·ln 0 = 0.
//
// G² is two-sided: it is large both for pairs seen together far more often
// than chance (attraction) and far less often (repulsion); see [SignedG2].
// It is ≥ 0, 0 exactly at independence, symmetric in x and y, and
// asymptotically χ²-distributed with one degree of freedom (3.84 is the 5 %
// critical value, 10.83 the 0.1 % one).
//
// Because Σ O_ij = Σ E_ij, the statistic equals 2 · Σ (O ln(O/E) − (O − E)),
// a sum of non-negative terms; each term is evaluated without cancellation
// (a series for O close to E), so G² stays accurate to a few ulps even for
// pairs near independence. Invalid tables score 0.
func G2(t Table) float64 {
	if !t.Valid() {
		return 0
	}
	return g2(t, t.excess())
}

func g2(t Table, d float64) float64 {
	o11, o12, o21, o22 := t.Observed()
	e11, e12, e21, e22 := t.Expected()
	s := DevianceTerm(o11, e11, d) + DevianceTerm(o12, e12, -d) +
		DevianceTerm(o21, e21, -d) + DevianceTerm(o22, e22, d)
	return Finite(2 * s)
}

// DevianceTerm returns o·ln(o/e) − (o − e) ≥ 0 for a cell with observed
// count o, expected count e and o − e = d (d passed in because it is known
// more accurately than o − e would be computed here). Summing these terms
// over cells whose observed and expected totals agree gives G²/2 without
// cancellation; package termstat uses it for keyness too.
func DevianceTerm(o, e, d float64) float64 {
	if o <= 0 {
		return e // 0·ln 0 = 0
	}
	if e <= 0 {
		return 0 // cannot happen for a valid table (e = 0 forces o = 0)
	}
	u := d / e // o/e = 1 + u
	if math.Abs(u) < 0.01 {
		// (1+u)·ln(1+u) − u = Σ_{k≥2} (−1)^k u^k / (k(k−1)); ten terms
		// reach double precision for |u| < 0.01.
		var s float64
		p := u * u
		for k := 2; k <= 11; k++ {
			s += p / float64(k*(k-1))
			p *= -u
		}
		return e * s
	}
	if u > -0.5 {
		return o*math.Log1p(u) - d
	}
	// o far below e: log1p(u) would round u to −1 when o is tiny; the
	// difference of logarithms cannot overflow or underflow.
	return o*(math.Log(o)-math.Log(e)) - d
}

// G2Entropy returns G² computed in its entropy form, the same statistic
// rewritten with ln(O/E) = ln O − ln R − ln C + ln n (R, C the row and
// column totals of the cell):
//
//	G² = 2 · [Σ_cells k ln k − Σ_rows R ln R − Σ_cols C ln C + n ln n]
//	   = 2n · (H(rows) + H(cols) − H(table)),
//
// with H the entropy of the empirical distributions. It exists as an
// independent check of [G2] and for readers who know this form; it is less
// accurate near independence, where it subtracts numbers of size n·ln n to
// obtain a small result. Invalid tables score 0.
func G2Entropy(t Table) float64 {
	if !t.Valid() {
		return 0
	}
	o11, o12, o21, o22 := t.Observed()
	cells := xlnx(o11) + xlnx(o12) + xlnx(o21) + xlnx(o22)
	rows := xlnx(t.F1) + xlnx(t.N-t.F1)
	cols := xlnx(t.F2) + xlnx(t.N-t.F2)
	g := 2 * (cells - rows - cols + xlnx(t.N))
	if g < 0 { // rounding below the true minimum 0
		g = 0
	}
	return Finite(g)
}

func xlnx(x float64) float64 {
	if x <= 0 {
		return 0
	}
	return x * math.Log(x)
}

// SignedG2 returns [G2] with the sign of O11 − E11: positive for attraction
// (the pair occurs more often than chance predicts), negative for
// repulsion. Ranking collocations by SignedG2 puts the strongest attracted
// pairs first, while ranking by G2 would mix in strongly repelled ones. The
// signing itself is common practice, not part of Dunning (1993).
func SignedG2(t Table) float64 {
	if !t.Valid() {
		return 0
	}
	d := t.excess()
	if d < 0 {
		return -g2(t, d)
	}
	return g2(t, d)
}

// PMI returns the pointwise mutual information of the pair in bits, the
// "association ratio" of Church and Hanks (1990), "Word association norms,
// mutual information, and lexicography", Computational Linguistics 16(1),
// with probabilities estimated by relative frequencies:
//
//	PMI = log2( P(x,y) / (P(x)·P(y)) ) = log2( f12·n / (f1·f2) ).
//
// PMI is 0 at independence and symmetric in x and y. It is known to favour
// rare pairs: a pair seen once whose parts are each seen once gets the
// maximum, log2 n. A pair never seen together (f12 = 0) returns [LogFloor];
// invalid tables score 0.
func PMI(t Table) float64 {
	if !t.Valid() {
		return 0
	}
	return pmi(t, 1)
}

// pmi returns log2(f12^k·n/(f1·f2)) for k = 1 (PMI) or 3 (MI³). For
// ordinary counts it divides the two exact products (so that independence
// gives exactly 0); products beyond the float64 range fall back to summing
// logarithms term by term.
func pmi(t Table, k int) float64 {
	if t.F12 == 0 {
		return LogFloor
	}
	num := t.F12 * t.N
	if k == 3 {
		num *= t.F12 * t.F12
	}
	den := t.F1 * t.F2
	if num >= 0x1p-1022 && num <= math.MaxFloat64 && den >= 0x1p-1022 && den <= math.MaxFloat64 {
		return logFloored(math.Log2(num / den))
	}
	return logFloored(float64(k)*math.Log2(t.F12) + math.Log2(t.N) - math.Log2(t.F1) - math.Log2(t.F2))
}

// MI3 returns the cubic association ratio MI³ of Daille (1994), "Approche
// mixte pour l'extraction automatique de terminologie : statistiques
// lexicales et filtres linguistiques", PhD thesis, Université Paris 7:
//
//	MI³ = log2( f12³·n / (f1·f2) ).
//
// Cubing the joint frequency counters PMI's preference for rare pairs.
// Symmetric in x and y. f12 = 0 returns [LogFloor]; invalid tables score 0.
func MI3(t Table) float64 {
	if !t.Valid() {
		return 0
	}
	return pmi(t, 3)
}

// TScore returns the t-score of the pair,
//
//	t = (O11 − E11) / √O11,
//
// the form used for collocations by Church, Gale, Hanks and Hindle (1991),
// "Using statistics in lexical analysis", and derived in Manning and
// Schütze (1999), Foundations of Statistical Natural Language Processing,
// chapter 5 (the t test for collocations): the pair's occurrence is a Bernoulli trial over the n pairs with
// sample mean x̄ = f12/n, the null hypothesis mean is μ = P(x)·P(y) =
// f1·f2/n², and the sample variance x̄(1−x̄) is approximated by x̄ because
// x̄ is tiny. Then t = (x̄ − μ)/√(x̄/n), which is exactly the count form
// above. Symmetric in x and y.
//
// For f12 = 0 the statistic divides by zero; TScore returns 0 (no
// evidence). Invalid tables score 0.
func TScore(t Table) float64 {
	if !t.Valid() || t.F12 == 0 {
		return 0
	}
	return tscore(t, t.excess())
}

func tscore(t Table, d float64) float64 {
	if t.F12 == 0 {
		return 0
	}
	return Finite(d / math.Sqrt(t.F12))
}

// ChiSquare returns Pearson's χ² statistic for the 2×2 table, without
// Yates' continuity correction, in the closed form for 2×2 tables given by
// Manning and Schütze (1999), chapter 5 (Pearson's χ² test):
//
//	χ² = n·(O11·O22 − O12·O21)² / ((O11+O12)(O11+O21)(O12+O22)(O21+O22)).
//
// It is ≥ 0, 0 at independence, symmetric in x and y, and asymptotically
// χ²-distributed with one degree of freedom. When a margin is zero (f1 or
// f2 is 0 or n) the formula is 0/0 and ChiSquare returns 0: a constant
// margin carries no evidence. Invalid tables score 0.
func ChiSquare(t Table) float64 {
	if !t.Valid() {
		return 0
	}
	return chiSquare(t, t.excess())
}

func chiSquare(t Table, d float64) float64 {
	r1, r2 := t.F1, t.N-t.F1
	c1, c2 := t.F2, t.N-t.F2
	if r1 == 0 || r2 == 0 || c1 == 0 || c2 == 0 {
		return 0
	}
	// O11·O22 − O12·O21 = n·d; divide step by step so nothing overflows.
	x := t.N * d
	return Finite(t.N * (x / r1) * (x / r2) / c1 / c2)
}

// Dice returns the Dice coefficient of the pair, 2·f12 / (f1 + f2), from
// Dice (1945), "Measures of the amount of ecologic association between
// species", Ecology 26(3). It lies in [0, 1], is 1 when x and y only ever
// occur together, and does not depend on n. Symmetric in x and y. Invalid
// tables and f1 = f2 = 0 score 0.
func Dice(t Table) float64 {
	if !t.Valid() {
		return 0
	}
	return dice(t)
}

func dice(t Table) float64 {
	if t.F12 == 0 {
		return 0
	}
	if sum := t.F1 + t.F2; sum <= math.MaxFloat64 {
		return 2 * t.F12 / sum // 2·f12 ≤ f1+f2, so no overflow
	}
	// f1+f2 overflows: halve first (the counts are huge, nothing underflows).
	return t.F12 / (t.F1/2 + t.F2/2)
}

// LogDice returns logDice, Rychlý (2008), "A lexicographer-friendly
// association score", Proceedings of RASLAN 2008:
//
//	logDice = 14 + log2( 2·f12 / (f1 + f2) ) = 14 + log2(Dice).
//
// Its maximum is 14 (x and y only occur together); each point less halves
// the Dice coefficient, and 0 means the pair accounts for about 1 in 16 000
// occurrences of its parts. Like Dice it ignores n, so scores are
// comparable across corpora of different sizes. Symmetric in x and y.
// f12 = 0 returns [LogFloor]; invalid tables score 0.
func LogDice(t Table) float64 {
	if !t.Valid() {
		return 0
	}
	return logDice(t)
}

func logDice(t Table) float64 {
	if t.F12 == 0 {
		return LogFloor
	}
	return logFloored(14 + math.Log2(dice(t)))
}
