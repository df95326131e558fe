package logbook

import (
	"fmt"
	"math"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"vigil/ephem"
	"vigil/observe"
)

// demoTruth returns the hidden truth behind each demo star, by name.
func demoTruth() map[string]*demoStar {
	out := map[string]*demoStar{}
	stars := demoStars()
	for i := range stars {
		out[stars[i].name] = &stars[i]
	}
	return out
}

// TestDemoLabels checks that every demo record says it is a demo, and that
// the logbook is flagged as one.
func TestDemoLabels(t *testing.T) {
	lb := openT(t, sharedDemo(t))
	if demo, err := lb.IsDemo(); err != nil || !demo {
		t.Errorf("IsDemo: got %v, %v; want true", demo, err)
	}
	sites, err := lb.Sites()
	if err != nil {
		t.Fatal(err)
	}
	if len(sites) != 2 {
		t.Errorf("got %d demo sites, want 2", len(sites))
	}
	for _, s := range sites {
		if !strings.HasSuffix(s.Name, "(demo)") {
			t.Errorf("site %q: the name does not say demo", s.Name)
		}
	}
	targets, err := lb.Targets()
	if err != nil {
		t.Fatal(err)
	}
	if len(targets) != 8 {
		t.Errorf("got %d demo targets, want 8", len(targets))
	}
	for i, tg := range targets {
		if want := fmt.Sprintf("Ashgrove V%d", i+1); tg.Name != want {
			t.Errorf("target %d: got %q, want %q", i, tg.Name, want)
		}
		if !strings.HasPrefix(tg.Notes, demoNote) {
			t.Errorf("target %q: notes %q do not start with %q", tg.Name, tg.Notes, demoNote)
		}
		if len(tg.Comps) < 2 {
			t.Errorf("target %q: %d comparison stars, want at least 2", tg.Name, len(tg.Comps))
		}
		for _, c := range append(append([]observe.Comp{}, tg.Comps...), tg.Checks...) {
			if math.IsNaN(c.BV) {
				t.Errorf("target %q: comparison %q has no B−V", tg.Name, c.ID)
			}
		}
		timings, err := lb.TimingsOf(tg.Name)
		if err != nil {
			t.Fatal(err)
		}
		for _, tm := range timings {
			if !strings.HasPrefix(tm.Notes, demoNote) {
				t.Errorf("timing %d of %q: notes %q do not say demo", tm.ID, tg.Name, tm.Notes)
			}
			if tm.Origin == Published && !strings.Contains(tm.Source, "[demo, invented]") {
				t.Errorf("published timing %d of %q: source %q does not say it is invented", tm.ID, tg.Name, tm.Source)
			}
		}
		hist, err := lb.EphemerisHistory(tg.Name)
		if err != nil {
			t.Fatal(err)
		}
		for _, h := range hist {
			if !strings.Contains(h.Source, "invented") {
				t.Errorf("ephemeris of %q adopted %v: source %q does not say it is invented", tg.Name, h.Adopted, h.Source)
			}
		}
	}
	nights, err := lb.Nights("")
	if err != nil {
		t.Fatal(err)
	}
	for _, n := range nights {
		if !strings.HasPrefix(n.Notes, demoNote) || !strings.HasPrefix(n.Observer, "Demo") || !strings.HasPrefix(n.Equipment, "Demo kit") {
			t.Errorf("night %s at %q: %q / %q / %q do not say demo", dateKey(n.Date), n.Site, n.Notes, n.Observer, n.Equipment)
		}
	}
	for _, bt := range []string{"sites", "targets", "nights"} {
		var n int
		if err := lb.db.QueryRow("SELECT count(*) FROM " + bt + " WHERE demo = 0").Scan(&n); err != nil || n != 0 {
			t.Errorf("%s: %d rows not flagged demo (%v)", bt, n, err)
		}
	}
}

