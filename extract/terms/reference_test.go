package terms

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The default reference is the treebank's lemma counts and WordNet's
// concordance counts added, word by word and in size, whatever the case
// of the word asked for.
func TestModelReferencePoolsTreebankAndConcordance(t *testing.T) {
	m, _ := defaultSetup(t)
	wn := m.WordNet()
	require.NotNil(t, wn, "the embedded model carries a WordNet table")
	ref := ModelReference(m)
	assert.Equal(t, m.RefSize()+wn.TaggedTotal(), ref.Size())
	assert.Greater(t, wn.TaggedTotal(), 100000, "the concordance's tagged words")
	for _, w := range []string{"instrument", "valve", "the", "glossmith"} {
		assert.Equal(t, m.RefLemmaFreq(w)+wn.TaggedCount(w), ref.Freq(w), w)
	}
	assert.Greater(t, ref.Freq("instrument"), m.RefLemmaFreq("instrument"), "a word of written English the concordance has")
	assert.Equal(t, ref.Freq("instrument"), ref.Freq("Instrument"))
}
