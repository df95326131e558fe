package app

import (
	"errors"
	"fmt"
	"math"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

// Adopting a fitted ephemeris: the candidate from an O−C fit, the words of
// the confirmation and the source it is stored with.

// TimingCandidate returns the ephemeris of the study's fit ("linear" or
// "quadratic"), with its epoch moved to the whole cycle of the timings at
// which its error is least, so that T0 and P are close to uncorrelated (the
// planner takes them as independent: ephem.Ephemeris.Sigma). The linear fit
// keeps the current ephemeris's Q.
func (s TimingStudy) Candidate(fit string) (ephem.Ephemeris, error) {
	a := s.Analysis
	if a == nil {
		return ephem.Ephemeris{}, errors.New("there is no O−C fit to adopt")
	}
	eph := ephem.Ephemeris{Scale: a.Ephemeris.Scale}
	var cov [3][3]float64
	var epoch, period, q float64
	switch fit {
	case "linear":
		epoch, period, q = a.Linear.Epoch, a.Linear.Period, a.Ephemeris.Q
		cov[0][0], cov[1][1] = a.Linear.EpochErr*a.Linear.EpochErr, a.Linear.PeriodErr*a.Linear.PeriodErr
		cov[0][1], cov[1][0] = a.Linear.CovEpochPeriod, a.Linear.CovEpochPeriod
	case "quadratic":
		if a.Quadratic == nil {
			return eph, errors.New("there is no quadratic fit: it needs at least 4 timings on 3 cycles")
		}
		epoch, period, q, cov = a.Quadratic.Epoch, a.Quadratic.Period, a.Quadratic.Q, a.Quadratic.Cov
	default:
		return eph, fmt.Errorf("fit %q: want linear or quadratic", fit)
	}
	// σ²(T(E)) = g·Cov·g with g = (1, E, E²); σ²(P(E)) with h = (0, 1, 2E).
	form := func(g [3]float64) float64 {
		v := 0.0
		for i := range 3 {
			for j := range 3 {
				v += g[i] * cov[i][j] * g[j]
			}
		}
		return max(v, 0)
	}
	best, bestVar := 0.0, math.Inf(1)
	for _, r := range a.Rows {
		e := math.Round(r.Cycle)
		if v := form([3]float64{1, e, e * e}); v < bestVar {
			best, bestVar = e, v
		}
	}
	eph.Epoch = epoch + period*best + q*best*best
	eph.PeriodDays = period + 2*q*best
	eph.Q = q
	eph.EpochErr = math.Sqrt(bestVar)
	eph.PeriodErr = math.Sqrt(form([3]float64{0, 1, 2 * best}))
	return eph, eph.Validate()
}

// TimingAdoptSource is the source text an adopted ephemeris is stored with.
func TimingAdoptSource(what string, n int, now time.Time) string {
	return fmt.Sprintf("%s of %d timings, %s", what, n, now.UTC().Format(time.DateOnly))
}

// TimingEphemerisText writes an ephemeris as observers do: "Min I =
// BJD_TDB 2460435.89673(±0.00040) + 2.8673591(±0.0000002) × E".
func TimingEphemerisText(kind observe.Kind, e ephem.Ephemeris) string {
	what := "Max"
	if kind == observe.Min {
		what = "Min I"
	}
	s := fmt.Sprintf("%s = %s %s + %s × E", what, e.Scale.Label(), timingValErr(e.Epoch, e.EpochErr, 5), timingValErr(e.PeriodDays, e.PeriodErr, 7))
	switch {
	case e.Q > 0:
		s += fmt.Sprintf(" + %s × E²", timingSci(e.Q, 0))
	case e.Q < 0:
		s += fmt.Sprintf(" − %s × E²", timingSci(-e.Q, 0))
	}
	return s
}

// TimingAdoptMessage is the confirmation shown before an ephemeris is
// adopted: the old and the new elements and what adopting does.
func TimingAdoptMessage(tg observe.Target, eph ephem.Ephemeris, source string) string {
	return fmt.Sprintf("Adopt a new ephemeris for %s?\n\nNow:  %s\nNew:  %s\n\nSource: %s\n\n"+
		"The planner will predict from the new one; the old one stays in the star's history.",
		tg.Name, TimingEphemerisText(tg.Kind, tg.Ephemeris), TimingEphemerisText(tg.Kind, eph), source)
}
