package main

import (
	"bufio"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"strings"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"glossmith/extract/terms"
	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
	"glossmith/tagger/read"
)

func newEvalCmd() *cobra.Command {
	cmd := &cobra.Command{
		Use:   "eval",
		Short: "Measure tagging or term extraction against a gold standard",
	}
	cmd.AddCommand(newEvalTaggingCmd(), newEvalTermsCmd())
	return cmd
}

// reportFormats are the output formats of the eval commands.
var reportFormats = []string{"text", "json"}

// evalTaggingOptions are the flags of eval tagging.
type evalTaggingOptions struct {
	model string
	to    string
}

func newEvalTaggingCmd() *cobra.Command {
	o := &evalTaggingOptions{}
	cmd := &cobra.Command{
		Use:   "tagging [flags] GOLD.conllu...",
		Short: "Tag gold-tokenized CoNLL-U and report UPOS, XPOS and lemma accuracy",
		Long: `Tags the tokens of gold CoNLL-U files (hiding their annotation from the tagger)
and prints UPOS, XPOS and lemma accuracy (lemmas compared case-insensitively),
for all tokens and for tokens known and unknown to the model's training data,
and the most frequent confusions.`,
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := o.validate(args); err != nil {
				return err
			}
			return o.run(args)
		},
	}
	cmd.Flags().StringVar(&o.model, "model", "", "model file (default: the embedded model)")
	cmd.Flags().StringVar(&o.to, "to", "text", "output: "+strings.Join(reportFormats, " or "))
	completeChoices(cmd, "to", reportFormats)
	return cmd
}

// validate checks every flag value before any input is read.
func (o *evalTaggingOptions) validate(args []string) error {
	if err := checkChoice("to", o.to, reportFormats); err != nil {
		return err
	}
	if len(args) == 0 {
		return usageError("name the gold CoNLL-U file(s)")
	}
	return nil
}

func (o *evalTaggingOptions) run(args []string) error {
	m, err := loadModel(o.model)
	if err != nil {
		return err
	}
	gold, loss := readConllu(args)
	if len(gold) == 0 {
		// No table of zeros: there is nothing to measure.
		return exitError{1, "no sentences with gold tags to evaluate on"}
	}
	rep := hmm.Evaluate(m, gold)
	w := bufio.NewWriter(os.Stdout)
	if o.to == "json" {
		writeJSON(w, rep)
	} else {
		printTaggingReport(w, rep)
	}
	// A bufio.Writer keeps its first error: Flush reports every failed
	// write (a full disk, a closed pipe).
	if err := w.Flush(); err != nil {
		return exitError{1, fmt.Sprintf("writing the report: %v", err)}
	}
	return loss.err("")
}

// writeJSON writes v as indented JSON; errors show in the writer's Flush.
func writeJSON(w *bufio.Writer, v any) {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	_ = enc.Encode(v)
}

func printTaggingReport(w io.Writer, r hmm.Report) {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintf(tw, "\tall\tknown\tunknown\t\n")
	// A column over no tokens (every word known) has no accuracy: "–",
	// not a 0.00% that reads as all wrong.
	pct := func(s hmm.Score) string {
		if s.Total == 0 {
			return "–"
		}
		return fmt.Sprintf("%.2f%%", s.Accuracy)
	}
	row := func(name string, s hmm.Split) {
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t\n", name, pct(s.Score), pct(s.Known), pct(s.Unknown))
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
		if len(c.list) == 0 {
			fmt.Fprintln(w, "  none")
		}
		for _, x := range c.list {
			fmt.Fprintf(w, "  %6d  %s → %s\n", x.Count, x.Gold, x.Predicted)
		}
	}
}

// evalTermsOptions are the flags of eval terms.
type evalTermsOptions struct {
	in       inputFlags
	rules    ruleFlags
	goldPath string
	to       string
	minFreq  int
}

