package pattern

import (
	"fmt"
	"strings"
	"sync"
)

// The compiled form of rules, as regexp/syntax/prog.go is of regular
// expressions: each rule becomes a Thompson NFA over token predicates
// (prog), the predicates are formulas over the distinct token tests
// (atoms), and a Matcher holds the rules compiled together. The compiler
// that builds them is in compile.go; lazydfa.go runs them.

// opcodes of the compiled program.
const (
	opMatch uint8 = iota
	opPred        // consume one token if predicate arg holds, then goto out
	opSplit       // goto out (preferred) or out1
	opNop         // goto out
	opSave        // record the position in slot arg, goto out
	opBegin       // goto out at the sentence start
	opEnd         // goto out at the sentence end
)

// inst is one instruction: op with its argument (a predicate or a slot)
// and where to go next.
type inst struct {
	op   uint8
	arg  int32
	out  int32
	out1 int32
}

// prog is one rule compiled to a Thompson NFA.
type prog struct {
	name   string
	insts  []inst
	start  int32
	labels []string // slot 2k, 2k+1 hold the span of labels[k]

	// Precomputed for the DFAs: "important" instructions are the ones a
	// state must remember (opPred, opMatch, opEnd); bit b of a state set
	// stands for important instruction imp[b].
	imp        []int32
	nw         int      // words per state set
	succ       []uint64 // succ[b*nw:] = important closure of imp[b].out
	predOf     []int32  // predicate of imp[b] (opPred) or -1
	predMask   []uint64
	endMask    []uint64
	matchBit   int
	endAccept  []bool // opEnd bit b: at the sentence end, out reaches match
	startMid   []uint64
	startBegin []uint64
	// group, off: the rule's group and the word offset of its set within
	// the group's sets; bit: the rule's bit in the group's masks.
	group, off, bit int

	// required lists predicates that every match reads a token for: a
	// sentence without any token satisfying one of them cannot match, and
	// the rule is skipped without running its automata.
	required []int32
}

// formula is a test about one token built from atoms.
type formula struct {
	op   byte // 'a' atom, '!' not, '&' and, '|' or, 't' true
	atom int
	subs []*formula
}

func (f *formula) eval(bits uint64) bool {
	switch f.op {
	case 'a':
		return bits&(1<<uint(f.atom)) != 0
	case '!':
		return !f.subs[0].eval(bits)
	case '&':
		for _, s := range f.subs {
			if !s.eval(bits) {
				return false
			}
		}
		return true
	case '|':
		for _, s := range f.subs {
			if s.eval(bits) {
				return true
			}
		}
		return false
	}
	return true
}

func (f *formula) key() string {
	switch f.op {
	case 'a':
		return fmt.Sprint(f.atom)
	case 't':
		return "t"
	case '!':
		return "!" + f.subs[0].key()
	}
	parts := make([]string, len(f.subs))
	for i, s := range f.subs {
		parts[i] = s.key()
	}
	return "(" + strings.Join(parts, string(f.op)) + ")"
}

// Matcher finds the matches of a set of compiled rules in tagged sentences.
// It is safe for concurrent use: each call takes its working memory (and
// its lazily built automata) from a pool.
type Matcher struct {
	progs []*prog
	atoms []*atom
	preds []*formula

	fieldMask [numFields]uint64 // cached atoms by the token field they read
	anyBits   uint64            // atoms true for every token
	direct    []*atom           // cheap word tests, evaluated on every token
	directBit []uint64
	formGate  *[256]bool // first bytes that can pass a cached word test; nil: any
	wordGate  *[256]bool // first bytes that can pass any word test; nil: any

	// groups splits the rules into runs of at most 64 that share one
	// reverse automaton (see group).
	groups []*group

	pool sync.Pool
}

// Rules returns the names of the compiled rules, in order.
func (m *Matcher) Rules() []string {
	out := make([]string, len(m.progs))
	for i, p := range m.progs {
		out[i] = p.name
	}
	return out
}

// Labels returns the labels of rule name (nil if it has none or is not
// compiled).
func (m *Matcher) Labels(name string) []string {
	for _, p := range m.progs {
		if p.name == name {
			return append([]string(nil), p.labels...)
		}
	}
	return nil
}

