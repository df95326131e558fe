package logbook_test

import (
	"bytes"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// The usual chain: a logbook with a site, a target and a night; a timing
// from that night; the targets as the planner wants them, with their last
// timing filled in.
func Example() {
	dir, _ := os.MkdirTemp("", "vigil-example-")
	defer os.RemoveAll(dir)
	lb, err := logbook.Create(filepath.Join(dir, "vigil.db"))
	if err != nil {
		fmt.Println(err)
		return
	}
	defer lb.Close()

	site, _ := observe.NewSite("Back Garden", 51.48, -0.61, 30, "Europe/London", 20, nil)
	_ = lb.AddSite(site)
	star := observe.NewTarget("Example Star", ephem.Star{RAHours: 5.5, DecDeg: 30}, observe.Eclipsing,
		ephem.Ephemeris{Epoch: 2459000.1234, PeriodDays: 1.2345678, Scale: ephem.BJDTDB}, observe.Min)
	_ = lb.AddTarget(star, "my catalogue")
	night, _ := lb.AddNight(logbook.Night{Site: "Back Garden", Date: time.Date(2025, 1, 20, 0, 0, 0, 0, time.UTC), Observer: "me"})
	_, err = lb.AddTiming(logbook.Timing{Target: "Example Star", JD: 2460696.43312, Scale: ephem.BJDTDB, SigmaDays: 0.0004,
		Kind: observe.Min, Origin: logbook.Own, Method: "kvw", NightID: night})
	if err != nil {
		fmt.Println(err)
		return
	}
	targets, _ := lb.Targets()
	for _, t := range targets {
		fmt.Printf("%s: T0 %.4f %s, P %.7f d, last timing %.5f\n", t.Name, t.Ephemeris.Epoch, t.Ephemeris.Scale.Label(),
			t.Ephemeris.PeriodDays, t.LastTimingJD)
	}
	// Output:
	// Example Star: T0 2459000.1234 BJD_TDB, P 1.2345678 d, last timing 2460696.43312
}

// Adopting a new ephemeris keeps the old ones, each with its date and
// source.
func ExampleLogbook_AdoptEphemeris() {
	dir, _ := os.MkdirTemp("", "vigil-example-")
	defer os.RemoveAll(dir)
	lb, _ := logbook.Create(filepath.Join(dir, "vigil.db"))
	defer lb.Close()

	old := ephem.Ephemeris{Epoch: 2451000.3321, PeriodDays: 0.3691228, Scale: ephem.HJD}
	_ = lb.AddTarget(observe.NewTarget("Example Binary", ephem.Star{RAHours: 13.2, DecDeg: 31.7}, observe.Eclipsing, old, observe.Min), "a 1999 paper")
	newer := ephem.Ephemeris{Epoch: 2459000.18731, PeriodDays: 0.3691234, Scale: ephem.BJDTDB, EpochErr: 0.0008, PeriodErr: 1e-7}
	_ = lb.AdoptEphemeris("Example Binary", newer, "own O-C fit") // adopted now
	// An ephemeris adopted long ago joins the history at its date.
	ancient := ephem.Ephemeris{Epoch: 2440000.2511, PeriodDays: 0.369121, Scale: ephem.HJD}
	_ = lb.AdoptEphemerisAt("Example Binary", ancient, "a 1968 discovery note", time.Date(1970, 1, 1, 0, 0, 0, 0, time.UTC))

	history, _ := lb.EphemerisHistory("Example Binary")
	for _, h := range history {
		fmt.Printf("%s: T0 %.5f %s, P %.7f\n", h.Source, h.Epoch, h.Scale.Label(), h.PeriodDays)
	}
	current, _ := lb.Target("example binary") // names match in any case
	fmt.Printf("current: P %.7f d on %s\n", current.Ephemeris.PeriodDays, current.Ephemeris.Scale.Label())
	// Output:
	// a 1968 discovery note: T0 2440000.25110 HJD_UTC, P 0.3691210
	// a 1999 paper: T0 2451000.33210 HJD_UTC, P 0.3691228
	// own O-C fit: T0 2459000.18731 BJD_TDB, P 0.3691234
	// current: P 0.3691234 d on BJD_TDB
}

// An import is all or nothing, and its error names the file, line and
// column of the fault.
func ExampleLogbook_ImportCSV() {
	dir, _ := os.MkdirTemp("", "vigil-example-")
	defer os.RemoveAll(dir)
	lb, _ := logbook.Create(filepath.Join(dir, "vigil.db"))
	defer lb.Close()
	_ = lb.AddTarget(observe.NewTarget("Example Star", ephem.Star{RAHours: 5.5, DecDeg: 30}, observe.Eclipsing,
		ephem.Ephemeris{Epoch: 2459000.1234, PeriodDays: 1.2345678, Scale: ephem.BJDTDB}, observe.Min), "")

	published := `target,jd,timescale,sigma_days,kind,origin,source
Example Star,2455000.4321,hjd,0.0006,min,published,An Invented Journal 3 (2009)
Example Star,2456000.1234,hjd,0.0007,min,published,An Invented Journal 5 (2012)
Exemple Star,2457000.0987,hjd,0.0005,min,published,An Invented Journal 8 (2015)
`
	n, err := lb.ImportCSV(logbook.TimingsTable, strings.NewReader(published), "published.csv")
	fmt.Println(n, err)
	timings, _ := lb.TimingsOf("Example Star")
	fmt.Println(len(timings), "timings stored")

	n, err = lb.ImportCSV(logbook.TimingsTable, strings.NewReader(strings.Replace(published, "Exemple", "Example", 1)), "published.csv")
	fmt.Println(n, err)
	// Output:
	// 0 published.csv: line 4, column 1 (target): target "Exemple Star": not found in the logbook
	// 0 timings stored
	// 3 <nil>
}

// A demo logbook: records stored flagged as demo (the first run's
// scenario comes from vigil/internal/demo), removed by ClearDemo or by any
// import.
func ExampleCreateDemo() {
	dir, _ := os.MkdirTemp("", "vigil-example-")
	defer os.RemoveAll(dir)
	site, _ := observe.NewSite("Hilltop (demo)", 52.1, -1.45, 140, "Europe/London", 20, nil)
	star := observe.NewTarget("Invented V1", ephem.Star{RAHours: 0.9151, DecDeg: 24.31}, observe.Pulsating,
		ephem.Ephemeris{Epoch: 2459001.31274, PeriodDays: 0.5672381, Scale: ephem.BJDTDB}, observe.Max)
	lb, err := logbook.CreateDemo(filepath.Join(dir, "vigil.db"), &logbook.DemoRecords{
		Sites:   []observe.Site{site},
		Targets: []logbook.DemoTarget{{Target: star, MeanMagV: math.NaN(), Adopted: time.Date(2019, 1, 5, 20, 0, 0, 0, time.UTC), Source: "invented"}},
		Nights:  []logbook.DemoNight{{Night: logbook.Night{Site: site.Name, Date: time.Date(2019, 9, 20, 0, 0, 0, 0, time.UTC)}}},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	defer lb.Close()
	demo, _ := lb.IsDemo()
	sites, _ := lb.Sites()
	targets, _ := lb.Targets()
	fmt.Println("demo:", demo, len(sites), "site,", len(targets), "target")

	_ = lb.ClearDemo()
	demo, _ = lb.IsDemo()
	sites, _ = lb.Sites()
	targets, _ = lb.Targets()
	fmt.Println("after ClearDemo:", demo, len(sites), "sites,", len(targets), "targets")
	// Output:
	// demo: true 1 site, 1 target
	// after ClearDemo: false 0 sites, 0 targets
}

// A night's log: the site, the plan, the measurements and the timings.
func ExampleLogbook_NightLog() {
	dir, _ := os.MkdirTemp("", "vigil-example-")
	defer os.RemoveAll(dir)
	lb, _ := logbook.Create(filepath.Join(dir, "vigil.db"))
	defer lb.Close()
	site, _ := observe.NewSite("Back Garden", 51.48, -0.61, 30, "Europe/London", 20, nil)
	_ = lb.AddSite(site)
	t := observe.NewTarget("Example Star", ephem.Star{RAHours: 5.5, DecDeg: 30}, observe.Pulsating,
		ephem.Ephemeris{Epoch: 2459000.1234, PeriodDays: 0.5672381, Scale: ephem.BJDTDB}, observe.Max)
	t.Comps = []observe.Comp{{ID: "C1", V: 11.2, BV: 0.6}}
	_ = lb.AddTarget(t, "")
	date := time.Date(2025, 1, 20, 0, 0, 0, 0, time.UTC)
	night, _ := lb.AddNight(logbook.Night{Site: "Back Garden", Date: date, Observer: "me", Conditions: "clear"})
	_ = lb.SetPlan(night, []logbook.PlanItem{{Target: "Example Star", Note: "around the maximum"}})
	_, _ = lb.AddMeasurements([]logbook.Measurement{{Target: "Example Star", NightID: night, JDUTC: 2460696.41, Filter: "V",
		InstMag: -8.62, InstErr: 0.004, Comps: []logbook.RawMag{{Label: "C1", InstMag: -8.12, InstErr: 0.005}},
		Mag: 10.7, MagErr: 0.0064, ExposureS: 60, Airmass: 1.21, HJD: math.NaN(), BJDTDB: math.NaN()}})

	log, _ := lb.NightLog("Back Garden", date)
	fmt.Println(log.Night.Date.Format("2006-01-02"), log.Site.Name, log.Night.Observer, log.Night.Conditions)
	fmt.Println("plan:", log.Plan[0].Target, "-", log.Plan[0].Note)
	m := log.Measurements[0]
	fmt.Printf("%.2f %s V=%.3f±%.4f (%s %.2f), BJD known: %v\n", m.JDUTC, m.Target, m.Mag, m.MagErr, m.Comps[0].Label,
		m.Comps[0].InstMag, !math.IsNaN(m.BJDTDB))
	// Output:
	// 2025-01-20 Back Garden me clear
	// plan: Example Star - around the maximum
	// 2460696.41 Example Star V=10.700±0.0064 (C1 -8.12), BJD known: false
}

// A backup restores to an identical logbook.
func ExampleRestore() {
	dir, _ := os.MkdirTemp("", "vigil-example-")
	defer os.RemoveAll(dir)
	lb, _ := logbook.Create(filepath.Join(dir, "vigil.db"))
	site, _ := observe.NewSite("Back Garden", 51.48, -0.61, 30, "Europe/London", 20, observe.Horizon{{AzDeg: 180, AltDeg: 25}})
	_ = lb.AddSite(site)
	var first bytes.Buffer
	_ = lb.Backup(&first)
	lb.Close()

	restored, err := logbook.Restore(filepath.Join(dir, "restored.db"), bytes.NewReader(first.Bytes()), "backup.json")
	if err != nil {
		fmt.Println(err)
		return
	}
	defer restored.Close()
	var second bytes.Buffer
	_ = restored.Backup(&second)
	fmt.Println("identical:", bytes.Equal(first.Bytes(), second.Bytes()))
	s, _ := restored.Site("back garden")
	fmt.Println(s.Name, s.Horizon)
	// Output:
	// identical: true
	// Back Garden [{180 25}]
}
