package reduce

import (
	"errors"
	"math"
	"strings"
	"testing"

	"example.org/vigil/ephem"
)

// ocMethods11 returns the synthetic timings of methods.md §11 [C]:
// O = T0 + P·E + Q·E² with T0 = 2450000.0, P = 0.4 d, Q = 2.0e-10 d, at
// E = 0, 1000, …, 20000.
func ocMethods11() []Timing {
	var tm []Timing
	for e := 0.0; e <= 20000; e += 1000 {
		tm = append(tm, Timing{Time: 2450000.0 + 0.4*e + 2.0e-10*e*e, Sigma: math.NaN()})
	}
	return tm
}

var ocLinearEph = ephem.Ephemeris{Epoch: 2450000.0, PeriodDays: 0.4, Scale: ephem.BJDTDB}

func TestOCMethods11(t *testing.T) {
	// methods.md §11 [C]: O−C against the linear elements = 0.005, 0.020,
	// 0.080 d at E = 5000, 10000, 20000; the quadratic fit returns
	// Q = 2.0e-10 d and dP/dt = 1.0e-9 d/d = 0.03156 s/yr.
	const (
		ocTol   = 1e-9    // days: rounding of Julian dates near 2.45e6 (~5e-10 d)
		dpdtTol = 0.00001 // s/yr: the published value has 4 digits
	)
	a, err := OC(ocLinearEph, ocMethods11(), OCOptions{})
	if err != nil {
		t.Fatalf("OC: %v", err)
	}
	for _, c := range []struct{ cycle, oc float64 }{{5000, 0.005}, {10000, 0.020}, {20000, 0.080}} {
		r := a.Rows[int(c.cycle/1000)]
		if r.Cycle != c.cycle || math.Abs(r.OCDays-c.oc) > ocTol {
			t.Errorf("row cycle %g: O−C = %.10f, want cycle %g, O−C %.3f (methods.md §11)", r.Cycle, r.OCDays, c.cycle, c.oc)
		}
	}
	q := a.Quadratic
	if q == nil {
		t.Fatalf("no quadratic fit")
	}
	if d := q.Q/2e-10 - 1; math.Abs(d) > 1e-4 {
		t.Errorf("Q = %.6g, want 2.0e-10 (methods.md §11), rel diff %.2g", q.Q, d)
	}
	if d := q.DPdt/1e-9 - 1; math.Abs(d) > 1e-4 {
		t.Errorf("dP/dt = %.6g d/d, want 1.0e-9 (methods.md §11), rel diff %.2g", q.DPdt, d)
	}
	if d := q.DPdtSecPerYear - 0.03156; math.Abs(d) > dpdtTol {
		t.Errorf("dP/dt = %.6f s/yr, want 0.03156 (methods.md §11), diff %.2g, tol %g", q.DPdtSecPerYear, d, dpdtTol)
	}
	if math.Abs(q.Epoch-2450000.0) > ocTol || math.Abs(q.Period-0.4) > ocTol/20000 {
		t.Errorf("quadratic elements T0 = %.9f, P = %.12f, want 2450000.0 and 0.4", q.Epoch, q.Period)
	}
	if a.Preferred != "quadratic" {
		t.Errorf("preferred = %q (%s), want quadratic", a.Preferred, a.PreferredBy)
	}
	if !strings.Contains(strings.Join(a.Warnings, " "), "light-travel-time") {
		t.Errorf("warnings %q: want the caution that a parabola may be part of a light-time orbit (methods.md §11)", a.Warnings)
	}
}

func TestOCExactEphemeris(t *testing.T) {
	// Invariant: timings that follow the ephemeris exactly have O−C = 0,
	// the linear fit returns the ephemeris, and the linear model is
	// preferred.
	const tol = 1e-9 // days
	eph := ephem.Ephemeris{Epoch: 2455123.4567, PeriodDays: 1.2345678, Scale: ephem.HJD}
	var tm []Timing
	for _, e := range []float64{-300, -12, 0, 7, 150, 990, 2001} {
		tm = append(tm, Timing{Time: eph.At(e), Sigma: 0.0005})
	}
	a, err := OC(eph, tm, OCOptions{})
	if err != nil {
		t.Fatalf("OC: %v", err)
	}
	for i, r := range a.Rows {
		if math.Abs(r.OCDays) > tol || r.Ambiguous {
			t.Errorf("row %d: O−C = %g, ambiguous %v, want 0 and not ambiguous", i, r.OCDays, r.Ambiguous)
		}
	}
	if math.Abs(a.Linear.Epoch-eph.Epoch) > tol || math.Abs(a.Linear.Period-eph.PeriodDays) > tol/2000 {
		t.Errorf("linear fit T0 = %.9f, P = %.10f, want %.9f, %.10f", a.Linear.Epoch, a.Linear.Period, eph.Epoch, eph.PeriodDays)
	}
	if a.Preferred != "linear" {
		t.Errorf("preferred = %q (%s), want linear", a.Preferred, a.PreferredBy)
	}
}

