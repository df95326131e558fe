package logbook

import (
	"bytes"
	"context"
	"database/sql"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"net/url"
	"os"
	"path/filepath"
	"strings"
	"time"
	_ "time/tzdata" // sites' time zones, on systems without a zone database

	_ "modernc.org/sqlite" // the pure-Go SQLite driver, registered as "sqlite"
)

// Logbook is an open logbook file. It is safe for concurrent use; every
// change runs in a transaction that takes the write lock at its start, so
// writers queue (up to the busy timeout) and readers never block.
type Logbook struct {
	db   *sql.DB
	path string
}

// Errors callers branch on. They are wrapped with the details.
var (
	// ErrNotFound: the named site, target, night or record is not in the
	// logbook.
	ErrNotFound = errors.New("not found")
	// ErrNotLogbook: the file exists but is not a vigil logbook.
	ErrNotLogbook = errors.New("not a vigil logbook")
	// ErrNewerSchema: the file was written by a newer vigil whose schema
	// this program does not know.
	ErrNewerSchema = errors.New("written by a newer version of vigil")
	// ErrExists: Create and Restore do not overwrite a file.
	ErrExists = errors.New("already exists")
)

// busyTimeoutMS is how long a writer waits for another's transaction to
// end before giving up (common practice for desktop use of SQLite).
const busyTimeoutMS = 10000

// cacheKiB is each connection's page cache: large enough that an import of
// a hundred thousand rows stays in memory until it commits.
const cacheKiB = 64 << 10

// sqliteMagic starts every SQLite 3 database file.
var sqliteMagic = []byte("SQLite format 3\x00")

// DefaultPath returns where the logbook lives unless the user names another
// file: vigil/vigil.db in the user's configuration directory
// (os.UserConfigDir: $XDG_CONFIG_HOME or ~/.config on Linux, ~/Library/
// Application Support on macOS, %AppData% on Windows).
func DefaultPath() (string, error) {
	dir, err := os.UserConfigDir()
	if err != nil {
		return "", fmt.Errorf("logbook: finding the configuration directory: %w (name a logbook file with --logbook)", err)
	}
	return filepath.Join(dir, "vigil", "vigil.db"), nil
}

// dsn returns the driver's name for the file at path: a SQLite URI, so
// that any character in the path is escaped, with foreign keys on, the busy
// timeout, full synchronisation (a committed change survives a power cut)
// and transactions that take the write lock when they begin. With mustExist
// the driver will not create a missing file.
func dsn(path string, mustExist bool) (string, error) {
	abs, err := filepath.Abs(path)
	if err != nil {
		return "", fmt.Errorf("logbook: %s: %w", path, err)
	}
	p := filepath.ToSlash(abs)
	if !strings.HasPrefix(p, "/") {
		p = "/" + p // a Windows drive letter: file:///C:/...
	}
	q := fmt.Sprintf("_pragma=foreign_keys(1)&_pragma=busy_timeout(%d)&_pragma=synchronous(FULL)&_pragma=cache_size(%d)&_txlock=immediate",
		busyTimeoutMS, -cacheKiB)
	if mustExist {
		q = "mode=rw&" + q
	}
	u := url.URL{Scheme: "file", Path: p, RawQuery: q}
	return u.String(), nil
}

// Open opens the existing logbook at path, brings its schema up to date
// (each migration in its own transaction) and turns on write-ahead logging.
// It refuses, without changing the file, a missing file (fs.ErrNotExist), a
// file that is not a vigil logbook (ErrNotLogbook) and one written by a newer
// vigil (ErrNewerSchema).
func Open(path string) (*Logbook, error) {
	if err := checkHeader(path); err != nil {
		return nil, err
	}
	name, err := dsn(path, true)
	if err != nil {
		return nil, err
	}
	db, err := sql.Open("sqlite", name)
	if err != nil {
		return nil, fmt.Errorf("logbook: %s: %w", path, err)
	}
	lb := &Logbook{db: db, path: path}
	version, err := lb.identify()
	if err != nil {
		db.Close()
		return nil, err
	}
	if _, err := db.Exec("PRAGMA journal_mode=WAL"); err != nil {
		db.Close()
		return nil, fmt.Errorf("logbook: %s: turning on write-ahead logging: %w", path, err)
	}
	if err := lb.migrate(version, SchemaVersion); err != nil {
		db.Close()
		return nil, err
	}
	return lb, nil
}

// checkHeader refuses a missing path, a directory, an empty file and a file
// that does not start like a SQLite database.
func checkHeader(path string) error {
	st, err := os.Stat(path)
	if err != nil {
		if errors.Is(err, fs.ErrNotExist) {
			return fmt.Errorf("logbook: %s: no such file: %w", path, fs.ErrNotExist)
		}
		return fmt.Errorf("logbook: %w", err)
	}
	if st.IsDir() {
		return fmt.Errorf("logbook: %s is a directory: want a logbook file such as vigil.db", path)
	}
	f, err := os.Open(path)
	if err != nil {
		return fmt.Errorf("logbook: %w", err)
	}
	defer f.Close()
	head := make([]byte, len(sqliteMagic))
	n, _ := io.ReadFull(f, head)
	if n == 0 {
		return fmt.Errorf("logbook: %s: %w: the file is empty", path, ErrNotLogbook)
	}
	if !bytes.Equal(head[:n], sqliteMagic) {
		return fmt.Errorf("logbook: %s: %w: not an SQLite database", path, ErrNotLogbook)
	}
	return nil
}

