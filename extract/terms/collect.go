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
	"unicode"
	"unicode/utf8"

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
	// Keep, when set, decides on each candidate occurrence from its tokens
	// (the include and exclude patterns of the command line).
	Keep func(toks []doc.Token) bool
}

// DefaultMaxWords is the default longest candidate, in orthographic words
// ("root-zone temperature sensor" has three). Longer noun phrases are
// rarely glossary entries and mostly fragments of names and titles: on the
// three evaluation domains a limit of 3 ranked better than 4, 5 or 6
// (README); --max-words raises it.
const DefaultMaxWords = 3

// Context is an example sentence of a candidate.
type Context struct {
	Doc  string `json:"doc"`
	Line int    `json:"line"`
	Text string `json:"text"`
}

// occurrence counts of one candidate group in one document.
//
// A candidate rarely has more than one or two spellings within a document,
// so they are kept in short slices searched linearly: four maps per
// candidate and document made counting the slowest step of the pipeline.
type docCand struct {
	freq     int
	variants []spelling  // surface forms as written, with counts
	canon    []canonical // canonical spellings, with counts
	contexts []Context
	lastSent int // sentence index of the last context taken
}

// spelling is a string with its count.
type spelling struct {
	text string
	n    int
}

// canonical is a canonical spelling with its count, words and UPOS tags.
type canonical struct {
	spelling
	words []string
	pos   string
	keys  []string // content words' lemma keys, for domain specificity
}

// DocCounts are what one document contributes.
type DocCounts struct {
	Name   string
	Tokens int
	// Words counts every word token by its lower-cased lemma, for domain
	// specificity against a reference corpus.
	Words map[string]int
	cands map[string]*docCand
	order []string // group keys in order of first occurrence
}

// Collector finds candidates with a matcher (normally the stock "terms"
// rules run in nested mode, so that sub-phrases are candidates too).
type Collector struct {
	m   *pattern.Matcher
	opt Options
}

// NewCollector returns a Collector; it is safe for concurrent use.
func NewCollector(m *pattern.Matcher, opt Options) *Collector {
	if opt.MaxWords <= 0 {
		opt.MaxWords = DefaultMaxWords
	}
	return &Collector{m: m, opt: opt}
}

// CountWords counts a document's word tokens by lower-cased lemma, without
// looking for candidates: the counts of a reference corpus.
func CountWords(d *doc.Document) *DocCounts {
	dc := &DocCounts{Name: d.Name, Words: map[string]int{}, cands: map[string]*docCand{}}
	for si := range d.Sentences {
		dc.countWords(d.Sentences[si].Tokens)
	}
	return dc
}

func (dc *DocCounts) countWords(toks []doc.Token) {
	for i := range toks {
		if isWord(toks[i].Form) {
			dc.Tokens++
			dc.Words[WordKey(&toks[i])]++
		}
	}
}

// Collect counts the candidates of one annotated document.
func (c *Collector) Collect(d *doc.Document) *DocCounts {
	dc := &DocCounts{Name: d.Name, Words: map[string]int{}, cands: map[string]*docCand{}}
	for si := range d.Sentences {
		s := &d.Sentences[si]
		toks := s.Tokens
		dc.countWords(toks)
		seen := map[[2]int]bool{}
		ctx := sentenceContext{d: d, s: s}
		for _, m := range c.m.FindNested(toks) {
			span := [2]int{m.Start, m.End}
			if seen[span] {
				continue // the same span found by several rules counts once
			}
			seen[span] = true
			cand, ok := c.candidate(d, toks, m.Start, m.End)
			if !ok {
				continue
			}
			dc.add(cand, &ctx)
		}
	}
	return dc
}

// cand is one candidate occurrence.
type cand struct {
	key     string   // group key: lower-cased, hyphens and spaces removed
	canon   string   // canonical spelling: head lemmatized, case folded
	words   []string // canonical words
	pos     string   // UPOS tags of the words, space-separated
	keys    []string // lemma keys of the content words (see contentKeys)
	surface string   // as written, white space folded
}

