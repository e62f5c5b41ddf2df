package terms

import (
	"sort"
	"strings"

	"glossmith/extract/termstat"
)

// Reference gives general-language word frequencies: by default those of
// the tagger's training treebank, carried in the model; or counts of the
// user's own reference documents.
type Reference interface {
	// Freq returns the frequency of a lower-cased lemma.
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
	for w, n := range dc.Words {
		// A copy, for every word and not only new ones: w may be a slice of
		// the document's text (see detach), and assigning to a string key
		// stores the key given even when the key is there already.
		c.Words[strings.Clone(w)] += n
	}
	c.Total += dc.Tokens
}

// docFreq is a candidate's count in one document. 32-bit fields: the
// per-document counts are the largest table of a big corpus (one entry per
// candidate and document), and halving them saves a quarter of its memory.
type docFreq struct{ doc, n int32 }

type group struct {
	key      string
	freq     int
	perDoc   []docFreq
	variants []spelling  // few per group: slices beat maps (see docCand)
	canon    []canonical // in order of first occurrence
	contexts []Context
	spare    []Context // further contexts, used when too few documents offer one
}

// Corpus merges the documents' counts in input order.
type Corpus struct {
	docs     []string
	docSize  []int
	words    Counts
	groups   map[string]*group
	order    []string
	contexts int
	budget   budget // see budget.go
}

// NewCorpus returns an empty corpus keeping up to contexts example
// sentences per candidate.
func NewCorpus(contexts int) *Corpus {
	return &Corpus{groups: map[string]*group{}, contexts: contexts}
}

// Add merges one document's counts. Call it in input order.
func (c *Corpus) Add(dc *DocCounts) {
	di := len(c.docs)
	c.docs = append(c.docs, dc.Name)
	c.docSize = append(c.docSize, dc.Tokens)
	c.words.Add(dc)
	for _, k := range dc.order {
		x := dc.cands[k]
		g := c.groups[k]
		if g == nil {
			g = &group{key: k}
			c.groups[k] = g
			c.order = append(c.order, k)
		}
		g.freq += x.freq
		g.perDoc = append(g.perDoc, docFreq{int32(di), int32(x.freq)})
		for _, v := range x.variants {
			n := len(g.variants)
			if g.variants = addSpelling(g.variants, v); len(g.variants) > n {
				g.variants[n].text = strings.Clone(v.text)
			}
		}
	canon:
		for _, v := range x.canon {
			for i := range g.canon {
				if g.canon[i].text == v.text {
					g.canon[i].n += v.n
					continue canon
				}
			}
			g.canon = append(g.canon, v.detach())
		}
		// Contexts: at most one per document until every candidate has
		// its quota, so examples show the term in different documents.
		for i, cx := range x.contexts {
			switch {
			case i == 0 && len(g.contexts) < c.contexts:
				g.contexts = append(g.contexts, cx)
			case len(g.spare) < c.contexts:
				g.spare = append(g.spare, cx)
			}
		}
	}
	c.checkBudget(dc)
}

// detach returns a copy of the canonical spelling that shares no memory
// with the document it came from. Strings cut from a document's text (a
// word form, a span) keep the whole text alive: kept in the corpus, they
// would hold every document ever read in memory.
//
// Every string field of canonical must be copied here.
func (v canonical) detach() canonical {
	v.text = strings.Clone(v.text)
	v.words = cloneAll(v.words)
	v.keys = cloneAll(v.keys)
	return v
}

func cloneAll(ss []string) []string {
	out := make([]string, len(ss))
	for i, s := range ss {
		out[i] = strings.Clone(s)
	}
	return out
}

// WordFreq returns how often a lower-cased lemma occurs in the corpus.
func (c *Corpus) WordFreq(w string) int { return c.words.Words[w] }

// Documents returns the number of documents merged.
func (c *Corpus) Documents() int { return len(c.docs) }

// Tokens returns the number of word tokens merged.
func (c *Corpus) Tokens() int { return c.words.Total }

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
	Score    float64   `json:"score"`
	Contexts []Context `json:"contexts,omitempty"`
	key      string
	words    []string
	keys     []string
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
	out := make([]*Term, 0, len(c.order))
	sizes := make([]float64, len(c.docSize))
	for i, n := range c.docSize {
		sizes[i] = float64(n)
	}
	parts, partsErr := termstat.NewParts(sizes)
	freqs := make([]float64, len(c.docSize))
	cands := make([]termstat.Candidate, 0, len(c.order))
	for _, k := range c.order {
		g := c.groups[k]
		cn := g.canonical()
		words := cn.words
		t := &Term{Term: cn.text, Words: len(words), POS: cn.pos, Freq: g.freq, Docs: len(g.perDoc), key: k, words: words}
		for _, v := range g.variants {
			t.Variants = append(t.Variants, Variant{v.text, v.n})
		}
		sort.Slice(t.Variants, func(i, j int) bool {
			a, b := t.Variants[i], t.Variants[j]
			if a.Count != b.Count {
				return a.Count > b.Count
			}
			return a.Form < b.Form
		})
		if partsErr == nil {
			clear(freqs)
			for _, df := range g.perDoc {
				freqs[df.doc] += float64(df.n)
			}
			t.DP, _ = parts.DP(freqs)
		}
		t.Contexts = g.contexts
		for _, cx := range g.spare {
			if len(t.Contexts) >= c.contexts {
				break
			}
			t.Contexts = append(t.Contexts, cx)
		}
		t.Keyness, t.Weirdness = c.specificity(cn.keys, ref, Alpha)
		t.keys = cn.keys
		out = append(out, t)
		lw := make([]string, len(words))
		for i, w := range words {
			lw[i] = strings.ToLower(w)
		}
		cands = append(cands, termstat.Candidate{Words: lw, Freq: float64(g.freq)})
	}
	if cv, err := termstat.CValue(dedupe(cands), termstat.CValueOptions{Weight: termstat.Log2LengthPlusOne}); err == nil {
		for i := range out {
			out[i].CValue = cv[i].Score
		}
	}
	return out
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
// of its least specific content word (keys are lemma keys). A term is taken
// to be as domain-specific as its most general word, so "wind turbine
// design" is held back by "design"; on the evaluation lists the minimum
// ranked better than the mean (see README).
func (c *Corpus) specificity(keys []string, ref Reference, alpha float64) (ll, weird float64) {
	if ref == nil || ref.Size() == 0 || c.words.Total == 0 {
		return 0, 0
	}
	for i, key := range keys {
		k := termstat.Contrast{Study: float64(c.words.Words[key]), Reference: float64(ref.Freq(key)),
			StudySize: float64(c.words.Total), ReferenceSize: float64(ref.Size())}
		k.Study = min(k.Study, k.StudySize)
		k.Reference = min(k.Reference, k.ReferenceSize)
		if wr := k.SmoothedWeirdness(alpha); i == 0 || wr < weird {
			weird, ll = wr, k.LL()
		}
	}
	return ll, weird
}
