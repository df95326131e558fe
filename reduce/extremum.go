package reduce

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"sort"
	"strconv"
)

// ExtremumKind says which extremum of a light curve is timed.
type ExtremumKind string

// The two extrema. Magnitudes grow fainter upwards, so Maximum (maximum
// light) is the SMALLEST magnitude and Minimum the largest.
const (
	Maximum ExtremumKind = "max"
	Minimum ExtremumKind = "min"
)

// ExtremumMethod names a way of timing an extremum; its value is the word the
// command line takes after --method.
type ExtremumMethod string

// The timing methods.
const (
	// MethodPoly fits a polynomial around the extremum and solves dm/dt = 0.
	MethodPoly ExtremumMethod = "poly"
	// MethodKvW is the method of Kwee & van Woerden (1956), BAN 12, 327,
	// for symmetric minima.
	MethodKvW ExtremumMethod = "kvw"
)

// ParseExtremumKind reads "max" or "min" (the --kind flag).
func ParseExtremumKind(s string) (ExtremumKind, error) {
	switch k := ExtremumKind(s); k {
	case Maximum, Minimum:
		return k, nil
	}
	return "", fmt.Errorf("reduce: extremum kind %q: want max or min", s)
}

// ParseExtremumMethod reads "poly" or "kvw" (the --method flag).
func ParseExtremumMethod(s string) (ExtremumMethod, error) {
	switch m := ExtremumMethod(s); m {
	case MethodPoly, MethodKvW:
		return m, nil
	}
	return "", fmt.Errorf("reduce: extremum method %q: want poly or kvw", s)
}

// ErrOneSided is wrapped by the error Extremum returns when the data do not
// cover both sides of the extremum: the brightest (or faintest) part of the
// curve lies at an end of the data, or too few points lie on one side of the
// fitted time.
var ErrOneSided = errors.New("data do not cover both sides of the extremum")

// ErrNoExtremum is wrapped by the error Extremum returns when the data show no
// extremum of the requested kind: the curve is flat within its noise, or the
// fit has no turning point of that kind inside the window.
var ErrNoExtremum = errors.New("no extremum of the requested kind in the data")

// PointError reports one unusable input point: Index is its position
// in the slice given (from 0), so that a caller reading a file can name the
// line; Field is "time", "mag" or "err".
type PointError struct {
	Index int
	Field string
	Value float64
	Want  string
}

func (e *PointError) Error() string {
	return fmt.Sprintf("reduce: point %d: %s %s: want %s", e.Index, e.Field, timingNum(e.Value), e.Want)
}

// timingNum formats a number for an error message in full, without an
// exponent: Julian dates read as typed (2460000.5, not 2.4600005e+06).
func timingNum(v float64) string { return strconv.FormatFloat(v, 'f', -1, 64) }

// ExtremumOptions tunes Extremum. The zero value times a maximum by a
// polynomial (degree 3, or 4 when the data ask for it) in a window chosen
// from the data, with DefaultBootstrap resamples.
type ExtremumOptions struct {
	Kind   ExtremumKind   // Maximum (default when empty) or Minimum
	Method ExtremumMethod // MethodPoly (default when empty) or MethodKvW

	// WindowDays is the full width (days) of a window centred on the
	// extremum; 0 lets the data choose it (see Extremum). From and To, when
	// To > From, fix the window instead as the time range [From, To] (Julian
	// dates), with no recentring.
	WindowDays float64
	From, To   float64

	// Degree of the polynomial (2 to 4); 0 chooses it from the data.
	Degree int
	// Folds is the number of trial times at which the Kwee–van Woerden sum
	// S(T) is evaluated (odd, 3 to 9); 0 means 5, after Deeg (2021),
	// Galaxies 9, 1, who finds five or more folds more precise than the
	// original three.
	Folds int

	// Bootstrap is the number of resamples for SigmaBootstrap: 0 means
	// DefaultBootstrap, a negative number turns the bootstrap off.
	Bootstrap int
	// Seed makes the bootstrap repeatable: the same data, options and seed
	// give the same result.
	Seed uint64
}

