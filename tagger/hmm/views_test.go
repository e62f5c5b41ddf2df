package hmm

import (
	"math/rand/v2"
	"slices"
	"strings"
	"sync"
	"testing"
	"unsafe"

	"glossmith/tagger/doc"
	"glossmith/tagger/model"

	"github.com/stretchr/testify/require"
)

// buildLatticeRef is the straightforward scoring of every token from its
// feature keys, as the decoder did before the per-word views: the test
// below holds the fast path to exactly the same lattice.
//
// It scores the tags of every token and keeps the candidates:
// the tag dictionary's tags for frequent words (one tag needs no scoring
// at all), the best maxCands tags for the others.
func (p *perceptron) buildLatticeRef(m *Model, ws *workspace, toks []doc.Token) {
	ws.reset(len(toks))
	// Look the words up first: a dictionary word with one tag needs no
	// features at all.
	ws.need = ws.need[:0]
	for i := range toks {
		e, ok := m.lookup(&ws.featureScratch, toks[i].Form)
		ws.need = append(ws.need, !ok || e.count < p.dictMin || p.dict[ws.wid[i]].n > 1)
	}
	ws.classes = p.classes
	ws.info = extractFeatures(&ws.featureScratch, toks, ws.info, m.wn, m.freq)
	ws.need = ws.need[:0]
	nt := len(m.tags)
	score := ws.score[:nt]
	for i := range toks {
		var e *wordEntry
		if w := ws.wid[i]; w >= 0 {
			e = &m.words[w]
		}
		dict := e != nil && e.count >= p.dictMin
		if dict && p.dict[ws.wid[i]].n == 1 {
			ws.add(p.dictTags(ws.wid[i])[0], 0)
			ws.closePos()
			continue
		}
		clear(score)
		from := ws.keyOff[i]
		if dict {
			from = ws.aloneEnd[i] // the word-alone part is in wscore
		}
		for _, k := range ws.keys[from:ws.keyOff[i+1]] {
			r := p.row(k)
			if r < 0 {
				continue
			}
			for _, c := range p.cells[p.rowStart[r]:p.rowStart[r+1]] {
				score[c.t] += c.w()
			}
		}
		if dict {
			for _, t := range p.dictTags(ws.wid[i]) {
				var alone float32 // what the old load-time table held
				for _, k := range ws.keys[ws.keyOff[i]:ws.aloneEnd[i]] {
					alone += p.weight(p.row(k), t)
				}
				ws.add(t, score[t]+alone)
			}
			ws.closePos()
			continue
		}
		selectCands(&ws.lattice, score, p.maxCands, 1)
	}
	// "Word after tag" rows by key, from the hashes of every token.
	p.fillPairs(&ws.lattice, &ws.tagIndex, uint8(nt), nil, func(i int, b uint8) int32 { return p.row(pairKey(ws.info[i].lower, b)) })
}

// weight returns the weight of row r for tag t (0 when absent), for the
// plain scoring above.
func (p *perceptron) weight(r int32, t uint8) float32 {
	return float32(p.steps(r, t)) * weightStep
}

// TestViewsMatchPlainScoring holds the decoder's fast scoring (views.go) to
// the plain one above: on every sentence of UD English EWT dev the two
// lattices — candidates, emission and pair scores — must be identical, bit
// for bit, and so must the tags.
func TestViewsMatchPlainScoring(t *testing.T) {
	_, dev, _ := ewt(t)
	m, err := Default()
	require.NoError(t, err)
	p := m.perc
	fast, plain := newWorkspace(), newWorkspace()
	toks := 0
	for _, s := range dev {
		p.buildLattice(m, fast, s.Tokens)
		p.buildLatticeRef(m, plain, s.Tokens)
		toks += len(s.Tokens)
		if !equalSlices(fast.cands, plain.cands) || !equalSlices(fast.off, plain.off) ||
			!equalSlices(fast.emit, plain.emit) || !equalSlices(fast.pair, plain.pair) {
			t.Fatalf("sentence %s: lattices differ\nfast  %v %v\nplain %v %v", s.ID, fast.cands, fast.emit, plain.cands, plain.emit)
		}
		fast.decode(&m.trans, m.beam)
		plain.decode(&m.trans, m.beam)
		if !equalSlices(fast.tags, plain.tags) {
			t.Fatalf("sentence %s: tags differ", s.ID)
		}
	}
	if toks < 20000 {
		t.Fatalf("only %d tokens compared", toks)
	}
}

