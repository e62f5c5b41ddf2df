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
	groups   map[string]*mixedGroup
	order    []*mixedGroup
	// Suppressed counts the glossary findings left out (code, addresses,
	// silenced lines).
	Suppressed int
}

// mixedGroup is a variant group's spellings over the documents, in order
// of first use.
type mixedGroup struct {
	key       string
	spellings []*mixedSpelling
}

type mixedSpelling struct {
	spelling, lower string
	total           int
	uses            []docUse // per document using it, in input order
}

// docUse is a spelling's count in one document and its first use there,
// kept compact: a large corpus has one per candidate and document.
type docUse struct {
	doc, n                     int32
	line, col, endLine, endCol int32
	text                       int32 // in the report's string table
}

// NewReport starts a report. g is the glossary the documents were checked
// against (nil if none): variant groups whose key is a glossary term's are
// left to the glossary findings.
func NewReport(g *Matcher) *Report {
	return &Report{glossary: g, groups: map[string]*mixedGroup{}}
}

// Add takes one document's result; call it in input order.
func (r *Report) Add(res *DocResult) {
	di := int32(len(r.docs))
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
	for _, s := range res.spellings {
		if r.glossary != nil && r.glossary.hasKey(s.key) {
			continue
		}
		g := r.groups[s.key]
		if g == nil {
			g = &mixedGroup{key: strings.Clone(s.key)}
			r.groups[g.key] = g
			r.order = append(r.order, g)
		}
		lower := strings.ToLower(s.spelling)
		var ms *mixedSpelling
		for _, x := range g.spellings {
			if x.lower == lower {
				ms = x
				break
			}
		}
		if ms == nil {
			ms = &mixedSpelling{spelling: strings.Clone(s.spelling), lower: strings.Clone(lower)}
			g.spellings = append(g.spellings, ms)
		}
		ms.total += s.n
		f := &s.first
		ms.uses = append(ms.uses, docUse{doc: di, n: int32(s.n), line: int32(f.Line), col: int32(f.Column),
			endLine: int32(f.EndLine), endCol: int32(f.EndColumn), text: r.strs.id(f.Text)})
	}
}

// hasKey reports whether a form of the glossary has the key (as appendKey
// makes it).
func (m *Matcher) hasKey(key string) bool {
	n := int32(0)
	for i := 0; i < len(key) && n >= 0; i++ {
		n = m.child(n, key[i])
	}
	return n >= 0 && m.final[n] != 0
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
		mixed := r.mixed()
		var fs []Finding
		for di, kept := range r.findings {
			fs = fs[:0]
			for k := range kept {
				fs = append(fs, r.finding(di, &kept[k]))
			}
			if m := mixed[int32(di)]; len(m) > 0 {
				fs = append(fs, m...)
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

// mixed makes the mixed findings of the variant groups spelled more than
// one way, by document.
func (r *Report) mixed() map[int32][]Finding {
	perDoc := map[int32][]Finding{}
	for _, g := range r.order {
		if len(g.spellings) < 2 {
			continue
		}
		byTotal := slices.Clone(g.spellings)
		slices.SortStableFunc(byTotal, func(a, b *mixedSpelling) int { return cmp.Compare(b.total, a.total) })
		major := byTotal[0]
		docsUsing := map[int32]bool{}
		var all []string
		for _, s := range byTotal {
			for _, u := range s.uses {
				docsUsing[u.doc] = true
			}
			all = append(all, fmt.Sprintf("%s %d", s.spelling, s.total))
		}
		inAll := fmt.Sprintf("in %d document(s) %s", len(docsUsing), strings.Join(all, ", "))
		here := map[int32][]string{}
		for _, s := range byTotal {
			for _, u := range s.uses {
				here[u.doc] = append(here[u.doc], fmt.Sprintf("%s %d", s.spelling, u.n))
			}
		}
		for _, s := range byTotal[1:] {
			for _, u := range s.uses {
				perDoc[u.doc] = append(perDoc[u.doc], Finding{
					File: r.docs[u.doc], Line: int(u.line), Column: int(u.col), EndLine: int(u.endLine), EndColumn: int(u.endCol),
					Text: r.strs.strs[u.text], Kind: KindMixed, Preferred: major.spelling, Entry: major.spelling,
					Message: fmt.Sprintf("%q is one of %d spellings of a term: here %s; %s: use %q",
						r.strs.strs[u.text], len(g.spellings), strings.Join(here[u.doc], ", "), inAll, major.spelling),
				})
			}
		}
	}
	return perDoc
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
