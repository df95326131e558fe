package reduce

import (
	"context"
	"errors"
	"fmt"
	"math"
	"slices"
)

// Period-search limits and defaults.
const (
	// MinPeriodPoints is the fewest points a period search accepts: the
	// floating-mean sinusoid has 3 parameters, and Baluev's (2008) FAP
	// needs N − 3 > 0 degrees of freedom with some to spare.
	MinPeriodPoints = 5
	// MaxFreqs is the largest frequency grid a search accepts.
	MaxFreqs = 10_000_000
	// DefaultOversample is the number of grid points per peak width 1/T
	// (VanderPlas 2018, ApJS 236, 16, §7.1, suggests 5–10 [from memory]).
	DefaultOversample = 5
	// DefaultPeaks is how many distinct peaks a search reports by default.
	DefaultPeaks = 10
)

// Method names a period-search method, as in the CLI's --method flag.
const (
	MethodLS  = "ls"  // generalised Lomb–Scargle, Zechmeister & Kürster (2009)
	MethodPDM = "pdm" // phase dispersion minimisation, Stellingwerf (1978)
)

// PeriodSearch says what Periodogram computes. Zero values take defaults.
type PeriodSearch struct {
	Method     string  // MethodLS (default) or MethodPDM
	MinPeriod  float64 // shortest trial period, days; 0: twice the median spacing of the times
	MaxPeriod  float64 // longest trial period, days; 0: the time span T
	Oversample float64 // grid points per peak width 1/T; 0: DefaultOversample
	NFreq      int     // number of trial frequencies, overriding Oversample; 0: from Oversample
	NPeaks     int     // number of distinct peaks to report; 0: DefaultPeaks
	Bins       int     // PDM phase bins; 0: DefaultPDMBins
	Covers     int     // PDM covers (shifted bin sets); 0: 1
	// Progress, if set, is called from the calling goroutine with the
	// number of trial frequencies done so far and the total.
	Progress func(done, total int)
}

// Peak is one local optimum of a periodogram.
type Peak struct {
	FreqPerDay float64 // cycles per day
	PeriodDays float64 // 1/FreqPerDay
	Power      float64 // GLS power (higher is better) or PDM θ (lower is better)
}

// PeriodResult is the outcome of a period search.
type PeriodResult struct {
	Method string   // MethodLS or MethodPDM
	Grid   FreqGrid // the trial frequencies
	Freqs  []float64
	// Power is the GLS power in [0, 1] (Zechmeister & Kürster 2009, eqs. 4–5)
	// or Stellingwerf's (1978) θ at each of Freqs (cycles per day).
	Power []float64
	// Window is the spectral window of the sampling at each of Freqs,
	// |Σ w_i exp(2πi f t_i)|² with weights summing to 1 (Deeming 1975,
	// Ap&SS 36, 137 [from memory]): 1 at f = 0 and wherever the times
	// repeat in phase, so peaks near 1, 2, … cycles per day mark the aliases
	// of nightly sampling.
	Window []float64
	Best   Peak   // the best peak (for ls refined off the grid)
	Peaks  []Peak // distinct local optima, best first (Best is Peaks[0])
	// FAP is the false-alarm probability of Best by Baluev (2008) for ls;
	// NaN for pdm.
	FAP float64
	// SpanDays is the time span T of the data: 1/T is the width of a peak.
	SpanDays float64
}

// FreqGrid is an evenly spaced grid of trial frequencies in cycles per
// day: Start, Start + Step, …, Start + (N−1)·Step.
type FreqGrid struct {
	Start float64 // first frequency, cycles per day
	Step  float64 // spacing, cycles per day
	N     int     // number of frequencies
}

// Freq returns the k-th frequency of the grid.
func (g FreqGrid) Freq(k int) float64 { return g.Start + float64(k)*g.Step }

// Freqs returns every frequency of the grid.
func (g FreqGrid) Freqs() []float64 {
	f := make([]float64, g.N)
	for k := range f {
		f[k] = g.Freq(k)
	}
	return f
}

func (g FreqGrid) validate() error {
	switch {
	case g.N < 1 || g.N > MaxFreqs:
		return fmt.Errorf("frequency grid of %d frequencies: want 1 to %d", g.N, MaxFreqs)
	case !(g.Start >= 0) || math.IsInf(g.Start, 0):
		return fmt.Errorf("frequency grid start %v: want a finite frequency ≥ 0 cycles per day", g.Start)
	case g.N > 1 && !(g.Step > 0 && !math.IsInf(g.Step, 0)):
		return fmt.Errorf("frequency grid step %v: want a finite step > 0 cycles per day", g.Step)
	case math.IsInf(g.Freq(g.N-1), 0):
		return fmt.Errorf("frequency grid ends at %v cycles per day", g.Freq(g.N-1))
	}
	return nil
}

