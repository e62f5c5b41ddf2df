package main

import (
	"bytes"
	"fmt"
	"io"
	"os"
	"slices"
	"strings"

	"github.com/spf13/cobra"

	"glossmith/extract/check"
	"glossmith/extract/termbase"
	"glossmith/pattern"
	"glossmith/tagger/doc"
	"glossmith/tagger/read"
)

// checkOptions are the flags of the check command.
type checkOptions struct {
	in       inputFlags
	termbase string
	lang     string
	variants bool
	to       string
	outPath  string
	failOn   string
	baseline string
	color    string

	failLevel check.Level     // the --fail-on, parsed by validate
	base      *check.Baseline // the --baseline, read by validate
}

func newCheckCmd() *cobra.Command {
	o := &checkOptions{}
	cmd := &cobra.Command{
		Use:   "check [flags] INPUT...",
		Short: "Check documents against the termbase: deprecated terms, other spellings, misspelt terms, mixed spellings",
		Long: `Reports every use of a deprecated or forbidden term of the termbase, and of a
spelling of a term other than its preferred form: hyphen, space or closed
spellings ("setpoint" for "set point"), the case of a term whose case matters
("plc" for "PLC"), and inflected forms ("magnet valves" for the deprecated
"magnet valve"). Also terms with one word misspelt ("solenoid vavle",
"thermistr"): a lower-case word of five letters or more, one letter left out,
added or wrong, or two swapped (never the first), that is no English word the
tagger knows ("value" is not taken for "valve") and no word of the termbase;
a capitalized word too where the capital is the writing's (a sentence's first
word, a heading's words, a heading or line in capitals), unless the running
text writes it capitalized as a name or acronym; there a capitalized plural
the tagger takes for a name is read by its regular singular too ("Thermisters"
for the deprecated "thermister").
With --variants, also every variant group (grouped as the terms command
groups them) spelled more than one way, with its counts in each document and
in all, and the majority spelling to use.

Levels: deprecated and forbidden terms are errors, other spellings and
misspelt terms warnings, mixed spellings notes. The exit status is 0 without
findings at or above --fail-on, 1 with some (or when an input could not be
read), 2 on a usage error.

Terms in code (code blocks, inline code, HTML code and pre elements), URLs,
e-mail addresses and file paths are not reported. A line holding
"glossmith:skip-next-line" — in Markdown and HTML as a comment,
<!-- glossmith:skip-next-line --> — silences the next line that has text.

Positions are 1-based lines and columns in characters: those of the file for
Markdown, HTML and plain text (markup counted as written), those of the
extracted text for DOCX and PDF.`,
		Example: `  glossmith check --termbase pumps.termbase manuals/
  glossmith check --variants manuals/
  glossmith check --termbase pumps.termbase --to sarif -o check.sarif manuals/
  glossmith check --termbase pumps.termbase --baseline check.sarif --fail-on warning manuals/`,
		RunE: validateThenRun(o.validate, o.run),
	}
	o.register(cmd)
	return cmd
}

func (o *checkOptions) register(cmd *cobra.Command) {
	o.in.register(cmd, true)
	fl := cmd.Flags()
	fl.StringVar(&o.termbase, "termbase", "", "the termbase to check against (default: $"+termbaseEnv+")")
	fl.StringVar(&o.lang, "lang", "", "check only the termbase's terms of this language (default: every language)")
	fl.BoolVar(&o.variants, "variants", false, "also report variant groups spelled more than one way (needs no termbase)")
	fl.StringVar(&o.to, "to", "text", "output format: "+strings.Join(check.Formats, ", ")+" (default: from the -o extension, else text)")
	fl.StringVarP(&o.outPath, "output", "o", "", "write to this file (complete or not at all) instead of standard output")
	fl.StringVar(&o.failOn, "fail-on", "error", "exit 1 on a finding of this level or above: error, warning, note")
	fl.StringVar(&o.baseline, "baseline", "", "a result of an earlier check (JSON Lines or SARIF): report only findings it does not hold")
	fl.StringVar(&o.color, "color", "auto", "colour the levels: auto (on a terminal, unless NO_COLOR is set or TERM=dumb), always, never")
	completeChoices(cmd, "to", check.Formats)
	completeChoices(cmd, "fail-on", failLevels)
	completeChoices(cmd, "color", colorModes)
}

// failLevels are the values of --fail-on.
var failLevels = []string{"error", "warning", "note"}

