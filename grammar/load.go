package grammar

import (
	"embed"
	"fmt"
	"glossmith/internal/suggest"
	"io/fs"
	"maps"
	"os"
	"path"
	"path/filepath"
	"slices"
	"sort"
	"strings"
)

//go:embed stock/*.gsr
var stockFS embed.FS

// StockNames returns the names of the built-in rule sets, sorted.
func StockNames() []string {
	ents, _ := fs.ReadDir(stockFS, "stock")
	var out []string
	for _, e := range ents {
		if n, ok := strings.CutSuffix(e.Name(), ".gsr"); ok {
			out = append(out, n)
		}
	}
	sort.Strings(out)
	return out
}

// Stock parses the built-in rule set called name (its `use` statements are
// not resolved; see LoadStock).
func Stock(name string) (*File, error) {
	b, err := stockFS.ReadFile("stock/" + name + ".gsr")
	if err != nil {
		msg := fmt.Sprintf("no stock rule set %q (have: %s)", name, strings.Join(StockNames(), ", "))
		if h := suggest.Hint(name, StockNames()); h != "" {
			msg = fmt.Sprintf("no stock rule set %q — %s", name, h)
		}
		return nil, fmt.Errorf("%s", msg)
	}
	return ParseString("stock/"+name+".gsr", string(b))
}

// RuleSet is a checked set of rules: every file loaded, every `use`
// resolved, every rule reference defined and free of cycles.
type RuleSet struct {
	// Rules in load order: a used file's rules come at the place of its
	// first `use`, then the rules of the using file.
	Rules []*Rule
	// Files in the same order; each file appears once however often used.
	Files []*File

	byName map[string]*Rule
	single map[string]bool // rule name -> IsSingleToken of its body
}

// Rule returns the rule called name, or nil.
func (rs *RuleSet) Rule(name string) *Rule { return rs.byName[name] }

// Names returns the rule names in order.
func (rs *RuleSet) Names() []string {
	out := make([]string, len(rs.Rules))
	for i, r := range rs.Rules {
		out[i] = r.Name
	}
	return out
}

// Examples returns every expect/reject example of the set, in file order.
func (rs *RuleSet) Examples() []*Example {
	var out []*Example
	for _, f := range rs.Files {
		out = append(out, f.Examples...)
	}
	return out
}

// Load reads the rule files at paths, resolves their `use` statements and
// checks the whole set. A path of the form "stock:NAME" loads the built-in
// set NAME instead of a file. The error, when not nil, is an ErrorList
// holding every problem found (the RuleSet is then nil); a file that cannot
// be read is one of its entries.
func Load(paths ...string) (*RuleSet, error) {
	l := newLoader()
	for _, p := range paths {
		if name, ok := strings.CutPrefix(p, "stock:"); ok {
			l.loadStock(name, nil)
			continue
		}
		l.loadDisk(p, nil)
	}
	return l.finish()
}

// LoadStock loads built-in rule sets by name.
func LoadStock(names ...string) (*RuleSet, error) {
	l := newLoader()
	for _, n := range names {
		l.loadStock(n, nil)
	}
	return l.finish()
}

// LoadFiles resolves and checks already parsed files; a `use "path"` in a
// file is read from disk relative to that file's Name.
func LoadFiles(files ...*File) (*RuleSet, error) {
	l := newLoader()
	for _, f := range files {
		l.add(fileKey(f.Name), f)
	}
	return l.finish()
}

type loader struct {
	rs      *RuleSet
	errs    ErrorList
	done    map[string]bool
	onStack []string // keys
	names   []string // display names, parallel to onStack
}

func newLoader() *loader {
	return &loader{rs: &RuleSet{byName: map[string]*Rule{}}, done: map[string]bool{}}
}

func fileKey(name string) string {
	if strings.HasPrefix(name, "stock/") && !fileExists(name) {
		return "stock:" + name
	}
	abs, err := filepath.Abs(name)
	if err != nil {
		abs = name
	}
	return "file:" + filepath.Clean(abs)
}

