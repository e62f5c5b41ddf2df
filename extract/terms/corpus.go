package terms

import (
	"math"
	"runtime"
	"slices"
	"sort"
	"strings"
	"sync"

	"glossmith/extract/termstat"
)

// Reference gives general-language word frequencies: by default those of
// the tagger's training treebank, carried in the model; or counts of the
// user's own reference documents.
type Reference interface {
	// Freq returns the frequency of a lower-cased lemma. Corpus.Terms
	// calls it (and Size) from several goroutines at once.
	Freq(word string) int
	// Size returns the number of word tokens counted.
	Size() int
}

// Counts is a Reference built from counted words (for --reference INPUT).
type Counts struct {
	Words map[string]int
	Total int
}

// Freq implements Reference.
func (c *Counts) Freq(w string) int { return c.Words[w] }

// Size implements Reference.
func (c *Counts) Size() int { return c.Total }

// Add counts the words of a document's counts.
func (c *Counts) Add(dc *DocCounts) {
	if c.Words == nil {
		c.Words = map[string]int{}
	}
	for _, w := range dc.words {
		// A copy, for every word and not only new ones: the word may be a
		// slice of the document's text, and assigning to a string key
		// stores the key given even when the key is there already.
		c.Words[strings.Clone(w.word)] += int(w.n)
	}
	c.Total += dc.Tokens
}

// wordTable counts the words of a corpus. The counts live in a slice the
// map indexes, so that adding to a word met before takes one look-up and
// leaves the stored key alone (see Counts.Add): only new words are copied.
type wordTable struct {
	index map[string]int32
	freq  []int
	// labeled counts the uses followed by a label (see isLabel).
	labeled []int32
	total   int
	// ref holds each word's reference frequency (see setReference).
	ref []int32
}

// setReference looks up every word of the table in the reference once:
// the candidates' words then take their reference frequency from the
// table (see specificity) instead of asking the reference again for each
// candidate they occur in — a binary search of the WordNet table for the
// default reference.
func (t *wordTable) setReference(ref Reference) {
	t.ref = slices.Grow(t.ref[:0], len(t.freq))[:len(t.freq)]
	for w, i := range t.index {
		t.ref[i] = int32(min(ref.Freq(w), math.MaxInt32))
	}
}

func (t *wordTable) add(w string, n int, labeled int32) {
	if i, ok := t.index[w]; ok {
		t.freq[i] += n
		t.labeled[i] += labeled
		return
	}
	if t.index == nil {
		t.index = map[string]int32{}
	}
	t.index[strings.Clone(w)] = int32(len(t.freq))
	t.freq = append(t.freq, n)
	t.labeled = append(t.labeled, labeled)
}

// withReference returns how often w occurs, the share of its uses that a
// label follows, with one use added to the count (a word seen once before
// a number is not yet a document-structure word), and w's reference
// frequency as setReference found it; ok is false when there is none (a
// word not in the table or not looked up).
func (t *wordTable) withReference(w string) (freq int, labelShare float64, ref int, ok bool) {
	i, in := t.index[w]
	if !in {
		return 0, 0, 0, false
	}
	freq, labelShare = t.freq[i], float64(t.labeled[i])/float64(t.freq[i]+1)
	if int(i) < len(t.ref) {
		return freq, labelShare, int(t.ref[i]), true
	}
	return freq, labelShare, 0, false
}

func (t *wordTable) get(w string) int {
	if i, ok := t.index[w]; ok {
		return t.freq[i]
	}
	return 0
}

// docFreq is a candidate's count in one document. 32-bit fields: the
// per-document counts are the largest table of a big corpus (one entry per
// candidate and document), and halving them saves a quarter of its memory.
type docFreq struct{ doc, n int32 }

type group struct {
	key      string
	freq     int
	kept     int // occurrences Options.Keep accepts (see Corpus.Terms)
	perDoc   []docFreq
	variants []spelling  // few per group: slices beat maps (see docCand)
	canon    []canonical // in order of first occurrence
	// contexts are the example sentences: first the main ones, at most
	// one per document, then spare ones, used when too few documents
	// offer one.
	contexts []ctxRef
	// contexts[:main] are the main ones, and contexts[:good] of those
	// are good examples (goodContext), in document order, then the others.
	// (Two int32s take the place of one int: groups are many.)
	main, good int32

	// first holds the first element of each slice above: most groups are
	// rare candidates that never get a second one, and one allocation
	// for all of them leaves the collector less to do.
	first struct {
		perDoc   [1]docFreq
		variants [1]spelling
		canon    [1]canonical
		contexts [1]ctxRef
	}
}

