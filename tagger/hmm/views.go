package hmm

import (
	"math/bits"
	"sync/atomic"

	"glossmith/tagger/doc"
)

// Scoring a token from its feature keys costs some twenty-five hash-table
// look-ups, each a likely cache miss, and it dominated the time of a
// whole `terms` run. Most of that work depends on a word form alone, not
// on its sentence, and words recur: so the perceptron keeps a wordView per
// word form — the summed weights of its word-alone features, the rows its
// neighbours' context features will read and the rows of its "word after
// tag" features. Views of lexicon words are built on first use and shared
// by all goroutines (a view is a pure function of the form, so which
// goroutine builds it does not matter); views of other words are kept in
// a small cache per workspace. Scoring then reads three dense vectors (the
// word's own, its neighbours' side vectors) and a few rows per token, two
// of them found by hashing (the word bigrams).
//
// Every weight is a whole number of weightSteps, small enough that sums of
// them are exact in any order: scoring adds whole steps as integers, and
// the lattice is bit for bit the one the plain look-up of every feature,
// summed in float32, builds (TestViewsMatchPlainScoring).

// Context templates whose value is a property of one neighbouring word,
// indexes of wordView.ctx.
const (
	cPrev1 = iota
	cNext1
	cPrev2
	cNext2
	cPrevSuf3
	cNextSuf3
	cPrevShape
	cNextShape
	cNextPrefix1
	cPrevWN
	cNextWN
	nCtx
)

// wordView is what scoring needs to know of a word form before it sees the
// sentence. Every token of every sentence reads its own view and its
// neighbours', so the struct is kept small (184 bytes): adding 24 bytes
// to it made tagging measurably slower.
type wordView struct {
	lower uint64 // hash of the lower-cased form, for the bigram and pair keys
	// alone is the summed weight per tag of the word-alone features, in
	// weight steps; for a word the tag dictionary settles, of its tags
	// only, in their order (nil when it has one).
	alone []int32
	// ctx[c] is the row (or -1) of context feature c when this word is the
	// neighbour it describes: ctx[cPrev1] is read by the word after it.
	ctx [nCtx]int32
	// side, for lexicon words, holds two vectors over the tags: the
	// summed weights of the context features this word sets as the word
	// before another (prev1, prevSuf3, prevShape; side[:nt]) and as the
	// word after another (next1, nextSuf3, nextShape, nextPrefix1;
	// side[nt:]), in weight steps. The words around a token scored in full
	// are mostly frequent lexicon words, and two dense vectors read in
	// order cost less than seven rows scattered over the weights. nil for
	// other words, which use their rows.
	side []int16
	// pairs, when set, marks in pairSet every previous tag that has a
	// "word after tag" feature with this word; pairData[:npair] holds
	// their rows in the order of the tags. Without it the rows are looked
	// up by key.
	pairSet  [4]uint64
	pairData []int32
	// For a word the tag dictionary settles: its tags are
	// perceptron.dtags[dfirst:dfirst+ndict] (its candidates in every
	// sentence), ndict is 0 for other words, and pairData[npair+x*ndict+k]
	// is the weight, in steps, of pair row x for the k-th of those tags,
	// so that filling its pair scores reads no rows.
	dfirst     int32
	npair      uint16
	ndict      uint8
	pairs      bool
	upperFirst bool
	// lemma, when lemmaSet, is the word's lemma in state lemmaState: for
	// a word outside the lexicon (whose view a workspace owns), the last one
	// found; for a lexicon word, its lemma with its most frequent tag, set
	// when the view is built and never changed (the view is shared). The
	// view is in cache when the lemma is looked up, the lexicon is not.
	lemmaState uint8
	lemmaSet   bool
	// For lexicon words: their tags and lemmas are
	// Model.wlex[wfirst:wfirst+wn] (kept in what was padding).
	wn     uint8
	wfirst int32
	lemma  string
}

// viewBoundary holds the rows of the context features that see past the
// sentence's edge, and of the capitalization features.
type viewBoundary struct {
	prev1, prev2, next1, next2 int32 // neighbour is the start/end marker
	capFirst, capInside        int32
}

