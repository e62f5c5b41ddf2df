package main

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"os"
	"slices"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"glossmith/extract/tbx"
	"glossmith/extract/termbase"
	"glossmith/extract/termio"
	"glossmith/internal/printable"
	"glossmith/internal/suggest"
	"glossmith/internal/tabular"
	"glossmith/tagger/doc"
)

// termbaseEnv names the termbase when --termbase is not given.
const termbaseEnv = "GLOSSMITH_TERMBASE"

// termbaseFlags are the flags every termbase command shares.
type termbaseFlags struct {
	path string
	user string
}

func (f *termbaseFlags) register(fl interface {
	StringVar(*string, string, string, string)
}) {
	fl.StringVar(&f.path, "termbase", "", "termbase file (default: $"+termbaseEnv+"); created by the commands that write to it")
	fl.StringVar(&f.user, "user", "", "name written to the change log (default: the login name)")
}

// validate settles the file: the flag, else the environment.
func (f *termbaseFlags) validate() error {
	if f.path == "" {
		f.path = os.Getenv(termbaseEnv)
	}
	if f.path == "" {
		return usageError("no termbase: give --termbase FILE or set %s", termbaseEnv)
	}
	return nil
}

// needFile refuses a termbase file that is not there, for the commands
// that only read it (and check): opening creates a missing file, so a
// mistyped name would give an empty glossary — an export overwriting a
// good file with it, a check finding nothing — and leave a stray termbase.
func (f *termbaseFlags) needFile() error {
	return needTermbaseFile(f.path)
}

func needTermbaseFile(path string) error {
	if fi, err := os.Stat(path); err != nil || fi.IsDir() {
		return usageError("--termbase %s: no termbase file there (termbase import, termbase accept or terms --record create one)", path)
	}
	return nil
}

// open opens the termbase; failures are exit status 1 with the file named.
func (f *termbaseFlags) open() (*termbase.Store, error) {
	s, err := termbase.Open(f.path)
	if err != nil {
		return nil, exitError{1, err.Error()}
	}
	if f.user != "" {
		s.User = f.user
	}
	return s, nil
}

func newTermbaseCmd() *cobra.Command {
	tf := &termbaseFlags{}
	cmd := &cobra.Command{
		Use:   "termbase",
		Short: "Keep glossary decisions: import, decide, compare runs, export",
		Long: `A termbase is one file (SQLite) that remembers a glossary: concepts with their
terms, each preferred, admitted, deprecated, a candidate or rejected; parts of
speech, definitions, notes, surface forms and contexts; recorded runs of
"terms" and an append-only change log (who, when, what) that undo reads.

Statuses: preferred, admitted and deprecated are the TBX-Basic administrative
statuses; candidate (undecided, or deferred) and rejected are review states.
A rejected candidate is remembered and never listed as new again.

Every command takes --termbase FILE (default: $GLOSSMITH_TERMBASE) and
--user NAME (default: the login name) for the change log.`,
		Example: `  glossmith terms --termbase gloss.db --record v2 manuals-v2/
  glossmith termbase --termbase gloss.db accept "solenoid valve" "set point"
  glossmith termbase --termbase gloss.db diff v2 v3
  glossmith termbase --termbase gloss.db export -o glossary.tbx`,
	}
	tf.register(cmd.PersistentFlags())
	cmd.SetFlagErrorFunc(termAsFlagHint)
	cmd.AddCommand(newTermbaseImportCmd(tf), newTermbaseDecideCmd(tf, "accept"), newTermbaseDecideCmd(tf, "reject"),
		newTermbaseDecideCmd(tf, "defer"), newTermbaseSetCmd(tf), newTermbaseMergeCmd(tf), newTermbaseUndoCmd(tf),
		newTermbaseListCmd(tf), newTermbaseShowCmd(tf), newTermbaseDiffCmd(tf), newTermbaseExportCmd(tf), newTermbaseRunsCmd(tf))
	return cmd
}

