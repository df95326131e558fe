package app

import (
	"context"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/reduce"
)

// TimingPeriodInput is what the period search's fields hold, as typed.
type TimingPeriodInput struct {
	Min, Max, Oversample string
	Method               string // reduce.MethodLS or reduce.MethodPDM
}

// TimingPeriodDefaults fills the fields for a star of period p days: from
// p/2.5 to 2.5·p, which takes in half and twice the period (an eclipsing
// binary's Lomb–Scargle peak lies at P/2), and the default oversampling.
func TimingPeriodDefaults(p float64) TimingPeriodInput {
	in := TimingPeriodInput{Oversample: strconv.Itoa(reduce.DefaultOversample), Method: reduce.MethodLS}
	if p > 0 {
		in.Min = strconv.FormatFloat(p/2.5, 'g', 4, 64)
		in.Max = strconv.FormatFloat(p*2.5, 'g', 4, 64)
	}
	return in
}

// TimingParsePeriod checks the fields and returns the search they ask for;
// a field at fault ("min", "max", "oversample", "method") gets its message
// in the map (nil when all are good).
func TimingParsePeriod(in TimingPeriodInput) (reduce.PeriodSearch, map[string]string) {
	errs := map[string]string{}
	var s reduce.PeriodSearch
	days := func(field, text string) float64 {
		v, err := strconv.ParseFloat(strings.TrimSpace(text), 64)
		if err != nil || !(v > 0) || math.IsInf(v, 0) {
			errs[field] = fmt.Sprintf("%q: want a period in days such as 0.35", strings.TrimSpace(text))
			return 0
		}
		return v
	}
	s.MinPeriod = days("min", in.Min)
	s.MaxPeriod = days("max", in.Max)
	if errs["min"] == "" && errs["max"] == "" && !(s.MaxPeriod > s.MinPeriod) {
		errs["max"] = fmt.Sprintf("%g d: want a longest period above the shortest, %g d", s.MaxPeriod, s.MinPeriod)
	}
	o, err := strconv.ParseFloat(strings.TrimSpace(in.Oversample), 64)
	if err != nil || !(o >= 1 && o <= 100) {
		errs["oversample"] = fmt.Sprintf("%q: want a number of trial periods per peak width from 1 to 100, such as 5", strings.TrimSpace(in.Oversample))
	}
	s.Oversample = o
	switch in.Method {
	case reduce.MethodLS, reduce.MethodPDM:
		s.Method = in.Method
	default:
		errs["method"] = fmt.Sprintf("method %q: want %q or %q", in.Method, reduce.MethodLS, reduce.MethodPDM)
	}
	if len(errs) > 0 {
		return s, errs
	}
	return s, nil
}

// TimingSearch runs the period search over the points (reduce.Periodogram),
// reporting progress; cancelling ctx stops it.
func TimingSearch(ctx context.Context, pts []reduce.Point, s reduce.PeriodSearch, progress func(done, total int)) (reduce.PeriodResult, error) {
	if len(pts) < reduce.MinPeriodPoints {
		return reduce.PeriodResult{}, fmt.Errorf("%s: a period search needs at least %d", plural(len(pts), "reduced measurement", "reduced measurements"), reduce.MinPeriodPoints)
	}
	s.Progress = progress
	return reduce.Periodogram(ctx, pts, s)
}

// TimingPeakColumns are the headings of the table of peaks.
var TimingPeakColumns = []string{"#", "Period (d)", "Frequency (c/d)", "Power", "Note"}

// TimingPeakCells writes the peaks of a search, best first: period,
// frequency, power (θ for PDM) and how each relates to the best
// (reduce.AliasNote).
func TimingPeakCells(r reduce.PeriodResult) [][]string {
	out := make([][]string, len(r.Peaks))
	for i, p := range r.Peaks {
		note := ""
		if i == 0 {
			note = "best"
		} else {
			note = reduce.AliasNote(p.FreqPerDay, r.Best.FreqPerDay, r.SpanDays)
		}
		out[i] = []string{strconv.Itoa(i + 1), fmt.Sprintf("%.7f", p.PeriodDays), fmt.Sprintf("%.6f", p.FreqPerDay),
			fmt.Sprintf("%.4f", p.Power), note}
	}
	return out
}

