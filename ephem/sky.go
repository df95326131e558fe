package ephem

import (
	"math"
)

// Position is where an object stands as seen from a site at an instant.
type Position struct {
	AltDeg     float64 // airless topocentric altitude
	AzDeg      float64 // azimuth from north through east, [0, 360)
	HourAngleH float64 // local apparent sidereal time − apparent RA, [-12, 12)
	RAHours    float64 // apparent right ascension, true equator and equinox of date
	DecDeg     float64 // apparent declination, true equator of date
}

// Sky is the view from one site at one instant: the local apparent sidereal
// time and the rotations that turn a J2000 direction into altitude and
// azimuth. It is cheap to make from a Frame (Frame.Sky) and cheap to ask about
// many stars (Sky.Star).
type Sky struct {
	f    *Frame
	t    Time
	site Site
	last float64 // local apparent sidereal time (rad)
	hz   mat3    // true equator of date → (north, east, up)
	full mat3    // J2000 → (north, east, up) = hz·np
	obs  vec3    // observer's geocentric position, true equator of date (km)
	beta vec3    // annual aberration v⊕/c, true equator of date
	diur vec3    // diurnal aberration v_obs/c, true equator of date
	abh  vec3    // beta + diur in the horizon frame
	// moon is the Moon's apparent geocentric position (km, true equator of
	// date) when a SkySpan supplied it (hasMoon); otherwise it is computed
	// on demand from Meeus 1998, ch. 47.
	moon    vec3
	hasMoon bool
}

// earthRotRate is the Earth's rotation rate (rad/s).
const earthRotRate = 7.292115e-5

// cKMs is the speed of light in km/s.
const cKMs = 299792.458

// NewSky returns the view from site at instant t, computing its own Frame.
// To compute many instants near each other, make one Frame and call Frame.Sky.
func NewSky(site Site, t Time) *Sky {
	return NewFrame(t).Sky(site, t)
}

// Sky returns the view from site at instant t. t should lie within a day of
// the frame's own instant: precession, nutation and the direction of the
// Earth's velocity are taken from the frame (their change over a day moves a
// star by under 0.3″), while sidereal time, the Earth's position and the Sun
// and Moon are computed for t itself.
func (f *Frame) Sky(site Site, t Time) *Sky {
	s := &Sky{}
	sc := site.consts()
	f.fillSky(s, site, t, &sc)
	return s
}

// siteConsts holds what the view needs of a site's latitude and elevation.
type siteConsts struct {
	sinLat, cosLat float64
	rhoSin, rhoCos float64 // ρ sin φ′, ρ cos φ′ (Meeus 1998, ch. 11)
}

func (site Site) consts() siteConsts {
	var c siteConsts
	c.sinLat, c.cosLat = math.Sincos(site.LatDeg * deg2rad)
	c.rhoSin, c.rhoCos = site.parallaxConstants()
	return c
}

// fillSky sets s to the view from site at instant t (see Frame.Sky).
func (f *Frame) fillSky(s *Sky, site Site, t Time, sc *siteConsts) {
	*s = Sky{f: f, t: t, site: site}
	s.last = wrap2Pi(f.gast(t) + site.LonDeg*deg2rad)
	sp, cp := sc.sinLat, sc.cosLat
	sl, cl := math.Sincos(s.last)
	// Equatorial (true of date) → (north, east, up): rotate by the local
	// sidereal time about the pole, then tilt by the latitude (Meeus eq. 13.5
	// and 13.6 in vector form, azimuth from north).
	s.hz = mat3{
		{-sp * cl, -sp * sl, cp},
		{-sl, cl, 0},
		{cp * cl, cp * sl, sp},
	}
	s.full = s.hz.mulm(&f.np)
	rs, rc := sc.rhoSin, sc.rhoCos
	s.obs = vec3{rc * cl * earthRadiusKM, rc * sl * earthRadiusKM, rs * earthRadiusKM}
	v := f.bary[1].add(f.bary[2].scale(t.jd - f.t.jd)) // AU/day, J2000
	s.beta = f.np.mul(v.scale(1 / lightDayAU))
	w := earthRotRate * rc * earthRadiusKM / cKMs
	s.diur = vec3{-w * sl, w * cl, 0}
	s.abh = s.hz.mul(s.beta.add(s.diur))
}

// Time returns the instant of the view.
func (s *Sky) Time() Time { return s.t }

// Site returns the site of the view.
func (s *Sky) Site() Site { return s.site }

// LocalSiderealHours returns the local apparent sidereal time in hours.
func (s *Sky) LocalSiderealHours() float64 { return s.last * rad2deg / 15 }

// position turns an apparent direction w (true equator of date, any length)
// into a Position.
func (s *Sky) position(w vec3) Position {
	// hz rows: (−sin φ cos θ, −sin φ sin θ, cos φ), (−sin θ, cos θ, 0), ...
	return horizontal(w, s.last, -s.hz[1][0], s.hz[1][1], s.hz[2][2], s.hz[0][2])
}

