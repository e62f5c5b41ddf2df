package termbase

import (
	"database/sql"
	"math/rand"
	"os"
	"path/filepath"
	"strconv"
	"sync"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func openTemp(t *testing.T) *Store {
	t.Helper()
	s, err := Open(filepath.Join(t.TempDir(), "tb.sqlite"))
	require.NoError(t, err)
	t.Cleanup(func() { s.Close() })
	s.User = "tester"
	return s
}

// termStatus returns the status of the term with this text, "" if none.
func termStatus(t *testing.T, s *Store, text string) Status {
	t.Helper()
	es, err := s.Entries()
	require.NoError(t, err)
	for _, e := range es {
		for _, x := range e.Terms {
			if x.Text == text {
				return x.Status
			}
		}
	}
	return ""
}

func TestDecisionsAndUndo(t *testing.T) {
	s := openTemp(t)
	c, err := s.Accept("solenoid valve", "set point")
	require.NoError(t, err)
	assert.NotZero(t, c.ID)
	assert.Equal(t, "tester", c.User)
	_, err = s.Reject("next step")
	require.NoError(t, err)
	_, err = s.Defer("drip line")
	require.NoError(t, err)
	assert.Equal(t, Preferred, termStatus(t, s, "solenoid valve"))
	assert.Equal(t, Rejected, termStatus(t, s, "next step"))
	assert.Equal(t, Candidate, termStatus(t, s, "drip line"))

	// Accepting again changes nothing and logs nothing.
	c, err = s.Accept("solenoid valve")
	require.NoError(t, err)
	assert.Zero(t, c.ID)

	before, err := s.Entries()
	require.NoError(t, err)

	// A deprecated synonym, a preferred spelling, a merge, fields.
	_, err = s.SetStatus("solenoid valve", "magnet valve", Deprecated)
	require.NoError(t, err)
	_, err = s.SetPreferred("set point", "setpoint")
	require.NoError(t, err)
	assert.Equal(t, Preferred, termStatus(t, s, "setpoint"))
	assert.Equal(t, Admitted, termStatus(t, s, "set point"), "the former preferred term becomes admitted")
	_, err = s.Merge("set point", "drip line")
	require.NoError(t, err)
	_, err = s.SetDefinition("solenoid valve", "A valve opened by an electromagnet.", "Climate controller manual")
	require.NoError(t, err)
	_, err = s.SetPOS("solenoid valve", "NOUN")
	require.NoError(t, err)
	_, err = s.SetNote("solenoid valve", "Do not use magnet valve.")
	require.NoError(t, err)
	_, err = s.SetSubject("solenoid valve", "irrigation")
	require.NoError(t, err)

	es, err := s.Lookup("magnet valve")
	require.NoError(t, err)
	require.Len(t, es, 1)
	e := es[0]
	assert.Equal(t, "solenoid valve", e.Preferred("en").Text)
	assert.Equal(t, "A valve opened by an electromagnet.", e.Definition)
	assert.Equal(t, "irrigation", e.Subject)
	assert.Equal(t, []string{"Do not use magnet valve."}, e.Notes)
	assert.Equal(t, "NOUN", e.Term("en", "solenoid valve").POS)
	es, err = s.Lookup("drip line")
	require.NoError(t, err)
	require.Len(t, es, 1)
	assert.NotNil(t, es[0].Term("en", "setpoint"), "merged into one entry")

	hist, err := s.History(e.ID)
	require.NoError(t, err)
	assert.GreaterOrEqual(t, len(hist), 5)

	// Undoing the seven changes restores the entries exactly.
	undone, err := s.Undo(7)
	require.NoError(t, err)
	assert.Len(t, undone, 7)
	after, err := s.Entries()
	require.NoError(t, err)
	assert.Equal(t, before, after)

	cs, err := s.Changes(c.Time.AddDate(-1, 0, 0))
	require.NoError(t, err)
	assert.Len(t, cs, 3+7+7)
	assert.Equal(t, "undo", cs[len(cs)-1].Action)
	assert.NotZero(t, cs[len(cs)-1].Undoes)
}

func TestChangeLogIsAppendOnly(t *testing.T) {
	s := openTemp(t)
	_, err := s.Accept("drip emitter")
	require.NoError(t, err)
	_, err = s.db.Exec("UPDATE changes SET user = 'someone else'")
	assert.ErrorContains(t, err, "append-only")
	_, err = s.db.Exec("DELETE FROM changes")
	assert.ErrorContains(t, err, "append-only")
}

func TestReopenKeepsDecisions(t *testing.T) {
	path := filepath.Join(t.TempDir(), "tb.sqlite")
	s, err := Open(path)
	require.NoError(t, err)
	_, err = s.Accept("humidity sensor")
	require.NoError(t, err)
	require.NoError(t, s.Close())
	s, err = Open(path)
	require.NoError(t, err)
	defer s.Close()
	assert.Equal(t, Preferred, termStatus(t, s, "humidity sensor"))
}

// Files that are not termbases are refused with the file's name and left
// as they were.
func TestOpenRefusesOtherFiles(t *testing.T) {
	dir := t.TempDir()
	random := make([]byte, 8192)
	rand.New(rand.NewSource(1)).Read(random)

	good := filepath.Join(dir, "good.sqlite")
	s, err := Open(good)
	require.NoError(t, err)
	_, err = s.Accept("climate controller")
	require.NoError(t, err)
	require.NoError(t, s.Close())
	whole, err := os.ReadFile(good)
	require.NoError(t, err)
	require.Greater(t, len(whole), 4096)

	other := filepath.Join(dir, "other.sqlite")
	db, err := sql.Open("sqlite", other)
	require.NoError(t, err)
	_, err = db.Exec("CREATE TABLE t(x)")
	require.NoError(t, err)
	db.Close()

	corrupt := append([]byte(nil), whole...)
	for i := 4096; i < len(corrupt); i++ {
		corrupt[i] = byte(i * 7)
	}

	for _, tc := range []struct {
		name, want string
		data       []byte
	}{
		{"empty.sqlite", "empty", []byte{}},
		{"random.sqlite", "not an SQLite database", random},
		{"text.sqlite", "not an SQLite database", []byte("term\tstatus\nvalve\tpreferred\n")},
		{"half.sqlite", "truncated", whole[:len(whole)/2+100]},
		{"corrupt.sqlite", "damaged", corrupt},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p := filepath.Join(dir, tc.name)
			require.NoError(t, os.WriteFile(p, tc.data, 0o644))
			_, err := Open(p)
			require.Error(t, err)
			assert.Contains(t, err.Error(), p)
			assert.Contains(t, err.Error(), tc.want)
			got, _ := os.ReadFile(p)
			assert.Equal(t, tc.data, got, "the file is left as it was")
		})
	}
	_, err = Open(other)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "not a glossmith termbase")
}