// fillView computes the view of a form. alone, when not nil, receives the
// word-alone scores (len = number of tags); keys and buf are scratch
// space, returned for reuse.
func (p *perceptron) fillView(v *wordView, form string, alone []int32, keys []uint64, buf []byte) ([]uint64, []byte) {
	*v = wordView{} // a cache slot may hold another word's view
	var ti tokenInfo
	buf = ti.fill(buf, form, p.wn, p.freq)
	keys, buf, v.upperFirst = appendAloneKeys(keys[:0], buf, form, &ti, p.classes)
	v.lower = ti.lower
	v.ctx = [nCtx]int32{
		cPrev1: p.row(key(fPrev1, ti.lower)), cNext1: p.row(key(fNext1, ti.lower)),
		cPrev2: p.row(key(fPrev2, ti.lower)), cNext2: p.row(key(fNext2, ti.lower)),
		cPrevSuf3: p.row(key(fPrevSuf3, ti.suf3)), cNextSuf3: p.row(key(fNextSuf3, ti.suf3)),
		cPrevShape: p.row(key(fPrevShape, ti.shape)), cNextShape: p.row(key(fNextShape, ti.shape)),
		cNextPrefix1: p.row(key(fNextPrefix1, ti.pre1)),
		cPrevWN:      -1, cNextWN: -1,
	}
	if ti.hasWN {
		v.ctx[cPrevWN], v.ctx[cNextWN] = p.row(key(fPrevWN, ti.wnSig())), p.row(key(fNextWN, ti.wnSig()))
	}
	v.alone = alone
	if alone != nil {
		var acc [256]int32
		for _, k := range keys {
			p.addRow(&acc, p.row(k))
		}
		copy(alone, acc[:])
	}
	return keys, buf
}

// denseMin is the length from which a row is also kept as a dense vector
// over all tags. Such rows (the features of frequent neighbours, of
// common suffixes) are few but make most of the weights a token reads, and
// a dense row answers "weight of tag t" in one step.
const denseMin = 16

// prepareDense builds the dense copies of the long rows.
func (p *perceptron) prepareDense() {
	p.dense = make([]int32, len(p.rowStart)-1)
	var store []int16
	for r := range p.dense {
		a, b := p.rowStart[r], p.rowStart[r+1]
		if b-a < denseMin {
			p.dense[r] = -1
			continue
		}
		off := len(store)
		p.dense[r] = int32(off)
		store = append(store, make([]int16, p.nt)...)
		for _, c := range p.cells[a:b] {
			store[off+int(c.t)] = c.q
		}
	}
	p.denseW = append(store, make([]int16, 256)...) // room to view the last row as [256]
}

// rowAt sets out[k] to the weight of row r for tag tags[k]; index maps
// each of tags to its k (see tagIndex), so that a short row is read once,
// whatever the number of tags.
func (p *perceptron) rowAt(out []float32, r int32, tags []uint8, index *tagIndex) {
	out = out[:len(tags)]
	clear(out)
	if r < 0 {
		return
	}
	if d := p.dense[r]; d >= 0 {
		dw := (*[256]int16)(p.denseW[d:][:256])
		for k, t := range tags {
			out[k] = float32(dw[t]) * weightStep
		}
		return
	}
	for _, c := range p.cells[p.rowStart[r]:p.rowStart[r+1]] {
		if k := index[c.t]; k >= 0 {
			out[k] = c.w()
		}
	}
}

// addRow adds the weights of row r (none when r < 0) to score, in steps.
func (p *perceptron) addRow(score *[256]int32, r int32) {
	if r < 0 {
		return
	}
	for _, c := range p.cells[p.rowStart[r]:p.rowStart[r+1]] {
		score[c.t] += int32(c.q)
	}
}

// prepareViews readies the lazily built lexicon views and the boundary
// rows, and gives the weights a new identity (see weightsIDs).
func (p *perceptron) prepareViews(m *Model) {
	p.id = weightsIDs.Add(1)
	p.nt = len(m.tags)
	p.prepareDense()
	p.views = make([]atomic.Pointer[wordView], len(m.words))
	p.edge = viewBoundary{
		prev1: p.row(key(fPrev1, hStart)), prev2: p.row(key(fPrev2, hStart)),
		next1: p.row(key(fNext1, hEnd)), next2: p.row(key(fNext2, hEnd)),
		capFirst: p.row(key(fCapFirst, 0)), capInside: p.row(key(fCapInside, 0)),
	}
}

