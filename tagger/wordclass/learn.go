package wordclass

import (
	"cmp"
	"math"
	"slices"
	"sync"
)

// Options control Learn.
type Options struct {
	// Classes is the number of word classes the exchange algorithm
	// forms, the leaves of the tree (at least 2).
	Classes int
	// MinCount is how often a word must occur to be classed; rarer words
	// share one fixed class of their own and get no path.
	MinCount int
	// MaxIterations bounds the passes of the exchange algorithm over the
	// vocabulary; it stops earlier when a pass moves fewer than one word
	// in a thousand.
	MaxIterations int
}

// Stats describes what Learn did, for the generator's report.
type Stats struct {
	Tokens     int   // words of the sentences, boundaries not counted
	Vocabulary int   // words classed (seen MinCount times or more)
	Moves      []int // words moved in each pass of the exchange algorithm
	Classes    int   // non-empty classes, the leaves of the tree
}

// Learn forms word classes from sentences of words (already lower-cased
// or otherwise normalized: words are taken as they are) and returns the
// table of every word seen opt.MinCount times or more with the path of
// its class. It is deterministic: the same sentences and options give the
// same table.
//
// The classes maximize the likelihood of the class bigram model, which is
// the average mutual information of adjacent classes that Brown et al.
// (1992, "Class-based n-gram models of natural language") maximize by
// greedy merging. They are found in two steps:
//
//  1. The exchange algorithm (Kneser and Ney 1993, "Improved clustering
//     techniques for class-based statistical language modelling"; Martin,
//     Liermann and Ney 1998, "Algorithms for bigram and trigram word
//     clustering", Speech Communication 24): start from Classes classes
//     (word i of the frequency ranking in class i mod Classes), then visit
//     the words in turn, each time moving the word to the class that gains
//     the most likelihood, until a pass moves almost nothing.
//  2. Brown et al.'s greedy merging, applied to the classes instead of
//     the words: repeatedly merge the two classes whose merge loses the
//     least likelihood, until one is left. The merges form a binary tree;
//     a class's path is its branch from the root, 0 for the first child
//     and 1 for the second, so that prefixes of paths name coarser classes
//     (the word representation of Koo et al. 2008 and Turian et al. 2010).
//
// Sentence boundaries count as a word of a class of their own, as do the
// words rarer than MinCount, all together; neither is moved or merged.
func Learn(sents [][]string, opt Options) (*Table, Stats) {
	c := newCounts(sents, opt.MinCount)
	st := Stats{Tokens: c.tokens, Vocabulary: len(c.words)}
	nc := max(2, opt.Classes)
	x := newExchange(c, nc)
	for range opt.MaxIterations {
		moved := x.pass()
		st.Moves = append(st.Moves, moved)
		if moved*1000 < len(c.words) {
			break
		}
	}
	paths := x.mergeTree()
	var b tableBuilder
	for w, word := range c.words {
		b.add(word, paths[x.cls[w]])
	}
	st.Classes = len(b.t.paths)
	return &b.t, st
}

// counts holds the vocabulary and the word bigrams of the sentences. Word
// ids follow the frequency ranking (ties by word); the boundary and the
// rare words come after the vocabulary.
type counts struct {
	words  []string
	tokens int
	// right[w] lists the words seen right after w, with counts (w itself
	// included), in order of id; left[w] those seen right before it.
	right, left [][]neighbour
	// nl[w] and nr[w] count w as the first and the second word of a
	// bigram.
	nl, nr []int64
}

type neighbour struct {
	id int32
	n  int64
}

func newCounts(sents [][]string, minCount int) *counts {
	freq := map[string]int{}
	c := &counts{}
	for _, s := range sents {
		for _, w := range s {
			freq[w]++
		}
		c.tokens += len(s)
	}
	for w, n := range freq {
		if n >= minCount {
			c.words = append(c.words, w)
		}
	}
	slices.SortFunc(c.words, func(a, b string) int {
		if d := cmp.Compare(freq[b], freq[a]); d != 0 {
			return d
		}
		return cmp.Compare(a, b)
	})
	ids := make(map[string]int32, len(c.words))
	for i, w := range c.words {
		ids[w] = int32(i)
	}
	boundary, rare := int32(len(c.words)), int32(len(c.words)+1)
	all := len(c.words) + 2
	bigrams := map[[2]int32]int64{}
	for _, s := range sents {
		prev := boundary
		for _, w := range s {
			id, ok := ids[w]
			if !ok {
				id = rare
			}
			bigrams[[2]int32{prev, id}]++
			prev = id
		}
		bigrams[[2]int32{prev, boundary}]++
	}
	c.right, c.left = make([][]neighbour, all), make([][]neighbour, all)
	c.nl, c.nr = make([]int64, all), make([]int64, all)
	for k, n := range bigrams {
		a, b := k[0], k[1]
		c.right[a] = append(c.right[a], neighbour{b, n})
		c.left[b] = append(c.left[b], neighbour{a, n})
		c.nl[a] += n
		c.nr[b] += n
	}
	byID := func(x, y neighbour) int { return cmp.Compare(x.id, y.id) }
	for i := range all {
		slices.SortFunc(c.right[i], byID)
		slices.SortFunc(c.left[i], byID)
	}
	return c
}

// xlogx returns n·ln n (0 for 0), from a table for small n once Learn
// has built it.
func xlogx(n int64) float64 {
	if n < int64(len(xlogxTable)) {
		return xlogxTable[n]
	}
	return float64(n) * math.Log(float64(n))
}

