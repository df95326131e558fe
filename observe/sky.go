package observe

import (
	"math"
	"runtime"
	"sync"

	"vigil/ephem"
)

// This file holds the sky table: everything that depends only on the site
// and the instant over a span of days, computed once and shared by every
// star. The star's own work then reduces to dot products with unit vectors
// and to the hour-angle algebra of Meeus 1998, eq. 13.6 and 15.1.

// vec is a Cartesian unit vector (true equator and equinox of date unless
// said otherwise).
type vec [3]float64

func (a vec) dot(b vec) float64 { return a[0]*b[0] + a[1]*b[1] + a[2]*b[2] }

func (a vec) unit() vec {
	n := math.Sqrt(a.dot(a))
	return vec{a[0] / n, a[1] / n, a[2] / n}
}

// lerp returns the normalised linear interpolation between a and b.
func lerp(a, b vec, f float64) vec {
	return vec{a[0] + f*(b[0]-a[0]), a[1] + f*(b[1]-a[1]), a[2] + f*(b[2]-a[2])}.unit()
}

// sphVec returns the unit vector of right ascension (hours) and declination
// (degrees).
func sphVec(raHours, decDeg float64) vec {
	sa, ca := math.Sincos(raHours * 15 * deg2rad)
	sd, cd := math.Sincos(decDeg * deg2rad)
	return vec{cd * ca, cd * sa, sd}
}

// sepDeg returns the angle between two unit vectors in degrees.
func sepDeg(a, b vec) float64 {
	return math.Acos(math.Max(-1, math.Min(1, a.dot(b)))) * rad2deg
}

const (
	deg2rad = math.Pi / 180
	rad2deg = 180 / math.Pi
	// siderealRate is the Earth's rotation in radians per day of UT:
	// 360.98564736629° per day (Meeus 1998, eq. 12.4).
	siderealRate = 360.98564736629 * deg2rad
	secPerDay    = 86400.0
	// earthRadiusLightDays is the Earth's equatorial radius (6378.14 km,
	// IAU 1976, Meeus 1998 ch. 11) in light-days.
	earthRadiusLightDays = 6378.14 / 299792.458 / secPerDay
	// Sampling steps of the Sun's and the Moon's apparent directions (days).
	// Linear interpolation of the topocentric Sun over 3 h errs by under 1″
	// (its diurnal parallax, 8.8″, is the largest curvature); of the
	// topocentric Moon over 1 h by under 0.01° (its diurnal parallax is about
	// 1°).
	sunStep  = 0.125
	moonStep = 1.0 / 24
	// darkStep is the step (days) at which the Sun's altitude is scanned
	// for the crossings of the twilight limit, refined by bisection to
	// darkTol (about 0.01 s).
	darkStep = 10.0 / 1440
	darkTol  = 1e-7
)

// day is one UTC day of the table: the Frame ephem uses for instants within
// half a day of 0h UTC (JD k+0.5 for instants in [k, k+1)), and what the
// forecast needs of it.
type day struct {
	frame  *ephem.Frame
	centre float64 // JD (UTC) of 0h UTC
	lst0   float64 // local apparent sidereal time at centre (rad)
	// ttUTC holds TT − UTC (days) before and after 0h UTC, the only instant
	// of the day at which a leap second can change it.
	ttUTC [2]float64
	tdbTT float64 // TDB − TT (days) as the frame counts it
	// helio and bary hold the quadratic in dt = t − centre of the Earth's
	// centre relative to the Sun and to the barycentre, in light-days,
	// J2000 equator: r(t) = c[0] + c[1]·dt + c[2]·dt².
	helio, bary [3]vec
}

