package wordclass

import (
	"bytes"
	"fmt"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// toyCorpus generates sentences of a small grammar — determiner, noun,
// verb, determiner, noun, full stop — whose words of each part of speech
// occur in the same contexts, so that a class bigram model has an obvious
// best answer: one class per part of speech.
func toyCorpus(n int, seed uint64) [][]string {
	dets := []string{"the", "a", "this", "every"}
	nouns := []string{"valve", "pump", "sensor", "pipe", "tank", "filter"}
	verbs := []string{"feeds", "drains", "checks", "cools", "opens"}
	rng := rand.New(rand.NewPCG(seed, 7))
	pick := func(ws []string) string { return ws[rng.IntN(len(ws))] }
	var sents [][]string
	for range n {
		sents = append(sents, []string{pick(dets), pick(nouns), pick(verbs), pick(dets), pick(nouns), "."})
	}
	return sents
}

// randomCorpus returns n sentences of words drawn at random, the small
// numbers more often, so that every class meets every other.
func randomCorpus(n int) [][]string {
	rng := rand.New(rand.NewPCG(8, 9))
	sents := make([][]string, n)
	for i := range sents {
		for range 3 + rng.IntN(8) {
			sents[i] = append(sents[i], fmt.Sprintf("w%d", rng.IntN(1+rng.IntN(60))))
		}
	}
	return sents
}

// objective computes F of the exchange state from scratch (the formula in
// the comment of exchange), from the word bigrams and the word classes.
func objective(x *exchange) float64 {
	k := x.k
	n := make([]int64, k*k)
	nl, nr := make([]int64, k), make([]int64, k)
	for a, row := range x.c.right {
		for _, e := range row {
			n[int(x.cls[a])*k+int(x.cls[e.id])] += e.n
		}
		nl[x.cls[a]] += x.c.nl[a]
		nr[x.cls[a]] += x.c.nr[a]
	}
	f := 0.0
	for _, v := range n {
		f += xlogx(v)
	}
	for c := range k {
		f -= xlogx(nl[c]) + xlogx(nr[c])
	}
	return f
}

func TestLearnFindsPartsOfSpeech(t *testing.T) {
	tab, st := Learn(toyCorpus(2000, 1), Options{Classes: 4, MinCount: 1, MaxIterations: 20})
	require.Equal(t, 16, tab.Len(), "every word of the grammar is classed")
	assert.Equal(t, 4, st.Classes)
	groups := [][]string{{"the", "a", "this", "every"}, {"valve", "pump", "sensor", "pipe", "tank", "filter"}, {"feeds", "drains", "checks", "cools", "opens"}, {"."}}
	path := func(w string) string { return tab.Path(tab.Class([]byte(w))) }
	for _, g := range groups {
		for _, w := range g[1:] {
			assert.Equal(t, path(g[0]), path(w), "%s and %s occur in the same contexts", g[0], w)
		}
	}
	assert.NotEqual(t, path("the"), path("valve"))
	assert.NotEqual(t, path("valve"), path("feeds"))
	assert.NotEqual(t, path("feeds"), path("."))
	assert.NotEqual(t, path("the"), path("."))
	assert.Equal(t, int32(-1), tab.Class([]byte("pumps")))
}

func TestLearnIsDeterministic(t *testing.T) {
	sents := toyCorpus(500, 2)
	// Noise words, so that ties and rare words occur.
	for i := range sents {
		sents[i] = append(sents[i], fmt.Sprintf("w%d", i%37))
	}
	opt := Options{Classes: 6, MinCount: 2, MaxIterations: 10}
	a, _ := Learn(sents, opt)
	b, _ := Learn(sents, opt)
	za, err := a.Compress()
	require.NoError(t, err)
	zb, err := b.Compress()
	require.NoError(t, err)
	assert.Equal(t, za, zb)
}

// The gain the exchange algorithm computes for moving a word is the change
// of the objective computed from scratch, and a pass never lowers it.
func TestExchangeGainIsObjectiveChange(t *testing.T) {
	x := newExchange(newCounts(randomCorpus(200), 2), 5)
	for w := range int32(len(x.c.words)) {
		for b := range int32(x.nc) {
			before := objective(x)
			a := x.cls[w]
			self := x.gather(w)
			x.move(w, a, self, -1)
			delta := x.gain(w, b, self) - x.gain(w, a, self)
			x.move(w, b, self, 1)
			x.clearGathered()
			x.cls[w] = b
			require.InDelta(t, objective(x)-before, delta, 1e-6, "word %s to class %d", x.c.words[w], b)
		}
	}
	for range 3 {
		before := objective(x)
		x.pass()
		assert.GreaterOrEqual(t, objective(x), before-1e-9)
	}
}

// The gains the merger keeps up to date step by step are those computed
// from scratch after every merge.
func TestMergerGainsMatchRecomputed(t *testing.T) {
	x := newExchange(newCounts(randomCorpus(300), 1), 12)
	x.pass()
	g := newMerger(x)
	require.Greater(t, len(g.active), 4)
	for len(g.active) > 1 {
		g.merge(g.best())
		for k, i := range g.active {
			for _, j := range g.active[k+1:] {
				require.InDelta(t, x.mergeGain(i, j), g.gain[i*x.nc+j], 1e-6, "classes %d and %d with %d left", i, j, len(g.active))
			}
		}
	}
	paths := x.mergeTree()
	assert.Empty(t, paths[x.nc], "the boundary class has no path")
}

func TestTableTextRoundTrip(t *testing.T) {
	tab, _ := Learn(toyCorpus(300, 10), Options{Classes: 4, MinCount: 1, MaxIterations: 5})
	var text bytes.Buffer
	require.NoError(t, tab.WriteText(&text))
	back, err := Parse(bytes.NewReader(text.Bytes()), "t.txt")
	require.NoError(t, err)
	var again bytes.Buffer
	require.NoError(t, back.WriteText(&again))
	assert.Equal(t, text.String(), again.String())
	z, err := tab.Compress()
	require.NoError(t, err)
	unz, err := ParseCompressed(z, "t.gz")
	require.NoError(t, err)
	assert.Equal(t, tab.Len(), unz.Len())
	assert.Equal(t, tab.Path(tab.Class([]byte("valve"))), unz.Path(unz.Class([]byte("valve"))))
}

func TestParseErrorsNameTheLine(t *testing.T) {
	for _, tc := range []struct{ text, want string }{
		{"01\tvalve\n0x1\tpump\n", "t.txt:2: path \"0x1\" is not made of 0 and 1"},
		{"01\tvalve\n", ""},
		{"01 valve\n", "t.txt:1: want a path, a tab and a word"},
		{"01\tvalve\n10\tvalve\n", "t.txt:2: word \"valve\" listed twice"},
		{"01\t\n", "t.txt:1: empty word"},
		{strings.Repeat("1", MaxPath+1) + "\tx\n", "t.txt:1: path of 256 bits"},
	} {
		_, err := Parse(strings.NewReader(tc.text), "t.txt")
		if tc.want == "" {
			assert.NoError(t, err)
			continue
		}
		require.Error(t, err, tc.text)
		assert.Contains(t, err.Error(), tc.want)
	}
	_, err := ParseCompressed([]byte("not gzip"), "t.gz")
	assert.ErrorContains(t, err, "t.gz")
}
