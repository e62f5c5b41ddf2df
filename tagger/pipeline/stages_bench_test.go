package pipeline_test

import (
	"fmt"
	"os"
	"path/filepath"
	"testing"
	"time"

	"glossmith/extract/colloc"
	"glossmith/extract/terms"
	"glossmith/internal/benchcorpus"
	"glossmith/pattern"
	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
	"glossmith/tagger/pipeline"
	"glossmith/tagger/tokenize"
)

// benchSize is the text each stage benchmark works through per iteration:
// large enough for stable per-token rates, small enough for a quick run.
const benchSize = 2 << 20

// stageFixture holds the benchmark slice at every stage of annotation.
type stageFixture struct {
	texts  []string
	tagged []*doc.Document
	tokens int
	model  *hmm.Model
	m      *pattern.Matcher
}

func newStageFixture(b *testing.B) *stageFixture {
	b.Helper()
	f := &stageFixture{texts: benchcorpus.Slice(b, benchSize)}
	var err error
	if f.model, err = hmm.Default(); err != nil {
		b.Fatal(err)
	}
	f.m, err = pattern.CompileStock("terms")
	if err != nil {
		b.Fatal(err)
	}
	for i, t := range f.texts {
		d := &doc.Document{Name: fmt.Sprintf("doc-%05d.txt", i+1), Format: "txt", Text: t}
		tokenize.Document(d)
		f.model.TagDocument(d)
		f.tokens += d.TokenCount()
		f.tagged = append(f.tagged, d)
	}
	return f
}

// reportTokens reports tokens per wall-clock second and per CPU second
// (all threads of the process, garbage collection included) since cpu0.
// On a shared machine the CPU rate is the one to compare.
func reportTokens(b *testing.B, tokens int, cpu0 time.Duration) {
	n := float64(tokens) * float64(b.N)
	b.ReportMetric(n/b.Elapsed().Seconds(), "tokens/s")
	if cpu := benchcorpus.CPUTime() - cpu0; cpu > 0 {
		b.ReportMetric(n/cpu.Seconds(), "tokens/cpu-s")
	}
	b.ReportMetric(0, "ns/op") // per-iteration time of a 2 MiB slice says little
}

// BenchmarkStages measures each stage of the terms pipeline on one core,
// in tokens per second, so that the slowest stage stands out:
//
//	tokenize  sentence splitting and tokenization
//	tag       HMM tagging and lemmatization of tokenized text
//	match     the stock "terms" rules in nested mode
//	collect   terms.Collector.Collect: matching plus per-document counting
//	merge     terms.Corpus.Add: merging per-document counts in input order
//	rank      Corpus.Terms + Rank: statistics and ranking at the end
//
// count (collect − match) is the per-document counting alone.
func BenchmarkStages(b *testing.B) {
	f := newStageFixture(b)
	b.Run("tokenize", func(b *testing.B) {
		cpu0 := benchcorpus.CPUTime()
		for b.Loop() {
			for _, t := range f.texts {
				d := &doc.Document{Text: t}
				tokenize.Document(d)
			}
		}
		reportTokens(b, f.tokens, cpu0)
	})
	b.Run("tag", func(b *testing.B) {
		fresh := make([]*doc.Document, len(f.texts))
		for i, t := range f.texts {
			fresh[i] = &doc.Document{Text: t}
			tokenize.Document(fresh[i])
		}
		cpu0 := benchcorpus.CPUTime()
		for b.Loop() {
			b.StopTimer()
			for _, d := range fresh {
				untag(d)
			}
			b.StartTimer()
			for _, d := range fresh {
				f.model.TagDocument(d)
			}
		}
		reportTokens(b, f.tokens, cpu0)
	})
	b.Run("match", func(b *testing.B) {
		cpu0 := benchcorpus.CPUTime()
		for b.Loop() {
			for _, d := range f.tagged {
				for si := range d.Sentences {
					f.m.FindNested(d.Sentences[si].Tokens)
				}
			}
		}
		reportTokens(b, f.tokens, cpu0)
	})
	col := terms.NewCollector(f.m, terms.Options{Contexts: 3})
	b.Run("collect", func(b *testing.B) {
		cpu0 := benchcorpus.CPUTime()
		for b.Loop() {
			for _, d := range f.tagged {
				col.Collect(d).Release() // as the terms command does, after merging
			}
		}
		reportTokens(b, f.tokens, cpu0)
	})
	counts := make([]*terms.DocCounts, len(f.tagged))
	for i, d := range f.tagged {
		counts[i] = col.Collect(d)
	}
	b.Run("merge", func(b *testing.B) {
		cpu0 := benchcorpus.CPUTime()
		for b.Loop() {
			c := terms.NewCorpus(3)
			for _, dc := range counts {
				c.Add(dc)
			}
		}
		reportTokens(b, f.tokens, cpu0)
	})
	b.Run("rank", func(b *testing.B) {
		c := terms.NewCorpus(3)
		for _, dc := range counts {
			c.Add(dc)
		}
		ref := &terms.Counts{}
		for _, dc := range counts {
			ref.Add(dc)
		}
		cpu0 := benchcorpus.CPUTime()
		for b.Loop() {
			if _, err := terms.Rank(c.Terms(ref), terms.RankOptions{}); err != nil {
				b.Fatal(err)
			}
		}
		reportTokens(b, f.tokens, cpu0)
	})
}