// TimingPeriodSummary says what a search found over n points.
func TimingPeriodSummary(r reduce.PeriodResult, n int) []string {
	method, power := "Lomb–Scargle", "power"
	if r.Method == reduce.MethodPDM {
		method, power = "Phase dispersion (PDM)", "θ, lower is better"
	}
	first, last := r.Grid.Freq(0), r.Grid.Freq(r.Grid.N-1)
	out := []string{
		fmt.Sprintf("%s over %d measurements spanning %.0f d: %d trial periods from %.5g to %.5g d.",
			method, n, r.SpanDays, r.Grid.N, 1/last, 1/first),
		fmt.Sprintf("Best: P = %.7f d (%s %.4f).", r.Best.PeriodDays, power, r.Best.Power),
	}
	switch {
	case r.Method == reduce.MethodPDM:
		out = append(out, "PDM gives no false-alarm probability; it also dips at multiples of the true period.")
	case r.FAP < 1e-10:
		out = append(out, "False-alarm probability below 10⁻¹⁰ (Baluev 2008): the signal is real, though it may be an alias.")
	default:
		out = append(out, fmt.Sprintf("False-alarm probability %.2g (Baluev 2008): the chance that noise alone makes a peak this high.", r.FAP))
	}
	if w := r.WindowPeaks(3); len(w) > 0 {
		var fs []string
		for _, p := range w {
			fs = append(fs, fmt.Sprintf("%.4f", p.FreqPerDay))
		}
		out = append(out, fmt.Sprintf("The sampling repeats at %s c/d: peaks that far from the best may be its aliases.", strings.Join(fs, ", ")))
	}
	return out
}

// TimingFromPeak makes an ephemeris of period p (days) from the points:
// they are folded on p, the phase of the brightest (or, for a star timed at
// minima, the faintest) stretch is found from binned means
// (reduce.BinInPhase), and the extremum is timed on the folded curve around
// it (reduce.Extremum, Kwee–van Woerden for an eclipsing star's minima),
// its epoch moved to the cycle nearest the middle of the data; σ(T0) is
// that fit's. σ(P) comes from the frequency's error (TimingPeriodSigma).
func TimingFromPeak(pts []reduce.Point, p float64, tg observe.Target) (ephem.Ephemeris, error) {
	scale := tg.Ephemeris.Scale
	if len(pts) < reduce.MinPeriodPoints || !(p > 0) {
		return ephem.Ephemeris{}, fmt.Errorf("period %g d over %d points: want a positive period and at least %d points", p, len(pts), reduce.MinPeriodPoints)
	}
	lo, hi, mean := pts[0].T, pts[0].T, 0.0
	for _, q := range pts {
		lo, hi, mean = min(lo, q.T), max(hi, q.T), mean+q.T
	}
	mean /= float64(len(pts))
	ref := ephem.Ephemeris{Epoch: lo, PeriodDays: p, Scale: scale}
	folded, err := reduce.PhaseFold(pts, ref)
	if err != nil {
		return ephem.Ephemeris{}, err
	}
	bins, err := reduce.BinInPhase(folded, min(max(len(folded)/10, 10), 100))
	if err != nil {
		return ephem.Ephemeris{}, err
	}
	kind := TimingDefaultKind(tg)
	ext := bins[0]
	for _, b := range bins {
		if (kind == reduce.Maximum && b.Mag < ext.Mag) || (kind == reduce.Minimum && b.Mag > ext.Mag) {
			ext = b
		}
	}
	// One cycle of the folded curve centred on the extreme bin, as times.
	cycle := make([]reduce.Point, len(folded))
	for i, f := range folded {
		ph := f.Phase - ext.X
		ph -= math.Round(ph)
		cycle[i] = reduce.Point{T: lo + (ext.X+ph)*p, Mag: f.Mag, Err: f.Err}
	}
	slices.SortFunc(cycle, func(a, b reduce.Point) int { return timingCmp(a.T, b.T) })
	t0, sigma := lo+ext.X*p, (ext.Hi-ext.Lo)*p/2
	if tm, err := reduce.Extremum(cycle, reduce.ExtremumOptions{Kind: kind, Method: TimingDefaultMethod(tg, kind), Seed: TimingSeed}); err == nil {
		t0, sigma = tm.Time, tm.Sigma
	}
	n := math.Round((mean - t0) / p)
	eph := ephem.Ephemeris{Epoch: t0 + n*p, PeriodDays: p, Scale: scale, EpochErr: sigma,
		PeriodErr: TimingPeriodSigma(pts, p)}
	return eph, eph.Validate()
}