// reopen closes s and opens its file again, as this glossmith opens an
// older termbase: the schema is then the current one.
func reopen(t *testing.T, s *Store) *Store {
	t.Helper()
	require.NoError(t, s.Close())
	s, err := Open(s.path)
	require.NoError(t, err)
	t.Cleanup(func() { s.Close() })
	var v string
	require.NoError(t, s.db.QueryRow("SELECT value FROM meta WHERE key = 'schema_version'").Scan(&v))
	require.Equal(t, strconv.Itoa(SchemaVersion), v)
	return s
}

// A file at schema version 1 is backed up, then migrated.
func TestMigrationBacksUp(t *testing.T) {
	path := filepath.Join(t.TempDir(), "old.sqlite")
	s, err := open(path, 1)
	require.NoError(t, err)
	_, err = s.Accept("valve")
	require.NoError(t, err)
	s = reopen(t, s)
	_, err = s.Runs()
	assert.NoError(t, err, "the runs table exists after migrating")
	assert.Equal(t, Preferred, termStatus(t, s, "valve"))

	bak, err := Open(path + ".v1.bak")
	require.NoError(t, err, "the backup is a termbase of its own")
	defer bak.Close()
	es, err := bak.Entries()
	require.NoError(t, err)
	require.Len(t, es, 1)
	assert.Equal(t, "valve", es[0].Terms[0].Text)
}

