package colloc

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/grammar"
)

func loadRules(t *testing.T, src string) *grammar.RuleSet {
	t.Helper()
	f, err := grammar.ParseString("rel.gsr", src)
	require.NoError(t, err)
	rs, err := grammar.LoadFiles(f)
	require.NoError(t, err)
	return rs
}

func TestCheckRelations(t *testing.T) {
	stock, err := grammar.LoadStock("pairs")
	require.NoError(t, err)
	assert.NoError(t, CheckRelations(stock), "the stock pairs set")

	rs := loadRules(t, `ok = @collocate ADJ @node NOUN ;
bare = ADJ NOUN ;
half = @node VERB NOUN ;
old = @dep ADJ @head NOUN ;
inner = @node x ;
x = @collocate ADJ NOUN ;
_helper = ADJ ;
`)
	err = CheckRelations(rs)
	require.Error(t, err)
	var list grammar.ErrorList
	require.ErrorAs(t, err, &list)
	var got []string
	for _, e := range list {
		got = append(got, e.Error())
	}
	assert.Equal(t, []string{
		"rel.gsr:2:1: rule bare has no @node and no @collocate slot: a relation counted by collocations labels the word studied @node and the word found with it @collocate",
		"rel.gsr:3:1: rule half has no @collocate slot: a relation counted by collocations labels the word studied @node and the word found with it @collocate",
		`rel.gsr:4:7: collocation slot @dep — did you mean "@collocate"?`,
		`rel.gsr:4:16: collocation slot @head — did you mean "@node"?`,
		// Labels of a referenced rule stay inside it.
		"rel.gsr:5:1: rule inner has no @collocate slot: a relation counted by collocations labels the word studied @node and the word found with it @collocate",
		"rel.gsr:6:1: rule x has no @node slot: a relation counted by collocations labels the word studied @node and the word found with it @collocate",
	}, got)
	assert.NoError(t, CheckRelations(rs, "ok"))
	assert.Error(t, CheckRelations(rs, "ok", "half"))
}
