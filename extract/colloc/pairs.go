package colloc

import (
	"strings"
	"unicode"

	"glossmith/extract/wordshape"
	"glossmith/tagger/doc"
)

// By chooses what of a token is counted: its lemma or its word form.
type By int

const (
	ByLemma By = iota // lemma, lower-cased except proper nouns (the default)
	ByWord            // word form, lower-cased except proper nouns
)

// Key returns the string counted for a token. Lemmas fall back to the form
// for untagged tokens. Proper nouns and all-capital acronyms keep their
// case ("VX-220", "EC"), everything else is lower-cased so that sentence
// capitals do not split counts.
func (b By) Key(t *doc.Token) string {
	w := t.Form
	if b == ByLemma && t.Lemma != "" {
		w = t.Lemma
	}
	if t.UPOS == "PROPN" || wordshape.IsAcronym(t.Form) {
		return w
	}
	return strings.ToLower(w)
}

// SlotPair makes the pair of a relation match from its "node" and
// "collocate" slots (token spans [start, end) in the sentence). A slot spanning several
// tokens stands for its last token, the head of an English noun phrase. It
// reports false when either slot is missing or empty.
func SlotPair(relation string, toks []doc.Token, slots map[string][2]int, by By) (Pair, bool) {
	h, okh := slots[NodeSlot]
	d, okd := slots[CollocateSlot]
	if !okh || !okd || h[1] <= h[0] || d[1] <= d[0] || h[1] > len(toks) || d[1] > len(toks) {
		return Pair{}, false
	}
	hi, di := h[1]-1, d[1]-1
	hw, dw := by.Key(&toks[hi]), by.Key(&toks[di])
	if di < hi {
		return Pair{Relation: relation, W1: dw, W2: hw, NodeIsW2: true}, true
	}
	return Pair{Relation: relation, W1: hw, W2: dw, NodeIsW2: false}, true
}

// WindowRelation is the relation name of window co-occurrence pairs.
const WindowRelation = "window"

// ContentWord reports whether a token takes part in window pairs by
// default: nouns, proper nouns, verbs, adjectives, adverbs and numbers that
// contain a letter or digit. Function words would otherwise fill the top of
// every list with "the"+noun pairs that say nothing about a domain.
func ContentWord(t *doc.Token) bool {
	switch t.UPOS {
	case "NOUN", "PROPN", "VERB", "ADJ", "ADV", "NUM":
	case "":
		// untagged text: fall back to words with letters
	default:
		return false
	}
	for _, r := range t.Form {
		if unicode.IsLetter(r) || unicode.IsDigit(r) {
			return true
		}
	}
	return false
}

// WindowPairs calls emit for every pair of kept tokens at most n tokens
// apart within the sentence (positions i < j ≤ i+n, counted over all tokens
// so that punctuation still takes room). W1 is the earlier token; a window
// pair has no node of its own (a profile asks for either word).
func WindowPairs(toks []doc.Token, n int, by By, keep func(*doc.Token) bool, emit func(Pair)) {
	if keep == nil {
		keep = ContentWord
	}
	for i := range toks {
		if !keep(&toks[i]) {
			continue
		}
		wi := by.Key(&toks[i])
		for j := i + 1; j <= i+n && j < len(toks); j++ {
			if !keep(&toks[j]) {
				continue
			}
			emit(Pair{Relation: WindowRelation, W1: wi, W2: by.Key(&toks[j])})
		}
	}
}

// The labels a relation rule gives its two words: the word studied (the
// node) and the word found with it (the collocate), the terms of corpus
// linguistics. A rule that `collocations` counts must set both.
const (
	NodeSlot      = "node"
	CollocateSlot = "collocate"
)
