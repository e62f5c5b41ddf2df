// Package terms finds term candidates in annotated documents, groups their
// variants under one canonical form, measures them and ranks them.
//
// Work is split the way the pipeline runs: Collect looks at one document on
// a worker goroutine and returns its local counts; a Corpus merges those in
// input order and, at the end, computes the statistics and the ranking. The
// result depends only on the inputs and their order, never on scheduling.
package terms

import (
	"strings"
	"sync"
	"unicode"
	"unicode/utf8"
	"unsafe"

	"glossmith/extract/acronym"
	"glossmith/extract/wordshape"
	"glossmith/pattern"
	"glossmith/tagger/doc"
)

// Options tune candidate collection.
type Options struct {
	// MaxWords is the longest candidate kept, in orthographic words (a
	// hyphenated compound counts as one word). 0 means DefaultMaxWords.
	MaxWords int
	// Contexts is how many example sentences each candidate keeps.
	Contexts int
	// Stop holds lower-cased words: a candidate that begins or ends with one
	// of them, or that is one of them, is dropped.
	Stop map[string]bool
	// Keep, when set, is asked about each candidate occurrence from its
	// tokens (the include and exclude patterns of the command line). It
	// filters whole candidates, not occurrences: a candidate is listed when
	// Keep accepts more than half of its occurrences, and its counts,
	// contexts and measures are those of all of them.
	Keep func(toks []doc.Token) bool
}

// DefaultMaxWords is the default longest candidate, in orthographic words
// ("root-zone temperature sensor" has three). Longer noun phrases are
// rarely glossary entries and mostly names and titles, so they and their
// parts are left out (countFrom). Four words rather than three: a phrase of
// four words is seldom a term itself — it takes the fragment penalty (see
// Score) — but as a candidate it marks its three-word pieces as fragments
// (Within) and lets its shorter parts count ("braking system" in "wind
// turbine braking system", "reparation of damages" in "mere reparation of
// damages"). On the three evaluation domains this ranked better than
// leaving four-word phrases out with their parts (with the treebank
// reference: mean best F1 0.432 against 0.428) or allowing five words
// (0.431); README. --max-words changes it.
const DefaultMaxWords = 4

// Context is an example sentence of a candidate.
type Context struct {
	Doc  string `json:"doc"`
	Line int    `json:"line"`
	Text string `json:"text"`
	// Start and End are the character (not byte) offsets in Text of the
	// first use of the term, End exclusive; both -1 when no spelling of
	// the term is found whole in Text. The writers fill them (MarkTerm).
	Start int `json:"start"`
	End   int `json:"end"`
}

// DocCounts are what one document contributes: its word counts and its
// candidates' counts, kept compact for Corpus.Add. Their strings are slices
// of the document's text or of one arena (see arena), not copies each of
// its own: the corpus copies the few it keeps.
type DocCounts struct {
	Name   string
	Tokens int
	docTables
	arena arena // text made up here (keys, lower-cased words, folded spans)
}

// docTables are the tables of a DocCounts: in the DocCounts, in the
// collector's scratch space while they grow (see settle), or on their way
// there from a released DocCounts.
type docTables struct {
	words  []wordCount    // by key (see WordKey), in order of first occurrence
	cands  []docCand      // candidate groups in order of first occurrence
	spells []docSpelling  // the groups' spellings, chained per group
	canons []docCanonical // the groups' canonical forms, chained per group
	ends   []int32        // ends of canonical words and keys (see docCanonical)
	// contexts are the sentences offered as contexts, each once (doc unset).
	contexts []ctxRef
	// abbrevs are the short forms the document defines, one per definition.
	abbrevs []docAbbrev
}

// empty returns the tables emptied, their room kept.
func (t *docTables) empty() docTables {
	return docTables{t.words[:0], t.cands[:0], t.spells[:0], t.canons[:0], t.ends[:0], t.contexts[:0], t.abbrevs[:0]}
}

// wordCount is how often a word key occurs in a document, and how often
// the token after it is a label (see isLabel): "Figure 3", "Table 2",
// "Section 4.1", "Appendix B". 32-bit counts keep the entry at 24 bytes.
type wordCount struct {
	word    string
	n       int32
	labeled int32
}

