package terms

import (
	"cmp"
	"slices"
	"sort"
	"strings"

	"glossmith/tagger/doc"
)

// docAbbrev is a short form a document defines ("vapour pressure deficit
// (VPD)"): the group keys of the short and the long form, as candidates
// would have them, and the short form's canonical spelling.
type docAbbrev struct {
	short, long, shortText string
}

// findAbbrevs records the short forms the sentence toks defines
// (acronym.Find on its text), each pair of spans that are whole tokens. A
// sentence without both parentheses costs one scan of its bytes.
func (c *Collector) findAbbrevs(dc *DocCounts, sc *scratch, toks []doc.Token) {
	if len(toks) < 4 {
		return
	}
	text := sc.doc.Text
	base, end := int(toks[0].Start), int(toks[len(toks)-1].End)
	if base < 0 || end > len(text) || end <= base {
		return
	}
	s := text[base:end]
	if k := strings.IndexByte(s, '('); k < 0 || strings.IndexByte(s[k:], ')') < 0 {
		return
	}
	sc.pairs = sc.acronyms.Append(sc.pairs[:0], s)
	for _, p := range sc.pairs {
		si, sj, ok1 := tokenSpan(toks, base+p.Short.Start, base+p.Short.End)
		li, lj, ok2 := tokenSpan(toks, base+p.Long.Start, base+p.Long.End)
		if !ok1 || !ok2 {
			continue
		}
		cw := &sc.cw
		if cw.split(toks[li:lj], c.opt.MaxWords) == 0 {
			continue // longer than any candidate
		}
		cw.write(toks[li:lj])
		long := dc.arena.str(view(cw.key))
		if cw.split(toks[si:sj], c.opt.MaxWords) == 0 {
			continue
		}
		cw.write(toks[si:sj])
		if long == view(cw.key) {
			continue
		}
		dc.abbrevs = append(dc.abbrevs, docAbbrev{short: dc.arena.str(view(cw.key)), long: long, shortText: dc.arena.str(view(cw.text))})
	}
}

// tokenSpan returns the tokens [i, j) that cover the bytes [start, end)
// of the text exactly; false when no whole tokens do.
func tokenSpan(toks []doc.Token, start, end int) (i, j int, ok bool) {
	i = sort.Search(len(toks), func(k int) bool { return int(toks[k].Start) >= start })
	j = sort.Search(len(toks), func(k int) bool { return int(toks[k].End) >= end })
	if i >= len(toks) || j >= len(toks) || int(toks[i].Start) != start || int(toks[j].End) != end || j < i {
		return 0, 0, false
	}
	return i, j + 1, true
}

// abbrevTable counts the definitions of the corpus by pair of group keys,
// in order of first definition.
type abbrevTable struct {
	index map[[2]string]int
	pairs []abbrevPair
}

// abbrevPair is a short form and a long form, as group keys, with the
// short form's first canonical spelling and how often the documents
// define the one by the other.
type abbrevPair struct {
	short, long, shortText string
	n                      int
}

// add counts a document's definitions, copying the strings of new pairs.
func (t *abbrevTable) add(as []docAbbrev) {
	for _, a := range as {
		k := [2]string{a.short, a.long}
		if i, ok := t.index[k]; ok {
			t.pairs[i].n++
			continue
		}
		if t.index == nil {
			t.index = map[[2]string]int{}
		}
		p := abbrevPair{strings.Clone(a.short), strings.Clone(a.long), strings.Clone(a.shortText), 1}
		t.index[[2]string{p.short, p.long}] = len(t.pairs)
		t.pairs = append(t.pairs, p)
	}
}

// linkAbbrevs links the candidates the documents define as a short form
// and its long form (the terms are in the order of c.order): each long
// form that is a candidate gets one short form, each short form one long
// form, the pairs taken by how often the documents define them (then by
// their keys), so that one stray definition does not override the usual one.
//
// The long form's entry is the concept's: its Acronym names the short form,
// and it pools the short form's evidence — frequency and documents summed,
// DP over the summed counts per document, the short form's spellings among
// its variants — so that a concept written mostly as its acronym ranks by
// all its uses. The short form keeps its own line, counts and rank, with
// FullForm naming the long form: both are glossary entries a reviewer
// decides on (the evaluation lists hold both; dropping the acronym's line
// lowered F1, README). C-value, keyness and weirdness stay those of the
// long form's own words.
func (c *Corpus) linkAbbrevs(out []*Term, spread *docSpread) {
	if len(c.abbrevs.pairs) == 0 {
		return
	}
	// The index in out of the candidates in a pair: a look-up per
	// candidate in a map as small as the pairs.
	at := make(map[string]int, 2*len(c.abbrevs.pairs))
	for _, p := range c.abbrevs.pairs {
		at[p.short], at[p.long] = -1, -1
	}
	for i, t := range out {
		if _, ok := at[t.key]; ok {
			at[t.key] = i
		}
	}
	ps := slices.Clone(c.abbrevs.pairs)
	slices.SortFunc(ps, func(a, b abbrevPair) int {
		if a.n != b.n {
			return b.n - a.n
		}
		return cmp.Or(strings.Compare(a.short, b.short), strings.Compare(a.long, b.long))
	})
	var memo []float64
	if spread != nil {
		memo = spread.newMemo()
	}
	shortDone, longDone := map[string]bool{}, map[string]bool{}
	for _, p := range ps {
		li := at[p.long]
		if li < 0 || shortDone[p.short] || longDone[p.long] {
			continue
		}
		shortDone[p.short], longDone[p.long] = true, true
		lt := out[li]
		lt.Acronym = p.shortText
		si := at[p.short]
		if si < 0 {
			continue
		}
		st := out[si]
		lt.Acronym, st.FullForm = st.Term, lt.Term
		perDoc := sumDocs(c.groups[lt.key].perDoc, c.groups[st.key].perDoc)
		lt.pooled = st.key
		lt.Freq += st.Freq
		lt.kept += st.kept
		lt.Docs = len(perDoc)
		if spread != nil {
			lt.DP = spread.dp(perDoc, memo)
		}
		lt.Variants = append(slices.Clip(lt.Variants), st.Variants...)
		sortVariants(lt.Variants)
	}
}

// sumDocs merges two candidates' counts per document, both in document
// order, into one list in document order.
func sumDocs(a, b []docFreq) []docFreq {
	out := make([]docFreq, 0, len(a)+len(b))
	i, j := 0, 0
	for i < len(a) || j < len(b) {
		switch {
		case j == len(b) || i < len(a) && a[i].doc < b[j].doc:
			out = append(out, a[i])
			i++
		case i == len(a) || b[j].doc < a[i].doc:
			out = append(out, b[j])
			j++
		default:
			out = append(out, docFreq{a[i].doc, a[i].n + b[j].n})
			i++
			j++
		}
	}
	return out
}