// DefaultBootstrap is the number of bootstrap resamples used when
// ExtremumOptions.Bootstrap is 0; Efron & Tibshirani (1993), An Introduction
// to the Bootstrap, advise some hundreds to thousands for a standard error
// [from memory].
const DefaultBootstrap = 1000

// Timing is the time of one extremum with its uncertainties.
type Timing struct {
	Time float64 // Julian date of the extremum, on the scale of the input

	// Sigma is the one-sigma uncertainty (days) to report: the bootstrap for
	// MethodPoly (the method's own when the bootstrap was off or failed) and
	// the method's own for MethodKvW.
	Sigma float64
	// SigmaMethod is the method's own uncertainty (days): for MethodPoly the
	// least-squares covariance propagated to the root of dm/dt; for
	// MethodKvW the photometric noise propagated to first order through the
	// Kwee–van Woerden estimator.
	SigmaMethod float64
	// SigmaBootstrap is the standard deviation (days) of the extremum times
	// of Bootstrap resamples of the points (pairs drawn with replacement,
	// Efron 1979, Ann. Stat. 7, 1); NaN when the bootstrap was not run.
	SigmaBootstrap float64
	// SigmaKvW1956 is the uncertainty from the original formula of Kwee &
	// van Woerden (1956), σ² = (4AC − B²)/(4A²(Z − 1)) with Z = N/4; NaN for
	// MethodPoly or where the formula fails (S(T0) ≤ 0, as happens for
	// precise data: Deeg 2021, Galaxies 9, 1).
	SigmaKvW1956 float64

	Kind   ExtremumKind
	Method ExtremumMethod
	N      int     // points used
	Mag    float64 // magnitude at the extremum (fitted, or interpolated for KvW)

	WindowFrom, WindowTo float64 // time range of the points used
	Degree               int     // polynomial degree (MethodPoly)
	Folds                int     // trial times (MethodKvW)
	Pairs                int     // reflected pairs K (MethodKvW)
	Bootstrap            int     // bootstrap resamples that gave a time
	BootstrapFailed      int     // resamples that gave none
	Weighted             bool    // fit weighted by 1/err²

	// Curve is the fitted polynomial (MethodPoly), for plotting; nil for
	// MethodKvW.
	Curve *PolyCurve
}

// PolyCurve is a polynomial in x = (t − Centre)/Scale: m(t) = Σ Coef[k]·x^k.
type PolyCurve struct {
	Centre, Scale float64
	Coef          []float64
}

// At returns the polynomial's magnitude at Julian date t.
func (c *PolyCurve) At(t float64) float64 {
	return timingPolyEval(c.Coef, (t-c.Centre)/c.Scale)
}

// Extremum returns the time of the one maximum (opt.Kind = Maximum, smallest
// magnitude) or minimum that pts cover, by a polynomial fit (MethodPoly, see
// extremumPoly) or by Kwee & van Woerden (1956), BAN 12, 327 (MethodKvW, for
// symmetric minima).
//
// Points with a NaN magnitude are skipped as missing; errors are used as
// weights 1/err² only when every point has a positive error. Unless fixed by
// opt, the window is chosen from the data: a running mean locates the
// extremum, and the window is the symmetric interval about it inside which
// the curve stays within a fraction of the smaller of the two side depths
// (one half for the polynomial, a quarter for a parabola, nine tenths for
// KvW); it is then recentred on the fitted time until the points in it no
// longer change.
//
// Errors wrap ErrOneSided when the data do not cover both sides of the
// extremum, ErrNoExtremum when they show none; bad points give a
// *PointError.
func Extremum(pts []Point, opt ExtremumOptions) (Timing, error) {
	if opt.Kind == "" {
		opt.Kind = Maximum
	}
	if opt.Method == "" {
		opt.Method = MethodPoly
	}
	if err := opt.check(); err != nil {
		return Timing{}, err
	}
	lc, err := extremumClean(pts, opt.Kind)
	if err != nil {
		return Timing{}, err
	}
	switch opt.Method {
	case MethodKvW:
		return extremumKvW(lc, opt)
	default:
		return extremumPoly(lc, opt)
	}
}

