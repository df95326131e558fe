package observe

import (
	"math"
	"testing"
	"time"

	"example.org/vigil/ephem"
)

// Tolerances of the planner (ephem.SkySpan) against ephem's full
// computation at the instant, with a frame of its own (ephem is itself
// checked against astropy in its own tests).
const (
	seenVsEphemSec     = 0.001 // SkySpan.SeenAt, Newton's method to 86 µs
	altVsEphemArcsec   = 0.3   // the nearest day's frame (ephem.Frame.Sky)
	sunVsEphemArcsec   = 0.3   // as the star
	moonVsEphemArcsec  = 0.5   // the Moon interpolated hourly (0.2″) and the frame
	illumVsEphem       = 1e-6  // from the interpolated Moon
	twilightVsEphemSec = 0.5   // Sun crossings, both refined to 0.05 s
	coverageStepDays   = 30.0 / secPerDay
)

func engineCases(t *testing.T) []struct {
	name string
	site Site
	tg   Target
} {
	mk := func(name string, lat, lon, elev float64, h Horizon) Site {
		s, err := NewSite(name, lat, lon, elev, "UTC", 15, h)
		if err != nil {
			t.Fatal(err)
		}
		return s
	}
	eph := func(p float64, ts ephem.TimeScale) ephem.Ephemeris {
		return ephem.Ephemeris{Epoch: 2460000.3, PeriodDays: p, Scale: ts, EpochErr: 0.002, PeriodErr: 2e-6}
	}
	return []struct {
		name string
		site Site
		tg   Target
	}{
		{"north, BJD, flat", mk("Nordhang", 52, 13, 100, nil),
			NewTarget("Rowan Var", ephem.Star{RAHours: 3.2, DecDeg: 40}, Pulsating, eph(0.43, ephem.BJDTDB), Max)},
		{"south, HJD, profile", mk("Sudkamm", -33, -70, 2400, Horizon{{0, 10}, {120, 30}, {240, 5}}),
			NewTarget("Sorrel Ecl", ephem.Star{RAHours: 8.9, DecDeg: -50, PMRA: 300, PMDec: -200}, Eclipsing, eph(1.7, ephem.HJD), Min)},
		{"tropics, west", mk("Westkap", 19, -155, 4200, Horizon{{90, 25}}),
			NewTarget("Teasel Var", ephem.Star{RAHours: 22.1, DecDeg: 5}, Pulsating, eph(0.27, ephem.BJDTDB), Max)},
	}
}

func TestEngineAgainstEphem(t *testing.T) {
	from, _ := ephem.FromTime(time.Date(2026, 11, 20, 0, 0, 0, 0, time.UTC))
	to := from.AddDays(6)
	for _, tc := range engineCases(t) {
		t.Run(tc.name, func(t *testing.T) {
			c := DefaultConstraints()
			evs, err := Predict(tc.site, tc.tg, from, to, c)
			if err != nil {
				t.Fatal(err)
			}
			v := tc.tg.Star.Vec()
			for _, e := range evs {
				want, err := ephem.SeenAt(tc.tg.Ephemeris.Scale, e.EphemerisJD, tc.tg.Star, tc.site.Site)
				if err != nil {
					t.Fatal(err)
				}
				if d := e.UTC.Sub(want) * secPerDay; math.Abs(d) > seenVsEphemSec {
					t.Errorf("cycle %v: utc got %s want %s (ephem.SeenAt) diff %.4f s tol %v s", e.Cycle, e.UTC, want, d, seenVsEphemSec)
				}
				sky := ephem.NewSky(tc.site.Site, e.UTC)
				p := sky.Star(&v)
				if d := (e.AltDeg - p.AltDeg) * 3600; math.Abs(d) > altVsEphemArcsec {
					t.Errorf("cycle %v: alt got %.6f want %.6f (Sky.Star) diff %.2f\" tol %v\"", e.Cycle, e.AltDeg, p.AltDeg, d, altVsEphemArcsec)
				}
				if d := wrap180(e.AzDeg-p.AzDeg) * math.Cos(p.AltDeg*deg2rad) * 3600; math.Abs(d) > altVsEphemArcsec {
					t.Errorf("cycle %v: az got %.6f want %.6f (Sky.Star) diff %.2f\" tol %v\"", e.Cycle, e.AzDeg, p.AzDeg, d, altVsEphemArcsec)
				}
				if d := (e.SunAltDeg - sky.Sun().AltDeg) * 3600; math.Abs(d) > sunVsEphemArcsec {
					t.Errorf("cycle %v: Sun alt diff %.2f\" tol %v\"", e.Cycle, d, sunVsEphemArcsec)
				}
				if d := (e.MoonAltDeg - sky.Moon().AltDeg) * 3600; math.Abs(d) > moonVsEphemArcsec {
					t.Errorf("cycle %v: Moon alt got %.6f want %.6f diff %.3f\" tol %v\"", e.Cycle, e.MoonAltDeg, sky.Moon().AltDeg, d, moonVsEphemArcsec)
				}
				if d := (e.MoonSepDeg - sky.MoonSeparationDeg(&v)) * 3600; math.Abs(d) > moonVsEphemArcsec {
					t.Errorf("cycle %v: Moon separation diff %.3f\" tol %v\"", e.Cycle, d, moonVsEphemArcsec)
				}
				if d := (e.SunSepDeg - sky.SunSeparationDeg(&v)) * 3600; math.Abs(d) > sunVsEphemArcsec {
					t.Errorf("cycle %v: Sun separation diff %.3f\" tol %v\"", e.Cycle, d, sunVsEphemArcsec)
				}
				if d := e.MoonIllum - sky.MoonIllumination(); math.Abs(d) > illumVsEphem {
					t.Errorf("cycle %v: Moon illumination diff %.4f tol %v", e.Cycle, d, illumVsEphem)
				}
				got, want2 := e.Window.UsableFraction, bruteCoverage(tc.site, &v, c, e)
				if d := got - want2; math.Abs(d) > 2*coverageStepDays/(2*e.Window.HalfWidthDays) {
					t.Errorf("cycle %v (%s, alt %.1f): usable fraction got %.4f want %.4f (sampled every 30 s with ephem)", e.Cycle, e.UTC, e.AltDeg, got, want2)
				}
				if e.Window.Whole && !e.Observable {
					t.Errorf("cycle %v: whole window usable but the extremum is not", e.Cycle)
				}
			}
		})
	}
}

