package logbook

import (
	"bytes"
	"database/sql"
	"errors"
	"io/fs"
	"math"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"sync"
	"testing"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

func TestDefaultPath(t *testing.T) {
	if runtime.GOOS != "linux" {
		t.Skip("the configuration directory is set through XDG_CONFIG_HOME on Linux only")
	}
	dir := t.TempDir()
	t.Setenv("XDG_CONFIG_HOME", dir)
	got, err := DefaultPath()
	if want := filepath.Join(dir, "vigil", "vigil.db"); err != nil || got != want {
		t.Errorf("DefaultPath: got %q, %v; want %q", got, err, want)
	}
	t.Setenv("XDG_CONFIG_HOME", "")
	t.Setenv("HOME", "")
	if _, err := DefaultPath(); err == nil || !strings.Contains(err.Error(), "--logbook") {
		t.Errorf("DefaultPath without a home: got %v, want an error naming --logbook", err)
	}
}

// TestOpenRefuses checks that Open refuses what is not a logbook it can
// use, with a clear error, and leaves the file as it was.
func TestOpenRefuses(t *testing.T) {
	dir := t.TempDir()
	write := func(name string, data []byte) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, data, 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	other := filepath.Join(dir, "other.sqlite")
	db, err := sql.Open("sqlite", other)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := db.Exec("CREATE TABLE photos(id INTEGER PRIMARY KEY, name TEXT); INSERT INTO photos(name) VALUES ('x')"); err != nil {
		t.Fatal(err)
	}
	db.Close()
	newer := filepath.Join(dir, "newer.db")
	lb, err := Create(newer)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := lb.db.Exec("INSERT INTO schema_version(version, what, applied_utc) VALUES (99, 'from the future', '2030-01-01T00:00:00Z')"); err != nil {
		t.Fatal(err)
	}
	lb.Close()
	for _, tc := range []struct {
		name   string
		path   string
		is     error
		phrase string
	}{
		{"missing file", filepath.Join(dir, "nope.db"), fs.ErrNotExist, "no such file"},
		{"directory", dir, nil, "is a directory"},
		{"empty file", write("empty.db", nil), ErrNotLogbook, "empty"},
		{"text file", write("notes.txt", []byte("just some notes\n")), ErrNotLogbook, "not an SQLite database"},
		{"another program's database", other, ErrNotLogbook, "another program"},
		{"newer schema", newer, ErrNewerSchema, "version 99"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var before []byte
			if st, err := os.Stat(tc.path); err == nil && !st.IsDir() {
				before, _ = os.ReadFile(tc.path)
			}
			lb, err := Open(tc.path)
			if err == nil {
				lb.Close()
				t.Fatalf("Open(%s): got no error", tc.name)
			}
			if tc.is != nil && !errors.Is(err, tc.is) {
				t.Errorf("got %v, want it to wrap %v", err, tc.is)
			}
			if !strings.Contains(err.Error(), tc.phrase) || !strings.Contains(err.Error(), tc.path) {
				t.Errorf("got %q, want it to name the file and say %q", err, tc.phrase)
			}
			if before != nil {
				after, _ := os.ReadFile(tc.path)
				if !bytes.Equal(before, after) {
					t.Errorf("Open changed the file it refused")
				}
			}
		})
	}
}

func TestCreateRefusesExisting(t *testing.T) {
	path := filepath.Join(t.TempDir(), "vigil.db")
	if err := os.WriteFile(path, []byte("mine"), 0o644); err != nil {
		t.Fatal(err)
	}
	for name, create := range map[string]func() error{
		"Create":     func() error { _, err := Create(path); return err },
		"CreateDemo": func() error { _, err := CreateDemo(path, fxDemo(t)); return err },
		"Restore":    func() error { _, err := Restore(path, strings.NewReader("{}"), "b.json"); return err },
	} {
		if err := create(); !errors.Is(err, ErrExists) || !strings.Contains(err.Error(), path) {
			t.Errorf("%s over an existing file: got %v, want ErrExists naming the file", name, err)
		}
	}
	if b, _ := os.ReadFile(path); string(b) != "mine" {
		t.Errorf("the existing file was changed")
	}
	left, _ := filepath.Glob(filepath.Join(filepath.Dir(path), ".*tmp*"))
	if len(left) > 0 {
		t.Errorf("temporary files left behind: %v", left)
	}
}

// TestMigrationsInOrder checks the list of migrations: versions 1, 2, ...
// in order, the last one SchemaVersion.
func TestMigrationsInOrder(t *testing.T) {
	for i, m := range migrations {
		if m.version != i+1 || m.sql == "" || m.what == "" {
			t.Errorf("migration %d: version %d, %d bytes of SQL, %q", i, m.version, len(m.sql), m.what)
		}
	}
	if last := migrations[len(migrations)-1].version; last != SchemaVersion {
		t.Errorf("the last migration is version %d, SchemaVersion %d", last, SchemaVersion)
	}
}

