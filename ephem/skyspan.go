package ephem

import (
	"fmt"
	"math"
	"runtime"
	"sync"
)

// SkySpan is the sky over a span of days at one site, prepared once so that
// questions about many stars at many instants cost little: the planner asks
// it about every extremum of thousands of stars.
//
// It holds one Frame per UTC day (the frame of the nearest 0h UTC, as Frames
// hands out; the Earth's position and velocity about the Sun and the
// barycentre come from the frames' own Taylor series), the Moon's apparent
// geocentric position sampled every hour, and the Sun's altitude sampled
// every 10 minutes for the twilight searches. Build it with NewSkySpan; it is
// read-only afterwards and safe for concurrent use.
//
// Instants should lie in the span [From, To]. Outside it the nearest day's
// frame still serves stars and the Sun well (0.2″ a day out), but the Moon
// is extrapolated from its last samples: 8″ off a quarter of a day out, 80″
// half a day out. Pad the span rather than ask outside it.
//
// Accuracy of each fast answer against the exact path, Frame.Sky(site, t)
// with the frame of the nearest 0h UTC (measured in skyspan_test.go over
// several days at sites in both hemispheres):
//
//   - Sky(t): stars, the Sun, sidereal time, HJD and BJD_TDB are computed
//     by the very same equations, so they agree to rounding (below 1e-6″
//     and 0.1 ms). The Moon is interpolated linearly between the hourly
//     samples of its geocentric position and the topocentric parallax then
//     applied exactly: its place and its separation from a star agree to
//     under 0.2″ (0.09″ measured), its illuminated fraction to 1e-6.
//   - SunAltDeg: the same as Sky(t).SunAltDeg, to rounding.
//   - SeenAt: the same light-time equations solved by Newton's method to
//     under 1e-9 d (86 µs); within 1 ms of the package-level SeenAt.
//   - SunCrossings and SunBelow: the Sun's altitude searched by the method
//     of Crossings; the instants agree with Crossings to 0.2 s.
//
// Against a frame computed at t itself (NewSky), the nearest day's frame adds
// under 0.3″ to star places (see Frame.Sky; 0.08″ measured) and under
// 0.2 ms to HJD and BJD_TDB (see taylorStep).
type SkySpan struct {
	site     Site
	sc       siteConsts
	obsKM    [2]float64 // ρ cos φ′ and ρ sin φ′ in km
	diur     float64    // diurnal aberration v_obs/c
	from, to Time
	k0       int64     // floor(JD) of days[0]
	days     []spanDay // the day serving instants in [k0+i, k0+i+1)
	moon0    float64   // JD (UTC) of moon[0]
	moon     []vec3    // apparent geocentric Moon (km, true equator of date)
	sun      *curve    // the Sun's airless topocentric altitude (degrees)
}

// spanDay is one UTC day of a SkySpan: the frame of its 0h UTC and what the
// fast answers need of it.
type spanDay struct {
	f     *Frame
	jd    float64 // the frame's instant, JD (UTC)
	last0 float64 // local apparent sidereal time at jd (rad)
	// beta0 and beta1 are the annual aberration v⊕/c at jd and its rate per
	// day, true equator of date (as Frame.Sky computes it).
	beta0, beta1 vec3
	tdbTT        float64 // TDB − TT (days) as the frame counts it
}

// MaxSkySpanDays is the longest span NewSkySpan accepts (about 2.7 years):
// the Sun's samples then take about 2 MB.
const MaxSkySpanDays = 1000

// moonSampleDays is the step (days, 1 h) of the Moon's samples. Linear
// interpolation of the geocentric position errs by r·(ωh)²/8 ≈ 4 km along
// the radius (0.04″ of parallax) and, through the changing angular speed
// (eccentricity and perturbations, about 0.33°/d²), by under 0.3″ in
// direction.
const moonSampleDays = 1.0 / 24

