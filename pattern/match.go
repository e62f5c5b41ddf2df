package pattern

import (
	"math/bits"
	"slices"
	"sync"

	"glossmith/tagger/doc"
)

// Match is one match of a rule in a sentence.
type Match struct {
	Rule       string            // rule name
	Start, End int               // token indices in the sentence, End exclusive
	Slots      map[string][2]int // label -> [start,end) token span (nil when the rule has no labels)
}

// FindAll returns, for every rule, its leftmost-longest non-overlapping
// matches in one sentence: scanning from the left, a match starts at the
// first token where some non-empty match of the rule starts, and ends at
// the longest such match; the scan then goes on after it. Rules are matched
// independently, so matches of different rules may overlap. The result is
// sorted by Start, then by rule order.
func (m *Matcher) FindAll(tokens []doc.Token) []Match {
	return m.find(tokens, false, 0)
}

// FindNested returns, for every rule, every span [Start,End) of the
// sentence that the rule matches, each once: for every start position,
// every end position at which a non-empty match from there ends. The result
// is sorted by Start, then End, then rule order. This is what term
// extraction needs to see "steel valve" inside "steel valve body".
func (m *Matcher) FindNested(tokens []doc.Token) []Match {
	return m.find(tokens, true, 0)
}

// FindNestedWithin is FindNested without the spans longer than maxLen
// tokens (maxLen <= 0: no limit). Those are never generated, so the cost
// is at most the number of tokens times maxLen, where FindNested's grows
// with the square of a long run of matching tokens (a sentence of 100,000
// nouns has five billion nested spans).
func (m *Matcher) FindNestedWithin(tokens []doc.Token, maxLen int) []Match {
	return m.find(tokens, true, maxLen)
}

// AppendNested appends the matches FindNested returns to dst and returns
// the extended slice. A caller that passes the same slice back, emptied,
// for every sentence allocates nothing for results.
func (m *Matcher) AppendNested(dst []Match, tokens []doc.Token) []Match {
	if len(tokens) == 0 {
		return dst
	}
	sc := m.pool.Get().(*scratch)
	defer m.pool.Put(sc)
	return m.match(sc, tokens, true, 0, dst, nil)
}

// EachNested calls fn with the matches FindNestedWithin(tokens, maxLen)
// returns, in the same order, without collecting them: a start position's
// matches are handed over before the next position is scanned, so memory
// does not grow with the number of matches of a long sentence. fn may keep
// the Match it is given.
func (m *Matcher) EachNested(tokens []doc.Token, maxLen int, fn func(Match)) {
	if len(tokens) == 0 {
		return
	}
	sc := m.pool.Get().(*scratch)
	defer m.pool.Put(sc)
	bp, _ := eachBufs.Get().(*[]Match)
	if bp == nil {
		bp = new([]Match)
	}
	buf := m.match(sc, tokens, true, maxLen, (*bp)[:0], fn)
	clear(buf[:cap(buf)]) // slots are maps, rule names a matcher's
	*bp = buf[:0]
	eachBufs.Put(bp)
}

// eachBufs holds EachNested's buffers for the matches of one position.
var eachBufs sync.Pool

func (m *Matcher) find(tokens []doc.Token, nested bool, maxLen int) []Match {
	if len(tokens) == 0 {
		return nil
	}
	sc := m.pool.Get().(*scratch)
	defer m.pool.Put(sc)
	// Matches are written straight into the free part of the result slab;
	// if a sentence has more than fit, append moves them to an array of
	// their own.
	if len(sc.slab) < slabSize/8 {
		sc.slab = make([]Match, slabSize)
	}
	buf := m.match(sc, tokens, nested, maxLen, sc.slab[:0], nil)
	if len(buf) == 0 {
		return nil
	}
	out := buf[:len(buf):len(buf)] // capped: a caller's append cannot reach the next result
	if &buf[0] == &sc.slab[0] {
		sc.slab = sc.slab[len(buf):]
	} else {
		clear(sc.slab[:min(len(buf), len(sc.slab))]) // drop what append copied away
	}
	return out
}

// match appends the matches of one sentence to buf, in the order find
// promises; nested spans are at most maxLen tokens long (0: no limit).
// With emit set, nested matches go to emit a start position at a time and
// buf holds only those of the current position.
func (m *Matcher) match(sc *scratch, tokens []doc.Token, nested bool, maxLen int, buf []Match, emit func(Match)) []Match {
	sc.prepareSentence(tokens)
	present := sc.present()
	for gi, g := range m.groups {
		var possible uint64
	rules:
		for idx, k := range g.rules {
			for _, q := range m.progs[k].required {
				if !hasBit(present, int(q)) {
					continue rules
				}
			}
			possible |= 1 << uint(idx)
		}
		sc.possible[gi] = possible
		if possible != 0 {
			sc.sweep(g, sc.groups[gi], len(tokens))
		}
	}
	start := len(buf)
	buf = sc.matchAll(tokens, nested, maxLen, buf, emit)
	if emit == nil && nested {
		m.sortNested(buf[start:])
	}
	return buf
}

// sortNested puts nested matches, which come out by start and rule, in
// FindNested's order: a stable sort by start and end.
func (m *Matcher) sortNested(out []Match) {
	if len(m.progs) == 1 {
		return
	}
	if len(out) > 32 {
		slices.SortStableFunc(out, func(x, y Match) int {
			if x.Start != y.Start {
				return x.Start - y.Start
			}
			return x.End - y.End
		})
		return
	}
	for i := 1; i < len(out); i++ {
		for j := i; j > 0 && nestedBefore(&out[j], &out[j-1]); j-- {
			out[j], out[j-1] = out[j-1], out[j]
		}
	}
}

