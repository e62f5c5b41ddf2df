package main

import (
	"fmt"
	"os"
	"strings"

	"github.com/spf13/cobra"

	"glossmith/extract/colloc"
	"glossmith/extract/measure"
	"glossmith/grammar"
	"glossmith/pattern"
	"glossmith/tagger/doc"
)

// collocationsOptions are the flags of the collocations command.
type collocationsOptions struct {
	in        inputFlags
	rules     ruleFlags
	relations []string
	window    int
	by        string
	measure   string
	minFreq   int64
	node      string
	to        string
	outPath   string
	bom       bool
	limit     int

	ms  measure.Measure // the --measure, looked up by validate
	key colloc.By       // the --by, looked up by validate
}

func newCollocationsCmd() *cobra.Command {
	o := &collocationsOptions{}
	cmd := &cobra.Command{
		Use:     "collocations [flags] INPUT...",
		Aliases: []string{"colloc"},
		Short:   "Rank typical word pairs by association measures",
		Long: `Counts word pairs and ranks them by how much more often they occur together
than chance predicts.

Pairs come from the @node and @collocate slots of relation rules — the stock "pairs"
set has adj_noun, noun_noun, verb_obj, adv_adj, verb_particle and noun_of_noun —
or, with --window N, from content words at most N tokens apart in a sentence.
Pairs are counted on lemmas (--by word counts word forms). For each relation
the counts f(x,y), f(x), f(y) and N are taken over that relation's pairs only,
so every measure reads one consistent 2×2 contingency table.

Measures (every one is a column; --measure sorts):
  ` + measureHelp(),
		Example: `  glossmith collocations testdata/demo
  glossmith collocations --relation verb_obj --measure logdice testdata/demo
  glossmith collocations --node valve --to tsv manuals/
  glossmith collocations --window 3 --min-freq 3 notes/`,
		RunE: validateThenRun(o.validate, o.run),
	}
	o.register(cmd)
	return cmd
}

// byKeys are the values of collocations --by.
var byKeys = []string{"lemma", "word"}

func (o *collocationsOptions) register(cmd *cobra.Command) {
	o.in.register(cmd, true)
	o.rules.register(cmd, "pairs")
	fl := cmd.Flags()
	fl.StringArrayVar(&o.relations, "relation", nil, "count only this relation (rule name; repeatable)")
	fl.IntVar(&o.window, "window", 0, fmt.Sprintf("count content words at most N tokens apart (1 to %d) instead of relation rules", maxWindow))
	fl.StringVar(&o.by, "by", "lemma", "count "+strings.Join(byKeys, " or "))
	fl.StringVar(&o.measure, "measure", "g2", "sort by this measure: "+strings.Join(measure.Names(), ", "))
	fl.Int64Var(&o.minFreq, "min-freq", 2, "leave out pairs seen fewer times")
	fl.StringVar(&o.node, "node", "", "only pairs whose @node is this word (window pairs: either word)")
	fl.StringVar(&o.to, "to", "text", "output format: "+strings.Join(colloc.Formats, ", ")+" (default: from the -o extension, else text)")
	fl.StringVarP(&o.outPath, "output", "o", "", "write to this file (complete or not at all) instead of standard output")
	fl.BoolVar(&o.bom, "bom", false, bomUsage)
	fl.IntVar(&o.limit, "limit", 0, "print at most this many pairs (0: no limit)")
	completeChoices(cmd, "to", colloc.Formats)
	completeChoices(cmd, "by", byKeys)
	completeChoices(cmd, "measure", measure.Names())
}

// maxWindow bounds --window: counting is proportional to the window, and
// association beyond a few dozen words is not a collocation.
const maxWindow = 50

// validate checks every flag value before any input is read.
func (o *collocationsOptions) validate(cmd *cobra.Command, args []string) error {
	if err := o.in.validateWithOutput(cmd, &o.to, o.outPath, colloc.Formats); err != nil {
		return err
	}
	o.measure = strings.ToLower(o.measure)
	if err := checkChoice("measure", o.measure, measure.Names()); err != nil {
		return err
	}
	ms, err := measure.Lookup(o.measure)
	if err != nil {
		return err
	}
	o.ms = ms
	if err := checkChoice("by", o.by, byKeys); err != nil {
		return err
	}
	o.key = colloc.ByLemma
	if o.by == "word" {
		o.key = colloc.ByWord
	}
	if cmd.Flags().Changed("window") {
		if err := checkRange("window", int64(o.window), 1, maxWindow); err != nil {
			return err
		}
	}
	if err := checkRange("min-freq", o.minFreq, 1, -1); err != nil {
		return err
	}
	if err := checkRange("limit", int64(o.limit), 0, -1); err != nil {
		return err
	}
	return needInputs(args)
}

func (o *collocationsOptions) run(args []string) error {
	var (
		m  *pattern.Matcher
		rs *grammar.RuleSet
	)
	if o.window == 0 {
		var err error
		rs, err = o.rules.load("pairs")
		if err != nil {
			return err
		}
		names := append(append([]string(nil), o.rules.names...), o.relations...)
		if err := colloc.CheckRelations(rs, names...); err != nil {
			printGrammarErrors(os.Stderr, err)
			return exitError{2, "the relation rules have no @node and @collocate slots"}
		}
		if m, err = pattern.Compile(rs, names...); err != nil {
			return err
		}
	}
	model, err := loadModel(o.in.model)
	if err != nil {
		return err
	}
	if rs != nil {
		if err := checkTags(rs, model); err != nil {
			return err
		}
	}
	count := func(d *doc.Document) *colloc.Counter {
		c := colloc.NewCounter()
		for i := range d.Sentences {
			toks := d.Sentences[i].Tokens
			if m == nil {
				colloc.WindowPairs(toks, o.window, o.key, nil, c.Add)
				continue
			}
			for _, mt := range m.FindAll(toks) {
				if p, ok := colloc.SlotPair(mt.Rule, toks, mt.Slots, o.key); ok {
					c.Add(p)
				}
			}
		}
		return c
	}
	total := colloc.NewCounter()
	total.SetBudget(o.in.tableBudget())
	o.in.reuseTokens = true // pairs hold strings, not tokens
	st, runErr := runDocs(&o.in, args, model, count, func(_ *doc.Document, c *colloc.Counter) { total.Merge(c) })
	if p := total.Pruned(); p.Pairs > 0 {
		o.in.warnPruned("pairs", p.Pairs, p.MaxFreq)
	}
	if st.Documents == 0 {
		return runErr // nothing read: an existing output file is kept
	}
	rows := total.Rank(colloc.RankOptions{Measure: o.ms, MinFreq: o.minFreq, Node: o.node, Limit: o.limit})
	out, err := openOutput(o.outPath)
	if err != nil {
		return err
	}
	if err := out.commit(colloc.WriteOptions(out, o.to, rows, o.ms.Name, o.bom)); err != nil {
		return err
	}
	return runErr
}

func measureHelp() string {
	var b strings.Builder
	for i, m := range measure.All() {
		if i > 0 {
			b.WriteString("\n  ")
		}
		fmt.Fprintf(&b, "%-9s %s", m.Name, m.Title)
	}
	return b.String()
}