// NewSkySpan prepares the sky over [from, to] at site. The span must be
// non-empty, within the supported range and at most MaxSkySpanDays long.
func NewSkySpan(site Site, from, to Time) (*SkySpan, error) {
	if err := site.Validate(); err != nil {
		return nil, err
	}
	if !from.Valid() || !to.Valid() {
		return nil, fmt.Errorf("ephem: sky span %s to %s is %w", from, to, ErrOutOfRange)
	}
	if !from.Before(to) {
		return nil, fmt.Errorf("ephem: sky span from %s to %s is empty: from must be before to", from, to)
	}
	if d := to.Sub(from); d > MaxSkySpanDays {
		return nil, fmt.Errorf("ephem: sky span from %s to %s is %.1f days: at most %d", from, to, d, MaxSkySpanDays)
	}
	sp := &SkySpan{site: site, sc: site.consts(), from: from, to: to}
	sp.obsKM = [2]float64{sp.sc.rhoCos * earthRadiusKM, sp.sc.rhoSin * earthRadiusKM}
	sp.diur = earthRotRate * sp.obsKM[0] / cKMs
	sp.k0 = int64(math.Floor(from.jd))
	k1 := int64(math.Floor(to.jd))
	sp.days = make([]spanDay, k1-sp.k0+1)
	parallel(len(sp.days), func(i int) {
		c := float64(sp.k0+int64(i)) + 0.5 // 0h UTC
		c = math.Max(minJD, math.Min(c, maxJD-0.5))
		f := NewFrame(mustJD(c))
		sp.days[i] = spanDay{
			f:     f,
			jd:    c,
			last0: wrap2Pi(f.gast(f.t) + site.LonDeg*deg2rad),
			beta0: f.np.mul(f.bary[1].scale(1 / lightDayAU)),
			beta1: f.np.mul(f.bary[2].scale(1 / lightDayAU)),
			tdbTT: tdbMinusTT(f.jdTT) / secPerDay,
		}
	})
	// The Moon one sample beyond each end.
	sp.moon0 = (math.Floor(from.jd/moonSampleDays) - 1) * moonSampleDays
	n := int(math.Ceil((to.jd-sp.moon0)/moonSampleDays)) + 2
	sp.moon = make([]vec3, n)
	parallel(len(sp.moon), func(i int) {
		jd := sp.moon0 + float64(i)*moonSampleDays
		f := sp.dayOf(jd).f
		sp.moon[i] = moonGeocentric(mustJD(jd).JDTT(), f.dpsi, f.eps)
	})
	sp.sun = sampleCurve(from.jd, to.jd, sp.sunAlt)
	return sp, nil
}

// parallel calls fn(0), …, fn(n−1), spread over GOMAXPROCS goroutines when
// n is large enough to repay them.
func parallel(n int, fn func(i int)) {
	w := min(runtime.GOMAXPROCS(0), n/8)
	if w <= 1 {
		for i := 0; i < n; i++ {
			fn(i)
		}
		return
	}
	var wg sync.WaitGroup
	for g := 0; g < w; g++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := g; i < n; i += w {
				fn(i)
			}
		}()
	}
	wg.Wait()
}

// Site returns the span's site.
func (sp *SkySpan) Site() Site { return sp.site }

// From returns the start of the span.
func (sp *SkySpan) From() Time { return sp.from }

// To returns the end of the span.
func (sp *SkySpan) To() Time { return sp.to }

// dayOf returns the day that serves Julian date jd (UTC): that of the
// nearest 0h UTC.
func (sp *SkySpan) dayOf(jd float64) *spanDay {
	i := int(int64(math.Floor(jd)) - sp.k0)
	return &sp.days[max(0, min(i, len(sp.days)-1))]
}

// moonAt returns the Moon's apparent geocentric position (km, true equator
// of date) at jd, interpolated linearly between the samples.
func (sp *SkySpan) moonAt(jd float64) vec3 {
	x := (jd - sp.moon0) / moonSampleDays
	i := max(0, min(int(math.Floor(x)), len(sp.moon)-2))
	f := x - float64(i)
	a, b := sp.moon[i], sp.moon[i+1]
	return vec3{a[0] + f*(b[0]-a[0]), a[1] + f*(b[1]-a[1]), a[2] + f*(b[2]-a[2])}
}

// Sky returns the view from the span's site at instant t: the exact view of
// Frame.Sky with the frame of the nearest 0h UTC, except that the Moon (in
// Moon, MoonGeocentric, MoonSeparationDeg and MoonIllumination) is
// interpolated between hourly samples (see SkySpan for the accuracy). It is
// returned by value so that a loop over many instants allocates nothing:
//
//	s := span.Sky(t)
//	p := s.Star(&v)
func (sp *SkySpan) Sky(t Time) Sky {
	var s Sky
	sp.fill(&s, t)
	return s
}

func (sp *SkySpan) fill(s *Sky, t Time) {
	sp.dayOf(t.jd).f.fillSky(s, sp.site, t, &sp.sc)
	s.moon, s.hasMoon = sp.moonAt(t.jd), true
}