// TestMigrateFromV1 opens a logbook written at schema version 1 (by the
// real first migration, with records in its columns) with this program,
// which must bring it to the newest version with every record intact.
func TestMigrateFromV1(t *testing.T) {
	p := v1File(t)
	lb := openT(t, p)
	if got, err := lb.Version(); err != nil || got != SchemaVersion {
		t.Errorf("version after Open: %d, %v; want %d", got, err, SchemaVersion)
	}
	tg, err := lb.Target("old star")
	if err != nil {
		t.Fatal(err)
	}
	if tg.Ephemeris.Epoch != 2455000.5 || tg.Ephemeris.Scale != ephem.HJD || tg.LastTimingJD != 2457422.41 {
		t.Errorf("the v1 target after migration: %+v", tg)
	}
	if m, err := lb.MeanMagV("Old Star"); err != nil || !math.IsNaN(m) {
		t.Errorf("the new column: got %v, %v; want NaN (missing)", m, err)
	}
	var idx int
	lb.db.QueryRow("SELECT count(*) FROM sqlite_schema WHERE type = 'index' AND name = 'measurements_by_target'").Scan(&idx)
	if idx != 1 {
		t.Errorf("the version 2 index is missing")
	}
	ms, err := lb.MeasurementsOf("Old Star", 0)
	if err != nil || len(ms) != 1 || ms[0].Mag != 11.5 || !math.IsNaN(ms[0].InstMag) {
		t.Errorf("the v1 measurement: %+v, %v", ms, err)
	}
	s, err := lb.Site("Old Site")
	if err != nil || len(s.Horizon) != 1 || s.Horizon[0].AltDeg != 12.5 {
		t.Errorf("the v1 site: %+v, %v", s, err)
	}
	if err := lb.IntegrityCheck(); err != nil {
		t.Error(err)
	}
	// Opening again changes nothing.
	lb.Close()
	lb2 := openT(t, p)
	var rows int
	lb2.db.QueryRow("SELECT count(*) FROM schema_version").Scan(&rows)
	if rows != SchemaVersion {
		t.Errorf("schema_version holds %d rows, want one per migration (%d)", rows, SchemaVersion)
	}
}

// v1File writes a logbook file at schema version 1 with one record of each
// kind, as a program that knew only version 1 would have left it.
func v1File(t *testing.T) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), "v1.db")
	name, err := dsn(path, false)
	if err != nil {
		t.Fatal(err)
	}
	db, err := sql.Open("sqlite", name)
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	lb := &Logbook{db: db, path: path}
	if err := lb.migrate(0, 1); err != nil {
		t.Fatal(err)
	}
	for _, q := range []string{
		`INSERT INTO sites(id, name, lat_deg, lon_deg, elev_m, time_zone, min_alt_deg) VALUES (1, 'Old Site', 50.5, -3.25, 80, 'Europe/London', 18)`,
		`INSERT INTO horizon_points(site_id, az_deg, alt_deg) VALUES (1, 90, 12.5)`,
		`INSERT INTO targets(id, name, ra_h, dec_deg, class, kind) VALUES (1, 'Old Star', 12.5, 20.25, 'pulsating', 'max')`,
		`INSERT INTO ephemerides(target_id, epoch, period_days, timescale, adopted_utc, source) VALUES (1, 2455000.5, 0.61, 'hjd', '2015-06-01T20:00:00Z', 'old catalogue')`,
		`INSERT INTO nights(id, site_id, date, observer) VALUES (1, 1, '2016-02-03', 'me')`,
		`INSERT INTO measurements(night_id, target_id, jd_utc, mag, mag_err) VALUES (1, 1, 2457422.4, 11.5, 0.01)`,
		`INSERT INTO timings(target_id, night_id, jd, timescale, kind, origin) VALUES (1, 1, 2457422.41, 'hjd', 'max', 'own')`,
	} {
		if _, err := db.Exec(q); err != nil {
			t.Fatal(err)
		}
	}
	var v int
	if err := db.QueryRow("SELECT max(version) FROM schema_version").Scan(&v); err != nil || v != 1 {
		t.Fatalf("setup: version %d, %v", v, err)
	}
	return path
}

