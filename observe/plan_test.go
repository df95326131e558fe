package observe

import (
	"fmt"
	"math"
	"strings"
	"testing"
	"time"

	"example.org/vigil/ephem"
)

// TestForecastMatchesPredict: a forecast holds, night by night, exactly the
// events Predict finds with some usable part of their window, with the same
// numbers.
func TestForecastMatchesPredict(t *testing.T) {
	// Three nights of many targets, and thirty nights (whose stars' places
	// are interpolated between anchors 32 days apart) of a few.
	for _, c := range []struct{ targets, nights int }{{40, 3}, {8, 30}} {
		t.Run(fmt.Sprintf("%d targets, %d nights", c.targets, c.nights), func(t *testing.T) {
			forecastMatchesPredict(t, c.targets, c.nights)
		})
	}
}

func forecastMatchesPredict(t *testing.T, nTargets, nights int) {
	site := benchSite(t)
	targets := benchCatalogue(nTargets)
	for i := range targets {
		targets[i].Name = "Bench " + string(rune('A'+i%26)) + string(rune('a'+i/26))
	}
	p, err := NewPlanner(site, DefaultConstraints())
	if err != nil {
		t.Fatal(err)
	}
	date := time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)
	plans, err := p.Forecast(targets, date, nights)
	if err != nil {
		t.Fatal(err)
	}
	total := 0
	for _, plan := range plans {
		total += len(plan.Events)
	}
	if total < 20 {
		t.Fatalf("only %d events in %d nights of %d targets", total, nights, nTargets)
	}
	for n, plan := range plans {
		if want := date.AddDate(0, 0, n); !plan.Date.Equal(want) {
			t.Errorf("night %d: date %v want %v", n, plan.Date, want)
		}
		got := map[string]Event{}
		for i, e := range plan.Events {
			if e.UTC.Before(plan.Start) || !e.UTC.Before(plan.End) {
				t.Errorf("night %d: event at %s outside [%s, %s)", n, e.UTC, plan.Start, plan.End)
			}
			if i > 0 && e.UTC.Before(plan.Events[i-1].UTC) {
				t.Errorf("night %d: events %d and %d out of time order", n, i-1, i)
			}
			got[key(e)] = e
		}
		want := 0
		for i := range targets {
			evs, err := p.Predict(targets[i], plan.Start, plan.End)
			if err != nil {
				t.Fatal(err)
			}
			for _, w := range evs {
				if !(w.Window.UsableFraction > 0) && !w.Observable {
					continue
				}
				want++
				g, ok := got[key(w)]
				if !ok {
					t.Errorf("night %d: %s cycle %v (usable %.3f) missing from the forecast", n, w.Target, w.Cycle, w.Window.UsableFraction)
					continue
				}
				// The forecast's sky table spans more days: the same event
				// agrees to the Sun's crossings each table finds from its
				// own samples (see TestWindowsIndependentOfSpan).
				if d := g.UTC.Sub(w.UTC) * secPerDay; math.Abs(d) > 1e-3 || math.Abs(g.AltDeg-w.AltDeg) > 1e-3 ||
					math.Abs(g.Window.UsableFraction-w.Window.UsableFraction) > 1e-3 || g.Observable != w.Observable {
					t.Errorf("night %d: %s cycle %v: forecast %s alt %.4f usable %.4f, Predict %s alt %.4f usable %.4f",
						n, w.Target, w.Cycle, g.UTC, g.AltDeg, g.Window.UsableFraction, w.UTC, w.AltDeg, w.Window.UsableFraction)
				}
			}
		}
		if want != len(plan.Events) {
			t.Errorf("night %d: %d events in the forecast, Predict finds %d with usable windows", n, len(plan.Events), want)
		}
	}
}

func key(e Event) string { return fmt.Sprintf("%s %.1f", e.Target, e.Cycle) }

