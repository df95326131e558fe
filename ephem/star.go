package ephem

import (
	"fmt"
	"math"
)

// Star is a star's ICRS (J2000.0) mean place at epoch J2000.0, with optional
// proper motion in mas/yr; PMRA is μα* = μα cos δ, as modern catalogues give it.
type Star struct {
	RAHours float64
	DecDeg  float64
	PMRA    float64 // mas/yr, μα cos δ
	PMDec   float64 // mas/yr
}

// Validate reports the first out-of-range field of s.
func (s Star) Validate() error {
	switch {
	case math.IsNaN(s.RAHours) || s.RAHours < 0 || s.RAHours >= 24:
		return fmt.Errorf("ephem: right ascension %v: hours must be in [0, 24)", s.RAHours)
	case math.IsNaN(s.DecDeg) || s.DecDeg < -90 || s.DecDeg > 90:
		return fmt.Errorf("ephem: declination %v: degrees must be in [-90, 90]", s.DecDeg)
	case math.IsNaN(s.PMRA) || math.Abs(s.PMRA) > 20000:
		return fmt.Errorf("ephem: proper motion in RA %v: mas/yr must be within ±20000", s.PMRA)
	case math.IsNaN(s.PMDec) || math.Abs(s.PMDec) > 20000:
		return fmt.Errorf("ephem: proper motion in Dec %v: mas/yr must be within ±20000", s.PMDec)
	}
	return nil
}

// StarVec is a star prepared for fast repeated use: its J2000 unit vector and
// the vector rate of its proper motion. Build it once per star with Star.Vec.
type StarVec struct {
	u  vec3 // unit vector at J2000.0, J2000 mean equator
	pm vec3 // rate of change of u, radians per Julian year
}

// Vec prepares s for repeated use.
func (s Star) Vec() StarVec {
	ra, dec := s.RAHours*15*deg2rad, s.DecDeg*deg2rad
	sa, ca := math.Sincos(ra)
	sd, cd := math.Sincos(dec)
	v := StarVec{u: vec3{cd * ca, cd * sa, sd}}
	if s.PMRA != 0 || s.PMDec != 0 {
		// Unit vectors towards increasing RA and Dec; proper motion is a
		// motion on the sphere along them (linear, which is ample for
		// centuries at the rates of nearby stars).
		ea := vec3{-sa, ca, 0}
		ed := vec3{-sd * ca, -sd * sa, cd}
		k := 1e-3 * arcsec2rad
		v.pm = ea.scale(s.PMRA * k).add(ed.scale(s.PMDec * k))
	}
	return v
}

// at returns the star's unit vector (J2000 mean equator) at TT Julian date jd.
func (v *StarVec) at(jdTT float64) vec3 {
	if v.pm == (vec3{}) {
		return v.u
	}
	yr := (jdTT - J2000) / 365.25
	return v.u.add(v.pm.scale(yr)).unit()
}
