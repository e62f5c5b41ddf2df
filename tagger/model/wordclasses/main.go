// Command wordclasses learns the word classes of the default tagger model
// from unlabeled text and writes them to tagger/model/en-wordclasses.txt.gz.
// Run it from the module root:
//
//	go run ./tagger/model/wordclasses
//
// The text is the training file of UD English EWT 2.15 (its word forms;
// never the dev or test files) and the glosses and example sentences of
// WordNet 3.0 (Debian package wordnet-base), lower-cased; NOTICE.md beside
// the table names both with their licenses. The classes are learned by
// wordclass.Learn with the options below; the same text gives the same
// bytes.
package main

import (
	"bufio"
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"time"

	"glossmith/internal/atomicfile"
	"glossmith/tagger/conllu"
	"glossmith/tagger/tokenize"
	"glossmith/tagger/wordclass"
)

// Options of the table, chosen on UD English EWT dev by the accuracy of
// a tagger trained with the table's features (and without the WordNet
// ones; see the README).
var defaultOptions = wordclass.Options{Classes: 256, MinCount: 3, MaxIterations: 20}

// treebankFile is the only treebank file whose text the classes see.
const treebankFile = "en_ewt-ud-train.conllu"

// wordnetFiles are WordNet's data files, read in this order.
var wordnetFiles = []string{"data.noun", "data.verb", "data.adj", "data.adv"}

func main() {
	data := flag.String("data", "../shared/data/ud-en-ewt", "directory of the UD English EWT CoNLL-U files")
	wordnet := flag.String("wordnet", "/usr/share/wordnet", "directory of the WordNet 3.0 data files (Debian package wordnet-base)")
	out := flag.String("o", "tagger/model/en-wordclasses.txt.gz", "table to write (empty: do not write)")
	opt := defaultOptions
	flag.IntVar(&opt.Classes, "classes", opt.Classes, "number of classes")
	flag.IntVar(&opt.MinCount, "mincount", opt.MinCount, "occurrences a word needs to be classed")
	flag.IntVar(&opt.MaxIterations, "iterations", opt.MaxIterations, "most passes of the exchange algorithm")
	flag.Parse()

	start := time.Now()
	sents, err := readSources(*data, *wordnet)
	if err != nil {
		fail(err)
	}
	t, st := wordclass.Learn(sents, opt)
	fmt.Fprintf(os.Stderr, "%d sentences, %d tokens, %d words classed into %d classes; moves per pass %v; %s\n",
		len(sents), st.Tokens, st.Vocabulary, st.Classes, st.Moves, time.Since(start).Round(time.Millisecond))
	z, err := t.Compress()
	if err != nil {
		fail(err)
	}
	fmt.Fprintf(os.Stderr, "table: %d bytes compressed\n", len(z))
	if *out == "" {
		return
	}
	f, err := atomicfile.Create(*out)
	if err != nil {
		fail(err)
	}
	_, err = f.Write(z)
	if err = f.Finish(err); err != nil {
		fail(err)
	}
	fmt.Fprintf(os.Stderr, "wrote %s\n", *out)
}

// readSources returns the lower-cased sentences of the treebank's training
// file, then those of WordNet's glosses.
func readSources(data, wordnet string) ([][]string, error) {
	p := filepath.Join(data, treebankFile)
	f, err := os.Open(p)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	tb, err := conllu.ReadAll(f, p)
	if err != nil {
		return nil, err
	}
	var sents [][]string
	for _, s := range tb {
		words := make([]string, len(s.Tokens))
		for i, t := range s.Tokens {
			words[i] = strings.ToLower(t.Form)
		}
		sents = append(sents, words)
	}
	for _, name := range wordnetFiles {
		if sents, err = appendGlosses(sents, filepath.Join(wordnet, name)); err != nil {
			return nil, err
		}
	}
	return sents, nil
}

// appendGlosses appends the tokenized, lower-cased glosses of a WordNet
// data file: the text after " | " on each synset line (a definition,
// often followed by quoted examples). Lines that start with a space are
// the file's license header.
func appendGlosses(sents [][]string, path string) ([][]string, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	sc.Buffer(nil, 1<<20)
	line := 0
	for sc.Scan() {
		line++
		text := sc.Text()
		if strings.HasPrefix(text, " ") {
			continue
		}
		_, gloss, ok := strings.Cut(text, " | ")
		if !ok {
			return nil, fmt.Errorf("%s:%d: no gloss (\" | \") on a synset line", path, line)
		}
		for _, s := range tokenize.Sentences(strings.TrimSpace(gloss)) {
			words := make([]string, len(s.Tokens))
			for i, t := range s.Tokens {
				words[i] = strings.ToLower(t.Form)
			}
			sents = append(sents, words)
		}
	}
	return sents, sc.Err()
}

func fail(err error) {
	fmt.Fprintln(os.Stderr, "wordclasses:", err)
	os.Exit(1)
}
