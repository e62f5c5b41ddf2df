package hmm

import (
	"math"
	"unsafe"

	"glossmith/internal/prefetch"
	"glossmith/tagger/doc"
)

// buildLattice scores the tags of every token and keeps the candidates:
// the tag dictionary's tags for frequent words (one tag needs no scoring
// at all; see dictShare), the best maxCands tags for the others. Scores
// come from the words' views (see views.go).
func (p *perceptron) buildLattice(m *Model, ws *workspace, toks []doc.Token) {
	ws.reset(len(toks))
	p.viewsOf(m, ws, toks)
	nt := len(m.tags)
	score := &ws.steps
	// The context parts of token i+1 are gathered while token i is
	// scored, and what scoring it will read is prefetched: its rows'
	// weights, and for an open token its word-alone weights and its
	// neighbours' side vectors. scoreOpenToken and addRow, which read
	// them, took 17–21% of a one-worker run without the prefetch, 10–15%
	// with it (prefetchParts itself about 5%).
	if len(toks) > 0 && ws.views[0].ndict != 1 {
		ws.rows, ws.vecs = p.contextParts(ws.rows[:0], ws.vecs[:0], ws.views, 0)
	}
	for i := range toks {
		if i+1 < len(toks) && ws.views[i+1].ndict != 1 {
			ws.nextRows, ws.nextVecs = p.contextParts(ws.nextRows[:0], ws.nextVecs[:0], ws.views, i+1)
			p.prefetchParts(ws.views, i+1, ws.nextRows)
		}
		v := ws.views[i]
		switch {
		case v.ndict == 1:
			ws.add(p.dtags[v.dfirst], 0)
			ws.closePos()
		case v.ndict > 0:
			p.scoreDict(ws, v, score)
		case p.maxCands <= 8:
			// The rows first, into a zeroed accumulator; then one pass
			// over the tags sums the dense parts with it and selects.
			for _, r := range ws.rows {
				p.addRow(&ws.acc, r)
			}
			va, vb := zeroSide[:], zeroSide[:]
			if len(ws.vecs) > 0 {
				va = ws.vecs[0]
			}
			if len(ws.vecs) > 1 {
				vb = ws.vecs[1]
			}
			scoreOpenToken(&ws.lattice, v.alone[:nt], va, vb, &ws.acc, p.maxCands, weightStep)
		default:
			copy(score[:], v.alone)
			for _, vec := range ws.vecs {
				addDense(score, vec)
			}
			for _, r := range ws.rows {
				p.addRow(score, r)
			}
			selectCands(&ws.lattice, score[:nt], p.maxCands, weightStep)
		}
		ws.rows, ws.nextRows = ws.nextRows, ws.rows
		ws.vecs, ws.nextVecs = ws.nextVecs, ws.vecs
	}
	p.fillPairs(&ws.lattice, &ws.tagIndex, uint8(nt), ws.views, nil)
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
// token sums into ws.acc in scoreOpenToken, or, with more than eight
// candidates, starts from a copy of all nt word-alone scores).
func (p *perceptron) scoreDict(ws *workspace, v *wordView, score *[256]int32) {
	tags := p.dtags[v.dfirst : v.dfirst+int32(v.ndict)]
	for k, t := range tags {
		s := v.alone[k]
		for _, vec := range ws.vecs {
			s += int32(vec[t])
		}
		score[t] = s
	}
	for _, r := range ws.rows {
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
		ws.add(t, float32(score[t])*weightStep)
	}
	ws.closePos()
}

// addDense adds vec, indexed by tag, to score (in steps).
func addDense(score *[256]int32, vec []int16) {
	vec = vec[:min(len(vec), 256)]
	for t, w := range vec {
		score[t] += int32(w)
	}
}

// fillPairs scores the tag-word pair features of every state. views,
// when not nil, are the tokens' views: the row of "word i after tag b" is
// then found from the view (pairRow), and the scores of words the tag
// dictionary settles are copied from it (wordView.pairData) instead of
// read from rows. Without views, rowOf gives that row. index is scratch
// (see tagIndex).
func (p *perceptron) fillPairs(l *lattice, index *tagIndex, bound uint8, views []*wordView, rowOf func(i int, b uint8) int32) {
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
		index.mark(cur)
		for j, b := range prev {
			var r int32
			if views != nil {
				r = p.pairRow(views[i], b)
			} else {
				r = rowOf(i, b)
			}
			p.rowAt(out[j*nc:(j+1)*nc], r, cur, index)
		}
		index.unmark(cur)
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

// scoreOpenToken sums the scores of an open token — its word-alone weights,
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
func scoreOpenToken(l *lattice, alone []int32, va, vb []int16, acc *[256]int32, maxCands int, scale float32) {
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
