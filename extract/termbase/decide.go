package termbase

import (
	"database/sql"
	"encoding/json"
	"errors"
	"fmt"
	"slices"
	"strings"
)

// find returns the entry and term that text names: a term with that exact
// text in lang, else one with its key, else the term that has it as a
// surface form. Both are nil when there is none.
func (t *Tx) find(text, lang string) (*Entry, *Term, error) {
	ids, err := lookupIDs(t.ctx, t.tx, text)
	if err != nil {
		return nil, nil, t.s.errf(err)
	}
	if len(ids) == 0 {
		return nil, nil, nil
	}
	key := Key(text)
	var fallback *Entry
	var fallbackTerm *Term
	for _, id := range ids {
		e, err := t.entry(id)
		if err != nil || e == nil {
			return nil, nil, err
		}
		for _, pass := range []func(*Term) bool{
			func(x *Term) bool { return x.Text == text },
			func(x *Term) bool { return x.Key == key },
			func(x *Term) bool {
				return slices.ContainsFunc(x.Forms, func(f string) bool { return Key(f) == key })
			},
		} {
			for _, x := range e.Terms {
				if pass(x) {
					if x.Lang == lang {
						return e, x, nil
					}
					if fallback == nil {
						fallback, fallbackTerm = e, x
					}
				}
			}
		}
	}
	return fallback, fallbackTerm, nil
}

// findOrCreate returns the entry and term text names, creating an entry
// with the candidate as its one term (with status st) when there is none.
func (t *Tx) findOrCreate(c Proposal, st Status) (*Entry, *Term, bool, error) {
	lang := c.Lang
	if lang == "" {
		lang = t.s.Lang
	}
	e, term, err := t.find(c.Text, lang)
	if err != nil || e != nil {
		return e, term, false, err
	}
	term = &Term{Lang: lang, Text: c.Text, Status: st, POS: c.POS, Forms: c.Forms, Contexts: clipContexts(c.Contexts)}
	e = &Entry{Terms: []*Term{term}}
	if _, err := t.createEntry(e); err != nil {
		return nil, nil, false, err
	}
	return e, term, true, nil
}

func clipContexts(cs []Context) []Context {
	if len(cs) > MaxContexts {
		return cs[:MaxContexts]
	}
	return cs
}

// Accept marks each text an accepted term: the preferred term of its
// entry, or admitted when the entry already has a preferred one. A text
// that is only a surface form of a term accepts that term.
func (s *Store) Accept(texts ...string) (Change, error) {
	return s.Decide(Preferred, candidates(texts)...)
}

// Reject marks each text rejected: not a term, and not offered again.
func (s *Store) Reject(texts ...string) (Change, error) {
	return s.Decide(Rejected, candidates(texts)...)
}

// Defer leaves each text undecided on purpose (a candidate, marked
// deferred).
func (s *Store) Defer(texts ...string) (Change, error) {
	return s.Decide(Candidate, candidates(texts)...)
}

func candidates(texts []string) []Proposal {
	cs := make([]Proposal, len(texts))
	for i, t := range texts {
		cs[i] = Proposal{Text: t}
	}
	return cs
}

// Decide records one decision for several candidates in one change: st is
// Preferred (accept; admitted when another term of the entry is
// preferred), Admitted (a reviewer's "admitted": admitted whatever else
// the entry holds), Rejected, Candidate (defer) or Deprecated. Forms, contexts and
// a part of speech the candidates carry are added to their terms.
func (s *Store) Decide(st Status, cs ...Proposal) (Change, error) {
	cs = slices.Clone(cs)
	for i := range cs {
		cs[i].Text, cs[i].Forms = nfc(cs[i].Text), nfcAll(cs[i].Forms)
	}
	action := map[Status]string{Preferred: "accept", Admitted: "accept", Rejected: "reject", Candidate: "defer", Deprecated: "deprecate"}[st]
	if action == "" {
		return Change{}, fmt.Errorf("termbase: no decision %q", st)
	}
	texts := make([]string, len(cs))
	for i, c := range cs {
		texts[i] = c.Text
		if strings.TrimSpace(c.Text) == "" {
			return Change{}, fmt.Errorf("termbase: an empty term cannot be decided")
		}
	}
	return s.update(action, joinQuoted(texts), func(t *Tx) error {
		for _, c := range cs {
			if err := t.decide(st, c); err != nil {
				return err
			}
		}
		return nil
	})
}

