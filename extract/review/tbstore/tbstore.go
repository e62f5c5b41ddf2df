// Package tbstore lets the review page keep its decisions in a termbase:
// it is review.Store over termbase.Store, one termbase change (one
// transaction, one line of its change log) per action.
package tbstore

import (
	"errors"
	"fmt"

	"glossmith/extract/review"
	"glossmith/extract/termbase"
	"glossmith/extract/termio"
	"glossmith/extract/terms"
)

// Store is a termbase seen as a review.Store. The statuses are those of
// termio.LabelOf, the labelling `terms --termbase` calls, so the page and
// terms call a candidate the same.
type Store struct {
	tb    *termbase.Store
	forms map[string][]string // a candidate's surface forms, for the labels
	pairs map[string]pair     // a candidate's acronym or full form, for the labels
	mine  []int64             // the changes Apply made, oldest first, for Undo
}

// pair is the acronym and the full form the documents link a candidate to.
type pair struct{ acronym, fullForm string }

// New returns the review store of tb for the candidates of ds.
func New(tb *termbase.Store, ds *review.Dataset) *Store {
	s := &Store{tb: tb, forms: make(map[string][]string, len(ds.Candidates)), pairs: map[string]pair{}}
	for i, c := range ds.Candidates {
		if c.Acronym != "" || c.FullForm != "" {
			s.pairs[c.Term] = pair{c.Acronym, c.FullForm}
		}
		var fs []string
		for _, v := range ds.Details[i].Variants {
			fs = append(fs, v.Form)
		}
		s.forms[c.Term] = fs
	}
	return s
}

// smallLookup is the number of candidates up to which Lookup reads their
// entries one by one rather than the whole termbase.
const smallLookup = 16

// Lookup returns the decisions on the named candidates.
func (s *Store) Lookup(names []string) (map[string]review.Decision, error) {
	var entries []*termbase.Entry
	if len(names) > smallLookup {
		all, err := s.tb.Entries()
		if err != nil {
			return nil, err
		}
		entries = all
	} else {
		seen := map[int64]bool{}
		for _, n := range names {
			// The linked acronym or full form too: its entry may label n.
			p := s.pairs[n]
			for _, f := range append([]string{n, p.acronym, p.fullForm}, s.forms[n]...) {
				if f == "" {
					continue
				}
				es, err := s.tb.Lookup(f)
				if err != nil {
					return nil, err
				}
				for _, e := range es {
					if !seen[e.ID] {
						seen[e.ID] = true
						entries = append(entries, e)
					}
				}
			}
		}
	}
	ix := termbase.NewIndex(entries, s.tb.Lang)
	// A key names the entry holding it as a term before one holding it as
	// a surface form (as termbase.Index looks them up), whatever order
	// the entries came in.
	byKey := map[string]*termbase.Entry{}
	termOf := map[string]*termbase.Term{}
	for _, e := range entries {
		for _, t := range e.Terms {
			if _, ok := byKey[t.Key]; !ok && t.Lang == s.tb.Lang {
				byKey[t.Key], termOf[t.Key] = e, t
			}
		}
	}
	for _, e := range entries {
		for _, t := range e.Terms {
			if t.Lang != s.tb.Lang {
				continue
			}
			for _, f := range t.Forms {
				if k := termbase.Key(f); byKey[k] == nil {
					byKey[k] = e
				}
			}
		}
	}
	out := map[string]review.Decision{}
	for _, n := range names {
		p := s.pairs[n]
		label, entry := termio.LabelOf(ix, n, s.forms[n], p.acronym, p.fullForm)
		k := termbase.Key(n)
		e, t := byKey[k], termOf[k]
		switch {
		case e != nil || entry == "":
		case label == termbase.LabelAcronym || label == termbase.LabelFullForm:
			e = byKey[termbase.Key(entry)] // the entry of the accepted partner
		default:
			for _, f := range s.forms[n] {
				if e = byKey[termbase.Key(f)]; e != nil {
					break
				}
			}
		}
		if e == nil {
			continue
		}
		d := review.Decision{Status: review.Status(label), Definition: e.Definition, Forms: map[string]string{}}
		if t != nil && t.Deferred && label == termbase.LabelNew {
			d.Status = review.Deferred
		}
		if p := e.Preferred(s.tb.Lang); p != nil {
			d.Preferred = p.Text
			if entry != "" && termbase.Key(p.Text) != k {
				d.Entry = p.Text
			}
		}
		for _, x := range e.Terms {
			if x.Lang != s.tb.Lang {
				continue
			}
			if x.Status != termbase.Candidate {
				d.Forms[x.Text] = string(x.Status)
			}
			if x.Key != k {
				d.Concept = append(d.Concept, x.Text)
			}
		}
		if len(e.Notes) > 0 {
			d.Note = e.Notes[len(e.Notes)-1]
		}
		if t != nil {
			d.POS = t.POS
		}
		out[n] = d
	}
	return out, nil
}