// Grid returns the trial-frequency grid for pts under s: from 1/MaxPeriod
// to 1/MinPeriod inclusive, with a spacing of at most 1/(Oversample·T),
// T the time span (VanderPlas 2018, §7.1), or exactly NFreq frequencies.
// The defaults are common practice: MaxPeriod = T, and MinPeriod = twice
// the median spacing of successive distinct times.
func (s PeriodSearch) Grid(pts []Point) (FreqGrid, error) {
	d, err := newPeriodData(pts)
	if err != nil {
		return FreqGrid{}, err
	}
	return s.grid(d)
}

func (s PeriodSearch) grid(d *periodData) (FreqGrid, error) {
	minP, maxP := s.MinPeriod, s.MaxPeriod
	if maxP == 0 {
		maxP = d.span
	}
	if minP == 0 {
		minP = 2 * d.medianStep()
	}
	switch {
	case !(minP > 0) || math.IsInf(minP, 0):
		return FreqGrid{}, fmt.Errorf("min period %v: want a finite period > 0 days", minP)
	case !(maxP > 0) || math.IsInf(maxP, 0):
		return FreqGrid{}, fmt.Errorf("max period %v: want a finite period > 0 days", maxP)
	case minP >= maxP:
		return FreqGrid{}, fmt.Errorf("min period %v ≥ max period %v days: want min < max", minP, maxP)
	}
	over := s.Oversample
	if over == 0 {
		over = DefaultOversample
	}
	if !(over >= 1) || math.IsInf(over, 0) {
		return FreqGrid{}, fmt.Errorf("oversampling %v: want at least 1 point per peak width", over)
	}
	lo, hi := 1/maxP, 1/minP
	n := s.NFreq
	switch {
	case n < 0 || n == 1:
		return FreqGrid{}, fmt.Errorf("frequency count %d: want at least 2, or 0 for the default", n)
	case n == 0:
		steps := math.Ceil((hi - lo) * over * d.span)
		if steps+1 > MaxFreqs {
			return FreqGrid{}, fmt.Errorf("periods %v to %v days over a %.6g-day span need %.4g frequencies, more than %d: raise the min period or lower the oversampling",
				minP, maxP, d.span, steps+1, MaxFreqs)
		}
		n = int(steps) + 1
	case n > MaxFreqs:
		return FreqGrid{}, fmt.Errorf("frequency count %d: want at most %d", n, MaxFreqs)
	}
	g := FreqGrid{Start: lo, Step: (hi - lo) / float64(n-1), N: n}
	return g, g.validate()
}

// Periodogram searches pts for a period, by the generalised Lomb–Scargle
// periodogram (Zechmeister & Kürster 2009, A&A 496, 577) or by phase
// dispersion minimisation (Stellingwerf 1978, ApJ 224, 953), on the grid
// s.Grid gives. It returns the power at every trial frequency, the
// spectral window, the distinct peaks best first and, for ls, Baluev's
// (2008, MNRAS 385, 1279) false-alarm probability of the best peak. For ls
// the peaks are refined off the grid by maximising the exact power.
//
// Cancelling ctx stops the search within one block of frequencies and
// returns ctx's error.
func Periodogram(ctx context.Context, pts []Point, s PeriodSearch) (PeriodResult, error) {
	method := s.Method
	if method == "" {
		method = MethodLS
	}
	if method != MethodLS && method != MethodPDM {
		return PeriodResult{}, fmt.Errorf("method %q: want %q or %q", s.Method, MethodLS, MethodPDM)
	}
	npeaks := s.NPeaks
	if npeaks == 0 {
		npeaks = DefaultPeaks
	}
	if npeaks < 1 {
		return PeriodResult{}, fmt.Errorf("peak count %d: want at least 1", s.NPeaks)
	}
	d, err := newPeriodData(pts)
	if err != nil {
		return PeriodResult{}, err
	}
	g, err := s.grid(d)
	if err != nil {
		return PeriodResult{}, err
	}
	res := PeriodResult{Method: method, Grid: g, Freqs: g.Freqs(), FAP: math.NaN(), SpanDays: d.span}
	sep := 1 / d.span // distinct peaks lie at least one peak width apart
	switch method {
	case MethodLS:
		res.Power, res.Window, err = d.lombScargle(ctx, g, s.Progress)
		if err != nil {
			return PeriodResult{}, err
		}
		res.Peaks = findPeaks(g, res.Power, npeaks, sep, false)
		for i := range res.Peaks {
			if err := ctx.Err(); err != nil {
				return PeriodResult{}, err
			}
			res.Peaks[i] = d.refineLS(res.Peaks[i], g)
		}
		slices.SortStableFunc(res.Peaks, func(a, b Peak) int { return -peakOrder(a.Power, b.Power) })
		if len(res.Peaks) > 0 {
			res.FAP = d.baluevFAP(res.Peaks[0].Power, g.Freq(g.N-1))
		}
	case MethodPDM:
		bins, covers := s.Bins, s.Covers
		if bins == 0 {
			bins = DefaultPDMBins
		}
		if covers == 0 {
			covers = 1
		}
		res.Power, err = d.pdm(ctx, g, bins, covers, s.Progress)
		if err != nil {
			return PeriodResult{}, err
		}
		if res.Window, err = d.spectralWindow(ctx, g); err != nil {
			return PeriodResult{}, err
		}
		res.Peaks = findPeaks(g, res.Power, npeaks, sep, true)
	}
	if len(res.Peaks) == 0 {
		return PeriodResult{}, errors.New("the periodogram has no finite value")
	}
	res.Best = res.Peaks[0]
	return res, nil
}