// TestSites checks adding, reading, renaming and deleting sites.
func TestSites(t *testing.T) {
	lb, night := fixture(t)
	s, err := lb.Site("ridge top") // any case
	if err != nil {
		t.Fatal(err)
	}
	want := fxSiteValue(t)
	if s.Name != want.Name || s.LatDeg != want.LatDeg || s.LonDeg != want.LonDeg || s.ElevM != want.ElevM ||
		s.TimeZone != want.TimeZone || s.MinAltDeg != want.MinAltDeg || len(s.Horizon) != 2 || s.Horizon[1] != want.Horizon[1] {
		t.Errorf("Site: got %+v, want %+v", s, want)
	}
	if s.Location().String() != "Europe/Zurich" {
		t.Errorf("Site: the time zone is not loaded: %v", s.Location())
	}
	for _, tc := range []struct {
		name   string
		site   func() observe.Site
		phrase string
	}{
		{"same name, other case", func() observe.Site { x := fxSiteValue(t); x.Name = "RIDGE TOP"; return x }, "already in the logbook"},
		{"latitude out of range", func() observe.Site { x := fxSiteValue(t); x.Name = "X"; x.LatDeg = 95; return x }, "latitude"},
		{"unknown time zone", func() observe.Site { x := fxSiteValue(t); x.Name = "X"; x.TimeZone = "Mars/Olympus"; return x }, "time zone"},
		{"blank name", func() observe.Site { x := fxSiteValue(t); x.Name = " "; return x }, "empty"},
		{"horizon out of order", func() observe.Site {
			x := fxSiteValue(t)
			x.Name = "X"
			x.Horizon = observe.Horizon{{AzDeg: 100, AltDeg: 5}, {AzDeg: 50, AltDeg: 5}}
			return x
		}, "azimuths must increase"},
	} {
		if err := lb.AddSite(tc.site()); err == nil || !strings.Contains(err.Error(), tc.phrase) {
			t.Errorf("AddSite, %s: got %v, want an error saying %q", tc.name, err, tc.phrase)
		}
	}
	moved := fxSiteValue(t)
	moved.Name, moved.ElevM, moved.Horizon = "Ridge Top North", 455.5, nil
	if err := lb.UpdateSite(fxSite, moved); err != nil {
		t.Fatal(err)
	}
	if _, err := lb.Site(fxSite); !errors.Is(err, ErrNotFound) {
		t.Errorf("the old name after a rename: got %v, want ErrNotFound", err)
	}
	if s, err := lb.Site("Ridge Top North"); err != nil || s.ElevM != 455.5 || len(s.Horizon) != 0 {
		t.Errorf("after UpdateSite: %+v, %v", s, err)
	}
	if n, err := lb.NightByID(night); err != nil || n.Site != "Ridge Top North" {
		t.Errorf("the site's night after the rename: %+v, %v", n, err)
	}
	if err := lb.DeleteSite("Ridge Top North"); err == nil || !strings.Contains(err.Error(), "1 night") {
		t.Errorf("DeleteSite with a night: got %v, want a refusal naming the night", err)
	}
	if err := lb.DeleteNight(night); err != nil {
		t.Fatal(err)
	}
	if err := lb.DeleteSite("Ridge Top North"); err != nil {
		t.Errorf("DeleteSite: %v", err)
	}
	if sites, _ := lb.Sites(); len(sites) != 0 {
		t.Errorf("sites after the delete: %v", sites)
	}
	if err := lb.DeleteSite("Nowhere"); !errors.Is(err, ErrNotFound) {
		t.Errorf("DeleteSite of an unknown site: got %v, want ErrNotFound", err)
	}
}