// termAsFlagHint adds to the error of a term read as flags ("-20 °C mode"
// or "-40 series valve": unknown shorthand flag '2') how to give it.
func termAsFlagHint(c *cobra.Command, err error) error {
	msg := err.Error()
	i := strings.Index(msg, " in -")
	if !strings.HasPrefix(msg, "unknown shorthand flag") || i < 0 {
		return err
	}
	term := msg[i+len(" in "):]
	return usageError("%s (a term that starts with \"-\" goes after \"--\", the flags before it: %s -- %q)", msg, c.CommandPath(), term)
}

// escapedTable is tabular.Align over cells with their control characters
// escaped (printable.Escape): a term, note or file name holding an escape
// sequence, from an imported glossary or a document, must not reach the
// terminal as one.
func escapedTable(rows [][]string, right []bool) []string {
	for _, r := range rows {
		for i, c := range r {
			r[i] = printable.Escape(c)
		}
	}
	return tabular.Align(rows, right)
}

// withStore runs fn on the open termbase (validated first; a missing file
// refused when mustExist, for commands that only read it), closing it
// after; errors of fn are exit status 1.
func (f *termbaseFlags) withStore(mustExist bool, fn func(*termbase.Store) error) error {
	if err := f.validate(); err != nil {
		return err
	}
	if mustExist {
		if err := f.needFile(); err != nil {
			return err
		}
	}
	s, err := f.open()
	if err != nil {
		return err
	}
	defer s.Close()
	if err := fn(s); err != nil {
		if _, ok := err.(exitError); ok {
			return err
		}
		return exitError{1, err.Error()}
	}
	return nil
}

// reportChange prints what a change did, or that nothing changed.
func reportChange(w io.Writer, c termbase.Change) {
	if c.ID == 0 {
		fmt.Fprintln(w, "nothing changed")
		return
	}
	fmt.Fprintf(w, "#%d %s: %s\n", c.ID, c.Action, c.Summary)
}

// --- import ---

type termbaseImportOptions struct {
	tf   *termbaseFlags
	lang string
}

func newTermbaseImportCmd(tf *termbaseFlags) *cobra.Command {
	o := &termbaseImportOptions{tf: tf}
	cmd := &cobra.Command{
		Use:   "import FILE...",
		Short: "Import glossaries (TBX, CSV, TSV) or a filled-in review sheet (XLSX, CSV)",
		Long: `Imports TBX (TBX-Core, TBX-Basic in either style), CSV and TSV files with a
header naming the columns concept, term, lang, status, pos, subject, definition,
source, note, concept_note (other columns are kept as notes), and review files
(the XLSX sheet of "termbase export --to xlsx", or CSV/TSV with a decision
column) whose decisions and comments are recorded.

An entry sharing a term with a stored entry is merged into it, so importing a
file twice changes nothing. Each file is one change (undo takes it back). Rows
that cannot be used are reported with their line; the rest is imported and the
exit status is 1.`,
		RunE: validateThenWrite(o.validate, o.run),
	}
	cmd.Flags().StringVar(&o.lang, "lang", "en", "language of terms whose file names none (BCP 47)")
	return cmd
}

func (o *termbaseImportOptions) validate(args []string) error {
	if err := o.tf.validate(); err != nil {
		return err
	}
	if len(args) == 0 {
		return usageError("no file to import")
	}
	if err := checkLangTag(o.lang); err != nil {
		return err
	}
	return nil
}

func (o *termbaseImportOptions) run(w io.Writer, files []string) error {
	s, err := o.tf.open()
	if err != nil {
		return err
	}
	defer s.Close()
	s.Lang = o.lang
	failed := 0
	for _, f := range files {
		imp, err := termio.ReadFile(f, o.lang)
		if err != nil {
			fmt.Fprintln(os.Stderr, "glossmith:", err)
			failed++
			continue
		}
		for _, p := range imp.Problems {
			fmt.Fprintln(os.Stderr, "glossmith:", p.Error())
		}
		if len(imp.Problems) > 0 {
			failed++
		}
		if len(imp.Entries) > 0 || len(imp.Verdicts) == 0 {
			c, err := s.Import(f, imp.Entries)
			if err != nil {
				return exitError{1, err.Error()}
			}
			fmt.Fprintf(w, "%s: %d entries read; ", f, len(imp.Entries))
			reportChange(w, c)
		}
		if len(imp.Verdicts) > 0 {
			c, err := s.Review(f, imp.Verdicts)
			if err != nil {
				return exitError{1, err.Error()}
			}
			fmt.Fprintf(w, "%s: %d verdicts read; ", f, len(imp.Verdicts))
			reportChange(w, c)
		}
	}
	if failed > 0 {
		return exitError{1, fmt.Sprintf("%d of %d file(s) had problems (reported above)", failed, len(files))}
	}
	return nil
}

