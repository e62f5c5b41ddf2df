package termbase

import (
	"context"
	"database/sql"
	"encoding/json"
	"errors"
	"fmt"
	"maps"
	"slices"
	"time"
)

// Tx is one change in progress. Every write goes through it, so that the
// entries it touches are saved as they were before (for undo) and the
// change log names them.
type Tx struct {
	s       *Store
	ctx     context.Context
	tx      *sql.Tx
	before  map[int64]*Entry // nil: the entry did not exist before
	runs    []int64          // runs recorded
	changed bool
	undoes  int64  // the change an undo takes back, set by fn (0: updateUndo's)
	summary string // the change's summary, when fn sets it
}

// restore is what the change log keeps to undo a change.
type restore struct {
	Entries []restoreEntry `json:"entries,omitempty"`
	Runs    []int64        `json:"runs,omitempty"`
}

type restoreEntry struct {
	ID     int64  `json:"id"`
	Before *Entry `json:"before"` // null: did not exist
}

// update runs fn in one transaction and logs it as one change. When fn
// changed nothing, nothing is logged and the Change has ID 0.
func (s *Store) update(action, summary string, fn func(*Tx) error) (Change, error) {
	return s.updateUndo(action, summary, 0, fn)
}

func (s *Store) updateUndo(action, summary string, undoes int64, fn func(*Tx) error) (Change, error) {
	ctx := context.Background()
	sqlTx, err := s.db.BeginTx(ctx, nil)
	if err != nil {
		return Change{}, s.errf(err)
	}
	defer sqlTx.Rollback()
	t := &Tx{s: s, ctx: ctx, tx: sqlTx, before: map[int64]*Entry{}}
	if err := fn(t); err != nil {
		return Change{}, err
	}
	if !t.changed {
		return Change{}, nil
	}
	if t.undoes != 0 {
		undoes, summary = t.undoes, t.summary
	}
	r := restore{Runs: t.runs}
	for _, id := range slices.Sorted(maps.Keys(t.before)) {
		r.Entries = append(r.Entries, restoreEntry{ID: id, Before: t.before[id]})
	}
	blob, err := json.Marshal(r)
	if err != nil {
		return Change{}, err
	}
	c := Change{Time: s.now().UTC(), User: s.User, Action: action, Summary: clip(summary, 400), Undoes: undoes}
	var und any
	if undoes != 0 {
		und = undoes
	}
	res, err := sqlTx.ExecContext(ctx, "INSERT INTO changes(time, user, action, summary, undoes, restore) VALUES (?, ?, ?, ?, ?, ?)",
		c.Time.Format(time.RFC3339Nano), c.User, c.Action, c.Summary, und, blob)
	if err != nil {
		return Change{}, s.errf(err)
	}
	c.ID, _ = res.LastInsertId()
	stmt, err := sqlTx.PrepareContext(ctx, "INSERT INTO entry_changes(change_id, entry_id) VALUES (?, ?)")
	if err != nil {
		return Change{}, s.errf(err)
	}
	for id := range t.before {
		if _, err := stmt.ExecContext(ctx, c.ID, id); err != nil {
			return Change{}, s.errf(err)
		}
	}
	stmt.Close()
	if err := sqlTx.Commit(); err != nil {
		return Change{}, s.errf(err)
	}
	return c, nil
}

// clip shortens s to at most n bytes at a character boundary.
func clip(s string, n int) string {
	if len(s) <= n {
		return s
	}
	for n > 0 && s[n]&0xC0 == 0x80 {
		n--
	}
	return s[:n] + "…"
}

// touch saves an existing entry as it is before the change first modifies
// it.
func (t *Tx) touch(id int64) error {
	if _, ok := t.before[id]; ok {
		return nil
	}
	e, err := loadEntry(t.ctx, t.tx, id)
	if err != nil {
		return t.s.errf(err)
	}
	if e == nil {
		return fmt.Errorf("termbase %s: no entry %d", t.s.path, id)
	}
	t.before[id] = e
	return nil
}

func (t *Tx) exec(query string, args ...any) (sql.Result, error) {
	res, err := t.tx.ExecContext(t.ctx, query, args...)
	if err != nil {
		return nil, t.s.errf(err)
	}
	return res, nil
}

// entry reads an entry inside the transaction.
func (t *Tx) entry(id int64) (*Entry, error) {
	e, err := loadEntry(t.ctx, t.tx, id)
	return e, t.s.errf(err)
}

