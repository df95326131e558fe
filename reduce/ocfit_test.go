package reduce

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"

	"example.org/vigil/ephem"
)

func TestOCFitMeeusQuadratic(t *testing.T) {
	// Meeus (1998), Astronomical Algorithms, p. 40 (ch. 4): the points
	// x = −4…2, y = −6, −1, 2, 3, 2, −1, −6 lie exactly on
	// y = −x² − 2x + 2 (methods.md §11 [L]).
	const tol = 1e-12
	x := []float64{-4, -3, -2, -1, 0, 1, 2}
	y := []float64{-6, -1, 2, 3, 2, -1, -6}
	want := []float64{2, -2, -1}
	coef, _, chi2, p, err := ocFit(x, y, nil, 2)
	if err != nil {
		t.Fatalf("ocFit: %v", err)
	}
	for k := range want {
		if d := coef[k] - want[k]; math.Abs(d) > tol {
			t.Errorf("coefficient of x^%d = %.15g, want %g (Meeus p. 40), diff %g", k, coef[k], want[k], d)
		}
	}
	if chi2 > tol {
		t.Errorf("χ² = %g, want 0 for exact points", chi2)
	}
	for i, xi := range x {
		if d := p.at(xi) - y[i]; math.Abs(d) > tol {
			t.Errorf("fitted curve at x = %g: %g, want %g", xi, p.at(xi), y[i])
		}
	}
}

func TestOCFitFTestClosedForms(t *testing.T) {
	// The F-test's tail with (1, d) degrees of freedom is that of Student's
	// t with d degrees of freedom, two-sided, at t = √F; closed forms for
	// d = 1 (Cauchy): p = 1 − (2/π) atan √F, and d = 2: p = 1 − √(F/(F + 2))
	// (Abramowitz & Stegun 1964, 26.7 [from memory]).
	const tol = 1e-12
	for _, f := range []float64{0.5, 3, 12.7, 98.5} {
		cases := []struct {
			d    float64
			want float64
		}{
			{1, 1 - 2/math.Pi*math.Atan(math.Sqrt(f))},
			{2, 1 - math.Sqrt(f/(f+2))},
		}
		for _, c := range cases {
			got := distuv.F{D1: 1, D2: c.d}.Survival(f)
			if math.Abs(got-c.want) > tol {
				t.Errorf("F = %g, (1, %g) dof: p = %.15g, want %.15g", f, c.d, got, c.want)
			}
		}
	}
}

// ocReadTimings reads a timing table (time, optional sigma, cycle).
func ocReadTimings(t testing.TB, name string, withSigma bool) (tm []Timing, cycles []float64) {
	t.Helper()
	for _, r := range timingReadCSV(t, name) {
		x := Timing{Time: timingFloat(t, r, "time"), Sigma: math.NaN()}
		if withSigma {
			x.Sigma = timingFloat(t, r, "sigma")
		}
		tm = append(tm, x)
		cycles = append(cycles, timingFloat(t, r, "cycle"))
	}
	return tm, cycles
}

