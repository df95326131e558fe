package logbook

import (
	"database/sql"
	"fmt"
	"os"
	"path/filepath"
)

// Create makes a new, empty logbook at path (creating its directory) and
// opens it. It refuses to overwrite an existing file (ErrExists). The file
// is built under a temporary name and renamed into place when complete, so
// a crash leaves no half-made logbook.
func Create(path string) (*Logbook, error) {
	if err := build(path, SchemaVersion, nil); err != nil {
		return nil, err
	}
	return Open(path)
}

// build makes a logbook at path: a temporary file in the same directory at
// schema version, filled by fill (when not nil), migrated to the newest
// version, closed (which folds the write-ahead log into it) and renamed to
// path.
func build(path string, version int, fill func(lb *Logbook) error) (err error) {
	if err := refuseExisting(path); err != nil {
		return err
	}
	dir := filepath.Dir(path)
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return fmt.Errorf("logbook: %w", err)
	}
	f, err := os.CreateTemp(dir, "."+filepath.Base(path)+".*.tmp")
	if err != nil {
		return fmt.Errorf("logbook: %w", err)
	}
	tmp := f.Name()
	f.Close()
	defer func() {
		if err != nil {
			for _, suffix := range []string{"", "-wal", "-shm", "-journal"} {
				os.Remove(tmp + suffix)
			}
		}
	}()
	name, err := dsn(tmp, false)
	if err != nil {
		return err
	}
	db, err := sql.Open("sqlite", name)
	if err != nil {
		return fmt.Errorf("logbook: %s: %w", path, err)
	}
	lb := &Logbook{db: db, path: path}
	err = func() error {
		if _, err := db.Exec("PRAGMA journal_mode=WAL"); err != nil {
			return fmt.Errorf("logbook: %s: %w", path, err)
		}
		if err := lb.migrate(0, version); err != nil {
			return err
		}
		if fill != nil {
			if err := fill(lb); err != nil {
				return err
			}
		}
		return lb.migrate(version, SchemaVersion)
	}()
	if cerr := db.Close(); err == nil && cerr != nil {
		err = fmt.Errorf("logbook: %s: %w", path, cerr)
	}
	if err != nil {
		return err
	}
	if _, serr := os.Stat(tmp + "-wal"); serr == nil {
		return fmt.Errorf("logbook: %s: the write-ahead log was not folded into the new file", path)
	}
	if _, serr := os.Stat(path); serr == nil {
		return fmt.Errorf("logbook: %s: %w: it appeared while the new logbook was being made", path, ErrExists)
	}
	if err := os.Rename(tmp, path); err != nil {
		return fmt.Errorf("logbook: %w", err)
	}
	return nil
}

// refuseExisting returns ErrExists when there is a file at path.
func refuseExisting(path string) error {
	if _, err := os.Stat(path); err == nil {
		return fmt.Errorf("logbook: %s: %w: choose another name or remove it first", path, ErrExists)
	}
	return nil
}
