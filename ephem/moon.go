package ephem

import (
	"github.com/soniakeys/meeus/v3/moonposition"
)

// moonGeocentric returns the Moon's apparent geocentric position (km) in the
// true equator and equinox of date at TT Julian date jd, given the nutation
// in longitude dpsi and the true obliquity eps (radians): Meeus 1998, ch. 47
// (the ELP-2000/82 main terms, about 10″ in longitude), apparent longitude
// λ + Δψ (p. 343), rotated by the true obliquity.
func moonGeocentric(jdTT, dpsi, eps float64) vec3 {
	l, b, d := moonposition.Position(jdTT)
	ecl := sphToVec(l.Rad()+dpsi, b.Rad()).scale(d)
	r := rotX(-eps)
	return r.mul(ecl)
}
