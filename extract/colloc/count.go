// Package colloc counts word pairs — from the labelled slots of relation
// rules or from co-occurrence in a window — and ranks them by association
// measures.
//
// # Counts and the contingency table
//
// Every pair (x, y) belongs to one relation: the name of the rule it came
// from ("adj_noun", "verb_obj", …) or "window" for window co-occurrence.
// For each relation R the counter keeps
//
//	f(x,y)  how often the pair occurs in R,
//	f(x)    how often x occurs as the first element of any pair in R,
//	f(y)    how often y occurs as the second element of any pair in R,
//	N       the number of pairs in R,
//
// so the marginals are taken over the same relation, never over the whole
// corpus. That is what makes the four numbers one consistent 2×2 table
// (Evert 2005, ch. 3): a corpus-wide f(x) would count occurrences of x that
// could never have formed a pair of R and would inflate every expected value.
// The first element is the word earlier in the sentence, so "tighten …
// nut" has x = tighten, y = nut; which of the two is the relation's @head is
// recorded separately.
package colloc

import (
	"sort"
)

// Pair is one observed pair occurrence.
type Pair struct {
	Relation string
	W1, W2   string // words in text order
	HeadIsW2 bool   // the @head slot is W2 (otherwise W1)
}

// key identifies a pair within a relation by the words' ids.
type key struct{ w1, w2 uint32 }

type relCounts struct {
	pairs  map[key]int64
	heads  map[key]bool // HeadIsW2 of the first occurrence seen
	first  map[uint32]int64
	second map[uint32]int64
	n      int64
}

// Counter accumulates pair counts. It is not safe for concurrent use; give
// each worker its own and Merge them in a fixed order for deterministic
// output.
type Counter struct {
	words []string
	ids   map[string]uint32
	rels  map[string]*relCounts
}

// NewCounter returns an empty counter.
func NewCounter() *Counter {
	return &Counter{ids: make(map[string]uint32), rels: make(map[string]*relCounts)}
}

func (c *Counter) id(w string) uint32 {
	if id, ok := c.ids[w]; ok {
		return id
	}
	id := uint32(len(c.words))
	c.words = append(c.words, w)
	c.ids[w] = id
	return id
}

func (c *Counter) rel(name string) *relCounts {
	r := c.rels[name]
	if r == nil {
		r = &relCounts{pairs: map[key]int64{}, heads: map[key]bool{}, first: map[uint32]int64{}, second: map[uint32]int64{}}
		c.rels[name] = r
	}
	return r
}

// Add counts one pair occurrence.
func (c *Counter) Add(p Pair) { c.addN(p.Relation, p.W1, p.W2, p.HeadIsW2, 1) }

func (c *Counter) addN(rel, w1, w2 string, headIsW2 bool, n int64) {
	r := c.rel(rel)
	k := key{c.id(w1), c.id(w2)}
	if _, seen := r.pairs[k]; !seen {
		r.heads[k] = headIsW2
	}
	r.pairs[k] += n
	r.first[k.w1] += n
	r.second[k.w2] += n
	r.n += n
}

// Merge adds the counts of o into c.
func (c *Counter) Merge(o *Counter) {
	for _, name := range o.Relations() {
		r := o.rels[name]
		keys := make([]key, 0, len(r.pairs))
		for k := range r.pairs {
			keys = append(keys, k)
		}
		sort.Slice(keys, func(i, j int) bool {
			if keys[i].w1 != keys[j].w1 {
				return keys[i].w1 < keys[j].w1
			}
			return keys[i].w2 < keys[j].w2
		})
		for _, k := range keys {
			c.addN(name, o.words[k.w1], o.words[k.w2], r.heads[k], r.pairs[k])
		}
	}
}

// Relations returns the relation names seen, sorted.
func (c *Counter) Relations() []string {
	names := make([]string, 0, len(c.rels))
	for name := range c.rels {
		names = append(names, name)
	}
	sort.Strings(names)
	return names
}

// Total returns the number of pair occurrences counted in all relations.
func (c *Counter) Total() int64 {
	var n int64
	for _, r := range c.rels {
		n += r.n
	}
	return n
}

// Distinct returns the number of distinct pairs in all relations.
func (c *Counter) Distinct() int {
	n := 0
	for _, r := range c.rels {
		n += len(r.pairs)
	}
	return n
}
