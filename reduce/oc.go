package reduce

import (
	"fmt"
	"math"
	"sort"

	"example.org/vigil/ephem"
)

// OCOptions tunes OC.
type OCOptions struct {
	// Secondary allows half-integer cycles: each timing gets the nearest
	// half-integer cycle, for lists that mix primary and secondary minima.
	Secondary bool
	// AmbiguityFraction: a timing whose |O−C| exceeds this fraction of the
	// cycle spacing (P, or P/2 with Secondary) is flagged as a possibly
	// miscounted cycle. 0 means DefaultAmbiguityFraction.
	AmbiguityFraction float64
}

// DefaultAmbiguityFraction flags |O−C| above 0.3 of the cycle spacing:
// rounding to the nearest cycle is wrong once the true O−C passes one half,
// and 0.3 leaves room for the scatter (common practice).
const DefaultAmbiguityFraction = 0.3

// OCRow is one timing on the O−C diagram.
type OCRow struct {
	Time      float64 // observed time of the extremum (Julian date)
	SigmaDays float64 // its uncertainty, days (0 or NaN when unknown)
	Cycle     float64 // cycle number E (a half-integer for a secondary minimum)
	OCDays    float64 // O − C = Time − T(E), days
	Ambiguous bool    // the cycle count may be wrong; Warning says why
	Warning   string  // the reasons, joined by "; "
}

// OCAnalysis is an O−C diagram with its ephemeris fits.
type OCAnalysis struct {
	Ephemeris ephem.Ephemeris // the ephemeris the O−C are computed with
	Rows      []OCRow         // in the order of the input
	Weighted  bool            // fits weighted by 1/σ² (every timing had σ > 0)

	Linear OCLinear
	// Quadratic is nil when there are fewer than 4 timings or 3 distinct
	// cycles.
	Quadratic *OCQuadratic
	// Preferred is "linear" or "quadratic", by the F-test on the quadratic
	// term at the OCSignificance level; PreferredBy says so with F and p.
	Preferred, PreferredBy string
	FTestF, FTestP         float64

	// Warnings lists what may make the cycle count or the fits unsafe, one
	// sentence each.
	Warnings []string
}

// OC computes the O−C diagram of timings against ephemeris eph and fits it
// (Sterken 2005, ASP Conf. Ser. 335, 3): each timing gets the cycle number
// E nearest to eph.Cycle(t) (the nearest half-integer with opt.Secondary)
// and O−C = t − T(E); then a linear and a quadratic ephemeris are fitted by
// weighted least squares on centred cycle numbers (ocFit), and an F-test on
// the added term at the 1% level says which the data prefer.
//
// With an uncertainty on every timing the fits are weighted by 1/σ² and the
// parameter errors are the formal ones; otherwise χ² is the sum of squared
// residuals (days²) and the errors are scaled by sqrt(χ²/dof). Epochs are
// reported at cycle 0 of eph.
//
// A timing is flagged Ambiguous when |O−C| exceeds opt.AmbiguityFraction of
// the cycle spacing, when three times the ephemeris uncertainty at its cycle
// (eph.Sigma) reaches half the spacing, or when it follows a gap of so many
// cycles that three times the drift from the period's uncertainty reaches
// half the spacing: in each case rounding may have given the wrong E.
//
// Timings must share eph's time scale and type of extremum (never mix HJD
// and BJD, maxima and minima). At least 3 timings are needed.
func OC(eph ephem.Ephemeris, timings []Timing, opt OCOptions) (OCAnalysis, error) {
	if err := eph.Validate(); err != nil {
		return OCAnalysis{}, err
	}
	frac := opt.AmbiguityFraction
	if frac == 0 {
		frac = DefaultAmbiguityFraction
	}
	if math.IsNaN(frac) || frac <= 0 || frac >= 0.5 {
		return OCAnalysis{}, fmt.Errorf("reduce: ambiguity fraction %v: want a number between 0 and 0.5", opt.AmbiguityFraction)
	}
	if len(timings) < 3 {
		return OCAnalysis{}, fmt.Errorf("reduce: %d timings: want at least 3 for an ephemeris fit", len(timings))
	}
	a := OCAnalysis{Ephemeris: eph, Rows: make([]OCRow, len(timings)), Weighted: true}
	step := 1.0
	if opt.Secondary {
		step = 0.5
	}
	cycles := make([]float64, len(timings))
	ocs := make([]float64, len(timings))
	for i, tm := range timings {
		switch {
		case math.IsNaN(tm.Time) || math.IsInf(tm.Time, 0) || tm.Time < 1e6 || tm.Time > 1e7:
			return OCAnalysis{}, &PointError{i, "time", tm.Time, "a full Julian date such as 2460000.1234"}
		case tm.Sigma < 0 || math.IsInf(tm.Sigma, 0):
			return OCAnalysis{}, &PointError{i, "sigma", tm.Sigma, "a positive uncertainty in days (or empty for unknown)"}
		}
		if !(tm.Sigma > 0) {
			a.Weighted = false
		}
		e := math.Round(eph.Cycle(tm.Time)/step) * step
		oc := tm.Time - eph.At(e)
		a.Rows[i] = OCRow{Time: tm.Time, SigmaDays: tm.Sigma, Cycle: e, OCDays: oc}
		cycles[i], ocs[i] = e, oc
	}
	var w []float64
	if a.Weighted {
		w = make([]float64, len(timings))
		for i, tm := range timings {
			w[i] = 1 / (tm.Sigma * tm.Sigma)
		}
	}
	if n := ocDistinct(cycles); n < 2 {
		return OCAnalysis{}, fmt.Errorf("reduce: all %d timings fall on cycle %v: want at least 2 distinct cycles", len(timings), cycles[0])
	}
	var err error
	a.Linear, err = ocLinearFit(eph.Epoch, eph.PeriodDays, cycles, ocs, w)
	if err != nil {
		return OCAnalysis{}, err
	}
	a.Preferred = "linear"
	a.FTestF, a.FTestP = math.NaN(), math.NaN()
	if len(timings) >= 4 && ocDistinct(cycles) >= 3 {
		q, err := ocQuadraticFit(eph.Epoch, eph.PeriodDays, eph.Q, cycles, ocs, w)
		if err != nil {
			return OCAnalysis{}, err
		}
		a.Quadratic = &q
		a.FTestF, a.FTestP = ocFTest(a.Linear, q)
		if a.Linear.rmsDays < ocExactDays {
			a.PreferredBy = fmt.Sprintf("the timings lie on the linear ephemeris to within %.2g d rms: no test needed", ocExactDays)
		} else if a.FTestP < OCSignificance {
			a.Preferred = "quadratic"
			a.PreferredBy = fmt.Sprintf("F-test on the quadratic term: F = %.4g with (1, %d) degrees of freedom, %s, below the %g level",
				a.FTestF, q.Dof, ocPText(a.FTestP), OCSignificance)
			a.Warnings = append(a.Warnings,
				"a parabola in the O−C may also be part of a light-travel-time orbit: check the residuals before claiming a period change")
		} else {
			a.PreferredBy = fmt.Sprintf("F-test on the quadratic term: F = %.4g with (1, %d) degrees of freedom, %s, not below the %g level",
				a.FTestF, q.Dof, ocPText(a.FTestP), OCSignificance)
		}
	} else {
		a.PreferredBy = "too few timings for a quadratic fit: want at least 4 on 3 distinct cycles"
	}
	a.flagAmbiguous(frac, step)
	return a, nil
}

