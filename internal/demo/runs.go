package demo

import (
	"fmt"
	"math"
	"math/rand/v2"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// generator holds the state of one generation.
type generator struct {
	rng    *rand.Rand
	frames *ephem.Frames
	nights map[string]*logbook.DemoNight
	zp     map[string]float64 // nightly zero point
}

// nightDate returns the civil date on which the night holding instant t
// begins at a site of longitude lonDeg: the nights run from local mean noon
// to local mean noon (as ephem.NightOf).
func nightDate(t time.Time, lonDeg float64) time.Time {
	local := t.Add(time.Duration(lonDeg / 15 * float64(time.Hour))).Add(-12 * time.Hour)
	return civilDate(local)
}

// civilDate returns 0h UTC of t's year, month and day, as logbook.Night.Date
// holds a date.
func civilDate(t time.Time) time.Time {
	y, m, d := t.Date()
	return time.Date(y, m, d, 0, 0, 0, 0, time.UTC)
}

// nightKey names the night of date at the site.
func nightKey(site observe.Site, date time.Time) string {
	return site.Name + " " + date.Format("2006-01-02")
}

// night returns the demo night of date at the site, making it when new.
func (g *generator) night(site observe.Site, date time.Time) *logbook.DemoNight {
	key := nightKey(site, date)
	if n, ok := g.nights[key]; ok {
		return n
	}
	observer, kit := demoObserver, demoEquipment
	if site.Name == demoSchoolName {
		observer, kit = demoSchoolObs, demoSchoolKit
	}
	skies := []string{"clear, steady seeing", "clear, some haze low down", "mostly clear, thin cirrus at times",
		"clear, breezy, seeing fair", "clear and dark, dew later"}
	n := &logbook.DemoNight{Night: logbook.Night{Site: site.Name, Date: date, Observer: observer, Equipment: kit,
		Conditions: skies[g.rng.IntN(len(skies))], Notes: demoNote + ": an invented night of the demo logbook."}}
	g.nights[key] = n
	g.zp[key] = zeroPoint + 0.3*(g.rng.Float64()-0.5)
	return n
}

// season returns the span around the star's opposition in year: when the
// Sun's right ascension is the star's plus 12 h (the Sun moves about 24 h
// of right ascension a year from the March equinox, day 80).
func season(s *demoStar, year int, halfDays int) (from, to time.Time) {
	oppDay := 80 + math.Mod(s.star.RAHours+12, 24)/24*365.25
	mid := time.Date(year, 1, 1, 0, 0, 0, 0, time.UTC).Add(time.Duration(oppDay * 24 * float64(time.Hour)))
	from, to = mid.AddDate(0, 0, -halfDays), mid.AddDate(0, 0, halfDays)
	if from.Before(firstNight) {
		from = firstNight
	}
	if to.After(lastNight) {
		to = lastNight
	}
	return from, to
}

// runs schedules perSeason light-curve runs of the star from the site in
// each year's season, spread through it: for each, the extremum nearest the
// chosen date whose whole run can be watched (usableRun), some lost to
// cloud. Each run is recorded with its timing.
func (g *generator) runs(site observe.Site, s *demoStar, perSeason, fromYear, toYear int) error {
	if perSeason == 0 {
		return nil
	}
	v := s.star.Vec()
	step := 1.0
	if s.second {
		step = 0.5
	}
	for year := fromYear; year <= toYear; year++ {
		from, to := season(s, year, 100)
		if !from.Before(to) {
			continue
		}
		jdFrom, jdTo := julianDay(from.Date()), julianDay(to.Date())
		for k := 0; k < perSeason; k++ {
			if g.rng.Float64() < 0.2 {
				continue // clouded out
			}
			want := jdFrom + (jdTo-jdFrom)*(float64(k)+0.3+0.4*g.rng.Float64())/float64(perSeason)
			c0 := math.Round((want-s.truth.epoch)/s.truth.periodDays/step) * step
			// The extrema nearest the wanted date, alternately after and
			// before it, up to 40 days away.
			for i := 0; ; i++ {
				c := c0 + step*float64((i+1)/2)
				if i%2 == 1 {
					c = c0 - step*float64((i+1)/2)
				}
				if math.Abs(c-c0)*s.truth.periodDays > 40 {
					break
				}
				bjd := s.truth.eventTime(c)
				if bjd < jdFrom || bjd > jdTo {
					continue
				}
				t, err := ephem.SeenAt(ephem.BJDTDB, bjd, s.star, site.Site)
				if err != nil {
					return err
				}
				if g.usableRun(site, &v, t, s.runHalfDays) {
					if err := g.run(site, s, c, t); err != nil {
						return err
					}
					break
				}
			}
		}
	}
	return nil
}

// usableRun reports whether a run of ±halfDays about t can be watched
// whole: the star above the site's lowest altitude and horizon and the Sun
// below the runs' limit all through it (checked every 10 minutes), and the
// Moon, when up, at least 15° from the star (methods sheet §15).
func (g *generator) usableRun(site observe.Site, v *ephem.StarVec, t ephem.Time, halfDays float64) bool {
	const stepDays = 10.0 / 1440
	n := int(math.Ceil(2 * halfDays / stepDays))
	for k := 0; k <= n; k++ {
		u := t.AddDays(-halfDays + 2*halfDays*float64(k)/float64(n))
		sky := g.frames.For(u).Sky(site.Site, u)
		pos := sky.Star(v)
		if pos.AltDeg < site.LowestAltDeg(pos.AzDeg) || sky.Sun().AltDeg >= sunLimitDeg {
			return false
		}
	}
	sky := g.frames.For(t).Sky(site.Site, t)
	return sky.Moon().AltDeg < 0 || sky.MoonSeparationDeg(v) >= 15
}

// frame is one simulated exposure.
type frame struct {
	utc           ephem.Time
	hjd, bjd      float64
	airmass       float64
	altDeg, azDeg float64
	sunAltDeg     float64
}

// frameAt computes where the star stands at t and its time on both scales
// (the hidden light curve is a function of BJD_TDB; a photometric frame's
// stored times come from its reduction, reduce.Photometry, which computes
// them the same way).
func (g *generator) frameAt(site observe.Site, v *ephem.StarVec, t ephem.Time) frame {
	f := g.frames.For(t)
	sky := f.Sky(site.Site, t)
	pos := sky.Star(v)
	x, ok := ephem.Airmass(ephem.RefractedAltDeg(pos.AltDeg))
	if !ok {
		x = math.NaN()
	}
	return frame{utc: t, hjd: sky.HJD(v), bjd: sky.BJDTDB(v), airmass: x, altDeg: pos.AltDeg, azDeg: pos.AzDeg,
		sunAltDeg: sky.Sun().AltDeg}
}

// usable reports whether the frame can be taken: the star above the site's
// lowest altitude and horizon, the Sun below the runs' limit.
func usable(site *observe.Site, fr frame) bool {
	return fr.altDeg >= site.LowestAltDeg(fr.azDeg) && fr.sunAltDeg < sunLimitDeg && !math.IsNaN(fr.airmass)
}

// expose simulates one CCD frame of the star at fr: the raw instrumental
// magnitudes of the target, comparison and check stars (true magnitude +
// the night's zero point + extinction + the frame's transparency + noise),
// with their errors to 4 decimals as photometry software prints them. The
// reduced magnitude and the times are left for reducePhotometry.
func (g *generator) expose(s *demoStar, fr frame, zp float64) logbook.Measurement {
	mTrue := s.shape.magAt(s.truth.phaseAt(fr.bjd))
	common := zp + extinction*fr.airmass + transparency*g.rng.NormFloat64()
	raw := func(mag float64) (inst, sigma float64) {
		sigma = photNoise(mag)
		return mag + common + sigma*g.rng.NormFloat64(), roundTo(sigma, 4)
	}
	m := logbook.Measurement{Target: s.name, JDUTC: fr.utc.JDUTC(), ExposureS: s.exposureS, Filter: "V", Airmass: fr.airmass}
	m.InstMag, m.InstErr = raw(mTrue)
	for _, c := range s.comps {
		in, sg := raw(c.V)
		m.Comps = append(m.Comps, logbook.RawMag{Label: c.ID, InstMag: in, InstErr: sg})
	}
	for _, c := range s.checks {
		in, sg := raw(c.V)
		m.Checks = append(m.Checks, logbook.RawMag{Label: c.ID, InstMag: in, InstErr: sg})
	}
	return m
}

// photometry returns the set-up that reduces the target's frames taken at
// site: its comparison stars with their catalogue V, its first check star,
// the filter V, and the site for topocentric HJD and BJD_TDB (frames is the
// cache of ephem frames to share; nil for none).
func photometry(t observe.Target, site observe.Site, frames *ephem.Frames) *reduce.Photometry {
	p := &reduce.Photometry{Star: t.Star, Site: &site.Site, Filter: "V", Frames: frames}
	for _, c := range t.Comps {
		p.Comps = append(p.Comps, reduce.Comp{ID: c.ID, Mag: c.V})
	}
	if len(t.Checks) > 0 {
		p.Check = &reduce.Comp{ID: t.Checks[0].ID, Mag: t.Checks[0].V}
	}
	return p
}

// exposure returns the raw instrumental magnitudes of a measurement as p
// reduces them: the comparison stars in the order of p.Comps (one not
// measured is missing), the check star of p.Check.
func exposure(m logbook.Measurement, p *reduce.Photometry) reduce.Exposure {
	ex := reduce.NewExposure(m.JDUTC, len(p.Comps))
	ex.Filter = m.Filter
	ex.Target = reduce.Inst{Mag: m.InstMag, Err: m.InstErr, Airmass: m.Airmass}
	for j, c := range p.Comps {
		for _, r := range m.Comps {
			if r.Label == c.ID {
				ex.Comps[j] = reduce.Inst{Mag: r.InstMag, Err: r.InstErr, Airmass: m.Airmass}
			}
		}
	}
	if p.Check != nil {
		for _, r := range m.Checks {
			if r.Label == p.Check.ID {
				ex.Check = reduce.Inst{Mag: r.InstMag, Err: r.InstErr, Airmass: m.Airmass}
			}
		}
	}
	return ex
}

// reducePhotometry reduces the frames of one target taken together with p
// (reduce.Photometry.Reduce: the weighted ensemble of the comparison
// stars, Honeycutt 1992, methods sheet §8) and stores each frame's
// magnitude, error, HJD and BJD_TDB in it. Every frame must come out
// reduced with every comparison star: the demo's catalogue is its truth, so
// a frame skipped or a star left out is a fault of the generator.
func reducePhotometry(p *reduce.Photometry, ms []logbook.Measurement) error {
	exps := make([]reduce.Exposure, len(ms))
	for i, m := range ms {
		exps[i] = exposure(m, p)
	}
	red, err := p.Reduce(exps)
	if err != nil {
		return err
	}
	if len(red.Rejected) > 0 || len(red.Skipped) > 0 || len(red.Rows) != len(ms) {
		return fmt.Errorf("reducing %d frames: %d reduced, %d skipped, %d comparison stars left out", len(ms), len(red.Rows),
			len(red.Skipped), len(red.Rejected))
	}
	for _, r := range red.Rows {
		m := &ms[r.Index]
		m.Mag, m.MagErr, m.HJD, m.BJDTDB = r.Mag, r.Err, r.HJD, r.BJDTDB
	}
	return nil
}

// run records one light-curve run around the extremum of cycle c, seen at
// the site at instant at, and times the extremum from it.
func (g *generator) run(site observe.Site, s *demoStar, c float64, at ephem.Time) error {
	v := s.star.Vec()
	secondary := c != math.Floor(c)
	date := nightDate(at.Time(), site.LonDeg)
	n := g.night(site, date)
	zp := g.zp[nightKey(site, date)]
	step := s.cadenceMin / 1440
	start := at.AddDays(-s.runHalfDays)
	var ms []logbook.Measurement
	for k := 0; ; k++ {
		jitter := (g.rng.Float64() - 0.5) * 20.0 / 86400
		t := start.AddDays(float64(k)*step + jitter)
		if t.Sub(at) > s.runHalfDays {
			break
		}
		fr := g.frameAt(site, &v, t)
		if !usable(&site, fr) {
			continue
		}
		ms = append(ms, g.expose(s, fr, zp))
	}
	what := "maximum"
	if s.kind == observe.Min {
		what = "minimum"
		if secondary {
			what = "secondary minimum"
		}
	}
	addPlan(n, s.name, fmt.Sprintf("light curve around the predicted %s at %s UT", what, at.Time().Format("15:04")))
	if len(ms) == 0 {
		return nil
	}
	if err := reducePhotometry(photometry(s.target(), site, g.frames), ms); err != nil {
		return fmt.Errorf("run of %s: %w", dateKey(date), err)
	}
	n.Measurements = append(n.Measurements, ms...)
	tm, err := reduce.Extremum(lightCurve(ms), s.timingOptions())
	if err != nil {
		return nil // a run too short or lopsided to time: the light curve stays, without a timing
	}
	n.Timings = append(n.Timings, logbook.Timing{Target: s.name, JD: tm.Time, Scale: ephem.BJDTDB, SigmaDays: tm.Sigma,
		Kind: s.kind, Secondary: secondary, Origin: logbook.Own, Method: methodLabel(tm), Filter: "V",
		Observer: n.Night.Observer, Notes: demoNote + ": fitted to this night's light curve."})
	return nil
}

// dateKey writes a night's date as the logbook does, YYYY-MM-DD.
func dateKey(d time.Time) string { return d.Format("2006-01-02") }

// lightCurve returns the reduced magnitudes of the measurements against
// BJD_TDB, with their errors.
func lightCurve(ms []logbook.Measurement) []reduce.Point {
	pts := make([]reduce.Point, len(ms))
	for i, m := range ms {
		pts[i] = reduce.Point{T: m.BJDTDB, Mag: m.Mag, Err: m.MagErr}
	}
	return pts
}

// timingOptions says how the demo observer times the star's extrema from a
// night's light curve: reduce.Extremum in a window of fixed width about the
// extremum, by Kwee & van Woerden for eclipses and by a polynomial of fixed
// degree for pulsators, with the method's own error (no bootstrap: the demo
// is made on the first run and must be quick).
func (d *demoStar) timingOptions() reduce.ExtremumOptions {
	opt := reduce.ExtremumOptions{Kind: reduce.Maximum, Method: reduce.MethodPoly, WindowDays: 2 * d.fitHalfDays,
		Bootstrap: -1}
	if d.kind == observe.Min {
		opt.Kind = reduce.Minimum
	}
	if d.fitMethod != "" {
		opt.Method = d.fitMethod
	}
	if opt.Method == reduce.MethodPoly {
		opt.Degree = d.fitDegree
	}
	return opt
}

// methodLabel names the method of a timing as the logbook records it:
// "kvw", or "poly" with the degree.
func methodLabel(tm reduce.Timing) string {
	if tm.Method == reduce.MethodPoly {
		return fmt.Sprintf("poly%d", tm.Degree)
	}
	return string(tm.Method)
}

func addPlan(n *logbook.DemoNight, target, note string) {
	for _, p := range n.Plan {
		if p.Target == target {
			return
		}
	}
	n.Plan = append(n.Plan, logbook.PlanItem{Target: target, Note: note})
}
