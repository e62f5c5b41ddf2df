package hmm

import (
	"math"
	"sync/atomic"

	"glossmith/tagger/genfreq"
	"glossmith/tagger/wordnet"
)

// perceptron holds the weights of the discriminative model in the form
// decoding wants: a hash table from feature key to row, and per row the
// non-zero weights as (tag, weight) pairs. Transition weights live in
// Model.trans.
type perceptron struct {
	dictMin  int32
	maxCands int
	// wn is the model's table of WordNet word classes (Model.wn), nil
	// when it has none: the word-alone features read it.
	wn *wordnet.Table
	// freq is the model's general-English frequency table (Model.freq),
	// nil when it has none.
	freq *genfreq.Table

	keys     []uint64 // feature keys, sorted; row i belongs to keys[i]
	rowStart []int32  // weights of row i: cells[rowStart[i]:rowStart[i+1]]
	cells    []cell

	slots []slot // open-addressing table of keys
	mask  uint64
	// bloom has two bits set for every key (see row).
	bloom []uint64

	// layers are the transition weights as trained (and stored);
	// Model.trans holds them folded into one table.
	layers []transLayer

	// views[w] is the precomputed view of lexicon word w; edge holds the
	// rows of the features that see the sentence boundary.
	views []atomic.Pointer[wordView]
	edge  viewBoundary
	nt    int // number of tags
	// dict[w] lists the tags the tag dictionary allows lexicon word w, in
	// dtags (see dictShare); only entries of words seen dictMin times
	// or more are used.
	dict  []dictEntry
	dtags []uint8
	// dense[r] is the offset in denseW of row r as a dense vector over
	// the tags, or -1 for a short row (see denseMin).
	dense  []int32
	denseW []int16 // weights in steps, as in cells
	// classes gives the word class features of the tokens (nil: none).
	classes *classFeatures
	// id identifies these weights to the workspaces that cache what they
	// read from them (see weightsIDs); set by prepareViews.
	id uint64
}

// dictShare is the smallest share of a frequent word's occurrences with
// which a tag must have been seen to stay in the tag dictionary. The
// treebank annotates a few hundredths of a percent of frequent words with
// a tag that is an error or a rare use ("the" as a proper noun in a
// title); each such tag made the word need scoring and widened the
// lattice. Tuned on UD English EWT dev: 0.002 gives UPOS 95.23 / XPOS
// 94.62 against 95.21 / 94.60 with no pruning (0.001: 95.22, 0.005:
// 95.20, 0.02: 95.13), and tags technical text about 20% faster.
const dictShare = 0.002

// dictEntry locates a word's allowed tags in perceptron.dtags.
type dictEntry struct{ first, n int32 }

// dictTags returns the tags the tag dictionary allows lexicon word w.
func (p *perceptron) dictTags(w int32) []uint8 {
	d := p.dict[w]
	return p.dtags[d.first : d.first+d.n]
}

// prepareDict builds the pruned tag dictionary. A word keeps its tags
// seen in at least dictShare of its occurrences, in their stored order;
// the most frequent one always passes.
func (p *perceptron) prepareDict(m *Model) {
	p.dict = make([]dictEntry, len(m.words))
	p.dtags = p.dtags[:0]
	for w, e := range m.words {
		d := dictEntry{first: int32(len(p.dtags))}
		for j := e.first; j < e.first+e.ntags; j++ {
			if float64(m.wcount[j]) >= dictShare*float64(e.count) {
				p.dtags = append(p.dtags, m.wtags[j])
			}
		}
		d.n = int32(len(p.dtags)) - d.first
		p.dict[w] = d
	}
}

// prepare builds what decoding needs beyond the stored weights.
func (p *perceptron) prepare(m *Model) {
	p.wn, p.freq = m.wn, m.freq
	p.index()
	p.classes = p.learnedClasses()
	p.prepareDict(m)
	freq := make([]int64, len(m.tags)+1)
	freq[len(m.tags)] = math.MaxInt64 // the boundary
	for j, t := range m.wtags {
		freq[t] += int64(m.wcount[j])
	}
	m.trans = (&transitions{t1: len(m.tags) + 1, layers: p.layers}).fold(frequencyRank(freq))
	p.prepareViews(m)
}

// cell is one weight of a feature row: the tag and its weight side by
// side, so that reading a row touches one run of memory. The weight is
// kept as its count of weightSteps, which halves the rows' memory (and
// the cache they take); q·weightStep is exact in float32.
type cell struct {
	q int16
	t uint8
}

// w returns the cell's weight.
func (c cell) w() float32 { return float32(c.q) * weightStep }

// steps returns the weight of row r for tag t in steps (0 when absent),
// from the dense copy of a long row (see denseMin) or by scanning a short
// one.
func (p *perceptron) steps(r int32, t uint8) int32 {
	if r < 0 {
		return 0
	}
	if d := p.dense[r]; d >= 0 {
		return int32(p.denseW[int(d)+int(t)])
	}
	for _, c := range p.cells[p.rowStart[r]:p.rowStart[r+1]] {
		if c.t == t {
			return int32(c.q)
		}
	}
	return 0
}

// slot holds a key with its row, so that a look-up touches one cache line.
type slot struct {
	key uint64 // 0: empty
	row int32
}

// index builds the open-addressing table over keys, at most 2/3 full.
func (p *perceptron) index() {
	size := 1
	for size*2 < 3*len(p.keys)+1 {
		size <<= 1
	}
	p.slots = make([]slot, size)
	p.mask = uint64(size - 1)
	for i, k := range p.keys {
		s := k & p.mask
		for p.slots[s].key != 0 {
			s = (s + 1) & p.mask
		}
		p.slots[s] = slot{k, int32(i)}
	}
	p.bloom = make([]uint64, bloomBits/64)
	for _, k := range p.keys {
		a, b := bloomBitsOf(k)
		p.bloom[a>>6] |= 1 << (a & 63)
		p.bloom[b>>6] |= 1 << (b & 63)
	}
}

// bloomBits is the size of the Bloom filter in front of the feature table:
// 128 KB, which stays in a core's cache while the 2 MB table does not.
// Most keys looked up are absent (word pairs never seen in training); with
// some 84,000 keys and two bits each, the filter turns away about 97% of
// them without touching the table.
const bloomBits = 1 << 20

// bloomBitsOf returns the filter's two bits for a key (keys are hashes
// already, see key).
func bloomBitsOf(k uint64) (uint64, uint64) {
	return k & (bloomBits - 1), (k >> 32) & (bloomBits - 1)
}

// row returns the row of a feature key, or -1.
func (p *perceptron) row(k uint64) int32 {
	a, b := bloomBitsOf(k)
	if p.bloom[a>>6]&(1<<(a&63)) == 0 || p.bloom[b>>6]&(1<<(b&63)) == 0 {
		return -1
	}
	s := k & p.mask
	for {
		e := &p.slots[s]
		if e.key == k {
			return e.row
		}
		if e.key == 0 {
			return -1
		}
		s = (s + 1) & p.mask
	}
}

// weightStep is the resolution of stored weights: they are kept as 16-bit
// integers times weightStep in the model file, and rounded the same way in
// memory so that a trained model and its saved copy tag alike.
const weightStep = 1.0 / 512

func quantize(w float64) float32 {
	q := math.Round(w / weightStep)
	q = max(-32767, min(32767, q))
	return float32(q * weightStep)
}
