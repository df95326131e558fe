package demo

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"sync"
	"testing"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

var (
	demoOnce sync.Once
	demoPath string
	demoErr  error
	demoDir  string
)

func TestMain(m *testing.M) {
	code := m.Run()
	if demoDir != "" {
		os.RemoveAll(demoDir)
	}
	os.Exit(code)
}

// sharedDemo returns the path of a demo logbook made once for the tests
// that only read it.
func sharedDemo(t testing.TB) string {
	t.Helper()
	demoOnce.Do(func() {
		demoDir, demoErr = os.MkdirTemp("", "vigil-demo-test-")
		if demoErr != nil {
			return
		}
		demoPath = filepath.Join(demoDir, "demo.db")
		var lb *logbook.Logbook
		lb, demoErr = Create(demoPath)
		if demoErr == nil {
			demoErr = lb.Close()
		}
	})
	if demoErr != nil {
		t.Fatalf("making the demo logbook: %v", demoErr)
	}
	return demoPath
}

// openT opens a logbook closed at the end of the test.
func openT(t testing.TB, path string) *logbook.Logbook {
	t.Helper()
	lb, err := logbook.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { lb.Close() })
	return lb
}

// demoCopy opens a private copy of the demo logbook, closed at the end of
// the test.
func demoCopy(t testing.TB) *logbook.Logbook {
	t.Helper()
	in, err := os.Open(sharedDemo(t))
	if err != nil {
		t.Fatal(err)
	}
	defer in.Close()
	dst := filepath.Join(t.TempDir(), "demo.db")
	out, err := os.Create(dst)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := io.Copy(out, in); err != nil {
		t.Fatal(err)
	}
	if err := out.Close(); err != nil {
		t.Fatal(err)
	}
	return openT(t, dst)
}

// demoTruth returns the hidden truth behind each demo star, by name.
func demoTruth() map[string]*demoStar {
	out := map[string]*demoStar{}
	stars := demoStars()
	for i := range stars {
		out[stars[i].name] = &stars[i]
	}
	return out
}

// allMeasurements returns every measurement of the logbook, by target.
func allMeasurements(t *testing.T, lb *logbook.Logbook) map[string][]logbook.Measurement {
	t.Helper()
	targets, err := lb.Targets()
	if err != nil {
		t.Fatal(err)
	}
	out := map[string][]logbook.Measurement{}
	for _, tg := range targets {
		ms, err := lb.MeasurementsOf(tg.Name, 0)
		if err != nil {
			t.Fatal(err)
		}
		out[tg.Name] = ms
	}
	return out
}

// TestSite checks the demo site's definition against the values the
// command-line contract and the scenario fix, and that the demo logbook
// stores exactly that site.
func TestSite(t *testing.T) {
	s := Site()
	for _, c := range []struct {
		what      string
		got, want float64
	}{{"latitude", s.LatDeg, 52.1172}, {"longitude (east positive: west of Greenwich)", s.LonDeg, -1.4538},
		{"elevation", s.ElevM, 140}, {"lowest altitude", s.MinAltDeg, 20}} {
		if c.got != c.want {
			t.Errorf("Ashgrove Hill %s: got %v, want %v", c.what, c.got, c.want)
		}
	}
	const wantName = "Ashgrove Hill Observatory (demo)" // the command-line contract's demo site
	if names := []string{s.Name, SiteName}; names[0] != wantName || names[1] != wantName {
		t.Errorf("Ashgrove Hill name: got %q, SiteName %q; want %q", s.Name, SiteName, wantName)
	}
	if s.TimeZone != "Europe/London" || s.Location().String() != "Europe/London" {
		t.Errorf("Ashgrove Hill time zone: got %q, location %v", s.TimeZone, s.Location())
	}
	if ne, south, west := s.Horizon.AltDeg(45), s.Horizon.AltDeg(180), s.Horizon.AltDeg(270); ne < 30 || south < 20 || west > 10 {
		t.Errorf("Ashgrove Hill horizon: north-east %v°, south %v°, west %v°: want trees NE, a roof S, open W", ne, south, west)
	}
	if err := s.Validate(); err != nil {
		t.Errorf("Site().Validate: %v", err)
	}
	lb := openT(t, sharedDemo(t))
	stored, err := lb.Site(SiteName)
	if err != nil {
		t.Fatal(err)
	}
	if fmt.Sprint(stored.Site, stored.TimeZone, stored.MinAltDeg, stored.Horizon) != fmt.Sprint(s.Site, s.TimeZone, s.MinAltDeg, s.Horizon) {
		t.Errorf("the demo logbook's site %+v differs from Site() %+v", stored, s)
	}
	school, err := lb.Site(demoSchoolName)
	if err != nil {
		t.Fatal(err)
	}
	if school.LatDeg >= 0 {
		t.Errorf("the school site is at latitude %v: want the southern hemisphere", school.LatDeg)
	}
}

