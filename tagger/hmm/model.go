// Package hmm is glossmith's part-of-speech tagger: trigram hidden Markov
// models trained from a CoNLL-U treebank, decoded with Viterbi.
//
// Two ways of estimating the same model are offered:
//
//   - MethodHMM, the generative trigram tagger of Brants (2000), "TnT — a
//     statistical part-of-speech tagger": transition probabilities
//     interpolated from uni-, bi- and trigram estimates with weights found
//     by deleted interpolation, emission probabilities for known words, and
//     a suffix model (separate tables for capitalized and lower-case words)
//     for unknown ones. Training is counting; it is the fast baseline.
//   - MethodPerceptron, the discriminatively trained HMM of Collins (2002),
//     "Discriminative training methods for hidden Markov models": the same
//     trigram Viterbi decoding, with weights for rich features of the word
//     and its neighbours and for tag bigrams and trigrams, learned by the
//     averaged structured perceptron. It is the default model.
//
// The states of both are "joint" tags, a fine Penn tag together with its
// Universal Dependencies tag (XPOS+UPOS), or fine tags alone with UPOS
// chosen afterwards from the word and its fine tag (TagsetXPOS). Lemmas
// come from package lemma. A Model is read-only once built and safe for
// concurrent use.
package hmm

import (
	"slices"
	"strings"
	"sync"

	"glossmith/tagger/doc"
	"glossmith/tagger/genfreq"
	"glossmith/tagger/lemma"
	"glossmith/tagger/spelling"
	"glossmith/tagger/titlecase"
	"glossmith/tagger/wordnet"
)

// Training methods.
const (
	MethodHMM        = "hmm"
	MethodPerceptron = "perceptron"
)

// Tag sets.
const (
	TagsetJoint = "joint" // states are XPOS+UPOS pairs
	TagsetXPOS  = "xpos"  // states are XPOS; UPOS from (word, XPOS)
)

// maxTags is the largest number of states; tags are stored as bytes and
// one index is kept for the sentence boundary.
const maxTags = 255

// Info describes a model for `glossmith` users and reports.
type Info struct {
	Method        string `json:"method"`
	Tagset        string `json:"tagset"`
	Source        string `json:"source"`
	States        int    `json:"states"`
	UPOSTags      int    `json:"upos_tags"`
	XPOSTags      int    `json:"xpos_tags"`
	Words         int    `json:"words"`
	Features      int    `json:"features,omitempty"`
	Weights       int    `json:"weights,omitempty"`
	Epochs        int    `json:"epochs,omitempty"`
	LemmaRules    int    `json:"lemma_rules"`
	LemmaExcepts  int    `json:"lemma_exceptions"`
	TrainingToken int    `json:"training_tokens"`
}

// wordEntry is what the lexicon knows of a training word form.
type wordEntry struct {
	count int32
	first int32 // tagged counts in Model.wtags/wcount[first:first+ntags]
	ntags int32
}

// tagLemma is a tag of a lexicon word and the word's lemma with it.
type tagLemma struct {
	tag   uint8
	lemma string
}

// Model is a trained tagger.
type Model struct {
	method string
	tagset string
	source string
	epochs int

	tags       []string // state names: "XPOS\tUPOS" (joint) or "XPOS"
	tagX, tagU []string // per state

	// Lexicon of training word forms with the tags each was seen with.
	lex    map[string]int32
	words  []wordEntry
	wtags  []uint8
	wcount []int32
	// wlex[j] is wtags[j] with the lemma of the word with that tag,
	// precomputed: side by side, so that finding a token's lemma reads
	// one place (the tagger knows the word's range from its view).
	wlex []tagLemma

	// UPOS for TagsetXPOS: by lower-cased word and XPOS state, then by XPOS.
	uposByWord map[string][]uposChoice
	uposByTag  []string

	lem *lemma.Lemmatizer

	// wn is the table of word classes from WordNet that the perceptron's
	// features read (nil in models trained without it, and in those of
	// format versions before 4); wnText is the table as stored.
	wn     *wordnet.Table
	wnText string
	// freq is the table of general-English frequency bands the
	// perceptron's features read (nil in models trained without it and in
	// those of format versions before 5); freqText is the table as stored.
	freq     *genfreq.Table
	freqText string

	// General-language reference counts from the training data.
	refForm  map[string]int32
	refLemma map[string]int32
	refSize  int

	trans transitions
	beam  float32
	gen   *generative
	perc  *perceptron

	pool sync.Pool // *workspace
	// spellDict is the dictionary of readings of misspelt words, built
	// on first use (spellDictionary).
	spellOnce sync.Once
	spellDict *spelling.Dictionary
}

