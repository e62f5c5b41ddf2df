package hmm

import (
	"math"
	"sort"
)

// lattice holds one sentence's decoding problem and the state of the
// second-order Viterbi search. Both the generative and the perceptron
// model reduce to it: every score is additive (log probabilities or
// perceptron weights), so the decoder does not care which model made them.
//
// A state at position i is the pair (tag of i-1, tag of i), which is what
// a trigram model needs; only the candidate tags of each position take
// part, and states far below the best one at a position are pruned (beam).
type lattice struct {
	n     int
	cands []uint8   // candidate tags of all positions, flat
	off   []int32   // cands of position i: cands[off[i]:off[i+1]]
	emit  []float32 // emission score per candidate, parallel to cands
	// pair holds, in the layout of delta, a score for each (previous tag,
	// tag) state that depends on the word: the perceptron's tag-word
	// features. Unused when its length differs from delta's.
	pair     []float32
	delta    []float32 // per position: prev-cand × cur-cand scores
	back     []int16   // back pointers (index into cands of position i-2)
	stateOff []int32   // delta, back and pair of position i start at stateOff[i]
	candRank []uint8   // rank of each candidate, parallel to cands (see fold)
	// prev2Row is scratch of forwardFolded: for each candidate two
	// positions back, the offset of its block of the trigram table.
	prev2Row [256]int
	tags     []uint8 // best path, filled by decode
	cut      float32 // states of the last position below it are dead (beam)
	bound    [1]uint8
	// score is scratch of candidate selection and of the generative
	// model's suffix scores: one score per tag.
	score []float32
}

// newLattice returns an empty lattice; its score scratch has room for
// every possible tag (maxTags), so scoring may index it by a byte.
func newLattice() lattice {
	return lattice{score: make([]float32, maxTags+1)}
}

func (l *lattice) reset(n int) {
	l.n = n
	l.cands = l.cands[:0]
	l.emit = l.emit[:0]
	l.off = append(l.off[:0], 0)
	l.pair = l.pair[:0]
}

// add appends a candidate tag with its emission score to the position
// being built; closePos ends the position.
func (l *lattice) add(tag uint8, score float32) {
	l.cands = append(l.cands, tag)
	l.emit = append(l.emit, score)
}

func (l *lattice) closePos() { l.off = append(l.off, int32(len(l.cands))) }

// startPairs sizes l.pair for the lattice's states, with bound the
// boundary tag (the "previous tag" of the first position).
func (l *lattice) startPairs(bound uint8) {
	l.pair = growF32(l.pair, l.layout())
	l.bound[0] = bound
}

// pairBlock returns the candidates of positions i-1 (the boundary for
// i = 0) and i, and the pair scores of their states, from
// l.pair[stateOff[i]] on: the score of (prev[j], cur[k]) is
// out[j*len(cur)+k].
func (l *lattice) pairBlock(i int) (prev, cur []uint8, out []float32) {
	prev = l.bound[:]
	if i > 0 {
		prev = l.cands[l.off[i-1]:l.off[i]]
	}
	return prev, l.cands[l.off[i]:l.off[i+1]], l.pair[l.stateOff[i]:]
}

var negInf = float32(math.Inf(-1))

// transitions gives the score of tag c after tags a, b. tri is indexed
// ((a*t1)+b)*t1+c with t1 = number of tags + 1; the extra index stands for
// the sentence boundary (start as context, stop as prediction). bi, when
// not nil, adds a bigram score bi[b*t1+c]. When layers is set (perceptron
// training, where weights change after every sentence), the score is
// instead summed over the layers; decoding a trained model folds them into
// tri once.
type transitions struct {
	t1  int
	tri []float32
	// steps, when not nil, replaces tri: the folded table of a perceptron
	// in whole weight steps, padded like tri (see fold). Its 2.2 MB take
	// half the cache of the float table, and the decoder reads it for
	// every pair of states.
	steps  []int16
	rank   *[256]uint8 // nil, or the index of each tag in tri (see fold)
	bi     []float32
	layers []transLayer
}

// transLayer holds transition weights over a projection of the states:
// the states themselves, their XPOS or their UPOS. Weights shared by
// all states with the same UPOS, say, are learned from more examples than
// those of each joint state.
type transLayer struct {
	proj    []uint8 // state → class; index len(states) is the boundary
	n1      int     // number of classes, boundary included
	tri, bi []float32
}

func (tr *transitions) t3(a, b, c uint8) float32 {
	var s float32
	for i := range tr.layers {
		y := &tr.layers[i]
		s += y.tri[(int(y.proj[a])*y.n1+int(y.proj[b]))*y.n1+int(y.proj[c])]
	}
	return s
}

