package logbook

import (
	"bufio"
	"context"
	"database/sql"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"

	"example.org/vigil/internal/safefile"
)

// backupFormat is the "format" field of a JSON backup.
const backupFormat = "vigil logbook backup"

// Backup writes the whole logbook as one JSON document: every table of the
// file, every column, every row, in a fixed order, numbers written exactly
// (the shortest text that reads back to the same float64), missing values as
// null. Restore turns it back into an identical logbook. It reads one
// consistent snapshot; writers are not held up meanwhile.
//
// The document is
//
//	{"format": "vigil logbook backup", "schema_version": N,
//	 "tables": [{"name": "sites", "columns": ["id", "name", ...],
//	             "rows": [[1, "Ashgrove Hill Observatory (demo)", ...], ...]}, ...]}
//
// with one row per line; the tables and columns are those of the package
// documentation's schema.
func (lb *Logbook) Backup(w io.Writer) error {
	tx, err := lb.db.BeginTx(context.Background(), &sql.TxOptions{ReadOnly: true})
	if err != nil {
		return lb.wrap(err)
	}
	defer tx.Rollback()
	var version int
	if err := tx.QueryRow("SELECT max(version) FROM schema_version").Scan(&version); err != nil {
		return lb.wrap(err)
	}
	bw := bufio.NewWriterSize(w, 1<<16)
	fmt.Fprintf(bw, "{\"format\": %q, \"schema_version\": %d, \"tables\": [", backupFormat, version)
	for i, bt := range backupTables {
		cols, err := tableColumns(tx, bt.name)
		if err != nil {
			return lb.wrap(err)
		}
		if i > 0 {
			bw.WriteString(",")
		}
		fmt.Fprintf(bw, "\n{\"name\": %q, \"columns\": [", bt.name)
		for j, c := range cols {
			if j > 0 {
				bw.WriteString(", ")
			}
			bw.WriteString(strconv.Quote(c))
		}
		bw.WriteString("], \"rows\": [")
		if err := dumpRows(tx, bw, bt.name, bt.orderBy, cols); err != nil {
			return lb.wrap(fmt.Errorf("backing up table %s: %w", bt.name, err))
		}
		bw.WriteString("]}")
	}
	bw.WriteString("\n]}\n")
	return bw.Flush()
}

// BackupFile writes the backup to the file at path, whole or not at all.
func (lb *Logbook) BackupFile(path string) error {
	return safefile.Write(path, lb.Backup)
}

// tableColumns returns a table's columns in their order in the schema.
func tableColumns(q querier, name string) ([]string, error) {
	rows, err := q.Query("SELECT name FROM pragma_table_info(?) ORDER BY cid", name)
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	var cols []string
	for rows.Next() {
		var c string
		if err := rows.Scan(&c); err != nil {
			return nil, err
		}
		cols = append(cols, c)
	}
	if len(cols) == 0 {
		return nil, fmt.Errorf("table %q is not in the schema", name)
	}
	return cols, rows.Err()
}

func dumpRows(q querier, w *bufio.Writer, name, orderBy string, cols []string) error {
	rows, err := q.Query(fmt.Sprintf("SELECT %s FROM %s ORDER BY %s", strings.Join(cols, ", "), name, orderBy))
	if err != nil {
		return err
	}
	defer rows.Close()
	vals := make([]any, len(cols))
	ptrs := make([]any, len(cols))
	for i := range vals {
		ptrs[i] = &vals[i]
	}
	first := true
	for rows.Next() {
		if err := rows.Scan(ptrs...); err != nil {
			return err
		}
		if !first {
			w.WriteString(",")
		}
		first = false
		w.WriteString("\n[")
		for i, v := range vals {
			if i > 0 {
				w.WriteString(", ")
			}
			if err := writeValue(w, v); err != nil {
				return fmt.Errorf("column %s: %w", cols[i], err)
			}
		}
		w.WriteString("]")
	}
	return rows.Err()
}

// writeValue writes one SQLite value as JSON.
func writeValue(w *bufio.Writer, v any) error {
	switch x := v.(type) {
	case nil:
		w.WriteString("null")
	case int64:
		w.WriteString(strconv.FormatInt(x, 10))
	case float64:
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return fmt.Errorf("value %v is not a finite number", x)
		}
		w.WriteString(fmtFloat(x))
	case string:
		b, err := json.Marshal(x)
		if err != nil {
			return err
		}
		w.Write(b)
	default:
		return fmt.Errorf("value of type %T cannot be backed up", v)
	}
	return nil
}