// ctxRef is a Context kept compact: its document by index.
type ctxRef struct {
	text      string
	doc, line int32
}

// spelling is a string with its count.
type spelling struct {
	text string
	n    int
}

// canonical is a canonical spelling with its count, words and UPOS tags.
type canonical struct {
	spelling
	// parts are its words, then the lemma keys of its words (for domain
	// specificity): one slice rather than two keeps a group small.
	parts []string
	nw    int // number of words
	pos   string
}

func (c *canonical) words() []string { return c.parts[:c.nw:c.nw] }

func (c *canonical) keys() []string {
	if len(c.parts) == c.nw {
		return nil
	}
	return c.parts[c.nw:]
}

// Corpus merges the documents' counts in input order.
type Corpus struct {
	docs     []string
	docSize  []int
	words    wordTable
	groups   map[string]*group
	order    []string
	contexts int
	budget   budget // see budget.go
	abbrevs  abbrevTable

	// working memory of Add
	texts []string // copies of the document's context texts, made on first use
}

// NewCorpus returns an empty corpus keeping up to contexts example
// sentences per candidate.
func NewCorpus(contexts int) *Corpus {
	return &Corpus{groups: map[string]*group{}, contexts: contexts}
}

// Add merges one document's counts. Call it in input order.
//
// Every string the corpus keeps is its own copy: strings cut from a
// document's text (a word form, a span) or from the arena of its counts
// would keep all of them alive, and on a large corpus nearly every
// document would stay in memory.
func (c *Corpus) Add(dc *DocCounts) {
	di := len(c.docs)
	c.docs = append(c.docs, dc.Name)
	c.docSize = append(c.docSize, dc.Tokens)
	for _, w := range dc.words {
		c.words.add(w.word, int(w.n), w.labeled)
	}
	c.words.total += dc.Tokens
	for xi := range dc.cands {
		x := &dc.cands[xi]
		g := c.groups[x.key]
		if g == nil {
			g = c.newGroup(dc, x, di)
		} else {
			c.merge(g, dc, x, di)
		}
		// Contexts: at most one per document until every candidate has
		// its quota, so examples show the term in different documents.
		// Good ones (no heading, a full sentence: goodContext) go before
		// the others and, once the quota is full, take their places, so
		// that a term its first document names only in a heading shows a
		// later document's sentence first.
		for i, k := range x.ctx[:x.nctx] {
			switch {
			case i == 0 && int(g.main) < c.contexts:
				c.roomForContext(g)
				at := g.main
				if x.firstGood {
					at = g.good
					g.good++
				}
				g.contexts = slices.Insert(g.contexts, int(at), c.context(dc, di, k))
				g.main++
			case i == 0 && x.firstGood && g.good < g.main:
				g.contexts = slices.Delete(g.contexts, int(g.main)-1, int(g.main))
				g.contexts = slices.Insert(g.contexts, int(g.good), c.context(dc, di, k))
				g.good++
			case len(g.contexts)-int(g.main) < c.contexts:
				c.roomForContext(g)
				g.contexts = append(g.contexts, c.context(dc, di, k))
			}
		}
	}
	clear(c.texts[:min(len(c.texts), len(dc.contexts))])
	c.abbrevs.add(dc.abbrevs)
	c.checkBudget(dc)
}

