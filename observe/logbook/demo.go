package logbook

import (
	"database/sql"
	"errors"
	"fmt"
	"io/fs"
	"math"
	"os"
	"time"

	"vigil/observe"
)

// demoSeed seeds the demo's noise: the same seed gives the same logbook.
const demoSeed = 20190105

// The span of the demo's own observations.
var (
	demoFirstNight = time.Date(2019, 1, 1, 0, 0, 0, 0, time.UTC)
	demoLastNight  = time.Date(2026, 11, 30, 0, 0, 0, 0, time.UTC)
)

// Demo photometry: a nightly zero point near demoZeroPoint, the V-band
// extinction coefficient (common practice: 0.15–0.25 mag per air mass,
// methods sheet §15) and the frame-to-frame transparency jitter that every
// star of a frame shares (and differential photometry removes).
const (
	demoZeroPoint   = -21.3
	demoExtinction  = 0.22
	demoTransparent = 0.01
	demoSunAltDeg   = -12 // runs start after nautical dusk
)

// CreateDemo makes a new logbook at path holding the demo scenario (see
// the package documentation) and opens it. It refuses to overwrite a file.
// The scenario is generated from a fixed seed: every call gives the same
// records.
func CreateDemo(path string) (*Logbook, error) {
	if err := refuseExisting(path); err != nil {
		return nil, err
	}
	d, err := generateDemo(demoSeed)
	if err != nil {
		return nil, fmt.Errorf("logbook: generating the demo: %w", err)
	}
	err = build(path, SchemaVersion, func(lb *Logbook) error {
		return lb.tx(func(tx *sql.Tx) error { return writeDemo(tx, d) })
	})
	if err != nil {
		return nil, err
	}
	return Open(path)
}

// OpenOrCreateDemo opens the logbook at path, or creates it with the demo
// scenario when there is no file there (the first run). created says which.
func OpenOrCreateDemo(path string) (lb *Logbook, created bool, err error) {
	if _, err := os.Stat(path); errors.Is(err, fs.ErrNotExist) {
		lb, err := CreateDemo(path)
		return lb, err == nil, err
	}
	lb, err = Open(path)
	return lb, false, err
}

// demoData is the generated scenario, before it is written.
type demoData struct {
	sites     []observe.Site
	stars     []demoStar
	nights    []*demoNight
	published []Timing
}

// demoNight is one night of the demo with what was done in it.
type demoNight struct {
	night   Night
	plan    []PlanItem
	meas    []Measurement
	timings []Timing
}

// writeDemo stores the scenario in the transaction, every record marked
// demo, and sets the logbook's demo flag.
func writeDemo(sqlTx *sql.Tx, d *demoData) error {
	tx := newStmtCache(sqlTx)
	defer tx.close()
	for _, s := range d.sites {
		if _, err := addSite(tx, s, true); err != nil {
			return err
		}
	}
	for i := range d.stars {
		s := &d.stars[i]
		mean := math.NaN()
		if s.meanMagV {
			mean = roundTo(s.shape.intensityMean(4000), 3)
		}
		id, err := addTarget(tx, s.target(), mean, s.history[0].Source, s.history[0].Adopted, true)
		if err != nil {
			return err
		}
		for _, h := range s.history[1:] {
			if err := insertEphemeris(tx, id, h.Ephemeris, h.Adopted, h.Source); err != nil {
				return err
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
	for _, n := range d.nights {
		id, err := addNight(tx, n.night, true)
		if err != nil {
			return err
		}
		for i, p := range n.plan {
			if err := addPlanItem(tx, id, i+1, p); err != nil {
				return err
			}
		}
		for i := range n.meas {
			n.meas[i].NightID = id
			if _, err := mw.add(&n.meas[i], 0); err != nil {
				return fmt.Errorf("demo measurement of %s: %w", n.meas[i].Target, err)
			}
		}
		for i := range n.timings {
			n.timings[i].NightID = id
			if _, err := tw.add(&n.timings[i], 0); err != nil {
				return err
			}
		}
	}
	if err := mw.flush(); err != nil {
		return err
	}
	for i := range d.published {
		if _, err := tw.add(&d.published[i], 0); err != nil {
			return err
		}
	}
	_, err = tx.Exec("UPDATE meta SET value = '1' WHERE key = 'demo'")
	return err
}
