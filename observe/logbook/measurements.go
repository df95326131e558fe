package logbook

import (
	"database/sql"
	"errors"
	"fmt"
	"strings"
	"time"

	"example.org/vigil/observe"
)

// resolver looks up sites, targets and nights by name inside one
// transaction, remembering what it found (an import of many rows asks the
// same few questions over and over).
type resolver struct {
	q       querier
	sites   map[string]int64
	targets map[string]*targetInfo
	nights  map[string]int64 // site ID and date → night ID
	nightOK map[int64]bool
}

type targetInfo struct {
	id     int64
	kind   observe.Kind
	labels map[string]bool // lower-case IDs of its comparison and check stars
}

func newResolver(q querier) *resolver {
	return &resolver{q: q, sites: map[string]int64{}, targets: map[string]*targetInfo{},
		nights: map[string]int64{}, nightOK: map[int64]bool{}}
}

func (r *resolver) site(name string) (int64, error) {
	if id, ok := r.sites[name]; ok {
		return id, nil
	}
	id, err := siteID(r.q, name)
	if err != nil {
		return 0, err
	}
	r.sites[name] = id
	return id, nil
}

func (r *resolver) target(name string) (*targetInfo, error) {
	if ti, ok := r.targets[name]; ok {
		return ti, nil
	}
	id, err := targetID(r.q, name)
	if err != nil {
		return nil, err
	}
	ti := &targetInfo{id: id, labels: map[string]bool{}}
	var kind string
	if err := r.q.QueryRow("SELECT kind FROM targets WHERE id = ?", id).Scan(&kind); err != nil {
		return nil, err
	}
	if ti.kind, err = observe.ParseKind(kind); err != nil {
		return nil, err
	}
	rows, err := r.q.Query("SELECT label FROM comps WHERE target_id = ?", id)
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	for rows.Next() {
		var l string
		if err := rows.Scan(&l); err != nil {
			return nil, err
		}
		ti.labels[strings.ToLower(l)] = true
	}
	if err := rows.Err(); err != nil {
		return nil, err
	}
	r.targets[name] = ti
	return ti, nil
}

// night returns the ID of the night of date at the named site.
func (r *resolver) night(site string, date time.Time) (int64, error) {
	sid, err := r.site(site)
	if err != nil {
		return 0, err
	}
	key := fmt.Sprint(sid, " ", dateKey(date))
	if id, ok := r.nights[key]; ok {
		return id, nil
	}
	id, err := nightID(r.q, sid, site, date)
	if err != nil {
		return 0, err
	}
	r.nights[key] = id
	return id, nil
}

func (r *resolver) checkNight(id int64) error {
	if r.nightOK[id] {
		return nil
	}
	if err := checkNightID(r.q, id); err != nil {
		return err
	}
	r.nightOK[id] = true
	return nil
}

// measurementWriter inserts measurements many rows to a statement: it
// numbers them itself (inside the write transaction no one else inserts),
// checks each as it comes, and writes them in batches. flush must be called
// before the transaction commits, close when done.
type measurementWriter struct {
	res        *resolver
	nextID     int64
	rows, raws *batchInserter
}

const (
	measurementFields = 16
	rawFields         = 6
	// batchRows is how many rows one INSERT statement carries.
	batchRows = 64
)

func newMeasurementWriter(tx *sql.Tx, res *resolver) (*measurementWriter, error) {
	var last sql.NullInt64
	if err := tx.QueryRow("SELECT max(id) FROM measurements").Scan(&last); err != nil {
		return nil, err
	}
	rows := &batchInserter{tx: tx, width: measurementFields, head: `INSERT INTO measurements(id, night_id, target_id, import_id,
		jd_utc, exposure_s, filter, airmass, inst_mag, inst_err, visual, mag, mag_err, hjd, bjd_tdb, notes) VALUES `}
	// The comparison stars refer to their measurement: it goes in first.
	raws := &batchInserter{tx: tx, width: rawFields, before: rows.flush, head: `INSERT INTO raw_comps(measurement_id, position,
		role, label, inst_mag, inst_err) VALUES `}
	return &measurementWriter{res: res, nextID: last.Int64 + 1, rows: rows, raws: raws}, nil
}

