package pattern

import (
	"encoding/binary"
	"math/bits"
	"strings"
	"unsafe"

	"glossmith/tagger/doc"
)

// Limits on the lazily built structures of one scratch; past them the
// caches are dropped (between sentences) and built again, so memory stays
// bounded whatever the input.
var (
	maxClasses   = 1 << 14
	maxDFAStates = 1 << 13
	maxTrans     = 1 << 22 // transition table entries per automaton (16 MiB)
)

const dmBits = 10 // direct-mapped caches hold 1<<dmBits entries

// strCache maps a field value to the bits of the atoms that hold for it.
// It is a direct-mapped table indexed by a cheap hash of the value's
// length and first and last eight bytes, checked by comparing the strings,
// so a hit costs no map look-up; a miss evaluates the atoms and replaces
// the entry. Cached strings are copies, so the cache never keeps a whole
// document's text alive.
type strCache struct {
	keys [1 << dmBits]string
	vals [1 << dmBits]uint64
	used [1 << dmBits]bool
}

// load8 reads up to eight bytes of s (from its start) as a little-endian
// word.
func load8(s string) uint64 {
	if len(s) >= 8 {
		return binary.LittleEndian.Uint64(unsafe.Slice(unsafe.StringData(s), 8))
	}
	var k uint64
	for i := len(s) - 1; i >= 0; i-- {
		k = k<<8 | uint64(s[i])
	}
	return k
}

func strHash(s string) uint64 {
	k := load8(s) + uint64(len(s))<<59
	if len(s) > 8 {
		k ^= load8(s[len(s)-8:]) * 0xFF51AFD7ED558CCD
	}
	return (k * 0x9E3779B97F4A7C15) >> (64 - dmBits)
}

func (c *strCache) get(m *Matcher, field int, s string) uint64 {
	h := strHash(s)
	if c.used[h] && c.keys[h] == s {
		return c.vals[h]
	}
	v := m.evalField(field, s)
	c.keys[h], c.vals[h], c.used[h] = strings.Clone(s), v, true
	return v
}

// shortCache maps values of up to seven bytes (tags, short words), packed
// with their length into one word, to atom bits; longer values fall back to
// a strCache.
type shortCache struct {
	keys [1 << dmBits]uint64 // 0: empty (a packed key is never 0)
	vals [1 << dmBits]uint64
	long strCache
}

// pack7 packs a value of at most seven bytes, with its length, into one
// word that is never 0.
func pack7(s string) uint64 {
	var k uint64
	switch len(s) {
	case 7:
		k = uint64(s[6])<<48 | uint64(s[5])<<40 | uint64(s[4])<<32 | uint64(s[3])<<24 | uint64(s[2])<<16 | uint64(s[1])<<8 | uint64(s[0])
	case 6:
		k = uint64(s[5])<<40 | uint64(s[4])<<32 | uint64(s[3])<<24 | uint64(s[2])<<16 | uint64(s[1])<<8 | uint64(s[0])
	case 5:
		k = uint64(s[4])<<32 | uint64(s[3])<<24 | uint64(s[2])<<16 | uint64(s[1])<<8 | uint64(s[0])
	case 4:
		k = uint64(s[3])<<24 | uint64(s[2])<<16 | uint64(s[1])<<8 | uint64(s[0])
	case 3:
		k = uint64(s[2])<<16 | uint64(s[1])<<8 | uint64(s[0])
	case 2:
		k = uint64(s[1])<<8 | uint64(s[0])
	case 1:
		k = uint64(s[0])
	}
	return k | uint64(len(s)+1)<<56
}

func (c *shortCache) get(m *Matcher, field int, s string) uint64 {
	if len(s) > 7 {
		return c.long.get(m, field, s)
	}
	k := pack7(s)
	h := (k * 0x9E3779B97F4A7C15) >> (64 - dmBits)
	if c.keys[h] == k {
		return c.vals[h]
	}
	v := m.evalField(field, s)
	c.keys[h], c.vals[h] = k, v
	return v
}

// tagCache maps a token's (UPOS, XPOS) pair to atom bits with one look-up
// in a small direct-mapped table (tags are few and short). The slot comes
// from the lengths and three bytes of each tag, read without loops so that
// the processor predicts every branch; a hit is confirmed by comparing the
// tags.
type tagCache struct {
	e [1 << tagBits]tagEntry
}

type tagEntry struct {
	upos, xpos string
	v          uint64
	cls        int32 // class+1 of a token with these tags and no word test passed; 0: not yet known
	used       bool
}

const tagBits = 8

