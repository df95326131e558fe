package main

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"

	"example.org/vigil/observe/logbook"
)

// backupResponse is the answer of vigil logbook backup with --json.
type backupResponse struct {
	Logbook       string `json:"logbook"`
	Out           string `json:"out"`
	SchemaVersion int    `json:"schema_version"`
	SizeBytes     int64  `json:"size_bytes"`
}

func runLogbookBackup(e *env, args []string) error {
	f := newFlags(e.cmd, "--out FILE.json [--logbook PATH] [--json]",
		`Writes the whole logbook as one JSON document: every table of the file,
every column and every row, numbers written exactly, missing values as null.
vigil logbook restore turns it back into an identical logbook. The backup
reads one consistent snapshot of the logbook, so other programs may go on
writing to it meanwhile. The file is written whole or not at all (an older
one stays as it was on a failure). With --json: {logbook, out,
schema_version, size_bytes}.`)
	outText := f.required("out", "FILE", "the backup file to write, ending in .json")
	book := addLogbookFlag(e, f)
	asJSON := f.toggle("json", "print one JSON object instead of text")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}
	out, err := get(f, "out", *outText, func(s string) (string, error) { return parseOutFile(s, ".json", "a JSON backup file") })
	if err != nil {
		return err
	}
	lb, err := book.open()
	if err != nil {
		return err
	}
	if sameFile(out, lb.Path()) {
		return &flagError{flag: "out", err: fmt.Errorf("%q is the logbook itself: want another file", out)}
	}
	resp := backupResponse{Logbook: lb.Path(), Out: out}
	if resp.SchemaVersion, err = lb.Version(); err != nil {
		return fmt.Errorf("reading the schema version of %s: %w", lb.Path(), err)
	}
	if err := lb.BackupFile(out); err != nil {
		return &flagError{flag: "out", err: err}
	}
	if fi, err := os.Stat(out); err == nil {
		resp.SizeBytes = fi.Size()
	}
	if *asJSON {
		return writeJSON(e.stdout, resp)
	}
	fmt.Fprintf(e.stdout, "Backed up the logbook %s (schema version %d) to %s (%d bytes).\n", resp.Logbook, resp.SchemaVersion, resp.Out, resp.SizeBytes)
	return nil
}

// restoreResponse is the answer of vigil logbook restore with --json.
type restoreResponse struct {
	Logbook  string      `json:"logbook"`
	Input    string      `json:"input"`
	Replaced bool        `json:"replaced"` // an existing logbook was replaced (--force)
	Info     logbookInfo `json:"info"`     // the new logbook, as vigil logbook info
}

func runLogbookRestore(e *env, args []string) error {
	f := newFlags(e.cmd, "--input FILE.json --logbook NEWPATH [--force] [--json]",
		`Makes a new logbook at --logbook from a JSON backup written by vigil logbook
backup: identical to the logbook backed up, then brought up to this vigil's
schema. Every table, type, constraint and reference is checked first; the
new file appears only when all of it succeeded. An existing file at --logbook
is left alone unless --force is given; --force replaces only a vigil logbook
that no other program has open, and the replaced logbook is lost (back it
up first). Prints what the new logbook holds, as vigil logbook info (with
--json: {logbook, input, replaced, info}, info as vigil logbook info --json).`)
	inputText := f.required("input", "FILE", "the JSON backup to restore")
	book := addLogbookFlagAs(e, f, "the logbook to make from the backup: a new path, or an existing logbook with --force")
	force := f.toggle("force", "replace an existing logbook at --logbook (it is lost)")
	asJSON := f.toggle("json", "print one JSON object instead of text")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}
	input, err := get(f, "input", *inputText, parseReadableFile)
	if err != nil {
		return err
	}
	path, err := book.where()
	if err != nil {
		return err
	}
	replace := false
	if _, err := os.Stat(path); err == nil {
		if !*force {
			return &flagError{flag: "logbook", err: fmt.Errorf("%q already exists: restore into a new path, or give --force to replace that logbook (it is then lost)", path)}
		}
		if err := replaceable(path); err != nil {
			return err
		}
		replace = true
	} else if !errors.Is(err, fs.ErrNotExist) {
		return &flagError{flag: "logbook", err: fmt.Errorf("cannot use %q: %v", path, unwrapPath(err))}
	}
	if sameFile(input, path) {
		return &flagError{flag: "input", err: fmt.Errorf("%q is the logbook to restore into: want a JSON backup", input)}
	}

	if err := restoreInto(path, input, replace); err != nil {
		return err
	}
	lb, err := book.open() // the restored file: it exists now
	if err != nil {
		return err
	}
	info, err := describe(lb)
	if err != nil {
		return err
	}
	resp := restoreResponse{Logbook: lb.Path(), Input: input, Replaced: replace, Info: info}
	if *asJSON {
		return writeJSON(e.stdout, resp)
	}
	verb := "Restored"
	if replace {
		verb = "Replaced the logbook with"
	}
	fmt.Fprintf(e.stdout, "%s the backup %s into %s.\n\n", verb, input, lb.Path())
	writeInfo(e.stdout, info)
	return nil
}

