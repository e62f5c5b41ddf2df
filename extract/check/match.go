package check

import (
	"cmp"
	"slices"
	"strings"
	"unicode"
	"unicode/utf8"

	"glossmith/tagger/doc"
)

// Matcher is a compiled glossary: one automaton over every form of every
// entry, so that a document is read once however many entries there are.
//
// The automaton is a trie over the forms' keys: a form lower-cased with
// its spaces and hyphens removed ("Set-point", "set point" and "setpoint"
// all have the key "setpoint"). A text is walked token by token from each
// word, feeding the trie either the token's form or its lemma (keyed the
// same way; glued hyphens between words are skipped), so one walk finds
// the spaced, hyphenated, closed and inflected spellings of a form
// ("set points", "set-point", "setpoints" → "setpoint"). Where a walk ends
// on a form's key at a token boundary, the forms there are compared with
// the text as written to tell the preferred spelling from the others.
type Matcher struct {
	g Glossary
	// nodes[n] is what a step through node n reads, side by side: a walk
	// jumps about a large trie, and each array a step reads is a cache
	// line of its own to fetch.
	nodes []trieNode
	// edges are the nodes' children, each node's sorted by byte.
	edges  []trieEdge
	tables [][256]int32
	ends   [][]formRef // forms whose key ends at a node
	// folded holds each form's text as compared with the text found
	// (foldSpace), per entry and form.
	folded [][]string
	// wordKeys holds the hashes (keyHash) of the keys of the forms and
	// of their words: a capitalized plural is read as its singular only
	// when that is one (singular).
	wordKeys map[uint64]struct{}
}

// trieNode is a node of the matcher's trie.
type trieNode struct {
	lo, hi int32 // its edges, edges[lo:hi]
	// table is 1 + the index in tables of the node's child table, for
	// nodes with many children (the first levels of a large glossary),
	// where a scan of the edges would be long; 0 for the others.
	table int32
	final int32 // 1 + index into ends; 0 when no form ends there
}

// trieEdge is a child of a node by byte.
type trieEdge struct {
	to int32
	b  byte
}

// denseFrom is the number of children from which a node gets a table.
const denseFrom = 8

// formRef names one form of the glossary.
type formRef struct{ entry, form int32 }

// Compile builds the matcher of a glossary. Forms whose key is empty (no
// letters) are left out.
func Compile(g Glossary) *Matcher {
	type edge struct {
		from int32
		b    byte
	}
	edges := map[edge]int32{}
	next := int32(1)
	finals := map[int32][]formRef{}
	var key []byte
	for ei := range g.Entries {
		for fi, f := range g.Entries[ei].Forms {
			key = appendKey(key[:0], f.Text)
			if len(key) == 0 {
				continue
			}
			n := int32(0)
			for _, b := range key {
				e := edge{n, b}
				c, ok := edges[e]
				if !ok {
					c = next
					next++
					edges[e] = c
				}
				n = c
			}
			finals[n] = append(finals[n], formRef{int32(ei), int32(fi)})
		}
	}
	m := &Matcher{g: g, nodes: make([]trieNode, next)}
	all := make([]edge, 0, len(edges))
	for e := range edges {
		all = append(all, e)
	}
	slices.SortFunc(all, func(a, b edge) int {
		if c := cmp.Compare(a.from, b.from); c != 0 {
			return c
		}
		return cmp.Compare(a.b, b.b)
	})
	m.edges = make([]trieEdge, len(all))
	var root [256]int32 // child of the root by byte; 0 = none (the root is node 0)
	for i, e := range all {
		m.edges[i] = trieEdge{to: edges[e], b: e.b}
		if i == 0 || all[i-1].from != e.from {
			m.nodes[e.from].lo = int32(i)
		}
		m.nodes[e.from].hi = int32(i + 1)
		if e.from == 0 {
			root[e.b] = edges[e]
		}
	}
	// The root's table is tables[0]: child has no case of its own for it,
	// which keeps child small enough for the compiler to inline into walk.
	m.tables = append(m.tables, root)
	m.nodes[0].table = 1
	for n := int32(1); n < next; n++ {
		nd := &m.nodes[n]
		if nd.hi-nd.lo < denseFrom {
			continue
		}
		var t [256]int32
		for _, e := range m.edges[nd.lo:nd.hi] {
			t[e.b] = e.to
		}
		m.tables = append(m.tables, t)
		nd.table = int32(len(m.tables))
	}
	m.folded = make([][]string, len(g.Entries))
	m.wordKeys = make(map[uint64]struct{}, len(g.Entries)*4)
	for ei, e := range g.Entries {
		m.folded[ei] = make([]string, len(e.Forms))
		for fi, f := range e.Forms {
			m.folded[ei][fi] = foldSpace(f.Text)
			addWordKeys(m.wordKeys, f.Text)
		}
	}
	nodes := make([]int32, 0, len(finals))
	for n := range finals {
		nodes = append(nodes, n)
	}
	slices.Sort(nodes)
	for _, n := range nodes {
		m.ends = append(m.ends, finals[n])
		m.nodes[n].final = int32(len(m.ends))
	}
	return m
}