type uposChoice struct {
	xpos uint8
	upos string
}

// Info describes the model.
func (m *Model) Info() Info {
	ux := map[string]bool{}
	uu := map[string]bool{}
	for i := range m.tags {
		ux[m.tagX[i]] = true
		if m.tagU[i] != "" {
			uu[m.tagU[i]] = true
		}
	}
	for _, u := range m.uposByTag {
		uu[u] = true
	}
	for _, cs := range m.uposByWord {
		for _, c := range cs {
			uu[c.upos] = true
		}
	}
	in := Info{Method: m.method, Tagset: m.tagset, Source: m.source, States: len(m.tags),
		UPOSTags: len(uu), XPOSTags: len(ux), Words: len(m.words), Epochs: m.epochs, TrainingToken: m.refSize}
	if m.perc != nil {
		in.Features = len(m.perc.keys)
		in.Weights = len(m.perc.cells)
	}
	in.LemmaExcepts, in.LemmaRules = m.lem.Size()
	return in
}

// RefFreq returns how often the lower-cased word form occurred in the
// training data: a general-language reference count.
func (m *Model) RefFreq(word string) int { return int(m.refForm[strings.ToLower(word)]) }

// RefLemmaFreq returns how often the lower-cased lemma occurred in the
// training data.
func (m *Model) RefLemmaFreq(l string) int { return int(m.refLemma[strings.ToLower(l)]) }

// RefSize returns the number of tokens of the training data.
func (m *Model) RefSize() int { return m.refSize }

// Known reports whether the word form was seen in training.
func (m *Model) Known(form string) bool { _, ok := m.lex[form]; return ok }

// TagDocument tags every sentence, unless the document came fully tagged.
// Its headings are read with the evidence of its running text
// (titlecase.Gather).
func (m *Model) TagDocument(d *doc.Document) {
	if d.Tagged() {
		return
	}
	var ev *titlecase.Evidence
	if m.freq != nil || m.wn != nil {
		ev = titlecase.Gather(d.Sentences)
	}
	for i := range d.Sentences {
		m.tag(&d.Sentences[i], ev)
	}
}

// pretagged reports whether every token has UPOS, XPOS and lemma.
func pretagged(s *doc.Sentence) bool {
	for i := range s.Tokens {
		t := &s.Tokens[i]
		if t.UPOS == "" || t.XPOS == "" || t.Lemma == "" {
			return false
		}
	}
	return len(s.Tokens) > 0
}

// Tag fills UPOS, XPOS and Lemma of every token of the sentence. A sentence
// whose tokens all carry the three already is left as it is.
func (m *Model) Tag(s *doc.Sentence) { m.tag(s, nil) }

// tag is Tag with the evidence of the sentence's document, nil for none.
func (m *Model) tag(s *doc.Sentence, ev *titlecase.Evidence) {
	if len(s.Tokens) == 0 || pretagged(s) {
		return
	}
	ws := m.getWorkspace()
	defer m.pool.Put(ws)
	toks := s.Tokens
	if s.Heading {
		// The tagger reads a heading's title-case words as running text
		// would write them; the tags and lemmas it finds for those forms
		// go to the tokens as written.
		if v := (titlecase.Viewer{Freq: m.freq, WordNet: m.wn, Doc: ev}).View(ws.heading, s.Tokens); &v[0] != &toks[0] {
			toks, ws.heading = v, v
		}
	}
	// Misspelt words are tagged as the words they stand for, but keep a
	// lemma of their own: a wrong reading must not join another word's
	// counts in a term list.
	// The view is made before decoding, so that a sentence is decoded once.
	read := m.spellView(ws, toks)
	m.decode(ws, read)
	for i := range toks {
		t := &toks[i]
		st := ws.tags[i]
		t.XPOS = m.tagX[st]
		if r := &read[i]; r != t {
			t.UPOS = m.uposOf(r.Form, st)
			t.Lemma = m.unknownLemma(t.Form, t.UPOS, t.XPOS)
			continue
		}
		t.UPOS = m.uposOf(t.Form, st)
		t.Lemma = ""
		if w := ws.wid[i]; w >= 0 {
			t.Lemma = m.lexiconLemma(ws, i, w, st)
		}
		if t.Lemma == "" {
			t.Lemma = m.memoLemma(ws, i, st, t)
		}
	}
	if &read[0] != &toks[0] {
		clear(read) // the workspace outlives the document's text
	}
	if &toks[0] != &s.Tokens[0] {
		for i := range toks {
			o, v := &s.Tokens[i], &toks[i]
			o.XPOS, o.UPOS, o.Lemma = v.XPOS, v.UPOS, v.Lemma
		}
		clear(toks) // the workspace outlives the document's text
	}
}

