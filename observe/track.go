package observe

import (
	"math"

	"example.org/vigil/ephem"
)

// track is one target prepared against a sky table: the star ready for
// ephem, its apparent place at the table's anchors, and the hour angles at
// which it stands clear of the horizon profile. A worker keeps one track and
// resets it for each target, so that its buffers are reused.
type track struct {
	tg  *Target
	idx int
	v   ephem.StarVec
	// ra and h0 hold, at each anchor, the apparent right ascension (hours,
	// unwrapped) and the hour angle (hours) at which the star passes the
	// site's lowest altitude: 0 when it never rises so high, 12 when it
	// never sets below (ephem.DiurnalCircle.HourAngleAt).
	ra, h0 []float64
	// clr holds the hour-angle intervals clear of the horizon profile of
	// the last two blocks of anchorStepDays the target's windows met
	// (skyTable.clearAt); clrNext is the slot to fill next.
	clr     [2]clearBlock
	clrNext int
}

// clearBlock is a star's hour-angle intervals (hours) clear of the horizon
// profile in block k of anchorStepDays (skyTable.clearAt).
type clearBlock struct {
	k  float64
	ok bool
	h  []hspan
}

// anchorStepDays is the step (whole days) between the anchors at which a
// star's apparent place is computed for its windows (skyTable), and the
// length of the blocks in which its hour-angle intervals clear of the
// horizon profile are found once, for its declination at the block's
// anchor (skyTable.clearAt). Over 32 days the annual aberration (20.5″)
// departs from a straight line by under 1″, so the interpolated transits
// and hour angles err by well under a second. In 32 days the declination
// drifts by at most 2π·32/365.25 × 20.5″ ≈ 11″ through the annual
// aberration, by about 2″ through precession and nutation (Meeus 1998,
// chs. 21–23) and by under 1″ through a proper motion of 10″ a year, which
// moves an edge set by the profile by under a second where the star
// crosses the profile steeply (more where its path grazes the profile).
// The anchors and blocks are fixed in absolute time, so that the edges of
// an event's window depend only on the target and the event's own time:
// not on the span asked for, nor on which windows came first.
const anchorStepDays = 32.0

// reset prepares tr for target tg (index idx of the caller's list).
func (tb *skyTable) reset(tr *track, tg *Target, idx int) {
	*tr = track{tg: tg, idx: idx, v: tg.Star.Vec(), ra: tr.ra[:0], h0: tr.h0[:0],
		clr: [2]clearBlock{{h: tr.clr[0].h[:0]}, {h: tr.clr[1].h[:0]}}}
	site := tb.site
	for i := 0; i < tb.nAnc; i++ {
		var p ephem.Position
		if tb.ancSky != nil {
			p = tb.ancSky[i].Star(&tr.v)
		} else {
			p = tb.span.Star(&tr.v, mustTime(tb.anc0+float64(i)*tb.ancStep))
		}
		ra := p.RAHours
		if i > 0 {
			ra = tr.ra[i-1] + wrap12(ra-tr.ra[i-1])
		}
		h0, _ := ephem.NewDiurnalCircle(site.LatDeg, p.DecDeg).HourAngleAt(site.MinAltDeg)
		tr.ra = append(tr.ra, ra)
		tr.h0 = append(tr.h0, h0)
	}
}

// wrap12 returns the hour angle x (hours) reduced to [-12, 12).
func wrap12(x float64) float64 { return x - 24*math.Floor((x+12)/24) }

// winSpans holds the spans of one coverage window: the star above the
// site's lowest altitude (high), also above the horizon profile (hc; equal
// to high without a profile), and usable (dark ∩ hc). Reused between
// windows to spare allocations.
type winSpans struct {
	lo, hi                  float64
	high, hc, usable, hcBuf spans
	clear                   spans
	dark0                   int // the first dark span that meets the window
}

// total returns the summed length of s.
func (s spans) total() float64 {
	m := 0.0
	for _, x := range s {
		m += x.b - x.a
	}
	return m
}

// hourDays is the time (days) in which the hour angle grows by one hour,
// and siderealDay the length of a sidereal day (days): from the rate of
// sidereal time (Meeus 1998, eq. 12.4).
const (
	hourDays    = 15 / ephem.SiderealRateDegPerDay
	siderealDay = 24 * hourDays
)

