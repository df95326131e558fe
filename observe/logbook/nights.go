package logbook

import (
	"database/sql"
	"errors"
	"fmt"
	"strings"
	"time"
)

// AddNight stores a new observing night and returns its ID. There is one
// night per site and date.
func (lb *Logbook) AddNight(n Night) (int64, error) {
	var id int64
	err := lb.tx(func(tx *sql.Tx) (err error) {
		id, err = addNight(tx, n, false)
		return err
	})
	return id, lb.wrap(err)
}

func addNight(q querier, n Night, demo bool) (int64, error) {
	if err := n.Validate(); err != nil {
		return 0, err
	}
	sid, err := siteID(q, n.Site)
	if err != nil {
		return 0, fmt.Errorf("night %s: %w", dateKey(n.Date), err)
	}
	if _, err := nightID(q, sid, n.Site, n.Date); err == nil {
		return 0, fmt.Errorf("the night of %s at %q is already in the logbook", dateKey(n.Date), n.Site)
	} else if !errors.Is(err, ErrNotFound) {
		return 0, err
	}
	res, err := q.Exec(`INSERT INTO nights(site_id, date, observer, equipment, conditions, notes, demo) VALUES (?, ?, ?, ?, ?, ?, ?)`,
		sid, dateKey(n.Date), n.Observer, n.Equipment, n.Conditions, n.Notes, boolInt(demo))
	if err != nil {
		return 0, fmt.Errorf("night %s at %q: %w", dateKey(n.Date), n.Site, err)
	}
	return res.LastInsertId()
}

// nightID returns the ID of the night of date at the site siteID, or an
// error wrapping ErrNotFound.
func nightID(q querier, siteID int64, siteName string, date time.Time) (int64, error) {
	var id int64
	err := q.QueryRow("SELECT id FROM nights WHERE site_id = ? AND date = ?", siteID, dateKey(date)).Scan(&id)
	if errors.Is(err, sql.ErrNoRows) {
		return 0, fmt.Errorf("the night of %s at %q: %w in the logbook", dateKey(date), siteName, ErrNotFound)
	}
	return id, err
}

// checkNightID checks that a night with this ID is in the logbook.
func checkNightID(q querier, id int64) error {
	var one int
	err := q.QueryRow("SELECT 1 FROM nights WHERE id = ?", id).Scan(&one)
	if errors.Is(err, sql.ErrNoRows) {
		return fmt.Errorf("night %d: %w in the logbook", id, ErrNotFound)
	}
	return err
}

const nightSelect = `SELECT n.id, s.name, n.date, n.observer, n.equipment, n.conditions, n.notes
FROM nights n JOIN sites s ON s.id = n.site_id `

func loadNights(q querier, tail string, args ...any) ([]Night, error) {
	rows, err := q.Query(nightSelect+tail, args...)
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	var out []Night
	for rows.Next() {
		var n Night
		var date string
		if err := rows.Scan(&n.ID, &n.Site, &date, &n.Observer, &n.Equipment, &n.Conditions, &n.Notes); err != nil {
			return nil, err
		}
		d, err := time.Parse("2006-01-02", date)
		if err != nil {
			return nil, fmt.Errorf("stored night %d: date %q: %w", n.ID, date, err)
		}
		n.Date = d
		out = append(out, n)
	}
	return out, rows.Err()
}

// Night returns the night of date (its year, month and day) at the site
// named site.
func (lb *Logbook) Night(site string, date time.Time) (Night, error) {
	ns, err := loadNights(lb.db, "WHERE s.name = ? AND n.date = ?", site, dateKey(date))
	if err != nil {
		return Night{}, lb.wrap(err)
	}
	if len(ns) == 0 {
		if _, err := siteID(lb.db, site); err != nil {
			return Night{}, lb.wrap(err)
		}
		return Night{}, lb.wrap(fmt.Errorf("the night of %s at %q: %w in the logbook", dateKey(date), site, ErrNotFound))
	}
	return ns[0], nil
}

// NightByID returns the night with this ID.
func (lb *Logbook) NightByID(id int64) (Night, error) {
	ns, err := loadNights(lb.db, "WHERE n.id = ?", id)
	if err != nil {
		return Night{}, lb.wrap(err)
	}
	if len(ns) == 0 {
		return Night{}, lb.wrap(fmt.Errorf("night %d: %w in the logbook", id, ErrNotFound))
	}
	return ns[0], nil
}

// Nights returns the nights at the site named site (every site when site is
// ""), in order of date.
func (lb *Logbook) Nights(site string) ([]Night, error) {
	if site == "" {
		ns, err := loadNights(lb.db, "ORDER BY n.date, s.name")
		return ns, lb.wrap(err)
	}
	if _, err := siteID(lb.db, site); err != nil {
		return nil, lb.wrap(err)
	}
	ns, err := loadNights(lb.db, "WHERE s.name = ? ORDER BY n.date", site)
	return ns, lb.wrap(err)
}