// candidate checks and normalizes the span [i, j) of a sentence.
func (c *Collector) candidate(d *doc.Document, toks []doc.Token, i, j int) (cand, bool) {
	if j <= i || !isWord(toks[i].Form) || !isWord(toks[j-1].Form) {
		return cand{}, false
	}
	// A span must not cut a hyphenated compound: "compensating drip emitter"
	// inside "pressure-compensating drip emitter" is no candidate.
	if i > 0 && glued(toks[i-1], toks[i]) && isHyphen(toks[i-1].Form) {
		return cand{}, false
	}
	if j < len(toks) && glued(toks[j-1], toks[j]) && isHyphen(toks[j].Form) {
		return cand{}, false
	}
	words, lowerWords, pos := canonicalWords(toks[i:j])
	if len(words) == 0 || len(words) > c.opt.MaxWords {
		return cand{}, false
	}
	if c.opt.Stop != nil {
		if c.opt.Stop[lowerWords[0]] || c.opt.Stop[lowerWords[len(lowerWords)-1]] || c.opt.Stop[strings.Join(lowerWords, " ")] {
			return cand{}, false
		}
	}
	if c.opt.Keep != nil && !c.opt.Keep(toks[i:j]) {
		return cand{}, false
	}
	var key strings.Builder
	for _, w := range lowerWords {
		for _, r := range w {
			if r != '-' && r != '‐' && r != '‑' {
				key.WriteRune(r)
			}
		}
	}
	return cand{
		key:     key.String(),
		canon:   strings.Join(words, " "),
		words:   words,
		pos:     pos,
		keys:    contentKeys(toks[i:j]),
		surface: surfaceOf(d, toks[i:j]),
	}, true
}

func (dc *DocCounts) add(cd cand, ctx *sentenceContext) {
	g := dc.cands[cd.key]
	if g == nil {
		g = &docCand{}
		dc.cands[cd.key] = g
		dc.order = append(dc.order, cd.key)
	}
	g.freq++
	g.variants = addSpelling(g.variants, spelling{cd.surface, 1})
	found := false
	for i := range g.canon {
		if g.canon[i].text == cd.canon {
			g.canon[i].n++
			found = true
			break
		}
	}
	if !found {
		g.canon = append(g.canon, canonical{spelling{cd.canon, 1}, cd.words, cd.pos, cd.keys})
	}
	// One context per sentence; the corpus keeps the first few overall.
	if len(g.contexts) < maxDocContexts {
		if len(g.contexts) == 0 || g.lastSent != ctx.s.Index {
			g.lastSent = ctx.s.Index
			g.contexts = append(g.contexts, ctx.context())
		}
	}
}

// sentenceContext makes the context of a sentence once, on first use:
// the many nested candidates of a sentence share one string.
type sentenceContext struct {
	d    *doc.Document
	s    *doc.Sentence
	cx   Context
	done bool
}

func (c *sentenceContext) context() Context {
	if !c.done {
		// A copy: the text may be a slice of the document's, which the
		// corpus must not keep alive for one sentence.
		c.cx = Context{Doc: c.d.Name, Line: c.s.Line(), Text: strings.Clone(sentenceText(c.d, c.s))}
		c.done = true
	}
	return c.cx
}

// maxDocContexts bounds the contexts one document offers a candidate.
const maxDocContexts = 3

// canonicalWords joins hyphenated parts back into orthographic words and
// normalizes them: every word lower-cased except acronyms and proper nouns,
// the head replaced by its lemma. It returns the canonical
// words, their lower-cased forms and their UPOS tags (a hyphenated word
// takes the tag of its last part).
func canonicalWords(toks []doc.Token) (words, lower []string, pos string) {
	type word struct {
		text  string
		last  *doc.Token
		upper bool
	}
	ws := make([]word, 0, len(toks)) // sized once: called for every nested span
	for k := 0; k < len(toks); k++ {
		t := &toks[k]
		if len(ws) > 0 && k > 0 && glued(toks[k-1], *t) && (isHyphen(t.Form) || isHyphen(toks[k-1].Form)) {
			w := &ws[len(ws)-1]
			w.text += t.Form
			w.last = t
			continue
		}
		ws = append(ws, word{text: t.Form, last: t})
	}
	// The head is the last word of the first noun phrase: the word before
	// the first preposition ("angles of attack" → "angle of attack"), or
	// else the last word.
	head := len(ws) - 1
	for n := 1; n < len(ws)-1; n++ {
		if ws[n].last.UPOS == "ADP" {
			head = n - 1
			break
		}
	}
	words = make([]string, 0, len(ws))
	lower = make([]string, 0, len(ws))
	var tags strings.Builder
	tags.Grow(5 * len(ws))
	for n, w := range ws {
		text := w.text
		// Proper nouns keep their case here; the corpus folds a group's case
		// when a lower-case spelling of it occurs too.
		keepCase := isAcronym(text) || w.last.UPOS == "PROPN"
		if n == head && w.last.Lemma != "" && !strings.ContainsAny(text, "-") {
			text = headLemma(text, w.last.Lemma, keepCase)
		} else if n == head && w.last.Lemma != "" {
			// hyphenated head: lemmatize its last part ("set-points" -> "set-point")
			if cut := strings.LastIndexAny(text, "-"); cut >= 0 && strings.EqualFold(text[cut+1:], w.last.Form) {
				text = text[:cut+1] + w.last.Lemma
			}
		}
		if !keepCase {
			text = strings.ToLower(text)
		}
		words = append(words, text)
		lower = append(lower, strings.ToLower(text))
		if n > 0 {
			tags.WriteByte(' ')
		}
		tags.WriteString(w.last.UPOS)
	}
	return words, lower, tags.String()
}

