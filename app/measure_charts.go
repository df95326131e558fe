package app

import (
	"context"
	"fmt"
	"math"

	"example.org/vigil/app/chart"
	"example.org/vigil/ephem"
	"example.org/vigil/reduce"
)

// The Measurements page's charts, built from an analysis (no fyne).

// LightCurveData returns what the page's light curve draws
// (chart.LightCurve): the star's reduced magnitudes with their errors,
// brighter up; the check star below (or above) them, shifted by a round
// offset the key states when the two would overlap; clock time of the
// site for one night, BJD_TDB less an offset across nights.
func (a MeasureAnalysis) LightCurveData() chart.LightCurveData {
	t := a.Request.Target
	d := chart.LightCurveData{MagLabel: measureMagLabel(a.Filter)}
	if a.Scope == MeasureThisNight {
		d.Title = fmt.Sprintf("%s · %s", t.Name, measureNightWords(a.Request.Date))
		d.Clock = a.Request.Site.Location()
	} else {
		d.Title = fmt.Sprintf("%s · all nights (%s, %s)", t.Name, plural(len(a.Target), "point", "points"), plural(a.Nights, "night", "nights"))
		d.Scale = ephem.BJDTDB
	}
	d.Series = []chart.Series{{Name: t.Name, Points: a.Target}}
	if len(a.Check) > 0 {
		d.Series = append(d.Series, chart.Series{Name: "check " + a.CheckID, Points: a.Check,
			OffsetMag: measureCheckOffset(a.Target, a.Check)})
	}
	return d
}

// measureCheckOffset returns the shift (a multiple of 0.1 mag) that puts
// the check star's points 0.2 mag below the faintest of the target's when
// their ranges would overlap, or 0 when they are apart already.
func measureCheckOffset(target, check []reduce.Point) float64 {
	tlo, thi := measureRange(target)
	clo, chi := measureRange(check)
	if math.IsNaN(tlo) || math.IsNaN(clo) {
		return 0
	}
	const gap = 0.2 // mag between the two curves (common practice: clear of each other)
	if clo > thi+gap/2 || chi < tlo-gap/2 {
		return 0
	}
	return math.Ceil((thi+gap-clo)*10) / 10
}

// measureRange returns the faintest and brightest magnitudes of pts (NaN
// when none).
func measureRange(pts []reduce.Point) (lo, hi float64) {
	lo, hi = math.NaN(), math.NaN()
	for _, p := range pts {
		if math.IsNaN(p.Mag) {
			continue
		}
		if math.IsNaN(lo) || p.Mag < lo {
			lo = p.Mag
		}
		if math.IsNaN(hi) || p.Mag > hi {
			hi = p.Mag
		}
	}
	return lo, hi
}

// PhaseData returns what the page's folded curve draws (chart.PhaseCurve):
// the points folded on the star's current ephemeris, with means in bins
// equal bins of phase when bins > 0 (reduce.BinInPhase).
func (a MeasureAnalysis) PhaseData(bins int) (chart.PhaseData, error) {
	t := a.Request.Target
	eph := t.Ephemeris
	d := chart.PhaseData{Points: a.Phase, Ephemeris: &eph, MagLabel: measureMagLabel(a.Filter), Name: t.Name}
	d.Title = fmt.Sprintf("%s folded on P = %.7g d", t.Name, eph.PeriodDays)
	if bins > 0 && len(a.Phase) >= 2*bins {
		b, err := reduce.BinInPhase(a.Phase, bins)
		if err != nil {
			return d, err
		}
		d.Binned = b
	}
	return d, nil
}

// measureMagLabel labels the magnitude axis by the filter: "V magnitude",
// "visual magnitude", or "magnitude" when the filters differ.
func measureMagLabel(filter string) string {
	switch filter {
	case "":
		return "magnitude"
	case "vis":
		return "visual magnitude"
	}
	return filter + " magnitude"
}

// measureLightSource draws the analysis's light curve.
func measureLightSource(a MeasureAnalysis) ChartSource {
	d := a.LightCurveData()
	return func(ctx context.Context, pal chart.Palette) (Drawable, error) {
		return chart.LightCurve(d, pal)
	}
}

// measurePhaseSource draws the analysis's folded curve with bins bins.
func measurePhaseSource(a MeasureAnalysis, bins int) ChartSource {
	return func(ctx context.Context, pal chart.Palette) (Drawable, error) {
		if a.PhaseErr != nil {
			return nil, a.PhaseErr
		}
		d, err := a.PhaseData(bins)
		if err != nil {
			return nil, err
		}
		return chart.PhaseCurve(d, pal)
	}
}