// UpdateNight replaces the night with n.ID by n (which may move it to
// another site or date).
func (lb *Logbook) UpdateNight(n Night) error {
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		if err := checkNightID(tx, n.ID); err != nil {
			return err
		}
		if err := n.Validate(); err != nil {
			return err
		}
		sid, err := siteID(tx, n.Site)
		if err != nil {
			return err
		}
		if other, err := nightID(tx, sid, n.Site, n.Date); err == nil && other != n.ID {
			return fmt.Errorf("the night of %s at %q is already in the logbook", dateKey(n.Date), n.Site)
		}
		_, err = tx.Exec(`UPDATE nights SET site_id = ?, date = ?, observer = ?, equipment = ?, conditions = ?, notes = ? WHERE id = ?`,
			sid, dateKey(n.Date), n.Observer, n.Equipment, n.Conditions, n.Notes, n.ID)
		return err
	}))
}

// DeleteNight removes the night with this ID, its plan and its
// measurements. Timings taken that night are kept, no longer tied to a
// night.
func (lb *Logbook) DeleteNight(id int64) error {
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		if err := checkNightID(tx, id); err != nil {
			return err
		}
		_, err := tx.Exec("DELETE FROM nights WHERE id = ?", id)
		return err
	}))
}

// SetPlan replaces the night's plan with items, in their order.
func (lb *Logbook) SetPlan(nightID int64, items []PlanItem) error {
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		if err := checkNightID(tx, nightID); err != nil {
			return err
		}
		if _, err := tx.Exec("DELETE FROM plans WHERE night_id = ?", nightID); err != nil {
			return err
		}
		for i, it := range items {
			if err := addPlanItem(tx, nightID, i+1, it); err != nil {
				return err
			}
		}
		return nil
	}))
}

func addPlanItem(q querier, nightID int64, position int, it PlanItem) error {
	if err := checkText("plan note", it.Note); err != nil {
		return err
	}
	tid, err := targetID(q, it.Target)
	if err != nil {
		return err
	}
	var dup int
	if err := q.QueryRow("SELECT count(*) FROM plans WHERE night_id = ? AND target_id = ?", nightID, tid).Scan(&dup); err != nil {
		return err
	}
	if dup > 0 {
		return fmt.Errorf("target %q is already in the night's plan", it.Target)
	}
	_, err = q.Exec("INSERT INTO plans(night_id, position, target_id, note) VALUES (?, ?, ?, ?)", nightID, position, tid, it.Note)
	return err
}

// Plan returns the targets planned for the night, in order.
func (lb *Logbook) Plan(nightID int64) ([]PlanItem, error) {
	if err := checkNightID(lb.db, nightID); err != nil {
		return nil, lb.wrap(err)
	}
	p, err := loadPlan(lb.db, nightID)
	return p, lb.wrap(err)
}

func loadPlan(q querier, nightID int64) ([]PlanItem, error) {
	rows, err := q.Query(`SELECT t.name, p.note FROM plans p JOIN targets t ON t.id = p.target_id
		WHERE p.night_id = ? ORDER BY p.position`, nightID)
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	var out []PlanItem
	for rows.Next() {
		var it PlanItem
		if err := rows.Scan(&it.Target, &it.Note); err != nil {
			return nil, err
		}
		out = append(out, it)
	}
	return out, rows.Err()
}

// NightLog returns everything the logbook holds about the night of date at
// the site named site: the night, the site, the plan, and the measurements
// and timings taken, in time order.
func (lb *Logbook) NightLog(site string, date time.Time) (NightLog, error) {
	n, err := lb.Night(site, date)
	if err != nil {
		return NightLog{}, err
	}
	s, err := lb.Site(n.Site)
	if err != nil {
		return NightLog{}, err
	}
	log := NightLog{Night: n, Site: s}
	if log.Plan, err = loadPlan(lb.db, n.ID); err != nil {
		return NightLog{}, lb.wrap(err)
	}
	if log.Measurements, err = loadMeasurements(lb.db, "WHERE m.night_id = ? ORDER BY m.jd_utc, m.id", n.ID); err != nil {
		return NightLog{}, lb.wrap(err)
	}
	if log.Timings, err = loadTimings(lb.db, "WHERE tm.night_id = ? ORDER BY tm.jd, tm.id", n.ID); err != nil {
		return NightLog{}, lb.wrap(err)
	}
	return log, nil
}

// parseNightDate reads a night's date "YYYY-MM-DD".
func parseNightDate(s string) (time.Time, error) {
	d, err := time.Parse("2006-01-02", strings.TrimSpace(s))
	if err != nil {
		return time.Time{}, fmt.Errorf("date %q: want YYYY-MM-DD, the civil date the night begins on", s)
	}
	if d.Year() < minNightYear || d.Year() > maxNightYear {
		return time.Time{}, fmt.Errorf("date %q: want a year from %d to %d", s, minNightYear, maxNightYear)
	}
	return d, nil
}