// A termbase at schema 2 — a run recorded as schema 2 stored it, by the
// same SQL — migrates to schema 3 without loss: the run, its candidates'
// counts, forms and contexts and the decisions read back as they were, the
// old run without an acronym link; a run recorded afterwards keeps the
// link (an invented "root zone moisture sensor (RMS)").
func TestMigrationKeepsRecordedRuns(t *testing.T) {
	path := filepath.Join(t.TempDir(), "v2.sqlite")
	s, err := open(path, 2)
	require.NoError(t, err)
	_, err = s.Accept("RMS")
	require.NoError(t, err)
	_, err = s.db.Exec(`INSERT INTO runs(id, label, time, inputs, documents, tokens) VALUES (1, 'v1', '2026-11-02T09:30:00Z', '["manuals/v1"]', 2, 40)`)
	require.NoError(t, err)
	_, err = s.db.Exec(`INSERT INTO run_terms(run_id, term, key, pos, freq, docs, forms, contexts) VALUES
		(1, 'root zone moisture sensor', 'root zone moisture sensor', 'noun', 2, 2, '[{"text":"root zone moisture sensor","count":2}]',
		 '[{"text":"The root zone moisture sensor (RMS) reads the water.","doc":"a.txt","line":1}]'),
		(1, 'RMS', 'rms', 'noun', 3, 2, '[{"text":"RMS","count":3}]', '[]')`)
	require.NoError(t, err)
	s = reopen(t, s)
	assert.FileExists(t, path+".v2.bak")
	assert.Equal(t, Preferred, termStatus(t, s, "RMS"))
	run, rts, err := s.RunTerms("v1")
	require.NoError(t, err)
	assert.Equal(t, []string{"manuals/v1"}, run.Inputs)
	assert.Equal(t, 40, run.Tokens)
	assert.Equal(t, []RunTerm{
		{Term: "RMS", POS: "noun", Freq: 3, Docs: 2, Forms: []Form{{"RMS", 3}}, Contexts: []Context{}},
		{Term: "root zone moisture sensor", POS: "noun", Freq: 2, Docs: 2, Forms: []Form{{"root zone moisture sensor", 2}},
			Contexts: []Context{{Text: "The root zone moisture sensor (RMS) reads the water.", Doc: "a.txt", Line: 1}}},
	}, rts)

	rec := []RunTerm{
		{Term: "RMS", Freq: 3, Docs: 2, FullForm: "root zone moisture sensor"},
		{Term: "root zone moisture sensor", Freq: 2, Docs: 2, Acronym: "RMS"},
		{Term: "drip emitter", Freq: 1, Docs: 1},
	}
	_, err = s.RecordRun(Run{Label: "v2", Tokens: 41}, rec)
	require.NoError(t, err)
	_, rts, err = s.RunTerms("v2")
	require.NoError(t, err)
	assert.Equal(t, rec, rts, "the acronym links come back")
}

// Two stores on one file deciding at the same time both succeed.
func TestConcurrentWriters(t *testing.T) {
	path := filepath.Join(t.TempDir(), "tb.sqlite")
	first, err := Open(path)
	require.NoError(t, err)
	first.Close()
	inParallel(t, path, 2, func(s *Store, w int) error {
		for i := range 50 {
			if _, err := s.Accept(string(rune('a'+w)) + "-term " + string(rune('a'+i%26)) + string(rune('a'+i/26))); err != nil {
				return err
			}
		}
		return nil
	})
	s, err := Open(path)
	require.NoError(t, err)
	defer s.Close()
	es, err := s.Entries()
	require.NoError(t, err)
	assert.Len(t, es, 100)
}

