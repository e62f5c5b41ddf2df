package main

import (
	"bufio"
	"fmt"
	"os"
	"slices"
	"strings"

	"github.com/spf13/cobra"

	"glossmith/extract/termbase"
	"glossmith/extract/terms"
	"glossmith/grammar"
	"glossmith/pattern"
	"glossmith/tagger/doc"
)

// ruleFlags select the rules a command matches with.
type ruleFlags struct {
	files []string
	names []string
}

func (r *ruleFlags) register(cmd *cobra.Command, what string) {
	cmd.Flags().StringArrayVar(&r.files, "rules", nil, "rule file (.gsr) to use instead of the stock "+what+" rules (repeatable)")
	cmd.Flags().StringArrayVar(&r.names, "rule", nil, "use only this rule of the set (repeatable)")
	completeRuleFiles(cmd)
}

// load returns the rule set: the user's files, or the named stock set.
func (r *ruleFlags) load(stock string) (*grammar.RuleSet, error) {
	if len(r.files) > 0 {
		return grammar.Load(r.files...)
	}
	return grammar.LoadStock(stock)
}

// matcher loads the rules (the user's files or the stock set) and compiles
// the selected rules, or all of them.
func (r *ruleFlags) matcher(stock string) (*grammar.RuleSet, *pattern.Matcher, error) {
	rs, err := r.load(stock)
	if err != nil {
		return nil, nil, err
	}
	m, err := pattern.Compile(rs, r.names...)
	return rs, m, err
}

// termsOptions are the flags of the terms command.
type termsOptions struct {
	in        inputFlags
	rules     ruleFlags
	reference []string
	to        string
	outPath   string
	bom       bool
	lang      string
	color     string
	sortKey   string
	minFreq   int
	maxWords  int
	contexts  int
	stopFiles []string
	include   string
	exclude   string
	all       bool
	limit     int
	tb        termsTermbase // --termbase, --new, --record (termbase_terms.go)
}

func newTermsCmd() *cobra.Command {
	o := &termsOptions{}
	cmd := &cobra.Command{
		Use:   "terms [flags] INPUT...",
		Short: "Rank term candidates with their variants, counts, measures and contexts",
		Long: `Finds term candidates with the stock "terms" rules (or --rules), groups their
variants under a canonical form (head lemmatized, case folded except acronyms,
units, mixed-case words and names, hyphen/space/no-space spellings unified),
measures them and ranks
them, best first.

Measures (each a column, each a --sort key):
  freq       occurrences, nested ones included
  docs       documents the candidate occurs in
  dp         Gries' deviation of proportions over documents (0 = evenly spread)
  cvalue     C-value over nested candidates (Frantzi et al. 2000), log2(|a|+1) weight
  keyness    signed log-likelihood keyness (Rayson and Garside 2000) of the
             candidate's least specific word (lowest weirdness) against the
             reference: the tagger's training treebank pooled with
             WordNet's sense-tagged Brown corpus counts, unless --reference
             names documents
  weirdness  smoothed weirdness ratio (Ahmad et al. 1999) of that same least
             specific word
  score      ln(1+freq) · (ln(weirdness) · damping + unit): damping is 0
             for document-structure words, those a number or label follows
             in at least 20% of their uses ("Figure 3", "Table 2"), else 1;
             unit is +1.5 for a phrase seen twice or more, -6 for a phrase
             mostly inside one longer candidate or of more than 3 words
             (see README)

Other columns: variants; within, the longer candidate this one occurs inside
at least 90% of the time ("drip emitter" for "drip"; in TBX a note, and in
TBX-Basic a cross-reference when that candidate is listed); acronym
and full_form, where the documents define an acronym ("vapour pressure deficit
(VPD)", Schwartz and Hearst 2003): the full form's line pools the acronym's
frequency, documents and spellings and is shown as "vapour pressure deficit
(VPD)"; the acronym keeps its own line, "VPD (vapour pressure deficit)"; in TBX
both are one entry, the terms typed fullForm and acronym.

The default list ends where the score falls below 2.5; --all prints every
candidate. The list is a set of candidates for expert review, not a
validated terminology.`,
		Example: `  glossmith terms testdata/demo
  glossmith terms --contexts 2 --limit 30 manuals/
  glossmith terms -o glossary.tbx manuals/*.docx
  glossmith terms --reference general-texts/ --sort keyness specs/`,
		RunE: validateThenRun(o.validate, o.run),
	}
	o.register(cmd)
	return cmd
}

