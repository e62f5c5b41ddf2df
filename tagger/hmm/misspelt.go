package hmm

import (
	"math"
	"strings"

	"glossmith/tagger/doc"
	"glossmith/tagger/genfreq"
	"glossmith/tagger/spelling"
)

// The readings of misspelt words (package spelling) come from the words the
// model knows well enough: those of its treebank seen at least
// minSpellCount times, and those general English uses at least 1,000 times
// in its 51 million words (band 4 of package genfreq), about 20 a million.
const (
	minSpellCount = 3
	minSpellBand  = 4
	// generalWords is the size of the general-English reference of package
	// genfreq (SUBTLEX-US, Brysbaert and New 2009).
	generalWords = 51e6
)

// spellDictionary returns the words misspellings may be read as, with
// their frequencies per billion words: the higher of the treebank's and
// general English's (the lower bound of its band). It is built on first
// use, for a model whose text has a word no lexicon knows.
func (m *Model) spellDictionary() *spelling.Dictionary {
	m.spellOnce.Do(func() {
		words := map[string]float64{}
		if m.refSize > 0 {
			for w, i := range m.lex {
				if c := m.words[i].count; c >= minSpellCount {
					words[w] = float64(c) / float64(m.refSize) * 1e9
				}
			}
		}
		m.freq.Each(func(w string, c genfreq.Code) {
			if b := c.Band(); b >= minSpellBand {
				words[w] = max(words[w], math.Pow(10, float64(b-1))/generalWords*1e9)
			}
		})
		m.spellDict = spelling.NewDictionary(words)
	})
	return m.spellDict
}

// unknownToAll reports whether a lower-case word is in none of the model's
// lexicons: its treebank, WordNet and general English. Only such words are
// read as misspellings — a rare word any of them lists is a word.
func (m *Model) unknownToAll(w string) bool {
	if _, ok := m.lex[w]; ok {
		return false
	}
	if m.freq.LookupBytes([]byte(w)) != 0 {
		return false
	}
	return !m.wn.Classes(w).Listed()
}

// UnknownWord reports whether a lower-case word is in none of the model's
// lexicons — its treebank, WordNet and general English — so that a caller
// may take it for a misspelling (the document check does, for words one
// edit from a glossary term's). A model without WordNet or general English
// calls no word unknown: its treebank alone misses too many rare words.
func (m *Model) UnknownWord(w string) bool {
	if m.wn == nil || m.freq == nil {
		return false
	}
	return m.unknownToAll(w)
}

// maxMisspeltMemo bounds the workspace's memo of readings: a domain's
// unknown words recur, and a reading costs up to 50 look-ups a letter.
const maxMisspeltMemo = 1 << 14

// reading returns the reading of a lower-case word outside the treebank's
// lexicon, or "" when it has none.
func (m *Model) reading(ws *workspace, w string) string {
	if !m.unknownToAll(w) {
		return ""
	}
	if ws.speller.Dict == nil {
		ws.speller.Dict = m.spellDictionary()
	}
	r, _ := ws.speller.Correct(w)
	return r
}

// emphatic reports whether a word in ASCII letters has one three times in
// a row, in either case: the cheap test that keeps almost every
// capitalized word from a look-up.
func emphatic(w string) bool {
	for i := 2; i < len(w); i++ {
		if w[i]|0x20 == w[i-1]|0x20 && w[i]|0x20 == w[i-2]|0x20 && 'a' <= w[i]|0x20 && w[i]|0x20 <= 'z' {
			return true
		}
	}
	return false
}

// emphasisReading returns the reading of a capitalized word outside the
// treebank's lexicon that repeats a letter for emphasis, in the word's
// capitals — all of them ("VERYYY" → "VERY") or the first ("Sooooo" →
// "So") — or "" when it has none.
func (m *Model) emphasisReading(ws *workspace, w string) string {
	lw := strings.ToLower(w)
	if !m.unknownToAll(lw) {
		return ""
	}
	if ws.speller.Dict == nil {
		ws.speller.Dict = m.spellDictionary()
	}
	r, ok := ws.speller.Emphasized(lw)
	if !ok {
		return ""
	}
	if strings.ToUpper(w) == w {
		return strings.ToUpper(r)
	}
	return strings.ToUpper(r[:1]) + r[1:]
}

// spellView returns the tokens as the tagger should read them: a word in
// lower case that no lexicon of the model knows and that reads as a
// misspelling of a known word ("fisrt") is seen as that word; tokens
// untouched return toks itself. Capitalized words are mostly names
// ("Traci" is not "Track"): they are read only when they repeat a letter
// for emphasis ("Sooooo", "VERYYY"), and keep their capitals in the
// reading ("So", "VERY"). buf is reused for the copy.
//
// Only a model that carries WordNet and general English reads words this
// way: with its treebank alone, too many rare words are unknown to it
// (a generative model read so lost 0.43 UPOS and 1.91 XPOS on unseen EWT
// dev words).
func (m *Model) spellView(ws *workspace, toks []doc.Token) []doc.Token {
	out := toks
	if m.wn == nil || m.freq == nil {
		return out
	}
	for i := range toks {
		w := toks[i].Form
		if len(w) < 2 {
			continue
		}
		capital := 'A' <= w[0] && w[0] <= 'Z'
		if !capital && (w[0] < 'a' || w[0] > 'z') || capital && !emphatic(w) {
			continue
		}
		if _, ok := m.lex[w]; ok {
			continue
		}
		r, ok := ws.misspelt[w]
		if !ok {
			if capital {
				r = m.emphasisReading(ws, w)
			} else {
				r = m.reading(ws, w)
			}
			if len(ws.misspelt) >= maxMisspeltMemo {
				clear(ws.misspelt)
			}
			ws.misspelt[strings.Clone(w)] = r
		}
		if r == "" {
			continue
		}
		if &out[0] == &toks[0] {
			out = append(ws.spelled[:0], toks...)
			ws.spelled = out
		}
		out[i].Form = r
	}
	return out
}
