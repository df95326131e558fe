package main

import (
	"bytes"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"example.org/vigil/app/report"
	"example.org/vigil/ephem"
	"example.org/vigil/internal/demo"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// recordedNight returns the latest night of the demo's main site whose
// record holds reduced measurements and a timing.
func recordedNight(t *testing.T, lb *logbook.Logbook) logbook.NightLog {
	t.Helper()
	nights, err := lb.Nights(demo.SiteName)
	if err != nil {
		t.Fatal(err)
	}
	for i := len(nights) - 1; i >= 0; i-- {
		nl, err := lb.NightLog(demo.SiteName, nights[i].Date)
		if err != nil {
			t.Fatal(err)
		}
		if len(nl.Measurements) > 0 && len(nl.Timings) > 0 {
			return nl
		}
	}
	t.Fatal("no night of the demo with measurements and timings")
	return logbook.NightLog{}
}

// reduced counts the measurements with a reduced magnitude.
func reduced(ms []logbook.Measurement) int {
	n := 0
	for _, m := range ms {
		if !math.IsNaN(m.Mag) {
			n++
		}
	}
	return n
}

// TestLogWrites checks vigil log on the demo logbook: a PDF (A4 or US
// Letter, ISO 216 and ANSI page sizes in points of 1/72 in) and a text file
// naming the site and the night; the planned extrema are those vigil plan
// finds under the same (default) constraints; the record's observer,
// measurements and timings are those the logbook holds.
func TestLogWrites(t *testing.T) {
	path := sharedDemo(t)
	lb := openBook(t, path)
	nl := recordedNight(t, lb)
	date := nl.Night.Date.Format(time.DateOnly)
	targets, err := lb.Targets()
	if err != nil {
		t.Fatal(err)
	}
	plan := mustJSON(t, "plan", "--site", "demo", "--logbook", path, "--date", date, "--json")
	events := number(t, list(t, plan, "nights")[0], "n")
	dir := t.TempDir()
	for _, tc := range []struct {
		name, out string
		extra     []string
		format    string
		start     string // the file's first bytes
		contains  []string
	}{
		{"PDF, A4", "night.pdf", nil, "pdf", "%PDF-", []string{"/MediaBox [0 0 595.28 841.89]"}},
		{"PDF, US Letter", "night-letter.PDF", []string{"--paper", "letter"}, "pdf", "%PDF-", []string{"/MediaBox [0 0 612.00 792.00]"}},
		{"text", "night.txt", nil, "txt", "Observing log: " + demo.SiteName, []string{
			"night of " + nl.Night.Date.Format("Mon 2006-01-02"), nl.Night.Observer, nl.Timings[0].Target, "Measurements", "Timings of extrema"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			out := filepath.Join(dir, tc.out)
			m := mustJSON(t, append([]string{"log", "--logbook", path, "--date", date, "--out", out, "--json"}, tc.extra...)...)
			b, err := os.ReadFile(out)
			if err != nil {
				t.Fatal(err)
			}
			if !bytes.HasPrefix(b, []byte(tc.start)) {
				t.Errorf("%s starts %q, want %q", tc.out, b[:min(len(b), 40)], tc.start)
			}
			for _, want := range tc.contains {
				if !bytes.Contains(b, []byte(want)) {
					t.Errorf("%s lacks %q", tc.out, want)
				}
			}
			for key, want := range map[string]any{
				"out": out, "format": tc.format, "logbook": path, "logbook_created": false, "site": demo.SiteName,
				"site_choice": "first", "date": date, "night_recorded": true, "observer": nl.Night.Observer, "site_in_logbook": true,
				"targets": float64(len(targets)), "events": events, "measurements": float64(reduced(nl.Measurements)),
				"unreduced": float64(len(nl.Measurements) - reduced(nl.Measurements)), "timings": float64(len(nl.Timings)),
			} {
				if m[key] != want {
					t.Errorf("%s = %v, want %v", key, m[key], want)
				}
			}
		})
	}
	// The summary for people says which site and what was written.
	out := filepath.Join(dir, "summary.txt")
	s := mustRun(t, "log", "--logbook", path, "--date", date, "--out", out)
	for _, want := range []string{out, demo.SiteName, "the first of the logbook's 2 sites", nl.Night.Date.Format("Monday 2 January 2006"), nl.Night.Observer} {
		if !strings.Contains(s, want) {
			t.Errorf("summary lacks %q:\n%s", want, s)
		}
	}
}

// TestLogSites checks the site of vigil log: --site, the only site of a
// logbook, the demo site by its alias when the logbook no longer holds it,
// and "tonight" at the site's own zone.
func TestLogSites(t *testing.T) {
	path := sharedDemo(t)
	lb := openBook(t, path)
	sites, err := lb.Sites()
	if err != nil {
		t.Fatal(err)
	}
	other := sites[1].Name
	one := filepath.Join(t.TempDir(), "one.db")
	ob, err := logbook.Create(one)
	if err != nil {
		t.Fatal(err)
	}
	yard, err := observe.NewSite("Oak Yard", 50, 10, 100, "Europe/Berlin", 15, nil) // invented
	if err != nil {
		t.Fatal(err)
	}
	if err := ob.AddSite(yard); err != nil {
		t.Fatal(err)
	}
	ob.Close()
	withClock(t, time.Date(2026, 12, 2, 3, 0, 0, 0, time.UTC)) // 04:00 in Berlin: the night of 1 December
	dir := t.TempDir()
	for _, tc := range []struct {
		name string
		args []string
		want map[string]any
	}{
		{"--site by a part", []string{"--logbook", path, "--site", strings.Fields(other)[0], "--date", "2026-12-01"},
			map[string]any{"site": other, "site_choice": "site", "night_recorded": false, "site_in_logbook": true}},
		{"the only site, no targets, tonight", []string{"--logbook", one, "--date", "tonight"},
			map[string]any{"site": "Oak Yard", "site_choice": "only", "date": "2026-12-01", "targets": 0.0, "events": 0.0, "site_in_logbook": true}},
		{"the demo site, not in the logbook", []string{"--logbook", one, "--site", "demo", "--date", "2026-12-01"},
			map[string]any{"site": demo.SiteName, "site_choice": "site", "night_recorded": false, "site_in_logbook": false}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			m := mustJSON(t, append([]string{"log", "--out", filepath.Join(dir, "log.txt"), "--json"}, tc.args...)...)
			for key, want := range tc.want {
				if m[key] != want {
					t.Errorf("%s = %v, want %v", key, m[key], want)
				}
			}
		})
	}
}