// spanAt holds what the fast answers share at one instant.
type spanAt struct {
	d      *spanDay
	jd, dt float64 // the instant (JD UTC) and its distance from d.jd
	last   float64 // local apparent sidereal time (rad)
	sl, cl float64 // its sine and cosine
	sp, cp float64 // sine and cosine of the latitude
	ab     vec3    // annual + diurnal aberration, true equator of date
	obs    vec3    // the site about the Earth's centre (km, true equator of date)
}

// at returns the shared part of the fast answers at jd. The local sidereal
// time grows linearly from the day's frame, at SiderealRateDegPerDay: the
// quadratic term of Meeus eq. 12.4 changes it by under 1e-4″ in half a day
// (2.1e-8·T degrees a day, T in Julian centuries from J2000).
func (sp *SkySpan) at(jd float64) spanAt {
	d := sp.dayOf(jd)
	a := spanAt{d: d, jd: jd, dt: jd - d.jd, sp: sp.sc.sinLat, cp: sp.sc.cosLat}
	a.last = d.last0 + SiderealRateDegPerDay*deg2rad*a.dt
	a.sl, a.cl = math.Sincos(a.last)
	a.ab = vec3{
		d.beta0[0] + d.beta1[0]*a.dt - sp.diur*a.sl,
		d.beta0[1] + d.beta1[1]*a.dt + sp.diur*a.cl,
		d.beta0[2] + d.beta1[2]*a.dt,
	}
	a.obs = vec3{sp.obsKM[0] * a.cl, sp.obsKM[0] * a.sl, sp.obsKM[1]}
	return a
}

// sunGeo returns the Sun's geometric geocentric position (km, true equator
// of date): minus the Earth's heliocentric position of the frame's Taylor
// series (Frame.earthAt), rotated to the equator of date.
func (a *spanAt) sunGeo() vec3 {
	f := a.d.f
	c := &f.helio
	dt, h := a.dt, 0.5*a.dt*a.dt
	e := vec3{
		-auKM * (c[0][0] + dt*c[1][0] + h*c[2][0]),
		-auKM * (c[0][1] + dt*c[1][1] + h*c[2][1]),
		-auKM * (c[0][2] + dt*c[1][2] + h*c[2][2]),
	}
	return f.np.mul(e)
}

// up returns the sine of the altitude of the unit direction w.
func (a *spanAt) up(w vec3) float64 {
	return a.cp*(a.cl*w[0]+a.sl*w[1]) + a.sp*w[2]
}

// apparent returns the star's apparent direction (unit, true equator of
// date), as Sky.apparent.
func (a *spanAt) apparent(v *StarVec) vec3 {
	f := a.d.f
	return f.np.mul(v.at(f.jdTT)).add(a.ab).unit()
}

// altAz returns the airless altitude and the azimuth (degrees) of the unit
// direction w, as horizontal computes them.
func (a *spanAt) altAz(w vec3) (altDeg, azDeg float64) {
	x := a.cl*w[0] + a.sl*w[1]
	north := -a.sp*x + a.cp*w[2]
	east := -a.sl*w[0] + a.cl*w[1]
	az := math.Atan2(east, north)
	if az < 0 {
		az += 2 * math.Pi
	}
	return math.Asin(clamp1(a.up(w))) * rad2deg, az * rad2deg
}

// position turns a unit direction into a Position, as Sky.position.
func (a *spanAt) position(w vec3) Position {
	return horizontal(w, a.last, a.sl, a.cl, a.sp, a.cp)
}

// LocalSiderealHours returns the local apparent sidereal time at t (hours,
// [0, 24)): the fast form of Sky(t).LocalSiderealHours, equal to it within
// 1e-4″ (see at).
func (sp *SkySpan) LocalSiderealHours(t Time) float64 {
	d := sp.dayOf(t.jd)
	return wrap2Pi(d.last0+SiderealRateDegPerDay*deg2rad*(t.jd-d.jd)) * rad2deg / 15
}

// Star returns where the star stands at t: the fast form of
// Sky(t).Star(v), which it equals to 1e-4″ (the linear sidereal time).
func (sp *SkySpan) Star(v *StarVec, t Time) Position {
	a := sp.at(t.jd)
	return a.position(a.apparent(v))
}

// Circumstances says where a star, the Sun and the Moon stand at one
// instant, as a planner needs them: the star's altitude and azimuth, and the
// Sun's and the Moon's altitudes and distances from it.
type Circumstances struct {
	StarAltDeg float64 // the star's airless topocentric altitude
	StarAzDeg  float64 // its azimuth, from north through east, [0, 360)
	SunAltDeg  float64 // the Sun's airless topocentric altitude
	SunSepDeg  float64 // angle between the star and the Sun
	MoonAltDeg float64 // the Moon's airless topocentric altitude (centre)
	MoonSepDeg float64 // angle between the star and the topocentric Moon
	MoonIllum  float64 // the Moon's illuminated fraction (Meeus 1998, eq. 48.1)
}

