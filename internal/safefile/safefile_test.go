package safefile

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"testing"
)

func TestWriteReplacesWhole(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "out.csv")
	if err := Write(path, func(w io.Writer) error { _, err := io.WriteString(w, "new\n"); return err }); err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile(path)
	if err != nil || string(b) != "new\n" {
		t.Fatalf("content %q, %v; want %q", b, err, "new\n")
	}
}

func TestWriteFailureLeavesOldFile(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "out.csv")
	if err := os.WriteFile(path, []byte("old\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	boom := errors.New("boom")
	err := Write(path, func(w io.Writer) error {
		io.WriteString(w, "half")
		return boom
	})
	if !errors.Is(err, boom) {
		t.Fatalf("err = %v, want the writer's error", err)
	}
	b, _ := os.ReadFile(path)
	if string(b) != "old\n" {
		t.Errorf("after a failed write the file holds %q, want the old content", b)
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		t.Errorf("directory holds %d entries, want only the target (no temporary left)", len(entries))
	}
}

func TestWriteNoDirectory(t *testing.T) {
	err := Write(filepath.Join(t.TempDir(), "missing", "out.csv"), func(io.Writer) error { return nil })
	if err == nil {
		t.Fatal("writing into a missing directory succeeded")
	}
}
