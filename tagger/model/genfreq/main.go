// Command genfreq writes the general-English frequency table the tagger
// model carries, tagger/model/general-en-bands.tsv, from the SUBTLEX-US
// word list at ../shared/data/general-en (ISC license; notice in
// tagger/model/NOTICE.md). Run it from the module root:
//
//	go run ./tagger/model/genfreq
//
// The output is sorted, so the same list gives the same bytes; the test of
// package genfreq checks that the committed table is what this command
// writes. Rebuild the model afterwards (go run ./tagger/model/build),
// which copies the table in.
package main

import (
	"flag"
	"fmt"
	"os"

	"glossmith/tagger/genfreq"
)

func main() {
	in := flag.String("words", "../shared/data/general-en/subtlex-us-words.json", "SUBTLEX-US word list (JSON)")
	out := flag.String("o", "tagger/model/general-en-bands.tsv", "table to write")
	flag.Parse()
	if err := run(*in, *out); err != nil {
		fmt.Fprintln(os.Stderr, "genfreq:", err)
		os.Exit(1)
	}
}

func run(in, out string) error {
	data, err := os.ReadFile(in)
	if err != nil {
		return err
	}
	b, err := genfreq.Generate(data)
	if err != nil {
		return fmt.Errorf("%s: %w", in, err)
	}
	t, err := genfreq.Parse(string(b))
	if err != nil {
		return err
	}
	tmp := out + ".tmp" // no half-written table on failure
	if err := os.WriteFile(tmp, b, 0o644); err != nil {
		return err
	}
	if err := os.Rename(tmp, out); err != nil {
		return err
	}
	fmt.Fprintf(os.Stderr, "wrote %s: %d forms, %d bytes\n", out, t.Len(), len(b))
	return nil
}
