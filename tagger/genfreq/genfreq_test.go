package genfreq

import (
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/internal/testenv"
)

// The committed table is what the generator writes from the SUBTLEX-US
// word list in ../shared/data/general-en (required under CI).
func TestGenerateReproducesTable(t *testing.T) {
	dir := testenv.SharedDir(t, "data/general-en")
	data, err := os.ReadFile(filepath.Join(dir, "subtlex-us-words.json"))
	require.NoError(t, err)
	got, err := Generate(data)
	require.NoError(t, err)
	want, err := os.ReadFile(filepath.Join("..", "model", "general-en-bands.tsv"))
	require.NoError(t, err)
	assert.True(t, string(got) == string(want), "go run ./tagger/model/genfreq writes a different table: regenerate it and retrain the model")
}

func TestGeneratePoolsCaseAndBands(t *testing.T) {
	// Invented counts: "Harbor" mostly capitalized, "valve" always lower case.
	in := `[{"word":"Harbor","count":900},{"word":"harbor","count":100},{"word":"valve","count":12},{"word":"Wend","count":5}]`
	b, err := Generate([]byte(in))
	require.NoError(t, err)
	tab, err := Parse(string(b))
	require.NoError(t, err)
	tests := []struct {
		word        string
		band, share uint8
	}{
		{"harbor", 4, 1}, // 1,000 → 1 + 3; 10 % lower case
		{"valve", 2, 4},  // 12 → 1 + 1; all lower case
		{"wend", 1, 1},   // 5 → 1 + 0; capitalized only
		{"absent", 0, 0},
	}
	for _, tc := range tests {
		c := tab.LookupBytes([]byte(tc.word))
		assert.Equal(t, tc.band, c.Band(), tc.word)
		assert.Equal(t, tc.share, c.Share(), tc.word)
	}
}

func TestBadInputNamesTheProblem(t *testing.T) {
	_, err := Parse("a\t7\t4\nb\t9\n")
	require.Error(t, err)
	assert.Contains(t, err.Error(), "line 2")
	_, err = Generate([]byte(`[{"word":"","count":3}]`))
	require.Error(t, err)
	assert.Contains(t, err.Error(), "entry 1")
}