// check validates m against itself and the logbook and returns its target.
func (w *measurementWriter) check(m *Measurement) (*targetInfo, error) {
	if err := m.Validate(); err != nil {
		return nil, err
	}
	ti, err := w.res.target(m.Target)
	if err != nil {
		return nil, &fieldError{field: "target", err: err}
	}
	if err := w.res.checkNight(m.NightID); err != nil {
		return nil, &fieldError{field: "date", err: err}
	}
	for _, set := range []struct {
		col string
		ms  []RawMag
	}{{"comp_inst", m.Comps}, {"check_inst", m.Checks}} {
		for _, c := range set.ms {
			if !ti.labels[strings.ToLower(c.Label)] {
				return nil, fieldErr(set.col, "comparison star %q is not among the comparison and check stars of target %q", c.Label, m.Target)
			}
		}
	}
	return ti, nil
}

// add checks m, queues it under the next free ID and returns that ID.
func (w *measurementWriter) add(m *Measurement, importID int64) (int64, error) {
	ti, err := w.check(m)
	if err != nil {
		return 0, err
	}
	id := w.nextID
	w.nextID++
	if err := w.rows.add(id, m.NightID, ti.id, nullID(importID), m.JDUTC, nullable(m.ExposureS), m.Filter,
		nullable(m.Airmass), nullable(m.InstMag), nullable(m.InstErr), m.Visual, nullable(m.Mag), nullable(m.MagErr),
		nullable(m.HJD), nullable(m.BJDTDB), m.Notes); err != nil {
		return 0, err
	}
	return id, w.queueRaw(id, m)
}

func (w *measurementWriter) queueRaw(id int64, m *Measurement) error {
	pos := 0
	for _, set := range []struct {
		role string
		ms   []RawMag
	}{{"comp", m.Comps}, {"check", m.Checks}} {
		for _, c := range set.ms {
			pos++
			if err := w.raws.add(id, pos, set.role, c.Label, c.InstMag, nullable(c.InstErr)); err != nil {
				return err
			}
		}
	}
	return nil
}

// flush writes what is queued: the measurements first, then their
// comparison stars.
func (w *measurementWriter) flush() error {
	if err := w.rows.flush(); err != nil {
		return err
	}
	return w.raws.flush()
}

func (w *measurementWriter) close() {
	w.rows.close()
	w.raws.close()
}

// AddMeasurements stores the measurements, all of them or none, and returns
// their IDs. Each names a target in the logbook and the ID of a night; its
// comparison and check stars must be among the target's.
func (lb *Logbook) AddMeasurements(ms []Measurement) ([]int64, error) {
	ids := make([]int64, 0, len(ms))
	err := lb.tx(func(tx *sql.Tx) error {
		w, err := newMeasurementWriter(tx, newResolver(tx))
		if err != nil {
			return err
		}
		defer w.close()
		for i := range ms {
			id, err := w.add(&ms[i], 0)
			if err != nil {
				return fmt.Errorf("measurement %d: %w", i+1, err)
			}
			ids = append(ids, id)
		}
		return w.flush()
	})
	if err != nil {
		return nil, lb.wrap(err)
	}
	return ids, nil
}

// UpdateMeasurement replaces the measurement with m.ID by m.
func (lb *Logbook) UpdateMeasurement(m Measurement) error {
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		if err := checkMeasurementID(tx, m.ID); err != nil {
			return err
		}
		w, err := newMeasurementWriter(tx, newResolver(tx))
		if err != nil {
			return err
		}
		defer w.close()
		ti, err := w.check(&m)
		if err != nil {
			return err
		}
		if _, err := tx.Exec(`UPDATE measurements SET night_id = ?, target_id = ?, jd_utc = ?, exposure_s = ?, filter = ?,
			airmass = ?, inst_mag = ?, inst_err = ?, visual = ?, mag = ?, mag_err = ?, hjd = ?, bjd_tdb = ?, notes = ? WHERE id = ?`,
			m.NightID, ti.id, m.JDUTC, nullable(m.ExposureS), m.Filter, nullable(m.Airmass), nullable(m.InstMag),
			nullable(m.InstErr), m.Visual, nullable(m.Mag), nullable(m.MagErr), nullable(m.HJD), nullable(m.BJDTDB),
			m.Notes, m.ID); err != nil {
			return err
		}
		if _, err := tx.Exec("DELETE FROM raw_comps WHERE measurement_id = ?", m.ID); err != nil {
			return err
		}
		if err := w.queueRaw(m.ID, &m); err != nil {
			return err
		}
		return w.flush()
	}))
}

func checkMeasurementID(q querier, id int64) error {
	var one int
	err := q.QueryRow("SELECT 1 FROM measurements WHERE id = ?", id).Scan(&one)
	if errors.Is(err, sql.ErrNoRows) {
		return fmt.Errorf("measurement %d: %w in the logbook", id, ErrNotFound)
	}
	return err
}

