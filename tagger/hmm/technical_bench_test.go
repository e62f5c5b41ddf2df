package hmm

import (
	"testing"
	"time"

	"glossmith/internal/benchcorpus"
	"glossmith/tagger/doc"
	"glossmith/tagger/tokenize"
)

// BenchmarkTagTechnical tags 1 MiB of the benchmark corpus (technical
// text built from ../shared/data/term-gold-en, see internal/benchcorpus)
// with the default model on one goroutine: the tagging stage of a
// `terms` run, measured apart from the rest of the pipeline. The treebank
// benchmarks above read short web sentences; this is the text glossmith
// is for.
func BenchmarkTagTechnical(b *testing.B) {
	m, err := Default()
	if err != nil {
		b.Fatal(err)
	}
	var sents []doc.Sentence
	tokens := 0
	for _, t := range benchcorpus.Slice(b, 1<<20) {
		d := &doc.Document{Text: t}
		tokenize.Document(d)
		sents = append(sents, d.Sentences...)
		tokens += d.TokenCount()
	}
	start, cpu0 := time.Now(), benchcorpus.CPUTime()
	for b.Loop() {
		for j := range sents {
			for k := range sents[j].Tokens {
				sents[j].Tokens[k].UPOS = ""
			}
			m.Tag(&sents[j])
		}
	}
	b.ReportMetric(float64(tokens*b.N)/time.Since(start).Seconds(), "tokens/s")
	if cpu := benchcorpus.CPUTime() - cpu0; cpu > 0 {
		b.ReportMetric(float64(tokens*b.N)/cpu.Seconds(), "tokens/cpu-s")
	}
	b.ReportMetric(0, "ns/op")
}
