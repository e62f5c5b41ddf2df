package check

import (
	"cmp"
	"fmt"
	"iter"
	"slices"
	"strings"
)

// Report gathers the documents' results in input order and, at the end,
// works out the mixed spellings, which need every document.
type Report struct {
	glossary *Matcher
	docs     []string
	// findings are each document's glossary findings, sorted, kept compact
	// until they are written: a large corpus has hundreds of thousands.
	findings [][]keptFinding
	strs     interned
	// The variant groups (--variants), their spellings over all documents,
	// and each document's uses of them, kept as compact as the findings:
	// a large corpus has a use for nearly every candidate of every
	// document, and only the groups spelled more than one way, known at
	// the end, make findings.
	groups    map[string]int32 // group key → index in groupList
	groupList []mixedGroup     // in order of first use
	spells    []mixedSpelling
	uses      [][]docUse // per document
	scratch   []docUse
	// Suppressed counts the glossary findings left out (code, addresses,
	// silenced lines).
	Suppressed int
}

// mixedGroup is a variant group: its key and its spellings, a list
// through spells in order of first use.
type mixedGroup struct {
	key         string
	first, last int32 // spells
	n           int32 // spellings
}

// mixedSpelling is one spelling of a group over all documents.
type mixedSpelling struct {
	spelling, lower string
	group, next     int32 // next: the group's next spelling, or -1
	total           int
}

// docUse is a spelling's count in one document and its first use there.
type docUse struct {
	spell, n                   int32
	line, col, endLine, endCol int32
	text                       int32 // in the report's string table
}

// NewReport starts a report. g is the glossary the documents were checked
// against (nil if none): variant groups whose key is a glossary term's are
// left to the glossary findings.
func NewReport(g *Matcher) *Report {
	return &Report{glossary: g, groups: map[string]int32{}}
}

// Add takes one document's result; call it in input order.
func (r *Report) Add(res *DocResult) {
	r.docs = append(r.docs, res.Name)
	sortFindings(res.Findings)
	var kept []keptFinding
	if len(res.Findings) > 0 {
		kept = make([]keptFinding, len(res.Findings))
		for i := range res.Findings {
			kept[i] = r.keep(&res.Findings[i])
		}
	}
	r.findings = append(r.findings, kept)
	r.Suppressed += res.Suppressed
	uses := r.scratch[:0]
	for _, s := range res.spellings {
		if r.glossary != nil && r.glossary.hasKey(s.key) {
			continue
		}
		gi, ok := r.groups[s.key]
		if !ok {
			gi = int32(len(r.groupList))
			g := mixedGroup{key: strings.Clone(s.key), first: -1, last: -1}
			r.groupList = append(r.groupList, g)
			r.groups[g.key] = gi
		}
		g := &r.groupList[gi]
		lower := strings.ToLower(s.spelling)
		si := g.first
		for si >= 0 && r.spells[si].lower != lower {
			si = r.spells[si].next
		}
		if si < 0 {
			si = int32(len(r.spells))
			r.spells = append(r.spells, mixedSpelling{spelling: strings.Clone(s.spelling), lower: strings.Clone(lower), group: gi, next: -1})
			if g.last >= 0 {
				r.spells[g.last].next = si
			} else {
				g.first = si
			}
			g.last = si
			g.n++
		}
		r.spells[si].total += s.n
		uses = append(uses, docUse{spell: si, n: int32(s.n), line: s.line, col: s.col,
			endLine: s.endLine, endCol: s.endCol, text: r.strs.id(s.text)})
	}
	r.scratch = uses
	if len(uses) == 0 {
		r.uses = append(r.uses, nil)
		return
	}
	r.uses = append(r.uses, slices.Clone(uses)) // no room to spare: there is one a document
}

// hasKey reports whether a form of the glossary has the key (as appendKey
// makes it).
func (m *Matcher) hasKey(key string) bool {
	n := int32(0)
	for i := 0; i < len(key) && n >= 0; i++ {
		n = m.child(n, key[i])
	}
	return n >= 0 && m.nodes[n].final != 0
}