func newEvalTermsCmd() *cobra.Command {
	o := &evalTermsOptions{}
	cmd := &cobra.Command{
		Use:   "terms --gold LIST.tsv [flags] INPUT...",
		Short: "Score term extraction against a gold term list",
		Long: `Runs the term extraction and scores it as term-extraction research does: the
lower-cased surface forms of the candidates (their variants) are compared as
sets with the gold list (one term per line, an optional tab and label after
it). Prints precision, recall and F1 of the default list, and the best F1 over
all cut-offs of the full ranking with the rank where it is reached.`,
		RunE: validateThenRun(o.validate, o.run),
	}
	o.in.register(cmd, true)
	o.rules.register(cmd, "terms")
	cmd.Flags().StringVar(&o.goldPath, "gold", "", "gold term list (TSV: term, tab, optional label)")
	cmd.Flags().StringVar(&o.to, "to", "text", "output: "+strings.Join(reportFormats, " or "))
	cmd.Flags().IntVar(&o.minFreq, "min-freq", 1, "minimum frequency of the default list, as for the terms command")
	completeChoices(cmd, "to", reportFormats)
	return cmd
}

// validate checks every flag value before any input is read.
func (o *evalTermsOptions) validate(cmd *cobra.Command, args []string) error {
	if err := o.in.validate(cmd); err != nil {
		return err
	}
	if o.goldPath == "" {
		return usageError("--gold is required")
	}
	if err := checkChoice("to", o.to, reportFormats); err != nil {
		return err
	}
	if err := checkRange("min-freq", int64(o.minFreq), 1, -1); err != nil {
		return err
	}
	return needInputs(args)
}

func (o *evalTermsOptions) run(args []string) error {
	f, err := os.Open(o.goldPath)
	if err != nil {
		return usageError("--gold %s: cannot open: %s", o.goldPath, read.Describe(err))
	}
	gold, err := terms.ReadGold(f, o.goldPath)
	f.Close()
	if err != nil {
		return err
	}
	rs, m, err := o.rules.matcher("terms")
	if err != nil {
		return err
	}
	model, err := loadModel(o.in.model)
	if err != nil {
		return err
	}
	if err := checkTags(rs, model); err != nil {
		return err
	}
	col := terms.NewCollector(m, terms.Options{})
	corpus := terms.NewCorpus(0)
	o.in.reuseTokens = true // Collect and Add copy what they keep
	_, runErr := runDocs(&o.in, args, model, col.Collect, func(_ *doc.Document, dc *terms.DocCounts) { corpus.Add(dc); dc.Release() })
	if corpus.Documents() == 0 || corpus.Tokens() == 0 {
		if runErr != nil {
			return runErr
		}
		return exitError{1, "no words read from the inputs: nothing to evaluate"}
	}
	ts := corpus.Terms(terms.ModelReference(model))
	full, err := terms.Rank(ts, terms.RankOptions{MinFreq: 1, All: true})
	if err != nil {
		return err
	}
	def, err := terms.Rank(full, terms.RankOptions{MinFreq: o.minFreq})
	if err != nil {
		return err
	}
	ev := terms.Evaluate(full, -1, gold)
	ev.Default = terms.Evaluate(def, len(def), gold).Default
	w := bufio.NewWriter(os.Stdout)
	if o.to == "json" {
		writeJSON(w, ev)
	} else {
		fmt.Fprintf(w, "gold terms: %d; candidates ranked: %d; default list: %d\n", ev.Gold, len(full), len(def))
		tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
		fmt.Fprintf(tw, "\tcandidates\tforms\tcorrect\tprecision\trecall\tF1\t\n")
		for _, s := range []struct {
			name string
			s    terms.Scores
		}{{"default list", ev.Default}, {"best cut-off", ev.Best}} {
			fmt.Fprintf(tw, "%s\t%d\t%d\t%d\t%.3f\t%.3f\t%.3f\t\n", s.name, s.s.Rank, s.s.Extracted, s.s.Correct, s.s.Precision, s.s.Recall, s.s.F1)
		}
		tw.Flush()
	}
	if err := w.Flush(); err != nil {
		return exitError{1, fmt.Sprintf("writing the report: %v", err)}
	}
	return runErr
}
