package logbook

import (
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

// TestCreateDemo checks that CreateDemo stores every record it is given,
// each site, target and night flagged demo, and flags the logbook.
func TestCreateDemo(t *testing.T) {
	lb := openT(t, sharedDemo(t))
	if demo, err := lb.IsDemo(); err != nil || !demo {
		t.Errorf("IsDemo: got %v, %v; want true", demo, err)
	}
	c := counts(t, lb)
	for table, want := range map[string]int{"sites": 2, "horizon_points": 2, "targets": 2, "ephemerides": 3, "comps": 5,
		"nights": 2, "plans": 2, "measurements": 4, "raw_comps": 6, "timings": 2, "imports": 0} {
		if c[table] != want {
			t.Errorf("%s: %d rows, want %d", table, c[table], want)
		}
	}
	for _, table := range []string{"sites", "targets", "nights"} {
		var n int
		if err := lb.db.QueryRow("SELECT count(*) FROM " + table + " WHERE demo = 0").Scan(&n); err != nil || n != 0 {
			t.Errorf("%s: %d rows not flagged demo (%v)", table, n, err)
		}
	}
	// The ephemeris history: the catalogue's first, the later one current.
	fx := fxDemo(t)
	h, err := lb.EphemerisHistory(fxTarget)
	if err != nil {
		t.Fatal(err)
	}
	first, later := fx.Targets[0], fx.Targets[0].Later[0]
	if len(h) != 2 || h[0].Ephemeris != first.Target.Ephemeris || !h[0].Adopted.Equal(first.Adopted) || h[0].Source != first.Source ||
		h[1].Ephemeris != later.Ephemeris || h[1].Source != later.Source {
		t.Errorf("history of %s: %+v; want the first ephemeris then %+v", fxTarget, h, later)
	}
	if cur, _ := lb.Target(fxTarget); cur.Ephemeris != later.Ephemeris {
		t.Errorf("current ephemeris of %s: %+v, want the one adopted last %+v", fxTarget, cur.Ephemeris, later.Ephemeris)
	}
	if mean, err := lb.MeanMagV(fxTargetB); err != nil || mean != 9.181 {
		t.Errorf("mean V of %s: %v, %v; want 9.181", fxTargetB, mean, err)
	}
	if mean, err := lb.MeanMagV(fxTarget); err != nil || !math.IsNaN(mean) {
		t.Errorf("mean V of %s: %v, %v; want none (NaN)", fxTarget, mean, err)
	}
	// The nights' measurements and own timings belong to them.
	log, err := lb.NightLog(fxSite, fxDate)
	if err != nil {
		t.Fatal(err)
	}
	if len(log.Plan) != 2 || len(log.Measurements) != 3 || len(log.Timings) != 1 {
		t.Errorf("night %s: %d plan items, %d measurements, %d timings; want 2, 3, 1", dateKey(fxDate), len(log.Plan),
			len(log.Measurements), len(log.Timings))
	}
	ts, _ := lb.TimingsOf(fxTarget)
	for _, tm := range ts {
		if (tm.Origin == Own) != (tm.NightID == log.Night.ID) {
			t.Errorf("timing %+v: origin %v on night %d; want the own timing on night %d, the published on none", tm, tm.Origin,
				tm.NightID, log.Night.ID)
		}
	}
}

// TestCreateDemoRefuses checks that a bad record stops CreateDemo with an
// error naming it, and leaves no file; and that an existing file is not
// overwritten.
func TestCreateDemoRefuses(t *testing.T) {
	for _, tc := range []struct {
		name   string
		spoil  func(d *DemoRecords)
		phrase string
	}{
		{"bad site", func(d *DemoRecords) { d.Sites[1].MinAltDeg = 95 }, fmt.Sprintf("demo site %q", fxSchool)},
		{"unknown comparison star", func(d *DemoRecords) { d.Nights[0].Measurements[0].Comps[0].Label = "C9" },
			fmt.Sprintf("demo measurement of %q", fxTarget)},
		{"published timing on a night", func(d *DemoRecords) { d.Timings[0].NightID = 1 }, "want 0"},
		{"timing of an unknown target", func(d *DemoRecords) { d.Nights[0].Timings[0].Target = "Nobody" }, `demo timing of "Nobody"`},
		{"ephemeris of a bad history", func(d *DemoRecords) { d.Targets[0].Later[0].PeriodDays = -1 }, "ephemeris adopted"},
		{"plan of an unknown target", func(d *DemoRecords) { d.Nights[0].Plan[0].Target = "Nobody" }, "plan"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			d := fxDemo(t)
			tc.spoil(d)
			path := filepath.Join(t.TempDir(), "demo.db")
			lb, err := CreateDemo(path, d)
			if err == nil {
				lb.Close()
				t.Fatalf("got no error")
			}
			if !strings.Contains(err.Error(), tc.phrase) {
				t.Errorf("error %q does not say %q", err, tc.phrase)
			}
			left, _ := os.ReadDir(filepath.Dir(path))
			if len(left) != 0 {
				t.Errorf("files left behind: %v", left)
			}
		})
	}
	path := filepath.Join(t.TempDir(), "vigil.db")
	if err := os.WriteFile(path, []byte("mine"), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, err := CreateDemo(path, fxDemo(t)); !errors.Is(err, ErrExists) {
		t.Errorf("CreateDemo over a file: got %v, want ErrExists", err)
	}
}

// TestClearDemo checks that ClearDemo, and an import of real data, remove
// the demo and nothing else; and that a failed import leaves the demo.
func TestClearDemo(t *testing.T) {
	lb := demoCopy(t)
	// A real target and a real night at a demo site survive.
	real := observe.NewTarget("My Star", ephem.Star{RAHours: 7, DecDeg: 10}, observe.Pulsating,
		ephem.Ephemeris{Epoch: 2459000.5, PeriodDays: 0.5, Scale: ephem.BJDTDB}, observe.Max)
	if err := lb.AddTarget(real, "test"); err != nil {
		t.Fatal(err)
	}
	id, err := lb.AddNight(Night{Site: fxSite, Date: fxDate.AddDate(0, 0, 7)})
	if err != nil {
		t.Fatal(err)
	}
	if err := lb.ClearDemo(); err != nil {
		t.Fatal(err)
	}
	if demo, _ := lb.IsDemo(); demo {
		t.Errorf("IsDemo after ClearDemo: true")
	}
	ts, _ := lb.Targets()
	if len(ts) != 1 || ts[0].Name != real.Name {
		t.Errorf("targets after ClearDemo: %v, want only %q", ts, real.Name)
	}
	c := counts(t, lb)
	for _, table := range []string{"measurements", "timings", "raw_comps", "plans", "comps"} {
		if c[table] != 0 {
			t.Errorf("%s after ClearDemo: %d rows, want 0", table, c[table])
		}
	}
	if c["nights"] != 1 || c["sites"] != 1 {
		t.Errorf("after ClearDemo: %d nights and %d sites, want the real night and the site it uses", c["nights"], c["sites"])
	}
	if n, err := lb.NightByID(id); err != nil || n.Site != fxSite {
		t.Errorf("the real night: %+v, %v", n, err)
	}
	var flagged int
	if err := lb.db.QueryRow("SELECT count(*) FROM sites WHERE demo = 1").Scan(&flagged); err != nil || flagged != 0 {
		t.Errorf("the kept site is still flagged demo (%d, %v)", flagged, err)
	}

	// An import into the demo logbook removes the demo.
	lb2 := demoCopy(t)
	n, err := lb2.ImportCSV(SitesTable, strings.NewReader("name,lat_deg,lon_deg,time_zone,min_alt_deg\nMy Yard,51.5,-0.1,Europe/London,15\n"), "sites.csv")
	if err != nil || n != 1 {
		t.Fatalf("import: %d, %v", n, err)
	}
	if demo, _ := lb2.IsDemo(); demo {
		t.Errorf("IsDemo after an import: true")
	}
	sites, _ := lb2.Sites()
	if len(sites) != 1 || sites[0].Name != "My Yard" {
		t.Errorf("sites after the import: %v", sites)
	}
	// A failed import leaves the demo as it was.
	lb3 := demoCopy(t)
	before := counts(t, lb3)
	if _, err := lb3.ImportCSV(SitesTable, strings.NewReader("name,lat_deg,lon_deg,time_zone,min_alt_deg\nMy Yard,95,-0.1,UTC,15\n"), "bad.csv"); err == nil {
		t.Fatalf("import of a bad site: no error")
	}
	if demo, _ := lb3.IsDemo(); !demo {
		t.Errorf("a failed import removed the demo")
	}
	if after := counts(t, lb3); fmt.Sprint(after) != fmt.Sprint(before) {
		t.Errorf("a failed import changed the logbook: %v → %v", before, after)
	}
}