// TestLogBadInput checks that vigil log refuses a bad --out, --paper or
// --date with a message naming the flag, writes no file, and (for the
// output flags, checked first) makes no logbook either.
func TestLogBadInput(t *testing.T) {
	dir := t.TempDir()
	newBook := filepath.Join(dir, "new.db")
	outDir := filepath.Join(dir, "out")
	if err := os.Mkdir(outDir, 0o755); err != nil {
		t.Fatal(err)
	}
	pdfDir := filepath.Join(dir, "folder.pdf")
	if err := os.Mkdir(pdfDir, 0o755); err != nil {
		t.Fatal(err)
	}
	log := func(out string, extra ...string) []string {
		return append([]string{"log", "--logbook", newBook, "--date", "2026-12-01", "--out", filepath.Join(outDir, out)}, extra...)
	}
	for _, tc := range []struct {
		name string
		args []string
		want []string
	}{
		{"extension .doc", log("night.doc"), []string{"--out", "night.doc", ".pdf", ".txt"}},
		{"no extension", log("night"), []string{"--out", `night"`, ".pdf"}},
		{"only an extension", log(".pdf"), []string{"--out", "file name before the extension"}},
		{"missing directory", log(filepath.Join("nowhere", "n.pdf")), []string{"--out", "does not exist"}},
		{"a directory", []string{"log", "--logbook", newBook, "--date", "2026-12-01", "--out", pdfDir}, []string{"--out", "is a directory"}},
		{"bad paper", log("n.pdf", "--paper", "legal"), []string{"--paper", `"legal"`, "a4 or letter"}},
		{"paper for text", log("n.txt", "--paper", "a4"), []string{"--paper", "PDF only"}},
		{"missing --out", []string{"log", "--logbook", newBook, "--date", "2026-12-01"}, []string{"--out", "missing"}},
		{"empty --site", log("n.pdf", "--site", ""), []string{"--site", "empty"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			wantFailure(t, tc.args, vigil(tc.args...), tc.want...)
			if entries, _ := os.ReadDir(outDir); len(entries) > 0 {
				t.Errorf("a failed run wrote %s", entries[0].Name())
			}
			if _, err := os.Stat(newBook); err == nil {
				t.Errorf("a bad output flag made the logbook %s", newBook)
			}
		})
	}
	// A bad date is found after the site, which needs the logbook.
	path := sharedDemo(t)
	for _, tc := range []struct {
		date string
		want []string
	}{
		{"2026-02-30", []string{"--date", `"2026-02-30"`}},
		{"yesterday", []string{"--date", `"yesterday"`}},
	} {
		args := []string{"log", "--logbook", path, "--date", tc.date, "--out", filepath.Join(outDir, "n.pdf")}
		wantFailure(t, args, vigil(args...), tc.want...)
		if entries, _ := os.ReadDir(outDir); len(entries) > 0 {
			t.Errorf("a failed run wrote %s", entries[0].Name())
		}
	}
}