// Apply records one action as one termbase change.
func (s *Store) Apply(a review.Action) error {
	if err := a.Check(); err != nil {
		return err
	}
	var c termbase.Change
	var err error
	switch a.Kind {
	case review.Accept:
		c, err = s.tb.Decide(termbase.Preferred, s.proposal(a.Term))
	case review.Reject:
		c, err = s.tb.Decide(termbase.Rejected, s.proposal(a.Term))
	case review.Defer:
		c, err = s.tb.Decide(termbase.Candidate, s.proposal(a.Term))
	case review.Prefer:
		c, err = s.tb.SetStatus(a.Term, a.Form, termbase.Preferred)
	case review.Admit:
		c, err = s.tb.SetStatus(a.Term, a.Form, termbase.Admitted)
	case review.Deprecate:
		c, err = s.tb.SetStatus(a.Term, a.Form, termbase.Deprecated)
	case review.Merge:
		c, err = s.tb.Merge(a.Term, a.Other)
	case review.Definition:
		c, err = s.tb.SetDefinition(a.Term, a.Text, "")
	case review.Note:
		c, err = s.tb.SetNote(a.Term, a.Text)
	case review.SetPOS:
		c, err = s.tb.SetPOS(a.Term, a.Text)
	default:
		err = fmt.Errorf("unknown action %q", a.Kind)
	}
	if err == nil && c.ID != 0 {
		s.mine = append(s.mine, c.ID)
	}
	return err
}

// proposal is a decided candidate with its surface forms, so that the
// termbase knows them as forms of the term.
func (s *Store) proposal(term string) termbase.Proposal {
	return termbase.Proposal{Text: term, Forms: s.forms[term]}
}

// Undo takes back the latest change made here (by Apply) that is not
// undone, when no change made elsewhere — termbase commands, another
// page — came after it: one reviewer's undo never takes back another's
// decision. False when there is none left.
func (s *Store) Undo() (bool, error) {
	for len(s.mine) > 0 {
		id := s.mine[len(s.mine)-1]
		_, err := s.tb.UndoIfLatest(id)
		if errors.Is(err, termbase.ErrUndone) {
			s.mine = s.mine[:len(s.mine)-1] // undone elsewhere
			continue
		}
		if err != nil {
			return false, err
		}
		s.mine = s.mine[:len(s.mine)-1]
		return true, nil
	}
	return false, nil
}

// FromRun is the review dataset of a run recorded in the termbase
// (`terms --record LABEL`): its candidates, most frequent first, with
// their forms, contexts and acronym / full-form links (so that New labels
// a pair as the live page does; runs recorded before schema 3 have none).
func FromRun(tb *termbase.Store, label string) (*review.Dataset, error) {
	run, rts, err := tb.RunTerms(label)
	if err != nil {
		return nil, err
	}
	list := make([]review.Listed, len(rts))
	for i, rt := range rts {
		l := review.Listed{Term: rt.Term, POS: rt.POS, Freq: rt.Freq, Docs: rt.Docs, Acronym: rt.Acronym, FullForm: rt.FullForm}
		for _, f := range rt.Forms {
			l.Variants = append(l.Variants, terms.Variant{Form: f.Text, Count: f.Count})
		}
		for _, c := range rt.Contexts {
			l.Contexts = append(l.Contexts, terms.Context{Doc: c.Doc, Line: c.Line, Text: c.Text})
		}
		list[i] = l
	}
	src := fmt.Sprintf("run %q of %s: %d candidates from %d document(s), %d words", run.Label,
		run.Time.Format("2 January 2006 15:04"), len(list), run.Documents, run.Tokens)
	return review.FromList(src, list), nil
}