// TestTargets checks targets, their ephemeris history and LastTimingJD.
func TestTargets(t *testing.T) {
	lb, night := fixture(t)
	want := fxTargetValue()
	got, err := lb.Target("TEST STAR A")
	if err != nil {
		t.Fatal(err)
	}
	if got.Name != want.Name || got.Star != want.Star || got.Ephemeris != want.Ephemeris || got.Kind != want.Kind ||
		got.Class != want.Class || !got.Secondary || got.MagBright != 10.9 || got.Notes != want.Notes ||
		len(got.Comps) != 2 || got.Comps[0] != want.Comps[0] || !math.IsNaN(got.Comps[1].BV) || got.Checks[0] != want.Checks[0] {
		t.Errorf("Target: got %+v, want %+v", got, want)
	}
	if got.LastTimingJD != 0 {
		t.Errorf("LastTimingJD with no timing: got %v, want 0", got.LastTimingJD)
	}
	if err := lb.AddTarget(want, ""); err == nil || !strings.Contains(err.Error(), "already in the logbook") {
		t.Errorf("a second %q: got %v", fxTarget, err)
	}
	bad := want
	bad.Name = "Dup Comps"
	bad.Checks = []observe.Comp{{ID: "c1", V: 10, BV: math.NaN()}}
	if err := lb.AddTarget(bad, ""); err == nil || !strings.Contains(err.Error(), "appears twice") {
		t.Errorf("a comparison star twice: got %v", err)
	}

	// The ephemeris history.
	newer := ephem.Ephemeris{Epoch: 2460500.2345, PeriodDays: 1.2345691, Q: 1e-10, Scale: ephem.BJDTDB, EpochErr: 0.0002, PeriodErr: 1e-7}
	if err := lb.AdoptEphemeris(fxTarget, newer, "own O-C fit"); err != nil {
		t.Fatal(err)
	}
	older := ephem.Ephemeris{Epoch: 2440000.5, PeriodDays: 1.23456, Scale: ephem.HJD}
	if err := lb.AdoptEphemerisAt(fxTarget, older, "a 1970s paper", time.Date(1975, 5, 1, 0, 0, 0, 0, time.UTC)); err != nil {
		t.Fatal(err)
	}
	h, err := lb.EphemerisHistory(fxTarget)
	if err != nil {
		t.Fatal(err)
	}
	if len(h) != 3 || h[0].Ephemeris != older || h[0].Source != "a 1970s paper" || h[1].Ephemeris != want.Ephemeris ||
		h[1].Source != "test catalogue" || h[2].Ephemeris != newer || h[2].Source != "own O-C fit" {
		t.Errorf("EphemerisHistory: got %+v", h)
	}
	if time.Since(h[2].Adopted) > time.Minute || h[2].Adopted.Location() != time.UTC {
		t.Errorf("adopted at %v, want now in UTC", h[2].Adopted)
	}
	if got, _ := lb.Target(fxTarget); got.Ephemeris != newer {
		t.Errorf("the current ephemeris: got %+v, want the one adopted last %+v", got.Ephemeris, newer)
	}
	if err := lb.AdoptEphemeris(fxTarget, ephem.Ephemeris{Epoch: 12, PeriodDays: 1, Scale: ephem.HJD}, "x"); err == nil {
		t.Errorf("adopting a bad ephemeris: no error")
	}

	// UpdateTarget keeps the ephemeris to AdoptEphemeris.
	cur, _ := lb.Target(fxTarget)
	cur.Notes, cur.MagFaint, cur.Comps = "edited", math.NaN(), cur.Comps[:1]
	if err := lb.UpdateTarget(fxTarget, cur); err != nil {
		t.Fatal(err)
	}
	if got, _ := lb.Target(fxTarget); got.Notes != "edited" || !math.IsNaN(got.MagFaint) || len(got.Comps) != 1 {
		t.Errorf("after UpdateTarget: %+v", got)
	}
	cur.Ephemeris.PeriodDays = 1.5
	if err := lb.UpdateTarget(fxTarget, cur); err == nil || !strings.Contains(err.Error(), "AdoptEphemeris") {
		t.Errorf("UpdateTarget with another ephemeris: got %v, want a pointer to AdoptEphemeris", err)
	}

	// LastTimingJD: the latest timing, or the catalogue's if later.
	for _, jd := range []float64{2460600.5, 2460700.25, 2460650.75} {
		if _, err := lb.AddTiming(Timing{Target: fxTarget, JD: jd, Scale: ephem.BJDTDB, SigmaDays: math.NaN(), Kind: observe.Min,
			Origin: Own, NightID: night}); err != nil {
			t.Fatal(err)
		}
	}
	cat := fxTargetValue()
	cat.Name, cat.LastTimingJD = "Catalogued", 2460800.5
	if err := lb.AddTarget(cat, "catalogue"); err != nil {
		t.Fatal(err)
	}
	ts, err := lb.Targets()
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name string
		want float64
	}{{"Catalogued", 2460800.5}, {fxTarget, 2460700.25}} {
		found := false
		for _, tg := range ts {
			if tg.Name == c.name {
				found = true
				if tg.LastTimingJD != c.want {
					t.Errorf("%s: LastTimingJD %v, want %v", c.name, tg.LastTimingJD, c.want)
				}
			}
		}
		if !found {
			t.Errorf("Targets lacks %q", c.name)
		}
	}
	if ts[0].Name != "Catalogued" {
		t.Errorf("Targets is not in order of name: %q first", ts[0].Name)
	}

	if err := lb.SetMeanMagV(fxTarget, 9.123456789); err != nil {
		t.Fatal(err)
	}
	if m, _ := lb.MeanMagV(fxTarget); m != 9.123456789 {
		t.Errorf("MeanMagV: got %v", m)
	}
	if err := lb.SetComps(fxTarget, []observe.Comp{{ID: "N1", V: 10.5, BV: 0.3}}, nil); err != nil {
		t.Fatal(err)
	}
	if c, k, err := lb.Comps(fxTarget); err != nil || len(c) != 1 || c[0].ID != "N1" || len(k) != 0 {
		t.Errorf("Comps after SetComps: %v %v %v", c, k, err)
	}
	if err := lb.AddComp(fxTarget, observe.Comp{ID: "K9", V: 11.1, BV: math.NaN()}, true); err != nil {
		t.Fatal(err)
	}
	if err := lb.AddComp(fxTarget, observe.Comp{ID: "n1", V: 11.1, BV: math.NaN()}, false); err == nil {
		t.Errorf("AddComp of an ID already there: no error")
	}
	if err := lb.DeleteComp(fxTarget, "n1"); err != nil {
		t.Fatal(err)
	}
	if err := lb.DeleteComp(fxTarget, "n1"); !errors.Is(err, ErrNotFound) {
		t.Errorf("DeleteComp twice: got %v, want ErrNotFound", err)
	}
	if c, k, _ := lb.Comps(fxTarget); len(c) != 0 || len(k) != 1 || k[0].ID != "K9" {
		t.Errorf("Comps after AddComp and DeleteComp: %v %v", c, k)
	}

	// Deleting a target deletes everything about it.
	if _, err := lb.AddMeasurements([]Measurement{{Target: fxTarget, NightID: night, JDUTC: 2460700.3, Mag: 11, MagErr: math.NaN(),
		InstMag: math.NaN(), InstErr: math.NaN(), ExposureS: math.NaN(), Airmass: math.NaN(), HJD: math.NaN(), BJDTDB: math.NaN()}}); err != nil {
		t.Fatal(err)
	}
	if err := lb.SetPlan(night, []PlanItem{{Target: fxTarget}}); err != nil {
		t.Fatal(err)
	}
	if err := lb.DeleteTarget(fxTarget); err != nil {
		t.Fatal(err)
	}
	c := counts(t, lb)
	for _, table := range []string{"ephemerides", "comps", "measurements", "timings", "plans"} {
		want := 0
		if table == "ephemerides" || table == "comps" {
			want = map[string]int{"ephemerides": 1, "comps": 3}[table] // the other target's
		}
		if c[table] != want {
			t.Errorf("%s after DeleteTarget: %d rows, want %d", table, c[table], want)
		}
	}
	if _, err := lb.Target(fxTarget); !errors.Is(err, ErrNotFound) {
		t.Errorf("Target after DeleteTarget: got %v, want ErrNotFound", err)
	}
}

