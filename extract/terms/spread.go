package terms

import "math"

// docSpread computes Gries' deviation of proportions (DP) of candidates
// over the documents of a corpus with the very floating-point operations,
// in the same order, as termstat.Parts.DP on the dense vector of a
// candidate's per-document frequencies, so the results are the same to
// the last bit; but it takes the sparse per-document counts of a group.
//
// A dense evaluation costs every candidate one pass over all documents
// (two with the validation of the frequencies), and most candidates occur
// in one or two of thousands: at the end of a large run that made DP most
// of the serial tail. Up to a candidate's first document its running sum
// adds only the shares of the documents it is absent from (|0/T − s_i| is
// s_i exactly), the same for every candidate, so that sum is computed once
// (before); the pass starts at the first document. And candidates found in
// one document only share the DP of that document (see dp).
type docSpread struct {
	share  []float64 // each document's share of the corpus's word tokens
	before []float64 // before[i] = share[0] + … + share[i-1], added in that order
}

// newDocSpread returns the spread table of documents of the given sizes
// in word tokens, or nil when they hold no tokens at all (where
// termstat.NewParts fails and DP is left 0).
func newDocSpread(sizes []int) *docSpread {
	// termstat.NewParts: the total in order, then each size over it.
	var total float64
	for _, n := range sizes {
		total += float64(n)
	}
	if !(total > 0) || math.IsInf(total, 1) {
		return nil
	}
	t := &docSpread{share: make([]float64, len(sizes)), before: make([]float64, len(sizes)+1)}
	for i, n := range sizes {
		t.share[i] = float64(n) / total
		t.before[i+1] = t.before[i] + t.share[i]
	}
	return t
}

// newMemo returns a memo for dp, for one goroutine.
func (t *docSpread) newMemo() []float64 {
	memo := make([]float64, len(t.share))
	for i := range memo {
		memo[i] = math.NaN()
	}
	return memo
}

// dp returns DP for a candidate's counts per document, in document order.
// memo (see newMemo) keeps the DP of candidates found in one document
// only, most of them: their frequencies over their total are 1 in that
// document and 0 elsewhere, whatever the count, so they all have the DP of
// their document.
func (t *docSpread) dp(perDoc []docFreq, memo []float64) float64 {
	if len(perDoc) == 0 {
		return 0
	}
	if len(perDoc) == 1 && perDoc[0].n > 0 {
		d := perDoc[0].doc
		if math.IsNaN(memo[d]) {
			memo[d] = t.dense(perDoc)
		}
		return memo[d]
	}
	return t.dense(perDoc)
}

// dense computes dp without the memo.
func (t *docSpread) dense(perDoc []docFreq) float64 {
	// The total of the frequencies: whole numbers, so exact in any order.
	var total float64
	for _, df := range perDoc {
		total += float64(df.n)
	}
	if !(total > 0) {
		return 0 // termstat.Parts.DP fails: no occurrence
	}
	first := int(perDoc[0].doc)
	sum := t.before[first]
	k := 0
	for i := first; i < len(t.share); i++ {
		var f float64
		for k < len(perDoc) && int(perDoc[k].doc) == i {
			f += float64(perDoc[k].n)
			k++
		}
		if f == 0 {
			sum += t.share[i] // |0/total − s_i|
			continue
		}
		sum += math.Abs(f/total - t.share[i])
	}
	return min(sum/2, 1)
}
