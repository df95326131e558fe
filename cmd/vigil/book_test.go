package main

import (
	"bytes"
	"database/sql"
	"fmt"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"sync"
	"testing"
	"time"

	"example.org/vigil/internal/demo"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// TestMain points the default logbook at a temporary directory, so that no
// test reads or makes the user's own logbook: a command that names a site
// without --logbook creates the demo there, as it would on a first run.
func TestMain(m *testing.M) {
	if os.Getenv(asMainEnv) == "1" {
		// Run as the vigil command itself (TestNoStartupNoise).
		os.Exit(run(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
	}
	dir, err := os.MkdirTemp("", "vigil-cmd-test-")
	if err != nil {
		fmt.Fprintln(os.Stderr, "vigil tests: making a temporary directory:", err)
		os.Exit(1)
	}
	testDir = dir
	defaultLogbookPath = func() (string, error) { return filepath.Join(dir, "vigil", "vigil.db"), nil }
	code := m.Run()
	os.RemoveAll(dir)
	os.Exit(code)
}

// testDir is the temporary directory of the whole test run.
var testDir string

// sharedDemoPath is a demo logbook made once for the tests that only read
// it; sharedDemoErr is what making it returned.
var (
	sharedDemoOnce sync.Once
	sharedDemoPath string
	sharedDemoErr  error
)

// sharedDemo returns the path of a demo logbook (demo.OpenOrCreate) that the
// tests only read.
func sharedDemo(t *testing.T) string {
	t.Helper()
	sharedDemoOnce.Do(func() {
		sharedDemoPath = filepath.Join(testDir, "shared", "demo.db")
		var lb *logbook.Logbook
		if lb, _, sharedDemoErr = demo.OpenOrCreate(sharedDemoPath); sharedDemoErr == nil {
			sharedDemoErr = lb.Close()
		}
	})
	if sharedDemoErr != nil {
		t.Fatalf("making the demo logbook: %v", sharedDemoErr)
	}
	return sharedDemoPath
}

// freshDemo returns the path of a new demo logbook of the test's own.
func freshDemo(t *testing.T) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), "demo.db")
	lb, created, err := demo.OpenOrCreate(path)
	if err != nil || !created {
		t.Fatalf("demo.OpenOrCreate(%s): created %v, %v", path, created, err)
	}
	if err := lb.Close(); err != nil {
		t.Fatal(err)
	}
	return path
}

// openBook opens a logbook for the test to read, closed at its end.
func openBook(t *testing.T, path string) *logbook.Logbook {
	t.Helper()
	lb, err := logbook.Open(path)
	if err != nil {
		t.Fatalf("opening %s: %v", path, err)
	}
	t.Cleanup(func() { lb.Close() })
	return lb
}

// withDefaultLogbook points the default logbook at path for one test.
func withDefaultLogbook(t *testing.T, path string) {
	t.Helper()
	old := defaultLogbookPath
	defaultLogbookPath = func() (string, error) { return path, nil }
	t.Cleanup(func() { defaultLogbookPath = old })
}

// wantFailure checks the contract of a failed run: exit 2, one line on
// stderr holding every phrase, nothing on stdout.
func wantFailure(t *testing.T, args []string, r result, phrases ...string) {
	t.Helper()
	if r.code != exitUsage {
		t.Errorf("vigil %s: exit %d, want %d (stderr %q)", strings.Join(args, " "), r.code, exitUsage, r.stderr)
	}
	if r.stdout != "" {
		t.Errorf("vigil %s: stdout = %q, want nothing on a failed run", strings.Join(args, " "), r.stdout)
	}
	if strings.Count(r.stderr, "\n") != 1 || !strings.HasSuffix(r.stderr, "\n") {
		t.Errorf("vigil %s: stderr = %q, want exactly one line", strings.Join(args, " "), r.stderr)
	}
	for _, p := range phrases {
		if !strings.Contains(r.stderr, p) {
			t.Errorf("vigil %s: stderr = %q, want it to contain %q", strings.Join(args, " "), r.stderr, p)
		}
	}
}

