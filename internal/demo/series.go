package demo

import (
	"fmt"
	"math"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// bestTime returns the instant of the night of date at which the star
// stands highest while the Sun is below the runs' limit, sampled every 20
// minutes, and whether it is observable then.
func (g *generator) bestTime(site observe.Site, v *ephem.StarVec, date time.Time) (frame, bool) {
	noon, err := ephem.FromTime(date.Add(12*time.Hour - time.Duration(site.LonDeg/15*float64(time.Hour))))
	if err != nil {
		return frame{}, false
	}
	var best frame
	found := false
	for k := 0; k < 72; k++ {
		fr := g.frameAt(site, v, noon.AddDays(float64(k)/72))
		if usable(&site, fr) && (!found || fr.altDeg > best.altDeg) {
			best, found = fr, true
		}
	}
	return best, found
}

// nightlySeries records a few frames of the star on one night in three,
// through its seasons of 2021–2024 (a Cepheid followed through its cycle).
func (g *generator) nightlySeries(site observe.Site, s *demoStar) error {
	v := s.star.Vec()
	p := photometry(s.target(), site, g.frames)
	for year := 2021; year <= 2024; year++ {
		from, to := season(s, year, 60)
		for d := from; d.Before(to); d = d.AddDate(0, 0, 3) {
			if g.rng.Float64() < 0.3 {
				continue // cloudy
			}
			fr, ok := g.bestTime(site, &v, d)
			if !ok {
				continue
			}
			n := g.night(site, d)
			zp := g.zp[nightKey(site, d)]
			var ms []logbook.Measurement
			for k := 0; k < 3; k++ {
				f := g.frameAt(site, &v, fr.utc.AddDays(float64(k)*s.cadenceMin/1440))
				if !usable(&site, f) {
					break
				}
				ms = append(ms, g.expose(s, f, zp))
			}
			if len(ms) == 0 {
				continue
			}
			if err := reducePhotometry(p, ms); err != nil {
				return fmt.Errorf("frames of %s: %w", dateKey(d), err)
			}
			n.Measurements = append(n.Measurements, ms...)
			addPlan(n, s.name, "nightly frames through the cycle")
		}
	}
	return nil
}

// visualSeries records a visual estimate of the star about once a week,
// 2019–2026, by the fractional method against its comparison stars
// (reduce.ParseEstimate and VisualEstimate.Magnitude, methods sheet §9),
// and times the maxima it covers from the estimates.
func (g *generator) visualSeries(site observe.Site, s *demoStar) error {
	v := s.star.Vec()
	chart := map[string]float64{}
	for _, c := range s.comps {
		chart[c.ID] = c.V
	}
	var pts []reduce.Point
	var nights []*logbook.DemoNight // the night of each point
	for d := firstNight; d.Before(lastNight); d = d.AddDate(0, 0, 5+g.rng.IntN(6)) {
		if g.rng.Float64() < 0.35 {
			continue
		}
		fr, ok := g.bestTime(site, &v, d)
		if !ok {
			continue
		}
		n := g.night(site, d)
		mTrue := s.shape.magAt(s.truth.phaseAt(fr.bjd))
		seen := mTrue + visualScatter*g.rng.NormFloat64()
		// The bracketing comparison stars, brighter (A) and fainter (B).
		ia := 0
		for ia+2 < len(s.comps) && s.comps[ia+1].V <= seen {
			ia++
		}
		a, b := s.comps[ia], s.comps[ia+1]
		steps := 5
		if g.rng.IntN(2) == 0 {
			steps = 10
		}
		x := int(math.Round((seen - a.V) / (b.V - a.V) * float64(steps)))
		x = min(steps, max(0, x))
		m := logbook.Measurement{Target: s.name, JDUTC: fr.utc.JDUTC(), Filter: "vis", Airmass: fr.airmass, HJD: fr.hjd,
			BJDTDB: fr.bjd, Visual: fmt.Sprintf("%s %d V %d %s", a.ID, x, steps-x, b.ID), ExposureS: math.NaN(),
			InstMag: math.NaN(), InstErr: math.NaN(), MagErr: math.NaN()}
		est, err := reduce.ParseEstimate(m.Visual)
		if err != nil {
			return fmt.Errorf("visual estimate %q: %w", m.Visual, err)
		}
		if m.Mag, _, err = est.Magnitude(chart, 0); err != nil {
			return fmt.Errorf("visual estimate %q: %w", m.Visual, err)
		}
		n.Measurements = append(n.Measurements, m)
		addPlan(n, s.name, "visual estimate")
		pts = append(pts, reduce.Point{T: fr.bjd, Mag: m.Mag, Err: math.NaN()})
		nights = append(nights, n)
	}
	// Time each maximum that has estimates on both sides of it: a parabola
	// (reduce.Extremum) through the estimates within visualHalfDays of the
	// predicted time, kept when the estimates reach visualCoverDays on
	// both sides and the fit is not hopelessly loose.
	first, last := julianDay(firstNight.Date()), julianDay(lastNight.Date())
	for c := math.Ceil((first - s.truth.epoch) / s.truth.periodDays); ; c++ {
		tMax := s.truth.eventTime(c)
		if tMax > last {
			break
		}
		from, to := tMax-visualHalfDays, tMax+visualHalfDays
		var in []int
		for i, p := range pts {
			if p.T >= from && p.T <= to {
				in = append(in, i)
			}
		}
		if len(in) < 8 || pts[in[0]].T > tMax-visualCoverDays || pts[in[len(in)-1]].T < tMax+visualCoverDays {
			continue
		}
		tm, err := reduce.Extremum(pts, reduce.ExtremumOptions{Kind: reduce.Maximum, Method: reduce.MethodPoly,
			From: from, To: to, Degree: 2, Bootstrap: -1})
		if err != nil || tm.Sigma > visualMaxSigmaDays {
			continue
		}
		n := nights[in[len(in)-1]]
		n.Timings = append(n.Timings, logbook.Timing{Target: s.name, JD: tm.Time, Scale: ephem.BJDTDB, SigmaDays: tm.Sigma,
			Kind: observe.Max, Origin: logbook.Own, Method: "poly2 (visual estimates)", Filter: "vis", Observer: n.Night.Observer,
			Notes: fmt.Sprintf("%s: fitted to the visual estimates within %d days of the maximum.", demoNote, visualHalfDays)})
	}
	return nil
}

// The demo's visual observing: the scatter of one estimate (common
// practice: 0.1–0.2 mag, methods sheet §15), and how a maximum is timed
// from the estimates: within ±visualHalfDays of the predicted time, when
// they reach visualCoverDays on both sides, kept when σ ≤ visualMaxSigmaDays.
const (
	visualScatter      = 0.12 // mag
	visualHalfDays     = 45   // days
	visualCoverDays    = 20   // days
	visualMaxSigmaDays = 10   // days
)

// publishedTimings invents the star's published timings: true extremum
// times with noise of the stated uncertainty, on the HJD scale as older
// publications give them.
func (g *generator) publishedTimings(s *demoStar) ([]logbook.Timing, error) {
	ps := s.published
	var out []logbook.Timing
	if ps.n == 0 {
		return nil, nil
	}
	// A site on the equator at Greenwich stands for the geocentre (the
	// topocentric part of HJD is under 0.03 s).
	geo := ephem.Site{Name: "geocentre"}
	jd0 := julianDay(ps.fromYear, 1, 1)
	span := julianDay(ps.toYear+1, 1, 1) - jd0
	for k := 0; k < ps.n; k++ {
		jd := jd0 + span*(float64(k)+g.rng.Float64())/float64(ps.n)
		cycle := math.Round((jd - s.truth.epoch) / s.truth.periodDays)
		secondary := ps.secondaryEvery > 0 && k%ps.secondaryEvery == ps.secondaryEvery-1
		if secondary {
			cycle += 0.5
		}
		sigma := ps.sigmaDays[0] + (ps.sigmaDays[1]-ps.sigmaDays[0])*g.rng.Float64()
		sigma = roundTo(sigma, 5)
		bjd := s.truth.eventTime(cycle) + sigma*g.rng.NormFloat64()
		t, err := ephem.SeenAt(ephem.BJDTDB, bjd, s.star, geo)
		if err != nil {
			return nil, err
		}
		hjd := ephem.HJDOf(t, s.star, geo)
		method := ""
		if s.class == observe.Eclipsing {
			method = "kvw"
		}
		out = append(out, logbook.Timing{Target: s.name, JD: roundTo(hjd, 5), Scale: ephem.HJD, SigmaDays: sigma,
			Kind: s.kind, Secondary: secondary, Origin: logbook.Published, Method: method, Source: ps.sources[k%len(ps.sources)],
			Notes: demoNote + ": an invented published timing."})
	}
	return out, nil
}

// julianDay returns the Julian day of 0h UTC of a Gregorian date.
func julianDay(year int, month time.Month, day int) float64 {
	return ephem.CalendarToJD(year, int(month), float64(day))
}
