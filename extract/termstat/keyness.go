package termstat

import (
	"fmt"
	"math"

	"glossmith/extract/measure"
)

// Contrast holds a word's frequency in a study corpus (the documents a
// glossary is built from) and in a general reference corpus, with the two
// corpus sizes, for measuring how specific the word is to the study
// corpus's domain. In the notation of Rayson and Garside (2000) the four
// numbers are a, b, c and d.
type Contrast struct {
	Study         float64 // a: frequency of the word in the study corpus
	Reference     float64 // b: frequency of the word in the reference corpus
	StudySize     float64 // c: number of tokens in the study corpus
	ReferenceSize float64 // d: number of tokens in the reference corpus
}

// Valid reports whether the counts are usable: all finite and
// non-negative, a ≤ c, b ≤ d, and c + d > 0.
func (k Contrast) Valid() bool {
	return k.Check() == nil
}

// Check returns nil for valid counts and otherwise an error naming the
// problem.
func (k Contrast) Check() error {
	for _, v := range []struct {
		name string
		x    float64
	}{{"study frequency", k.Study}, {"reference frequency", k.Reference},
		{"study size", k.StudySize}, {"reference size", k.ReferenceSize}} {
		if !(v.x >= 0) || math.IsInf(v.x, 1) {
			return fmt.Errorf("termstat: %s %g is not a finite non-negative number", v.name, v.x)
		}
	}
	switch {
	case k.Study > k.StudySize:
		return fmt.Errorf("termstat: study frequency %g exceeds study size %g", k.Study, k.StudySize)
	case k.Reference > k.ReferenceSize:
		return fmt.Errorf("termstat: reference frequency %g exceeds reference size %g", k.Reference, k.ReferenceSize)
	case !(k.StudySize+k.ReferenceSize > 0) || math.IsInf(k.StudySize+k.ReferenceSize, 1):
		return fmt.Errorf("termstat: corpus sizes %g and %g give no usable total", k.StudySize, k.ReferenceSize)
	}
	return nil
}

// LL returns the log-likelihood keyness of the word, Rayson and Garside
// (2000), "Comparing corpora using frequency profiling", Proceedings of the
// ACL Workshop on Comparing Corpora:
//
//	E1 = c·(a+b)/(c+d),  E2 = d·(a+b)/(c+d)
//	LL = 2·( a·ln(a/E1) + b·ln(b/E2) ),   0·ln 0 = 0
//
// Sign convention (ours: the statistic itself is unsigned, and keyword
// lists usually report the direction beside it): LL is positive when the
// word is relatively more frequent in the study corpus (a/c > b/d, a
// candidate domain term), negative when it is relatively more frequent in
// the reference corpus, and 0 when the relative frequencies are equal. Its
// magnitude is compared with χ²(1) critical values (3.84 for p < 0.05, 6.63 for
// p < 0.01, 15.13 for p < 0.0001).
//
// LL sums only the two cells of the word's own row. The full 2×2 table
// [a, b; c−a, d−b] has G² ([Contrast.G2]) equal to LL plus the two
// non-negative terms of the "other words" row, so |G²| ≥ |LL|, and the
// two agree closely when the word is rare in both corpora (the extra terms
// are about (a−E1)²·(1/(c−E1) + 1/(d−E2))); the tests check this relation.
// Invalid counts (see [Contrast.Check]) score 0.
func (k Contrast) LL() float64 {
	if !k.Valid() {
		return 0
	}
	a, b, c, d := k.Study, k.Reference, k.StudySize, k.ReferenceSize
	n := c + d
	e1 := c * ((a + b) / n)
	e2 := d * ((a + b) / n)
	// a − E1 = (a·d − b·c)/n = −(b − E2); with Σ(O−E) = 0 over the row,
	// LL = 2·Σ (O ln(O/E) − (O−E)), summed without cancellation.
	diff := measure.Det2(a, d, b, c)
	d1 := diff / n
	if math.IsInf(d1, 0) || math.IsNaN(d1) {
		d1 = a - e1 // products beyond float64 range
	}
	ll := 2 * (measure.DevianceTerm(a, e1, d1) + measure.DevianceTerm(b, e2, -d1))
	if diff < 0 {
		ll = -ll
	}
	return measure.Finite(ll)
}

// Table returns the word's 2×2 contingency table in the form of
// [measure.Table]: rows "this word" and "other words", columns "study
// corpus" and "reference corpus", so O11 = a, O12 = b, O21 = c−a,
// O22 = d−b (f12 = a, f1 = a+b, f2 = c, n = c+d).
func (k Contrast) Table() measure.Table {
	return measure.Table{F12: k.Study, F1: k.Study + k.Reference, F2: k.StudySize, N: k.StudySize + k.ReferenceSize}
}

// G2 returns Dunning's G² of the full 2×2 table ([Contrast.Table]) with
// the sign convention of [Contrast.LL]. It is the exact log-likelihood
// ratio test for the contrast, of which LL is the common two-cell form.
// Invalid counts score 0.
func (k Contrast) G2() float64 {
	if !k.Valid() {
		return 0
	}
	return measure.SignedG2(k.Table())
}

// Weirdness returns the weirdness ratio of Ahmad, Gillam and Tostevin
// (1999), "University of Surrey participation in TREC8: weirdness indexing
// for logical document extrapolation and retrieval" — the word's relative
// frequency in the study corpus divided by its relative frequency in the
// reference corpus — with add-one smoothing:
//
//	W = (a/c) / ((b+1)/(d+1))
//
// The unsmoothed ratio is infinite for a word absent from the reference
// corpus, which is exactly the case of many specialised terms. The
// smoothing (our choice, in the spirit of common practice) counts the word
// as if the reference corpus held one more token, an occurrence of it; it
// is applied to every word, not only unseen ones, so that the score has no
// jump at b = 0. Words absent from the reference therefore rank by their
// study frequency. W > 1 means the word is relatively more frequent in the
// study corpus. Invalid counts, and c = 0, score 0.
func (k Contrast) Weirdness() float64 {
	if !k.Valid() || k.StudySize == 0 {
		return 0
	}
	return measure.Finite((k.Study / k.StudySize) * ((k.ReferenceSize + 1) / (k.Reference + 1)))
}

// SmoothedWeirdness is the weirdness ratio with additive smoothing of both
// frequencies,
//
//	W_α = ((a + α)/c) / ((b + α)/d),
//
// for ranking candidates that include rare words. Adding α to the study
// frequency as well as to the reference frequency keeps the ratio
// symmetric (a word equally rare in both corpora scores about c⁻¹/d⁻¹
// whatever its count) and, with a small α, lets a word absent from the
// reference still rank by how often the study corpus uses it. Additive
// smoothing is common practice; the value of α is the caller's choice.
// Invalid counts, a zero corpus size or α ≤ 0 score 0.
func (k Contrast) SmoothedWeirdness(alpha float64) float64 {
	if !k.Valid() || k.StudySize == 0 || k.ReferenceSize == 0 || !(alpha > 0) {
		return 0
	}
	return measure.Finite(((k.Study + alpha) / k.StudySize) / ((k.Reference + alpha) / k.ReferenceSize))
}
