package logbook

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"sort"
	"time"
	"vigil/ephem"
	"vigil/observe"
)

// generator holds the state of one generation.
type generator struct {
	rng    *rand.Rand
	frames *ephem.Frames
	nights map[string]*demoNight
	zp     map[string]float64 // nightly zero point
}

// generateDemo builds the demo scenario from seed.
func generateDemo(seed uint64) (*demoData, error) {
	sites, err := demoSites()
	if err != nil {
		return nil, err
	}
	g := &generator{rng: rand.New(rand.NewPCG(seed, 0x5647_4c42)), frames: ephem.NewFrames(),
		nights: map[string]*demoNight{}, zp: map[string]float64{}}
	d := &demoData{sites: sites, stars: demoStars()}
	for i := range d.stars {
		s := &d.stars[i]
		if err := g.runs(sites[0], s, s.runsPerSeason, 2019, 2026); err != nil {
			return nil, fmt.Errorf("%s: %w", s.name, err)
		}
		// The school's runs, spread over its years.
		for k := 0; k < s.schoolRuns; k++ {
			year := 2023 + k*4/s.schoolRuns
			if err := g.runs(sites[1], s, 1, year, year); err != nil {
				return nil, fmt.Errorf("%s: %w", s.name, err)
			}
		}
	}
	for i := range d.stars {
		s := &d.stars[i]
		var err error
		switch {
		case s.visual:
			err = g.visualSeries(sites[0], s)
		case s.nightly:
			err = g.nightlySeries(sites[0], s)
		}
		if err != nil {
			return nil, fmt.Errorf("%s: %w", s.name, err)
		}
		pub, err := g.publishedTimings(s)
		if err != nil {
			return nil, fmt.Errorf("%s: %w", s.name, err)
		}
		d.published = append(d.published, pub...)
	}
	keys := make([]string, 0, len(g.nights))
	for k := range g.nights {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		n := g.nights[k]
		sort.SliceStable(n.meas, func(i, j int) bool { return n.meas[i].JDUTC < n.meas[j].JDUTC })
		d.nights = append(d.nights, n)
	}
	sort.Slice(d.nights, func(i, j int) bool {
		a, b := d.nights[i].night, d.nights[j].night
		if !a.Date.Equal(b.Date) {
			return a.Date.Before(b.Date)
		}
		return a.Site < b.Site
	})
	return d, nil
}

// nightDate returns the civil date on which the night holding instant t
// begins at a site of longitude lonDeg: the nights run from local mean noon
// to local mean noon (as ephem.NightOf).
func nightDate(t time.Time, lonDeg float64) time.Time {
	local := t.Add(time.Duration(lonDeg / 15 * float64(time.Hour))).Add(-12 * time.Hour)
	return civilDate(local)
}

// night returns the demo night of date at the site, making it when new.
func (g *generator) night(site observe.Site, date time.Time) *demoNight {
	key := site.Name + " " + dateKey(date)
	if n, ok := g.nights[key]; ok {
		return n
	}
	observer, kit := demoObserver, demoEquipment
	if site.Name == demoSchoolName {
		observer, kit = demoSchoolObs, demoSchoolKit
	}
	skies := []string{"clear, steady seeing", "clear, some haze low down", "mostly clear, thin cirrus at times",
		"clear, breezy, seeing fair", "clear and dark, dew later"}
	n := &demoNight{night: Night{Site: site.Name, Date: date, Observer: observer, Equipment: kit,
		Conditions: skies[g.rng.IntN(len(skies))], Notes: demoNote + ": an invented night of the demo logbook."}}
	g.nights[key] = n
	g.zp[key] = demoZeroPoint + 0.3*(g.rng.Float64()-0.5)
	return n
}

