package reduce

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat/distuv"

	"example.org/vigil/ephem"
)

// ErrShortSpan is wrapped by the error LightTime returns when the timings
// span less than LightTimeMinCycles orbits of the trial period.
var ErrShortSpan = errors.New("timings span too short for the trial period")

// LightTimeMinCycles is the fewest orbits of a periodic O−C term the timings
// must span before it is fitted (common practice: a periodic term seen over
// less than about one and a half cycles cannot be told from a parabola).
const LightTimeMinCycles = 1.5

// LightTimeOptions tunes LightTime.
type LightTimeOptions struct {
	// Eccentric fits the full light-travel-time orbit of Irwin (1952); false
	// fits its circular-orbit case, a sinusoid.
	Eccentric bool
	// Quadratic adds a parabola (a steady period change) to the linear
	// ephemeris fitted with the orbit.
	Quadratic bool
	// MinPeriodDays, MaxPeriodDays bound the trial orbital periods; 0 means
	// max(10 × the median spacing of the timings, span/50) and
	// span/LightTimeMinCycles.
	MinPeriodDays, MaxPeriodDays float64
}

// LightTimeFit is a periodic term fitted to an O−C diagram together with
// the ephemeris.
type LightTimeFit struct {
	Eccentric, Quadratic bool

	PeriodDays, PeriodErr float64 // orbital period P3 and its σ, days
	// AmplitudeDays is a12·sin i / c (days), Irwin's amplitude; for the
	// circular orbit it is the semi-amplitude of the sinusoid.
	AmplitudeDays, AmplitudeErr float64
	// SemiAmplitudeDays is half the peak-to-peak light-time effect,
	// A·sqrt(1 − e²cos²ω) (Irwin 1952).
	SemiAmplitudeDays float64
	// Eccentricity e and argument of periastron ω (degrees) of the orbit
	// (0 and NaN for the circular orbit).
	Eccentricity, EccentricityErr float64
	OmegaDeg, OmegaErr            float64
	// OrbitEpochJD is the time of periastron for the eccentric orbit, and
	// the time of greatest delay (τ = +A) for the circular one.
	OrbitEpochJD, OrbitEpochErr float64

	// Ephemeris fitted with the orbit, T(E) = T0 + P·E + Q·E² plus τ, with
	// EpochErr and PeriodErr filled in; Q is the input ephemeris's unless
	// Quadratic, and QErr its error (0 unless Quadratic).
	Ephemeris ephem.Ephemeris
	QErr      float64

	Chi2  float64
	Dof   int
	Iters int // Levenberg–Marquardt iterations
	// FTestF, FTestP: F-test of the added orbit terms against the
	// ephemeris alone; a small FTestP says the periodic term is significant.
	// It is approximate: the best of many trial periods is kept, so a
	// chance peak looks more significant than it is.
	FTestF, FTestP float64

	eph                    ephem.Ephemeris // of the O−C analysis
	centre, scale, tCentre float64
	par                    []float64
}

// Tau returns the light-time term τ(t) (days) of the fitted orbit at Julian
// date t: Irwin (1952), ApJ 116, 211, eq. (1):
// τ = A[(1 − e²)/(1 + e cos ν)·sin(ν + ω) + e sin ω].
func (f LightTimeFit) Tau(t float64) float64 {
	return ltTau(f.par[f.nBase():], f.Eccentric, t-f.tCentre)
}

// OC returns the O−C (days, against the ephemeris of the analysis) that the
// fit predicts at Julian date t, at the fractional cycle of t: ephemeris
// correction plus τ(t).
func (f LightTimeFit) OC(t float64) float64 {
	e := f.eph.Cycle(t)
	return ltModel(f.par, f.nBase(), f.Eccentric, (e-f.centre)/f.scale, t-f.tCentre)
}

func (f LightTimeFit) nBase() int {
	if f.Quadratic {
		return 3
	}
	return 2
}