// TestTimingOC checks the O−C that vigil log gives each timing against
// reduce.OC (Sterken 2005, ASP Conf. Ser. 335, 3) on the same timings and
// ephemeris: the demo's timings of every target on its ephemeris's scale and
// kind; and NaN for a timing on another scale or of another kind.
func TestTimingOC(t *testing.T) {
	// ocTol: the two compute t − T(E) in a different order; float64 JDs
	// near 2.46e6 resolve about 5e-10 d.
	const ocTol = 1e-9 // days
	lb := openBook(t, sharedDemo(t))
	targets, err := lb.Targets()
	if err != nil {
		t.Fatal(err)
	}
	checked := 0
	for _, tg := range targets {
		ts, err := lb.TimingsOf(tg.Name)
		if err != nil {
			t.Fatal(err)
		}
		var same []logbook.Timing
		var in []reduce.Timing
		secondary := false
		for _, tm := range ts {
			if tm.Scale == tg.Ephemeris.Scale && tm.Kind == tg.Kind {
				same = append(same, tm)
				in = append(in, reduce.Timing{Time: tm.JD, Sigma: tm.SigmaDays})
				secondary = secondary || tm.Secondary
			}
		}
		if len(same) < 3 {
			continue
		}
		a, err := reduce.OC(tg.Ephemeris, in, reduce.OCOptions{Secondary: secondary})
		if err != nil {
			t.Fatalf("%s: reduce.OC: %v", tg.Name, err)
		}
		for i, tm := range same {
			near(t, tg.Name+" timing "+ephemJD(tm.JD), report.TimingOC(tg, tm), a.Rows[i].OCDays, ocTol, "d", "reduce.OC")
			checked++
		}
		other := same[0]
		other.Scale = ephem.HJD + ephem.BJDTDB - other.Scale
		if oc := report.TimingOC(tg, other); !math.IsNaN(oc) {
			t.Errorf("%s: timing on %v against an ephemeris on %v: O−C %v, want NaN", tg.Name, other.Scale, tg.Ephemeris.Scale, oc)
		}
		other = same[0]
		other.Kind = observe.Max + observe.Min - other.Kind
		if oc := report.TimingOC(tg, other); !math.IsNaN(oc) {
			t.Errorf("%s: a %v timing against an ephemeris of %v: O−C %v, want NaN", tg.Name, other.Kind, tg.Kind, oc)
		}
	}
	if checked == 0 {
		t.Fatal("no timings checked")
	}
}

// ephemJD writes a Julian date for a message.
func ephemJD(jd float64) string { return "JD" + fmtRef(jd) }
