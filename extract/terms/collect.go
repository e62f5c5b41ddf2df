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

// DefaultMaxWords is the default longest candidate: longer noun phrases are
// rarely terms and mostly fragments of names and titles.
const DefaultMaxWords = 6

// Context is an example sentence of a candidate.
type Context struct {
	Doc  string `json:"doc"`
	Line int    `json:"line"`
	Text string `json:"text"`
}

// occurrence counts of one candidate group in one document.
type docCand struct {
	freq     int
	variants map[string]int // surface form as written -> count
	canon    map[string]int // canonical spelling -> count
	words    map[string][]string
	pos      map[string]string
	contexts []Context
	lastSent int // sentence index of the last context taken
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
			dc.add(cand, d, s)
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
		surface: surfaceOf(d, toks[i:j]),
	}, true
}

func (dc *DocCounts) add(cd cand, d *doc.Document, s *doc.Sentence) {
	g := dc.cands[cd.key]
	if g == nil {
		g = &docCand{variants: map[string]int{}, canon: map[string]int{}, words: map[string][]string{}, pos: map[string]string{}}
		dc.cands[cd.key] = g
		dc.order = append(dc.order, cd.key)
	}
	g.freq++
	g.variants[cd.surface]++
	g.canon[cd.canon]++
	if _, ok := g.words[cd.canon]; !ok {
		g.words[cd.canon] = cd.words
		g.pos[cd.canon] = cd.pos
	}
	// One context per sentence; the corpus keeps the first few overall.
	if len(g.contexts) < maxDocContexts {
		if len(g.contexts) == 0 || g.lastSent != s.Index {
			g.lastSent = s.Index
			g.contexts = append(g.contexts, Context{Doc: d.Name, Line: s.Line(), Text: sentenceText(d, s)})
		}
	}
}

// maxDocContexts bounds the contexts one document offers a candidate.
const maxDocContexts = 3

// canonicalWords joins hyphenated parts back into orthographic words and
// normalizes them: every word lower-cased except acronyms and proper nouns,
// the last word (the head) replaced by its lemma. It returns the canonical
// words, their lower-cased forms and their UPOS tags (a hyphenated word
// takes the tag of its last part).
func canonicalWords(toks []doc.Token) (words, lower []string, pos string) {
	type word struct {
		text  string
		last  *doc.Token
		upper bool
	}
	var ws []word
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
	for n, w := range ws {
		text := w.text
		// Proper nouns keep their case here; the corpus folds a group's case
		// when a lower-case spelling of it occurs too.
		keepCase := isAcronym(text) || w.last.UPOS == "PROPN"
		if n == len(ws)-1 && w.last.Lemma != "" && !strings.ContainsAny(text, "-") {
			text = headLemma(text, w.last.Lemma, keepCase)
		} else if n == len(ws)-1 && w.last.Lemma != "" {
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
			pos += " "
		}
		pos += w.last.UPOS
	}
	return words, lower, pos
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

func sentenceText(d *doc.Document, s *doc.Sentence) string {
	if len(s.Tokens) == 0 {
		return ""
	}
	return surfaceOf(d, s.Tokens)
}