// createEntry inserts e with its terms (their ids are set) and returns its
// id.
func (t *Tx) createEntry(e *Entry) (int64, error) {
	var id any
	if e.ID != 0 {
		id = e.ID
	}
	res, err := t.exec("INSERT INTO entries(id, ext_id, subject, definition, def_source, notes) VALUES (?, ?, ?, ?, ?, ?)",
		id, e.ExtID, e.Subject, e.Definition, e.DefSource, encodeNotes(e.Notes))
	if err != nil {
		return 0, err
	}
	e.ID, _ = res.LastInsertId()
	if _, ok := t.before[e.ID]; !ok {
		t.before[e.ID] = nil
	}
	t.changed = true
	for _, term := range e.Terms {
		if err := t.insertTerm(e.ID, term); err != nil {
			return 0, err
		}
	}
	return e.ID, nil
}

// insertTerm adds a term (with its forms and contexts) to entry id, which
// the caller has touched or created.
func (t *Tx) insertTerm(entryID int64, term *Term) error {
	if term.Lang == "" {
		term.Lang = t.s.Lang
	}
	if term.Status == "" {
		term.Status = Candidate
	}
	term.Key = Key(term.Text)
	term.EntryID = entryID
	var id any
	if term.ID != 0 {
		id = term.ID
	}
	res, err := t.exec("INSERT INTO terms(id, entry_id, lang, text, key, status, deferred, pos, notes) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)",
		id, entryID, term.Lang, term.Text, term.Key, string(term.Status), term.Deferred, term.POS, encodeNotes(term.Notes))
	if err != nil {
		return err
	}
	term.ID, _ = res.LastInsertId()
	t.changed = true
	for _, f := range term.Forms {
		if _, err := t.exec("INSERT OR IGNORE INTO forms(term_id, form, key) VALUES (?, ?, ?)", term.ID, f, Key(f)); err != nil {
			return err
		}
	}
	for _, c := range term.Contexts {
		if _, err := t.exec("INSERT INTO contexts(term_id, text, doc, line, source) VALUES (?, ?, ?, ?, ?)", term.ID, c.Text, c.Doc, c.Line, c.Source); err != nil {
			return err
		}
	}
	return nil
}

// deleteEntry removes an entry with its terms (the caller has touched it).
func (t *Tx) deleteEntry(id int64) error {
	if _, err := t.exec("DELETE FROM entries WHERE id = ?", id); err != nil {
		return err
	}
	t.changed = true
	return nil
}

// setEntry writes an entry's own fields when they differ from what is
// stored.
func (t *Tx) setEntry(old, e *Entry) error {
	if old.ExtID == e.ExtID && old.Subject == e.Subject && old.Definition == e.Definition &&
		old.DefSource == e.DefSource && encodeNotes(old.Notes) == encodeNotes(e.Notes) {
		return nil
	}
	if err := t.touch(old.ID); err != nil {
		return err
	}
	_, err := t.exec("UPDATE entries SET ext_id = ?, subject = ?, definition = ?, def_source = ?, notes = ? WHERE id = ?",
		e.ExtID, e.Subject, e.Definition, e.DefSource, encodeNotes(e.Notes), old.ID)
	t.changed = true
	return err
}

// setTerm writes a term's own fields (status, deferred, POS, notes, entry)
// when they differ, and adds forms and contexts it lacks.
func (t *Tx) setTerm(old, n *Term) error {
	same := old.Status == n.Status && old.Deferred == n.Deferred && old.POS == n.POS &&
		encodeNotes(old.Notes) == encodeNotes(n.Notes) && old.EntryID == n.EntryID && old.Text == n.Text
	if !same {
		if err := t.touch(old.EntryID); err != nil {
			return err
		}
		if n.EntryID != old.EntryID {
			if err := t.touch(n.EntryID); err != nil {
				return err
			}
		}
		if _, err := t.exec("UPDATE terms SET entry_id = ?, text = ?, key = ?, status = ?, deferred = ?, pos = ?, notes = ? WHERE id = ?",
			n.EntryID, n.Text, Key(n.Text), string(n.Status), n.Deferred, n.POS, encodeNotes(n.Notes), old.ID); err != nil {
			return err
		}
		t.changed = true
	}
	return t.addSeen(old, n.Forms, n.Contexts)
}

