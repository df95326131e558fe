package report

import (
	"math"
	"testing"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

// The example catalogue of invented stars shared with observe's tests.
const targetsCSV = "../../observe/testdata/targets_example.csv"

// fixture names a night to print: a site, a date, the planner's settings and
// what was measured.
type fixture struct {
	site        string
	latDeg      float64
	lonDeg      float64 // east positive
	elevM       float64
	tz          string
	date        time.Time
	keepAll     bool // every extremum of the night, usable or not
	noTargets   bool
	measured    bool // add invented measurements and timings
	paper       Paper
	constraints func(*observe.Constraints)
}

// hilltop is the night of 2024-12-21 at φ = +50°, λ = +10° E, the site of
// the methods sheet's astropy check of the Sun's events.
var hilltop = fixture{site: "Hilltop Yard", latDeg: 50, lonDeg: 10, elevM: 300, tz: "Europe/Berlin",
	date: date(2024, 12, 21), keepAll: true, measured: true}

// fjord is a midnight-sun night at φ = +69.65°: the Sun does not set.
var fjord = fixture{site: "Fjord Shed", latDeg: 69.65, lonDeg: 18.96, elevM: 20, tz: "Europe/Oslo",
	date: date(2025, 6, 21)}

// moor is a June night at φ = +55.5°, where the Sun sets but stays above
// −12° (so no nautical nor astronomical darkness), with no targets at all.
var moor = fixture{site: "Moor Cabin", latDeg: 55.5, lonDeg: -3.2, elevM: 150, tz: "Europe/London",
	date: date(2025, 6, 21), noTargets: true}

func date(y int, m time.Month, d int) time.Time { return time.Date(y, m, d, 0, 0, 0, 0, time.UTC) }

// build plans the fixture's night with the real planner and the example
// catalogue.
func (fx fixture) build(t testing.TB) *NightLog {
	t.Helper()
	site, err := observe.NewSite(fx.site, fx.latDeg, fx.lonDeg, fx.elevM, fx.tz, 20, nil)
	if err != nil {
		t.Fatalf("site: %v", err)
	}
	var targets []observe.Target
	if !fx.noTargets {
		if targets, err = observe.ReadTargetsCSVFile(targetsCSV); err != nil {
			t.Fatalf("targets: %v", err)
		}
	}
	c := observe.DefaultConstraints()
	c.KeepAll = fx.keepAll
	if fx.constraints != nil {
		fx.constraints(&c)
	}
	p, err := observe.NewPlanner(site, c)
	if err != nil {
		t.Fatalf("planner: %v", err)
	}
	l, err := ForNight(p, targets, fx.date)
	if err != nil {
		t.Fatalf("ForNight: %v", err)
	}
	l.Paper = fx.paper
	if fx.measured {
		l.Observer = "R. Example"
		l.Measurements, l.Timings = measured(t)
	}
	return &l
}

// measured returns invented measurements and timings of the night of
// 2024-12-21 (demo data, not observations).
func measured(t testing.TB) ([]Measurement, []Timing) {
	at := func(s string) ephem.Time {
		tm, err := ephem.ParseInstant(s)
		if err != nil {
			t.Fatalf("instant %q: %v", s, err)
		}
		return tm
	}
	ms := []Measurement{
		{Time: at("2024-12-22T01:55:12Z"), Target: "Alder Var", Band: "V", Mag: 10.214, MagErr: 0.012, Comp: "C1+C2", Check: "K1"},
		{Time: at("2024-12-22T02:07:40Z"), Target: "Alder Var", Band: "V", Mag: 10.131, MagErr: 0.011, Comp: "C1+C2", Check: "K1"},
		{Time: at("2024-12-22T02:20:05Z"), Target: "Alder Var", Band: "V", Mag: 10.187, MagErr: math.NaN(), Comp: "C1+C2"},
		{Time: at("2024-12-22T05:13:30Z"), Target: "Fir Fast", Mag: 12.05, MagErr: 0.03, Comp: "ensemble of 3"},
	}
	ts := []Timing{
		{Target: "Alder Var", Kind: observe.Max, JD: 2460666.59541, Scale: ephem.BJDTDB, SigmaDays: 0.00062,
			Method: "kvw", OCDays: 0.00034},
		{Target: "Fir Fast", Kind: observe.Max, JD: 2460666.7196, Scale: ephem.HJD, SigmaDays: math.NaN(),
			Method: "poly", OCDays: math.NaN()},
	}
	return ms, ts
}