func peakOrder(a, b float64) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}

// findPeaks returns up to n local optima of power (maxima, or minima when
// lower is better), best first, each at least sep cycles per day from every
// better one. A grid end counts as a local optimum when it beats its one
// neighbour.
func findPeaks(g FreqGrid, power []float64, n int, sep float64, lower bool) []Peak {
	better := func(a, b float64) bool {
		if lower {
			return a < b
		}
		return a > b
	}
	var cand []int
	last := len(power) - 1
	for k, p := range power {
		if math.IsNaN(p) {
			continue
		}
		// A NaN neighbour counts as no neighbour.
		if (k == 0 || !better(power[k-1], p)) && (k == last || math.IsNaN(power[k+1]) || better(p, power[k+1])) {
			cand = append(cand, k)
		}
	}
	slices.SortStableFunc(cand, func(a, b int) int {
		if better(power[a], power[b]) {
			return -1
		}
		if better(power[b], power[a]) {
			return 1
		}
		return 0
	})
	var peaks []Peak
	for _, k := range cand {
		f := g.Freq(k)
		distinct := true
		for _, q := range peaks {
			if math.Abs(f-q.FreqPerDay) < sep {
				distinct = false
				break
			}
		}
		if distinct {
			peaks = append(peaks, Peak{FreqPerDay: f, PeriodDays: 1 / f, Power: power[k]})
			if len(peaks) == n {
				break
			}
		}
	}
	return peaks
}

// BaluevFAP returns the false-alarm probability of a generalised
// Lomb–Scargle peak of power z (normalised to [0, 1]) found by a search up
// to fmax cycles per day, for the times and errors of pts: the chance that
// pure Gaussian noise gives a peak at least that high. It is Baluev's
// (2008, MNRAS 385, 1279) alias-free approximation (eq. 6, with Table 1 for
// the floating-mean model, d_H = 1 and d_K = 3):
//
//	FAP ≈ 1 − (1 − (1 − z)^((N−3)/2)) · e^(−τ),
//	τ = γ_H · W · (1 − z)^((N−4)/2) · √(N_H·z/2),
//	W = fmax · √(4π·D_t),  γ_H = √(2/N_H) · Γ(N_H/2) / Γ((N_H−1)/2),
//
// where N_H = N − 1 and D_t is the weighted variance of the times. It is an
// upper bound that is tight for small FAP; for FAP near 1 it is rough.
func BaluevFAP(pts []Point, z, fmax float64) (float64, error) {
	d, err := newPeriodData(pts)
	if err != nil {
		return 0, err
	}
	if !(z >= 0 && z <= 1) {
		return 0, fmt.Errorf("power %v: want a normalised power in [0, 1]", z)
	}
	if !(fmax > 0) || math.IsInf(fmax, 0) {
		return 0, fmt.Errorf("max frequency %v: want a finite frequency > 0 cycles per day", fmax)
	}
	return d.baluevFAP(z, fmax), nil
}

