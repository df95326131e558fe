package ephem

import (
	"github.com/soniakeys/meeus/v3/coord"
	"github.com/soniakeys/unit"
)

// This file is the one place where vigil's conventions meet those of
// github.com/soniakeys/meeus/v3 (after Meeus 1998), which counts longitude
// positive WEST (globe.Coord, Meeus p. 93) and azimuth from the SOUTH,
// westwards (coord.EqToHz, Meeus eq. 13.5).

// meeusLon returns the west-positive longitude the library expects for an
// east-positive longitude in degrees.
func meeusLon(lonEastDeg float64) unit.Angle { return unit.AngleFromDeg(-lonEastDeg) }

// azFromNorth turns an azimuth measured from the south, westwards, into one
// measured from the north, eastwards, in degrees [0, 360).
func azFromNorth(azSouth unit.Angle) float64 {
	a := azSouth.Deg() + 180
	for a >= 360 {
		a -= 360
	}
	for a < 0 {
		a += 360
	}
	return a
}

// HorizontalOf returns the airless altitude and the azimuth (from north
// through east) of a place given by its apparent right ascension and
// declination of date, seen from a site whose Greenwich apparent sidereal
// time is gastHours: Meeus 1998, eq. 13.5 and 13.6, by coord.EqToHz. It is
// the textbook form of what Sky.Star does for catalogue places.
func HorizontalOf(raHours, decDeg float64, site Site, gastHours float64) (altDeg, azDeg float64) {
	A, h := coord.EqToHz(
		unit.RAFromHour(raHours), unit.AngleFromDeg(decDeg),
		unit.AngleFromDeg(site.LatDeg), meeusLon(site.LonDeg),
		unit.TimeFromHour(gastHours))
	return h.Deg(), azFromNorth(A)
}