// mustRun runs vigil and requires success.
func mustRun(t *testing.T, args ...string) string {
	t.Helper()
	r := vigil(args...)
	if r.code != exitOK || r.stderr != "" {
		t.Fatalf("vigil %s: exit %d, stderr %q", strings.Join(args, " "), r.code, r.stderr)
	}
	return r.stdout
}

// siteCoords returns --lat, --lon and --elev of a site, exactly.
func siteCoords(s observe.Site) []string {
	return []string{"--lat", fmtRef(s.LatDeg), "--lon", fmtRef(s.LonDeg), "--elev", fmtRef(s.ElevM)}
}

// TestSiteFromLogbook checks --site against the logbook: every way of naming
// the demo's observatory (the exact name, any case, a unique part, the alias
// with and without --logbook, the default logbook) gives the same sky as
// --site demo and as the site's own coordinates; another site of the logbook
// gives its coordinates and its time zone.
func TestSiteFromLogbook(t *testing.T) {
	path := sharedDemo(t)
	lb := openBook(t, path)
	sites, err := lb.Sites()
	if err != nil || len(sites) != 2 {
		t.Fatalf("the demo logbook's sites: %v, %v; want two", sites, err)
	}
	ash, err := lb.Site(demo.SiteName)
	if err != nil {
		t.Fatal(err)
	}
	other := sites[0]
	if other.Name == demo.SiteName {
		other = sites[1]
	}
	sky := []string{"sky", "--ra", "05:55:10.3", "--dec", "+07:24:25", "--at", "2025-12-01T22:00:00Z", "--json"}
	byAlias := mustRun(t, append(sky, "--site", "demo")...)
	if d := diffJSONText(t, byAlias, mustRun(t, append(sky, siteCoords(ash)...)...)); len(d) > 0 {
		t.Errorf("--site demo differs from the logbook's coordinates of %q: %v", demo.SiteName, d)
	}
	for _, tc := range []struct {
		name string
		site []string // --site and --logbook
		want string   // JSON of the same sky
	}{
		{"exact name", []string{"--site", demo.SiteName, "--logbook", path}, byAlias},
		{"any case", []string{"--site", strings.ToUpper(demo.SiteName), "--logbook", path}, byAlias},
		{"unique part", []string{"--site", "ashgrove", "--logbook", path}, byAlias},
		{"alias with --logbook", []string{"--site", "Demo", "--logbook", path}, byAlias},
		{"exact name, default logbook", []string{"--site", demo.SiteName}, byAlias},
		{"the other site by a part", []string{"--site", strings.Fields(other.Name)[0], "--logbook", path}, mustRun(t, append(sky, siteCoords(other)...)...)},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := mustRun(t, append(sky, tc.site...)...)
			for _, d := range diffJSONText(t, got, tc.want) {
				t.Errorf("%v: %s", tc.site, d)
			}
		})
	}
	// The site brings its time zone to the tables.
	out := mustRun(t, "night", "--site", other.Name, "--logbook", path, "--date", "2026-12-01")
	for _, want := range []string{other.Name, other.TimeZone} {
		if !strings.Contains(out, want) {
			t.Errorf("night at %q lacks %q:\n%s", other.Name, want, out)
		}
	}
	// Every command with site flags takes --site from the logbook.
	for _, args := range [][]string{
		{"predict", "--ra", "22:29:10.26502", "--dec", "+58:24:54.7139", "--epoch", "2436075.445", "--period", "5.366341",
			"--from", "2026-11-01T00:00:00Z", "--to", "2026-12-01T00:00:00Z", "--json"},
		append(append([]string(nil), reduceEnsemble[:len(reduceEnsemble)-7]...), "--json"),
		{"plan", "--targets", planTargets, "--date", "2026-12-01", "--json"},
		{"chart", "--targets", planTargets, "--date", "2026-12-01", "--out", filepath.Join(t.TempDir(), "c.svg"), "--json"},
	} {
		byName := mustRun(t, append(args, "--site", "ashgrove", "--logbook", path)...)
		if args[0] == "chart" {
			continue // the answer names the file only
		}
		for _, d := range diffJSONText(t, byName, mustRun(t, append(args, "--site", "demo")...)) {
			t.Errorf("vigil %s: --site ashgrove --logbook vs --site demo: %s", args[0], d)
		}
	}
}

