package tokenize

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"glossmith/internal/benchcorpus"
	"glossmith/internal/testenv"
)

// BenchmarkSentences measures tokenizing and sentence splitting throughput
// (MB/s) on the shared term-extraction texts (../shared/data/term-gold-en,
// CC BY-NC-SA 4.0, evaluation only), skipped when they are missing.
func BenchmarkSentences(b *testing.B) {
	dir := testenv.SharedDir(b, "data/term-gold-en")
	files, err := filepath.Glob(filepath.Join(dir, "*", "texts", "*.txt"))
	if err != nil || len(files) == 0 {
		b.Skipf("no texts under %s", dir)
	}
	var texts []string
	size := 0
	for _, f := range files {
		data, err := os.ReadFile(f)
		if err != nil {
			b.Fatal(err)
		}
		texts = append(texts, string(data))
		size += len(data)
	}
	b.SetBytes(int64(size))
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		for _, t := range texts {
			Sentences(t)
		}
	}
}

// BenchmarkAdversarial runs inputs built to make a careless scanner
// quadratic: long runs of separators inside one chunk. Throughput should
// stay in the range of ordinary text.
func BenchmarkAdversarial(b *testing.B) {
	inputs := map[string]string{
		"digit-hyphens": strings.Repeat("1-", 1<<17),
		"prefix-digits": strings.Repeat("1", 1<<17) + "." + strings.Repeat("1-", 1<<16),
		"date-slashes":  strings.Repeat("12/", 1<<17),
		"url-brackets":  "http://example.com/" + strings.Repeat("(", 1<<16) + strings.Repeat(")", 1<<17),
		"dots":          strings.Repeat("a.", 1<<17) + ".",
		"apostrophes":   strings.Repeat("a'", 1<<17),
		"one-line":      strings.Repeat("Valve ", 1<<16) + "\n" + strings.Repeat("Pump ", 1<<16),
	}
	for name, in := range inputs {
		b.Run(name, func(b *testing.B) {
			b.SetBytes(int64(len(in)))
			for b.Loop() {
				Sentences(in)
			}
		})
	}
}

// BenchmarkCorpusSlice tokenizes 2 MiB of benchmark-corpus documents
// (internal/benchcorpus, drawn from the shared term-gold texts), documents
// of the size a real run meets, and reports tokens per CPU second (all
// threads, garbage collection included), the rate to compare on a shared
// machine.
func BenchmarkCorpusSlice(b *testing.B) {
	texts := benchcorpus.Slice(b, 2<<20)
	tokens := 0
	for _, t := range texts {
		for _, s := range Sentences(t) {
			tokens += len(s.Tokens)
		}
	}
	b.ReportAllocs()
	cpu0 := benchcorpus.CPUTime()
	for b.Loop() {
		for _, t := range texts {
			Sentences(t)
		}
	}
	if cpu := benchcorpus.CPUTime() - cpu0; cpu > 0 {
		b.ReportMetric(float64(tokens)*float64(b.N)/cpu.Seconds(), "tokens/cpu-s")
	}
}