// TestDemoContent checks the size and shape of the scenario: the sites as
// the brief fixes them, several years of nights, light curves, visual
// estimates, own and published timings, the ephemeris histories.
func TestDemoContent(t *testing.T) {
	lb := openT(t, sharedDemo(t))
	ash, err := lb.Site(demoSiteName)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		what      string
		got, want float64
	}{{"latitude", ash.LatDeg, 52.1172}, {"longitude (east positive: west of Greenwich)", ash.LonDeg, -1.4538},
		{"elevation", ash.ElevM, 140}, {"lowest altitude", ash.MinAltDeg, 20}} {
		if c.got != c.want {
			t.Errorf("Ashgrove Hill %s: got %v, want %v", c.what, c.got, c.want)
		}
	}
	if ash.TimeZone != "Europe/London" || ash.Location().String() != "Europe/London" {
		t.Errorf("Ashgrove Hill time zone: got %q", ash.TimeZone)
	}
	if ne, s := ash.Horizon.AltDeg(45), ash.Horizon.AltDeg(180); ne < 30 || s < 20 || ash.Horizon.AltDeg(270) > 10 {
		t.Errorf("Ashgrove Hill horizon: north-east %v°, south %v°, west %v°: want trees NE, a roof S, open W", ne, s, ash.Horizon.AltDeg(270))
	}
	school, err := lb.Site(demoSchoolName)
	if err != nil {
		t.Fatal(err)
	}
	if school.LatDeg >= 0 {
		t.Errorf("the school site is at latitude %v: want the southern hemisphere", school.LatDeg)
	}
	nights, err := lb.Nights("")
	if err != nil {
		t.Fatal(err)
	}
	years := map[int]bool{}
	for _, n := range nights {
		years[n.Date.Year()] = true
	}
	for y := 2019; y <= 2026; y++ {
		if !years[y] {
			t.Errorf("no demo night in %d", y)
		}
	}
	var n struct{ meas, visual, own, pub, lcNights int }
	lb.db.QueryRow("SELECT count(*) FROM measurements").Scan(&n.meas)
	lb.db.QueryRow("SELECT count(*) FROM measurements WHERE visual <> ''").Scan(&n.visual)
	lb.db.QueryRow("SELECT count(*) FROM timings WHERE origin = 'own'").Scan(&n.own)
	lb.db.QueryRow("SELECT count(*) FROM timings WHERE origin = 'published'").Scan(&n.pub)
	lb.db.QueryRow("SELECT count(*) FROM (SELECT night_id FROM measurements GROUP BY night_id, target_id HAVING count(*) >= 30)").Scan(&n.lcNights)
	for _, c := range []struct {
		what     string
		got, min int
	}{{"measurements", n.meas, 2000}, {"visual estimates", n.visual, 100}, {"own timings", n.own, 40},
		{"published timings", n.pub, 40}, {"full light curves (30+ points a night)", n.lcNights, 10}} {
		if c.got < c.min {
			t.Errorf("%s: got %d, want at least %d", c.what, c.got, c.min)
		}
	}
	for _, name := range []string{"Ashgrove V1", "Ashgrove V4", "Ashgrove V5"} {
		h, err := lb.EphemerisHistory(name)
		if err != nil {
			t.Fatal(err)
		}
		cur, _ := lb.Target(name)
		if len(h) < 2 || h[len(h)-1].Ephemeris != cur.Ephemeris {
			t.Errorf("%s: history of %d ephemerides, last %+v; want 2 or more, the last the current %+v", name, len(h), h[len(h)-1], cur.Ephemeris)
		}
	}
	mean, err := lb.MeanMagV("Ashgrove V2")
	if err != nil || math.IsNaN(mean) {
		t.Errorf("the Cepheid-like star's mean V: got %v, %v", mean, err)
	}
	log, err := lb.NightLog(demoSiteName, nights[len(nights)/2].Date)
	if err == nil && len(log.Plan) == 0 {
		t.Errorf("night %s: no plan", dateKey(log.Night.Date))
	}
}

