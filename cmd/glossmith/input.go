package main

import (
	"fmt"
	"io"
	"os"
	"strings"

	"github.com/spf13/cobra"

	"glossmith/tagger/doc"
	"glossmith/tagger/pipeline"
	"glossmith/tagger/read"
)

// inputFlags are the flags of every command that reads documents.
type inputFlags struct {
	from    string
	model   string
	workers int
	quiet   bool
	noTag   bool
}

func (f *inputFlags) register(cmd *cobra.Command, tagging bool) {
	fl := cmd.Flags()
	fl.StringVar(&f.from, "from", "", "input format, overriding detection: "+strings.Join(read.Formats(), ", "))
	fl.IntVar(&f.workers, "workers", 0, "documents processed at once (default: one per core)")
	fl.BoolVarP(&f.quiet, "quiet", "q", false, "print no notes or progress on standard error (warnings and errors still)")
	if tagging {
		fl.StringVar(&f.model, "model", "", "tagging model file (default: the embedded English model)")
	}
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
	fmt.Fprintf(p.w, "%s: %s\n", pr.Severity, pr.Error())
}

// runDocs runs the pipeline over the command's inputs with the given
// per-document work, and turns skipped inputs into exit status 1.
func runDocs[R any](f *inputFlags, args []string, tagger pipeline.Tagger,
	mapFn func(*doc.Document) R, reduceFn func(*doc.Document, R)) (pipeline.Stats, error) {
	if len(args) == 0 {
		return pipeline.Stats{}, fmt.Errorf("no input: name files, directories, glob patterns, or - for standard input")
	}
	pp := &problemPrinter{w: os.Stderr, quiet: f.quiet}
	opt := pipeline.Options{
		Read:    read.Options{Format: f.from},
		Tagger:  tagger,
		Workers: f.workers,
		Report:  pp.report,
	}
	prog := newProgress(f.quiet)
	opt.Progress = prog.update
	st := pipeline.Run(args, opt, mapFn, reduceFn)
	prog.finish()
	if st.Documents == 0 && pp.errors == 0 {
		return st, exitError{code: 1, msg: "no readable text in the inputs"}
	}
	if pp.errors > 0 {
		return st, exitError{code: 1, msg: fmt.Sprintf("%d problem(s) with the inputs; the rest was processed", pp.errors)}
	}
	return st, nil
}