func (opt ExtremumOptions) check() error {
	if _, err := ParseExtremumKind(string(opt.Kind)); err != nil {
		return err
	}
	if _, err := ParseExtremumMethod(string(opt.Method)); err != nil {
		return err
	}
	switch {
	case math.IsNaN(opt.WindowDays) || math.IsInf(opt.WindowDays, 0) || opt.WindowDays < 0:
		return fmt.Errorf("reduce: window %v: want a positive width in days, or 0 to choose it from the data", opt.WindowDays)
	case (opt.From != 0 || opt.To != 0) && !(opt.To > opt.From && !math.IsInf(opt.From, 0) && !math.IsInf(opt.To, 0)):
		return fmt.Errorf("reduce: window JD %s to %s: want finite Julian dates with From before To", timingNum(opt.From), timingNum(opt.To))
	case opt.Degree != 0 && (opt.Degree < 2 || opt.Degree > 4):
		return fmt.Errorf("reduce: polynomial degree %d: want 2, 3 or 4 (or 0 to choose)", opt.Degree)
	case opt.Folds != 0 && (opt.Folds < 3 || opt.Folds > 9 || opt.Folds%2 == 0):
		return fmt.Errorf("reduce: folds %d: want an odd number from 3 to 9 (or 0 for 5)", opt.Folds)
	}
	return nil
}

// extremumCurve is a light curve cleaned for timing: sorted by time, missing
// points dropped, and magnitudes multiplied by flip so that the extremum
// sought is always the largest value of m. sig holds the errors, nil when not
// every point has one.
type extremumCurve struct {
	t, m, sig []float64
	flip      float64 // +1 for a minimum, −1 for a maximum: m = flip·mag
}

func extremumClean(pts []Point, kind ExtremumKind) (*extremumCurve, error) {
	flip := 1.0
	if kind == Maximum {
		flip = -1
	}
	lc := &extremumCurve{flip: flip}
	var order []int // input indices of the usable points
	allErr := true
	for i, p := range pts {
		switch {
		case math.IsNaN(p.T) || math.IsInf(p.T, 0):
			return nil, &PointError{i, "time", p.T, "a finite Julian date"}
		case math.IsInf(p.Mag, 0):
			return nil, &PointError{i, "mag", p.Mag, "a finite magnitude (or empty for missing)"}
		case p.Err < 0 || math.IsInf(p.Err, 0):
			return nil, &PointError{i, "err", p.Err, "a positive error in magnitudes (or empty for unknown)"}
		case math.IsNaN(p.Mag):
			continue
		}
		if !(p.Err > 0) {
			allErr = false
		}
		order = append(order, i)
	}
	sort.SliceStable(order, func(a, b int) bool { return pts[order[a]].T < pts[order[b]].T })
	for _, i := range order {
		lc.t = append(lc.t, pts[i].T)
		lc.m = append(lc.m, flip*pts[i].Mag)
		if allErr {
			lc.sig = append(lc.sig, pts[i].Err)
		}
	}
	if len(lc.t) < extremumMinPoints {
		return nil, fmt.Errorf("reduce: %d points with a magnitude: want at least %d around the extremum: %w",
			len(lc.t), extremumMinPoints, ErrNoExtremum)
	}
	if lc.t[len(lc.t)-1] == lc.t[0] {
		return nil, fmt.Errorf("reduce: all %d points at the same time %s: want a time series: %w", len(lc.t), timingNum(lc.t[0]), ErrNoExtremum)
	}
	return lc, nil
}

const (
	// extremumMinPoints is the fewest points accepted for a timing.
	extremumMinPoints = 7
	// extremumMinSide is the fewest points required on each side of the
	// extremum, in the data and in the window.
	extremumMinSide = 3
	// extremumSignificance: a side must rise (or fall) from the extremum by
	// this many standard deviations of the smoothed curve to count as
	// covered.
	extremumSignificance = 3.0
)