func equalSlices[E comparable](a, b []E) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

// TestSelectCandsAgrees holds the stack-based selection to the plain
// insertion it replaced, on random scores with many ties.
func TestSelectCandsAgrees(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	la, lb := newLattice(), newLattice()
	a, b := &la, &lb
	score := make([]float32, 102)
	steps := make([]int32, 102)
	for round := 0; round < 2000; round++ {
		for i := range score {
			score[i] = float32(rng.IntN(20) - 10) // small range: ties are common
		}
		k := 1 + rng.IntN(maxFastCands+4) // beyond maxFastCands: the long way
		a.reset(1)
		b.reset(1)
		selectCands(a, score, k, 1)
		selectCandsLong(b, score, k)
		if !equalSlices(a.cands, b.cands) || !equalSlices(a.emit, b.emit) || !equalSlices(a.off, b.off) {
			t.Fatalf("k=%d: %v %v, want %v %v", k, a.cands, a.emit, b.cands, b.emit)
		}
		// The same scores in whole steps.
		for i := range score {
			steps[i] = int32(score[i])
		}
		a.reset(1)
		selectCands(a, steps, k, 1)
		if !equalSlices(a.cands, b.cands) || !equalSlices(a.emit, b.emit) || !equalSlices(a.off, b.off) {
			t.Fatalf("k=%d, steps: %v %v, want %v %v", k, a.cands, a.emit, b.cands, b.emit)
		}
		// The decoder's selection of at most eight, on all the tags and
		// on fewer tags than candidates.
		if k <= 8 {
			for _, n := range []int{len(steps), 1 + rng.IntN(12)} {
				a.reset(1)
				b.reset(1)
				// Split the scores into the four parts scoreOpenToken adds.
				var acc [256]int32
				alone := make([]int32, n)
				va, vb := make([]int16, n), make([]int16, n)
				for t, x := range steps[:n] {
					va[t] = int16(rng.IntN(200) - 100)
					vb[t] = int16(rng.IntN(200) - 100)
					acc[t] = int32(rng.IntN(200) - 100)
					alone[t] = x - int32(va[t]) - int32(vb[t]) - acc[t]
				}
				scoreOpenToken(a, alone, va, vb, &acc, k, 1)
				if acc != ([256]int32{}) {
					t.Fatalf("scoreOpenToken left the accumulator dirty: %v", acc[:n])
				}
				selectCandsLong(b, score[:n], k)
				if !equalSlices(a.cands, b.cands) || !equalSlices(a.emit, b.emit) || !equalSlices(a.off, b.off) {
					t.Fatalf("k=%d, %d tags, top 8: %v %v, want %v %v", k, n, a.cands, a.emit, b.cands, b.emit)
				}
			}
		}
	}
}

// TestConcurrentTaggingBuildsViewsSafely tags the same sentences from
// several goroutines on a freshly decoded model, whose lexicon views are
// all still unbuilt, and requires every goroutine to agree with a plain
// sequential run. Run it with -race: the views are built lazily and shared.
func TestConcurrentTaggingBuildsViewsSafely(t *testing.T) {
	_, dev, _ := ewt(t)
	dev = dev[:min(len(dev), 600)]
	fresh := func() *Model {
		m, err := Decode(model.EnglishEWT)
		require.NoError(t, err)
		return m
	}
	tagAll := func(m *Model) []string {
		var out []string
		for _, g := range dev {
			var s doc.Sentence
			for _, tok := range g.Tokens {
				s.Tokens = append(s.Tokens, doc.Token{Form: tok.Form})
			}
			m.Tag(&s)
			for _, tok := range s.Tokens {
				out = append(out, tok.XPOS+"/"+tok.UPOS+"/"+tok.Lemma)
			}
		}
		return out
	}
	want := tagAll(fresh())
	m := fresh()
	const workers = 4
	got := make([][]string, workers)
	var wg sync.WaitGroup
	for w := range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			got[w] = tagAll(m)
		}()
	}
	wg.Wait()
	for w := range workers {
		if !equalSlices(got[w], want) {
			t.Fatalf("goroutine %d tagged differently from a sequential run", w)
		}
	}
}