// TestNightsAndLog checks nights, plans and the night's log.
func TestNightsAndLog(t *testing.T) {
	lb, night := fixture(t)
	if _, err := lb.AddNight(Night{Site: "ridge top", Date: fxDate.Add(20 * time.Hour)}); err == nil || !strings.Contains(err.Error(), "already") {
		t.Errorf("a second night on the same date: got %v", err)
	}
	if _, err := lb.AddNight(Night{Site: "Nowhere", Date: fxDate}); !errors.Is(err, ErrNotFound) {
		t.Errorf("a night at an unknown site: got %v, want ErrNotFound", err)
	}
	next, err := lb.AddNight(Night{Site: fxSite, Date: fxDate.AddDate(0, 0, 1), Conditions: "hazy"})
	if err != nil {
		t.Fatal(err)
	}
	ns, err := lb.Nights(fxSite)
	if err != nil || len(ns) != 2 || ns[0].ID != night || ns[1].ID != next || ns[1].Conditions != "hazy" {
		t.Errorf("Nights: %+v, %v", ns, err)
	}
	// The date may be given at any hour of any zone: its calendar date counts.
	zurich, _ := time.LoadLocation("Europe/Zurich")
	n, err := lb.Night(fxSite, time.Date(2025, 3, 14, 23, 30, 0, 0, zurich))
	if err != nil || n.ID != night || !n.Date.Equal(fxDate) || n.Observer != "tester" {
		t.Errorf("Night: %+v, %v", n, err)
	}
	if _, err := lb.Night(fxSite, fxDate.AddDate(0, 0, 5)); !errors.Is(err, ErrNotFound) {
		t.Errorf("Night of a date without one: got %v, want ErrNotFound", err)
	}
	other := fxTargetValue()
	other.Name = "Test Star B"
	if err := lb.AddTarget(other, "x"); err != nil {
		t.Fatal(err)
	}
	if err := lb.SetPlan(night, []PlanItem{{Target: "Test Star B", Note: "first"}, {Target: fxTarget, Note: "then"}}); err != nil {
		t.Fatal(err)
	}
	if err := lb.SetPlan(night, []PlanItem{{Target: fxTarget}, {Target: fxTarget}}); err == nil {
		t.Errorf("a plan with a target twice: no error")
	}
	if _, err := lb.AddMeasurements([]Measurement{fxMeasurement(night, 2460749.45), fxMeasurement(night, 2460749.40)}); err != nil {
		t.Fatal(err)
	}
	if _, err := lb.AddMeasurements([]Measurement{fxMeasurement(next, 2460750.45)}); err != nil {
		t.Fatal(err)
	}
	if _, err := lb.AddTiming(Timing{Target: fxTarget, JD: 2460749.43, Scale: ephem.BJDTDB, SigmaDays: 0.0004, Kind: observe.Min,
		Origin: Own, Method: "kvw", NightID: night}); err != nil {
		t.Fatal(err)
	}
	log, err := lb.NightLog(fxSite, fxDate)
	if err != nil {
		t.Fatal(err)
	}
	if log.Night.ID != night || log.Site.Name != fxSite || len(log.Plan) != 2 || log.Plan[0].Target != "Test Star B" ||
		log.Plan[1].Note != "then" || len(log.Measurements) != 2 || log.Measurements[0].JDUTC != 2460749.40 ||
		len(log.Timings) != 1 || log.Timings[0].Method != "kvw" {
		t.Errorf("NightLog: %+v", log)
	}
	n.Notes, n.Date = "moved", fxDate.AddDate(0, 0, 2)
	if err := lb.UpdateNight(n); err != nil {
		t.Fatal(err)
	}
	n.Date = fxDate.AddDate(0, 0, 1)
	if err := lb.UpdateNight(n); err == nil {
		t.Errorf("moving a night onto another: no error")
	}
	if err := lb.DeleteNight(night); err != nil {
		t.Fatal(err)
	}
	c := counts(t, lb)
	if c["measurements"] != 1 || c["plans"] != 0 || c["timings"] != 1 {
		t.Errorf("after DeleteNight: %v; want its measurements and plan gone, its timing kept", c)
	}
	ts, _ := lb.TimingsOf(fxTarget)
	if len(ts) != 1 || ts[0].NightID != 0 {
		t.Errorf("the deleted night's timing: %+v, want it kept without a night", ts)
	}
}