// TestSiteErrors checks the messages about --site: an unknown name lists
// the logbook's sites, a part of several names lists those, and --site
// excludes --lat/--lon.
func TestSiteErrors(t *testing.T) {
	path := sharedDemo(t)
	lb := openBook(t, path)
	sites, err := lb.Sites()
	if err != nil {
		t.Fatal(err)
	}
	all := []string{"--site", strconv.Quote(path)}
	for _, s := range sites {
		all = append(all, strconv.Quote(s.Name))
	}
	sky := func(extra ...string) []string {
		return append([]string{"sky", "--ra", "5.5", "--dec", "-5", "--at", "2026-12-01T22:00:00Z", "--logbook", path}, extra...)
	}
	for _, tc := range []struct {
		name string
		args []string
		want []string
	}{
		{"unknown site", sky("--site", "Ridge Top"), append([]string{`no site named "Ridge Top"`}, all...)},
		{"part of several names", sky("--site", "(demo)"), append([]string{`"(demo)" is part of the names of 2 sites`, "whole name"}, all...)},
		{"empty name", sky("--site", " "), []string{"--site", "empty value"}},
		{"site and coordinates", sky("--site", "ashgrove", "--lon", "10"), []string{"--site", "--lon", "not both"}},
		{"unknown site, log", []string{"log", "--logbook", path, "--site", "Ridge Top", "--date", "2026-12-01", "--out", filepath.Join(t.TempDir(), "x.txt")}, all},
		{"--tz with a named site", []string{"plan", "--logbook", path, "--site", "ashgrove", "--tz", "UTC", "--date", "2026-12-01"}, []string{"--tz", "--site", "not both"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			wantFailure(t, tc.args, vigil(tc.args...), tc.want...)
		})
	}
}

// TestLogbookOnlyWhenNeeded checks that the logbook is opened only by a step
// that needs it: runs with --lat/--lon, and --site demo without --logbook,
// open and make no file; --site NAME on a new path makes the demo logbook
// there (demo.OpenOrCreate), with or without --logbook.
func TestLogbookOnlyWhenNeeded(t *testing.T) {
	dir := t.TempDir()
	def := filepath.Join(dir, "config", "vigil", "vigil.db")
	withDefaultLogbook(t, def)
	named := filepath.Join(dir, "named.db")
	here := []string{"--lat", "50", "--lon", "10", "--logbook", named}
	chartOut := filepath.Join(dir, "chart.svg")
	for _, args := range [][]string{
		append([]string{"sky", "--ra", "5.5", "--dec", "-5", "--at", "2026-12-01T22:00:00Z"}, here...),
		append([]string{"night", "--date", "2026-12-01"}, here...),
		append([]string{"predict", "--ra", "5.5", "--dec", "-5", "--epoch", "2436075.445", "--period", "5.366341",
			"--from", "2026-11-01T00:00:00Z", "--to", "2026-12-01T00:00:00Z"}, here...),
		append(append([]string(nil), reduceEnsemble...), "--logbook", named),
		append(append([]string(nil), reduceEnsemble[:len(reduceEnsemble)-7]...), "--logbook", named), // no site at all
		append([]string{"plan", "--targets", planTargets, "--date", "2026-12-01"}, here...),
		append([]string{"chart", "--targets", planTargets, "--date", "2026-12-01", "--out", chartOut}, here...),
		{"sky", "--site", "demo", "--ra", "5.5", "--dec", "-5", "--at", "2026-12-01T22:00:00Z"},
		{"plan", "--targets", planTargets, "--site", "demo", "--date", "2026-12-01"},
		{"chart", "--targets", planTargets, "--site", "demo", "--date", "2026-12-01", "--out", chartOut},
	} {
		mustRun(t, args...)
		for _, p := range []string{def, named} {
			if _, err := os.Stat(p); err == nil {
				t.Fatalf("vigil %s made %s: want no logbook for this run", strings.Join(args, " "), p)
			}
		}
	}
	// A run that made the logbook and then failed leaves nothing behind.
	deep := filepath.Join(dir, "made", "for", "it", "vigil.db")
	args := []string{"sky", "--site", "Ridge Top", "--logbook", deep, "--ra", "5.5", "--dec", "-5", "--at", "2026-12-01T22:00:00Z"}
	wantFailure(t, args, vigil(args...), "--site", `"Ridge Top"`, demo.SiteName)
	if _, err := os.Stat(filepath.Join(dir, "made")); err == nil {
		t.Errorf("the failed run left %s", filepath.Join(dir, "made"))
	}
	for _, tc := range []struct {
		name string
		args []string
		path string
	}{
		{"--site NAME --logbook NEW", []string{"sky", "--site", demo.SiteName, "--logbook", named, "--ra", "5.5", "--dec", "-5", "--at", "2026-12-01T22:00:00Z"}, named},
		{"--site NAME, no default logbook yet", []string{"night", "--site", "ashgrove", "--date", "2026-12-01"}, def},
	} {
		t.Run(tc.name, func(t *testing.T) {
			mustRun(t, tc.args...)
			lb := openBook(t, tc.path)
			isDemo, err := lb.IsDemo()
			if err != nil || !isDemo {
				t.Errorf("%s: IsDemo = %v, %v; want the demo scenario", tc.path, isDemo, err)
			}
			if _, err := lb.Site(demo.SiteName); err != nil {
				t.Errorf("%s: site %q: %v", tc.path, demo.SiteName, err)
			}
		})
	}
}