// lexView returns the view of lexicon word w (of form form), building it
// on first use. Words the tag dictionary settles on its own get no
// word-alone scores; every lexicon word gets its pair list, as lexicon
// words are the ones that recur.
func (p *perceptron) lexView(m *Model, fs *featureScratch, w int32, form string) *wordView {
	if v := p.views[w].Load(); v != nil {
		return v
	}
	v := &wordView{}
	e := m.words[w]
	var alone []int32
	if e.count < p.dictMin || p.dict[w].n > 1 {
		alone = make([]int32, p.nt)
	}
	fs.keys, fs.buf = p.fillView(v, form, alone, fs.keys, fs.buf)
	for b := 0; b <= p.nt; b++ {
		if r := p.row(pairKey(v.lower, uint8(b))); r >= 0 {
			v.pairSet[b>>6] |= 1 << (b & 63)
			v.pairData = append(v.pairData, r)
		}
	}
	v.pairs, v.npair = true, uint16(len(v.pairData))
	if e.ntags <= 255 {
		v.wfirst, v.wn = e.first, uint8(e.ntags)
		if x := m.commonLemma(e); x.lemma != "" {
			v.lemma, v.lemmaState, v.lemmaSet = x.lemma, x.tag, true
		}
	}
	if e.count >= p.dictMin {
		tags := p.dictTags(w)
		v.ndict, v.dfirst = uint8(len(tags)), p.dict[w].first
		if v.alone != nil {
			// Only its tags are ever scored: keep their word-alone
			// weights, side by side.
			own := make([]int32, len(tags))
			for k, t := range tags {
				own[k] = v.alone[t]
			}
			v.alone = own
		}
		for _, r := range v.pairData[:v.npair] {
			for _, t := range tags {
				v.pairData = append(v.pairData, p.steps(r, t))
			}
		}
	}
	p.sideVectors(v)
	if !p.views[w].CompareAndSwap(nil, v) {
		v = p.views[w].Load()
	}
	return v
}

// unknownCacheSize is the number of views of words outside the lexicon a
// workspace keeps (direct-mapped by hash: a newcomer replaces whatever sat
// in its slot). Domain words recur within a document and a corpus: on
// 4 MiB of the benchmark corpus 43% of the unknown tokens missed a
// 2048-slot cache, 23% miss this one (about 4 MB per workspace; one
// workspace per busy goroutine).
const unknownCacheSize = 8192

// cachedView is one slot of a workspace's cache of unknown-word views. The
// form is kept in the slot itself, where comparing it reads the cache
// line the slot's look-up has just brought in; kept as a string of its
// own (a copy: the cache must not keep documents' text alive), comparing
// read another line and was a fifth of the cache's time. (Three
// alternated 100 MB runs: the cache's share 6.3–7.0% before, 5.1–6.7%
// after.) Forms longer than maxCachedForm are not cached (see
// unknownView).
type cachedView struct {
	form     [maxCachedForm]byte
	n        uint8  // the form's length; 0 for an empty slot
	sentence uint64 // the sentence (featureScratch.sentence) that last used it
	view     wordView
}

// maxCachedForm is the longest form the unknown-word cache keeps: nearly
// every word is shorter; longer tokens (URLs, part numbers, chemical
// names) are rarer and their views are built each time.
const maxCachedForm = 23

// holds reports whether the slot holds the view of form.
func (c *cachedView) holds(form string) bool {
	return int(c.n) == len(form) && string(c.form[:c.n]) == form
}

// unknownView returns the view of a word outside the lexicon from the
// workspace's cache, building it when absent.
func (p *perceptron) unknownView(fs *featureScratch, form string) *wordView {
	if fs.cache == nil {
		fs.cache = make([]cachedView, unknownCacheSize)
		fs.cacheAlone = make([]int32, unknownCacheSize*p.nt)
	}
	slot := hashString(form) & (unknownCacheSize - 1)
	c := &fs.cache[slot]
	cacheable := form != "" && len(form) <= maxCachedForm
	if cacheable && c.holds(form) {
		c.sentence = fs.sentence
		return &c.view
	}
	if !cacheable || c.sentence == fs.sentence && c.n != 0 {
		// The form cannot be cached, or another word of this sentence
		// holds the slot: build this view aside rather than pull one from
		// under that word. (fs.aside has room for every token, so it never
		// moves.)
		k := len(fs.aside)
		fs.aside = append(fs.aside, wordView{})
		alone := fs.asideAlone[k*p.nt : (k+1)*p.nt : (k+1)*p.nt]
		fs.keys, fs.buf = p.fillView(&fs.aside[k], form, alone, fs.keys, fs.buf)
		return &fs.aside[k]
	}
	c.sentence = fs.sentence
	alone := fs.cacheAlone[int(slot)*p.nt : int(slot+1)*p.nt : int(slot+1)*p.nt]
	c.n = uint8(copy(c.form[:], form))
	fs.keys, fs.buf = p.fillView(&c.view, form, alone, fs.keys, fs.buf)
	return &c.view
}

