package logbook

import (
	"errors"
	"fmt"
	"math"
)

// The demo's hidden truth: the light curves and extremum times of its
// invented stars, and the plain arithmetic that turns them into what an
// observer records. Every function here is tested on its own.

// shapeKind is the form of a demo light curve.
type shapeKind int

const (
	shapePulsator shapeKind = iota + 1 // fast rise, slow decline (RR Lyrae, Cepheid); maximum light at phase 0
	shapeSine                          // sinusoid (δ Scuti, RRc, long-period); maximum light at phase 0
	shapeAlgol                         // detached eclipses: flat outside, Gaussian dips; primary minimum at phase 0
	shapeContact                       // contact binary: continuous variation; primary minimum at phase 0
)

// lightShape is a light curve as a function of phase.
type lightShape struct {
	kind shapeKind
	// base is the magnitude at maximum light (pulsators) or outside eclipse
	// (binaries).
	base float64
	// amp is the full amplitude of a pulsator or the depth of the primary
	// minimum of a binary (magnitudes).
	amp float64
	// depth2 is the depth of the secondary minimum (binaries).
	depth2 float64
	// width is the Gaussian σ of an eclipse in phase (shapeAlgol), or the
	// skew c of a pulsator's phase warp (shapePulsator, 0 ≤ c < 1).
	width float64
}

// magAt returns the magnitude at phase phi (cycles from the primary
// extremum; any real number).
func (s lightShape) magAt(phi float64) float64 {
	phi -= math.Floor(phi + 0.5) // to [-0.5, 0.5)
	switch s.kind {
	case shapePulsator:
		// A monotone warp of phase, u = φ − c(1 − cos 2πφ)/(2π), keeps the
		// maximum at φ = 0, smooth and symmetric to second order, and moves
		// the minimum late in the cycle: a slow decline and a fast rise.
		u := phi - s.width*(1-math.Cos(2*math.Pi*phi))/(2*math.Pi)
		return s.base + s.amp*(1-math.Cos(2*math.Pi*u))/2
	case shapeSine:
		return s.base + s.amp*(1-math.Cos(2*math.Pi*phi))/2
	case shapeAlgol:
		d2 := phi - math.Floor(phi) - 0.5 // distance from phase 0.5, in [-0.5, 0.5)
		return s.base + s.amp*math.Exp(-phi*phi/(2*s.width*s.width)) +
			s.depth2*math.Exp(-d2*d2/(2*s.width*s.width))
	case shapeContact:
		// Two waves: the ellipsoidal one (period P/2) sets the secondary
		// depth, the one at P deepens the primary.
		return s.base + s.depth2*(1+math.Cos(4*math.Pi*phi))/2 + (s.amp-s.depth2)*(1+math.Cos(2*math.Pi*phi))/2
	}
	return math.NaN()
}

// intensityMean returns the intensity-mean magnitude of the light curve over
// one cycle, −2.5 log10 ⟨10^(−0.4 m)⟩ (the ⟨V⟩ a period–luminosity distance
// needs; methods sheet §13), by the midpoint rule with n steps.
func (s lightShape) intensityMean(n int) float64 {
	sum := 0.0
	for i := 0; i < n; i++ {
		sum += math.Pow(10, -0.4*s.magAt((float64(i)+0.5)/float64(n)))
	}
	return intensityMeanOf(sum / float64(n))
}

// intensityMeanOf turns a mean flux (in units of magnitude 0) into a
// magnitude.
func intensityMeanOf(meanFlux float64) float64 { return -2.5 * math.Log10(meanFlux) }

// lightTime is a light-travel-time orbit: a third body on a circular orbit
// moves the binary so that its eclipses come early and late by
// τ = A sin(2π (t − T)/P₃) (Irwin 1952, ApJ 116, 211, with e = 0).
type lightTime struct {
	amplitudeDays float64 // A = a₁₂ sin i / c
	periodDays    float64 // P₃
	zeroJD        float64 // T: τ = 0 and rising
}

// at returns τ(t) in days; zero when there is no third body.
func (l lightTime) at(jd float64) float64 {
	if l.amplitudeDays == 0 {
		return 0
	}
	return l.amplitudeDays * math.Sin(2*math.Pi*(jd-l.zeroJD)/l.periodDays)
}

// trueElements are the hidden elements of a demo star: the times of its
// extrema are T(E) = T0 + P·E + Q·E² + τ(T0 + P·E) on the BJD_TDB scale
// (Sterken 2005 for the quadratic term; Irwin 1952 for τ).
type trueElements struct {
	epoch, periodDays, q float64
	ltt                  lightTime
}

