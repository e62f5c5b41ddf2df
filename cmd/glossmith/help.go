package main

import (
	"os"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/cobra"
	"github.com/spf13/cobra/doc"
)

// newHelpCmd is cobra's help command with one addition, "help man", so
// that an installed binary can write its own manual pages.
func newHelpCmd() *cobra.Command {
	help := &cobra.Command{
		Use:   "help [command]",
		Short: "Help about any command, or manual pages (help man)",
		Long: `Help provides help for any command: glossmith help terms.
"glossmith help man -o DIR" writes a manual page for every command.`,
		RunE: func(c *cobra.Command, args []string) error {
			cmd, _, err := c.Root().Find(args)
			if cmd == nil || err != nil {
				return usageError("no help topic %q", strings.Join(args, " "))
			}
			cmd.InitDefaultHelpFlag()
			cmd.InitDefaultVersionFlag()
			return cmd.Help()
		},
		ValidArgsFunction: func(c *cobra.Command, args []string, _ string) ([]string, cobra.ShellCompDirective) {
			cmd, _, err := c.Root().Find(args)
			if err != nil || cmd == nil {
				return nil, cobra.ShellCompDirectiveNoFileComp
			}
			var names []string
			for _, sub := range cmd.Commands() {
				if sub.IsAvailableCommand() {
					names = append(names, sub.Name())
				}
			}
			return names, cobra.ShellCompDirectiveNoFileComp
		},
	}
	help.AddCommand(newManCmd())
	return help
}

func newManCmd() *cobra.Command {
	var dir string
	cmd := &cobra.Command{
		Use:   "man -o DIR",
		Short: "Write a manual page (section 1) for every command into DIR",
		Long: `Writes glossmith.1, glossmith-terms.1 and one page for every other command into
DIR (created if missing), from the same text as --help. The date on the pages
is today's, or that of SOURCE_DATE_EPOCH when it is set (reproducible builds).`,
		Example: `  glossmith help man -o /usr/local/share/man/man1`,
		RunE: func(c *cobra.Command, args []string) error {
			if dir == "" {
				return usageError("name the directory with -o DIR")
			}
			date, err := manDate()
			if err != nil {
				return err
			}
			if err := os.MkdirAll(dir, 0o777); err != nil {
				return err
			}
			root := c.Root()
			root.DisableAutoGenTag = true
			header := &doc.GenManHeader{Title: "GLOSSMITH", Section: "1", Date: &date,
				Source: "glossmith " + versionString(), Manual: "glossmith manual"}
			return doc.GenManTree(root, header, dir)
		},
	}
	cmd.Flags().StringVarP(&dir, "output", "o", "", "directory to write the pages into")
	_ = cmd.MarkFlagDirname("output")
	return cmd
}

// manDate is the date printed on manual pages: SOURCE_DATE_EPOCH (seconds
// since 1970, reproducible-builds.org) when set, else today.
func manDate() (time.Time, error) {
	s := os.Getenv("SOURCE_DATE_EPOCH")
	if s == "" {
		return time.Now().UTC(), nil
	}
	sec, err := strconv.ParseInt(s, 10, 64)
	if err != nil {
		return time.Time{}, usageError("SOURCE_DATE_EPOCH=%q: want seconds since 1970", s)
	}
	return time.Unix(sec, 0).UTC(), nil
}