// TestMeasurements checks measurements: exact numbers, missing values kept
// missing, one transaction for a batch, the comparison stars checked.
func TestMeasurements(t *testing.T) {
	lb, night := fixture(t)
	m := fxMeasurement(night, 2460749.4123456789)
	m.Mag, m.MagErr = 0.1+0.2, 1e-300 // numbers that print long
	m.ExposureS, m.Airmass, m.HJD = math.NaN(), math.NaN(), math.NaN()
	m.Visual = "C1 2 V 3 C2"
	ids, err := lb.AddMeasurements([]Measurement{m})
	if err != nil {
		t.Fatal(err)
	}
	got, err := lb.Measurement(ids[0])
	if err != nil {
		t.Fatal(err)
	}
	m.ID = ids[0]
	if !sameMeasurement(got, m) {
		t.Errorf("Measurement: got %+v, want %+v", got, m)
	}
	for _, tc := range []struct {
		name   string
		edit   func(*Measurement)
		phrase string
	}{
		{"unknown comparison star", func(m *Measurement) { m.Comps[0].Label = "C9" }, `"C9" is not among`},
		{"unknown target", func(m *Measurement) { m.Target = "Nobody" }, "not found"},
		{"unknown night", func(m *Measurement) { m.NightID = 999 }, "night 999"},
		{"no value", func(m *Measurement) {
			m.InstMag, m.InstErr, m.Mag, m.MagErr = math.NaN(), math.NaN(), math.NaN(), math.NaN()
		}, "no value"},
		{"time not a full JD", func(m *Measurement) { m.JDUTC = 60749.5 }, "full Julian date"},
		{"air mass below 1", func(m *Measurement) { m.Airmass = 0.9 }, "air mass"},
		{"negative error", func(m *Measurement) { m.MagErr = -0.01 }, "magnitude error"},
		{"infinite magnitude", func(m *Measurement) { m.InstMag = math.Inf(1) }, "instrumental magnitude"},
		{"zero exposure", func(m *Measurement) { m.ExposureS = 0 }, "exposure"},
		{"comparison twice", func(m *Measurement) { m.Checks[0].Label = "c1" }, "appears twice"},
		{"not UTF-8", func(m *Measurement) { m.Notes = "\xff" }, "UTF-8"},
	} {
		bad := fxMeasurement(night, 2460749.5)
		bad.Comps = append([]RawMag(nil), bad.Comps...)
		bad.Checks = append([]RawMag(nil), bad.Checks...)
		tc.edit(&bad)
		before := counts(t, lb)
		// A good measurement first: the batch is stored whole or not at all.
		if _, err := lb.AddMeasurements([]Measurement{fxMeasurement(night, 2460749.6), bad}); err == nil ||
			!strings.Contains(err.Error(), tc.phrase) || !strings.Contains(err.Error(), "measurement 2") {
			t.Errorf("%s: got %v, want an error naming measurement 2 and saying %q", tc.name, err, tc.phrase)
		}
		if after := counts(t, lb); after["measurements"] != before["measurements"] || after["raw_comps"] != before["raw_comps"] {
			t.Errorf("%s: a failed batch stored rows", tc.name)
		}
	}
	got.Comps, got.Checks, got.Visual, got.Mag = got.Comps[:1], nil, "", 11.25
	if err := lb.UpdateMeasurement(got); err != nil {
		t.Fatal(err)
	}
	if again, _ := lb.Measurement(got.ID); !sameMeasurement(again, got) {
		t.Errorf("after UpdateMeasurement: got %+v, want %+v", again, got)
	}
	second, err := lb.AddNight(Night{Site: fxSite, Date: fxDate.AddDate(0, 0, 1)})
	if err != nil {
		t.Fatal(err)
	}
	if _, err := lb.AddMeasurements([]Measurement{fxMeasurement(second, 2460750.5), fxMeasurement(second, 2460750.4)}); err != nil {
		t.Fatal(err)
	}
	all, _ := lb.MeasurementsOf(fxTarget, 0)
	one, _ := lb.MeasurementsOf(fxTarget, second)
	if len(all) != 3 || len(one) != 2 || one[0].JDUTC != 2460750.4 || all[0].ID != got.ID {
		t.Errorf("MeasurementsOf: all %d (first %d), night %d: %d (first at %v)", len(all), all[0].ID, second, len(one), one[0].JDUTC)
	}
	if _, err := lb.MeasurementsOf(fxTarget, 12345); !errors.Is(err, ErrNotFound) {
		t.Errorf("MeasurementsOf an unknown night: got %v, want ErrNotFound", err)
	}
	if err := lb.DeleteMeasurement(got.ID); err != nil {
		t.Fatal(err)
	}
	if _, err := lb.Measurement(got.ID); !errors.Is(err, ErrNotFound) {
		t.Errorf("after DeleteMeasurement: got %v", err)
	}
	if c := counts(t, lb); c["raw_comps"] != 2*3 {
		t.Errorf("raw comparison rows after the delete: %d, want 6", c["raw_comps"])
	}
}

