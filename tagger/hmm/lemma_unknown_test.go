package hmm

import (
	"strings"
	"testing"

	"glossmith/tagger/doc"

	"github.com/stretchr/testify/assert"
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

// A singular noun the treebank does not know is its own lemma: suffix
// rules learned from the treebank's typo corrections ("rode" → "road")
// turned "corrode" into "corroad" and "endorphin" into "endorphing". A
// rewrite stands only when WordNet 3.0 lists its result (Latin and Greek
// plurals tagged NN: "clostridia" → "clostridium").
func TestUnknownSingularLemma(t *testing.T) {
	m, err := Default()
	require.NoError(t, err)
	tests := []struct{ form, want string }{
		{"corrode", "corrode"},
		{"endorphin", "endorphin"},
		{"deposer", "deposer"},
		{"principalship", "principalship"},
		{"nematoda", "nematoda"},
		{"paramecia", "paramecium"},
	}
	for _, tt := range tests {
		s := doc.Sentence{Tokens: []doc.Token{{Form: "The"}, {Form: "storage"}, {Form: "tank"}, {Form: tt.form}, {Form: "is"}, {Form: "here"}, {Form: "."}}}
		m.Tag(&s)
		tok := s.Tokens[3]
		require.Equal(t, "NN", tok.XPOS, "%s: the check is of singular nouns", tt.form)
		assert.Equal(t, tt.want, tok.Lemma, tt.form)
	}
}

// A singular noun in capitals is an acronym, and its letters are no word
// for the suffix rules learned from lower-case words: "LED" had the lemma
// "le" and "OLED" "ole" (the rule of "used"), so terms listed "LED" under
// "le".
func TestAcronymSingularLemma(t *testing.T) {
	m, err := Default()
	require.NoError(t, err)
	for _, form := range []string{"LED", "OLED", "GPS", "HVAC", "RCD"} {
		s := doc.Sentence{Tokens: []doc.Token{{Form: "Check"}, {Form: "the"}, {Form: form}, {Form: "now"}, {Form: "."}}}
		m.Tag(&s)
		tok := s.Tokens[2]
		require.Equal(t, "NN", tok.XPOS, "%s: the check is of singular nouns", form)
		assert.Equal(t, strings.ToLower(form), tok.Lemma, form)
	}
}
