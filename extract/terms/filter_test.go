package terms

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/doc"
	"glossmith/tagger/tokenize"
)

// extractWith runs an extraction with the given options over small texts.
func extractWith(t *testing.T, opt Options, texts ...string) []*Term {
	t.Helper()
	m, col := stockSetup(t, opt)
	c := NewCorpus(3)
	for i, text := range texts {
		d := &doc.Document{Name: string(rune('a' + i)), Text: text}
		tokenize.Document(d)
		m.TagDocument(d)
		c.Add(col.Collect(d))
	}
	return c.Terms(ModelReference(m))
}

// Keep (--include, --exclude) removes whole candidates from the list:
// the candidates left have the counts, contexts and measures of the
// unfiltered run, nested occurrences inside removed candidates included.
func TestKeepFiltersWholeCandidates(t *testing.T) {
	texts := []string{
		"The hot water valve leaks. A water valve was replaced. The valve body is steel.",
		"Check the hot water valve weekly. Each valve opens at dawn. Hot water flows.",
	}
	startsWithAdj := func(toks []doc.Token) bool { return toks[0].UPOS == "ADJ" }
	all := extractWith(t, Options{}, texts...)
	kept := extractWith(t, Options{Keep: func(toks []doc.Token) bool { return !startsWithAdj(toks) }}, texts...)
	require.NotNil(t, find(all, "hot water valve"))
	assert.Nil(t, find(kept, "hot water valve"), "an excluded candidate is listed")
	assert.Less(t, len(kept), len(all))
	for _, k := range kept {
		a := find(all, k.Term)
		require.NotNil(t, a, "%q is not a candidate of the unfiltered run", k.Term)
		assert.Equal(t, a.Freq, k.Freq, "freq of %q", k.Term)
		assert.Equal(t, a.Docs, k.Docs, "docs of %q", k.Term)
		assert.Equal(t, a.CValue, k.CValue, "C-value of %q", k.Term)
		assert.Equal(t, a.Keyness, k.Keyness, "keyness of %q", k.Term)
		assert.Equal(t, a.Contexts, k.Contexts, "contexts of %q", k.Term)
	}
	for _, a := range all {
		if find(kept, a.Term) == nil {
			assert.Equal(t, "ADJ", a.POS[:3], "%q (%s) was left out", a.Term, a.POS)
		}
	}
}
