package termstat

import (
	"fmt"
	"math"
	"strings"
)

// Candidate is a multi-word (or single-word) term candidate: its words,
// already normalised by the caller (for example lower-cased lemmas), and its
// frequency in the corpus. The frequency counts every occurrence, including
// occurrences inside longer candidates, as C-value requires.
type Candidate struct {
	Words []string
	Freq  float64
}

// LengthWeight chooses how C-value weights a candidate by its length.
type LengthWeight int

const (
	// Log2Length weights by log2|a|, as Frantzi, Ananiadou and Mima (2000)
	// define C-value. Single words get weight log2 1 = 0 and so always score
	// 0: the method was designed for multi-word terms only.
	Log2Length LengthWeight = iota
	// Log2LengthPlusOne weights by log2(|a|+1). This is a variant, not the
	// paper's formula: it is common practice in later term-extraction work
	// and toolkits that rank single-word and multi-word candidates together,
	// since it gives single words weight 1 while keeping longer candidates
	// ahead (weights 1, 1.58, 2, 2.32, … for lengths 1, 2, 3, 4, …).
	Log2LengthPlusOne
)

// CValueOptions adjusts C-value. The zero value is the paper's method.
type CValueOptions struct {
	Weight LengthWeight
}

// CValueResult is the C-value of one candidate with the quantities that
// produced it, so that a glossary tool can explain a score.
type CValueResult struct {
	// Score is the C-value.
	Score float64
	// Containers is P(T_a), the number of longer candidates that contain
	// this one as a contiguous word sequence; 0 means not nested.
	Containers int
	// ContainerFreq is Σ_{b∈T_a} f(b), the summed frequency of those
	// longer candidates.
	ContainerFreq float64
	// Top is the index of the most frequent of those longer candidates
	// (ties: the one whose words come first, compared word by word in
	// byte order), when
	// Containers > 0: the candidate a nested one mostly occurs in, from the
	// same pass over the sub-sequences.
	Top int
}

// Nested reports whether the candidate occurs inside a longer candidate.
func (r CValueResult) Nested() bool { return r.Containers > 0 }

// CValue computes the C-value of every candidate, Frantzi, Ananiadou and
// Mima (2000), "Automatic recognition of multi-word terms: the
// C-value/NC-value method", International Journal on Digital Libraries
// 3(2):115–130:
//
//	C(a) = log2|a| · f(a)                                if a is not nested
//	C(a) = log2|a| · ( f(a) − (1/P(T_a)) · Σ_{b∈T_a} f(b) )   otherwise
//
// where |a| is the length of a in words, f its frequency, T_a the set of
// candidates that contain a as a contiguous, strictly shorter sub-sequence
// and P(T_a) their number. Subtracting the mean frequency of the containing
// candidates discounts a string that mostly occurs as part of a longer term
// ("cell carcinoma" inside "basal cell carcinoma"), while a string nested in
// many different candidates keeps its score, since many distinct contexts
// are themselves evidence of termhood. T_a is a set: a candidate that
// contains a twice is counted once.
//
// The closed formula is implemented as stated; the paper also describes an
// incremental algorithm (longest candidates first, with a C-value threshold
// for entering the output), which callers can emulate by filtering the
// candidate set. If the counts are inconsistent — a container more
// frequent than the string inside it — the score can be negative; it is
// returned as is.
//
// The result is parallel to cands. Nesting is found without comparing all
// pairs: each candidate of length L enumerates its L(L+1)/2 − 1 proper
// contiguous sub-sequences and looks them up in a map, O(Σ L²) lookups in
// all. An error names the first bad candidate: no words, a word containing
// a NUL byte, a negative or non-finite frequency, or the same word sequence
// given twice.
func CValue(cands []Candidate, opt CValueOptions) ([]CValueResult, error) {
	// Each candidate is keyed by its words joined with NUL, so a contiguous
	// sub-sequence of words is a substring of the key between two word
	// boundaries and can be looked up without building a new string.
	keys := make([]string, len(cands))
	index := make(map[string]int, len(cands))
	for i, c := range cands {
		if len(c.Words) == 0 {
			return nil, fmt.Errorf("termstat: candidate %d has no words", i)
		}
		for _, w := range c.Words {
			if strings.IndexByte(w, 0) >= 0 {
				return nil, fmt.Errorf("termstat: candidate %d (%q): word contains a NUL byte", i, strings.Join(c.Words, " "))
			}
		}
		if !(c.Freq >= 0) || math.IsInf(c.Freq, 1) {
			return nil, fmt.Errorf("termstat: candidate %d (%q): frequency %g is not a finite non-negative number", i, strings.Join(c.Words, " "), c.Freq)
		}
		keys[i] = strings.Join(c.Words, "\x00")
		if j, dup := index[keys[i]]; dup {
			return nil, fmt.Errorf("termstat: candidate %d (%q) repeats candidate %d", i, strings.Join(c.Words, " "), j)
		}
		index[keys[i]] = i
	}

	res := make([]CValueResult, len(cands))
	lastContainer := make([]int, len(cands)) // 1 + index of the last b counted for a
	var bounds []int                         // start offset of each word in the key, plus len+1
	for b, c := range cands {
		if len(c.Words) < 2 {
			continue
		}
		key := keys[b]
		bounds = bounds[:0]
		off := 0
		for _, w := range c.Words {
			bounds = append(bounds, off)
			off += len(w) + 1
		}
		bounds = append(bounds, off) // one past the final (virtual) separator
		L := len(c.Words)
		for i := 0; i < L; i++ {
			for j := i + 1; j <= L; j++ {
				if j-i == L {
					continue // the candidate itself
				}
				a, ok := index[key[bounds[i]:bounds[j]-1]]
				if !ok || lastContainer[a] == b+1 {
					continue
				}
				lastContainer[a] = b + 1
				r := &res[a]
				if r.Containers == 0 || c.Freq > cands[r.Top].Freq || c.Freq == cands[r.Top].Freq && key < keys[r.Top] {
					r.Top = b
				}
				r.Containers++
				r.ContainerFreq += c.Freq
			}
		}
	}
	for a, c := range cands {
		f := c.Freq
		if res[a].Containers > 0 {
			f -= res[a].ContainerFreq / float64(res[a].Containers)
		}
		res[a].Score = lengthWeight(len(c.Words), opt.Weight) * f
	}
	return res, nil
}

func lengthWeight(n int, w LengthWeight) float64 {
	if w == Log2LengthPlusOne {
		return math.Log2(float64(n + 1))
	}
	return math.Log2(float64(n))
}