// replaceable checks that the file at path is a vigil logbook that no other
// program has open, which restore --force may replace.
func replaceable(path string) error {
	old, err := logbook.Open(path)
	if err != nil {
		switch {
		case errors.Is(err, logbook.ErrNotLogbook):
			return &flagError{flag: "logbook", err: fmt.Errorf("%q is not a vigil logbook (%s): --force replaces a logbook only; the file is left as it is", path, reason(err, logbook.ErrNotLogbook))}
		case errors.Is(err, logbook.ErrNewerSchema):
			return &flagError{flag: "logbook", err: fmt.Errorf("%q was written by a newer version of vigil (%s): --force replaces only a logbook this vigil reads; the file is left as it is", path, reason(err, logbook.ErrNewerSchema))}
		}
		return openError(path, err)
	}
	if err := old.Close(); err != nil {
		return &flagError{flag: "logbook", err: fmt.Errorf("closing %q: %v", path, err)}
	}
	// The write-ahead log goes when the last connection closes: if it is
	// still there, another program has the logbook open.
	if _, err := os.Stat(path + "-wal"); err == nil {
		return &flagError{flag: "logbook", err: fmt.Errorf("%q is open in another program (its write-ahead log %q is there): close that program first", path, path+"-wal")}
	}
	return nil
}

// restoreInto restores the backup input as the logbook at path. A new path
// is made by logbook.RestoreFile directly; an existing logbook (replace) is
// replaced by a complete restored file, made beside it and renamed over it,
// so that a failure leaves the old logbook as it was.
func restoreInto(path, input string, replace bool) error {
	if !replace {
		lb, err := logbook.RestoreFile(path, input)
		if err != nil {
			return restoreError(input, err)
		}
		return lb.Close()
	}
	tmp, err := os.MkdirTemp(filepath.Dir(path), ".vigil-restore-")
	if err != nil {
		return &flagError{flag: "logbook", err: fmt.Errorf("cannot make a file beside %q: %v", path, unwrapPath(err))}
	}
	defer os.RemoveAll(tmp)
	made := filepath.Join(tmp, filepath.Base(path))
	lb, err := logbook.RestoreFile(made, input)
	if err != nil {
		return restoreError(input, err)
	}
	if err := lb.Close(); err != nil {
		return fmt.Errorf("closing the restored logbook: %w", err)
	}
	if err := os.Rename(made, path); err != nil {
		return &flagError{flag: "logbook", err: fmt.Errorf("cannot replace %q: %v", path, unwrapPath(err))}
	}
	// Side files of the old logbook (none after a clean close) would not
	// belong to the new one.
	for _, side := range []string{path + "-wal", path + "-shm", path + "-journal"} {
		os.Remove(side)
	}
	return nil
}

// restoreError names --input for a backup that cannot be restored; the
// logbook package's message says what is wrong in it.
func restoreError(input string, err error) error {
	return &flagError{flag: "input", err: fmt.Errorf("cannot restore %q: %v", input, err)}
}
