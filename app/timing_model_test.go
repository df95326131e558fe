package app

import (
	"encoding/csv"
	"errors"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/demo"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// timingDemo makes the demo logbook in a temporary directory.
func timingDemo(t testing.TB) *logbook.Logbook {
	t.Helper()
	return demoLogbook(t)
}

// timingLoad reads a star of the demo for the page.
func timingLoad(t testing.TB, lb *logbook.Logbook, name string) *TimingData {
	t.Helper()
	d, err := LoadTimingData(lb, name)
	if err != nil {
		t.Fatal(err)
	}
	return d
}

// The night's points are the logbook's reduced measurements on the star's
// scale, and a fit of them is reduce.Extremum's with the page's options.
func TestTimingFitIsExtremum(t *testing.T) {
	t.Parallel()
	lb := timingDemo(t)
	d := timingLoad(t, lb, "Ashgrove V4")
	if len(d.Nights) == 0 {
		t.Fatal("Ashgrove V4 has no night with data")
	}
	n := d.Nights[0] // the most recent
	ms, err := lb.MeasurementsOf("Ashgrove V4", n.Night.ID)
	if err != nil {
		t.Fatal(err)
	}
	if len(n.Points) != len(ms) {
		t.Fatalf("night of %s: %d points, the logbook has %d measurements", n.Night.Date.Format(time.DateOnly), len(n.Points), len(ms))
	}
	for i, m := range ms {
		if n.Points[i].T != m.BJDTDB || n.Points[i].Mag != m.Mag {
			t.Fatalf("point %d: got (%v, %v), want the measurement's BJD_TDB and mag (%v, %v)", i, n.Points[i].T, n.Points[i].Mag, m.BJDTDB, m.Mag)
		}
	}
	kind := TimingDefaultKind(d.Target)
	method := TimingDefaultMethod(d.Target, kind)
	if kind != reduce.Minimum || method != reduce.MethodKvW {
		t.Errorf("defaults for an eclipsing star: got %s by %s, want min by kvw", kind, method)
	}
	for _, m := range []reduce.ExtremumMethod{reduce.MethodKvW, reduce.MethodPoly} {
		req := TimingFitRequest{Points: n.Points, Kind: kind, Method: m}
		got, err := TimingFit(req)
		if err != nil {
			t.Fatalf("%s: %v", m, err)
		}
		want, err := reduce.Extremum(ms2points(ms), reduce.ExtremumOptions{Kind: reduce.Minimum, Method: m, Seed: TimingSeed})
		if err != nil {
			t.Fatal(err)
		}
		if got.Time != want.Time || got.Sigma != want.Sigma || got.N != want.N {
			t.Errorf("%s: got %.6f ± %.6f (%d points), reduce.Extremum gives %.6f ± %.6f (%d points)",
				m, got.Time, got.Sigma, got.N, want.Time, want.Sigma, want.N)
		}
	}
	// The demo observer timed the same minimum (in a window of fixed width):
	// the page's time agrees within three of the two σ combined.
	got, _ := TimingFit(TimingFitRequest{Points: n.Points, Kind: kind, Method: reduce.MethodKvW})
	found := false
	for _, tm := range d.Timings {
		if tm.NightID == n.Night.ID {
			found = true
			tol := 3 * math.Hypot(got.Sigma, tm.SigmaDays)
			if diff := got.Time - tm.JD; math.Abs(diff) > tol {
				t.Errorf("minimum: got %.6f, the demo's own timing %.6f: diff %.2g d, tol %.2g d", got.Time, tm.JD, diff, tol)
			}
		}
	}
	if !found {
		t.Error("the demo has no own timing of the night")
	}
}

func ms2points(ms []logbook.Measurement) []reduce.Point {
	out := make([]reduce.Point, len(ms))
	for i, m := range ms {
		out[i] = reduce.Point{T: m.BJDTDB, Mag: m.Mag, Err: m.MagErr}
	}
	return out
}

// Keeping a fit stores it as the star's own timing of the night.
func TestTimingKeepStores(t *testing.T) {
	t.Parallel()
	lb := timingDemo(t)
	d := timingLoad(t, lb, "Ashgrove V4")
	n := d.Nights[0]
	tm, err := TimingFit(TimingFitRequest{Points: n.Points, Kind: reduce.Minimum, Method: reduce.MethodKvW})
	if err != nil {
		t.Fatal(err)
	}
	id, err := lb.AddTiming(TimingRecord(tm, d.Target, n))
	if err != nil {
		t.Fatal(err)
	}
	got, err := lb.Timing(id)
	if err != nil {
		t.Fatal(err)
	}
	if got.JD != tm.Time || got.SigmaDays != tm.Sigma || got.Scale != ephem.BJDTDB || got.Origin != logbook.Own ||
		got.Method != "kvw" || got.NightID != n.Night.ID || got.Secondary || got.Kind.String() != "min" {
		t.Errorf("stored %+v, want the fit %.6f ± %.6f on BJD_TDB, own, kvw, night %d, primary min", got, tm.Time, tm.Sigma, n.Night.ID)
	}
	poly, err := TimingFit(TimingFitRequest{Points: n.Points, Kind: reduce.Minimum, Method: reduce.MethodPoly, Degree: 4})
	if err != nil {
		t.Fatal(err)
	}
	if rec := TimingRecord(poly, d.Target, n); rec.Method != "poly4" {
		t.Errorf("method of a degree-4 polynomial: got %q, want poly4", rec.Method)
	}
}

// A range that holds one side of the minimum only is refused with reduce's
// reason, in words.
func TestTimingOneSidedRefused(t *testing.T) {
	t.Parallel()
	lb := timingDemo(t)
	d := timingLoad(t, lb, "Ashgrove V4")
	n := d.Nights[0]
	full, err := TimingFit(TimingFitRequest{Points: n.Points, Kind: reduce.Minimum, Method: reduce.MethodKvW})
	if err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name     string
		from, to float64
		method   reduce.ExtremumMethod
		want     error
	}{
		{"before the minimum, kvw", n.Points[0].T, full.Time - 0.02, reduce.MethodKvW, reduce.ErrOneSided},
		{"before the minimum, poly", n.Points[0].T, full.Time - 0.02, reduce.MethodPoly, reduce.ErrOneSided},
		{"after the minimum, poly", full.Time + 0.02, n.Points[len(n.Points)-1].T, reduce.MethodPoly, reduce.ErrOneSided},
	}
	for _, tc := range tests {
		_, err := TimingFit(TimingFitRequest{Points: n.Points, Kind: reduce.Minimum, Method: tc.method, From: tc.from, To: tc.to})
		if !errors.Is(err, tc.want) {
			t.Errorf("%s: got %v, want %v", tc.name, err, tc.want)
			continue
		}
		if msg := TimingRefusal(err, reduce.Minimum); !strings.Contains(msg, "both sides of the minimum") || !strings.Contains(msg, err.Error()) {
			t.Errorf("%s: refusal %q: want it to say both sides are needed, and why", tc.name, msg)
		}
	}
}

