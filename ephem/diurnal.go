package ephem

import (
	"fmt"
	"math"
)

// DiurnalCircle is the daily path of a place of fixed declination across the
// sky of a latitude: its altitude is a sinusoid in hour angle H,
//
//	sin h = sin φ sin δ + cos φ cos δ cos H   (Meeus 1998, eq. 13.6),
//
// so the hours in which a star stands above a given altitude follow in closed
// form. A star's apparent declination changes by under 1″ a day, which moves
// these hour angles by well under a second of time except within a few
// arcminutes of the pole. Build it with NewDiurnalCircle; the zero value is
// the equator seen from the equator.
type DiurnalCircle struct {
	sinLat, cosLat, sinDec, cosDec float64
}

// NewDiurnalCircle returns the daily path of declination decDeg seen from
// geodetic latitude latDeg (both in degrees, north positive).
func NewDiurnalCircle(latDeg, decDeg float64) DiurnalCircle {
	var c DiurnalCircle
	c.sinLat, c.cosLat = math.Sincos(latDeg * deg2rad)
	c.sinDec, c.cosDec = math.Sincos(decDeg * deg2rad)
	return c
}

// AltAz returns the airless altitude and the azimuth (degrees, from north
// through east) at hour angle hourAngleH (hours, positive west of the
// meridian): Meeus 1998, eq. 13.5 and 13.6, with the azimuth counted from
// north instead of south,
//
//	tan A = −cos δ sin H / (sin δ cos φ − cos δ cos H sin φ).
func (c DiurnalCircle) AltAz(hourAngleH float64) (altDeg, azDeg float64) {
	sh, ch := math.Sincos(hourAngleH * 15 * deg2rad)
	up := c.sinLat*c.sinDec + c.cosLat*c.cosDec*ch
	east := -c.cosDec * sh
	north := c.sinDec*c.cosLat - c.cosDec*ch*c.sinLat
	az := math.Atan2(east, north) * rad2deg
	if az < 0 {
		az += 360
	}
	return math.Asin(clamp1(up)) * rad2deg, az
}

// HourAngleAt returns the hour angle H0 (hours, in [0, 12]) at which the
// path crosses the airless altitude altDeg: the place stands above altDeg
// for hour angles |H| < H0, by Meeus 1998, eq. 15.1,
//
//	cos H0 = (sin h0 − sin φ sin δ) / (cos φ cos δ).
//
// When the place never goes down to altDeg it returns 12 and ErrCircumpolar;
// when it never rises above it, 0 and ErrNeverRises. At a pole, or for a
// place at a pole of the sky, the altitude is the same all day and one of
// the two errors is always returned. An altitude outside [−90°, 90°] (or
// NaN) gives NaN and an error naming it.
func (c DiurnalCircle) HourAngleAt(altDeg float64) (hours float64, err error) {
	if math.IsNaN(altDeg) || altDeg < -90 || altDeg > 90 {
		return math.NaN(), fmt.Errorf("ephem: altitude %v: degrees must be in [-90, 90]", altDeg)
	}
	s := math.Sin(altDeg * deg2rad)
	num := s - c.sinLat*c.sinDec
	den := c.cosLat * c.cosDec
	if den <= 0 { // at a pole: the same altitude all day
		if c.sinLat*c.sinDec > s {
			return 12, ErrCircumpolar
		}
		return 0, ErrNeverRises
	}
	switch {
	case num <= -den: // cos H0 ≤ −1: lowest point at or above altDeg
		return 12, ErrCircumpolar
	case num >= den: // cos H0 ≥ 1: highest point at or below altDeg
		return 0, ErrNeverRises
	}
	return math.Acos(num/den) * rad2deg / 15, nil
}