// keptFinding is a glossary finding as a report keeps it: positions, and
// its strings as indexes into the report's table of distinct strings. The
// texts, messages, terms and entries of a large run repeat (99,227
// findings of 500 benchmark documents have 3,243 distinct messages), and
// a text kept as found would hold on to its document's whole text.
type keptFinding struct {
	line, col, endLine, endCol      int32
	text, preferred, entry, message int32
	kind                            Kind
}

// interned is a table of distinct strings, each held once.
type interned struct {
	index map[string]int32
	strs  []string
}

// id returns s's index in the table, adding a copy of s when it is new.
func (t *interned) id(s string) int32 {
	if i, ok := t.index[s]; ok {
		return i
	}
	if t.index == nil {
		t.index = map[string]int32{}
	}
	s = strings.Clone(s)
	i := int32(len(t.strs))
	t.strs = append(t.strs, s)
	t.index[s] = i
	return i
}

func (r *Report) keep(f *Finding) keptFinding {
	return keptFinding{
		line: int32(f.Line), col: int32(f.Column), endLine: int32(f.EndLine), endCol: int32(f.EndColumn),
		text: r.strs.id(f.Text), preferred: r.strs.id(f.Preferred), entry: r.strs.id(f.Entry),
		message: r.strs.id(f.Message), kind: f.Kind,
	}
}

// finding turns a kept finding of document di back into a Finding (whose
// Start and End, offsets in a text no longer held, are 0).
func (r *Report) finding(di int, k *keptFinding) Finding {
	s := r.strs.strs
	return Finding{File: r.docs[di], Line: int(k.line), Column: int(k.col), EndLine: int(k.endLine), EndColumn: int(k.endCol),
		Text: s[k.text], Kind: k.kind, Preferred: s[k.preferred], Entry: s[k.entry], Message: s[k.message]}
}

// Findings returns every finding, in the order of All.
func (r *Report) Findings() []Finding { return slices.Collect(r.All()) }

// All yields every finding: per document in input order, the glossary's
// and the mixed spellings', by position. A mixed finding is made for each
// document and each spelling it uses that is not the group's majority
// spelling over all documents, at its first use there; its message gives
// the group's counts in that document and in all. One document's findings
// are made at a time, so that a writer streaming them holds no more.
func (r *Report) All() iter.Seq[Finding] {
	return func(yield func(Finding) bool) {
		mx := r.mixed()
		var fs []Finding
		for di, kept := range r.findings {
			fs = fs[:0]
			for k := range kept {
				fs = append(fs, r.finding(di, &kept[k]))
			}
			if mx.add(r, di, &fs) > 0 {
				sortFindings(fs)
				fs = dropCovering(fs)
			}
			for _, f := range fs {
				if !yield(f) {
					return
				}
			}
		}
	}
}

// mixedGroups is what the mixed findings need of the variant groups
// spelled more than one way, worked out once over all documents: each
// spelling's rank by total (0 the majority; -1 for a group spelled one
// way) and each such group's summary over all documents.
type mixedGroups struct {
	rank  []int32  // by spelling
	major []int32  // by group: its majority spelling
	inAll []string // by group: "in N document(s) a 5, b 2"
	sel   []int    // scratch: indexes into a document's uses
}

