package main

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"glossmith/grammar"
	"glossmith/internal/printable"
	"glossmith/internal/suggest"
	"glossmith/pattern"
	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
	"glossmith/tagger/tokenize"
)

func newRulesCmd() *cobra.Command {
	cmd := &cobra.Command{
		Use:   "rules",
		Short: "Check, list and show rule files (.gsr)",
		Long: `Rule files hold named phrase patterns over tags and words, written in
glossmith's pattern language (see grammar/LANGUAGE.md), with expect/reject
examples that document and test them.`,
	}
	cmd.AddCommand(newRulesCheckCmd(), newRulesListCmd(), newRulesShowCmd())
	return cmd
}

func newRulesCheckCmd() *cobra.Command {
	var model string
	cmd := &cobra.Command{
		Use:   "check [flags] FILE...",
		Short: "Parse rule files, resolve use, and run their expect/reject examples",
		Long: `Parses each rule file, resolves its use statements and checks the rules: every
problem is reported as file:line:column with the source line and a caret, and
a suggestion where one is near. Then every expect/reject example is tokenized
and tagged with the real tokenizer and tagger and matched against its rule.
The exit status is 1 when anything failed. "stock:NAME" checks a built-in set.`,
		Example: `  glossmith rules check myrules.gsr
  glossmith rules check stock:terms stock:pairs`,
		RunE: func(cmd *cobra.Command, args []string) error {
			if len(args) == 0 {
				return usageError("name the rule file(s) to check, or stock:NAME")
			}
			return runRulesCheck(model, args)
		},
		ValidArgsFunction: completeRuleArgs,
	}
	cmd.Flags().StringVar(&model, "model", "", "tagging model for the examples (default: the embedded model)")
	return cmd
}

func runRulesCheck(model string, args []string) error {
	m, err := loadModel(model)
	if err != nil {
		return err
	}
	w := bufio.NewWriter(os.Stdout)
	failed := 0
	for _, arg := range args {
		rs, err := loadRuleArg(arg)
		if err != nil {
			failed += printGrammarErrors(os.Stderr, err)
			continue
		}
		// Compile every rule and check its fine tags against the model
		// before the examples, so that a rule too large to run or a tag
		// the model never assigns fails here with file:line:col.
		problems := pattern.CheckRules(rs)
		tagErrs, warnings := rs.CheckTags(m.XPOSTags())
		for _, e := range append(problems, tagErrs...) {
			printGrammarError(os.Stderr, e)
		}
		printTagWarnings(warnings)
		failed += len(problems) + len(tagErrs)
		n, fails := pattern.CheckExamples(rs, analyzer(m))
		for _, e := range fails {
			printGrammarError(os.Stderr, e)
		}
		failed += len(fails)
		fmt.Fprintf(w, "%s: %d rule(s), %d example(s), %d failed\n", arg, len(rs.Rules), n, len(fails))
	}
	if err := w.Flush(); err != nil {
		return exitError{1, fmt.Sprintf("writing the report: %v", err)}
	}
	if failed > 0 {
		return exitError{1, fmt.Sprintf("%d problem(s)", failed)}
	}
	return nil
}

func newRulesListCmd() *cobra.Command {
	var all bool
	cmd := &cobra.Command{
		Use:   "list [flags] [FILE|stock:NAME]...",
		Short: "List rules with their bodies and documentation comments",
		Long: `Lists the rules of rule files, or of every built-in set when no file is named:
each rule's documentation comment and its body as written, in the syntax of a
rule file. Rules whose names start with "_" are helpers for other rules and
are left out unless --all is given.`,
		Example: `  glossmith rules list
  glossmith rules list --all stock:terms
  glossmith rules list myrules.gsr`,
		RunE: func(cmd *cobra.Command, args []string) error {
			return runRulesList(args, all)
		},
		ValidArgsFunction: completeRuleArgs,
	}
	cmd.Flags().BoolVar(&all, "all", false, "include helper rules (names starting with _)")
	return cmd
}

func runRulesList(args []string, all bool) error {
	if len(args) == 0 {
		args = stockArgs()
	}
	w := bufio.NewWriter(os.Stdout)
	bad := 0
	for i, arg := range args {
		rs, err := loadRuleArg(arg)
		if err != nil {
			bad += printGrammarErrors(os.Stderr, err)
			continue
		}
		if i > 0 {
			w.WriteString("\n")
		}
		fmt.Fprintf(w, "# %s\n", printable.Escape(arg))
		for _, r := range rs.Rules {
			if all || !strings.HasPrefix(r.Name, "_") {
				w.WriteString("\n")
				writeRule(w, rs, r)
			}
		}
	}
	if err := w.Flush(); err != nil {
		return exitError{1, fmt.Sprintf("writing the list: %v", err)}
	}
	if bad > 0 {
		return exitError{1, ""}
	}
	return nil
}

// writeRule prints a rule as a rule file has it: its documentation as
// comment lines, its position, then its body as written.
func writeRule(w io.Writer, rs *grammar.RuleSet, r *grammar.Rule) {
	for _, line := range strings.Split(strings.TrimSpace(r.Doc), "\n") {
		if line != "" {
			fmt.Fprintf(w, "# %s\n", printable.Escape(line))
		}
	}
	src := rs.Source(r)
	if src == "" {
		src = r.Name + " = " + grammar.Format(r.Expr) + " ;"
	}
	lines := strings.Split(src, "\n")
	for i, line := range lines {
		lines[i] = printable.Escape(line) // a multi-line body keeps its lines
	}
	fmt.Fprintf(w, "%s    # %s\n", strings.Join(lines, "\n"), r.Pos)
}