// skyTable is the sky over a span of days at one site.
type skyTable struct {
	site           *Site
	sinLat, cosLat float64
	rhoSin, rhoCos float64 // ρ sin φ′, ρ cos φ′ (Earth radii), Meeus 1998 ch. 11
	from, to       float64 // JD (UTC) span covered
	k0             int64   // floor(JD) of days[0]
	days           []day
	sun0, moon0    float64 // JD of the first sample
	sun, moon      []vec   // apparent topocentric directions of date
	illum          []float64
	sunLimitDeg    float64
	dark           spans // Sun below sunLimitDeg
	night          spans // Sun below the horizon (−0.8333°)
	anc0, ancStep  float64
	anchors        []*ephem.Sky // for the stars' apparent places
}

// axes are the J2000 unit vectors, as stars, from which the Earth's position
// is read out of ephem's light-time functions.
var axes = func() [3]ephem.StarVec {
	return [3]ephem.StarVec{
		ephem.Star{RAHours: 0, DecDeg: 0}.Vec(),
		ephem.Star{RAHours: 6, DecDeg: 0}.Vec(),
		ephem.Star{RAHours: 0, DecDeg: 90}.Vec(),
	}
}()

// newTable computes the sky table for [from, to) (JD UTC).
func newTable(site *Site, from, to, sunLimitDeg float64) *skyTable {
	tb := &skyTable{site: site, from: from, to: to, sunLimitDeg: sunLimitDeg}
	phi := site.LatDeg * deg2rad
	tb.sinLat, tb.cosLat = math.Sincos(phi)
	tb.rhoSin, tb.rhoCos = parallaxConstants(phi, site.ElevM)
	tb.k0 = int64(math.Floor(from))
	k1 := int64(math.Floor(to))
	tb.days = make([]day, k1-tb.k0+1)
	tb.sun0 = math.Floor(from/sunStep) * sunStep
	tb.sun = make([]vec, int(math.Ceil((to-tb.sun0)/sunStep))+2)
	tb.illum = make([]float64, len(tb.sun))
	tb.moon0 = math.Floor(from/moonStep) * moonStep
	tb.moon = make([]vec, int(math.Ceil((to-tb.moon0)/moonStep))+2)
	n := int(math.Ceil((to-from)/32)) + 1
	tb.anc0, tb.ancStep = from, (to-from)/float64(max(n-1, 1))
	tb.anchors = make([]*ephem.Sky, n)

	frames := ephem.NewFrames()
	parallel(len(tb.days), func(i int) { tb.days[i] = tb.newDay(frames, tb.k0+int64(i)) })
	parallel(len(tb.sun), func(i int) {
		jd := tb.sun0 + float64(i)*sunStep
		s := tb.sky(jd)
		p := s.Sun()
		tb.sun[i] = sphVec(p.RAHours, p.DecDeg)
		tb.illum[i] = s.MoonIllumination()
	})
	parallel(len(tb.moon), func(i int) {
		p := tb.sky(tb.moon0 + float64(i)*moonStep).Moon()
		tb.moon[i] = sphVec(p.RAHours, p.DecDeg)
	})
	for i := range tb.anchors {
		tb.anchors[i] = tb.sky(tb.anc0 + float64(i)*tb.ancStep)
	}
	tb.dark = tb.below(sunLimitDeg, from, to)
	tb.night = tb.below(ephem.SunriseAltDeg, from, to)
	return tb
}

// parallel runs fn(0..n-1) over GOMAXPROCS goroutines.
func parallel(n int, fn func(i int)) {
	w := min(runtime.GOMAXPROCS(0), n)
	if w <= 1 {
		for i := 0; i < n; i++ {
			fn(i)
		}
		return
	}
	var wg sync.WaitGroup
	for g := 0; g < w; g++ {
		wg.Add(1)
		go func(g int) {
			defer wg.Done()
			for i := g; i < n; i += w {
				fn(i)
			}
		}(g)
	}
	wg.Wait()
}