// TestLogbookRefused checks that every command refuses, with a message
// naming --logbook and without changing it, a file that is no logbook (text,
// empty), one written by a newer vigil, a directory, and a path where no
// file can be made.
func TestLogbookRefused(t *testing.T) {
	dir := t.TempDir()
	write := func(name, text string) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	notes := write("notes.txt", "clear skies, seeing 3\"\n")
	empty := write("empty.db", "")
	newer := filepath.Join(dir, "newer.db")
	lb, err := logbook.Create(newer)
	if err != nil {
		t.Fatal(err)
	}
	lb.Close()
	db, err := sql.Open("sqlite", newer)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := db.Exec("INSERT INTO schema_version(version, what, applied_utc) VALUES (99, 'from the future', '2030-01-01T00:00:00Z')"); err != nil {
		t.Fatal(err)
	}
	db.Close()
	out := t.TempDir()
	for _, bad := range []struct {
		name, path string
		want       string
	}{
		{"text file", notes, "is not a vigil logbook"},
		{"empty file", empty, "is not a vigil logbook"},
		{"newer schema", newer, "newer version of vigil"},
		{"directory", dir, "cannot open or create"},
		{"under a file", filepath.Join(notes, "vigil.db"), "cannot open or create"},
	} {
		before, _ := os.ReadFile(bad.path)
		for _, args := range [][]string{
			{"sky", "--site", "ashgrove", "--ra", "5.5", "--dec", "-5", "--at", "2026-12-01T22:00:00Z"},
			{"sky", "--site", "demo", "--ra", "5.5", "--dec", "-5", "--at", "2026-12-01T22:00:00Z"},
			{"plan", "--site", "demo", "--date", "2026-12-01"},
			{"log", "--date", "2026-12-01", "--out", filepath.Join(out, "night.pdf")},
			{"logbook", "info"},
			{"logbook", "export", "--dir", filepath.Join(out, "export")},
			{"logbook", "import", "--dir", "testdata"},
			{"logbook", "backup", "--out", filepath.Join(out, "backup.json")},
		} {
			a := append(args, "--logbook", bad.path)
			t.Run(bad.name+"/"+strings.Join(args[:2], " "), func(t *testing.T) {
				wantFailure(t, a, vigil(a...), "--logbook", strconv.Quote(bad.path), bad.want)
				after, _ := os.ReadFile(bad.path)
				if !bytes.Equal(before, after) {
					t.Errorf("%s changed", bad.path)
				}
				if entries, _ := os.ReadDir(out); len(entries) > 0 {
					t.Errorf("the failed run wrote %s", entries[0].Name())
				}
			})
		}
	}
}