// docCand counts one candidate group in one document.
//
// A candidate rarely has more than one or two spellings or canonical forms
// within a document, so they are chains through DocCounts.spells and
// DocCounts.canons searched linearly, with the chains of every group in
// one slice: a map or a slice of their own per candidate and document made
// counting the slowest step of the pipeline.
type docCand struct {
	key      string // group key: lower-cased, hyphens and spaces removed
	freq     int32
	kept     int32 // occurrences Options.Keep accepts
	spells   int32 // first spelling in DocCounts.spells, -1 for none
	canons   int32 // first canonical form in DocCounts.canons, -1 for none
	nctx     int32
	ctx      [maxDocContexts]int32 // contexts offered, in DocCounts.contexts
	lastSent int32                 // Sentence.Index of the last context taken
	// firstGood tells whether ctx[0] is a good context (goodContext).
	firstGood bool
}

// docSpelling is a surface form as written, white space folded.
type docSpelling struct {
	text string
	n    int32
	next int32 // next in the group's chain, -1 at its end
}

// docCanonical is a canonical spelling (head lemmatized, case folded) with
// what the corpus needs of it when it is new there, worked out at its
// first occurrence in the document.
type docCanonical struct {
	// all holds the spelling, its first textLen bytes, and then the lemma
	// keys of its words (see WordKey), for domain specificity. DocCounts.ends
	// from ends on has the end in all of each of its nw words and nk keys.
	all           string
	pos           string // UPOS tags of the words, space-separated
	n             int32
	next          int32 // next in the group's chain, -1 at its end
	textLen, ends int32
	nw, nk        int32
}

func (v *docCanonical) text() string { return v.all[:v.textLen] }

// maxDocContexts bounds the contexts one document offers a candidate.
const maxDocContexts = 3

// Collector finds candidates with a matcher (normally the stock "terms"
// rules run in nested mode, so that sub-phrases are candidates too).
type Collector struct {
	m   *pattern.Matcher
	opt Options
	// limit is the longest span looked at, in tokens: SpanLimit of one
	// word more than a candidate may have, so that the too-long matches
	// whose fragments are left out (countFrom) are seen too.
	limit int
}

// NewCollector returns a Collector; it is safe for concurrent use.
func NewCollector(m *pattern.Matcher, opt Options) *Collector {
	if opt.MaxWords <= 0 {
		opt.MaxWords = DefaultMaxWords
	}
	return &Collector{m: m, opt: opt, limit: SpanLimit(opt.MaxWords + 1)}
}

// scratch is the working memory of one Collect call, reused from call to
// call so that counting a document allocates little beyond its result.
type scratch struct {
	wordIndex  map[string]int32 // word key → index in DocCounts.words
	groupIndex map[string]int32 // group key → index in DocCounts.cands
	doc        *doc.Document    // the document being counted
	toks       []doc.Token      // the sentence being counted
	spans      spanState        // whether unclean is known for the sentence
	addrKnown  bool             // whether addrBefore is known for the sentence
	addrBefore []int32          // see hasAddress
	unclean    []int32          // see surface
	recent     wordCache        // words of the document by string address
	isWord     []bool           // per token of the current sentence
	wordAt     []int32          // per word token of the sentence: its index in DocCounts.words
	context    []int32          // per sentence: 1 + its index in DocCounts.contexts, 0 if none
	cw         canonWriter
	acronyms   acronym.Finder
	pairs      []acronym.Pair
	from       []pattern.Match // the matches from one start (see countFrom)
	reach      []ruleReach     // how far too-long matches reach (see countFrom)
	buf        []byte          // a lower-cased word key, a folded span
	keyBuf     []byte          // a canonical spelling and its keys
	tagBuf     []byte          // the tags of a canonical spelling
	tags       tagCache        // tag strings made

	// The tables of the DocCounts being filled grow here (see settle).
	docTables
}

var scratchPool = sync.Pool{New: func() any {
	return &scratch{wordIndex: map[string]int32{}, groupIndex: map[string]int32{}}
}}

// newCounts returns the counts of d to fill, growing in sc's tables.
func (sc *scratch) newCounts(d *doc.Document) *DocCounts {
	return &DocCounts{Name: d.Name, docTables: sc.docTables.empty()}
}

