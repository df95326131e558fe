package ephem

import (
	"math"

	"github.com/soniakeys/meeus/v3/moonposition"
	pe "github.com/soniakeys/meeus/v3/planetelements"
	"github.com/soniakeys/meeus/v3/solar"
)

// auKM is the astronomical unit in kilometres (IAU 2012 Resolution B2).
const auKM = 149597870.700

// lightDayAU is the speed of light in AU per day (c = 299792.458 km/s).
const lightDayAU = 299792.458 * secPerDay / auKM

// moonEMBFraction is M_Moon/(M_Earth + M_Moon) = 1/82.30057 (IAU 2009 system
// of astronomical constants, Luzum et al. 2011, CeMDA 110, 293 [from memory]):
// the Earth's centre lies this fraction of the geocentric Moon vector away from
// the Earth–Moon barycentre, on the side opposite the Moon.
const moonEMBFraction = 1 / 82.30057

// planetMass holds the planets' masses (Earth: Earth+Moon) in solar masses,
// reciprocal values of the IAU 2009 system (Luzum et al. 2011 [from memory]),
// indexed as meeus/v3/planetelements.
var planetMass = [8]float64{
	1 / 6023600.0, // Mercury
	1 / 408523.71, // Venus
	1 / 328900.56, // Earth + Moon
	1 / 3098708.0, // Mars
	1 / 1047.3486, // Jupiter
	1 / 3497.898,  // Saturn
	1 / 22902.98,  // Uranus
	1 / 19412.24,  // Neptune
}

// earthHelioBary returns the position of the Earth's centre relative to the
// Sun's centre and to the solar-system barycentre, in AU, in the mean ecliptic
// and equinox of date, at the TDB Julian date jd.
//
// The Earth–Moon barycentre comes from the Sun's low-precision theory (Meeus
// 1998, ch. 25, about 0.01°), the Earth from it by the Moon's position
// (Meeus ch. 47). The Sun's offset from the barycentre is −Σ mᵢrᵢ/(1 + Σ mᵢ)
// over the eight planets, placed by their mean elements (Meeus ch. 31,
// table 31.A) and Kepler's equation (Meeus ch. 30); Jupiter and Saturn make
// most of it (up to 0.01 AU, about 5 s of light time).
func earthHelioBary(jd float64) (helio, bary vec3) {
	T := (jd - J2000) / 36525
	s, nu := solar.True(T)
	ecc := solar.Eccentricity(T)
	R := 1.000001018 * (1 - ecc*ecc) / (1 + ecc*nu.Cos()) // Meeus eq. 25.5
	sl, cl := math.Sincos(s.Rad())
	emb := vec3{-R * cl, -R * sl, 0}
	lm, bm, dm := moonposition.Position(jd)
	moon := sphToVec(lm.Rad(), bm.Rad()).scale(dm / auKM)
	helio = emb.sub(moon.scale(moonEMBFraction))
	return helio, helio.add(sunFromBarycentre(jd, emb))
}

// sunFromBarycentre returns the Sun's centre relative to the solar-system
// barycentre (AU, mean ecliptic of date) at TDB Julian date jd, given the
// heliocentric Earth–Moon barycentre emb.
func sunFromBarycentre(jd float64, emb vec3) vec3 {
	sum := emb.scale(planetMass[pe.Earth])
	total := 1 + planetMass[pe.Earth]
	var e pe.Elements
	for p := pe.Mercury; p <= pe.Neptune; p++ {
		if p == pe.Earth {
			continue // table 31.A has no node for the Earth; emb stands in
		}
		pe.Mean(p, jd, &e)
		r := keplerPosition(&e)
		sum = sum.add(r.scale(planetMass[p]))
		total += planetMass[p]
	}
	return sum.scale(-1 / total)
}

// keplerPosition returns the heliocentric ecliptic position (AU) of a planet
// from its mean orbital elements: Kepler's equation E − e sin E = M solved by
// Newton's method (Meeus 1998, ch. 30), then the orbit rotated by the argument
// of perihelion ω = ϖ − Ω, the inclination i and the node Ω.
func keplerPosition(e *pe.Elements) vec3 {
	M := e.Lon.Rad() - e.Peri.Rad()
	E := M + e.Ecc*math.Sin(M)
	for i := 0; i < 6; i++ {
		sE, cE := math.Sincos(E)
		dE := (E - e.Ecc*sE - M) / (1 - e.Ecc*cE)
		E -= dE
		if math.Abs(dE) < 1e-12 {
			break
		}
	}
	sE, cE := math.Sincos(E)
	xp := e.Axis * (cE - e.Ecc)
	yp := e.Axis * math.Sqrt(1-e.Ecc*e.Ecc) * sE
	node := e.Node.Rad()
	omega := e.Peri.Rad() - node
	so, co := math.Sincos(omega)
	sn, cn := math.Sincos(node)
	si, ci := math.Sincos(e.Inc.Rad())
	// Orbital plane → ecliptic: R3(−Ω)·R1(−i)·R3(−ω).
	x := xp*co - yp*so
	y := xp*so + yp*co
	return vec3{
		x*cn - y*ci*sn,
		x*sn + y*ci*cn,
		y * si,
	}
}
