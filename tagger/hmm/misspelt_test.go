package hmm

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/doc"
)

func sentenceOf(text string) *doc.Sentence {
	s := &doc.Sentence{}
	for f := range strings.FieldsSeq(text) {
		s.Tokens = append(s.Tokens, doc.Token{Form: f})
	}
	return s
}

// A misspelt word is tagged as the word it stands for ("fisrt" as the
// adjective "first", "workign" as the verb "working"; without the reading
// the tagger made them a verb and an adjective) and keeps its own form and
// a lemma of its own. A capitalized word, mostly a name, is not read as
// another word, and a word any lexicon knows is left alone.
func TestMisspeltWordsTaggedAsMeant(t *testing.T) {
	m, err := Default()
	require.NoError(t, err)
	for _, c := range []struct {
		text, word, upos, lemma string
	}{
		{"Close the fisrt valve before you clean the filter .", "fisrt", "ADJ", "fisrt"},
		{"Check that the controller is workign .", "workign", "VERB", ""},
		{"Close the first valve before you clean the filter .", "first", "ADJ", "first"},
		// Capitalized words are read only for letters repeated for
		// emphasis, as "So" and "VERY".
		{"Sooooo glad the pump works again .", "Sooooo", "ADV", ""},
		{"The new sensor is VERYYY accurate .", "VERYYY", "ADV", ""},
	} {
		for range 2 { // the second time from the workspace's memo
			s := sentenceOf(c.text)
			m.Tag(s)
			for _, tok := range s.Tokens {
				if tok.Form != c.word {
					continue
				}
				assert.Equal(t, c.upos, tok.UPOS, c.text)
				if c.lemma != "" {
					assert.Equal(t, c.lemma, tok.Lemma, c.text)
				}
			}
		}
	}
	ws := m.getWorkspace()
	defer m.pool.Put(ws)
	for _, w := range []string{"Traci", "valve", "x", "Brrrr", "AAA", "YYYY"} {
		toks := sentenceOf("Ask " + w + " now").Tokens
		m.decode(ws, toks)
		v := m.spellView(ws, toks)
		assert.Same(t, &toks[0], &v[0], w)
	}
}

// UnknownWord is true only for words no lexicon of the model lists: a
// treebank word, a WordNet word and a general-English word are words; a
// misspelling of one is not.
func TestUnknownWord(t *testing.T) {
	m, err := Default()
	require.NoError(t, err)
	for _, c := range []struct {
		word    string
		unknown bool
	}{
		{"valve", false},      // treebank and general English
		{"value", false},      // one edit from "valve", a word
		{"thermistor", false}, // WordNet
		{"vavle", true},
		{"thermistr", true},
		{"piont", true},
	} {
		assert.Equal(t, c.unknown, m.UnknownWord(c.word), c.word)
	}
	// A model without WordNet and general English calls no word unknown.
	bare := &Model{lex: m.lex, freq: m.freq}
	assert.False(t, bare.UnknownWord("vavle"))
}