// TestDemoSkyCoverage checks that on every night of a year some demo stars
// are up at Ashgrove Hill at local midnight: above the site's lowest
// useful altitude and clear of its trees and roof.
func TestDemoSkyCoverage(t *testing.T) {
	const minUp = 2 // stars
	sites, err := demoSites()
	if err != nil {
		t.Fatal(err)
	}
	ash := sites[0]
	stars := demoStars()
	for d := time.Date(2026, 1, 1, 0, 0, 0, 0, time.UTC); d.Year() == 2026; d = d.AddDate(0, 0, 3) {
		night, err := ephem.NightOf(ash.Site, d)
		if err != nil {
			t.Fatal(err)
		}
		mid := night.Start.AddDays(0.5) // local mean midnight
		var up []string
		for _, s := range stars {
			v := s.star.Vec()
			pos := ephem.NewSky(ash.Site, mid).Star(&v)
			if pos.AltDeg >= ash.LowestAltDeg(pos.AzDeg) {
				up = append(up, s.name)
			}
		}
		if len(up) < minUp {
			t.Errorf("night of %s: demo stars up at midnight %v, want at least %d", dateKey(d), up, minUp)
		}
	}
}

// TestDemoMeasurements recomputes, for every demo measurement, what the
// observer could not have got wrong: the star above the site's lowest
// altitude and horizon with the Sun below −12°, the air mass, HJD and
// BJD_TDB from ephem; and reduces the raw instrumental magnitudes again
// (ensemble of the comparison stars' catalogue V, methods sheet §8) to get
// the stored magnitude back, and the hidden light curve within the noise.
func TestDemoMeasurements(t *testing.T) {
	lb := openT(t, sharedDemo(t))
	truth := demoTruth()
	const tolJD = 0.001 * second // ephem.Frames vs single instants: under a millisecond
	const tolAirmass = 1e-5      // and well under an arcsecond of altitude
	const tolMag = 1e-9          // the same arithmetic
	var sumZ, sumZ2, sumK2 float64
	var nZ, nK int
	targets, _ := lb.Targets()
	for _, tg := range targets {
		s := truth[tg.Name]
		catalogue := map[string]float64{}
		for _, c := range append(append([]observe.Comp{}, tg.Comps...), tg.Checks...) {
			catalogue[c.ID] = c.V
		}
		ms, err := lb.MeasurementsOf(tg.Name, 0)
		if err != nil {
			t.Fatal(err)
		}
		sites := map[int64]observe.Site{}
		for _, m := range ms {
			site, ok := sites[m.NightID]
			if !ok {
				n, err := lb.NightByID(m.NightID)
				if err != nil {
					t.Fatal(err)
				}
				if site, err = lb.Site(n.Site); err != nil {
					t.Fatal(err)
				}
				sites[m.NightID] = site
			}
			at, err := ephem.FromJDUTC(m.JDUTC)
			if err != nil {
				t.Fatal(err)
			}
			v := tg.Star.Vec()
			sky := ephem.NewSky(site.Site, at)
			pos := sky.Star(&v)
			if pos.AltDeg < site.LowestAltDeg(pos.AzDeg) || sky.Sun().AltDeg >= -12 {
				t.Errorf("%s at JD %.5f from %q: star at %.1f° (lowest %.1f°), Sun at %.1f°", tg.Name, m.JDUTC, site.Name,
					pos.AltDeg, site.LowestAltDeg(pos.AzDeg), sky.Sun().AltDeg)
			}
			x, _ := ephem.Airmass(ephem.RefractedAltDeg(pos.AltDeg))
			hjd, bjd := ephem.HJDOf(at, tg.Star, site.Site), ephem.BJDTDBOf(at, tg.Star, site.Site)
			if math.Abs(m.Airmass-x) > tolAirmass || math.Abs(m.HJD-hjd) > tolJD || math.Abs(m.BJDTDB-bjd) > tolJD {
				t.Errorf("%s at JD %.5f: air mass %v, HJD %.8f, BJD %.8f; ephem gives %v, %.8f, %.8f", tg.Name, m.JDUTC,
					m.Airmass, m.HJD, m.BJDTDB, x, hjd, bjd)
			}
			mTrue := s.shape.magAt(s.truth.phaseAt(m.BJDTDB))
			if m.Visual != "" {
				if math.Abs(m.Mag-mTrue) > 0.6 {
					t.Errorf("%s visual %q: %v, the star was %v", tg.Name, m.Visual, m.Mag, mTrue)
				}
				continue
			}
			// Reduce again: Z_i = V_i − v_i weighted by 1/σ_i².
			var sw, swz float64
			for _, c := range m.Comps {
				w := 1 / (c.InstErr * c.InstErr)
				sw += w
				swz += w * (catalogue[c.Label] - c.InstMag)
			}
			z := swz / sw
			if got := m.InstMag + z; math.Abs(got-m.Mag) > tolMag {
				t.Errorf("%s at JD %.5f: reduced again %v, stored %v", tg.Name, m.JDUTC, got, m.Mag)
			}
			sumZ += (m.Mag - mTrue) / m.MagErr
			sumZ2 += (m.Mag - mTrue) * (m.Mag - mTrue) / (m.MagErr * m.MagErr)
			nZ++
			for _, k := range m.Checks {
				r := k.InstMag + z - catalogue[k.Label]
				sumK2 += r * r / (k.InstErr*k.InstErr + 1/sw)
				nK++
			}
		}
	}
	// The residuals from the hidden light curve, in units of the stated
	// error, have mean 0 and spread 1: the reduction gives the light curve
	// back within the noise. With thousands of points the bounds are wide
	// (5 standard errors of the mean, ±10% on the spread).
	mean, rms := sumZ/float64(nZ), math.Sqrt(sumZ2/float64(nZ))
	if math.Abs(mean) > 5/math.Sqrt(float64(nZ)) || math.Abs(rms-1) > 0.1 {
		t.Errorf("(reduced − true)/error over %d points: mean %.3f, rms %.3f; want 0 and 1", nZ, mean, rms)
	}
	if k := math.Sqrt(sumK2 / float64(nK)); math.Abs(k-1) > 0.1 {
		t.Errorf("check stars: rms of (measured − catalogue)/error over %d = %.3f, want 1", nK, k)
	}
	if nZ < 2000 {
		t.Errorf("only %d photometric measurements", nZ)
	}
}

