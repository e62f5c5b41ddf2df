// Command build trains glossmith's default tagger model and writes it to
// tagger/model/en-ewt.glsm. Run it from the module root:
//
//	go run ./tagger/model/build
//
// It reads UD English EWT 2.15 from ../shared/data/ud-en-ewt (train for
// training, dev for the progress report) with the hyperparameters chosen on
// dev, which are the defaults below. Training is deterministic, so the same
// data gives the same bytes. Other flags make it a small experiment bench:
// -method hmm, -tagset xpos, -test to also report test accuracy.
package main

import (
	"bytes"
	"encoding/json"
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"time"

	"glossmith/tagger/conllu"
	"glossmith/tagger/hmm"
)

func main() {
	data := flag.String("data", "../shared/data/ud-en-ewt", "directory of the UD English EWT CoNLL-U files")
	out := flag.String("o", "tagger/model/en-ewt.glsm", "model file to write (empty: do not write)")
	method := flag.String("method", hmm.MethodPerceptron, "hmm or perceptron")
	tagset := flag.String("tagset", hmm.TagsetJoint, "joint or xpos")
	epochs := flag.Int("epochs", 10, "perceptron epochs")
	dictMin := flag.Int("dictmin", 0, "tag dictionary threshold (0: default)")
	cands := flag.Int("cands", 0, "candidates per word outside the tag dictionary (0: default)")
	minFeat := flag.Int("minfeat", 0, "minimum feature count (0: default, -1: keep all)")
	pruneW := flag.Float64("prunew", 0.5, "drop weights below this magnitude (-1: keep all)")
	shuffles := flag.Int("shuffles", 3, "perceptrons trained on differently shuffled data, their weights averaged")
	seed := flag.Uint64("seed", 16, "seed of the first perceptron's shuffling (the others take the next ones); 16, the best of ten seed sets on dev: train with other seeds to see how much a change is noise")
	beam := flag.Float64("beam", 0, "Viterbi beam (0: default, -1: off)")
	classes := flag.String("wordclasses", "tagger/model/wordnet-classes.tsv", "WordNet word-class table (go run ./tagger/model/lexicon; empty: none)")
	general := flag.String("general", "tagger/model/general-en-bands.tsv", "general-English frequency table (go run ./tagger/model/genfreq; empty: none)")
	learned := flag.Bool("learned", false, "also train with the learned word class features (tagger/model/en-wordclasses.txt.gz)")
	test := flag.Bool("test", false, "also evaluate on the test set")
	trainAcc := flag.Bool("trainacc", false, "also evaluate on the first 2000 training sentences")
	jsonOut := flag.Bool("json", false, "print full reports as JSON")
	flag.Parse()

	read := func(name string) []*conllu.Sentence {
		p := filepath.Join(*data, name)
		f, err := os.Open(p)
		if err != nil {
			fail(err)
		}
		defer f.Close()
		s, err := conllu.ReadAll(f, p)
		if err != nil {
			fail(err)
		}
		return s
	}
	train := read("en_ewt-ud-train.conllu")
	dev := read("en_ewt-ud-dev.conllu")
	var wn []byte
	if *classes != "" {
		var err error
		if wn, err = os.ReadFile(*classes); err != nil {
			fail(err)
		}
	}
	var gf []byte
	if *general != "" {
		var err error
		if gf, err = os.ReadFile(*general); err != nil {
			fail(err)
		}
	}
	start := time.Now()
	m, err := hmm.Train(train, hmm.TrainOptions{
		Method: *method, Tagset: *tagset, Epochs: *epochs,
		Source:   "UD English EWT 2.15 (en_ewt-ud-train.conllu)",
		Shuffles: *shuffles,
		Seed:     *seed,
		DictMin:  *dictMin, MaxCands: *cands, MinFeatureCount: *minFeat, PruneWeight: *pruneW, Beam: *beam,
		WordClasses:        string(wn),
		GeneralFrequencies: string(gf),
		LearnedClasses:     *learned,
		Dev:                dev,
		Progress: func(ep int, u, x float64) {
			fmt.Fprintf(os.Stderr, "epoch %d: dev UPOS %.2f%% XPOS %.2f%% (%s)\n", ep, u, x, time.Since(start).Round(time.Second))
		},
	})
	if err != nil {
		fail(err)
	}
	fmt.Fprintf(os.Stderr, "trained in %s\n", time.Since(start).Round(time.Millisecond))
	var buf bytes.Buffer
	if err := m.Save(&buf); err != nil {
		fail(err)
	}
	fmt.Fprintf(os.Stderr, "model: %d bytes; %+v\n", buf.Len(), m.Info())
	// Evaluate the model as saved, so the figures are those of the file.
	if m, err = hmm.Decode(buf.Bytes()); err != nil {
		fail(err)
	}
	sets := map[string][]*conllu.Sentence{"dev": dev}
	names := []string{"dev"}
	if *trainAcc {
		sets["train[:2000]"] = train[:2000]
		names = append(names, "train[:2000]")
	}
	if *test {
		sets["test"] = read("en_ewt-ud-test.conllu")
		names = append(names, "test")
	}
	for _, n := range names {
		t0 := time.Now()
		r := hmm.Evaluate(m, sets[n])
		fmt.Fprintf(os.Stderr, "%s: tagged %d tokens in %s (%.0f tokens/s, including evaluation)\n", n, r.Tokens,
			time.Since(t0).Round(time.Millisecond), float64(r.Tokens)/time.Since(t0).Seconds())
		if *jsonOut {
			b, _ := json.MarshalIndent(r, "", "  ")
			fmt.Printf("%s: %s\n", n, b)
			continue
		}
		fmt.Printf("%s: UPOS %.2f (known %.2f, unknown %.2f)  XPOS %.2f (known %.2f, unknown %.2f)  lemma %.2f (known %.2f, unknown %.2f)  unknown tokens %d/%d\n",
			n, r.UPOS.Accuracy, r.UPOS.Known.Accuracy, r.UPOS.Unknown.Accuracy,
			r.XPOS.Accuracy, r.XPOS.Known.Accuracy, r.XPOS.Unknown.Accuracy,
			r.Lemma.Accuracy, r.Lemma.Known.Accuracy, r.Lemma.Unknown.Accuracy, r.UnknownTokens, r.Tokens)
	}
	if *out == "" {
		return
	}
	tmp := *out + ".tmp"
	if err := os.WriteFile(tmp, buf.Bytes(), 0o644); err != nil {
		fail(err)
	}
	if err := os.Rename(tmp, *out); err != nil {
		fail(err)
	}
	fmt.Fprintf(os.Stderr, "wrote %s\n", *out)
}

func fail(err error) {
	fmt.Fprintln(os.Stderr, "build:", err)
	os.Exit(1)
}