// bruteCoverage samples the window every 30 s with ephem's full Sky.
func bruteCoverage(site Site, v *ephem.StarVec, c Constraints, e Event) float64 {
	n := int(math.Round(2 * e.Window.HalfWidthDays / coverageStepDays))
	good := 0
	for i := 0; i < n; i++ {
		t := e.Window.Start.AddDays((float64(i) + 0.5) * 2 * e.Window.HalfWidthDays / float64(n))
		sky := ephem.NewSky(site.Site, t)
		p := sky.Star(v)
		ok := sky.Sun().AltDeg < c.SunAltDeg && p.AltDeg > site.LowestAltDeg(p.AzDeg)
		if c.MoonMinSepDeg > 0 && sky.Moon().AltDeg > 0 && sky.MoonSeparationDeg(v) < c.MoonMinSepDeg {
			ok = false
		}
		if ok {
			good++
		}
	}
	return float64(good) / float64(n)
}

func TestTwilightsAgainstEphem(t *testing.T) {
	for _, tc := range engineCases(t) {
		for _, date := range []time.Time{time.Date(2026, 6, 21, 0, 0, 0, 0, time.UTC), time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)} {
			t.Run(tc.name+" "+date.Format("2006-01-02"), func(t *testing.T) {
				p, err := NewPlanner(tc.site, DefaultConstraints())
				if err != nil {
					t.Fatal(err)
				}
				plan, err := p.Night(nil, date)
				if err != nil {
					t.Fatal(err)
				}
				want, err := ephem.NightOf(tc.site.Site, date)
				if err != nil {
					t.Fatal(err)
				}
				if plan.Start != want.Start || plan.End != want.End {
					t.Errorf("night span got %s–%s want %s–%s (ephem.NightOf)", plan.Start, plan.End, want.Start, want.End)
				}
				tw := plan.Twilights
				for _, x := range []struct {
					name      string
					got, want ephem.Event
				}{
					{"sunset", tw.Sunset, want.Sunset}, {"sunrise", tw.Sunrise, want.Sunrise},
					{"civil dusk", tw.CivilDusk, want.CivilDusk}, {"civil dawn", tw.CivilDawn, want.CivilDawn},
					{"nautical dusk", tw.NauticalDusk, want.NauticalDusk}, {"nautical dawn", tw.NauticalDawn, want.NauticalDawn},
					{"astronomical dusk", tw.AstroDusk, want.AstroDusk}, {"astronomical dawn", tw.AstroDawn, want.AstroDawn},
				} {
					if x.got.OK != x.want.OK {
						t.Errorf("%s: happens %v, ephem.NightOf says %v", x.name, x.got.OK, x.want.OK)
						continue
					}
					if d := x.got.At.Sub(x.want.At) * secPerDay; x.got.OK && math.Abs(d) > twilightVsEphemSec {
						t.Errorf("%s: got %s want %s diff %.2f s tol %v s", x.name, x.got.At, x.want.At, d, twilightVsEphemSec)
					}
				}
				if tw.NauticalDusk.OK && (math.Abs(tw.DarkFrom.At.Sub(tw.NauticalDusk.At))*secPerDay > twilightVsEphemSec ||
					math.Abs(tw.DarkTo.At.Sub(tw.NauticalDawn.At))*secPerDay > twilightVsEphemSec) {
					t.Errorf("dark span %v–%v, want the nautical twilights %v–%v for the −12° limit", tw.DarkFrom, tw.DarkTo, tw.NauticalDusk, tw.NauticalDawn)
				}
			})
		}
	}
}
