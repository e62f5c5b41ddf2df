package termstat

import "math"

// deviance returns o·ln(o/e) − (o − e) ≥ 0, one cell's share of G²/2,
// given d = o − e computed separately (more exactly than o − e would be
// here). Because the observed and expected counts of a row have the same
// total, summing these terms instead of o·ln(o/e) gives the same statistic
// without cancellation; near o = e a series replaces the logarithm. It is
// the same technique package measure uses for G².
func deviance(o, e, d float64) float64 {
	if o <= 0 {
		return e // 0·ln 0 = 0
	}
	if e <= 0 {
		return 0 // e = 0 forces o = 0 for consistent counts
	}
	u := d / e // o/e = 1 + u
	switch {
	case math.Abs(u) < 0.01:
		// (1+u)·ln(1+u) − u = Σ_{k≥2} (−1)^k u^k / (k(k−1))
		var s float64
		p := u * u
		for k := 2; k <= 11; k++ {
			s += p / float64(k*(k-1))
			p *= -u
		}
		return e * s
	case u > -0.5:
		return o*math.Log1p(u) - d
	}
	return o*(math.Log(o)-math.Log(e)) - d
}

// det2 returns x·y − z·w with Kahan's fused-multiply-add algorithm, with a
// relative error of at most about two units of roundoff (Jeannerod, Louvet
// and Muller 2013, Mathematics of Computation 82).
func det2(x, y, z, w float64) float64 {
	p := z * w
	e := math.FMA(-z, w, p)
	f := math.FMA(x, y, -p)
	return f + e
}