// season returns the span around the star's opposition in year: when the
// Sun's right ascension is the star's plus 12 h (the Sun moves about 24 h
// of right ascension a year from the March equinox, day 80).
func season(s *demoStar, year int, halfDays int) (from, to time.Time) {
	oppDay := 80 + math.Mod(s.star.RAHours+12, 24)/24*365.25
	mid := time.Date(year, 1, 1, 0, 0, 0, 0, time.UTC).Add(time.Duration(oppDay * 24 * float64(time.Hour)))
	from, to = mid.AddDate(0, 0, -halfDays), mid.AddDate(0, 0, halfDays)
	if from.Before(demoFirstNight) {
		from = demoFirstNight
	}
	if to.After(demoLastNight) {
		to = demoLastNight
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
		if pos.AltDeg < site.LowestAltDeg(pos.AzDeg) || sky.Sun().AltDeg >= demoSunAltDeg {
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

// frameAt computes where the star stands at t and its time on both scales.
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
	return fr.altDeg >= site.LowestAltDeg(fr.azDeg) && fr.sunAltDeg < demoSunAltDeg && !math.IsNaN(fr.airmass)
}

// expose simulates one CCD frame of the star at fr and reduces it: the raw
// instrumental magnitudes of the target, comparison and check stars (true
// magnitude + zero point + extinction + the frame's transparency + noise),
// and the ensemble magnitude.
func (g *generator) expose(s *demoStar, fr frame, zp float64) (Measurement, float64) {
	mTrue := s.shape.magAt(s.truth.phaseAt(fr.bjd))
	common := zp + demoExtinction*fr.airmass + demoTransparent*g.rng.NormFloat64()
	raw := func(mag float64) (inst, sigma float64) {
		sigma = photNoise(mag)
		return mag + common + sigma*g.rng.NormFloat64(), sigma
	}
	m := Measurement{Target: s.name, JDUTC: fr.utc.JDUTC(), ExposureS: s.exposureS, Filter: "V", Airmass: fr.airmass,
		HJD: fr.hjd, BJDTDB: fr.bjd, Visual: ""}
	m.InstMag, m.InstErr = raw(mTrue)
	cat := make([]float64, len(s.comps))
	inst := make([]float64, len(s.comps))
	sig := make([]float64, len(s.comps))
	for i, c := range s.comps {
		inst[i], sig[i] = raw(c.V)
		cat[i] = c.V
		m.Comps = append(m.Comps, RawMag{Label: c.ID, InstMag: inst[i], InstErr: roundErr(sig[i])})
	}
	for _, c := range s.checks {
		in, sg := raw(c.V)
		m.Checks = append(m.Checks, RawMag{Label: c.ID, InstMag: in, InstErr: roundErr(sg)})
	}
	m.InstErr = roundErr(m.InstErr)
	v, sz, _ := ensemble(m.InstMag, cat, inst, errsOf(m.Comps))
	m.Mag, m.MagErr = v, math.Hypot(m.InstErr, sz)
	return m, mTrue
}

// roundErr keeps an error to 4 decimals, as photometry software prints it.
func roundErr(e float64) float64 { return roundTo(e, 4) }

func errsOf(ms []RawMag) []float64 {
	out := make([]float64, len(ms))
	for i, m := range ms {
		out[i] = m.InstErr
	}
	return out
}

// run records one light-curve run around the extremum of cycle c, seen at
// the site at instant at, and times the extremum from it.
func (g *generator) run(site observe.Site, s *demoStar, c float64, at ephem.Time) error {
	v := s.star.Vec()
	secondary := c != math.Floor(c)
	date := nightDate(at.Time(), site.LonDeg)
	n := g.night(site, date)
	zp := g.zp[site.Name+" "+dateKey(date)]
	step := s.cadenceMin / 1440
	start := at.AddDays(-s.runHalfDays)
	var ts, ms []float64
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
		m, _ := g.expose(s, fr, zp)
		n.meas = append(n.meas, m)
		ts, ms = append(ts, m.BJDTDB), append(ms, m.Mag)
	}
	what := "maximum"
	if s.kind == observe.Min {
		what = "minimum"
		if secondary {
			what = "secondary minimum"
		}
	}
	addPlan(n, s.name, fmt.Sprintf("light curve around the predicted %s at %s UT", what, at.Time().Format("15:04")))
	tExt, sigma, err := timeExtremum(ts, ms, s.fitHalfDays, s.fitDegree, s.kind == observe.Max)
	if err != nil {
		return nil // a run too short to time: the light curve stays, without a timing
	}
	n.timings = append(n.timings, Timing{Target: s.name, JD: tExt, Scale: ephem.BJDTDB, SigmaDays: sigma, Kind: s.kind,
		Secondary: secondary, Origin: Own, Method: fmt.Sprintf("poly%d", s.fitDegree), Filter: "V",
		Observer: n.night.Observer, Notes: demoNote + ": fitted to this night's light curve."})
	return nil
}

func addPlan(n *demoNight, target, note string) {
	for _, p := range n.plan {
		if p.Target == target {
			return
		}
	}
	n.plan = append(n.plan, PlanItem{Target: target, Note: note})
}

// timeExtremum times the extremum of a light curve as an observer would:
// it finds the extreme of a five-point running mean, keeps the points
// within halfDays of it and fits a polynomial (polyExtremum).
func timeExtremum(ts, ms []float64, halfDays float64, degree int, maxLight bool) (tExt, sigma float64, err error) {
	if len(ts) < 5 {
		return math.NaN(), math.NaN(), errors.New("too few points")
	}
	best := -1
	bestV := 0.0
	for i := 2; i < len(ts)-2; i++ {
		v := (ms[i-2] + ms[i-1] + ms[i] + ms[i+1] + ms[i+2]) / 5
		if maxLight {
			v = -v
		}
		if best < 0 || v > bestV {
			best, bestV = i, v
		}
	}
	var wt, wm []float64
	for i := range ts {
		if math.Abs(ts[i]-ts[best]) <= halfDays {
			wt, wm = append(wt, ts[i]), append(wm, ms[i])
		}
	}
	if len(wt) < 3*(degree+1) {
		return math.NaN(), math.NaN(), errors.New("too few points about the extremum")
	}
	return polyExtremum(wt, wm, degree, maxLight)
}
