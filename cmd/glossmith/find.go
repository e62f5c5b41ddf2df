package main

import (
	"os"
	"strings"

	"github.com/spf13/cobra"

	"glossmith/extract/concord"
	"glossmith/grammar"
	"glossmith/pattern"
	"glossmith/tagger/doc"
)

// findOptions are the flags of the find command.
type findOptions struct {
	in     inputFlags
	rules  ruleFlags
	count  bool
	by     string
	to     string
	width  int
	nested bool
	limit  int
	color  string
}

func newFindCmd() *cobra.Command {
	o := &findOptions{}
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
			if err := o.validate(cmd, args); err != nil {
				return err
			}
			return o.run(cmd, args)
		},
	}
	o.register(cmd)
	return cmd
}

// findFormats are the output formats of find.
var findFormats = []string{"text", "tsv", "jsonl"}

// countKeys are the values of find --by.
var countKeys = []string{"word", "lemma"}

func (o *findOptions) register(cmd *cobra.Command) {
	o.in.register(cmd, true)
	fl := cmd.Flags()
	fl.StringArrayVar(&o.rules.files, "rules", nil, "rule file whose rules the pattern may name, or stock:NAME (repeatable)")
	fl.StringArrayVar(&o.rules.names, "rule", nil, "match this named rule instead of a pattern (repeatable)")
	fl.BoolVar(&o.count, "count", false, "print a frequency list of the matched strings")
	fl.StringVar(&o.by, "by", "word", "with --count: count "+strings.Join(countKeys, " or "))
	fl.StringVar(&o.to, "to", "text", "output format: "+strings.Join(findFormats, ", "))
	fl.IntVar(&o.width, "width", 40, "characters of context on each side (text output)")
	fl.BoolVar(&o.nested, "nested", false, "report every matching span, not only leftmost-longest ones")
	fl.IntVar(&o.limit, "limit", 0, "print at most this many lines (0: no limit)")
	fl.StringVar(&o.color, "color", "auto", "highlight matches: auto (on a terminal, unless NO_COLOR is set or TERM=dumb), always, never")
	completeRuleFiles(cmd)
	completeChoices(cmd, "to", findFormats)
	completeChoices(cmd, "by", countKeys)
	completeChoices(cmd, "color", colorModes)
}

// maxWidth bounds --width: a context wider than a screen is a paragraph.
const maxWidth = 1000

// validate checks every flag value before any input is read.
func (o *findOptions) validate(cmd *cobra.Command, args []string) error {
	if err := o.in.validate(cmd); err != nil {
		return err
	}
	for _, c := range []struct {
		flag, v string
		valid   []string
	}{
		{"to", o.to, findFormats}, {"by", o.by, countKeys}, {"color", o.color, colorModes},
	} {
		if err := checkChoice(c.flag, c.v, c.valid); err != nil {
			return err
		}
	}
	if err := checkRange("limit", int64(o.limit), 0, -1); err != nil {
		return err
	}
	if err := checkRange("width", int64(o.width), 1, maxWidth); err != nil {
		return err
	}
	if len(o.rules.names) == 0 {
		if len(args) == 0 {
			return usageError("give a PATTERN or --rule NAME, then the inputs")
		}
		args = args[1:]
	}
	return needInputs(args)
}

// matcher compiles the pattern (the first argument) or the --rule rules,
// and returns the arguments left: the inputs.
func (o *findOptions) matcher(args []string) (*pattern.Matcher, []string, error) {
	var (
		rs  *grammar.RuleSet
		err error
	)
	if len(o.rules.files) > 0 {
		if rs, err = grammar.Load(o.rules.files...); err != nil {
			printGrammarErrors(os.Stderr, err)
			return nil, nil, exitError{2, "the rules did not load"}
		}
	}
	var m *pattern.Matcher
	if len(o.rules.names) > 0 {
		if rs == nil {
			if rs, err = grammar.LoadStock(grammar.StockNames()...); err != nil {
				return nil, nil, err
			}
		}
		m, err = pattern.Compile(rs, o.rules.names...)
	} else {
		m, err = pattern.CompilePattern(args[0], rs)
		args = args[1:]
	}
	if err != nil {
		printGrammarErrors(os.Stderr, err)
		return nil, nil, exitError{2, "the pattern did not compile"}
	}
	return m, args, nil
}

func (o *findOptions) run(cmd *cobra.Command, args []string) error {
	m, args, err := o.matcher(args)
	if err != nil {
		return err
	}
	model, err := loadModel(o.in.model)
	if err != nil {
		return err
	}
	find := m.FindAll
	if o.nested {
		find = m.FindNested
	}
	lemma := o.by == "lemma"
	type result struct {
		hits   []concord.Hit
		counts *concord.Counter
	}
	var hits []concord.Hit
	total := concord.NewCounter()
	mapFn := func(d *doc.Document) result {
		var r result
		if o.count {
			r.counts = concord.NewCounter()
		}
		for si := range d.Sentences {
			toks := d.Sentences[si].Tokens
			for _, mt := range find(toks) {
				if o.count {
					r.counts.Add(concord.Key(toks, mt.Start, mt.End, lemma))
				} else {
					r.hits = append(r.hits, concord.NewHit(d, si, mt.Start, mt.End, mt.Rule, mt.Slots))
				}
			}
		}
		return r
	}
	_, runErr := runDocs(&o.in, args, model, mapFn, func(_ *doc.Document, r result) {
		if o.count {
			total.Merge(r.counts)
		} else if o.limit <= 0 || len(hits) < o.limit {
			hits = append(hits, r.hits...)
		}
	})
	if o.limit > 0 && len(hits) > o.limit {
		hits = hits[:o.limit]
	}
	switch {
	case o.count:
		list := total.Sorted()
		if o.limit > 0 && len(list) > o.limit {
			list = list[:o.limit]
		}
		err = concord.WriteCounts(os.Stdout, o.to, list)
	case o.to == "text":
		hl := useColor(o.color, isTerminal(os.Stdout))
		err = concord.WriteText(os.Stdout, hits, concord.Style{Width: o.width, Highlight: hl})
	case o.to == "tsv":
		err = concord.WriteTSV(os.Stdout, hits)
	case o.to == "jsonl":
		err = concord.WriteJSONL(os.Stdout, hits)
	}
	if err != nil {
		return err
	}
	return runErr
}
