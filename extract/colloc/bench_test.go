package colloc

import (
	"path/filepath"
	"sync"
	"testing"

	"glossmith/internal/testenv"
	"glossmith/pattern"
	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
	"glossmith/tagger/pipeline"
)

var (
	benchOnce  sync.Once
	benchSents [][]doc.Token
	benchToks  int
)

// benchCorpus tags the shared term-extraction texts (three domains, about
// 150,000 words) once for the counting benchmarks.
func benchCorpus(b *testing.B) [][]doc.Token {
	dir := testenv.SharedDir(b, "data/term-gold-en")
	benchOnce.Do(func() {
		m, err := hmm.Default()
		if err != nil {
			b.Fatal(err)
		}
		glob := filepath.Join(dir, "*", "texts", "*.txt")
		pipeline.Run([]string{glob}, pipeline.Options{Tagger: m}, nil, func(d *doc.Document, _ struct{}) {
			for _, s := range d.Sentences {
				benchSents = append(benchSents, s.Tokens)
				benchToks += len(s.Tokens)
			}
		})
	})
	return benchSents
}

// BenchmarkCountRelations counts the stock pairs relations over the tagged
// texts: matching plus counting, reported as tokens per second.
func BenchmarkCountRelations(b *testing.B) {
	sents := benchCorpus(b)
	m, err := pattern.CompileStock("pairs")
	if err != nil {
		b.Fatal(err)
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		c := NewCounter()
		for _, toks := range sents {
			for _, mt := range m.FindAll(toks) {
				if p, ok := SlotPair(mt.Rule, toks, mt.Slots, ByLemma); ok {
					c.Add(p)
				}
			}
		}
	}
	b.ReportMetric(float64(benchToks)*float64(b.N)/b.Elapsed().Seconds(), "tokens/s")
}

// BenchmarkCountWindow counts window pairs (N = 3) over the tagged texts.
func BenchmarkCountWindow(b *testing.B) {
	sents := benchCorpus(b)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		c := NewCounter()
		for _, toks := range sents {
			WindowPairs(toks, 3, ByLemma, nil, c.Add)
		}
	}
	b.ReportMetric(float64(benchToks)*float64(b.N)/b.Elapsed().Seconds(), "tokens/s")
}

// BenchmarkRank scores and sorts every counted relation pair.
func BenchmarkRank(b *testing.B) {
	sents := benchCorpus(b)
	c := NewCounter()
	for _, toks := range sents {
		WindowPairs(toks, 3, ByLemma, nil, c.Add)
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		c.Rank(RankOptions{})
	}
	b.ReportMetric(float64(c.Distinct()), "pairs")
}
