package termbase

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"sort"
	"time"

	"database/sql"

	"glossmith/extract/termstat"
)

// Import stores entries, one change for all of them. An entry that has a
// term (same language and text) already stored is merged into that entry:
// terms it lacks are added, a status or part of speech given replaces the
// stored one, empty fields are filled and notes added; otherwise it becomes
// a new entry. Importing the same entries twice therefore changes nothing
// the second time. A new term without a status is admitted. what names the
// source in the change log.
func (s *Store) Import(what string, entries []*Entry) (Change, error) {
	return s.update("import", fmt.Sprintf("%s: %d entries", what, len(entries)), func(t *Tx) error {
		index, err := t.termIndex()
		if err != nil {
			return err
		}
		ins, err := newInserter(t)
		if err != nil {
			return err
		}
		defer ins.close()
		for _, e := range entries {
			var target int64
			for _, x := range e.Terms {
				if x.Lang == "" {
					x.Lang = s.Lang
				}
				x.Text, x.Forms = nfc(x.Text), nfcAll(x.Forms)
				if id, ok := index[x.Lang+"\x00"+x.Text]; ok {
					target = id
					break
				}
			}
			if target == 0 {
				id, err := ins.entry(e)
				if err != nil {
					return err
				}
				for _, x := range e.Terms {
					index[x.Lang+"\x00"+x.Text] = id
				}
				continue
			}
			if err := t.mergeInto(target, e); err != nil {
				return err
			}
			for _, x := range e.Terms {
				index[x.Lang+"\x00"+x.Text] = target
			}
		}
		return nil
	})
}

// importedStatus is the status of an imported term that comes without
// one: a glossary's terms are its approved designations.
const importedStatus = Admitted

// termIndex maps "lang\x00text" of every stored term to its entry.
func (t *Tx) termIndex() (map[string]int64, error) {
	rows, err := t.tx.QueryContext(t.ctx, "SELECT lang, text, entry_id FROM terms ORDER BY id DESC")
	if err != nil {
		return nil, t.s.errf(err)
	}
	defer rows.Close()
	m := map[string]int64{}
	for rows.Next() {
		var lang, text string
		var id int64
		if err := rows.Scan(&lang, &text, &id); err != nil {
			return nil, t.s.errf(err)
		}
		m[lang+"\x00"+text] = id
	}
	return m, t.s.errf(rows.Err())
}

// mergeInto merges an imported entry into a stored one.
func (t *Tx) mergeInto(id int64, e *Entry) error {
	old, err := t.entry(id)
	if err != nil || old == nil {
		return err
	}
	n := old.filledFrom(e)
	if err := t.setEntry(old, &n); err != nil {
		return err
	}
	for _, x := range e.Terms {
		have := old.Term(x.Lang, x.Text)
		if have == nil {
			if err := t.touch(id); err != nil {
				return err
			}
			if x.Status == "" {
				x.Status = importedStatus
			}
			if err := t.insertTerm(id, x); err != nil {
				return err
			}
			continue
		}
		m := *have
		if x.Status != "" {
			m.Status, m.Deferred = x.Status, x.Deferred
		}
		if x.POS != "" {
			m.POS = x.POS
		}
		m.Notes = mergeNotes(have.Notes, x.Notes)
		m.Forms, m.Contexts = x.Forms, x.Contexts
		if err := t.setTerm(have, &m); err != nil {
			return err
		}
	}
	return nil
}

// filledFrom returns a copy of e whose empty fields are filled from o and
// whose notes gain those of o it lacks: what a merge keeps of two entries.
func (e *Entry) filledFrom(o *Entry) Entry {
	n := *e
	if n.Subject == "" {
		n.Subject = o.Subject
	}
	if n.Definition == "" {
		n.Definition, n.DefSource = o.Definition, o.DefSource
	}
	n.Notes = mergeNotes(n.Notes, o.Notes)
	return n
}

func mergeNotes(a, b []string) []string {
	out := a
	for _, x := range b {
		found := false
		for _, y := range out {
			if x == y {
				found = true
			}
		}
		if !found {
			if len(out) == len(a) {
				out = append([]string(nil), a...)
			}
			out = append(out, x)
		}
	}
	return out
}