// toBJD converts a timing to BJD_TDB through the instant it was seen at
// the geocentre (ephem.SeenAt, Eastman et al. 2010).
func toBJD(t *testing.T, tm Timing, star ephem.Star) float64 {
	if tm.Scale == ephem.BJDTDB {
		return tm.JD
	}
	geo := ephem.Site{Name: "geocentre"}
	at, err := ephem.SeenAt(tm.Scale, tm.JD, star, geo)
	if err != nil {
		t.Fatal(err)
	}
	return ephem.BJDTDBOf(at, star, geo)
}

// ocOf returns the cycles, O−C (days, BJD_TDB) and weights of the target's
// timings against its current ephemeris.
func ocOf(t *testing.T, lb *Logbook, name string) (tg observe.Target, cycles, oc, w, bjd []float64) {
	tg, err := lb.Target(name)
	if err != nil {
		t.Fatal(err)
	}
	ts, err := lb.TimingsOf(name)
	if err != nil {
		t.Fatal(err)
	}
	e := tg.Ephemeris
	if e.Scale != ephem.BJDTDB {
		t.Fatalf("%s: the current ephemeris is on %v; the test wants BJD_TDB", name, e.Scale)
	}
	for _, tm := range ts {
		b := toBJD(t, tm, tg.Star)
		step := 1.0
		if tm.Secondary {
			step = 0.5
		}
		c := math.Round(e.Cycle(b)/step) * step
		if tm.Secondary == (c == math.Floor(c)) {
			t.Errorf("%s: timing %.5f secondary=%v at cycle %v", name, tm.JD, tm.Secondary, c)
		}
		cycles, oc, w, bjd = append(cycles, c), append(oc, b-e.At(c)), append(w, 1/(tm.SigmaDays*tm.SigmaDays)), append(bjd, b)
	}
	return tg, cycles, oc, w, bjd
}

