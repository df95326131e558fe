package chart

import (
	"fmt"
	"math"
	"time"

	"gonum.org/v1/plot"

	"example.org/vigil/ephem"
)

// timeAxis maps Julian dates to a chart's x axis: days since a round
// offset, or hours since a whole UTC hour with clock-time ticks.
type timeAxis struct {
	x       func(jd float64) float64
	label   string
	ticks   plot.Ticker // nil: gonum's default ticks
	scale   string      // "BJD_TDB", "HJD_UTC" or "JD_UTC"
	clock   *time.Location
	clockAt func(jd float64) time.Time
}

// scaleLabel names a light curve's time scale (0: JD UTC).
func scaleLabel(ts ephem.TimeScale) (string, error) {
	switch ts {
	case 0:
		return "JD_UTC", nil
	case ephem.HJD, ephem.BJDTDB:
		return ts.Label(), nil
	}
	return "", fmt.Errorf("chart: time scale %d: want ephem.HJD, ephem.BJDTDB or 0 (JD UTC)", int(ts))
}

// roundOffset returns the Julian date to subtract from times in [lo, hi]
// so that the axis shows small numbers: lo rounded down to a whole day, or
// over longer spans to a multiple of the largest power of ten within the
// span (the axis then starts below ten times that power).
func roundOffset(lo, hi float64) float64 {
	unit := 1.0
	if span := hi - lo; span > 1 {
		unit = math.Pow(10, math.Floor(math.Log10(span)))
	}
	return math.Floor(lo/unit) * unit
}

// jdToTime returns the instant of a Julian date UTC (days of 86400 s).
func jdToTime(jd float64) time.Time {
	ns := math.Round((jd - jdUnixEpoch) * 86400e9)
	return time.Unix(0, int64(ns)).UTC()
}

// newTimeAxis returns the time axis for Julian dates on scale ts in
// [lo, hi], in clock time of zone clock when it is set.
func newTimeAxis(ts ephem.TimeScale, clock *time.Location, lo, hi float64) (timeAxis, error) {
	name, err := scaleLabel(ts)
	if err != nil {
		return timeAxis{}, err
	}
	if clock == nil {
		off := roundOffset(lo, hi)
		return timeAxis{
			x:     func(jd float64) float64 { return jd - off },
			label: fmt.Sprintf("%s − %.0f (days)", name, off),
			scale: name,
		}, nil
	}
	if ts != 0 {
		return timeAxis{}, fmt.Errorf("chart: clock time axis: times on %s: want JD UTC, as HJD and BJD run up to 8.3 minutes off the clock", name)
	}
	if span := hi - lo; span > MaxClockSpanDays {
		return timeAxis{}, fmt.Errorf("chart: clock time axis: the data span %.2f days: want at most %d (one night)", span, MaxClockSpanDays)
	}
	// 1700 to 2200: far inside time.Duration's range from 1970.
	if lo < 2341972.5 || hi > 2524593.5 {
		return timeAxis{}, fmt.Errorf("chart: clock time axis: JD %.5f to %.5f: want dates between the years 1700 and 2200", lo, hi)
	}
	from := jdToTime(lo).Truncate(time.Hour)
	jdFrom := jdUnixEpoch + float64(from.Unix())/86400
	to := jdToTime(hi)
	hours := newHourTicks(from, to, clock)
	return timeAxis{
		x:       func(jd float64) float64 { return (jd - jdFrom) * 24 },
		label:   fmt.Sprintf("%s, night of %s", hours.label(), jdToTime(lo).In(clock).Add(-12*time.Hour).Format("2006-01-02")),
		ticks:   hours,
		scale:   name,
		clock:   clock,
		clockAt: jdToTime,
	}, nil
}

// instant writes a Julian date for the key: on its scale, and in clock
// time as well on a clock axis.
func (a timeAxis) instant(jd float64) string {
	s := fmt.Sprintf("%s %.5f", a.scale, jd)
	if a.clock != nil {
		s += " = " + a.clockAt(jd).In(a.clock).Format("15:04:05 MST")
	}
	return s
}

// span writes a range of Julian dates for the key.
func (a timeAxis) span(from, to float64) string {
	if a.clock != nil {
		return a.clockAt(from).In(a.clock).Format("15:04") + "–" + a.clockAt(to).In(a.clock).Format("15:04 MST")
	}
	return fmt.Sprintf("%s %.4f–%.4f", a.scale, from, to)
}