func (tr *transitions) t2(b, c uint8) float32 {
	var s float32
	for i := range tr.layers {
		y := &tr.layers[i]
		s += y.bi[int(y.proj[b])*y.n1+int(y.proj[c])]
	}
	return s
}

// decode finds the best tag sequence; beam < 0 disables state pruning.
// The result is in l.tags.
func (l *lattice) decode(tr *transitions, beam float32) {
	n := l.n
	l.tags = grow(l.tags, n)
	if n == 0 {
		return
	}
	l.bound[0] = uint8(tr.t1 - 1)
	size := l.layout()
	l.delta = growF32(l.delta, size)
	l.back = growI16(l.back, size)
	rank := tr.rank
	if rank == nil {
		rank = &identityRank
	}
	l.candRank = grow(l.candRank, len(l.cands))
	for i, c := range l.cands {
		l.candRank[i] = rank[c]
	}
	switch {
	case tr.steps != nil:
		forwardFolded(l, tr.steps, tr.t1, weightStep, rank, beam)
	case tr.layers == nil && tr.bi == nil && cap(tr.tri) >= len(tr.tri)+256:
		forwardFolded(l, tr.tri, tr.t1, 1, rank, beam)
	default:
		l.forward(tr, beam)
	}
	l.finish(tr, rank)
}

// candAt returns the candidates of position i; before the sentence, the
// boundary.
func (l *lattice) candAt(i int) []uint8 {
	if i < 0 {
		return l.bound[:]
	}
	return l.cands[l.off[i]:l.off[i+1]]
}

// forwardFolded fills delta and back for a folded, padded trigram table
// (see fold) whose entries times scale are the transition scores: the
// decoder of tagging, where it is about a fifth of all the work, hence
// the specialized loops. Scaling by a power of two is exact, so an entry
// in steps gives the same float32 as the float table held.
//
// Most positions have few candidates, so what surrounds the innermost
// loop costs more instructions than the loop itself: the beam is
// applied when the next position reads a state (a state below its
// position's cut is dead, as one set to −∞ was) rather than in a pass of
// its own, and emission and pair scores are added without testing for
// dead states (−∞ plus a finite score stays −∞).
func forwardFolded[W int16 | float32](l *lattice, tab []W, t1 int, scale float32, rank *[256]uint8, beam float32) {
	pairs := len(l.pair) == len(l.delta)
	prev2Row := &l.prev2Row
	pcut := dead // states of the previous position below it are dead
	var start [1]float32
	prev2, prev := l.bound[:], l.bound[:]
	for i := 0; i < l.n; i++ {
		lo, hi := l.off[i], l.off[i+1]
		cur := l.cands[lo:hi]
		p1, p0 := len(prev), len(cur)
		emit := l.emit[lo:hi][:p0]
		rcur := l.candRank[lo:hi][:p0]
		base := int(l.stateOff[i])
		delta := l.delta[base : base+p1*p0]
		back := l.back[base : base+p1*p0]
		var pair []float32
		if pairs {
			pair = l.pair[base : base+p1*p0]
		}
		pdelta := start[:] // before the first position: one state, score 0
		if i > 0 {
			pb := int(l.stateOff[i-1])
			pdelta = l.delta[pb : pb+len(prev2)*p1]
		}
		for h, a := range prev2 {
			prev2Row[h] = int(rank[a]) * t1 * t1
		}
		best := negInf
		if p0 == 1 {
			// One candidate (a third of the positions: words the tag
			// dictionary settles): each state is one maximum over the
			// states before it, kept in registers.
			c, e := int(rcur[0]), emit[0]
			for j, b := range prev {
				rb := int(rank[b])*t1 + c
				v, bh := negInf, 0
				for h := range prev2 {
					d := pdelta[h*p1+j]
					if d < pcut {
						continue
					}
					if s := d + float32(tab[prev2Row[uint8(h)]+rb])*scale; s > v {
						v, bh = s, h
					}
				}
				v += e
				if pairs {
					v += pair[j]
				}
				delta[j], back[j] = v, int16(bh)
				if v > best {
					best = v
				}
			}
		} else {
			for j, b := range prev {
				row := delta[j*p0 : j*p0+p0][:p0]
				brow := back[j*p0 : j*p0+p0][:p0]
				for k := range row {
					row[k] = negInf
				}
				rb := int(rank[b]) * t1
				for h := range prev2 {
					d := pdelta[h*p1+j]
					if d < pcut {
						continue
					}
					// A tag is a byte, so an array of 256 needs no bounds checks.
					off := prev2Row[uint8(h)] + rb
					tri := (*[256]W)(tab[off : off+256])
					for k, c := range rcur {
						if s := d + float32(tri[c])*scale; s > row[k] {
							row[k] = s
							brow[k] = int16(h)
						}
					}
				}
			}
			best = addEmissions(delta, emit, pair, pairs)
		}
		pcut = dead
		if beam >= 0 {
			pcut = best - beam
		}
		prev2, prev = prev, cur
	}
	l.cut = pcut
}

