package hmm

import (
	"maps"
	"math"
	"math/rand/v2"
	"slices"
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
	nt     int
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
			classes := slices.Sorted(maps.Keys(set))
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

// trainPerceptron trains the averaged perceptron in steps: the feature
// rows (trainingRows), the dense weights (newTrainer), then per epoch
// and sentence the best path under the current weights (predict) and the
// update from its errors (update); finishPerceptron turns the averages
// into the model's weights. With opt.Shuffles > 1 that many perceptrons
// learn from differently shuffled sentences and the model takes the mean
// of their averaged weights (mergeTrainers).
func trainPerceptron(m *Model, sents []*conllu.Sentence, gold [][]uint8, opt *TrainOptions) {
	ws := newWorkspace()
	if opt.LearnedClasses {
		ws.classes = englishClasses()
	}
	rows := trainingRows(m, ws, sents, gold, opt.MinFeatureCount)
	m.perc = &perceptron{dictMin: int32(opt.DictMin), maxCands: opt.MaxCands}
	trs := make([]*trainer, max(1, opt.Shuffles))
	for r := range trs {
		trs[r] = newTrainer(m, len(rows.keys), opt)
		trs[r].run(m, ws, rows, opt, opt.Seed+uint64(r), len(trs) == 1)
	}
	m.epochs = opt.Epochs
	if len(trs) == 1 {
		if opt.Progress == nil {
			finishPerceptron(m, trs[0], rows.keys, rows.counts, opt)
		}
		return // (else the last epoch's report finished it)
	}
	finishPerceptron(m, mergeTrainers(trs), rows.keys, rows.counts, opt)
	if opt.Progress != nil {
		var du, dx float64
		if len(opt.Dev) > 0 {
			r := Evaluate(m, opt.Dev)
			du, dx = r.UPOS.Accuracy, r.XPOS.Accuracy
		}
		opt.Progress(opt.Epochs, du, dx)
	}
}

// run trains tr for opt.Epochs epochs, shuffling the sentences with seed
// before each; with report set it passes the dev accuracies after each
// epoch to opt.Progress (see reportEpoch).
func (tr *trainer) run(m *Model, ws *workspace, rows *featureRows, opt *TrainOptions, seed uint64, report bool) {
	nt := tr.nt
	trans := transitions{t1: nt + 1, layers: tr.layers}
	if len(tr.layers) == 1 { // the joint states alone: the fast path
		trans = transitions{t1: nt + 1, tri: tr.layers[0].tri, bi: tr.layers[0].bi}
	}
	order := make([]int, len(rows.data))
	for i := range order {
		order[i] = i
	}
	rng := rand.New(rand.NewPCG(seed, 0x676c6f73736d6974))
	trainDict := int32(math.MaxInt32) // no tag dictionary while training
	if opt.TrainDictMin > 0 {
		trainDict = int32(opt.TrainDictMin)
	}
	for ep := 1; ep <= opt.Epochs; ep++ {
		rng.Shuffle(len(order), func(i, j int) { order[i], order[j] = order[j], order[i] })
		for _, si := range order {
			ts := &rows.data[si]
			tr.c++
			tr.predict(m, &ws.lattice, ts, rows.rows, &trans, trainDict)
			tr.update(ts, ws.tags, rows.rows)
		}
		if report && opt.Progress != nil {
			tr.reportEpoch(m, rows, ep, opt)
		}
	}
}

// mergeTrainers returns trs[0] holding, as its weights with no update sums
// left (so that finishPerceptron's average is the weight itself), the mean
// of the averaged weights of all of trs.
func mergeTrainers(trs []*trainer) *trainer {
	out := trs[0]
	n := float64(len(trs))
	mean := func(w []float32, u []float64, part func(*trainer) ([]float32, []float64)) {
		for i := range w {
			var sum float64
			for _, t := range trs {
				tw, tu := part(t)
				sum += float64(tw[i]) - tu[i]/t.c
			}
			w[i], u[i] = float32(sum/n), 0
		}
	}
	mean(out.w, out.u, func(t *trainer) ([]float32, []float64) { return t.w, t.u })
	for k := range out.layers {
		mean(out.layers[k].tri, out.ulay[k][0], func(t *trainer) ([]float32, []float64) { return t.layers[k].tri, t.ulay[k][0] })
		mean(out.layers[k].bi, out.ulay[k][1], func(t *trainer) ([]float32, []float64) { return t.layers[k].bi, t.ulay[k][1] })
	}
	return out
}

// tagAt returns the tag of position i of seq, or bound outside it.
func tagAt(seq []uint8, i int, bound uint8) uint8 {
	if i < 0 || i >= len(seq) {
		return bound
	}
	return seq[i]
}

// featureRows numbers the features training keeps and holds the
// training sentences in terms of them.
type featureRows struct {
	rows   map[uint64]int32 // feature key → row
	keys   []uint64         // key of each row, in order of first appearance
	counts []int32          // occurrences of each row's feature
	data   []trainSent
}

// trainingRows counts the features of the training sentences and numbers
// those seen minCount times or more, in order of first appearance, which
// is deterministic. Rarer features are left out before training, not
// only pruned after it: a word seen once then trains the weights unknown
// words rely on (suffixes, shape, context) instead of its own identity
// feature, which decoding would not have anyway.
func trainingRows(m *Model, ws *workspace, sents []*conllu.Sentence, gold [][]uint8, minCount int) *featureRows {
	bound := uint8(len(m.tags))
	fs := &ws.featureScratch
	freq := map[uint64]int32{}
	for si, s := range sents {
		fs.info = extractFeatures(fs, s.Tokens, fs.info, m.wn, m.freq)
		for _, k := range fs.keys {
			freq[k]++
		}
		for i := range s.Tokens {
			freq[pairKey(fs.info[i].lower, tagAt(gold[si], i-1, bound))]++
		}
	}
	fr := &featureRows{rows: map[uint64]int32{}}
	rowOf := func(k uint64) (int32, bool) {
		if int(freq[k]) < minCount {
			return 0, false
		}
		r, ok := fr.rows[k]
		if !ok {
			r = int32(len(fr.keys))
			fr.rows[k] = r
			fr.keys = append(fr.keys, k)
			fr.counts = append(fr.counts, 0)
		}
		fr.counts[r]++
		return r, true
	}
	fr.data = make([]trainSent, len(sents))
	for si, s := range sents {
		fs.info = extractFeatures(fs, s.Tokens, fs.info, m.wn, m.freq)
		ts := trainSent{toks: s.Tokens, gold: gold[si], off: make([]int32, len(s.Tokens)+1),
			lower: make([]uint64, len(s.Tokens))}
		ts.ids = make([]int32, 0, len(fs.keys))
		for i := range s.Tokens {
			for _, k := range fs.keys[fs.keyOff[i]:fs.keyOff[i+1]] {
				if r, ok := rowOf(k); ok {
					ts.ids = append(ts.ids, r)
				}
			}
			ts.off[i+1] = int32(len(ts.ids))
			ts.lower[i] = fs.info[i].lower
			rowOf(pairKey(ts.lower[i], tagAt(gold[si], i-1, bound)))
		}
		fr.data[si] = ts
	}
	return fr
}

// newTrainer returns zero weights for nf feature rows and the model's
// transition layers.
func newTrainer(m *Model, nf int, opt *TrainOptions) *trainer {
	nt := len(m.tags)
	tr := &trainer{nt: nt, w: make([]float32, nf*nt), u: make([]float64, nf*nt),
		layers: m.transLayers(!opt.FactoredTransitions)}
	for _, y := range tr.layers {
		tr.ulay = append(tr.ulay, [2][]float64{make([]float64, len(y.tri)), make([]float64, len(y.bi))})
	}
	return tr
}

// predict builds the lattice of a training sentence from the current
// weights — every tag a candidate unless the word is in the training
// tag dictionary (trainDict) — with its tag-word pair scores, and
// decodes it without pruning; the best path is left in l.tags.
func (tr *trainer) predict(m *Model, l *lattice, ts *trainSent, rows map[uint64]int32, trans *transitions, trainDict int32) {
	nt := tr.nt
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
	l.startPairs(uint8(nt))
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
	l.decode(trans, -1) // no pruning while learning
}

// update moves the weights toward the gold tags and away from the
// predicted ones wherever they differ: the token's features, its
// tag-word pair feature and the transitions.
func (tr *trainer) update(ts *trainSent, pred []uint8, rows map[uint64]int32) {
	bound := uint8(tr.nt)
	for i := 0; i <= len(ts.gold); i++ {
		g2, g1, g0 := tagAt(ts.gold, i-2, bound), tagAt(ts.gold, i-1, bound), tagAt(ts.gold, i, bound)
		p2, p1, p0 := tagAt(pred, i-2, bound), tagAt(pred, i-1, bound), tagAt(pred, i, bound)
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

// reportEpoch passes the dev accuracies after epoch ep to opt.Progress:
// after an inner epoch from the averages so far, unpruned; after the last
// from the finished model, which it leaves in m.
func (tr *trainer) reportEpoch(m *Model, rows *featureRows, ep int, opt *TrainOptions) {
	var du, dx float64
	if len(opt.Dev) > 0 && ep < opt.Epochs {
		finishPerceptron(m, tr, rows.keys, rows.counts, &TrainOptions{MinFeatureCount: -1, PruneWeight: -1, Beam: opt.Beam})
		r := Evaluate(m, opt.Dev)
		du, dx = r.UPOS.Accuracy, r.XPOS.Accuracy
	}
	if ep == opt.Epochs {
		finishPerceptron(m, tr, rows.keys, rows.counts, opt)
		if len(opt.Dev) > 0 {
			r := Evaluate(m, opt.Dev)
			du, dx = r.UPOS.Accuracy, r.XPOS.Accuracy
		}
	}
	opt.Progress(ep, du, dx)
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
