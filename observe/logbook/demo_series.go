package logbook

import (
	"fmt"
	"math"
	"time"
	"vigil/ephem"
	"vigil/observe"
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
			zp := g.zp[site.Name+" "+dateKey(d)]
			for k := 0; k < 3; k++ {
				f := g.frameAt(site, &v, fr.utc.AddDays(float64(k)*s.cadenceMin/1440))
				if !usable(&site, f) {
					break
				}
				m, _ := g.expose(s, f, zp)
				n.meas = append(n.meas, m)
			}
			addPlan(n, s.name, "nightly frames through the cycle")
		}
	}
	return nil
}

// visualSeries records a visual estimate of the star about once a week,
// 2019–2026, by the fractional method against its comparison stars, and
// times the maxima it covers from the estimates.
func (g *generator) visualSeries(site observe.Site, s *demoStar) error {
	v := s.star.Vec()
	var ts, ms []float64
	type est struct {
		bjd, mag float64
		n        *demoNight
	}
	var all []est
	for d := demoFirstNight; d.Before(demoLastNight); d = d.AddDate(0, 0, 5+g.rng.IntN(6)) {
		if g.rng.Float64() < 0.35 {
			continue
		}
		fr, ok := g.bestTime(site, &v, d)
		if !ok {
			continue
		}
		n := g.night(site, d)
		mTrue := s.shape.magAt(s.truth.phaseAt(fr.bjd))
		seen := mTrue + 0.12*g.rng.NormFloat64() // a visual estimate's scatter (methods sheet §15)
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
		m := Measurement{Target: s.name, JDUTC: fr.utc.JDUTC(), Filter: "vis", Airmass: fr.airmass, HJD: fr.hjd, BJDTDB: fr.bjd,
			Visual: fmt.Sprintf("%s %d V %d %s", a.ID, x, steps-x, b.ID), ExposureS: math.NaN(), InstMag: math.NaN(),
			InstErr: math.NaN(), MagErr: math.NaN()}
		m.Mag = fractionalEstimate(a.V, x, steps-x, b.V)
		n.meas = append(n.meas, m)
		addPlan(n, s.name, "visual estimate")
		all = append(all, est{fr.bjd, m.Mag, n})
	}
	// Time each maximum that has estimates on both sides of it.
	first, last := julianDay(demoFirstNight.Date()), julianDay(demoLastNight.Date())
	for c := math.Ceil((first - s.truth.epoch) / s.truth.periodDays); ; c++ {
		tMax := s.truth.eventTime(c)
		if tMax > last {
			break
		}
		ts, ms = ts[:0], ms[:0]
		var last *demoNight
		for _, e := range all {
			if math.Abs(e.bjd-tMax) <= 45 {
				ts, ms, last = append(ts, e.bjd), append(ms, e.mag), e.n
			}
		}
		if len(ts) < 8 || ts[0] > tMax-20 || ts[len(ts)-1] < tMax+20 {
			continue
		}
		tExt, sigma, err := polyExtremum(ts, ms, 2, true)
		if err != nil || sigma > 10 {
			continue
		}
		last.timings = append(last.timings, Timing{Target: s.name, JD: tExt, Scale: ephem.BJDTDB, SigmaDays: sigma,
			Kind: observe.Max, Origin: Own, Method: "poly2 (visual estimates)", Filter: "vis", Observer: last.night.Observer,
			Notes: demoNote + ": fitted to the visual estimates within 45 days of the maximum."})
	}
	return nil
}

// publishedTimings invents the star's published timings: true extremum
// times with noise of the stated uncertainty, on the HJD scale as older
// publications give them.
func (g *generator) publishedTimings(s *demoStar) ([]Timing, error) {
	ps := s.published
	var out []Timing
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
		out = append(out, Timing{Target: s.name, JD: roundTo(hjd, 5), Scale: ephem.HJD, SigmaDays: sigma,
			Kind: s.kind, Secondary: secondary, Origin: Published, Method: method, Source: ps.sources[k%len(ps.sources)],
			Notes: demoNote + ": an invented published timing."})
	}
	return out, nil
}

// julianDay returns the Julian day of 0h UTC of a Gregorian date.
func julianDay(year int, month time.Month, day int) float64 {
	return ephem.CalendarToJD(year, int(month), float64(day))
}
