package reduce

import (
	"fmt"
	"math"
)

const (
	// kvwDepthFraction: the automatic KvW window holds the curve within nine
	// tenths of the depth of the extremum, to leave out the plateau outside
	// an eclipse, which the method must not see (Deeg 2021, Galaxies 9, 1).
	kvwDepthFraction = 0.9
	// kvwMinPairs is the fewest reflected pairs K accepted.
	kvwMinPairs = 3
	// kvwDefaultFolds is the number of trial times by default (Deeg 2021).
	kvwDefaultFolds = 5
	// kvwMaxIter bounds the moves of the trial centre and of the window.
	kvwMaxIter = 10
)

// extremumKvW times a symmetric extremum by the method of Kwee & van Woerden
// (1956), BAN 12, 327: the points are interpolated linearly to equal steps
// Δt (their mean spacing); for a trial time T on that grid,
// S(T) = Σ_{k=1..K} [m(T + kΔt) − m(T − kΔt)]² over the same K reflected
// pairs at each of opt.Folds trial times T1 + jΔt; a parabola
// S = A T² + B T + C fitted to them gives T0 = −B/(2A). T1 is moved to the
// grid point nearest T0 until it stays.
//
// Uncertainties: SigmaKvW1956 is the original σ² = (4AC − B²)/(4A²(Z − 1))
// with Z = N/4 for the N = 2K + 1 interpolated points, which fails for
// precise data where S(T0) is close to 0 (Deeg 2021, Galaxies 9, 1).
// SigmaMethod is instead the photometric noise (the errors, or
// extremumNoise) propagated to first order through the whole estimator,
// interpolation, sums and parabola included, so that it depends on the noise
// of the points rather than on S(T0), as Deeg (2021) recommends.
func extremumKvW(lc *extremumCurve, opt ExtremumOptions) (Timing, error) {
	folds := opt.Folds
	if folds == 0 {
		folds = kvwDefaultFolds
	}
	noise := extremumNoise(lc)
	var res kvwResult
	lc, idx, err := extremumWindow(lc, opt, kvwDepthFraction, kvwMaxIter, func(c *extremumCurve, idx []int, centre float64) (float64, error) {
		var err error
		res, err = kvwSolve(c.subset(idx), centre, folds, noise)
		return res.time, err
	})
	if err != nil {
		return Timing{}, err
	}
	if err := extremumSides(lc, idx, res.time); err != nil {
		return Timing{}, err
	}
	sub := lc.subset(idx)
	tm := Timing{
		Time:           res.time,
		SigmaMethod:    res.sigma,
		SigmaBootstrap: math.NaN(),
		SigmaKvW1956:   res.sigma1956,
		Kind:           opt.Kind,
		Method:         MethodKvW,
		N:              len(idx),
		Mag:            lc.flip * kvwInterp(sub.t, sub.m, res.time),
		WindowFrom:     sub.t[0],
		WindowTo:       sub.t[len(sub.t)-1],
		Folds:          folds,
		Pairs:          res.pairs,
		Weighted:       lc.sig != nil,
	}
	if nb := opt.bootstrapCount(); nb > 0 {
		tm.SigmaBootstrap, tm.Bootstrap, tm.BootstrapFailed = timingBootstrap(len(idx), nb, opt.Seed, func(pick []int) (float64, bool) {
			r, err := kvwSolve(sub.pick(pick), res.time, folds, noise)
			return r.time, err == nil
		})
	}
	tm.Sigma = tm.SigmaMethod
	return tm, nil
}

// kvwResult is one solution of the Kwee–van Woerden method.
type kvwResult struct {
	time      float64 // T0, Julian date
	sigma     float64 // propagated noise, days
	sigma1956 float64 // original formula, days (NaN where it fails)
	pairs     int     // K
}

