package pattern

import (
	"os"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/grammar"
	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
	"glossmith/tagger/tokenize"
)

// realAnalyzer tokenizes and tags a text as the commands do, with the
// embedded model, which it returns too.
func realAnalyzer(t *testing.T) (*hmm.Model, Analyzer) {
	model, err := hmm.Default()
	require.NoError(t, err)
	return model, func(text string) ([]doc.Sentence, error) {
		d := &doc.Document{Name: "example", Text: text}
		tokenize.Document(d)
		model.TagDocument(d)
		return d.Sentences, nil
	}
}

// TestDocumentSamples runs every rule sample of the README and of the
// language guide (the ```gsr fences) through what `rules check` does: load
// and check the set, check its fine tags against the embedded model,
// compile every rule, and run its expect/reject examples through the real
// tokenizer and tagger. A document may not teach a rule file that fails.
func TestDocumentSamples(t *testing.T) {
	model, analyze := realAnalyzer(t)
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

// TestGuideTokenTable checks the language guide's table of one-token
// tests against the tokenizer and tagger: each example word (in italics)
// is one token when written on its own, and the row's test (or the test
// the example names, "`xpos:VBN` — *sealed*") matches it. An example the
// tokenizer splits ("Turbine-2" is Turbine, -, 2) could never be matched
// by a one-token test.
func TestGuideTokenTable(t *testing.T) {
	_, analyze := realAnalyzer(t)
	b, err := os.ReadFile("../grammar/LANGUAGE.md")
	require.NoError(t, err)
	guide := string(b)
	start := strings.Index(guide, "## Testing one token")
	require.NotEqual(t, -1, start, "the guide has no section on one-token tests")
	section := guide[start:]
	if end := strings.Index(section[3:], "\n## "); end >= 0 {
		section = section[:end+3]
	}
	row := regexp.MustCompile("(?m)^\\| `([^`]+)`[^|]*\\|[^|]*\\| (.*) \\|$")
	named := regexp.MustCompile("^`([^`]+)` — ")
	italic := regexp.MustCompile(`\*([^*]+)\*`)
	rows := 0
	for _, r := range row.FindAllStringSubmatch(section, -1) {
		test, examples := r[1], r[2]
		if m := named.FindStringSubmatch(examples); m != nil {
			test = m[1]
		}
		for _, w := range italic.FindAllStringSubmatch(examples, -1) {
			word := w[1]
			rows++
			t.Run(test+" "+word, func(t *testing.T) {
				sents, err := analyze(word)
				require.NoError(t, err)
				require.Len(t, sents, 1)
				toks := sents[0].Tokens
				require.Len(t, toks, 1, "%q is not one token", word)
				m, err := CompilePattern(test, nil)
				require.NoError(t, err)
				assert.Len(t, m.FindAll(toks), 1, "%s does not match %q (%s %s, lemma %s)", test, word, toks[0].UPOS, toks[0].XPOS, toks[0].Lemma)
			})
		}
	}
	assert.GreaterOrEqual(t, rows, 10, "the table's examples were not found")
}
