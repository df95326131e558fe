package reduce

import (
	"errors"
	"math"
	"testing"

	"example.org/vigil/ephem"
)

// ltEphemeris is the ephemeris of the light-time tables of
// make_timing_refs.py.
var ltEphemeris = ephem.Ephemeris{Epoch: 2451000.0, PeriodDays: 0.8, Scale: ephem.BJDTDB}

// ltAnalysis reads a light-time table and computes its O−C diagram.
func ltAnalysis(t *testing.T, name string) OCAnalysis {
	t.Helper()
	timings, cycles := ocReadTimings(t, name, true)
	a, err := OC(ltEphemeris, timings, OCOptions{})
	if err != nil {
		t.Fatalf("OC: %v", err)
	}
	for i, r := range a.Rows {
		if r.Cycle != cycles[i] {
			t.Fatalf("%s row %d: cycle %g, table %g", name, i, r.Cycle, cycles[i])
		}
	}
	return a
}

func TestLightTimeIrwinTau(t *testing.T) {
	// Irwin (1952) τ for A = 0.015 d, P3 = 3300 d, T_peri = 2454000.0,
	// e = 0.45, ω = 60°, against numpy (Kepler's equation by Newton
	// iteration) in irwin_tau.csv.
	const tol = 1e-12 // days
	q := []float64{0.015, 3300, 0, 0.45, 60 * math.Pi / 180}
	for _, r := range timingReadCSV(t, "irwin_tau.csv") {
		tt, want := timingFloat(t, r, "time"), timingFloat(t, r, "tau")
		got := ltTau(q, true, tt-2454000.0)
		if math.Abs(got-want) > tol {
			t.Errorf("τ(JD %.1f) = %.15f d, numpy %.15f, diff %.2g", tt, got, want, got-want)
		}
	}
}

func TestLightTimeCircularNumpy(t *testing.T) {
	// make_timing_refs.py fits the same circular orbit by a period grid
	// with np.linalg.lstsq at each period, golden-section refinement and a
	// covariance from a central-difference Jacobian. Tolerances: the
	// optimum to 1% of its σ; errors to 2% (the numpy Jacobian uses
	// different steps).
	refs := timingRefs(t)
	a := ltAnalysis(t, "lighttime_circ.csv")
	f, err := LightTime(a, LightTimeOptions{})
	if err != nil {
		t.Fatalf("LightTime: %v", err)
	}
	ref := func(k string) float64 { return timingRef(t, refs, k) }
	check := func(name string, got, want, tol float64) {
		if d := got - want; math.Abs(d) > tol {
			t.Errorf("%s = %.8g, numpy %.8g, diff %.3g, tol %.3g", name, got, want, d, tol)
		}
	}
	pErr, aErr, tErr := ref("ltc_period_err"), ref("ltc_amplitude_err"), ref("ltc_tmax_err")
	check("P3", f.PeriodDays, ref("ltc_period"), 0.01*pErr)
	check("A", f.AmplitudeDays, ref("ltc_amplitude"), 0.01*aErr)
	// The time of greatest delay is defined modulo P3.
	dt := math.Remainder(f.OrbitEpochJD-ref("ltc_tmax"), f.PeriodDays)
	check("time of greatest delay (mod P3)", dt, 0, 0.01*tErr)
	check("σ(P3)", f.PeriodErr, pErr, 0.02*pErr)
	check("σ(A)", f.AmplitudeErr, aErr, 0.02*aErr)
	check("σ(T)", f.OrbitEpochErr, tErr, 0.02*tErr)
	check("χ²", f.Chi2, ref("ltc_chi2"), 1e-6*ref("ltc_chi2"))
	// And the truth the data were made with lies within 3σ.
	check("P3 vs truth", f.PeriodDays, ref("ltc_true_period"), 3*f.PeriodErr)
	check("A vs truth", f.AmplitudeDays, ref("ltc_true_amplitude"), 3*f.AmplitudeErr)
	if !(f.FTestP < 1e-6) {
		t.Errorf("F-test p = %g for a 6σ orbit, want a clear detection", f.FTestP)
	}
}