func newRulesShowCmd() *cobra.Command {
	cmd := &cobra.Command{
		Use:   "show NAME [FILE|stock:NAME]...\n  glossmith rules show stock:NAME",
		Short: "Show one rule, the rules it uses and its examples, or a whole built-in set",
		Long: `Prints the rule called NAME — its documentation and body as written — then every
rule it uses (directly or through others) and its expect/reject examples.
The rule is looked up in the named rule files, or in the built-in sets.

"rules show stock:NAME" prints the built-in set NAME as it is shipped, so an
installed binary documents its own rules.`,
		Example: `  glossmith rules show verb_obj
  glossmith rules show term myrules.gsr
  glossmith rules show stock:terms`,
		RunE: func(cmd *cobra.Command, args []string) error {
			if len(args) == 0 {
				return usageError("name a rule, or a built-in set as stock:NAME")
			}
			return runRulesShow(args[0], args[1:])
		},
		ValidArgsFunction: completeRuleArgs,
	}
	return cmd
}

func runRulesShow(name string, files []string) error {
	w := bufio.NewWriter(os.Stdout)
	if set, ok := strings.CutPrefix(name, "stock:"); ok && len(files) == 0 {
		f, err := grammar.Stock(set)
		if err != nil {
			return usageError("%v (built-in sets: %s)", err, strings.Join(stockArgs(), ", "))
		}
		w.WriteString(f.Src)
		return flushed(w)
	}
	if len(files) == 0 {
		files = stockArgs()
	}
	rs, err := grammar.Load(files...)
	if err != nil {
		printGrammarErrors(os.Stderr, err)
		return exitError{2, "the rules did not load"}
	}
	r := rs.Rule(name)
	if r == nil {
		msg := fmt.Sprintf("no rule %q in %s", name, strings.Join(files, ", "))
		if h := suggest.Hint(name, rs.Names()); h != "" {
			msg += "; " + h
		}
		return exitError{2, msg}
	}
	writeRule(w, rs, r)
	if uses := rs.Uses(name); len(uses) > 0 {
		fmt.Fprintf(w, "\n# uses:\n")
		for _, u := range uses {
			if ur := rs.Rule(u); ur != nil {
				w.WriteString("\n")
				writeRule(w, rs, ur)
			}
		}
	}
	if len(r.Examples) > 0 {
		fmt.Fprintf(w, "\n# examples:\n")
		for _, e := range r.Examples {
			fmt.Fprintf(w, "%s\n", printable.Escape(exampleSource(e)))
		}
	}
	return flushed(w)
}

// exampleSource writes an example as a rule file has it, the expected span
// in brackets.
func exampleSource(e *grammar.Example) string {
	text := e.Text
	kind := "reject"
	if e.Expect {
		kind = "expect"
		if a, b := e.Span[0], e.Span[1]; 0 <= a && a <= b && b <= len(text) {
			text = text[:a] + "[" + text[a:b] + "]" + text[b:]
		}
	}
	return fmt.Sprintf("%s %s: %s ;", kind, e.Rule, strconv.Quote(text))
}

// flushed flushes w and turns a failed write into exit status 1.
func flushed(w *bufio.Writer) error {
	if err := w.Flush(); err != nil {
		return exitError{1, fmt.Sprintf("writing to standard output: %v", err)}
	}
	return nil
}

// stockArgs names every built-in rule set as "stock:NAME".
func stockArgs() []string {
	var args []string
	for _, n := range grammar.StockNames() {
		args = append(args, "stock:"+n)
	}
	return args
}

// completeRuleArgs completes rule-file arguments: the stock sets, and
// files.
func completeRuleArgs(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
	return stockArgs(), cobra.ShellCompDirectiveDefault
}

// loadRuleArg loads a rule file, or a built-in set written "stock:NAME".
func loadRuleArg(arg string) (*grammar.RuleSet, error) { return grammar.Load(arg) }

// analyzer tokenizes and tags example texts for the rule checker.
func analyzer(m *hmm.Model) pattern.Analyzer {
	return func(text string) ([]doc.Sentence, error) {
		d := &doc.Document{Name: "example", Text: text}
		tokenize.Document(d)
		m.TagDocument(d)
		return d.Sentences, nil
	}
}

// printGrammarErrors prints a rule-loading error — a positioned list or a
// plain error — and returns how many problems it held.
func printGrammarErrors(w io.Writer, err error) int {
	var list grammar.ErrorList
	if errors.As(err, &list) {
		for _, e := range list {
			printGrammarError(w, e)
		}
		return len(list)
	}
	fmt.Fprintln(w, "error:", err)
	return 1
}

func printGrammarError(w io.Writer, e *grammar.Error) {
	fmt.Fprintf(w, "%s\n", e.Error())
	if c := e.Caret(); c != "" {
		for _, line := range strings.Split(c, "\n") {
			fmt.Fprintf(w, "    %s\n", line)
		}
	}
}