// Circumstances returns the circumstances of the star at t in one pass: the
// same answers as Sky(t).Star (altitude and azimuth), SunAltDeg,
// SunSeparationDeg, Moon().AltDeg, MoonSeparationDeg and MoonIllumination
// (to 1e-4″ and 1e-12), with the apparent place of the star, the Sun's
// direction and the Moon's computed once.
func (sp *SkySpan) Circumstances(v *StarVec, t Time) Circumstances {
	a := sp.at(t.jd)
	w := a.apparent(v)
	var c Circumstances
	c.StarAltDeg, c.StarAzDeg = a.altAz(w)
	// The Sun: geometric geocentric, then topocentric, then apparent (as
	// Sky.sunTopo).
	sun := a.sunGeo()
	ws := sun.sub(a.obs).unit().add(a.ab)
	c.SunAltDeg = math.Asin(clamp1(a.up(ws)/ws.norm())) * rad2deg
	c.SunSepDeg = angleBetween(w, ws) * rad2deg
	// The Moon, topocentric (no aberration, as Sky.Moon).
	m := sp.moonAt(t.jd)
	mt := m.sub(a.obs)
	c.MoonAltDeg = math.Asin(clamp1(a.up(mt)/mt.norm())) * rad2deg
	c.MoonSepDeg = angleBetween(w, mt) * rad2deg
	// Phase angle i between the Sun and the Earth seen from the Moon
	// (Meeus 1998, eq. 48.1, as Sky.MoonIllumination).
	ms := sun.sub(m)
	cosI := -ms.dot(m) / (ms.norm() * m.norm())
	c.MoonIllum = (1 + clamp1(cosI)) / 2
	return c
}

// sunAlt returns the Sun's airless topocentric altitude (degrees) at jd.
func (sp *SkySpan) sunAlt(jd float64) float64 {
	a := sp.at(jd)
	ws := a.sunGeo().sub(a.obs).unit().add(a.ab)
	return math.Asin(clamp1(a.up(ws)/ws.norm())) * rad2deg
}

// SunAltDeg returns the Sun's airless topocentric altitude at t (degrees):
// the fast form of Sky(t).SunAltDeg, equal to it within 1e-4″.
func (sp *SkySpan) SunAltDeg(t Time) float64 { return sp.sunAlt(t.jd) }

// SunCrossings returns, in time order, the instants in [from, to) (clipped
// to the span) at which the Sun's airless altitude passes levelDeg, each
// marked rising or setting: as Crossings(site, Sun, from, to, levelDeg),
// about 0.05 s, from the span's samples.
func (sp *SkySpan) SunCrossings(levelDeg float64, from, to Time) []Crossing {
	c := sp.sun
	n := len(c.t)
	step := (c.t[n-1] - c.t[0]) / float64(n-1)
	lo := int(math.Floor((from.jd-c.t[0])/step)) - 1
	hi := int(math.Ceil((to.jd-c.t[0])/step)) + 2
	if hi <= 0 || lo >= n {
		return nil
	}
	all := c.rootsIn(levelDeg, lo, hi, nil)
	out := all[:0]
	for _, x := range all {
		if x.At.jd >= from.jd && x.At.jd < to.jd {
			out = append(out, x)
		}
	}
	return out
}

// Interval is a stretch of time [From, To).
type Interval struct {
	From, To Time
}

// SunBelow returns, in time order, the intervals of the span in which the
// Sun's airless altitude is below limitDeg (−12° for nautical darkness,
// SunriseAltDeg for night). Their ends are the Sun's crossings of limitDeg
// (see SunCrossings), or the ends of the span.
func (sp *SkySpan) SunBelow(limitDeg float64) []Interval {
	var out []Interval
	start, below := sp.from, sp.sun.y[0] < limitDeg
	for _, c := range sp.sun.roots(limitDeg) {
		if c.Rising { // darkness ends
			if below && start.Before(c.At) {
				out = append(out, Interval{start, c.At})
			}
			below = false
		} else {
			start, below = c.At, true
		}
	}
	if below && start.Before(sp.to) {
		out = append(out, Interval{start, sp.to})
	}
	return out
}

