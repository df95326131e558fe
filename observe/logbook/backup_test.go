package logbook

import (
	"bytes"
	"encoding/json"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestBackupRestore backs up a demo logbook (fxDemo: every table holds
// rows), restores it into a new file and backs that up: the two documents
// must be byte-identical, and so must every table (compared row by row
// through the backup's own structure). The whole demo scenario goes through
// the same round trip in vigil/internal/demo.
func TestBackupRestore(t *testing.T) {
	src := openT(t, sharedDemo(t))
	var first bytes.Buffer
	if err := src.Backup(&first); err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "restored.db")
	dst, err := Restore(path, bytes.NewReader(first.Bytes()), "backup.json")
	if err != nil {
		t.Fatal(err)
	}
	defer dst.Close()
	var second bytes.Buffer
	if err := dst.Backup(&second); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(first.Bytes(), second.Bytes()) {
		t.Errorf("the backup of the restored logbook differs from the original backup (%d and %d bytes)", first.Len(), second.Len())
	}
	var a, b backupDoc
	if err := json.Unmarshal(first.Bytes(), &a); err != nil {
		t.Fatalf("the backup is not JSON: %v", err)
	}
	if err := json.Unmarshal(second.Bytes(), &b); err != nil {
		t.Fatal(err)
	}
	if len(a.Tables) != len(backupTables) {
		t.Errorf("the backup holds %d tables, want %d", len(a.Tables), len(backupTables))
	}
	for i := range a.Tables {
		ja, _ := json.Marshal(a.Tables[i])
		jb, _ := json.Marshal(b.Tables[i])
		if !bytes.Equal(ja, jb) {
			t.Errorf("table %s differs after backup and restore", a.Tables[i].Name)
		}
	}
	if c := counts(t, dst); c["measurements"] == 0 || c["measurements"] != counts(t, src)["measurements"] {
		t.Errorf("measurements after restore: %d", c["measurements"])
	}
	if demo, _ := dst.IsDemo(); !demo {
		t.Errorf("the restored demo is not flagged demo")
	}
	if err := dst.IntegrityCheck(); err != nil {
		t.Error(err)
	}
	// The file is written whole or not at all.
	file := filepath.Join(t.TempDir(), "backup.json")
	if err := src.BackupFile(file); err != nil {
		t.Fatal(err)
	}
	if got, _ := os.ReadFile(file); !bytes.Equal(got, first.Bytes()) {
		t.Errorf("BackupFile wrote other bytes than Backup")
	}
	again, err := RestoreFile(filepath.Join(t.TempDir(), "again.db"), file)
	if err != nil {
		t.Fatal(err)
	}
	again.Close()
}

// TestRestoreOldBackup restores a backup written at schema version 1: it is
// loaded as version 1 and migrated.
func TestRestoreOldBackup(t *testing.T) {
	old := openT(t, v1File(t)) // Open migrates it: back up the v1 file raw instead
	old.Close()
	p := v1File(t)
	lb := &Logbook{path: p}
	name, _ := dsn(p, true)
	db, err := openRaw(name)
	if err != nil {
		t.Fatal(err)
	}
	lb.db = db
	var buf bytes.Buffer
	if err := lb.Backup(&buf); err != nil {
		t.Fatal(err)
	}
	db.Close()
	if !strings.Contains(buf.String(), `"schema_version": 1,`) {
		t.Fatalf("the backup of a v1 file does not say version 1")
	}
	r, err := Restore(filepath.Join(t.TempDir(), "r.db"), &buf, "old.json")
	if err != nil {
		t.Fatal(err)
	}
	defer r.Close()
	if v, _ := r.Version(); v != SchemaVersion {
		t.Errorf("restored version %d, want %d", v, SchemaVersion)
	}
	if tg, err := r.Target("Old Star"); err != nil || tg.LastTimingJD != 2457422.41 {
		t.Errorf("the restored v1 target: %+v, %v", tg, err)
	}
}

// TestRestoreRefuses feeds broken backups: each is refused with a clear
// error and leaves no file behind.
func TestRestoreRefuses(t *testing.T) {
	src, _ := fixture(t)
	var buf bytes.Buffer
	if err := src.Backup(&buf); err != nil {
		t.Fatal(err)
	}
	good := buf.String()
	for _, tc := range []struct {
		name, doc, phrase string
		is                error
	}{
		{"not JSON", "hello", "not a JSON backup", nil},
		{"another format", strings.Replace(good, backupFormat, "photo album", 1), "photo album", nil},
		{"newer schema", strings.Replace(good, `"schema_version": 2`, `"schema_version": 9`, 1), "version 9", ErrNewerSchema},
		{"a table missing", strings.Replace(good, `{"name": "timings"`, `{"name": "timings_gone"`, 1), "timings_gone", nil},
		{"text in a number column", strings.Replace(good, `47.25`, `"north"`, 1), "sites, row 1", nil},
		{"latitude out of range", strings.Replace(good, `47.25`, `147.25`, 1), "CHECK constraint", nil},
		{"a row pointing nowhere", strings.Replace(good, `[1, 1, 2459000.1234`, `[1, 7, 2459000.1234`, 1), "", nil},
		{"a fractional id", strings.Replace(good, `"rows": [`+"\n"+`[1, "Ridge Top"`, `"rows": [`+"\n"+`[1.5, "Ridge Top"`, 1), "sites, row 1", nil},
		{"a bad time zone", strings.Replace(good, `"Europe/Zurich"`, `"Mars/Olympus"`, 1), "Mars/Olympus", nil},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if tc.doc == good {
				t.Fatalf("the case changes nothing")
			}
			path := filepath.Join(t.TempDir(), "r.db")
			lb, err := Restore(path, strings.NewReader(tc.doc), "b.json")
			if err == nil {
				lb.Close()
				t.Fatalf("got no error")
			}
			if !strings.Contains(err.Error(), tc.phrase) || !strings.Contains(err.Error(), "b.json") {
				t.Errorf("got %q, want it to name b.json and say %q", err, tc.phrase)
			}
			if tc.is != nil && !errors.Is(err, tc.is) {
				t.Errorf("got %v, want it to wrap %v", err, tc.is)
			}
			if left, _ := os.ReadDir(filepath.Dir(path)); len(left) != 0 {
				t.Errorf("files left behind: %v", left)
			}
		})
	}
}
