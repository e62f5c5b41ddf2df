package termbase

import (
	"context"
	"database/sql"
	"encoding/json"
	"fmt"
	"strings"
	"time"
)

// querier is what reading needs of a *sql.DB or a *sql.Tx.
type querier interface {
	QueryContext(ctx context.Context, query string, args ...any) (*sql.Rows, error)
	QueryRowContext(ctx context.Context, query string, args ...any) *sql.Row
	ExecContext(ctx context.Context, query string, args ...any) (sql.Result, error)
}

func (s *Store) errf(err error) error {
	if err == nil {
		return nil
	}
	return fmt.Errorf("termbase %s: %w", s.path, err)
}

// Entries loads every entry with its terms, forms and contexts, in id
// order (terms in id order within an entry).
func (s *Store) Entries() ([]*Entry, error) {
	es, err := loadEntries(context.Background(), s.db, "")
	return es, s.errf(err)
}

// Entry reads one entry; nil when there is none with that id.
func (s *Store) Entry(id int64) (*Entry, error) {
	e, err := loadEntry(context.Background(), s.db, id)
	return e, s.errf(err)
}

func loadEntry(ctx context.Context, q querier, id int64) (*Entry, error) {
	es, err := loadEntries(ctx, q, fmt.Sprintf(" = %d", id))
	if err != nil || len(es) == 0 {
		return nil, err
	}
	return es[0], nil
}

// loadEntries reads the entries whose id matches the condition cond (an
// SQL fragment after "id", "" for all) with four queries.
func loadEntries(ctx context.Context, q querier, cond string) ([]*Entry, error) {
	where := ""
	if cond != "" {
		where = " WHERE id" + cond
	}
	rows, err := q.QueryContext(ctx, "SELECT id, ext_id, subject, definition, def_source, notes FROM entries"+where+" ORDER BY id")
	if err != nil {
		return nil, err
	}
	var entries []*Entry
	byID := map[int64]*Entry{}
	for rows.Next() {
		e := &Entry{}
		var notes string
		if err := rows.Scan(&e.ID, &e.ExtID, &e.Subject, &e.Definition, &e.DefSource, &notes); err != nil {
			rows.Close()
			return nil, err
		}
		e.Notes = decodeNotes(notes)
		entries = append(entries, e)
		byID[e.ID] = e
	}
	rows.Close()
	if err := rows.Err(); err != nil {
		return nil, err
	}
	if len(entries) == 0 {
		return nil, nil
	}
	twhere := ""
	if cond != "" {
		twhere = " WHERE entry_id" + cond
	}
	rows, err = q.QueryContext(ctx, "SELECT id, entry_id, lang, text, key, status, deferred, pos, notes FROM terms"+twhere+" ORDER BY id")
	if err != nil {
		return nil, err
	}
	byTerm := map[int64]*Term{}
	for rows.Next() {
		t := &Term{}
		var notes string
		if err := rows.Scan(&t.ID, &t.EntryID, &t.Lang, &t.Text, &t.Key, &t.Status, &t.Deferred, &t.POS, &notes); err != nil {
			rows.Close()
			return nil, err
		}
		t.Notes = decodeNotes(notes)
		if e := byID[t.EntryID]; e != nil {
			e.Terms = append(e.Terms, t)
			byTerm[t.ID] = t
		}
	}
	rows.Close()
	if err := rows.Err(); err != nil {
		return nil, err
	}
	fwhere, cwhere := "", ""
	if cond != "" {
		fwhere = " WHERE term_id IN (SELECT id FROM terms WHERE entry_id" + cond + ")"
		cwhere = fwhere
	}
	rows, err = q.QueryContext(ctx, "SELECT term_id, form FROM forms"+fwhere+" ORDER BY term_id, form")
	if err != nil {
		return nil, err
	}
	for rows.Next() {
		var id int64
		var f string
		if err := rows.Scan(&id, &f); err != nil {
			rows.Close()
			return nil, err
		}
		if t := byTerm[id]; t != nil {
			t.Forms = append(t.Forms, f)
		}
	}
	rows.Close()
	if err := rows.Err(); err != nil {
		return nil, err
	}
	rows, err = q.QueryContext(ctx, "SELECT term_id, text, doc, line, source FROM contexts"+cwhere+" ORDER BY term_id, id")
	if err != nil {
		return nil, err
	}
	for rows.Next() {
		var id int64
		var c Context
		if err := rows.Scan(&id, &c.Text, &c.Doc, &c.Line, &c.Source); err != nil {
			rows.Close()
			return nil, err
		}
		if t := byTerm[id]; t != nil {
			t.Contexts = append(t.Contexts, c)
		}
	}
	rows.Close()
	return entries, rows.Err()
}

