package app

import (
	"math"
	"strings"
	"testing"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/demo"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// measureNight is the night of the model tests: 1–2 December 2026.
var measureNight = time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)

// measureSouth is a site two hours east of UTC all year (Africa/Johannesburg
// has kept SAST, UTC+2, without daylight saving since 1944: IANA tz
// database).
func measureSouth(t *testing.T) observe.Site {
	t.Helper()
	s, err := observe.NewSite("Test South", -33.9, 18.4, 20, "Africa/Johannesburg", 15, nil)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

func TestMeasureTimeParse(t *testing.T) {
	london := demo.Site() // Europe/London keeps GMT = UTC in December (IANA tz database)
	south := measureSouth(t)
	cases := []struct {
		name string
		in   string
		site observe.Site
		utc  bool
		want time.Time // zero: an error is expected
		err  string
	}{
		{"evening clock", "21:14", london, false, time.Date(2026, 12, 1, 21, 14, 0, 0, time.UTC), ""},
		{"morning clock is the next day", "02:30:15", london, false, time.Date(2026, 12, 2, 2, 30, 15, 0, time.UTC), ""},
		{"fractional seconds", "21:14:05.5", london, false, time.Date(2026, 12, 1, 21, 14, 5, 5e8, time.UTC), ""},
		{"hours and h", "21h14", london, false, time.Date(2026, 12, 1, 21, 14, 0, 0, time.UTC), ""},
		{"local clock two hours ahead", "21:14", south, false, time.Date(2026, 12, 1, 19, 14, 0, 0, time.UTC), ""},
		{"UTC clock at a site ahead of UTC", "09:30", south, true, time.Date(2026, 12, 2, 9, 30, 0, 0, time.UTC), ""},
		{"UTC clock after local noon", "10:30", south, true, time.Date(2026, 12, 1, 10, 30, 0, 0, time.UTC), ""},
		{"local date and time", "2026-12-01 23:05", south, false, time.Date(2026, 12, 1, 21, 5, 0, 0, time.UTC), ""},
		{"ISO with zone", "2026-12-02T03:00:00+01:00", london, false, time.Date(2026, 12, 2, 2, 0, 0, 0, time.UTC), ""},
		// JD 2461376.5 is 2026-12-02 0h UTC (Meeus 1998, ch. 7: JD 2451545.0
		// is 2000 January 1.5, and 2026-12-02 is 9831.5 days later).
		{"Julian date", "JD2461376.5", london, false, time.Date(2026, 12, 2, 0, 0, 0, 0, time.UTC), ""},
		{"hour out of range", "25:61", london, false, time.Time{}, `time "25:61": expected a clock time such as 21:14 or 21:14:30 (GMT, Europe/London)`},
		{"words", "soon", london, false, time.Time{}, `time "soon": expected a clock time`},
		{"empty", " ", london, false, time.Time{}, "time is empty"},
		{"no such date", "2026-11-31 21:00", london, false, time.Time{}, "there is no such date"},
		{"another night", "2026-12-05T21:00:00Z", london, false, time.Time{}, "not in the night of Tue 1 – Wed 2 Dec 2026"},
	}
	for _, tc := range cases {
		loc := tc.site.Location()
		if tc.utc {
			loc = time.UTC
		}
		got, err := ParseMeasureTime(tc.in, loc, measureNight, &tc.site)
		if tc.err != "" {
			if err == nil || !strings.Contains(err.Error(), tc.err) {
				t.Errorf("%s: %q gave %v, error %v; want an error containing %q", tc.name, tc.in, got, err, tc.err)
			}
			continue
		}
		if err != nil || !got.Equal(tc.want) {
			t.Errorf("%s: %q gave %v (error %v), want %v", tc.name, tc.in, got.UTC(), err, tc.want)
		}
	}
}

// measureTestStar is an invented star with the comparison stars of the
// methods.md §8 ensemble check (V = 11.200, 12.050, 10.700) and its check
// star (11.650), and two chart stars for the §9 visual checks.
func measureTestStar() observe.Target {
	t := invented("Test Ensemble", observe.Pulsating, 2.5, 40, 2461375.4, 0.37)
	t.Comps = []observe.Comp{{ID: "C1", V: 11.200, BV: math.NaN()}, {ID: "C2", V: 12.050, BV: math.NaN()}, {ID: "C3", V: 10.700, BV: math.NaN()}}
	t.Checks = []observe.Comp{{ID: "K", V: 11.650, BV: math.NaN()}}
	return t
}

// Tolerances of the reduction checks: methods.md §8 quotes V to 3 or 5
// decimals, so half a unit of the last decimal.
const (
	measureTol3 = 0.0005   // mag
	measureTol5 = 0.000005 // mag
)

func TestMeasureInstrumentalRow(t *testing.T) {
	site := demo.Site()
	star := measureTestStar()
	entry := func(errs bool) MeasureEntry {
		e := MeasureEntry{Time: "21:14:05", Filter: "V",
			Target: MeasureStarEntry{Mag: "-7.512"},
			Comps:  []MeasureStarEntry{{Label: "C1", Mag: "−8.120"}, {Label: "C2", Mag: "-7.262"}, {Label: "C3", Mag: "-8,628"}},
			Check:  MeasureStarEntry{Label: "K", Mag: "-7.668"}}
		if errs {
			e.Comps[0].Err, e.Comps[1].Err, e.Comps[2].Err = "0.005", "0.010", "0.005"
		}
		return e
	}
	// methods.md §8 ensemble check: unweighted V = 11.808, the check star
	// 11.652; weighted by σ = 0.005, 0.010, 0.005: V = 11.81067, σ_Z = 0.00333.
	cases := []struct {
		name             string
		errs             bool
		want, wantErr    float64
		tol, errTol      float64
		wantCheck, chTol float64
	}{
		{"unweighted", false, 11.808, math.NaN(), measureTol3, 0, 11.652, measureTol3},
		{"weighted", true, 11.81067, 0.00333, measureTol5, measureTol5, math.NaN(), 0},
	}
	for _, tc := range cases {
		r, err := ReduceEntry(entry(tc.errs), star, &site, measureNight)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		if d := r.M.Mag - tc.want; math.Abs(d) > tc.tol {
			t.Errorf("%s: V = %.5f, want %.5f (diff %.5f, tol %g)", tc.name, r.M.Mag, tc.want, d, tc.tol)
		}
		if !math.IsNaN(tc.wantErr) {
			if d := r.M.MagErr - tc.wantErr; math.Abs(d) > tc.errTol {
				t.Errorf("%s: σ = %.5f, want %.5f (diff %.5f, tol %g)", tc.name, r.M.MagErr, tc.wantErr, d, tc.errTol)
			}
		}
		if !math.IsNaN(tc.wantCheck) {
			if d := r.CheckMag - tc.wantCheck; math.Abs(d) > tc.chTol || r.CheckID != "K" {
				t.Errorf("%s: check %s = %.4f, want K = %.3f (diff %.4f, tol %g)", tc.name, r.CheckID, r.CheckMag, tc.wantCheck, d, tc.chTol)
			}
		}
		if len(r.M.Comps) != 3 || len(r.M.Checks) != 1 || r.M.InstMag != -7.512 || r.M.Comps[2].InstMag != -8.628 {
			t.Errorf("%s: raw inputs not kept: target %v, comps %+v, checks %+v", tc.name, r.M.InstMag, r.M.Comps, r.M.Checks)
		}
		// The times: 21:14:05 GMT is 21:14:05 UTC; HJD and BJD_TDB from
		// reduce.ConvertTimes for the demo site.
		wantJD := 2461376.5 - (2*60+45+55.0/60)/1440 // 2 h 45 min 55 s before 2 Dec 0h UTC
		hjd, bjd, _ := reduce.ConvertTimes([]float64{wantJD}, star.Star, &site.Site)
		const jdTol = 1e-8 // days (0.9 ms)
		if math.Abs(r.M.JDUTC-wantJD) > jdTol || math.Abs(r.M.HJD-hjd[0]) > jdTol || math.Abs(r.M.BJDTDB-bjd[0]) > jdTol {
			t.Errorf("%s: times JD %.8f HJD %.8f BJD %.8f, want %.8f %.8f %.8f", tc.name, r.M.JDUTC, r.M.HJD, r.M.BJDTDB, wantJD, hjd[0], bjd[0])
		}
	}
}

func TestMeasureVisualRow(t *testing.T) {
	site := demo.Site()
	star := invented("Test Visual", observe.Pulsating, 2.5, 40, 2461375.4, 300)
	star.Comps = []observe.Comp{{ID: "A", V: 6.2, BV: math.NaN()}, {ID: "B", V: 6.8, BV: math.NaN()}}
	// methods.md §9 checks: A = 6.2, B = 6.8.
	cases := []struct {
		est, step string
		want      float64
	}{
		{"A 2 V 3 B", "", 6.44},
		{"A 3 V, V 2 B", "", 6.56},
		{"A 3 V; V 2 B", "", 6.56},
		{"A 2 V", "0.12", 6.44}, // one star with the step value 0.12 mag of the §9 check
	}
	const tol = 1e-9 // mag: exact arithmetic on the check's numbers
	for _, tc := range cases {
		r, err := ReduceEntry(MeasureEntry{Visual: true, Time: "22:00", Estimate: tc.est, Step: tc.step}, star, &site, measureNight)
		if err != nil {
			t.Errorf("%q: %v", tc.est, err)
			continue
		}
		if d := r.M.Mag - tc.want; math.Abs(d) > tol || r.M.Visual != tc.est || r.M.Filter != "vis" || !math.IsNaN(r.M.MagErr) {
			t.Errorf("%q: mag %.4f (diff %.2g), visual %q, filter %q, err %v; want %.2f, the estimate, vis, NaN", tc.est, r.M.Mag, d, r.M.Visual, r.M.Filter, r.M.MagErr, tc.want)
		}
	}
}

func TestMeasureBadEntries(t *testing.T) {
	site := demo.Site()
	star := measureTestStar()
	good := MeasureEntry{Time: "21:14", Target: MeasureStarEntry{Mag: "-7.5"},
		Comps: []MeasureStarEntry{{Label: "C1", Mag: "-8.1"}, {Label: "C2"}, {Label: "C3"}}, Check: MeasureStarEntry{Label: "K"}}
	cases := []struct {
		name  string
		edit  func(e *MeasureEntry)
		field string
		msg   string
	}{
		{"bad time", func(e *MeasureEntry) { e.Time = "25:61" }, MeasureFieldTime, `time "25:61": expected a clock time`},
		{"target not a number", func(e *MeasureEntry) { e.Target.Mag = "abc" }, MeasureFieldTarget, `target "abc" is not a number: expected its instrumental magnitude`},
		{"target missing", func(e *MeasureEntry) { e.Target.Mag = "" }, MeasureFieldTarget, `target "" (empty)`},
		{"negative error", func(e *MeasureEntry) { e.Target.Err = "-0.1" }, MeasureFieldTargetE, `target error "-0.1" is out of range`},
		{"comp not a number", func(e *MeasureEntry) { e.Comps[1].Mag = "8.1x" }, MeasureMagField("C2"), `comparison star C2 "8.1x" is not a number`},
		{"no comparison", func(e *MeasureEntry) { e.Comps[0].Mag = "" }, MeasureMagField("C1"), "no comparison star measured"},
		{"error without magnitude", func(e *MeasureEntry) { e.Check.Err = "0.01" }, MeasureMagField("K"), "has an error but no magnitude"},
		{"air mass below 1", func(e *MeasureEntry) { e.Airmass = "0.8" }, MeasureFieldAirmass, `air mass "0.8" is out of range`},
		{"zero exposure", func(e *MeasureEntry) { e.Exposure = "0" }, MeasureFieldExposure, `exposure "0": expected a length in seconds`},
		{"empty estimate", func(e *MeasureEntry) { e.Visual = true }, MeasureFieldEstimate, "the estimate is empty"},
		{"unknown label", func(e *MeasureEntry) { e.Visual, e.Estimate = true, "C1 2 V 3 Z" }, MeasureFieldEstimate, `comparison star "Z" is not on the chart`},
		{"one star without step", func(e *MeasureEntry) { e.Visual, e.Estimate = true, "C1 2 V" }, MeasureFieldStep, "give the step value in magnitudes"},
	}
	for _, tc := range cases {
		e := good
		e.Comps = append([]MeasureStarEntry(nil), good.Comps...)
		tc.edit(&e)
		_, err := ReduceEntry(e, star, &site, measureNight)
		ee, ok := err.(MeasureEntryError)
		if !ok {
			t.Errorf("%s: got %v, want a MeasureEntryError", tc.name, err)
			continue
		}
		if msg := ee.Of(tc.field); !strings.Contains(msg, tc.msg) {
			t.Errorf("%s: message for %q: got %q, want it to contain %q (all: %v)", tc.name, tc.field, msg, tc.msg, ee)
		}
	}
	if _, err := ReduceEntry(good, star, &site, measureNight); err != nil {
		t.Errorf("the good entry: %v", err)
	}
}

// measureDemo makes a demo logbook in a temporary directory.
func measureDemo(t testing.TB) *logbook.Logbook {
	t.Helper()
	return demoLogbook(t)
}

// A visual estimate typed for the demo's eye-followed star gives the
// magnitude reduce reads from it, and is stored in a new night record.
func TestMeasureVisualRowStored(t *testing.T) {
	lb := measureDemo(t)
	star, err := lb.Target("Ashgrove V8")
	if err != nil {
		t.Fatal(err)
	}
	site := demo.Site()
	r := MeasureRequest{Target: star, Site: site, Date: measureNight}
	d, err := LoadMeasure(lb, r)
	if err != nil {
		t.Fatal(err)
	}
	if d.Night.ID != 0 || d.Night.Observer == "" {
		t.Fatalf("the night of 1 Dec 2026 should be new, with the previous night's observer: %+v", d.Night)
	}
	const est = "D 2 V 3 E"
	red, err := ReduceEntry(MeasureEntry{Visual: true, Time: "19:40", Estimate: est}, star, &site, measureNight)
	if err != nil {
		t.Fatal(err)
	}
	ve, _ := reduce.ParseEstimate(est)
	want, _, err := ve.Magnitude(MeasureChart(star), 0)
	if err != nil {
		t.Fatal(err)
	}
	if red.M.Mag != want {
		t.Errorf("magnitude of %q: got %v, reduce gives %v", est, red.M.Mag, want)
	}
	details := d.Night
	details.Conditions = "clear, test"
	m, n, err := AddMeasureRow(lb, r, details, red.M)
	if err != nil {
		t.Fatal(err)
	}
	got, err := lb.Measurement(m.ID)
	if err != nil {
		t.Fatal(err)
	}
	if got.Mag != want || got.Visual != est || got.NightID != n.ID || math.IsNaN(got.BJDTDB) {
		t.Errorf("stored: %+v; want mag %v, %q, night %d, a BJD_TDB", got, want, est, n.ID)
	}
	stored, err := lb.Night(site.Name, measureNight)
	if err != nil || stored.Conditions != "clear, test" || stored.Observer != d.Night.Observer {
		t.Errorf("night record: %+v (%v)", stored, err)
	}
	// ephem's clock: 19:40 GMT on 1 Dec 2026.
	if want := time.Date(2026, 12, 1, 19, 40, 0, 0, time.UTC); !measureJDTime(got.JDUTC).Equal(want) {
		t.Errorf("time: got %v, want %v", measureJDTime(got.JDUTC), want)
	}
	if _, err := ephem.FromJDUTC(got.JDUTC); err != nil {
		t.Error(err)
	}
}