func fileExists(p string) bool { _, err := os.Stat(p); return err == nil }

// useError records a problem with a use statement (or with a top-level
// name when from is nil).
func (l *loader) useError(from *File, u *Use, format string, args ...any) {
	if from == nil || u == nil {
		l.errs = append(l.errs, &Error{Msg: fmt.Sprintf(format, args...)})
		return
	}
	from.lines.errorf(&l.errs, u.Pos.Offset, format, args...)
}

// enter reports a cycle or a file already loaded; it returns false when the
// file must not be loaded again.
func (l *loader) enter(key, name string, from *File, u *Use) bool {
	for i, k := range l.onStack {
		if k == key {
			chain := append(append([]string{}, l.names[i:]...), name)
			l.useError(from, u, "use cycle: %s", strings.Join(chain, " → "))
			return false
		}
	}
	return !l.done[key]
}

func (l *loader) loadDisk(p string, from *File) {
	l.loadDiskUse(p, from, nil)
}

func (l *loader) loadDiskUse(p string, from *File, u *Use) {
	key := fileKey(p)
	if !l.enter(key, p, from, u) {
		return
	}
	// Only rule files are read: a mistyped or hostile name (a device, a
	// file of secrets) is refused by its name, before a byte of it is read,
	// so that no message can quote it.
	if !IsRuleFileName(p) {
		if from == nil {
			l.errs = append(l.errs, &Error{Pos: Pos{File: p}, Msg: "not a rule file: rule file names end in " + RuleFileExt})
		} else {
			l.useError(from, u, "use reads only rule files, whose names end in %s: %s", RuleFileExt, u.Path)
		}
		return
	}
	b, err := readRuleFile(p)
	if err != nil {
		if from == nil {
			l.errs = append(l.errs, &Error{Pos: Pos{File: p}, Msg: fmt.Sprintf("cannot read rule file: %v", unwrapPathError(err))})
		} else {
			l.useError(from, u, "cannot read used file %s: %v", p, unwrapPathError(err))
		}
		return
	}
	f, perr := ParseString(p, string(b))
	l.addParsed(key, f, perr)
}

// RuleFileExt ends the name of every rule file.
const RuleFileExt = ".gsr"

// IsRuleFileName reports whether name is a rule file's name: it ends in
// RuleFileExt (in any case).
func IsRuleFileName(name string) bool {
	return strings.EqualFold(filepath.Ext(name), RuleFileExt)
}

func unwrapPathError(err error) error {
	if pe, ok := err.(*fs.PathError); ok {
		return pe.Err
	}
	return err
}

func (l *loader) loadStock(name string, from *File) {
	l.loadStockUse(name, from, nil)
}

func (l *loader) loadStockUse(name string, from *File, u *Use) {
	key := "stock:stock/" + name + ".gsr"
	if !l.enter(key, "stock "+name, from, u) {
		return
	}
	f, err := Stock(name)
	if f == nil {
		if from == nil {
			l.errs = append(l.errs, &Error{Msg: err.Error()})
		} else {
			l.useError(from, u, "%v", err)
		}
		return
	}
	l.addParsed(key, f, err)
}

func (l *loader) addParsed(key string, f *File, perr error) {
	if el, ok := perr.(ErrorList); ok {
		l.errs = append(l.errs, el...)
	}
	l.add(key, f)
}