// parallaxConstants returns ρ sin φ′ and ρ cos φ′ of a site at geodetic
// latitude phi (rad) and elevation h (m), in equatorial Earth radii, for the
// IAU 1976 ellipsoid (Meeus 1998, ch. 11, p. 82).
func parallaxConstants(phi, h float64) (rhoSin, rhoCos float64) {
	const ba = 0.99664719 // b/a
	u := math.Atan(ba * math.Tan(phi))
	su, cu := math.Sincos(u)
	sp, cp := math.Sincos(phi)
	return ba*su + h/6378140*sp, cu + h/6378140*cp
}

// mustTime turns a Julian date known to lie in range into an ephem.Time.
func mustTime(jd float64) ephem.Time {
	t, err := ephem.FromJDUTC(jd)
	if err != nil {
		panic("observe: internal instant out of range: " + err.Error())
	}
	return t
}

// dayOf returns the day whose frame serves instant jd.
func (tb *skyTable) dayOf(jd float64) *day {
	i := int(int64(math.Floor(jd)) - tb.k0)
	i = max(0, min(i, len(tb.days)-1))
	return &tb.days[i]
}

// sky returns ephem's full view from the site at jd.
func (tb *skyTable) sky(jd float64) *ephem.Sky {
	t := mustTime(jd)
	return tb.dayOf(jd).frame.Sky(tb.site.Site, t)
}

func (tb *skyTable) newDay(frames *ephem.Frames, k int64) day {
	c := float64(k) + 0.5
	f := frames.For(mustTime(c))
	d := day{frame: f, centre: c}
	d.lst0 = f.Sky(tb.site.Site, mustTime(c)).LocalSiderealHours() * 15 * deg2rad
	ttUTC := func(jd float64) float64 { t := mustTime(jd); return t.JDTT() - t.JDUTC() }
	d.ttUTC = [2]float64{ttUTC(c - 0.25), ttUTC(c + 0.25)}
	ft := f.Time()
	d.tdbTT = ft.JDTDB() - ft.JDTT()
	// Read the Earth's position out of the light time toward the three
	// axes at three instants, and fit the quadratic through them.
	var h, b [3]vec // [sample][axis]
	for s, dt := range [3]float64{-0.5, 0, 0.5} {
		t := mustTime(c + dt)
		tdb := t.JDTT() + d.tdbTT
		for a := range axes {
			h[s][a] = f.HJD(&axes[a], t) - t.JDUTC()
			b[s][a] = f.BJDTDB(&axes[a], t) - tdb
		}
	}
	fit := func(m, z, p vec) [3]vec {
		var q [3]vec
		for a := 0; a < 3; a++ {
			q[0][a] = z[a]
			q[1][a] = p[a] - m[a]
			q[2][a] = 2 * (p[a] + m[a] - 2*z[a])
		}
		return q
	}
	d.helio = fit(h[0], h[1], h[2])
	d.bary = fit(b[0], b[1], b[2])
	return d
}

// lst returns the local apparent sidereal time (rad) at jd.
func (tb *skyTable) lst(jd float64) float64 {
	d := tb.dayOf(jd)
	return d.lst0 + siderealRate*(jd-d.centre)
}

// zenith returns the site's zenith direction (true equator of date) at jd,
// with the sine and cosine of the local sidereal time.
func (tb *skyTable) zenith(jd float64) (z vec, sl, cl float64) {
	sl, cl = math.Sincos(tb.lst(jd))
	return vec{tb.cosLat * cl, tb.cosLat * sl, tb.sinLat}, sl, cl
}

// altAz returns the altitude and azimuth (degrees, from north through east)
// of direction u seen at local sidereal time (sl, cl): Meeus 1998,
// eq. 13.5 and 13.6 in vector form.
func (tb *skyTable) altAz(u vec, sl, cl float64) (alt, az float64) {
	north := -tb.sinLat*cl*u[0] - tb.sinLat*sl*u[1] + tb.cosLat*u[2]
	east := -sl*u[0] + cl*u[1]
	up := tb.cosLat*cl*u[0] + tb.cosLat*sl*u[1] + tb.sinLat*u[2]
	az = math.Atan2(east, north) * rad2deg
	if az < 0 {
		az += 360
	}
	return math.Asin(math.Max(-1, math.Min(1, up))) * rad2deg, az
}

