package termstat

import (
	"errors"
	"fmt"
	"math"
)

// Parts describes how a corpus is divided for dispersion measures: the
// size of each part (documents, files, sections) as a share of the corpus.
// Build it once with [NewParts] and score every word against it.
type Parts struct {
	share    []float64 // s_i, summing to 1
	minShare float64
}

// NewParts returns the parts of a corpus with the given sizes (any unit,
// typically tokens). Sizes must be finite and non-negative with a positive
// total; parts of size 0 are allowed (a word cannot occur in them).
func NewParts(sizes []float64) (*Parts, error) {
	if len(sizes) == 0 {
		return nil, errors.New("termstat: corpus has no parts")
	}
	var total float64
	for i, s := range sizes {
		if !(s >= 0) || math.IsInf(s, 1) {
			return nil, fmt.Errorf("termstat: part %d has invalid size %g", i, s)
		}
		total += s
	}
	if !(total > 0) || math.IsInf(total, 1) {
		return nil, fmt.Errorf("termstat: corpus parts have invalid total size %g", total)
	}
	p := &Parts{share: make([]float64, len(sizes)), minShare: 1}
	for i, s := range sizes {
		p.share[i] = s / total
		p.minShare = min(p.minShare, p.share[i])
	}
	return p, nil
}

// Len returns the number of parts.
func (p *Parts) Len() int { return len(p.share) }

// DP returns Gries' deviation of proportions for a word with the given
// frequency in each part, Gries (2008), "Dispersions and adjusted
// frequencies in corpora", International Journal of Corpus Linguistics
// 13(4):403–437:
//
//	DP = ½ · Σ_i |v_i − s_i|
//
// with s_i the share of part i in the corpus and v_i the share of the
// word's occurrences that fall in part i. DP is 0 when the word is spread
// exactly as the corpus is and approaches 1 when it is concentrated in one
// small part; a term used evenly throughout a manual scores low, a word
// confined to one chapter high. It is the total variation distance between
// the two distributions.
//
// freqs must have one non-negative, finite entry per part and a positive
// total; otherwise DP returns an error. It does not allocate.
func (p *Parts) DP(freqs []float64) (float64, error) {
	if len(freqs) != len(p.share) {
		return 0, fmt.Errorf("termstat: %d frequencies for %d corpus parts", len(freqs), len(p.share))
	}
	var total float64
	for i, f := range freqs {
		if !(f >= 0) || math.IsInf(f, 1) {
			return 0, fmt.Errorf("termstat: frequency %g in part %d is invalid", f, i)
		}
		total += f
	}
	if !(total > 0) || math.IsInf(total, 1) {
		return 0, fmt.Errorf("termstat: word frequencies total %g; DP needs at least one occurrence", total)
	}
	var sum float64
	for i, f := range freqs {
		sum += math.Abs(f/total - p.share[i])
	}
	return min(sum/2, 1), nil
}

// DPNorm returns DP normalised to the range [0, 1] by its largest possible
// value for this corpus division, 1 − min_i s_i (reached when every
// occurrence falls in the smallest part), following Lijffijt and Gries
// (2012), "Correction to Stefan Th. Gries' 'Dispersions and adjusted
// frequencies in corpora'", International Journal of Corpus Linguistics
// 17(1):147–149. With a single part DP is always 0 and so is DPNorm.
// Errors are those of [Parts.DP].
func (p *Parts) DPNorm(freqs []float64) (float64, error) {
	dp, err := p.DP(freqs)
	if err != nil {
		return 0, err
	}
	span := 1 - p.minShare
	if span <= 0 {
		return 0, nil
	}
	return min(dp/span, 1), nil
}