// settle hands the tables dc grew in over to dc and gives sc others for
// the next document: those of a released DocCounts (see Release) or,
// when there is none, new ones with room for twice this document. (Copying
// the tables out at their final size instead, and keeping the grown ones,
// was 1.7% of a terms run and a fifth of the bytes it allocated.)
func (sc *scratch) settle(dc *DocCounts) {
	t, _ := freeTables.Get().(*docTables)
	if t == nil {
		// Room for a document a good deal larger than this one, so that
		// the next rarely grows them.
		t = &docTables{
			make([]wordCount, 0, 2*len(dc.words)), make([]docCand, 0, 2*len(dc.cands)),
			make([]docSpelling, 0, 2*len(dc.spells)), make([]docCanonical, 0, 2*len(dc.canons)),
			make([]int32, 0, 2*len(dc.ends)), make([]ctxRef, 0, 2*len(dc.contexts)), nil,
		}
	}
	sc.docTables = *t
}

// freeTables holds the (empty) tables of released DocCounts.
var freeTables sync.Pool

// Release gives dc's tables and the blocks of its arena back for the
// counts of later documents. Call it once dc has been added to a corpus
// (Corpus.Add and Counts.Add copy what they keep; TestCorpusKeepsNoDocumentText)
// and nothing refers to its strings any more: dc is empty afterwards.
// Not calling it costs only allocations.
func (dc *DocCounts) Release() {
	if cap(dc.words) == 0 && cap(dc.cands) == 0 {
		return
	}
	// The strings point into the document and the arena: dropped, so
	// that tables waiting in the pool keep no text alive.
	clear(dc.words)
	clear(dc.cands)
	clear(dc.spells)
	clear(dc.canons)
	clear(dc.contexts)
	clear(dc.abbrevs)
	t := dc.docTables.empty()
	freeTables.Put(&t)
	dc.arena.free()
	*dc = DocCounts{}
}

// maxScratchMap is the size beyond which a scratch map is dropped rather
// than cleared: clearing costs in proportion to the largest document seen.
const maxScratchMap = 1 << 15

// release forgets the document (the maps' keys point into it) and returns
// sc to the pool.
func (sc *scratch) release() {
	for _, m := range []*map[string]int32{&sc.wordIndex, &sc.groupIndex} {
		if len(*m) > maxScratchMap {
			*m = map[string]int32{}
		} else {
			clear(*m)
		}
	}
	sc.doc, sc.toks = nil, nil
	clear(sc.recent[:])
	scratchPool.Put(sc)
}

// CountWords counts a document's word tokens by lower-cased lemma, without
// looking for candidates: the counts of a reference corpus.
func CountWords(d *doc.Document) *DocCounts {
	sc := scratchPool.Get().(*scratch)
	defer sc.release()
	dc := sc.newCounts(d)
	for si := range d.Sentences {
		sc.countWords(dc, d.Sentences[si].Tokens)
	}
	sc.settle(dc)
	return dc
}

// countWords counts a sentence's word tokens under their keys (see
// WordKey) and notes which tokens are words.
func (sc *scratch) countWords(dc *DocCounts, toks []doc.Token) {
	if cap(sc.isWord) < len(toks) {
		sc.isWord = make([]bool, len(toks), 2*len(toks))
		sc.wordAt = make([]int32, len(toks), 2*len(toks))
	}
	sc.isWord, sc.wordAt = sc.isWord[:len(toks)], sc.wordAt[:len(toks)]
	for i := range toks {
		t := &toks[i]
		sc.isWord[i] = wordshape.IsWord(t.Form)
		if !sc.isWord[i] {
			continue
		}
		dc.Tokens++
		// One byte looked at for most tokens: the next one's first.
		var labeled int32
		if i+1 < len(toks) && toks[i+1].Form != "" && labelStart[toks[i+1].Form[0]] && isLabel(&toks[i+1]) {
			labeled = 1
		}
		w := wordOf(t)
		e := sc.recent.entry(w)
		if e.p == unsafe.StringData(w) && e.n == len(w) {
			dc.words[e.index].n++
			dc.words[e.index].labeled += labeled
			sc.wordAt[i] = e.index
			continue
		}
		e.p, e.n = unsafe.StringData(w), len(w)
		var ok bool
		if needsLower(w) {
			sc.buf = appendLower(sc.buf[:0], w)
			if e.index, ok = sc.wordIndex[string(sc.buf)]; !ok {
				w = dc.arena.str(view(sc.buf))
			}
		} else {
			e.index, ok = sc.wordIndex[w]
		}
		if !ok {
			e.index = int32(len(dc.words))
			sc.wordIndex[w] = e.index
			dc.words = append(dc.words, wordCount{word: w})
		}
		dc.words[e.index].n++
		dc.words[e.index].labeled += labeled
		sc.wordAt[i] = e.index
	}
}