// add resolves f's uses (depth first) and then takes its rules.
func (l *loader) add(key string, f *File) {
	if l.done[key] {
		return
	}
	l.onStack = append(l.onStack, key)
	l.names = append(l.names, f.Name)
	for _, u := range f.Uses {
		switch {
		case u.Stock != "":
			l.loadStockUse(u.Stock, f, u)
		case strings.HasPrefix(key, "stock:"):
			// A stock set may use its siblings by file name.
			l.loadStockUse(strings.TrimSuffix(path.Base(u.Path), ".gsr"), f, u)
		default:
			p := u.Path
			if !filepath.IsAbs(p) {
				p = filepath.Join(filepath.Dir(f.Name), p)
			}
			l.loadDiskUse(p, f, u)
		}
	}
	l.onStack = l.onStack[:len(l.onStack)-1]
	l.names = l.names[:len(l.names)-1]
	l.done[key] = true
	l.rs.Files = append(l.rs.Files, f)
	for _, r := range f.Rules {
		if prev := l.rs.byName[r.Name]; prev != nil {
			f.lines.errorf(&l.errs, r.Pos.Offset, "rule %s is defined twice (first at %s)", r.Name, prev.Pos)
			continue
		}
		l.rs.byName[r.Name] = r
		l.rs.Rules = append(l.rs.Rules, r)
	}
}

func (l *loader) finish() (*RuleSet, error) {
	l.check()
	if len(l.errs) > 0 {
		l.errs.Sort()
		return nil, l.errs
	}
	return l.rs, nil
}

// fileOf finds the file a position belongs to, for quoting source lines.
func (l *loader) fileOf(p Pos) *File {
	for _, f := range l.rs.Files {
		if f.Name == p.File {
			return f
		}
	}
	return nil
}

func (l *loader) errorAt(p Pos, format string, args ...any) {
	src := ""
	if f := l.fileOf(p); f != nil {
		src = f.lines.line(p.Line)
	}
	l.errs.Add(p, src, format, args...)
}

// check runs the checks that need the whole set: references, cycles,
// single-token operands of & and !, examples naming rules.
func (l *loader) check() {
	rs := l.rs
	candidates := append([]string{}, UPOSTags...)
	for name := range rs.byName {
		candidates = append(candidates, name)
	}
	sort.Strings(candidates[len(UPOSTags):])
	for _, r := range rs.Rules {
		Walk(r.Expr, func(n Node) {
			ref, ok := n.(*Ref)
			if !ok || rs.byName[ref.Name] != nil {
				return
			}
			what := "undefined rule " + ref.Name
			if looksLikeTag(ref.Name) {
				what = "unknown tag " + ref.Name
			}
			if h := suggest.Hint(ref.Name, candidates); h != "" {
				l.errorAt(ref.Pos, "%s — %s", what, h)
			} else if looksLikeTag(ref.Name) {
				l.errorAt(ref.Pos, "%s (UPOS tags: %s)", what, strings.Join(UPOSTags, " "))
			} else {
				// Most often a word meant to be matched, written bare.
				l.errorAt(ref.Pos, "%s — to match the word, quote it: %q", what, ref.Name)
			}
		})
	}
	l.checkCycles()
	rs.computeSingle()
	for _, r := range rs.Rules {
		l.checkTokenOperands(r.Expr)
	}
	for _, f := range rs.Files {
		for _, ex := range f.Examples {
			r := rs.byName[ex.Rule]
			if r == nil {
				msg := "example for undefined rule " + ex.Rule
				if h := suggest.Hint(ex.Rule, rs.Names()); h != "" {
					msg += " — " + h
				}
				l.errorAt(ex.Pos, "%s", msg)
				continue
			}
			r.Examples = append(r.Examples, ex)
		}
	}
}

// checkCycles reports every rule that refers to itself, directly or not.
func (l *loader) checkCycles() {
	const (
		unseen = iota
		active
		finished
	)
	state := map[string]int{}
	var stack []string
	var visit func(r *Rule)
	visit = func(r *Rule) {
		state[r.Name] = active
		stack = append(stack, r.Name)
		Walk(r.Expr, func(n Node) {
			ref, ok := n.(*Ref)
			if !ok {
				return
			}
			next := l.rs.byName[ref.Name]
			if next == nil {
				return
			}
			switch state[next.Name] {
			case active:
				i := len(stack) - 1
				for stack[i] != next.Name {
					i--
				}
				chain := append(append([]string{}, stack[i:]...), next.Name)
				l.errorAt(ref.Pos, "rule cycle: %s (a rule cannot contain itself)", strings.Join(chain, " → "))
			case unseen:
				visit(next)
			}
		})
		stack = stack[:len(stack)-1]
		state[r.Name] = finished
	}
	for _, r := range l.rs.Rules {
		if state[r.Name] == unseen {
			visit(r)
		}
	}
}

