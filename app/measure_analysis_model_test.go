package app

import (
	"context"
	"fmt"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/stat"
	"gonum.org/v1/plot"

	"example.org/vigil/app/chart"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// measureBusiestNight returns the request of the demo night with the most
// measurements of the star, and the data loaded for it.
func measureBusiestNight(t *testing.T, lb *logbook.Logbook, star string) (MeasureRequest, MeasureData) {
	t.Helper()
	tg, err := lb.Target(star)
	if err != nil {
		t.Fatal(err)
	}
	all, err := lb.MeasurementsOf(star, 0)
	if err != nil {
		t.Fatal(err)
	}
	count := map[int64]int{}
	var best int64
	for _, m := range all {
		count[m.NightID]++
		if count[m.NightID] > count[best] {
			best = m.NightID
		}
	}
	n, err := lb.NightByID(best)
	if err != nil {
		t.Fatal(err)
	}
	site, err := lb.Site(n.Site)
	if err != nil {
		t.Fatal(err)
	}
	r := MeasureRequest{Target: tg, Site: site, Date: n.Date}
	d, err := LoadMeasure(lb, r)
	if err != nil {
		t.Fatal(err)
	}
	if d.Night.ID != best || len(d.Tonight()) != count[best] {
		t.Fatalf("loaded night %d with %d rows, want night %d with %d", d.Night.ID, len(d.Tonight()), best, count[best])
	}
	return r, d
}

// The check star's summary is reduce's for the night's frames, and its mean
// and scatter are those gonum's stat.MeanStdDev gives for the check star's
// reduced magnitudes (the sample standard deviation, n − 1).
func TestMeasureCheckSummary(t *testing.T) {
	lb := measureDemo(t)
	r, d := measureBusiestNight(t, lb, "Ashgrove V1")
	a, err := AnalyseMeasure(context.Background(), d, MeasureThisNight)
	if err != nil {
		t.Fatal(err)
	}
	if a.RedErr != nil || a.Red == nil || a.Red.Check == nil {
		t.Fatalf("no joint reduction: %v", a.RedErr)
	}
	// The same frames reduced here, straight from the logbook's raw values.
	p := reduce.Photometry{Star: r.Target.Star, Site: &r.Site.Site, Check: &reduce.Comp{ID: r.Target.Checks[0].ID, Mag: r.Target.Checks[0].V}}
	for _, c := range r.Target.Comps {
		p.Comps = append(p.Comps, reduce.Comp{ID: c.ID, Mag: c.V})
	}
	var exps []reduce.Exposure
	for _, m := range d.Tonight() {
		e := reduce.NewExposure(m.JDUTC, len(p.Comps))
		e.Filter, e.Target = m.Filter, reduce.Inst{Mag: m.InstMag, Err: m.InstErr, Airmass: m.Airmass}
		for j, c := range p.Comps {
			for _, raw := range m.Comps {
				if raw.Label == c.ID {
					e.Comps[j] = reduce.Inst{Mag: raw.InstMag, Err: raw.InstErr, Airmass: math.NaN()}
				}
			}
		}
		for _, raw := range m.Checks {
			if raw.Label == p.Check.ID {
				e.Check = reduce.Inst{Mag: raw.InstMag, Err: raw.InstErr, Airmass: math.NaN()}
			}
		}
		exps = append(exps, e)
	}
	want, err := p.Reduce(exps)
	if err != nil {
		t.Fatal(err)
	}
	if *a.Red.Check != *want.Check {
		t.Errorf("check summary: got %+v, reduce gives %+v", *a.Red.Check, *want.Check)
	}
	var mags []float64
	for _, row := range a.Red.Rows {
		if !math.IsNaN(row.CheckMag) {
			mags = append(mags, row.CheckMag)
		}
	}
	mean, std := stat.MeanStdDev(mags, nil)
	const tol = 1e-9 // mag: rounding of sums over some hundred values
	c := a.Red.Check
	if math.Abs(c.Mean-mean) > tol || math.Abs(c.Std-std) > tol || c.N != len(mags) {
		t.Errorf("check mean %.6f, std %.6f over %d; gonum: %.6f, %.6f over %d", c.Mean, c.Std, c.N, mean, std, len(mags))
	}
	if len(a.Check) != c.N || len(a.Target) != len(d.Tonight()) {
		t.Errorf("points: %d check, %d target; want %d and %d", len(a.Check), len(a.Target), c.N, len(d.Tonight()))
	}
	// The summary says it in words, with reduce's numbers.
	text := measureNotesText(a.Summary())
	for _, want := range []string{
		fmt.Sprintf("Check star %s (catalogue %.3f mag): mean %.3f mag, scatter %.3f mag (sample standard deviation, n = %d)", c.ID, c.CatalogMag, c.Mean, c.Std, c.N),
		"comparison stars C1, C2 and C3",
		"more than 0.05 mag off its catalogue value or scatters by more than 0.03 mag (common practice)",
	} {
		if !strings.Contains(text, want) {
			t.Errorf("summary lacks %q:\n%s", want, text)
		}
	}
}

func measureNotesText(ns []MeasureNote) string {
	var b strings.Builder
	for _, n := range ns {
		b.WriteString(n.Text + "\n")
	}
	return b.String()
}

// A comparison star whose catalogue magnitude is 0.3 mag wrong is left out
// of the joint reduction, and the summary says so and why.
func TestMeasureRejectedComp(t *testing.T) {
	lb := measureDemo(t)
	_, d := measureBusiestNight(t, lb, "Ashgrove V4")
	d.Request.Target.Comps[1].V += 0.3
	a, err := AnalyseMeasure(context.Background(), d, MeasureThisNight)
	if err != nil {
		t.Fatal(err)
	}
	if a.Red == nil || len(a.Red.Rejected) != 1 || a.Red.Rejected[0].ID != d.Request.Target.Comps[1].ID {
		t.Fatalf("rejected: %+v, want %s", a.Red.Rejected, d.Request.Target.Comps[1].ID)
	}
	text := measureNotesText(a.Summary())
	if !strings.Contains(text, "Comparison star "+d.Request.Target.Comps[1].ID+" left out: its zero point differs") {
		t.Errorf("summary does not name the rejected star and why:\n%s", text)
	}
}

// The charts of a night, of every night and of a visual star build.
func TestMeasureChartsBuild(t *testing.T) {
	lb := measureDemo(t)
	cases := []struct {
		star  string
		scope MeasureScope
		bins  int
	}{
		{"Ashgrove V1", MeasureThisNight, 0},
		{"Ashgrove V1", MeasureAllNights, 20},
		{"Ashgrove V8", MeasureAllNights, 10},
	}
	for _, tc := range cases {
		_, d := measureBusiestNight(t, lb, tc.star)
		a, err := AnalyseMeasure(context.Background(), d, tc.scope)
		if err != nil {
			t.Fatal(err)
		}
		for _, pal := range []chart.Palette{chart.DefaultPalette(), chart.NightRedPalette()} {
			lc, err := measureLightSource(a)(context.Background(), pal)
			if err != nil {
				t.Errorf("%s %v: light curve: %v", tc.star, tc.scope, err)
			} else if p, ok := lc.(*plot.Plot); !ok {
				t.Errorf("%s %v: light curve is a %T, want a *plot.Plot", tc.star, tc.scope, lc)
			} else if _, inv := p.Y.Scale.(plot.InvertedScale); !inv {
				t.Errorf("%s %v: the magnitude axis is not inverted (brighter up)", tc.star, tc.scope)
			}
			if _, err := measurePhaseSource(a, tc.bins)(context.Background(), pal); err != nil {
				t.Errorf("%s %v: phase curve: %v", tc.star, tc.scope, err)
			}
		}
		ld := a.LightCurveData()
		if (tc.scope == MeasureThisNight) != (ld.Clock != nil) {
			t.Errorf("%s %v: clock axis %v", tc.star, tc.scope, ld.Clock)
		}
		pd, _ := a.PhaseData(tc.bins)
		if len(pd.Points) != len(a.Target) || (tc.bins > 0 && len(pd.Binned) == 0) {
			t.Errorf("%s %v: %d folded of %d points, %d bins", tc.star, tc.scope, len(pd.Points), len(a.Target), len(pd.Binned))
		}
		if tc.star == "Ashgrove V8" {
			if s := measureNotesText(a.Summary()); !strings.Contains(s, "Visual estimates only") {
				t.Errorf("summary of a visual star: %q", s)
			}
		}
	}
}

// The check star is moved clear of the target only when they overlap.
func TestMeasureCheckOffset(t *testing.T) {
	pts := func(ms ...float64) []reduce.Point {
		var out []reduce.Point
		for _, m := range ms {
			out = append(out, reduce.Point{Mag: m})
		}
		return out
	}
	cases := []struct {
		target, check []reduce.Point
		want          float64
	}{
		{pts(11.6, 12.0), pts(11.7, 11.75), 0.5}, // 12.0 + 0.2 − 11.7 = 0.5
		{pts(11.6, 12.0), pts(12.5, 12.6), 0},    // already below
		{pts(11.6, 12.0), pts(10.2, 10.3), 0},    // above
		{pts(11.6, 12.0), nil, 0},
	}
	const tol = 1e-9
	for i, tc := range cases {
		if got := measureCheckOffset(tc.target, tc.check); math.Abs(got-tc.want) > tol {
			t.Errorf("case %d: offset %v, want %v", i, got, tc.want)
		}
	}
}
