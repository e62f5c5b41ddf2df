package wordnet

// TaggedCount returns how often the senses of a lower-cased lemma were
// tagged in the semantic concordance whose counts WordNet ships (cntlist:
// the sense-tagged part of the Brown corpus, balanced written English),
// over all its parts of speech; 0 for a form the
// table does not list as a lemma. Term ranking reads it as a general-
// language frequency (extract/terms).
func (t *Table) TaggedCount(lemma string) int {
	e := t.find(lemma)
	if e == nil {
		return 0
	}
	n := 0
	for _, c := range e.counts {
		n += int(c)
	}
	return n
}

// TaggedTotal is the sum of TaggedCount over every lemma of the table: the
// size of the concordance, as far as the table's single words go.
func (t *Table) TaggedTotal() int {
	if t == nil {
		return 0
	}
	n := 0
	for i := range t.entries {
		for _, c := range t.entries[i].counts {
			n += int(c)
		}
	}
	return n
}