// commonLemma returns the tag a lexicon word was seen with most often in
// training (the first of equals) and the word's lemma with it.
func (m *Model) commonLemma(e wordEntry) tagLemma {
	if e.ntags <= 0 {
		return tagLemma{} // (a model file may hold such an entry)
	}
	best := e.first
	for j := e.first; j < e.first+e.ntags; j++ {
		if m.wcount[j] > m.wcount[best] {
			best = j
		}
	}
	return m.wlex[best]
}

// lexiconLemma returns the lexicon's lemma of token i, lexicon word w,
// in state st, or "" when the word was not seen with that state: from the
// view when st is the word's most frequent tag, else from the lexicon.
func (m *Model) lexiconLemma(ws *workspace, i int, w int32, st uint8) string {
	var first, n int32
	if m.perc != nil {
		v := ws.views[i]
		if v.lemmaSet && v.lemmaState == st {
			return v.lemma
		}
		first, n = v.wfirst, int32(v.wn)
	}
	if n == 0 {
		e := &m.words[w]
		first, n = e.first, e.ntags
	}
	for _, x := range m.wlex[first : first+n] {
		if x.tag == st {
			return x.lemma
		}
	}
	return ""
}

// memoLemma lemmatizes token i in state st when the lexicon has no lemma
// for it. The view of a word outside the lexicon belongs to this workspace
// alone, so it can keep the last lemma found for the word: an unknown
// domain word mostly recurs with the same tag, and its lemma then costs
// no look-ups. The lemmas of lexicon words in states they were never seen
// in (0.37 s of the 1.2 s this function took on the 100 MB benchmark
// corpus) are memoized by the workspace (lemmaMemo).
func (m *Model) memoLemma(ws *workspace, i int, st uint8, t *doc.Token) string {
	if w := ws.wid[i]; w >= 0 {
		// A lexicon word with a tag it was not seen with in training: its
		// view is shared by all goroutines, so the memo is the workspace's
		// own, by word and state (which settle form, UPOS and XPOS).
		return ws.lexLemma(w, st, func() string { return m.unknownLemma(t.Form, t.UPOS, t.XPOS) })
	}
	if m.perc == nil || i >= len(ws.views) {
		return m.unknownLemma(t.Form, t.UPOS, t.XPOS)
	}
	v := ws.views[i]
	if !v.lemmaSet || v.lemmaState != st {
		// A clone: the lemma may be the form itself, a slice of the
		// document's text, which the cache would otherwise keep alive.
		v.lemma = strings.Clone(m.unknownLemma(t.Form, t.UPOS, t.XPOS))
		v.lemmaState, v.lemmaSet = st, true
	}
	return v.lemma
}

