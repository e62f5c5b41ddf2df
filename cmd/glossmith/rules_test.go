package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// rules list prints each rule's documentation and body; helpers only
// with --all. The listing is itself a rule file that loads.
func TestRulesListBodies(t *testing.T) {
	r := run(t, "", "rules", "list", "stock:pairs")
	require.Equal(t, 0, r.code, r.stderr)
	assert.Contains(t, r.stdout, "# A noun modifying the next noun")
	assert.Contains(t, r.stdout, "\nnoun_noun = @collocate NOUN @node NOUN ;")
	assert.NotContains(t, r.stdout, "\n_object_verb =")

	r = run(t, "", "rules", "list", "--all", "stock:pairs")
	require.Equal(t, 0, r.code, r.stderr)
	assert.Contains(t, r.stdout, "\n_object_verb = ")
	file := filepath.Join(t.TempDir(), "listed.gsr")
	require.NoError(t, os.WriteFile(file, []byte(r.stdout), 0o644))
	check := run(t, "", "rules", "check", file, "stock:pairs")
	require.Equal(t, 0, check.code, check.stderr)
	lines := strings.Split(strings.TrimSpace(check.stdout), "\n")
	require.Len(t, lines, 2)
	listed, _, _ := strings.Cut(strings.TrimPrefix(lines[0], file+": "), ",")
	stock, _, _ := strings.Cut(strings.TrimPrefix(lines[1], "stock:pairs: "), ",")
	assert.Equal(t, stock, listed, "the listing holds every rule of the set")
}

// rules show NAME: the rule, the rules it uses, its examples.
func TestRulesShow(t *testing.T) {
	r := run(t, "", "rules", "show", "verb_obj")
	require.Equal(t, 0, r.code, r.stderr)
	assert.True(t, strings.Contains(r.stdout, "\nverb_obj = @node"), r.stdout)
	uses := strings.Index(r.stdout, "# uses:")
	examples := strings.Index(r.stdout, "# examples:")
	require.True(t, uses > 0 && examples > uses, r.stdout)
	assert.Contains(t, r.stdout[uses:examples], "\n_object_verb = ")
	assert.Contains(t, r.stdout[examples:], `expect verb_obj: "Please [calibrate the humidity sensor] before sowing." ;`)

	r = run(t, "", "rules", "show", "verb_ob")
	assert.Equal(t, 2, r.code)
	assert.Contains(t, r.stderr, `did you mean "verb_obj"`)
}

// rules show stock:NAME prints the shipped file byte for byte.
func TestRulesShowStock(t *testing.T) {
	for _, name := range []string{"terms", "pairs"} {
		want, err := os.ReadFile(filepath.Join("..", "..", "grammar", "stock", name+".gsr"))
		require.NoError(t, err)
		r := run(t, "", "rules", "show", "stock:"+name)
		require.Equal(t, 0, r.code, r.stderr)
		assert.Equal(t, string(want), r.stdout)
	}
	r := run(t, "", "rules", "show", "stock:term")
	assert.Equal(t, 2, r.code)
	assert.Contains(t, r.stderr, `"terms"`)
}
