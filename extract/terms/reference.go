package terms

import (
	"strings"

	"glossmith/tagger/hmm"
	"glossmith/tagger/wordnet"
)

// ModelReference returns the default general-language reference, both
// carried by the tagger model: the lemma counts of its training treebank
// (UD English EWT, web text) pooled with the tagged-sense counts of
// WordNet's semantic concordance (the sense-tagged Brown corpus, balanced
// written English), as if they were one corpus: a word's counts are added,
// and so are the two sizes. With the treebank alone, words of written
// English that web text seldom uses ("accordance", "ratification",
// "diameter") looked specific to every domain; on the evaluation lists the
// pooled reference ranked better on all three domains (mean best F1 0.432
// → 0.450; README, "Evaluation").
func ModelReference(m *hmm.Model) Reference {
	wn := m.WordNet()
	return modelReference{m, wn, m.RefSize() + wn.TaggedTotal()}
}

type modelReference struct {
	m    *hmm.Model
	wn   *wordnet.Table
	size int
}

// Freq implements Reference.
func (r modelReference) Freq(w string) int {
	w = strings.ToLower(w)
	return r.m.RefLemmaFreq(w) + r.wn.TaggedCount(w)
}

// Size implements Reference.
func (r modelReference) Size() int { return r.size }