func TestOCAmbiguity(t *testing.T) {
	// methods.md §11 [C]: with P in error by 1e-4 d the drift reaches
	// 0.2 d = P/2 after 2000 cycles and E flips. Timings made with
	// P = 0.4001 d against the ephemeris P = 0.4 d drift by 1e-4·E: rows
	// past |O−C| = 0.3 P = 0.12 d (E > 1200) must be flagged, earlier ones
	// not.
	var tm []Timing
	var trueE []float64
	for e := 0.0; e <= 2600; e += 200 {
		tm = append(tm, Timing{Time: 2450000.0 + 0.4001*e, Sigma: math.NaN()})
		trueE = append(trueE, e)
	}
	a, err := OC(ocLinearEph, tm, OCOptions{})
	if err != nil {
		t.Fatalf("OC: %v", err)
	}
	for i, r := range a.Rows {
		drift := 1e-4 * trueE[i]
		want := drift > 0.3*0.4 && drift < 0.7*0.4 // wrapped O−C also near ±P/2
		if r.Ambiguous != want {
			t.Errorf("cycle %g (true %g, drift %.2f d): ambiguous = %v (%s), want %v", r.Cycle, trueE[i], drift, r.Ambiguous, r.Warning, want)
		}
		if trueE[i] > 2000 && r.Cycle == trueE[i] {
			t.Errorf("true cycle %g: rounding gave %g; past the flip it must be off by one (methods.md §11)", trueE[i], r.Cycle)
		}
	}
}

func TestOCGapWarning(t *testing.T) {
	// A gap of 5000 cycles: with σ(P) = 1e-5 d three times the drift,
	// 3 × 5000 × 1e-5 = 0.15 d, stays below P/2 = 0.2 d; with σ(P) = 2e-5 d
	// it reaches 0.3 d, and the first timing after the gap is flagged.
	var tm []Timing
	for _, e := range []float64{0, 1, 2, 3, 5003, 5004} {
		tm = append(tm, Timing{Time: 2450000.0 + 0.4*e, Sigma: 0.001})
	}
	for _, c := range []struct {
		sigP float64
		want bool
	}{{1e-5, false}, {2e-5, true}} {
		eph := ocLinearEph
		eph.PeriodErr = c.sigP
		a, err := OC(eph, tm, OCOptions{})
		if err != nil {
			t.Fatalf("OC: %v", err)
		}
		got := a.Rows[4].Ambiguous && strings.Contains(a.Rows[4].Warning, "gap")
		if got != c.want {
			t.Errorf("σ(P) = %g: timing after the gap flagged = %v (%q), want %v", c.sigP, got, a.Rows[4].Warning, c.want)
		}
		for _, i := range []int{0, 1, 2, 3, 5} {
			if a.Rows[i].Ambiguous && strings.Contains(a.Rows[i].Warning, "gap") {
				t.Errorf("σ(P) = %g: timing %d flagged for a gap: %s", c.sigP, i, a.Rows[i].Warning)
			}
		}
	}
}

