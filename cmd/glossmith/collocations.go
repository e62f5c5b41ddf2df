package main

import (
	"fmt"
	"strings"

	"github.com/spf13/cobra"

	"glossmith/extract/colloc"
	"glossmith/extract/measure"
	"glossmith/pattern"
	"glossmith/tagger/doc"
)

func newCollocationsCmd() *cobra.Command {
	var (
		in        inputFlags
		rules     ruleFlags
		relations []string
		window    int
		by        string
		measureN  string
		minFreq   int64
		node      string
		to        string
		outPath   string
		limit     int
	)
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
		RunE: func(cmd *cobra.Command, args []string) error {
			ms, err := measure.Lookup(measureN)
			if err != nil {
				return err
			}
			var key colloc.By
			switch by {
			case "lemma":
				key = colloc.ByLemma
			case "word":
				key = colloc.ByWord
			default:
				return fmt.Errorf("--by %q: want lemma or word", by)
			}
			var m *pattern.Matcher
			if window <= 0 {
				rs, err := rules.load("pairs")
				if err != nil {
					return err
				}
				names := append(append([]string(nil), rules.names...), relations...)
				if m, err = pattern.Compile(rs, names...); err != nil {
					return err
				}
			}
			model, err := loadModel(in.model)
			if err != nil {
				return err
			}
			count := func(d *doc.Document) *colloc.Counter {
				c := colloc.NewCounter()
				for i := range d.Sentences {
					toks := d.Sentences[i].Tokens
					if m == nil {
						colloc.WindowPairs(toks, window, key, nil, c.Add)
						continue
					}
					for _, mt := range m.FindAll(toks) {
						if p, ok := colloc.SlotPair(mt.Rule, toks, mt.Slots, key); ok {
							c.Add(p)
						}
					}
				}
				return c
			}
			total := colloc.NewCounter()
			total.SetBudget(in.tableBudget())
			in.reuseTokens = true // pairs hold strings, not tokens
			_, runErr := runDocs(&in, args, model, count, func(_ *doc.Document, c *colloc.Counter) { total.Merge(c) })
			if p := total.Pruned(); p.Pairs > 0 {
				in.notePruned("pairs", p.Pairs, p.MaxFreq)
			}
			rows := total.Rank(colloc.RankOptions{Measure: ms, MinFreq: minFreq, Node: node, Limit: limit})
			out, err := openOutput(outPath)
			if err != nil {
				return err
			}
			if err := out.commit(colloc.Write(out, to, rows, ms.Name)); err != nil {
				return err
			}
			return runErr
		},
	}
	in.register(cmd, true)
	rules.register(cmd, "pairs")
	fl := cmd.Flags()
	fl.StringArrayVar(&relations, "relation", nil, "count only this relation (rule name; repeatable)")
	fl.IntVar(&window, "window", 0, "count content words at most N tokens apart instead of relation rules")
	fl.StringVar(&by, "by", "lemma", "count lemma or word")
	fl.StringVar(&measureN, "measure", "g2", "sort by this measure: "+strings.Join(measure.Names(), ", "))
	fl.Int64Var(&minFreq, "min-freq", 2, "leave out pairs seen fewer times")
	fl.StringVar(&node, "node", "", "only pairs whose @node is this word (window pairs: either word)")
	fl.StringVar(&to, "to", "text", "output format: "+strings.Join(colloc.Formats, ", "))
	fl.StringVarP(&outPath, "output", "o", "", "write to this file (complete or not at all) instead of standard output")
	fl.IntVar(&limit, "limit", 0, "print at most this many pairs")
	return cmd
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
