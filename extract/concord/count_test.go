package concord

import (
	"testing"

	"github.com/stretchr/testify/assert"

	"glossmith/tagger/doc"
)

// Keys keep the case of acronyms and units, also as lemmas, and fold
// every other word.
func TestKeyKeepsMeaningfulCase(t *testing.T) {
	toks := []doc.Token{
		{Form: "Two", Lemma: "two"}, {Form: "HAWTs", Lemma: "hawt"}, {Form: "give", Lemma: "give"},
		{Form: "3", Lemma: "3"}, {Form: "MW", Lemma: "mw"}, {Form: "at", Lemma: "at"}, {Form: "200", Lemma: "200"}, {Form: "kPa", Lemma: "kpa"},
	}
	assert.Equal(t, "two HAWTs give 3 MW at 200 kPa", Key(toks, 0, len(toks), false))
	assert.Equal(t, "two HAWT give 3 MW at 200 kPa", Key(toks, 0, len(toks), true))
}

// Spellings of one string in different case are one line, lower case
// when it occurs, else the most frequent spelling; the order in which
// counts were merged does not matter.
func TestSortedFoldsCase(t *testing.T) {
	counts := []map[string]int{{"MW": 2, "Mw": 1}, {"MW": 1, "kPa": 2}, {"Valve": 1, "valve": 1}, {"KPA": 1}}
	var lists [][]Entry
	for _, order := range [][]int{{0, 1, 2, 3}, {3, 2, 1, 0}} {
		c := NewCounter()
		for _, k := range order {
			o := NewCounter()
			for s, n := range counts[k] {
				for range n {
					o.Add(s)
				}
			}
			c.Merge(o)
		}
		lists = append(lists, c.Sorted())
	}
	want := []Entry{{"MW", 4}, {"kPa", 3}, {"valve", 2}}
	assert.Equal(t, want, lists[0])
	assert.Equal(t, want, lists[1])
}
