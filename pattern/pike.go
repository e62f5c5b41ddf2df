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
	type thread struct {
		pc   int32
		caps []int
	}
	var clist, nlist []thread
	onList := make([]int, len(p.insts)) // generation stamp per pc
	gen := 0
	var add func(list []thread, pc int32, caps []int, pos int) []thread
	add = func(list []thread, pc int32, caps []int, pos int) []thread {
		for {
			if onList[pc] == gen {
				return list
			}
			onList[pc] = gen
			in := &p.insts[pc]
			switch in.op {
			case opMatch, opPred:
				return append(list, thread{pc, caps})
			case opSplit:
				list = add(list, in.out, caps, pos)
				pc = in.out1
			case opNop:
				pc = in.out
			case opSave:
				c := make([]int, nslot)
				copy(c, caps)
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
	init := make([]int, nslot)
	for i := range init {
		init[i] = -1
	}
	gen++
	clist = add(clist, p.start, init, start)
	for pos := start; ; pos++ {
		if pos == end {
			for _, t := range clist {
				if p.insts[t.pc].op == opMatch {
					return capsToSlots(p.labels, t.caps)
				}
			}
			return map[string][2]int{}
		}
		gen++
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

func capsToSlots(labels []string, caps []int) map[string][2]int {
	out := make(map[string][2]int, len(labels))
	for k, name := range labels {
		if s, e := caps[2*k], caps[2*k+1]; s >= 0 && e >= s {
			out[name] = [2]int{s, e}
		}
	}
	return out
}