// TestDemoOCParabola checks that the O−C of Ashgrove V4's timings against
// its linear ephemeris is the parabola the generator put in: a weighted
// fit O−C = a + bE + QE² returns the Q chosen within its error, and the
// term is plain to see (many times its error). The fit itself is checked
// on the methods sheet §11 synthetic case [C].
func TestDemoOCParabola(t *testing.T) {
	// The fit: T0 = 2450000.0, P = 0.4 d, Q = 2.0×10⁻¹⁰ d, O = T0 + PE + QE².
	var basis [][]float64
	var y, w []float64
	for e := 0.0; e <= 20000; e += 1000 {
		basis, y, w = append(basis, []float64{1, e, e * e}), append(y, 2e-10*e*e), append(w, 1)
	}
	c, _ := wls(basis, y, w)
	if math.Abs(c[2]-2e-10) > 1e-15 {
		t.Errorf("methods sheet §11: fitted Q %v, want 2.0e-10", c[2])
	}

	lb := openT(t, sharedDemo(t))
	truth := demoTruth()["Ashgrove V4"]
	_, cycles, oc, wt, _ := ocOf(t, lb, "Ashgrove V4")
	basis = basis[:0]
	for _, e := range cycles {
		basis = append(basis, []float64{1, e, e * e})
	}
	c, cov := wls(basis, oc, wt)
	sigmaQ := math.Sqrt(cov[2][2])
	const nSigma = 3 // agreement within 3 standard errors
	if d := c[2] - truth.truth.q; math.Abs(d) > nSigma*sigmaQ {
		t.Errorf("Ashgrove V4: fitted Q %.3g ± %.2g d, want %.3g (diff %.2g, tol %d σ)", c[2], sigmaQ, truth.truth.q, d, nSigma)
	}
	if c[2]/sigmaQ < 10 {
		t.Errorf("Ashgrove V4: Q = %.3g ± %.2g d is not plain to see (want 10 σ or more)", c[2], sigmaQ)
	}
	if len(cycles) < 30 {
		t.Errorf("Ashgrove V4: %d timings, want 30 or more", len(cycles))
	}
}

// TestDemoOCWobble checks that the O−C of Ashgrove V5's timings (primary
// and secondary minima) against its linear ephemeris carries the
// light-travel-time wave the generator put in: a weighted fit of
// a + bE + s·sin(2π(t − T)/P₃) + c·cos(2π(t − T)/P₃), with the third
// body's period and zero time, returns s = A and c = 0 within their errors.
func TestDemoOCWobble(t *testing.T) {
	lb := openT(t, sharedDemo(t))
	l := demoTruth()["Ashgrove V5"].truth.ltt
	_, cycles, oc, wt, bjd := ocOf(t, lb, "Ashgrove V5")
	var basis [][]float64
	for i, e := range cycles {
		ph := 2 * math.Pi * (bjd[i] - l.zeroJD) / l.periodDays
		basis = append(basis, []float64{1, e, math.Sin(ph), math.Cos(ph)})
	}
	c, cov := wls(basis, oc, wt)
	const nSigma = 3
	ss, sc := math.Sqrt(cov[2][2]), math.Sqrt(cov[3][3])
	if d := c[2] - l.amplitudeDays; math.Abs(d) > nSigma*ss {
		t.Errorf("Ashgrove V5: sine amplitude %.5f ± %.5f d, want %.5f (tol %d σ)", c[2], ss, l.amplitudeDays, nSigma)
	}
	if math.Abs(c[3]) > nSigma*sc {
		t.Errorf("Ashgrove V5: cosine term %.5f ± %.5f d, want 0 (tol %d σ)", c[3], sc, nSigma)
	}
	if c[2]/ss < 10 {
		t.Errorf("Ashgrove V5: the wobble %.4f ± %.4f d is not plain to see", c[2], ss)
	}
	secondaries := 0
	ts, _ := lb.TimingsOf("Ashgrove V5")
	for _, tm := range ts {
		if tm.Secondary {
			secondaries++
		}
	}
	if secondaries < 5 {
		t.Errorf("Ashgrove V5: %d secondary minima timed, want 5 or more", secondaries)
	}
}