// --- accept, reject, defer ---

type termbaseDecideOptions struct {
	tf       *termbaseFlags
	verb     string
	fromFile string
}

func newTermbaseDecideCmd(tf *termbaseFlags, verb string) *cobra.Command {
	o := &termbaseDecideOptions{tf: tf, verb: verb}
	short := map[string]string{
		"accept": "Accept terms: preferred, or admitted when their entry has a preferred term",
		"reject": "Reject candidates: not terms, never offered as new again",
		"defer":  "Put candidates off: undecided on purpose",
	}[verb]
	cmd := &cobra.Command{
		Use:   verb + " TERM... [--from-file FILE]",
		Short: short,
		Long: short + `.
A term not in the termbase becomes a new entry. All the terms are one change.
--from-file reads one term per line ("#" starts a comment).`,
		RunE: validateThenWrite(o.validate, o.run),
	}
	cmd.Flags().StringVar(&o.fromFile, "from-file", "", "read the terms from this file, one per line")
	return cmd
}

func (o *termbaseDecideOptions) validate(args []string) error {
	if err := o.tf.validate(); err != nil {
		return err
	}
	if len(args) == 0 && o.fromFile == "" {
		return usageError("no term: name terms or give --from-file")
	}
	return nil
}

func (o *termbaseDecideOptions) run(w io.Writer, args []string) error {
	list := slices.Clone(args)
	if o.fromFile != "" {
		more, err := readTermList(o.fromFile)
		if err != nil {
			return exitError{1, err.Error()}
		}
		list = append(list, more...)
	}
	s, err := o.tf.open()
	if err != nil {
		return err
	}
	defer s.Close()
	var c termbase.Change
	switch o.verb {
	case "accept":
		c, err = s.Accept(list...)
	case "reject":
		c, err = s.Reject(list...)
	default:
		c, err = s.Defer(list...)
	}
	if err != nil {
		return exitError{1, err.Error()}
	}
	reportChange(w, c)
	return nil
}

// readTermList reads the terms of a --from-file file.
func readTermList(path string) ([]string, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	list, err := termio.ReadTermList(f)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", path, err)
	}
	return list, nil
}

// --- set ---

type termbaseSetOptions struct {
	tf *termbaseFlags
	ed termbase.Edit
}

func newTermbaseSetCmd(tf *termbaseFlags) *cobra.Command {
	o := &termbaseSetOptions{tf: tf}
	cmd := &cobra.Command{
		Use:   "set TERM [--preferred FORM] [--admitted FORM]... [--deprecated FORM]... [--pos P] [--definition TEXT] [--note TEXT] [--subject S]",
		Short: "Edit the entry of a term: its forms' statuses, part of speech, definition, note, subject",
		Long: `Edits the entry TERM belongs to, as one change. --preferred makes FORM the
entry's preferred term (the former one becomes admitted); --admitted and
--deprecated give forms those statuses; a form that is not yet a term of the
entry becomes one (moved out of another entry if it is a term there). --pos
sets TERM's part of speech; --definition (with --source), --note and
--subject the entry's.`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := o.validate(); err != nil {
				return err
			}
			return o.run(cmd.OutOrStdout(), args[0])
		},
	}
	fl := cmd.Flags()
	fl.StringVar(&o.ed.Preferred, "preferred", "", "make this form the preferred term")
	fl.StringArrayVar(&o.ed.Admitted, "admitted", nil, "make this form an admitted term (repeatable)")
	fl.StringArrayVar(&o.ed.Deprecated, "deprecated", nil, "make this form a deprecated term (repeatable)")
	fl.StringVar(&o.ed.POS, "pos", "", "part of speech of TERM: noun, verb, adjective, adverb, other, or UPOS tags (NOUN, \"ADJ NOUN\")")
	fl.StringVar(&o.ed.Definition, "definition", "", "the entry's definition")
	fl.StringVar(&o.ed.DefSource, "source", "", "where the definition comes from")
	fl.StringVar(&o.ed.Note, "note", "", "add a note to the entry")
	fl.StringVar(&o.ed.Subject, "subject", "", "the entry's subject field")
	completeChoices(cmd, "pos", append(slices.Clone(termbase.BasicPOS), doc.UPOSTags...))
	return cmd
}

