package main

import "github.com/spf13/cobra"

// completeChoices lets shell completion offer values for a flag that takes
// one of a fixed list.
func completeChoices(cmd *cobra.Command, flag string, values []string) {
	_ = cmd.RegisterFlagCompletionFunc(flag, cobra.FixedCompletions(values, cobra.ShellCompDirectiveNoFileComp))
}

// completeRuleFiles lets completion of --rules offer the stock sets
// besides files.
func completeRuleFiles(cmd *cobra.Command) {
	_ = cmd.RegisterFlagCompletionFunc("rules", func(*cobra.Command, []string, string) ([]string, cobra.ShellCompDirective) {
		return stockArgs(), cobra.ShellCompDirectiveDefault
	})
}