// kvwSolve applies the method to the points of lc (sorted by time), starting
// from the trial time nearest guess. noise is the σ of a point used when lc
// has no errors.
func kvwSolve(lc *extremumCurve, guess float64, folds int, noise float64) (kvwResult, error) {
	t, m, nrep := kvwMerge(lc.t, lc.m)
	var sig []float64 // σ of each merged point
	if lc.sig != nil {
		_, v, _ := kvwMerge(lc.t, kvwSquares(lc.sig))
		sig = make([]float64, len(v))
		for i := range v { // mean of n variances / n = variance of the mean
			sig[i] = math.Sqrt(v[i] / float64(nrep[i]))
		}
	}
	n := len(t)
	if n < extremumMinPoints {
		return kvwResult{}, fmt.Errorf("reduce: %d distinct times: want at least %d: %w", n, extremumMinPoints, ErrNoExtremum)
	}
	dt := (t[n-1] - t[0]) / float64(n-1)
	grid := make([]float64, n)
	y := make([]float64, n)
	left := make([]int, n)     // data index at or before each grid point
	frac := make([]float64, n) // interpolation weight of left+1
	for j := range n {
		g := t[0] + float64(j)*dt
		if j == n-1 {
			g = t[n-1]
		}
		grid[j] = g
		p := kvwBracket(t, g)
		left[j] = p
		if p+1 < n {
			frac[j] = (g - t[p]) / (t[p+1] - t[p])
			y[j] = m[p] + frac[j]*(m[p+1]-m[p])
		} else {
			y[j] = m[p]
		}
	}
	f := (folds - 1) / 2
	c := int(math.Round((guess - t[0]) / dt))
	var a, b, c0, x0 float64
	var k int
	var s []float64
	for iter := 0; ; iter++ {
		k = min(c-f, n-1-(c+f))
		if k < kvwMinPairs {
			return kvwResult{}, fmt.Errorf("reduce: the trial time JD %.5f leaves %d reflected pairs inside the data: want at least %d: %w",
				t[0]+float64(c)*dt, max(k, 0), kvwMinPairs, ErrOneSided)
		}
		s = make([]float64, folds)
		for j := -f; j <= f; j++ {
			for q := 1; q <= k; q++ {
				d := y[c+j+q] - y[c+j-q]
				s[j+f] += d * d
			}
		}
		a, b, c0 = kvwParabola(s, f)
		if !(a > 0) {
			return kvwResult{}, fmt.Errorf("reduce: the symmetry sum S(T) has no minimum near JD %.5f: %w", grid[c], ErrNoExtremum)
		}
		x0 = -b / (2 * a)
		step := int(math.Round(x0))
		if step == 0 || iter == kvwMaxIter {
			break
		}
		c += step
	}
	if math.Abs(x0) > float64(f) {
		return kvwResult{}, fmt.Errorf("reduce: the minimum of S(T) at JD %.5f lies outside the trial times: %w", grid[c]+x0*dt, ErrNoExtremum)
	}
	res := kvwResult{time: grid[c] + x0*dt, pairs: k, sigma1956: math.NaN()}
	// Kwee & van Woerden (1956): σ² = (4AC − B²)/(4A²(Z − 1)), Z = N/4.
	z := float64(2*k+1) / 4
	if sMin := c0 - b*b/(4*a); sMin > 0 && z > 1 {
		res.sigma1956 = dt * math.Sqrt(sMin/(a*(z-1)))
	}
	// First-order propagation: ∂x0/∂S_j through the parabola, ∂S_j/∂y_l
	// through the sums, ∂y_l/∂m_p through the interpolation.
	x0a, x0b := b/(2*a*a), -1/(2*a)
	fl := float64(folds)
	s2, s4 := 0.0, 0.0
	for j := -f; j <= f; j++ {
		s2 += float64(j * j)
		s4 += float64(j * j * j * j)
	}
	det := s4*fl - s2*s2
	gy := make([]float64, n)
	for j := -f; j <= f; j++ {
		xj := float64(j)
		dadS := (fl*xj*xj - s2) / det
		dbdS := xj / s2
		w := x0a*dadS + x0b*dbdS
		for q := 1; q <= k; q++ {
			d := y[c+j+q] - y[c+j-q]
			gy[c+j+q] += w * 2 * d
			gy[c+j-q] -= w * 2 * d
		}
	}
	gm := make([]float64, n)
	for l, g := range gy {
		p := left[l]
		gm[p] += g * (1 - frac[l])
		if p+1 < n {
			gm[p+1] += g * frac[l]
		}
	}
	v := 0.0
	for p, g := range gm {
		sp := noise
		if sig != nil {
			sp = sig[p]
		} else if nrep[p] > 1 {
			sp = noise / math.Sqrt(float64(nrep[p]))
		}
		v += g * g * sp * sp
	}
	res.sigma = dt * math.Sqrt(v)
	return res, nil
}

// kvwParabola fits S_j = a·x² + b·x + c at x = −f…f by least squares (exact
// for three folds), using the symmetry of the abscissae.
func kvwParabola(s []float64, f int) (a, b, c float64) {
	var s0, s2, s4, sy, sxy, sx2y float64
	for j := -f; j <= f; j++ {
		x, v := float64(j), s[j+f]
		s0++
		s2 += x * x
		s4 += x * x * x * x
		sy += v
		sxy += x * v
		sx2y += x * x * v
	}
	det := s4*s0 - s2*s2
	a = (s0*sx2y - s2*sy) / det
	c = (s4*sy - s2*sx2y) / det
	b = sxy / s2
	return a, b, c
}

// kvwMerge averages the values at equal times (t sorted) and returns the
// distinct times, the means and how many points each mean has.
func kvwMerge(t, v []float64) (tu, vu []float64, n []int) {
	for i := 0; i < len(t); {
		j, sum := i, 0.0
		for j < len(t) && t[j] == t[i] {
			sum += v[j]
			j++
		}
		tu = append(tu, t[i])
		vu = append(vu, sum/float64(j-i))
		n = append(n, j-i)
		i = j
	}
	return tu, vu, n
}

func kvwSquares(x []float64) []float64 {
	s := make([]float64, len(x))
	for i, v := range x {
		s[i] = v * v
	}
	return s
}

// kvwBracket returns the index p of the last time t[p] ≤ g (0 when g < t[0]),
// never the last index unless g is at the end.
func kvwBracket(t []float64, g float64) int {
	lo, hi := 0, len(t)-1
	if g >= t[hi] {
		return hi
	}
	for hi-lo > 1 {
		mid := (lo + hi) / 2
		if t[mid] <= g {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo
}

// kvwInterp interpolates m(t) linearly at g.
func kvwInterp(t, m []float64, g float64) float64 {
	p := kvwBracket(t, g)
	if p+1 >= len(t) {
		return m[p]
	}
	return m[p] + (g-t[p])/(t[p+1]-t[p])*(m[p+1]-m[p])
}
