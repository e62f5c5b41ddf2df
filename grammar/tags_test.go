package grammar

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The Penn Treebank tags of Marcus, Santorini and Marcinkiewicz (1993),
// Table 2, as the UD English EWT treebank's XPOS column uses them (with
// ADD, AFX, GW, HYPH, NFP and XX added there).
var pennTags = []string{"$", "''", ",", "-LRB-", "-RRB-", ".", ":", "ADD", "AFX", "CC", "CD", "DT", "EX", "FW", "GW", "HYPH", "IN", "JJ", "JJR", "JJS", "LS", "MD", "NFP", "NN", "NNP", "NNPS", "NNS", "PDT", "POS", "PRP", "PRP$", "RB", "RBR", "RBS", "RP", "SYM", "TO", "UH", "VB", "VBD", "VBG", "VBN", "VBP", "VBZ", "WDT", "WP", "WP$", "WRB", "XX", "``"}

func TestCheckTags(t *testing.T) {
	f, err := ParseString("tags.gsr", "a = xpos:NNQ ;\nb = xpos:VBN xpos:PRP$ ;\nc = xpos:/^ZZ/ | xpos:/^VB/ ;\nd = xpos:QQQQQQ ;\n")
	require.NoError(t, err)
	rs, err := LoadFiles(f)
	require.NoError(t, err)
	errs, warnings := rs.CheckTags(pennTags)
	require.Len(t, errs, 2)
	assert.Equal(t, `tags.gsr:1:5: unknown fine tag xpos:NNQ: the tagging model never assigns it — did you mean "NN", "NNP" or "NNS"?`, errs[0].Error())
	assert.Equal(t, "a = xpos:NNQ ;\n    ^", errs[0].Caret())
	assert.Equal(t, "tags.gsr:4:5: unknown fine tag xpos:QQQQQQ: the tagging model never assigns it", errs[1].Error())
	require.Len(t, warnings, 1)
	assert.Equal(t, "tags.gsr:3:10: xpos:/^ZZ/ matches none of the 50 fine tags of the tagging model", warnings[0].Error())

	errs, warnings = rs.CheckTags(nil)
	assert.Empty(t, errs)
	assert.Empty(t, warnings)

	stock, err := LoadStock(StockNames()...)
	require.NoError(t, err)
	errs, warnings = stock.CheckTags(pennTags)
	assert.Empty(t, errs, "stock sets")
	assert.Empty(t, warnings, "stock sets")
}
