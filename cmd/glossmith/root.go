package main

import (
	"fmt"
	"os"
	"runtime/debug"
	"runtime/pprof"
	"strings"

	"github.com/spf13/cobra"

	"glossmith/internal/suggest"
)

// version is set at build time with -ldflags "-X main.version=..."; by
// default it comes from the module's build information.
var version = ""

func versionString() string {
	if version != "" {
		return version
	}
	if bi, ok := debug.ReadBuildInfo(); ok && bi.Main.Version != "" && bi.Main.Version != "(devel)" {
		return bi.Main.Version
	}
	return "0.1.0-dev"
}

func newRootCmd() *cobra.Command {
	root := &cobra.Command{
		Use:   "glossmith",
		Short: "Build glossary drafts from technical documents",
		Long: `glossmith reads technical documents (text, Markdown, HTML, DOCX, PDF, CoNLL-U,
any of them gzipped), tags them with an embedded part-of-speech model, matches
phrase rules written in its own pattern language, ranks term candidates and
collocations with published statistics, and writes glossary drafts as text,
TSV, CSV, JSON Lines, TBX or an HTML report. A termbase keeps the glossary's
decisions between runs; review shows the candidates in the browser, check
finds deprecated terms and other spellings in documents.

Inputs are files, directories (read recursively), glob patterns, or - for
standard input. Problems with single inputs are reported on standard error
with the file name and line; the other inputs are still processed, and the
exit status is 1 when anything was skipped, 2 on a usage error (a bad flag
value, checked before any input is read).`,
		Version:       versionString(),
		SilenceUsage:  true,
		SilenceErrors: true,
	}
	root.SetVersionTemplate("glossmith {{.Version}}\n")
	// --cpuprofile is for developers measuring a whole run (DEVELOPERS.md);
	// it is hidden from the help.
	var profile string
	root.PersistentFlags().StringVar(&profile, "cpuprofile", "", "write a CPU profile of the run to `FILE`")
	_ = root.PersistentFlags().MarkHidden("cpuprofile")
	root.PersistentPreRunE = func(*cobra.Command, []string) error {
		if profile == "" {
			return nil
		}
		f, err := os.Create(profile)
		if err != nil {
			return err
		}
		if err := pprof.StartCPUProfile(f); err != nil {
			f.Close()
			return fmt.Errorf("cpu profile: %w", err)
		}
		profFile = f
		return nil
	}
	root.SetHelpCommand(newHelpCmd())
	root.AddCommand(newTagCmd(), newTermsCmd(), newTermbaseCmd(), newCollocationsCmd(), newEvalCmd(), newFindCmd(), newRulesCmd(), newTrainCmd(), newReviewCmd())
	root.AddCommand(newCheckCmd())
	hideExtensionDefaults(root)
	return root
}

// unknownSubcommand refuses a word after a command group that names none
// of its commands ("rules chek FILE", "completion tcsh"). cobra checks this
// only under the root: a group, which has no run of its own, printed its
// help and exited 0, so a mistyped command in a script passed unnoticed.
// A group alone, with --help or with "help", still shows its help.
func unknownSubcommand(root *cobra.Command, args []string) error {
	root.InitDefaultCompletionCmd(args...) // added by Execute otherwise, too late to be found
	c, rest, err := root.Find(args)
	if err != nil || c == root || c.Runnable() || !c.HasSubCommands() {
		return nil // cobra's own checks and messages apply
	}
	if err := c.ParseFlags(rest); err != nil {
		return nil
	}
	if help, _ := c.Flags().GetBool("help"); help {
		return nil
	}
	words := c.Flags().Args()
	if len(words) == 0 || words[0] == "help" {
		return nil
	}
	var names []string
	for _, sub := range c.Commands() {
		if sub.IsAvailableCommand() {
			names = append(names, sub.Name())
		}
	}
	msg := fmt.Sprintf("unknown command %q for %q", words[0], c.CommandPath())
	if h := suggest.Hint(words[0], names); h != "" {
		msg += ": " + h
	}
	return exitError{2, msg}
}

// hideExtensionDefaults keeps the help of a --to whose default follows the
// extension of -o ("default: from the -o extension, else text") from
// ending in cobra's own (default "text") as well, which reads as if the
// extension did not count.
func hideExtensionDefaults(c *cobra.Command) {
	if f := c.Flags().Lookup("to"); f != nil && strings.Contains(f.Usage, "(default: from the -o extension") {
		f.DefValue = ""
	}
	for _, sub := range c.Commands() {
		hideExtensionDefaults(sub)
	}
}

// profFile is the CPU profile being written, if any. It is stopped by a
// finalizer, which cobra runs however the command ends: a post-run hook
// is skipped when the command returns an error, and check, which exits 1
// when it finds something, then left an empty profile.
var profFile *os.File

func init() {
	cobra.OnFinalize(func() {
		if profFile != nil {
			pprof.StopCPUProfile()
			profFile.Close()
			profFile = nil
		}
	})
}