func (r *Report) mixed() *mixedGroups {
	mx := &mixedGroups{rank: make([]int32, len(r.spells)), major: make([]int32, len(r.groupList)), inAll: make([]string, len(r.groupList))}
	for i := range mx.rank {
		mx.rank[i] = -1
	}
	docsUsing := make([]int, len(r.groupList))
	lastDoc := make([]int, len(r.groupList))
	for gi := range lastDoc {
		lastDoc[gi] = -1
	}
	for di, uses := range r.uses {
		for _, u := range uses {
			if gi := r.spells[u.spell].group; lastDoc[gi] != di {
				lastDoc[gi], docsUsing[gi] = di, docsUsing[gi]+1
			}
		}
	}
	var byTotal []int32
	for gi := range r.groupList {
		g := &r.groupList[gi]
		if g.n < 2 {
			continue
		}
		byTotal = byTotal[:0]
		for si := g.first; si >= 0; si = r.spells[si].next {
			byTotal = append(byTotal, si)
		}
		slices.SortStableFunc(byTotal, func(a, b int32) int { return cmp.Compare(r.spells[b].total, r.spells[a].total) })
		all := make([]string, len(byTotal))
		for k, si := range byTotal {
			mx.rank[si] = int32(k)
			all[k] = fmt.Sprintf("%s %d", r.spells[si].spelling, r.spells[si].total)
		}
		mx.major[gi] = byTotal[0]
		mx.inAll[gi] = fmt.Sprintf("in %d document(s) %s", docsUsing[gi], strings.Join(all, ", "))
	}
	return mx
}

// add appends the mixed findings of document di to fs, in order of their
// groups' first use and, within a group, of the spellings' rank, and
// returns how many.
func (mx *mixedGroups) add(r *Report, di int, fs *[]Finding) int {
	uses := r.uses[di]
	mx.sel = mx.sel[:0]
	for k, u := range uses {
		if mx.rank[u.spell] >= 0 {
			mx.sel = append(mx.sel, k)
		}
	}
	if len(mx.sel) == 0 {
		return 0
	}
	slices.SortFunc(mx.sel, func(a, b int) int {
		sa, sb := uses[a].spell, uses[b].spell
		if c := cmp.Compare(r.spells[sa].group, r.spells[sb].group); c != 0 {
			return c
		}
		return cmp.Compare(mx.rank[sa], mx.rank[sb])
	})
	n := 0
	for i := 0; i < len(mx.sel); {
		gi := r.spells[uses[mx.sel[i]].spell].group
		j := i
		var here []string
		for ; j < len(mx.sel) && r.spells[uses[mx.sel[j]].spell].group == gi; j++ {
			u := &uses[mx.sel[j]]
			here = append(here, fmt.Sprintf("%s %d", r.spells[u.spell].spelling, u.n))
		}
		g, major := &r.groupList[gi], r.spells[mx.major[gi]].spelling
		for _, k := range mx.sel[i:j] {
			u := &uses[k]
			if mx.rank[u.spell] == 0 {
				continue
			}
			text := r.strs.strs[u.text]
			*fs = append(*fs, Finding{
				File: r.docs[di], Line: int(u.line), Column: int(u.col), EndLine: int(u.endLine), EndColumn: int(u.endCol),
				Text: text, Kind: KindMixed, Preferred: major, Entry: major,
				Message: fmt.Sprintf("%q is one of %d spellings of a term: here %s; %s: use %q",
					text, g.n, strings.Join(here, ", "), mx.inAll[gi], major),
			})
			n++
		}
		i = j
	}
	return n
}

// dropCovering leaves out the mixed findings that contain another finding
// of the document: "heating set-point" against "heating set point" is the
// variation of the "set point" group it contains, reported there.
func dropCovering(fs []Finding) []Finding {
	out := fs[:0]
	for i := range fs {
		f := &fs[i]
		covers := false
		for j := range fs {
			if f.Kind != KindMixed {
				break
			}
			o := &fs[j]
			if i == j || o.Line > f.EndLine {
				continue
			}
			if before(f.Line, f.Column, o.Line, o.Column) && before(o.EndLine, o.EndColumn, f.EndLine, f.EndColumn) &&
				(f.Line != o.Line || f.Column != o.Column || f.EndLine != o.EndLine || f.EndColumn != o.EndColumn) {
				covers = true
				break
			}
		}
		if !covers {
			out = append(out, *f)
		}
	}
	return out
}

// before reports whether position (l1, c1) is at or before (l2, c2).
func before(l1, c1, l2, c2 int) bool { return l1 < l2 || l1 == l2 && c1 <= c2 }
