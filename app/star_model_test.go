package app

import (
	"math"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// starExampleCSV is the documented example catalogue of observe (4 stars).
var starExampleCSV = filepath.Join("..", "observe", "testdata", "targets_example.csv")

// starExampleVOT is the documented example VOTable of observe (2 stars).
var starExampleVOT = filepath.Join("..", "observe", "testdata", "targets_example.vot")

func TestStarInfo(t *testing.T) {
	tg := invented("Test Info", observe.Eclipsing, 5.5, -5.5, 2460000.25, 2.87)
	tg.Ephemeris.Q = 5e-9
	tg.Star.PMRA, tg.Star.PMDec = 4000, -3000
	tg.MagBright, tg.MagFaint = 10.1, math.NaN()
	tg.Secondary = true
	tg.Comps = []observe.Comp{{ID: "C1", V: 11.2, BV: 0.6}}
	tg.Checks = []observe.Comp{{ID: "K1", V: 10.874, BV: math.NaN()}}
	adopted := time.Date(2025, 3, 4, 21, 0, 0, 0, time.UTC)
	old := tg.Ephemeris
	old.PeriodDays = 2.8
	d := StarData{Name: tg.Name, MeanMagV: math.NaN(), History: []logbook.AdoptedEphemeris{
		{Ephemeris: old, Adopted: adopted.AddDate(-2, 0, 0), Source: "first"},
		{Ephemeris: tg.Ephemeris, Adopted: adopted, Source: "second"},
	}}
	in := BuildStarInfo(tg, d, testNow)
	lines := map[string]string{}
	for _, ls := range [][]StarLine{in.Position, in.Kind, in.Ephemeris} {
		for _, l := range ls {
			lines[l.Key] = l.Value
		}
	}
	want := map[string]string{
		// 5.5 h = 82.5° (1 h = 15°, by definition).
		"Right ascension":  "05:30:00.00   (5.500000 h, 82.50000°)",
		"Declination":      "-05:30:00.0   (-5.500000°)",
		"Proper motion":    "μα cos δ +4000.00 mas/yr, μδ -3000.00 mas/yr",
		"Class":            "eclipsing",
		"T0 marks":         "minimum light",
		"Secondary minima": "predicted too, half a cycle after each primary (E + 0.5)",
		"Magnitude range":  "brightest 10.10 mag, faintest not known",
		"T0":               "2460000.25 BJD_TDB",
		// 0.001 d = 1.44 min; 1e-6 d = 0.0864 s.
		"σ(T0)": "± 0.001 d (1.44 min)",
		"σ(P)":  "± 1e-06 d (0.086 s)",
		// dP/dt = 2Q/P (Sterken 2005): 2 × 5e-9 / 2.87 × 86400 × 365.25 s/yr = 0.10996 s/yr.
		"Q":       "5e-09 d (period change dP/dt = 2Q/P = +0.11 s/yr)",
		"Source":  "second",
		"Adopted": "2025-03-04 21:00 UTC",
	}
	for k, v := range want {
		if lines[k] != v {
			t.Errorf("%s: got %q, want %q", k, lines[k], v)
		}
	}
	if lines["Mean V"] != "" {
		t.Errorf("an eclipsing star shows a mean V: %q", lines["Mean V"])
	}
	ceph := invented("Test Ceph", observe.Pulsating, 22.5, 58, 2460000.5, 5.366249)
	for _, l := range BuildStarInfo(ceph, StarData{MeanMagV: 3.954}, testNow).Kind {
		if l.Key == "Mean V" && l.Value != "3.954" {
			t.Errorf("mean V of a pulsating star: %q, want 3.954", l.Value)
		}
	}
	if len(in.History) != 2 || in.History[0][1] != "second" || in.History[1][1] != "first" {
		t.Errorf("history, newest first: got %q", in.History)
	}
	if in.History[1][3] != "2.8" {
		t.Errorf("the older period in the history: got %q, want 2.8", in.History[1][3])
	}
	if len(in.Comps) != 2 || strings.Join(in.Comps[0].Cells(), "|") != "C1|11.200|0.600|comparison" ||
		strings.Join(in.Comps[1].Cells(), "|") != "K1|10.874|—|check" {
		t.Errorf("comparison stars: got %+v", in.Comps)
	}
}

// The form reads its fields with ephem's parsers: a fault has the same
// words as on the command line, and goes to the field it belongs to.
func TestStarFormTarget(t *testing.T) {
	base := smallTargets()[0]
	good := StarFormOf(base)
	_, raErr := ephem.ParseRA("25:00:00")
	_, decErr := ephem.ParseDec("+95")
	_, classErr := observe.ParseClass("planet")
	cases := []struct {
		name  string
		edit  func(*StarForm)
		field string
		want  string
	}{
		{"bad RA", func(f *StarForm) { f.RA = "25:00:00" }, StarFieldRA, starErrText(raErr)},
		{"bad Dec", func(f *StarForm) { f.Dec = "+95" }, StarFieldDec, starErrText(decErr)},
		{"bad class", func(f *StarForm) { f.Class = "planet" }, StarFieldClass, starErrText(classErr)},
		{"no name", func(f *StarForm) { f.Name = "  " }, StarFieldName, "the star needs a name"},
		{"bad unit", func(f *StarForm) { f.PMRA = "12 km" }, StarFieldPMRA, `"12 km": want a number of mas/yr`},
		{"pm too big", func(f *StarForm) { f.PMDec = "30000" }, StarFieldPMDec, "from -20000 to 20000"},
		{"range upside down", func(f *StarForm) { f.MagBright, f.MagFaint = "11", "10" }, StarFieldMagFaint, "not smaller than the brightest"},
	}
	for _, tc := range cases {
		f := good
		tc.edit(&f)
		got, errs := f.Target(base)
		if !strings.Contains(errs[tc.field], tc.want) {
			t.Errorf("%s: error of %q: got %q, want it to contain %q (all: %v)", tc.name, tc.field, errs[tc.field], tc.want, errs)
		}
		if got.Star != base.Star || got.Name != base.Name {
			t.Errorf("%s: a form with faults changed the target: %+v", tc.name, got)
		}
	}

	f := good
	f.Name, f.RA, f.Dec, f.PMRA, f.PMDec = "Test Renamed", "5h30m", "-05 23 28", "4000 mas/yr", "-3000"
	f.Class, f.Kind, f.MagBright, f.MagFaint, f.Notes = "eclipsing", "minimum", "10.1 mag", "10.9", " fine "
	got, errs := f.Target(base)
	if len(errs) > 0 {
		t.Fatalf("a good form: %v", errs)
	}
	// −05°23′28″ = −(5 + 23/60 + 28/3600)° = −5.391111°.
	const tolDeg = 1e-9
	if got.Name != "Test Renamed" || got.Star.RAHours != 5.5 || math.Abs(got.Star.DecDeg+5.391111111) > tolDeg ||
		got.Star.PMRA != 4000 || got.Star.PMDec != -3000 || got.Class != observe.Eclipsing || got.Kind != observe.Min ||
		got.MagBright != 10.1 || got.MagFaint != 10.9 || got.Notes != "fine" {
		t.Errorf("a good form: got %+v", got)
	}
	if got.Ephemeris != base.Ephemeris {
		t.Errorf("the form changed the ephemeris: %+v", got.Ephemeris)
	}
	back, errs := StarFormOf(got).Target(base)
	if len(errs) > 0 || back.Star != got.Star || back.MagFaint != got.MagFaint {
		t.Errorf("StarFormOf does not read back: %+v %v", back, errs)
	}
}

func TestStarEphemForm(t *testing.T) {
	good := StarEphemForm{T0: "2460000.1234", Scale: "HJD_UTC", Period: "13.6 h", Q: "", EpochErr: "0.001", PeriodErr: "", Source: "a paper"}
	e, src, errs := good.Adoption()
	if len(errs) > 0 {
		t.Fatalf("a good ephemeris: %v", errs)
	}
	// 13.6 h = 13.6/24 d.
	const tolDays = 1e-15
	if e.Epoch != 2460000.1234 || e.Scale != ephem.HJD || math.Abs(e.PeriodDays-13.6/24) > tolDays || e.Q != 0 ||
		e.EpochErr != 0.001 || e.PeriodErr != 0 || src != "a paper" {
		t.Errorf("a good ephemeris: got %+v from %q", e, src)
	}
	epochErr := ephem.Ephemeris{Epoch: 12345, PeriodDays: 1, Scale: ephem.BJDTDB}.Validate()
	_, scaleErr := ephem.ParseTimeScale("tt")
	cases := []struct {
		name  string
		edit  func(*StarEphemForm)
		field string
		want  string
	}{
		{"T0 not a full JD", func(f *StarEphemForm) { f.T0 = "12345" }, StarFieldT0, starErrText(epochErr)},
		{"T0 missing", func(f *StarEphemForm) { f.T0 = "" }, StarFieldT0, "(required)"},
		{"bad scale", func(f *StarEphemForm) { f.Scale = "tt" }, StarFieldScale, starErrText(scaleErr)},
		{"zero period", func(f *StarEphemForm) { f.Period = "0" }, StarFieldPeriod, "days must be positive"},
		{"period unit", func(f *StarEphemForm) { f.Period = "3 weeks" }, StarFieldPeriod, "(or with a unit: d, h, min, s)"},
		{"negative σ", func(f *StarEphemForm) { f.EpochErr = "-0.1" }, StarFieldEpochErr, "from 0 to"},
		// P + 2QE reaches zero within 1620–2200 (ephem.Ephemeris.Validate).
		{"Q too large", func(f *StarEphemForm) { f.Q = "-0.001" }, StarFieldQ, "would fall to zero"},
		{"no source", func(f *StarEphemForm) { f.Source = " " }, StarFieldSource, "where the ephemeris comes from"},
	}
	for _, tc := range cases {
		f := good
		tc.edit(&f)
		_, _, errs := f.Adoption()
		if !strings.Contains(errs[tc.field], tc.want) {
			t.Errorf("%s: error of %q: got %q, want it to contain %q (all: %v)", tc.name, tc.field, errs[tc.field], tc.want, errs)
		}
	}
}

func TestStarCompForm(t *testing.T) {
	cases := []struct {
		form  StarCompForm
		field string // "" for a good one
	}{
		{StarCompForm{ID: "C1", V: "11.2", BV: "0.6"}, ""},
		{StarCompForm{ID: "C2", V: "12.05 mag"}, ""},
		{StarCompForm{ID: "C=1", V: "11"}, StarFieldCompID},
		{StarCompForm{ID: "", V: "11"}, StarFieldCompID},
		{StarCompForm{ID: "C3", V: ""}, StarFieldCompV},
		{StarCompForm{ID: "C3", V: "eleven"}, StarFieldCompV},
		{StarCompForm{ID: "C3", V: "11", BV: "12"}, StarFieldCompBV},
	}
	for _, tc := range cases {
		c, errs := tc.form.Comp()
		switch {
		case tc.field == "" && len(errs) > 0:
			t.Errorf("%+v: unexpected faults %v", tc.form, errs)
		case tc.field != "" && errs[tc.field] == "":
			t.Errorf("%+v: no fault on %q (got %v)", tc.form, tc.field, errs)
		}
		if tc.field == "" && (c.ID != strings.TrimSpace(tc.form.ID) || (tc.form.BV == "") != math.IsNaN(c.BV)) {
			t.Errorf("%+v: got %+v", tc.form, c)
		}
	}
}

func TestStarEmptyText(t *testing.T) {
	if s := starEmptyText(0); !strings.Contains(s, "No stars yet: add one or import a catalogue") {
		t.Errorf("no stars: %q", s)
	}
	if s := starEmptyText(3); !strings.Contains(s, "No star selected") {
		t.Errorf("none selected: %q", s)
	}
}
