// Package table reads the CSV tables vigil takes in: a header row naming the
// columns, '#' comment lines, unknown columns kept and ignored, empty cells
// read as missing values (never zero). Every error it returns names the file,
// line and column of the fault, and the column's name.
//
// It is a thin layer over encoding/csv, whose FieldPos gives the positions.
package table

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"
)

// Error is a fault at one place of an input table. Line and Column count
// from 1; Column is 0 when the fault is a whole line, Line is 0 when it is
// the whole file.
type Error struct {
	File   string
	Line   int
	Column int
	Name   string // the column's name in the header, if known
	Err    error
}

func (e *Error) Error() string {
	var b strings.Builder
	if e.File != "" {
		b.WriteString(e.File)
	} else {
		b.WriteString("input")
	}
	if e.Line > 0 {
		fmt.Fprintf(&b, ": line %d", e.Line)
	}
	if e.Column > 0 {
		fmt.Fprintf(&b, ", column %d", e.Column)
	}
	if e.Name != "" {
		fmt.Fprintf(&b, " (%s)", e.Name)
	}
	b.WriteString(": ")
	b.WriteString(e.Err.Error())
	return b.String()
}

func (e *Error) Unwrap() error { return e.Err }

// ErrMissing is wrapped by errors about a required value or column that is
// absent.
var ErrMissing = errors.New("missing")

// Table is a CSV table read whole into memory.
type Table struct {
	File   string
	Header []string
	cols   map[string]int // lower-case trimmed name → index
	hline  int            // line of the header
	rows   []row
}

type row struct {
	fields []string
	line   int
	col    []int // column (1-based, in bytes) of each field
}

// ReadFile reads the table in the file at path.
func ReadFile(path string) (*Table, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, &Error{File: path, Err: err}
	}
	defer f.Close()
	return Read(f, path)
}

// Read reads a table from r; name is used in errors.
func Read(r io.Reader, name string) (*Table, error) {
	cr := csv.NewReader(r)
	cr.Comment = '#'
	cr.FieldsPerRecord = -1
	cr.TrimLeadingSpace = true
	cr.ReuseRecord = false
	t := &Table{File: name, cols: map[string]int{}}
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			var pe *csv.ParseError
			if errors.As(err, &pe) {
				return nil, &Error{File: name, Line: pe.Line, Column: pe.Column, Err: pe.Err}
			}
			return nil, &Error{File: name, Err: err}
		}
		line, _ := cr.FieldPos(0)
		if t.Header == nil {
			if len(rec) == 1 && strings.TrimSpace(rec[0]) == "" {
				continue // blank line before the header
			}
			t.hline = line
			for i, h := range rec {
				key := strings.ToLower(strings.TrimSpace(h))
				_, c := cr.FieldPos(i)
				if key == "" {
					continue
				}
				if j, dup := t.cols[key]; dup {
					return nil, &Error{File: name, Line: line, Column: c, Name: h,
						Err: fmt.Errorf("column name %q repeats column %d", strings.TrimSpace(h), j+1)}
				}
				t.cols[key] = i
			}
			if len(t.cols) == 0 {
				return nil, &Error{File: name, Line: line, Err: errors.New("header row names no columns")}
			}
			// Keep header positions aligned with record indices.
			t.Header = make([]string, len(rec))
			for i, h := range rec {
				t.Header[i] = strings.TrimSpace(h)
			}
			continue
		}
		if allBlank(rec) {
			continue
		}
		rw := row{fields: rec, line: line, col: make([]int, len(rec))}
		for i := range rec {
			_, rw.col[i] = cr.FieldPos(i)
		}
		t.rows = append(t.rows, rw)
	}
	if t.Header == nil {
		return nil, &Error{File: name, Err: errors.New("no header row: the first line that is not a comment must name the columns")}
	}
	return t, nil
}

func allBlank(rec []string) bool {
	for _, f := range rec {
		if strings.TrimSpace(f) != "" {
			return false
		}
	}
	return true
}

// Has reports whether the header names the column (case and blanks ignored).
func (t *Table) Has(col string) bool {
	_, ok := t.cols[strings.ToLower(strings.TrimSpace(col))]
	return ok
}

// Require returns an error naming the first of cols the header lacks.
func (t *Table) Require(cols ...string) error {
	for _, c := range cols {
		if !t.Has(c) {
			return &Error{File: t.File, Line: t.hline, Err: fmt.Errorf("%w column %q (the header has: %s)", ErrMissing, c, strings.Join(t.nonEmptyHeader(), ", "))}
		}
	}
	return nil
}

func (t *Table) nonEmptyHeader() []string {
	var out []string
	for _, h := range t.Header {
		if h != "" {
			out = append(out, h)
		}
	}
	return out
}

// HeaderLine returns the line number of the header row.
func (t *Table) HeaderLine() int { return t.hline }

// Len returns the number of data rows.
func (t *Table) Len() int { return len(t.rows) }

// Row returns data row i (0-based).
func (t *Table) Row(i int) Row { return Row{t: t, i: i} }

// Row is one data row of a Table.
type Row struct {
	t *Table
	i int
}

// Line returns the row's line number in the file.
func (r Row) Line() int { return r.t.rows[r.i].line }

// Index returns the column index of col, or -1.
func (t *Table) Index(col string) int {
	if i, ok := t.cols[col]; ok { // already lower-case and trimmed: no allocation
		return i
	}
	i, ok := t.cols[strings.ToLower(strings.TrimSpace(col))]
	if !ok {
		return -1
	}
	return i
}

// String returns the trimmed cell of col; "" when the column or cell is
// absent.
func (r Row) String(col string) string {
	i := r.t.Index(col)
	rw := &r.t.rows[r.i]
	if i < 0 || i >= len(rw.fields) {
		return ""
	}
	return strings.TrimSpace(rw.fields[i])
}

// Errorf returns an error positioned at the row's cell of col (or at the
// row when col is "" or absent).
func (r Row) Errorf(col, format string, args ...any) error {
	return r.Wrap(col, fmt.Errorf(format, args...))
}

// Wrap positions err at the row's cell of col.
func (r Row) Wrap(col string, err error) error {
	rw := &r.t.rows[r.i]
	e := &Error{File: r.t.File, Line: rw.line, Err: err}
	if i := r.t.Index(col); i >= 0 {
		e.Name = r.t.Header[i]
		if i < len(rw.col) {
			e.Column = rw.col[i]
		} else if len(rw.col) > 0 {
			e.Column = rw.col[len(rw.col)-1] + len(rw.fields[len(rw.fields)-1]) + 1
		}
	}
	return e
}

// Float reads col as a float64. ok is false when the cell is empty or the
// column absent (a missing value). A cell that is not a finite number is an
// error naming its place.
func (r Row) Float(col string) (v float64, ok bool, err error) {
	s := r.String(col)
	if s == "" {
		return math.NaN(), false, nil
	}
	v, perr := strconv.ParseFloat(s, 64)
	if perr != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return math.NaN(), false, r.Errorf(col, "%q is not a number", s)
	}
	return v, true, nil
}

// MustFloat reads col as Float does but also makes an empty cell an error.
func (r Row) MustFloat(col string) (float64, error) {
	v, ok, err := r.Float(col)
	if err != nil {
		return v, err
	}
	if !ok {
		return v, r.Wrap(col, fmt.Errorf("%w value: the cell is empty", ErrMissing))
	}
	return v, nil
}
