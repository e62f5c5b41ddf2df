package grammar

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestSourceAndUses(t *testing.T) {
	f, err := ParseString("t.gsr", `# a helper
_mod = ADJ | NOUN ;   # trailing comment

# the term
term = _mod* NOUN    # a comment; with a semicolon
     | "a;b" /x;y/ NOUN ;
outer = term "of" term | _other ;
_other = PROPN ;
alone = NOUN ;
`)
	require.NoError(t, err)
	rs, err := LoadFiles(f)
	require.NoError(t, err)
	assert.Equal(t, "_mod = ADJ | NOUN ;", rs.Source(rs.Rule("_mod")))
	assert.Equal(t, "term = _mod* NOUN    # a comment; with a semicolon\n     | \"a;b\" /x;y/ NOUN ;", rs.Source(rs.Rule("term")))
	assert.Equal(t, []string{"term", "_mod", "_other"}, rs.Uses("outer"))
	assert.Equal(t, []string{"_mod"}, rs.Uses("term"))
	assert.Nil(t, rs.Uses("alone"))
	assert.Nil(t, rs.Uses("missing"))
}

// Every stock rule's source parses back to the same rule.
func TestSourceOfStockRules(t *testing.T) {
	for _, name := range StockNames() {
		rs, err := LoadStock(name)
		require.NoError(t, err)
		for _, r := range rs.Rules {
			src := rs.Source(r)
			require.NotEmpty(t, src, r.Name)
			f, err := ParseString("again.gsr", src)
			require.NoError(t, err, "%s: %q", r.Name, src)
			require.Len(t, f.Rules, 1)
			assert.Equal(t, Format(r.Expr), Format(f.Rules[0].Expr), r.Name)
		}
	}
}
