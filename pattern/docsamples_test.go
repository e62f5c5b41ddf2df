package pattern

import (
	"os"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/grammar"
	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
	"glossmith/tagger/tokenize"
)

// TestDocumentSamples runs every rule sample of the README and of the
// language guide (the ```gsr fences) through what `rules check` does: load
// and check the set, check its fine tags against the embedded model,
// compile every rule, and run its expect/reject examples through the real
// tokenizer and tagger. A document may not teach a rule file that fails.
func TestDocumentSamples(t *testing.T) {
	model, err := hmm.Default()
	require.NoError(t, err)
	analyze := func(text string) ([]doc.Sentence, error) {
		d := &doc.Document{Name: "example", Text: text}
		tokenize.Document(d)
		model.TagDocument(d)
		return d.Sentences, nil
	}
	total := 0
	for _, path := range []string{"../README.md", "../grammar/LANGUAGE.md"} {
		b, err := os.ReadFile(path)
		require.NoError(t, err)
		samples := grammar.RuleSamples(string(b))
		require.NotEmpty(t, samples, "%s has no ```%s fences", path, grammar.SampleFence)
		for _, s := range samples {
			total++
			// Blank lines in front keep the document's line numbers.
			f, err := grammar.ParseString(path, strings.Repeat("\n", s.Line-1)+s.Text)
			require.NoError(t, err, "sample at %s:%d", path, s.Line)
			rs, err := grammar.LoadFiles(f)
			require.NoError(t, err, "sample at %s:%d", path, s.Line)
			errs, warnings := rs.CheckTags(model.XPOSTags())
			assert.Empty(t, errs.Format()+warnings.Format(), "sample at %s:%d", path, s.Line)
			assert.Empty(t, CheckRules(rs).Format(), "sample at %s:%d", path, s.Line)
			_, fails := CheckExamples(rs, analyze)
			assert.Empty(t, fails.Format(), "sample at %s:%d", path, s.Line)
		}
	}
	assert.GreaterOrEqual(t, total, 6)
}
