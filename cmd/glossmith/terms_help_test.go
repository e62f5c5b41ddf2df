package main

import (
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The help of terms and the README's table of measures describe keyness
// and weirdness the way extract/terms computes them (the candidate's least
// specific word: TestSpecificityOfLeastSpecificWord there), not as means
// over the words.
func TestTermsHelpDescribesMeasuresAsComputed(t *testing.T) {
	r := run(t, "", "terms", "--help")
	require.Equal(t, 0, r.code, r.stderr)
	// A measure's entry: its line ("  keyness    …") and the indented lines
	// that continue it.
	entry := func(m string) string {
		e := regexp.MustCompile(`(?m)^  ` + m + ` +(.*\n(?: {4,}.*\n)*)`).FindStringSubmatch(r.stdout)
		if e == nil {
			return ""
		}
		return strings.Join(strings.Fields(e[1]), " ")
	}
	readme, err := os.ReadFile(filepath.Join("..", "..", "README.md"))
	require.NoError(t, err)
	for _, m := range []string{"keyness", "weirdness"} {
		h := entry(m)
		require.NotEmpty(t, h, "no %s line in the help", m)
		row := regexp.MustCompile("(?m)^\\| `" + m + "` \\|(.*)$").FindSubmatch(readme)
		require.NotNil(t, row, "no %s row in the README", m)
		for where, text := range map[string]string{"help": h, "README": string(row[1])} {
			assert.Regexp(t, `least specific word|same (least specific )?word`, text, "%s on %s", where, m)
			assert.NotContains(t, text, "mean", "%s on %s", where, m)
		}
	}
}
