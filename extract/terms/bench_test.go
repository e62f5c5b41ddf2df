package terms

import (
	"fmt"
	"os"
	"path/filepath"
	"testing"
	"time"

	"glossmith/internal/benchcorpus"
	"glossmith/tagger/doc"
	"glossmith/tagger/pipeline"
)

// BenchmarkCorpus measures the corpus's serial steps on the counts of a
// whole corpus, where their tables outgrow the processor's caches as they
// do in a large run: merging the documents' counts in input order (merge)
// and computing the measures and the ranking at the end (terms). The
// corpus is the directory named by GLOSSMITH_BENCH_DIR (for example one
// made by internal/benchcorpus/cmd), else 2 MiB of benchcorpus documents.
// Rates are tokens per CPU second (all threads, garbage collection
// included), the figure to compare on a shared machine.
func BenchmarkCorpus(b *testing.B) {
	dir := os.Getenv("GLOSSMITH_BENCH_DIR")
	if dir == "" {
		dir = b.TempDir()
		for i, t := range benchcorpus.Slice(b, 2<<20) {
			if err := os.WriteFile(filepath.Join(dir, fmt.Sprintf("doc-%05d.txt", i+1)), []byte(t), 0o644); err != nil {
				b.Fatal(err)
			}
		}
	}
	model, col := defaultSetup(b)
	var counts []*DocCounts
	st := pipeline.Run([]string{dir}, pipeline.Options{Tagger: model}, col.Collect,
		func(_ *doc.Document, dc *DocCounts) { counts = append(counts, dc) })
	tokens := float64(st.Tokens)
	report := func(b *testing.B, cpu time.Duration) {
		b.ReportMetric(tokens*float64(b.N)/cpu.Seconds(), "tokens/cpu-s")
		b.ReportMetric(tokens*float64(b.N)/b.Elapsed().Seconds(), "tokens/s")
		b.ReportMetric(0, "ns/op")
	}
	merged := func() *Corpus {
		c := NewCorpus(3)
		c.SetBudget(512 << 20) // as the command line's default
		for _, dc := range counts {
			c.Add(dc)
		}
		return c
	}
	b.Run("merge", func(b *testing.B) {
		cpu0 := benchcorpus.CPUTime()
		for b.Loop() {
			merged()
		}
		report(b, benchcorpus.CPUTime()-cpu0)
	})
	b.Run("terms", func(b *testing.B) {
		var cpu time.Duration
		for b.Loop() {
			b.StopTimer()
			c := merged() // Terms folds groups: a fresh corpus each time
			b.StartTimer()
			cpu0 := benchcorpus.CPUTime()
			if _, err := Rank(c.Terms(ModelReference(model)), RankOptions{}); err != nil {
				b.Fatal(err)
			}
			cpu += benchcorpus.CPUTime() - cpu0
		}
		report(b, cpu)
	})
}
