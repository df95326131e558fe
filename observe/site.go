package observe

import (
	"fmt"
	"math"
	"strings"
	"time"
	_ "time/tzdata" // named time zones work where the system has no zone database

	"example.org/vigil/ephem"
)

// Site is an observing place: where it is (ephem.Site: name, latitude,
// EAST-positive longitude, elevation), its IANA time zone for local times,
// the lowest altitude at which a star is worth observing there, and an
// optional horizon profile of trees, roofs and hills.
//
// Build one with NewSite, which checks every field and loads the time zone.
type Site struct {
	ephem.Site
	TimeZone  string  // IANA name, e.g. "Europe/Berlin"; "" or "UTC" for UTC
	MinAltDeg float64 // lowest useful airless altitude, degrees
	Horizon   Horizon // optional; nil means a flat horizon

	loc *time.Location
}

// NewSite returns a checked site. lonDeg is EAST positive and normalised to
// (-180, 180]; tz is an IANA time-zone name loaded with time.LoadLocation (the
// binary embeds time/tzdata); minAltDeg is the lowest useful altitude in
// [-5, 90); the horizon profile may be nil.
func NewSite(name string, latDeg, lonDeg, elevM float64, tz string, minAltDeg float64, h Horizon) (Site, error) {
	es, err := ephem.NewSite(name, latDeg, lonDeg, elevM)
	if err != nil {
		return Site{}, fmt.Errorf("observe: site %q: %w", name, err)
	}
	s := Site{Site: es, TimeZone: tz, MinAltDeg: minAltDeg, Horizon: h}
	if err := s.Validate(); err != nil {
		return Site{}, err
	}
	return s, nil
}

// Validate reports the first unusable field of s and loads its time zone.
func (s *Site) Validate() error {
	if err := s.Site.Validate(); err != nil {
		return fmt.Errorf("observe: site %q: %w", s.Name, err)
	}
	if math.IsNaN(s.MinAltDeg) || s.MinAltDeg < -5 || s.MinAltDeg >= 90 {
		return fmt.Errorf("observe: site %q: lowest useful altitude %v: degrees must be in [-5, 90)", s.Name, s.MinAltDeg)
	}
	if err := s.Horizon.Validate(); err != nil {
		return fmt.Errorf("observe: site %q: %w", s.Name, err)
	}
	tz := strings.TrimSpace(s.TimeZone)
	if tz == "" {
		tz = "UTC"
	}
	loc, err := time.LoadLocation(tz)
	if err != nil || strings.EqualFold(tz, "local") {
		return fmt.Errorf("observe: site %q: time zone %q: want an IANA name such as \"Europe/Berlin\" or \"UTC\"", s.Name, s.TimeZone)
	}
	s.loc = loc
	return nil
}

// Location returns the site's time zone (UTC when none was set or the site
// was not validated).
func (s *Site) Location() *time.Location {
	if s.loc == nil {
		return time.UTC
	}
	return s.loc
}

// LowestAltDeg returns the lowest useful altitude toward azimuth azDeg (from
// north through east): the larger of MinAltDeg and the horizon profile.
func (s *Site) LowestAltDeg(azDeg float64) float64 {
	if len(s.Horizon) == 0 {
		return s.MinAltDeg
	}
	return math.Max(s.MinAltDeg, s.Horizon.AltDeg(azDeg))
}

// HorizonPoint is one point of a horizon profile: the lowest useful
// altitude (degrees) toward an azimuth (degrees from north through east).
type HorizonPoint struct {
	AzDeg  float64
	AltDeg float64
}

// Horizon is a horizon profile: points in strictly increasing azimuth within
// [0, 360), altitudes within [-5, 90]. Between points the altitude is
// interpolated linearly in azimuth, wrapping from the last point past 360°
// to the first. One point means the same altitude all round.
type Horizon []HorizonPoint

// Validate reports the first point that is out of range or out of order.
func (h Horizon) Validate() error {
	for i, p := range h {
		if math.IsNaN(p.AzDeg) || p.AzDeg < 0 || p.AzDeg >= 360 {
			return fmt.Errorf("horizon point %d: azimuth %v: degrees must be in [0, 360)", i+1, p.AzDeg)
		}
		if math.IsNaN(p.AltDeg) || p.AltDeg < -5 || p.AltDeg > 90 {
			return fmt.Errorf("horizon point %d: altitude %v: degrees must be in [-5, 90]", i+1, p.AltDeg)
		}
		if i > 0 && !(p.AzDeg > h[i-1].AzDeg) {
			return fmt.Errorf("horizon point %d: azimuth %v after %v: azimuths must increase", i+1, p.AzDeg, h[i-1].AzDeg)
		}
	}
	return nil
}

// AltDeg returns the profile's altitude toward azimuth azDeg, interpolated
// linearly between the neighbouring points and wrapping at 360°. An empty
// profile returns -90 (no obstruction).
func (h Horizon) AltDeg(azDeg float64) float64 {
	n := len(h)
	switch n {
	case 0:
		return -90
	case 1:
		return h[0].AltDeg
	}
	az := azDeg
	if az < 0 || az >= 360 {
		az = math.Mod(az, 360)
		if az < 0 {
			az += 360
		}
	}
	// First point with azimuth > az (binary search on a short slice).
	lo, hi := 0, n
	for lo < hi {
		m := (lo + hi) / 2
		if h[m].AzDeg > az {
			hi = m
		} else {
			lo = m + 1
		}
	}
	var a, b HorizonPoint
	if lo == 0 || lo == n {
		// Between the last point and the first, across 360°.
		a, b = h[n-1], h[0]
		b.AzDeg += 360
		if az < a.AzDeg {
			az += 360
		}
	} else {
		a, b = h[lo-1], h[lo]
	}
	f := (az - a.AzDeg) / (b.AzDeg - a.AzDeg)
	return a.AltDeg + f*(b.AltDeg-a.AltDeg)
}

// MaxAltDeg returns the highest altitude of the profile (-90 when empty).
func (h Horizon) MaxAltDeg() float64 {
	m := -90.0
	for _, p := range h {
		m = math.Max(m, p.AltDeg)
	}
	return m
}
