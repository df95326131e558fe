// Package ephem knows the sky and time: where a star, the Sun and the Moon
// stand as seen from a site at an instant, and on which time scale that
// instant is counted.
//
// # Conventions
//
// Every public function, type, flag and file of vigil follows one table:
//
//	quantity          convention
//	----------------  -----------------------------------------------------------
//	longitude         degrees, EAST positive (IAU), in (-180, 180]
//	latitude          degrees, north positive, [-90, 90]
//	elevation         metres above the reference ellipsoid
//	right ascension   hours at the edges (RAHours), radians inside
//	azimuth           degrees from north through east, [0, 360)
//	altitude          airless (geometric, topocentric) unless a name says Refracted
//	hour angle        hours, local apparent sidereal time minus apparent RA, [-12, 12)
//	star positions    ICRS / J2000.0 mean place, proper motion in mas/yr (μα* = μα cos δ)
//	Julian dates      the scale is in the name: JDUTC, JDTT, JDTDB, HJD (heliocentric,
//	                  UTC scale), BJDTDB (barycentric, TDB scale)
//
// The library underneath (github.com/soniakeys/meeus/v3, after Meeus 1998)
// counts longitude positive WEST and azimuth from SOUTH. Both are converted in
// one place, meeus.go, and nowhere else.
//
// An instant is a Time. It stores the Julian date on the UTC scale in one
// float64, which near JD 2.46e6 resolves about 40 µs: ample for timings that
// matter at the level of a second.
//
// # Accuracy
//
// Against astropy 5.2.1 (IAU 2006/2000A, ERFA), measured by the tests in this
// package over 1950–2050 and both hemispheres: star altitude and azimuth to a
// few arcseconds above 10° altitude; HJD and BJD_TDB to a few hundredths of a
// second; Sun and Moon rise, set and twilight to a few seconds; the Moon's
// illuminated fraction to 0.001. The figures achieved are stated in the tests
// and in the README.
//
// # Many stars, many instants
//
// Frame and Frames share the work that depends only on the instant. A
// SkySpan goes further for a planner: it prepares the sky over a span of
// days at one site and answers per star and instant without computing
// precession, nutation, the Sun or the Moon again (Star, Circumstances,
// SeenAt, SunBelow, SunCrossings). Its answers agree with the exact path (Frame.Sky) to
// rounding, except the Moon, interpolated from hourly samples to 0.2″; see
// SkySpan for each figure. DiurnalCircle gives the closed forms of a star's
// daily path (Meeus 1998, eq. 13.5, 13.6 and 15.1).
//
// # Methods and references
//
//   - J. Meeus, Astronomical Algorithms, 2nd ed., Willmann-Bell 1998: Julian day
//     (ch. 7), ΔT (ch. 10), sidereal time (ch. 12), horizontal coordinates
//     (ch. 13), rise, transit and set (ch. 15), refraction (ch. 16), precession
//     (ch. 21, IAU 1976 angles of Lieske et al. 1977, A&A 58, 1), nutation
//     (ch. 22, IAU 1980), Sun (ch. 25), planets' mean elements (ch. 31),
//     Moon (ch. 47), illuminated fraction (ch. 48).
//   - IERS Bulletin C, leap seconds (table in data/leapseconds.txt).
//   - J. D. Eastman, R. Siverd, B. S. Gaudi (2010), PASP 122, 935: BJD_TDB.
//   - T. Sæmundsson (1986), Sky & Telescope 72, 70: refraction from true altitude.
//   - K. Pickering (2002), DIO 12, 3: airmass to the horizon.
//   - USNO Astronomical Applications Department, "Rise, Set, and Twilight
//     Definitions": the Sun's -0.8333°, -6°, -12°, -18°.
package ephem
