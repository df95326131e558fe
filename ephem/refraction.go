package ephem

import (
	"math"

	"github.com/soniakeys/meeus/v3/refraction"
	"github.com/soniakeys/unit"
)

// RefractionDeg returns the atmospheric refraction (degrees) for an object at
// airless (true) altitude altDeg, by Sæmundsson (1986), Sky & Telescope 72,
// 70 (Meeus 1998, eq. 16.4): R = 1.02′ / tan(h + 10.3/(h + 5.11)), for the
// standard atmosphere of 1010 hPa and 10 °C; consistent with Bennett's
// formula to 4″ (Meeus p. 106).
//
// Below a true altitude of −1° the object cannot be seen and no refraction is
// applied (the result is 0): the formula has no meaning there. Near the
// zenith, where the formula dips a hair below zero, the result is 0.
// Real refraction near the horizon varies with the weather by tens of
// percent; times that hinge on altitudes below 5° are approximate.
func RefractionDeg(altDeg float64) float64 {
	if math.IsNaN(altDeg) || altDeg < -1 || altDeg > 90 {
		return 0
	}
	return math.Max(0, refraction.Saemundsson(unit.AngleFromDeg(altDeg)).Deg())
}

// RefractedAltDeg returns the altitude an object at airless altitude altDeg
// appears at, by RefractionDeg.
func RefractedAltDeg(altDeg float64) float64 {
	return altDeg + RefractionDeg(altDeg)
}