// sameMeasurement compares two measurements, NaN equal to NaN.
func sameMeasurement(a, b Measurement) bool {
	eq := func(x, y float64) bool { return x == y || math.IsNaN(x) && math.IsNaN(y) }
	if a.ID != b.ID || a.Target != b.Target || a.NightID != b.NightID || a.Filter != b.Filter || a.Visual != b.Visual ||
		a.Notes != b.Notes || a.ImportID != b.ImportID || len(a.Comps) != len(b.Comps) || len(a.Checks) != len(b.Checks) {
		return false
	}
	for _, p := range [][2]float64{{a.JDUTC, b.JDUTC}, {a.ExposureS, b.ExposureS}, {a.Airmass, b.Airmass}, {a.InstMag, b.InstMag},
		{a.InstErr, b.InstErr}, {a.Mag, b.Mag}, {a.MagErr, b.MagErr}, {a.HJD, b.HJD}, {a.BJDTDB, b.BJDTDB}} {
		if !eq(p[0], p[1]) {
			return false
		}
	}
	for i := range a.Comps {
		if a.Comps[i].Label != b.Comps[i].Label || !eq(a.Comps[i].InstMag, b.Comps[i].InstMag) || !eq(a.Comps[i].InstErr, b.Comps[i].InstErr) {
			return false
		}
	}
	for i := range a.Checks {
		if a.Checks[i].Label != b.Checks[i].Label || !eq(a.Checks[i].InstMag, b.Checks[i].InstMag) || !eq(a.Checks[i].InstErr, b.Checks[i].InstErr) {
			return false
		}
	}
	return true
}