// LightTime fits a periodic term to the O−C diagram a together with a
// correction to its ephemeris (linear, or quadratic with opt.Quadratic): the
// light-travel time across a wide orbit about a third body (Irwin 1952, ApJ
// 116, 211), or its circular-orbit case τ = A cos(2π(t − T)/P3), T the time
// of greatest delay.
//
// The orbital period is searched on a grid of frequencies from
// 1/MaxPeriodDays to 1/MinPeriodDays (step 1/(10 × span)) with the
// amplitude and ephemeris terms solved linearly at each (circular orbit);
// the best is refined, with all parameters free, by Levenberg–Marquardt
// (Marquardt 1963, J. SIAM 11, 431), started for the eccentric orbit from
// a set of eccentricities and periastron angles. Parameter errors come from
// the covariance (JᵀWJ)⁻¹ at the solution, scaled by χ²/dof when the
// timings have no σ.
//
// It refuses (ErrShortSpan) when the timings span less than
// LightTimeMinCycles trial periods, and needs at least twice as many timings
// as parameters.
func LightTime(a OCAnalysis, opt LightTimeOptions) (LightTimeFit, error) {
	n := len(a.Rows)
	nBase := 2
	if opt.Quadratic {
		nBase = 3
	}
	nPar := nBase + 3
	if opt.Eccentric {
		nPar = nBase + 5
	}
	if n < 2*nPar {
		return LightTimeFit{}, fmt.Errorf("reduce: %d timings for a light-time fit with %d parameters: want at least %d", n, nPar, 2*nPar)
	}
	t := make([]float64, n)
	oc := make([]float64, n)
	var w []float64
	if a.Weighted {
		w = make([]float64, n)
	}
	tMin, tMax := math.Inf(1), math.Inf(-1)
	cycles := make([]float64, n)
	for i, r := range a.Rows {
		t[i], oc[i], cycles[i] = r.Time, r.OCDays, r.Cycle
		if w != nil {
			w[i] = 1 / (r.SigmaDays * r.SigmaDays)
		}
		tMin, tMax = min(tMin, r.Time), max(tMax, r.Time)
	}
	span := tMax - tMin
	pMax := span / LightTimeMinCycles
	lo, hi := opt.MinPeriodDays, opt.MaxPeriodDays
	if hi == 0 {
		hi = pMax
	}
	if lo == 0 {
		lo = max(10*ltMedianSpacing(t), span/50)
	}
	switch {
	case math.IsNaN(lo) || math.IsNaN(hi) || lo < 0 || hi < 0:
		return LightTimeFit{}, fmt.Errorf("reduce: trial periods %v to %v d: want positive numbers of days", lo, hi)
	case hi > pMax*(1+1e-12):
		return LightTimeFit{}, fmt.Errorf("reduce: the timings span %.1f d, %.2f cycles of the trial period %.1f d: want at least %g: %w",
			span, span/hi, hi, LightTimeMinCycles, ErrShortSpan)
	case lo >= hi:
		return LightTimeFit{}, fmt.Errorf("reduce: trial periods %.4g to %.4g d: want the shortest below the longest (the longest allowed by the span is %.4g d)",
			lo, hi, pMax)
	}

	f := LightTimeFit{Eccentric: opt.Eccentric, Quadratic: opt.Quadratic, eph: a.Ephemeris}
	// Centred, scaled cycle (as in ocFit) and centred time.
	for _, e := range cycles {
		f.centre += e
	}
	f.centre /= float64(n)
	for _, e := range cycles {
		f.scale = max(f.scale, math.Abs(e-f.centre))
	}
	if f.scale == 0 {
		f.scale = 1
	}
	f.tCentre = (tMin + tMax) / 2
	u := make([]float64, n)
	tc := make([]float64, n)
	for i := range n {
		u[i] = (cycles[i] - f.centre) / f.scale
		tc[i] = t[i] - f.tCentre
	}

	// Ephemeris alone, for the F-test.
	base := mat.NewDense(n, nBase, nil)
	for i := range n {
		for k, v := 0, 1.0; k < nBase; k, v = k+1, v*u[i] {
			base.Set(i, k, v)
		}
	}
	_, _, chi2Base, err := timingLSQ(base, oc, w)
	if err != nil {
		return LightTimeFit{}, fmt.Errorf("reduce: light-time fit: %w", err)
	}

	// Grid in frequency, circular orbit solved linearly at each.
	bestChi2, bestFreq := math.Inf(1), 0.0
	var bestLin []float64
	df := 1 / (10 * span)
	x := mat.NewDense(n, nBase+2, nil)
	for freq := 1 / hi; freq <= 1/lo; freq += df {
		for i := range n {
			row := x.RawRowView(i)
			for k, v := 0, 1.0; k < nBase; k, v = k+1, v*u[i] {
				row[k] = v
			}
			s, c := math.Sincos(2 * math.Pi * freq * tc[i])
			row[nBase], row[nBase+1] = s, c
		}
		c, _, chi2, err := timingLSQ(x, oc, w)
		if err == nil && chi2 < bestChi2 {
			bestChi2, bestFreq, bestLin = chi2, freq, c
		}
	}
	if bestLin == nil {
		return LightTimeFit{}, fmt.Errorf("reduce: light-time fit: no trial period between %.4g and %.4g d could be fitted", lo, hi)
	}
	// Circular orbit as (base…, A, P3, tMax): τ = A cos(2π(t − tMax)/P3).
	sa, ca := bestLin[nBase], bestLin[nBase+1]
	p3 := 1 / bestFreq
	start := append(append([]float64(nil), bestLin[:nBase]...), math.Hypot(sa, ca), p3, math.Atan2(sa, ca)/(2*math.Pi)*p3)
	model := func(p []float64, i int) float64 { return ltModel(p, nBase, opt.Eccentric, u[i], tc[i]) }
	linear := ltLinear{nBase, func(i, k int) float64 { return math.Pow(u[i], float64(k)) }}
	var sol ltSolution
	if !opt.Eccentric {
		sol, err = ltLevenbergMarquardt(start, model, linear, oc, w, ltSteps(start, nBase, false, p3), -1, ltMaxIter)
		if err != nil {
			return LightTimeFit{}, err
		}
	} else {
		// Eccentric orbit (base…, A, P3, Tperi − tCentre, e, ω). Near e = 0
		// Irwin's τ ≈ A sin(M + ω) = A cos(2π(t − tMax)/P3) when
		// M + ω = 2π(t − tMax)/P3 + π/2.
		// A few iterations from each start, then the best to convergence.
		sol.chi2 = math.Inf(1)
		for _, e := range []float64{0.1, 0.3, 0.5, 0.7} {
			for _, om := range []float64{0, 0.5 * math.Pi, math.Pi, 1.5 * math.Pi} {
				tp := start[nBase+2] - (math.Pi/2-om)/(2*math.Pi)*p3
				p := append(append([]float64(nil), start[:nBase+2]...), tp, e, om)
				s, err := ltLevenbergMarquardt(p, model, linear, oc, w, ltSteps(p, nBase, true, p3), nBase+3, ltStartIter)
				if err == nil && s.chi2 < sol.chi2 {
					sol = s
				}
			}
		}
		if !math.IsInf(sol.chi2, 1) {
			best := sol
			sol, err = ltLevenbergMarquardt(best.p, model, linear, oc, w, ltSteps(best.p, nBase, true, best.p[nBase+1]), nBase+3, ltMaxIter)
			if err != nil {
				return LightTimeFit{}, err
			}
			sol.iters += best.iters
		}
		if math.IsInf(sol.chi2, 1) {
			return LightTimeFit{}, fmt.Errorf("reduce: light-time fit: the eccentric orbit did not converge from any start")
		}
	}
	return f.finish(sol, a, n, nPar, nBase, chi2Base, span)
}

