package hmm

import (
	"testing"

	"glossmith/tagger/conllu"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Sentences tagged by a model (TrainOptions.Extra) teach the perceptron
// but never the lexicon: a word only they hold stays unknown, so that
// evaluation splits known from unknown tokens as without them.
func TestExtraSentencesLeaveTheLexiconAlone(t *testing.T) {
	train, _, _ := ewt(t)
	hand := train[:1200]
	var only string // a word of extra that hand lacks
	known, tags := map[string]bool{}, map[[2]string]bool{}
	for _, s := range hand {
		for _, tok := range s.Tokens {
			known[tok.Form] = true
			tags[[2]string{tok.XPOS, tok.UPOS}] = true
		}
	}
	var extra []*conllu.Sentence // of the next sentences, those with tags hand has
next:
	for _, s := range train[1200:1600] {
		for _, tok := range s.Tokens {
			if !tags[[2]string{tok.XPOS, tok.UPOS}] {
				continue next
			}
		}
		extra = append(extra, s)
	}
	for _, s := range extra {
		for _, tok := range s.Tokens {
			if !known[tok.Form] && only == "" {
				only = tok.Form
			}
		}
	}
	require.NotEmpty(t, only)
	base, err := Train(hand, TrainOptions{Epochs: 2})
	require.NoError(t, err)
	for _, newOnly := range []bool{false, true} {
		m, err := Train(hand, TrainOptions{Epochs: 2, Extra: extra, ExtraWeight: 0.5, ExtraNewOnly: newOnly})
		require.NoError(t, err)
		assert.Equal(t, base.Info().Words, m.Info().Words, "lexicon of the hand-tagged sentences only")
		assert.Equal(t, base.Info().TrainingToken, m.Info().TrainingToken)
		assert.False(t, m.Known(only), "%q appears only in the extra sentences", only)
		assert.Greater(t, m.Info().Features, base.Info().Features, "the extra sentences' features are learned")
	}
}

func TestExtraSentencesNeedKnownTags(t *testing.T) {
	train, _, _ := ewt(t)
	odd := &conllu.Sentence{}
	odd.Tokens = append(odd.Tokens, train[0].Tokens[0])
	odd.Tokens[0].XPOS = "ZZ"
	_, err := Train(train[:300], TrainOptions{Epochs: 1, Extra: []*conllu.Sentence{odd}})
	require.Error(t, err)
	assert.Contains(t, err.Error(), "ZZ")
}
