package main

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"os"
	"strings"

	"github.com/spf13/cobra"

	"glossmith/grammar"
	"glossmith/pattern"
	"glossmith/tagger/doc"
	"glossmith/tagger/hmm"
	"glossmith/tagger/tokenize"
)

func newRulesCmd() *cobra.Command {
	cmd := &cobra.Command{
		Use:   "rules",
		Short: "Check and list rule files (.gsr)",
		Long: `Rule files hold named phrase patterns over tags and words, written in
glossmith's pattern language (see grammar/LANGUAGE.md), with expect/reject
examples that document and test them.`,
	}
	cmd.AddCommand(newRulesCheckCmd(), newRulesListCmd())
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
	cmd := &cobra.Command{
		Use:   "list [FILE|stock:NAME]...",
		Short: "List rules with their documentation comments",
		Long:  `Lists the rules of rule files, or of every built-in set when no file is named.`,
		RunE: func(cmd *cobra.Command, args []string) error {
			return runRulesList(args)
		},
		ValidArgsFunction: completeRuleArgs,
	}
	return cmd
}

func runRulesList(args []string) error {
	if len(args) == 0 {
		args = stockArgs()
	}
	w := bufio.NewWriter(os.Stdout)
	bad := 0
	for _, arg := range args {
		rs, err := loadRuleArg(arg)
		if err != nil {
			bad += printGrammarErrors(os.Stderr, err)
			continue
		}
		fmt.Fprintf(w, "%s\n", arg)
		for _, r := range rs.Rules {
			if strings.HasPrefix(r.Name, "_") {
				continue // helpers, not meant to be run on their own
			}
			fmt.Fprintf(w, "  %s    (%s)\n", r.Name, r.Pos)
			for _, line := range strings.Split(strings.TrimSpace(r.Doc), "\n") {
				if line != "" {
					fmt.Fprintf(w, "      %s\n", line)
				}
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
