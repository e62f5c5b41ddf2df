package termbase

import (
	"bytes"
	"context"
	"database/sql"
	"encoding/binary"
	"errors"
	"fmt"
	"io"
	"net/url"
	"os"
	"os/user"
	"path/filepath"
	"strconv"
	"time"

	_ "modernc.org/sqlite" // registers the "sqlite" driver
)

// applicationID marks a glossmith termbase in the SQLite header (offset
// 68, PRAGMA application_id): the bytes "GLSM".
const applicationID = 0x474C534D

// BusyTimeout is how long a writer waits for another process's
// transaction before giving up.
const BusyTimeout = 30 * time.Second

// migrations[i] brings the schema from version i to i+1. Append, never
// edit: a file at version v runs migrations[v:].
var migrations = []string{
	// 1: concepts, terms and the change log.
	`CREATE TABLE meta(key TEXT PRIMARY KEY, value TEXT NOT NULL);
	CREATE TABLE entries(
		id INTEGER PRIMARY KEY AUTOINCREMENT,
		ext_id TEXT NOT NULL DEFAULT '',
		subject TEXT NOT NULL DEFAULT '',
		definition TEXT NOT NULL DEFAULT '',
		def_source TEXT NOT NULL DEFAULT '',
		notes TEXT NOT NULL DEFAULT '[]');
	CREATE TABLE terms(
		id INTEGER PRIMARY KEY AUTOINCREMENT,
		entry_id INTEGER NOT NULL REFERENCES entries(id) ON DELETE CASCADE,
		lang TEXT NOT NULL,
		text TEXT NOT NULL,
		key TEXT NOT NULL,
		status TEXT NOT NULL CHECK(status IN ('preferred','admitted','deprecated','candidate','rejected')),
		deferred INTEGER NOT NULL DEFAULT 0,
		pos TEXT NOT NULL DEFAULT '',
		notes TEXT NOT NULL DEFAULT '[]');
	CREATE INDEX terms_entry ON terms(entry_id);
	CREATE INDEX terms_text ON terms(text);
	CREATE INDEX terms_key ON terms(key);
	CREATE TABLE forms(
		term_id INTEGER NOT NULL REFERENCES terms(id) ON DELETE CASCADE,
		form TEXT NOT NULL,
		key TEXT NOT NULL,
		PRIMARY KEY(term_id, form));
	CREATE INDEX forms_key ON forms(key);
	CREATE TABLE contexts(
		id INTEGER PRIMARY KEY,
		term_id INTEGER NOT NULL REFERENCES terms(id) ON DELETE CASCADE,
		text TEXT NOT NULL,
		doc TEXT NOT NULL DEFAULT '',
		line INTEGER NOT NULL DEFAULT 0,
		source TEXT NOT NULL DEFAULT '');
	CREATE INDEX contexts_term ON contexts(term_id);
	CREATE TABLE changes(
		id INTEGER PRIMARY KEY,
		time TEXT NOT NULL,
		user TEXT NOT NULL,
		action TEXT NOT NULL,
		summary TEXT NOT NULL,
		undoes INTEGER REFERENCES changes(id),
		restore BLOB NOT NULL);
	CREATE INDEX changes_undoes ON changes(undoes);
	CREATE TABLE entry_changes(
		change_id INTEGER NOT NULL REFERENCES changes(id),
		entry_id INTEGER NOT NULL,
		PRIMARY KEY(entry_id, change_id));
	CREATE TRIGGER changes_no_update BEFORE UPDATE ON changes
		BEGIN SELECT RAISE(ABORT, 'the change log is append-only'); END;
	CREATE TRIGGER changes_no_delete BEFORE DELETE ON changes
		BEGIN SELECT RAISE(ABORT, 'the change log is append-only'); END;`,
	// 2: recorded runs of "terms" and their candidates' counts.
	`CREATE TABLE runs(
		id INTEGER PRIMARY KEY,
		label TEXT NOT NULL UNIQUE,
		time TEXT NOT NULL,
		inputs TEXT NOT NULL DEFAULT '[]',
		documents INTEGER NOT NULL DEFAULT 0,
		tokens INTEGER NOT NULL DEFAULT 0);
	CREATE TABLE run_terms(
		run_id INTEGER NOT NULL REFERENCES runs(id) ON DELETE CASCADE,
		term TEXT NOT NULL,
		key TEXT NOT NULL,
		pos TEXT NOT NULL DEFAULT '',
		freq INTEGER NOT NULL,
		docs INTEGER NOT NULL,
		forms TEXT NOT NULL DEFAULT '[]',
		contexts TEXT NOT NULL DEFAULT '[]',
		PRIMARY KEY(run_id, key));`,
	// 3: the acronym / full-form link of a run's candidates (empty for
	// runs recorded before: their documents are not at hand to find it).
	`ALTER TABLE run_terms ADD COLUMN acronym TEXT NOT NULL DEFAULT '';
	ALTER TABLE run_terms ADD COLUMN full_form TEXT NOT NULL DEFAULT '';`,
}

