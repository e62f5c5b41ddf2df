// Command mkwordfreq writes extract/wordfreq/general.tsv, the embedded
// general-language frequency table, from the SUBTLEX-US counts beside the
// repository:
//
//	go run ./extract/wordfreq/internal/mkwordfreq [-src ../shared/data/general-en/subtlex-us-words.json] [-o extract/wordfreq/general.tsv]
//
// Run it from the module root. TestEmbeddedTableIsGenerated checks that the
// embedded file is what it writes.
package main

import (
	"flag"
	"fmt"
	"os"
	"path/filepath"

	"glossmith/extract/wordfreq/internal/build"
)

func main() {
	src := flag.String("src", filepath.Join("..", "shared", "data", "general-en", "subtlex-us-words.json"), "SUBTLEX-US counts as JSON")
	out := flag.String("o", filepath.Join("extract", "wordfreq", "general.tsv"), "table to write")
	flag.Parse()
	if err := run(*src, *out); err != nil {
		fmt.Fprintln(os.Stderr, "mkwordfreq:", err)
		os.Exit(1)
	}
}

func run(src, out string) error {
	f, err := os.Open(src)
	if err != nil {
		return err
	}
	defer f.Close()
	table, err := build.Table(f)
	if err != nil {
		return fmt.Errorf("%s: %w", src, err)
	}
	tmp := out + ".tmp"
	if err := os.WriteFile(tmp, table, 0o644); err != nil {
		return err
	}
	return os.Rename(tmp, out)
}
