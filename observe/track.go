package observe

import (
	"math"

	"vigil/ephem"
)

// track is one target prepared against a sky table: its directions, and the
// intervals of the span in which it is high enough, clear of the horizon
// profile, and usable (also in the dark).
type track struct {
	tg  *Target
	idx int
	// u0 and pm are the J2000 unit vector at epoch J2000.0 and its rate of
	// change (rad per Julian year), built as ephem.Star.Vec builds them.
	u0, pm vec
	hasPM  bool
	bary   bool  // the ephemeris is on BJD_TDB (else HJD_UTC)
	anc    []vec // apparent directions of date at the table's anchors
	// ra and h0 hold, at each anchor, the apparent right ascension (rad,
	// unwrapped) and the hour angle at which the star passes the site's
	// lowest altitude (0: never above, π: never below).
	ra, h0 []float64
	// clr: hour-angle intervals clear of the horizon profile, computed on
	// first use.
	clr     []hspan
	clrDone bool
}

// winSpans holds the spans of one coverage window: the star above the
// site's lowest altitude (high), also above the horizon profile (hc; equal
// to high without a profile), and usable (dark ∩ hc). Reused between
// windows to spare allocations.
type winSpans struct {
	lo, hi                  float64
	high, hc, usable, hcBuf spans
}

// total returns the summed length of s.
func (s spans) total() float64 {
	m := 0.0
	for _, x := range s {
		m += x.b - x.a
	}
	return m
}

// newTrack prepares target tg (index idx of the caller's list).
func (tb *skyTable) newTrack(tg *Target, idx int) *track {
	tr := &track{tg: tg, idx: idx, bary: tg.Ephemeris.Scale == ephem.BJDTDB}
	s := tg.Star
	sa, ca := math.Sincos(s.RAHours * 15 * deg2rad)
	sd, cd := math.Sincos(s.DecDeg * deg2rad)
	tr.u0 = vec{cd * ca, cd * sa, sd}
	if s.PMRA != 0 || s.PMDec != 0 {
		k := 1e-3 / 3600 * deg2rad
		ea := vec{-sa, ca, 0}
		ed := vec{-sd * ca, -sd * sa, cd}
		for i := 0; i < 3; i++ {
			tr.pm[i] = (ea[i]*s.PMRA + ed[i]*s.PMDec) * k
		}
		tr.hasPM = true
	}
	v := s.Vec()
	tr.anc = make([]vec, len(tb.anchors))
	for i, sky := range tb.anchors {
		p := sky.Star(&v)
		tr.anc[i] = sphVec(p.RAHours, p.DecDeg)
	}
	n := len(tr.anc)
	tr.ra, tr.h0 = make([]float64, n), make([]float64, n)
	for i, u := range tr.anc {
		tr.ra[i] = math.Atan2(u[1], u[0])
		if i > 0 {
			tr.ra[i] = tr.ra[i-1] + wrapPi(tr.ra[i]-tr.ra[i-1])
		}
		tr.h0[i] = tb.highH(math.Asin(u[2]), tb.site.MinAltDeg)
	}
	return tr
}

// dirJ2000 returns the star's J2000 unit vector with proper motion carried
// to the TT epoch of the day d (as ephem.StarVec does for a frame).
func (tr *track) dirJ2000(d *day) vec {
	if !tr.hasPM {
		return tr.u0
	}
	yr := (d.centre + d.ttUTC[1] - ephem.J2000) / 365.25
	return vec{tr.u0[0] + tr.pm[0]*yr, tr.u0[1] + tr.pm[1]*yr, tr.u0[2] + tr.pm[2]*yr}.unit()
}

// apparent returns the star's apparent direction of date at jd,
// interpolated between the table's anchors (32 days apart at most: the
// annual aberration then errs by under 1″).
func (tb *skyTable) apparent(tr *track, jd float64) vec {
	if len(tr.anc) == 1 {
		return tr.anc[0]
	}
	x := (jd - tb.anc0) / tb.ancStep
	i := max(0, min(int(math.Floor(x)), len(tr.anc)-2))
	return lerp(tr.anc[i], tr.anc[i+1], x-float64(i))
}