// addEmissions adds to a position's states (previous candidate major)
// the emission scores of their candidates, and their pair scores when
// pairs is set, over all states in one loop, and returns the best. A dead
// state needs no test: −∞ plus a finite score stays −∞.
func addEmissions(delta, emit, pair []float32, pairs bool) float32 {
	best := negInf
	p0, k := len(emit), 0
	if pairs {
		pair = pair[:len(delta)]
		for s, v := range delta {
			v = v + emit[k] + pair[s] // the order of the other passes: exact alike
			delta[s] = v
			if v > best { // not max(): its NaN rules cost a third of the loop
				best = v
			}
			if k++; k == p0 {
				k = 0
			}
		}
		return best
	}
	for s, v := range delta {
		v += emit[k]
		delta[s] = v
		if v > best {
			best = v
		}
		if k++; k == p0 {
			k = 0
		}
	}
	return best
}

// dead is the cut below which no state is alive when there is no beam:
// only −∞ is below it.
const dead float32 = -math.MaxFloat32

// forward fills delta and back in the general case: transition layers
// (training) or a separate bigram table.
func (l *lattice) forward(tr *transitions, beam float32) {
	t1 := tr.t1
	pairs := len(l.pair) == len(l.delta)
	for i := 0; i < l.n; i++ {
		prev2, prev, cur := l.candAt(i-2), l.candAt(i-1), l.candAt(i)
		p1, p0 := len(prev), len(cur)
		emit := l.emit[l.off[i]:l.off[i+1]]
		base := int(l.stateOff[i])
		delta := l.delta[base : base+p1*p0]
		back := l.back[base : base+p1*p0]
		for s := range delta {
			delta[s] = negInf
		}
		var pdelta []float32
		if i > 0 {
			pb := int(l.stateOff[i-1])
			pdelta = l.delta[pb : pb+len(prev2)*p1]
		}
		for j, b := range prev {
			row := delta[j*p0 : j*p0+p0][:len(cur)]
			brow := back[j*p0 : j*p0+p0][:len(cur)]
			for h, a := range prev2 {
				var d float32
				if i > 0 {
					d = pdelta[h*p1+j]
					if d == negInf {
						continue
					}
				}
				for k, c := range cur {
					var t float32
					if tr.layers != nil {
						t = tr.t3(a, b, c)
					} else {
						t = tr.tri[(int(a)*t1+int(b))*t1+int(c)]
					}
					if s := d + t; s > row[k] {
						row[k] = s
						brow[k] = int16(h)
					}
				}
			}
			for k, c := range cur {
				if row[k] == negInf {
					continue
				}
				row[k] += emit[k]
				if pairs {
					row[k] += l.pair[base+j*p0+k]
				}
				if tr.layers != nil {
					row[k] += tr.t2(b, c)
				} else if tr.bi != nil {
					row[k] += tr.bi[int(b)*t1+int(c)]
				}
			}
		}
		if beam >= 0 {
			best := negInf
			for _, d := range delta {
				if d > best {
					best = d
				}
			}
			cut := best - beam
			for s, d := range delta {
				if d < cut {
					delta[s] = negInf
				}
			}
		}
	}
	l.cut = dead
}

// finish picks the best final state, with the transition to the sentence
// end, and follows the back pointers into l.tags.
func (l *lattice) finish(tr *transitions, rank *[256]uint8) {
	n, t1 := l.n, tr.t1
	bound := int(l.bound[0])
	prev, cur := l.candAt(n-2), l.candAt(n-1)
	p0 := len(cur)
	base := int(l.stateOff[n-1])
	best := negInf
	bj, bk := 0, 0
	for j, b := range prev {
		for k, c := range cur {
			d := l.delta[base+j*p0+k]
			if d < l.cut {
				continue
			}
			var s float32
			if tr.layers != nil {
				s = d + tr.t3(b, c, uint8(bound)) + tr.t2(c, uint8(bound))
			} else if i := (int(rank[b])*t1+int(rank[c]))*t1 + int(rank[bound]); tr.steps != nil {
				s = d + float32(tr.steps[i])*weightStep
			} else {
				s = d + tr.tri[i]
				if tr.bi != nil {
					s += tr.bi[int(c)*t1+bound]
				}
			}
			if s > best {
				best, bj, bk = s, j, k
			}
		}
	}
	// Back-track: state (j, k) at position i points at h at i-2.
	j, k := bj, bk
	for i := n - 1; i >= 0; i-- {
		cur := l.candAt(i)
		l.tags[i] = cur[k]
		if i == 0 {
			break
		}
		h := int(l.back[int(l.stateOff[i])+j*len(cur)+k])
		k = j
		j = h
	}
}