// inserter adds new entries with prepared statements (an import of
// 100,000 entries runs some 300,000 inserts).
type inserter struct {
	t                          *Tx
	entry_, term, form, contxt *sql.Stmt
}

func newInserter(t *Tx) (*inserter, error) {
	ins := &inserter{t: t}
	var err error
	prep := func(q string) *sql.Stmt {
		if err != nil {
			return nil
		}
		var st *sql.Stmt
		st, err = t.tx.PrepareContext(t.ctx, q)
		return st
	}
	ins.entry_ = prep("INSERT INTO entries(ext_id, subject, definition, def_source, notes) VALUES (?, ?, ?, ?, ?)")
	ins.term = prep("INSERT INTO terms(entry_id, lang, text, key, status, deferred, pos, notes) VALUES (?, ?, ?, ?, ?, ?, ?, ?)")
	ins.form = prep("INSERT OR IGNORE INTO forms(term_id, form, key) VALUES (?, ?, ?)")
	ins.contxt = prep("INSERT INTO contexts(term_id, text, doc, line, source) VALUES (?, ?, ?, ?, ?)")
	if err != nil {
		ins.close()
		return nil, t.s.errf(err)
	}
	return ins, nil
}

func (ins *inserter) close() {
	for _, st := range []*sql.Stmt{ins.entry_, ins.term, ins.form, ins.contxt} {
		if st != nil {
			st.Close()
		}
	}
}

func (ins *inserter) entry(e *Entry) (int64, error) {
	t, ctx := ins.t, ins.t.ctx
	res, err := ins.entry_.ExecContext(ctx, e.ExtID, e.Subject, e.Definition, e.DefSource, encodeNotes(e.Notes))
	if err != nil {
		return 0, t.s.errf(err)
	}
	e.ID, _ = res.LastInsertId()
	t.before[e.ID] = nil
	t.changed = true
	for _, x := range e.Terms {
		if x.Status == "" {
			x.Status = importedStatus
		}
		x.Key, x.EntryID = Key(x.Text), e.ID
		res, err := ins.term.ExecContext(ctx, e.ID, x.Lang, x.Text, x.Key, string(x.Status), x.Deferred, x.POS, encodeNotes(x.Notes))
		if err != nil {
			return 0, t.s.errf(err)
		}
		x.ID, _ = res.LastInsertId()
		for _, f := range x.Forms {
			if _, err := ins.form.ExecContext(ctx, x.ID, f, Key(f)); err != nil {
				return 0, t.s.errf(err)
			}
		}
		for _, c := range clipContexts(x.Contexts) {
			if _, err := ins.contxt.ExecContext(ctx, x.ID, c.Text, c.Doc, c.Line, c.Source); err != nil {
				return 0, t.s.errf(err)
			}
		}
	}
	return e.ID, nil
}

// ErrRunExists is returned when a run label is taken.
var ErrRunExists = errors.New("a run with this label is recorded already")