// checkTokenOperands reports operands of & and ! that can match more (or
// less) than exactly one token.
func (l *loader) checkTokenOperands(n Node) {
	Walk(n, func(n Node) {
		var ops []Node
		switch n := n.(type) {
		case *And:
			ops = n.Subs
		case *Not:
			ops = []Node{n.Sub}
		default:
			return
		}
		for _, op := range ops {
			if !IsSingleToken(l.rs, op) {
				l.errorAt(op.Position(), "& and ! combine tests of one token; this operand can match a sequence, a repetition or an anchor")
			}
		}
	})
}

// IsSingleToken reports whether n always matches exactly one token and is
// built only of token tests, !, & and | (following references in rs). Such
// a node is one test about one token, which & and ! require.
func IsSingleToken(rs *RuleSet, n Node) bool {
	if rs.single == nil {
		rs.computeSingle()
	}
	return rs.isSingle(n, nil)
}

// computeSingle records for every rule whether it is a single-token test,
// so that IsSingleToken answers for a reference with one look-up (without
// the memo, rules built of references to references would take
// exponential time).
func (rs *RuleSet) computeSingle() {
	rs.single = make(map[string]bool, len(rs.byName))
	for _, name := range slices.Sorted(maps.Keys(rs.byName)) {
		rs.isSingle(&Ref{Name: name}, map[string]bool{})
	}
}

func (rs *RuleSet) isSingle(n Node, seen map[string]bool) bool {
	switch n := n.(type) {
	case *Test:
		return true
	case *Not:
		return rs.isSingle(n.Sub, seen)
	case *And:
		for _, s := range n.Subs {
			if !rs.isSingle(s, seen) {
				return false
			}
		}
		return true
	case *Alt:
		for _, s := range n.Alts {
			if !rs.isSingle(s, seen) {
				return false
			}
		}
		return true
	case *Ref:
		if v, ok := rs.single[n.Name]; ok {
			return v
		}
		r := rs.byName[n.Name]
		if r == nil || seen == nil || seen[n.Name] {
			return true // undefined or cyclic: reported elsewhere
		}
		seen[n.Name] = true
		v := rs.isSingle(r.Expr, seen)
		delete(seen, n.Name)
		rs.single[n.Name] = v
		return v
	}
	return false
}

// CanCoverToken reports whether n can match a span of at least one token,
// following references in rs. A rule that cannot (`^`, `^ $`, `NOUN{0}`)
// never matches anything, since every match covers at least one token;
// pattern.Compile refuses such a rule.
func CanCoverToken(rs *RuleSet, n Node) bool {
	return rs.covers(n, map[string]bool{}, map[string]bool{})
}

// covers answers CanCoverToken; memo holds the answers for rules, active
// the rules being visited (a cycle is reported elsewhere: it counts as
// covering).
func (rs *RuleSet) covers(n Node, memo, active map[string]bool) bool {
	switch n := n.(type) {
	case *Test, *Not, *And:
		return true
	case *Seq:
		for _, it := range n.Items {
			if rs.covers(it, memo, active) {
				return true
			}
		}
	case *Alt:
		for _, a := range n.Alts {
			if rs.covers(a, memo, active) {
				return true
			}
		}
	case *Repeat:
		return n.Max != 0 && rs.covers(n.Sub, memo, active)
	case *Label:
		return rs.covers(n.Sub, memo, active)
	case *Ref:
		if v, ok := memo[n.Name]; ok {
			return v
		}
		r := rs.byName[n.Name]
		if r == nil || active[n.Name] {
			return true // undefined or cyclic: reported elsewhere
		}
		active[n.Name] = true
		v := rs.covers(r.Expr, memo, active)
		delete(active, n.Name)
		memo[n.Name] = v
		return v
	}
	return false
}