// newGroup adds the group of a candidate new to the corpus, with its
// counts in document di. Its key, spellings and canonical forms are
// copied into one string: they live as long as the group.
func (c *Corpus) newGroup(dc *DocCounts, x *docCand, di int) *group {
	n := len(x.key)
	for k := x.spells; k >= 0; k = dc.spells[k].next {
		n += len(dc.spells[k].text)
	}
	for k := x.canons; k >= 0; k = dc.canons[k].next {
		n += len(dc.canons[k].all)
	}
	var b strings.Builder
	b.Grow(n)
	b.WriteString(x.key)
	for k := x.spells; k >= 0; k = dc.spells[k].next {
		b.WriteString(dc.spells[k].text)
	}
	for k := x.canons; k >= 0; k = dc.canons[k].next {
		b.WriteString(dc.canons[k].all)
	}
	all := b.String()
	next := func(n int) (s string) {
		s, all = all[:n], all[n:]
		return s
	}
	g := &group{key: next(len(x.key)), freq: int(x.freq), kept: int(x.kept)}
	g.perDoc = append(g.first.perDoc[:0], docFreq{int32(di), x.freq})
	g.variants = g.first.variants[:0]
	for k := x.spells; k >= 0; k = dc.spells[k].next {
		v := &dc.spells[k]
		g.variants = append(g.variants, spelling{next(len(v.text)), int(v.n)})
	}
	g.canon = g.first.canon[:0]
	for k := x.canons; k >= 0; k = dc.canons[k].next {
		v := &dc.canons[k]
		g.canon = append(g.canon, newCanonical(dc, v, next(len(v.all))))
	}
	c.groups[g.key] = g
	if len(c.order) == cap(c.order) {
		c.order = slices.Grow(c.order, len(c.order)) // doubling: append grows a long slice by a quarter
	}
	c.order = append(c.order, g.key)
	return g
}

// merge adds the counts in document di of a candidate to its group.
func (c *Corpus) merge(g *group, dc *DocCounts, x *docCand, di int) {
	g.freq += int(x.freq)
	g.kept += int(x.kept)
	g.perDoc = append(g.perDoc, docFreq{int32(di), x.freq})
	for k := x.spells; k >= 0; k = dc.spells[k].next {
		v := &dc.spells[k]
		n := len(g.variants)
		if g.variants = addSpelling(g.variants, spelling{v.text, int(v.n)}); len(g.variants) > n {
			g.variants[n].text = strings.Clone(v.text)
		}
	}
canon:
	for k := x.canons; k >= 0; k = dc.canons[k].next {
		v := &dc.canons[k]
		for i := range g.canon {
			if g.canon[i].text == v.text() {
				g.canon[i].n += int(v.n)
				continue canon
			}
		}
		g.canon = append(g.canon, newCanonical(dc, v, strings.Clone(v.all)))
	}
}

// newCanonical makes the canonical spelling v of a document's counts one
// of the corpus, from all, a copy of v.all. Its words and keys are slices
// of that copy, their headers of one slice: few allocations per candidate,
// and nothing that points into the document or its counts. The tags are
// not copied: they are a string of their own, shared by the canonical
// forms of the same tags.
func newCanonical(dc *DocCounts, v *docCanonical, all string) canonical {
	ends := dc.ends[v.ends : v.ends+v.nw+v.nk]
	parts := make([]string, len(ends))
	start := int32(0)
	for i, end := range ends {
		parts[i] = all[start:end]
		if start = end; int32(i) < v.nw-1 {
			start++ // the space between two words
		}
	}
	return canonical{spelling{all[:v.textLen], int(v.n)}, parts, int(v.nw), v.pos}
}

// roomForContext makes room for one more context in g: the first goes in
// the group itself, and when it has more, room for as many as it may get,
// quota and spare ones, in one allocation.
func (c *Corpus) roomForContext(g *group) {
	switch {
	case g.contexts == nil:
		g.contexts = g.first.contexts[:0]
	case len(g.contexts) == cap(g.contexts):
		g.contexts = slices.Grow(g.contexts, max(1, 2*c.contexts-len(g.contexts)))
	}
}

// context returns context k of the document, its text copied once for
// all the candidates that take it.
func (c *Corpus) context(dc *DocCounts, di int, k int32) ctxRef {
	if len(c.texts) < len(dc.contexts) {
		c.texts = make([]string, len(dc.contexts))
	}
	cx := dc.contexts[k]
	if c.texts[k] == "" {
		c.texts[k] = strings.Clone(cx.text)
	}
	cx.text, cx.doc = c.texts[k], int32(di)
	return cx
}

// WordFreq returns how often a lower-cased lemma occurs in the corpus.
func (c *Corpus) WordFreq(w string) int { return c.words.get(w) }

