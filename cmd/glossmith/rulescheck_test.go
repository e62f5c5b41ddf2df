package main

import (
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// rules check compiles the rules and checks their fine tags against the
// model, each problem at file:line:col; a regexp over tags that matches no
// tag of the model is a warning, not a failure.
func TestRulesCheckCompilesAndChecksTags(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.gsr")
	require.NoError(t, os.WriteFile(bad, []byte("ok = ADJ* NOUN ;\nhuge = ((NOUN{1000}){1000}){1000} ;\nnever = ^ ;\ntagged = xpos:NNQ ;\n"), 0o644))
	r := run(t, "", "rules", "check", bad)
	assert.Equal(t, 1, r.code, r.stderr)
	assert.Contains(t, r.stderr, bad+":2:1: rule huge is too large")
	assert.Contains(t, r.stderr, bad+":3:1: rule never can match no token")
	assert.Contains(t, r.stderr, bad+`:4:10: unknown fine tag xpos:NNQ: the tagging model never assigns it — did you mean "NN", "NNP" or "NNS"?`)

	warn := filepath.Join(dir, "warn.gsr")
	require.NoError(t, os.WriteFile(warn, []byte("other = xpos:/^ZZ/ ;\n"), 0o644))
	r = run(t, "", "rules", "check", warn)
	assert.Equal(t, 0, r.code, r.stderr)
	assert.Contains(t, r.stderr, warn+":1:14: warning: xpos:/^ZZ/ matches none")
}