// A new termbase that its creator still holds open — its header and
// tables still in the write-ahead log (SQLite's WAL mode, sqlite.org/wal.html)
// — opens in a second process, as review and terms --termbase run side by
// side; another program's database in the same state is still refused.
func TestOpenWhileTheCreatorHoldsIt(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "new.gtb")
	first, err := Open(path)
	require.NoError(t, err)
	defer first.Close()
	_, err = first.Accept("drip emitter")
	require.NoError(t, err)
	_, err = os.Stat(path + "-wal")
	require.NoError(t, err, "the creator's changes are in the write-ahead log")

	second, err := Open(path)
	require.NoError(t, err, "a second store on a termbase its creator holds open")
	defer second.Close()
	es, err := second.Entries()
	require.NoError(t, err)
	require.Len(t, es, 1)
	assert.Equal(t, "drip emitter", es[0].Terms[0].Text)

	other := filepath.Join(dir, "other.sqlite")
	db, err := sql.Open("sqlite", other)
	require.NoError(t, err)
	defer db.Close()
	db.SetMaxOpenConns(1)
	_, err = db.Exec("PRAGMA journal_mode=WAL")
	require.NoError(t, err)
	_, err = db.Exec("CREATE TABLE t(x); INSERT INTO t VALUES (1)")
	require.NoError(t, err)
	_, err = os.Stat(other + "-wal")
	require.NoError(t, err, "the other program's database is in the write-ahead log too")
	_, err = Open(other)
	require.Error(t, err)
	assert.Contains(t, err.Error(), other)
	assert.Contains(t, err.Error(), "not a glossmith termbase")
	var n int
	require.NoError(t, db.QueryRow("SELECT count(*) FROM t").Scan(&n))
	assert.Equal(t, 1, n, "the other program's data is left as it was")
}

func TestIndexLabels(t *testing.T) {
	s := openTemp(t)
	_, err := s.Accept("set point")
	require.NoError(t, err)
	_, err = s.SetStatus("set point", "setpoint", Admitted)
	require.NoError(t, err)
	_, err = s.SetStatus("solenoid valve", "magnet valve", Deprecated)
	require.NoError(t, err)
	_, err = s.Reject("next step")
	require.NoError(t, err)
	_, err = s.Defer("drip line")
	require.NoError(t, err)
	_, err = s.Decide(Preferred, Proposal{Text: "valve", Forms: []string{"valves", "Valve"}})
	require.NoError(t, err)
	es, err := s.Entries()
	require.NoError(t, err)
	ix := NewIndex(es, "en")
	for _, tc := range []struct {
		term, label, entry string
		forms              []string
	}{
		{"set point", LabelAccepted, "set point", nil},
		{"Set Point", LabelAccepted, "set point", nil},
		{"setpoint", LabelAccepted, "set point", nil},
		{"magnet valve", LabelDeprecated, "solenoid valve", nil},
		{"next step", LabelRejected, "next step", nil},
		{"drip line", LabelNew, "", nil},
		{"valves", LabelVariant, "valve", nil},
		{"set-point", LabelVariant, "set point", []string{"set-point", "setpoint"}},
		{"pressure sensor", LabelNew, "", []string{"pressure sensors"}},
	} {
		label, entry := ix.Label(tc.term, tc.forms)
		assert.Equal(t, tc.label, label, tc.term)
		assert.Equal(t, tc.entry, entry, tc.term)
	}
}