// SchemaVersion is the schema this glossmith writes.
var SchemaVersion = len(migrations)

// Store is an open termbase.
type Store struct {
	db   *sql.DB
	path string
	// User is written to the change log with every change: by default the
	// login name (the environment's USER when that cannot be had).
	User string
	// Lang is the language given to terms created without one: "en".
	Lang string
	now  func() time.Time
	// schema is the schema version of the file (SchemaVersion but in
	// tests of migrations, which make older files).
	schema int
}

// Path returns the file the store was opened from.
func (s *Store) Path() string { return s.path }

// Close closes the database.
func (s *Store) Close() error { return s.db.Close() }

// LoginName is the default user of the change log.
func LoginName() string {
	if u, err := user.Current(); err == nil && u.Username != "" {
		return u.Username
	}
	if u := os.Getenv("USER"); u != "" {
		return u
	}
	return "unknown"
}

// Open opens the termbase at path, creating it when the file does not
// exist. See the package documentation for what is refused.
func Open(path string) (*Store, error) {
	return open(path, SchemaVersion)
}

// creatable reports a folder, named in a missing termbase's path, that is
// not there or not a folder, in words rather than SQLite's "unable to open
// database file (14)".
func creatable(path string) error {
	dir := filepath.Dir(path)
	fi, err := os.Stat(dir)
	switch {
	case errors.Is(err, os.ErrNotExist):
		return fmt.Errorf("termbase %s: there is no folder %s to create it in", path, dir)
	case err != nil:
		return fmt.Errorf("termbase %s: %w", path, err)
	case !fi.IsDir():
		return fmt.Errorf("termbase %s: %s is a file, not a folder", path, dir)
	}
	return nil
}

// open opens or creates path and brings it to schema version target (tests
// make older versions with a lower target).
func open(path string, target int) (*Store, error) {
	fresh := false
	fi, err := os.Stat(path)
	if err != nil {
		if err := creatable(path); err != nil {
			return nil, err
		}
	}
	switch {
	case errors.Is(err, os.ErrNotExist):
		fresh = true
	case err != nil:
		return nil, fmt.Errorf("termbase %s: %w", path, err)
	case fi.IsDir():
		return nil, fmt.Errorf("termbase %s: is a directory", path)
	default:
		if err := checkHeader(path, fi.Size()); err != nil {
			return nil, err
		}
	}
	q := url.Values{}
	q.Add("_pragma", "busy_timeout("+strconv.Itoa(int(BusyTimeout/time.Millisecond))+")")
	q.Add("_pragma", "foreign_keys(1)")
	q.Add("_pragma", "synchronous(NORMAL)")
	// 64 MiB of page cache: an import of 100,000 entries touches some
	// 40 MB of table and index pages in one transaction, and with the
	// default 2 MB SQLite spills them to the log and reads them back.
	q.Add("_pragma", "cache_size(-65536)")
	q.Add("_txlock", "immediate")
	db, err := sql.Open("sqlite", "file:"+(&url.URL{Path: path}).EscapedPath()+"?"+q.Encode())
	if err != nil {
		return nil, fmt.Errorf("termbase %s: %w", path, err)
	}
	s := &Store{db: db, path: path, User: LoginName(), Lang: "en", now: time.Now}
	if err := s.prepare(fresh, target); err != nil {
		db.Close()
		if fresh {
			os.Remove(path)
			os.Remove(path + "-wal")
			os.Remove(path + "-shm")
		}
		return nil, err
	}
	return s, nil
}