func (d *periodData) baluevFAP(z, fmax float64) float64 {
	n := float64(len(d.dt))
	nh, nk := n-1, n-3
	var vt float64
	for i, t := range d.dt {
		vt += d.w[i] * (t - d.tm) * (t - d.tm)
	}
	w := fmax * math.Sqrt(4*math.Pi*vt)
	lg1, _ := math.Lgamma(nh / 2)
	lg2, _ := math.Lgamma((nh - 1) / 2)
	gammaH := math.Sqrt(2/nh) * math.Exp(lg1-lg2)
	tau := gammaH * w * math.Pow(1-z, (nk-1)/2) * math.Sqrt(nh*z/2)
	single := math.Pow(1-z, nk/2)
	// 1 − (1 − single)·e^(−τ), written to keep small values exact.
	return -math.Expm1(-tau) + single*math.Exp(-tau)
}

// periodData is a light curve made ready for a period search: times from
// the earliest, magnitudes centred on their weighted mean, weights summing
// to 1. Working from the earliest time keeps Julian dates near 2.46e6 from
// costing phase precision.
type periodData struct {
	t0   float64   // earliest time
	dt   []float64 // t − t0, days
	y    []float64 // magnitude − weighted mean
	w    []float64 // weights, Σw = 1: 1/σ² when every point has an error, else equal
	yy   float64   // Σ w·y², the weighted variance (ZK09's YY)
	ya   float64   // Σ w·|y|
	sy   float64   // Σ y, unweighted (for PDM)
	syy  float64   // Σ y², unweighted (for PDM)
	span float64   // max dt, days
	tm   float64   // Σ w·dt, the weighted mean time from t0
}

// newPeriodData checks pts and prepares them. Errors name the first bad
// point by its index (from 0).
func newPeriodData(pts []Point) (*periodData, error) {
	if len(pts) < MinPeriodPoints {
		return nil, fmt.Errorf("a period search needs at least %d points, got %d", MinPeriodPoints, len(pts))
	}
	weighted := true
	t0 := math.Inf(1)
	for i, p := range pts {
		switch {
		case math.IsNaN(p.T) || math.IsInf(p.T, 0):
			return nil, &PointError{Index: i, Field: "time", Value: p.T, Want: "a finite Julian date"}
		case math.IsNaN(p.Mag) || math.IsInf(p.Mag, 0):
			return nil, &PointError{Index: i, Field: "mag", Value: p.Mag, Want: "a finite magnitude (drop points without one first)"}
		case p.Err < 0 || math.IsInf(p.Err, 0):
			return nil, &PointError{Index: i, Field: "err", Value: p.Err, Want: "a finite error > 0 (0 or empty for unknown)"}
		case !(p.Err > 0):
			weighted = false // unknown: equal weights for all (package convention)
		}
		t0 = min(t0, p.T)
	}
	n := len(pts)
	d := &periodData{t0: t0, dt: make([]float64, n), y: make([]float64, n), w: make([]float64, n)}
	var sw, my float64
	for i, p := range pts {
		d.dt[i] = p.T - t0
		d.span = max(d.span, d.dt[i])
		d.w[i] = 1
		if weighted {
			d.w[i] = 1 / (p.Err * p.Err)
		}
		sw += d.w[i]
	}
	if d.span == 0 {
		return nil, fmt.Errorf("all %d times are %v: a period search needs a time span", n, t0)
	}
	if math.IsInf(sw, 0) {
		return nil, errors.New("errors are so small that their weights 1/σ² overflow")
	}
	for i, p := range pts {
		d.w[i] /= sw
		my += d.w[i] * p.Mag
		d.tm += d.w[i] * d.dt[i]
	}
	for i, p := range pts {
		d.y[i] = p.Mag - my
		d.yy += d.w[i] * d.y[i] * d.y[i]
		d.ya += d.w[i] * math.Abs(d.y[i])
		d.sy += d.y[i]
		d.syy += d.y[i] * d.y[i]
	}
	if !slices.ContainsFunc(pts, func(p Point) bool { return p.Mag != pts[0].Mag }) {
		return nil, fmt.Errorf("all %d magnitudes are %v: nothing varies", n, pts[0].Mag)
	}
	return d, nil
}

// medianStep returns the median spacing of successive distinct times.
func (d *periodData) medianStep() float64 {
	t := slices.Clone(d.dt)
	slices.Sort(t)
	var steps []float64
	for i := 1; i < len(t); i++ {
		if t[i] > t[i-1] {
			steps = append(steps, t[i]-t[i-1])
		}
	}
	slices.Sort(steps)
	return steps[len(steps)/2]
}
