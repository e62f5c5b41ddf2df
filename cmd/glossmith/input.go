package main

import (
	"context"
	"fmt"
	"io"
	"math"
	"os"
	"runtime/debug"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"glossmith/internal/printable"
	"glossmith/tagger/doc"
	"glossmith/tagger/pipeline"
	"glossmith/tagger/read"
)

// inputFlags are the flags of every command that reads documents.
type inputFlags struct {
	from     string
	encoding string
	model    string
	workers  int
	quiet    bool
	noTag    bool
	memory   memorySize
	// reuseTokens is set by commands whose per-document work keeps
	// nothing of the tokens (see pipeline.Options.ReuseTokens); not by
	// find, whose hits keep their documents.
	reuseTokens bool
	// ctx, if set, stops the run early when it is cancelled (find's
	// --limit, a failed write).
	ctx context.Context
	// stdin, if set, is read for the input "-" instead of os.Stdin (check
	// reads standard input first, as it needs its bytes again).
	stdin io.Reader
}

func (f *inputFlags) register(cmd *cobra.Command, tagging bool) {
	fl := cmd.Flags()
	fl.StringVar(&f.from, "from", "", "input format, overriding detection: "+strings.Join(read.Formats(), ", "))
	fl.StringVar(&f.encoding, "encoding", "", "encoding of the text inputs, e.g. windows-1252, iso-8859-15, shift_jis (default: byte order mark, declared charset, UTF-8, else Windows-1252)")
	fl.IntVar(&f.workers, "workers", 0, "documents processed at once (default: one per core)")
	fl.BoolVarP(&f.quiet, "quiet", "q", false, "print no notes or progress on standard error (warnings and errors still)")
	f.memory = defaultMemory
	fl.Var(&f.memory, "memory", "memory to stay within, e.g. 512MiB or 2GiB: count tables get half and drop their rarest entries when full")
	completeChoices(cmd, "from", read.Formats())
	if tagging {
		fl.StringVar(&f.model, "model", "", "tagging model file (default: the embedded English model)")
	}
}

// validateWithOutput checks the input flags and the output format: --to,
// or the format -o's extension names (outputFormat), one of formats; the
// format found is stored in *to.
func (f *inputFlags) validateWithOutput(cmd *cobra.Command, to *string, outPath string, formats []string) error {
	if err := f.validate(cmd); err != nil {
		return err
	}
	format, err := outputFormat(cmd, *to, outPath, formats)
	if err != nil {
		return err
	}
	*to = format
	return nil
}

// validate checks the reading flags before any input is read.
func (f *inputFlags) validate(cmd *cobra.Command) error {
	if f.from != "" {
		if err := checkChoice("from", f.from, read.Formats()); err != nil {
			return err
		}
	}
	return checkWorkers(cmd, f.workers)
}

// problemPrinter writes input problems to standard error as
// "file:line: severity: message" and counts the errors.
type problemPrinter struct {
	w      io.Writer
	quiet  bool
	errors int
}

func (p *problemPrinter) report(pr read.Problem) {
	if pr.Severity == read.Error {
		p.errors++
	}
	if p.quiet && pr.Severity == read.Note {
		return
	}
	fmt.Fprintf(p.w, "%s: %s\n", pr.Severity, printable.Escape(pr.Error()))
}