// extremumWindow picks the points an extremum is timed from and solves
// on them (solve returns the time it finds; c is the curve idx indexes).
// With opt.From < opt.To it takes the points in that range of lc, which
// must hold extremumMinPoints, and solves once. Otherwise it takes a
// window of opt.WindowDays about the extremum of the smoothed curve (with
// no width given: the automatic width for depth fraction frac, widened
// by a quarter until it holds extremumMinPoints), and centres it on each
// solution again until its points stay the same, at most maxIter times.
// It returns the curve and the points of the last solution.
func extremumWindow(lc *extremumCurve, opt ExtremumOptions, frac float64, maxIter int,
	solve func(c *extremumCurve, idx []int, centre float64) (float64, error)) (*extremumCurve, []int, error) {
	fixed := opt.To > opt.From
	if fixed {
		lc = lc.subset(extremumSelect(lc.t, opt.From, opt.To))
		if len(lc.t) < extremumMinPoints {
			return nil, nil, fmt.Errorf("reduce: window JD %s to %s holds %d points: want at least %d: %w",
				timingNum(opt.From), timingNum(opt.To), len(lc.t), extremumMinPoints, ErrNoExtremum)
		}
	}
	i0, smooth, dL, dR, err := extremumLocate(lc)
	if err != nil {
		return nil, nil, err
	}
	centre := lc.t[i0]
	if fixed {
		idx := make([]int, len(lc.t))
		for i := range idx {
			idx[i] = i
		}
		_, err := solve(lc, idx, centre)
		return lc, idx, err
	}
	h := opt.WindowDays / 2
	if h == 0 {
		h = extremumHalfWidth(lc, i0, smooth, min(dL, dR), frac)
	}
	var idx []int
	for iter := 0; ; iter++ {
		sel := extremumSelect(lc.t, centre-h, centre+h)
		for len(sel) < extremumMinPoints && opt.WindowDays == 0 && len(sel) < len(lc.t) && h > 0 {
			h *= 1.25 // too few points: widen the automatic window
			sel = extremumSelect(lc.t, centre-h, centre+h)
		}
		if len(sel) < extremumMinPoints {
			return nil, nil, fmt.Errorf("reduce: window of %.5g d about JD %.5f holds %d points: want at least %d: %w",
				2*h, centre, len(sel), extremumMinPoints, ErrNoExtremum)
		}
		if slices.Equal(sel, idx) || iter == maxIter {
			return lc, idx, nil
		}
		idx = sel
		if centre, err = solve(lc, idx, centre); err != nil {
			return nil, nil, err
		}
	}
}

// extremumLocate finds the extremum roughly: the largest value of a running
// mean of lc.m. It returns the index of that point, the running mean, its
// noise and the depth of each side (how far the smoothed curve falls from
// the extremum before and after it). It wraps ErrOneSided or ErrNoExtremum
// when a side is missing or flat.
func extremumLocate(lc *extremumCurve) (i0 int, smooth []float64, depthL, depthR float64, err error) {
	n := len(lc.m)
	half := max(1, n/20)
	smooth = make([]float64, n)
	for i := range n {
		lo, hi := max(0, i-half), min(n-1, i+half)
		s := 0.0
		for j := lo; j <= hi; j++ {
			s += lc.m[j]
		}
		smooth[i] = s / float64(hi-lo+1)
	}
	for i := range n {
		if smooth[i] > smooth[i0] {
			i0 = i
		}
	}
	noise := extremumNoise(lc) / math.Sqrt(float64(2*half+1))
	for j := range i0 {
		depthL = max(depthL, smooth[i0]-smooth[j])
	}
	for j := i0 + 1; j < n; j++ {
		depthR = max(depthR, smooth[i0]-smooth[j])
	}
	level := extremumSignificance * noise
	switch {
	case max(depthL, depthR) <= level:
		err = fmt.Errorf("reduce: the curve varies by %.4g mag, within its noise (%.2g mag): %w",
			max(depthL, depthR), noise, ErrNoExtremum)
	case i0 < extremumMinSide || depthL <= level:
		err = fmt.Errorf("reduce: the %s is at or before the first points (JD %.5f): %w", lc.kindWord(), lc.t[i0], ErrOneSided)
	case n-1-i0 < extremumMinSide || depthR <= level:
		err = fmt.Errorf("reduce: the %s is at or after the last points (JD %.5f): %w", lc.kindWord(), lc.t[i0], ErrOneSided)
	}
	return i0, smooth, depthL, depthR, err
}

