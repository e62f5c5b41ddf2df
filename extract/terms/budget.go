package terms

import (
	"slices"
	"unsafe"
)

// A memory budget for the corpus's count tables.
//
// A large corpus keeps meeting new candidates — most of them seen once —
// and each holds its spellings, per-document counts and example sentences.
// With a budget set, the corpus estimates the size of its tables as it
// merges documents and, when the estimate passes the budget, drops the
// rarest candidates (seen once, then at most twice, …) until the tables
// are back to three quarters of it. Word counts, the document list and
// the token total stay exact, so every measure of a kept candidate is
// computed against the true corpus size.
//
// Pruning is lossy: a candidate dropped and met again later restarts its
// count, so its frequency may be low by at most the largest threshold
// used (reported as Pruned.MaxFreq), and the C-value of a kept candidate
// no longer subtracts dropped longer candidates that contain it. The
// estimate and the decisions depend only on the documents and their
// order, never on timing, so the output stays the same for any number of
// workers.

// Pruned reports what a budget made the corpus drop.
type Pruned struct {
	Candidates int // candidate groups dropped, counting a group again if it came back and was dropped again
	MaxFreq    int // the highest frequency a dropped candidate had
	Times      int // how often the tables were pruned
}

// budget is the state of a corpus's memory budget.
type budget struct {
	limit  int64 // bytes; 0: none
	over   int64 // bytes the estimate may pass limit by before pruning again
	est    int64 // estimated bytes of the tables
	seen   int   // len(Corpus.order) when est was last brought up to date
	words  int   // len(Corpus.words.index) likewise
	pruned Pruned
}

// SetBudget limits the estimated size of the corpus's count tables to
// about limit bytes; 0 or less means no limit. Set it before the first Add.
func (c *Corpus) SetBudget(limit int64) { c.budget.limit = max(limit, 0) }

// Pruned reports what the budget made the corpus drop; the zero value
// means nothing was dropped.
func (c *Corpus) Pruned() Pruned { return c.budget.pruned }

// Sizes of the fixed parts of the tables, in bytes, on a 64-bit machine:
// a group with its map entry, order entry and slice headers; one entry of
// each slice; a word count's map entry. Map entries are counted at about
// twice their payload for the table's slack.
const (
	groupBytes     = 8 + 2*(16+8) + 16 + 144
	spellingBytes  = 24
	canonicalBytes = 64
	docFreqBytes   = 8
	contextBytes   = 40
	wordBytes      = 2*(16+8) + 4
)

// checkBudget is called at the end of Add: it brings the estimate up to
// date and prunes when it passes the limit.
func (c *Corpus) checkBudget(dc *DocCounts) {
	b := &c.budget
	if b.limit <= 0 {
		return
	}
	// New groups are measured whole (each context text counted, though
	// candidates of one sentence share it); groups met before grow by a
	// per-document count and at most a few spellings and contexts. The
	// full count below settles the difference before anything is dropped.
	for _, k := range c.order[b.seen:] {
		b.est += c.groups[k].bytes(nil)
	}
	b.seen = len(c.order)
	b.est += int64(len(dc.cands)) * docFreqBytes
	b.est += int64(len(c.words.index)-b.words) * (wordBytes + newWordBytes)
	b.words = len(c.words.index)
	if b.est <= b.limit+b.over {
		return
	}
	b.est = c.tableBytes()
	if b.est > b.limit+b.over {
		c.prune(b.limit * 3 / 4)
		// Word counts are never dropped; when they alone fill the budget,
		// wait for a quarter of it more before pruning again rather than
		// pruning after every document.
		b.over = max(0, b.est+b.limit/4-b.limit)
	}
}

// newWordBytes is the length of a new word (a rare one, longer than the
// average running word) assumed between two full counts.
const newWordBytes = 12

// bytes estimates the memory a group holds. The candidates of a sentence
// share its context text, so when texts is not nil each text is recorded
// there by address (and counted by the caller once); with texts nil every
// text counts whole, an overestimate.
func (g *group) bytes(texts map[uintptr]int) int64 {
	n := int64(groupBytes + len(g.key))
	n += int64(cap(g.perDoc)) * docFreqBytes
	for _, v := range g.variants {
		n += spellingBytes + int64(len(v.text))
	}
	for _, v := range g.canon {
		n += canonicalBytes + int64(len(v.text))
		for _, w := range v.words() {
			n += 16 + int64(len(w))
		}
	}
	for _, cx := range g.contexts {
		n += contextBytes
		switch {
		case texts == nil:
			n += int64(len(cx.text))
		case len(cx.text) > 0:
			texts[uintptr(unsafe.Pointer(unsafe.StringData(cx.text)))] = len(cx.text)
		}
	}
	return n
}

// tableBytes counts the tables in full, each shared context text once.
func (c *Corpus) tableBytes() int64 {
	var n int64
	texts := map[uintptr]int{}
	for _, k := range c.order {
		n += c.groups[k].bytes(texts)
	}
	for _, l := range texts {
		n += int64(l)
	}
	return n + c.fixedBytes()
}

// fixedBytes counts what pruning never drops: the word counts and the
// document list.
func (c *Corpus) fixedBytes() int64 {
	var n int64
	for w := range c.words.index {
		n += wordBytes + int64(len(w))
	}
	return n + int64(len(c.docs))*(16+8)
}

// prune drops the rarest groups until the tables fit in target bytes: all
// groups seen at most k times, for the smallest k that is enough. A
// context text shared with a kept group is not freed, so the bytes a
// frequency class holds are counted with its texts whole: the threshold
// may come out one step higher than strictly needed, never lower.
func (c *Corpus) prune(target int64) {
	b := &c.budget
	byFreq := map[int]int64{} // bytes held by groups of each frequency
	for _, k := range c.order {
		g := c.groups[k]
		byFreq[g.freq] += g.bytes(nil)
	}
	freqs := make([]int, 0, len(byFreq))
	for f := range byFreq {
		freqs = append(freqs, f)
	}
	slices.Sort(freqs)
	// Word counts stay; if they alone fill the target, the candidates
	// still keep half of it rather than all being dropped.
	fixed := c.fixedBytes()
	keep := max(target-fixed, target/2)
	over := b.est - fixed - keep
	k := 0
	for _, f := range freqs {
		if over <= 0 {
			break
		}
		over -= byFreq[f]
		k = f
	}
	if k == 0 {
		return
	}
	kept := c.order[:0]
	dropped := 0
	for _, key := range c.order {
		if c.groups[key].freq <= k {
			delete(c.groups, key)
			dropped++
			continue
		}
		kept = append(kept, key)
	}
	clear(c.order[len(kept):])
	c.order = slices.Clip(kept)
	// A map keeps the room of deleted entries: copy the survivors.
	groups := make(map[string]*group, len(kept))
	for _, key := range kept {
		groups[key] = c.groups[key]
	}
	c.groups = groups
	b.seen = len(kept)
	b.pruned.Candidates += dropped
	b.pruned.MaxFreq = max(b.pruned.MaxFreq, k)
	b.pruned.Times++
	b.est = c.tableBytes()
}
