package hmm

import (
	"testing"

	"glossmith/tagger/doc"

	"github.com/stretchr/testify/require"
)

// Regular plurals of words the treebank barely knows must not follow the
// suffix rules learned from frequent irregulars ("wolves" → "wolf"): the
// plain reading wins when the treebank attests it as a lemma.
func TestUnknownPluralLemma(t *testing.T) {
	m, err := Default()
	require.NoError(t, err)
	for form, want := range map[string]string{"valves": "valve", "boxes": "box", "emitters": "emitter"} {
		s := doc.Sentence{Tokens: []doc.Token{{Form: "The"}, {Form: form}, {Form: "failed"}, {Form: "."}}}
		m.Tag(&s)
		if got := s.Tokens[1].Lemma; got != want {
			t.Errorf("%s: lemma %q (tag %s), want %q", form, got, s.Tokens[1].XPOS, want)
		}
	}
}
