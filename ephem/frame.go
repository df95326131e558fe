package ephem

import (
	"math"

	"github.com/soniakeys/meeus/v3/nutation"
)

// Frame holds everything about an instant that depends neither on the site
// nor on the star: the time scales, the precession and nutation of the
// Earth's axis, and the Earth's position and velocity about the Sun and the
// solar-system barycentre. Build one with NewFrame and reuse it for every
// star and site, and for any instant within a day of it (see Frame.Sky).
type Frame struct {
	t           Time
	jdTT, jdTDB float64
	dpsi, deps  float64 // nutation in longitude and obliquity (rad)
	eps0, eps   float64 // mean and true obliquity of date (rad)
	eqeq        float64 // equation of the equinoxes Δψ cos ε (rad)
	prec        mat3    // J2000 mean equator → mean equator of date
	np          mat3    // J2000 mean equator → true equator and equinox of date
	ecl2j2000   mat3    // mean ecliptic of date → J2000 mean equator
	// Taylor coefficients about t (position AU, velocity AU/d, acceleration
	// AU/d²), J2000 mean equator, of the Earth's centre relative to the Sun's
	// centre (helio) and to the solar-system barycentre (bary).
	helio, bary [3]vec3
}

// taylorStep is the half-width (days) of the central differences that give
// the Earth's velocity and acceleration. The neglected third-order term is
// the curvature of the orbit, about ω³r = 760 km/d³: the second-order series
// reproduces the Earth's position to about 15 km over ±0.5 day (50 µs of
// light time) and 130 km over ±1 day (0.4 ms).
const taylorStep = 0.25

// NewFrame computes the frame of the instant t. t must be valid.
func NewFrame(t Time) *Frame {
	f := &Frame{t: t}
	f.jdTT = t.JDTT()
	f.jdTDB = f.jdTT + tdbMinusTT(f.jdTT)/secPerDay
	dpsi, deps := nutation.Nutation(f.jdTT) // IAU 1980 series, Meeus 1998, ch. 22
	f.dpsi, f.deps = dpsi.Rad(), deps.Rad()
	f.eps0 = nutation.MeanObliquity(f.jdTT).Rad() // Meeus eq. 22.2
	f.eps = f.eps0 + f.deps
	f.eqeq = f.dpsi * math.Cos(f.eps)
	f.prec = precessionMatrix(f.jdTT)
	nut := nutationMatrix(f.eps0, f.dpsi, f.deps)
	f.np = nut.mulm(&f.prec)
	f.ecl2j2000 = eclipticToJ2000(f.eps0, &f.prec)

	// The Earth a step either side, each turned from the ecliptic of its own
	// date to the J2000 equator before the differences are taken: the
	// equinox of date drifts by 50″ a year, which would otherwise add 100 km
	// a day to the velocity.
	var h, b [3]vec3
	for i, d := range [3]float64{-taylorStep, 0, taylorStep} {
		rot := &f.ecl2j2000
		if d != 0 {
			p := precessionMatrix(f.jdTT + d)
			r := eclipticToJ2000(nutation.MeanObliquity(f.jdTT+d).Rad(), &p)
			rot = &r
		}
		hd, bd := earthHelioBary(f.jdTDB + d)
		h[i], b[i] = rot.mul(hd), rot.mul(bd)
	}
	f.helio = taylor(h[0], h[1], h[2])
	f.bary = taylor(b[0], b[1], b[2])
	return f
}

// eclipticToJ2000 returns the rotation from the mean ecliptic and equinox of
// a date (mean obliquity eps0, precession matrix prec) to the J2000 mean
// equator: R1(−ε0) to the equator of date, then Pᵀ back to J2000.
func eclipticToJ2000(eps0 float64, prec *mat3) mat3 {
	e2q := rotX(-eps0)
	pt := transpose(*prec)
	return pt.mulm(&e2q)
}

// taylor turns three positions a step apart (J2000 equator) into position,
// velocity and acceleration by central differences.
func taylor(m, z, p vec3) [3]vec3 {
	v := p.sub(m).scale(1 / (2 * taylorStep))
	a := p.sub(z.scale(2)).add(m).scale(1 / (taylorStep * taylorStep))
	return [3]vec3{z, v, a}
}