func (o *termbaseSetOptions) validate() error {
	if err := o.tf.validate(); err != nil {
		return err
	}
	e := o.ed
	if e.Preferred == "" && len(e.Admitted) == 0 && len(e.Deprecated) == 0 && e.POS == "" && e.Definition == "" && e.Note == "" && e.Subject == "" {
		return usageError("nothing to set: give --preferred, --admitted, --deprecated, --pos, --definition, --note or --subject")
	}
	if e.DefSource != "" && e.Definition == "" {
		return usageError("--source goes with --definition")
	}
	return checkPOS(e.POS)
}

// checkPOS refuses a --pos that no reader of the termbase understands
// (termbase.ValidPOS), with the closest value.
func checkPOS(pos string) error {
	if termbase.ValidPOS(pos) {
		return nil
	}
	choices := append(slices.Clone(termbase.BasicPOS), doc.UPOSTags...)
	msg := fmt.Sprintf("--pos %q: want one of %s, or UPOS tags such as NOUN or \"ADJ NOUN\"", pos, strings.Join(termbase.BasicPOS, ", "))
	if h := suggest.Hint(pos, choices); h != "" {
		msg += "; " + h
	}
	return usageError("%s", msg)
}

func (o *termbaseSetOptions) run(w io.Writer, term string) error {
	s, err := o.tf.open()
	if err != nil {
		return err
	}
	defer s.Close()
	c, err := s.Edit(term, o.ed)
	if err != nil {
		return exitError{1, err.Error()}
	}
	reportChange(w, c)
	return nil
}

// --- merge ---

func newTermbaseMergeCmd(tf *termbaseFlags) *cobra.Command {
	return &cobra.Command{
		Use:   "merge TERM1 TERM2",
		Short: "Make the entries of two terms one concept (TERM1's entry keeps its preferred term)",
		Args:  cobra.ExactArgs(2),
		RunE: func(cmd *cobra.Command, args []string) error {
			return tf.withStore(false, func(s *termbase.Store) error {
				c, err := s.Merge(args[0], args[1])
				if err == nil {
					reportChange(cmd.OutOrStdout(), c)
				}
				return err
			})
		},
	}
}

// --- undo ---

func newTermbaseUndoCmd(tf *termbaseFlags) *cobra.Command {
	return &cobra.Command{
		Use:   "undo [N]",
		Short: "Undo the last N changes (default 1), newest first; each undo is logged",
		Args:  cobra.MaximumNArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			n := 1
			if len(args) == 1 {
				v, err := strconv.Atoi(args[0])
				if err != nil || v < 1 {
					return usageError("undo %q: want a whole number of at least 1", args[0])
				}
				n = v
			}
			return tf.withStore(true, func(s *termbase.Store) error {
				done, err := s.Undo(n)
				for _, c := range done {
					reportChange(cmd.OutOrStdout(), c)
				}
				if err == nil && len(done) < n {
					fmt.Fprintf(cmd.OutOrStdout(), "%d change(s) undone; nothing older to undo\n", len(done))
				}
				return err
			})
		},
	}
}

// --- list ---

type termbaseListOptions struct {
	tf      *termbaseFlags
	status  string
	since   string
	sinceT  time.Time
	to      string
	outPath string
}

var listStatuses = []string{"preferred", "admitted", "deprecated", "candidate", "deferred", "rejected"}