// RecordRun stores a run of term extraction with its candidates' counts
// and contexts, as one change. Stored terms whose key is a candidate's
// gain the surface forms and contexts the run saw, and its part of speech
// when they have none.
func (s *Store) RecordRun(run Run, cands []RunTerm) (Change, error) {
	if run.Label == "" {
		return Change{}, errors.New("termbase: a run needs a label")
	}
	if run.Time.IsZero() {
		run.Time = s.now()
	}
	return s.update("record", fmt.Sprintf("run %q: %d candidates from %d document(s)", run.Label, len(cands), run.Documents), func(t *Tx) error {
		var n int
		if err := t.tx.QueryRowContext(t.ctx, "SELECT COUNT(*) FROM runs WHERE label = ?", run.Label).Scan(&n); err != nil {
			return t.s.errf(err)
		}
		if n > 0 {
			return fmt.Errorf("termbase %s: run %q: %w", s.path, run.Label, ErrRunExists)
		}
		inputs, _ := json.Marshal(run.Inputs)
		res, err := t.exec("INSERT INTO runs(label, time, inputs, documents, tokens) VALUES (?, ?, ?, ?, ?)",
			run.Label, run.Time.UTC().Format(time.RFC3339Nano), string(inputs), run.Documents, run.Tokens)
		if err != nil {
			return err
		}
		id, _ := res.LastInsertId()
		t.runs = append(t.runs, id)
		t.changed = true
		stmt, err := t.tx.PrepareContext(t.ctx, "INSERT OR REPLACE INTO run_terms(run_id, term, key, pos, freq, docs, forms, contexts, acronym, full_form) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)")
		if err != nil {
			return t.s.errf(err)
		}
		defer stmt.Close()
		byKey := map[string]*RunTerm{}
		for i := range cands {
			c := &cands[i]
			forms, _ := json.Marshal(c.Forms)
			ctxs, _ := json.Marshal(clipContexts(c.Contexts))
			if _, err := stmt.ExecContext(t.ctx, id, c.Term, Key(c.Term), c.POS, c.Freq, c.Docs, string(forms), string(ctxs), c.Acronym, c.FullForm); err != nil {
				return t.s.errf(err)
			}
			byKey[Key(c.Term)] = c
		}
		// Stored terms learn what the run saw of them.
		entries, err := loadEntries(t.ctx, t.tx, "")
		if err != nil {
			return t.s.errf(err)
		}
		for _, e := range entries {
			ownTerms := map[string]bool{}
			for _, x := range e.Terms {
				ownTerms[x.Key] = true
			}
			for _, x := range e.Terms {
				c := byKey[x.Key]
				if c == nil {
					continue
				}
				// A form that is a term of the entry itself (a spelling
				// with its own status) is not one of this term's forms.
				var forms []string
				for _, f := range c.Forms {
					if k := Key(f.Text); k == x.Key || !ownTerms[k] {
						forms = append(forms, f.Text)
					}
				}
				if x.POS == "" && c.POS != "" {
					n := *x
					n.POS = c.POS
					n.Forms, n.Contexts = nil, nil
					if err := t.setTerm(x, &n); err != nil {
						return err
					}
				}
				if err := t.addSeen(x, forms, c.Contexts); err != nil {
					return err
				}
			}
		}
		return nil
	})
}

// Runs lists the recorded runs, oldest first.
func (s *Store) Runs() ([]Run, error) {
	rows, err := s.db.Query("SELECT id, label, time, inputs, documents, tokens FROM runs ORDER BY id")
	if err != nil {
		return nil, s.errf(err)
	}
	defer rows.Close()
	var out []Run
	for rows.Next() {
		var r Run
		var ts, inputs string
		if err := rows.Scan(&r.ID, &r.Label, &ts, &inputs, &r.Documents, &r.Tokens); err != nil {
			return nil, s.errf(err)
		}
		r.Time, _ = time.Parse(time.RFC3339Nano, ts)
		_ = json.Unmarshal([]byte(inputs), &r.Inputs)
		out = append(out, r)
	}
	return out, s.errf(rows.Err())
}

// RunTerms returns a recorded run and its candidates, most frequent first.
func (s *Store) RunTerms(label string) (Run, []RunTerm, error) {
	var r Run
	var ts, inputs string
	err := s.db.QueryRow("SELECT id, label, time, inputs, documents, tokens FROM runs WHERE label = ?", label).
		Scan(&r.ID, &r.Label, &ts, &inputs, &r.Documents, &r.Tokens)
	if errors.Is(err, sql.ErrNoRows) {
		return r, nil, fmt.Errorf("termbase %s: no run labelled %q", s.path, label)
	}
	if err != nil {
		return r, nil, s.errf(err)
	}
	r.Time, _ = time.Parse(time.RFC3339Nano, ts)
	_ = json.Unmarshal([]byte(inputs), &r.Inputs)
	rows, err := s.db.Query("SELECT term, pos, freq, docs, forms, contexts, acronym, full_form FROM run_terms WHERE run_id = ? ORDER BY freq DESC, term", r.ID)
	if err != nil {
		return r, nil, s.errf(err)
	}
	defer rows.Close()
	var out []RunTerm
	for rows.Next() {
		var c RunTerm
		var forms, ctxs string
		if err := rows.Scan(&c.Term, &c.POS, &c.Freq, &c.Docs, &forms, &ctxs, &c.Acronym, &c.FullForm); err != nil {
			return r, nil, s.errf(err)
		}
		_ = json.Unmarshal([]byte(forms), &c.Forms)
		_ = json.Unmarshal([]byte(ctxs), &c.Contexts)
		out = append(out, c)
	}
	return r, out, s.errf(rows.Err())
}

