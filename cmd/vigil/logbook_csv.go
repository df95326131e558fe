package main

import (
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"strings"

	csvtable "example.org/vigil/internal/table"
	"example.org/vigil/observe/logbook"
)

// csvFile is one CSV file exported or imported: its table, its path and the
// rows in it.
type csvFile struct {
	Table string `json:"table"`
	File  string `json:"file"`
	Rows  int    `json:"rows"`
}

// exportResponse is the answer of vigil logbook export with --json.
type exportResponse struct {
	Logbook string    `json:"logbook"`
	Files   []csvFile `json:"files"`
}

// tableNames lists the logbook's CSV tables, for help and messages.
func tableNames() string {
	names := make([]string, len(logbook.Tables))
	for i, t := range logbook.Tables {
		names[i] = string(t)
	}
	return strings.Join(names, ", ")
}

func runLogbookExport(e *env, args []string) error {
	f := newFlags(e.cmd, "(--dir DIR | --table NAME --out FILE.csv) [--logbook PATH] [--json]",
		`Writes the logbook's tables as CSV: with --dir every table into DIR (made if
missing) as sites.csv, targets.csv, ephemerides.csv, nights.csv, plans.csv,
measurements.csv and timings.csv; with --table one table into --out. Every
number is written exactly (the shortest decimal that reads back to the same
value), a missing value as an empty cell; records refer to each other by name
and by site and date, so that vigil logbook import reads the files back into
another logbook. Each file is written whole or not at all; the files written
are listed with their rows (with --json: {logbook, files [{table, file,
rows}]}).`)
	dirText := f.value("dir", "DIR", "", "the directory to write every table into", "or --table and --out")
	tableText := f.value("table", "NAME", "", "the one table to write: "+tableNames(), "with --out")
	outText := f.value("out", "FILE", "", "the file to write the one --table into, ending in .csv", "with --table")
	book := addLogbookFlag(e, f)
	asJSON := f.toggle("json", "print one JSON object instead of text")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}
	one, err := oneOrAll(f, "out")
	if err != nil {
		return err
	}
	var t logbook.Table
	var out, dir string
	if one {
		if t, err = get(f, "table", *tableText, parseTableName); err != nil {
			return err
		}
		if out, err = get(f, "out", *outText, parseCSVOut); err != nil {
			return err
		}
	} else if dir, err = get(f, "dir", *dirText, parseExportDir); err != nil {
		return err
	}
	lb, err := book.open()
	if err != nil {
		return err
	}

	resp := exportResponse{Logbook: lb.Path()}
	if one {
		if sameFile(out, lb.Path()) {
			return &flagError{flag: "out", err: fmt.Errorf("%q is the logbook itself: want another file", out)}
		}
		if err := lb.ExportCSVFile(t, out); err != nil {
			return &flagError{flag: "out", err: err}
		}
		resp.Files = []csvFile{{Table: string(t), File: out}}
	} else {
		for _, t := range logbook.Tables {
			if p := filepath.Join(dir, t.FileName()); sameFile(p, lb.Path()) {
				return &flagError{flag: "dir", err: fmt.Errorf("%q: the logbook itself is %s there: want another directory", dir, t.FileName())}
			}
		}
		if err := lb.ExportCSVDir(dir); err != nil {
			return &flagError{flag: "dir", err: err}
		}
		for _, t := range logbook.Tables {
			resp.Files = append(resp.Files, csvFile{Table: string(t), File: filepath.Join(dir, t.FileName())})
		}
	}
	for i := range resp.Files {
		if resp.Files[i].Rows, err = csvRows(resp.Files[i].File); err != nil {
			return fmt.Errorf("counting the rows written: %w", err)
		}
	}
	if *asJSON {
		return writeJSON(e.stdout, resp)
	}
	fmt.Fprintf(e.stdout, "Exported from the logbook %s:\n", resp.Logbook)
	writeCSVFiles(e.stdout, resp.Files)
	return nil
}

// importResponse is the answer of vigil logbook import with --json.
type importResponse struct {
	Logbook     string    `json:"logbook"`
	Created     bool      `json:"created"`      // made by this run, empty before the import
	DemoRemoved bool      `json:"demo_removed"` // the demo scenario was removed first
	Files       []csvFile `json:"files"`        // the files read, in the order imported
	Rows        int       `json:"rows"`         // stored in all
}

