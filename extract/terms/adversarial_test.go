package terms

import (
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"glossmith/tagger/doc"
	"glossmith/tagger/pipeline"
)

// adversarialInput is an input that once made nested counting blow up:
// long runs of words the terms rules match, in one sentence, so that the
// nested spans of the run grow with the square of its length and their
// text with the cube.
type adversarialInput struct {
	name, file string
	text       func(scale int) string
}

// adversarialInputs are built at a scale (1 for the sizes that took
// minutes and gigabytes before spans were bounded).
var adversarialInputs = []adversarialInput{
	{"valve run", "run.txt", func(k int) string { return strings.Repeat("valve ", 16_000*k) }},
	{"hyphen run", "hyphens.txt", func(k int) string { return "The " + strings.Repeat("ab-", 300_000*k) }},
	{"valve lines", "lines.txt", func(k int) string { return strings.Repeat("valve\n", 3_000*k) }},
	{"pre lines", "pre.html", func(k int) string {
		return "<html><body><pre>" + strings.Repeat("valve\n", 200_000*k) + "</pre></body></html>"
	}},
	{"conllu sentence", "long.conllu", func(k int) string {
		var b strings.Builder
		b.WriteString("# text = a long sentence\n")
		for i := 1; i <= 100_000*k; i++ {
			fmt.Fprintf(&b, "%d\tvalve\tvalve\tNOUN\tNN\t_\t_\t_\t_\t_\n", i)
		}
		b.WriteString("\n")
		return b.String()
	}},
}

// runAdversarial writes the input at scale k and collects its candidates
// with the default extraction, returning the candidates and the tokens.
func runAdversarial(t testing.TB, in adversarialInput, k int) ([]*Term, int64) {
	dir := t.TempDir()
	path := filepath.Join(dir, in.file)
	require.NoError(t, os.WriteFile(path, []byte(in.text(k)), 0o644))
	model, col := defaultSetup(t)
	corpus := NewCorpus(3)
	st := pipeline.Run([]string{path}, pipeline.Options{Tagger: model, Workers: 1}, col.Collect,
		func(_ *doc.Document, dc *DocCounts) { corpus.Add(dc); dc.Release() })
	return corpus.Terms(ModelReference(model)), st.Tokens
}

// TestAdversarialInputsStayLinear runs each input that once took minutes
// and gigabytes (a sentence of 16,000 nouns: 13 GB; 300,000 hyphenated
// parts: killed at 24 GB) with generous bounds: it must finish within a
// minute and allocate no more than 40 KB per input token over the whole run
// (tokenizing, tagging and counting; a bounded run allocates about a tenth
// of that). Speed itself is measured by BenchmarkAdversarial.
func TestAdversarialInputsStayLinear(t *testing.T) {
	if testing.Short() {
		t.Skip("tags several megabytes of text")
	}
	for _, in := range adversarialInputs {
		t.Run(in.name, func(t *testing.T) {
			var before, after runtime.MemStats
			runtime.ReadMemStats(&before)
			done := make(chan struct{})
			var ts []*Term
			var tokens int64
			go func() {
				defer close(done)
				ts, tokens = runAdversarial(t, in, 1)
			}()
			select {
			case <-done:
			case <-time.After(time.Minute):
				t.Fatalf("%s: still counting after a minute", in.name)
			}
			runtime.ReadMemStats(&after)
			require.Positive(t, tokens)
			perToken := float64(after.TotalAlloc-before.TotalAlloc) / float64(tokens)
			t.Logf("%s: %d tokens, %.0f bytes allocated per token, %d candidates", in.name, tokens, perToken, len(ts))
			assert.Less(t, perToken, 40e3)
			for _, x := range ts {
				assert.LessOrEqual(t, len(strings.Fields(x.Term)), DefaultMaxWords, "candidate %q", x.Term)
			}
		})
	}
}

// BenchmarkAdversarial measures the adversarial inputs at two scales:
// tokens per second must stay about the same when the input doubles.
func BenchmarkAdversarial(b *testing.B) {
	for _, in := range adversarialInputs {
		for _, k := range []int{1, 2} {
			b.Run(fmt.Sprintf("%s/x%d", strings.ReplaceAll(in.name, " ", "-"), k), func(b *testing.B) {
				var tokens int64
				for b.Loop() {
					_, tokens = runAdversarial(b, in, k)
				}
				b.ReportMetric(float64(tokens)*float64(b.N)/b.Elapsed().Seconds(), "tokens/s")
			})
		}
	}
}
