package reduce

import (
	"context"
	"math"
)

const (
	// lsNUFFTTol bounds the error of every trigonometric sum the
	// non-uniform FFT returns, relative to Σ|strength| (internal/nufft's
	// tests check it against direct sums).
	lsNUFFTTol = 1e-12
	// lsPowerBudget is the largest first-order bound on the power error
	// accepted from the fast sums; frequencies above it are recomputed
	// by direct sums. It is a tenth of the 1e-6 the tests demand.
	lsPowerBudget = 1e-7
	// lsDirectWork is the N·K (points × frequencies) up to which direct
	// sums are cheaper than setting up the fast transform.
	lsDirectWork = 200_000
	// lsBlock is the most frequencies one fast transform covers; longer
	// grids are done in blocks, which bounds memory (six fine grids of
	// about 2^21 complex values) and gives progress and cancellation
	// points.
	lsBlock = 1 << 20
	// glsDegenerate is the relative size below which the 2×2 matrix of
	// ZK09's CC, CS, SS counts as singular (see glsFit.power).
	glsDegenerate = 1e-14
	// lsFloat64Eps is the spacing of float64 numbers at 1.
	lsFloat64Eps = 0x1p-52
)

// glsFit holds the terms CC, SS, CS, YC, YS of the generalised
// Lomb–Scargle periodogram (Zechmeister & Kürster 2009, A&A 496, 577,
// Sect. 2, "ZK09") at one frequency, and the spectral window |C + iS|².
type glsFit struct {
	cc, ss, cs, yc, ys float64
	win                float64
}

// power returns the GLS power p(ω) = (SS·YC² + CC·YS² − 2·CS·YC·YS) /
// (YY·D), D = CC·SS − CS² (ZK09, eqs. 4–5), where yy is YY (the
// weighted variance). p = 1 − χ²(ω)/χ²₀ of the best floating-mean sinusoid,
// in [0, 1]. Where the matrix [CC CS; CS SS] is singular (every time at the
// same phase of 2ω) the same least-squares fit has only one regressor, and
// p is its share of YY; with none (f = 0) p = 0.
func (g glsFit) power(yy float64) float64 {
	cc, ss, cs := g.cc, g.ss, g.cs
	tr := cc + ss
	if !(tr > glsDegenerate) {
		return 0
	}
	d := cc*ss - cs*cs
	if d <= glsDegenerate*tr*tr {
		// Rank one: fit along the eigenvector of the larger eigenvalue λ.
		lam := tr/2 + math.Hypot((cc-ss)/2, cs)
		ex, ey := cs, lam-cc
		if fx, fy := lam-ss, cs; fx*fx+fy*fy > ex*ex+ey*ey {
			ex, ey = fx, fy
		}
		proj := ex*g.yc + ey*g.ys
		return proj * proj / ((ex*ex + ey*ey) * lam * yy)
	}
	return (ss*g.yc*g.yc + cc*g.ys*g.ys - 2*cs*g.yc*g.ys) / (yy * d)
}

// glsPowerChecked returns the GLS power p(ω) (as glsFit.power) from the
// weighted trigonometric sums of ZK09 (Sect. 2) at one angular frequency
// ω = 2πf, for weights w with Σw = 1 and magnitudes y centred on their
// weighted mean (so ZK09's Y = 0):
//
//	c, s   = Σ w cos ωt, Σ w sin ωt (ZK09's C, S)
//	yc, ys = Σ w y cos ωt, Σ w y sin ωt (ZK09's YC, YS when Y = 0)
//	c2, s2 = Σ w cos 2ωt, Σ w sin 2ωt
//
// ZK09's CC, SS and CS come from cos² = (1 + cos 2ωt)/2, sin² = (1 −
// cos 2ωt)/2 and sin·cos = sin 2ωt / 2; these one-pass differences lose
// digits where CC or SS is tiny (f·T ≪ 1). So it also returns whether p can
// be trusted: ok is false when a first-order bound on the power's error
// exceeds lsPowerBudget, given that each of c, s, c2, s2 may be off by eps
// and each of yc, ys by eps·ya (ya = Σw|y|). The bound is Σ|∂p/∂x|·|δx|
// over ZK09's YC, YS, CC, SS and CS; it grows as D = CC·SS − CS² shrinks,
// i.e. where the fit is ill conditioned, and ok is false wherever D ≤ 0.
// The fast periodogram calls it at every frequency, with plain float64
// arguments that stay in registers.
func glsPowerChecked(c, s, yc, ys, c2, s2, yy, ya, eps float64) (p float64, ok bool) {
	cc := 0.5*(1+c2) - c*c
	ss := 0.5*(1-c2) - s*s
	cs := 0.5*s2 - c*s
	d := cc*ss - cs*cs
	if !(d > 0) {
		return 0, false
	}
	inv := 1 / (yy * d)
	p = (ss*yc*yc + cc*ys*ys - 2*cs*yc*ys) * inv
	pyy := p * yy
	dYC := 2 * (ss*yc - cs*ys)
	dYS := 2 * (cc*ys - cs*yc)
	dCC := ys*ys - pyy*ss
	dSS := yc*yc - pyy*cc
	dCS := 2 * (pyy*cs - yc*ys)
	ac, as := math.Abs(c), math.Abs(s)
	bound := eps * inv * (ya*(math.Abs(dYC)+math.Abs(dYS)) +
		math.Abs(dCC)*(0.5+2*ac) + math.Abs(dSS)*(0.5+2*as) + math.Abs(dCS)*(0.5+ac+as))
	return p, bound <= lsPowerBudget
}