// isLabel reports whether a token is the kind of label that follows a
// document-structure word ("Figure 3", "Table 2.1", "Appendix B", "Part
// IV"): a number, a single capital letter other than the article "A" and
// the pronoun "I", or a Roman numeral of up to four letters. Words that a
// label mostly follows name a part of the document rather than a concept
// of its domain (see structureDamping).
func isLabel(t *doc.Token) bool {
	f := t.Form
	if f == "" {
		return false
	}
	c := f[0]
	switch {
	case c >= '0' && c <= '9':
		return true
	case len(f) == 1:
		return c >= 'A' && c <= 'Z' && t.UPOS != "DET" && t.UPOS != "PRON"
	case len(f) > 4:
		return false
	}
	for i := 0; i < len(f); i++ {
		switch f[i] {
		case 'I', 'V', 'X', 'i', 'v', 'x':
		default:
			return false
		}
	}
	return true
}

// labelStart marks the bytes a label may start with (see isLabel).
var labelStart = func() (t [256]bool) {
	for c := '0'; c <= '9'; c++ {
		t[c] = true
	}
	for c := 'A'; c <= 'Z'; c++ {
		t[c] = true
	}
	t['i'], t['v'], t['x'] = true, true, true
	return t
}()

// wordCache finds the counts of words met recently in a document by the
// address of their string, without hashing their text: the tagger gives
// known words the lemma strings of its lexicon, so most words come back as
// the very same string. Two strings of the same address and length are
// equal; a miss costs a map look-up.
type wordCache [1 << wordCacheBits]recentWord

const wordCacheBits = 10

// recentWord is a word string seen in the document, by address and
// length, and the index of its count in DocCounts.words.
type recentWord struct {
	p     *byte
	n     int
	index int32
}

// entry returns the cache entry for w: the one w is in if it is there.
func (c *wordCache) entry(w string) *recentWord {
	h := (uint64(uintptr(unsafe.Pointer(unsafe.StringData(w)))) ^ uint64(len(w))) * 0x9e3779b97f4a7c15
	return &c[h>>(64-wordCacheBits)]
}

// Collect counts the candidates of one annotated document.
func (c *Collector) Collect(d *doc.Document) *DocCounts {
	sc := scratchPool.Get().(*scratch)
	defer sc.release()
	dc := sc.newCounts(d)
	sc.doc = d
	if cap(sc.context) < len(d.Sentences) {
		sc.context = make([]int32, len(d.Sentences))
	}
	sc.context = sc.context[:len(d.Sentences)]
	clear(sc.context)
	for si := range d.Sentences {
		toks := d.Sentences[si].Tokens
		sc.toks, sc.spans, sc.addrKnown = toks, spansUnknown, false
		sc.countWords(dc, toks)
		// Nested matches come sorted by start, then end; those of one
		// start are counted together (countFrom). Spans longer than a
		// match of MaxWords+1 words can be are never generated (see
		// SpanLimit).
		sc.reach, sc.from = sc.reach[:0], sc.from[:0]
		c.m.EachNested(toks, c.limit, func(mt pattern.Match) {
			if len(sc.from) > 0 && mt.Start != sc.from[0].Start {
				c.countFrom(dc, sc, si)
			}
			sc.from = append(sc.from, mt)
		})
		c.countFrom(dc, sc, si)
		c.findAbbrevs(dc, sc, toks)
	}
	sc.settle(dc)
	return dc
}