// backupDoc is a JSON backup as read.
type backupDoc struct {
	Format        string `json:"format"`
	SchemaVersion int    `json:"schema_version"`
	Tables        []struct {
		Name    string   `json:"name"`
		Columns []string `json:"columns"`
		Rows    [][]any  `json:"rows"`
	} `json:"tables"`
}

// Restore makes a new logbook at path from a JSON backup read from r (name
// is used in errors) and opens it. It refuses to overwrite a file
// (ErrExists). The backup is loaded at its own schema version, checked
// (types, constraints, foreign keys, and every record as the logbook's API
// would check it), then migrated to the newest schema; the new file
// appears only when all of that succeeded.
func Restore(path string, r io.Reader, name string) (*Logbook, error) {
	if err := refuseExisting(path); err != nil {
		return nil, err
	}
	dec := json.NewDecoder(r)
	dec.UseNumber()
	var doc backupDoc
	if err := dec.Decode(&doc); err != nil {
		return nil, fmt.Errorf("logbook: restoring %s: not a JSON backup: %w", name, err)
	}
	if doc.Format != backupFormat {
		return nil, fmt.Errorf("logbook: restoring %s: format %q: want %q", name, doc.Format, backupFormat)
	}
	if doc.SchemaVersion < 1 || doc.SchemaVersion > SchemaVersion {
		return nil, fmt.Errorf("logbook: restoring %s: schema version %d: %w (this program knows versions 1 to %d)",
			name, doc.SchemaVersion, ErrNewerSchema, SchemaVersion)
	}
	err := build(path, doc.SchemaVersion, func(lb *Logbook) error {
		return lb.tx(func(tx *sql.Tx) error { return restoreInto(tx, &doc) })
	})
	if err != nil {
		return nil, fmt.Errorf("logbook: restoring %s: %w", name, err)
	}
	return Open(path)
}

// RestoreFile is Restore from the backup file at backupPath.
func RestoreFile(path, backupPath string) (*Logbook, error) {
	f, err := os.Open(backupPath)
	if err != nil {
		return nil, fmt.Errorf("logbook: %w", err)
	}
	defer f.Close()
	return Restore(path, bufio.NewReader(f), backupPath)
}

func restoreInto(tx *sql.Tx, doc *backupDoc) error {
	// The new file's own bookkeeping gives way to the backup's.
	if _, err := tx.Exec("DELETE FROM meta"); err != nil {
		return err
	}
	if _, err := tx.Exec("DELETE FROM schema_version"); err != nil {
		return err
	}
	seen := map[string]bool{}
	for _, t := range doc.Tables {
		known := false
		for _, bt := range backupTables {
			known = known || bt.name == t.Name
		}
		if !known || seen[t.Name] {
			return fmt.Errorf("table %q: unknown or repeated", t.Name)
		}
		seen[t.Name] = true
		cols, err := tableColumns(tx, t.Name)
		if err != nil {
			return err
		}
		if strings.Join(cols, ",") != strings.Join(t.Columns, ",") {
			return fmt.Errorf("table %s: columns %v: want %v for schema version %d", t.Name, t.Columns, cols, doc.SchemaVersion)
		}
		if err := restoreRows(tx, t.Name, cols, t.Rows); err != nil {
			return err
		}
	}
	for _, bt := range backupTables {
		if !seen[bt.name] {
			return fmt.Errorf("table %q is missing", bt.name)
		}
	}
	var v sql.NullInt64
	if err := tx.QueryRow("SELECT max(version) FROM schema_version").Scan(&v); err != nil {
		return err
	}
	if int(v.Int64) != doc.SchemaVersion {
		return fmt.Errorf("the schema_version table says version %d, the document %d", v.Int64, doc.SchemaVersion)
	}
	var format string
	if err := tx.QueryRow("SELECT value FROM meta WHERE key = 'format'").Scan(&format); err != nil || format != formatName {
		return fmt.Errorf("the meta table does not name the format %q", formatName)
	}
	var broken int
	if err := tx.QueryRow("SELECT count(*) FROM pragma_foreign_key_check").Scan(&broken); err != nil {
		return err
	}
	if broken > 0 {
		return fmt.Errorf("%d rows refer to records that are not there", broken)
	}
	return checkRecords(tx)
}

