package logbook

import (
	"database/sql"
	"io"
	"math"
	"os"
	"path/filepath"
	"sync"
	"testing"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

var (
	demoOnce sync.Once
	demoPath string
	demoErr  error
	demoDir  string
)

func TestMain(m *testing.M) {
	code := m.Run()
	if demoDir != "" {
		os.RemoveAll(demoDir)
	}
	os.Exit(code)
}

// sharedDemo returns the path of a demo logbook holding fxDemo, made once
// for the tests that only read it.
func sharedDemo(t testing.TB) string {
	t.Helper()
	demoOnce.Do(func() {
		demoDir, demoErr = os.MkdirTemp("", "vigil-logbook-test-")
		if demoErr != nil {
			return
		}
		demoPath = filepath.Join(demoDir, "demo.db")
		var lb *Logbook
		lb, demoErr = CreateDemo(demoPath, fxDemo(t))
		if demoErr == nil {
			demoErr = lb.Close()
		}
	})
	if demoErr != nil {
		t.Fatalf("making the demo logbook: %v", demoErr)
	}
	return demoPath
}

// demoCopy opens a private copy of the demo logbook, closed at the end of
// the test.
func demoCopy(t testing.TB) *Logbook {
	t.Helper()
	src := sharedDemo(t)
	dst := filepath.Join(t.TempDir(), "demo.db")
	in, err := os.Open(src)
	if err != nil {
		t.Fatal(err)
	}
	defer in.Close()
	out, err := os.Create(dst)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := io.Copy(out, in); err != nil {
		t.Fatal(err)
	}
	if err := out.Close(); err != nil {
		t.Fatal(err)
	}
	return openT(t, dst)
}

// openT opens a logbook closed at the end of the test.
func openT(t testing.TB, path string) *Logbook {
	t.Helper()
	lb, err := Open(path)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { lb.Close() })
	return lb
}

// emptyT creates an empty logbook closed at the end of the test.
func emptyT(t testing.TB) *Logbook {
	t.Helper()
	lb, err := Create(filepath.Join(t.TempDir(), "vigil.db"))
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { lb.Close() })
	return lb
}

// Fixture names of the small logbook the tests build.
const (
	fxSite   = "Ridge Top"
	fxTarget = "Test Star A"
)

var fxDate = time.Date(2025, 3, 14, 0, 0, 0, 0, time.UTC)

func fxSiteValue(t testing.TB) observe.Site {
	t.Helper()
	s, err := observe.NewSite(fxSite, 47.25, 8.5, 420, "Europe/Zurich", 15, observe.Horizon{{AzDeg: 90, AltDeg: 10}, {AzDeg: 180, AltDeg: 25}})
	if err != nil {
		t.Fatal(err)
	}
	return s
}

func fxTargetValue() observe.Target {
	tg := observe.NewTarget(fxTarget, ephem.Star{RAHours: 5.5, DecDeg: 30}, observe.Eclipsing,
		ephem.Ephemeris{Epoch: 2459000.1234, PeriodDays: 1.2345678, Scale: ephem.BJDTDB, EpochErr: 0.0005}, observe.Min)
	tg.Comps = []observe.Comp{{ID: "C1", V: 11.2, BV: 0.6}, {ID: "C2", V: 12.05, BV: math.NaN()}}
	tg.Checks = []observe.Comp{{ID: "K1", V: 11.65, BV: 0.55}}
	tg.MagBright, tg.MagFaint = 10.9, 11.8
	tg.Secondary = true
	tg.Notes = "a test star"
	return tg
}

// fixture returns an empty logbook with one site, one target and one night.
func fixture(t testing.TB) (*Logbook, int64) {
	t.Helper()
	lb := emptyT(t)
	if err := lb.AddSite(fxSiteValue(t)); err != nil {
		t.Fatal(err)
	}
	if err := lb.AddTarget(fxTargetValue(), "test catalogue"); err != nil {
		t.Fatal(err)
	}
	id, err := lb.AddNight(Night{Site: fxSite, Date: fxDate, Observer: "tester", Equipment: "test kit"})
	if err != nil {
		t.Fatal(err)
	}
	return lb, id
}

// fxMeasurement is a measurement of the fixture's target in night.
func fxMeasurement(night int64, jd float64) Measurement {
	return Measurement{Target: fxTarget, NightID: night, JDUTC: jd, ExposureS: 60, Filter: "V", Airmass: 1.234,
		InstMag: -7.512, InstErr: 0.004, Comps: []RawMag{{"C1", -8.120, 0.005}, {"C2", -7.262, math.NaN()}},
		Checks: []RawMag{{"K1", -7.668, 0.006}}, Mag: 11.808, MagErr: 0.006, HJD: jd + 0.001, BJDTDB: jd + 0.0018,
		Notes: "", Visual: ""}
}

