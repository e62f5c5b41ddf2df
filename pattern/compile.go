package pattern

import (
	"fmt"
	"regexp"
	"regexp/syntax"
	"sort"
	"strings"
	"sync"

	"glossmith/grammar"
	"glossmith/internal/suggest"
)

// MaxAtoms is the largest number of distinct token tests one Matcher can
// hold. Alternatives of plain words ("a" | "an" | "the") count as one test,
// so the limit is rarely near.
const MaxAtoms = 64

// maxInsts bounds the size of one compiled rule (after inlining and
// expanding counted repetition).
const maxInsts = 20000

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

type inst struct {
	op       uint8
	arg      int32
	out      int32
	out1     int32
	reserved int32
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

// Compile compiles the named rules of rs, referenced rules inlined, into
// one Matcher. With no names it compiles every rule whose name does not
// start with "_" (helper rules, by convention).
func Compile(rs *grammar.RuleSet, names ...string) (*Matcher, error) {
	if rs == nil {
		return nil, fmt.Errorf("pattern: no rule set")
	}
	if len(names) == 0 {
		for _, r := range rs.Rules {
			if !strings.HasPrefix(r.Name, "_") {
				names = append(names, r.Name)
			}
		}
		if len(names) == 0 {
			return nil, fmt.Errorf("pattern: the rule set has no rules to match (helpers named _… are not matched on their own)")
		}
	}
	c := &compiler{rs: rs, m: &Matcher{}, atomIdx: map[string]int{}, predIdx: map[string]int{}, refFormula: map[string]*formula{}}
	for _, name := range names {
		r := rs.Rule(name)
		if r == nil {
			msg := fmt.Sprintf("pattern: no rule %q", name)
			if h := suggest.Hint(name, rs.Names()); h != "" {
				msg += " — " + h
			}
			return nil, fmt.Errorf("%s", msg)
		}
		p, err := c.compileRule(r)
		if err != nil {
			return nil, ruleError(rs, r, "%s", strings.TrimPrefix(err.Error(), "pattern: "))
		}
		c.m.progs = append(c.m.progs, p)
	}
	m := c.m
	gate, gated := &[256]bool{}, true
	for i, a := range m.atoms {
		switch {
		case a.kind == grammar.Any:
			m.anyBits |= 1 << uint(i)
		case a.direct():
			m.direct = append(m.direct, a)
			m.directBit = append(m.directBit, 1<<uint(i))
		default:
			m.fieldMask[a.field()] |= 1 << uint(i)
			if a.field() == fieldForm {
				if a.first == nil {
					gated = false
				} else {
					for b, ok := range a.first {
						gate[b] = gate[b] || ok
					}
				}
			}
		}
	}
	if gated {
		m.formGate = gate
		// The word gate also covers the direct tests, where their first
		// byte is known; a token whose first byte is outside it needs no
		// word test at all.
		words := *gate
		for _, a := range m.direct {
			switch {
			case a.fold0 != 0:
				words[a.fold0] = true
				if 'a' <= a.fold0 && a.fold0 <= 'z' {
					words[a.fold0-'a'+'A'] = true
				}
				for b := 0x80; b < 0x100; b++ { // non-ASCII letters may fold
					words[b] = true
				}
			case a.kind == grammar.WordExact && a.value != "":
				words[a.value[0]] = true
			default:
				gated = false
			}
		}
		if gated {
			m.wordGate = &words
		}
	}
	for start := 0; start < len(m.progs); start += 64 {
		g := &group{}
		for k := start; k < min(start+64, len(m.progs)); k++ {
			g.rules = append(g.rules, k)
			g.off = append(g.off, g.nw)
			g.nw += m.progs[k].nw
			m.progs[k].group, m.progs[k].off, m.progs[k].bit = len(m.groups), g.off[len(g.off)-1], k-start
		}
		m.groups = append(m.groups, g)
	}
	m.pool.New = func() any { return newScratch(m) }
	return m, nil
}

// ruleError is a problem with rule r, positioned at the rule so that
// messages say file:line:col.
func ruleError(rs *grammar.RuleSet, r *grammar.Rule, format string, args ...any) error {
	return grammar.ErrorList{{Pos: r.Pos, Msg: fmt.Sprintf(format, args...), Source: rs.SourceLine(r.Pos)}}
}

// coverError reports a rule that can match no token (it would never
// match, which is a mistake rather than a search worth running), or nil.
func coverError(rs *grammar.RuleSet, r *grammar.Rule) error {
	if grammar.CanCoverToken(rs, r.Expr) {
		return nil
	}
	what := "rule " + r.Name
	if r.Name == grammar.PatternRule && r.Pos.File == "pattern" {
		what = "the pattern"
	}
	return ruleError(rs, r, "%s can match no token, and every match covers at least one: it would never match", what)
}

// CheckRules compiles the rules that commands run — each rule of rs whose
// name does not start with "_" — as `rules check` does before any text is
// read: each alone, so that a rule too large to run or one that can match
// no token is reported at its file:line:col, then all together (as `find
// --rules` runs them), which can exceed MaxAtoms.
func CheckRules(rs *grammar.RuleSet) grammar.ErrorList {
	var errs grammar.ErrorList
	var names []string
	for _, r := range rs.Rules {
		if strings.HasPrefix(r.Name, "_") {
			continue
		}
		names = append(names, r.Name)
		err := coverError(rs, r)
		if err == nil {
			_, err = Compile(rs, r.Name)
		}
		if err != nil {
			errs = append(errs, asErrorList(err)...)
		}
	}
	if len(errs) == 0 && len(names) > 1 {
		if _, err := Compile(rs, names...); err != nil {
			errs = append(errs, asErrorList(err)...)
		}
	}
	errs.Sort()
	return errs
}

func asErrorList(err error) grammar.ErrorList {
	if el, ok := err.(grammar.ErrorList); ok {
		return el
	}
	return grammar.ErrorList{{Msg: err.Error()}}
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

// CompileStock compiles the named stock rule sets embedded in package
// grammar ("terms", "phrases", "pairs"; see grammar.StockNames), as
// Compile compiles a loaded set.
func CompileStock(names ...string) (*Matcher, error) {
	rs, err := grammar.LoadStock(names...)
	if err != nil {
		return nil, err
	}
	return Compile(rs)
}

// CompilePattern compiles a one-off pattern, such as the PATTERN argument
// of `glossmith find`; it may name rules of rs (which may be nil). The
// pattern's matches carry the rule name grammar.PatternRule. A pattern
// that can match no token (`^`) is an error.
func CompilePattern(src string, rs *grammar.RuleSet) (*Matcher, error) {
	full, err := grammar.ParsePattern(src, rs)
	if err != nil {
		return nil, err
	}
	if err := coverError(full, full.Rule(grammar.PatternRule)); err != nil {
		return nil, err
	}
	return Compile(full, grammar.PatternRule)
}

type compiler struct {
	rs      *grammar.RuleSet
	m       *Matcher
	atomIdx map[string]int
	predIdx map[string]int
	// refFormula memoizes the formula of single-token rules, shared by
	// every reference to them.
	refFormula map[string]*formula

	p      *prog
	labels map[string]int
	err    error
}

func (c *compiler) compileRule(r *grammar.Rule) (*prog, error) {
	c.p = &prog{name: r.Name}
	c.labels = map[string]int{}
	c.err = nil
	// Number the labels in written order.
	grammar.Walk(r.Expr, func(n grammar.Node) {
		if l, ok := n.(*grammar.Label); ok {
			if _, seen := c.labels[l.Name]; !seen {
				c.labels[l.Name] = len(c.p.labels)
				c.p.labels = append(c.p.labels, l.Name)
			}
		}
	})
	match := c.emit(inst{op: opMatch})
	c.p.start = c.compile(r.Expr, match, 0)
	if c.err != nil {
		return nil, c.err
	}
	c.p.prepare()
	return c.p, nil
}

func (c *compiler) emit(in inst) int32 {
	if len(c.p.insts) >= maxInsts && c.err == nil {
		c.err = fmt.Errorf("pattern: rule %s is too large once its references and counted repetitions are expanded (over %d steps)", c.p.name, maxInsts)
	}
	if c.err != nil {
		return 0
	}
	c.p.insts = append(c.p.insts, in)
	return int32(len(c.p.insts) - 1)
}

// compile emits n so that it continues at next and returns its entry. depth
// counts the rule references followed; labels count only at depth 0 (a
// referenced rule's labels belong to that rule).
func (c *compiler) compile(n grammar.Node, next int32, depth int) int32 {
	if c.err != nil {
		return 0
	}
	if depth > 100 {
		c.err = fmt.Errorf("pattern: rule %s: references nested too deep", c.p.name)
		return 0
	}
	if f := c.tokenFormula(n); f != nil {
		if c.err != nil {
			return 0
		}
		return c.emit(inst{op: opPred, arg: int32(c.pred(f)), out: next})
	}
	switch n := n.(type) {
	case *grammar.Seq:
		for i := len(n.Items) - 1; i >= 0; i-- {
			next = c.compile(n.Items[i], next, depth)
		}
		return next
	case *grammar.Alt:
		entries := make([]int32, len(n.Alts))
		for i, a := range n.Alts {
			entries[i] = c.compile(a, next, depth)
		}
		e := entries[len(entries)-1]
		for i := len(entries) - 2; i >= 0; i-- {
			e = c.emit(inst{op: opSplit, out: entries[i], out1: e})
		}
		return e
	case *grammar.Repeat:
		tail := next
		if n.Max < 0 {
			loop := c.emit(inst{op: opSplit, out1: next})
			body := c.compile(n.Sub, loop, depth)
			if c.err == nil {
				c.p.insts[loop].out = body
			}
			tail = loop
		} else {
			for k := 0; k < n.Max-n.Min; k++ {
				body := c.compile(n.Sub, tail, depth)
				tail = c.emit(inst{op: opSplit, out: body, out1: next})
			}
		}
		for k := 0; k < n.Min; k++ {
			tail = c.compile(n.Sub, tail, depth)
		}
		return tail
	case *grammar.Label:
		if depth > 0 {
			return c.compile(n.Sub, next, depth)
		}
		k := c.labels[n.Name]
		end := c.emit(inst{op: opSave, arg: int32(2*k + 1), out: next})
		body := c.compile(n.Sub, end, depth)
		return c.emit(inst{op: opSave, arg: int32(2 * k), out: body})
	case *grammar.Anchor:
		if n.End {
			return c.emit(inst{op: opEnd, out: next})
		}
		return c.emit(inst{op: opBegin, out: next})
	case *grammar.Ref:
		r := c.rs.Rule(n.Name)
		if r == nil {
			c.err = fmt.Errorf("pattern: rule %s refers to undefined rule %s", c.p.name, n.Name)
			return 0
		}
		return c.compile(r.Expr, next, depth+1)
	}
	c.err = fmt.Errorf("pattern: %s: cannot compile %s", n.Position(), grammar.Format(n))
	return 0
}

// tokenFormula returns the formula of n when n is a test about exactly one
// token (tests, !, & and alternatives of such, through references), or nil.
func (c *compiler) tokenFormula(n grammar.Node) *formula {
	if !grammar.IsSingleToken(c.rs, n) {
		return nil
	}
	return c.formula(n, 0)
}

func (c *compiler) formula(n grammar.Node, depth int) *formula {
	if depth > 100 {
		return &formula{op: 't'}
	}
	switch n := n.(type) {
	case *grammar.Test:
		if n.Kind == grammar.Any {
			return &formula{op: 't'}
		}
		return &formula{op: 'a', atom: c.atom(newAtom(n))}
	case *grammar.Not:
		return &formula{op: '!', subs: []*formula{c.formula(n.Sub, depth)}}
	case *grammar.And:
		f := &formula{op: '&'}
		for _, s := range n.Subs {
			f.subs = append(f.subs, c.formula(s, depth))
		}
		return f
	case *grammar.Alt:
		f := &formula{op: '|'}
		// Plain words (and plain lemmas) of one alternation become one set
		// test, evaluated with one look-up.
		var words, lemmas []string
		var rest []grammar.Node
		for _, a := range n.Alts {
			if t, ok := a.(*grammar.Test); ok && t.Kind == grammar.Word {
				words = append(words, t.Value)
			} else if ok && t.Kind == grammar.Lemma {
				lemmas = append(lemmas, t.Value)
			} else {
				rest = append(rest, a)
			}
		}
		for _, set := range []struct {
			kind  grammar.TestKind
			items []string
		}{{grammar.Word, words}, {grammar.Lemma, lemmas}} {
			switch len(set.items) {
			case 0:
			case 1:
				f.subs = append(f.subs, &formula{op: 'a', atom: c.atom(newAtom(&grammar.Test{Kind: set.kind, Value: set.items[0]}))})
			default:
				f.subs = append(f.subs, &formula{op: 'a', atom: c.atom(newSetAtom(set.kind, set.items))})
			}
		}
		for _, s := range rest {
			f.subs = append(f.subs, c.formula(s, depth))
		}
		return f
	case *grammar.Ref:
		if f, ok := c.refFormula[n.Name]; ok {
			return f
		}
		f := c.formula(c.rs.Rule(n.Name).Expr, depth+1)
		c.refFormula[n.Name] = f
		return f
	}
	return &formula{op: 't'}
}

func (c *compiler) atom(a *atom) int {
	k := a.key
	if i, ok := c.atomIdx[k]; ok {
		return i
	}
	if len(c.m.atoms) >= MaxAtoms {
		if c.err == nil {
			c.err = fmt.Errorf("pattern: more than %d distinct token tests in the rules compiled together; compile fewer rules at once", MaxAtoms)
		}
		return 0
	}
	c.atomIdx[k] = len(c.m.atoms)
	c.m.atoms = append(c.m.atoms, a)
	return len(c.m.atoms) - 1
}

func (c *compiler) pred(f *formula) int {
	k := f.key()
	if i, ok := c.predIdx[k]; ok {
		return i
	}
	c.predIdx[k] = len(c.m.preds)
	c.m.preds = append(c.m.preds, f)
	return len(c.m.preds) - 1
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

// firstBytes returns, for a regular expression that can only match text
// starting with one of a known set of bytes at the very start, that set;
// otherwise nil. It lets the matcher skip the regular expression for most
// words ("/^[A-Z]{2,6}s?$/" is tried only on words starting with a capital).
func firstBytes(re *regexp.Regexp) *[256]bool {
	t, err := syntax.Parse(re.String(), syntax.Perl)
	if err != nil {
		return nil
	}
	t = t.Simplify()
	if t.Op != syntax.OpConcat || len(t.Sub) < 2 || t.Sub[0].Op != syntax.OpBeginText {
		return nil
	}
	var set [256]bool
	if !firstOf(&syntax.Regexp{Op: syntax.OpConcat, Sub: t.Sub[1:]}, &set) {
		return nil
	}
	return &set
}

// firstOf adds to set every byte a match of t can start with and reports
// whether t surely consumes at least one character (otherwise the set
// says nothing).
func firstOf(t *syntax.Regexp, set *[256]bool) bool {
	switch t.Op {
	case syntax.OpLiteral:
		if len(t.Rune) == 0 || t.Flags&syntax.FoldCase != 0 || t.Rune[0] >= 0x80 {
			return false
		}
		set[t.Rune[0]] = true
		return true
	case syntax.OpCharClass:
		for i := 0; i+1 < len(t.Rune); i += 2 {
			lo, hi := t.Rune[i], t.Rune[i+1]
			if hi >= 0x80 {
				for b := 0xC0; b < 0x100; b++ { // any UTF-8 lead byte
					set[b] = true
				}
				hi = 0x7F
			}
			for r := lo; r <= hi; r++ {
				set[r] = true
			}
		}
		return len(t.Rune) > 0
	case syntax.OpCapture, syntax.OpPlus:
		return firstOf(t.Sub[0], set)
	case syntax.OpRepeat:
		return t.Min >= 1 && firstOf(t.Sub[0], set)
	case syntax.OpConcat:
		return len(t.Sub) > 0 && firstOf(t.Sub[0], set)
	case syntax.OpAlternate:
		for _, s := range t.Sub {
			if !firstOf(s, set) {
				return false
			}
		}
		return true
	}
	return false
}

// sortedKeys is used for stable set atoms.
func sortedKeys(items []string) []string {
	s := append([]string(nil), items...)
	sort.Strings(s)
	out := s[:0]
	for i, x := range s {
		if i == 0 || x != s[i-1] {
			out = append(out, x)
		}
	}
	return out
}
