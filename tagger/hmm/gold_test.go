package hmm

import (
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/conllu"
	"glossmith/tagger/doc"
)

// goldSentence makes a two-token training sentence whose second token,
// on line 3, has the given tags.
func goldSentence(upos, xpos string) *conllu.Sentence {
	return &conllu.Sentence{Sentence: doc.Sentence{Tokens: []doc.Token{
		{Form: "Valves", Lemma: "valve", UPOS: "NOUN", XPOS: "NNS", Line: 2},
		{Form: "open", Lemma: "open", UPOS: upos, XPOS: xpos, Line: 3},
	}}}
}

// CheckGold refuses what a model cannot learn from, naming the file and
// the token's line; Train refuses it too, before training.
func TestCheckGoldRefusesBadTags(t *testing.T) {
	cases := []struct {
		name, upos, xpos, want string
	}{
		{"untagged", "", "", `train.conllu:3: token "open" has neither UPOS nor XPOS`},
		{"UPOS not in UD", "VERBAL", "VBP", `UPOS "VERBAL" is not a Universal Dependencies tag`},
		{"UPOS in lower case", "verb", "VBP", `UPOS "verb" is not a Universal Dependencies tag`},
		{"XPOS with a tab", "VERB", "VB\tP", `XPOS "VB\tP" has a space or a control character`},
		{"XPOS with a space", "VERB", "VB P", `XPOS "VB P" has a space or a control character`},
		{"XPOS with an escape", "VERB", "\x1b[2J", `XPOS "\x1b[2J" has a space or a control character`},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s := goldSentence(c.upos, c.xpos)
			err := CheckGold(s, "train.conllu")
			require.Error(t, err)
			assert.Contains(t, err.Error(), c.want)
			assert.Contains(t, err.Error(), "train.conllu:3:")

			_, err = Train([]*conllu.Sentence{goldSentence("NOUN", "NN"), s}, TrainOptions{Method: MethodHMM})
			require.Error(t, err, "Train must refuse the sentence")
			assert.Contains(t, err.Error(), "line 3:")
		})
	}
	// Every UD tag, an XPOS alone or a UPOS alone pass.
	for _, u := range doc.UPOSTags {
		assert.NoError(t, CheckGold(goldSentence(u, "XX"), "f"))
	}
	assert.NoError(t, CheckGold(goldSentence("", "VBP"), "f"))
	assert.NoError(t, CheckGold(goldSentence("VERB", ""), "f"))
	assert.Len(t, doc.UPOSTags, 17, "UD v2 has 17 UPOS tags (universaldependencies.org/u/pos/)")
	assert.NotContains(t, strings.Join(doc.UPOSTags, ""), " ")
}

// An unknown method is refused before the sentences are looked at.
func TestTrainChecksMethodFirst(t *testing.T) {
	_, err := Train([]*conllu.Sentence{goldSentence("", "")}, TrainOptions{Method: "bogus"})
	require.Error(t, err)
	assert.Contains(t, err.Error(), `unknown training method "bogus"`)
}
