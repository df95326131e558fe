package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"

	"example.org/vigil/observe/logbook"
)

// tableCount is the number of rows of one table of the file.
type tableCount struct {
	Name string `json:"name"`
	Rows int    `json:"rows"`
}

// logbookInfo is the answer of vigil logbook info.
type logbookInfo struct {
	Path                 string       `json:"path"`
	Created              bool         `json:"created"`                // made by this run, with the demo scenario
	SchemaVersion        int          `json:"schema_version"`         // of the file
	ProgramSchemaVersion int          `json:"program_schema_version"` // the newest this vigil knows
	Demo                 bool         `json:"demo"`                   // the file still holds the demo scenario
	SizeBytes            int64        `json:"size_bytes"`
	Integrity            string       `json:"integrity"` // "ok", or what the check found
	Tables               []tableCount `json:"tables"`    // every table of the file, in the backup's order
}

func runLogbookInfo(e *env, args []string) error {
	f := newFlags(e.cmd, "[--logbook PATH] [--json]",
		`What the logbook file is: its path, the schema version of the file (and the
newest this vigil knows), whether it still holds the demo scenario, its size,
the result of the integrity check (as vigil logbook check) and the number of
rows in every table of the file. A logbook that does not exist yet is created
with the demo scenario in it, and info says so. With --json: {path, created,
schema_version, program_schema_version, demo, size_bytes, integrity, tables
[{name, rows}]}.`)
	book := addLogbookFlag(e, f)
	asJSON := f.toggle("json", "print one JSON object instead of text")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}
	lb, err := book.open()
	if err != nil {
		return err
	}
	info, err := describe(lb)
	if err != nil {
		return err
	}
	info.Created = book.created
	if *asJSON {
		return writeJSON(e.stdout, info)
	}
	writeInfo(e.stdout, info)
	return nil
}

// describe reads what vigil logbook info reports.
func describe(lb *logbook.Logbook) (logbookInfo, error) {
	info := logbookInfo{Path: lb.Path(), ProgramSchemaVersion: logbook.SchemaVersion, Integrity: "ok"}
	var err error
	if info.SchemaVersion, err = lb.Version(); err != nil {
		return info, fmt.Errorf("reading the schema version of %s: %w", lb.Path(), err)
	}
	if info.Demo, err = lb.IsDemo(); err != nil {
		return info, fmt.Errorf("reading the demo flag of %s: %w", lb.Path(), err)
	}
	if fi, err := os.Stat(lb.Path()); err == nil {
		info.SizeBytes = fi.Size()
	}
	if err := lb.IntegrityCheck(); err != nil {
		info.Integrity = oneLine(err.Error())
	}
	if info.Tables, err = countRows(lb); err != nil {
		return info, err
	}
	return info, nil
}

// writeInfo prints vigil logbook info for people.
func writeInfo(w io.Writer, info logbookInfo) {
	fmt.Fprintf(w, "Logbook %s\n", info.Path)
	if info.Created {
		fmt.Fprintln(w, "Created now, with the demo scenario in it.")
	}
	demo := "no"
	if info.Demo {
		demo = "yes (removed whole by the first import)"
	}
	t := newTable(w)
	t.row("Schema version", fmt.Sprintf("%d (this vigil knows up to %d)", info.SchemaVersion, info.ProgramSchemaVersion))
	t.row("Demo scenario", demo)
	t.row("Size", fmt.Sprintf("%d bytes", info.SizeBytes))
	t.row("Integrity", info.Integrity)
	t.flush()
	fmt.Fprintln(w, "\nRows per table:")
	t = newTable(w)
	for _, c := range info.Tables {
		t.row("  "+c.Name, fmt.Sprintf("%d", c.Rows))
	}
	t.flush()
}