// periodFrac returns x − ⌊x⌋, in [0, 1).
func periodFrac(x float64) float64 { return x - math.Floor(x) }

// glsDirect returns ZK09's terms at f cycles per day by direct summation:
// the exact periodogram against which the fast one is tested. It works in
// the frame of the weighted mean time t̄ (the power does not depend on the
// time origin), with phases a = 2π·f·(t − t̄) reduced to [−π, π], and sums
// cos a − 1 = −sin²a/(1 + cos a) rather than cos a, so that CC, SS and CS,
// differences of nearly equal sums, keep their digits when f·T ≪ 1.
func (d *periodData) glsDirect(f float64) glsFit {
	var sv, ss, svv, sss, svs, syv, sys, sy float64
	for j, t := range d.dt {
		x := f * (t - d.tm)
		sn, cs := math.Sincos(2 * math.Pi * (x - math.Round(x)))
		v := cs - 1
		if cs > 0 {
			v = -sn * sn / (1 + cs)
		}
		w, wy := d.w[j], d.w[j]*d.y[j]
		sv += w * v
		ss += w * sn
		svv += w * v * v
		sss += w * sn * sn
		svs += w * v * sn
		syv += wy * v
		sys += wy * sn
		sy += wy
	}
	c := 1 + sv
	return glsFit{
		cc:  svv - sv*sv,
		ss:  sss - ss*ss,
		cs:  svs - sv*ss,
		yc:  syv - sy*sv,
		ys:  sys - sy*ss,
		win: c*c + ss*ss,
	}
}

// LombScargle returns the generalised Lomb–Scargle power (Zechmeister &
// Kürster 2009, A&A 496, 577, eqs. 4–5: floating mean, weights 1/σ² when
// every point has an error) of pts at every frequency of grid, normalised
// to [0, 1] like astropy's LombScargle(fit_mean=True, center_data=True,
// normalization='standard'), and the spectral window of the sampling
// (see PeriodResult.Window) on the same grid.
//
// The sums come from three type-1 non-uniform FFTs (internal/nufft: the
// "exponential of semicircle" kernel of Barnett, Magland & af Klinteberg
// 2019, SIAM J. Sci. Comput. 41, C479), one at 2f; frequencies where the
// fit is so ill conditioned that the transforms' 1e-12 error could move the
// power by more than 1e-7 are recomputed by direct sums. The power then
// agrees with the exact (direct-sum) periodogram to better than 1e-6 at
// every frequency. progress, if not nil, is called from the calling
// goroutine with the frequencies done and the total; cancelling ctx stops
// between blocks of up to 2^20 frequencies.
func LombScargle(ctx context.Context, pts []Point, grid FreqGrid, progress func(done, total int)) (power, window []float64, err error) {
	d, err := newPeriodData(pts)
	if err != nil {
		return nil, nil, err
	}
	if err := grid.validate(); err != nil {
		return nil, nil, err
	}
	return d.lombScargle(ctx, grid, progress)
}

// LombScarglePower returns the generalised Lomb–Scargle power of pts at
// one frequency (cycles per day) by direct sums (see LombScargle).
func LombScarglePower(pts []Point, freq float64) (float64, error) {
	d, err := newPeriodData(pts)
	if err != nil {
		return 0, err
	}
	if err := (FreqGrid{Start: freq, N: 1}).validate(); err != nil {
		return 0, err
	}
	return d.glsDirect(freq).power(d.yy), nil
}

// SpectralWindow returns the spectral window of the times of pts (with the
// same weights as LombScargle) at every frequency of grid: see
// PeriodResult.Window.
func SpectralWindow(ctx context.Context, pts []Point, grid FreqGrid) ([]float64, error) {
	d, err := newPeriodData(pts)
	if err != nil {
		return nil, err
	}
	if err := grid.validate(); err != nil {
		return nil, err
	}
	return d.spectralWindow(ctx, grid)
}

// refineLS moves a grid peak of the GLS power to the maximum of the exact
// power within one grid step either side, by golden-section search
// (Kiefer 1953, Proc. AMS 4, 502 [from memory]) to 1e-7 of a step.
func (d *periodData) refineLS(pk Peak, g FreqGrid) Peak {
	lo := max(pk.FreqPerDay-g.Step, 0.5*pk.FreqPerDay)
	hi := pk.FreqPerDay + g.Step
	pow := func(f float64) float64 { return d.glsDirect(f).power(d.yy) }
	const invPhi = 0.6180339887498949 // (√5 − 1)/2
	x1 := hi - invPhi*(hi-lo)
	x2 := lo + invPhi*(hi-lo)
	p1, p2 := pow(x1), pow(x2)
	for hi-lo > 1e-7*g.Step {
		if p1 < p2 {
			lo, x1, p1 = x1, x2, p2
			x2 = lo + invPhi*(hi-lo)
			p2 = pow(x2)
		} else {
			hi, x2, p2 = x2, x1, p1
			x1 = hi - invPhi*(hi-lo)
			p1 = pow(x1)
		}
	}
	f, p := x1, p1
	if p2 > p1 {
		f, p = x2, p2
	}
	if p < pk.Power { // the grid point itself was better (flat top)
		return pk
	}
	return Peak{FreqPerDay: f, PeriodDays: 1 / f, Power: p}
}
