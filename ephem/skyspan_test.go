package ephem

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"
)

// The fast answers of SkySpan against the exact path: Frame.Sky with the
// frame of the nearest 0h UTC (Frames.For), and a frame at the instant
// itself (NewSky). Those are checked against astropy in astropy_test.go.
const (
	// tolSpanSameArcsec: Sky(t) uses the very equations of Frame.Sky with
	// the same frame; only rounding may differ.
	tolSpanSameArcsec = 1e-6
	// tolSpanFastArcsec: the fast paths (Star, Circumstances, SunAltDeg,
	// LocalSiderealHours) run the sidereal time linearly through the day:
	// the quadratic term of Meeus eq. 12.4 is under 1e-4″ (1e-5″ in 2026).
	tolSpanFastArcsec = 1e-4
	// tolSpanFrameArcsec: the nearest day's frame against one at t: the
	// change of precession, nutation and aberration over half a day (Frame.Sky
	// documents under 0.3″).
	tolSpanFrameArcsec = 0.3
	// tolSpanMoonArcsec: the Moon interpolated linearly between hourly
	// geocentric samples (SkySpan documents under 0.2″; 0.09″ measured).
	tolSpanMoonArcsec = 0.2
	// tolSpanIllum: the illuminated fraction from the interpolated Moon; the
	// fraction changes by at most about 0.01 per hour.
	tolSpanIllum = 1e-6
	// tolSpanLightSec: HJD and BJD_TDB, same frame: rounding of a JD near
	// 2.46e6 (40 µs).
	tolSpanLightSec = 1e-4
	// tolSpanFrameLightSec: the Earth's position from the Taylor series of
	// the nearest day against one at t: 15 km (50 µs) at half a day (see
	// taylorStep), plus the 40 µs rounding of two JDs near 2.46e6.
	tolSpanFrameLightSec = 2e-4
	// tolSpanSeenSec: SeenAt against the exact fixed-point solution
	// (converged to 86 µs each).
	tolSpanSeenSec = 1e-3
	// tolSpanCrossingSec: Sun crossings against Crossings: both are refined
	// to 0.05 s (rootTol), with frames half a day apart at most.
	tolSpanCrossingSec = 0.2
)

// spanCases are multi-day spans at sites in both hemispheres, around both
// solstices and across a leap second (2016-12-31).
var spanCases = []struct {
	name     string
	site     Site
	from     string
	days     float64
	northern bool
}{
	{"50N 10E December", Site{Name: "50N", LatDeg: 50, LonDeg: 10, ElevM: 300}, "2026-12-01T07:30:00Z", 6.3, true},
	{"33S 70W June", Site{Name: "33S", LatDeg: -33, LonDeg: -70, ElevM: 2400}, "2026-06-18T00:00:00Z", 5, false},
	{"43S 172E leap second", Site{Name: "43S", LatDeg: -43.5, LonDeg: 172.6, ElevM: 20}, "2016-12-29T12:00:00Z", 4.5, false},
	{"64N 20W June", Site{Name: "64N", LatDeg: 64.1, LonDeg: -21.9}, "2025-06-19T00:00:00Z", 3, true},
}

func newTestSpan(t *testing.T, i int) (*SkySpan, Time, Time) {
	t.Helper()
	c := spanCases[i]
	from, err := ParseInstant(c.from)
	if err != nil {
		t.Fatal(err)
	}
	to := from.AddDays(c.days)
	sp, err := NewSkySpan(c.site, from, to)
	if err != nil {
		t.Fatal(err)
	}
	return sp, from, to
}

// arcsecBetween returns the angle between two positions on the sky (″).
func arcsecBetween(a, b Position) float64 {
	u := sphToVec(a.AzDeg*deg2rad, a.AltDeg*deg2rad)
	v := sphToVec(b.AzDeg*deg2rad, b.AltDeg*deg2rad)
	return angleBetween(u, v) * rad2deg * 3600
}

