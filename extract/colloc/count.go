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
// nut" has x = tighten, y = nut; which of the two is the relation's @node is
// recorded separately.
package colloc

import (
	"maps"
	"slices"
	"sort"
	"strings"
)

// Pair is one observed pair occurrence.
type Pair struct {
	Relation string
	W1, W2   string // words in text order
	NodeIsW2 bool   // the @node slot is W2 (otherwise W1)
}

// key identifies a pair within a relation by the words' ids.
type key struct{ w1, w2 uint32 }

type relCounts struct {
	pairs  map[key]int64
	nodeW2 map[key]bool // NodeIsW2 of the first occurrence seen
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
	// size estimates the bytes of the tables; limit is the budget (0: none).
	size, limit int64
	trigger     int64 // prune when size passes this (≥ limit)
	pruned      Pruned
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
	// A copy: w is often a slice of a document's text (a lower-case word
	// form), and keeping it would keep the whole text alive.
	w = strings.Clone(w)
	c.words = append(c.words, w)
	c.ids[w] = id
	c.size += wordEntryBytes + int64(len(w))
	return id
}

func (c *Counter) rel(name string) *relCounts {
	r := c.rels[name]
	if r == nil {
		r = &relCounts{pairs: map[key]int64{}, nodeW2: map[key]bool{}, first: map[uint32]int64{}, second: map[uint32]int64{}}
		c.rels[name] = r
	}
	return r
}

// Add counts one pair occurrence.
func (c *Counter) Add(p Pair) { c.addN(p.Relation, p.W1, p.W2, p.NodeIsW2, 1) }

func (c *Counter) addN(rel, w1, w2 string, nodeIsW2 bool, n int64) {
	r := c.rel(rel)
	k := key{c.id(w1), c.id(w2)}
	if _, seen := r.pairs[k]; !seen {
		r.nodeW2[k] = nodeIsW2
		c.size += pairEntryBytes
	}
	r.pairs[k] += n
	if _, seen := r.first[k.w1]; !seen {
		c.size += marginalEntryBytes
	}
	r.first[k.w1] += n
	if _, seen := r.second[k.w2]; !seen {
		c.size += marginalEntryBytes
	}
	r.second[k.w2] += n
	r.n += n
	if c.limit > 0 && c.size > c.trigger {
		c.prune(c.limit * 3 / 4)
	}
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
			c.addN(name, o.words[k.w1], o.words[k.w2], r.nodeW2[k], r.pairs[k])
		}
	}
}

// Relations returns the relation names seen, sorted.
func (c *Counter) Relations() []string {
	return slices.Sorted(maps.Keys(c.rels))
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

// A memory budget for the pair tables.
//
// Most distinct pairs of a large corpus are seen once, and they fill the
// tables. With a budget set (SetBudget), the counter keeps an estimate of
// its size and, when it passes the budget, drops the rarest pairs — seen
// once, then at most twice, … — until the tables are back to three
// quarters of it. The marginals f(x), f(y) and N stay exact, so every
// measure of a kept pair reads the true contingency table. A pair dropped
// and seen again later restarts its count, so f(x,y) may be low by at most
// Pruned.MaxFreq; with the default minimum frequency of the ranking such
// pairs were rarely listed anyway. The decisions depend only on the counts
// and their order, so a fixed merge order keeps the output deterministic.

// Pruned reports what a budget made a counter drop.
type Pruned struct {
	Pairs   int   // distinct pairs dropped (a pair dropped twice counts twice)
	MaxFreq int64 // the highest count a dropped pair had
	Times   int   // how often the tables were pruned
}

// Estimated bytes per table entry on a 64-bit machine: the payload of a
// map entry about doubled for the map's slack and control bytes.
const (
	pairEntryBytes     = 2*16 + 2*9 // pairs and nodeW2 entries
	marginalEntryBytes = 2 * 12
	wordEntryBytes     = 16 + 2*(16+4)
)

// SetBudget limits the estimated size of the counter's tables to about
// limit bytes; 0 or less means no limit.
func (c *Counter) SetBudget(limit int64) {
	c.limit = max(limit, 0)
	c.trigger = c.limit
	if c.limit > 0 && c.size > c.trigger {
		c.prune(c.limit * 3 / 4)
	}
}

// Pruned reports what the budget made the counter drop; the zero value
// means nothing was dropped.
func (c *Counter) Pruned() Pruned { return c.pruned }

// Size returns the estimated bytes of the counter's tables.
func (c *Counter) Size() int64 { return c.size }

// prune drops all pairs seen at most k times, for the smallest k that
// brings the estimate down to target.
func (c *Counter) prune(target int64) {
	hist := map[int64]int{} // pairs by count
	for _, r := range c.rels {
		for _, f := range r.pairs {
			hist[f]++
		}
	}
	counts := make([]int64, 0, len(hist))
	for f := range hist {
		counts = append(counts, f)
	}
	sort.Slice(counts, func(i, j int) bool { return counts[i] < counts[j] })
	// Words and marginals stay; if they alone fill the target, the pairs
	// still keep half of it rather than all being dropped.
	pairs := int64(0)
	for _, n := range hist {
		pairs += int64(n)
	}
	pairBytes := pairs * pairEntryBytes
	keep := max(target-(c.size-pairBytes), target/2)
	over := pairBytes - keep
	var k int64
	for _, f := range counts {
		if over <= 0 {
			break
		}
		over -= int64(hist[f]) * pairEntryBytes
		k = f
	}
	defer func() {
		// Words and marginals are never dropped; when they alone fill the
		// budget, wait for a quarter of it more before pruning again
		// rather than pruning after every pair.
		c.trigger = max(c.limit, c.size+c.limit/4)
	}()
	if k == 0 {
		return
	}
	dropped := 0
	for _, r := range c.rels {
		for p, f := range r.pairs {
			if f <= k {
				delete(r.pairs, p)
				delete(r.nodeW2, p)
				dropped++
			}
		}
		// Go maps do not shrink: copy the survivors so the memory of the
		// dropped entries is freed.
		r.pairs = compact(r.pairs)
		r.nodeW2 = compact(r.nodeW2)
	}
	c.size -= int64(dropped) * pairEntryBytes
	c.pruned.Pairs += dropped
	c.pruned.MaxFreq = max(c.pruned.MaxFreq, k)
	c.pruned.Times++
}

// compact copies a map into one sized for its entries: a map keeps the
// room of deleted entries (maps.Clone keeps it too).
func compact[V any](m map[key]V) map[key]V {
	out := make(map[key]V, len(m))
	for k, v := range m {
		out[k] = v
	}
	return out
}