// countFrom counts the matches in sc.from, which start at one position
// of sentence si, sorted by end and then rule. A match of more than
// MaxWords words (or with a word of more than maxWordTokens tokens) is no
// candidate, and neither is any span inside it that the same rule
// matches: cut to MaxWords words, "radiation sum set point" would leave
// "sum set point" and "radiation sum set", fragments that name nothing,
// in the list. A span inside it that another rule matches is a match of
// its own and counts (an acronym inside a long noun phrase), and so do the
// span's other occurrences. sc.reach holds, per rule, the farthest end of
// its too-long matches from this or an earlier start: a span of the rule
// ending there or before lies inside one.
func (c *Collector) countFrom(dc *DocCounts, sc *scratch, si int) {
	ms := sc.from
	if len(ms) == 0 {
		return
	}
	// A longer span from the same start has at least as many words, so
	// the too-long matches are the last ones.
	for k := len(ms) - 1; k >= 0 && c.tooLong(sc, ms[k].Start, ms[k].End); k-- {
		sc.extendReach(ms[k].Rule, ms[k].End)
	}
	for k := 0; k < len(ms); {
		i, j := ms[k].Start, ms[k].End
		// The same span found by several rules comes in a row; it counts
		// once, when one of them finds it outside a too-long match.
		inside := true
		for ; k < len(ms) && ms[k].End == j; k++ {
			inside = inside && sc.insideTooLong(ms[k].Rule, j)
		}
		if !inside {
			c.count(dc, sc, si, i, j)
		}
	}
	clear(ms) // slots are maps
	sc.from = ms[:0]
}

// tooLong reports whether the span [i, j) of the current sentence has more
// than MaxWords words or a word of more than maxWordTokens tokens. A span
// of so few tokens that it can have neither is not split into words.
func (c *Collector) tooLong(sc *scratch, i, j int) bool {
	if n := j - i; n <= c.opt.MaxWords && n <= maxWordTokens {
		return false
	}
	return sc.cw.split(sc.toks[i:j], c.opt.MaxWords) == 0
}

// ruleReach is how far the too-long matches of a rule reach in the current
// sentence (see countFrom).
type ruleReach struct {
	rule string
	end  int
}

// extendReach notes a too-long match of rule ending at end.
func (sc *scratch) extendReach(rule string, end int) {
	for k := range sc.reach {
		if sc.reach[k].rule == rule {
			sc.reach[k].end = max(sc.reach[k].end, end)
			return
		}
	}
	sc.reach = append(sc.reach, ruleReach{rule, end})
}

// insideTooLong reports whether a span of rule from the current start,
// ending at end, lies inside a too-long match of the same rule.
func (sc *scratch) insideTooLong(rule string, end int) bool {
	for _, r := range sc.reach {
		if r.rule == rule {
			return end <= r.end
		}
	}
	return false
}