// addSeen adds the forms and contexts a term lacks (contexts up to
// MaxContexts, one per document first).
func (t *Tx) addSeen(old *Term, forms []string, contexts []Context) error {
	have := map[string]bool{}
	for _, f := range old.Forms {
		have[f] = true
	}
	for _, f := range forms {
		if have[f] || f == "" {
			continue
		}
		if err := t.touch(old.EntryID); err != nil {
			return err
		}
		if _, err := t.exec("INSERT OR IGNORE INTO forms(term_id, form, key) VALUES (?, ?, ?)", old.ID, f, Key(f)); err != nil {
			return err
		}
		have[f] = true
		old.Forms = append(old.Forms, f)
		t.changed = true
	}
	for _, c := range contexts {
		if len(old.Contexts) >= MaxContexts {
			break
		}
		dup := false
		for _, o := range old.Contexts {
			if o.Text == c.Text {
				dup = true
			}
		}
		if dup || c.Text == "" {
			continue
		}
		if err := t.touch(old.EntryID); err != nil {
			return err
		}
		if _, err := t.exec("INSERT INTO contexts(term_id, text, doc, line, source) VALUES (?, ?, ?, ?, ?)", old.ID, c.Text, c.Doc, c.Line, c.Source); err != nil {
			return err
		}
		old.Contexts = append(old.Contexts, c)
		t.changed = true
	}
	return nil
}

// restoreEntries puts entries back as a change found them.
func (t *Tx) restoreEntries(r restore) error {
	for _, re := range r.Entries {
		if cur, err := t.entry(re.ID); err != nil {
			return err
		} else if cur != nil {
			if err := t.touch(re.ID); err != nil {
				return err
			}
			if err := t.deleteEntry(re.ID); err != nil {
				return err
			}
		}
	}
	for _, re := range r.Entries {
		if re.Before == nil {
			continue
		}
		if _, ok := t.before[re.ID]; !ok {
			t.before[re.ID] = nil
		}
		e := *re.Before
		if _, err := t.createEntry(&e); err != nil {
			return err
		}
	}
	for _, id := range r.Runs {
		if _, err := t.exec("DELETE FROM runs WHERE id = ?", id); err != nil {
			return err
		}
		t.changed = true
	}
	return nil
}

// Undo undoes the last n changes that are not undos and not undone yet,
// newest first, each as a logged change of its own. It returns the undo
// changes made (fewer than n when the log runs out).
func (s *Store) Undo(n int) ([]Change, error) {
	var done []Change
	for range n {
		c, err := s.undoLatest(0)
		if errors.Is(err, errNothingToUndo) {
			break
		}
		if err != nil {
			return done, err
		}
		done = append(done, c)
	}
	return done, nil
}

// ErrUndone is UndoIfLatest's error for a change that is undone already.
var ErrUndone = errors.New("undone already")

var errNothingToUndo = errors.New("nothing to undo")

// UndoIfLatest undoes change id when it is the latest change not undone,
// so that one person's undo (the review page's) never takes back a change
// someone else made after theirs: then it names that change and undoes
// nothing. A change undone already is ErrUndone.
func (s *Store) UndoIfLatest(id int64) (Change, error) {
	return s.undoLatest(id)
}

// undoLatest undoes the latest change that is not an undo and not undone
// (it must be change want, unless want is 0), reading it inside the
// transaction so that two undos at once never take back one change twice.
func (s *Store) undoLatest(want int64) (Change, error) {
	return s.updateUndo("undo", "", 0, func(t *Tx) error {
		if want != 0 {
			var undone bool
			if err := t.tx.QueryRowContext(t.ctx, "SELECT EXISTS(SELECT 1 FROM changes WHERE undoes = ?)", want).Scan(&undone); err != nil {
				return t.s.errf(err)
			}
			if undone {
				return fmt.Errorf("termbase %s: change #%d: %w", s.path, want, ErrUndone)
			}
		}
		var id int64
		var user, action, summary string
		var blob []byte
		err := t.tx.QueryRowContext(t.ctx, `SELECT c.id, c.user, c.action, c.summary, c.restore FROM changes c
			WHERE c.undoes IS NULL AND NOT EXISTS (SELECT 1 FROM changes u WHERE u.undoes = c.id)
			ORDER BY c.id DESC LIMIT 1`).Scan(&id, &user, &action, &summary, &blob)
		if errors.Is(err, sql.ErrNoRows) {
			return errNothingToUndo
		}
		if err != nil {
			return t.s.errf(err)
		}
		if want != 0 && id != want {
			return fmt.Errorf("change #%d, %s by %s (%s), came after; undo it first (termbase undo)", id, action, user, clip(summary, 120))
		}
		var r restore
		if err := json.Unmarshal(blob, &r); err != nil {
			return fmt.Errorf("termbase %s: change %d cannot be undone: %w", s.path, id, err)
		}
		if err := t.restoreEntries(r); err != nil {
			return err
		}
		t.changed = true // an undo of a no-op is still logged, so it is not offered again
		t.undoes, t.summary = id, fmt.Sprintf("undo #%d %s: %s", id, action, summary)
		return nil
	})
}