// finish turns the solution into the reported parameters.
func (f LightTimeFit) finish(sol ltSolution, a OCAnalysis, n, nPar, nBase int, chi2Base, span float64) (LightTimeFit, error) {
	p, cov := sol.p, sol.cov
	f.par, f.Chi2, f.Dof, f.Iters = p, sol.chi2, n-nPar, sol.iters
	if !a.Weighted {
		cov.ScaleSym(sol.chi2/float64(f.Dof), cov)
	}
	sd := func(k int) float64 { return math.Sqrt(max(cov.At(k, k), 0)) }
	if p[nBase] < 0 { // keep A positive: shift the orbit by half a period
		p[nBase] = -p[nBase]
		if f.Eccentric {
			p[nBase+4] += math.Pi
		} else {
			p[nBase+2] += p[nBase+1] / 2
		}
	}
	f.AmplitudeDays, f.AmplitudeErr = p[nBase], sd(nBase)
	f.PeriodDays, f.PeriodErr = p[nBase+1], sd(nBase+1)
	if f.PeriodDays*LightTimeMinCycles > span {
		return LightTimeFit{}, fmt.Errorf("reduce: the fitted orbital period %.1f d is more than the span %.1f d / %g: %w",
			f.PeriodDays, span, LightTimeMinCycles, ErrShortSpan)
	}
	f.OrbitEpochJD, f.OrbitEpochErr = f.tCentre+p[nBase+2], sd(nBase+2)
	f.SemiAmplitudeDays = f.AmplitudeDays
	f.OmegaDeg, f.OmegaErr = math.NaN(), math.NaN()
	if f.Eccentric {
		f.Eccentricity, f.EccentricityErr = p[nBase+3], sd(nBase+3)
		om := math.Mod(p[nBase+4], 2*math.Pi)
		if om < 0 {
			om += 2 * math.Pi
		}
		p[nBase+4] = om
		f.OmegaDeg, f.OmegaErr = om*180/math.Pi, sd(nBase+4)*180/math.Pi
		ec := f.Eccentricity * math.Cos(om)
		f.SemiAmplitudeDays = f.AmplitudeDays * math.Sqrt(1-ec*ec)
	}
	// Ephemeris in E from the centred, scaled polynomial and its covariance.
	covBase := mat.NewSymDense(nBase, nil)
	for i := range nBase {
		for j := i; j < nBase; j++ {
			covBase.SetSym(i, j, cov.At(i, j))
		}
	}
	coef, covE := ocUncentre(p[:nBase], covBase, f.centre, f.scale)
	f.Ephemeris = f.eph
	f.Ephemeris.Epoch += coef[0]
	f.Ephemeris.PeriodDays += coef[1]
	f.Ephemeris.EpochErr = math.Sqrt(covE.At(0, 0))
	f.Ephemeris.PeriodErr = math.Sqrt(covE.At(1, 1))
	if nBase == 3 {
		f.Ephemeris.Q += coef[2]
		f.QErr = math.Sqrt(covE.At(2, 2))
	}
	k := nPar - nBase
	f.FTestF, f.FTestP = math.NaN(), math.NaN()
	if f.Dof > 0 && sol.chi2 > 0 && chi2Base > sol.chi2 {
		f.FTestF = (chi2Base - sol.chi2) / float64(k) / (sol.chi2 / float64(f.Dof))
		f.FTestP = distuv.F{D1: float64(k), D2: float64(f.Dof)}.Survival(f.FTestF)
	}
	return f, nil
}