func transpose(m mat3) mat3 {
	return mat3{{m[0][0], m[1][0], m[2][0]}, {m[0][1], m[1][1], m[2][1]}, {m[0][2], m[1][2], m[2][2]}}
}

// Time returns the instant the frame was computed for.
func (f *Frame) Time() Time { return f.t }

// earthAt returns the Earth's heliocentric or barycentric position (AU,
// J2000 equator) at the instant t from the frame's Taylor series.
func (f *Frame) earthAt(c *[3]vec3, t Time) vec3 {
	dt := t.jd - f.t.jd
	return c[0].add(c[1].scale(dt)).add(c[2].scale(0.5 * dt * dt))
}

// precessionMatrix returns the rotation from the J2000 mean equator and
// equinox to the mean equator and equinox of date (TT Julian date jd), by the
// IAU 1976 angles of Lieske et al. (1977), A&A 58, 1 (Meeus 1998, eq. 21.2),
// as P = R3(−z)·R2(θ)·R3(−ζ) (Explanatory Supplement 1992, eq. 3.21-8).
func precessionMatrix(jdTT float64) mat3 {
	T := (jdTT - J2000) / 36525
	zeta := ((0.017998*T+0.30188)*T + 2306.2181) * T * arcsec2rad
	z := ((0.018203*T+1.09468)*T + 2306.2181) * T * arcsec2rad
	theta := ((-0.041833*T-0.42665)*T + 2004.3109) * T * arcsec2rad
	a, b, c := rotZ(-z), rotY(theta), rotZ(-zeta)
	ab := a.mulm(&b)
	return ab.mulm(&c)
}

// nutationMatrix returns N = R1(−ε)·R3(−Δψ)·R1(ε0), the rotation from the mean
// to the true equator and equinox of date (Explanatory Supplement 1992,
// eq. 3.222-3), with ε = ε0 + Δε.
func nutationMatrix(eps0, dpsi, deps float64) mat3 {
	a, b, c := rotX(-(eps0 + deps)), rotZ(-dpsi), rotX(eps0)
	ab := a.mulm(&b)
	return ab.mulm(&c)
}

// SiderealRateDegPerDay is the rate at which sidereal time (and so the hour
// angle of a fixed place on the sky) grows: 360.98564736629° per day of UT,
// the linear coefficient of Meeus 1998, eq. 12.4. A sidereal day is
// 360/SiderealRateDegPerDay = 0.9972696 days.
const SiderealRateDegPerDay = 360.98564736629

// gmst returns the Greenwich mean sidereal time (radians, [0, 2π)) at Julian
// date jd (UT1, taken equal to UTC), by the IAU 1982 expression (Meeus 1998,
// eq. 12.4).
func gmst(jd float64) float64 {
	// Split the day count so the large linear term keeps its precision.
	d0 := math.Floor(jd) - J2000
	fr := jd - math.Floor(jd)
	T := (jd - J2000) / 36525
	// SiderealRateDegPerDay·D = 360·D + 0.98564736629·D, and 360·d0 is
	// whole turns.
	deg := 280.46061837 + 0.98564736629*(d0+fr) + 360*fr +
		(0.000387933-T/38710000)*T*T
	return wrap2Pi(deg * deg2rad)
}

// ApparentSiderealTime returns the Greenwich apparent sidereal time at t in
// hours [0, 24): the mean sidereal time (Meeus eq. 12.4) plus the equation of
// the equinoxes Δψ cos ε (Meeus ch. 12, p. 88). UT1 is taken equal to UTC.
func ApparentSiderealTime(t Time) float64 {
	f := NewFrame(t)
	return f.gast(t) * rad2deg / 15
}

// gast returns the Greenwich apparent sidereal time at t (radians [0, 2π)).
func (f *Frame) gast(t Time) float64 {
	return wrap2Pi(gmst(t.jd) + f.eqeq)
}

// wrap2Pi returns the angle x (radians) reduced to [0, 2π). It subtracts
// whole turns found by math.Floor, exact to an ulp of x and several times
// faster than math.Mod, which matters on the planner's paths.
func wrap2Pi(x float64) float64 {
	const turn = 2 * math.Pi
	r := x - turn*math.Floor(x/turn)
	if r >= turn || r < 0 { // rounding at the edge of a turn
		r = 0
	}
	return r
}