// unknownLemma lemmatizes a word unseen in training. The suffix rules learn
// from the treebank's frequent irregulars ("wolves" → "wolf", "freed" →
// "free"), which leads them astray on rarer regular words ("valves" →
// "valf", "bleed" → "blee"). So the rule's reading is weighed against the
// plain ones — the word itself, and for a plural noun or a third-person
// verb the word less "s" or "es" — and the reading seen most often as a
// lemma in training wins; the rule's reading stands on a tie. Then, for an
// inflected form whose reading WordNet does not list as a base form of the
// word ("closest" → "clos", "smelled" → "smel", "won" → "wo"), WordNet's
// base forms (exception lists first) take its place, the one seen most
// often as a lemma in training first.
func (m *Model) unknownLemma(form, upos, xpos string) string {
	lem := m.lem.Lemma(form, upos, xpos)
	if upos == "PROPN" || lem == "" {
		return lem
	}
	best, bestN := lem, m.refLemma[strings.ToLower(lem)]
	low := strings.ToLower(form)
	try := func(cand string) {
		if n := m.refLemma[cand]; n > bestN {
			best, bestN = cand, n
		}
	}
	try(low)
	if xpos == "NNS" || xpos == "VBZ" {
		for _, cut := range []int{1, 2} {
			if len(low) > cut+2 && strings.HasSuffix(low, "es"[2-cut:]) {
				try(low[:len(low)-cut])
			}
		}
	}
	if p := inflectedPOS[xpos]; p != 0 && m.wn != nil {
		if bases := m.wn.Bases(low, p); len(bases) > 0 && !slices.Contains(bases, strings.ToLower(best)) {
			best, bestN = bases[0], m.refLemma[bases[0]]
			for _, b := range bases[1:] {
				try(b)
			}
		}
	}
	// A singular noun or a plain adjective rewritten to something neither
	// the treebank nor WordNet knows is the work of rules learned from the
	// treebank's typo corrections ("rode" → "road" made "corrode"
	// "corroad"): the word is its own lemma. (Numbers keep their rules:
	// the treebank writes "12,000" as "12000" on purpose.)
	if (xpos == "NN" || xpos == "JJ") && bestN == 0 && m.wn != nil {
		if lb := strings.ToLower(best); lb != low && !m.wn.Classes(lb).Listed() {
			best = low
		}
	}
	return best
}

// inflectedPOS maps the Penn tags of inflected forms to the WordNet part of
// speech whose base forms are their lemmas.
var inflectedPOS = map[string]wordnet.POS{
	"NNS": wordnet.Noun,
	"VBD": wordnet.Verb, "VBG": wordnet.Verb, "VBN": wordnet.Verb, "VBZ": wordnet.Verb,
	"JJR": wordnet.Adj, "JJS": wordnet.Adj,
	"RBR": wordnet.Adv, "RBS": wordnet.Adv,
}

// prepareLexicon precomputes the lemma of every (word, tag) of the
// lexicon, which spares the lemmatizer's look-ups for most tokens.
func (m *Model) prepareLexicon() {
	m.wlex = make([]tagLemma, len(m.wtags))
	for form, w := range m.lex {
		e := m.words[w]
		for j := e.first; j < e.first+e.ntags; j++ {
			st := m.wtags[j]
			m.wlex[j] = tagLemma{st, m.lem.Lemma(form, m.uposOf(form, st), m.tagX[st])}
		}
	}
}

func (m *Model) getWorkspace() *workspace {
	if ws, ok := m.pool.Get().(*workspace); ok {
		return ws
	}
	return newWorkspace()
}

// decode builds the lattice of a sentence with the model's scores and runs
// Viterbi; the best states are left in ws.tags.
func (m *Model) decode(ws *workspace, toks []doc.Token) {
	if m.perc != nil {
		m.perc.buildLattice(m, ws, toks)
	} else {
		m.gen.buildLattice(m, ws, toks)
	}
	ws.decode(&m.trans, m.beam)
}

// uposOf gives the UPOS of a word in a state.
func (m *Model) uposOf(form string, st uint8) string {
	if u := m.tagU[st]; u != "" {
		return u
	}
	if cs, ok := m.uposByWord[form]; ok {
		for _, c := range cs {
			if c.xpos == st {
				return c.upos
			}
		}
	}
	if lw := strings.ToLower(form); lw != form {
		for _, c := range m.uposByWord[lw] {
			if c.xpos == st {
				return c.upos
			}
		}
	}
	return m.uposByTag[st]
}

// entry returns the lexicon entry of a form.
func (m *Model) entry(form string) (*wordEntry, bool) {
	i, ok := m.lex[form]
	if !ok {
		return nil, false
	}
	return &m.words[i], true
}

// lookup returns the lexicon entry of a form and records its index as the
// next token's in fs.wid (-1 when unknown).
func (m *Model) lookup(fs *featureScratch, form string) (*wordEntry, bool) {
	i, ok := m.lex[form]
	if !ok {
		fs.wid = append(fs.wid, -1)
		return nil, false
	}
	fs.wid = append(fs.wid, i)
	return &m.words[i], true
}

func (m *Model) stateName(x, u string) string {
	if m.tagset == TagsetXPOS {
		return x
	}
	return x + "\t" + u
}
