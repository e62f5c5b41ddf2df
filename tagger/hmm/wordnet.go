package hmm

import "glossmith/tagger/wordnet"

// WordNet returns the WordNet word-class table the model carries (nil for a
// model without one): term ranking reads its tagged-sense counts as a
// general-language reference.
func (m *Model) WordNet() *wordnet.Table { return m.wn }