// countRows returns the number of rows in every table of the logbook, read
// from its JSON backup (Logbook.Backup: every table of the file, in a fixed
// order) as it streams, so that a large logbook is never held in memory.
func countRows(lb *logbook.Logbook) ([]tableCount, error) {
	pr, pw := io.Pipe()
	done := make(chan error, 1)
	go func() {
		err := lb.Backup(pw)
		pw.CloseWithError(err)
		done <- err
	}()
	counts, err := countBackupRows(json.NewDecoder(pr))
	if err == nil {
		// Let the writer finish (a last newline).
		_, err = io.Copy(io.Discard, pr)
	}
	// Stop the writer if the reading failed, and wait for it.
	pr.CloseWithError(errors.New("counting stopped"))
	if berr := <-done; err == nil && berr != nil {
		err = berr
	}
	if err != nil {
		return nil, fmt.Errorf("counting the rows of %s: %w", lb.Path(), err)
	}
	return counts, nil
}

// countBackupRows reads a backup document, {"format": ..., "schema_version":
// N, "tables": [{"name": ..., "columns": [...], "rows": [[...], ...]}, ...]},
// and counts the rows of each table.
func countBackupRows(dec *json.Decoder) ([]tableCount, error) {
	var counts []tableCount
	if err := expectDelim(dec, '{'); err != nil {
		return nil, err
	}
	for dec.More() {
		key, err := dec.Token()
		if err != nil {
			return nil, err
		}
		if key != "tables" {
			if err := skipValue(dec); err != nil {
				return nil, err
			}
			continue
		}
		if err := expectDelim(dec, '['); err != nil {
			return nil, err
		}
		for dec.More() {
			c, err := countTable(dec)
			if err != nil {
				return nil, err
			}
			counts = append(counts, c)
		}
		if err := expectDelim(dec, ']'); err != nil {
			return nil, err
		}
	}
	return counts, expectDelim(dec, '}')
}

// countTable reads one table of a backup, {"name": ..., "rows": [...]}.
func countTable(dec *json.Decoder) (tableCount, error) {
	var c tableCount
	if err := expectDelim(dec, '{'); err != nil {
		return c, err
	}
	for dec.More() {
		key, err := dec.Token()
		if err != nil {
			return c, err
		}
		switch key {
		case "name":
			if err := dec.Decode(&c.Name); err != nil {
				return c, err
			}
		case "rows":
			if err := expectDelim(dec, '['); err != nil {
				return c, err
			}
			for dec.More() {
				if err := skipValue(dec); err != nil {
					return c, err
				}
				c.Rows++
			}
			if err := expectDelim(dec, ']'); err != nil {
				return c, err
			}
		default:
			if err := skipValue(dec); err != nil {
				return c, err
			}
		}
	}
	return c, expectDelim(dec, '}')
}

// expectDelim reads the next token and checks that it is d.
func expectDelim(dec *json.Decoder, d json.Delim) error {
	tok, err := dec.Token()
	if err != nil {
		return err
	}
	if tok != d {
		return fmt.Errorf("backup document: found %v where %q was expected", tok, string(d))
	}
	return nil
}

// skipValue reads one JSON value and drops it.
func skipValue(dec *json.Decoder) error {
	var raw json.RawMessage
	return dec.Decode(&raw)
}

func runLogbookCheck(e *env, args []string) error {
	f := newFlags(e.cmd, "[--logbook PATH] [--json]",
		`SQLite's full consistency check of the logbook file (PRAGMA integrity_check)
and the check of every reference between its tables (PRAGMA
foreign_key_check). An intact logbook prints its path and "ok" (with --json:
{path, integrity: "ok"}); a damaged one exits with status 2 and one line
saying what the checks found. Restore a backup (vigil logbook restore) to
replace a damaged logbook.`)
	book := addLogbookFlag(e, f)
	asJSON := f.toggle("json", "print one JSON object instead of text")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}
	lb, err := book.open()
	if err != nil {
		return err
	}
	if err := lb.IntegrityCheck(); err != nil {
		return fmt.Errorf("the logbook %q fails its check: %w", lb.Path(), err)
	}
	if *asJSON {
		return writeJSON(e.stdout, struct {
			Path      string `json:"path"`
			Integrity string `json:"integrity"`
		}{lb.Path(), "ok"})
	}
	fmt.Fprintf(e.stdout, "%s: ok (integrity and foreign keys checked)\n", lb.Path())
	return nil
}
