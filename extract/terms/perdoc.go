package terms

// DocCount is how often a candidate occurs in one document of the corpus.
type DocCount struct {
	Doc   int // index in DocNames
	Count int
}

// DocNames returns the names of the merged documents in input order; a
// DocCount's Doc indexes it.
func (c *Corpus) DocNames() []string { return c.docs }

// DocSizes returns each document's size in word tokens, in input order
// (what a count per document is read against).
func (c *Corpus) DocSizes() []int { return c.docSize }

// PerDoc returns the candidate's counts per document, in document order,
// for the spread of a term over the documents (a review page draws it);
// a full form's include the acronym's it pools (see linkAbbrevs). t must
// come from this corpus's Terms.
func (c *Corpus) PerDoc(t *Term) []DocCount {
	g := c.groups[t.key]
	if g == nil {
		return nil
	}
	perDoc := g.perDoc
	if a := c.groups[t.pooled]; t.pooled != "" && a != nil {
		perDoc = sumDocs(perDoc, a.perDoc)
	}
	out := make([]DocCount, len(perDoc))
	for i, df := range perDoc {
		out[i] = DocCount{Doc: int(df.doc), Count: int(df.n)}
	}
	return out
}

// Key returns the candidate's group key (lower-cased, hyphens and spaces
// removed): what two spellings of one candidate share.
func (t *Term) Key() string { return t.key }

// WordList returns the candidate's words as the canonical form has them.
func (t *Term) WordList() []string { return t.words }
