package hmm

import (
	"strings"
	"sync/atomic"

	"glossmith/tagger/doc"
	"glossmith/tagger/spelling"
)

// workspace is what one goroutine needs to tag a sentence: the Viterbi
// state, the scratch space of scoring and the memo of lexicon words'
// lemmas. The model pools workspaces, so that tagging allocates nothing
// once they have grown; each part is kept apart because each has its own
// lifetime (the lattice is rebuilt per sentence, the caches of scoring and
// the lemma memo last as long as the workspace).
type workspace struct {
	lattice
	featureScratch
	lemmaMemo
	heading []doc.Token // a heading's tokens as the tagger sees them (Model.Tag)
	spelled []doc.Token // the tokens with misspelt words read as meant (spellView)
	speller spelling.Corrector
	// misspelt memoizes readings of words outside the lexicon ("" for
	// none), see spellView.
	misspelt map[string]string
}

// newWorkspace returns an empty workspace.
func newWorkspace() *workspace {
	ws := &workspace{lattice: newLattice(), misspelt: map[string]string{}}
	ws.tagIndex.clear()
	return ws
}

// reset starts the lattice of a sentence of n tokens.
func (ws *workspace) reset(n int) {
	ws.lattice.reset(n)
	ws.wid = ws.wid[:0]
}

// featureScratch is the scratch space of scoring a sentence's tokens:
// feature keys and hashes, the tokens' views (see views.go) with the cache
// of views of words outside the lexicon, and the parts of the token being
// scored.
type featureScratch struct {
	buf      []byte   // scratch for lower-casing and the like
	keys     []uint64 // feature keys of the tokens, see extractFeatures
	keyOff   []int32  // keys of token i: keys[keyOff[i]:keyOff[i+1]]
	aloneEnd []int32  // keys of token i from aloneEnd[i] on depend on its context
	info     []tokenInfo
	need     []bool  // tokens that need features (nil or empty: all)
	wid      []int32 // lexicon index of each token, -1 if unknown
	// classes gives the word class features (nil: none).
	classes *classFeatures

	// views[i] is the view of token i: a shared lexicon view, one from
	// cache (whose word-alone scores live in cacheAlone), or one built
	// aside (asideAlone) when its cache slot was taken in this sentence.
	views      []*wordView
	cache      []cachedView
	cacheAlone []int32
	aside      []wordView
	asideAlone []int32
	// cacheWeights identifies the weights the cached views were read
	// from (perceptron.id): the cache is emptied when they change.
	cacheWeights uint64
	sentence     uint64 // counts the sentences scored, for the cache

	// The context parts of the token being scored and of the next one
	// (see contextParts): feature rows and neighbours' side vectors.
	rows, nextRows []int32
	vecs, nextVecs [][]int16
	steps          [256]int32 // scratch: one score per tag, in weight steps
	// acc sums the rows of an open token, in steps; it is zero between
	// tokens (scoreOpenToken clears it as it reads it).
	acc      [256]int32
	tagIndex tagIndex
}

// tagIndex maps the tags of one position to their index, every other tag
// to -1 (see mark), so that a short row is read once whatever the number
// of tags.
type tagIndex [256]int16

func (x *tagIndex) clear() {
	for i := range x {
		x[i] = -1
	}
}

// mark points the index at each of tags; unmark undoes it, leaving every
// entry -1 again.
func (x *tagIndex) mark(tags []uint8) {
	for k, t := range tags {
		x[t] = int16(k)
	}
}

func (x *tagIndex) unmark(tags []uint8) {
	for _, t := range tags {
		x[t] = -1
	}
}

// weightsIDs numbers the perceptrons' weights as they are prepared, so
// that a workspace can tell whether its cached views were read from the
// weights it now scores with (training replaces a model's weights after
// every epoch and keeps its pooled workspaces).
var weightsIDs atomic.Uint64

// lemmaMemo memoizes the lemmas of lexicon words in states they were not
// seen in, direct-mapped: the lexicon's precomputed lemmas cover the
// states a word was seen in, and a lexicon word's view is shared by all
// goroutines, so this memo is the workspace's own.
type lemmaMemo struct {
	lexMemo []lexLemmaSlot
}

// lexLemmaBits gives the number of slots (1<<lexLemmaBits) of the memo.
const lexLemmaBits = 12

// lexLemmaSlot is one slot of that memo.
type lexLemmaSlot struct {
	key   uint64 // 1 + word<<8 + state; 0 for an empty slot
	lemma string
}

// lexLemma returns the lemma of lexicon word w in state st from the memo,
// or from find (whose result is kept) when absent.
func (lm *lemmaMemo) lexLemma(w int32, st uint8, find func() string) string {
	if lm.lexMemo == nil {
		lm.lexMemo = make([]lexLemmaSlot, 1<<lexLemmaBits)
	}
	key := 1 + uint64(w)<<8 + uint64(st)
	e := &lm.lexMemo[(key*0x9E3779B97F4A7C15)>>(64-lexLemmaBits)]
	if e.key != key {
		// A clone: the lemma may be a slice of the document's text.
		e.key, e.lemma = key, strings.Clone(find())
	}
	return e.lemma
}
