package logbook

import (
	"database/sql"
	"math"
	"strings"
)

// nullable turns NaN into SQL NULL.
func nullable(v float64) any {
	if math.IsNaN(v) {
		return nil
	}
	return v
}

// nullIfZero turns 0 into SQL NULL, for the quantities whose Go type counts
// 0 as unknown (ephemeris uncertainties, a catalogue's last timing).
func nullIfZero(v float64) any {
	if v == 0 || math.IsNaN(v) {
		return nil
	}
	return v
}

// nullID turns the ID 0 (none) into SQL NULL.
func nullID(id int64) any {
	if id == 0 {
		return nil
	}
	return id
}

// orNaN reads a nullable REAL: NULL is NaN.
func orNaN(n sql.NullFloat64) float64 {
	if !n.Valid {
		return math.NaN()
	}
	return n.Float64
}

// orZero reads a nullable REAL whose Go type counts 0 as unknown.
func orZero(n sql.NullFloat64) float64 {
	if !n.Valid {
		return 0
	}
	return n.Float64
}

// boolInt writes a bool as SQLite's 0 or 1.
func boolInt(b bool) int64 {
	if b {
		return 1
	}
	return 0
}

// querier is what *sql.DB and *sql.Tx share.
type querier interface {
	Exec(query string, args ...any) (sql.Result, error)
	Query(query string, args ...any) (*sql.Rows, error)
	QueryRow(query string, args ...any) *sql.Row
}

// stmtCache runs statements in a transaction, preparing each distinct one
// once: an import asks the same few questions for every row.
type stmtCache struct {
	tx *sql.Tx
	m  map[string]*sql.Stmt
}

func newStmtCache(tx *sql.Tx) *stmtCache { return &stmtCache{tx: tx, m: map[string]*sql.Stmt{}} }

func (c *stmtCache) stmt(query string) (*sql.Stmt, error) {
	if s, ok := c.m[query]; ok {
		return s, nil
	}
	s, err := c.tx.Prepare(query)
	if err != nil {
		return nil, err
	}
	c.m[query] = s
	return s, nil
}

func (c *stmtCache) Exec(query string, args ...any) (sql.Result, error) {
	s, err := c.stmt(query)
	if err != nil {
		return nil, err
	}
	return s.Exec(args...)
}

func (c *stmtCache) Query(query string, args ...any) (*sql.Rows, error) {
	s, err := c.stmt(query)
	if err != nil {
		return nil, err
	}
	return s.Query(args...)
}

func (c *stmtCache) QueryRow(query string, args ...any) *sql.Row {
	s, err := c.stmt(query)
	if err != nil {
		return c.tx.QueryRow(query, args...) // fails the same way, with the error in the Row
	}
	return s.QueryRow(args...)
}

func (c *stmtCache) close() {
	for _, s := range c.m {
		s.Close()
	}
}

// batchInserter queues rows for one table and inserts them batchRows to a
// statement (prepared once), the rest one by one.
type batchInserter struct {
	tx        *sql.Tx
	head      string // "INSERT INTO t(cols) VALUES "
	width     int
	before    func() error // run before each flush (may be nil)
	queue     []any
	one, many *sql.Stmt
}

func (b *batchInserter) add(values ...any) error {
	b.queue = append(b.queue, values...)
	if len(b.queue) >= batchRows*b.width {
		return b.flush()
	}
	return nil
}

func (b *batchInserter) stmt(rows int) (*sql.Stmt, error) {
	p := &b.one
	if rows > 1 {
		p = &b.many
	}
	if *p == nil {
		group := "(" + strings.TrimSuffix(strings.Repeat("?, ", b.width), ", ") + ")"
		s, err := b.tx.Prepare(b.head + strings.TrimSuffix(strings.Repeat(group+", ", rows), ", "))
		if err != nil {
			return nil, err
		}
		*p = s
	}
	return *p, nil
}

func (b *batchInserter) flush() error {
	if b.before != nil && len(b.queue) > 0 {
		if err := b.before(); err != nil {
			return err
		}
	}
	for len(b.queue) > 0 {
		rows := 1
		if len(b.queue) >= batchRows*b.width {
			rows = batchRows
		}
		s, err := b.stmt(rows)
		if err != nil {
			return err
		}
		if _, err := s.Exec(b.queue[:rows*b.width]...); err != nil {
			return err
		}
		b.queue = b.queue[rows*b.width:]
	}
	b.queue = b.queue[:0]
	return nil
}

func (b *batchInserter) close() {
	for _, s := range []*sql.Stmt{b.one, b.many} {
		if s != nil {
			s.Close()
		}
	}
}
