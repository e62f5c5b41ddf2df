package hmm

import (
	"slices"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/conllu"
)

// searchErrors decodes every sentence of gold (its tokens only) with the
// given beam and with none, and returns the number of sentences whose
// tags differ: the beam's search errors, as the perceptron's scores do not
// change with it.
func searchErrors(t *testing.T, m *Model, gold []*conllu.Sentence, beam float32) int {
	t.Helper()
	ws := m.getWorkspace()
	defer m.pool.Put(ws)
	n := 0
	for _, s := range gold {
		m.perc.buildLattice(m, ws, s.Tokens)
		ws.decode(&m.trans, beam)
		beamed := slices.Clone(ws.tags[:len(s.Tokens)])
		ws.decode(&m.trans, -1)
		if !slices.Equal(beamed, ws.tags[:len(s.Tokens)]) {
			n++
		}
	}
	return n
}

// The default model's beam prunes states without losing the best path of
// more than a handful of UD English EWT dev sentences (exact Viterbi is
// the reference: the beam is there for speed, not accuracy), where a beam
// of 30 lost many more.
func TestDefaultBeamKeepsTheBestPath(t *testing.T) {
	_, dev, _ := ewt(t)
	m, err := Default()
	require.NoError(t, err)
	require.Equal(t, MethodPerceptron, m.Info().Method)
	own := searchErrors(t, m, dev, m.beam)
	narrow := searchErrors(t, m, dev, 30)
	t.Logf("EWT dev, %d sentences: %d differ from exact Viterbi with the model's beam %v, %d with beam 30", len(dev), own, m.beam, narrow)
	assert.LessOrEqual(t, own, len(dev)/500, "beam %v: search errors in more than 0.2%% of the sentences", m.beam)
	assert.Less(t, own, narrow)
}
