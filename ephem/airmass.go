package ephem

import "math"

// Airmass returns the relative air mass toward an object at apparent
// (refracted) altitude refractedAltDeg, by Pickering (2002), DIO 12, 3:
//
//	X = 1 / sin(h + 244/(165 + 47 h^1.1)),  h in degrees.
//
// It is 1 at the zenith and stays finite down to the horizon (38.75 at
// h = 0), agreeing with the secant to 0.1% above 60° and with Kasten & Young
// (1989) to about 0.5% above 5°. ok is false when the object is below the
// apparent horizon (h < 0); the command line then prints null.
func Airmass(refractedAltDeg float64) (x float64, ok bool) {
	h := refractedAltDeg
	if math.IsNaN(h) || h < 0 || h > 90 {
		return math.NaN(), false
	}
	return 1 / math.Sin((h+244/(165+47*math.Pow(h, 1.1)))*deg2rad), true
}