// checkHeader refuses, before SQLite sees it, a file that is empty, not an
// SQLite database, another program's database, or shorter than its header
// says (a half-written copy).
func checkHeader(path string, size int64) error {
	if size == 0 {
		return fmt.Errorf("termbase %s: the file is empty, not a glossmith termbase (remove it to start a new one)", path)
	}
	f, err := os.Open(path)
	if err != nil {
		return fmt.Errorf("termbase %s: %w", path, err)
	}
	defer f.Close()
	var h [100]byte
	if _, err := io.ReadFull(f, h[:]); err != nil || !bytes.Equal(h[:16], []byte("SQLite format 3\x00")) {
		return fmt.Errorf("termbase %s: not a glossmith termbase (not an SQLite database)", path)
	}
	// While a process that created the termbase still has it open (review
	// on a new file), the file's header may be the empty first page and
	// everything else, the application id too, in the write-ahead log;
	// prepare then looks for the glossmith mark through SQLite.
	_, walErr := os.Stat(path + "-wal")
	inLog := walErr == nil
	if id := binary.BigEndian.Uint32(h[68:72]); id != applicationID && !(id == 0 && inLog) {
		return fmt.Errorf("termbase %s: an SQLite database, but not a glossmith termbase", path)
	}
	pageSize := int64(binary.BigEndian.Uint16(h[16:18]))
	if pageSize == 1 {
		pageSize = 65536
	}
	pages := int64(binary.BigEndian.Uint32(h[28:32]))
	if inLog {
		return nil // the header's page count may lag behind the write-ahead log
	}
	if pageSize < 512 || size%pageSize != 0 || size < pages*pageSize {
		return fmt.Errorf("termbase %s: the file is truncated or damaged (%d bytes, the header promises %d)", path, size, pages*pageSize)
	}
	return nil
}

// prepare sets the journal mode, creates or checks the schema and migrates
// an older one after a backup copy. It does not read the whole file
// (PRAGMA quick_check would cost more than loading a 10,000-entry
// termbase): a page damaged elsewhere is reported, with the file's name,
// by the first query that reads it.
func (s *Store) prepare(fresh bool, target int) error {
	ctx := context.Background()
	wrap := func(err error) error {
		return fmt.Errorf("termbase %s: %w", s.path, err)
	}
	if _, err := s.db.ExecContext(ctx, "PRAGMA journal_mode=WAL"); err != nil {
		return wrap(err)
	}
	version := 0
	if fresh {
		if _, err := s.db.ExecContext(ctx, "PRAGMA application_id="+strconv.Itoa(applicationID)); err != nil {
			return wrap(err)
		}
	} else {
		var app string
		err := s.db.QueryRowContext(ctx, "SELECT value FROM meta WHERE key='application'").Scan(&app)
		if err != nil || app != "glossmith-termbase" {
			if err == nil {
				err = errors.New("no glossmith mark")
			}
			return fmt.Errorf("termbase %s: not a glossmith termbase, or damaged: %w", s.path, err)
		}
		var v string
		if err := s.db.QueryRowContext(ctx, "SELECT value FROM meta WHERE key='schema_version'").Scan(&v); err != nil {
			return wrap(err)
		}
		if version, err = strconv.Atoi(v); err != nil || version < 1 {
			return fmt.Errorf("termbase %s: damaged schema version %q", s.path, v)
		}
		if version > len(migrations) {
			return fmt.Errorf("termbase %s: written by a newer glossmith (schema %d; this one knows %d)", s.path, version, len(migrations))
		}
	}
	if version >= target {
		s.schema = version
		return nil
	}
	s.schema = target
	if !fresh {
		if err := s.backup(version); err != nil {
			return err
		}
	}
	tx, err := s.db.BeginTx(ctx, nil)
	if err != nil {
		return wrap(err)
	}
	defer tx.Rollback()
	for v := version; v < target; v++ {
		if _, err := tx.ExecContext(ctx, migrations[v]); err != nil {
			return fmt.Errorf("termbase %s: migrating to schema %d: %w", s.path, v+1, err)
		}
	}
	if _, err := tx.ExecContext(ctx, `INSERT INTO meta(key, value) VALUES ('application', 'glossmith-termbase'), ('schema_version', ?)
		ON CONFLICT(key) DO UPDATE SET value=excluded.value`, strconv.Itoa(target)); err != nil {
		return wrap(err)
	}
	return wrap2(tx.Commit(), wrap)
}

func wrap2(err error, wrap func(error) error) error {
	if err != nil {
		return wrap(err)
	}
	return nil
}

// backup writes a consistent copy of the database as it is, before a
// migration, to PATH.vN.bak (VACUUM INTO: the copy holds what the
// write-ahead log holds too). An existing backup is not overwritten.
func (s *Store) backup(version int) error {
	dst := fmt.Sprintf("%s.v%d.bak", s.path, version)
	if _, err := os.Stat(dst); err == nil {
		dst = fmt.Sprintf("%s.v%d.%d.bak", s.path, version, s.now().Unix())
	}
	if _, err := s.db.Exec("VACUUM INTO ?", dst); err != nil {
		return fmt.Errorf("termbase %s: backup before migrating to %s: %w", s.path, dst, err)
	}
	return nil
}