// identify checks that the open file is a vigil logbook and returns its
// schema version, refusing one newer than this program knows.
func (lb *Logbook) identify() (int, error) {
	var app int64
	if err := lb.db.QueryRow("PRAGMA application_id").Scan(&app); err != nil {
		return 0, fmt.Errorf("logbook: %s: %w: %v", lb.path, ErrNotLogbook, err)
	}
	if app != applicationID {
		return 0, fmt.Errorf("logbook: %s: %w: an SQLite database of another program (application id %#x, want %#x)", lb.path, ErrNotLogbook, app, applicationID)
	}
	var v sql.NullInt64
	if err := lb.db.QueryRow("SELECT max(version) FROM schema_version").Scan(&v); err != nil || !v.Valid {
		return 0, fmt.Errorf("logbook: %s: %w: it has no schema version", lb.path, ErrNotLogbook)
	}
	if int(v.Int64) > SchemaVersion {
		return 0, fmt.Errorf("logbook: %s: %w: its schema is version %d, this program knows up to version %d; update vigil to open it",
			lb.path, ErrNewerSchema, v.Int64, SchemaVersion)
	}
	return int(v.Int64), nil
}

// formatName is the meta table's "format" value.
const formatName = "vigil logbook"

// stampLayout is how the logbook writes instants: ISO 8601 UTC to the
// second, so that the text sorts in time order.
const stampLayout = "2006-01-02T15:04:05Z"

// stamp writes t as stampLayout.
func stamp(t time.Time) string { return t.UTC().Format(stampLayout) }

// parseStamp reads an instant written by stamp (or any RFC 3339 instant,
// which it truncates to the second in UTC).
func parseStamp(s string) (time.Time, error) {
	t, err := time.Parse(time.RFC3339, strings.TrimSpace(s))
	if err != nil {
		return time.Time{}, fmt.Errorf("instant %q: want ISO 8601 UTC such as 2026-12-01T03:00:00Z", s)
	}
	return t.UTC().Truncate(time.Second), nil
}

// Close closes the logbook. The write-ahead log is folded into the file
// when the last connection closes.
func (lb *Logbook) Close() error {
	if err := lb.db.Close(); err != nil {
		return fmt.Errorf("logbook: %s: %w", lb.path, err)
	}
	return nil
}

// Path returns the file the logbook was opened from.
func (lb *Logbook) Path() string { return lb.path }

// Version returns the schema version of the open file (SchemaVersion once
// Open has migrated it).
func (lb *Logbook) Version() (int, error) {
	var v int
	if err := lb.db.QueryRow("SELECT max(version) FROM schema_version").Scan(&v); err != nil {
		return 0, lb.wrap(err)
	}
	return v, nil
}

// IntegrityCheck runs SQLite's full consistency check of the file
// (PRAGMA integrity_check) and the foreign-key check, and returns an error
// listing what they found, or nil.
func (lb *Logbook) IntegrityCheck() error {
	rows, err := lb.db.Query("PRAGMA integrity_check")
	if err != nil {
		return lb.wrap(err)
	}
	var problems []string
	for rows.Next() {
		var s string
		if err := rows.Scan(&s); err != nil {
			rows.Close()
			return lb.wrap(err)
		}
		if s != "ok" {
			problems = append(problems, s)
		}
	}
	rows.Close()
	if err := rows.Err(); err != nil {
		return lb.wrap(err)
	}
	var n int
	if err := lb.db.QueryRow("SELECT count(*) FROM pragma_foreign_key_check").Scan(&n); err != nil {
		return lb.wrap(err)
	}
	if n > 0 {
		problems = append(problems, fmt.Sprintf("%d rows break a foreign key", n))
	}
	if len(problems) > 0 {
		return fmt.Errorf("logbook: %s: integrity check failed: %s", lb.path, strings.Join(problems, "; "))
	}
	return nil
}

// wrap prefixes a database error with the file.
func (lb *Logbook) wrap(err error) error {
	if err == nil {
		return nil
	}
	return fmt.Errorf("logbook: %s: %w", lb.path, err)
}

// tx runs f in one transaction, committed when f returns nil and rolled
// back otherwise.
func (lb *Logbook) tx(f func(tx *sql.Tx) error) (err error) {
	tx, err := lb.db.BeginTx(context.Background(), nil)
	if err != nil {
		return err
	}
	defer func() {
		if p := recover(); p != nil {
			tx.Rollback()
			panic(p)
		}
		if err != nil {
			tx.Rollback()
		}
	}()
	if err = f(tx); err != nil {
		return err
	}
	return tx.Commit()
}

// IsDemo reports whether the logbook still holds the demo scenario
// (the meta flag CreateDemo sets and ClearDemo and every import clear).
func (lb *Logbook) IsDemo() (bool, error) {
	var v string
	err := lb.db.QueryRow("SELECT value FROM meta WHERE key = 'demo'").Scan(&v)
	if errors.Is(err, sql.ErrNoRows) {
		return false, nil
	}
	if err != nil {
		return false, lb.wrap(err)
	}
	return v == "1", nil
}

// ClearDemo removes every demo record: the demo targets (with their
// ephemerides, comparison stars, measurements and timings), the demo nights
// and the demo sites, and clears the demo flag. A demo site on which the
// user has recorded nights of their own is kept (no longer marked demo).
func (lb *Logbook) ClearDemo() error {
	return lb.wrap(lb.tx(clearDemo))
}

func clearDemo(tx *sql.Tx) error {
	for _, q := range []string{
		"DELETE FROM targets WHERE demo = 1",
		"DELETE FROM nights WHERE demo = 1",
		"DELETE FROM sites WHERE demo = 1 AND id NOT IN (SELECT site_id FROM nights)",
		"UPDATE sites SET demo = 0 WHERE demo = 1",
		"UPDATE meta SET value = '0' WHERE key = 'demo'",
	} {
		if _, err := tx.Exec(q); err != nil {
			return err
		}
	}
	return nil
}