// PatternRule is the name ParsePattern gives to a one-off pattern.
const PatternRule = "pattern"

// ParsePattern parses src, a rule body written on the command line (as in
// `NOUN "of" term`), as a rule called PatternRule that may refer to the
// rules of base (which may be nil). It returns a new set holding base's
// rules and the pattern; base is not changed. Positions, of errors and of
// the pattern's nodes, are in a file called "pattern" whose one line is
// src.
func ParsePattern(src string, base *RuleSet) (*RuleSet, error) {
	f := &File{Name: "pattern", Src: src, lines: newLineTable("pattern", src)}
	start := Pos{File: "pattern", Line: 1, Col: 1}
	if strings.ContainsAny(src, "\n\r") {
		return nil, ErrorList{{Pos: start, Msg: "a pattern is one line", Source: firstLine(src)}}
	}
	var errs ErrorList
	if strings.TrimSpace(src) == "" {
		errs.Add(start, src, "empty pattern: give a rule body, as in 'ADJ* NOUN'")
		return nil, errs
	}
	r := &Rule{Name: PatternRule, Pos: start}
	if off, msg := checkNesting(f.Name, src); msg != "" {
		f.lines.errorf(&errs, off, "%s", msg)
		return nil, errs
	}
	pp, err := patternParser.ParseString(f.Name, src)
	if err != nil {
		f.lines.errorf(&errs, errorOffset(err, len(src)), "%s", parseMessage(err, true))
		return nil, errs
	}
	c := converter{f: f, errs: &errs}
	r.Expr = c.alt(pp.Body)
	r.End = f.lines.pos(len(src))
	f.Rules = []*Rule{r}
	f.checkLocal(&errs)
	if len(errs) > 0 {
		errs.Sort()
		return nil, errs
	}
	l := newLoader()
	if base != nil {
		l.rs.Rules = append(l.rs.Rules, base.Rules...)
		l.rs.Files = append(l.rs.Files, base.Files...)
		for _, r := range base.Rules {
			l.rs.byName[r.Name] = r
		}
		for _, f := range base.Files {
			l.done[fileKey(f.Name)] = true
		}
	}
	if l.rs.byName[PatternRule] != nil {
		return nil, ErrorList{{Pos: start, Msg: "the rule set already has a rule called " + PatternRule, Source: src}}
	}
	l.add("pattern:", f)
	// The base set was checked when it was loaded; check only the pattern.
	return l.finishOnly(f)
}

func firstLine(s string) string {
	if i := strings.IndexAny(s, "\r\n"); i >= 0 {
		return s[:i]
	}
	return s
}

// finishOnly checks only the rules of f against the whole set.
func (l *loader) finishOnly(f *File) (*RuleSet, error) {
	full := l.rs
	sub := &RuleSet{Rules: f.Rules, Files: []*File{f}, byName: full.byName}
	l.rs = sub
	l.check()
	l.rs = full
	full.computeSingle()
	if len(l.errs) > 0 {
		l.errs.Sort()
		return nil, l.errs
	}
	return full, nil
}

// Line returns the text of 1-based line n of the file, without its line
// ending ("" when out of range).
func (f *File) Line(n int) string {
	if f.lines == nil {
		f.lines = newLineTable(f.Name, f.Src)
	}
	return f.lines.line(n)
}

// SourceLine returns the source line a position points at, when the
// position is in one of the set's files.
func (rs *RuleSet) SourceLine(p Pos) string {
	for _, f := range rs.Files {
		if f.Name == p.File {
			return f.Line(p.Line)
		}
	}
	return ""
}