// validate checks every flag value, and reads the baseline, before any
// input is read.
func (o *checkOptions) validate(cmd *cobra.Command, args []string) error {
	if err := o.in.validateWithOutput(cmd, &o.to, o.outPath, check.Formats); err != nil {
		return err
	}
	if err := checkChoice("fail-on", o.failOn, failLevels); err != nil {
		return err
	}
	o.failLevel, _ = check.ParseLevel(o.failOn)
	if err := checkChoice("color", o.color, colorModes); err != nil {
		return err
	}
	if o.termbase == "" {
		o.termbase = os.Getenv(termbaseEnv)
	}
	if o.termbase == "" && !o.variants {
		return usageError("nothing to check against: give --termbase FILE (or set %s), --variants, or both", termbaseEnv)
	}
	if o.termbase != "" {
		if err := needTermbaseFile(o.termbase); err != nil {
			return err
		}
	}
	if o.baseline != "" {
		f, err := os.Open(o.baseline)
		if err != nil {
			return usageError("--baseline: %v", err)
		}
		defer f.Close()
		if o.base, err = check.ReadBaseline(f, o.baseline); err != nil {
			return usageError("--baseline: %v", err)
		}
	}
	return needInputs(args)
}

func (o *checkOptions) run(args []string) error {
	opt := check.Options{Encoding: o.in.encoding}
	if o.termbase != "" {
		tb, err := termbase.Open(o.termbase)
		if err != nil {
			return err
		}
		entries, err := tb.Entries()
		tb.Close()
		if err != nil {
			return err
		}
		opt.Glossary = check.Compile(check.FromTermbase(entries, o.lang))
	}
	if o.variants {
		m, err := pattern.CompileStock("terms")
		if err != nil {
			return err
		}
		opt.Candidates = m
	}
	model, err := loadModel(o.in.model)
	if err != nil {
		return err
	}
	if opt.Glossary != nil {
		opt.Misspellings = check.NewMisspellings(opt.Glossary, model)
	}
	rep := check.NewReport(opt.Glossary)
	o.in.reuseTokens = true // results hold strings and positions, not tokens
	stdin, err := o.readStdin(args)
	if err != nil {
		return err
	}
	st, runErr := runDocs(&o.in, args, model,
		func(d *doc.Document) *check.DocResult { return check.Check(d, readSource(d, stdin), opt) },
		func(_ *doc.Document, r *check.DocResult) { rep.Add(r) })
	if st.Documents == 0 {
		return runErr
	}
	// The findings are written as the report makes them, one document's at
	// a time, and counted on the way.
	fs := rep.All()
	known := 0
	if o.base != nil {
		fs = o.base.Filter(fs, &known)
	}
	n, failing := 0, 0
	var byLevel [3]int
	counted := func(yield func(check.Finding) bool) {
		for f := range fs {
			lv := f.Level()
			n++
			byLevel[lv]++
			if lv >= o.failLevel {
				failing++
			}
			if !yield(f) {
				return
			}
		}
	}
	out, err := openOutput(o.outPath)
	if err != nil {
		return err
	}
	wopt := check.WriteOptions{Color: o.to == "text" && useColor(o.color, out.toTerminal()), Version: versionString()}
	if err := out.commit(check.WriteSeq(out, o.to, counted, wopt)); err != nil {
		return err
	}
	if !o.in.quiet {
		msg := fmt.Sprintf("check: %d finding(s) in %d document(s): %d error(s), %d warning(s), %d note(s)",
			n, st.Documents, byLevel[check.Error], byLevel[check.Warning], byLevel[check.Note])
		if rep.Suppressed > 0 {
			msg += fmt.Sprintf("; %d left out in code, addresses or silenced lines", rep.Suppressed)
		}
		if o.base != nil {
			msg += fmt.Sprintf("; %d already in the baseline", known)
		}
		fmt.Fprintln(os.Stderr, msg)
	}
	if runErr != nil {
		return runErr
	}
	if failing > 0 {
		return exitError{code: 1}
	}
	return nil
}

// readStdin reads standard input whole when "-" is among the inputs and
// has the document reader take it from there: the check reads a
// document's source twice (see readSource), and a pipe can be read once.
// Reading stops one byte past the reader's cap, which then refuses it.
func (o *checkOptions) readStdin(args []string) ([]byte, error) {
	if !slices.Contains(args, "-") {
		return nil, nil
	}
	data, err := io.ReadAll(io.LimitReader(os.Stdin, read.DefaultMaxBytes+1))
	if err != nil {
		return nil, fmt.Errorf("-: cannot read standard input: %w", err)
	}
	o.in.stdin = bytes.NewReader(data)
	return data, nil
}

// readSource returns the bytes of the file a document was read from, from
// which the check takes code and skip comments (positions come with the
// document): stdin for standard input; nil for a file that cannot be read
// again.
func readSource(d *doc.Document, stdin []byte) []byte {
	switch d.Format {
	case "md", "txt", "html":
	default:
		return nil
	}
	if d.Name == "-" {
		return stdin
	}
	b, err := os.ReadFile(d.Name)
	if err != nil {
		return nil
	}
	return b
}
