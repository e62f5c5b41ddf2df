package pattern

// slots recovers the labels of a match [start,end) by running a Pike VM
// (a Thompson NFA simulation that carries capture positions) over the
// matched tokens only. Threads are kept in priority order — alternatives in
// written order, repetitions greedy — and the first thread that reaches
// the match instruction exactly at end wins. So when a span can be parsed
// in several ways, the labels come from the parse that a backtracking
// matcher trying alternatives left to right and repeating as often as it
// can would find first among the parses of exactly that span.
func (sc *scratch) slots(p *prog, n, start, end int) map[string][2]int {
	nslot := 2 * len(p.labels)
	// Capture arrays are cut from one arena per call: threads live only
	// while this call runs, so nothing here needs its own allocation.
	arena := sc.pikeArena[:0]
	newCaps := func(from []int) []int {
		k := len(arena)
		arena = append(arena, from...)
		return arena[k : k+nslot : k+nslot]
	}
	defer func() { sc.pikeArena = arena[:0] }()
	clist, nlist := sc.pikeList[0][:0], sc.pikeList[1][:0]
	defer func() { sc.pikeList[0], sc.pikeList[1] = clist[:0], nlist[:0] }()
	if len(sc.pikeSeen) < len(p.insts) {
		sc.pikeSeen = make([]uint32, len(p.insts))
		sc.pikeGen = 0
	}
	onList := sc.pikeSeen // generation stamp per pc
	var add func(list []pikeThread, pc int32, caps []int, pos int) []pikeThread
	add = func(list []pikeThread, pc int32, caps []int, pos int) []pikeThread {
		for {
			if onList[pc] == sc.pikeGen {
				return list
			}
			onList[pc] = sc.pikeGen
			in := &p.insts[pc]
			switch in.op {
			case opMatch, opPred:
				return append(list, pikeThread{pc, caps})
			case opSplit:
				list = add(list, in.out, caps, pos)
				pc = in.out1
			case opNop:
				pc = in.out
			case opSave:
				c := newCaps(caps)
				c[in.arg] = pos
				caps = c
				pc = in.out
			case opBegin:
				if pos != 0 {
					return list
				}
				pc = in.out
			case opEnd:
				if pos != n {
					return list
				}
				pc = in.out
			default:
				return list
			}
		}
	}
	none := newCaps(make([]int, nslot))
	for i := range none {
		none[i] = -1
	}
	sc.nextPikeGen()
	clist = add(clist, p.start, none, start)
	for pos := start; ; pos++ {
		if pos == end {
			for _, t := range clist {
				if p.insts[t.pc].op == opMatch {
					return capsToSlots(p.labels, t.caps)
				}
			}
			return map[string][2]int{}
		}
		sc.nextPikeGen()
		nlist = nlist[:0]
		preds := sc.classes[sc.cls[pos]].preds
		for _, t := range clist {
			in := &p.insts[t.pc]
			if in.op == opPred && hasBit(preds, int(in.arg)) {
				nlist = add(nlist, in.out, t.caps, pos+1)
			}
		}
		clist, nlist = nlist, clist
		if len(clist) == 0 {
			return map[string][2]int{}
		}
	}
}

type pikeThread struct {
	pc   int32
	caps []int
}

// nextPikeGen starts a new step: stamps from earlier steps no longer count.
func (sc *scratch) nextPikeGen() {
	sc.pikeGen++
	if sc.pikeGen == 0 { // wrapped: old stamps could collide
		clear(sc.pikeSeen)
		sc.pikeGen = 1
	}
}

func capsToSlots(labels []string, caps []int) map[string][2]int {
	out := make(map[string][2]int, len(labels))
	for k, name := range labels {
		if s, e := caps[2*k], caps[2*k+1]; s >= 0 && e >= s {
			out[name] = [2]int{s, e}
		}
	}
	return out
}
