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
func (e Ephemeris) Validate() error {
	switch {
	case math.IsNaN(e.Epoch) || math.IsInf(e.Epoch, 0) || e.Epoch < 2e6 || e.Epoch > 2.6e6:
		return fmt.Errorf("ephem: epoch T0 %v: want a full Julian date such as 2460000.1234", e.Epoch)
	case math.IsNaN(e.PeriodDays) || !(e.PeriodDays > 0) || e.PeriodDays > 1e5:
		return fmt.Errorf("ephem: period %v: days must be positive (and below 100000)", e.PeriodDays)
	case math.IsNaN(e.Q) || math.IsInf(e.Q, 0) || math.Abs(e.Q) > 1e-3*e.PeriodDays:
		return fmt.Errorf("ephem: quadratic term Q %v: days must be finite and far smaller than the period", e.Q)
	case e.Scale != HJD && e.Scale != BJDTDB:
		return fmt.Errorf("ephem: ephemeris time scale must be hjd or bjd")
	case math.IsNaN(e.EpochErr) || e.EpochErr < 0:
		return fmt.Errorf("ephem: epoch uncertainty %v: days must not be negative", e.EpochErr)
	case math.IsNaN(e.PeriodErr) || e.PeriodErr < 0:
		return fmt.Errorf("ephem: period uncertainty %v: days must not be negative", e.PeriodErr)
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
