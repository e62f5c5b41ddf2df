package main

import (
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A fine tag the tagging model never assigns is an error (exit 2, with the
// rule's position and the closest tags) in every command that matches
// rules, not only in rules check; a tag regexp that matches no tag is a
// warning and the run goes on.
func TestUnknownFineTagsRefused(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.gsr")
	require.NoError(t, os.WriteFile(bad, []byte("term = xpos:NNQ NOUN ;\n"), 0o644))
	pairs := filepath.Join(dir, "pairs.gsr")
	require.NoError(t, os.WriteFile(pairs, []byte("adj_noun = @collocate ADJ @node xpos:NNQ ;\n"), 0o644))
	demo := filepath.Join("testdata", "demo", "maintenance-schedule.txt") // run starts in the repository root

	for _, args := range [][]string{
		{"find", "xpos:NNQ", demo},
		{"find", "--rules", bad, "--rule", "term", demo},
		{"terms", "--rules", bad, demo},
		{"collocations", "--rules", pairs, demo},
		{"eval", "terms", "--gold", demo, "--rules", bad, demo},
	} {
		r := run(t, "", args...)
		assert.Equal(t, 2, r.code, "%v: %s", args, r.stderr)
		assert.Contains(t, r.stderr, "unknown fine tag", args)
		assert.Contains(t, r.stderr, `did you mean "NN"`, args)
		assert.Empty(t, r.stdout, args)
	}

	r := run(t, "", "find", "--count", "xpos:/^QQ/", demo)
	assert.Equal(t, 0, r.code, r.stderr)
	assert.Contains(t, r.stderr, "warning: xpos:/^QQ/ matches none of the")
}