// eventTime returns the BJD_TDB of the extremum at cycle E (a half-integer E
// is a secondary minimum).
func (e trueElements) eventTime(cycle float64) float64 {
	lin := e.epoch + e.periodDays*cycle
	return lin + e.q*cycle*cycle + e.ltt.at(lin)
}

// phaseAt returns the phase of BJD_TDB jd: cycles since the nearest primary
// extremum (in [-0.5, 0.5)), counted with the local period P + 2QE.
func (e trueElements) phaseAt(jd float64) float64 {
	c := math.Round((jd - e.epoch) / e.periodDays)
	// Step to the primary extremum nearest jd: the quadratic and light-time
	// terms move it by a small part of a cycle at most.
	for i := 0; i < 3; i++ {
		d := (jd - e.eventTime(c)) / (e.periodDays + 2*e.q*c)
		if d >= -0.5 && d < 0.5 {
			return d
		}
		c += math.Round(d)
	}
	return (jd - e.eventTime(c)) / (e.periodDays + 2*e.q*c)
}

// photNoise returns the standard deviation (magnitudes) of one demo CCD
// measurement of a star of magnitude mag: a floor from scintillation and
// flat fielding, and a sky-limited term growing as 10^(0.4 m) (common
// practice: 0.005–0.02 mag for amateur differential photometry, methods
// sheet §15).
func photNoise(mag float64) float64 {
	const floor, atEleven = 0.002, 0.004
	return math.Hypot(floor, atEleven*math.Pow(10, 0.4*(mag-11)))
}

// ensemble returns the magnitude of a star from its instrumental magnitude
// inst and the comparison stars' catalogue magnitudes cat, instrumental
// magnitudes comp and errors sigma: each comparison gives a zero point
// Z_i = V_i − v_i, averaged with weights 1/σ_i² (all equal when sigma is
// nil); V = v + Z and σ_Z = (Σ w_i)^−½ (Honeycutt 1992, PASP 104, 435, as in
// the methods sheet §8).
func ensemble(inst float64, cat, comp, sigma []float64) (v, sigmaZ float64, err error) {
	if len(cat) == 0 || len(cat) != len(comp) || (sigma != nil && len(sigma) != len(cat)) {
		return math.NaN(), math.NaN(), errors.New("ensemble: want as many catalogue as instrumental magnitudes, at least one")
	}
	var sw, swz float64
	for i := range cat {
		w := 1.0
		if sigma != nil {
			if !(sigma[i] > 0) {
				return math.NaN(), math.NaN(), fmt.Errorf("ensemble: comparison %d: error %v must be positive", i+1, sigma[i])
			}
			w = 1 / (sigma[i] * sigma[i])
		}
		sw += w
		swz += w * (cat[i] - comp[i])
	}
	return inst + swz/sw, 1 / math.Sqrt(sw), nil
}

// fractionalEstimate returns the magnitude of a visual estimate "A a V b B"
// by the fractional method: m = m_A + (m_B − m_A)·a/(a + b) (methods sheet
// §9).
func fractionalEstimate(magA float64, a int, b int, magB float64) float64 {
	return magA + (magB-magA)*float64(a)/float64(a+b)
}

// polyFit fits y = Σ_k c_k x^k (k = 0..deg) by least squares and returns the
// coefficients and their covariance scaled by the residual variance
// (Cov = s² (XᵀX)⁻¹, s² = RSS/(n − deg − 1)), solving the normal equations
// by Gauss–Jordan elimination with partial pivoting. The caller centres and
// scales x so that the equations stay well conditioned.
func polyFit(x, y []float64, deg int) (c []float64, cov [][]float64, err error) {
	n, m := len(x), deg+1
	if deg < 1 || len(y) != n || n <= m {
		return nil, nil, fmt.Errorf("polynomial fit: %d points for degree %d: want more than %d", n, deg, m)
	}
	// [XᵀX | Xᵀy | I]
	a := make([][]float64, m)
	for i := range a {
		a[i] = make([]float64, 2*m+1)
		a[i][m+1+i] = 1
	}
	pow := make([]float64, 2*m-1)
	for k := range x {
		p := 1.0
		for j := range pow {
			pow[j] = p
			p *= x[k]
		}
		for i := 0; i < m; i++ {
			for j := 0; j < m; j++ {
				a[i][j] += pow[i+j]
			}
			a[i][m] += pow[i] * y[k]
		}
	}
	for col := 0; col < m; col++ {
		piv := col
		for r := col + 1; r < m; r++ {
			if math.Abs(a[r][col]) > math.Abs(a[piv][col]) {
				piv = r
			}
		}
		if a[piv][col] == 0 {
			return nil, nil, errors.New("polynomial fit: the points do not determine the polynomial")
		}
		a[col], a[piv] = a[piv], a[col]
		inv := 1 / a[col][col]
		for j := range a[col] {
			a[col][j] *= inv
		}
		for r := 0; r < m; r++ {
			if r != col && a[r][col] != 0 {
				f := a[r][col]
				for j := range a[r] {
					a[r][j] -= f * a[col][j]
				}
			}
		}
	}
	c = make([]float64, m)
	for i := range c {
		c[i] = a[i][m]
	}
	rss := 0.0
	for k := range x {
		r := y[k] - polyAt(c, x[k])
		rss += r * r
	}
	s2 := rss / float64(n-m)
	cov = make([][]float64, m)
	for i := range cov {
		cov[i] = make([]float64, m)
		for j := range cov[i] {
			cov[i][j] = s2 * a[i][m+1+j]
		}
	}
	return c, cov, nil
}