// Documents returns the number of documents merged.
func (c *Corpus) Documents() int { return len(c.docs) }

// Tokens returns the number of word tokens merged.
func (c *Corpus) Tokens() int { return c.words.total }

// Variant is one surface form of a candidate with its count.
type Variant struct {
	Form  string `json:"form"`
	Count int    `json:"count"`
}

// Term is a ranked candidate with every measure.
type Term struct {
	Rank     int       `json:"rank"`
	Term     string    `json:"term"`
	Words    int       `json:"words"`
	POS      string    `json:"pos"` // UPOS tags of the canonical form's words
	Variants []Variant `json:"variants"`
	Freq     int       `json:"freq"`
	Docs     int       `json:"docs"`
	// DP is Gries' deviation of proportions over documents (0 = spread as
	// the corpus is, near 1 = concentrated in one small document).
	DP float64 `json:"dp"`
	// CValue is C-value with the log2(|a|+1) length weight so that single
	// words take part (Frantzi et al. 2000; the weight is a common variant).
	CValue float64 `json:"cvalue"`
	// Keyness is the signed log-likelihood keyness (Rayson and Garside
	// 2000) of the candidate's least specific word against the reference:
	// positive when the documents use it more than the reference does.
	Keyness float64 `json:"keyness"`
	// Weirdness is the smoothed weirdness ratio (Ahmad et al. 1999) of the
	// same word: its relative frequency in the documents over that in the
	// reference, with additive smoothing Alpha.
	Weirdness float64 `json:"weirdness"`
	// Score is the combined ranking score.
	Score float64 `json:"score"`
	// Within is the longer candidate this one occurs inside at least
	// WithinPercent % of the time ("drip emitter" for "drip"): ranked as it is,
	// but a reviewer sees it may be a fragment. The most frequent such
	// candidate, ties by its words; "" for none.
	Within string `json:"within,omitempty"`
	// Acronym is the short form the documents define for this candidate
	// ("VPD" for "vapour pressure deficit"), FullForm the long form an
	// acronym stands for; see linkAbbrevs. "" for none.
	Acronym  string    `json:"acronym,omitempty"`
	FullForm string    `json:"full_form,omitempty"`
	Contexts []Context `json:"contexts,omitempty"`
	// Status and Entry come from a termbase (terms --termbase): new,
	// accepted, variant, acronym, full form, deprecated or rejected, and the
	// preferred term of the entry it belongs to. Empty without a termbase.
	Status string `json:"status,omitempty"`
	Entry  string `json:"entry,omitempty"`
	key    string
	pooled string // group key of the acronym whose counts this one pools (linkAbbrevs)
	words  []string
	keys   []string
	kept   int // occurrences Options.Keep accepted
	// labelShare is the share of the least specific word's uses a label
	// follows (see structureDamping).
	labelShare float64
}

// canonical picks a group's display form: the most frequent canonical
// spelling, preferring a lower-case one when the candidate also occurs in
// lower case (so a capitalized heading does not decide). Ties go to the
// byte-wise smallest spelling.
func (g *group) canonical() *canonical {
	best, bestN, bestLower, bi := "", -1, false, 0
	for i, c := range g.canon {
		s, n := c.text, c.n
		lower := s == strings.ToLower(s)
		better := false
		switch {
		case lower != bestLower:
			better = lower
		case n != bestN:
			better = n > bestN
		default:
			better = s < best
		}
		if bestN < 0 || better {
			best, bestN, bestLower, bi = s, n, lower, i
		}
	}
	if bestN < 0 {
		return &canonical{}
	}
	return &g.canon[bi]
}

// addSpelling adds v's count to the same spelling in ss, or appends it.
func addSpelling(ss []spelling, v spelling) []spelling {
	for i := range ss {
		if ss[i].text == v.text {
			ss[i].n += v.n
			return ss
		}
	}
	return append(ss, v)
}