func runLogbookImport(e *env, args []string) error {
	f := newFlags(e.cmd, "(--dir DIR | --table NAME --input FILE) [--logbook PATH] [--json]",
		`Adds CSV tables to the logbook: with --dir every table whose file is in DIR
(sites.csv, targets.csv, ephemerides.csv, nights.csv, plans.csv,
measurements.csv, timings.csv, in that order, each may refer to the ones
before it); with --table one table from --input. The columns are those vigil
logbook export writes (see the logbook's documentation): a header row, '#'
comment lines, unknown columns ignored, empty cells missing. An import only
adds: a name already in the logbook, or repeated in the file, is an error.
The whole import is one transaction: every row is stored or none, and an
error names the file, line and column. Importing into the demo logbook
removes the demo first, in the same transaction. A logbook that does not
exist yet is made empty (and removed again if the import fails). With
--json: {logbook, created, demo_removed, files [{table, file, rows}], rows}.`)
	dirText := f.value("dir", "DIR", "", "the directory to read the tables from", "or --table and --input")
	tableText := f.value("table", "NAME", "", "the one table to read: "+tableNames(), "with --input")
	inputText := f.value("input", "FILE", "", "the CSV file of the one --table", "with --table")
	book := addLogbookFlagAs(e, f, "the logbook to import into; one that does not exist yet is made empty")
	asJSON := f.toggle("json", "print one JSON object instead of text")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}
	one, err := oneOrAll(f, "input")
	if err != nil {
		return err
	}
	var t logbook.Table
	var input, dir string
	if one {
		if t, err = get(f, "table", *tableText, parseTableName); err != nil {
			return err
		}
		if input, err = get(f, "input", *inputText, parseReadableFile); err != nil {
			return err
		}
	} else if dir, err = get(f, "dir", *dirText, parseImportDir); err != nil {
		return err
	}
	lb, made, err := book.openExisting()
	if err != nil {
		return err
	}
	resp := importResponse{Logbook: lb.Path(), Created: made}
	if resp.DemoRemoved, err = lb.IsDemo(); err != nil {
		return fmt.Errorf("reading the demo flag of %s: %w", lb.Path(), err)
	}

	counts := map[logbook.Table]int{}
	if one {
		var n int
		n, err = lb.ImportCSVFile(t, input)
		counts[t] = n
	} else {
		counts, err = lb.ImportCSVDir(dir)
	}
	if err != nil {
		return importError(err, one)
	}
	for _, t := range logbook.Tables {
		n, ok := counts[t]
		if !ok {
			continue
		}
		file := input
		if !one {
			file = filepath.Join(dir, t.FileName())
		}
		resp.Files = append(resp.Files, csvFile{Table: string(t), File: file, Rows: n})
		resp.Rows += n
	}
	if *asJSON {
		return writeJSON(e.stdout, resp)
	}
	w := e.stdout
	switch {
	case resp.Created:
		fmt.Fprintf(w, "Made the logbook %s and imported %s:\n", resp.Logbook, count(resp.Rows, "row", "rows"))
	case resp.DemoRemoved:
		fmt.Fprintf(w, "Removed the demo scenario from the logbook %s and imported %s:\n", resp.Logbook, count(resp.Rows, "row", "rows"))
	default:
		fmt.Fprintf(w, "Imported %s into the logbook %s:\n", count(resp.Rows, "row", "rows"), resp.Logbook)
	}
	writeCSVFiles(w, resp.Files)
	return nil
}

// importError passes an error about the input (a *csvtable.Error, which names
// the file, line and column) as it is, and names the flag for the rest.
func importError(err error, one bool) error {
	var te *csvtable.Error
	if errors.As(err, &te) {
		return err
	}
	if one {
		return &flagError{flag: "input", err: err}
	}
	return &flagError{flag: "dir", err: err}
}

// oneOrAll checks that either --dir or --table with its file flag (--out
// or --input) was given, and says which: one is true for --table.
func oneOrAll(f *flags, file string) (one bool, err error) {
	switch {
	case f.given("dir") && (f.given("table") || f.given(file)):
		other := "table"
		if !f.given("table") {
			other = file
		}
		return false, &flagError{flag: "dir", err: fmt.Errorf("give either --dir or --table with --%s, not both (--%s was given too)", file, other)}
	case f.given("dir"):
		return false, nil
	case f.given("table") && !f.given(file):
		return false, &flagError{flag: file, err: fmt.Errorf("missing: --table needs --%s FILE", file)}
	case f.given(file) && !f.given("table"):
		return false, &flagError{flag: "table", err: fmt.Errorf("missing: --%s needs --table NAME, one of %s", file, tableNames())}
	case f.given("table"):
		return true, nil
	}
	return false, &flagError{flag: "dir", err: fmt.Errorf("missing: give --dir DIR for every table, or --table NAME with --%s FILE for one", file)}
}

// parseTableName reads --table.
func parseTableName(s string) (logbook.Table, error) {
	t, err := logbook.ParseTable(s)
	if err != nil {
		return "", fmt.Errorf("%q: want one of %s", s, tableNames())
	}
	return t, nil
}

// writeCSVFiles lists CSV files with their tables and rows, for people.
func writeCSVFiles(w io.Writer, files []csvFile) {
	t := newTable(w)
	for _, f := range files {
		t.row("  "+f.Table, count(f.Rows, "row", "rows"), f.File)
	}
	t.flush()
}