func newTermbaseListCmd(tf *termbaseFlags) *cobra.Command {
	o := &termbaseListOptions{tf: tf}
	cmd := &cobra.Command{
		Use:   "list [--status S] [--changed-since DATE]",
		Short: "List the entries: preferred term, status, other terms, part of speech",
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := o.validate(cmd); err != nil {
				return err
			}
			return o.run()
		},
	}
	fl := cmd.Flags()
	fl.StringVar(&o.status, "status", "", "only entries with a term of this status: "+strings.Join(listStatuses, ", "))
	fl.StringVar(&o.since, "changed-since", "", "only entries changed at or after this date (2006-01-02) or time (RFC 3339)")
	fl.StringVar(&o.to, "to", "text", "output format: text, jsonl (default: from the -o extension, else text)")
	fl.StringVarP(&o.outPath, "output", "o", "", "write to this file (complete or not at all) instead of standard output")
	completeChoices(cmd, "status", listStatuses)
	return cmd
}

func (o *termbaseListOptions) validate(cmd *cobra.Command) error {
	if err := o.tf.validate(); err != nil {
		return err
	}
	if o.status != "" {
		if err := checkChoice("status", o.status, listStatuses); err != nil {
			return err
		}
	}
	if o.since != "" {
		t, err := parseDate(o.since)
		if err != nil {
			return usageError("--changed-since %q: want a date such as 2026-12-01 or a time such as 2026-12-01T09:30:00Z", o.since)
		}
		o.sinceT = t
	}
	to, err := outputFormat(cmd, o.to, o.outPath, []string{"text", "jsonl"})
	if err != nil {
		return err
	}
	o.to = to
	return o.tf.needFile()
}

func parseDate(s string) (time.Time, error) {
	if t, err := time.Parse(time.RFC3339, s); err == nil {
		return t, nil
	}
	return time.ParseInLocation("2006-01-02", s, time.Local)
}

func (o *termbaseListOptions) run() error {
	s, err := o.tf.open()
	if err != nil {
		return err
	}
	defer s.Close()
	entries, err := s.Entries()
	if err != nil {
		return exitError{1, err.Error()}
	}
	var changed map[int64]bool
	if o.since != "" {
		if changed, err = s.ChangedSince(o.sinceT); err != nil {
			return exitError{1, err.Error()}
		}
	}
	var keep []*termbase.Entry
	for _, e := range entries {
		if changed != nil && !changed[e.ID] {
			continue
		}
		if o.status != "" && !slices.ContainsFunc(e.Terms, func(t *termbase.Term) bool {
			if o.status == "deferred" {
				return t.Deferred
			}
			return string(t.Status) == o.status
		}) {
			continue
		}
		keep = append(keep, e)
	}
	out, err := openOutput(o.outPath)
	if err != nil {
		return err
	}
	if o.to == "jsonl" {
		return out.commit(termio.WriteJSONL(out, keep))
	}
	rows := [][]string{{"entry", "term", "status", "pos", "other terms"}}
	for _, e := range keep {
		p := e.Head(s.Lang)
		if p == nil {
			continue
		}
		var others []string
		for _, t := range e.Terms {
			if t != p {
				others = append(others, t.Text+" ("+termStatusName(t)+")")
			}
		}
		rows = append(rows, []string{strconv.FormatInt(e.ID, 10), p.Text, termStatusName(p), p.POS, strings.Join(others, ", ")})
	}
	bw := bufio.NewWriter(out)
	for _, l := range escapedTable(rows, []bool{true}) {
		bw.WriteString(l + "\n")
	}
	fmt.Fprintf(bw, "%d %s\n", len(keep), plural(len(keep), "entry", "entries"))
	return out.commit(bw.Flush())
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

func termStatusName(t *termbase.Term) string {
	if t.Deferred {
		return "deferred"
	}
	return string(t.Status)
}

// --- show ---

func newTermbaseShowCmd(tf *termbaseFlags) *cobra.Command {
	return &cobra.Command{
		Use:   "show TERM",
		Short: "Show the entry of a term with its history",
		Args:  cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			return tf.withStore(true, func(s *termbase.Store) error {
				es, err := s.Lookup(args[0])
				if err != nil {
					return err
				}
				if len(es) == 0 {
					return fmt.Errorf("%q is not in %s", args[0], tf.path)
				}
				var text bytes.Buffer
				w := bufio.NewWriter(&text)
				for i, e := range es {
					if i > 0 {
						w.WriteString("\n")
					}
					hist, err := s.History(e.ID)
					if err != nil {
						return err
					}
					writeEntry(w, e, hist)
				}
				w.Flush()
				out := bufio.NewWriter(cmd.OutOrStdout())
				for _, line := range strings.SplitAfter(text.String(), "\n") {
					out.WriteString(printable.Escape(strings.TrimSuffix(line, "\n")))
					if strings.HasSuffix(line, "\n") {
						out.WriteString("\n")
					}
				}
				return out.Flush()
			})
		},
	}
}

