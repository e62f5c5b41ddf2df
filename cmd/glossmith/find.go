package main

import (
	"context"
	"errors"
	"os"
	"strings"
	"syscall"

	"github.com/spf13/cobra"

	"glossmith/extract/concord"
	"glossmith/extract/terms"
	"glossmith/grammar"
	"glossmith/pattern"
	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
	"glossmith/tagger/pipeline"
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
	bom    bool
	// outPath is the -o file; "" or "-" for standard output.
	outPath string
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
matches (sub-phrases too) up to the longest span terms looks at (45 tokens).

--count prints a frequency list of the matched strings instead (--by word or
lemma; lower-cased except acronyms, units and mixed-case words: "AC", "kPa")
— an n-gram list is "find --count '_ _'".`,
		Example: `  glossmith find 'ADJ+ NOUN' testdata/demo
  glossmith find '"replace" DET? _* NOUN' testdata/demo
  glossmith find --rule verb_obj --rules stock:pairs --to jsonl testdata/demo
  glossmith find --count --by lemma 'NOUN NOUN' testdata/demo
  glossmith find --count '_ _ _' notes.txt              # trigram frequency list`,
		RunE: validateThenRun(o.validate, o.run),
	}
	o.register(cmd)
	return cmd
}

// findFormats are the output formats of find.
var findFormats = concord.HitFormats

// countKeys are the values of find --by.
var countKeys = []string{"word", "lemma"}

func (o *findOptions) register(cmd *cobra.Command) {
	o.in.register(cmd, true)
	fl := cmd.Flags()
	fl.StringArrayVar(&o.rules.files, "rules", nil, "rule file whose rules the pattern may name, or stock:NAME (repeatable)")
	fl.StringArrayVar(&o.rules.names, "rule", nil, "match this named rule instead of a pattern (repeatable)")
	fl.BoolVar(&o.count, "count", false, "print a frequency list of the matched strings")
	fl.StringVar(&o.by, "by", "word", "with --count: count "+strings.Join(countKeys, " or "))
	fl.StringVar(&o.to, "to", "text", "output format: "+strings.Join(findFormats, ", ")+" (default: from the -o extension, else text)")
	fl.IntVar(&o.width, "width", 40, "terminal columns of context on each side (text output)")
	fl.BoolVar(&o.nested, "nested", false, "report every matching span, not only leftmost-longest ones")
	fl.IntVar(&o.limit, "limit", 0, "print at most this many lines and stop reading (0: no limit)")
	fl.StringVarP(&o.outPath, "output", "o", "", "write to this file (complete or not at all) instead of standard output")
	fl.StringVar(&o.color, "color", "auto", "highlight matches: auto (on a terminal, unless NO_COLOR is set or TERM=dumb), always, never")
	fl.BoolVar(&o.bom, "bom", false, bomUsage)
	completeRuleFiles(cmd)
	completeChoices(cmd, "to", findFormats)
	completeChoices(cmd, "by", countKeys)
	completeChoices(cmd, "color", colorModes)
}

// maxWidth bounds --width: a context wider than a screen is a paragraph.
const maxWidth = 1000

