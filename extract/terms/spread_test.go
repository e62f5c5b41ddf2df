package terms

import (
	"math"
	"math/rand/v2"
	"testing"

	"glossmith/extract/termstat"
)

// TestDocSpreadMatchesParts checks that the sparse DP of docSpread is the
// dense termstat.Parts.DP to the last bit, on random corpora with empty
// documents and candidates from everywhere: the output must not change
// with the way DP is evaluated.
func TestDocSpreadMatchesParts(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	for round := 0; round < 200; round++ {
		docs := 1 + rng.IntN(300)
		sizes := make([]int, docs)
		fsizes := make([]float64, docs)
		for i := range sizes {
			if rng.IntN(10) > 0 {
				sizes[i] = rng.IntN(20000)
			}
			fsizes[i] = float64(sizes[i])
		}
		spread := newDocSpread(sizes)
		parts, err := termstat.NewParts(fsizes)
		if (spread == nil) != (err != nil) {
			t.Fatalf("round %d: newDocSpread nil = %v, NewParts error = %v", round, spread == nil, err)
		}
		if spread == nil {
			continue
		}
		memo := spread.newMemo()
		for cand := 0; cand < 100; cand++ {
			var perDoc []docFreq
			freqs := make([]float64, docs)
			p := rng.Float64()
			for d := range docs {
				if rng.Float64() < p*p*p {
					n := int32(1 + rng.IntN(40))
					perDoc = append(perDoc, docFreq{int32(d), n})
					freqs[d] = float64(n)
				}
			}
			if cand%2 == 1 {
				// in one document, often the same: the memo's case
				d, n := rng.IntN(min(docs, 5)), int32(1+rng.IntN(40))
				perDoc = []docFreq{{int32(d), n}}
				clear(freqs)
				freqs[d] = float64(n)
			}
			want, err := parts.DP(freqs)
			if err != nil {
				want = 0 // Terms leaves DP 0 when it fails
			}
			if got := spread.dp(perDoc, memo); math.Float64bits(got) != math.Float64bits(want) {
				t.Fatalf("round %d, candidate %d (%d documents): dp = %v, termstat.Parts.DP = %v", round, cand, len(perDoc), got, want)
			}
		}
	}
}