func TestLightTimeEccentric(t *testing.T) {
	// Timings made with an eccentric orbit (make_timing_refs.py): the fit
	// must recover each element within 3σ, and its σ must agree within 30%
	// with the errors numpy expects from the Fisher matrix at the true
	// elements (the two are evaluated at different points).
	refs := timingRefs(t)
	a := ltAnalysis(t, "lighttime_ecc.csv")
	f, err := LightTime(a, LightTimeOptions{Eccentric: true})
	if err != nil {
		t.Fatalf("LightTime: %v", err)
	}
	cases := []struct {
		name      string
		got, sig  float64
		key       string
		wrapRange float64
	}{
		{"A", f.AmplitudeDays, f.AmplitudeErr, "amplitude", 0},
		{"P3", f.PeriodDays, f.PeriodErr, "period", 0},
		{"T_peri", f.OrbitEpochJD, f.OrbitEpochErr, "tperi", f.PeriodDays},
		{"e", f.Eccentricity, f.EccentricityErr, "e", 0},
		{"ω", f.OmegaDeg, f.OmegaErr, "omega_deg", 360},
	}
	for _, c := range cases {
		want := timingRef(t, refs, "lte_true_"+c.key)
		wantErr := timingRef(t, refs, "lte_expected_"+c.key+"_err")
		d := c.got - want
		if c.wrapRange > 0 {
			d = math.Remainder(d, c.wrapRange)
		}
		if math.Abs(d) > 3*c.sig {
			t.Errorf("%s = %.6g ± %.3g, truth %.6g: off by %.1fσ, want within 3σ", c.name, c.got, c.sig, want, d/c.sig)
		}
		if r := c.sig / wantErr; r < 1/1.3 || r > 1.3 {
			t.Errorf("σ(%s) = %.4g, numpy Fisher matrix %.4g: ratio %.2f, want within 30%%", c.name, c.sig, wantErr, r)
		}
	}
	// The ephemeris the data were made with: T0 − 0.001 d, P + 1e-7 d.
	eph := f.Ephemeris
	if d := eph.Epoch - (2451000.0 - 0.001); math.Abs(d) > 3*eph.EpochErr {
		t.Errorf("T0 = %.6f ± %.2g, want 2450999.999 within 3σ", eph.Epoch, eph.EpochErr)
	}
	if d := eph.PeriodDays - (0.8 + 1e-7); math.Abs(d) > 3*eph.PeriodErr {
		t.Errorf("P = %.10f ± %.2g, want 0.8000001 within 3σ", eph.PeriodDays, eph.PeriodErr)
	}
	// The fitted curve leaves residuals at the noise (σ = 0.0015 d): a
	// reduced χ² near 1 (within 0.7–1.3 for ~140 degrees of freedom).
	if r := f.Chi2 / float64(f.Dof); r < 0.7 || r > 1.3 {
		t.Errorf("reduced χ² = %.3f, want about 1", r)
	}
	// OC(t) is the model: at each timing it reproduces O−C up to the
	// residual, whose rms must match χ².
	ss := 0.0
	for _, r := range a.Rows {
		d := r.OCDays - f.OC(r.Time)
		ss += d * d / (r.SigmaDays * r.SigmaDays)
	}
	if math.Abs(ss/f.Chi2-1) > 1e-6 {
		t.Errorf("Σ((O−C − OC(t))/σ)² = %.6g, χ² = %.6g: the curve is not the fitted model", ss, f.Chi2)
	}
}

func TestLightTimeRefuses(t *testing.T) {
	a := ltAnalysis(t, "lighttime_circ.csv")
	span := 0.0
	for _, r := range a.Rows {
		span = max(span, r.Time-a.Rows[0].Time)
	}
	short := a
	short.Rows = a.Rows[:9]
	cases := []struct {
		name string
		a    OCAnalysis
		opt  LightTimeOptions
		want error
	}{
		{"trial period over span/1.5", a, LightTimeOptions{MaxPeriodDays: span}, ErrShortSpan},
		{"too few timings", short, LightTimeOptions{Eccentric: true}, nil},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := LightTime(tc.a, tc.opt)
			if err == nil || (tc.want != nil && !errors.Is(err, tc.want)) {
				t.Errorf("err = %v, want %v", err, tc.want)
			}
		})
	}
}