// SeenAt returns the UTC instant at which an event at Julian date jd on the
// time scale ts (HJD_UTC or BJD_TDB: the ephemeris time) is seen at the
// span's site: the inverse of Sky.HJD and Sky.BJDTDB, solved by Newton's
// method with the rate of the light time from the Earth's and the site's
// velocities (two steps reach 1e-9 d, 86 µs). It is the fast form of the
// package-level SeenAt (Eastman, Siverd & Gaudi 2010, eq. 1) and agrees with
// Frame.SeenAt to under a millisecond.
//
// jd must lie within a day of the span; an unknown scale, a jd that is not a
// number or lies further out, or a result outside the supported range give
// an error.
func (sp *SkySpan) SeenAt(ts TimeScale, jd float64, v *StarVec) (Time, error) {
	if ts != HJD && ts != BJDTDB {
		return Time{}, fmt.Errorf("ephem: time scale %v: want hjd or bjd", ts)
	}
	if math.IsNaN(jd) || !(jd >= sp.from.jd-1 && jd < sp.to.jd+1) {
		return Time{}, fmt.Errorf("ephem: %s %.6f lies more than a day outside the sky span %s to %s", ts.Label(), jd, sp.from, sp.to)
	}
	// Newton's method on got(t) = jd. The site's share of the light time
	// (at most 21 ms) is evaluated once, at the first step, and carried to
	// the later ones by its rate: the 500 s of the first step move it by
	// under 0.8 ms, and its second-order change stays under 15 µs. The
	// star's projection on the Earth's path is kept while t stays in the
	// same day.
	t := jd
	var lt lightTime
	lt.prepare(sp, ts, v, t)
	got, rate := lt.at(t)
	site, siteRate := lt.site(sp, t)
	got += site
	rate += siteRate
	t0 := t
	for i := 0; i < 8; i++ {
		dt := (jd - got) / rate
		t += dt
		if math.Abs(dt) < 1e-9 {
			break
		}
		if sp.dayOf(t) != lt.d {
			lt.prepare(sp, ts, v, t)
		}
		got, rate = lt.at(t)
		got += site + siteRate*(t-t0)
		rate += siteRate
	}
	if !mustJD(t).Valid() {
		return Time{}, fmt.Errorf("ephem: %s %.6f is seen at JD %.6f (UTC), %w", ts.Label(), jd, t, ErrOutOfRange)
	}
	return mustJD(t), nil
}

// lightTime holds what the HJD (UTC) or BJD_TDB of a star seen from the
// span's site needs of one day, as Sky.HJD and Sky.BJDTDB compute it: the
// day, the scale, the star (mean equator of J2000) and its projections on
// the Earth's position, velocity and acceleration about the Sun or the
// barycentre (Frame.earthAt): AU, AU/day and AU/day².
type lightTime struct {
	d          *spanDay
	ts         TimeScale
	u          vec3
	p0, p1, p2 float64
}

// prepare sets lt up for the day that serves jd.
func (lt *lightTime) prepare(sp *SkySpan, ts TimeScale, v *StarVec, jd float64) {
	d := sp.dayOf(jd)
	f := d.f
	c := &f.helio
	if ts == BJDTDB {
		c = &f.bary
	}
	u := v.at(f.jdTT)
	*lt = lightTime{d: d, ts: ts, u: u, p0: c[0].dot(u), p1: c[1].dot(u), p2: c[2].dot(u)}
}

// at returns the ephemeris time of the instant jd (UTC) without the site's
// share of the light time, and its rate of change d(HJD)/d(JD_UTC).
func (lt *lightTime) at(jd float64) (got, rate float64) {
	dt := jd - lt.d.jd
	got = jd + (lt.p0+dt*(lt.p1+0.5*dt*lt.p2))*auLightDays
	rate = 1 + (lt.p1+dt*lt.p2)*auLightDays
	if lt.ts == BJDTDB {
		got += ttMinusUTC(jd)/secPerDay + lt.d.tdbTT
	}
	return got, rate
}

// site returns the site's share of the light time at jd (days) and its
// rate.
func (lt *lightTime) site(sp *SkySpan, jd float64) (site, siteRate float64) {
	const w = SiderealRateDegPerDay * deg2rad // rad/day
	d := lt.d
	ud := d.f.np.mul(lt.u) // the star, true equator of date
	sl, cl := math.Sincos(d.last0 + w*(jd-d.jd))
	rc, rs := sp.obsKM[0]/auKM*auLightDays, sp.obsKM[1]/auKM*auLightDays
	site = rc*(cl*ud[0]+sl*ud[1]) + rs*ud[2]
	siteRate = rc * w * (cl*ud[1] - sl*ud[0])
	return site, siteRate
}