// seen returns the Julian date (UTC) at which the event at ephemeris time T
// is seen at the site: T = t + r·n̂/c on the UTC scale (HJD), or
// T = t_TDB + r·n̂/c (BJD_TDB), r the site's position about the Sun's centre
// or the barycentre (Eastman et al. 2010, eq. 1), solved by fixed-point
// iteration as ephem.Frame.SeenAt does. Two steps reach 1e-10 d (9 µs),
// since the light time changes by under 1e-4 d per day; the site's share,
// at most 21 ms, is taken once.
func (tb *skyTable) seen(tr *track, T float64) float64 {
	t := T
	site := tb.siteLight(tr, T)
	for i := 0; i < 2; i++ {
		d := tb.dayOf(t)
		lt := d.lightTime(tr.bary, tr.dirJ2000(d), t) + site
		if tr.bary {
			t = T - lt - d.ttMinusUTC(t) - d.tdbTT
		} else {
			t = T - lt
		}
	}
	return t
}

// siteLight returns the light time (days) across the site's offset from the
// Earth's centre toward the star, r_site·n̂/c, at most 21 ms. It uses the
// star's J2000 direction with the sidereal time of date: the precession
// since J2000 changes it by under 0.2 ms.
func (tb *skyTable) siteLight(tr *track, jd float64) float64 {
	sl, cl := math.Sincos(tb.lst(jd))
	u := tr.u0
	return earthRadiusLightDays * (tb.rhoCos*(u[0]*cl+u[1]*sl) + tb.rhoSin*u[2])
}

// hspan is an interval of hour angle (rad) within [-π, π].
type hspan struct{ a, b float64 }

// highH returns the hour angles at which a star at declination dec (rad) is
// above altDeg: |H| < H0 with cos H0 = (sin h0 − sin φ sin δ)/(cos φ cos δ)
// (Meeus 1998, eq. 15.1). Empty when it never rises so high; all of
// [-π, π] when it never sets below.
func (tb *skyTable) highH(dec, altDeg float64) (h0 float64) {
	sd, cd := math.Sincos(dec)
	c := (math.Sin(altDeg*deg2rad) - tb.sinLat*sd) / (tb.cosLat * cd)
	switch {
	case math.IsNaN(c) || c >= 1:
		if tb.sinLat*sd > math.Sin(altDeg*deg2rad) { // at a pole: constant altitude
			return math.Pi
		}
		return 0
	case c <= -1:
		return math.Pi
	}
	return math.Acos(c)
}

// clearStepRad is the step in hour angle (2°, 8 minutes of time) at which
// the altitude is compared with the horizon profile; crossings are then
// refined by bisection. Features of the profile narrower than about this
// step in azimuth may be missed by the windows (never by the verdict at the
// instant, which is computed exactly).
const clearStepRad = 2 * deg2rad

// clearTol is the accuracy (rad of hour angle, about 1.4 s of time) to
// which the crossings of the horizon profile are refined.
const clearTol = 1e-4