// decide records one decision (see Decide).
func (t *Tx) decide(st Status, c Proposal) error {
	if len(c.Forms) == 0 && len(c.Contexts) == 0 {
		if err := t.seenInRuns(&c); err != nil {
			return err
		}
	}
	e, term, created, err := t.findOrCreate(c, st)
	if err != nil {
		return err
	}
	if created {
		if st == Candidate {
			return t.markDeferred(e.ID, term)
		}
		return nil
	}
	// A form that is a term of the entry itself (a spelling with its own
	// status) is not one of this term's forms, as in RecordRun.
	c.Forms = slices.DeleteFunc(slices.Clone(c.Forms), func(f string) bool {
		k := Key(f)
		return k != term.Key && slices.ContainsFunc(e.Terms, func(x *Term) bool { return x.Key == k })
	})
	n := *term
	n.Deferred = false
	switch st {
	case Preferred:
		// Accepted: preferred unless another term of the entry is.
		if p := e.Preferred(term.Lang); term.Status != Preferred && p != nil && p != term && p.Status == Preferred {
			n.Status = Admitted
		} else {
			n.Status = Preferred
		}
	case Candidate:
		n.Status, n.Deferred = Candidate, true
	default:
		n.Status = st
	}
	if c.POS != "" && n.POS == "" {
		n.POS = c.POS
	}
	n.Forms, n.Contexts = c.Forms, c.Contexts
	return t.setTerm(term, &n)
}

// seenInRuns gives a proposal that comes without them (a term named on
// the command line or in a review sheet) the surface forms, contexts and
// part of speech of the latest recorded run that has it as a candidate: a
// term decided after its run was recorded shows them, in termbase show and
// the review sheet's contexts, as one decided before does.
func (t *Tx) seenInRuns(c *Proposal) error {
	if t.s.schema < 2 { // no recorded runs before schema 2
		return nil
	}
	var pos, forms, ctxs string
	err := t.tx.QueryRowContext(t.ctx, "SELECT rt.pos, rt.forms, rt.contexts FROM runs r JOIN run_terms rt ON rt.run_id = r.id AND rt.key = ? ORDER BY r.id DESC LIMIT 1", Key(c.Text)).
		Scan(&pos, &forms, &ctxs)
	if errors.Is(err, sql.ErrNoRows) {
		return nil
	}
	if err != nil {
		return t.s.errf(err)
	}
	var fs []Form
	_ = json.Unmarshal([]byte(forms), &fs)
	for _, f := range fs {
		c.Forms = append(c.Forms, f.Text)
	}
	_ = json.Unmarshal([]byte(ctxs), &c.Contexts)
	if c.POS == "" {
		c.POS = pos
	}
	return nil
}

// Verdict is one row of a review: a term, the decision on it (a Status;
// "" for none) and a comment (added to the entry's notes).
type Verdict struct {
	Term    string
	Status  Status
	Comment string
}

// Review records a reviewer's verdicts — from a review sheet — as one
// change.
func (s *Store) Review(what string, vs []Verdict) (Change, error) {
	vs = slices.Clone(vs)
	for i := range vs {
		vs[i].Term = nfc(vs[i].Term)
	}
	return s.update("review", fmt.Sprintf("%s: %d verdict(s)", what, len(vs)), func(t *Tx) error {
		for _, v := range vs {
			if v.Status != "" {
				if err := t.decide(v.Status, Proposal{Text: v.Term}); err != nil {
					return err
				}
			}
			if v.Comment == "" {
				continue
			}
			e, _, _, err := t.findOrCreate(Proposal{Text: v.Term}, Candidate)
			if err != nil {
				return err
			}
			n := *e
			n.Notes = mergeNotes(e.Notes, []string{v.Comment})
			if err := t.setEntry(e, &n); err != nil {
				return err
			}
		}
		return nil
	})
}

func (t *Tx) markDeferred(entryID int64, term *Term) error {
	n := *term
	n.Deferred = true
	n.Forms, n.Contexts = nil, nil
	return t.setTerm(term, &n)
}

// SetStatus gives form the status st in the entry that term names (a term
// or surface form of it): form becomes a term of that entry if it is not
// one (moved out of another entry if it is a term there). Setting
// Preferred makes the entry's former preferred term admitted.
func (s *Store) SetStatus(term, form string, st Status) (Change, error) {
	term, form = nfc(term), nfc(form)
	if _, err := ParseStatus(string(st)); err != nil {
		return Change{}, err
	}
	return s.update("set-status", fmt.Sprintf("%q in the entry of %q: %s", form, term, st), func(t *Tx) error {
		return t.setStatus(term, form, st)
	})
}

