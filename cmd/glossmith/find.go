package main

import (
	"fmt"
	"os"

	"github.com/mattn/go-isatty"
	"github.com/spf13/cobra"

	"glossmith/extract/concord"
	"glossmith/grammar"
	"glossmith/pattern"
	"glossmith/tagger/doc"
)

func newFindCmd() *cobra.Command {
	var (
		in     inputFlags
		rules  ruleFlags
		count  bool
		by     string
		to     string
		width  int
		nested bool
		limit  int
		color  string
	)
	cmd := &cobra.Command{
		Use:   "find [flags] PATTERN INPUT...\n  glossmith find [flags] --rule NAME INPUT...",
		Short: "Show every match of a pattern as a concordance line, or count matches",
		Long: `Matches a pattern of glossmith's pattern language (or named rules with --rule)
against tagged sentences and prints every match as a concordance line: the
document and line, the left context, the match, the right context. On a
terminal the match is highlighted.

Matches never cross a sentence boundary. By default each rule reports its
leftmost-longest, non-overlapping matches; --nested reports every span that
matches (sub-phrases too).

--count prints a frequency list of the matched strings instead (--by word or
lemma, lower-cased) — an n-gram list is "find --count '_ _'".`,
		Example: `  glossmith find 'ADJ+ NOUN' testdata/demo
  glossmith find '"replace" DET? _* NOUN' testdata/demo
  glossmith find --rule verb_obj --rules stock:pairs --to jsonl testdata/demo
  glossmith find --count --by lemma 'NOUN NOUN' testdata/demo
  glossmith find --count '_ _ _' notes.txt              # trigram frequency list`,
		RunE: func(cmd *cobra.Command, args []string) error {
			var (
				rs  *grammar.RuleSet
				err error
			)
			if len(rules.files) > 0 {
				if rs, err = grammar.Load(rules.files...); err != nil {
					printGrammarErrors(os.Stderr, err)
					return exitError{2, "the rules did not load"}
				}
			}
			var m *pattern.Matcher
			if len(rules.names) > 0 {
				if rs == nil {
					if rs, err = grammar.LoadStock(grammar.StockNames()...); err != nil {
						return err
					}
				}
				m, err = pattern.Compile(rs, rules.names...)
			} else {
				if len(args) == 0 {
					return fmt.Errorf("give a PATTERN or --rule NAME")
				}
				m, err = pattern.CompilePattern(args[0], rs)
				args = args[1:]
			}
			if err != nil {
				printGrammarErrors(os.Stderr, err)
				return exitError{2, "the pattern did not compile"}
			}
			model, err := loadModel(in.model)
			if err != nil {
				return err
			}
			find := m.FindAll
			if nested {
				find = m.FindNested
			}
			lemma := by == "lemma"
			if by != "lemma" && by != "word" {
				return fmt.Errorf("--by %q: want word or lemma", by)
			}
			type result struct {
				hits   []concord.Hit
				counts *concord.Counter
			}
			var hits []concord.Hit
			total := concord.NewCounter()
			mapFn := func(d *doc.Document) result {
				var r result
				if count {
					r.counts = concord.NewCounter()
				}
				for si := range d.Sentences {
					toks := d.Sentences[si].Tokens
					for _, mt := range find(toks) {
						if count {
							r.counts.Add(concord.Key(toks, mt.Start, mt.End, lemma))
						} else {
							r.hits = append(r.hits, concord.NewHit(d, si, mt.Start, mt.End, mt.Rule, mt.Slots))
						}
					}
				}
				return r
			}
			_, runErr := runDocs(&in, args, model, mapFn, func(_ *doc.Document, r result) {
				if count {
					total.Merge(r.counts)
				} else if limit <= 0 || len(hits) < limit {
					hits = append(hits, r.hits...)
				}
			})
			if limit > 0 && len(hits) > limit {
				hits = hits[:limit]
			}
			switch {
			case count:
				list := total.Sorted()
				if limit > 0 && len(list) > limit {
					list = list[:limit]
				}
				err = concord.WriteCounts(os.Stdout, to, list)
			case to == "text":
				hl := color == "always" || color == "auto" && isatty.IsTerminal(os.Stdout.Fd())
				err = concord.WriteText(os.Stdout, hits, concord.Style{Width: width, Highlight: hl})
			case to == "tsv":
				err = concord.WriteTSV(os.Stdout, hits)
			case to == "jsonl":
				err = concord.WriteJSONL(os.Stdout, hits)
			default:
				return fmt.Errorf("--to %q: want text, tsv or jsonl", to)
			}
			if err != nil {
				return err
			}
			return runErr
		},
	}
	in.register(cmd, true)
	fl := cmd.Flags()
	fl.StringArrayVar(&rules.files, "rules", nil, "rule file whose rules the pattern may name, or stock:NAME (repeatable)")
	fl.StringArrayVar(&rules.names, "rule", nil, "match this named rule instead of a pattern (repeatable)")
	fl.BoolVar(&count, "count", false, "print a frequency list of the matched strings")
	fl.StringVar(&by, "by", "word", "with --count: count word or lemma")
	fl.StringVar(&to, "to", "text", "output format: text, tsv, jsonl")
	fl.IntVar(&width, "width", 40, "characters of context on each side (text output)")
	fl.BoolVar(&nested, "nested", false, "report every matching span, not only leftmost-longest ones")
	fl.IntVar(&limit, "limit", 0, "print at most this many lines")
	fl.StringVar(&color, "color", "auto", "highlight matches: auto (on a terminal), always, never")
	return cmd
}
