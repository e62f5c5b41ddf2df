// Command cmd builds a benchmark corpus from the term-gold texts in
// ../shared, outside the repository:
//
//	go run ./internal/benchcorpus/cmd -o /tmp/glossmith-bench -size 100MB
package main

import (
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"strings"

	"glossmith/internal/benchcorpus"
)

func main() {
	out := flag.String("o", "", "output directory (must lie outside the repository)")
	size := flag.String("size", "100MB", "total size of the corpus")
	docSize := flag.String("doc-size", "32KB", "mean size of a document")
	rare := flag.Float64("rare", benchcorpus.DefaultRare, "share of words replaced by invented words (the long tail of a real vocabulary)")
	seed := flag.Uint64("seed", 1, "random seed (the same seed builds the same corpus)")
	src := flag.String("src", "", "directory holding {corp,equi,wind}/texts (default: ../shared/data/term-gold-en beside the module root)")
	flag.Parse()
	if err := run(*out, *size, *docSize, *rare, *seed, *src); err != nil {
		fmt.Fprintln(os.Stderr, "benchcorpus:", err)
		os.Exit(1)
	}
}

func run(out, size, docSize string, rare float64, seed uint64, src string) error {
	if out == "" {
		return fmt.Errorf("-o DIR is required")
	}
	total, err := benchcorpus.ParseSize(size)
	if err != nil {
		return err
	}
	ds, err := benchcorpus.ParseSize(docSize)
	if err != nil {
		return err
	}
	root, err := moduleRoot()
	if err != nil {
		return err
	}
	absOut, err := filepath.Abs(out)
	if err != nil {
		return err
	}
	if rel, err := filepath.Rel(root, absOut); err == nil && rel != ".." && !strings.HasPrefix(rel, ".."+string(filepath.Separator)) {
		return fmt.Errorf("%s lies inside the repository %s; build the corpus elsewhere (e.g. /tmp/glossmith-bench)", absOut, root)
	}
	if src == "" {
		src = filepath.Join(root, "..", "shared", "data", "term-gold-en")
	}
	dirs, _ := filepath.Glob(filepath.Join(src, "*", "texts"))
	if len(dirs) == 0 {
		return fmt.Errorf("no */texts directories under %s", src)
	}
	paras, err := benchcorpus.LoadParagraphs(dirs...)
	if err != nil {
		return err
	}
	g := benchcorpus.NewGenerator(paras, benchcorpus.Options{Size: total, DocSize: int(ds), Rare: rare, Seed: seed})
	docs, n, err := g.Write(absOut)
	if err != nil {
		return err
	}
	fmt.Fprintf(os.Stderr, "wrote %d documents, %d bytes to %s (from %d paragraphs)\n", docs, n, absOut, len(paras))
	return nil
}

// moduleRoot is the nearest directory at or above the working directory
// that holds go.mod.
func moduleRoot() (string, error) {
	dir, err := os.Getwd()
	if err != nil {
		return "", err
	}
	for {
		if _, err := os.Stat(filepath.Join(dir, "go.mod")); err == nil {
			return dir, nil
		}
		parent := filepath.Dir(dir)
		if parent == dir {
			return "", fmt.Errorf("run inside the glossmith module (go.mod not found)")
		}
		dir = parent
	}
}