// horizontal returns the Position of the apparent direction w (true equator
// of date, any length) for the local sidereal time last (rad, with its sine
// sl and cosine cl) at the latitude of sine sp and cosine cp: Meeus 1998,
// eq. 13.5 and 13.6 in vector form, azimuth from north.
func horizontal(w vec3, last, sl, cl, sp, cp float64) Position {
	x := cl*w[0] + sl*w[1] // toward the meridian, in the equator
	north := -sp*x + cp*w[2]
	east := -sl*w[0] + cl*w[1]
	up := cp*x + sp*w[2]
	r := w.norm()
	alt := math.Asin(clamp1(up / r))
	az := math.Atan2(east, north)
	if az < 0 {
		az += 2 * math.Pi
	}
	ra, dec := vecToSph(w)
	ha := wrap2Pi(last-ra+math.Pi) - math.Pi
	return Position{
		AltDeg:     alt * rad2deg,
		AzDeg:      az * rad2deg,
		HourAngleH: ha * rad2deg / 15,
		RAHours:    ra * rad2deg / 15,
		DecDeg:     dec * rad2deg,
	}
}

// clamp1 returns x limited to [-1, 1] (NaN stays NaN), for asin and acos
// of values that rounding may push a hair beyond.
func clamp1(x float64) float64 {
	switch {
	case x > 1:
		return 1
	case x < -1:
		return -1
	}
	return x
}

// apparent returns the apparent direction (true equator of date, unit) of a
// star: proper motion to the instant, precession and nutation, then annual
// and diurnal aberration (first order in v/c, which leaves under 1 mas).
// Gravitational deflection by the Sun (under 0.02″ beyond 5° from it) is
// neglected.
func (s *Sky) apparent(v *StarVec) vec3 {
	u := s.f.np.mul(v.at(s.f.jdTT))
	return u.add(s.beta).add(s.diur).unit()
}

// Star returns where the star stands.
func (s *Sky) Star(v *StarVec) Position {
	return s.position(s.apparent(v))
}

// StarAltDeg returns only the airless altitude of the star: the fast path for
// planning many stars at many instants.
func (s *Sky) StarAltDeg(v *StarVec) float64 {
	u := v.at(s.f.jdTT)
	// J2000 → horizon in one matrix, aberration added in the horizon frame.
	n := s.full.mul(u).add(s.abh)
	return math.Asin(clamp1(n[2]/n.norm())) * rad2deg
}

// SunAltDeg returns only the Sun's airless topocentric altitude: Sun().AltDeg
// without the right ascension and declination, for twilight searches.
func (s *Sky) SunAltDeg() float64 {
	w, _ := s.sunTopo()
	return s.altDeg(w)
}

// altDeg returns the airless altitude of an apparent direction w (true
// equator of date, any length), as position does.
func (s *Sky) altDeg(w vec3) float64 {
	up := s.hz[2][0]*w[0] + s.hz[2][1]*w[1] + s.hz[2][2]*w[2]
	return math.Asin(clamp1(up/w.norm())) * rad2deg
}

// sunTopo returns the Sun's apparent topocentric direction (true equator of
// date) and its geocentric distance (AU). The geometric direction comes from
// the Earth's heliocentric position; aberration by the Earth's velocity then
// gives the apparent place (together they make Meeus's −20.4898″/R).
func (s *Sky) sunTopo() (vec3, float64) {
	h := s.f.earthAt(&s.f.helio, s.t)
	g := s.f.np.mul(h.scale(-auKM)) // geocentric Sun, km
	d := g.sub(s.obs)
	return d.unit().add(s.beta).add(s.diur), h.norm()
}

// Sun returns where the Sun stands (topocentric, apparent, airless).
func (s *Sky) Sun() Position {
	w, _ := s.sunTopo()
	return s.position(w)
}

// moonGeo returns the Moon's apparent geocentric position (km, true equator
// and equinox of date): Meeus 1998, ch. 47, with nutation in longitude added.
func (s *Sky) moonGeo() vec3 {
	if s.hasMoon {
		return s.moon
	}
	return moonGeocentric(s.t.JDTT(), s.f.dpsi, s.f.eps)
}

// Moon returns where the Moon stands, seen from the site (topocentric: the
// parallax reaches a degree).
func (s *Sky) Moon() Position {
	return s.position(s.moonGeo().sub(s.obs))
}

// MoonGeocentric returns the Moon's position computed from the Earth's centre
// (no parallax), the definition used for moonrise and moonset (Meeus 1998,
// ch. 15).
func (s *Sky) MoonGeocentric() Position {
	return s.position(s.moonGeo())
}

// MoonIllumination returns the Moon's illuminated fraction k = (1 + cos i)/2,
// i the phase angle (Meeus 1998, eq. 48.1), seen from the Earth's centre.
func (s *Sky) MoonIllumination() float64 {
	m := s.moonGeo()
	h := s.f.earthAt(&s.f.helio, s.t)
	sun := s.f.np.mul(h.scale(-auKM))
	i := angleBetween(sun.sub(m), m.scale(-1))
	return (1 + math.Cos(i)) / 2
}

// MoonSeparationDeg returns the angle between the star and the Moon, both
// seen from the site (topocentric Moon), in degrees.
func (s *Sky) MoonSeparationDeg(v *StarVec) float64 {
	return angleBetween(s.apparent(v), s.moonGeo().sub(s.obs)) * rad2deg
}

// SunSeparationDeg returns the angle between the star and the Sun in degrees.
func (s *Sky) SunSeparationDeg(v *StarVec) float64 {
	w, _ := s.sunTopo()
	return angleBetween(s.apparent(v), w) * rad2deg
}
