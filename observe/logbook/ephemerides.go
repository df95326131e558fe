package logbook

import (
	"database/sql"
	"example.org/vigil/ephem"
	"fmt"
	"math"
	"time"
)

// insertEphemeris adds an entry to the target's ephemeris history.
func insertEphemeris(q querier, targetID int64, e ephem.Ephemeris, adopted time.Time, source string) error {
	if err := e.Validate(); err != nil {
		return err
	}
	if math.IsInf(e.EpochErr, 0) || math.IsInf(e.PeriodErr, 0) {
		return fmt.Errorf("ephemeris uncertainties must be finite")
	}
	if err := checkText("ephemeris source", source); err != nil {
		return err
	}
	_, err := q.Exec(`INSERT INTO ephemerides(target_id, epoch, period_days, q_days, timescale, epoch_err, period_err, adopted_utc, source)
		VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)`, targetID, e.Epoch, e.PeriodDays, e.Q, e.Scale.String(),
		nullIfZero(e.EpochErr), nullIfZero(e.PeriodErr), stamp(adopted), source)
	return err
}

// AdoptEphemeris makes eph the target's current ephemeris, adopted now from
// source (e.g. "own O−C fit 2026" or a publication). The ephemerides adopted
// before stay in the history (EphemerisHistory).
func (lb *Logbook) AdoptEphemeris(target string, eph ephem.Ephemeris, source string) error {
	return lb.AdoptEphemerisAt(target, eph, source, time.Now())
}

// AdoptEphemerisAt is AdoptEphemeris with the date of adoption given (kept to
// the second, in UTC). An ephemeris adopted at an earlier date than the
// current one joins the history without becoming current.
func (lb *Logbook) AdoptEphemerisAt(target string, eph ephem.Ephemeris, source string, at time.Time) error {
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		id, err := targetID(tx, target)
		if err != nil {
			return err
		}
		if err := insertEphemeris(tx, id, eph, at, source); err != nil {
			return fmt.Errorf("target %q: %w", target, err)
		}
		return nil
	}))
}

// EphemerisHistory returns every ephemeris the target has had, in order of
// adoption: the last one is the current one.
func (lb *Logbook) EphemerisHistory(target string) ([]AdoptedEphemeris, error) {
	id, err := targetID(lb.db, target)
	if err != nil {
		return nil, lb.wrap(err)
	}
	h, err := loadHistory(lb.db, "WHERE target_id = ?", id)
	return h, lb.wrap(err)
}

func loadHistory(q querier, where string, args ...any) ([]AdoptedEphemeris, error) {
	rows, err := q.Query(`SELECT epoch, period_days, q_days, timescale, epoch_err, period_err, adopted_utc, source
		FROM ephemerides `+where+` ORDER BY adopted_utc, id`, args...)
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	var out []AdoptedEphemeris
	for rows.Next() {
		var (
			a           AdoptedEphemeris
			scale, when string
			eErr, pErr  sql.NullFloat64
		)
		if err := rows.Scan(&a.Epoch, &a.PeriodDays, &a.Q, &scale, &eErr, &pErr, &when, &a.Source); err != nil {
			return nil, err
		}
		a.EpochErr, a.PeriodErr = orZero(eErr), orZero(pErr)
		if a.Scale, err = ephem.ParseTimeScale(scale); err != nil {
			return nil, err
		}
		if a.Adopted, err = parseStamp(when); err != nil {
			return nil, err
		}
		out = append(out, a)
	}
	return out, rows.Err()
}