// validate checks every flag value before any input is read.
func (o *findOptions) validate(cmd *cobra.Command, args []string) error {
	if err := o.in.validateWithOutput(cmd, &o.to, o.outPath, findFormats); err != nil {
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
func (o *findOptions) matcher(args []string) (*pattern.Matcher, *grammar.RuleSet, []string, error) {
	var (
		rs  *grammar.RuleSet
		err error
	)
	if len(o.rules.files) > 0 {
		if rs, err = grammar.Load(o.rules.files...); err != nil {
			printGrammarErrors(os.Stderr, err)
			return nil, nil, nil, exitError{2, "the rules did not load"}
		}
	}
	var m *pattern.Matcher
	if len(o.rules.names) > 0 {
		if rs == nil {
			if rs, err = grammar.LoadStock(grammar.StockNames()...); err != nil {
				return nil, nil, nil, err
			}
		}
		m, err = pattern.Compile(rs, o.rules.names...)
	} else {
		m, err = pattern.CompilePattern(args[0], rs)
		if err == nil {
			// The pattern compiled, so it parses: the set with it is
			// what its fine tags are checked in.
			rs, err = grammar.ParsePattern(args[0], rs)
		}
		args = args[1:]
	}
	if err != nil {
		printGrammarErrors(os.Stderr, err)
		return nil, nil, nil, exitError{2, "the pattern did not compile"}
	}
	return m, rs, args, nil
}

func (o *findOptions) run(args []string) error {
	m, rs, args, err := o.matcher(args)
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
	find := m.FindAll
	if o.nested {
		// Spans no longer than terms looks at: their number grows with the
		// square of a run of matching tokens otherwise.
		find = func(toks []doc.Token) []pattern.Match {
			return m.FindNestedWithin(toks, terms.SpanLimit(terms.DefaultMaxWords))
		}
	}
	out, err := openOutput(o.outPath)
	if err != nil {
		return err
	}
	defer out.abort()
	o.in.reuseTokens = true // hits and counts hold strings, not tokens
	if o.count {
		return o.runCount(out, find, args, model)
	}
	hw, err := concord.NewHitWriter(out, o.to, concord.Style{Width: o.width, Highlight: useColor(o.color, out.toTerminal()), BOM: o.bom})
	if err != nil {
		return err
	}
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	o.in.ctx = ctx
	mapFn := func(d *doc.Document) []concord.Hit {
		var hits []concord.Hit
		for si := range d.Sentences {
			toks := d.Sentences[si].Tokens
			for _, mt := range find(toks) {
				hits = append(hits, concord.NewHit(d, si, mt.Start, mt.End, mt.Rule, mt.Slots))
			}
		}
		return hits
	}
	// Hits are written as each document is reduced, in input order, and
	// each document's lines are flushed at once: a reader (a terminal,
	// "head") sees them while the search goes on, and a closed pipe or a
	// full disk ends the run at the next document with hits.
	written := 0
	var werr error
	st, runErr := runDocs(&o.in, args, model, mapFn, func(_ *doc.Document, hits []concord.Hit) {
		if werr != nil || len(hits) == 0 {
			return
		}
		if o.limit > 0 && written+len(hits) >= o.limit {
			hits = hits[:o.limit-written]
			cancel() // enough: read no further
		}
		written += len(hits)
		werr = hw.Write(hits)
		if werr == nil {
			werr = hw.Flush()
		}
		if werr != nil {
			cancel()
		}
	})
	if werr == nil {
		werr = hw.Flush()
	}
	return o.finish(out, st, werr, runErr)
}

// finish commits the output unless nothing was read (an existing file is
// then kept) or writing failed; a reader that went away (a closed pipe)
// ends the run quietly.
func (o *findOptions) finish(out *output, st pipeline.Stats, werr, runErr error) error {
	if errors.Is(werr, syscall.EPIPE) {
		return exitError{code: 1}
	}
	if werr == nil && st.Documents == 0 {
		return runErr
	}
	if err := out.commit(werr); err != nil {
		return err
	}
	return runErr
}

// runCount prints the frequency list of the matched strings.
func (o *findOptions) runCount(out *output, find func([]doc.Token) []pattern.Match, args []string, model *hmm.Model) error {
	lemma := o.by == "lemma"
	total := concord.NewCounter()
	mapFn := func(d *doc.Document) *concord.Counter {
		c := concord.NewCounter()
		for si := range d.Sentences {
			toks := d.Sentences[si].Tokens
			for _, mt := range find(toks) {
				c.Add(concord.Key(toks, mt.Start, mt.End, lemma))
			}
		}
		return c
	}
	st, runErr := runDocs(&o.in, args, model, mapFn, func(_ *doc.Document, c *concord.Counter) { total.Merge(c) })
	list := total.Sorted()
	if o.limit > 0 && len(list) > o.limit {
		list = list[:o.limit]
	}
	return o.finish(out, st, concord.WriteCounts(out, o.to, list, o.bom), runErr)
}
