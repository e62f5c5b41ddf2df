package pattern

import (
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
	return m.find(tokens, false)
}

// FindNested returns, for every rule, every span [Start,End) of the
// sentence that the rule matches, each once: for every start position,
// every end position at which a non-empty match ends (longest first is not
// implied; the order is Start, then End, then rule order). This is what
// term extraction needs to see "steel valve" inside "steel valve body".
func (m *Matcher) FindNested(tokens []doc.Token) []Match {
	return m.find(tokens, true)
}

func (m *Matcher) find(tokens []doc.Token, nested bool) []Match {
	if len(tokens) == 0 {
		return nil
	}
	sc := m.pool.Get().(*scratch)
	defer m.pool.Put(sc)
	sc.prepareSentence(tokens)
	buf := sc.out[:0]
	present := sc.present()
	active := sc.active[:0]
progs:
	for i, p := range m.progs {
		for _, q := range p.required {
			if !hasBit(present, int(q)) {
				continue progs
			}
		}
		active = append(active, i)
	}
	sc.active = active
	sc.reversePasses(active, len(tokens))
	for _, i := range active {
		buf = sc.matchRule(m.progs[i], sc.rules[i], sc.revs[i], tokens, nested, buf)
	}
	sc.out = buf[:0]
	if len(buf) == 0 {
		return nil
	}
	out := sc.alloc(len(buf))
	copy(out, buf)
	clear(buf) // drop references to slot maps
	// Each rule's matches are in order; an insertion sort by position (stable,
	// so rule order stays among matches at the same place) merges them.
	if len(m.progs) > 1 {
		for i := 1; i < len(out); i++ {
			for j := i; j > 0 && matchBefore(&out[j], &out[j-1], nested); j-- {
				out[j], out[j-1] = out[j-1], out[j]
			}
		}
	}
	return out
}

// slabSize is the number of matches allocated at once for results.
const slabSize = 256

// alloc returns a fresh slice of n matches for a result. Results are cut
// from a shared slab, capped so that a caller's append cannot reach into
// the next result; this saves one allocation per sentence.
func (sc *scratch) alloc(n int) []Match {
	if n > slabSize/4 {
		return make([]Match, n)
	}
	if len(sc.slab) < n {
		sc.slab = make([]Match, slabSize)
	}
	out := sc.slab[:n:n]
	sc.slab = sc.slab[n:]
	return out
}

func matchBefore(x, y *Match, nested bool) bool {
	if x.Start != y.Start {
		return x.Start < y.Start
	}
	return nested && x.End < y.End
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

// matchRule runs one rule over the sentence. A reverse pass first records,
// for every position j, the reverse state R[j]: which instructions can
// still reach a match reading tokens j, j+1, …. Then forward scans start
// only where a non-empty match starts and stop as soon as the forward
// state has nothing left in common with R[j], that is right after the
// longest match. Every token is read at most once by the reverse pass and
// once by a forward scan per match it is part of (FindAll) — linear time,
// whatever the rule.
// reversePasses runs the reverse automata of the active rules over the
// sentence, all in one sweep so that their independent table look-ups
// overlap in the processor, and records the state of rule k at each
// position j in sc.revs[k][j].
func (sc *scratch) reversePasses(active []int, n int) {
	r := sc.revState[:0]
	for _, k := range active {
		if cap(sc.revs[k]) < n+1 {
			sc.revs[k] = make([]int32, n+1, 2*n+1)
		}
		sc.revs[k] = sc.revs[k][:n+1]
		r = append(r, sc.rules[k].revEnd)
		sc.revs[k][n] = sc.rules[k].revEnd
	}
	sc.revState = r
	cls := sc.cls[:n]
	for j := n - 1; j >= 0; j-- {
		c := int(cls[j])
		for a, k := range active {
			rd := sc.rules[k].rev
			if c < rd.stride {
				if t := rd.trans[int(r[a])*rd.stride+c]; t != 0 {
					r[a] = t - 1
					sc.revs[k][j] = t - 1
					continue
				}
			}
			r[a] = sc.revStep(sc.m.progs[k], sc.rules[k], r[a], int32(c))
			sc.revs[k][j] = r[a]
		}
	}
}

func (sc *scratch) matchRule(p *prog, rs *ruleState, rev []int32, tokens []doc.Token, nested bool, out []Match) []Match {
	n := len(tokens)
	cls := sc.cls[:n]
	for i := 0; i < n; {
		startFlag := uint8(fStartMid)
		start := rs.startMid
		if i == 0 {
			startFlag, start = fStartBegin, rs.startBegin
		}
		if rs.rev.flags[rev[i]]&startFlag == 0 {
			i++
			continue
		}
		s := start
		best := -1
		for j := i; j < n; {
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
			if p.nw == 1 {
				if rs.fwd.w0[s]&rs.rev.w0[rev[j]]&p.predMask[0] == 0 {
					break
				}
			} else if !intersects3(rs.fwd.set(s), rs.rev.set(rev[j]), p.predMask) {
				break
			}
		}
		if best <= i { // cannot happen: the reverse pass promised a match
			i++
			continue
		}
		if nested {
			i++
			continue
		}
		out = append(out, sc.newMatch(p, tokens, i, best))
		i = best
	}
	return out
}

func (sc *scratch) newMatch(p *prog, tokens []doc.Token, start, end int) Match {
	mt := Match{Rule: p.name, Start: start, End: end}
	if len(p.labels) > 0 {
		mt.Slots = sc.slots(p, len(tokens), start, end)
	}
	return mt
}
