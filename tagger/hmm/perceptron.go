package hmm

import (
	"math"
	"math/rand/v2"
	"sort"
	"sync/atomic"
	"unsafe"

	"glossmith/internal/prefetch"
	"glossmith/tagger/conllu"
	"glossmith/tagger/doc"
)

// perceptron holds the weights of the discriminative model in the form
// decoding wants: a hash table from feature key to row, and per row the
// non-zero weights as (tag, weight) pairs. Transition weights live in
// Model.trans.
type perceptron struct {
	dictMin  int32
	maxCands int

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
	p.index()
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

// buildLattice scores the tags of every token and keeps the candidates:
// the tag dictionary's tags for frequent words (one tag needs no scoring
// at all; see dictShare), the best maxCands tags for the others. Scores come from the
// words' views (see views.go).
func (p *perceptron) buildLattice(m *Model, l *lattice, toks []doc.Token) {
	l.reset(len(toks))
	p.viewsOf(m, l, toks)
	nt := len(m.tags)
	score := &l.steps
	// The context parts of token i+1 are gathered while token i is
	// scored, and what scoring it will read is prefetched: its rows'
	// weights, and for an open token its word-alone weights and its
	// neighbours' side vectors. sumTop8 and addRow, which read them,
	// took 17–21% of a one-worker run without the prefetch, 10–15% with
	// it (prefetchParts itself about 5%).
	if len(toks) > 0 && l.views[0].ndict != 1 {
		l.rows, l.vecs = p.contextParts(l.rows[:0], l.vecs[:0], l.views, 0)
	}
	for i := range toks {
		if i+1 < len(toks) && l.views[i+1].ndict != 1 {
			l.rows2, l.vecs2 = p.contextParts(l.rows2[:0], l.vecs2[:0], l.views, i+1)
			p.prefetchParts(l.views, i+1, l.rows2)
		}
		v := l.views[i]
		switch {
		case v.ndict == 1:
			l.add(p.dtags[v.dfirst], 0)
			l.closePos()
		case v.ndict > 0:
			p.scoreDict(l, v, score)
		case p.maxCands <= 8:
			// The rows first, into a zeroed accumulator; then one pass
			// over the tags sums the dense parts with it and selects.
			for _, r := range l.rows {
				p.addRow(&l.acc, r)
			}
			va, vb := zeroSide[:], zeroSide[:]
			if len(l.vecs) > 0 {
				va = l.vecs[0]
			}
			if len(l.vecs) > 1 {
				vb = l.vecs[1]
			}
			sumTop8(l, v.alone[:nt], va, vb, &l.acc, p.maxCands, weightStep)
		default:
			copy(score[:], v.alone)
			for _, vec := range l.vecs {
				addDense(score, vec)
			}
			for _, r := range l.rows {
				p.addRow(score, r)
			}
			selectCands(l, score[:nt], p.maxCands, weightStep)
		}
		l.rows, l.rows2 = l.rows2, l.rows
		l.vecs, l.vecs2 = l.vecs2, l.vecs
	}
	p.fillPairs(l, uint8(nt), l.pairRowOf, l.views)
}

// prefetchParts starts loading what scoring token i will read: the
// weights of its context rows (those a dictionary word reads from their
// dense copies excepted) and, for an open token, its word-alone weights
// and its neighbours' side vectors.
func (p *perceptron) prefetchParts(views []*wordView, i int, rows []int32) {
	var at prefetch.List
	v := views[i]
	dict := v.ndict > 0
	for _, r := range rows {
		if r < 0 || dict && p.dense[r] >= 0 || p.rowStart[r] == p.rowStart[r+1] {
			continue // absent, read from its dense copy (scoreDict), or empty
		}
		at.Add(unsafe.Pointer(&p.cells[p.rowStart[r]]))
	}
	if !dict && len(v.alone) > 0 {
		at.AddBytes(unsafe.Pointer(&v.alone[0]), len(v.alone)*4)
		if i > 0 {
			if w := views[i-1]; w.side != nil {
				at.AddBytes(unsafe.Pointer(&w.side[0]), p.nt*2)
			}
		}
		if i+1 < len(views) {
			if w := views[i+1]; w.side != nil {
				at.AddBytes(unsafe.Pointer(&w.side[p.nt]), p.nt*2)
			}
		}
	}
	at.Start()
}

// scoreDict adds the candidates of a token whose tags the dictionary
// gives: only those tags are scored. A short row is added whole into
// score, which costs a few adds without a branch, where looking up each
// tag in it cost a scan that ended in a mispredicted branch per tag.
// score is scratch: only the dictionary's entries are set before and
// read after; nothing reads what the rows leave in the others (an open
// token sums into l.acc in sumTop8, or, with more than eight candidates,
// starts from a copy of all nt word-alone scores).
func (p *perceptron) scoreDict(l *lattice, v *wordView, score *[256]int32) {
	tags := p.dtags[v.dfirst : v.dfirst+int32(v.ndict)]
	for k, t := range tags {
		s := v.alone[k]
		for _, vec := range l.vecs {
			s += int32(vec[t])
		}
		score[t] = s
	}
	for _, r := range l.rows {
		if r < 0 {
			continue
		}
		if d := p.dense[r]; d >= 0 {
			dw := (*[256]int16)(p.denseW[d:][:256])
			for _, t := range tags {
				score[t] += int32(dw[t])
			}
			continue
		}
		p.addRow(score, r)
	}
	for _, t := range tags {
		l.add(t, float32(score[t])*weightStep)
	}
	l.closePos()
}

// addDense adds vec, indexed by tag, to score (in steps).
func addDense(score *[256]int32, vec []int16) {
	vec = vec[:min(len(vec), 256)]
	for t, w := range vec {
		score[t] += int32(w)
	}
}

// startPairs sizes l.pair for the lattice's states, with bound the
// boundary tag (the "previous tag" of the first position).
func (l *lattice) startPairs(bound uint8) {
	l.pair = growF32(l.pair, l.layout())
	l.bound[0] = bound
}

// pairBlock returns the candidates of positions i-1 (the boundary for
// i = 0) and i, and the pair scores of their states, from l.pair[doff[i]]
// on: the score of (prev[j], cur[k]) is out[j*len(cur)+k].
func (l *lattice) pairBlock(i int) (prev, cur []uint8, out []float32) {
	prev = l.bound[:]
	if i > 0 {
		prev = l.cands[l.off[i-1]:l.off[i]]
	}
	return prev, l.cands[l.off[i]:l.off[i+1]], l.pair[l.doff[i]:]
}

// fillPairs scores the tag-word pair features of every state; rowOf gives
// the row of "word i after tag b". views, when not nil, are the tokens'
// views: the scores of words the tag dictionary settles are then copied
// from their views (wordView.pairData) instead of read from rows.
func (p *perceptron) fillPairs(l *lattice, bound uint8, rowOf func(i int, b uint8) int32, views []*wordView) {
	l.startPairs(bound)
	for i := 0; i < l.n; i++ {
		prev, cur, out := l.pairBlock(i)
		nc := len(cur)
		if views != nil && int(views[i].ndict) == nc { // cur is the word's dictionary tags
			v := views[i]
			for j, b := range prev {
				o := out[j*nc : (j+1)*nc]
				if x := v.pairIndex(b); x >= 0 {
					at := int(v.npair) + x*nc
					pw := v.pairData[at : at+nc]
					for k := range o { // one to three numbers: no call to copy
						o[k] = float32(pw[k]) * weightStep
					}
				} else {
					for k := range o {
						o[k] = 0
					}
				}
			}
			continue
		}
		l.markTags(cur)
		for j, b := range prev {
			p.rowAt(out[j*nc:(j+1)*nc], rowOf(i, b), cur, &l.slot)
		}
		l.unmarkTags(cur)
	}
}

// selectCands adds the maxCands best-scoring tags of a token to the
// lattice, best first (of equal scores, the lower tag first), by partial
// insertion sort on the stack: after the first few tags the running
// threshold turns almost every other tag away with one comparison. The
// scores are weights (float32) or whole weight steps (int32, scale
// weightStep); the lattice gets score·scale.
func selectCands[S int32 | float32](l *lattice, score []S, maxCands int, scale float32) {
	k := min(maxCands, len(score))
	if k > maxFastCands {
		f := l.score[:len(score)] // may be score itself (training), scale 1
		for t, s := range score {
			f[t] = float32(s) * scale
		}
		selectCandsLong(l, f, maxCands)
		return
	}
	var tags [maxFastCands]uint8
	var vals [maxFastCands]S
	n := 0
	for t, s := range score {
		if n == k {
			if s <= vals[k-1] {
				continue
			}
			n--
		}
		j := n
		for j > 0 && s > vals[j-1] {
			vals[j], tags[j] = vals[j-1], tags[j-1]
			j--
		}
		vals[j], tags[j] = s, uint8(t)
		n++
	}
	l.cands = append(l.cands, tags[:n]...)
	for _, v := range vals[:n] {
		l.emit = append(l.emit, float32(v)*scale)
	}
	l.closePos()
}

// sumTop8 sums the scores of an open token — its word-alone weights,
// two dense vectors (its neighbours' side vectors, or zeroSide) and the
// rows gathered in acc, all in whole steps — and adds its best maxCands
// (at most eight) tags to the lattice, in one pass over the tags; acc is
// left zero. It is selectCands for the decoder's case, fused with the
// sums: three passes over the tags before it cost more instructions
// than the selection.
//
// Score and tag go into one integer key whose order is the candidates'
// order (higher score first, then lower tag: the low byte holds
// 255-tag), and the eight best keys are kept sorted: a key that beats
// the eighth is put in place by eight min/max pairs, which compile to
// conditional moves. The insertion loop of selectCands mispredicts its
// exit at nearly every insertion; on 2,000 score vectors of unknown and
// rare words from the benchmark corpus (102 tags) the keys took 290 ns a
// token against 480–500. Only the eighth key stays in a register through
// the loop: all eight, with the four slices, spilled on every tag.
func sumTop8(l *lattice, alone []int32, va, vb []int16, acc *[256]int32, maxCands int, scale float32) {
	const none = math.MinInt64
	n := len(alone)
	va, vb, rows := va[:n], vb[:n], acc[:n]
	top := [8]int64{none, none, none, none, none, none, none, none}
	floor := int64(none) // top[7]: the loop needs only it in a register
	for t, s := range alone {
		s += int32(va[t]) + int32(vb[t]) + rows[t]
		rows[t] = 0
		x := int64(s)<<8 | int64(255-uint8(t))
		if x <= floor {
			continue
		}
		top[7] = max(top[7], min(top[6], x))
		top[6] = max(top[6], min(top[5], x))
		top[5] = max(top[5], min(top[4], x))
		top[4] = max(top[4], min(top[3], x))
		top[3] = max(top[3], min(top[2], x))
		top[2] = max(top[2], min(top[1], x))
		top[1] = max(top[1], min(top[0], x))
		top[0] = max(top[0], x)
		floor = top[7]
	}
	for _, x := range top[:min(maxCands, n, 8)] {
		l.cands = append(l.cands, 255-uint8(x))
		l.emit = append(l.emit, float32(int32(x>>8))*scale)
	}
	l.closePos()
}

// zeroSide stands for a side vector a neighbour does not have.
var zeroSide [256]int16

// maxFastCands bounds the candidates selectCands keeps on the stack.
const maxFastCands = 16

// selectCandsLong is selectCands for more than maxFastCands candidates.
func selectCandsLong(l *lattice, score []float32, maxCands int) {
	insertTop(l, score, maxCands, negInf)
	l.closePos()
}

// insertTop appends to the position being built the k tags of highest
// score, best first (of equal scores, the lower tag first), leaving out
// tags that score below floor; it sorts by insertion into the lattice.
func insertTop(l *lattice, score []float32, k int, floor float32) {
	start := len(l.cands)
	for t, s := range score {
		if s < floor {
			continue
		}
		n := len(l.cands) - start
		if n < k {
			l.add(uint8(t), s)
		} else if s > l.emit[len(l.emit)-1] {
			l.cands[len(l.cands)-1], l.emit[len(l.emit)-1] = uint8(t), s
		} else {
			continue
		}
		// Keep the slice sorted by descending score.
		for j := len(l.cands) - 1; j > start && l.emit[j] > l.emit[j-1]; j-- {
			l.cands[j], l.cands[j-1] = l.cands[j-1], l.cands[j]
			l.emit[j], l.emit[j-1] = l.emit[j-1], l.emit[j]
		}
	}
}

// trainer holds the dense weights of perceptron training. Averaging uses
// the trick of Daumé (2006, "Practical structured learning techniques for
// natural language processing", §2.1.1): besides the weights w, a sum u of
// every update multiplied by the time step c is kept, and the average of w
// over all steps is w - u/c. This gives exactly the averaged perceptron of
// Collins (2002) while touching only the weights an update changes — the
// same saving as the lazy time-stamp update, with no time stamps.
type trainer struct {
	nt, t1 int
	w      []float32 // features × tags
	u      []float64
	layers []transLayer // transition weights
	ulay   [][2][]float64
	c      float64
}

func (tr *trainer) updFeat(id int32, t uint8, d float32) {
	i := int(id)*tr.nt + int(t)
	tr.w[i] += d
	tr.u[i] += tr.c * float64(d)
}

func (tr *trainer) updTrans(a, b, c uint8, d float32) {
	for k := range tr.layers {
		y := &tr.layers[k]
		pa, pb, pc := int(y.proj[a]), int(y.proj[b]), int(y.proj[c])
		i := (pa*y.n1+pb)*y.n1 + pc
		y.tri[i] += d
		tr.ulay[k][0][i] += tr.c * float64(d)
		j := pb*y.n1 + pc
		y.bi[j] += d
		tr.ulay[k][1][j] += tr.c * float64(d)
	}
}

// transLayers returns empty transition layers: the joint states, and for
// a joint tag set their XPOS and their UPOS as well unless flat is set.
func (m *Model) transLayers(flat bool) []transLayer {
	nt := len(m.tags)
	ident := make([]uint8, nt+1)
	for i := range ident {
		ident[i] = uint8(i)
	}
	layers := []transLayer{{proj: ident, n1: nt + 1}}
	if !flat && m.tagset == TagsetJoint {
		for _, names := range [][]string{m.tagX, m.tagU} {
			set := map[string]bool{}
			for _, n := range names {
				set[n] = true
			}
			classes := sortedKeys(set)
			idx := map[string]uint8{}
			for i, c := range classes {
				idx[c] = uint8(i)
			}
			proj := make([]uint8, nt+1)
			for i, n := range names {
				proj[i] = idx[n]
			}
			proj[nt] = uint8(len(classes))
			layers = append(layers, transLayer{proj: proj, n1: len(classes) + 1})
		}
	}
	for i := range layers {
		n1 := layers[i].n1
		layers[i].tri = make([]float32, n1*n1*n1)
		layers[i].bi = make([]float32, n1*n1)
	}
	return layers
}

// trainSent is one training sentence with its feature rows per token.
type trainSent struct {
	toks  []doc.Token
	gold  []uint8
	ids   []int32 // feature rows, token i's at ids[off[i]:off[i+1]]
	off   []int32
	lower []uint64 // hash of each lower-cased word, for pair features
}

func trainPerceptron(m *Model, sents []*conllu.Sentence, gold [][]uint8, opt *TrainOptions) {
	nt := len(m.tags)
	t1 := nt + 1
	// Features seen fewer than MinFeatureCount times are left out before
	// training, not only pruned after it: a word seen once then trains the
	// weights unknown words rely on (suffixes, shape, context) instead of
	// its own identity feature, which decoding would not have anyway.
	l := newLattice()
	freq := map[uint64]int32{}
	bound := uint8(nt)
	prevOf := func(seq []uint8, i int) uint8 {
		if i < 0 || i >= len(seq) {
			return bound
		}
		return seq[i]
	}
	for si, s := range sents {
		l.info = extractFeatures(m, l, s.Tokens, l.info)
		for _, k := range l.feats {
			freq[k]++
		}
		for i := range s.Tokens {
			freq[pairKey(l.info[i].lower, prevOf(gold[si], i-1))]++
		}
	}
	// Feature rows in order of first appearance, which is deterministic.
	rows := map[uint64]int32{}
	var keys []uint64
	var counts []int32
	rowOf := func(k uint64) (int32, bool) {
		if int(freq[k]) < opt.MinFeatureCount {
			return 0, false
		}
		r, ok := rows[k]
		if !ok {
			r = int32(len(keys))
			rows[k] = r
			keys = append(keys, k)
			counts = append(counts, 0)
		}
		counts[r]++
		return r, true
	}
	data := make([]trainSent, len(sents))
	for si, s := range sents {
		l.info = extractFeatures(m, l, s.Tokens, l.info)
		ts := trainSent{toks: s.Tokens, gold: gold[si], off: make([]int32, len(s.Tokens)+1),
			lower: make([]uint64, len(s.Tokens))}
		ts.ids = make([]int32, 0, len(l.feats))
		for i := range s.Tokens {
			for _, k := range l.feats[l.foff[i]:l.foff[i+1]] {
				if r, ok := rowOf(k); ok {
					ts.ids = append(ts.ids, r)
				}
			}
			ts.off[i+1] = int32(len(ts.ids))
			ts.lower[i] = l.info[i].lower
			rowOf(pairKey(ts.lower[i], prevOf(gold[si], i-1)))
		}
		data[si] = ts
	}
	freq = nil
	nf := len(keys)
	tr := &trainer{nt: nt, t1: t1,
		w: make([]float32, nf*nt), u: make([]float64, nf*nt),
		layers: m.transLayers(!opt.FactoredTransitions)}
	for _, y := range tr.layers {
		tr.ulay = append(tr.ulay, [2][]float64{make([]float64, len(y.tri)), make([]float64, len(y.bi))})
	}
	m.perc = &perceptron{dictMin: int32(opt.DictMin), maxCands: opt.MaxCands}
	trans := transitions{t1: t1, layers: tr.layers}
	if len(tr.layers) == 1 { // the joint states alone: the fast path
		trans = transitions{t1: t1, tri: tr.layers[0].tri, bi: tr.layers[0].bi}
	}
	order := make([]int, len(data))
	for i := range order {
		order[i] = i
	}
	rng := rand.New(rand.NewPCG(opt.Seed, 0x676c6f73736d6974))
	trainDict := int32(math.MaxInt32) // no tag dictionary while training
	if opt.TrainDictMin > 0 {
		trainDict = int32(opt.TrainDictMin)
	}
	for ep := 1; ep <= opt.Epochs; ep++ {
		rng.Shuffle(len(order), func(i, j int) { order[i], order[j] = order[j], order[i] })
		for _, si := range order {
			ts := &data[si]
			tr.c++
			l.reset(len(ts.toks))
			score := l.score[:nt]
			for i := range ts.toks {
				clear(score)
				for _, id := range ts.ids[ts.off[i]:ts.off[i+1]] {
					row := tr.w[int(id)*nt : int(id)*nt+nt]
					for t, w := range row {
						score[t] += w
					}
				}
				if e, ok := m.entry(ts.toks[i].Form); ok && e.count >= trainDict {
					for j := e.first; j < e.first+e.ntags; j++ {
						l.add(m.wtags[j], score[m.wtags[j]])
					}
					l.closePos()
				} else {
					selectCands(l, score, m.perc.maxCands, 1)
				}
			}
			// Tag-word pair scores from the current weights.
			l.startPairs(bound)
			for i := range ts.toks {
				prev, cur, out := l.pairBlock(i)
				for j, b := range prev {
					r, ok := rows[pairKey(ts.lower[i], b)]
					for k, c := range cur {
						var v float32
						if ok {
							v = tr.w[int(r)*nt+int(c)]
						}
						out[j*len(cur)+k] = v
					}
				}
			}
			l.decode(&trans, -1) // no pruning while learning
			pred := l.tags
			at := func(seq []uint8, i int) uint8 {
				if i < 0 || i >= len(seq) {
					return bound
				}
				return seq[i]
			}
			for i := 0; i <= len(ts.gold); i++ {
				g2, g1, g0 := at(ts.gold, i-2), at(ts.gold, i-1), at(ts.gold, i)
				p2, p1, p0 := at(pred, i-2), at(pred, i-1), at(pred, i)
				if g0 != p0 && i < len(ts.gold) {
					for _, id := range ts.ids[ts.off[i]:ts.off[i+1]] {
						tr.updFeat(id, g0, 1)
						tr.updFeat(id, p0, -1)
					}
				}
				if (g1 != p1 || g0 != p0) && i < len(ts.gold) {
					if r, ok := rows[pairKey(ts.lower[i], g1)]; ok {
						tr.updFeat(r, g0, 1)
					}
					if r, ok := rows[pairKey(ts.lower[i], p1)]; ok {
						tr.updFeat(r, p0, -1)
					}
				}
				if g2 != p2 || g1 != p1 || g0 != p0 {
					tr.updTrans(g2, g1, g0, 1)
					tr.updTrans(p2, p1, p0, -1)
				}
			}
		}
		if opt.Progress != nil {
			var du, dx float64
			if len(opt.Dev) > 0 && ep < opt.Epochs {
				finishPerceptron(m, tr, keys, counts, &TrainOptions{MinFeatureCount: -1, PruneWeight: -1, Beam: opt.Beam})
				r := Evaluate(m, opt.Dev)
				du, dx = r.UPOS.Accuracy, r.XPOS.Accuracy
			}
			if ep == opt.Epochs {
				finishPerceptron(m, tr, keys, counts, opt)
				if len(opt.Dev) > 0 {
					r := Evaluate(m, opt.Dev)
					du, dx = r.UPOS.Accuracy, r.XPOS.Accuracy
				}
			}
			opt.Progress(ep, du, dx)
		}
	}
	if opt.Progress == nil {
		finishPerceptron(m, tr, keys, counts, opt)
	}
	m.epochs = opt.Epochs
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

// finishPerceptron turns the averaged weights into the decoding form,
// dropping rare features and small weights.
func finishPerceptron(m *Model, tr *trainer, keys []uint64, counts []int32, opt *TrainOptions) {
	nt := tr.nt
	c := tr.c
	avg := func(w float32, u float64) float64 { return float64(w) - u/c }
	type rowRef struct {
		key uint64
		id  int
	}
	var kept []rowRef
	for id, k := range keys {
		if opt.MinFeatureCount > 0 && int(counts[id]) < opt.MinFeatureCount {
			continue
		}
		kept = append(kept, rowRef{k, id})
	}
	sort.Slice(kept, func(i, j int) bool { return kept[i].key < kept[j].key })
	p := &perceptron{dictMin: m.perc.dictMin, maxCands: m.perc.maxCands}
	p.rowStart = append(p.rowStart, 0)
	for _, r := range kept {
		base := r.id * nt
		for t := 0; t < nt; t++ {
			w := avg(tr.w[base+t], tr.u[base+t])
			if opt.PruneWeight > 0 && math.Abs(w) < opt.PruneWeight {
				continue
			}
			q := quantize(w)
			if q == 0 {
				continue
			}
			p.cells = append(p.cells, cell{q: int16(math.Round(float64(q) / weightStep)), t: uint8(t)})
		}
		if int(p.rowStart[len(p.rowStart)-1]) == len(p.cells) {
			continue // nothing left of this feature
		}
		p.keys = append(p.keys, r.key)
		p.rowStart = append(p.rowStart, int32(len(p.cells)))
	}
	for k, y := range tr.layers {
		out := transLayer{proj: y.proj, n1: y.n1, tri: make([]float32, len(y.tri)), bi: make([]float32, len(y.bi))}
		for i := range y.tri {
			out.tri[i] = quantize(avg(y.tri[i], tr.ulay[k][0][i]))
		}
		for i := range y.bi {
			out.bi[i] = quantize(avg(y.bi[i], tr.ulay[k][1][i]))
		}
		p.layers = append(p.layers, out)
	}
	m.perc = p
	m.beam = float32(opt.Beam)
	p.prepare(m)
}
