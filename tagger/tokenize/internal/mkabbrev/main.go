// Command mkabbrev learns the tokenizer's abbreviation list from the
// training part of the UD English Web Treebank and writes
// tagger/tokenize/abbrev.txt, which the tokenizer embeds.
//
//	go run ./tagger/tokenize/internal/mkabbrev [-train file] [-o file]
//
// An abbreviation is a treebank token of letters and periods that ends in a
// period, such as "Dr.", "etc." or "U.S." (EWT keeps the period on the word
// inside a sentence). For each one the list also records how often the word
// ended a sentence: EWT then splits the period off ("etc" + "."), and such
// words ("etc.", "Inc.") may end a sentence while titles ("Dr.") never do.
package main

import (
	"bufio"
	"flag"
	"fmt"
	"io"
	"log"
	"maps"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"unicode"

	"glossmith/tagger/conllu"
)

func main() {
	train := flag.String("train", "../shared/data/ud-en-ewt/en_ewt-ud-train.conllu", "UD EWT training file")
	out := flag.String("o", "tagger/tokenize/abbrev.txt", "output file")
	flag.Parse()

	f, err := os.Open(*train)
	if err != nil {
		log.Fatal(err)
	}
	defer f.Close()
	inside, final, err := count(f, *train)
	if err != nil {
		log.Fatal(err)
	}
	if err := write(*out, inside, final); err != nil {
		log.Fatal(err)
	}
}

// isAbbrevForm reports whether form looks like an abbreviation: letters
// (and inner periods or an apostrophe) followed by a final period.
func isAbbrevForm(form string) bool {
	if len(form) < 2 || !strings.HasSuffix(form, ".") || strings.HasSuffix(form, "..") {
		return false
	}
	letters := 0
	for _, r := range form[:len(form)-1] {
		switch {
		case unicode.IsLetter(r):
			letters++
		case r == '.' || r == '\'':
		default:
			return false
		}
	}
	return letters > 0
}

// closing reports whether a token is closing punctuation that may follow
// the full stop of a sentence.
func closing(form string) bool {
	switch form {
	case `"`, "'", "''", ")", "]", "”", "’", "»":
		return true
	}
	return false
}

// count returns, per abbreviation, the times it was seen inside a sentence
// and the times it ended one with its period split off.
func count(r io.Reader, name string) (inside, final map[string]int, err error) {
	inside, final = map[string]int{}, map[string]int{}
	rd := conllu.NewReader(r, name)
	var ended []string // words seen as "X" + "." at a sentence end
	for {
		s, err := rd.Next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, nil, err
		}
		toks := s.Tokens
		last := len(toks) - 1
		for last > 0 && closing(toks[last].Form) {
			last--
		}
		for i, t := range toks {
			if isAbbrevForm(t.Form) && i != last {
				inside[t.Form]++
			}
		}
		if last > 0 && toks[last].Form == "." && !toks[last-1].SpaceAfter {
			ended = append(ended, toks[last-1].Form+".")
		}
	}
	if errs := rd.Errors(); len(errs) > 0 {
		return nil, nil, errs
	}
	// A sentence-final "X ." only counts for words known as abbreviations.
	for _, a := range ended {
		if inside[a] > 0 {
			final[a]++
		}
	}
	return inside, final, nil
}

func write(path string, inside, final map[string]int) error {
	forms := slices.Sorted(maps.Keys(inside))
	tmp, err := os.CreateTemp(filepath.Dir(path), ".abbrev-*.txt")
	if err != nil {
		return err
	}
	defer os.Remove(tmp.Name())
	w := bufio.NewWriter(tmp)
	fmt.Fprintln(w, "# Abbreviations for glossmith's sentence splitter, learned from the training part")
	fmt.Fprintln(w, "# of the Universal Dependencies English Web Treebank 2.15 (en_ewt-ud-train.conllu,")
	fmt.Fprintln(w, "# CC BY-SA 4.0, https://universaldependencies.org/) by")
	fmt.Fprintln(w, "#   go run ./tagger/tokenize/internal/mkabbrev")
	fmt.Fprintln(w, "# Do not edit by hand; regenerate. Columns (tab-separated): the abbreviation, the")
	fmt.Fprintln(w, "# times it occurred inside a sentence, the times it ended a sentence (EWT then")
	fmt.Fprintln(w, "# writes its period as a token of its own).")
	for _, a := range forms {
		fmt.Fprintf(w, "%s\t%d\t%d\n", a, inside[a], final[a])
	}
	if err := w.Flush(); err != nil {
		tmp.Close()
		return err
	}
	if err := tmp.Chmod(0o644); err != nil {
		tmp.Close()
		return err
	}
	if err := tmp.Close(); err != nil {
		return err
	}
	return os.Rename(tmp.Name(), path)
}
