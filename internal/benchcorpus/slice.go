package benchcorpus

import (
	"fmt"
	"os"
	"path/filepath"
	"testing"

	"glossmith/internal/testenv"
)

// Slice returns documents of about size bytes in total, drawn from the
// term-gold texts in ../shared the way the corpus generator draws them
// (seed 1, default document size and rare-word share). Benchmarks use it
// to measure stages on realistic text without building a corpus on disk;
// it skips (or fails under CI=true) when the shared data is missing.
func Slice(tb testing.TB, size int64) []string {
	tb.Helper()
	src := testenv.SharedDir(tb, "data/term-gold-en")
	dirs, _ := filepath.Glob(filepath.Join(src, "*", "texts"))
	paras, err := LoadParagraphs(dirs...)
	if err != nil {
		tb.Fatal(err)
	}
	g := NewGenerator(paras, Options{Size: size, Rare: DefaultRare, Seed: 1})
	var docs []string
	for n := int64(0); n < size; {
		d := g.Document()
		docs = append(docs, d)
		n += int64(len(d))
	}
	return docs
}

// SliceDir returns a directory of benchmark documents: the one named by
// the environment variable GLOSSMITH_BENCH_DIR (a corpus made by
// internal/benchcorpus/cmd, say), else a temporary one holding Slice's
// documents of about size bytes as doc-NNNNN.txt.
func SliceDir(tb testing.TB, size int64) string {
	tb.Helper()
	if dir := os.Getenv("GLOSSMITH_BENCH_DIR"); dir != "" {
		return dir
	}
	dir := tb.TempDir()
	for i, t := range Slice(tb, size) {
		if err := os.WriteFile(filepath.Join(dir, fmt.Sprintf("doc-%05d.txt", i+1)), []byte(t), 0o644); err != nil {
			tb.Fatal(err)
		}
	}
	return dir
}