func (lc *extremumCurve) kindWord() string {
	if lc.flip < 0 {
		return "maximum"
	}
	return "minimum"
}

// extremumHalfWidth returns the half-width (days) of the symmetric window
// about lc.t[i0] inside which the smoothed curve stays within frac of the
// smaller side depth of the extremum.
func extremumHalfWidth(lc *extremumCurve, i0 int, smooth []float64, depth, frac float64) float64 {
	level := smooth[i0] - frac*depth
	tL, tR := lc.t[0], lc.t[len(lc.t)-1]
	for j := i0 - 1; j >= 0; j-- {
		if smooth[j] <= level {
			tL = lc.t[j]
			break
		}
	}
	for j := i0 + 1; j < len(lc.t); j++ {
		if smooth[j] <= level {
			tR = lc.t[j]
			break
		}
	}
	h := min(lc.t[i0]-tL, tR-lc.t[i0])
	if !(h > 0) {
		// Points share the extremum's time: start from the mean spacing so
		// that widening the window can make progress (0 when every point
		// has the same time, which the caller then refuses).
		h = (lc.t[len(lc.t)-1] - lc.t[0]) / float64(len(lc.t))
	}
	return h
}

// extremumNoise estimates the scatter (magnitudes) of one point: the median
// error when every point has one, otherwise the robust spread of the
// deviations of each point from the line through its neighbours, each scaled
// by its own variance factor 1 + a² + b² (common practice).
func extremumNoise(lc *extremumCurve) float64 {
	if lc.sig != nil {
		return extremumMedian(append([]float64(nil), lc.sig...))
	}
	n := len(lc.t)
	d := make([]float64, 0, n)
	for i := 1; i+1 < n; i++ {
		span := lc.t[i+1] - lc.t[i-1]
		if span <= 0 {
			continue
		}
		a := (lc.t[i+1] - lc.t[i]) / span
		b := 1 - a
		dev := lc.m[i] - (a*lc.m[i-1] + b*lc.m[i+1])
		d = append(d, math.Abs(dev)/math.Sqrt(1+a*a+b*b))
	}
	if len(d) == 0 {
		return 0
	}
	return 1.4826 * extremumMedian(d) // MAD → σ for a normal distribution
}

func extremumMedian(x []float64) float64 {
	sort.Float64s(x)
	n := len(x)
	if n%2 == 1 {
		return x[n/2]
	}
	return (x[n/2-1] + x[n/2]) / 2
}

// extremumSelect returns the indices of the points with From ≤ t ≤ To.
func extremumSelect(t []float64, from, to float64) []int {
	lo := sort.SearchFloat64s(t, from)
	var idx []int
	for i := lo; i < len(t) && t[i] <= to; i++ {
		idx = append(idx, i)
	}
	return idx
}

// extremumSides checks that at least extremumMinSide of the points at idx lie
// on each side of time tx.
func extremumSides(lc *extremumCurve, idx []int, tx float64) error {
	before, after := 0, 0
	for _, i := range idx {
		switch {
		case lc.t[i] < tx:
			before++
		case lc.t[i] > tx:
			after++
		}
	}
	if before < extremumMinSide || after < extremumMinSide {
		return fmt.Errorf("reduce: %d points before and %d after the %s at JD %.5f: want at least %d on each side: %w",
			before, after, lc.kindWord(), tx, extremumMinSide, ErrOneSided)
	}
	return nil
}