// TestTopLevelLogbook checks vigil tonight --logbook PATH: tonight at the
// logbook's first site, as vigil night reports it; and the errors of the
// top-level vigil --logbook PATH, which opens the window.
func TestTopLevelLogbook(t *testing.T) {
	withClock(t, time.Date(2026, 12, 1, 21, 0, 0, 0, time.UTC))
	path := sharedDemo(t)
	lb := openBook(t, path)
	sites, err := lb.Sites()
	if err != nil || len(sites) < 2 {
		t.Fatalf("sites %v, %v", sites, err)
	}
	m := mustJSON(t, "night", "--site", sites[0].Name, "--logbook", path, "--date", "2026-12-01", "--json")
	sunset, ok := instant(t, m, "sunset")
	if !ok {
		t.Fatal("no sunset")
	}
	for _, args := range [][]string{{"tonight", "--logbook", path}, {"tonight", "--logbook=" + path}, {"tonight", "-logbook", path}} {
		out := mustRun(t, args...)
		for _, want := range []string{"Tonight at " + sites[0].Name, "Night of Tuesday 1 December 2026", "the first of the logbook's 2 sites",
			path, sunset.Round(time.Second).Format("2006-01-02 15:04:05") + " UTC"} {
			if !strings.Contains(out, want) {
				t.Errorf("vigil %s lacks %q:\n%s", strings.Join(args, " "), want, out)
			}
		}
	}
	notes := writeTemp(t, "notes.txt", "not a logbook\n")
	for _, tc := range []struct {
		args []string
		want []string
	}{
		{[]string{"--logbook"}, []string{"--logbook", "needs PATH"}},
		{[]string{"--logbook", ""}, []string{"--logbook", "empty"}},
		{[]string{"--logbook", path, "sky"}, []string{"--logbook", `"sky"`, "after the command"}},
		{[]string{"tonight", "--logbook", notes}, []string{"--logbook", strconv.Quote(notes), "not a vigil logbook"}},
	} {
		wantFailure(t, tc.args, vigil(tc.args...), tc.want...)
	}
}

// TestPlanFromLogbook checks plan and chart without --targets: the
// logbook's targets, each event at the time its current ephemeris gives
// (T0 + P·E + Q·E², ephem.Ephemeris.At), and a named site's horizon.
func TestPlanFromLogbook(t *testing.T) {
	path := sharedDemo(t)
	lb := openBook(t, path)
	targets, err := lb.Targets()
	if err != nil || len(targets) == 0 {
		t.Fatalf("targets %d, %v", len(targets), err)
	}
	m := mustJSON(t, "plan", "--site", "demo", "--logbook", path, "--date", "2026-11-05", "--nights", "3", "--json")
	if got := number(t, m, "targets"); got != float64(len(targets)) {
		t.Errorf("targets = %v, want the logbook's %d", got, len(targets))
	}
	// ephemTol: the JSON carries the ephemeris time as a float64 JD; the
	// same sum in another order differs by rounding only (1e-9 d = 86 µs).
	const ephemTol = 1e-9
	n := 0
	for _, night := range list(t, m, "nights") {
		for _, ev := range list(t, night, "events") {
			i := observe.FindTarget(targets, ev["target"].(string))
			if i < 0 {
				t.Errorf("event of %q: no such target in the logbook", ev["target"])
				continue
			}
			n++
			want := targets[i].Ephemeris.At(number(t, ev, "cycle"))
			near(t, fmt.Sprintf("%s cycle %v", ev["target"], ev["cycle"]), number(t, ev, "ephemeris_time"), want, ephemTol, "d", "current ephemeris of the logbook")
		}
	}
	if n == 0 {
		t.Error("no events in three nights of the demo's targets")
	}
	out := filepath.Join(t.TempDir(), "chart.png")
	c := mustJSON(t, "chart", "--site", "demo", "--logbook", path, "--date", "2026-11-05", "--out", out, "--json")
	if got := len(c["targets"].([]any)); got != len(targets) {
		t.Errorf("chart targets = %d, want the logbook's %d", got, len(targets))
	}
	wantFailure(t, nil, vigil("plan", "--site", "demo", "--logbook", path, "--date", "2026-11-05", "--votable-timescale", "hjd"), "--votable-timescale")
}