func TestSkySpanAgainstFrame(t *testing.T) {
	frames := NewFrames()
	for i, c := range spanCases {
		t.Run(c.name, func(t *testing.T) {
			sp, from, to := newTestSpan(t, i)
			worst := map[string]float64{}
			note := func(what string, got, tol float64, at Time) {
				worst[what] = math.Max(worst[what], math.Abs(got))
				if math.Abs(got) > tol {
					t.Errorf("%s at %s: diff %.3g, tol %.3g", what, at, got, tol)
				}
			}
			// Every 97 minutes, so that the instants fall at all hours and on
			// both sides of each 0h UTC.
			for at := from; at.Before(to); at = at.AddDays(97.0 / 1440) {
				s := sp.Sky(at)
				same := frames.For(at).Sky(c.site, at)
				own := NewSky(c.site, at)
				for _, st := range testStars {
					v := st.star.Vec()
					got := s.Star(&v)
					note("star vs same frame (″)", arcsecBetween(got, same.Star(&v)), tolSpanSameArcsec, at)
					note("star vs own frame (″)", arcsecBetween(got, own.Star(&v)), tolSpanFrameArcsec, at)
					note("star HJD vs own frame (s)", (s.HJD(&v)-own.HJD(&v))*secPerDay, tolSpanFrameLightSec, at)
					note("star BJD vs same frame (s)", (s.BJDTDB(&v)-same.BJDTDB(&v))*secPerDay, tolSpanLightSec, at)
					note("star BJD vs own frame (s)", (s.BJDTDB(&v)-own.BJDTDB(&v))*secPerDay, tolSpanFrameLightSec, at)
					note("Moon separation (″)", (s.MoonSeparationDeg(&v)-same.MoonSeparationDeg(&v))*3600, tolSpanMoonArcsec, at)
					// The fast paths against the span's own Sky.
					fast := sp.Star(&v, at)
					note("star fast path (″)", arcsecBetween(fast, got), tolSpanFastArcsec, at)
					note("star fast path hour angle (″)", wrapDiffDeg(fast.HourAngleH*15, got.HourAngleH*15)*3600, tolSpanFastArcsec, at)
					note("star fast path RA (″)", wrapDiffDeg(fast.RAHours*15, got.RAHours*15)*3600, tolSpanSameArcsec, at)
					note("star fast path Dec (″)", (fast.DecDeg-got.DecDeg)*3600, tolSpanSameArcsec, at)
					c := sp.Circumstances(&v, at)
					note("circumstances star (″)", arcsecBetween(Position{AltDeg: c.StarAltDeg, AzDeg: c.StarAzDeg}, fast), tolSpanSameArcsec, at)
					note("circumstances Sun altitude (″)", (c.SunAltDeg-s.SunAltDeg())*3600, tolSpanFastArcsec, at)
					note("circumstances Sun separation (″)", (c.SunSepDeg-s.SunSeparationDeg(&v))*3600, tolSpanSameArcsec, at)
					note("circumstances Moon altitude (″)", (c.MoonAltDeg-s.Moon().AltDeg)*3600, tolSpanFastArcsec, at)
					note("circumstances Moon separation (″)", (c.MoonSepDeg-s.MoonSeparationDeg(&v))*3600, tolSpanSameArcsec, at)
					note("circumstances Moon illumination", c.MoonIllum-s.MoonIllumination(), 1e-12, at)
				}
				note("Sun vs same frame (″)", arcsecBetween(s.Sun(), same.Sun()), tolSpanSameArcsec, at)
				note("Sun vs own frame (″)", arcsecBetween(s.Sun(), own.Sun()), tolSpanFrameArcsec, at)
				note("Sun altitude fast path (″)", (sp.SunAltDeg(at)-same.Sun().AltDeg)*3600, tolSpanFastArcsec, at)
				note("sidereal time fast path (″)", wrapDiffDeg(sp.LocalSiderealHours(at)*15, same.LocalSiderealHours()*15)*3600, tolSpanFastArcsec, at)
				note("Moon vs same frame (″)", arcsecBetween(s.Moon(), same.Moon()), tolSpanMoonArcsec, at)
				note("Moon geocentric (″)", arcsecBetween(s.MoonGeocentric(), same.MoonGeocentric()), tolSpanMoonArcsec, at)
				note("Moon illumination", s.MoonIllumination()-same.MoonIllumination(), tolSpanIllum, at)
				note("sidereal time vs same frame (″)", wrapDiffDeg(s.LocalSiderealHours()*15, same.LocalSiderealHours()*15)*3600, tolSpanSameArcsec, at)
				note("sidereal time vs own frame (″)", wrapDiffDeg(s.LocalSiderealHours()*15, own.LocalSiderealHours()*15)*3600, tolSpanFrameArcsec, at)
			}
			for _, k := range []string{"star vs own frame (″)", "Moon vs same frame (″)", "Moon illumination", "star BJD vs own frame (s)"} {
				t.Logf("largest %s: %.3g", k, worst[k])
			}
		})
	}
}