// sample interpolates a table of directions sampled every step from t0.
func sample(tab []vec, t0, step, jd float64) vec {
	x := (jd - t0) / step
	i := int(math.Floor(x))
	i = max(0, min(i, len(tab)-2))
	return lerp(tab[i], tab[i+1], x-float64(i))
}

// sunVec and moonVec return the Sun's and the Moon's apparent topocentric
// directions at jd.
func (tb *skyTable) sunVec(jd float64) vec  { return sample(tb.sun, tb.sun0, sunStep, jd) }
func (tb *skyTable) moonVec(jd float64) vec { return sample(tb.moon, tb.moon0, moonStep, jd) }

// moonIllum returns the Moon's illuminated fraction at jd.
func (tb *skyTable) moonIllum(jd float64) float64 {
	x := (jd - tb.sun0) / sunStep
	i := max(0, min(int(math.Floor(x)), len(tb.illum)-2))
	f := x - float64(i)
	return tb.illum[i] + f*(tb.illum[i+1]-tb.illum[i])
}

// sunAlt returns the Sun's airless altitude (degrees) at jd.
func (tb *skyTable) sunAlt(jd float64) float64 {
	z, _, _ := tb.zenith(jd)
	return math.Asin(math.Max(-1, math.Min(1, tb.sunVec(jd).dot(z)))) * rad2deg
}

// crossings returns the instants in [from, to) at which f crosses level,
// each with the sign of the crossing (true rising), scanning at step and
// refining by bisection to darkTol.
func crossings(f func(float64) float64, level, from, to, step float64) (ts []float64, up []bool) {
	a, fa := from, f(from)-level
	for a < to {
		b := min(a+step, to)
		fb := f(b) - level
		if (fa < 0) != (fb < 0) {
			lo, hi, flo := a, b, fa
			for hi-lo > darkTol {
				m := (lo + hi) / 2
				fm := f(m) - level
				if (fm < 0) == (flo < 0) {
					lo, flo = m, fm
				} else {
					hi = m
				}
			}
			ts = append(ts, (lo+hi)/2)
			up = append(up, fa < 0)
		}
		a, fa = b, fb
	}
	return ts, up
}

// below returns the intervals of [from, to) in which the Sun is below
// limitDeg.
func (tb *skyTable) below(limitDeg, from, to float64) spans {
	ts, up := crossings(tb.sunAlt, limitDeg, from, to, darkStep)
	var s spans
	start := math.NaN()
	if tb.sunAlt(from) < limitDeg {
		start = from
	}
	for i, t := range ts {
		if up[i] { // the Sun rises through the limit: darkness ends
			if !math.IsNaN(start) {
				s = s.add(start, t)
			}
			start = math.NaN()
		} else {
			start = t
		}
	}
	if !math.IsNaN(start) {
		s = s.add(start, to)
	}
	return s
}

// lightTime returns the light time (days) r·n̂/c for the Earth's centre,
// heliocentric or barycentric, toward the J2000 direction u at jd.
func (d *day) lightTime(bary bool, u vec, jd float64) float64 {
	c := &d.helio
	if bary {
		c = &d.bary
	}
	dt := jd - d.centre
	var r vec
	for a := 0; a < 3; a++ {
		r[a] = c[0][a] + dt*(c[1][a]+dt*c[2][a])
	}
	return r.dot(u)
}

// ttMinusUTC returns TT − UTC (days) at jd within the day.
func (d *day) ttMinusUTC(jd float64) float64 {
	if jd < d.centre {
		return d.ttUTC[0]
	}
	return d.ttUTC[1]
}
