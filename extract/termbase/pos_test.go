package termbase

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A part of speech is stored only when it is a TBX-Basic value
// (TBX-Basic's partOfSpeech picklist: adjective, noun, other, verb,
// adverb) or UPOS tags (Universal Dependencies v2 tag set), whichever way
// it is set: a refused value changes nothing and logs nothing.
func TestPartOfSpeechIsChecked(t *testing.T) {
	for _, c := range []struct {
		pos string
		ok  bool
	}{
		{"", true},
		{"noun", true},
		{"adverb", true},
		{"PROPN", true},
		{"ADJ NOUN", true},
		{"nuon", false},
		{"Noun", false},
		{"NN", false},
		{"ADJ  NOUN", false},
		{" NOUN", false},
		{"banana", false},
	} {
		t.Run(c.pos, func(t *testing.T) {
			assert.Equal(t, c.ok, ValidPOS(c.pos))
			if c.pos == "" {
				return
			}
			s := openTemp(t)
			_, err := s.Accept("defrost heater")
			require.NoError(t, err)
			_, err1 := s.SetPOS("defrost heater", c.pos)
			_, err2 := s.Edit("defrost heater", Edit{POS: c.pos, Note: "from the spare parts list"})
			es, err := s.Lookup("defrost heater")
			require.NoError(t, err)
			require.Len(t, es, 1)
			if c.ok {
				assert.NoError(t, err1)
				assert.NoError(t, err2)
				assert.Equal(t, c.pos, es[0].Terms[0].POS)
				return
			}
			assert.ErrorContains(t, err1, "want one of noun, verb, adjective, adverb, other")
			assert.ErrorContains(t, err2, "want one of noun, verb, adjective, adverb, other")
			assert.Empty(t, es[0].Terms[0].POS)
			assert.Empty(t, es[0].Notes, "a refused edit changed nothing")
			hist, err := s.History(es[0].ID)
			require.NoError(t, err)
			assert.Len(t, hist, 1, "only the accept is logged")
		})
	}
}
