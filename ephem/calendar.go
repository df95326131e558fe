package ephem

import (
	"math"

	"github.com/soniakeys/meeus/v3/julian"
)

// CalendarToJD returns the Julian day of a calendar date with fractional day
// d (Meeus 1998, eq. 7.1): Gregorian calendar from 1582 October 15 on, Julian
// calendar before, as Meeus counts. The result carries no time scale: it is
// the Julian date on whatever scale the calendar date was given in.
func CalendarToJD(year, month int, day float64) float64 {
	if year > 1582 || (year == 1582 && (month > 10 || (month == 10 && day >= 15))) {
		return julian.CalendarGregorianToJD(year, month, day)
	}
	return julian.CalendarJulianToJD(year, month, day)
}

// JDToCalendar returns the calendar date (Gregorian from 1582 October 15 on,
// Julian before) and fractional day of Julian day jd, by Meeus 1998, ch. 7,
// p. 63. jd must not be negative. (Written out here rather than taken from
// meeus/v3, whose switch to the Gregorian calendar sits ten days early.)
func JDToCalendar(jd float64) (year, month int, day float64) {
	zf, f := math.Modf(jd + 0.5)
	z := int64(zf)
	a := z
	if z >= 2299161 {
		alpha := int64(math.Floor((float64(z) - 1867216.25) / 36524.25))
		a = z + 1 + alpha - alpha/4
	}
	b := a + 1524
	c := int64(math.Floor((float64(b) - 122.1) / 365.25))
	d := int64(math.Floor(365.25 * float64(c)))
	e := int64(math.Floor(float64(b-d) / 30.6001))
	day = float64(b-d-int64(math.Floor(30.6001*float64(e)))) + f
	if e < 14 {
		month = int(e - 1)
	} else {
		month = int(e - 13)
	}
	if month > 2 {
		year = int(c - 4716)
	} else {
		year = int(c - 4715)
	}
	return year, month, day
}
