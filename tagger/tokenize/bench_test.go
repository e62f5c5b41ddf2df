package tokenize

import (
	"os"
	"path/filepath"
	"testing"

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