// restoreRows inserts the rows of one table, batchRows to a statement; when
// a batch fails it inserts that batch's rows one by one to name the row at
// fault (a failed statement leaves nothing behind).
func restoreRows(tx *sql.Tx, table string, cols []string, rows [][]any) error {
	head := fmt.Sprintf("INSERT INTO %s(%s) VALUES ", table, strings.Join(cols, ", "))
	b := &batchInserter{tx: tx, head: head, width: len(cols)}
	defer b.close()
	for start := 0; start < len(rows); start += batchRows {
		end := min(start+batchRows, len(rows))
		var args []any
		for i := start; i < end; i++ {
			a, err := rowArgs(rows[i], len(cols))
			if err != nil {
				return fmt.Errorf("table %s, row %d: %w", table, i+1, err)
			}
			args = append(args, a...)
		}
		b.queue = args
		if err := b.flush(); err != nil {
			for i := start; i < end; i++ {
				a, _ := rowArgs(rows[i], len(cols))
				b.queue = a
				if err := b.flush(); err != nil {
					return fmt.Errorf("table %s, row %d: %w", table, i+1, err)
				}
			}
			return fmt.Errorf("table %s, rows %d to %d: %w", table, start+1, end, err)
		}
	}
	return nil
}

// rowArgs turns one JSON row into SQL values: numbers without a fraction or
// exponent are integers, others float64 (a REAL column stores an integer as
// the same float64).
func rowArgs(row []any, n int) ([]any, error) {
	if len(row) != n {
		return nil, fmt.Errorf("%d values: want %d", len(row), n)
	}
	args := make([]any, n)
	for i, v := range row {
		switch x := v.(type) {
		case nil, string:
			args[i] = x
		case json.Number:
			s := string(x)
			if strings.ContainsAny(s, ".eE") {
				f, err := strconv.ParseFloat(s, 64)
				if err != nil || math.IsInf(f, 0) {
					return nil, fmt.Errorf("value %d: %s is not a finite number", i+1, s)
				}
				args[i] = f
			} else {
				k, err := strconv.ParseInt(s, 10, 64)
				if err != nil {
					return nil, fmt.Errorf("value %d: %s is not a 64-bit integer", i+1, s)
				}
				args[i] = k
			}
		default:
			return nil, fmt.Errorf("value %d: %v: want a number, a string or null", i+1, v)
		}
	}
	return args, nil
}

// checkRecords reads every record back through the logbook's own readers
// and checks it as the API would have on the way in.
func checkRecords(q querier) error {
	if _, err := loadSites(q, ""); err != nil {
		return err
	}
	ts, _, err := loadTargets(q, "")
	if err != nil {
		return err
	}
	var nTargets int
	if err := q.QueryRow("SELECT count(*) FROM targets").Scan(&nTargets); err != nil {
		return err
	}
	if nTargets != len(ts) {
		return fmt.Errorf("%d targets have no ephemeris", nTargets-len(ts))
	}
	cols, err := tableColumns(q, "targets")
	if err != nil {
		return err
	}
	if strings.Contains(","+strings.Join(cols, ",")+",", ",mean_mag_v,") { // schema version 2 and later
		var bad sql.NullFloat64
		err := q.QueryRow("SELECT mean_mag_v FROM targets WHERE mean_mag_v NOT BETWEEN ? AND ? LIMIT 1", -maxAbsMag, maxAbsMag).Scan(&bad)
		if err == nil {
			return fmt.Errorf("mean V magnitude %v: want within ±%d", bad.Float64, maxAbsMag)
		}
		if !errors.Is(err, sql.ErrNoRows) {
			return err
		}
	}
	for i := range ts {
		if err := checkTarget(&ts[i], math.NaN()); err != nil {
			return err
		}
	}
	hist, err := loadHistory(q, "")
	if err != nil {
		return err
	}
	for _, h := range hist {
		if err := h.Ephemeris.Validate(); err != nil {
			return err
		}
		if err := checkText("ephemeris source", h.Source); err != nil {
			return err
		}
	}
	ns, err := loadNights(q, "")
	if err != nil {
		return err
	}
	for i := range ns {
		if err := ns[i].Validate(); err != nil {
			return err
		}
	}
	ms, err := loadMeasurements(q, "ORDER BY m.id")
	if err != nil {
		return err
	}
	for i := range ms {
		if err := ms[i].Validate(); err != nil {
			return fmt.Errorf("measurement %d: %w", ms[i].ID, err)
		}
	}
	tms, err := loadTimings(q, "ORDER BY tm.id")
	if err != nil {
		return err
	}
	for i := range tms {
		if err := tms[i].Validate(); err != nil {
			return fmt.Errorf("timing %d: %w", tms[i].ID, err)
		}
	}
	return nil
}