// Terms computes the statistics of every candidate against the reference
// and returns them in first-occurrence order, unranked (Score and Rank are
// set by Rank).
func (c *Corpus) Terms(ref Reference) []*Term {
	c.foldCapitalPlurals()
	if ref != nil {
		c.words.setReference(ref)
	}
	out := make([]*Term, len(c.order))
	cands := make([]termstat.Candidate, len(c.order))
	spread := newDocSpread(c.docSize)
	// The candidates' measures are independent of each other. On a large
	// corpus this loop is the serial tail of a run, after the workers are
	// done, so it runs on every core, each on a range of the candidates.
	inParallel(len(c.order), parallelTermsFrom, func(lo, hi int) {
		var ctxs []Context
		var memo []float64
		if spread != nil {
			memo = spread.newMemo()
		}
		for i := lo; i < hi; i++ {
			out[i], cands[i], ctxs = c.term(c.order[i], spread, memo, ref, ctxs)
		}
	})
	if cv, err := termstat.CValue(dedupe(cands), termstat.CValueOptions{Weight: termstat.Log2LengthPlusOne}); err == nil {
		for i := range out {
			out[i].CValue = cv[i].Score
			if r := cv[i]; r.Nested() && mostlyWithin(cands[r.Top].Freq, cands[i].Freq) {
				out[i].Within = out[r.Top].Term
			}
		}
	}
	c.linkAbbrevs(out, spread)
	// Options.Keep filters whole candidates, once every measure is known:
	// a candidate stays when it accepted most of its occurrences.
	return slices.DeleteFunc(out, func(t *Term) bool { return 2*t.kept <= t.Freq })
}

// WithinPercent is the share of a candidate's occurrences, in percent,
// that must lie inside one longer candidate for Term.Within to name it.
const WithinPercent = 90

// mostlyWithin reports whether a candidate seen inner times is, at least
// WithinPercent of the time, inside a longer one seen outer times (each
// occurrence of the longer one holds one of the shorter). The counts are
// whole numbers, so the comparison is exact.
func mostlyWithin(outer, inner float64) bool {
	return inner > 0 && 100*outer >= WithinPercent*inner
}

// parallelTermsFrom is the number of candidates from which Terms spreads
// its work over goroutines: a small corpus is done before they would
// start. (A variable for the tests.)
var parallelTermsFrom = 4096

// inParallel calls f on consecutive ranges [lo, hi) covering [0, n), one
// per core, concurrently when n is at least from, and returns when all
// are done.
func inParallel(n, from int, f func(lo, hi int)) {
	parts := runtime.GOMAXPROCS(0)
	if n < from || parts < 2 {
		f(0, n)
		return
	}
	var wg sync.WaitGroup
	for p := range parts {
		lo, hi := n*p/parts, n*(p+1)/parts
		wg.Go(func() { f(lo, hi) })
	}
	wg.Wait()
}

// term computes the measures of the group of key k except C-value, with
// its example contexts cut from ctxs (see exampleContexts), and returns
// its words lower-cased for C-value and the rest of ctxs. memo is the
// goroutine's for spread.dp.
func (c *Corpus) term(k string, spread *docSpread, memo []float64, ref Reference, ctxs []Context) (*Term, termstat.Candidate, []Context) {
	g := c.groups[k]
	cn := g.canonical()
	words := cn.words()
	t := &Term{Term: cn.text, Words: len(words), POS: cn.pos, Freq: g.freq, Docs: len(g.perDoc), key: k, words: words, kept: g.kept}
	for _, v := range g.variants {
		t.Variants = append(t.Variants, Variant{v.text, v.n})
	}
	sortVariants(t.Variants)
	if spread != nil {
		t.DP = spread.dp(g.perDoc, memo)
	}
	t.Contexts, ctxs = c.exampleContexts(g, ctxs)
	t.Keyness, t.Weirdness, t.labelShare = c.specificity(cn.keys(), ref, Alpha)
	t.keys = cn.keys()
	lw := make([]string, len(words))
	for i, w := range words {
		lw[i] = strings.ToLower(w)
	}
	return t, termstat.Candidate{Words: lw, Freq: float64(g.freq)}, ctxs
}

// sortVariants orders variants by count, most frequent first, then by form.
func sortVariants(vs []Variant) {
	sort.Slice(vs, func(i, j int) bool {
		a, b := vs[i], vs[j]
		if a.Count != b.Count {
			return a.Count > b.Count
		}
		return a.Form < b.Form
	})
}