// SetPreferred makes form the preferred term of term's entry.
func (s *Store) SetPreferred(term, form string) (Change, error) {
	return s.SetStatus(term, form, Preferred)
}

func (t *Tx) setStatus(term, form string, st Status) error {
	e, _, _, err := t.findOrCreate(Proposal{Text: term}, Candidate)
	if err != nil {
		return err
	}
	lang := t.s.Lang
	target := e.Term(lang, form)
	if target == nil {
		// A term of another entry moves here; else a new term.
		oe, ot, err := t.find(form, lang)
		if err != nil {
			return err
		}
		if ot != nil && ot.Text == form && oe.ID != e.ID {
			n := *ot
			n.EntryID = e.ID
			n.Forms, n.Contexts = nil, nil
			if err := t.setTerm(ot, &n); err != nil {
				return err
			}
			if err := t.dropIfEmpty(oe.ID); err != nil {
				return err
			}
			if e, err = t.entry(e.ID); err != nil {
				return err
			}
			target = e.Term(ot.Lang, form)
		} else {
			if err := t.touch(e.ID); err != nil {
				return err
			}
			target = &Term{Lang: lang, Text: form, Status: st}
			if err := t.insertTerm(e.ID, target); err != nil {
				return err
			}
			e.Terms = append(e.Terms, target)
		}
	}
	if st == Preferred {
		for _, x := range e.Terms {
			if x.ID != target.ID && x.Lang == target.Lang && x.Status == Preferred {
				n := *x
				n.Status = Admitted
				n.Forms, n.Contexts = nil, nil
				if err := t.setTerm(x, &n); err != nil {
					return err
				}
			}
		}
	}
	// A spelling with a status of its own is no longer a surface form of
	// the entry's other terms (what RecordRun keeps of forms).
	if err := t.touch(e.ID); err != nil {
		return err
	}
	res, err := t.exec("DELETE FROM forms WHERE key = ? AND term_id IN (SELECT id FROM terms WHERE entry_id = ? AND id != ?)", Key(form), e.ID, target.ID)
	if err != nil {
		return err
	}
	if k, _ := res.RowsAffected(); k > 0 {
		t.changed = true
	}
	n := *target
	n.Status, n.Deferred = st, false
	n.Forms, n.Contexts = nil, nil
	return t.setTerm(target, &n)
}

// dropIfEmpty deletes an entry left without terms.
func (t *Tx) dropIfEmpty(id int64) error {
	e, err := t.entry(id)
	if err != nil || e == nil || len(e.Terms) > 0 {
		return err
	}
	if err := t.touch(id); err != nil {
		return err
	}
	return t.deleteEntry(id)
}

// Merge makes the entries of term1 and term2 one concept: term2's entry's
// terms join term1's entry (its preferred term becomes admitted when
// term1's entry has one), empty fields are filled from it, its notes are
// added, and it is deleted.
func (s *Store) Merge(term1, term2 string) (Change, error) {
	term1, term2 = nfc(term1), nfc(term2)
	return s.update("merge", fmt.Sprintf("%q and %q", term1, term2), func(t *Tx) error {
		e1, _, _, err := t.findOrCreate(Proposal{Text: term1}, Candidate)
		if err != nil {
			return err
		}
		e2, _, _, err := t.findOrCreate(Proposal{Text: term2}, Candidate)
		if err != nil {
			return err
		}
		if e1.ID == e2.ID {
			return nil
		}
		if err := t.touch(e1.ID); err != nil {
			return err
		}
		if err := t.touch(e2.ID); err != nil {
			return err
		}
		n := e1.filledFrom(e2)
		if err := t.setEntry(e1, &n); err != nil {
			return err
		}
		for _, x := range e2.Terms {
			m := *x
			m.EntryID = e1.ID
			m.Forms, m.Contexts = nil, nil
			if x.Status == Preferred {
				if p := e1.Preferred(x.Lang); p != nil && p.Status == Preferred {
					m.Status = Admitted
				}
			}
			if err := t.setTerm(x, &m); err != nil {
				return err
			}
		}
		return t.deleteEntry(e2.ID)
	})
}

