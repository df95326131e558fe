package app

import (
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/demo"
	"example.org/vigil/internal/table"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// targetNames returns the names of the logbook's targets, in order.
func targetNames(t *testing.T, lb *logbook.Logbook) []string {
	t.Helper()
	ts, err := lb.Targets()
	if err != nil {
		t.Fatal(err)
	}
	var out []string
	for _, tg := range ts {
		out = append(out, tg.Name)
	}
	return out
}

func TestImportStarsCSV(t *testing.T) {
	lb := smallLogbook(t)
	n, err := ImportStars(lb, starExampleCSV)
	if err != nil || n != 4 {
		t.Fatalf("importing the example: %d stars, %v; want 4", n, err)
	}
	want, err := observe.ReadTargetsCSVFile(starExampleCSV)
	if err != nil {
		t.Fatal(err)
	}
	for _, w := range want {
		got, err := lb.Target(w.Name)
		if err != nil {
			t.Errorf("%s not in the logbook after the import: %v", w.Name, err)
			continue
		}
		if got.Star != w.Star || got.Ephemeris != w.Ephemeris || got.Kind != w.Kind || len(got.Comps) != len(w.Comps) {
			t.Errorf("%s stored as %+v, read as %+v", w.Name, got, w)
		}
	}
	if got := len(targetNames(t, lb)); got != 7 {
		t.Errorf("targets after the import: %d, want 3 + 4", got)
	}
	// The same file again: every name is taken; nothing is added.
	if _, err := ImportStars(lb, starExampleCSV); err == nil || !strings.Contains(err.Error(), "Alder Var") {
		t.Errorf("importing the same stars twice: %v, want a refusal naming Alder Var", err)
	}
	if got := len(targetNames(t, lb)); got != 7 {
		t.Errorf("targets after a refused import: %d, want 7", got)
	}
}

// starBadCSV writes the example catalogue with one bad cell: the Dec of its
// third star (line 10 of the file; the cell starts at character 21).
func starBadCSV(t *testing.T) string {
	t.Helper()
	b, err := os.ReadFile(starExampleCSV)
	if err != nil {
		t.Fatal(err)
	}
	s := strings.Replace(string(b), "Fir Fast,10:08:22.3,+11:58:02", "Fir Fast,10:08:22.3,+95:58:02", 1)
	if s == string(b) {
		t.Fatal("the example catalogue changed: no Fir Fast row to spoil")
	}
	p := filepath.Join(t.TempDir(), "bad.csv")
	if err := os.WriteFile(p, []byte(s), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

func TestImportStarsRefusedWhole(t *testing.T) {
	lb := smallLogbook(t)
	bad := starBadCSV(t)
	_, err := ImportStars(lb, bad)
	var te *table.Error
	if !errors.As(err, &te) {
		t.Fatalf("a bad catalogue: %v, want a *table.Error", err)
	}
	// Line 10: six comment lines and the header, then Alder Var, Cedar
	// Ecl, Fir Fast; the Dec cell starts at character 21 of the line
	// (after "Fir Fast,10:08:22.3,").
	if te.Line != 10 || te.Column != 21 || te.Name != "dec" || !strings.Contains(err.Error(), "bad.csv: line 10, column 21 (dec)") {
		t.Errorf("the fault: %v (line %d, column %d, %q), want line 10, column 21 (dec)", err, te.Line, te.Column, te.Name)
	}
	if got := targetNames(t, lb); len(got) != 3 {
		t.Errorf("targets after a refused import: %v, want the 3 of before", got)
	}
}

func TestImportStarsVOTable(t *testing.T) {
	lb := smallLogbook(t)
	want, err := observe.ReadVOTableFile(starExampleVOT, observe.VOTableOptions{})
	if err != nil {
		t.Fatal(err)
	}
	n, err := ImportStars(lb, starExampleVOT)
	if err != nil || n != len(want) {
		t.Fatalf("importing the example VOTable: %d, %v; want %d", n, err, len(want))
	}
	for _, w := range want {
		got, err := lb.Target(w.Name)
		if err != nil || got.Star != w.Star || got.Ephemeris != w.Ephemeris {
			t.Errorf("%s stored as %+v (%v), read as %+v", w.Name, got, err, w)
		}
		h, err := lb.EphemerisHistory(w.Name)
		if err != nil || len(h) != 1 || !strings.Contains(h[0].Source, "targets_example.vot") {
			t.Errorf("%s: history %+v (%v), want one entry from the file", w.Name, h, err)
		}
	}
	// Again: the names are taken, refused before anything is written.
	if _, err := ImportStars(lb, starExampleVOT); err == nil || !strings.Contains(err.Error(), "already in the logbook") {
		t.Errorf("importing the VOTable twice: %v", err)
	}
	if got := len(targetNames(t, lb)); got != 3+len(want) {
		t.Errorf("targets: %d, want %d", got, 3+len(want))
	}
}

func TestExportStars(t *testing.T) {
	lb := smallLogbook(t)
	p := filepath.Join(t.TempDir(), "out.csv")
	n, err := ExportStars(lb, p)
	if err != nil || n != 3 {
		t.Fatalf("export: %d, %v", n, err)
	}
	back, err := observe.ReadTargetsCSVFile(p)
	if err != nil {
		t.Fatalf("the export does not read back: %v", err)
	}
	for i, w := range smallTargets() {
		if back[i].Name != w.Name || back[i].Star != w.Star || back[i].Ephemeris != w.Ephemeris {
			t.Errorf("row %d: got %+v, want %+v", i, back[i], w)
		}
	}
}

func TestCountStarRecords(t *testing.T) {
	lb := smallLogbook(t)
	name := "Test Alpha"
	if err := lb.AddComp(name, observe.Comp{ID: "C1", V: 11, BV: math.NaN()}, false); err != nil {
		t.Fatal(err)
	}
	e := smallTargets()[0].Ephemeris
	e.PeriodDays += 1e-5
	if err := lb.AdoptEphemeris(name, e, "test"); err != nil {
		t.Fatal(err)
	}
	nid, err := lb.AddNight(logbook.Night{Site: demo.Site().Name, Date: time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)})
	if err != nil {
		t.Fatal(err)
	}
	var ms []logbook.Measurement
	for i := range 3 {
		ms = append(ms, logbook.Measurement{Target: name, NightID: nid, JDUTC: 2461376.3 + 0.01*float64(i), Filter: "V",
			ExposureS: math.NaN(), Airmass: math.NaN(), InstMag: math.NaN(), InstErr: math.NaN(),
			Mag: 10.5, MagErr: 0.01, HJD: math.NaN(), BJDTDB: math.NaN()})
	}
	if _, err := lb.AddMeasurements(ms); err != nil {
		t.Fatal(err)
	}
	for i := range 2 {
		tm := logbook.Timing{Target: name, JD: 2461376.3 + float64(i), Scale: ephem.BJDTDB, SigmaDays: 0.001,
			Kind: observe.Max, Origin: logbook.Published, Source: "invented"}
		if _, err := lb.AddTiming(tm); err != nil {
			t.Fatal(err)
		}
	}
	d, err := CountStarRecords(lb, name)
	if err != nil {
		t.Fatal(err)
	}
	if d != (StarDeletion{Name: name, Ephemerides: 2, Comps: 1, Measurements: 3, Timings: 2}) {
		t.Errorf("counts: got %+v", d)
	}
	q := d.Question()
	for _, w := range []string{"Delete Test Alpha", "2 ephemerides", "1 comparison or check star", "3 measurements", "2 timings"} {
		if !strings.Contains(q, w) {
			t.Errorf("question %q lacks %q", q, w)
		}
	}
}
