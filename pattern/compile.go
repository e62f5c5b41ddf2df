package pattern

import (
	"fmt"
	"strings"

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
