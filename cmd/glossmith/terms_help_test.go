package main

import (
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/extract/terms"
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

// The help of terms and the README state the score's constants as
// extract/terms defines them: the cut-off, the phrase bonus and fragment
// penalty, and the share that makes a structure word.
func TestTermsHelpStatesScoreConstants(t *testing.T) {
	r := run(t, "", "terms", "--help")
	require.Equal(t, 0, r.code, r.stderr)
	help := strings.Join(strings.Fields(r.stdout), " ")
	readme, err := os.ReadFile(filepath.Join("..", "..", "README.md"))
	require.NoError(t, err)
	doc := strings.Join(strings.Fields(string(readme)), " ")
	for _, want := range []string{
		fmt.Sprintf("falls below %g;", terms.Cutoff),
		fmt.Sprintf("unit is +%g for a phrase", terms.RepeatedPhraseBonus),
		fmt.Sprintf("-%g for a phrase mostly inside one longer candidate or of more than %d words", terms.FragmentPenalty, terms.MaxUnitWords),
		fmt.Sprintf("in at least %g%% of their uses", 100*terms.StructureShare),
		"ln(1+freq) · (ln(weirdness) · damping + unit)",
	} {
		assert.Contains(t, help, want)
	}
	for _, want := range []string{
		fmt.Sprintf("falls below **%g**", terms.Cutoff),
		fmt.Sprintf("it is **+%g**", terms.RepeatedPhraseBonus),
		fmt.Sprintf("it is **−%g**", terms.FragmentPenalty),
		fmt.Sprintf("more than **%d** words", terms.MaxUnitWords),
		fmt.Sprintf("in at least **%g %%** of its uses", 100*terms.StructureShare),
		"**ln(1 + freq) · (ln(weirdness) · damping + unit)**",
	} {
		assert.Contains(t, doc, want)
	}
}