func writeEntry(w *bufio.Writer, e *termbase.Entry, hist []termbase.Change) {
	fmt.Fprintf(w, "entry %d", e.ID)
	if e.ExtID != "" {
		fmt.Fprintf(w, " (%s)", e.ExtID)
	}
	w.WriteString("\n")
	if e.Subject != "" {
		fmt.Fprintf(w, "  subject:    %s\n", e.Subject)
	}
	if e.Definition != "" {
		fmt.Fprintf(w, "  definition: %s", e.Definition)
		if e.DefSource != "" {
			fmt.Fprintf(w, " [%s]", e.DefSource)
		}
		w.WriteString("\n")
	}
	for _, n := range e.Notes {
		fmt.Fprintf(w, "  note:       %s\n", n)
	}
	for _, t := range e.Terms {
		fmt.Fprintf(w, "  %-10s  %s", termStatusName(t), t.Text)
		if t.Lang != "" {
			fmt.Fprintf(w, " [%s]", t.Lang)
		}
		if t.POS != "" {
			fmt.Fprintf(w, " (%s)", t.POS)
		}
		w.WriteString("\n")
		if len(t.Forms) > 0 {
			fmt.Fprintf(w, "              forms: %s\n", strings.Join(t.Forms, ", "))
		}
		for _, n := range t.Notes {
			fmt.Fprintf(w, "              note: %s\n", n)
		}
		for _, c := range t.Contexts {
			src := c.Source
			if c.Doc != "" {
				src = fmt.Sprintf("%s:%d", c.Doc, c.Line)
			}
			fmt.Fprintf(w, "              %s: %s\n", src, c.Text)
		}
	}
	if len(hist) > 0 {
		w.WriteString("  history:\n")
		for _, c := range hist {
			fmt.Fprintf(w, "    #%d %s %s %s: %s", c.ID, c.Time.Local().Format("2006-01-02 15:04"), c.User, c.Action, c.Summary)
			if c.UndoneBy != 0 {
				fmt.Fprintf(w, " (undone by #%d)", c.UndoneBy)
			}
			w.WriteString("\n")
		}
	}
}

// --- diff ---

type termbaseDiffOptions struct {
	tf        *termbaseFlags
	threshold float64
	minFreq   int
	to        string
	outPath   string
}

func newTermbaseDiffCmd(tf *termbaseFlags) *cobra.Command {
	o := &termbaseDiffOptions{tf: tf}
	cmd := &cobra.Command{
		Use:   "diff LABEL1 LABEL2",
		Short: "Compare two recorded runs: terms new, gone, significantly more or less frequent",
		Long: fmt.Sprintf(`Compares two runs recorded with "terms --record LABEL": terms found only in the
later run (new), only in the earlier one (gone), and terms whose frequency
relative to the run's word count rose or fell significantly — by Dunning's
log-likelihood G² (1993) of the 2×2 table of the term's count against the other
words of each run, at |G²| ≥ --threshold (default %.2f, the χ²(1) critical value
for p < 0.0001: with thousands of terms compared at once, the usual 3.84 would
flag dozens by chance).`, termbase.DefaultDiffThreshold),
		Args: cobra.ExactArgs(2),
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := o.validate(cmd, args); err != nil {
				return err
			}
			return o.run(args[0], args[1])
		},
	}
	fl := cmd.Flags()
	fl.Float64Var(&o.threshold, "threshold", termbase.DefaultDiffThreshold, "|G²| a change in frequency must reach")
	fl.IntVar(&o.minFreq, "min-freq", 2, "list new and gone terms seen at least this often in the run that has them")
	fl.StringVar(&o.to, "to", "text", "output format: text, tsv, jsonl (default: from the -o extension, else text)")
	fl.StringVarP(&o.outPath, "output", "o", "", "write to this file (complete or not at all) instead of standard output")
	return cmd
}