// Store.Index gives the labels NewIndex gives over Entries.
func TestStoreIndexMatchesNewIndex(t *testing.T) {
	s := openTemp(t)
	_, err := s.Decide(Preferred, Proposal{Text: "valve", Forms: []string{"valves", "Valve"}})
	require.NoError(t, err)
	_, err = s.Edit("set point", Edit{Admitted: []string{"set-point"}, Deprecated: []string{"setpoint"}})
	require.NoError(t, err)
	_, err = s.Accept("set point")
	require.NoError(t, err)
	_, err = s.Reject("next step")
	require.NoError(t, err)
	_, err = s.Defer("drip line")
	require.NoError(t, err)
	es, err := s.Entries()
	require.NoError(t, err)
	want := NewIndex(es, "en")
	got, err := s.Index("en")
	require.NoError(t, err)
	assert.Equal(t, want, got)
	assert.Equal(t, 6, got.Len())
}

func TestKey(t *testing.T) {
	for in, want := range map[string]string{
		"set point": "set point", "Set  Point ": "set point", " kPa": "kpa", "": "", "Ventil\u00d6ffnung": "ventilöffnung",
		"a\tb": "a b", "x ": "x",
	} {
		assert.Equal(t, want, Key(in), "%q", in)
	}
}

// A termbase to create in a folder that is not there, or under a file,
// is refused with the folder named, and nothing is created.
func TestOpenNamesAMissingFolder(t *testing.T) {
	dir := t.TempDir()
	notes := filepath.Join(dir, "notes.md")
	require.NoError(t, os.WriteFile(notes, []byte("# notes\n"), 0o644))
	for _, c := range []struct{ name, path, want string }{
		{"missing folder", filepath.Join(dir, "glossaries", "cold-store.db"), "there is no folder " + filepath.Join(dir, "glossaries") + " to create it in"},
		{"missing folders", filepath.Join(dir, "a", "b", "cold-store.db"), "there is no folder " + filepath.Join(dir, "a", "b") + " to create it in"},
		{"a file for a folder", filepath.Join(notes, "cold-store.db"), notes + " is a file, not a folder"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := Open(c.path)
			require.Error(t, err)
			assert.Equal(t, "termbase "+c.path+": "+c.want, err.Error())
			assert.NoDirExists(t, filepath.Join(dir, "glossaries"))
			assert.NoDirExists(t, filepath.Join(dir, "a"))
		})
	}
}

// Undos at once, from processes of their own (here stores of their own on
// one file), each take back a different change: none is undone twice and
// none is lost, as if they had run one after another.
func TestConcurrentUndos(t *testing.T) {
	path := filepath.Join(t.TempDir(), "tb.sqlite")
	first, err := Open(path)
	require.NoError(t, err)
	for i := range 8 {
		_, err := first.Accept("term " + strconv.Itoa(i))
		require.NoError(t, err)
	}
	first.Close()
	const undoers = 4
	undone := make(chan int64, undoers*2)
	inParallel(t, path, undoers, func(s *Store, _ int) error {
		for range 2 {
			cs, err := s.Undo(1)
			if err != nil {
				return err
			}
			for _, c := range cs {
				undone <- c.Undoes
			}
		}
		return nil
	})
	close(undone)
	var got []int64
	for id := range undone {
		got = append(got, id)
	}
	assert.ElementsMatch(t, []int64{1, 2, 3, 4, 5, 6, 7, 8}, got, "each change undone once")
	s, err := Open(path)
	require.NoError(t, err)
	defer s.Close()
	es, err := s.Entries()
	require.NoError(t, err)
	assert.Empty(t, es)
}

// inParallel runs fn in n goroutines at once, each with a store of its
// own on path (as processes of their own would have), and fails on any
// error.
func inParallel(t *testing.T, path string, n int, fn func(s *Store, w int) error) {
	t.Helper()
	var wg sync.WaitGroup
	errs := make(chan error, n)
	for w := range n {
		wg.Add(1)
		go func() {
			defer wg.Done()
			s, err := Open(path)
			if err != nil {
				errs <- err
				return
			}
			defer s.Close()
			if err := fn(s, w); err != nil {
				errs <- err
			}
		}()
	}
	wg.Wait()
	close(errs)
	for err := range errs {
		require.NoError(t, err)
	}
}