// clearH returns the hour-angle intervals in which a star at declination
// dec (rad) is above the horizon profile, within |H| < hMin (where it is
// above the site's lowest altitude). Above the profile's highest point no
// sampling is needed.
func (tb *skyTable) clearH(dec, hMin float64) []hspan {
	h := tb.site.Horizon
	hMax := tb.highH(dec, h.MaxAltDeg())
	sd, cd := math.Sincos(dec)
	g := func(H float64) float64 {
		if math.Abs(H) < hMax {
			return 1
		}
		sh, ch := math.Sincos(H)
		alt := math.Asin(math.Max(-1, math.Min(1, tb.sinLat*sd+tb.cosLat*cd*ch))) * rad2deg
		az := math.Atan2(-cd*sh, sd*tb.cosLat-cd*ch*tb.sinLat) * rad2deg
		return alt - h.AltDeg(az)
	}
	if hMin <= 0 {
		return nil
	}
	n := int(math.Ceil(2 * hMin / clearStepRad))
	step := 2 * hMin / float64(n)
	var out []hspan
	a, ga := -hMin, g(-hMin)
	start := math.NaN()
	if ga > 0 {
		start = a
	}
	for i := 1; i <= n; i++ {
		b := -hMin + float64(i)*step
		gb := g(b)
		if (ga > 0) != (gb > 0) {
			// Regula falsi with the Illinois modification (Dowell &
			// Jarratt 1971, BIT 11, 168): a few evaluations reach clearTol
			// where bisection needs a dozen.
			lo, hi, glo, ghi := a, b, ga, gb
			x := (lo + hi) / 2
			for k := 0; k < 30; k++ {
				m := hi - ghi*(hi-lo)/(ghi-glo)
				m = math.Max(lo, math.Min(hi, m))
				done := k > 0 && math.Abs(m-x) < clearTol
				x = m
				if done {
					break
				}
				gm := g(m)
				if (gm > 0) == (glo > 0) {
					lo, glo = m, gm
					ghi /= 2
				} else {
					hi, ghi = m, gm
					glo /= 2
				}
			}
			if gb > 0 {
				start = x
			} else if !math.IsNaN(start) {
				out = append(out, hspan{start, x})
				start = math.NaN()
			}
		}
		a, ga = b, gb
	}
	if !math.IsNaN(start) {
		out = append(out, hspan{start, hMin})
	}
	return out
}

// windowSpans fills ws with the spans of [lo, hi) (at most a day long): the
// star's apparent place is interpolated between the anchors at the middle
// of the window, and each hour-angle interval is turned into time about the
// transits (Meeus 1998, eq. 15.1).
func (tb *skyTable) windowSpans(tr *track, lo, hi float64, ws *winSpans) {
	const sidDay = 2 * math.Pi / siderealRate
	mid := (lo + hi) / 2
	ra, h0 := tr.ra[0], tr.h0[0]
	if n := len(tr.ra); n > 1 {
		x := (mid - tb.anc0) / tb.ancStep
		i := max(0, min(int(math.Floor(x)), n-2))
		x -= float64(i)
		ra = tr.ra[i] + x*(tr.ra[i+1]-tr.ra[i])
		h0 = tr.h0[i] + x*(tr.h0[i+1]-tr.h0[i])
	}
	tt := mid + wrapPi(ra-tb.lst(mid))/siderealRate // a transit
	ws.lo, ws.hi = lo, hi
	ws.high = ws.high[:0]
	if h0 > 0 {
		for n := -1; n <= 1; n++ {
			tn := tt + float64(n)*sidDay
			ws.high = ws.high.add(max(lo, tn-h0/siderealRate), min(hi, tn+h0/siderealRate))
		}
	}
	ws.hc = ws.high
	if len(tb.site.Horizon) > 0 && len(ws.high) > 0 {
		if !tr.clrDone {
			dec := math.Asin(tr.anc[len(tr.anc)/2][2])
			tr.clr = tb.clearH(dec, tb.highH(dec, tb.site.MinAltDeg))
			tr.clrDone = true
		}
		var clear spans
		var buf [8]span
		clear = buf[:0]
		for n := -1; n <= 1; n++ {
			tn := tt + float64(n)*sidDay
			for _, c := range tr.clr {
				clear = clear.add(max(lo, tn+c.a/siderealRate), min(hi, tn+c.b/siderealRate))
			}
		}
		ws.hcBuf = ws.high.intersect(clear, ws.hcBuf)
		ws.hc = ws.hcBuf
	}
	// dark ∩ hc, with the dark spans that meet the window.
	i := tb.dark.first(lo)
	j := i
	for j < len(tb.dark) && tb.dark[j].a < hi {
		j++
	}
	ws.usable = tb.dark[i:j].intersect(ws.hc, ws.usable)
}

// wrapPi returns x reduced to [-π, π).
func wrapPi(x float64) float64 {
	return x - 2*math.Pi*math.Floor((x+math.Pi)/(2*math.Pi))
}