func TestSkySpanSeenAt(t *testing.T) {
	for i, c := range spanCases {
		t.Run(c.name, func(t *testing.T) {
			sp, from, to := newTestSpan(t, i)
			for _, st := range testStars {
				v := st.star.Vec()
				for _, ts := range []TimeScale{HJD, BJDTDB} {
					// Ephemeris times spread through the span, and just
					// beyond its ends.
					for jd := from.jd - 0.3; jd < to.jd+0.3; jd += 0.377 {
						got, err := sp.SeenAt(ts, jd, &v)
						if err != nil {
							t.Fatalf("%s %s %.5f: %v", st.name, ts.Label(), jd, err)
						}
						want, err := SeenAt(ts, jd, st.star, c.site)
						if err != nil {
							t.Fatal(err)
						}
						if d := got.Sub(want) * secPerDay; math.Abs(d) > tolSpanSeenSec {
							t.Errorf("%s %s %.5f: seen at %s, want %s (SeenAt), diff %.2g s, tol %.2g s",
								st.name, ts.Label(), jd, got, want, d, tolSpanSeenSec)
						}
					}
				}
			}
		})
	}
}

// TestSkySpanSunBelow checks the dark intervals against Crossings and
// against the Sun's altitude inside and outside them.
func TestSkySpanSunBelow(t *testing.T) {
	for i, c := range spanCases {
		for _, limit := range []float64{SunriseAltDeg, NauticalAltDeg, AstronomicalAltDeg} {
			t.Run(fmt.Sprintf("%s/%g", c.name, limit), func(t *testing.T) {
				sp, from, to := newTestSpan(t, i)
				got := sp.SunBelow(limit)
				cs, err := Crossings(c.site, Sun, from, to, limit)
				if err != nil {
					t.Fatal(err)
				}
				// Every interval end inside the span is a crossing, in order.
				var ends []Crossing
				for _, iv := range got {
					if !iv.From.Before(iv.To) {
						t.Errorf("interval %s–%s is empty or reversed", iv.From, iv.To)
					}
					if iv.From != from {
						ends = append(ends, Crossing{At: iv.From, Rising: false})
					}
					if iv.To != to {
						ends = append(ends, Crossing{At: iv.To, Rising: true})
					}
				}
				if len(ends) != len(cs) {
					t.Fatalf("%d interval ends %v, Crossings finds %d: %v", len(ends), ends, len(cs), cs)
				}
				for k := range cs {
					if ends[k].Rising != cs[k].Rising {
						t.Errorf("end %d rising %v, Crossings says %v", k, ends[k].Rising, cs[k].Rising)
					}
					if d := ends[k].At.Sub(cs[k].At) * secPerDay; math.Abs(d) > tolSpanCrossingSec {
						t.Errorf("end %d at %s, Crossings %s, diff %.3f s tol %v s", k, ends[k].At, cs[k].At, d, tolSpanCrossingSec)
					}
				}
				// The Sun is below the limit inside and above it outside,
				// a minute from the ends.
				in := func(at Time) bool {
					for _, iv := range got {
						if !at.Before(iv.From) && at.Before(iv.To) {
							return true
						}
					}
					return false
				}
				for at := from; at.Before(to); at = at.AddDays(7.0 / 1440) {
					alt := NewSky(c.site, at).Sun().AltDeg
					if math.Abs(alt-limit) < 0.25 { // within a minute of a crossing
						continue
					}
					if in(at) != (alt < limit) {
						t.Errorf("%s: Sun at %.3f°, limit %g°, inside a dark interval: %v", at, alt, limit, in(at))
					}
				}
			})
		}
	}
}