// TestRankedTransitionsDecodeAlike holds the trigram table indexed by tag
// frequency rank to the one indexed by tag: on EWT dev both must give the
// same best path for every sentence.
func TestRankedTransitionsDecodeAlike(t *testing.T) {
	_, dev, _ := ewt(t)
	m, err := Default()
	require.NoError(t, err)
	if m.trans.rank == nil {
		t.Fatal("the default model's transitions are not ranked")
	}
	if m.trans.steps == nil {
		t.Fatal("the default model's folded transitions are not in weight steps")
	}
	plain := (&transitions{t1: m.trans.t1, layers: m.perc.layers}).fold(nil)
	// The same table in float32, as it was before it was kept in steps:
	// the decoder must not tell the two apart.
	floats := transitions{t1: plain.t1, tri: padTri(plain.t1)}
	for i, q := range plain.steps[:len(floats.tri)] {
		floats.tri[i] = float32(q) * weightStep
	}
	// Without its padding the table goes to the general forward pass,
	// which applies the beam in a pass of its own and has no special
	// cases: forwardFolded must find the same paths.
	general := transitions{t1: floats.t1, tri: floats.tri[:len(floats.tri):len(floats.tri)]}
	l := newWorkspace()
	for _, s := range dev {
		m.perc.buildLattice(m, l, s.Tokens)
		l.decode(&m.trans, m.beam)
		ranked := append([]uint8(nil), l.tags...)
		l.decode(&plain, m.beam)
		if !equalSlices(ranked, l.tags) {
			t.Fatalf("sentence %s: %v with ranks, %v without", s.ID, ranked, l.tags)
		}
		l.decode(&floats, m.beam)
		if !equalSlices(ranked, l.tags) {
			t.Fatalf("sentence %s: %v in steps, %v in float32", s.ID, ranked, l.tags)
		}
		// Narrow beams too, where pruning decides: both passes must drop
		// the same states.
		for _, beam := range []float32{m.beam, 4, 1, 0} {
			l.decode(&floats, beam)
			folded := append([]uint8(nil), l.tags...)
			l.decode(&general, beam)
			if !equalSlices(folded, l.tags) {
				t.Fatalf("sentence %s, beam %v: %v by forwardFolded, %v by the general forward pass", s.ID, beam, folded, l.tags)
			}
		}
	}
}

// TestInSteps checks that a folded table is kept in 16-bit steps only when
// every entry is exactly a whole number of steps within int16.
func TestInSteps(t *testing.T) {
	ok := []float32{0, weightStep, -3 * weightStep, 32767 * weightStep, -32768 * weightStep}
	q := inSteps(ok)
	if q == nil || cap(q) < len(ok)+256 {
		t.Fatalf("inSteps(%v) = %v (cap %d), want a padded table", ok, q, cap(q))
	}
	for i, v := range ok {
		if float32(q[i])*weightStep != v {
			t.Errorf("entry %d: %d steps, want %v", i, q[i], v)
		}
	}
	for _, bad := range []float32{weightStep / 2, 32768 * weightStep, -32769 * weightStep, 0.1} {
		if q := inSteps([]float32{0, bad}); q != nil {
			t.Errorf("inSteps kept %v as %d steps", bad, q[1])
		}
	}
}