// count checks and normalizes the span [i, j) of sentence si and, when it
// is a candidate, counts it.
func (c *Collector) count(dc *DocCounts, sc *scratch, si, i, j int) {
	s := &sc.doc.Sentences[si]
	toks := s.Tokens
	if j <= i || !sc.isWord[i] || !sc.isWord[j-1] {
		return
	}
	// A span must not cut a hyphenated compound: "compensating drip emitter"
	// inside "pressure-compensating drip emitter" is no candidate.
	if i > 0 && glued(toks[i-1], toks[i]) && isHyphen(toks[i-1].Form) {
		return
	}
	if j < len(toks) && glued(toks[j-1], toks[j]) && isHyphen(toks[j].Form) {
		return
	}
	if sc.hasAddress(i, j) {
		return
	}
	cw := &sc.cw
	if cw.split(toks[i:j], c.opt.MaxWords) == 0 {
		return
	}
	cw.write(toks[i:j])
	if c.opt.Stop != nil && cw.stopped(c.opt.Stop) {
		return
	}
	gi, ok := sc.groupIndex[string(cw.key)]
	if !ok {
		gi = int32(len(dc.cands))
		key := dc.arena.str(view(cw.key))
		sc.groupIndex[key] = gi
		dc.cands = append(dc.cands, docCand{key: key, spells: -1, canons: -1})
	}
	g := &dc.cands[gi]
	g.freq++
	if c.opt.Keep == nil || c.opt.Keep(toks[i:j]) {
		g.kept++
	}
	surface, inBuf := sc.surface(i, j)
	dc.addSpelling(g, surface, inBuf)
	dc.addCanonical(sc, g, i, j)
	// One context per sentence; the corpus keeps the first few overall.
	// A full sentence of reasonable length shows the term in use better
	// than a heading or a list fragment: the first context of a document
	// (the one the corpus shows first) is a good sentence when the
	// document has one.
	switch {
	case g.nctx > 0 && g.lastSent == int32(s.Index):
	case g.nctx < maxDocContexts:
		g.lastSent = int32(s.Index)
		g.ctx[g.nctx] = sc.contextOf(dc, si)
		g.nctx++
		if k := g.nctx - 1; k > 0 && !g.firstGood && goodContext(s, dc.contexts[g.ctx[k]].text) {
			g.ctx[0], g.ctx[k] = g.ctx[k], g.ctx[0]
			g.firstGood = true
		} else if k == 0 {
			g.firstGood = goodContext(s, dc.contexts[g.ctx[0]].text)
		}
	case !g.firstGood && goodContext(s, sc.sentenceText(dc, si)):
		g.lastSent = int32(s.Index)
		g.ctx[0] = sc.contextOf(dc, si)
		g.firstGood = true
	}
}

// maxContextLen is the longest sentence preferred as a context, in bytes:
// longer ones are mostly run-on text that tables and lists turned into one
// "sentence".
const maxContextLen = 300

// goodContext reports whether sentence s, of text text, is a good example:
// not a heading or caption as the document's markup showed it (a caption
// may end in a full stop, a heading may be "Step 3. Open the Valve."), and
// a full sentence (ending in a full stop, a question or exclamation mark,
// maybe followed by a closing quote or bracket) of at most maxContextLen
// bytes and more than three words' worth of text, so not a heading the
// markup did not show either, nor a list item.
func goodContext(s *doc.Sentence, text string) bool {
	if s.Heading {
		return false
	}
	t := strings.TrimRight(text, "\"')]”’ ")
	return len(text) <= maxContextLen && len(t) > 20 && strings.ContainsAny(t[len(t)-1:], ".!?") && strings.Count(t, " ") >= 3
}

// sentenceText returns the text of the current sentence si as contextOf
// stores it.
func (sc *scratch) sentenceText(dc *DocCounts, si int) string {
	if k := sc.context[si]; k > 0 {
		return dc.contexts[k-1].text
	}
	s, _ := sc.surface(0, len(sc.doc.Sentences[si].Tokens))
	return s
}

// contextOf returns the index in dc.contexts of sentence si, adding it on
// first use: the many nested candidates of a sentence share its text.
func (sc *scratch) contextOf(dc *DocCounts, si int) int32 {
	if k := sc.context[si]; k > 0 {
		return k - 1
	}
	s := &sc.doc.Sentences[si]
	text, inBuf := sc.surface(0, len(s.Tokens))
	if inBuf {
		text = dc.arena.str(text)
	}
	dc.contexts = append(dc.contexts, ctxRef{text: text, line: int32(s.Line())})
	sc.context[si] = int32(len(dc.contexts))
	return int32(len(dc.contexts) - 1)
}

// hasAddress reports whether the span [i, j) of the current sentence
// has a token of a URL, an e-mail address or a file path
// (wordshape.IsAddress): such spans are no candidates. The tokens written
// together (no space between them) are tested as one piece of text, since
// the tokenizer splits a path at its slashes. addrBefore[k], worked out
// once per sentence, is the number of such tokens before token k.
func (sc *scratch) hasAddress(i, j int) bool {
	if !sc.addrKnown {
		sc.markAddresses()
	}
	return sc.addrBefore[j] != sc.addrBefore[i]
}

