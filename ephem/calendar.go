package ephem

import (
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
// Julian before) and fractional day of Julian day jd (Meeus 1998, ch. 7,
// p. 63). jd must not be negative.
func JDToCalendar(jd float64) (year, month int, day float64) {
	return julian.JDToCalendar(jd)
}