// TestTimings checks timings and what a timing must say.
func TestTimings(t *testing.T) {
	lb, night := fixture(t)
	good := Timing{Target: fxTarget, JD: 2460749.4321987, Scale: ephem.HJD, SigmaDays: 0.00035, Kind: observe.Min,
		Secondary: true, Origin: Published, Method: "kvw", Source: "Some Journal 1, 2 (2020)", Notes: "typed in"}
	id, err := lb.AddTiming(good)
	if err != nil {
		t.Fatal(err)
	}
	got, err := lb.Timing(id)
	good.ID = id
	if err != nil || got != good {
		t.Errorf("Timing: got %+v, %v; want %+v", got, err, good)
	}
	for _, tc := range []struct {
		name   string
		edit   func(*Timing)
		phrase string
	}{
		{"published without source", func(x *Timing) { x.Source = " " }, "needs its source"},
		{"published with a night", func(x *Timing) { x.NightID = night }, "no night"},
		{"secondary maximum", func(x *Timing) { x.Kind = observe.Max }, "secondary extremum must be a minimum"},
		{"no time scale", func(x *Timing) { x.Scale = 0 }, "time scale"},
		{"no kind", func(x *Timing) { x.Kind = 0 }, "kind"},
		{"no origin", func(x *Timing) { x.Origin = 0 }, "origin"},
		{"negative uncertainty", func(x *Timing) { x.SigmaDays = -1 }, "uncertainty"},
		{"a modified JD", func(x *Timing) { x.JD = 60749.43 }, "full Julian date"},
		{"unknown target", func(x *Timing) { x.Target = "Nobody" }, "not found"},
		{"unknown night", func(x *Timing) { x.Origin, x.NightID = Own, 77 }, "night 77"},
	} {
		bad := good
		bad.ID = 0
		tc.edit(&bad)
		if _, err := lb.AddTiming(bad); err == nil || !strings.Contains(err.Error(), tc.phrase) {
			t.Errorf("%s: got %v, want an error saying %q", tc.name, err, tc.phrase)
		}
	}
	own := Timing{Target: fxTarget, JD: 2460749.40, Scale: ephem.BJDTDB, SigmaDays: math.NaN(), Kind: observe.Min, Origin: Own, NightID: night}
	id2, err := lb.AddTiming(own)
	if err != nil {
		t.Fatal(err)
	}
	ts, err := lb.TimingsOf(fxTarget)
	if err != nil || len(ts) != 2 || ts[0].ID != id2 || !math.IsNaN(ts[0].SigmaDays) || ts[1].ID != id {
		t.Errorf("TimingsOf: %+v, %v; want the own one (no uncertainty) first", ts, err)
	}
	own.ID, own.Method = id2, "poly"
	if err := lb.UpdateTiming(own); err != nil {
		t.Fatal(err)
	}
	if x, _ := lb.Timing(id2); x.Method != "poly" {
		t.Errorf("after UpdateTiming: %+v", x)
	}
	if err := lb.DeleteTiming(id); err != nil {
		t.Fatal(err)
	}
	if err := lb.DeleteTiming(id); !errors.Is(err, ErrNotFound) {
		t.Errorf("deleting twice: got %v, want ErrNotFound", err)
	}
}

// TestConcurrentWriters checks that two programs writing to one logbook at
// once both succeed: each waits for the other's transaction (busy timeout).
func TestConcurrentWriters(t *testing.T) {
	lb, night := fixture(t)
	other := openT(t, lb.Path())
	var wg sync.WaitGroup
	errs := make(chan error, 2)
	for i, w := range []*Logbook{lb, other} {
		wg.Add(1)
		go func(i int, w *Logbook) {
			defer wg.Done()
			for k := 0; k < 30; k++ {
				m := fxMeasurement(night, 2460749.4+float64(i)*0.1+float64(k)*0.001)
				if _, err := w.AddMeasurements([]Measurement{m}); err != nil {
					errs <- err
					return
				}
			}
		}(i, w)
	}
	wg.Wait()
	close(errs)
	for err := range errs {
		t.Error(err)
	}
	if ms, _ := lb.MeasurementsOf(fxTarget, night); len(ms) != 60 {
		t.Errorf("got %d measurements, want 60", len(ms))
	}
}

// TestPragmas checks the settings every connection runs with.
func TestPragmas(t *testing.T) {
	lb := emptyT(t)
	for _, tc := range []struct {
		pragma, want string
	}{
		{"foreign_keys", "1"}, {"journal_mode", "wal"}, {"busy_timeout", "10000"}, {"synchronous", "2"},
		{"application_id", "1447513154"}, // 0x56474C42, "VGLB"
	} {
		var got string
		if err := lb.db.QueryRow("PRAGMA " + tc.pragma).Scan(&got); err != nil || got != tc.want {
			t.Errorf("PRAGMA %s: got %q, %v; want %q", tc.pragma, got, err, tc.want)
		}
	}
	// Foreign keys are enforced: a measurement of no night is refused by
	// the file itself.
	if _, err := lb.db.Exec("INSERT INTO measurements(night_id, target_id, jd_utc, mag) VALUES (5, 5, 2460000.5, 10)"); err == nil {
		t.Errorf("a row pointing nowhere was stored")
	}
	// STRICT tables refuse text in a number column.
	if _, err := lb.db.Exec("INSERT INTO sites(name, lat_deg, lon_deg, elev_m, time_zone, min_alt_deg) VALUES ('x', 'north', 0, 0, 'UTC', 0)"); err == nil {
		t.Errorf("text stored in a REAL column")
	}
}