// Glossary returns the glossary the matcher was compiled from.
func (m *Matcher) Glossary() *Glossary { return &m.g }

// child returns node n's child by byte b, or -1.
func (m *Matcher) child(n int32, b byte) int32 {
	nd := &m.nodes[n]
	if nd.table != 0 {
		if c := m.tables[nd.table-1][b]; c != 0 {
			return c
		}
		return -1
	}
	for k := nd.lo; k < nd.hi; k++ {
		switch e := &m.edges[k]; {
		case e.b == b:
			return e.to
		case e.b > b:
			return -1
		}
	}
	return -1
}

// walk feeds s, keyed as appendKey keys it, to the trie from node n and
// returns the node reached, or -1.
// A string with nothing to feed (a dash whose lemma is "-") ends the
// walk: only a hyphen between two words is passed over, by find.
func (m *Matcher) walk(n int32, s string, scratch *[]byte) int32 {
	fed := false
	for i := 0; i < len(s); i++ {
		c := s[i]
		if c >= utf8.RuneSelf {
			*scratch = appendKey((*scratch)[:0], s[i:])
			for _, b := range *scratch {
				if n = m.child(n, b); n < 0 {
					return -1
				}
				fed = true
			}
			break
		}
		if c == '-' || c == ' ' {
			continue
		}
		if 'A' <= c && c <= 'Z' {
			c += 'a' - 'A'
		}
		if n = m.child(n, c); n < 0 {
			return -1
		}
		fed = true
	}
	if !fed {
		return -1
	}
	return n
}

// appendKey appends the key of s: lower-cased, without white space and
// hyphens (ASCII, U+2010, U+2011 and the soft hyphen).
func appendKey(dst []byte, s string) []byte {
	for _, r := range s {
		switch {
		case isKeySeparator(r):
			continue
		case r < utf8.RuneSelf:
			if 'A' <= r && r <= 'Z' {
				r += 'a' - 'A'
			}
			dst = append(dst, byte(r))
		default:
			dst = utf8.AppendRune(dst, unicode.ToLower(r))
		}
	}
	return dst
}

// isKeySeparator reports whether a key leaves r out: white space and the
// hyphens (ASCII, U+2010, U+2011 and the soft hyphen).
func isKeySeparator(r rune) bool {
	if r < utf8.RuneSelf {
		return r == '-' || r == ' ' || '\t' <= r && r <= '\r'
	}
	return wideKeySeparator(r)
}

// wideKeySeparator is isKeySeparator for the runes outside ASCII.
func wideKeySeparator(r rune) bool {
	return r == '\u2010' || r == '\u2011' || r == '\u00ad' || unicode.IsSpace(r)
}

func isHyphen(s string) bool { return s == "-" || s == "‐" || s == "‑" }