// TestPlanSiteHorizon checks that a named site brings its horizon profile
// and lowest altitude to the planner: an event is "behind the horizon
// profile" exactly when the star is above the lowest altitude and not above
// the profile at its azimuth (observe.Horizon.AltDeg of the demo's profile),
// and --lat/--lon of the same place know no profile.
func TestPlanSiteHorizon(t *testing.T) {
	// altTol: events within this of the profile are not judged (the
	// profile's interpolation at a rounded azimuth), degrees.
	const altTol = 1e-6
	site := demo.Site()
	args := func(extra ...string) []string {
		return append([]string{"plan", "--targets", planTargets, "--date", "2026-11-01", "--nights", "30", "--all", "--json"}, extra...)
	}
	named := mustJSON(t, args("--site", "demo")...)
	if got := number(t, object(t, named, "site"), "min_alt_deg"); got != site.MinAltDeg {
		t.Errorf("min_alt_deg = %v, want the site's %v", got, site.MinAltDeg)
	}
	behind := 0
	for _, night := range list(t, named, "nights") {
		for _, ev := range list(t, night, "events") {
			alt, az := number(t, ev, "alt_deg"), number(t, ev, "az_deg")
			profile := site.Horizon.AltDeg(az)
			if math.Abs(alt-profile) < altTol || math.Abs(alt-site.MinAltDeg) < altTol {
				continue
			}
			want := alt > site.MinAltDeg && alt < profile
			got := strings.Contains(fmt.Sprint(ev["reasons"]), "behind the horizon profile")
			if got {
				behind++
			}
			if got != want {
				t.Errorf("%s at %v: alt %.2f°, az %.1f°, profile %.2f°: behind the horizon %v, want %v", ev["target"], ev["utc"], alt, az, profile, got, want)
			}
		}
	}
	if behind == 0 {
		t.Error("no event behind the demo's horizon profile in 30 nights: the test checks nothing")
	}
	bare := mustJSON(t, args(append(siteCoords(site), "--tz", site.TimeZone)...)...)
	for _, night := range list(t, bare, "nights") {
		for _, ev := range list(t, night, "events") {
			if strings.Contains(fmt.Sprint(ev["reasons"]), "horizon profile") {
				t.Errorf("--lat/--lon: %s at %v behind a horizon profile the coordinates do not have", ev["target"], ev["utc"])
			}
		}
	}
	// --min-alt overrides the site's lowest altitude, not its profile.
	low := mustJSON(t, args("--site", "demo", "--min-alt", "10")...)
	if got := number(t, object(t, low, "site"), "min_alt_deg"); got != 10 {
		t.Errorf("--min-alt 10 with --site: min_alt_deg = %v, want 10", got)
	}
}

// asMainEnv makes the test binary run as the vigil command (see TestMain).
const asMainEnv = "VIGIL_TEST_AS_MAIN"

// TestNoStartupNoise runs the command as a separate process under the C and
// POSIX locales, where Fyne's translation package logs a locale error while
// it is initialised, and checks that a successful run writes nothing on
// stderr (internal/quietlog silences it).
func TestNoStartupNoise(t *testing.T) {
	for _, locale := range []string{"C", "C.UTF-8", "POSIX"} {
		cmd := exec.Command(os.Args[0], "distance", "--period", "5.366341", "--mean-mag", "3.94", "--json")
		cmd.Env = append(os.Environ(), asMainEnv+"=1", "LANG="+locale, "LC_ALL=", "LANGUAGE=")
		var stdout, stderr bytes.Buffer
		cmd.Stdout, cmd.Stderr = &stdout, &stderr
		if err := cmd.Run(); err != nil {
			t.Fatalf("LANG=%s: %v, stderr %q", locale, err, stderr.String())
		}
		if stderr.Len() != 0 {
			t.Errorf("LANG=%s: a successful run wrote on stderr: %q", locale, stderr.String())
		}
		if !strings.Contains(stdout.String(), `"distance_pc"`) {
			t.Errorf("LANG=%s: stdout %q lacks the answer", locale, stdout.String())
		}
	}
}