func tagHash(s string) uint64 {
	n := len(s)
	if n == 0 {
		return 0x51
	}
	// Length, first and last byte tell the UPOS tags and nearly all Penn
	// tags apart; a collision only costs misses, never a wrong answer.
	return uint64(n) | uint64(s[0])<<8 | uint64(s[n-1])<<16
}

func (sc *scratch) tagEntry(upos, xpos string) *tagEntry {
	h := (tagHash(upos)*0x9E3779B97F4A7C15 ^ tagHash(xpos)*0xC2B2AE3D27D4EB4F) >> (64 - tagBits)
	e := &sc.tags.e[h]
	if e.used && sameString(e.upos, upos) && sameString(e.xpos, xpos) {
		return e
	}
	m := sc.m
	// The entry keeps the strings themselves (not copies): taggers hand
	// out the same few tag strings again and again, and comparing a string
	// with itself stops at the pointer. Tags are short, so an entry pins
	// little memory (at most the text a reader sliced them from, until the
	// entry is replaced or the pool drops the scratch).
	e.upos, e.xpos, e.used, e.cls = upos, xpos, true, 0
	e.v = 0
	if len(upos) > 7 || len(xpos) > 7 {
		e.v = sc.fields[fieldUPOS].get(m, fieldUPOS, upos) | sc.fields[fieldXPOS].get(m, fieldXPOS, xpos)
	} else {
		e.v = m.evalField(fieldUPOS, upos) | m.evalField(fieldXPOS, xpos)
	}
	return e
}

// sameString is s == t with the common case — the very same string, as
// taggers hand out — decided without a call.
func sameString(s, t string) bool {
	if len(s) != len(t) {
		return false
	}
	return unsafe.StringData(s) == unsafe.StringData(t) || s == t
}

func lowerASCII(c byte) byte {
	if 'A' <= c && c <= 'Z' {
		return c + 'a' - 'A'
	}
	return c
}

// class is a set of tokens the rules cannot tell apart: tokens with the
// same atom bits. preds holds the predicates true for the class.
type class struct {
	preds []uint64
}

// dfa is one lazily built deterministic automaton over token classes. A
// state is a set of important instructions (see prog); state 0 is the
// empty set. Transitions live in one flat table, trans[s*stride+c] =
// target+1 (0: not built yet); the stride grows with the number of classes.
type dfa struct {
	nw     int
	sets   []uint64 // state s: sets[s*nw:(s+1)*nw]
	w0     []uint64 // first word of each state's set, for one-word programs
	trans  []int32
	stride int
	flags  []uint8
	index  map[string]int32
}

// Forward state flags.
const (
	fMatch     = 1 << iota // holds the match instruction
	fAcceptEnd             // accepts when the sentence ends here
)

func newDFA(nw int) *dfa {
	d := &dfa{nw: nw, index: map[string]int32{}, stride: 16}
	d.add(make([]uint64, nw), 0)
	return d
}

func setKey(s []uint64) string {
	b := make([]byte, 8*len(s))
	for i, w := range s {
		binary.LittleEndian.PutUint64(b[8*i:], w)
	}
	return string(b)
}

// add interns a state set and returns its id.
func (d *dfa) add(set []uint64, flags uint8) int32 {
	k := setKey(set)
	if id, ok := d.index[k]; ok {
		return id
	}
	id := int32(len(d.flags))
	d.index[k] = id
	d.sets = append(d.sets, set...)
	d.w0 = append(d.w0, set[0])
	d.trans = append(d.trans, make([]int32, d.stride)...)
	d.flags = append(d.flags, flags)
	return id
}

func (d *dfa) set(s int32) []uint64 { return d.sets[int(s)*d.nw : (int(s)+1)*d.nw] }

func (d *dfa) store(s, c, t int32) {
	if int(c) >= d.stride {
		stride := max(2*d.stride, int(c)+1)
		trans := make([]int32, len(d.flags)*stride)
		for i := range d.flags {
			copy(trans[i*stride:], d.trans[i*d.stride:(i+1)*d.stride])
		}
		d.trans, d.stride = trans, stride
	}
	d.trans[int(s)*d.stride+int(c)] = t + 1
}

// ruleState is one rule's forward automaton inside a scratch.
type ruleState struct {
	fwd        *dfa
	startMid   int32 // forward start states
	startBegin int32
}

// groupState is a group's reverse automaton inside a scratch, with, for
// each state, the rules (bits as in prog.bit) for which a non-empty match
// starts at a position in that state — elsewhere than at the sentence
// start (mid) and at it (begin).
type groupState struct {
	rev        *dfa
	startMid   []uint64
	startBegin []uint64
	end        int32   // state at the sentence end
	states     []int32 // state at each position of the current sentence
}