func TestOCSecondary(t *testing.T) {
	// Secondary minima at E + 0.5 get half-integer cycles with Secondary,
	// and O−C about −P/2 (ambiguous) without.
	var tm []Timing
	for _, e := range []float64{0, 10.5, 20, 30.5, 41} {
		tm = append(tm, Timing{Time: ocLinearEph.At(e) + 0.001, Sigma: math.NaN()})
	}
	a, err := OC(ocLinearEph, tm, OCOptions{Secondary: true})
	if err != nil {
		t.Fatalf("OC: %v", err)
	}
	for i, r := range a.Rows {
		if want := ocLinearEph.Cycle(tm[i].Time - 0.001); math.Abs(r.Cycle-want) > 1e-9 || math.Abs(r.OCDays-0.001) > 1e-9 {
			t.Errorf("row %d: cycle %g, O−C %.6f; want %g and 0.001", i, r.Cycle, r.OCDays, want)
		}
	}
	b, err := OC(ocLinearEph, tm, OCOptions{})
	if err != nil {
		t.Fatalf("OC: %v", err)
	}
	if !b.Rows[1].Ambiguous {
		t.Errorf("secondary minimum without Secondary: O−C %.4f d, want it flagged", b.Rows[1].OCDays)
	}
}

func TestOCBadInput(t *testing.T) {
	good := ocMethods11()
	with := func(i int, x Timing) []Timing {
		tm := append([]Timing(nil), good...)
		tm[i] = x
		return tm
	}
	bad := ocLinearEph
	bad.PeriodDays = -1
	cases := []struct {
		name     string
		eph      ephem.Ephemeris
		tm       []Timing
		opt      OCOptions
		wantText string
		index    int
	}{
		{"two timings", ocLinearEph, good[:2], OCOptions{}, "2 timings", -1},
		{"NaN time", ocLinearEph, with(4, Timing{Time: math.NaN()}), OCOptions{}, "time", 4},
		{"negative sigma", ocLinearEph, with(2, Timing{Time: good[2].Time, Sigma: -0.001}), OCOptions{}, "sigma", 2},
		{"bad ephemeris", bad, good, OCOptions{}, "period -1", -1},
		{"one cycle", ocLinearEph, []Timing{good[3], good[3], good[3]}, OCOptions{}, "distinct cycles", -1},
		{"ambiguity fraction", ocLinearEph, good, OCOptions{AmbiguityFraction: 0.7}, "0.7", -1},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := OC(tc.eph, tc.tm, tc.opt)
			if err == nil || !strings.Contains(err.Error(), tc.wantText) {
				t.Fatalf("err = %v, want one mentioning %q", err, tc.wantText)
			}
			var ie *PointError
			if tc.index >= 0 && (!errors.As(err, &ie) || ie.Index != tc.index) {
				t.Errorf("err = %v, want a *PointError at %d", err, tc.index)
			}
		})
	}
}

func TestOCThreeTimings(t *testing.T) {
	// Three timings allow the linear fit only: no quadratic, preferred
	// linear, and the reason says so.
	a, err := OC(ocLinearEph, ocMethods11()[:3], OCOptions{})
	if err != nil {
		t.Fatalf("OC: %v", err)
	}
	if a.Quadratic != nil || a.Preferred != "linear" || !strings.Contains(a.PreferredBy, "too few") {
		t.Errorf("quadratic %v, preferred %q (%s): want none, linear, too few", a.Quadratic, a.Preferred, a.PreferredBy)
	}
}

// TestCycleOf checks the cycle and O−C of single timings against an exact
// linear ephemeris (methods.md §6: Max = 2436075.445 + 5.366341 E, δ Cep,
// GCVS), primary and secondary.
func TestCycleOf(t *testing.T) {
	eph := ephem.Ephemeris{Epoch: 2436075.445, PeriodDays: 5.366341, Scale: ephem.HJD}
	for _, tc := range []struct {
		name      string
		jd        float64
		secondary bool
		cycle, oc float64
	}{
		{"on the ephemeris, E = 4583 (methods.md §6)", 2436075.445 + 5.366341*4583, false, 4583, 0},
		{"late by 0.01 d", 2436075.445 + 5.366341*4583 + 0.01, false, 4583, 0.01},
		{"early by 0.2 P", 2436075.445 + 5.366341*(4583-0.2), false, 4583, -0.2 * 5.366341},
		{"secondary at E + 0.5", 2436075.445 + 5.366341*4583.5 - 0.003, true, 4583.5, -0.003},
	} {
		c, oc := CycleOf(eph, tc.jd, tc.secondary)
		if c != tc.cycle || math.Abs(oc-tc.oc) > 1e-6 {
			t.Errorf("%s: CycleOf = %v, %.7f d; want %v, %.7f d", tc.name, c, oc, tc.cycle, tc.oc)
		}
	}
}