// ltModel is the O−C model: Σ p_k u^k (k < nBase) plus τ at centred time tc.
func ltModel(p []float64, nBase int, eccentric bool, u, tc float64) float64 {
	return timingPolyEval(p[:nBase], u) + ltTau(p[nBase:], eccentric, tc)
}

// ltTau is the light-time term. Circular: q = (A, P3, tMax), τ = A cos(2π(t −
// tMax)/P3). Eccentric: q = (A, P3, Tperi, e, ω) and Irwin (1952) eq. (1),
// with the true anomaly ν from Kepler's equation M = E − e sin E.
func ltTau(q []float64, eccentric bool, tc float64) float64 {
	a, p3, t0 := q[0], q[1], q[2]
	if !eccentric {
		return a * math.Cos(2*math.Pi*(tc-t0)/p3)
	}
	e, om := q[3], q[4]
	m := 2 * math.Pi * (tc - t0) / p3
	nu := ltTrueAnomaly(m, e)
	return a * ((1-e*e)/(1+e*math.Cos(nu))*math.Sin(nu+om) + e*math.Sin(om))
}

// ltTrueAnomaly solves Kepler's equation M = E − e sin E by Newton's method
// from E = M + e sin M (Meeus 1998, ch. 30) and returns the true anomaly
// ν = 2 atan(sqrt((1 + e)/(1 − e)) tan(E/2)) (Meeus 1998, eq. 30.1).
func ltTrueAnomaly(m, e float64) float64 {
	m = math.Remainder(m, 2*math.Pi)
	ea := m + e*math.Sin(m)
	for range 50 {
		d := (ea - e*math.Sin(ea) - m) / (1 - e*math.Cos(ea))
		ea -= d
		if math.Abs(d) < 1e-14 {
			break
		}
	}
	return 2 * math.Atan2(math.Sqrt(1+e)*math.Sin(ea/2), math.Sqrt(1-e)*math.Cos(ea/2))
}