// TestLabels checks that every demo record says it is a demo, that the
// logbook is flagged as one, and that every record is flagged: ClearDemo
// leaves nothing behind.
func TestLabels(t *testing.T) {
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
			if tm.Origin == logbook.Published && !strings.Contains(tm.Source, "[demo, invented]") {
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
	// Every site, target and night is flagged demo: ClearDemo removes all.
	cp := demoCopy(t)
	if err := cp.ClearDemo(); err != nil {
		t.Fatal(err)
	}
	s, _ := cp.Sites()
	tg, _ := cp.Targets()
	n, _ := cp.Nights("")
	if len(s)+len(tg)+len(n) != 0 {
		t.Errorf("after ClearDemo: %d sites, %d targets, %d nights left; want none (every demo record flagged)", len(s), len(tg), len(n))
	}
}

// TestContent checks the size and shape of the scenario: several years of
// nights, light curves, visual estimates, own and published timings, the
// ephemeris histories.
func TestContent(t *testing.T) {
	lb := openT(t, sharedDemo(t))
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
	for name, ms := range allMeasurements(t, lb) {
		perNight := map[int64]int{}
		for _, m := range ms {
			n.meas++
			if m.Visual != "" {
				n.visual++
			}
			perNight[m.NightID]++
		}
		for _, c := range perNight {
			if c >= 30 {
				n.lcNights++
			}
		}
		ts, err := lb.TimingsOf(name)
		if err != nil {
			t.Fatal(err)
		}
		for _, tm := range ts {
			if tm.Origin == logbook.Own {
				n.own++
			} else {
				n.pub++
			}
		}
	}
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
			t.Errorf("%s: history of %d ephemerides; want 2 or more, the last the current %+v", name, len(h), cur.Ephemeris)
		}
	}
	mean, err := lb.MeanMagV("Ashgrove V2")
	if err != nil || math.IsNaN(mean) {
		t.Errorf("the Cepheid-like star's mean V: got %v, %v", mean, err)
	}
	log, err := lb.NightLog(SiteName, nights[len(nights)/2].Date)
	if err == nil && len(log.Plan) == 0 {
		t.Errorf("night %s: no plan", dateKey(log.Night.Date))
	}
}