// BenchmarkPairStages measures the counting stages of the collocations
// command on one core: matching the stock "pairs" rules and counting the
// slot pairs of a document (pairs), and merging the per-document counters
// in input order (merge).
func BenchmarkPairStages(b *testing.B) {
	f := newStageFixture(b)
	m, err := pattern.CompileStock("pairs")
	if err != nil {
		b.Fatal(err)
	}
	count := func(d *doc.Document) *colloc.Counter {
		c := colloc.NewCounter()
		for i := range d.Sentences {
			toks := d.Sentences[i].Tokens
			for _, mt := range m.FindAll(toks) {
				if p, ok := colloc.SlotPair(mt.Rule, toks, mt.Slots, colloc.ByLemma); ok {
					c.Add(p)
				}
			}
		}
		return c
	}
	b.Run("pairs", func(b *testing.B) {
		cpu0 := benchcorpus.CPUTime()
		for b.Loop() {
			for _, d := range f.tagged {
				count(d)
			}
		}
		reportTokens(b, f.tokens, cpu0)
	})
	counters := make([]*colloc.Counter, len(f.tagged))
	for i, d := range f.tagged {
		counters[i] = count(d)
	}
	b.Run("merge", func(b *testing.B) {
		cpu0 := benchcorpus.CPUTime()
		for b.Loop() {
			total := colloc.NewCounter()
			for _, c := range counters {
				total.Merge(c)
			}
		}
		reportTokens(b, f.tokens, cpu0)
	})
}

func untag(d *doc.Document) {
	for si := range d.Sentences {
		for ti := range d.Sentences[si].Tokens {
			t := &d.Sentences[si].Tokens[ti]
			t.UPOS, t.XPOS, t.Lemma = "", "", ""
		}
	}
}

// BenchmarkTermsPipeline runs the whole terms pipeline — read, tokenize,
// tag, match, count, merge — over the benchmark slice written to files,
// with one and with two workers. On a machine with two idle cores the
// two-worker rate should be close to twice the one-worker rate.
func BenchmarkTermsPipeline(b *testing.B) {
	f := newStageFixture(b)
	dir := b.TempDir()
	for i, t := range f.texts {
		if err := os.WriteFile(filepath.Join(dir, fmt.Sprintf("doc-%05d.txt", i+1)), []byte(t), 0o644); err != nil {
			b.Fatal(err)
		}
	}
	for _, workers := range []int{1, 2} {
		b.Run(fmt.Sprintf("workers=%d", workers), func(b *testing.B) {
			col := terms.NewCollector(f.m, terms.Options{Contexts: 3})
			var tokens int64
			cpu0 := benchcorpus.CPUTime()
			for b.Loop() {
				corpus := terms.NewCorpus(3)
				st := pipeline.Run([]string{dir}, pipeline.Options{Tagger: f.model, Workers: workers, ReuseTokens: true},
					col.Collect, func(_ *doc.Document, dc *terms.DocCounts) { corpus.Add(dc); dc.Release() })
				tokens = st.Tokens
			}
			reportTokens(b, int(tokens), cpu0)
		})
	}
}