// hyphenEdge reports whether a token starts or ends with a hyphen: a dash,
// a command-line option ("--setpoint"), a prefix ("pre-").
func hyphenEdge(s string) bool {
	if s == "" {
		return false
	}
	first, last := s[0], s[len(s)-1]
	if first < utf8.RuneSelf && last < utf8.RuneSelf {
		return first == '-' || last == '-'
	}
	return first == '-' || last == '-' ||
		strings.HasPrefix(s, "‐") || strings.HasPrefix(s, "‑") || strings.HasSuffix(s, "‐") || strings.HasSuffix(s, "‑")
}

func glued(a, b *doc.Token) bool { return !a.SpaceAfter && a.End == b.Start }

// span is a stretch of a sentence's tokens [i, j) whose key is that of the
// forms in ends.
type span struct {
	i, j int
	ends []formRef
}

// scanner holds the working memory of scanning one sentence after another.
type scanner struct {
	m        *Matcher
	states   []int32
	next     []int32
	scratch  []byte
	terminal []int32
	// singulars are the words of the sentence scanned that are read also
	// as their singular, and read is the sentence with those words'
	// lemmas so (readSingulars); mostly none.
	singulars []singular
	read      []doc.Token
}

// find appends to out the leftmost-longest spans of toks whose key is the
// key of some form; spans do not overlap and do not cut a hyphenated
// compound ("valve" is not found in "magnet-valve").
func (sc *scanner) find(out []span, toks []doc.Token) []span {
	return sc.findFrom(out, toks, 0, len(toks))
}

// findFrom is find for the spans that start in toks[from:to]; they may end
// past to.
func (sc *scanner) findFrom(out []span, toks []doc.Token, from, to int) []span {
	m := sc.m
	for i := from; i < to; {
		if hyphenEdge(toks[i].Form) || i > 0 && glued(&toks[i-1], &toks[i]) && isHyphen(toks[i-1].Form) {
			i++
			continue
		}
		bestJ := -1
		sc.states = append(sc.states[:0], 0)
		for k := i; k < len(toks) && len(sc.states) > 0; k++ {
			t := &toks[k]
			if k > i && k+1 < len(toks) && isHyphen(t.Form) && glued(&toks[k-1], t) && glued(t, &toks[k+1]) {
				continue // the hyphen of "set-point": keys have none
			}
			if k > i && hyphenEdge(t.Form) { // (toks[i]'s was looked at above)
				break // "--", "--setpoint": options and dashes are not words
			}
			sc.next = sc.next[:0]
			for _, s := range sc.states {
				sc.next = addState(sc.next, m.walk(s, t.Form, &sc.scratch))
				if t.Lemma != "" && t.Lemma != t.Form {
					sc.next = addState(sc.next, m.walk(s, t.Lemma, &sc.scratch))
				}
			}
			sc.states, sc.next = sc.next, sc.states
			if k+1 < len(toks) && glued(t, &toks[k+1]) && isHyphen(toks[k+1].Form) {
				continue // "set-point-based": no end inside a compound
			}
			terminal := sc.terminal[:0]
			for _, s := range sc.states {
				if m.nodes[s].final != 0 {
					terminal = append(terminal, s)
				}
			}
			if len(terminal) > 0 {
				bestJ, sc.terminal = k+1, terminal
			}
		}
		if bestJ < 0 {
			i++
			continue
		}
		var ends []formRef
		if len(sc.terminal) == 1 {
			// one key, the usual case: its forms as they are, capped so
			// that an append copies them
			e := m.ends[m.nodes[sc.terminal[0]].final-1]
			ends = e[:len(e):len(e)]
		} else {
			for _, s := range sc.terminal {
				ends = append(ends, m.ends[m.nodes[s].final-1]...)
			}
		}
		out = append(out, span{i, bestJ, ends})
		i = bestJ
	}
	return out
}

// addState appends n to states unless it is -1 or already there.
func addState(states []int32, n int32) []int32 {
	if n < 0 || slices.Contains(states, n) {
		return states
	}
	return append(states, n)
}
