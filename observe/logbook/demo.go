package logbook

import (
	"database/sql"
	"fmt"
	"time"

	"example.org/vigil/observe"
)

// DemoRecords is a whole scenario to store as a demo logbook (CreateDemo):
// sites, targets with their ephemeris histories, nights with their plans,
// measurements and own timings, and timings tied to no night (published
// ones). The logbook only stores it; the scenario itself is generated
// elsewhere (package vigil/internal/demo).
type DemoRecords struct {
	Sites   []observe.Site
	Targets []DemoTarget
	Nights  []DemoNight
	Timings []Timing // tied to no night; NightID must be 0
}

// DemoTarget is a target of a demo scenario: the target as the catalogue
// holds it, whose Ephemeris is the first one adopted (at Adopted, from
// Source), the ephemerides adopted after it in order (the last is current),
// and its intensity-mean V (NaN when it has none).
type DemoTarget struct {
	Target   observe.Target
	MeanMagV float64
	Adopted  time.Time
	Source   string
	Later    []AdoptedEphemeris
}

// DemoNight is a night of a demo scenario with what was done in it. The
// NightID of its measurements and timings is set when they are stored.
type DemoNight struct {
	Night        Night
	Plan         []PlanItem
	Measurements []Measurement
	Timings      []Timing
}

// CreateDemo makes a new logbook at path holding the records, every site,
// target and night flagged demo (ClearDemo removes them, and so does an
// import), sets the logbook's demo flag (IsDemo) and opens it. Every record
// is checked as the rest of the API checks it; on any error nothing is
// left at path. It refuses to overwrite a file (ErrExists).
func CreateDemo(path string, d *DemoRecords) (*Logbook, error) {
	if d == nil {
		d = &DemoRecords{}
	}
	err := build(path, SchemaVersion, func(lb *Logbook) error {
		return lb.tx(func(tx *sql.Tx) error { return writeDemo(tx, d) })
	})
	if err != nil {
		return nil, err
	}
	return Open(path)
}

// writeDemo stores the records in the transaction, every site, target and
// night marked demo, and sets the logbook's demo flag.
func writeDemo(sqlTx *sql.Tx, d *DemoRecords) error {
	tx := newStmtCache(sqlTx)
	defer tx.close()
	for _, s := range d.Sites {
		if _, err := addSite(tx, s, true); err != nil {
			return fmt.Errorf("demo site %q: %w", s.Name, err)
		}
	}
	for _, t := range d.Targets {
		id, err := addTarget(tx, t.Target, t.MeanMagV, t.Source, t.Adopted, true)
		if err != nil {
			return fmt.Errorf("demo target %q: %w", t.Target.Name, err)
		}
		for _, h := range t.Later {
			if err := insertEphemeris(tx, id, h.Ephemeris, h.Adopted, h.Source); err != nil {
				return fmt.Errorf("demo target %q: ephemeris adopted %s: %w", t.Target.Name, stamp(h.Adopted), err)
			}
		}
	}
	res := newResolver(tx)
	mw, err := newMeasurementWriter(sqlTx, res)
	if err != nil {
		return err
	}
	defer mw.close()
	tw, err := newTimingWriter(sqlTx, res)
	if err != nil {
		return err
	}
	defer tw.ins.Close()
	for _, n := range d.Nights {
		id, err := addNight(tx, n.Night, true)
		if err != nil {
			return fmt.Errorf("demo night %s at %q: %w", dateKey(n.Night.Date), n.Night.Site, err)
		}
		for i, p := range n.Plan {
			if err := addPlanItem(tx, id, i+1, p); err != nil {
				return fmt.Errorf("demo night %s at %q: plan: %w", dateKey(n.Night.Date), n.Night.Site, err)
			}
		}
		for _, m := range n.Measurements {
			m.NightID = id
			if _, err := mw.add(&m, 0); err != nil {
				return fmt.Errorf("demo measurement of %q at JD %v: %w", m.Target, m.JDUTC, err)
			}
		}
		for _, t := range n.Timings {
			t.NightID = id
			if _, err := tw.add(&t, 0); err != nil {
				return fmt.Errorf("demo timing of %q at JD %v: %w", t.Target, t.JD, err)
			}
		}
	}
	if err := mw.flush(); err != nil {
		return err
	}
	for _, t := range d.Timings {
		if t.NightID != 0 {
			return fmt.Errorf("demo timing of %q at JD %v: night %d: want 0 (a timing tied to a night goes with DemoNight.Timings)", t.Target, t.JD, t.NightID)
		}
		if _, err := tw.add(&t, 0); err != nil {
			return fmt.Errorf("demo timing of %q at JD %v: %w", t.Target, t.JD, err)
		}
	}
	_, err = tx.Exec("UPDATE meta SET value = '1' WHERE key = 'demo'")
	return err
}