// SetDefinition sets the definition (and its source) of term's entry.
func (s *Store) SetDefinition(term, definition, source string) (Change, error) {
	return s.setEntryField("set-definition", term, definition, func(e *Entry) { e.Definition, e.DefSource = definition, source })
}

// SetNote adds a note to term's entry (an empty note removes the notes).
func (s *Store) SetNote(term, note string) (Change, error) {
	return s.setEntryField("set-note", term, note, func(e *Entry) {
		if note == "" {
			e.Notes = nil
		} else if !slices.Contains(e.Notes, note) {
			e.Notes = append(slices.Clone(e.Notes), note)
		}
	})
}

// SetSubject sets the subject field of term's entry.
func (s *Store) SetSubject(term, subject string) (Change, error) {
	return s.setEntryField("set-subject", term, subject, func(e *Entry) { e.Subject = subject })
}

func (s *Store) setEntryField(action, term, value string, fn func(*Entry)) (Change, error) {
	term = nfc(term)
	return s.update(action, fmt.Sprintf("%q: %q", term, value), func(t *Tx) error {
		e, _, _, err := t.findOrCreate(Proposal{Text: term}, Candidate)
		if err != nil {
			return err
		}
		n := *e
		fn(&n)
		return t.setEntry(e, &n)
	})
}

// SetPOS sets the part of speech of the term text names.
func (s *Store) SetPOS(term, pos string) (Change, error) {
	term = nfc(term)
	if err := CheckPOS(pos); err != nil {
		return Change{}, err
	}
	return s.update("set-pos", fmt.Sprintf("%q: %q", term, pos), func(t *Tx) error {
		_, x, _, err := t.findOrCreate(Proposal{Text: term}, Candidate)
		if err != nil {
			return err
		}
		n := *x
		n.POS = pos
		n.Forms, n.Contexts = nil, nil
		return t.setTerm(x, &n)
	})
}

// Edit is a set of changes to one entry, made as one change by
// Store.Edit. Empty fields are left alone.
type Edit struct {
	Preferred  string   // this form becomes the preferred term
	Admitted   []string // these forms become admitted terms
	Deprecated []string // these forms become deprecated terms
	POS        string   // the named term's part of speech
	Definition string
	DefSource  string
	Note       string // added to the entry's notes
	Subject    string
}

// Edit applies an Edit to the entry term names (created when there is
// none) as one change.
func (s *Store) Edit(term string, ed Edit) (Change, error) {
	term, ed.Preferred = nfc(term), nfc(ed.Preferred)
	ed.Admitted, ed.Deprecated = nfcAll(ed.Admitted), nfcAll(ed.Deprecated)
	if err := CheckPOS(ed.POS); err != nil {
		return Change{}, err
	}
	var parts []string
	add := func(name, v string) {
		if v != "" {
			parts = append(parts, fmt.Sprintf("%s %q", name, v))
		}
	}
	add("preferred", ed.Preferred)
	add("admitted", strings.Join(ed.Admitted, ", "))
	add("deprecated", strings.Join(ed.Deprecated, ", "))
	add("pos", ed.POS)
	add("definition", ed.Definition)
	add("note", ed.Note)
	add("subject", ed.Subject)
	return s.update("set", fmt.Sprintf("%q: %s", term, strings.Join(parts, "; ")), func(t *Tx) error {
		if ed.Preferred != "" {
			if err := t.setStatus(term, ed.Preferred, Preferred); err != nil {
				return err
			}
		}
		for _, f := range ed.Admitted {
			if err := t.setStatus(term, f, Admitted); err != nil {
				return err
			}
		}
		for _, f := range ed.Deprecated {
			if err := t.setStatus(term, f, Deprecated); err != nil {
				return err
			}
		}
		e, x, _, err := t.findOrCreate(Proposal{Text: term}, Candidate)
		if err != nil {
			return err
		}
		if ed.POS != "" {
			n := *x
			n.POS = ed.POS
			n.Forms, n.Contexts = nil, nil
			if err := t.setTerm(x, &n); err != nil {
				return err
			}
		}
		if e, err = t.entry(e.ID); err != nil {
			return err
		}
		n := *e
		if ed.Definition != "" {
			n.Definition, n.DefSource = ed.Definition, ed.DefSource
		}
		if ed.Note != "" {
			n.Notes = mergeNotes(e.Notes, []string{ed.Note})
		}
		if ed.Subject != "" {
			n.Subject = ed.Subject
		}
		return t.setEntry(e, &n)
	})
}
