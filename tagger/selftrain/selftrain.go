// Package selftrain makes training sentences for the tagger out of
// unlabeled text: self-training (McClosky, Charniak and Johnson 2006)
// with two views as the filter, as in tri-training (Zhou and Li 2005;
// Søgaard 2010 for taggers): the text is tagged by the perceptron model
// and by the generative HMM trained on the same treebank, and a sentence
// is kept only where both give every token the same tags. The kept
// sentences teach the perceptron weights of words the treebank lacks; they
// must never feed the tag dictionary (hmm.TrainOptions.Extra), so that
// "unseen in training" keeps meaning unseen in the treebank.
//
// The unlabeled text is WordNet 3.0's glosses: its definitions and
// example sentences (Glosses), which its license lets us redistribute
// derived data of.
package selftrain

import (
	"path/filepath"
	"strings"
	"unicode"

	"glossmith/tagger/conllu"
	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
	"glossmith/tagger/tokenize"
	"glossmith/tagger/wordnet"
)

// Glosses returns the definitions and the example sentences of the
// WordNet 3.0 database in dir (Debian package wordnet-base installs it in
// /usr/share/wordnet), in file order: on each synset line the text after
// " | " is a definition, then quoted examples ("tumble dry";
// "Wash in warm water and tumble dry"), which come back apart and without
// their quotes.
func Glosses(dir string) ([]string, error) {
	var out []string
	for _, name := range wordnet.DataFiles {
		err := wordnet.EachGloss(filepath.Join(dir, name), func(gloss string) {
			out = appendParts(out, gloss)
		})
		if err != nil {
			return nil, err
		}
	}
	return out, nil
}

// appendParts appends a gloss's definition and its quoted examples.
func appendParts(out []string, gloss string) []string {
	def, rest, _ := strings.Cut(gloss, "\"")
	if def = strings.TrimRight(strings.TrimSpace(def), ";"); def != "" {
		out = append(out, strings.TrimSpace(def))
	}
	for rest != "" {
		ex, after, closed := strings.Cut(rest, "\"")
		if ex = strings.TrimSpace(ex); closed && ex != "" {
			out = append(out, ex)
		}
		// Skip what lies between this example and the next opening quote
		// ("; ", or an attribution such as " - Author").
		_, rest, _ = strings.Cut(after, "\"")
	}
	return out
}

// Options bound the sentences Select keeps.
type Options struct {
	// MinTokens and MaxTokens bound a kept sentence's length (defaults 3
	// and 40).
	MinTokens, MaxTokens int
	// Budget is the most tokens kept in all (0: no limit); when more
	// qualify, sentences are taken evenly spread over the text, so that
	// every part of the database (WordNet's files group synsets by topic)
	// is represented.
	Budget int
}

// Stats says what Select saw and kept.
type Stats struct {
	Sentences int // sentences of the text in the length bounds
	New       int // of those, with a word outside the treebank's lexicon
	Agreed    int // of those, tagged alike by both models
	Kept      int // of those, kept within the budget
	Tokens    int // tokens of the kept sentences
}

// Select tokenizes the texts, tags each sentence with both models and
// returns, as tagged sentences (XPOS, UPOS and lemma of first), those
// that have a word first does not know (hmm.Model.Known: seen in its
// training data) and whose tags the models agree on token by token. Both
// models must share a tag set; the result depends only on the inputs.
func Select(texts []string, first, second *hmm.Model, opt Options) ([]*conllu.Sentence, Stats) {
	if opt.MinTokens <= 0 {
		opt.MinTokens = 3
	}
	if opt.MaxTokens <= 0 {
		opt.MaxTokens = 40
	}
	var st Stats
	var agreed []*conllu.Sentence
	var tokens int
	var other doc.Sentence
	for _, text := range texts {
		for _, s := range tokenize.Sentences(text) {
			if len(s.Tokens) < opt.MinTokens || len(s.Tokens) > opt.MaxTokens {
				continue
			}
			st.Sentences++
			if !hasNewWord(first, s.Tokens) {
				continue
			}
			st.New++
			other.Tokens = append(other.Tokens[:0], s.Tokens...)
			first.Tag(&s)
			second.Tag(&other)
			if !sameTags(s.Tokens, other.Tokens) {
				continue
			}
			st.Agreed++
			tokens += len(s.Tokens)
			agreed = append(agreed, &conllu.Sentence{Sentence: s})
		}
	}
	kept := agreed
	if opt.Budget > 0 && tokens > opt.Budget {
		kept = spread(agreed, tokens, opt.Budget)
	}
	st.Kept = len(kept)
	for _, s := range kept {
		st.Tokens += len(s.Tokens)
	}
	return kept, st
}

// spread returns sentences evenly spaced over sents, a share of
// budget/total of them, about budget tokens when total is their tokens.
func spread(sents []*conllu.Sentence, total, budget int) []*conllu.Sentence {
	var out []*conllu.Sentence
	acc := 0
	for _, s := range sents {
		// Bresenham: keep a sentence each time the running share crosses
		// a whole one.
		acc += budget
		if acc >= total {
			acc -= total
			out = append(out, s)
		}
	}
	return out
}

// hasNewWord reports whether a token with a letter is outside m's lexicon.
func hasNewWord(m *hmm.Model, toks []doc.Token) bool {
	for _, t := range toks {
		if strings.IndexFunc(t.Form, unicode.IsLetter) >= 0 && !m.Known(t.Form) {
			return true
		}
	}
	return false
}

// sameTags reports whether two taggings of one sentence agree on every
// token's XPOS and UPOS.
func sameTags(a, b []doc.Token) bool {
	for i := range a {
		if a[i].XPOS != b[i].XPOS || a[i].UPOS != b[i].UPOS {
			return false
		}
	}
	return true
}