// A range end is a Julian date on the star's scale or a local clock time
// in the night, converted for the star at the site.
func TestTimingParseRangeEnd(t *testing.T) {
	t.Parallel()
	lb := timingDemo(t)
	d := timingLoad(t, lb, "Ashgrove V4")
	n := d.Nights[0]  // 5 Nov 2026 at the demo site (GMT)
	const tolS = 0.01 // s: the round trip through SeenAt
	for _, tc := range []struct {
		in   string
		want time.Time // the local instant meant; zero for a JD
		jd   float64
	}{
		{"2461350.55", time.Time{}, 2461350.55},
		{" 2461350.5512 ", time.Time{}, 2461350.5512},
		{"23:40", time.Date(2026, 11, 5, 23, 40, 0, 0, timingLondon), 0},
		{"01:05:30", time.Date(2026, 11, 6, 1, 5, 30, 0, timingLondon), 0},
		{"2026-11-06T01:05:30Z", time.Date(2026, 11, 6, 1, 5, 30, 0, time.UTC), 0},
		// JD 2440587.5 is the Unix epoch, 1970-01-01 0h UTC (common practice).
		{"JD2461350.5", time.Unix((2461350.5-2440587.5)*86400, 0).UTC(), 0},
	} {
		got, err := TimingParseRangeEnd(tc.in, d.Target, n)
		if err != nil {
			t.Errorf("%q: %v", tc.in, err)
			continue
		}
		if tc.want.IsZero() {
			if got != tc.jd {
				t.Errorf("%q: got %v, want %v", tc.in, got, tc.jd)
			}
			continue
		}
		seen, err := ephem.SeenAt(ephem.BJDTDB, got, d.Target.Star, n.Site.Site)
		if err != nil {
			t.Fatal(err)
		}
		if diff := seen.Time().Sub(tc.want).Seconds(); math.Abs(diff) > tolS {
			t.Errorf("%q: BJD_TDB %.6f is seen at %v, want %v (diff %.3g s, tol %g s)", tc.in, got, seen, tc.want, diff, tolS)
		}
	}
	for _, bad := range []string{"", "tomorrow", "25:00", "12.5", "2461350.5x", "2026-13-01T00:00Z", "1:2:3:4"} {
		_, err := TimingParseRangeEnd(bad, d.Target, n)
		if err == nil || !strings.Contains(err.Error(), "want a Julian date on BJD_TDB") || !strings.Contains(err.Error(), "local time such as 23:40") {
			t.Errorf("%q: got %v, want an error saying what is expected", bad, err)
		}
	}
}