// group is a run of at most 64 rules whose reverse automata run as one:
// a state of the group's reverse DFA is the concatenation of its rules'
// state sets (rule k's set in words off[k]…), so one table look-up per
// token advances all of them, and a 64-bit mask per state says which of
// the rules can start a match there.
type group struct {
	rules []int // indexes into Matcher.progs, in order
	off   []int // word offset of each rule's set within a group set
	nw    int   // words per group set
}

// prepare computes the sets the DFAs are built from.
func (p *prog) prepare() {
	bit := make([]int, len(p.insts))
	for pc := range p.insts {
		bit[pc] = -1
		switch p.insts[pc].op {
		case opPred, opMatch, opEnd:
			bit[pc] = len(p.imp)
			p.imp = append(p.imp, int32(pc))
		}
	}
	nb := len(p.imp)
	p.nw = (nb + 63) / 64
	p.succ = make([]uint64, nb*p.nw)
	p.predOf = make([]int32, nb)
	p.predMask = make([]uint64, p.nw)
	p.endMask = make([]uint64, p.nw)
	p.endAccept = make([]bool, nb)
	seen := make([]uint32, len(p.insts)) // generation stamps: no clearing per closure
	gen := uint32(0)
	closure := func(dst []uint64, pc int32, begin, end bool) {
		gen++
		var walk func(pc int32)
		walk = func(pc int32) {
			for {
				if seen[pc] == gen {
					return
				}
				seen[pc] = gen
				in := &p.insts[pc]
				switch in.op {
				case opMatch, opPred:
					setBit(dst, bit[pc])
					return
				case opEnd:
					if !end {
						setBit(dst, bit[pc])
						return
					}
					pc = in.out
				case opBegin:
					if !begin {
						return
					}
					pc = in.out
				case opSplit:
					walk(in.out)
					pc = in.out1
				default: // opNop, opSave
					pc = in.out
				}
			}
		}
		walk(pc)
	}
	for b, pc := range p.imp {
		in := p.insts[pc]
		p.predOf[b] = -1
		switch in.op {
		case opMatch:
			p.matchBit = b
		case opPred:
			p.predOf[b] = in.arg
			setBit(p.predMask, b)
			closure(p.succ[b*p.nw:(b+1)*p.nw], in.out, false, false)
		case opEnd:
			setBit(p.endMask, b)
			tmp := make([]uint64, p.nw)
			closure(tmp, in.out, false, true)
			p.endAccept[b] = hasBit(tmp, p.matchBit)
			closure(p.succ[b*p.nw:(b+1)*p.nw], in.out, false, false)
		}
	}
	p.required = p.requiredPreds()
	p.startMid = make([]uint64, p.nw)
	p.startBegin = make([]uint64, p.nw)
	closure(p.startMid, p.start, false, false)
	closure(p.startBegin, p.start, true, false)
}

// requiredPreds returns the predicates without which the match
// instruction cannot be reached from the start (anchors counted as always
// passable, which can only make the list shorter).
func (p *prog) requiredPreds() []int32 {
	var out []int32
	// One search per predicate; skip the optimization for programs where
	// that would cost more than it saves.
	if len(p.imp)*len(p.insts) > 4_000_000 {
		return nil
	}
	seenPred := map[int32]bool{}
	for _, in := range p.insts {
		if in.op != opPred || seenPred[in.arg] {
			continue
		}
		q := in.arg
		seenPred[q] = true
		visited := make([]bool, len(p.insts))
		stack := []int32{p.start}
		reached := false
		for len(stack) > 0 && !reached {
			pc := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			if visited[pc] {
				continue
			}
			visited[pc] = true
			in := &p.insts[pc]
			switch in.op {
			case opMatch:
				reached = true
			case opPred:
				if in.arg != q {
					stack = append(stack, in.out)
				}
			case opSplit:
				stack = append(stack, in.out, in.out1)
			default:
				stack = append(stack, in.out)
			}
		}
		if !reached {
			out = append(out, q)
		}
	}
	return out
}

func setBit(s []uint64, b int)      { s[b/64] |= 1 << uint(b%64) }
func hasBit(s []uint64, b int) bool { return s[b/64]&(1<<uint(b%64)) != 0 }