func (sc *scratch) markAddresses() {
	toks, text := sc.toks, sc.doc.Text
	if cap(sc.addrBefore) < len(toks)+1 {
		sc.addrBefore = make([]int32, len(toks)+1, 2*len(toks)+2)
	}
	sc.addrBefore = sc.addrBefore[:len(toks)+1]
	sc.addrBefore[0] = 0
	n := int32(0)
	for a := 0; a < len(toks); {
		b := a + 1 // toks[a:b] are written together
		for b < len(toks) && !toks[b-1].SpaceAfter && toks[b-1].End == toks[b].Start {
			b++
		}
		piece := toks[a].Form
		if b > a+1 && int(toks[a].Start) <= int(toks[b-1].End) && int(toks[b-1].End) <= len(text) {
			piece = text[toks[a].Start:toks[b-1].End]
		}
		addr := mayBeAddress(piece) && wordshape.IsAddress(piece)
		for k := a; k < b; k++ {
			if addr {
				n++
			}
			sc.addrBefore[k+1] = n
		}
		a = b
	}
	sc.addrKnown = true
}

// mayBeAddress is a quick test before wordshape.IsAddress: an address
// has a slash, a backslash or an at sign, or starts with "www.".
func mayBeAddress(s string) bool {
	for i := 0; i < len(s); i++ {
		switch s[i] {
		case '/', '\\', '@':
			return true
		}
	}
	return len(s) > 4 && s[3] == '.' && (s[0] == 'w' || s[0] == 'W')
}

// spanState tells whether the clean parts of the current sentence are
// known (see surface).
type spanState int8

const (
	spansUnknown spanState = iota
	spansKnown             // sc.unclean holds them
	spansOdd               // token offsets out of order or range: no fast path
)

// surface returns the span [i, j) of the current sentence as written,
// white space folded, as appendSurface does; inBuf is true when it is in
// sc.buf. The nested candidates of a sentence overlap, and checking the
// bytes of each span again took a sixth of the time of counting them. So
// the sentence's tokens and the gaps between them are checked once: a span
// of tokens that are valid UTF-8 without white space, with nothing or a
// single space between them, is its own folded form, a slice of the text.
func (sc *scratch) surface(i, j int) (s string, inBuf bool) {
	toks := sc.toks
	if sc.spans == spansUnknown {
		sc.spans = sc.markUnclean()
	}
	// Items 2k and 2k+1 are token k and the gap after it.
	if sc.spans == spansKnown && sc.unclean[2*(j-1)+1] == sc.unclean[2*i] {
		return sc.doc.Text[toks[i].Start:toks[j-1].End], false
	}
	s, sc.buf, inBuf = appendSurface(sc.buf[:0], sc.doc, toks[i:j])
	return s, inBuf
}

// markUnclean fills sc.unclean for the current sentence: unclean[m] is the
// number of unclean items among its first m tokens and gaps, taken in
// text order (token 0, gap 0, token 1, …). A token is clean when it is
// non-empty valid UTF-8 without white space, a gap when it is empty or one
// ASCII space.
func (sc *scratch) markUnclean() spanState {
	toks, text := sc.toks, sc.doc.Text
	u := append(sc.unclean[:0], 0)
	n := int32(0)
	for k := range toks {
		t := &toks[k]
		if t.Start < 0 || t.End < t.Start || int(t.End) > len(text) || k > 0 && t.Start < toks[k-1].End {
			return spansOdd
		}
		if !cleanToken(text[t.Start:t.End]) {
			n++
		}
		u = append(u, n)
		if k+1 < len(toks) {
			if next := toks[k+1].Start; next < t.End || int(next) > len(text) {
				return spansOdd
			} else if gap := text[t.End:next]; gap != "" && gap != " " {
				n++
			}
		}
		u = append(u, n)
	}
	sc.unclean = u
	return spansKnown
}

// cleanToken reports whether s is non-empty valid UTF-8 without white
// space (unicode.IsSpace), so that appendFields would leave it as it is.
func cleanToken(s string) bool {
	if s == "" {
		return false
	}
	for i := 0; i < len(s); {
		c := s[i]
		if c < utf8.RuneSelf {
			if c <= ' ' && asciiBlank[c] {
				return false
			}
			i++
			continue
		}
		r, size := utf8.DecodeRuneInString(s[i:])
		if r == utf8.RuneError && size == 1 || unicode.IsSpace(r) {
			return false
		}
		i += size
	}
	return true
}