func TestSkySpanSunCrossings(t *testing.T) {
	for i, c := range spanCases {
		t.Run(c.name, func(t *testing.T) {
			sp, from, _ := newTestSpan(t, i)
			// One night's worth, starting mid-span and at the span's start.
			for _, start := range []Time{from, from.AddDays(1.3)} {
				end := start.AddDays(1)
				for _, level := range []float64{SunriseAltDeg, CivilAltDeg, NauticalAltDeg, AstronomicalAltDeg} {
					got := sp.SunCrossings(level, start, end)
					want, err := Crossings(c.site, Sun, start, end, level)
					if err != nil {
						t.Fatal(err)
					}
					if len(got) != len(want) {
						t.Errorf("%s, %g°: %d crossings %v, Crossings finds %d %v", start, level, len(got), got, len(want), want)
						continue
					}
					for k := range want {
						if d := got[k].At.Sub(want[k].At) * secPerDay; got[k].Rising != want[k].Rising || math.Abs(d) > tolSpanCrossingSec {
							t.Errorf("%s, %g°: crossing %d at %s rising %v, want %s rising %v (Crossings), diff %.3f s tol %v s",
								start, level, k, got[k].At, got[k].Rising, want[k].At, want[k].Rising, d, tolSpanCrossingSec)
						}
					}
				}
			}
		})
	}
}

// TestSkySpanPolar: at 78° N the Sun never reaches −12° in June and never
// rises in December (common practice: polar day and night at Svalbard).
func TestSkySpanPolar(t *testing.T) {
	site := Site{Name: "78N", LatDeg: 78, LonDeg: 15}
	for _, c := range []struct {
		from      string
		wantWhole bool
	}{
		{"2026-06-15T00:00:00Z", false},
		{"2026-12-15T00:00:00Z", true},
	} {
		from, _ := ParseInstant(c.from)
		to := from.AddDays(3)
		sp, err := NewSkySpan(site, from, to)
		if err != nil {
			t.Fatal(err)
		}
		got := sp.SunBelow(SunriseAltDeg)
		switch {
		case c.wantWhole && (len(got) != 1 || got[0].From != from || got[0].To != to):
			t.Errorf("%s: SunBelow = %v, want the whole span (polar night)", c.from, got)
		case !c.wantWhole && len(got) != 0:
			t.Errorf("%s: SunBelow = %v, want none (midnight Sun)", c.from, got)
		}
	}
}

func TestSkySpanRejects(t *testing.T) {
	site := Site{Name: "50N", LatDeg: 50, LonDeg: 10}
	t0, _ := ParseInstant("2026-12-01T00:00:00Z")
	for _, c := range []struct {
		name     string
		site     Site
		from, to Time
		want     string
	}{
		{"bad site", Site{LatDeg: 91}, t0, t0.AddDays(1), "latitude 91"},
		{"empty span", site, t0, t0, "empty"},
		{"reversed span", site, t0.AddDays(1), t0, "empty"},
		{"too long", site, t0, t0.AddDays(MaxSkySpanDays + 1), "at most 1000"},
		{"invalid instant", site, Time{}, t0, "outside the supported range"},
	} {
		if _, err := NewSkySpan(c.site, c.from, c.to); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: NewSkySpan error %v, want one containing %q", c.name, err, c.want)
		}
	}
	sp, err := NewSkySpan(site, t0, t0.AddDays(2))
	if err != nil {
		t.Fatal(err)
	}
	v := Star{RAHours: 1, DecDeg: 20}.Vec()
	for _, c := range []struct {
		name string
		ts   TimeScale
		jd   float64
		want string
	}{
		{"unknown scale", 0, t0.jd, "time scale TimeScale(0)"},
		{"NaN", HJD, math.NaN(), "HJD_UTC NaN"},
		{"far before", BJDTDB, t0.jd - 1.5, "more than a day outside"},
		{"far after", HJD, t0.jd + 3.01, "more than a day outside"},
	} {
		if _, err := sp.SeenAt(c.ts, c.jd, &v); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: SeenAt error %v, want one containing %q", c.name, err, c.want)
		}
	}
}

