package terms

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A gold list that is not text (a binary file, another encoding) is an
// error naming the file and line, not an empty or garbled list that would
// score zeros.
func TestReadGoldRefusesNonText(t *testing.T) {
	for name, in := range map[string]string{
		"binary": "valve\n\x00\x01\x02binary\n",
		"latin1": "valve\ncaf\xe9 filter\n",
	} {
		_, err := ReadGold(strings.NewReader(in), name+".tsv")
		require.Error(t, err, name)
		assert.Contains(t, err.Error(), name+".tsv:2: not a text file", name)
	}
	g, err := ReadGold(strings.NewReader("Valve\tTerm\n# note\n\ndrip emitter\n"), "gold.tsv")
	require.NoError(t, err)
	assert.Equal(t, Gold{"valve": true, "drip emitter": true}, g)
}