// asciiBlank marks the ASCII white space of unicode.IsSpace.
var asciiBlank = [' ' + 1]bool{'\t': true, '\n': true, '\v': true, '\f': true, '\r': true, ' ': true}

// addSpelling counts a surface form of group g. A form made up in a
// scratch buffer (inBuf) is copied when it is new; others are slices of
// the document's text.
func (dc *DocCounts) addSpelling(g *docCand, text string, inBuf bool) {
	last := int32(-1)
	for k := g.spells; k >= 0; k = dc.spells[k].next {
		if dc.spells[k].text == text {
			dc.spells[k].n++
			return
		}
		last = k
	}
	if inBuf {
		text = dc.arena.str(text)
	}
	dc.spells = append(dc.spells, docSpelling{text: text, n: 1, next: -1})
	if last < 0 {
		g.spells = int32(len(dc.spells) - 1)
	} else {
		dc.spells[last].next = int32(len(dc.spells) - 1)
	}
}

// addCanonical counts the canonical spelling of span toks that sc.cw
// has written, in group g.
func (dc *DocCounts) addCanonical(sc *scratch, g *docCand, i, j int) {
	last := int32(-1)
	for k := g.canons; k >= 0; k = dc.canons[k].next {
		if dc.canons[k].text() == string(sc.cw.text) {
			dc.canons[k].n++
			return
		}
		last = k
	}
	dc.canons = append(dc.canons, sc.newCanonical(dc, i, j))
	if last < 0 {
		g.canons = int32(len(dc.canons) - 1)
	} else {
		dc.canons[last].next = int32(len(dc.canons) - 1)
	}
}

// newCanonical records the canonical spelling sc.cw has written for the
// span [i, j) of the current sentence, with its words, keys and tags.
func (sc *scratch) newCanonical(dc *DocCounts, i, j int) docCanonical {
	cw := &sc.cw
	v := docCanonical{n: 1, next: -1, textLen: int32(len(cw.text)), ends: int32(len(dc.ends)), nw: int32(len(cw.ends))}
	for _, end := range cw.ends {
		dc.ends = append(dc.ends, int32(end))
	}
	// The keys are the lemma keys of the candidate's words, punctuation
	// and hyphens left out. Function words stay: as the most general
	// words of a candidate they hold back prepositional phrases ("loss of
	// the signal"), which are rarely terms; leaving them out lowered F1 on
	// all three evaluation domains (README).
	b := append(sc.keyBuf[:0], cw.text...)
	for k := i; k < j; k++ {
		switch sc.toks[k].UPOS {
		case "PUNCT", "SYM":
			continue
		}
		if sc.isWord[k] {
			b = append(b, dc.words[sc.wordAt[k]].word...) // counted under its key
			dc.ends = append(dc.ends, int32(len(b)))
		}
	}
	sc.keyBuf = b
	v.nk = int32(len(dc.ends)) - v.ends - v.nw
	v.all = dc.arena.str(view(b))
	v.pos = sc.tagsOf(sc.toks[i:j])
	return v
}

// tagsOf returns the UPOS tags of the words of span toks as a string. The
// tagger gives tokens the tag strings of its tag set, so a sequence of
// tags comes back as the same strings: the string made for it last time
// is found by their addresses, without hashing or allocating.
func (sc *scratch) tagsOf(toks []doc.Token) string {
	cw := &sc.cw
	h := uint64(len(cw.words))
	for _, w := range cw.words {
		u := toks[w.to-1].UPOS
		h = (h ^ uint64(uintptr(unsafe.Pointer(unsafe.StringData(u)))) ^ uint64(len(u))<<48) * 0x9e3779b97f4a7c15
	}
	e := &sc.tags[h>>(64-tagCacheBits)]
	if e.h == h && cw.hasTags(e.pos, toks) {
		return e.pos
	}
	sc.tagBuf = cw.appendTags(sc.tagBuf[:0], toks)
	e.h, e.pos = h, string(sc.tagBuf) // not in the arena: corpora keep it as it is
	return e.pos
}

// tagCache holds tag strings made, by a hash of the addresses of the tags.
type tagCache [1 << tagCacheBits]struct {
	h   uint64
	pos string
}

const tagCacheBits = 10