// Fixture names of the demo records (fxDemo).
const (
	fxSchool  = "Low Meadow School"
	fxTargetB = "Test Star B"
)

// fxDemo returns a small demo scenario that fills every table: two sites
// (one with a horizon), two targets (one with an ephemeris history, one
// with a mean V), two nights with plans, measurements raw, visual and
// reduced only, own timings and a published one.
func fxDemo(t testing.TB) *DemoRecords {
	t.Helper()
	school, err := observe.NewSite(fxSchool, -34.05, 150.74, 70, "Australia/Sydney", 25, nil)
	if err != nil {
		t.Fatal(err)
	}
	b := observe.NewTarget(fxTargetB, ephem.Star{RAHours: 21.3, DecDeg: 41.2}, observe.Pulsating,
		ephem.Ephemeris{Epoch: 2459003.442, PeriodDays: 5.703124, Scale: ephem.BJDTDB, EpochErr: 0.02, PeriodErr: 0.00002}, observe.Max)
	b.Comps = []observe.Comp{{ID: "A", V: 8.05, BV: 0.9}, {ID: "B", V: 8.71, BV: 1.0}}
	adopted := time.Date(2024, 1, 2, 20, 0, 0, 0, time.UTC)
	later := AdoptedEphemeris{Ephemeris: ephem.Ephemeris{Epoch: 2460100.5432, PeriodDays: 1.2345691, Q: 3e-10,
		Scale: ephem.BJDTDB, EpochErr: 0.0004, PeriodErr: 0.0000002}, Adopted: time.Date(2025, 6, 1, 21, 30, 0, 0, time.UTC),
		Source: "own O-C fit 2025"}
	jd := 2460749.4 // the night of fxDate
	vis := Measurement{Target: fxTargetB, JDUTC: jd + 0.05, Filter: "vis", Visual: "A 2 V 3 B", Mag: 8.314,
		ExposureS: math.NaN(), Airmass: 1.1, InstMag: math.NaN(), InstErr: math.NaN(), MagErr: math.NaN(), HJD: jd + 0.0532,
		BJDTDB: jd + 0.05328}
	reducedOnly := Measurement{Target: fxTargetB, JDUTC: jd + 1.02, Filter: "V", Mag: 8.9, MagErr: 0.01, ExposureS: math.NaN(),
		Airmass: math.NaN(), InstMag: math.NaN(), InstErr: math.NaN(), HJD: math.NaN(), BJDTDB: math.NaN(), Notes: "from a table"}
	return &DemoRecords{
		Sites: []observe.Site{fxSiteValue(t), school},
		Targets: []DemoTarget{
			{Target: fxTargetValue(), MeanMagV: math.NaN(), Adopted: adopted, Source: "test catalogue", Later: []AdoptedEphemeris{later}},
			{Target: b, MeanMagV: 9.181, Adopted: adopted, Source: "test catalogue"},
		},
		Nights: []DemoNight{
			{Night: Night{Site: fxSite, Date: fxDate, Observer: "tester", Equipment: "test kit", Conditions: "clear", Notes: "demo night"},
				Plan:         []PlanItem{{Target: fxTarget, Note: "minimum at 22:10"}, {Target: fxTargetB}},
				Measurements: []Measurement{fxMeasurement(0, jd), fxMeasurement(0, jd+0.002), vis},
				Timings: []Timing{{Target: fxTarget, JD: 2460749.41234, Scale: ephem.BJDTDB, SigmaDays: 0.0004, Kind: observe.Min,
					Origin: Own, Method: "kvw", Filter: "V", Observer: "tester"}}},
			{Night: Night{Site: fxSchool, Date: fxDate.AddDate(0, 0, 1), Observer: "club"},
				Measurements: []Measurement{reducedOnly}},
		},
		Timings: []Timing{{Target: fxTarget, JD: 2455000.61234, Scale: ephem.HJD, SigmaDays: math.NaN(), Kind: observe.Min,
			Secondary: true, Origin: Published, Method: "kvw", Source: "Invented Circular no. 1"}},
	}
}

// counts returns the number of rows of every table.
func counts(t testing.TB, lb *Logbook) map[string]int {
	t.Helper()
	out := map[string]int{}
	for _, bt := range backupTables {
		var n int
		if err := lb.db.QueryRow("SELECT count(*) FROM " + bt.name).Scan(&n); err != nil {
			t.Fatal(err)
		}
		out[bt.name] = n
	}
	return out
}

// openRaw opens a logbook file without identifying or migrating it.
func openRaw(dsn string) (*sql.DB, error) { return sql.Open("sqlite", dsn) }