func (o *termsOptions) register(cmd *cobra.Command) {
	o.in.register(cmd, true)
	o.rules.register(cmd, "terms")
	fl := cmd.Flags()
	fl.StringArrayVar(&o.reference, "reference", nil, "general-language reference documents (default: the model's treebank and WordNet concordance counts)")
	fl.StringVar(&o.to, "to", "text", "output format: "+strings.Join(termsFormats, ", ")+" (default: from the -o extension, else text; html is a page for a reviewer, see review)")
	fl.StringVarP(&o.outPath, "output", "o", "", "write to this file (complete or not at all) instead of standard output")
	fl.BoolVar(&o.bom, "bom", false, bomUsage)
	fl.StringVar(&o.lang, "lang", "en", "tbx, tbx-basic: the documents' language (BCP 47), written as xml:lang; the embedded tagging model is English")
	fl.StringVar(&o.sortKey, "sort", "score", "sort by: "+strings.Join(terms.SortKeys, ", "))
	fl.IntVar(&o.minFreq, "min-freq", 1, "leave out candidates seen fewer times (the score cut-off already holds back rare ones)")
	fl.IntVar(&o.maxWords, "max-words", terms.DefaultMaxWords, "leave out phrases longer than this many words, and their parts")
	fl.IntVar(&o.contexts, "contexts", 3, "example sentences per term, in every format that has them (text output prints them only when this flag is given)")
	fl.StringVar(&o.color, "color", "auto", "mark the term in text output's example sentences in bold: auto (on a terminal, unless NO_COLOR is set or TERM=dumb), always, never")
	fl.StringArrayVar(&o.stopFiles, "stop", nil, "stop-word file, one word per line: candidates starting or ending with one are left out (repeatable)")
	fl.StringVar(&o.include, "include", "", "list only candidates that the pattern matches whole (in most occurrences); counts stay those of all candidates")
	fl.StringVar(&o.exclude, "exclude", "", "leave out of the list candidates that the pattern matches whole (in most occurrences)")
	fl.BoolVar(&o.all, "all", false, "list every candidate, not only those above the score cut-off")
	fl.IntVar(&o.limit, "limit", 0, "print at most this many terms (0: no limit)")
	o.tb.register(cmd)
	completeChoices(cmd, "to", termsFormats)
	completeChoices(cmd, "sort", terms.SortKeys)
	completeChoices(cmd, "color", colorModes)
}

// termsFormats are the output formats of terms: the term list's own, and
// html, the static review report (extract/review/web).
var termsFormats = append(slices.Clip(terms.Formats), "html")

// validate checks every flag value before any input is read.
func (o *termsOptions) validate(cmd *cobra.Command, args []string) error {
	if err := o.in.validateWithOutput(cmd, &o.to, o.outPath, termsFormats); err != nil {
		return err
	}
	if err := checkLangTag(o.lang); err != nil {
		return err
	}
	if err := checkChoice("color", o.color, colorModes); err != nil {
		return err
	}
	if err := checkChoice("sort", o.sortKey, terms.SortKeys); err != nil {
		return err
	}
	for _, c := range []struct {
		flag   string
		v      int
		lo, hi int64
	}{
		{"min-freq", o.minFreq, 1, -1},
		{"max-words", o.maxWords, 1, maxWordsLimit},
		{"contexts", o.contexts, 0, maxContexts},
		{"limit", o.limit, 0, -1},
	} {
		if err := checkRange(c.flag, int64(c.v), c.lo, c.hi); err != nil {
			return err
		}
	}
	if !cmd.Flags().Changed("contexts") && o.to == "text" {
		o.contexts = 0
	}
	if err := o.tb.validate(); err != nil {
		return err
	}
	return needInputs(args)
}

// Bounds of terms' numeric flags: a candidate of more than 32 words is a
// sentence, and contexts beyond 100 per term are a document.
const (
	maxWordsLimit = 32
	maxContexts   = 100
)