// layout fills l.stateOff: position i has P(i-1) × P(i) states (P(-1) = 1,
// the boundary), stored from l.stateOff[i] on. It returns the total.
func (l *lattice) layout() int {
	n := l.n
	l.stateOff = growI32(l.stateOff, n+1)
	size := 0
	prevP := 1
	for i := 0; i < n; i++ {
		l.stateOff[i] = int32(size)
		p := int(l.off[i+1] - l.off[i])
		size += prevP * p
		prevP = p
	}
	l.stateOff[n] = int32(size)
	return size
}

// fold sums the layers (or the bigram table) into one trigram table, so
// that decoding reads one number per transition. When rank is not nil
// the table is indexed by the ranks of the tags rather than the tags
// (see frequencyRank).
func (tr *transitions) fold(rank *[256]uint8) transitions {
	t1 := tr.t1
	tri := padTri(t1)
	r := rank
	if r == nil {
		r = &identityRank
	}
	for a := 0; a < t1; a++ {
		for b := 0; b < t1; b++ {
			for c := 0; c < t1; c++ {
				i := (a*t1+b)*t1 + c
				var v float32
				if tr.layers != nil {
					v = tr.t3(uint8(a), uint8(b), uint8(c)) + tr.t2(uint8(b), uint8(c))
				} else {
					v = tr.tri[i]
					if tr.bi != nil {
						v += tr.bi[b*t1+c]
					}
				}
				tri[(int(r[a])*t1+int(r[b]))*t1+int(r[c])] = v
			}
		}
	}
	if q := inSteps(tri); q != nil {
		return transitions{t1: t1, steps: q, rank: rank}
	}
	return transitions{t1: t1, tri: tri, rank: rank}
}

// inSteps returns a padded table of tri in weight steps, or nil when an
// entry is not a whole number of steps within int16. A perceptron's
// weights are stored in steps, and its folded sums fit: on the
// embedded model they span −11,333 to 20,462 steps.
func inSteps(tri []float32) []int16 {
	q := make([]int16, len(tri), len(tri)+256)
	for i, v := range tri {
		x := v / weightStep
		if x != float32(math.Round(float64(x))) || x < math.MinInt16 || x > math.MaxInt16 {
			return nil
		}
		q[i] = int16(x)
	}
	return q
}

// identityRank maps every tag to itself.
var identityRank = func() (r [256]uint8) {
	for i := range r {
		r[i] = uint8(i)
	}
	return r
}()

// frequencyRank numbers the tags (and the boundary, index t1-1, which is
// in every sentence) from the most frequent down. A trigram table indexed
// by ranks keeps the transitions among frequent tags — nearly all that
// decoding reads — in a small corner of the table, which stays in cache;
// indexed by tag it spreads them over all of it (2 MB in steps).
func frequencyRank(freq []int64) *[256]uint8 {
	order := make([]int, len(freq))
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(x, y int) bool { return freq[order[x]] > freq[order[y]] })
	rank := identityRank
	for r, t := range order {
		rank[t] = uint8(r)
	}
	return &rank
}

// padTri allocates a trigram table with room for 256 more numbers past
// its end, so that decode may view any row as an array of 256 (indexed by
// a byte, without bounds checks).
func padTri(t1 int) []float32 { return make([]float32, t1*t1*t1, t1*t1*t1+256) }

func grow(s []uint8, n int) []uint8 {
	if cap(s) < n {
		return make([]uint8, n, 2*n)
	}
	return s[:n]
}

func growF32(s []float32, n int) []float32 {
	if cap(s) < n {
		return make([]float32, n, 2*n)
	}
	return s[:n]
}

func growI16(s []int16, n int) []int16 {
	if cap(s) < n {
		return make([]int16, n, 2*n)
	}
	return s[:n]
}

func growI32(s []int32, n int) []int32 {
	if cap(s) < n {
		return make([]int32, n, 2*n)
	}
	return s[:n]
}
