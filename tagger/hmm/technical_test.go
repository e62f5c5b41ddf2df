package hmm

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/doc"
	"glossmith/tagger/tokenize"
)

// Sentences of the kind a technical writer's manual holds (our invented
// greenhouse controllers), where users met tagging errors: noun or verb
// ("closes" after its subject is the verb; "union nuts" are nuts),
// nouns before nouns, and common nouns capitalized in a heading. The
// expected tags follow the Universal Dependencies guidelines for UPOS
// (universaldependencies.org/u/pos: a noun that modifies a noun is NOUN, a
// capitalized common noun in a title is NOUN, not PROPN). The model before
// its WordNet word classes tagged "closes" in the second sentence, "cable"
// and the heading's "Humidity Sensor" wrongly; errors it still makes
// ("rises" and "drops" at a sentence's end as nouns) are listed in the
// README's tagger section. Headings the readers mark as such are tested
// in TestHeadingSentences.
func TestTechnicalSentences(t *testing.T) {
	m, err := Default()
	require.NoError(t, err)
	tests := []struct {
		text string
		want map[string]string // word → UPOS
	}{
		{"The controller closes the vent when the humidity rises.", map[string]string{"controller": "NOUN", "closes": "VERB", "vent": "NOUN"}},
		{"The valve closes after ten minutes.", map[string]string{"valve": "NOUN", "closes": "VERB"}},
		{"Tighten the union nuts on the drip line by hand.", map[string]string{"union": "NOUN", "nuts": "NOUN", "drip": "NOUN"}},
		{"Replacing the Humidity Sensor", map[string]string{"Replacing": "VERB", "Humidity": "NOUN", "Sensor": "NOUN"}},
		{"The sensor cable runs along the ridge beam.", map[string]string{"sensor": "NOUN", "cable": "NOUN", "ridge": "NOUN"}},
		{"Check the irrigation valve before each season.", map[string]string{"irrigation": "NOUN", "valve": "NOUN"}},
		{"Open the mixing valve slowly.", map[string]string{"Open": "VERB", "mixing": "NOUN"}},
	}
	for _, tt := range tests {
		d := &doc.Document{Text: tt.text}
		tokenize.Document(d)
		require.Len(t, d.Sentences, 1, tt.text)
		s := &d.Sentences[0]
		m.Tag(s)
		got := map[string]string{}
		for _, tok := range s.Tokens {
			if _, ok := tt.want[tok.Form]; ok {
				got[tok.Form] = tok.UPOS
			}
		}
		assert.Equal(t, tt.want, got, tt.text)
	}
}