// ltMedianSpacing is the median interval between consecutive sorted times.
func ltMedianSpacing(t []float64) float64 {
	s := append([]float64(nil), t...)
	extremumMedian(s) // sorts s
	var d []float64
	for i := 1; i < len(s); i++ {
		if s[i] > s[i-1] {
			d = append(d, s[i]-s[i-1])
		}
	}
	if len(d) == 0 {
		return 0
	}
	return extremumMedian(d)
}

// ltSteps returns the finite-difference step of each parameter.
func ltSteps(p []float64, nBase int, eccentric bool, p3 float64) []float64 {
	h := make([]float64, len(p))
	scale := 0.0
	for _, v := range p[:nBase+1] {
		scale = max(scale, math.Abs(v))
	}
	scale = max(scale, 1e-6)
	for k := range nBase + 1 {
		h[k] = 1e-6 * scale
	}
	h[nBase+1] = 1e-7 * p3
	h[nBase+2] = 1e-6 * p3
	if eccentric {
		h[nBase+3] = 1e-6
		h[nBase+4] = 1e-6
	}
	return h
}

// ltLinear describes the first n parameters of a model that enter it
// linearly: ∂model_i/∂p_k = basis(i, k), so that the Jacobian needs no
// differences for them.
type ltLinear struct {
	n     int
	basis func(i, k int) float64
}

// ltSolution is the result of ltLevenbergMarquardt.
type ltSolution struct {
	p     []float64
	cov   *mat.SymDense // (JᵀWJ)⁻¹
	chi2  float64
	iters int
}

const (
	// ltMaxIter bounds the Levenberg–Marquardt iterations.
	ltMaxIter = 200
	// ltStartIter is the number of iterations tried from each start of the
	// eccentric orbit before the best is refined.
	ltStartIter = 15
	// ltMaxEccentricity is the largest eccentricity the fit may reach.
	ltMaxEccentricity = 0.95
)