func (o *termbaseDiffOptions) validate(cmd *cobra.Command, labels []string) error {
	if err := o.tf.validate(); err != nil {
		return err
	}
	if labels[0] == labels[1] {
		// A run against itself changes nothing, and the TSV would name
		// two columns alike (freq_v1, freq_v1).
		return usageError("diff %s %s: name two different runs (termbase runs lists them)", labels[0], labels[1])
	}
	if !(o.threshold >= 0) {
		return usageError("--threshold %g: want a number of at least 0", o.threshold)
	}
	if err := checkRange("min-freq", int64(o.minFreq), 1, -1); err != nil {
		return err
	}
	to, err := outputFormat(cmd, o.to, o.outPath, []string{"text", "tsv", "jsonl"})
	if err != nil {
		return err
	}
	o.to = to
	return o.tf.needFile()
}

func (o *termbaseDiffOptions) run(a, b string) error {
	s, err := o.tf.open()
	if err != nil {
		return err
	}
	defer s.Close()
	rows, err := s.Diff(a, b, o.threshold, o.minFreq)
	if err != nil {
		return exitError{1, err.Error()}
	}
	out, err := openOutput(o.outPath)
	if err != nil {
		return err
	}
	return out.commit(writeDiff(out, o.to, rows, a, b))
}

func writeDiff(w io.Writer, format string, rows []termbase.DiffRow, a, b string) error {
	switch format {
	case "jsonl":
		j := tabular.NewJSONL(w)
		for _, r := range rows {
			if err := j.Encode(r); err != nil {
				return err
			}
		}
		return j.Flush()
	case "tsv":
		tw := tabular.NewTSV(w)
		tw.Write("change", "term", "freq_"+a, "freq_"+b, "per_million_"+a, "per_million_"+b, "g2")
		for _, r := range rows {
			tw.Write(r.Kind, r.Term, strconv.Itoa(r.Freq1), strconv.Itoa(r.Freq2),
				strconv.FormatFloat(r.Per1, 'f', 2, 64), strconv.FormatFloat(r.Per2, 'f', 2, 64), strconv.FormatFloat(r.G2, 'f', 2, 64))
		}
		return tw.Flush()
	}
	table := [][]string{{"change", "term", a, b, "G²"}}
	count := map[string]int{}
	for _, r := range rows {
		count[r.Kind]++
		table = append(table, []string{r.Kind, r.Term, strconv.Itoa(r.Freq1), strconv.Itoa(r.Freq2), strconv.FormatFloat(r.G2, 'f', 1, 64)})
	}
	bw := bufio.NewWriter(w)
	for _, l := range escapedTable(table, []bool{false, false, true, true, true}) {
		bw.WriteString(l + "\n")
	}
	fmt.Fprintf(bw, "%d new, %d gone, %d rose, %d fell\n", count["new"], count["gone"], count["rose"], count["fell"])
	return bw.Flush()
}

// --- export ---

var exportFormats = []string{"tbx", "tbx-basic", "csv", "tsv", "jsonl", "xlsx"}

type termbaseExportOptions struct {
	tf      *termbaseFlags
	to      string
	outPath string
	lang    string
	status  string
	bom     bool
}