func ocDistinct(cycles []float64) int {
	seen := map[float64]bool{}
	for _, e := range cycles {
		seen[e] = true
		if len(seen) >= 3 {
			break
		}
	}
	return len(seen)
}

// flagAmbiguous marks the rows whose cycle number may be miscounted.
func (a *OCAnalysis) flagAmbiguous(frac, step float64) {
	spacing := step * a.Ephemeris.PeriodDays
	half := spacing / 2
	flag := func(i int, msg string) {
		r := &a.Rows[i]
		if r.Ambiguous {
			r.Warning += "; " + msg
		} else {
			r.Ambiguous, r.Warning = true, msg
		}
		a.Warnings = append(a.Warnings, fmt.Sprintf("timing %d (JD %.5f, cycle %g): %s", i, r.Time, r.Cycle, msg))
	}
	for i, r := range a.Rows {
		if math.Abs(r.OCDays) > frac*spacing {
			flag(i, fmt.Sprintf("|O−C| = %.5f d is %.2f of the cycle spacing %.5f d: the cycle count may be off by one",
				math.Abs(r.OCDays), math.Abs(r.OCDays)/spacing, spacing))
		} else if s := a.Ephemeris.Sigma(r.Cycle); 3*s >= half {
			flag(i, fmt.Sprintf("three times the ephemeris uncertainty at this cycle (%.5f d) reaches half the cycle spacing", 3*s))
		}
	}
	// Gaps: across ΔE cycles without a timing the count drifts by ΔE·σ(P).
	sigP := max(a.Ephemeris.PeriodErr, a.Linear.PeriodErr)
	if !(sigP > 0) {
		return
	}
	order := make([]int, len(a.Rows))
	for i := range order {
		order[i] = i
	}
	sort.Slice(order, func(x, y int) bool { return a.Rows[order[x]].Time < a.Rows[order[y]].Time })
	for k := 1; k < len(order); k++ {
		prev, cur := a.Rows[order[k-1]], a.Rows[order[k]]
		gap := cur.Cycle - prev.Cycle
		if drift := gap * sigP; 3*drift >= half {
			flag(order[k], fmt.Sprintf("follows a gap of %g cycles since JD %.5f: three times the drift from σ(P) = %.2g d is %.4f d, half the cycle spacing or more",
				gap, prev.Time, sigP, 3*drift))
		}
	}
}

// Points returns the O−C diagram as points (T = time, Mag = O−C in days,
// Err = σ) for plotting.
func (a OCAnalysis) Points() []Point {
	p := make([]Point, len(a.Rows))
	for i, r := range a.Rows {
		p[i] = Point{T: r.Time, Mag: r.OCDays, Err: r.SigmaDays}
	}
	return p
}

// ocPText writes a p-value for people: three digits, or "p < 1e-12" below
// the level where a double-precision tail probability means anything.
func ocPText(p float64) string {
	if p < 1e-12 {
		return "p < 1e-12"
	}
	return fmt.Sprintf("p = %.3g", p)
}

// CycleOf returns the cycle number E of an extremum observed at Julian date jd
// (on the ephemeris's time scale) and its O−C = jd − T(E) in days: E is the
// nearest integer cycle, or for a secondary minimum the nearest half-integer
// (Sterken 2005, ASP Conf. Ser. 335, 3).
func CycleOf(eph ephem.Ephemeris, jd float64, secondary bool) (cycle, ocDays float64) {
	if secondary {
		cycle = math.Round(eph.Cycle(jd)-0.5) + 0.5
	} else {
		cycle = math.Round(eph.Cycle(jd))
	}
	return cycle, jd - eph.At(cycle)
}