// scratch is the working memory of one matching call; a Matcher keeps a
// pool of them so that concurrent calls never share one.
type scratch struct {
	m       *Matcher
	fields  [numFields]shortCache
	tags    tagCache
	dmKeys  [1 << dmBits]uint64 // atom bits -> class, direct mapped
	dmVals  [1 << dmBits]int32  // class+1
	classOf map[uint64]int32
	classes []class
	rules   []*ruleState
	groups  []*groupState

	cls      []int32  // class of each token of the sentence
	possible []uint64 // per group: rules whose required tests some token passes
	nextFree []int    // per rule: first position its next match may use
	slab     []Match  // unused part of the current result slab

	presentBuf []uint64 // predicates some token of the sentence satisfies

	pikeSeen  []uint32 // Pike VM: generation stamp per instruction
	pikeGen   uint32
	pikeArena []int
	pikeList  [2][]pikeThread
}

func newScratch(m *Matcher) *scratch {
	sc := &scratch{m: m, presentBuf: make([]uint64, max(1, (len(m.preds)+63)/64)),
		possible: make([]uint64, len(m.groups)), nextFree: make([]int, len(m.progs))}
	sc.reset()
	return sc
}

// reset drops every lazily built structure.
func (sc *scratch) reset() {
	sc.classOf = map[uint64]int32{}
	sc.classes = sc.classes[:0]
	sc.dmKeys = [1 << dmBits]uint64{}
	sc.tags = tagCache{}
	sc.fields = [numFields]shortCache{}
	sc.dmVals = [1 << dmBits]int32{}
	sc.rules = make([]*ruleState, len(sc.m.progs))
	for i, p := range sc.m.progs {
		rs := &ruleState{fwd: newDFA(p.nw)}
		rs.startMid = rs.fwd.add(p.startMid, fwdFlags(p, p.startMid))
		rs.startBegin = rs.fwd.add(p.startBegin, fwdFlags(p, p.startBegin))
		sc.rules[i] = rs
	}
	sc.groups = make([]*groupState, len(sc.m.groups))
	for gi, g := range sc.m.groups {
		// State 0, the empty set, starts nothing.
		gs := &groupState{rev: newDFA(g.nw), startMid: []uint64{0}, startBegin: []uint64{0}}
		sc.groups[gi] = gs
		end := make([]uint64, g.nw)
		for idx, k := range g.rules {
			p := sc.m.progs[k]
			sub := end[g.off[idx] : g.off[idx]+p.nw]
			setBit(sub, p.matchBit)
			for b := range p.imp {
				if hasBit(p.endMask, b) && p.endAccept[b] {
					setBit(sub, b)
				}
			}
		}
		gs.end = sc.addRev(g, gs, end)
	}
}

// addRev interns a reverse state of group g and computes its start masks.
func (sc *scratch) addRev(g *group, gs *groupState, set []uint64) int32 {
	t := gs.rev.add(set, 0)
	if int(t) < len(gs.startMid) {
		return t
	}
	var mid, begin uint64
	for idx, k := range g.rules {
		p := sc.m.progs[k]
		sub := set[g.off[idx] : g.off[idx]+p.nw]
		if intersects3(p.startMid, sub, p.predMask) {
			mid |= 1 << uint(idx)
		}
		if intersects3(p.startBegin, sub, p.predMask) {
			begin |= 1 << uint(idx)
		}
	}
	gs.startMid = append(gs.startMid, mid)
	gs.startBegin = append(gs.startBegin, begin)
	return t
}

// prepareSentence computes the class of every token and drops the caches
// when they have grown past their limits.
func (sc *scratch) prepareSentence(tokens []doc.Token) {
	grown := len(sc.classes) > maxClasses
	for _, rs := range sc.rules {
		if len(rs.fwd.flags) > maxDFAStates || len(rs.fwd.trans) > maxTrans {
			grown = true
		}
	}
	for _, gs := range sc.groups {
		if len(gs.rev.flags) > maxDFAStates || len(gs.rev.trans) > maxTrans {
			grown = true
		}
	}
	if grown {
		sc.reset()
	}
	n := len(tokens)
	if cap(sc.cls) < n {
		sc.cls = make([]int32, n, 2*n)
	}
	sc.cls = sc.cls[:n]
	m := sc.m
	tagged := m.fieldMask[fieldUPOS]|m.fieldMask[fieldXPOS] != 0
	untagged := tagEntry{cls: 0}
	for i := range tokens {
		t := &tokens[i]
		e := &untagged
		if tagged {
			e = sc.tagEntry(t.UPOS, t.XPOS)
		}
		var w uint64 // word and lemma tests that hold
		form := t.Form
		if m.wordGate != nil && (form == "" || !m.wordGate[form[0]]) {
			goto lemma // no word test can hold
		}
		if m.fieldMask[fieldForm] != 0 && (m.formGate == nil || form != "" && m.formGate[form[0]]) {
			w |= sc.fields[fieldForm].get(m, fieldForm, form)
		}
		for k, a := range m.direct {
			// Most words differ from a test word in their first letter:
			// reject those without a call.
			if a.fold0 != 0 && form != "" && form[0] < 0x80 && lowerASCII(form[0]) != a.fold0 {
				continue
			}
			if a.test(form) {
				w |= m.directBit[k]
			}
		}
	lemma:
		if m.fieldMask[fieldLemma] != 0 {
			w |= sc.fields[fieldLemma].get(m, fieldLemma, t.Lemma)
		}
		if w == 0 { // the common case: the tags alone decide the class
			if e.cls == 0 {
				e.cls = sc.classFor(m.anyBits|e.v) + 1
			}
			sc.cls[i] = e.cls - 1
			continue
		}
		sc.cls[i] = sc.classFor(m.anyBits | e.v | w)
	}
}