// TestDemoExtremumRecovered refits every own timing of the demo from the
// night's stored light curve and compares it with the extremum the
// generator put there (the hidden T(E)): the recovered time equals the
// generated one within the fit's own error.
func TestDemoExtremumRecovered(t *testing.T) {
	lb := openT(t, sharedDemo(t))
	truth := demoTruth()
	const nSigma = 4.0 // 70-odd timings: 4σ is a 1-in-16000 event each
	n := 0
	for name, s := range truth {
		ts, err := lb.TimingsOf(name)
		if err != nil {
			t.Fatal(err)
		}
		for _, tm := range ts {
			if tm.Origin != Own {
				continue
			}
			ms, err := lb.MeasurementsOf(name, tm.NightID)
			if err != nil {
				t.Fatal(err)
			}
			if tm.Filter == "vis" {
				continue // fitted over many nights
			}
			var tt, mm []float64
			for _, m := range ms {
				tt, mm = append(tt, m.BJDTDB), append(mm, m.Mag)
			}
			got, sigma, err := timeExtremum(tt, mm, s.fitHalfDays, s.fitDegree, s.kind == observe.Max)
			if err != nil {
				t.Errorf("%s night %d: %v", name, tm.NightID, err)
				continue
			}
			if got != tm.JD || sigma != tm.SigmaDays {
				t.Errorf("%s night %d: refitted %.7f ± %.2g, stored %.7f ± %.2g", name, tm.NightID, got, sigma, tm.JD, tm.SigmaDays)
			}
			step := 1.0
			if tm.Secondary {
				step = 0.5
			}
			c := math.Round((got-s.truth.epoch)/s.truth.periodDays/step) * step
			want := s.truth.eventTime(c)
			if d := got - want; math.Abs(d) > nSigma*sigma {
				t.Errorf("%s cycle %v: recovered %.6f ± %.1f s, generated %.6f (diff %.1f s, tol %.0f σ)", name, c, got,
					sigma/second, want, d/second, nSigma)
			}
			n++
		}
	}
	if n < 40 {
		t.Errorf("checked %d light-curve timings, want 40 or more", n)
	}
}

// TestDemoCepheidMean checks the Cepheid-like star's stored mean V against
// its own measurements: the intensity mean (methods sheet §13) of the
// light curve folded on its period, averaged in phase bins.
func TestDemoCepheidMean(t *testing.T) {
	lb := openT(t, sharedDemo(t))
	tg, err := lb.Target("Ashgrove V2")
	if err != nil {
		t.Fatal(err)
	}
	ms, err := lb.MeasurementsOf(tg.Name, 0)
	if err != nil {
		t.Fatal(err)
	}
	const bins = 20
	var sum [bins]float64
	var cnt [bins]int
	for _, m := range ms {
		b := int(tg.Ephemeris.Phase(m.BJDTDB) * bins)
		sum[b] += math.Pow(10, -0.4*m.Mag)
		cnt[b]++
	}
	flux := 0.0
	for b := range sum {
		if cnt[b] == 0 {
			t.Fatalf("phase bin %d of %d is empty", b, bins)
		}
		flux += sum[b] / float64(cnt[b]) / bins
	}
	got := intensityMeanOf(flux)
	want, err := lb.MeanMagV(tg.Name)
	if err != nil {
		t.Fatal(err)
	}
	const tol = 0.02 // magnitudes: binning and noise
	if math.Abs(got-want) > tol {
		t.Errorf("Ashgrove V2: intensity mean of the data %.3f, stored %.3f (tol %v mag)", got, want, tol)
	}
}

