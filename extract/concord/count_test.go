package concord

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/doc"
	"glossmith/tagger/tokenize"
)

// Keys keep the case of acronyms and units, also as lemmas, and fold
// every other word.
func TestKeyKeepsMeaningfulCase(t *testing.T) {
	toks := []doc.Token{
		{Form: "Two", Lemma: "two"}, {Form: "HAWTs", Lemma: "hawt"}, {Form: "give", Lemma: "give"},
		{Form: "3", Lemma: "3"}, {Form: "MW", Lemma: "mw"}, {Form: "at", Lemma: "at"}, {Form: "200", Lemma: "200"}, {Form: "kPa", Lemma: "kpa"},
	}
	for i := range toks {
		toks[i].SpaceAfter = true
	}
	assert.Equal(t, "two HAWTs give 3 MW at 200 kPa", Key(toks, 0, len(toks), false))
	assert.Equal(t, "two HAWT give 3 MW at 200 kPa", Key(toks, 0, len(toks), true))
}

// Keys are joined as the text is: a space where white space follows a
// token, none where the tokenizer split a word (UD English splits
// hyphenated compounds and clitics: "GC-48" is GC, -, 48).
func TestKeyJoinsAsTheTextIs(t *testing.T) {
	for _, c := range []struct {
		text, key, lemmaKey string
	}{
		{"Connect the GC-48 now", "connect the GC-48 now", "connect the GC-48 now"},
		{"It doesn't close.", "it doesn't close.", "it doesn't close."},
		{"two set-points", "two set-points", "two set-point"},
		{"a  flow   rate", "a flow rate", "a flow rate"},
	} {
		t.Run(c.text, func(t *testing.T) {
			d := &doc.Document{Name: "t", Text: c.text}
			tokenize.Document(d)
			var toks []doc.Token
			for _, s := range d.Sentences {
				toks = append(toks, s.Tokens...)
			}
			require.NotEmpty(t, toks)
			assert.Equal(t, c.key, Key(toks, 0, len(toks), false))
			for i := range toks {
				toks[i].Lemma = strings.ToLower(toks[i].Form)
				if toks[i].Lemma == "points" {
					toks[i].Lemma = "point"
				}
			}
			assert.Equal(t, c.lemmaKey, Key(toks, 0, len(toks), true))
		})
	}
}

// Lemmas run together as their forms do, except a clitic whose lemma is
// another word: "doesn't" counts as "do not", "gonna" as "go to", while
// "set-points" is "set-point" and "can't" "can not".
func TestLemmaKeySeparatesClitics(t *testing.T) {
	tok := func(form, lemma string, space bool) doc.Token {
		return doc.Token{Form: form, Lemma: lemma, SpaceAfter: space}
	}
	for _, c := range []struct {
		toks          []doc.Token
		key, lemmaKey string
	}{
		{[]doc.Token{tok("It", "it", true), tok("does", "do", false), tok("n't", "not", true), tok("close", "close", false)},
			"it doesn't close", "it do not close"},
		{[]doc.Token{tok("gon", "go", false), tok("na", "to", true), tok("leak", "leak", false)},
			"gonna leak", "go to leak"},
		{[]doc.Token{tok("two", "two", true), tok("set", "set", false), tok("-", "-", false), tok("points", "point", false)},
			"two set-points", "two set-point"},
		{[]doc.Token{tok("ca", "can", false), tok("n't", "not", false)}, "can't", "can not"},
		{[]doc.Token{tok("valve", "", false), tok("'s", "'s", false)}, "valve's", "valve's"},
	} {
		assert.Equal(t, c.key, Key(c.toks, 0, len(c.toks), false))
		assert.Equal(t, c.lemmaKey, Key(c.toks, 0, len(c.toks), true))
	}
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
