package logbook

import (
	"database/sql"
	"errors"
	"fmt"
	"math"
	"strings"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

// AddTarget stores a new target with its comparison and check stars. Its
// ephemeris becomes the first entry of its history, adopted now from source
// (e.g. the catalogue it was taken from). Names are unique regardless of
// case. t.LastTimingJD, when set, is kept as the catalogue's last timing:
// Targets reports the later of it and the logbook's own timings.
func (lb *Logbook) AddTarget(t observe.Target, source string) error {
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		_, err := addTarget(tx, t, math.NaN(), source, time.Now(), false)
		return err
	}))
}

func addTarget(q querier, t observe.Target, meanMagV float64, source string, adopted time.Time, demo bool) (int64, error) {
	if err := checkTarget(&t, meanMagV); err != nil {
		return 0, err
	}
	if err := checkText("ephemeris source", source); err != nil {
		return 0, err
	}
	if _, err := targetID(q, t.Name); err == nil {
		return 0, fmt.Errorf("target %q is already in the logbook", t.Name)
	} else if !errors.Is(err, ErrNotFound) {
		return 0, err
	}
	res, err := q.Exec(`INSERT INTO targets(name, ra_h, dec_deg, pm_ra_mas_yr, pm_dec_mas_yr, class, kind, secondary,
		mag_bright, mag_faint, last_timing_jd, notes, demo, mean_mag_v) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
		t.Name, t.Star.RAHours, t.Star.DecDeg, t.Star.PMRA, t.Star.PMDec, t.Class.String(), t.Kind.String(),
		boolInt(t.Secondary), nullable(t.MagBright), nullable(t.MagFaint), nullIfZero(t.LastTimingJD), t.Notes,
		boolInt(demo), nullable(meanMagV))
	if err != nil {
		return 0, fmt.Errorf("target %q: %w", t.Name, err)
	}
	id, err := res.LastInsertId()
	if err != nil {
		return 0, err
	}
	if err := insertEphemeris(q, id, t.Ephemeris, adopted, source); err != nil {
		return 0, err
	}
	return id, putComps(q, id, t.Comps, t.Checks)
}

// checkTarget validates t as observe does and adds the logbook's own rules.
func checkTarget(t *observe.Target, meanMagV float64) error {
	if err := checkName("target name", t.Name); err != nil {
		return fieldErr("name", "%v", err)
	}
	if err := t.Validate(); err != nil {
		return fmt.Errorf("target %q: %w", t.Name, err)
	}
	if math.IsInf(t.MagBright, 0) || math.IsInf(t.MagFaint, 0) {
		return fieldErr("mag_bright", "target %q: magnitude range must be finite", t.Name)
	}
	if t.LastTimingJD != 0 && !validJD(t.LastTimingJD) {
		return fieldErr("last_timing", "target %q: last timing %v: want a full Julian date, or 0 for none", t.Name, t.LastTimingJD)
	}
	if !optional(meanMagV, -maxAbsMag, maxAbsMag) {
		return fieldErr("mean_mag_v", "target %q: mean V magnitude %v: want within ±%d, or none", t.Name, meanMagV, maxAbsMag)
	}
	if err := checkText("notes", t.Notes); err != nil {
		return fieldErr("notes", "target %q: %v", t.Name, err)
	}
	seen := map[string]bool{}
	for i, c := range append(append([]observe.Comp(nil), t.Comps...), t.Checks...) {
		col := "comps"
		if i >= len(t.Comps) {
			col = "checks"
		}
		if err := checkName("comparison star ID", c.ID); err != nil {
			return fieldErr(col, "target %q: %v", t.Name, err)
		}
		if strings.ContainsAny(c.ID, ";=/") {
			return fieldErr(col, "target %q: comparison star ID %q: the characters ; = / are kept for the CSV cells", t.Name, c.ID)
		}
		if seen[strings.ToLower(c.ID)] {
			return fieldErr(col, "target %q: comparison star %q appears twice", t.Name, c.ID)
		}
		seen[strings.ToLower(c.ID)] = true
		if math.IsNaN(c.V) || math.Abs(c.V) > maxAbsMag || !optional(c.BV, -10, 10) {
			return fieldErr(col, "target %q: comparison star %q: V %v, B−V %v: want finite magnitudes", t.Name, c.ID, c.V, c.BV)
		}
	}
	return nil
}

// targetID returns the ID of the target named name (any case), or an error
// wrapping ErrNotFound.
func targetID(q querier, name string) (int64, error) {
	var id int64
	err := q.QueryRow("SELECT id FROM targets WHERE name = ?", name).Scan(&id)
	if errors.Is(err, sql.ErrNoRows) {
		return 0, fmt.Errorf("target %q: %w in the logbook", name, ErrNotFound)
	}
	return id, err
}

// targetSelect reads each target with its current ephemeris (the one
// adopted last) and the latest of its timings.
const targetSelect = `SELECT t.id, t.name, t.ra_h, t.dec_deg, t.pm_ra_mas_yr, t.pm_dec_mas_yr, t.class, t.kind,
	t.secondary, t.mag_bright, t.mag_faint, t.last_timing_jd, t.notes,
	e.epoch, e.period_days, e.q_days, e.timescale, e.epoch_err, e.period_err,
	(SELECT max(jd) FROM timings WHERE target_id = t.id)
FROM targets t
JOIN ephemerides e ON e.id = (SELECT id FROM ephemerides WHERE target_id = t.id ORDER BY adopted_utc DESC, id DESC LIMIT 1) `

// Targets returns every target in order of name, each with its current
// ephemeris (the one adopted last), its comparison and check stars, and
// LastTimingJD: the latest of its timings in the logbook (or of the
// catalogue's last timing, if later). Timings on the other time scale than
// the ephemeris are taken as they stand: HJD_UTC and BJD_TDB differ by about
// a minute, nothing for the age of a timing in days.
func (lb *Logbook) Targets() ([]observe.Target, error) {
	ts, _, err := loadTargets(lb.db, "ORDER BY t.name")
	return ts, lb.wrap(err)
}

// Target returns the target named name (any case) as Targets does.
func (lb *Logbook) Target(name string) (observe.Target, error) {
	ts, _, err := loadTargets(lb.db, "WHERE t.name = ?", name)
	if err != nil {
		return observe.Target{}, lb.wrap(err)
	}
	if len(ts) == 0 {
		return observe.Target{}, lb.wrap(fmt.Errorf("target %q: %w in the logbook", name, ErrNotFound))
	}
	return ts[0], nil
}

func loadTargets(q querier, tail string, args ...any) ([]observe.Target, []int64, error) {
	rows, err := q.Query(targetSelect+tail, args...)
	if err != nil {
		return nil, nil, err
	}
	var out []observe.Target
	var ids []int64
	byID := map[int64]int{}
	for rows.Next() {
		var (
			t                               observe.Target
			id                              int64
			class, kind, scale              string
			sec                             int64
			bright, faint, last, eErr, pErr sql.NullFloat64
			maxTiming                       sql.NullFloat64
		)
		if err := rows.Scan(&id, &t.Name, &t.Star.RAHours, &t.Star.DecDeg, &t.Star.PMRA, &t.Star.PMDec, &class, &kind,
			&sec, &bright, &faint, &last, &t.Notes, &t.Ephemeris.Epoch, &t.Ephemeris.PeriodDays, &t.Ephemeris.Q,
			&scale, &eErr, &pErr, &maxTiming); err != nil {
			rows.Close()
			return nil, nil, err
		}
		t.Secondary = sec != 0
		t.MagBright, t.MagFaint = orNaN(bright), orNaN(faint)
		t.Ephemeris.EpochErr, t.Ephemeris.PeriodErr = orZero(eErr), orZero(pErr)
		t.LastTimingJD = math.Max(orZero(last), orZero(maxTiming))
		var perr error
		if t.Class, perr = observe.ParseClass(class); perr == nil {
			if t.Kind, perr = observe.ParseKind(kind); perr == nil {
				t.Ephemeris.Scale, perr = ephem.ParseTimeScale(scale)
			}
		}
		if perr != nil {
			rows.Close()
			return nil, nil, fmt.Errorf("stored target %q: %w", t.Name, perr)
		}
		byID[id] = len(out)
		out = append(out, t)
		ids = append(ids, id)
	}
	rows.Close()
	if err := rows.Err(); err != nil {
		return nil, nil, err
	}
	if len(out) == 0 {
		return out, ids, nil
	}
	// The comparison stars: all of them for a long list, one target's for one.
	compQuery := "SELECT target_id, role, label, v_mag, bv FROM comps ORDER BY id" // each target's in order, no sort
	var compArgs []any
	if len(out) == 1 {
		compQuery = "SELECT target_id, role, label, v_mag, bv FROM comps WHERE target_id = ? ORDER BY id"
		compArgs = []any{ids[0]}
	}
	crows, err := q.Query(compQuery, compArgs...)
	if err != nil {
		return nil, nil, err
	}
	defer crows.Close()
	for crows.Next() {
		var (
			tid  int64
			role string
			c    observe.Comp
			bv   sql.NullFloat64
		)
		if err := crows.Scan(&tid, &role, &c.ID, &c.V, &bv); err != nil {
			return nil, nil, err
		}
		c.BV = orNaN(bv)
		i, ok := byID[tid]
		if !ok {
			continue
		}
		if role == "check" {
			out[i].Checks = append(out[i].Checks, c)
		} else {
			out[i].Comps = append(out[i].Comps, c)
		}
	}
	return out, ids, crows.Err()
}

// UpdateTarget replaces what the logbook holds of the target named name with
// t (which may rename it): position, class, kind, magnitudes, notes and
// comparison stars. The ephemeris is changed only through AdoptEphemeris,
// which keeps the history: UpdateTarget refuses a t whose ephemeris differs
// from the current one. t.LastTimingJD is not stored (it comes from the
// timings).
func (lb *Logbook) UpdateTarget(name string, t observe.Target) error {
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		ts, ids, err := loadTargets(tx, "WHERE t.name = ?", name)
		if err != nil {
			return err
		}
		if len(ts) == 0 {
			return fmt.Errorf("target %q: %w in the logbook", name, ErrNotFound)
		}
		if err := checkTarget(&t, math.NaN()); err != nil {
			return err
		}
		if t.Ephemeris != ts[0].Ephemeris {
			return fmt.Errorf("target %q: the ephemeris differs from the current one: adopt a new ephemeris with AdoptEphemeris, which keeps the old one in the history", name)
		}
		if other, err := targetID(tx, t.Name); err == nil && other != ids[0] {
			return fmt.Errorf("target %q is already in the logbook", t.Name)
		}
		if _, err := tx.Exec(`UPDATE targets SET name = ?, ra_h = ?, dec_deg = ?, pm_ra_mas_yr = ?, pm_dec_mas_yr = ?, class = ?,
			kind = ?, secondary = ?, mag_bright = ?, mag_faint = ?, notes = ? WHERE id = ?`,
			t.Name, t.Star.RAHours, t.Star.DecDeg, t.Star.PMRA, t.Star.PMDec, t.Class.String(), t.Kind.String(),
			boolInt(t.Secondary), nullable(t.MagBright), nullable(t.MagFaint), t.Notes, ids[0]); err != nil {
			return fmt.Errorf("target %q: %w", t.Name, err)
		}
		return putComps(tx, ids[0], t.Comps, t.Checks)
	}))
}

// DeleteTarget removes the target named name and everything about it: its
// ephemeris history, comparison stars, measurements, timings and places in
// night plans.
func (lb *Logbook) DeleteTarget(name string) error {
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		id, err := targetID(tx, name)
		if err != nil {
			return err
		}
		_, err = tx.Exec("DELETE FROM targets WHERE id = ?", id)
		return err
	}))
}

// MeanMagV returns the target's intensity-mean apparent V magnitude (the
// input of a period–luminosity distance), NaN when not known.
func (lb *Logbook) MeanMagV(target string) (float64, error) {
	var v sql.NullFloat64
	err := lb.db.QueryRow("SELECT mean_mag_v FROM targets WHERE name = ?", target).Scan(&v)
	if errors.Is(err, sql.ErrNoRows) {
		return math.NaN(), lb.wrap(fmt.Errorf("target %q: %w in the logbook", target, ErrNotFound))
	}
	return orNaN(v), lb.wrap(err)
}

// SetMeanMagV stores the target's intensity-mean apparent V magnitude; NaN
// clears it.
func (lb *Logbook) SetMeanMagV(target string, v float64) error {
	if !optional(v, -maxAbsMag, maxAbsMag) {
		return fmt.Errorf("logbook: target %q: mean V magnitude %v: want within ±%d, or NaN for none", target, v, maxAbsMag)
	}
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		id, err := targetID(tx, target)
		if err != nil {
			return err
		}
		_, err = tx.Exec("UPDATE targets SET mean_mag_v = ? WHERE id = ?", nullable(v), id)
		return err
	}))
}