// xlogxTable holds n·ln n for small n. It is built on the first use of
// the exchange algorithm (newExchange), not when a program that imports
// the package starts.
var (
	xlogxTable []float64
	xlogxOnce  sync.Once
)

func buildXlogx() {
	t := make([]float64, 1<<16)
	for i := 1; i < len(t); i++ {
		t[i] = float64(i) * math.Log(float64(i))
	}
	xlogxTable = t
}

// exchange is the state of the exchange algorithm: the class of every
// word and the class bigram counts. The likelihood of the class bigram
// model is, up to a constant,
//
//	F = Σ_{g,h} N(g,h) log N(g,h) − Σ_g Nl(g) log Nl(g) − Σ_h Nr(h) log Nr(h)
//
// (Martin et al. 1998, eq. 9, with Nl and Nr the counts of a class as the
// first and the second word of a bigram). Classes 0..nc-1 are learned;
// class nc holds the boundary and nc+1 the rare words.
type exchange struct {
	c      *counts
	nc, k  int     // learned classes; all classes (nc+2)
	cls    []int32 // class of each word
	n      []int64 // class bigram counts, k×k, row = first class
	nl, nr []int64 // class marginals
	// Scratch for the word being moved: its bigram counts by the class of
	// the other word, and which classes those are.
	r, l       []int64
	rset, lset []int32
}

func newExchange(c *counts, nc int) *exchange {
	xlogxOnce.Do(buildXlogx)
	k := nc + 2
	v := len(c.words)
	x := &exchange{c: c, nc: nc, k: k, cls: make([]int32, v+2), n: make([]int64, k*k),
		nl: make([]int64, k), nr: make([]int64, k), r: make([]int64, k), l: make([]int64, k)}
	for w := range v {
		x.cls[w] = int32(w % nc)
	}
	x.cls[v], x.cls[v+1] = int32(nc), int32(nc+1)
	for a := range c.right {
		ca := x.cls[a]
		for _, e := range c.right[a] {
			x.n[int(ca)*k+int(x.cls[e.id])] += e.n
		}
		x.nl[ca] += c.nl[a]
		x.nr[ca] += c.nr[a]
	}
	return x
}

// gather fills x.r and x.l with word w's bigram counts by the class of
// the other word, leaving out the bigram (w, w), whose count it returns.
func (x *exchange) gather(w int32) (self int64) {
	x.rset, x.lset = x.rset[:0], x.lset[:0]
	for _, e := range x.c.right[w] {
		if e.id == w {
			self = e.n
			continue
		}
		y := x.cls[e.id]
		if x.r[y] == 0 {
			x.rset = append(x.rset, y)
		}
		x.r[y] += e.n
	}
	for _, e := range x.c.left[w] {
		if e.id == w {
			continue
		}
		y := x.cls[e.id]
		if x.l[y] == 0 {
			x.lset = append(x.lset, y)
		}
		x.l[y] += e.n
	}
	return self
}

// clearGathered zeroes what gather filled.
func (x *exchange) clearGathered() {
	for _, y := range x.rset {
		x.r[y] = 0
	}
	for _, y := range x.lset {
		x.l[y] = 0
	}
}

// gain returns the change of F when word w, whose counts gather left in
// x.r and x.l, joins class b, from which it is absent.
func (x *exchange) gain(w int32, b int32, self int64) float64 {
	k := x.k
	row := x.n[int(b)*k : int(b)*k+k]
	d := 0.0
	for _, y := range x.rset {
		if y != b {
			d += xlogx(row[y]+x.r[y]) - xlogx(row[y])
		}
	}
	for _, y := range x.lset {
		if y != b {
			v := x.n[int(y)*k+int(b)]
			d += xlogx(v+x.l[y]) - xlogx(v)
		}
	}
	bb := row[b]
	d += xlogx(bb+x.r[b]+x.l[b]+self) - xlogx(bb)
	d -= xlogx(x.nl[b]+x.c.nl[w]) - xlogx(x.nl[b])
	d -= xlogx(x.nr[b]+x.c.nr[w]) - xlogx(x.nr[b])
	return d
}

// move adds word w's counts to class b (sign 1) or takes them out of it
// (sign -1).
func (x *exchange) move(w int32, b int32, self int64, sign int64) {
	k := x.k
	for _, y := range x.rset {
		if y != b {
			x.n[int(b)*k+int(y)] += sign * x.r[y]
		}
	}
	for _, y := range x.lset {
		if y != b {
			x.n[int(y)*k+int(b)] += sign * x.l[y]
		}
	}
	x.n[int(b)*k+int(b)] += sign * (x.r[b] + x.l[b] + self)
	x.nl[b] += sign * x.c.nl[w]
	x.nr[b] += sign * x.c.nr[w]
}

// pass visits every word once, in frequency order, and moves it to its
// best class (staying where it is unless another class gains strictly
// more, and of equal gains taking the lower class). It returns the number
// of words moved.
func (x *exchange) pass() int {
	moved := 0
	for w := range int32(len(x.c.words)) {
		self := x.gather(w)
		a := x.cls[w]
		x.move(w, a, self, -1)
		best, bestGain := a, x.gain(w, a, self)
		for b := range int32(x.nc) {
			if b == a {
				continue
			}
			if g := x.gain(w, b, self); g > bestGain {
				best, bestGain = b, g
			}
		}
		x.move(w, best, self, 1)
		x.clearGathered()
		if best != a {
			x.cls[w] = best
			moved++
		}
	}
	return moved
}
