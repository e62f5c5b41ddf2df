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
	"slices"
	"strings"
	"time"

	"glossmith/tagger/conllu"
	"glossmith/tagger/hmm"
	"glossmith/tagger/selftrain"
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
	seed := flag.Uint64("seed", 1, "seed of the first perceptron's shuffling (the others take the next ones): train with other seeds to see how much a change is noise")
	beam := flag.Float64("beam", 0, "Viterbi beam (0: default, -1: off)")
	classes := flag.String("wordclasses", "tagger/model/wordnet-classes.tsv", "WordNet word-class table (go run ./tagger/model/lexicon; empty: none)")
	general := flag.String("general", "tagger/model/general-en-bands.tsv", "general-English frequency table (go run ./tagger/model/genfreq; empty: none)")
	learned := flag.Bool("learned", false, "also train with the learned word class features (tagger/model/en-wordclasses.txt.gz)")
	self := flag.Bool("selftrain", false, "also train on WordNet glosses tagged alike by a teacher perceptron and the generative HMM (package selftrain)")
	selfWeight := flag.Float64("selfweight", 1, "update step of the self-training sentences")
	selfNew := flag.Bool("selfnew", false, "self-training sentences update only features the treebank lacks")
	selfAgree := flag.Bool("selfagree", true, "keep only self-training sentences the generative HMM tags alike (false: every sentence with a new word)")
	selfBudget := flag.Int("selfbudget", 200000, "most tokens of self-training sentences (0: all)")
	teacher := flag.String("teacher", "", "teacher model file for -selftrain (empty: train it here with the same options)")
	wordnetDir := flag.String("wordnet", "/usr/share/wordnet", "WordNet 3.0 database for -selftrain (Debian package wordnet-base)")
	selfDump := flag.String("selfdump", "", "write the self-training sentences to this CoNLL-U file")
	caseAug := flag.String("caseaug", "", "add copies of training sentences cased as web text: lower (all words) or first (the first word lowered)")
	caseShare := flag.Float64("caseshare", 0.25, "share of the training sentences -caseaug copies")
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
	opt := hmm.TrainOptions{
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
	}
	if *self {
		opt.ExtraWeight, opt.ExtraNewOnly = *selfWeight, *selfNew
		opt.Extra = selfTraining(train, opt, *teacher, *wordnetDir, *selfBudget, *selfDump, *selfAgree)
		fmt.Fprintf(os.Stderr, "self-training sentences ready (%s)\n", time.Since(start).Round(time.Second))
	}
	if *caseAug != "" {
		opt.Extra = append(opt.Extra, casedCopies(train, *caseAug, *caseShare)...)
	}
	m, err := hmm.Train(train, opt)
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

// selfTraining returns WordNet's glosses as tagged alike by the teacher
// (the model of opt trained on train, or the file teacherFile) and the
// generative HMM trained on train, at most budget tokens of them.
func selfTraining(train []*conllu.Sentence, opt hmm.TrainOptions, teacherFile, wordnetDir string, budget int, dump string, agree bool) []*conllu.Sentence {
	var teacher *hmm.Model
	if teacherFile != "" {
		b, err := os.ReadFile(teacherFile)
		if err != nil {
			fail(err)
		}
		if teacher, err = hmm.Decode(b); err != nil {
			fail(err)
		}
	} else {
		opt.Dev, opt.Progress = nil, nil
		m, err := hmm.Train(train, opt)
		if err != nil {
			fail(err)
		}
		// Tag with the teacher as saved, as the model file would.
		var buf bytes.Buffer
		if err := m.Save(&buf); err != nil {
			fail(err)
		}
		if teacher, err = hmm.Decode(buf.Bytes()); err != nil {
			fail(err)
		}
	}
	gen, err := hmm.Train(train, hmm.TrainOptions{Method: hmm.MethodHMM, Tagset: opt.Tagset})
	if err != nil {
		fail(err)
	}
	if !agree {
		gen = teacher
	}
	texts, err := selftrain.Glosses(wordnetDir)
	if err != nil {
		fail(err)
	}
	sents, st := selftrain.Select(texts, teacher, gen, selftrain.Options{Budget: budget})
	fmt.Fprintf(os.Stderr, "self-training: %d glosses, %+v\n", len(texts), st)
	if dump != "" {
		var buf bytes.Buffer
		for _, s := range sents {
			for i, t := range s.Tokens {
				fmt.Fprintf(&buf, "%d\t%s\t%s\t%s\t%s\n", i+1, t.Form, t.Lemma, t.UPOS, t.XPOS)
			}
			buf.WriteByte('\n')
		}
		if err := os.WriteFile(dump, buf.Bytes(), 0o644); err != nil {
			fail(err)
		}
	}
	return sents
}

// casedCopies returns copies of a share of sents, evenly spread, with
// their words lower-cased (mode "lower") or only the first word lowered
// ("first"); tags and lemmas stay.
func casedCopies(sents []*conllu.Sentence, mode string, share float64) []*conllu.Sentence {
	var out []*conllu.Sentence
	acc := 0.0
	for _, s := range sents {
		if acc += share; acc < 1 {
			continue
		}
		acc--
		c := &conllu.Sentence{}
		c.Tokens = slices.Clone(s.Tokens)
		changed := false
		for i := range c.Tokens {
			if mode == "first" && i > 0 {
				break
			}
			l := strings.ToLower(c.Tokens[i].Form)
			changed = changed || l != c.Tokens[i].Form
			c.Tokens[i].Form = l
		}
		if changed {
			out = append(out, c)
		}
	}
	fmt.Fprintf(os.Stderr, "case copies (%s): %d sentences\n", mode, len(out))
	return out
}

func fail(err error) {
	fmt.Fprintln(os.Stderr, "build:", err)
	os.Exit(1)
}
