package ephem

import (
	"fmt"
	"math"

	"github.com/soniakeys/meeus/v3/globe"
	"github.com/soniakeys/unit"
)

// Site is a place on the Earth: geodetic latitude (north positive),
// longitude (EAST positive) and elevation above the ellipsoid.
type Site struct {
	Name   string
	LatDeg float64
	LonDeg float64 // east positive
	ElevM  float64
}

// Elevation limits accepted for a site (metres): the shore of the Dead Sea
// to above the highest observatories.
const (
	minElevM = -500
	maxElevM = 9000
)

// NewSite returns a checked site. Longitude may be given in [-180, 360) and is
// normalised to (-180, 180].
func NewSite(name string, latDeg, lonDeg, elevM float64) (Site, error) {
	s := Site{Name: name, LatDeg: latDeg, LonDeg: lonDeg, ElevM: elevM}
	if err := s.Validate(); err != nil {
		return Site{}, err
	}
	s.LonDeg = normLonDeg(lonDeg)
	return s, nil
}

// Validate reports the first out-of-range coordinate of s.
func (s Site) Validate() error {
	switch {
	case math.IsNaN(s.LatDeg) || s.LatDeg < -90 || s.LatDeg > 90:
		return fmt.Errorf("ephem: site latitude %v: degrees must be in [-90, 90] (north positive)", s.LatDeg)
	case math.IsNaN(s.LonDeg) || s.LonDeg < -180 || s.LonDeg >= 360:
		return fmt.Errorf("ephem: site longitude %v: degrees must be in [-180, 360), east positive", s.LonDeg)
	case math.IsNaN(s.ElevM) || s.ElevM < minElevM || s.ElevM > maxElevM:
		return fmt.Errorf("ephem: site elevation %v: metres must be in [%d, %d]", s.ElevM, minElevM, maxElevM)
	}
	return nil
}

// earthRadiusKM is the equatorial radius of the IAU 1976 ellipsoid
// (globe.Earth76, Meeus 1998, ch. 11).
const earthRadiusKM = 6378.14

// parallaxConstants returns ρ sin φ′ and ρ cos φ′ of the site, in equatorial
// Earth radii (Meeus 1998, ch. 11).
func (s Site) parallaxConstants() (rhoSin, rhoCos float64) {
	return globe.Earth76.ParallaxConstants(unit.AngleFromDeg(s.LatDeg), s.ElevM)
}