func TestOCFitNumpy(t *testing.T) {
	// make_timing_refs.py fits the same O−C with np.polyfit (weights 1/σ,
	// covariance "unscaled" = formal; or unweighted with the covariance
	// scaled by χ²/(n − p)), cross-checked with np.linalg.lstsq. Ephemeris
	// T0 = 2450000.0, P = 0.4 d (methods.md §11 synthetic case, with noise).
	const (
		epochTol = milli * second // implementation agreement, 1 ms
		relTol   = 1e-6           // errors, χ², Q, dP/dt
	)
	refs := timingRefs(t)
	eph := ephem.Ephemeris{Epoch: 2450000.0, PeriodDays: 0.4, Scale: ephem.BJDTDB}
	for _, tc := range []struct {
		name, file, key string
		weighted        bool
	}{
		{"weighted", "oc_noisy.csv", "oc_weighted", true},
		{"unweighted", "oc_unweighted.csv", "oc_unweighted", false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			timings, cycles := ocReadTimings(t, tc.file, tc.weighted)
			a, err := OC(eph, timings, OCOptions{})
			if err != nil {
				t.Fatalf("OC: %v", err)
			}
			if a.Weighted != tc.weighted {
				t.Errorf("Weighted = %v, want %v", a.Weighted, tc.weighted)
			}
			for i, r := range a.Rows {
				if r.Cycle != cycles[i] {
					t.Errorf("row %d: cycle %g, numpy %g", i, r.Cycle, cycles[i])
				}
			}
			ref := func(name string) float64 { return timingRef(t, refs, tc.key+"_"+name) }
			abs := func(name string, got, want, tol float64) {
				if d := got - want; math.Abs(d) > tol {
					t.Errorf("%s = %.12g, numpy %.12g, diff %.3g, tol %.3g", name, got, want, d, tol)
				}
			}
			rel := func(name string, got, want float64) {
				if d := got/want - 1; math.Abs(d) > relTol {
					t.Errorf("%s = %.10g, numpy %.10g, rel diff %.3g, tol %g", name, got, want, d, relTol)
				}
			}
			l, q := a.Linear, a.Quadratic
			abs("linear epoch", l.Epoch, ref("linear_epoch"), epochTol)
			abs("linear period", l.Period, ref("linear_period"), epochTol/20000)
			rel("linear epoch_err", l.EpochErr, ref("linear_epoch_err"))
			rel("linear period_err", l.PeriodErr, ref("linear_period_err"))
			rel("linear cov(T0, P)", l.CovEpochPeriod, ref("linear_cov_epoch_period"))
			rel("linear chi2", l.Chi2, ref("linear_chi2"))
			if l.Dof != int(ref("linear_dof")) {
				t.Errorf("linear dof = %d, numpy %v", l.Dof, ref("linear_dof"))
			}
			if q == nil {
				t.Fatalf("no quadratic fit")
			}
			abs("quadratic epoch", q.Epoch, ref("quadratic_epoch"), epochTol)
			abs("quadratic period", q.Period, ref("quadratic_period"), epochTol/20000)
			rel("quadratic epoch_err", q.EpochErr, ref("quadratic_epoch_err"))
			rel("quadratic period_err", q.PeriodErr, ref("quadratic_period_err"))
			rel("quadratic q", q.Q, ref("quadratic_q"))
			rel("quadratic q_err", q.QErr, ref("quadratic_q_err"))
			rel("quadratic dpdt", q.DPdt, ref("quadratic_dpdt"))
			rel("quadratic dpdt_err", q.DPdtErr, ref("quadratic_dpdt_err"))
			rel("quadratic chi2", q.Chi2, ref("quadratic_chi2"))
			rel("F", a.FTestF, ref("ftest_f"))
			if q.Dof != int(ref("quadratic_dof")) {
				t.Errorf("quadratic dof = %d, numpy %v", q.Dof, ref("quadratic_dof"))
			}
			if a.Preferred != "quadratic" {
				t.Errorf("preferred %q (%s), want quadratic: the data were made with Q = 2e-10 d", a.Preferred, a.PreferredBy)
			}
			// The data were made with Q = 2e-10 d (dP/dt = 1e-9): the fit
			// must find it within 3σ.
			if d := q.Q - 2e-10; math.Abs(d) > 3*q.QErr {
				t.Errorf("Q = %.4g ± %.2g, want 2e-10 within 3σ", q.Q, q.QErr)
			}
		})
	}
}

func TestOCFitCurves(t *testing.T) {
	// The fitted curves are the O−C that the fitted elements predict:
	// OC(E) = T_fit(E) − T_eph(E), computed from the reported elements.
	const tol = 1e-9 // days; differences of Julian dates near 2.45e6
	timings, _ := ocReadTimings(t, "oc_noisy.csv", true)
	eph := ephem.Ephemeris{Epoch: 2450000.0, PeriodDays: 0.4, Scale: ephem.BJDTDB}
	a, err := OC(eph, timings, OCOptions{})
	if err != nil {
		t.Fatalf("OC: %v", err)
	}
	q := a.Quadratic
	for _, e := range []float64{0, 3000, 12345, 20000} {
		lin := a.Linear.Epoch + a.Linear.Period*e - eph.At(e)
		quad := q.Epoch + q.Period*e + q.Q*e*e - eph.At(e)
		if d := a.Linear.OC(e) - lin; math.Abs(d) > tol {
			t.Errorf("linear OC(%g) = %.9f, from elements %.9f", e, a.Linear.OC(e), lin)
		}
		if d := q.OC(e) - quad; math.Abs(d) > tol {
			t.Errorf("quadratic OC(%g) = %.9f, from elements %.9f", e, q.OC(e), quad)
		}
	}
}