// Diurnal circles: Meeus 1998, Ex. 13.b, p. 95 (Venus from Washington) and
// Ex. 15.a, p. 102 (Venus at Boston); the meeus/v3 library's EqToHz as an
// independent implementation of eq. 13.5 and 13.6.

// tolCircleDeg: the closed forms against the library's (rounding only).
const tolCircleDeg = 1e-9

func TestDiurnalCircleAltAz(t *testing.T) {
	// Ex. 13.b: H = 64.352133° (θ0 − L − α, Meeus p. 95), δ = −6°43′11.61″,
	// φ = +38°55′17″ → h = 15.1249°, A = 68.0337° from the south.
	const source = "Meeus 1998, Ex. 13.b, p. 95"
	c := NewDiurnalCircle(sexDeg(false, 38, 55, 17), sexDeg(true, 6, 43, 11.61))
	alt, az := c.AltAz(64.352133 / 15)
	if d := alt - 15.1249; math.Abs(d) > tolHorizontalDeg {
		t.Errorf("altitude %.5f°, want 15.1249° (%s), diff %.5f° tol %v°", alt, source, d, tolHorizontalDeg)
	}
	if d := wrapDiffDeg(az, 68.0337+180); math.Abs(d) > tolHorizontalDeg {
		t.Errorf("azimuth %.5f° from north, want 248.0337° (%s, 68.0337° from south), diff %.5f° tol %v°", az, source, d, tolHorizontalDeg)
	}
	// A grid against HorizontalOf (coord.EqToHz) at Greenwich sidereal time
	// 0h and longitude 0°, where the hour angle is −RA.
	for _, lat := range []float64{-89, -52, -10, 0, 23.4, 50, 78, 89.9} {
		for _, dec := range []float64{-85, -40, -5, 0, 12, 45, 88} {
			c := NewDiurnalCircle(lat, dec)
			for h := -12.0; h < 12; h += 1.7 {
				alt, az := c.AltAz(h)
				ra := math.Mod(-h+24, 24)
				wantAlt, wantAz := HorizontalOf(ra, dec, Site{LatDeg: lat}, 0)
				if d := alt - wantAlt; math.Abs(d) > tolCircleDeg {
					t.Errorf("φ %v δ %v H %.1f h: altitude %.9f°, want %.9f° (coord.EqToHz), diff %.2g°", lat, dec, h, alt, wantAlt, d)
				}
				if d := wrapDiffDeg(az, wantAz) * math.Cos(alt*deg2rad); math.Abs(d) > tolCircleDeg {
					t.Errorf("φ %v δ %v H %.1f h: azimuth %.9f°, want %.9f° (coord.EqToHz), diff %.2g° on the sky", lat, dec, h, az, wantAz, d)
				}
			}
		}
	}
}

