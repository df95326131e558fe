package main

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
)

// This file holds the checks of the file and directory flags of the
// logbook commands (--out, --dir, --input): each says what was wrong with
// the name before any work is done.

// parseCSVOut checks the name of a CSV file to write.
func parseCSVOut(s string) (string, error) {
	return parseOutFile(s, ".csv", "a CSV file")
}

// parseOutFile checks the name of a file to write: it ends in ext, its
// directory exists and it is no directory itself.
func parseOutFile(s, ext, what string) (string, error) {
	if strings.TrimSpace(s) == "" {
		return "", fmt.Errorf("empty value: want the name of %s ending in %s", what, ext)
	}
	if !strings.EqualFold(filepath.Ext(s), ext) {
		return "", fmt.Errorf("%q: want the name of %s ending in %s", s, what, ext)
	}
	if base := filepath.Base(s); strings.HasPrefix(base, ".") && strings.Count(base, ".") == 1 {
		return "", fmt.Errorf("%q: want a file name before the extension, such as vigil%s", s, ext)
	}
	if fi, err := os.Stat(filepath.Dir(s)); err != nil || !fi.IsDir() {
		return "", fmt.Errorf("%q: the directory %q does not exist: want a file in an existing directory", s, filepath.Dir(s))
	}
	if fi, err := os.Stat(s); err == nil && fi.IsDir() {
		return "", fmt.Errorf("%q is a directory: want the name of %s", s, what)
	}
	return s, nil
}

// parseExportDir checks --dir of an export: a directory, or a name that
// is free (it is made).
func parseExportDir(s string) (string, error) {
	if strings.TrimSpace(s) == "" {
		return "", fmt.Errorf("empty value: want a directory")
	}
	if fi, err := os.Stat(s); err == nil && !fi.IsDir() {
		return "", fmt.Errorf("%q is a file: want a directory (made if missing)", s)
	}
	return s, nil
}

// parseImportDir checks --dir of an import: an existing directory.
func parseImportDir(s string) (string, error) {
	if strings.TrimSpace(s) == "" {
		return "", fmt.Errorf("empty value: want a directory of CSV tables")
	}
	fi, err := os.Stat(s)
	if err != nil {
		return "", fmt.Errorf("cannot read %q: %v: want a directory of CSV tables", s, unwrapPath(err))
	}
	if !fi.IsDir() {
		return "", fmt.Errorf("%q is a file: want a directory of CSV tables (or --table NAME --input FILE for one file)", s)
	}
	return s, nil
}

// parseReadableFile checks that a file to read exists and is no directory.
func parseReadableFile(s string) (string, error) {
	if strings.TrimSpace(s) == "" {
		return "", fmt.Errorf("empty value: want a file name")
	}
	fi, err := os.Stat(s)
	if err != nil {
		return "", fmt.Errorf("cannot read %q: %v", s, unwrapPath(err))
	}
	if fi.IsDir() {
		return "", fmt.Errorf("%q is a directory: want a file", s)
	}
	return s, nil
}

// unwrapPath drops the path an *os.PathError repeats.
func unwrapPath(err error) error {
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	return err
}

// csvRows counts the data rows of a CSV file (the records after the header;
// '#' lines are comments).
func csvRows(path string) (int, error) {
	f, err := os.Open(path)
	if err != nil {
		return 0, err
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.Comment = '#'
	r.FieldsPerRecord = -1
	n := -1 // the header
	for {
		_, err := r.Read()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			return 0, fmt.Errorf("%s: %w", path, err)
		}
		n++
	}
	return max(n, 0), nil
}