// ltLevenbergMarquardt minimises χ² = Σ w_i (y_i − model(p, i))² from p0
// (Levenberg 1944, Q. Appl. Math. 2, 164; Marquardt 1963, J. SIAM 11, 431):
// a central-difference Jacobian J (steps h), and steps δ from
// (JᵀWJ + λ diag(JᵀWJ)) δ = JᵀW r (the columns of the parameters in
// linear taken from its basis), λ divided by 10 after a step that lowers
// χ² and multiplied by 10 after one that does not. It stops after maxIter
// iterations, when a step lowers χ² by less than 1e-6 of χ²/dof, or when no
// step lowers it. When eIdx ≥
// 0, p[eIdx] is an eccentricity, kept in [0, ltMaxEccentricity] (a negative
// one is reflected, turning ω = p[eIdx+1] by π).
func ltLevenbergMarquardt(p0 []float64, model func(p []float64, i int) float64, linear ltLinear, y, w, h []float64, eIdx, maxIter int) (ltSolution, error) {
	n, np := len(y), len(p0)
	p := append([]float64(nil), p0...)
	wt := func(i int) float64 {
		if w == nil {
			return 1
		}
		return w[i]
	}
	chi2Of := func(p []float64) float64 {
		s := 0.0
		for i := range n {
			r := y[i] - model(p, i)
			s += wt(i) * r * r
		}
		return s
	}
	jac := mat.NewDense(n, np, nil)
	q := make([]float64, np)
	fillJac := func() {
		copy(q, p)
		for i := range n {
			for k := range linear.n {
				jac.Set(i, k, linear.basis(i, k))
			}
		}
		for k := linear.n; k < np; k++ {
			plus, minus := p[k]+h[k], p[k]-h[k]
			if k == eIdx && minus < 0 {
				minus = p[k]
			}
			for i := range n {
				q[k] = plus
				up := model(q, i)
				q[k] = minus
				jac.Set(i, k, (up-model(q, i))/(plus-minus))
			}
			q[k] = p[k]
		}
	}
	// normal returns JᵀWJ and JᵀW r at p.
	normal := func() (*mat.SymDense, *mat.VecDense) {
		a := mat.NewSymDense(np, nil)
		g := mat.NewVecDense(np, nil)
		for i := range n {
			row := jac.RawRowView(i)
			wr := wt(i) * (y[i] - model(p, i))
			for j := range np {
				g.SetVec(j, g.AtVec(j)+row[j]*wr)
				for k := j; k < np; k++ {
					a.SetSym(j, k, a.At(j, k)+wt(i)*row[j]*row[k])
				}
			}
		}
		return a, g
	}
	chi2 := chi2Of(p)
	lambda := 1e-3
	iters := 0
	damped := mat.NewSymDense(np, nil)
	trial := make([]float64, np)
	// A step is negligible when it lowers χ² by less than 1e-6 of the
	// variance scale χ²/dof.
	negligible := 1e-6 * chi2 / float64(max(n-np, 1))
	for converged := false; !converged && iters < maxIter; iters++ {
		fillJac()
		a, g := normal()
		converged = true // unless a step lowers χ² noticeably
		for range 30 {
			damped.CopySym(a)
			for j := range np {
				damped.SetSym(j, j, a.At(j, j)*(1+lambda))
			}
			var ch mat.Cholesky
			var d mat.VecDense
			if !ch.Factorize(damped) || ch.SolveVecTo(&d, g) != nil {
				lambda *= 10
				continue
			}
			for j := range np {
				trial[j] = p[j] + d.AtVec(j)
			}
			if eIdx >= 0 {
				if trial[eIdx] < 0 {
					trial[eIdx], trial[eIdx+1] = -trial[eIdx], trial[eIdx+1]+math.Pi
				}
				trial[eIdx] = min(trial[eIdx], ltMaxEccentricity)
			}
			c := chi2Of(trial)
			if c >= chi2 {
				lambda *= 10
				continue
			}
			converged = chi2-c < negligible
			copy(p, trial)
			chi2 = c
			lambda = max(lambda/10, 1e-12)
			break
		}
	}
	fillJac()
	a, _ := normal()
	var ch mat.Cholesky
	if !ch.Factorize(a) {
		return ltSolution{}, fmt.Errorf("reduce: light-time fit: the normal matrix at the solution is singular: the timings do not constrain every parameter")
	}
	cov := mat.NewSymDense(np, nil)
	if err := ch.InverseTo(cov); err != nil {
		return ltSolution{}, fmt.Errorf("reduce: light-time fit: %w", err)
	}
	return ltSolution{p: p, cov: cov, chi2: chi2, iters: iters}, nil
}
