package ephem

import (
	"fmt"
	"math"
	"strings"
)

// TimeScale is the time scale of a star's ephemeris: the Julian date at which
// light from an event would reach the Sun's centre (HJD, counted in UTC) or
// the solar-system barycentre (BJD, counted in TDB).
type TimeScale int

const (
	// HJD is the heliocentric Julian date on the UTC scale (HJD_UTC), the
	// scale of most published ephemerides before about 2010.
	HJD TimeScale = iota + 1
	// BJDTDB is the barycentric Julian date on the TDB scale (Eastman, Siverd
	// & Gaudi 2010, PASP 122, 935).
	BJDTDB
)

// String returns "hjd" or "bjd", the names the command line uses.
func (ts TimeScale) String() string {
	switch ts {
	case HJD:
		return "hjd"
	case BJDTDB:
		return "bjd"
	}
	return fmt.Sprintf("TimeScale(%d)", int(ts))
}

// Label returns the scale as it should be written beside a number:
// "HJD_UTC" or "BJD_TDB".
func (ts TimeScale) Label() string {
	switch ts {
	case HJD:
		return "HJD_UTC"
	case BJDTDB:
		return "BJD_TDB"
	}
	return ts.String()
}

// ParseTimeScale reads "hjd" or "bjd" (also "hjd_utc", "bjd_tdb"; any case).
func ParseTimeScale(s string) (TimeScale, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "hjd", "hjd_utc":
		return HJD, nil
	case "bjd", "bjd_tdb":
		return BJDTDB, nil
	}
	return 0, fmt.Errorf("ephem: time scale %q: want hjd (heliocentric, UTC) or bjd (barycentric, TDB)", s)
}

// auLightDays is the light time over one astronomical unit, in days
// (499.004784 s).
const auLightDays = 1 / lightDayAU

// observerJ2000 returns the site's position relative to the Earth's centre
// in AU, J2000 mean equator.
func (s *Sky) observerJ2000() vec3 {
	return s.f.np.tmul(s.obs).scale(1 / auKM)
}

// HJD returns the heliocentric Julian date (UTC scale) of the instant for the
// star: JD_UTC + (r·n̂)/c, r the site's position relative to the Sun's
// centre and n̂ the direction to the star (Eastman et al. 2010, eq. 1
// without the relativistic terms, which stay under 1 ms).
func (s *Sky) HJD(v *StarVec) float64 {
	return s.f.lightTime(&s.f.helio, v, s.t, s.observerJ2000()) + s.t.jd
}

// BJDTDB returns the barycentric Julian date (TDB scale) of the instant for
// the star: JD_TDB + (r·n̂)/c, r the site's position relative to the
// solar-system barycentre (Eastman et al. 2010, eq. 1; the Shapiro delay and
// the Einstein delay beyond TDB − TT stay under 0.2 ms and are neglected).
func (s *Sky) BJDTDB(v *StarVec) float64 {
	return s.f.lightTime(&s.f.bary, v, s.t, s.observerJ2000()) + s.f.jdTDBAt(s.t)
}

// HJD returns the heliocentric Julian date (UTC) of instant t for the star
// seen from the Earth's centre. The site's own offset, at most 21 ms, is left
// out; use Sky.HJD to include it. t should lie within a day of the frame.
func (f *Frame) HJD(v *StarVec, t Time) float64 {
	return f.lightTime(&f.helio, v, t, vec3{}) + t.jd
}

// BJDTDB returns the barycentric Julian date (TDB) of instant t for the star
// seen from the Earth's centre (see Frame.HJD).
func (f *Frame) BJDTDB(v *StarVec, t Time) float64 {
	return f.lightTime(&f.bary, v, t, vec3{}) + f.jdTDBAt(t)
}

// lightTime returns (r·n̂)/c in days for the Earth's centre placed by the
// Taylor series c, plus the observer's offset obs (AU, J2000).
func (f *Frame) lightTime(c *[3]vec3, v *StarVec, t Time, obs vec3) float64 {
	r := f.earthAt(c, t).add(obs)
	return r.dot(v.at(f.jdTT)) * auLightDays
}

// jdTDBAt returns the TDB Julian date of t.
func (f *Frame) jdTDBAt(t Time) float64 {
	return t.jd + (ttMinusUTC(t.jd)+tdbMinusTT(f.jdTT))/secPerDay
}

// JD returns the Julian date of the instant on the ephemeris time scale ts
// for the star.
func (s *Sky) JD(ts TimeScale, v *StarVec) float64 {
	if ts == HJD {
		return s.HJD(v)
	}
	return s.BJDTDB(v)
}

// HJDOf returns the heliocentric Julian date (UTC) of instant t for the star
// seen from the site. See Sky.HJD.
func HJDOf(t Time, star Star, site Site) float64 {
	v := star.Vec()
	return NewSky(site, t).HJD(&v)
}

// BJDTDBOf returns the barycentric Julian date (TDB) of instant t for the
// star seen from the site. See Sky.BJDTDB.
func BJDTDBOf(t Time, star Star, site Site) float64 {
	v := star.Vec()
	return NewSky(site, t).BJDTDB(&v)
}

// SeenAt returns the instant (UTC) at which an event that happens at Julian
// date jd on scale ts (the ephemeris time) is seen at the site: the inverse of
// HJD and BJD_TDB, solved by fixed-point iteration (the light time changes by
// under 10 s per day, so each step gains four digits).
func SeenAt(ts TimeScale, jd float64, star Star, site Site) (Time, error) {
	if err := site.Validate(); err != nil {
		return Time{}, err
	}
	if err := star.Validate(); err != nil {
		return Time{}, err
	}
	if math.IsNaN(jd) || math.IsInf(jd, 0) {
		return Time{}, fmt.Errorf("ephem: %s %v is not a number", ts.Label(), jd)
	}
	if jd < minJD+0.1 || jd >= maxJD-0.1 {
		return Time{}, fmt.Errorf("ephem: %s %.6f is %w", ts.Label(), jd, ErrOutOfRange)
	}
	v := star.Vec()
	return NewFrame(mustJD(jd)).SeenAt(ts, jd, &v, &site)
}

// SeenAt is the inverse of Sky.HJD and Sky.BJDTDB (site given) or of
// Frame.HJD and Frame.BJDTDB (site nil: the Earth's centre): it returns the
// UTC instant at which an event at Julian date jd on scale ts is seen. jd must
// lie within a day of the frame's instant.
func (f *Frame) SeenAt(ts TimeScale, jd float64, v *StarVec, site *Site) (Time, error) {
	if ts != HJD && ts != BJDTDB {
		return Time{}, fmt.Errorf("ephem: unknown time scale %v", ts)
	}
	t := mustJD(jd)
	for i := 0; i < 8; i++ {
		var got float64
		switch {
		case site != nil && ts == HJD:
			got = f.Sky(*site, t).HJD(v)
		case site != nil:
			got = f.Sky(*site, t).BJDTDB(v)
		case ts == HJD:
			got = f.HJD(v, t)
		default:
			got = f.BJDTDB(v, t)
		}
		next := t.jd + (jd - got)
		done := math.Abs(next-t.jd) < 1e-9 // 86 µs
		t = mustJD(next)
		if done {
			break
		}
	}
	if !t.Valid() {
		return Time{}, fmt.Errorf("ephem: %s %.6f is seen at JD %.6f (UTC), %w", ts.Label(), jd, t.jd, ErrOutOfRange)
	}
	return t, nil
}
