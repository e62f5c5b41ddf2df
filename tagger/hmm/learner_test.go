package hmm

import (
	"bytes"
	"math"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/conllu"
	"glossmith/tagger/doc"
)

// greenhouseSents is a small invented treebank: form/UPOS/XPOS triples.
func greenhouseSents() []*conllu.Sentence {
	lines := []string{
		"The/DET/DT valve/NOUN/NN closes/VERB/VBZ after/ADP/IN ten/NUM/CD minutes/NOUN/NNS ./PUNCT/.",
		"Open/VERB/VB the/DET/DT drip/NOUN/NN line/NOUN/NN slowly/ADV/RB ./PUNCT/.",
		"The/DET/DT controller/NOUN/NN reads/VERB/VBZ the/DET/DT humidity/NOUN/NN sensor/NOUN/NN ./PUNCT/.",
		"Check/VERB/VB the/DET/DT union/NOUN/NN nuts/NOUN/NNS before/ADP/IN watering/NOUN/NN ./PUNCT/.",
		"A/DET/DT dry/ADJ/JJ tank/NOUN/NN stops/VERB/VBZ the/DET/DT pump/NOUN/NN ./PUNCT/.",
		"The/DET/DT fan/NOUN/NN runs/VERB/VBZ when/ADV/WRB the/DET/DT air/NOUN/NN is/AUX/VBZ warm/ADJ/JJ ./PUNCT/.",
	}
	var out []*conllu.Sentence
	for _, l := range lines {
		s := &conllu.Sentence{}
		for _, w := range strings.Fields(l) {
			p := strings.Split(w, "/")
			s.Tokens = append(s.Tokens, doc.Token{Form: p[0], Lemma: strings.ToLower(p[0]), UPOS: p[1], XPOS: p[2]})
		}
		out = append(out, s)
	}
	return out
}

// learnerSetup returns a model, its training rows and a fresh trainer, as
// trainPerceptron prepares them.
func learnerSetup(t *testing.T, opt TrainOptions) (*Model, *workspace, *featureRows, *trainer, transitions) {
	t.Helper()
	sents := greenhouseSents()
	require.NoError(t, opt.defaults())
	m, gold, err := newBase(sents, &opt)
	require.NoError(t, err)
	ws := newWorkspace()
	rows := trainingRows(m, ws, sents, gold, 1)
	m.perc = &perceptron{dictMin: int32(opt.DictMin), maxCands: opt.MaxCands}
	tr := newTrainer(m, len(rows.keys), &opt)
	trans := transitions{t1: tr.nt + 1, tri: tr.layers[0].tri, bi: tr.layers[0].bi}
	return m, ws, rows, tr, trans
}

// pathMargin is score(gold) − score(pred) under tr's weights, from the
// difference vector updatePA left in tr.diff.
func pathMargin(tr *trainer) float64 {
	var s float64
	for _, c := range tr.diff {
		s += float64(tr.weight(c)) * float64(c.d)
	}
	return s
}

// The PA-I step of Crammer et al. (2006, JMLR 7, eq. 8/§8): τ is the
// smallest step after which gold beats the prediction by the loss, so
// afterwards score(gold) − score(pred) equals the loss exactly, unless C
// caps the step, when τ = C.
func TestPassiveAggressiveStep(t *testing.T) {
	for _, tc := range []struct {
		name   string
		c      float64
		capped bool
	}{
		{"uncapped", 1e9, false},
		{"capped by C", 1e-4, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			m, ws, rows, tr, trans := learnerSetup(t, TrainOptions{PassiveAggressive: tc.c, TrainMargin: 1})
			ts := &rows.data[0]
			tr.c = 1
			tr.predict(m, &ws.lattice, ts, rows.rows, &trans, math.MaxInt32)
			pred := append([]uint8(nil), ws.tags...)
			loss := 0
			for i := range pred {
				if pred[i] != ts.gold[i] {
					loss++
				}
			}
			require.Positive(t, loss, "zero weights with a margin must predict wrong tags")
			tr.updatePA(ts, pred, rows.rows)
			require.Equal(t, 1, tr.nSteps)
			if tc.capped {
				assert.Equal(t, tc.c, tr.stepSum)
				assert.Less(t, pathMargin(tr), float64(loss))
			} else {
				assert.InDelta(t, float64(loss), pathMargin(tr), 1e-4)
				assert.Less(t, tr.stepSum, tc.c)
			}
		})
	}
}

// Cost-augmented decoding (Taskar et al. 2004): with all weights zero,
// every wrong tag outscores the gold one by the margin, so no token keeps
// its gold tag.
func TestCostAugmentedDecoding(t *testing.T) {
	m, ws, rows, tr, trans := learnerSetup(t, TrainOptions{TrainMargin: 1})
	for si := range rows.data {
		ts := &rows.data[si]
		tr.predict(m, &ws.lattice, ts, rows.rows, &trans, math.MaxInt32)
		for i, g := range ts.gold {
			assert.NotEqual(t, g, ws.tags[i], "sentence %d, token %d", si, i)
		}
	}
}

func TestPassiveAggressiveTrainingIsDeterministic(t *testing.T) {
	var files [2][]byte
	for i := range files {
		m, err := Train(greenhouseSents(), TrainOptions{Epochs: 3, Shuffles: 2, PassiveAggressive: 0.1, TrainMargin: 1, MinFeatureCount: -1})
		require.NoError(t, err)
		var b bytes.Buffer
		require.NoError(t, m.Save(&b))
		files[i] = b.Bytes()
	}
	assert.Equal(t, files[0], files[1])
}

func TestLearnerOptionsRejectNegatives(t *testing.T) {
	for _, opt := range []TrainOptions{{PassiveAggressive: -1}, {TrainMargin: -0.5}} {
		_, err := Train(greenhouseSents(), opt)
		assert.Error(t, err)
	}
}

// The passive-aggressive learner's weights come back to the scale of
// steps of 1, so a training sentence it learned is tagged right after
// pruning small weights as the perceptron's defaults do.
func TestPassiveAggressiveLearnsTrainingSet(t *testing.T) {
	sents := greenhouseSents()
	m, err := Train(sents, TrainOptions{Epochs: 10, PassiveAggressive: 1, MinFeatureCount: -1, PruneWeight: 0.5})
	require.NoError(t, err)
	r := Evaluate(m, sents)
	assert.Greater(t, r.UPOS.Accuracy, 95.0)
}