func decodeNotes(s string) []string {
	var notes []string
	if s == "" || s == "[]" {
		return nil
	}
	if json.Unmarshal([]byte(s), &notes) != nil {
		return []string{s}
	}
	return notes
}

func encodeNotes(notes []string) string {
	if len(notes) == 0 {
		return "[]"
	}
	b, _ := json.Marshal(notes)
	return string(b)
}

// Lookup returns the entries that hold text as a term or a surface form:
// those with the exact text if any, else those with its Key.
func (s *Store) Lookup(text string) ([]*Entry, error) {
	text = nfc(text)
	ids, err := lookupIDs(context.Background(), s.db, text)
	if err != nil {
		return nil, s.errf(err)
	}
	var out []*Entry
	for _, id := range ids {
		e, err := loadEntry(context.Background(), s.db, id)
		if err != nil {
			return nil, s.errf(err)
		}
		if e != nil {
			out = append(out, e)
		}
	}
	return out, nil
}

// lookupIDs finds entry ids by exact term text, then by term key, then by
// surface form key.
func lookupIDs(ctx context.Context, q querier, text string) ([]int64, error) {
	for _, query := range []struct{ sql, arg string }{
		{"SELECT DISTINCT entry_id FROM terms WHERE text = ? ORDER BY entry_id", text},
		{"SELECT DISTINCT entry_id FROM terms WHERE key = ? ORDER BY entry_id", Key(text)},
		{"SELECT DISTINCT t.entry_id FROM forms f JOIN terms t ON t.id = f.term_id WHERE f.key = ? ORDER BY t.entry_id", Key(text)},
	} {
		ids, err := queryIDs(ctx, q, query.sql, query.arg)
		if err != nil || len(ids) > 0 {
			return ids, err
		}
	}
	return nil, nil
}

func queryIDs(ctx context.Context, q querier, query string, args ...any) ([]int64, error) {
	rows, err := q.QueryContext(ctx, query, args...)
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	var ids []int64
	for rows.Next() {
		var id int64
		if err := rows.Scan(&id); err != nil {
			return nil, err
		}
		ids = append(ids, id)
	}
	return ids, rows.Err()
}

const changeCols = `c.id, c.time, c.user, c.action, c.summary, COALESCE(c.undoes, 0),
	COALESCE((SELECT u.id FROM changes u WHERE u.undoes = c.id), 0)`

func scanChanges(rows *sql.Rows) ([]Change, error) {
	defer rows.Close()
	var out []Change
	for rows.Next() {
		var c Change
		var ts string
		if err := rows.Scan(&c.ID, &ts, &c.User, &c.Action, &c.Summary, &c.Undoes, &c.UndoneBy); err != nil {
			return nil, err
		}
		c.Time, _ = time.Parse(time.RFC3339Nano, ts)
		out = append(out, c)
	}
	return out, rows.Err()
}

// Changes returns the change log from the oldest change on, or only the
// changes at or after since when it is not zero.
func (s *Store) Changes(since time.Time) ([]Change, error) {
	rows, err := s.db.Query("SELECT "+changeCols+" FROM changes c WHERE c.time >= ? ORDER BY c.id", since.UTC().Format(time.RFC3339Nano))
	if err != nil {
		return nil, s.errf(err)
	}
	cs, err := scanChanges(rows)
	return cs, s.errf(err)
}

// History returns the changes that touched an entry, oldest first.
func (s *Store) History(entryID int64) ([]Change, error) {
	rows, err := s.db.Query("SELECT "+changeCols+" FROM changes c JOIN entry_changes ec ON ec.change_id = c.id WHERE ec.entry_id = ? ORDER BY c.id", entryID)
	if err != nil {
		return nil, s.errf(err)
	}
	cs, err := scanChanges(rows)
	return cs, s.errf(err)
}

// ChangedSince returns the ids of the entries changed at or after t.
func (s *Store) ChangedSince(t time.Time) (map[int64]bool, error) {
	ids, err := queryIDs(context.Background(), s.db, "SELECT DISTINCT ec.entry_id FROM entry_changes ec JOIN changes c ON c.id = ec.change_id WHERE c.time >= ?", t.UTC().Format(time.RFC3339Nano))
	if err != nil {
		return nil, s.errf(err)
	}
	m := make(map[int64]bool, len(ids))
	for _, id := range ids {
		m[id] = true
	}
	return m, nil
}

// joinQuoted quotes texts for a change summary.
func joinQuoted(texts []string) string {
	q := make([]string, len(texts))
	for i, t := range texts {
		q[i] = fmt.Sprintf("%q", t)
	}
	return clip(strings.Join(q, ", "), 300)
}