// TestMemoLemmaFollowsState checks the lemma memo of unknown-word views:
// the same word in another state, and another word in a reused cache
// slot, must get their own lemmas.
func TestMemoLemmaFollowsState(t *testing.T) {
	m, err := Default()
	require.NoError(t, err)
	l := newWorkspace()
	toks := []doc.Token{{Form: "Glorbs"}, {Form: "flimbles"}}
	m.perc.buildLattice(m, l, toks)
	for _, st := range []string{"NNS\tNOUN", "JJ\tADJ", "NNS\tNOUN"} {
		s, found := uint8(0), false
		for i, name := range m.tags {
			if name == st {
				s, found = uint8(i), true
			}
		}
		if !found {
			t.Fatalf("no state %q", st)
		}
		tok := doc.Token{Form: "flimbles", XPOS: m.tagX[s], UPOS: m.tagU[s]}
		got := m.memoLemma(l, 1, s, &tok)
		if want := m.unknownLemma(tok.Form, tok.UPOS, tok.XPOS); got != want {
			t.Errorf("%s: memo %q, want %q", st, got, want)
		}
	}
	// Another word takes over the cache slot: no lemma of the old one.
	v := l.views[1]
	m.perc.fillView(v, "wumbles", v.alone, nil, nil)
	if v.lemmaSet {
		t.Error("a refilled view kept the lemma of the word before")
	}
}

// TestLemmaMemos: the lemma of a word the lexicon has no lemma for —
// a word outside it, or a lexicon word tagged with a state it was never
// seen in — comes from one of the lattice's memos (the unknown word's
// view, lexLemma). On EWT dev, tagged twice so that the second pass
// reads warm memos, every such lemma must be the lemmatizer's own.
func TestLemmaMemos(t *testing.T) {
	_, dev, _ := ewt(t)
	m, err := Default()
	require.NoError(t, err)
	unseen, unknown := 0, 0
	for pass := 0; pass < 2; pass++ {
		for _, cs := range dev {
			s := doc.Sentence{Tokens: slices.Clone(cs.Tokens)}
			for i := range s.Tokens {
				s.Tokens[i].UPOS, s.Tokens[i].XPOS, s.Tokens[i].Lemma = "", "", ""
			}
			m.Tag(&s)
			for _, tok := range s.Tokens {
				if w, ok := m.lex[tok.Form]; ok {
					seen := false
					e := m.words[w]
					for _, x := range m.wlex[e.first : e.first+e.ntags] {
						seen = seen || m.tagX[x.tag] == tok.XPOS && m.uposOf(tok.Form, x.tag) == tok.UPOS
					}
					if seen {
						continue
					}
					unseen++
				} else {
					unknown++
				}
				if want := m.unknownLemma(tok.Form, tok.UPOS, tok.XPOS); tok.Lemma != want {
					t.Fatalf("pass %d: %q as %s/%s: lemma %q, want %q", pass, tok.Form, tok.UPOS, tok.XPOS, tok.Lemma, want)
				}
			}
		}
	}
	if unseen == 0 || unknown == 0 {
		t.Fatalf("checked %d lexicon words in unseen states and %d unknown words: want some of both", unseen, unknown)
	}
	t.Logf("%d lexicon words in unseen states, %d unknown words checked", unseen, unknown)
}

// TestCacheKeepsNoDocumentText: the unknown-word cache outlives the
// documents it saw, so none of its strings (forms, remembered lemmas) may
// point into a document's text — one such string keeps the whole text in
// memory (on the 100 MB benchmark corpus that showed as +100 MB of peak
// memory).
func TestCacheKeepsNoDocumentText(t *testing.T) {
	m, err := Default()
	require.NoError(t, err)
	text := "the flimbles glorbed the wumbles and more wumbles glorbed"
	var toks []doc.Token
	for start := 0; start < len(text); {
		end := start
		for end < len(text) && text[end] != ' ' {
			end++
		}
		toks = append(toks, doc.Token{Form: text[start:end], Start: int32(start), End: int32(end)})
		start = end + 1
	}
	l := newWorkspace()
	m.decode(l, toks)
	for i := range toks { // as Tag does for words outside the lexicon
		st := l.tags[i]
		toks[i].XPOS, toks[i].UPOS = m.tagX[st], m.uposOf(toks[i].Form, st)
		m.memoLemma(l, i, st, &toks[i])
	}
	lo := uintptr(unsafe.Pointer(unsafe.StringData(text)))
	hi := lo + uintptr(len(text))
	inText := func(x string) bool {
		p := uintptr(unsafe.Pointer(unsafe.StringData(x)))
		return x != "" && p >= lo && p < hi
	}
	checked := 0
	for _, c := range l.cache {
		if c.n == 0 {
			continue
		}
		checked++
		// (The form is kept in the slot itself.)
		if inText(c.view.lemma) {
			t.Fatalf("cache entry %q: lemma %q points into the document's text", c.form[:c.n], c.view.lemma)
		}
	}
	if checked == 0 {
		t.Fatal("no cache entries to check")
	}
	// Nor may the lattice's memo of lexicon words' lemmas.
	for _, e := range l.lexMemo {
		if inText(e.lemma) {
			t.Fatalf("lexicon lemma memo %q points into the document's text", e.lemma)
		}
	}
}