// astropyConvertTolS: ephem's light-time corrections agree with astropy to
// its lightTimeTolS (0.5 s), and the conversion takes the Earth's centre
// for astropy's observatory (at most 21 ms, ephem.Frame.HJD).
const astropyConvertTolS = 0.5 + 0.021

// HJD_UTC → BJD_TDB and back against astropy's pairs of the same instants
// (testdata/astropy/timescales.csv, made by make_ephem.py), from 1972 on,
// where the two share the definition of UTC.
func TestTimingConvertAgainstAstropy(t *testing.T) {
	t.Parallel()
	f, err := os.Open(filepath.Join("..", "testdata", "astropy", "timescales.csv"))
	if err != nil {
		t.Fatalf("%v (regenerate with /usr/bin/python3 testdata/astropy/make_ephem.py)", err)
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.Comment = '#'
	rows, err := r.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	col := map[string]int{}
	for i, h := range rows[0] {
		col[h] = i
	}
	num := func(row []string, name string) float64 {
		v, err := strconv.ParseFloat(row[col[name]], 64)
		if err != nil {
			t.Fatalf("column %s: %v", name, err)
		}
		return v
	}
	checked := 0
	for _, row := range rows[1:] {
		if row[col["utc"]] < "1972" {
			continue
		}
		star := ephem.Star{RAHours: num(row, "ra_h"), DecDeg: num(row, "dec_deg"), PMRA: num(row, "pmra_mas_yr"), PMDec: num(row, "pmdec_mas_yr")}
		hjd, bjd := num(row, "hjd_utc"), num(row, "bjd_tdb")
		gotB, err := TimingConvert(hjd, ephem.HJD, ephem.BJDTDB, star)
		if err != nil {
			t.Fatal(err)
		}
		gotH, err := TimingConvert(bjd, ephem.BJDTDB, ephem.HJD, star)
		if err != nil {
			t.Fatal(err)
		}
		if d := (gotB - bjd) * 86400; math.Abs(d) > astropyConvertTolS {
			t.Errorf("%s: HJD %.9f → BJD_TDB %.9f, astropy %.9f: diff %.3f s, tol %.3f s", row[col["utc"]], hjd, gotB, bjd, d, astropyConvertTolS)
		}
		if d := (gotH - hjd) * 86400; math.Abs(d) > astropyConvertTolS {
			t.Errorf("%s: BJD_TDB %.9f → HJD %.9f, astropy %.9f: diff %.3f s, tol %.3f s", row[col["utc"]], bjd, gotH, hjd, d, astropyConvertTolS)
		}
		checked++
	}
	if checked < 50 {
		t.Errorf("only %d rows from 1972 on checked", checked)
	}
}

// A published timing's form: each fault named at its field.
func TestTimingParsePublished(t *testing.T) {
	t.Parallel()
	good := TimingPublishedInput{JD: "2452407.32965", Scale: "hjd", Sigma: "0.0004", Kind: "min", Source: "Journal 12, 34 (2011)"}
	tm, errs := TimingParsePublished(good, "Ashgrove V4")
	if errs != nil || tm.JD != 2452407.32965 || tm.Scale != ephem.HJD || tm.SigmaDays != 0.0004 || tm.Origin != logbook.Published {
		t.Errorf("good input: %+v, %v", tm, errs)
	}
	noSigma := good
	noSigma.Sigma = " "
	if tm, errs := TimingParsePublished(noSigma, "Ashgrove V4"); errs != nil || !math.IsNaN(tm.SigmaDays) {
		t.Errorf("no σ: got %v, %v; want an unknown σ (NaN)", tm.SigmaDays, errs)
	}
	for _, tc := range []struct {
		edit  func(*TimingPublishedInput)
		field string
		want  string
	}{
		{func(in *TimingPublishedInput) { in.JD = "52407.3" }, "jd", "full Julian date"},
		{func(in *TimingPublishedInput) { in.JD = "x" }, "jd", "full Julian date"},
		{func(in *TimingPublishedInput) { in.Scale = "tt" }, "scale", "tt"},
		{func(in *TimingPublishedInput) { in.Sigma = "-1" }, "sigma", "uncertainty in days"},
		{func(in *TimingPublishedInput) { in.Kind = "mid" }, "kind", "mid"},
		{func(in *TimingPublishedInput) { in.Kind, in.Secondary = "max", true }, "secondary", "minimum"},
		{func(in *TimingPublishedInput) { in.Source = "  " }, "source", "needs its source"},
	} {
		in := good
		tc.edit(&in)
		_, errs := TimingParsePublished(in, "Ashgrove V4")
		if !strings.Contains(errs[tc.field], tc.want) {
			t.Errorf("%+v: error at %s %q, want it to contain %q (all: %v)", in, tc.field, errs[tc.field], tc.want, errs)
		}
	}
}

// timingLondon is the demo site's time zone.
var timingLondon = func() *time.Location {
	s := demo.Site()
	return s.Location()
}()