// TimingPeriodSigma returns the uncertainty (days) of a period p found in
// the points, from the error of its frequency for a sinusoid fitted by
// least squares with independent errors of equal size:
//
//	σ(f) = σ_m / (2π · A) · √(2 / Σ(t − t̄)²),  σ(P) = P² · σ(f),
//
// A the sinusoid's semi-amplitude and σ_m the scatter of the points about
// it. For times spread evenly over T days Σ(t − t̄)² = N·T²/12 and this is
// σ(f) = √(6/N) · σ_m / (π · T · A) (Montgomery & O'Donoghue 1999, Delta
// Scuti Star Newsletter 13, 28 [from memory]); the sum keeps it right for
// data bunched into nights and seasons. A light curve far from a sinusoid
// leaves its shape in σ_m, which only makes the error larger. With no
// amplitude it falls back to half the peak's width, P²/(2T).
func TimingPeriodSigma(pts []reduce.Point, p float64) float64 {
	n := len(pts)
	lo, hi, mean := pts[0].T, pts[0].T, 0.0
	for _, q := range pts {
		lo, hi, mean = min(lo, q.T), max(hi, q.T), mean+q.T
	}
	mean /= float64(n)
	span, dt2 := hi-lo, 0.0
	for _, q := range pts {
		dt2 += (q.T - mean) * (q.T - mean)
	}
	fallback := p * p / (2 * span)
	if n < 4 || !(span > 0) {
		return fallback
	}
	// Normal equations of m = c + a·cos 2πf(t−lo) + b·sin 2πf(t−lo).
	var m [3][4]float64
	rows := make([][3]float64, n)
	for i, q := range pts {
		ph := 2 * math.Pi * math.Mod((q.T-lo)/p, 1)
		x := [3]float64{1, math.Cos(ph), math.Sin(ph)}
		rows[i] = x
		for j := range 3 {
			for k := range 3 {
				m[j][k] += x[j] * x[k]
			}
			m[j][3] += x[j] * q.Mag
		}
	}
	coef, ok := timingSolve3(m)
	if !ok {
		return fallback
	}
	amp := math.Hypot(coef[1], coef[2])
	ss := 0.0
	for i, q := range pts {
		r := q.Mag - (coef[0] + coef[1]*rows[i][1] + coef[2]*rows[i][2])
		ss += r * r
	}
	sigmaM := math.Sqrt(ss / float64(n-3))
	if !(amp > 0) {
		return fallback
	}
	sf := sigmaM / (2 * math.Pi * amp) * math.Sqrt(2/dt2)
	return p * p * sf
}

// timingSolve3 solves a 3×3 linear system given as its augmented matrix,
// by Gaussian elimination with partial pivoting.
func timingSolve3(m [3][4]float64) ([3]float64, bool) {
	for c := range 3 {
		piv := c
		for r := c + 1; r < 3; r++ {
			if math.Abs(m[r][c]) > math.Abs(m[piv][c]) {
				piv = r
			}
		}
		if m[piv][c] == 0 {
			return [3]float64{}, false
		}
		m[c], m[piv] = m[piv], m[c]
		for r := c + 1; r < 3; r++ {
			f := m[r][c] / m[c][c]
			for k := c; k < 4; k++ {
				m[r][k] -= f * m[c][k]
			}
		}
	}
	var x [3]float64
	for r := 2; r >= 0; r-- {
		v := m[r][3]
		for k := r + 1; k < 3; k++ {
			v -= m[r][k] * x[k]
		}
		x[r] = v / m[r][r]
	}
	return x, true
}

// The job slots of the Timings page.
const (
	timingSlotLoad   = "timing-load"
	timingSlotFit    = "timing-fit"
	timingSlotOC     = "timing-oc"
	timingSlotSearch = "timing-search"
	timingSlotFold   = "timing-fold"
	timingSlotWrite  = "timing-write"
)