// exampleContexts returns a group's main contexts, then spare ones while
// there are fewer than the quota, cut from the front of buf (the contexts
// of every term share a few allocations); it returns the rest of buf.
func (c *Corpus) exampleContexts(g *group, buf []Context) (out, rest []Context) {
	n := len(g.contexts)
	if main := int(g.main); main < n {
		n = max(main, min(n, c.contexts))
	}
	if n == 0 {
		return nil, buf
	}
	if len(buf) < n {
		buf = make([]Context, max(n, 1024))
	}
	out, rest = buf[:n:n], buf[n:]
	for i, cx := range g.contexts[:n] {
		out[i] = Context{Doc: c.docs[cx.doc], Line: int(cx.line), Text: cx.text}
	}
	return out, rest
}

// dedupe makes word sequences unique for C-value: two groups can share
// their lower-cased words only when their keys differ in hyphenation, which
// the key already removed, so this is a safety net that appends a marker.
func dedupe(cands []termstat.Candidate) []termstat.Candidate {
	seen := map[string]bool{}
	for i := range cands {
		k := strings.Join(cands[i].Words, "\x00")
		for seen[k] {
			w := append([]string(nil), cands[i].Words...)
			w[len(w)-1] += "\u200b"
			cands[i].Words = w
			k = strings.Join(w, "\x00")
		}
		seen[k] = true
	}
	return cands
}

// Alpha is the additive smoothing of the weirdness ratio (see
// termstat.Contrast.SmoothedWeirdness). With α = 0.1 a word absent from the
// reference still ranks by how often the documents use it, while a single
// stray occurrence does not outrank established vocabulary.
const Alpha = 0.1

// specificity returns the domain specificity of a candidate against the
// reference: the signed log-likelihood keyness and the smoothed weirdness
// of its least specific content word (keys are lemma keys), and the share
// of that word's uses a label follows (see structureDamping). A term is
// taken to be as domain-specific as its most general word, so "wind
// turbine design" is held back by "design"; on the evaluation lists the
// minimum ranked better than the mean (see README). The least specific word
// is the one of the lowest ln(weirdness) after structureDamping: "figure"
// in "figure 3 shows", whatever the weirdness of "figure".
func (c *Corpus) specificity(keys []string, ref Reference, alpha float64) (ll, weird, share float64) {
	if ref == nil || ref.Size() == 0 || c.words.total == 0 {
		return 0, 0, 0
	}
	lowest := 0.0
	for i, key := range keys {
		n, sh, rf, ok := c.words.withReference(key)
		if !ok {
			rf = ref.Freq(key)
		}
		k := termstat.Contrast{Study: float64(n), Reference: float64(rf),
			StudySize: float64(c.words.total), ReferenceSize: float64(ref.Size())}
		k.Study = min(k.Study, k.StudySize)
		k.Reference = min(k.Reference, k.ReferenceSize)
		wr := k.SmoothedWeirdness(alpha)
		if lw := damped(wr, sh); i == 0 || lw < lowest {
			lowest, weird, ll, share = lw, wr, k.LL(), sh
		}
	}
	return ll, weird, share
}

// damped is ln(weirdness) after structureDamping for a word a label
// follows in share of its uses (-Inf for a weirdness of 0).
func damped(weird, share float64) float64 {
	lw := math.Log(weird)
	if lw > 0 {
		lw *= structureDamping(share)
	}
	return lw
}

// structureDamping is the factor by which the domain specificity (ln
// weirdness) of a word is multiplied: 0 when a label (a number, a capital
// letter, a Roman numeral: isLabel) follows it in at least StructureShare
// of its uses, 1 otherwise. Words that mostly stand before one name a part
// of the document — "Figure 3", "see Table 2", "Section 4.1", "Appendix
// B", "page 12" — and are found by where they occur, not from a list.
// Domain words now and then numbered ("zone 3", "firmware 3.4") keep their
// score: a smooth damping that also caught those ranked the evaluation
// lists 0.002 better and the demo corpus's zones and firmware far worse.
func structureDamping(share float64) float64 {
	if share >= settings.structureShare {
		return 0
	}
	return 1
}

// StructureShare is the share of a word's uses before a label from which
// it counts as a document-structure word (see structureDamping), chosen
// leave-one-domain-out on the evaluation lists (README).
const StructureShare = 0.2
