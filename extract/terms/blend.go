package terms

import "math"

// Blend returns a reference that weighs the documents against two
// general-language references at once: a word's relative frequency in it
// is the geometric mean of its relative frequencies in a and in b, each
// smoothed with the weirdness ratio's α,
//
//	r(w) = √( (f_a(w) + α)/N_a · (f_b(w) + α)/N_b ),
//
// so that a word counts as general when either reference uses it often,
// without one reference's gaps (a word it lacks) making it look rare. The
// default is the tagger's treebank (written web text, 200,000 words)
// blended with the subtitles' table of package wordfreq (51 million words
// of speech): the treebank has "heading", "ratio" and "accordance" once or
// never, the subtitles "implementation" and "coefficient" hardly more, and
// a word neither has ("dripper") stands out more against the two. On the
// evaluation lists the geometric mean ranked better than the maximum or
// the arithmetic mean of the two (README).
//
// Corpus.Terms computes with the blend's exact counts; Freq and Size give
// them rounded, as equivalent counts in a reference of √(N_a·N_b) words.
func Blend(a, b Reference) Reference { return blend{a, b} }

type blend struct{ a, b Reference }

// fractionalReference is a reference whose counts for a smoothing α are
// not whole numbers: Corpus.specificity asks it for them.
type fractionalReference interface {
	counts(word string, alpha float64) (freq, size float64)
}

// counts returns the word's count and the reference size such that
// (freq + α)/size is r(w) above: size = √(N_a·N_b) and
// freq = √((f_a + α)(f_b + α)) − α, never negative.
func (x blend) counts(w string, alpha float64) (freq, size float64) {
	fa, fb := float64(x.a.Freq(w)), float64(x.b.Freq(w))
	return math.Sqrt((fa+alpha)*(fb+alpha)) - alpha, x.size()
}

func (x blend) size() float64 { return math.Sqrt(float64(x.a.Size()) * float64(x.b.Size())) }

// Freq implements Reference: the count, rounded, for the smoothing Alpha.
func (x blend) Freq(w string) int {
	f, _ := x.counts(w, Alpha)
	return int(math.Round(f))
}

// Size implements Reference: √(N_a·N_b), rounded.
func (x blend) Size() int { return int(math.Round(x.size())) }