func TestRankedAndScore(t *testing.T) {
	site := benchSite(t)
	targets := benchCatalogue(60)
	for i := range targets {
		targets[i].Name = "Bench " + string(rune('A'+i%26)) + string(rune('a'+i/26))
	}
	p, _ := NewPlanner(site, DefaultConstraints())
	plan, err := p.Night(targets, time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC))
	if err != nil {
		t.Fatal(err)
	}
	r := plan.Ranked()
	if len(r) != len(plan.Events) || len(r) < 5 {
		t.Fatalf("ranked %d of %d events", len(r), len(plan.Events))
	}
	for i, e := range r {
		if i > 0 && e.Score > r[i-1].Score {
			t.Errorf("rank %d: score %.3f above rank %d's %.3f", i, e.Score, i-1, r[i-1].Score)
		}
		if e.Score < 0 || e.Score > 1 || (e.Window.Whole && e.Score < 1.0/3) || (!e.Window.Whole && e.Score > 0.5) {
			t.Errorf("%s cycle %v: score %.3f out of its range (whole %v)", e.Target, e.Cycle, e.Score, e.Window.Whole)
		}
	}
	// The score formula, row by row (package documentation).
	base := Event{Window: Coverage{UsableFraction: 1, Whole: true, HalfWidthDays: 0.1}, EphemerisJD: 2460000, SigmaDays: 0.05}
	for _, tc := range []struct {
		name   string
		cov    float64
		whole  bool
		lastJD float64
		want   float64
	}{
		{"whole, never timed, σ = w/2", 1, true, 0, 1 * 2 * (1 + 1 + 0.5) / 6},
		{"whole, timed half a season ago", 1, true, 2460000 - AgeScaleDays/2, 2 * (1 + 0.5 + 0.5) / 6},
		{"half usable, timed today", 0.5, false, 2460000, 0.5 * (1 + 0 + 0.5) / 6},
		{"nothing usable", 0, false, 0, 0},
	} {
		e := base
		e.Window.UsableFraction, e.Window.Whole = tc.cov, tc.whole
		tg := Target{LastTimingJD: tc.lastJD}
		if got := score(&e, &tg); math.Abs(got-tc.want) > 1e-12 {
			t.Errorf("%s: score %v want %v", tc.name, got, tc.want)
		}
	}
}

// TestSolarWarning: a star a few degrees from the Sun at noon is flagged,
// and the night's stars are not.
func TestSolarWarning(t *testing.T) {
	site, _ := NewSite("Test Hill", 50, 10, 0, "UTC", 20, nil)
	noon, _ := ephem.FromTime(time.Date(2026, 6, 21, 11, 20, 0, 0, time.UTC))
	sun := ephem.NewSky(site.Site, noon).Sun()
	for _, tc := range []struct {
		name   string
		offDeg float64
		want   bool
	}{
		{"5° from the Sun", 5, true}, {"40° from the Sun", 40, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			star := ephem.Star{RAHours: sun.RAHours, DecDeg: sun.DecDeg - tc.offDeg}
			// A maximum seen at about local noon.
			jd := ephem.HJDOf(noon, star, site.Site)
			tg := NewTarget("Near Sun", star, Pulsating, ephem.Ephemeris{Epoch: jd, PeriodDays: 10, Scale: ephem.HJD}, Max)
			evs, err := Predict(site, tg, noon.AddDays(-0.1), noon.AddDays(0.1), DefaultConstraints())
			if err != nil || len(evs) != 1 {
				t.Fatalf("got %d events, %v", len(evs), err)
			}
			e := evs[0]
			if e.SolarWarning != tc.want || e.Observable || e.Reasons&Daylight == 0 {
				t.Errorf("Sun %.1f° away, Sun alt %.1f°: warning %v want %v; observable %v reasons %q",
					e.SunSepDeg, e.SunAltDeg, e.SolarWarning, tc.want, e.Observable, e.Reasons)
			}
		})
	}
	if !strings.Contains(SolarWarningText, "solar filter") {
		t.Errorf("the warning text must tell to use a solar filter: %q", SolarWarningText)
	}
}
