package reduce

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat/distuv"
)

const (
	// polyDepthFraction: the automatic window holds the part of the curve
	// within half the depth of the extremum (common practice: the top of
	// the curve, where a low-order polynomial fits).
	polyDepthFraction = 0.5
	// polyDepthFraction2 is the narrower window for a parabola (Degree 2),
	// which fits only the top of a curve.
	polyDepthFraction2 = 0.25
	// polyMaxIter bounds the recentring of the automatic window.
	polyMaxIter = 10
)

// extremumPoly times the extremum by least squares: a polynomial
// m(t) = Σ a_k x^k in x = (t − centre)/scale, of degree 2 to 4, fitted to the
// points in the window (QR, gonum mat); the extremum is the root of dm/dt = 0
// inside the window with the right curvature (for degree 2,
// t = t̄ − a1/(2a2)). With Degree 0 the degree is 3, raised to 4 when an
// F-test finds the quartic term significant at the 1% level. Its
// σ is the fit covariance propagated to the root: δx = −Σ_k k x^(k−1) δa_k /
// m”(x).
func extremumPoly(lc *extremumCurve, opt ExtremumOptions) (Timing, error) {
	frac := polyDepthFraction
	if opt.Degree == 2 {
		frac = polyDepthFraction2
	}
	var fit polyFit
	lc, idx, err := extremumWindow(lc, opt, frac, polyMaxIter, func(c *extremumCurve, idx []int, _ float64) (float64, error) {
		var err error
		fit, err = polyFitWindow(c, idx, opt.Degree)
		return fit.time, err
	})
	if err != nil {
		return Timing{}, err
	}
	if err := extremumSides(lc, idx, fit.time); err != nil {
		return Timing{}, err
	}
	tm := Timing{
		Time:           fit.time,
		SigmaMethod:    fit.sigma,
		SigmaBootstrap: math.NaN(),
		SigmaKvW1956:   math.NaN(),
		Kind:           opt.Kind,
		Method:         MethodPoly,
		N:              len(idx),
		Mag:            lc.flip * fit.mag,
		WindowFrom:     lc.t[idx[0]],
		WindowTo:       lc.t[idx[len(idx)-1]],
		Degree:         fit.degree,
		Weighted:       lc.sig != nil,
		Curve:          &PolyCurve{Centre: fit.centre, Scale: fit.scale, Coef: make([]float64, len(fit.coef))},
	}
	for k, c := range fit.coef {
		tm.Curve.Coef[k] = lc.flip * c
	}
	if nb := opt.bootstrapCount(); nb > 0 {
		sub := lc.subset(idx)
		from, to := tm.WindowFrom, tm.WindowTo
		tm.SigmaBootstrap, tm.Bootstrap, tm.BootstrapFailed = timingBootstrap(len(idx), nb, opt.Seed, func(pick []int) (float64, bool) {
			f, err := polyFitPoints(sub.pick(pick), fit.degree, fit.centre, fit.scale, from, to)
			return f.time, err == nil
		})
	}
	tm.Sigma = tm.SigmaBootstrap
	if math.IsNaN(tm.Sigma) {
		tm.Sigma = tm.SigmaMethod
	}
	return tm, nil
}

func (opt ExtremumOptions) bootstrapCount() int {
	switch {
	case opt.Bootstrap < 0:
		return 0
	case opt.Bootstrap == 0:
		return DefaultBootstrap
	}
	return opt.Bootstrap
}

// subset returns the points of lc at idx.
func (lc *extremumCurve) subset(idx []int) *extremumCurve {
	s := &extremumCurve{flip: lc.flip}
	for _, i := range idx {
		s.t = append(s.t, lc.t[i])
		s.m = append(s.m, lc.m[i])
		if lc.sig != nil {
			s.sig = append(s.sig, lc.sig[i])
		}
	}
	return s
}

// pick is subset for a bootstrap resample, with indices that may repeat.
func (lc *extremumCurve) pick(idx []int) *extremumCurve {
	s := &extremumCurve{flip: lc.flip, t: make([]float64, len(idx)), m: make([]float64, len(idx))}
	if lc.sig != nil {
		s.sig = make([]float64, len(idx))
	}
	for k, i := range idx {
		s.t[k], s.m[k] = lc.t[i], lc.m[i]
		if lc.sig != nil {
			s.sig[k] = lc.sig[i]
		}
	}
	return s
}

// polyFit is one polynomial fit and its extremum (in the flipped
// magnitudes of extremumCurve).
type polyFit struct {
	degree        int
	centre, scale float64
	coef          []float64
	time, mag     float64
	sigma         float64 // days
	chi2          float64
}

// polyFitWindow fits the points of lc at idx, choosing the degree by F-test
// when degree is 0.
func polyFitWindow(lc *extremumCurve, idx []int, degree int) (polyFit, error) {
	sub := lc.subset(idx)
	tMin, tMax := sub.t[0], sub.t[len(sub.t)-1]
	centre := (tMin + tMax) / 2
	scale := (tMax - tMin) / 2
	if degree != 0 {
		return polyFitPoints(sub, degree, centre, scale, tMin, tMax)
	}
	best, err := polyFitPoints(sub, polyDefaultDegree, centre, scale, tMin, tMax)
	if err != nil {
		return best, err
	}
	n := len(sub.t)
	if n-(polyDefaultDegree+2) >= 3 {
		if next, err := polyFitPoints(sub, polyDefaultDegree+1, centre, scale, tMin, tMax); err == nil && polyHigherDegreeBetter(best, next, n) {
			best = next
		}
	}
	return best, nil
}