func newTermbaseExportCmd(tf *termbaseFlags) *cobra.Command {
	o := &termbaseExportOptions{tf: tf}
	cmd := &cobra.Command{
		Use:   "export [--to FORMAT] [-o FILE]",
		Short: "Write the termbase as TBX, CSV, TSV, JSON Lines or an XLSX review sheet",
		Long: `Writes every entry (or those with a term of --status):
  tbx        TBX-Core: the core structure, every datum a note
  tbx-basic  TBX-Basic: administrative statuses, parts of speech, definitions,
             contexts with their sources
  csv, tsv   the columns "termbase import" reads; export then import changes nothing
  jsonl      one entry a line with all its fields
  xlsx       a review sheet for a subject expert: one row a concept with its
             variants, part of speech, contexts and status, and empty decision
             and comment columns that "termbase import" reads back`,
		RunE: func(cmd *cobra.Command, args []string) error {
			if err := o.validate(cmd); err != nil {
				return err
			}
			return o.run()
		},
	}
	fl := cmd.Flags()
	fl.StringVar(&o.to, "to", "tbx", "format: "+strings.Join(exportFormats, ", ")+" (default: from the -o extension, else tbx)")
	fl.StringVarP(&o.outPath, "output", "o", "", "write to this file (complete or not at all) instead of standard output")
	fl.StringVar(&o.lang, "lang", "en", "TBX: the document language (BCP 47)")
	fl.StringVar(&o.status, "status", "", "only entries with a term of this status: "+strings.Join(listStatuses, ", "))
	fl.BoolVar(&o.bom, "bom", false, bomUsage)
	completeChoices(cmd, "to", exportFormats)
	return cmd
}

func (o *termbaseExportOptions) validate(cmd *cobra.Command) error {
	if err := o.tf.validate(); err != nil {
		return err
	}
	if o.status != "" {
		if err := checkChoice("status", o.status, listStatuses); err != nil {
			return err
		}
	}
	to, err := outputFormat(cmd, o.to, o.outPath, exportFormats)
	if err != nil {
		return err
	}
	o.to = to
	if to == "xlsx" && (o.outPath == "" || o.outPath == "-") && isTerminal(os.Stdout) {
		return usageError("--to xlsx writes a binary workbook: give -o FILE.xlsx")
	}
	return o.tf.needFile()
}

func (o *termbaseExportOptions) run() error {
	s, err := o.tf.open()
	if err != nil {
		return err
	}
	defer s.Close()
	entries, err := s.Entries()
	if err != nil {
		return exitError{1, err.Error()}
	}
	if o.status != "" {
		entries = slices.DeleteFunc(entries, func(e *termbase.Entry) bool {
			return !slices.ContainsFunc(e.Terms, func(t *termbase.Term) bool { return termStatusName(t) == o.status })
		})
	}
	out, err := openOutput(o.outPath)
	if err != nil {
		return err
	}
	switch o.to {
	case "tbx", "tbx-basic":
		dialect := tbx.Core
		if o.to == "tbx-basic" {
			dialect = tbx.Basic
		}
		src := fmt.Sprintf("Glossary exported by glossmith from %s: %d entries.", baseName(o.tf.path), len(entries))
		err = tbx.Write(out, termio.ToTBX(entries, dialect, o.lang, src))
	case "csv":
		err = termio.WriteTable(out, entries, ',', o.bom)
	case "tsv":
		err = termio.WriteTable(out, entries, '\t', false)
	case "jsonl":
		err = termio.WriteJSONL(out, entries)
	case "xlsx":
		err = termio.WriteReviewSheet(out, entries, o.lang)
	}
	return out.commit(err)
}

func baseName(p string) string {
	if i := strings.LastIndexAny(p, `/\`); i >= 0 {
		return p[i+1:]
	}
	return p
}

// --- runs ---

func newTermbaseRunsCmd(tf *termbaseFlags) *cobra.Command {
	return &cobra.Command{
		Use:   "runs",
		Short: "List the recorded runs of terms (--record LABEL)",
		Args:  cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			return tf.withStore(true, func(s *termbase.Store) error {
				runs, err := s.Runs()
				if err != nil {
					return err
				}
				rows := [][]string{{"label", "recorded", "documents", "words", "inputs"}}
				for _, r := range runs {
					rows = append(rows, []string{r.Label, r.Time.Local().Format("2006-01-02 15:04"), strconv.Itoa(r.Documents), strconv.Itoa(r.Tokens), strings.Join(r.Inputs, " ")})
				}
				w := bufio.NewWriter(cmd.OutOrStdout())
				for _, l := range escapedTable(rows, []bool{false, false, true, true}) {
					w.WriteString(l + "\n")
				}
				return w.Flush()
			})
		},
	}
}