// hspan is an interval of hour angle (hours) within [-12, 12].
type hspan struct{ a, b float64 }

// clearStepH is the step in hour angle (2°, 8 minutes of time) at which the
// altitude is compared with the horizon profile; crossings are then refined.
// Features of the profile narrower than about this step in azimuth may be
// missed by the windows (never by the verdict at the instant, which is
// computed exactly).
const clearStepH = 2.0 / 15

// clearTolH is the accuracy (hours of hour angle, 1.4 s of time) to which
// the crossings of the horizon profile are refined.
const clearTolH = 4e-4

// clearH appends to out the hour-angle intervals in which a star on the
// diurnal circle c is above the horizon profile, within |H| < hMin (where it
// is above the site's lowest altitude). Above the profile's highest point no
// sampling is needed. Where the star stands far from the profile, the
// samples that cannot change sign (by the bound tb.clearRate) are passed
// over: the samples compared, and so the crossings, are the same as without.
func (tb *skyTable) clearH(c ephem.DiurnalCircle, hMin float64, out []hspan) []hspan {
	if hMin <= 0 {
		return out
	}
	h := tb.site.Horizon
	hMax, _ := c.HourAngleAt(h.MaxAltDeg()) // 0 when it never clears the highest point
	g := func(H float64) float64 {
		if math.Abs(H) < hMax {
			return 1
		}
		alt, az := c.AltAz(H)
		return alt - h.AltDeg(az)
	}
	n := int(math.Ceil(2 * hMin / clearStepH))
	step := 2 * hMin / float64(n)
	perStep := tb.clearRate * 15 * step // degrees g can change in one step
	a, ga := -hMin, g(-hMin)
	start := math.NaN()
	if ga > 0 {
		start = a
	}
	for i := 0; i < n; {
		// Samples i+1 … i+k keep the sign of ga: pass to sample i+k.
		// The bound holds outside |H| < hMax, where the star is below
		// the profile's highest point.
		if perStep > 0 && math.Abs(a) >= hMax {
			k := int(min(math.Abs(ga)/perStep, float64(n-i)))
			if a < 0 { // not past the side of the meridian
				k = min(k, int((-hMax-a)/step))
			}
			if k > 0 {
				i += k
				a = -hMin + float64(i)*step
				ga = g(a)
				continue
			}
		}
		i++
		b := -hMin + float64(i)*step
		gb := g(b)
		if (ga > 0) != (gb > 0) {
			x := illinois(g, a, b, ga, gb, clearTolH)
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

// clearRate bounds how fast (degrees per degree of hour angle) a star's
// altitude h less the profile's altitude behind it can change while the
// star stands between the site's lowest altitude and the profile's highest
// point: the altitude changes at most |cos φ| times as fast as the hour
// angle, the azimuth at most |sin φ| + |cos φ| |tan h| times (Meeus 1998,
// eqs. 13.5 and 13.6, differentiated), and the profile by its steepest
// slope per degree of azimuth. 10% is added for rounding. It is 0 without a
// profile or when the profile reaches within a degree of the zenith, where
// no useful bound exists.
func clearRate(site *Site) float64 {
	h := site.Horizon
	n := len(h)
	if n == 0 || h.MaxAltDeg() > 89 {
		return 0
	}
	slope := 0.0
	for i := range n {
		p, q := h[i], h[(i+1)%n]
		daz := q.AzDeg - p.AzDeg
		if i == n-1 {
			daz += 360
		}
		slope = max(slope, math.Abs(q.AltDeg-p.AltDeg)/daz)
	}
	sl, cl := math.Sincos(site.LatDeg * deg2rad)
	tanH := max(math.Abs(math.Tan(site.MinAltDeg*deg2rad)), math.Abs(math.Tan(h.MaxAltDeg()*deg2rad)))
	return 1.1 * (math.Abs(cl) + slope*(math.Abs(sl)+math.Abs(cl)*tanH))
}

// illinois returns the root of g in [lo, hi] (g(lo) = glo and g(hi) = ghi
// of opposite signs) to tol, by regula falsi with the Illinois modification
// (Dowell & Jarratt 1971, BIT 11, 168): a few evaluations where bisection
// needs a dozen.
func illinois(g func(float64) float64, lo, hi, glo, ghi, tol float64) float64 {
	x := (lo + hi) / 2
	for k := 0; k < 30; k++ {
		m := hi - ghi*(hi-lo)/(ghi-glo)
		m = math.Max(lo, math.Min(hi, m))
		done := k > 0 && math.Abs(m-x) < tol
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
	return x
}

// windowSpans fills ws with the spans of the window [jd − hw, jd + hw] (hw
// at most half a day). The star's apparent right ascension and the hour
// angle at the site's lowest altitude are interpolated between the anchors;
// each hour-angle interval is then turned into time about the transits
// nearest jd (Meeus 1998, eq. 15.1, by ephem.DiurnalCircle). The intervals
// clear of the horizon profile are those of the star's declination at the
// start of jd's block of anchorStepDays (clearAt).
func (tb *skyTable) windowSpans(tr *track, jd, hw float64, ws *winSpans) {
	lo, hi := jd-hw, jd+hw
	tt := tb.highSpans(tr, jd, hw, ws)
	ws.hc = ws.high
	if len(tb.site.Horizon) > 0 && len(ws.high) > 0 {
		clr := tb.clearAt(tr, jd)
		ws.clear = ws.clear[:0]
		for n := -1.0; n <= 1; n++ {
			tn := tt + n*siderealDay
			for _, c := range clr {
				ws.clear = ws.clear.add(max(lo, tn+c.a*hourDays), min(hi, tn+c.b*hourDays))
			}
		}
		ws.hcBuf = ws.high.intersect(ws.clear, ws.hcBuf)
		ws.hc = ws.hcBuf
	}
	// dark ∩ hc, with the dark spans that meet the window.
	d0 := tb.dark.firstFrom(lo, ws.dark0)
	ws.dark0 = d0
	d1 := d0
	for d1 < len(tb.dark) && tb.dark[d1].a < hi {
		d1++
	}
	ws.usable = tb.dark[d0:d1].intersect(ws.hc, ws.usable)
}

// highSpans sets ws.lo and ws.hi to the window [jd − hw, jd + hw] and
// ws.high to its spans in which the star of tr stands above the site's
// lowest altitude, with the right ascension and that altitude's hour angle
// interpolated between the anchors (see windowSpans). It returns the
// transit nearest jd (JD UTC).
func (tb *skyTable) highSpans(tr *track, jd, hw float64, ws *winSpans) (tt float64) {
	lo, hi := jd-hw, jd+hw
	i, x := 0, 0.0 // interpolate between anchors i and i+1
	if n := len(tr.ra); n > 1 {
		x = (jd - tb.anc0) / tb.ancStep
		i = max(0, min(int(math.Floor(x)), n-2))
		x -= float64(i)
	}
	lerp := func(y []float64) float64 {
		if len(y) == 1 {
			return y[0]
		}
		return y[i] + x*(y[i+1]-y[i])
	}
	ra, h0 := lerp(tr.ra), lerp(tr.h0)
	ha := wrap12(tb.span.LocalSiderealHours(mustTime(jd)) - ra)
	tt = jd - ha*hourDays // the transit nearest jd
	ws.lo, ws.hi = lo, hi
	ws.high = ws.high[:0]
	if h0 > 0 {
		for n := -1.0; n <= 1; n++ {
			tn := tt + n*siderealDay
			ws.high = ws.high.add(max(lo, tn-h0*hourDays), min(hi, tn+h0*hourDays))
		}
	}
	return tt
}

// clearAt returns the hour-angle intervals (hours) in which the star of tr
// stands clear of the horizon profile (clearH) for a window at jd (UTC):
// those of its apparent declination at the start of jd's block of
// anchorStepDays (blockSky), kept for the target's later windows in the
// block. Two blocks are kept, since a target's windows come mostly in time
// order.
func (tb *skyTable) clearAt(tr *track, jd float64) []hspan {
	k := math.Floor(jd / anchorStepDays)
	for i := range tr.clr {
		if c := &tr.clr[i]; c.ok && c.k == k {
			tr.clrNext = 1 - i
			return c.h
		}
	}
	c := &tr.clr[tr.clrNext]
	tr.clrNext = 1 - tr.clrNext
	dec := tb.blockSky(k).Star(&tr.v).DecDeg
	circle := ephem.NewDiurnalCircle(tb.site.LatDeg, dec)
	hMin, _ := circle.HourAngleAt(tb.site.MinAltDeg)
	c.k, c.ok, c.h = k, true, tb.clearH(circle, hMin, c.h[:0])
	return c.h
}

// blockSky returns the exact view from the site (its own ephem.Frame, not
// the sky span's) at the start of block k of anchorStepDays: JD (UTC)
// k·anchorStepDays, or the block's end when its start precedes ephem's
// range (1620). That of an anchor of the table serves when there is one.
func (tb *skyTable) blockSky(k float64) *ephem.Sky {
	if i := int(k - tb.anc0/anchorStepDays); tb.ancSky != nil && i >= 0 && i < len(tb.ancSky) {
		return tb.ancSky[i]
	}
	t, err := ephem.FromJDUTC(k * anchorStepDays)
	if err != nil {
		t = mustTime((k + 1) * anchorStepDays)
	}
	return ephem.NewSky(tb.site.Site, t)
}

// candPadDays widens the spans of candidates beyond the error of their
// transits (see candidates): 86 s.
const candPadDays = 1e-3

// candidates returns, appended to out[:0], spans covering every instant in
// [from, to] (JD UTC, within the table) at which the Sun is below the
// planner's limit and the star of tr may stand above the site's lowest
// altitude: the dark spans cut to the star's hours above that altitude
// about each of its transits, with the widest hour angle h0 of any anchor.
// The transits are placed as windowSpans places them, but with the right
// ascension interpolated near the transit (a window interpolates it at its
// own instant, up to a day and a half from the transit it uses); the
// spans are widened by candPadDays plus what three days of the right
// ascension's fastest drift move a transit, so that no window with a usable
// part misses them. A forecast solves the light time only for the extrema
// whose window may meet them. It returns the spans and high, its scratch
// space for the star's hours.
func (tb *skyTable) candidates(tr *track, from, to float64, out, high spans) (spans, spans) {
	out, high = out[:0], high[:0]
	h0, rate := 0.0, 0.0 // widest hour angle (hours); fastest drift in RA (hours a day)
	for i, h := range tr.h0 {
		h0 = max(h0, h)
		if i > 0 {
			rate = max(rate, math.Abs(tr.ra[i]-tr.ra[i-1])/tb.ancStep)
		}
	}
	switch {
	case h0 <= 0:
		return out, high
	case h0 >= 12:
		for _, d := range tb.dark[tb.dark.first(from):] {
			if d.a > to {
				break
			}
			out = append(out, d)
		}
		return out, high
	}
	spanLo, spanHi := tb.span.From().JDUTC(), tb.span.To().JDUTC()
	last := len(tr.ra) - 1
	seg := func(t float64) (int, float64) { // anchor segment of t, position in it
		x := max(0, min((t-tb.anc0)/tb.ancStep, float64(last)))
		i := min(int(x), max(last-1, 0))
		return i, x - float64(i)
	}
	// transit returns the transit nearest t (within the table), as
	// windowSpans finds it, with the right ascension interpolated at t.
	transit := func(t float64) float64 {
		i, x := seg(t)
		ra := tr.ra[i]
		if last > 0 {
			ra += x * (tr.ra[i+1] - tr.ra[i])
		}
		return t - wrap12(tb.span.LocalSiderealHours(mustTime(t))-ra)*hourDays
	}
	half := h0*hourDays + candPadDays + 3*rate*hourDays
	// From the transit before the one nearest from to the last that
	// reaches to. Within an anchor segment the right ascension changes
	// linearly, at s hours a day, and the transits follow each other every
	// siderealDay / (1 − s·hourDays); they are found afresh in each segment.
	tt := transit(max(spanLo, min(from, spanHi))) - siderealDay
	i, _ := seg(tt)
	for tt-half < to {
		high = high.add(tt-half, tt+half)
		s := 0.0
		if last > 0 {
			s = (tr.ra[i+1] - tr.ra[i]) / tb.ancStep
		}
		tt += siderealDay / (1 - s*hourDays)
		if j, _ := seg(tt); j != i {
			i = j
			if tt >= spanLo && tt <= spanHi {
				tt = transit(tt)
			}
		}
	}
	return tb.dark.intersect(high, out), high
}
