package main

import (
	"fmt"
	"os"

	"github.com/spf13/cobra"

	"glossmith/extract/termbase"
	"glossmith/extract/termio"
	"glossmith/extract/terms"
)

// termsTermbase are the termbase flags of terms: label the candidates
// from a termbase, keep only undecided ones, record the run.
type termsTermbase struct {
	store   *termbase.Store // opened by validate, closed by apply
	tf      termbaseFlags
	onlyNew bool
	record  string
	index   *termbase.Index // set by apply: what the writers ask the termbase
}

func (o *termsTermbase) register(cmd *cobra.Command) {
	o.tf.register(cmd.Flags())
	fl := cmd.Flags()
	fl.BoolVar(&o.onlyNew, "new", false, "list only candidates the termbase has no decision on (needs a termbase)")
	fl.StringVar(&o.record, "record", "", "store this run in the termbase under `LABEL` (counts and contexts of every candidate), for termbase diff")
}

// used reports whether a termbase takes part in the run: one is named
// (flag or environment) or needed.
func (o *termsTermbase) used() bool {
	return o.tf.path != "" || os.Getenv(termbaseEnv) != "" || o.onlyNew || o.record != ""
}

// validate settles the termbase file (flag or environment) when one is
// wanted (--new and --record need one), and opens it, so that a file that
// is not a termbase, or a --record label that is taken, stops the run
// before any input is read.
func (o *termsTermbase) validate() error {
	if !o.used() {
		return nil
	}
	if err := o.tf.validate(); err != nil {
		return err
	}
	if o.record == "" {
		// Only --record writes: labelling reads a termbase that is there.
		if err := o.tf.needFile(); err != nil {
			return err
		}
	}
	s, err := o.tf.open()
	if err != nil {
		return err
	}
	if o.record != "" {
		runs, err := s.Runs()
		if err != nil {
			s.Close()
			return exitError{1, err.Error()}
		}
		for _, r := range runs {
			if r.Label == o.record {
				s.Close()
				return exitError{1, fmt.Sprintf("--record %s: %s has a run with this label already (see termbase runs)", o.record, s.Path())}
			}
		}
	}
	o.store = s
	return nil
}

// apply labels every candidate from the termbase (one in-memory index,
// built once), records the run when asked, and keeps only the new ones
// under --new. run describes the run for --record.
func (o *termsTermbase) apply(cands []*terms.Term, run termbase.Run) ([]*terms.Term, error) {
	s := o.store
	if s == nil {
		return cands, nil
	}
	defer s.Close()
	ix, err := s.Index(s.Lang)
	if err != nil {
		return nil, exitError{1, err.Error()}
	}
	termio.Label(ix, cands)
	o.index = ix
	if o.record != "" {
		run.Label = o.record
		if _, err := s.RecordRun(run, termio.RunTerms(cands)); err != nil {
			return nil, exitError{1, err.Error()}
		}
	}
	if o.onlyNew {
		cands = termio.OnlyNew(cands)
	}
	return cands, nil
}

// termStatus is the writers' view of the termbase the candidates were
// labelled from (terms.WriteOptions.TermStatus); nil without one.
func (o *termsTermbase) termStatus() func(string) (string, bool) {
	if o.index == nil {
		return nil
	}
	return termio.TermStatus(o.index)
}