func TestDiurnalCircleHourAngleAt(t *testing.T) {
	// Ex. 15.a: φ = 42°20′, δ2 = 18°26′27.3″, h0 = −0.5667° → cos H0 =
	// −0.3178735, H0 = 108.5344° [from memory: Meeus 1998, p. 103].
	const tolH0Deg = 0.0001
	h, err := NewDiurnalCircle(sexDeg(false, 42, 20, 0), sexDeg(false, 18, 26, 27.3)).HourAngleAt(StarRiseAltDeg)
	if d := h*15 - 108.5344; err != nil || math.Abs(d) > tolH0Deg {
		t.Errorf("Ex. 15.a: H0 = %.5f° (%v), want 108.5344° (Meeus 1998, p. 103), diff %.5f° tol %v°", h*15, err, d, tolH0Deg)
	}
	for _, c := range []struct {
		name           string
		lat, dec, alt  float64
		wantErr        error
		wantH, tolHour float64 // when wantErr is nil and wantH ≥ 0
	}{
		// At φ = 50°, δ = 80° culminates at 90° − |φ − δ| = 60° and passes
		// below the pole at φ + δ − 90° = 40° (Meeus 1998, ch. 13, common
		// geometry of the celestial sphere).
		{"circumpolar below its lowest point", 50, 80, 39.9, ErrCircumpolar, 12, 0},
		{"between its lowest and highest point", 50, 80, 50, nil, -1, 0},
		{"above its highest point", 50, 80, 60.1, ErrNeverRises, 0, 0},
		{"southern star from the north", 50, -45, 0, ErrNeverRises, 0, 0},
		{"southern circumpolar", -33, -70, 10, ErrCircumpolar, 12, 0},
		// On the equator every star is up half the day: H0 = 6 h at h0 = 0.
		{"equator, horizon", 0, 37, 0, nil, 6, 1e-12},
		// Declination 0 is up half the day from any latitude.
		{"celestial equator", 64, 0, 0, nil, 6, 1e-12},
		// At the pole the altitude is the declination all day.
		{"north pole, above", 90, 30, 20, ErrCircumpolar, 12, 0},
		{"north pole, below", 90, 30, 40, ErrNeverRises, 0, 0},
		{"pole of the sky", 40, 90, 39, ErrCircumpolar, 12, 0},
	} {
		h, err := NewDiurnalCircle(c.lat, c.dec).HourAngleAt(c.alt)
		if !errors.Is(err, c.wantErr) {
			t.Errorf("%s: error %v, want %v", c.name, err, c.wantErr)
			continue
		}
		if c.wantH >= 0 && math.Abs(h-c.wantH) > c.tolHour {
			t.Errorf("%s: H0 = %v h, want %v h", c.name, h, c.wantH)
		}
		if err == nil {
			// The altitude at ±H0 is the one asked for.
			for _, s := range []float64{-1, 1} {
				if alt, _ := NewDiurnalCircle(c.lat, c.dec).AltAz(s * h); math.Abs(alt-c.alt) > tolCircleDeg {
					t.Errorf("%s: altitude at H = %+.6f h is %.9f°, want %v°", c.name, s*h, alt, c.alt)
				}
			}
		}
	}
	if _, err := NewDiurnalCircle(50, 10).HourAngleAt(math.NaN()); err == nil || !strings.Contains(err.Error(), "altitude NaN") {
		t.Errorf("HourAngleAt(NaN): error %v, want one naming the altitude", err)
	}
}

// TestFrameTaylor checks the Frame's Taylor series of the Earth's position
// against the position computed directly at the instant (a frame there):
// the neglected third-order term, the orbit's curvature ω³r ≈ 760 km/d³
// (ω = 2π/365.25 d, r = 1 au), bounds the error by 130 |dt|³ km. Before
// the series took each sample in its own ecliptic of date, the drift of the
// equinox added 100 km per day.
func TestFrameTaylor(t *testing.T) {
	const jerkKMPerDay3 = 760.0
	f := NewFrame(mustJD(2461375.5))
	for _, dt := range []float64{-1, -0.5, -0.25, -0.1, 0.1, 0.25, 0.5, 1} {
		at := mustJD(2461375.5 + dt)
		g := NewFrame(at)
		tol := jerkKMPerDay3*math.Abs(dt*dt*dt)/6 + 1
		for _, c := range []struct {
			name      string
			got, want vec3
		}{
			{"heliocentric", f.earthAt(&f.helio, at), g.helio[0]},
			{"barycentric", f.earthAt(&f.bary, at), g.bary[0]},
		} {
			if d := c.got.sub(c.want).norm() * auKM; d > tol {
				t.Errorf("dt %+.2f d: %s Earth from the series is %.1f km from the direct one, tol %.1f km", dt, c.name, d, tol)
			}
		}
	}
}
