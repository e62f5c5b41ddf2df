package benchcorpus

import (
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