// slabSize is the number of matches allocated at once for results: the
// results of many sentences share one allocation.
const slabSize = 512

func nestedBefore(x, y *Match) bool {
	return x.Start < y.Start || x.Start == y.Start && x.End < y.End
}

// present returns the predicates that some token of the sentence
// satisfies.
func (sc *scratch) present() []uint64 {
	p := sc.presentBuf
	clear(p)
	if len(p) == 1 {
		var w uint64
		for _, c := range sc.cls {
			w |= sc.classes[c].preds[0]
		}
		p[0] = w
		return p
	}
	for _, c := range sc.cls {
		for k, w := range sc.classes[c].preds {
			p[k] |= w
		}
	}
	return p
}

// sweep runs the reverse automaton of group g over the sentence, right to
// left, and records its state at every position 0..n in gs.states. One
// table look-up per token serves every rule of the group.
func (sc *scratch) sweep(g *group, gs *groupState, n int) {
	if cap(gs.states) < n+1 {
		gs.states = make([]int32, n+1, 2*n+1)
	}
	states := gs.states[:n+1]
	gs.states = states
	r := gs.end
	states[n] = r
	d := gs.rev
	cls := sc.cls[:n]
	for j := n - 1; j >= 0; j-- {
		c := int(cls[j])
		if x := int(r)*d.stride + c; c < d.stride && d.trans[x] != 0 {
			r = d.trans[x] - 1
		} else {
			r = sc.revStep(g, gs, r, int32(c))
		}
		states[j] = r
	}
}

// scan runs the forward automaton of rule k from i, where a match starts,
// and returns the end of the longest match; in nested mode it also appends
// every match from i to out. It stops as soon as the forward state has
// nothing in common with the reverse state at its position: no match can
// be completed from there.
func (sc *scratch) scan(k int, tokens []doc.Token, i int, nested bool, maxLen int, out []Match) (int, []Match) {
	p, rs := sc.m.progs[k], sc.rules[k]
	g, gs := sc.m.groups[p.group], sc.groups[p.group]
	n := len(tokens)
	cls := sc.cls[:n]
	states := gs.states
	revSets, gnw, off := gs.rev.sets, g.nw, p.off
	s := rs.startMid
	if i == 0 {
		s = rs.startBegin
	}
	best := -1
	stop := n // no span ends beyond stop
	if maxLen > 0 && i+maxLen < n {
		stop = i + maxLen
	}
	for j := i; j < stop; {
		fd := rs.fwd
		if c := int(cls[j]); c < fd.stride && fd.trans[int(s)*fd.stride+c] != 0 {
			s = fd.trans[int(s)*fd.stride+c] - 1
		} else {
			s = sc.fwdStep(p, rs, s, int32(c))
		}
		j++
		if s == 0 {
			break
		}
		fl := rs.fwd.flags[s]
		if j == n {
			if fl&fAcceptEnd != 0 {
				best = j
				if nested {
					out = append(out, sc.newMatch(p, tokens, i, j))
				}
			}
			break
		}
		if fl&fMatch != 0 {
			best = j
			if nested {
				out = append(out, sc.newMatch(p, tokens, i, j))
			}
		}
		rev := revSets[int(states[j])*gnw+off:]
		if p.nw == 1 {
			if rs.fwd.w0[s]&rev[0]&p.predMask[0] == 0 {
				break
			}
		} else if !intersects3(rs.fwd.set(s), rev[:p.nw], p.predMask) {
			break
		}
	}
	return best, out
}

// matchAll finds the matches of every rule from the start masks of the
// reverse states: position by position, rule by rule, so FindAll's result
// comes out sorted by start and then rule order, and one rule's matches
// never overlap. Nested spans are at most maxLen tokens (0: no limit);
// with emit set, each position's nested matches are sorted, handed to
// emit and dropped from out before the next position.
func (sc *scratch) matchAll(tokens []doc.Token, nested bool, maxLen int, out []Match, emit func(Match)) []Match {
	next := sc.nextFree
	clear(next)
	for i := range tokens {
		if emit != nil {
			out = sc.m.flushNested(out, emit)
		}
		for gi, g := range sc.m.groups {
			possible := sc.possible[gi]
			if possible == 0 {
				continue
			}
			gs := sc.groups[gi]
			mask := gs.startMid[gs.states[i]]
			if i == 0 {
				mask = gs.startBegin[gs.states[0]]
			}
			for mask &= possible; mask != 0; mask &= mask - 1 {
				k := g.rules[bits.TrailingZeros64(mask)]
				if i < next[k] {
					continue
				}
				var best int
				best, out = sc.scan(k, tokens, i, nested, maxLen, out)
				if best <= i || nested { // best <= i cannot happen: the reverse sweep promised a match
					continue
				}
				p := sc.m.progs[k]
				out = append(out, Match{Rule: p.name, Start: i, End: best})
				if len(p.labels) > 0 {
					out[len(out)-1].Slots = sc.slots(p, len(tokens), i, best)
				}
				next[k] = best
			}
		}
	}
	if emit != nil {
		out = sc.m.flushNested(out, emit)
	}
	return out
}

// flushNested hands the nested matches of one start position to emit, in
// order, and returns out emptied.
func (m *Matcher) flushNested(out []Match, emit func(Match)) []Match {
	if len(out) == 0 {
		return out
	}
	m.sortNested(out)
	for _, mt := range out {
		emit(mt)
	}
	return out[:0]
}

func (sc *scratch) newMatch(p *prog, tokens []doc.Token, start, end int) Match {
	mt := Match{Rule: p.name, Start: start, End: end}
	if len(p.labels) > 0 {
		mt.Slots = sc.slots(p, len(tokens), start, end)
	}
	return mt
}
