package main

import (
	"encoding/json"
	"fmt"
	"io"
	"os"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"glossmith/extract/terms"
	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
)

func newEvalCmd() *cobra.Command {
	cmd := &cobra.Command{
		Use:   "eval",
		Short: "Measure tagging or term extraction against a gold standard",
	}
	cmd.AddCommand(newEvalTaggingCmd(), newEvalTermsCmd())
	return cmd
}

func newEvalTaggingCmd() *cobra.Command {
	var (
		model string
		to    string
	)
	cmd := &cobra.Command{
		Use:   "tagging [flags] GOLD.conllu...",
		Short: "Tag gold-tokenized CoNLL-U and report UPOS, XPOS and lemma accuracy",
		Long: `Tags the tokens of gold CoNLL-U files (hiding their annotation from the tagger)
and prints UPOS, XPOS and lemma accuracy (lemmas compared case-insensitively),
for all tokens and for tokens known and unknown to the model's training data,
and the most frequent confusions.`,
		Args: cobra.MinimumNArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			m, err := loadModel(model)
			if err != nil {
				return err
			}
			gold, bad, err := readConllu(args)
			if err != nil {
				return err
			}
			rep := hmm.Evaluate(m, gold)
			switch to {
			case "json":
				enc := json.NewEncoder(os.Stdout)
				enc.SetIndent("", "  ")
				if err := enc.Encode(rep); err != nil {
					return err
				}
			case "text":
				printTaggingReport(os.Stdout, rep)
			default:
				return fmt.Errorf("--to %q: want text or json", to)
			}
			if bad > 0 {
				return exitError{1, fmt.Sprintf("%d malformed sentence(s) left out", bad)}
			}
			return nil
		},
	}
	cmd.Flags().StringVar(&model, "model", "", "model file (default: the embedded model)")
	cmd.Flags().StringVar(&to, "to", "text", "output: text or json")
	return cmd
}

func printTaggingReport(w io.Writer, r hmm.Report) {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintf(tw, "\tall\tknown\tunknown\t\n")
	row := func(name string, s hmm.Split) {
		fmt.Fprintf(tw, "%s\t%.2f%%\t%.2f%%\t%.2f%%\t\n", name, s.Accuracy, s.Known.Accuracy, s.Unknown.Accuracy)
	}
	row("UPOS", r.UPOS)
	row("XPOS", r.XPOS)
	row("lemma", r.Lemma)
	fmt.Fprintf(tw, "tokens\t%d\t%d\t%d\t\n", r.Tokens, r.Tokens-r.UnknownTokens, r.UnknownTokens)
	tw.Flush()
	for _, c := range []struct {
		name string
		list []hmm.Confusion
	}{{"UPOS", r.UPOSConfusions}, {"XPOS", r.XPOSConfusions}} {
		fmt.Fprintf(w, "\nmost frequent %s confusions (gold → tagged):\n", c.name)
		for _, x := range c.list {
			fmt.Fprintf(w, "  %6d  %s → %s\n", x.Count, x.Gold, x.Predicted)
		}
	}
}

func newEvalTermsCmd() *cobra.Command {
	var (
		in       inputFlags
		rules    ruleFlags
		goldPath string
		to       string
		minFreq  int
	)
	cmd := &cobra.Command{
		Use:   "terms --gold LIST.tsv [flags] INPUT...",
		Short: "Score term extraction against a gold term list",
		Long: `Runs the term extraction and scores it as term-extraction research does: the
lower-cased surface forms of the candidates (their variants) are compared as
sets with the gold list (one term per line, an optional tab and label after
it). Prints precision, recall and F1 of the default list, and the best F1 over
all cut-offs of the full ranking with the rank where it is reached.`,
		RunE: func(cmd *cobra.Command, args []string) error {
			if goldPath == "" {
				return fmt.Errorf("--gold is required")
			}
			f, err := os.Open(goldPath)
			if err != nil {
				return err
			}
			gold, err := terms.ReadGold(f, goldPath)
			f.Close()
			if err != nil {
				return err
			}
			_, m, err := rules.matcher("terms")
			if err != nil {
				return err
			}
			model, err := loadModel(in.model)
			if err != nil {
				return err
			}
			col := terms.NewCollector(m, terms.Options{})
			corpus := terms.NewCorpus(0)
			in.reuseTokens = true // Collect and Add copy what they keep
			_, runErr := runDocs(&in, args, model, col.Collect, func(_ *doc.Document, dc *terms.DocCounts) { corpus.Add(dc); dc.Release() })
			if corpus.Documents() == 0 {
				return runErr
			}
			ts := corpus.Terms(modelReference{model})
			full, err := terms.Rank(ts, terms.RankOptions{MinFreq: 1, All: true})
			if err != nil {
				return err
			}
			def, err := terms.Rank(full, terms.RankOptions{MinFreq: minFreq})
			if err != nil {
				return err
			}
			ev := terms.Evaluate(full, -1, gold)
			ev.Default = terms.Evaluate(def, len(def), gold).Default
			switch to {
			case "json":
				enc := json.NewEncoder(os.Stdout)
				enc.SetIndent("", "  ")
				if err := enc.Encode(ev); err != nil {
					return err
				}
			case "text":
				fmt.Printf("gold terms: %d; candidates ranked: %d; default list: %d\n", ev.Gold, len(full), len(def))
				tw := tabwriter.NewWriter(os.Stdout, 0, 0, 2, ' ', tabwriter.AlignRight)
				fmt.Fprintf(tw, "\tcandidates\tforms\tcorrect\tprecision\trecall\tF1\t\n")
				for _, s := range []struct {
					name string
					s    terms.Scores
				}{{"default list", ev.Default}, {"best cut-off", ev.Best}} {
					fmt.Fprintf(tw, "%s\t%d\t%d\t%d\t%.3f\t%.3f\t%.3f\t\n", s.name, s.s.Rank, s.s.Extracted, s.s.Correct, s.s.Precision, s.s.Recall, s.s.F1)
				}
				tw.Flush()
			default:
				return fmt.Errorf("--to %q: want text or json", to)
			}
			return runErr
		},
	}
	in.register(cmd, true)
	rules.register(cmd, "terms")
	cmd.Flags().StringVar(&goldPath, "gold", "", "gold term list (TSV: term, tab, optional label)")
	cmd.Flags().StringVar(&to, "to", "text", "output: text or json")
	cmd.Flags().IntVar(&minFreq, "min-freq", 1, "minimum frequency of the default list, as for the terms command")
	return cmd
}
