package pattern

import (
	"fmt"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/grammar"
)

func TestCompilePatternRefusesNoToken(t *testing.T) {
	for _, src := range []string{"^", "$", "^ $", "NOUN{0}", "(^ | $)", "@x (^ $)"} {
		_, err := CompilePattern(src, nil)
		var list grammar.ErrorList
		if assert.ErrorAs(t, err, &list, src) {
			assert.Contains(t, list[0].Error(), "pattern:1:1: the pattern can match no token", src)
		}
	}
	rs := mustSet(t, "start = ^ ;\n")
	_, err := CompilePattern("start", rs)
	assert.ErrorContains(t, err, "can match no token", "through a reference")
	for _, ok := range []string{"^ NOUN", "NOUN?", "_", "start NOUN"} {
		_, err := CompilePattern(ok, rs)
		assert.NoError(t, err, ok)
	}
}

func TestCheckRules(t *testing.T) {
	assert.Empty(t, CheckRules(mustSet(t, "a = ADJ* NOUN ;\n_helper = ^ ;\nb = _helper NOUN ;\n")))
	// A rule too large to run once counted repetitions are expanded.
	big := "x = NOUN ;\nbegin = ^ ;\nhuge = ((NOUN{1000}){1000}){1000} ;\n"
	errs := CheckRules(mustSet(t, big))
	require.Len(t, errs, 2)
	assert.Equal(t, "test.gsr:2:1: rule begin can match no token, and every match covers at least one: it would never match", errs[0].Error())
	assert.True(t, strings.HasPrefix(errs[1].Error(), "test.gsr:3:1: rule huge is too large"), errs[1].Error())
	assert.Equal(t, "huge = ((NOUN{1000}){1000}){1000} ;", errs[1].Source)
	// More distinct token tests than one matcher holds, across rules that
	// each compile alone.
	var src strings.Builder
	for i := range MaxAtoms + 1 {
		fmt.Fprintf(&src, "r%d = /^w%d$/ ;\n", i, i)
	}
	errs = CheckRules(mustSet(t, src.String()))
	require.Len(t, errs, 1)
	assert.Contains(t, errs[0].Error(), "distinct token tests")
}