func (sc *scratch) classFor(b uint64) int32 {
	h := ((b + 1) * 0x9E3779B97F4A7C15) >> (64 - dmBits)
	if sc.dmKeys[h] == b && sc.dmVals[h] != 0 {
		return sc.dmVals[h] - 1
	}
	id, ok := sc.classOf[b]
	if !ok {
		id = int32(len(sc.classes))
		preds := make([]uint64, max(1, (len(sc.m.preds)+63)/64))
		for i, f := range sc.m.preds {
			if f.eval(b) {
				setBit(preds, i)
			}
		}
		sc.classes = append(sc.classes, class{preds: preds})
		sc.classOf[b] = id
	}
	sc.dmKeys[h], sc.dmVals[h] = b, id+1
	return id
}

func fwdFlags(p *prog, set []uint64) uint8 {
	var f uint8
	if hasBit(set, p.matchBit) {
		f |= fMatch | fAcceptEnd
	}
	for i, w := range set {
		for w != 0 {
			b := i*64 + bits.TrailingZeros64(w)
			w &= w - 1
			if hasBit(p.endMask, b) && p.endAccept[b] {
				f |= fAcceptEnd
			}
		}
	}
	return f
}

func intersects3(a, b, c []uint64) bool {
	for i := range a {
		if a[i]&b[i]&c[i] != 0 {
			return true
		}
	}
	return false
}

// fwdStep returns the forward state after state s reads a token of class c.
func (sc *scratch) fwdStep(p *prog, rs *ruleState, s, c int32) int32 {
	d := rs.fwd
	if int(c) < d.stride {
		if t := d.trans[int(s)*d.stride+int(c)]; t != 0 {
			return t - 1
		}
	}
	set := rs.fwd.set(s)
	preds := sc.classes[c].preds
	next := make([]uint64, p.nw)
	for i, w := range set {
		w &= p.predMask[i]
		for w != 0 {
			b := i*64 + bits.TrailingZeros64(w)
			w &= w - 1
			if hasBit(preds, int(p.predOf[b])) {
				for k, x := range p.succ[b*p.nw : (b+1)*p.nw] {
					next[k] |= x
				}
			}
		}
	}
	t := rs.fwd.add(next, fwdFlags(p, next))
	rs.fwd.store(s, c, t)
	return t
}

// revStep returns the reverse state of group g before a token of class c,
// given the state r after it: for each rule, its match instruction and
// every predicate instruction whose test holds for c and whose successors
// meet the rule's part of r.
func (sc *scratch) revStep(g *group, gs *groupState, r, c int32) int32 {
	d := gs.rev
	if int(c) < d.stride {
		if t := d.trans[int(r)*d.stride+int(c)]; t != 0 {
			return t - 1
		}
	}
	after := d.set(r)
	preds := sc.classes[c].preds
	next := make([]uint64, g.nw)
	for idx, k := range g.rules {
		p := sc.m.progs[k]
		o := g.off[idx]
		aft, sub := after[o:o+p.nw], next[o:o+p.nw]
		setBit(sub, p.matchBit)
		for i, w := range p.predMask {
			for w != 0 {
				b := i*64 + bits.TrailingZeros64(w)
				w &= w - 1
				if !hasBit(preds, int(p.predOf[b])) {
					continue
				}
				for k, x := range p.succ[b*p.nw : (b+1)*p.nw] {
					if x&aft[k] != 0 {
						setBit(sub, b)
						break
					}
				}
			}
		}
	}
	t := sc.addRev(g, gs, next)
	d.store(r, c, t)
	return t
}