// viewsOf points ws.views at the view of every token and records the
// lexicon index of each token in ws.wid.
func (p *perceptron) viewsOf(m *Model, ws *workspace, toks []doc.Token) {
	if ws.cacheWeights != p.id {
		// The caches hold views (rows) and lemmas of other weights: during
		// training with progress reports a model's weights are replaced
		// after every epoch, and its pooled workspaces stay.
		ws.cache, ws.cacheAlone, ws.lexMemo = nil, nil, nil
		ws.cacheWeights = p.id
	}
	n := len(toks)
	if cap(ws.views) < n {
		ws.views = make([]*wordView, n, 2*n)
		ws.aside = make([]wordView, 0, 2*n)
		ws.asideAlone = make([]int32, 2*n*p.nt)
	}
	ws.views = ws.views[:n]
	ws.wid = ws.wid[:0]
	ws.sentence++
	ws.aside = ws.aside[:0]
	fs := &ws.featureScratch
	for i := range toks {
		form := toks[i].Form
		if w, ok := m.lex[form]; ok {
			ws.wid = append(ws.wid, w)
			ws.views[i] = p.lexView(m, fs, w, form)
			continue
		}
		ws.wid = append(ws.wid, -1)
		ws.views[i] = p.unknownView(fs, form)
	}
}

// pairIndex returns the index in v.pairData of the row of the feature
// "word of v after tag b", or -1; v.pairs must be set.
func (v *wordView) pairIndex(b uint8) int {
	w, bit := b>>6, uint64(1)<<(b&63)
	if v.pairSet[w]&bit == 0 {
		return -1
	}
	// The row's index is the number of marked tags below b.
	k := bits.OnesCount64(v.pairSet[w] & (bit - 1))
	for x := range w {
		k += bits.OnesCount64(v.pairSet[x])
	}
	return k
}

// pairRow returns the row of the feature "word of v after tag b", or -1.
func (p *perceptron) pairRow(v *wordView, b uint8) int32 {
	if !v.pairs {
		return p.row(pairKey(v.lower, b))
	}
	if k := v.pairIndex(b); k >= 0 {
		return v.pairData[k]
	}
	return -1
}

// contextParts gathers the context features of token i: the dense
// vectors of its neighbours that have them (see wordView.side), and the
// rows of all other features. The sums are exact (weights are multiples of
// weightStep and small), so the order of the parts does not matter.
func (p *perceptron) contextParts(rows []int32, vecs [][]int16, vs []*wordView, i int) ([]int32, [][]int16) {
	n := len(vs)
	v := vs[i]
	if v.upperFirst {
		if i == 0 {
			rows = append(rows, p.edge.capFirst)
		} else {
			rows = append(rows, p.edge.capInside)
		}
	}
	p1, n1 := hStart, hEnd
	prev2, next2 := p.edge.prev2, p.edge.next2
	if i > 0 {
		w := vs[i-1]
		p1 = w.lower
		if w.side != nil {
			vecs = append(vecs, w.side[:p.nt])
		} else {
			rows = append(rows, w.ctx[cPrev1], w.ctx[cPrevSuf3], w.ctx[cPrevShape], w.ctx[cPrevWN])
		}
	} else {
		rows = append(rows, p.edge.prev1)
	}
	if i+1 < n {
		w := vs[i+1]
		n1 = w.lower
		if w.side != nil {
			vecs = append(vecs, w.side[p.nt:])
		} else {
			rows = append(rows, w.ctx[cNext1], w.ctx[cNextSuf3], w.ctx[cNextShape], w.ctx[cNextPrefix1], w.ctx[cNextWN])
		}
	} else {
		rows = append(rows, p.edge.next1)
	}
	if i > 1 {
		prev2 = vs[i-2].ctx[cPrev2]
	}
	if i+2 < n {
		next2 = vs[i+2].ctx[cNext2]
	}
	rows = append(rows, prev2, next2,
		p.row(key2(fPrevWord, p1, v.lower)), p.row(key2(fWordNext, v.lower, n1)))
	return rows, vecs
}

// sideVectors fills v.side from the rows in v.ctx, or leaves it nil when
// a sum does not fit 16 bits (none does in the default model, whose
// largest is about 25,000 steps).
func (p *perceptron) sideVectors(v *wordView) {
	var prev, next [256]int32
	for _, c := range [...]int{cPrev1, cPrevSuf3, cPrevShape, cPrevWN} {
		p.addRow(&prev, v.ctx[c])
	}
	for _, c := range [...]int{cNext1, cNextSuf3, cNextShape, cNextPrefix1, cNextWN} {
		p.addRow(&next, v.ctx[c])
	}
	both := make([]int16, 2*p.nt)
	for t := range p.nt {
		a, b := prev[t], next[t]
		if a != int32(int16(a)) || b != int32(int16(b)) {
			return
		}
		both[t], both[p.nt+t] = int16(a), int16(b)
	}
	v.side = both
}