// headLemma returns the canonical head word. Words that keep their case
// (acronyms, names) keep their spelling when the lemma only changes case or
// drops a plural s ("PLCs" → "PLC", "VPD" stays "VPD").
func headLemma(form, lemma string, keepCase bool) string {
	if !keepCase {
		return lemma
	}
	switch {
	case strings.EqualFold(form, lemma):
		return form
	case strings.HasSuffix(form, "s") && strings.EqualFold(form[:len(form)-1], lemma):
		return form[:len(form)-1]
	}
	return lemma
}

// contentKeys returns the lemma keys (see WordKey) of a candidate's words,
// punctuation and hyphens left out. Function words stay: as the most
// general words of a candidate they hold back prepositional phrases ("loss
// of the signal"), which are rarely terms; leaving them out lowered F1 on
// all three evaluation domains (README).
func contentKeys(toks []doc.Token) []string {
	var keys []string
	for i := range toks {
		switch toks[i].UPOS {
		case "PUNCT", "SYM":
			continue
		}
		if isWord(toks[i].Form) {
			keys = append(keys, WordKey(&toks[i]))
		}
	}
	return keys
}

// WordKey is the key a word token is counted under for domain specificity:
// its lemma (or form) lower-cased.
func WordKey(t *doc.Token) string {
	w := t.Lemma
	if w == "" {
		w = t.Form
	}
	return strings.ToLower(w)
}

func glued(a, b doc.Token) bool { return !a.SpaceAfter && a.End == b.Start }

func isHyphen(s string) bool { return s == "-" || s == "‐" || s == "‑" }

// isWord reports whether a token contains a letter or a digit.
func isWord(s string) bool {
	for _, r := range s {
		if unicode.IsLetter(r) || unicode.IsDigit(r) {
			return true
		}
	}
	return false
}

func isAcronym(s string) bool {
	upper := 0
	for _, r := range s {
		if unicode.IsLower(r) {
			return false
		}
		if unicode.IsUpper(r) {
			upper++
		}
	}
	return upper >= 2
}

// surfaceOf returns the span as written in the document, white space folded.
func surfaceOf(d *doc.Document, toks []doc.Token) string {
	a, b := toks[0].Start, toks[len(toks)-1].End
	if a >= 0 && b <= len(d.Text) && a < b && d.Text[a:b] != "" && utf8.ValidString(d.Text[a:b]) {
		if span := d.Text[a:b]; singleSpaced(span) {
			return span // most spans: no copy
		}
		return strings.Join(strings.Fields(d.Text[a:b]), " ")
	}
	var sb strings.Builder
	for k, t := range toks {
		sb.WriteString(t.Form)
		if k < len(toks)-1 && t.SpaceAfter {
			sb.WriteByte(' ')
		}
	}
	return sb.String()
}

// singleSpaced reports whether s is ASCII with single spaces between
// words only, so that folding its white space would not change it.
func singleSpaced(s string) bool {
	if s[0] == ' ' || s[len(s)-1] == ' ' {
		return false
	}
	for i := 0; i < len(s); i++ {
		switch c := s[i]; {
		case c >= utf8.RuneSelf, c == '\t', c == '\n', c == '\v', c == '\f', c == '\r':
			return false
		case c == ' ' && s[i+1] == ' ':
			return false
		}
	}
	return true
}

func sentenceText(d *doc.Document, s *doc.Sentence) string {
	if len(s.Tokens) == 0 {
		return ""
	}
	return surfaceOf(d, s.Tokens)
}
