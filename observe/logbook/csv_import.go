package logbook

import (
	"bytes"
	"database/sql"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"time"

	"example.org/vigil/internal/table"
)

// maxImportBytes bounds one CSV file (a logbook table of a lifetime is far
// smaller).
const maxImportBytes = 1 << 30

// csvInput is one CSV file to import.
type csvInput struct {
	table Table
	name  string // for errors and the imports table
	data  []byte
}

// ImportCSV imports one table from r (name is used in errors and in the
// logbook's record of imports) and returns the number of rows stored. The
// whole import is one transaction: every row is stored or none is. An error
// about the input is a *table.Error naming the file, line, column and what
// was expected (a bad number, an unknown target, a duplicate name...).
// Importing into the demo logbook removes the demo first (in the same
// transaction).
func (lb *Logbook) ImportCSV(t Table, r io.Reader, name string) (int, error) {
	if t.columns() == nil {
		return 0, fmt.Errorf("logbook: importing: %w", tableErr(t))
	}
	data, err := io.ReadAll(io.LimitReader(r, maxImportBytes+1))
	if err != nil {
		return 0, &table.Error{File: name, Err: err}
	}
	if len(data) > maxImportBytes {
		return 0, &table.Error{File: name, Err: fmt.Errorf("the file is larger than %d bytes", maxImportBytes)}
	}
	counts, err := lb.importAll([]csvInput{{table: t, name: name, data: data}})
	return counts[t], err
}

// ImportCSVFile imports one table from the file at path, as ImportCSV.
func (lb *Logbook) ImportCSVFile(t Table, path string) (int, error) {
	f, err := os.Open(path)
	if err != nil {
		return 0, &table.Error{File: path, Err: err}
	}
	defer f.Close()
	return lb.ImportCSV(t, f, path)
}

// ImportCSVDir imports every table whose file (Table.FileName) is in the
// directory dir, in the order of Tables, all in one transaction, and
// returns the number of rows stored from each. A directory with none of
// the files is an error.
func (lb *Logbook) ImportCSVDir(dir string) (map[Table]int, error) {
	var inputs []csvInput
	for _, t := range Tables {
		path := filepath.Join(dir, t.FileName())
		data, err := os.ReadFile(path)
		if errors.Is(err, fs.ErrNotExist) {
			continue
		}
		if err != nil {
			return nil, &table.Error{File: path, Err: err}
		}
		inputs = append(inputs, csvInput{table: t, name: path, data: data})
	}
	if len(inputs) == 0 {
		return nil, fmt.Errorf("logbook: importing %s: the directory holds none of the tables (%s, ...)", dir, SitesTable.FileName())
	}
	return lb.importAll(inputs)
}

// importAll imports the inputs in one transaction.
func (lb *Logbook) importAll(inputs []csvInput) (map[Table]int, error) {
	counts := map[Table]int{}
	err := lb.tx(func(tx *sql.Tx) error {
		var demo string
		if err := tx.QueryRow("SELECT value FROM meta WHERE key = 'demo'").Scan(&demo); err != nil && !errors.Is(err, sql.ErrNoRows) {
			return err
		}
		if demo == "1" {
			if err := clearDemo(tx); err != nil {
				return err
			}
		}
		c := newStmtCache(tx)
		defer c.close()
		res := newResolver(c)
		for _, in := range inputs {
			n, err := importOne(c, res, in)
			if err != nil {
				return err
			}
			counts[in.table] += n
		}
		return nil
	})
	if err != nil {
		var te *table.Error
		if errors.As(err, &te) {
			return map[Table]int{}, err
		}
		return map[Table]int{}, lb.wrap(err)
	}
	return counts, nil
}

// importOne imports one file inside the transaction and records it in the
// imports table.
func importOne(tx *stmtCache, res *resolver, in csvInput) (int, error) {
	tab, err := table.Read(bytes.NewReader(in.data), in.name)
	if err != nil {
		return 0, err
	}
	r, err := tx.Exec("INSERT INTO imports(table_name, file, rows, imported_utc) VALUES (?, ?, 0, ?)",
		string(in.table), strings.ToValidUTF8(in.name, "\uFFFD"), stamp(time.Now()))
	if err != nil {
		return 0, err
	}
	importID, err := r.LastInsertId()
	if err != nil {
		return 0, err
	}
	var n int
	switch in.table {
	case SitesTable:
		n, err = importSites(tx, tab)
	case TargetsTable:
		n, err = importTargets(tx, tab, in)
	case EphemeridesTable:
		n, err = importEphemerides(tx, res, tab)
	case NightsTable:
		n, err = importNights(tx, res, tab)
	case PlansTable:
		n, err = importPlans(tx, res, tab)
	case MeasurementsTable:
		n, err = importMeasurements(tx, res, tab, importID)
	case TimingsTable:
		n, err = importTimings(tx, res, tab, importID)
	}
	if err != nil {
		return 0, err
	}
	_, err = tx.Exec("UPDATE imports SET rows = ? WHERE id = ?", n, importID)
	return n, err
}

// rowErr positions err at the row: at the column a *fieldError names, or
// at col.
func rowErr(r table.Row, col string, err error) error {
	var te *table.Error
	if errors.As(err, &te) {
		return err
	}
	var fe *fieldError
	if errors.As(err, &fe) && fe.field != "" {
		col = fe.field
	}
	return r.Wrap(col, err)
}

// optCell reads an optional number: NaN when the cell is empty.
func optCell(r table.Row, col string) (float64, error) {
	v, _, err := r.Float(col)
	return v, err
}