// TestDemoDeterministic checks that the demo is the same every time, and
// that the seed is what makes it.
func TestDemoDeterministic(t *testing.T) {
	text := func(d *demoData) string {
		var b strings.Builder
		for _, n := range d.nights {
			fmt.Fprintf(&b, "%v\n", *n) // NaN prints as NaN: comparable as text
		}
		fmt.Fprintf(&b, "%v\n", d.published)
		return b.String()
	}
	var gen [3]string
	for i, seed := range []uint64{demoSeed, demoSeed, demoSeed + 1} {
		d, err := generateDemo(seed)
		if err != nil {
			t.Fatal(err)
		}
		gen[i] = text(d)
	}
	if gen[0] != gen[1] {
		t.Errorf("two generations of the demo from one seed differ")
	}
	if gen[0] == gen[2] {
		t.Errorf("another seed gives the same demo")
	}
}

// TestClearDemo checks that ClearDemo, and an import of real data, remove
// the demo and nothing else.
func TestClearDemo(t *testing.T) {
	lb := demoCopy(t)
	// A real target and a real night at a demo site survive.
	if err := lb.AddTarget(fxTargetValue(), "test"); err != nil {
		t.Fatal(err)
	}
	id, err := lb.AddNight(Night{Site: demoSiteName, Date: fxDate})
	if err != nil {
		t.Fatal(err)
	}
	if err := lb.ClearDemo(); err != nil {
		t.Fatal(err)
	}
	if demo, _ := lb.IsDemo(); demo {
		t.Errorf("IsDemo after ClearDemo: true")
	}
	ts, _ := lb.Targets()
	if len(ts) != 1 || ts[0].Name != fxTarget {
		t.Errorf("targets after ClearDemo: %v, want only %q", ts, fxTarget)
	}
	c := counts(t, lb)
	for _, table := range []string{"measurements", "timings", "raw_comps", "plans"} {
		if c[table] != 0 {
			t.Errorf("%s after ClearDemo: %d rows, want 0", table, c[table])
		}
	}
	if c["nights"] != 1 || c["sites"] != 1 {
		t.Errorf("after ClearDemo: %d nights and %d sites, want the real night and the site it uses", c["nights"], c["sites"])
	}
	if n, err := lb.NightByID(id); err != nil || n.Site != demoSiteName {
		t.Errorf("the real night: %+v, %v", n, err)
	}

	// An import into the demo logbook removes the demo.
	lb2 := demoCopy(t)
	n, err := lb2.ImportCSV(SitesTable, strings.NewReader("name,lat_deg,lon_deg,time_zone,min_alt_deg\nMy Yard,51.5,-0.1,Europe/London,15\n"), "sites.csv")
	if err != nil || n != 1 {
		t.Fatalf("import: %d, %v", n, err)
	}
	if demo, _ := lb2.IsDemo(); demo {
		t.Errorf("IsDemo after an import: true")
	}
	sites, _ := lb2.Sites()
	if len(sites) != 1 || sites[0].Name != "My Yard" {
		t.Errorf("sites after the import: %v", sites)
	}
	// A failed import leaves the demo as it was.
	lb3 := demoCopy(t)
	before := counts(t, lb3)
	if _, err := lb3.ImportCSV(SitesTable, strings.NewReader("name,lat_deg,lon_deg,time_zone,min_alt_deg\nMy Yard,95,-0.1,UTC,15\n"), "bad.csv"); err == nil {
		t.Fatalf("import of a bad site: no error")
	}
	if demo, _ := lb3.IsDemo(); !demo {
		t.Errorf("a failed import removed the demo")
	}
	if after := counts(t, lb3); fmt.Sprint(after) != fmt.Sprint(before) {
		t.Errorf("a failed import changed the logbook: %v → %v", before, after)
	}
}

// TestOpenOrCreateDemo checks the first run and the runs after it.
func TestOpenOrCreateDemo(t *testing.T) {
	path := filepath.Join(t.TempDir(), "sub", "vigil.db")
	lb, created, err := OpenOrCreateDemo(path)
	if err != nil || !created {
		t.Fatalf("first run: created %v, %v", created, err)
	}
	lb.Close()
	lb, created, err = OpenOrCreateDemo(path)
	if err != nil || created {
		t.Fatalf("second run: created %v, %v", created, err)
	}
	defer lb.Close()
	if demo, _ := lb.IsDemo(); !demo {
		t.Errorf("the first run's logbook is not the demo")
	}
}