// runDocs runs the pipeline over the command's inputs with the given
// per-document work, and turns skipped inputs into exit status 1.
func runDocs[R any](f *inputFlags, args []string, tagger pipeline.Tagger,
	mapFn func(*doc.Document) R, reduceFn func(*doc.Document, R)) (pipeline.Stats, error) {
	if len(args) == 0 {
		return pipeline.Stats{}, fmt.Errorf("no input: name files, directories, glob patterns, or - for standard input")
	}
	if f.encoding != "" {
		if _, err := read.LookupEncoding(f.encoding); err != nil {
			return pipeline.Stats{}, fmt.Errorf("--encoding: %v", err)
		}
	}
	pp := &problemPrinter{w: os.Stderr, quiet: f.quiet}
	opt := pipeline.Options{
		Read:    read.Options{Format: f.from, Encoding: f.encoding, Stdin: f.stdin},
		Tagger:  tagger,
		Workers: f.workers,
		Report:  pp.report,

		ReuseTokens: f.reuseTokens,
		Context:     f.ctx,
	}
	// The runtime's limit covers its own memory only, not the program text
	// or the allocator's slack that the system counts too: aim a tenth low.
	debug.SetMemoryLimit(int64(f.memory) / 10 * 9)
	// With that limit in place the collector may let the heap grow to
	// three times the live data between cycles rather than twice (unless
	// the user set GOGC): on the 100 MB benchmark corpus, GOGC=200 against
	// 100 took 2-3% off the CPU time (runs alternated) and raised peak
	// memory from about 420 to 580 MiB.
	if os.Getenv("GOGC") == "" {
		debug.SetGCPercent(gcPercent)
	}
	prog := newProgress(f.quiet)
	opt.Progress = prog.update
	st := pipeline.Run(args, opt, mapFn, reduceFn)
	prog.finish()
	if st.Documents == 0 && pp.errors == 0 {
		return st, exitError{code: 1, msg: "no readable text in the inputs"}
	}
	if pp.errors > 0 && st.Documents == 0 {
		return st, exitError{code: 1, msg: fmt.Sprintf("%d problem(s) with the inputs; no input could be read", pp.errors)}
	}
	if pp.errors > 0 {
		return st, exitError{code: 1, msg: fmt.Sprintf("%d problem(s) with the inputs; the rest was processed", pp.errors)}
	}
	return st, nil
}

// gcPercent is the collector's heap growth target (see runDocs).
const gcPercent = 200

// memorySize is a byte count given as a number with an optional unit.
type memorySize int64

// defaultMemory keeps a run on a large corpus within an ordinary laptop's
// spare memory.
const defaultMemory = memorySize(1 << 30)

func (m *memorySize) String() string { return byteSize(int64(*m)) }

func (m *memorySize) Type() string { return "size" }

// Set reads sizes such as 800MB, 1.5GiB or 2g: the units K, M and G (with
// or without "i" and "B") are powers of 1024; a bare number is bytes.
func (m *memorySize) Set(s string) error {
	t := strings.ToUpper(strings.TrimSpace(s))
	t = strings.TrimSuffix(t, "B")
	t = strings.TrimSuffix(t, "I")
	mult := 1.0
	if n := len(t); n > 0 {
		switch t[n-1] {
		case 'K':
			mult = 1 << 10
		case 'M':
			mult = 1 << 20
		case 'G':
			mult = 1 << 30
		}
		if mult > 1 {
			t = t[:n-1]
		}
	}
	v, err := strconv.ParseFloat(strings.TrimSpace(t), 64)
	if err != nil || math.IsNaN(v) || v*mult < minMemory || v*mult > maxMemory {
		return fmt.Errorf("want a size from 16MiB to 64TiB, such as 512MiB or 2GiB")
	}
	*m = memorySize(v * mult)
	return nil
}

// The bounds of --memory: below 16 MiB the model and one document do not
// fit; above 64 TiB the number is a typing error, not a machine (and
// infinity is refused with it).
const (
	minMemory = 16 << 20
	maxMemory = 64 << 40
)

// tableBudget is the share of --memory given to a command's count tables:
// the rest is for the model, the documents in flight and the garbage
// collector's headroom.
func (f *inputFlags) tableBudget() int64 { return int64(f.memory) / 2 }

// warnPruned tells the user that the memory budget made a count table
// drop its rarest entries: the counts are approximate, so this is a
// warning that --quiet does not hide.
func (f *inputFlags) warnPruned(what string, n int, maxFreq int64) {
	if n == 0 {
		return
	}
	seen := fmt.Sprintf("at most %d times", maxFreq)
	if maxFreq == 1 {
		seen = "once"
	}
	fmt.Fprintf(os.Stderr, "warning: memory budget: dropped %d %s seen %s; counts of %s met again later may be low by up to %d (--memory %s; raise it to keep them)\n",
		n, what, seen, what, maxFreq, f.memory.String())
}
