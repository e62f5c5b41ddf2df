package hmm

import (
	"math"
	"math/rand/v2"
	"sort"

	"glossmith/tagger/conllu"
	"glossmith/tagger/doc"
)

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
