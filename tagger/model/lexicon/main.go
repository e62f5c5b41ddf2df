// Command lexicon writes the word-class table the tagger model carries,
// tagger/model/wordnet-classes.tsv, from a WordNet 3.0 database. Run it from
// the module root:
//
//	go run ./tagger/model/lexicon
//
// The database is Debian's package wordnet-base (/usr/share/wordnet by
// default, -wordnet DIR otherwise). The output is sorted, so the same
// database gives the same bytes; the test of package wordnet checks that
// the committed table is what this command writes. Rebuild the model
// afterwards (go run ./tagger/model/build), which copies the table in.
package main

import (
	"flag"
	"fmt"
	"os"

	"glossmith/tagger/wordnet"
)

func main() {
	dir := flag.String("wordnet", wordnet.DefaultDir, "WordNet 3.0 database directory")
	out := flag.String("o", "tagger/model/wordnet-classes.tsv", "table to write")
	flag.Parse()
	b, err := wordnet.Generate(*dir)
	if err == nil {
		err = writeFile(*out, b)
	}
	if err != nil {
		fmt.Fprintln(os.Stderr, "lexicon:", err)
		os.Exit(1)
	}
	t, err := wordnet.Parse(string(b))
	if err != nil {
		fmt.Fprintln(os.Stderr, "lexicon:", err)
		os.Exit(1)
	}
	fmt.Fprintf(os.Stderr, "wrote %s: %d forms, %d bytes\n", *out, t.Len(), len(b))
}

// writeFile writes through a temporary file, so a failed run leaves no
// half-written table.
func writeFile(path string, b []byte) error {
	tmp := path + ".tmp"
	if err := os.WriteFile(tmp, b, 0o644); err != nil {
		return err
	}
	return os.Rename(tmp, path)
}
