package demo

import (
	"math"

	"example.org/vigil/reduce"
)

// The demo's hidden truth: the light curves and extremum times of its
// invented stars and the noise of their photometry. What an observer makes
// of them (magnitudes, timings, means) is computed by package reduce.

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
// needs; methods sheet §13): reduce.IntensityMean of the curve sampled at n
// evenly spaced phases (the midpoint rule).
func (s lightShape) intensityMean(n int) (float64, error) {
	mags := make([]float64, n)
	for i := range mags {
		mags[i] = s.magAt((float64(i) + 0.5) / float64(n))
	}
	return reduce.IntensityMean(mags)
}

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
