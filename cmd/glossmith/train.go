package main

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"glossmith/tagger/conllu"
	"glossmith/tagger/hmm"
	"glossmith/tagger/read"
)

// trainOptions are the flags of the train command.
type trainOptions struct {
	method string
	from   string
	out    string
	dev    string
	epochs int
	quiet  bool
}

// trainMethods are the values of train --method.
var trainMethods = []string{"perceptron", "hmm"}

func newTrainCmd() *cobra.Command {
	o := &trainOptions{}
	cmd := &cobra.Command{
		Use:   "train [flags] FILE... -o MODEL",
		Short: "Train a tagging model from annotated CoNLL-U",
		Long: `Trains a tagging model (UPOS, XPOS and lemma) from CoNLL-U files whose FORM,
LEMMA, UPOS and XPOS columns are filled — a treebank, or your own annotated
documents — and writes it to MODEL for --model.

Methods:
  perceptron  trigram Viterbi with weights learned by the averaged structured
              perceptron (Collins 2002) over rich word features, among them
              the English word classes of WordNet 3.0 that the embedded
              model carries (default)
  hmm         generative trigram HMM with deleted interpolation and a suffix
              model for unknown words (Brants 2000): fast, less accurate

With --dev the accuracy on that file is printed after each epoch.`,
		Example: `  glossmith train -o en-ewt.glsm --dev en_ewt-ud-dev.conllu en_ewt-ud-train.conllu
  glossmith train --method hmm -o quick.glsm my-annotated/*.conllu`,
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := o.validate(args); err != nil {
				return err
			}
			return o.run(args)
		},
	}
	fl := cmd.Flags()
	fl.StringVar(&o.method, "method", "perceptron", "training method: "+strings.Join(trainMethods, " or "))
	fl.StringVar(&o.from, "from", "conllu", "input format (CoNLL-U only)")
	fl.StringVarP(&o.out, "output", "o", "", "model file to write (complete or not at all)")
	fl.StringVar(&o.dev, "dev", "", "CoNLL-U file to report accuracy on after each epoch")
	fl.IntVar(&o.epochs, "epochs", 0, "perceptron epochs (default: the method's default)")
	fl.BoolVarP(&o.quiet, "quiet", "q", false, "print no progress")
	completeChoices(cmd, "method", trainMethods)
	completeChoices(cmd, "from", []string{"conllu"})
	return cmd
}

// maxEpochs bounds --epochs: the perceptron settles within a few dozen.
const maxEpochs = 1000

// validate checks every flag value before any input is read.
func (o *trainOptions) validate(args []string) error {
	if err := checkChoice("method", o.method, trainMethods); err != nil {
		return err
	}
	if err := checkChoice("from", o.from, []string{"conllu"}); err != nil {
		return err
	}
	if err := checkRange("epochs", int64(o.epochs), 0, maxEpochs); err != nil {
		return err
	}
	if o.out == "" {
		return usageError("name the model file with -o MODEL")
	}
	if len(args) == 0 {
		return usageError("name the annotated CoNLL-U file(s) to train on")
	}
	return nil
}

func (o *trainOptions) run(args []string) error {
	sents, loss := readConllu(args)
	if len(sents) == 0 {
		return exitError{1, "no annotated sentences to train on"}
	}
	opt := hmm.TrainOptions{Method: o.method, Epochs: o.epochs, Source: strings.Join(baseNames(args), ", ")}
	if def, err := hmm.Default(); err == nil {
		opt.WordClasses = def.WordClasses() // the embedded model's WordNet word classes
	}
	if o.dev != "" {
		d, l := readConllu([]string{o.dev})
		loss = loss.add(l)
		opt.Dev = d
	}
	start := time.Now()
	opt.Progress = func(epoch int, u, x float64) {
		if o.quiet {
			return
		}
		if opt.Dev != nil {
			fmt.Fprintf(os.Stderr, "epoch %d: dev UPOS %.2f%%, XPOS %.2f%% (%s)\n", epoch, u, x, time.Since(start).Round(time.Second))
		} else {
			fmt.Fprintf(os.Stderr, "epoch %d done (%s)\n", epoch, time.Since(start).Round(time.Second))
		}
	}
	if !o.quiet {
		fmt.Fprintf(os.Stderr, "training %s on %d sentences\n", o.method, len(sents))
	}
	m, err := hmm.Train(sents, opt)
	if err != nil {
		return err
	}
	out, err := openOutput(o.out)
	if err != nil {
		return err
	}
	if err := out.commit(m.Save(out)); err != nil {
		return err
	}
	return loss.err(" of training")
}

// readConllu reads gold CoNLL-U files, reporting on standard error — with
// the file, and the line where there is one — files it cannot read and
// malformed sentences or sentences without valid gold tags
// (hmm.CheckGold), which are left out while the rest is read.
func readConllu(paths []string) ([]*conllu.Sentence, conlluLoss) {
	var all []*conllu.Sentence
	var loss conlluLoss
	for _, p := range paths {
		f, err := os.Open(p)
		if err != nil {
			fmt.Fprintf(os.Stderr, "error: %s: cannot open: %s\n", p, read.Describe(err))
			loss.files++
			continue
		}
		s, err := conllu.ReadAll(f, p)
		f.Close()
		if list, ok := err.(conllu.ErrorList); ok {
			for _, e := range list {
				fmt.Fprintln(os.Stderr, "error:", e)
			}
			loss.sentences += len(list)
		} else if err != nil {
			fmt.Fprintf(os.Stderr, "error: %s: cannot read: %s\n", p, read.Describe(err))
			loss.files++
			continue
		}
		for _, st := range s {
			if err := hmm.CheckGold(st, p); err != nil {
				fmt.Fprintln(os.Stderr, "error:", err)
				loss.sentences++
				continue
			}
			all = append(all, st)
		}
	}
	return all, loss
}

// conlluLoss counts what readConllu left out.
type conlluLoss struct{ sentences, files int }

func (l conlluLoss) add(o conlluLoss) conlluLoss {
	return conlluLoss{l.sentences + o.sentences, l.files + o.files}
}

// err is the exit status 1 that reports the loss at the end of a run that
// used the rest ("… left out of training"), nil when nothing was lost.
func (l conlluLoss) err(where string) error {
	var parts []string
	if l.sentences > 0 {
		parts = append(parts, fmt.Sprintf("%d malformed or untagged sentence(s)", l.sentences))
	}
	if l.files > 0 {
		parts = append(parts, fmt.Sprintf("%d unreadable file(s)", l.files))
	}
	if len(parts) == 0 {
		return nil
	}
	return exitError{1, strings.Join(parts, " and ") + " left out" + where}
}

func baseNames(paths []string) []string {
	out := make([]string, len(paths))
	for i, p := range paths {
		out[i] = filepath.Base(p)
	}
	return out
}