func (o *termsOptions) run(args []string) error {
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
	opt := terms.Options{MaxWords: o.maxWords, Contexts: o.contexts}
	if opt.Stop, err = readStopLists(o.stopFiles); err != nil {
		return err
	}
	if opt.Keep, err = spanFilter(o.include, o.exclude, rs); err != nil {
		return err
	}
	// Collect and Add copy what they keep of a document.
	o.in.reuseTokens = true
	var ref terms.Reference = terms.ModelReference(model)
	var refErr error // a reference input that could not be read: reported, and the run goes on
	if len(o.reference) > 0 {
		counts := &terms.Counts{}
		st, err := runDocs(&o.in, o.reference, model, terms.CountWords, func(_ *doc.Document, dc *terms.DocCounts) { counts.Add(dc); dc.Release() })
		if st.Documents == 0 {
			// An exitError is printed by its message alone: the prefix
			// must be in it, or the line reads as if the inputs failed.
			return exitError{1, fmt.Sprintf("reference: %v", err)}
		}
		if err != nil {
			refErr = exitError{1, fmt.Sprintf("reference: %v", err)}
		}
		ref = counts
	}
	if o.to == "html" {
		// The report's candidates carry the termbase's labels as terms'
		// other formats do (--new and --record too).
		prepare := func(corpus *terms.Corpus, cands []*terms.Term) ([]*terms.Term, error) {
			return o.tb.apply(cands, termbase.Run{Inputs: args, Documents: corpus.Documents(), Tokens: corpus.Tokens()})
		}
		return writeHTMLReport(&o.in, args, model, m, opt, ref, terms.RankOptions{MinFreq: o.minFreq, Sort: o.sortKey, All: o.all, Limit: o.limit}, prepare, o.outPath)
	}
	col := terms.NewCollector(m, opt)
	corpus := terms.NewCorpus(max(o.contexts, 3))
	corpus.SetBudget(o.in.tableBudget())
	_, runErr := runDocs(&o.in, args, model, col.Collect, func(_ *doc.Document, dc *terms.DocCounts) { corpus.Add(dc); dc.Release() })
	if p := corpus.Pruned(); p.Candidates > 0 {
		o.in.warnPruned("candidates", p.Candidates, int64(p.MaxFreq))
	}
	if runErr == nil {
		runErr = refErr
	}
	if corpus.Documents() == 0 {
		return runErr // nothing read: an existing output file is kept
	}
	cands, err := o.tb.apply(corpus.Terms(ref), termbase.Run{Inputs: args, Documents: corpus.Documents(), Tokens: corpus.Tokens()})
	if err != nil {
		return err
	}
	ranked, err := terms.Rank(cands, terms.RankOptions{MinFreq: o.minFreq, Sort: o.sortKey, All: o.all, Limit: o.limit})
	if err != nil {
		return err
	}
	out, err := openOutput(o.outPath)
	if err != nil {
		return err
	}
	src := fmt.Sprintf("%d document(s), %d words.", corpus.Documents(), corpus.Tokens())
	if err := out.commit(terms.Write(out, o.to, ranked, terms.WriteOptions{Contexts: o.contexts, Sort: o.sortKey, Highlight: o.to == "text" && useColor(o.color, out.toTerminal()), Source: src, BOM: o.bom, Lang: o.lang, TermStatus: o.tb.termStatus()})); err != nil {
		return err
	}
	return runErr
}

// readStopLists reads stop-word files: one word or phrase per line, "#"
// comments, compared lower-cased.
func readStopLists(paths []string) (map[string]bool, error) {
	if len(paths) == 0 {
		return nil, nil
	}
	stop := map[string]bool{}
	for _, p := range paths {
		f, err := os.Open(p)
		if err != nil {
			return nil, fmt.Errorf("stop list: %w", err)
		}
		sc := bufio.NewScanner(f)
		for sc.Scan() {
			line, _, _ := strings.Cut(sc.Text(), "#")
			if w := strings.ToLower(strings.TrimSpace(line)); w != "" {
				stop[w] = true
			}
		}
		err = sc.Err()
		f.Close()
		if err != nil {
			return nil, fmt.Errorf("stop list %s: %w", p, err)
		}
	}
	return stop, nil
}

// spanFilter compiles --include and --exclude into a test on a candidate's
// tokens: the pattern must match the whole candidate.
func spanFilter(include, exclude string, rs *grammar.RuleSet) (func([]doc.Token) bool, error) {
	compile := func(flag, src string) (*pattern.Matcher, error) {
		if src == "" {
			return nil, nil
		}
		// The pattern as typed first, so that an error has its column
		// there, shown as find shows it; then anchored to the whole span.
		if _, err := pattern.CompilePattern(src, rs); err != nil {
			printGrammarErrors(os.Stderr, err)
			return nil, exitError{2, flag + ": the pattern did not compile"}
		}
		m, err := pattern.CompilePattern("^ ( "+src+" ) $", rs)
		if err != nil {
			return nil, fmt.Errorf("%s: %w", flag, err)
		}
		return m, nil
	}
	inc, err := compile("--include", include)
	if err != nil {
		return nil, err
	}
	exc, err := compile("--exclude", exclude)
	if err != nil {
		return nil, err
	}
	if inc == nil && exc == nil {
		return nil, nil
	}
	return func(toks []doc.Token) bool {
		if inc != nil && len(inc.FindAll(toks)) == 0 {
			return false
		}
		return exc == nil || len(exc.FindAll(toks)) == 0
	}, nil
}