// DeleteMeasurement removes the measurement with this ID.
func (lb *Logbook) DeleteMeasurement(id int64) error {
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		if err := checkMeasurementID(tx, id); err != nil {
			return err
		}
		_, err := tx.Exec("DELETE FROM measurements WHERE id = ?", id)
		return err
	}))
}

// Measurement returns the measurement with this ID.
func (lb *Logbook) Measurement(id int64) (Measurement, error) {
	ms, err := loadMeasurements(lb.db, "WHERE m.id = ?", id)
	if err != nil {
		return Measurement{}, lb.wrap(err)
	}
	if len(ms) == 0 {
		return Measurement{}, lb.wrap(fmt.Errorf("measurement %d: %w in the logbook", id, ErrNotFound))
	}
	return ms[0], nil
}

// MeasurementsOf returns the target's measurements in time order: of the
// night with ID nightID, or of every night when nightID is 0.
func (lb *Logbook) MeasurementsOf(target string, nightID int64) ([]Measurement, error) {
	id, err := targetID(lb.db, target)
	if err != nil {
		return nil, lb.wrap(err)
	}
	var ms []Measurement
	if nightID == 0 {
		ms, err = loadMeasurements(lb.db, "WHERE m.target_id = ? ORDER BY m.jd_utc, m.id", id)
	} else {
		if err := checkNightID(lb.db, nightID); err != nil {
			return nil, lb.wrap(err)
		}
		ms, err = loadMeasurements(lb.db, "WHERE m.target_id = ? AND m.night_id = ? ORDER BY m.jd_utc, m.id", id, nightID)
	}
	return ms, lb.wrap(err)
}

const measurementColumns = `m.id, t.name, m.night_id, m.jd_utc, m.exposure_s, m.filter, m.airmass, m.inst_mag, m.inst_err,
	m.visual, m.mag, m.mag_err, m.hjd, m.bjd_tdb, m.notes, m.import_id`

// loadMeasurements reads the measurements that tail selects (a WHERE clause
// on m, the measurements, and an ORDER BY) with their comparison stars.
func loadMeasurements(q querier, tail string, args ...any) ([]Measurement, error) {
	rows, err := q.Query("SELECT "+measurementColumns+" FROM measurements m JOIN targets t ON t.id = m.target_id "+tail, args...)
	if err != nil {
		return nil, err
	}
	var out []Measurement
	index := map[int64]int{}
	for rows.Next() {
		var (
			m                                                  Measurement
			exp, airmass, inst, instErr, mag, magErr, hjd, bjd sql.NullFloat64
			imp                                                sql.NullInt64
		)
		if err := rows.Scan(&m.ID, &m.Target, &m.NightID, &m.JDUTC, &exp, &m.Filter, &airmass, &inst, &instErr,
			&m.Visual, &mag, &magErr, &hjd, &bjd, &m.Notes, &imp); err != nil {
			rows.Close()
			return nil, err
		}
		m.ExposureS, m.Airmass, m.InstMag, m.InstErr = orNaN(exp), orNaN(airmass), orNaN(inst), orNaN(instErr)
		m.Mag, m.MagErr, m.HJD, m.BJDTDB = orNaN(mag), orNaN(magErr), orNaN(hjd), orNaN(bjd)
		m.ImportID = imp.Int64
		index[m.ID] = len(out)
		out = append(out, m)
	}
	rows.Close()
	if err := rows.Err(); err != nil || len(out) == 0 {
		return out, err
	}
	// The comparison stars of the same measurements: the WHERE clause again.
	where := tail
	if i := strings.Index(where, "ORDER BY"); i >= 0 {
		where = where[:i]
	}
	crows, err := q.Query(`SELECT rc.measurement_id, rc.role, rc.label, rc.inst_mag, rc.inst_err
		FROM raw_comps rc JOIN measurements m ON m.id = rc.measurement_id `+where+` ORDER BY rc.measurement_id, rc.position`, args...)
	if err != nil {
		return nil, err
	}
	defer crows.Close()
	for crows.Next() {
		var (
			id   int64
			role string
			c    RawMag
			e    sql.NullFloat64
		)
		if err := crows.Scan(&id, &role, &c.Label, &c.InstMag, &e); err != nil {
			return nil, err
		}
		c.InstErr = orNaN(e)
		i, ok := index[id]
		if !ok {
			continue
		}
		if role == "check" {
			out[i].Checks = append(out[i].Checks, c)
		} else {
			out[i].Comps = append(out[i].Comps, c)
		}
	}
	return out, crows.Err()
}