// DefaultDiffThreshold is the G² a change in frequency must reach to count
// as significant: 15.13, the χ²(1) critical value for p < 0.0001. A diff
// compares thousands of candidates at once, so the usual 3.84 (p < 0.05)
// would call dozens of them changed by chance alone.
const DefaultDiffThreshold = 15.13

// DiffRow is one term that changed between two runs.
type DiffRow struct {
	Term  string  `json:"term"`
	Kind  string  `json:"kind"` // new, gone, rose, fell
	Freq1 int     `json:"freq1"`
	Freq2 int     `json:"freq2"`
	Per1  float64 `json:"per_million1"` // relative frequencies, per million words
	Per2  float64 `json:"per_million2"`
	G2    float64 `json:"g2"` // signed: positive when relatively more frequent in the later run
}

// Diff compares two recorded runs: candidates only in the later one (new),
// only in the earlier one (gone), and those whose frequency relative to
// the run's size rose or fell with |G²| ≥ threshold (Dunning 1993,
// "Accurate methods for the statistics of surprise and coincidence", over
// the 2×2 table of the term's count against the other words of each run).
// New and gone terms are listed when seen at least minFreq times in the
// run that has them. Rows come in the order new, gone, rose, fell; within
// a kind by |G²| (new and gone by frequency), then term.
func (s *Store) Diff(label1, label2 string, threshold float64, minFreq int) ([]DiffRow, error) {
	r1, t1, err := s.RunTerms(label1)
	if err != nil {
		return nil, err
	}
	r2, t2, err := s.RunTerms(label2)
	if err != nil {
		return nil, err
	}
	return diff(r1, t1, r2, t2, threshold, minFreq), nil
}

func diff(r1 Run, t1 []RunTerm, r2 Run, t2 []RunTerm, threshold float64, minFreq int) []DiffRow {
	n1, n2 := float64(r1.Tokens), float64(r2.Tokens)
	per := func(f int, n float64) float64 {
		if n <= 0 {
			return 0
		}
		return float64(f) / n * 1e6
	}
	m1 := map[string]RunTerm{}
	for _, x := range t1 {
		m1[Key(x.Term)] = x
	}
	seen := map[string]bool{}
	var rows []DiffRow
	for _, x := range t2 {
		k := Key(x.Term)
		seen[k] = true
		old, ok := m1[k]
		row := DiffRow{Term: x.Term, Freq1: old.Freq, Freq2: x.Freq, Per1: per(old.Freq, n1), Per2: per(x.Freq, n2)}
		row.G2 = termstat.Contrast{Study: float64(x.Freq), Reference: float64(old.Freq), StudySize: math.Max(n2, float64(x.Freq)), ReferenceSize: math.Max(n1, float64(old.Freq))}.G2()
		switch {
		case !ok && x.Freq < minFreq:
			continue
		case !ok:
			row.Kind = "new"
		case row.G2 >= threshold:
			row.Kind = "rose"
		case row.G2 <= -threshold:
			row.Kind = "fell"
		default:
			continue
		}
		rows = append(rows, row)
	}
	for _, x := range t1 {
		if seen[Key(x.Term)] || x.Freq < minFreq {
			continue
		}
		row := DiffRow{Term: x.Term, Kind: "gone", Freq1: x.Freq, Per1: per(x.Freq, n1)}
		row.G2 = termstat.Contrast{Study: 0, Reference: float64(x.Freq), StudySize: math.Max(n2, 0), ReferenceSize: math.Max(n1, float64(x.Freq))}.G2()
		rows = append(rows, row)
	}
	order := map[string]int{"new": 0, "gone": 1, "rose": 2, "fell": 3}
	sort.SliceStable(rows, func(i, j int) bool {
		a, b := rows[i], rows[j]
		if a.Kind != b.Kind {
			return order[a.Kind] < order[b.Kind]
		}
		ga, gb := math.Abs(a.G2), math.Abs(b.G2)
		if a.Kind == "new" || a.Kind == "gone" {
			ga, gb = float64(a.Freq1+a.Freq2), float64(b.Freq1+b.Freq2)
		}
		if ga != gb {
			return ga > gb
		}
		return a.Term < b.Term
	})
	return rows
}

var _ = context.Background