// polyAt evaluates Σ c_k x^k.
func polyAt(c []float64, x float64) float64 {
	v := 0.0
	for k := len(c) - 1; k >= 0; k-- {
		v = v*x + c[k]
	}
	return v
}

// polyExtremum times an extremum by the polynomial method (methods sheet
// §10): it fits m(t) = Σ a_k ((t − t̄)/h)^k of degree deg (2 to 4) to the
// points, t̄ their mean time and h their half-span, and solves dm/dt = 0 for
// the root inside the points' span nearest t̄ at which m has a minimum
// (maxLight) or a maximum (minimum light). sigma propagates the fit's
// covariance to the root: ∂x*/∂a_k = −k x*^(k−1) / m″(x*).
func polyExtremum(t, m []float64, deg int, maxLight bool) (tExt, sigma float64, err error) {
	if deg < 2 || deg > 4 {
		return math.NaN(), math.NaN(), fmt.Errorf("polynomial extremum: degree %d: want 2 to 4", deg)
	}
	if len(t) != len(m) || len(t) <= deg+1 {
		return math.NaN(), math.NaN(), fmt.Errorf("polynomial extremum: %d points for degree %d: want more than %d", len(t), deg, deg+1)
	}
	lo, hi, mean := t[0], t[0], 0.0
	for _, v := range t {
		lo, hi, mean = math.Min(lo, v), math.Max(hi, v), mean+v
	}
	mean /= float64(len(t))
	h := (hi - lo) / 2
	if !(h > 0) {
		return math.NaN(), math.NaN(), errors.New("polynomial extremum: the points span no time")
	}
	x := make([]float64, len(t))
	for i, v := range t {
		x[i] = (v - mean) / h
	}
	c, cov, err := polyFit(x, m, deg)
	if err != nil {
		return math.NaN(), math.NaN(), err
	}
	d1 := make([]float64, deg) // dm/dx
	for k := 1; k <= deg; k++ {
		d1[k-1] = float64(k) * c[k]
	}
	d2 := make([]float64, deg-1) // d²m/dx²
	for k := 2; k <= deg; k++ {
		d2[k-2] = float64(k*(k-1)) * c[k]
	}
	// The roots of dm/dx inside the span: sign changes on a fine grid,
	// refined by bisection.
	xlo, xhi := (lo-mean)/h, (hi-mean)/h
	const steps = 400
	best, found := 0.0, false
	prevX, prevV := xlo, polyAt(d1, xlo)
	for i := 1; i <= steps; i++ {
		xi := xlo + (xhi-xlo)*float64(i)/steps
		vi := polyAt(d1, xi)
		if (prevV <= 0 && vi >= 0) || (prevV >= 0 && vi <= 0) {
			a, b, va := prevX, xi, prevV
			for j := 0; j < 100 && b-a > 1e-15; j++ {
				mid := (a + b) / 2
				vm := polyAt(d1, mid)
				if (va <= 0 && vm >= 0) || (va >= 0 && vm <= 0) {
					b = mid
				} else {
					a, va = mid, vm
				}
			}
			root := (a + b) / 2
			curv := polyAt(d2, root)
			if (maxLight && curv > 0) || (!maxLight && curv < 0) {
				if !found || math.Abs(root) < math.Abs(best) {
					best, found = root, true
				}
			}
		}
		prevX, prevV = xi, vi
	}
	if !found {
		return math.NaN(), math.NaN(), errors.New("polynomial extremum: the fitted curve has no extremum of that kind inside the points")
	}
	curv := polyAt(d2, best)
	g := make([]float64, deg+1)
	for k := 1; k <= deg; k++ {
		g[k] = -float64(k) * math.Pow(best, float64(k-1)) / curv
	}
	varX := 0.0
	for i := range g {
		for j := range g {
			varX += g[i] * cov[i][j] * g[j]
		}
	}
	return mean + best*h, math.Sqrt(math.Max(varX, 0)) * h, nil
}
