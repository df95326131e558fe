package ephem

import (
	"fmt"
	"math"
)

// Ephemeris gives the times of a star's maxima or minima: T(E) = T0 + P·E +
// Q·E² for cycle number E, on the time scale Scale (Sterken 2005, ASP Conf.
// Ser. 335, 3). Q is zero for a linear ephemeris; the period at cycle E is
// P + 2QE and its rate of change dP/dt = 2Q/P.
type Ephemeris struct {
	Epoch      float64   // T0, Julian date on Scale
	PeriodDays float64   // P
	Q          float64   // quadratic term (days), 0 for a linear ephemeris
	Scale      TimeScale // HJD (UTC) or BJD (TDB)
	EpochErr   float64   // σ(T0), days; 0 when unknown
	PeriodErr  float64   // σ(P), days; 0 when unknown
}

// Validate reports the first unusable field of e.
//
// The quadratic term must leave the period positive throughout the supported
// range 1620–2200: the instantaneous period P + 2QE falls to zero at cycle
// E* = −P/(2Q), reached at T* = T0 − P²/(4Q), beyond which T(E) turns back
// and the times of the extrema are meaningless. So |Q| < P²/(4D), D the
// time from T0 to the end of the range on the side of T*. For P = 0.4 d and
// T0 in 2024 that is |Q| < 2.7e-7 d, a rate dP/dt = 2Q/P of 1.4e-6 d/d,
// a hundred times the fastest period changes timed in eclipsing binaries
// and pulsating stars (common practice: |dP/dt| ≲ 1e-5 d/yr).
func (e Ephemeris) Validate() error {
	switch {
	case math.IsNaN(e.Epoch) || math.IsInf(e.Epoch, 0) || e.Epoch < 2e6 || e.Epoch > 2.6e6:
		return fmt.Errorf("ephem: epoch T0 %v: want a full Julian date such as 2460000.1234", e.Epoch)
	case math.IsNaN(e.PeriodDays) || !(e.PeriodDays > 0) || e.PeriodDays > 1e5:
		return fmt.Errorf("ephem: period %v: days must be positive (and below 100000)", e.PeriodDays)
	case math.IsNaN(e.Q) || math.IsInf(e.Q, 0):
		return fmt.Errorf("ephem: quadratic term Q %v: days must be a finite number", e.Q)
	case e.Scale != HJD && e.Scale != BJDTDB:
		return fmt.Errorf("ephem: ephemeris time scale %v: want hjd (HJD_UTC) or bjd (BJD_TDB)", e.Scale)
	case math.IsNaN(e.EpochErr) || e.EpochErr < 0:
		return fmt.Errorf("ephem: epoch uncertainty %v: days must not be negative", e.EpochErr)
	case math.IsNaN(e.PeriodErr) || e.PeriodErr < 0:
		return fmt.Errorf("ephem: period uncertainty %v: days must not be negative", e.PeriodErr)
	}
	if e.Q != 0 {
		p2 := e.PeriodDays * e.PeriodDays
		tStar := e.Epoch - p2/(4*e.Q) // where P + 2QE = 0
		if tStar >= minJD && tStar < maxJD {
			d := e.Epoch - minJD
			if e.Q < 0 {
				d = maxJD - e.Epoch
			}
			return fmt.Errorf("ephem: quadratic term Q %v: the period P + 2QE would fall to zero at cycle %.0f "+
				"(JD %.1f), inside the supported range 1620–2200; want |Q| below P²/(4·%.0f d) = %.3g d",
				e.Q, -e.PeriodDays/(2*e.Q), tStar, d, p2/(4*d))
		}
	}
	return nil
}

// At returns T(E) = T0 + P·E + Q·E², the ephemeris time of cycle E (E may be
// a half-integer for secondary minima).
func (e Ephemeris) At(cycle float64) float64 {
	return e.Epoch + e.PeriodDays*cycle + e.Q*cycle*cycle
}

// Cycle returns the (fractional) cycle number of Julian date jd: the root of
// T(E) = jd nearest to (jd − T0)/P.
func (e Ephemeris) Cycle(jd float64) float64 {
	x := (jd - e.Epoch) / e.PeriodDays
	if e.Q == 0 {
		return x
	}
	// Q·E² + P·E − (jd − T0) = 0, in the form that does not cancel.
	d := jd - e.Epoch
	disc := e.PeriodDays*e.PeriodDays + 4*e.Q*d
	if disc < 0 {
		return x
	}
	return 2 * d / (e.PeriodDays + math.Sqrt(disc))
}

// Phase returns the phase of jd in [0, 1): the fractional part of its cycle.
func (e Ephemeris) Phase(jd float64) float64 {
	c := e.Cycle(jd)
	return c - math.Floor(c)
}

// Sigma returns the uncertainty (days) of T(E) from σ(T0) and σ(P), taken as
// independent: sqrt(σT0² + (E·σP)²). It grows with the distance from the
// epoch.
func (e Ephemeris) Sigma(cycle float64) float64 {
	return math.Hypot(e.EpochErr, cycle*e.PeriodErr)
}

// PeriodAt returns the instantaneous period P + 2QE at cycle E.
func (e Ephemeris) PeriodAt(cycle float64) float64 {
	return e.PeriodDays + 2*e.Q*cycle
}