// TestSkyCoverage checks that on every night of a year some demo stars are
// up at Ashgrove Hill at local midnight: above the site's lowest useful
// altitude and clear of its trees and roof.
func TestSkyCoverage(t *testing.T) {
	const minUp = 2 // stars
	ash := Site()
	stars := demoStars()
	for d := time.Date(2026, 1, 1, 0, 0, 0, 0, time.UTC); d.Year() == 2026; d = d.AddDate(0, 0, 1) {
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

// TestMeasurements recomputes, for every demo measurement, what the
// observer could not have got wrong: the star above the site's lowest
// altitude and horizon with the Sun below −12°, the air mass, HJD and
// BJD_TDB from ephem; reduces the stored raw instrumental magnitudes again
// with reduce (Photometry.Reduce, the ensemble of the comparison stars'
// stored catalogue V, methods sheet §8) and the visual estimates
// (reduce.ReduceVisual, §9) to get the stored magnitudes back; and finds
// the hidden light curve within the noise.
func TestMeasurements(t *testing.T) {
	lb := openT(t, sharedDemo(t))
	truth := demoTruth()
	const (
		tolJD      = 0.001 * second // ephem.Frames vs single instants: under a millisecond
		tolAirmass = 1e-5           // and well under an arcsecond of altitude
		tolMag     = 1e-9           // the same arithmetic on the same numbers
		tolVisual  = 0.6            // mag: 5 σ of a visual estimate's 0.12 mag
	)
	var sumZ, sumZ2, sumK2 float64
	var nZ, nK int
	sites := map[int64]observe.Site{}
	siteOf := func(night int64) observe.Site {
		if s, ok := sites[night]; ok {
			return s
		}
		n, err := lb.NightByID(night)
		if err != nil {
			t.Fatal(err)
		}
		s, err := lb.Site(n.Site)
		if err != nil {
			t.Fatal(err)
		}
		sites[night] = s
		return s
	}
	for name, ms := range allMeasurements(t, lb) {
		s := truth[name]
		tg, err := lb.Target(name)
		if err != nil {
			t.Fatal(err)
		}
		chart := map[string]float64{}
		for _, c := range tg.Comps {
			chart[c.ID] = c.V
		}
		byNight := map[int64][]logbook.Measurement{}
		var visual []logbook.Measurement
		for _, m := range ms {
			site := siteOf(m.NightID)
			at, err := ephem.FromJDUTC(m.JDUTC)
			if err != nil {
				t.Fatal(err)
			}
			v := tg.Star.Vec()
			sky := ephem.NewSky(site.Site, at)
			pos := sky.Star(&v)
			if pos.AltDeg < site.LowestAltDeg(pos.AzDeg) || sky.Sun().AltDeg >= -12 {
				t.Errorf("%s at JD %.5f from %q: star at %.1f° (lowest %.1f°), Sun at %.1f°", name, m.JDUTC, site.Name,
					pos.AltDeg, site.LowestAltDeg(pos.AzDeg), sky.Sun().AltDeg)
			}
			x, _ := ephem.Airmass(ephem.RefractedAltDeg(pos.AltDeg))
			hjd, bjd := ephem.HJDOf(at, tg.Star, site.Site), ephem.BJDTDBOf(at, tg.Star, site.Site)
			if math.Abs(m.Airmass-x) > tolAirmass || math.Abs(m.HJD-hjd) > tolJD || math.Abs(m.BJDTDB-bjd) > tolJD {
				t.Errorf("%s at JD %.5f: air mass %v, HJD %.8f, BJD %.8f; ephem gives %v, %.8f, %.8f (tol %v, %.1g s)", name,
					m.JDUTC, m.Airmass, m.HJD, m.BJDTDB, x, hjd, bjd, tolAirmass, tolJD/second)
			}
			if m.Visual != "" {
				visual = append(visual, m)
				continue
			}
			byNight[m.NightID] = append(byNight[m.NightID], m)
		}
		// The visual estimates, reduced again.
		if len(visual) > 0 {
			obs := make([]reduce.VisualObservation, len(visual))
			for i, m := range visual {
				obs[i] = reduce.VisualObservation{JDUTC: m.JDUTC, Estimate: m.Visual}
			}
			pts, err := reduce.ReduceVisual(obs, chart, 0)
			if err != nil {
				t.Fatalf("%s: reduce.ReduceVisual: %v", name, err)
			}
			for i, m := range visual {
				if pts[i].Mag != m.Mag {
					t.Errorf("%s visual %q: reduced again %v, stored %v", name, m.Visual, pts[i].Mag, m.Mag)
				}
				if mTrue := s.shape.magAt(s.truth.phaseAt(m.BJDTDB)); math.Abs(m.Mag-mTrue) > tolVisual {
					t.Errorf("%s visual %q: %v, the star was %v (tol %v mag)", name, m.Visual, m.Mag, mTrue, tolVisual)
				}
			}
		}
		// The photometry, reduced again night by night.
		for night, group := range byNight {
			p := photometry(tg, siteOf(night), nil)
			exps := make([]reduce.Exposure, len(group))
			for i, m := range group {
				exps[i] = exposure(m, p)
			}
			red, err := p.Reduce(exps)
			if err != nil {
				t.Fatalf("%s night %d: %v", name, night, err)
			}
			if len(red.Rows) != len(group) || len(red.Rejected) > 0 {
				t.Errorf("%s night %d: %d of %d frames reduced, %d comparison stars left out", name, night, len(red.Rows),
					len(group), len(red.Rejected))
				continue
			}
			for _, r := range red.Rows {
				m := group[r.Index]
				if math.Abs(r.Mag-m.Mag) > tolMag || math.Abs(r.Err-m.MagErr) > tolMag ||
					math.Abs(r.HJD-m.HJD) > tolJD || math.Abs(r.BJDTDB-m.BJDTDB) > tolJD {
					t.Errorf("%s at JD %.5f: reduced again %v ± %v at HJD %.8f, BJD %.8f; stored %v ± %v at %.8f, %.8f", name,
						m.JDUTC, r.Mag, r.Err, r.HJD, r.BJDTDB, m.Mag, m.MagErr, m.HJD, m.BJDTDB)
				}
				mTrue := s.shape.magAt(s.truth.phaseAt(m.BJDTDB))
				sumZ += (m.Mag - mTrue) / m.MagErr
				sumZ2 += (m.Mag - mTrue) * (m.Mag - mTrue) / (m.MagErr * m.MagErr)
				nZ++
				if !math.IsNaN(r.CheckMag) {
					k := (r.CheckMag - p.Check.Mag) / r.CheckErr
					sumK2 += k * k
					nK++
				}
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
		t.Errorf("check stars: rms of (reduced − catalogue)/error over %d = %.3f, want 1", nK, k)
	}
	if nZ < 2000 {
		t.Errorf("only %d photometric measurements", nZ)
	}
}

// toBJD converts a timing to BJD_TDB through the instant it was seen at
// the geocentre (ephem.SeenAt, Eastman et al. 2010).
func toBJD(t *testing.T, tm logbook.Timing, star ephem.Star) float64 {
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

// ocOf returns the O−C diagram (reduce.OC) of the target's timings, own and
// published, all on BJD_TDB, against its current ephemeris.
func ocOf(t *testing.T, lb *logbook.Logbook, name string, secondary bool) (reduce.OCAnalysis, []logbook.Timing) {
	tg, err := lb.Target(name)
	if err != nil {
		t.Fatal(err)
	}
	ts, err := lb.TimingsOf(name)
	if err != nil {
		t.Fatal(err)
	}
	if tg.Ephemeris.Scale != ephem.BJDTDB {
		t.Fatalf("%s: the current ephemeris is on %v; the test wants BJD_TDB", name, tg.Ephemeris.Scale)
	}
	in := make([]reduce.Timing, len(ts))
	for i, tm := range ts {
		in[i] = reduce.Timing{Time: toBJD(t, tm, tg.Star), Sigma: tm.SigmaDays}
	}
	a, err := reduce.OC(tg.Ephemeris, in, reduce.OCOptions{Secondary: secondary})
	if err != nil {
		t.Fatalf("%s: reduce.OC: %v", name, err)
	}
	for i, r := range a.Rows {
		if ts[i].Secondary == (r.Cycle == math.Floor(r.Cycle)) {
			t.Errorf("%s: timing %.5f secondary=%v at cycle %v", name, ts[i].JD, ts[i].Secondary, r.Cycle)
		}
		if r.Ambiguous {
			t.Errorf("%s: timing %.5f at cycle %v: %s", name, ts[i].JD, r.Cycle, r.Warning)
		}
	}
	return a, ts
}

// TestOCParabola checks that the O−C of Ashgrove V4's timings against its
// linear ephemeris is the parabola the generator put in: the quadratic
// ephemeris reduce.OC fits returns the Q chosen within its error, and the
// term is plain to see (many times its error, preferred by the F-test).
func TestOCParabola(t *testing.T) {
	lb := openT(t, sharedDemo(t))
	want := demoTruth()["Ashgrove V4"].truth.q
	a, ts := ocOf(t, lb, "Ashgrove V4", false)
	if a.Quadratic == nil {
		t.Fatalf("Ashgrove V4: no quadratic fit of %d timings", len(ts))
	}
	q, sigmaQ := a.Quadratic.Q, a.Quadratic.QErr
	const nSigma = 3 // agreement within 3 standard errors
	if d := q - want; math.Abs(d) > nSigma*sigmaQ {
		t.Errorf("Ashgrove V4: fitted Q %.3g ± %.2g d, want %.3g (diff %.2g, tol %d σ)", q, sigmaQ, want, d, nSigma)
	}
	if q/sigmaQ < 10 || a.Preferred != "quadratic" {
		t.Errorf("Ashgrove V4: Q = %.3g ± %.2g d is not plain to see (want 10 σ or more; %s)", q, sigmaQ, a.PreferredBy)
	}
	if len(ts) < 30 {
		t.Errorf("Ashgrove V4: %d timings, want 30 or more", len(ts))
	}
	t.Logf("Ashgrove V4: %d timings, Q = %.4g ± %.2g d (generated %.4g d)", len(ts), q, sigmaQ, want)
}

// TestOCWobble checks that the O−C of Ashgrove V5's timings (primary and
// secondary minima) against its linear ephemeris carries the
// light-travel-time wave the generator put in: reduce.LightTime, the
// circular orbit fitted with a linear ephemeris, returns the third body's
// amplitude, period and time of greatest delay within their errors.
func TestOCWobble(t *testing.T) {
	lb := openT(t, sharedDemo(t))
	l := demoTruth()["Ashgrove V5"].truth.ltt
	a, ts := ocOf(t, lb, "Ashgrove V5", true)
	fit, err := reduce.LightTime(a, reduce.LightTimeOptions{})
	if err != nil {
		t.Fatalf("Ashgrove V5: reduce.LightTime: %v", err)
	}
	const nSigma = 3
	// τ = A sin(2π(t − T)/P₃) is greatest a quarter period after T.
	greatest := l.zeroJD + l.periodDays/4
	dT := math.Remainder(fit.OrbitEpochJD-greatest, fit.PeriodDays)
	for _, c := range []struct {
		what            string
		got, sigma, off float64
	}{
		{"amplitude (d)", fit.AmplitudeDays, fit.AmplitudeErr, fit.AmplitudeDays - l.amplitudeDays},
		{"orbital period (d)", fit.PeriodDays, fit.PeriodErr, fit.PeriodDays - l.periodDays},
		{"time of greatest delay (JD)", fit.OrbitEpochJD, fit.OrbitEpochErr, dT},
	} {
		if !(math.Abs(c.off) <= nSigma*c.sigma) {
			t.Errorf("Ashgrove V5: %s %.6g ± %.2g, off the truth by %.3g (tol %d σ)", c.what, c.got, c.sigma, c.off, nSigma)
		}
	}
	t.Logf("Ashgrove V5: %d timings, A = %.5f ± %.5f d, P₃ = %.0f ± %.0f d, greatest delay off by %.0f ± %.0f d (generated A = %.5f d, P₃ = %.0f d)",
		len(ts), fit.AmplitudeDays, fit.AmplitudeErr, fit.PeriodDays, fit.PeriodErr, dT, fit.OrbitEpochErr, l.amplitudeDays, l.periodDays)
	if fit.AmplitudeDays/fit.AmplitudeErr < 10 {
		t.Errorf("Ashgrove V5: the wobble %.4f ± %.4f d is not plain to see", fit.AmplitudeDays, fit.AmplitudeErr)
	}
	secondaries := 0
	for _, tm := range ts {
		if tm.Secondary {
			secondaries++
		}
	}
	if secondaries < 5 {
		t.Errorf("Ashgrove V5: %d secondary minima timed, want 5 or more", secondaries)
	}
}

// TestExtremumRecovered times every own timing of the demo again from the
// stored measurements (reduce.Extremum with the demo observer's options: a
// night's light curve, or the visual estimates around a maximum) and
// compares it with the stored timing and with the extremum the generator
// put there (the hidden T(E)): the recovered time equals the generated one
// within 4 times its stated error.
func TestExtremumRecovered(t *testing.T) {
	lb := openT(t, sharedDemo(t))
	truth := demoTruth()
	const nSigma = 4.0 // 75-odd timings: 4σ is a 1-in-16000 event each
	var n, nVisual int
	var chi2 float64
	for name, s := range truth {
		ts, err := lb.TimingsOf(name)
		if err != nil {
			t.Fatal(err)
		}
		all, err := lb.MeasurementsOf(name, 0)
		if err != nil {
			t.Fatal(err)
		}
		for _, tm := range ts {
			if tm.Origin != logbook.Own {
				continue
			}
			step := 1.0
			if tm.Secondary {
				step = 0.5
			}
			c := math.Round((tm.JD-s.truth.epoch)/s.truth.periodDays/step) * step
			want := s.truth.eventTime(c)
			var got reduce.Timing
			if tm.Filter == "vis" {
				// Fitted to the estimates of many nights around the maximum.
				var pts []reduce.Point
				for _, m := range all {
					pts = append(pts, reduce.Point{T: m.BJDTDB, Mag: m.Mag, Err: math.NaN()})
				}
				got, err = reduce.Extremum(pts, reduce.ExtremumOptions{Kind: reduce.Maximum, From: want - visualHalfDays,
					To: want + visualHalfDays, Degree: 2, Bootstrap: -1})
				nVisual++
			} else {
				var ms []logbook.Measurement
				for _, m := range all {
					if m.NightID == tm.NightID {
						ms = append(ms, m)
					}
				}
				got, err = reduce.Extremum(lightCurve(ms), s.timingOptions())
				if err == nil && methodLabel(got) != tm.Method {
					t.Errorf("%s night %d: timed again by %s, stored %s", name, tm.NightID, methodLabel(got), tm.Method)
				}
			}
			if err != nil {
				t.Errorf("%s night %d: %v", name, tm.NightID, err)
				continue
			}
			if got.Time != tm.JD || got.Sigma != tm.SigmaDays {
				t.Errorf("%s night %d: timed again %.7f ± %.2g, stored %.7f ± %.2g", name, tm.NightID, got.Time, got.Sigma,
					tm.JD, tm.SigmaDays)
			}
			d := got.Time - want
			if math.Abs(d) > nSigma*got.Sigma {
				t.Errorf("%s cycle %v (%s): recovered %.6f ± %.1f s, generated %.6f (diff %.1f s, tol %.0f σ)", name, c,
					tm.Method, got.Time, got.Sigma/second, want, d/second, nSigma)
			}
			chi2 += d * d / (got.Sigma * got.Sigma)
			n++
		}
	}
	if n-nVisual < 40 || nVisual < 3 {
		t.Errorf("checked %d light-curve and %d visual timings, want 40 and 3 or more", n-nVisual, nVisual)
	}
	t.Logf("%d own timings (%d visual): rms (recovered − generated)/σ = %.2f", n, nVisual, math.Sqrt(chi2/float64(n)))
}

// TestCepheidMean checks the Cepheid-like star's stored mean V against its
// own measurements: the intensity mean of the light curve folded on its
// ephemeris (reduce.IntensityMeanPhased, methods sheet §13).
func TestCepheidMean(t *testing.T) {
	lb := openT(t, sharedDemo(t))
	tg, err := lb.Target("Ashgrove V2")
	if err != nil {
		t.Fatal(err)
	}
	ms, err := lb.MeasurementsOf(tg.Name, 0)
	if err != nil {
		t.Fatal(err)
	}
	phase, mags := make([]float64, len(ms)), make([]float64, len(ms))
	for i, m := range ms {
		phase[i], mags[i] = tg.Ephemeris.Phase(m.BJDTDB), m.Mag
	}
	got, err := reduce.IntensityMeanPhased(phase, mags)
	if err != nil {
		t.Fatal(err)
	}
	want, err := lb.MeanMagV(tg.Name)
	if err != nil {
		t.Fatal(err)
	}
	const tol = 0.02 // magnitudes: sampling and noise
	if d := got - want; math.Abs(d) > tol {
		t.Errorf("Ashgrove V2: intensity mean of the data %.3f, stored %.3f (diff %.3f, tol %v mag)", got, want, d, tol)
	}
}

// TestDeterministic checks that the demo is the same every time, and that
// the seed is what makes it.
func TestDeterministic(t *testing.T) {
	text := func(sc *scenario) string {
		var b strings.Builder
		for _, n := range sc.nights {
			fmt.Fprintf(&b, "%v\n", *n) // NaN prints as NaN: comparable as text
		}
		fmt.Fprintf(&b, "%v\n%v\n", sc.published, sc.targets)
		return b.String()
	}
	var gen [3]string
	for i, sd := range []uint64{seed, seed, seed + 1} {
		sc, err := generate(sd)
		if err != nil {
			t.Fatal(err)
		}
		gen[i] = text(sc)
	}
	if gen[0] != gen[1] {
		t.Errorf("two generations of the demo from one seed differ")
	}
	if gen[0] == gen[2] {
		t.Errorf("another seed gives the same demo")
	}
}

// TestClearDemo checks that ClearDemo, and an import of real data, remove
// the demo and only the demo from the demo logbook.
func TestClearDemo(t *testing.T) {
	lb := demoCopy(t)
	real := observe.NewTarget("My Star", ephem.Star{RAHours: 5.5, DecDeg: 30}, observe.Eclipsing,
		ephem.Ephemeris{Epoch: 2459000.1234, PeriodDays: 1.2345678, Scale: ephem.BJDTDB}, observe.Min)
	if err := lb.AddTarget(real, "test"); err != nil {
		t.Fatal(err)
	}
	date := time.Date(2025, 3, 14, 0, 0, 0, 0, time.UTC)
	if _, err := lb.AddNight(logbook.Night{Site: SiteName, Date: date}); err != nil {
		t.Fatal(err)
	}
	if err := lb.ClearDemo(); err != nil {
		t.Fatal(err)
	}
	if demo, _ := lb.IsDemo(); demo {
		t.Errorf("IsDemo after ClearDemo: true")
	}
	ts, _ := lb.Targets()
	if len(ts) != 1 || ts[0].Name != real.Name {
		t.Errorf("targets after ClearDemo: %d, want only %q", len(ts), real.Name)
	}
	sites, _ := lb.Sites()
	nights, _ := lb.Nights("")
	if len(sites) != 1 || sites[0].Name != SiteName || len(nights) != 1 || !nights[0].Date.Equal(date) {
		t.Errorf("after ClearDemo: %d sites and %d nights, want the real night and the site it uses", len(sites), len(nights))
	}

	// An import into the demo logbook removes the demo.
	lb2 := demoCopy(t)
	n, err := lb2.ImportCSV(logbook.SitesTable, strings.NewReader("name,lat_deg,lon_deg,time_zone,min_alt_deg\nMy Yard,51.5,-0.1,Europe/London,15\n"), "sites.csv")
	if err != nil || n != 1 {
		t.Fatalf("import: %d, %v", n, err)
	}
	if demo, _ := lb2.IsDemo(); demo {
		t.Errorf("IsDemo after an import: true")
	}
	if sites, _ := lb2.Sites(); len(sites) != 1 || sites[0].Name != "My Yard" {
		t.Errorf("sites after the import: %d, want only My Yard", len(sites))
	}
}

// TestOpenOrCreate checks the first run and the runs after it, and that a
// file that is not a logbook is refused and left alone.
func TestOpenOrCreate(t *testing.T) {
	path := filepath.Join(t.TempDir(), "sub", "vigil.db")
	lb, created, err := OpenOrCreate(path)
	if err != nil || !created {
		t.Fatalf("first run: created %v, %v", created, err)
	}
	lb.Close()
	lb, created, err = OpenOrCreate(path)
	if err != nil || created {
		t.Fatalf("second run: created %v, %v", created, err)
	}
	defer lb.Close()
	if demo, _ := lb.IsDemo(); !demo {
		t.Errorf("the first run's logbook is not the demo")
	}

	other := filepath.Join(t.TempDir(), "notes.db")
	if err := os.WriteFile(other, []byte("mine"), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, created, err := OpenOrCreate(other); err == nil || created || !errors.Is(err, logbook.ErrNotLogbook) {
		t.Errorf("a file that is not a logbook: created %v, err %v; want ErrNotLogbook", created, err)
	}
	if _, err := Create(other); !errors.Is(err, logbook.ErrExists) || !strings.Contains(err.Error(), other) {
		t.Errorf("Create over an existing file: got %v, want ErrExists naming the file", err)
	}
	if b, _ := os.ReadFile(other); string(b) != "mine" {
		t.Errorf("the existing file was changed")
	}
}

// TestRoundTrips checks the whole demo through the logbook's backup and
// CSV tables: a backup restored and backed up again gives the same bytes;
// every table exported, imported into an empty logbook and exported again
// gives the same files.
func TestRoundTrips(t *testing.T) {
	src := openT(t, sharedDemo(t))
	var first, second bytes.Buffer
	if err := src.Backup(&first); err != nil {
		t.Fatal(err)
	}
	dst, err := logbook.Restore(filepath.Join(t.TempDir(), "restored.db"), bytes.NewReader(first.Bytes()), "backup.json")
	if err != nil {
		t.Fatal(err)
	}
	defer dst.Close()
	if err := dst.Backup(&second); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(first.Bytes(), second.Bytes()) {
		t.Errorf("the backup of the restored demo differs from the original backup (%d and %d bytes)", first.Len(), second.Len())
	}
	if demo, _ := dst.IsDemo(); !demo {
		t.Errorf("the restored demo is not flagged demo")
	}

	dir1, dir2 := t.TempDir(), t.TempDir()
	if err := src.ExportCSVDir(dir1); err != nil {
		t.Fatal(err)
	}
	imp, err := logbook.Create(filepath.Join(t.TempDir(), "imported.db"))
	if err != nil {
		t.Fatal(err)
	}
	defer imp.Close()
	if _, err := imp.ImportCSVDir(dir1); err != nil {
		t.Fatal(err)
	}
	if err := imp.ExportCSVDir(dir2); err != nil {
		t.Fatal(err)
	}
	names := make([]string, 0, len(logbook.Tables))
	for _, tb := range logbook.Tables {
		names = append(names, tb.FileName())
	}
	sort.Strings(names)
	for _, name := range names {
		a, _ := os.ReadFile(filepath.Join(dir1, name))
		b, _ := os.ReadFile(filepath.Join(dir2, name))
		if !bytes.Equal(a, b) || len(a) == 0 {
			t.Errorf("%s: the second export differs from the first (%d and %d bytes)", name, len(a), len(b))
		}
	}
	if demo, _ := imp.IsDemo(); demo {
		t.Errorf("an imported export of the demo is flagged demo")
	}
}
