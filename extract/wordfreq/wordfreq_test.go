package wordfreq

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/extract/wordfreq/internal/build"
	"glossmith/internal/testenv"
)

// The embedded table is exactly what the generator makes from the shared
// SUBTLEX-US counts (../shared/data/general-en/subtlex-us-words.json), so
// it can be rebuilt and checked by anyone.
func TestEmbeddedTableIsGenerated(t *testing.T) {
	src := filepath.Join(testenv.SharedDir(t, "data/general-en"), "subtlex-us-words.json")
	f, err := os.Open(src)
	require.NoError(t, err)
	defer f.Close()
	want, err := build.Table(f)
	require.NoError(t, err)
	assert.True(t, string(want) == generalTSV, "general.tsv differs from what mkwordfreq makes: run go run ./extract/wordfreq/internal/mkwordfreq")
}

// The source README (../shared/data/general-en) gives 74,286 word forms
// from about 51 million words; lower-casing merges a few spellings.
func TestGeneralTableSize(t *testing.T) {
	g := General()
	assert.Greater(t, g.Len(), 70000)
	assert.LessOrEqual(t, g.Len(), 74286)
	assert.InDelta(t, 51e6, float64(g.Size()), 3e6)
}

// In subtitles "the" is far more frequent than "turbine", and a form seen
// only in capitals in the source ("I") is found lower-cased.
func TestGeneralTableLookups(t *testing.T) {
	g := General()
	assert.Greater(t, g.Freq("the"), 1_000_000)
	assert.Greater(t, g.Freq("i"), 1_000_000)
	assert.Less(t, g.Freq("turbine"), 100)
	assert.Zero(t, g.Freq("I"), "keys are lower-case")
	assert.Zero(t, g.Freq("pellwick"))
}

func TestBuildMergesCaseAndSorts(t *testing.T) {
	out, err := build.Table(bytes.NewReader([]byte(`[{"word":"Valve","count":3},{"word":"valve","count":4},{"word":"drip","count":7},{"word":"a b","count":9},{"word":"x","count":0}]`)))
	require.NoError(t, err)
	assert.Equal(t, build.Header+"drip\t7\nvalve\t7\n", string(out))
	tb, err := parse(string(out))
	require.NoError(t, err)
	assert.Equal(t, 14, tb.Size())
	assert.Equal(t, 7, tb.Freq("valve"))

	_, err = build.Table(bytes.NewReader([]byte(`{"word":"x"}`)))
	assert.Error(t, err, "not an array")
	_, err = build.Table(bytes.NewReader([]byte(`[]`)))
	assert.Error(t, err, "no forms")
}

func TestParseRejectsBadLines(t *testing.T) {
	_, err := parse("# c\nvalve\tmany\n")
	assert.ErrorContains(t, err, "line 2")
	_, err = parse("valve 12\n")
	assert.ErrorContains(t, err, "line 1")
}
