package hmm

import (
	"slices"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The embedded model is trained on UD English EWT, whose XPOS column holds
// the Penn Treebank tags (Marcus et al. 1993, Table 2) plus a few of its own.
func TestXPOSTagsOfDefaultModel(t *testing.T) {
	m, err := Default()
	require.NoError(t, err)
	tags := m.XPOSTags()
	assert.True(t, slices.IsSorted(tags))
	assert.Equal(t, len(tags), len(slices.Compact(slices.Clone(tags))), "each tag once")
	for _, want := range []string{"NN", "NNS", "NNP", "VB", "VBN", "VBG", "JJ", "PRP$", "RP", "HYPH"} {
		assert.Contains(t, tags, want)
	}
	assert.NotContains(t, tags, "NOUN", "UPOS tags are not fine tags")
}