// polyHigherDegreeBetter tests whether the extra terms of fit hi improve on
// fit lo: an F-test, F = ((χ²_lo − χ²_hi)/Δd) / (χ²_hi/dof_hi), at the
// polyDegreeSignificance level.
func polyHigherDegreeBetter(lo, hi polyFit, n int) bool {
	dd := float64(hi.degree - lo.degree)
	dof := float64(n - (hi.degree + 1))
	switch {
	case hi.chi2 <= 0:
		return lo.chi2 > 0
	case lo.chi2 <= hi.chi2:
		return false
	}
	f := (lo.chi2 - hi.chi2) / dd / (hi.chi2 / dof)
	return distuv.F{D1: dd, D2: dof}.Survival(f) < polyDegreeSignificance
}

// polyDefaultDegree is the degree used when none is given: a cubic follows
// the asymmetry of a maximum (a Cepheid's steep rise) that biases a parabola,
// and costs a symmetric minimum only a little precision.
const polyDefaultDegree = 3

// polyDegreeSignificance is the F-test level at which a higher degree is
// accepted when the degree is chosen from the data.
const polyDegreeSignificance = 0.01

// polyFitPoints fits a polynomial of the given degree to all points of lc and
// finds its extremum inside [from, to].
func polyFitPoints(lc *extremumCurve, degree int, centre, scale, from, to float64) (polyFit, error) {
	n, np := len(lc.t), degree+1
	if n < np+1 {
		return polyFit{}, fmt.Errorf("reduce: %d points for a polynomial of degree %d: want at least %d: %w", n, degree, np+1, ErrNoExtremum)
	}
	x := mat.NewDense(n, np, nil)
	for i, t := range lc.t {
		u, v := (t-centre)/scale, 1.0
		row := x.RawRowView(i)
		for k := range np {
			row[k] = v
			v *= u
		}
	}
	var w []float64
	if lc.sig != nil {
		w = make([]float64, n)
		for i, s := range lc.sig {
			w[i] = 1 / (s * s)
		}
	}
	c, cov, chi2, err := timingLSQ(x, lc.m, w)
	if err != nil {
		return polyFit{}, fmt.Errorf("reduce: polynomial fit of degree %d: %w", degree, err)
	}
	if w == nil {
		cov.ScaleSym(chi2/float64(n-np), cov)
	}
	xr, ok := polyTurningPoint(c, (from-centre)/scale, (to-centre)/scale)
	if !ok {
		return polyFit{}, fmt.Errorf("reduce: the polynomial of degree %d has no turning point of the right kind between JD %.5f and %.5f: %w",
			degree, from, to, ErrNoExtremum)
	}
	// Delta method: ∂x/∂a_k = −k x^(k−1) / m''(x).
	d2 := timingPolyEval(timingPolyDeriv(timingPolyDeriv(c)), xr)
	g := make([]float64, np)
	for k := 1; k < np; k++ {
		g[k] = -float64(k) * math.Pow(xr, float64(k-1)) / d2
	}
	gv := mat.NewVecDense(np, g)
	varX := mat.Inner(gv, cov, gv)
	return polyFit{
		degree: degree, centre: centre, scale: scale, coef: c,
		time:  centre + scale*xr,
		mag:   timingPolyEval(c, xr),
		sigma: scale * math.Sqrt(max(varX, 0)),
		chi2:  chi2,
	}, nil
}

// polyTurningPoint returns the maximum of the polynomial c in [lo, hi]: the
// root of its derivative with negative second derivative and the largest
// value (roots found by bracketing on a fine grid and bisection).
func polyTurningPoint(c []float64, lo, hi float64) (float64, bool) {
	d := timingPolyDeriv(c)
	d2 := timingPolyDeriv(d)
	var roots []float64
	if len(d) == 2 { // degree 2: one root, t̄ − a1/(2a2)
		roots = append(roots, -d[0]/d[1])
	} else {
		const steps = 64
		prevX, prevV := lo, timingPolyEval(d, lo)
		for s := 1; s <= steps; s++ {
			x := lo + (hi-lo)*float64(s)/steps
			v := timingPolyEval(d, x)
			if prevV == 0 {
				roots = append(roots, prevX)
			} else if prevV*v < 0 {
				a, b, fa := prevX, x, prevV
				for range 100 {
					m := (a + b) / 2
					fm := timingPolyEval(d, m)
					if fm == 0 || b-a < 1e-15 {
						a, b = m, m
						break
					}
					if fa*fm < 0 {
						b = m
					} else {
						a, fa = m, fm
					}
				}
				roots = append(roots, (a+b)/2)
			}
			prevX, prevV = x, v
		}
	}
	best, found := 0.0, false
	for _, r := range roots {
		if r < lo || r > hi || !(timingPolyEval(d2, r) < 0) {
			continue
		}
		if !found || timingPolyEval(c, r) > timingPolyEval(c, best) {
			best, found = r, true
		}
	}
	return best, found
}

// timingPolyEval evaluates Σ c[k]·x^k by Horner's rule.
func timingPolyEval(c []float64, x float64) float64 {
	v := 0.0
	for k := len(c) - 1; k >= 0; k-- {
		v = v*x + c[k]
	}
	return v
}

// timingPolyDeriv returns the coefficients of the derivative of Σ c[k]·x^k.
func timingPolyDeriv(c []float64) []float64 {
	if len(c) <= 1 {
		return []float64{0}
	}
	d := make([]float64, len(c)-1)
	for k := 1; k < len(c); k++ {
		d[k-1] = float64(k) * c[k]
	}
	return d
}