// FuzzViewsMatchPlainScoring feeds arbitrary token sequences (any bytes,
// split at spaces) to the fast and the plain scoring and requires the same
// lattice, over several sentences on one lattice so that the cache of
// unknown-word views is reused, collides and is refilled.
func FuzzViewsMatchPlainScoring(f *testing.F) {
	for _, s := range []string{"The valve opens .", "PLC-3 ÉTÉ 12,5 mm ; „x“", "a a a a a", "\xff\xfe A\x00b"} {
		f.Add(s)
	}
	m, err := Default()
	if err != nil {
		f.Fatal(err)
	}
	fast, plain := newWorkspace(), newWorkspace()
	f.Fuzz(func(t *testing.T, text string) {
		var toks []doc.Token
		for _, w := range strings.Fields(text) {
			toks = append(toks, doc.Token{Form: w})
		}
		for round := 0; round < 2; round++ {
			m.perc.buildLattice(m, fast, toks)
			m.perc.buildLatticeRef(m, plain, toks)
			if !equalSlices(fast.cands, plain.cands) || !equalSlices(fast.emit, plain.emit) || !equalSlices(fast.pair, plain.pair) {
				t.Fatalf("%q: lattices differ", text)
			}
		}
	})
}

// TestCacheFollowsWeights reuses a lattice whose cache of unknown-word
// views was filled under other weights (as training does, which replaces a
// model's weights after every epoch and keeps its pooled lattices): the
// lattice must score as a fresh one does.
func TestCacheFollowsWeights(t *testing.T) {
	m1, err := Decode(model.EnglishEWT)
	require.NoError(t, err)
	m2, err := Decode(model.EnglishEWT)
	require.NoError(t, err)
	for i := range m2.perc.cells {
		m2.perc.cells[i].q = -m2.perc.cells[i].q // other weights, same rows
	}
	m2.perc.prepareDense()
	var toks []doc.Token
	for _, w := range strings.Fields("The glorbished flanges of the zentrifuge were unpackaged .") {
		toks = append(toks, doc.Token{Form: w})
	}
	reused, fresh := newWorkspace(), newWorkspace()
	m1.perc.buildLattice(m1, reused, toks)
	m2.perc.buildLattice(m2, reused, toks)
	m2.perc.buildLattice(m2, fresh, toks)
	if !equalSlices(reused.cands, fresh.cands) || !equalSlices(reused.emit, fresh.emit) {
		t.Fatalf("reused lattice scores %v %v, fresh one %v %v", reused.cands, reused.emit, fresh.cands, fresh.emit)
	}
}

// TestRowFindsEveryKey: the Bloom filter in front of the feature table
// may let absent keys through to the table, but must never turn away a
// key that is there.
func TestRowFindsEveryKey(t *testing.T) {
	m, err := Default()
	require.NoError(t, err)
	p := m.perc
	for i, k := range p.keys {
		if r := p.row(k); r != int32(i) {
			t.Fatalf("key %d (%#x): row %d, want %d", i, k, r, i)
		}
	}
	// And it does turn most absent keys away (hashes of numbers are as
	// good as random keys; 2 bits of 2^20 per key, 84,000 keys: about 2.4%
	// pass by chance).
	through := 0
	for i := range 100000 {
		k := key(fPrevWord, uint64(i)*0x9E3779B97F4A7C15)
		a, b := bloomBitsOf(k)
		if p.bloom[a>>6]&(1<<(a&63)) != 0 && p.bloom[b>>6]&(1<<(b&63)) != 0 {
			through++
		}
	}
	if through > 5000 {
		t.Errorf("%d of 100,000 random keys pass the filter", through)
	}
}
