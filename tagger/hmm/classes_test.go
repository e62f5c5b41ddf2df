package hmm

import (
	"bytes"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The embedded word class table parses, and a word in it gets one feature
// per class prefix while a word outside it gets none.
func TestEmbeddedClasses(t *testing.T) {
	cf := englishClasses()
	require.NotNil(t, cf, "tagger/model/en-wordclasses.txt.gz is embedded and parses")
	assert.Greater(t, cf.table.Len(), 10000)
	require.GreaterOrEqual(t, cf.table.Class([]byte("valve")), int32(0), "a word of WordNet's glosses")
	assert.Equal(t, int32(-1), cf.table.Class([]byte("wumbles")))

	keys := func(form string, cf *classFeatures) int {
		var ti tokenInfo
		buf := ti.fill(nil, form, nil, nil)
		f, _, _ := appendAloneKeys(nil, buf, form, &ti, cf)
		return len(f)
	}
	assert.Equal(t, keys("Valve", nil)+len(classPrefixes), keys("Valve", cf), "looked up lower-cased")
	assert.Equal(t, keys("wumbles", nil), keys("wumbles", cf))
}

// A model uses the learned classes only when it was trained with them.
func TestLearnedClassesOnlyWhenTrainedWith(t *testing.T) {
	for _, with := range []bool{false, true} {
		m, err := Train(small(t), TrainOptions{Epochs: 1, LearnedClasses: with})
		require.NoError(t, err)
		assert.Equal(t, with, m.perc.classes != nil, "trained with learned classes: %v", with)
		var buf bytes.Buffer
		require.NoError(t, m.Save(&buf))
		back, err := Decode(buf.Bytes())
		require.NoError(t, err)
		assert.Equal(t, with, back.perc.classes != nil, "decoded, trained with learned classes: %v", with)
	}
}
