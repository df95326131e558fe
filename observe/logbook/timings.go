package logbook

import (
	"database/sql"
	"errors"
	"fmt"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

// timingWriter inserts timings with a prepared statement.
type timingWriter struct {
	res *resolver
	ins *sql.Stmt
}

func newTimingWriter(tx *sql.Tx, res *resolver) (*timingWriter, error) {
	ins, err := tx.Prepare(`INSERT INTO timings(target_id, night_id, import_id, jd, timescale, sigma_days, kind, secondary,
		origin, method, source, filter, observer, notes) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`)
	if err != nil {
		return nil, err
	}
	return &timingWriter{res: res, ins: ins}, nil
}

func (w *timingWriter) check(t *Timing) (*targetInfo, error) {
	if err := t.Validate(); err != nil {
		return nil, err
	}
	ti, err := w.res.target(t.Target)
	if err != nil {
		return nil, &fieldError{field: "target", err: err}
	}
	if t.NightID != 0 {
		if err := w.res.checkNight(t.NightID); err != nil {
			return nil, &fieldError{field: "date", err: err}
		}
	}
	return ti, nil
}

func (w *timingWriter) add(t *Timing, importID int64) (int64, error) {
	ti, err := w.check(t)
	if err != nil {
		return 0, err
	}
	res, err := w.ins.Exec(ti.id, nullID(t.NightID), nullID(importID), t.JD, t.Scale.String(), nullable(t.SigmaDays),
		t.Kind.String(), boolInt(t.Secondary), t.Origin.String(), t.Method, t.Source, t.Filter, t.Observer, t.Notes)
	if err != nil {
		return 0, err
	}
	return res.LastInsertId()
}

// AddTiming stores a timing and returns its ID. It names a target in the
// logbook and, for one of the user's own, the night it was taken on (or 0).
func (lb *Logbook) AddTiming(t Timing) (int64, error) {
	var id int64
	err := lb.tx(func(tx *sql.Tx) error {
		w, err := newTimingWriter(tx, newResolver(tx))
		if err != nil {
			return err
		}
		defer w.ins.Close()
		id, err = w.add(&t, 0)
		return err
	})
	return id, lb.wrap(err)
}

// UpdateTiming replaces the timing with t.ID by t.
func (lb *Logbook) UpdateTiming(t Timing) error {
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		if err := checkTimingID(tx, t.ID); err != nil {
			return err
		}
		w, err := newTimingWriter(tx, newResolver(tx))
		if err != nil {
			return err
		}
		defer w.ins.Close()
		ti, err := w.check(&t)
		if err != nil {
			return err
		}
		_, err = tx.Exec(`UPDATE timings SET target_id = ?, night_id = ?, jd = ?, timescale = ?, sigma_days = ?, kind = ?,
			secondary = ?, origin = ?, method = ?, source = ?, filter = ?, observer = ?, notes = ? WHERE id = ?`,
			ti.id, nullID(t.NightID), t.JD, t.Scale.String(), nullable(t.SigmaDays), t.Kind.String(), boolInt(t.Secondary),
			t.Origin.String(), t.Method, t.Source, t.Filter, t.Observer, t.Notes, t.ID)
		return err
	}))
}

func checkTimingID(q querier, id int64) error {
	var one int
	err := q.QueryRow("SELECT 1 FROM timings WHERE id = ?", id).Scan(&one)
	if errors.Is(err, sql.ErrNoRows) {
		return fmt.Errorf("timing %d: %w in the logbook", id, ErrNotFound)
	}
	return err
}

// DeleteTiming removes the timing with this ID.
func (lb *Logbook) DeleteTiming(id int64) error {
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		if err := checkTimingID(tx, id); err != nil {
			return err
		}
		_, err := tx.Exec("DELETE FROM timings WHERE id = ?", id)
		return err
	}))
}

// Timing returns the timing with this ID.
func (lb *Logbook) Timing(id int64) (Timing, error) {
	ts, err := loadTimings(lb.db, "WHERE tm.id = ?", id)
	if err != nil {
		return Timing{}, lb.wrap(err)
	}
	if len(ts) == 0 {
		return Timing{}, lb.wrap(fmt.Errorf("timing %d: %w in the logbook", id, ErrNotFound))
	}
	return ts[0], nil
}

// TimingsOf returns the target's timings, own and published, in time order:
// the points of its O−C diagram.
func (lb *Logbook) TimingsOf(target string) ([]Timing, error) {
	id, err := targetID(lb.db, target)
	if err != nil {
		return nil, lb.wrap(err)
	}
	ts, err := loadTimings(lb.db, "WHERE tm.target_id = ? ORDER BY tm.jd, tm.id", id)
	return ts, lb.wrap(err)
}

func loadTimings(q querier, tail string, args ...any) ([]Timing, error) {
	rows, err := q.Query(`SELECT tm.id, t.name, tm.night_id, tm.import_id, tm.jd, tm.timescale, tm.sigma_days, tm.kind,
		tm.secondary, tm.origin, tm.method, tm.source, tm.filter, tm.observer, tm.notes
		FROM timings tm JOIN targets t ON t.id = tm.target_id `+tail, args...)
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	var out []Timing
	for rows.Next() {
		var (
			t                   Timing
			night, imp          sql.NullInt64
			scale, kind, origin string
			sigma               sql.NullFloat64
			sec                 int64
		)
		if err := rows.Scan(&t.ID, &t.Target, &night, &imp, &t.JD, &scale, &sigma, &kind, &sec, &origin, &t.Method,
			&t.Source, &t.Filter, &t.Observer, &t.Notes); err != nil {
			return nil, err
		}
		t.NightID, t.ImportID, t.SigmaDays, t.Secondary = night.Int64, imp.Int64, orNaN(sigma), sec != 0
		if t.Scale, err = ephem.ParseTimeScale(scale); err != nil {
			return nil, err
		}
		if t.Kind, err = observe.ParseKind(kind); err != nil {
			return nil, err
		}
		if t.Origin, err = ParseOrigin(origin); err != nil {
			return nil, err
		}
		out = append(out, t)
	}
	return out, rows.Err()
}
