package app

import (
	"context"
	"errors"
	"math"
	"testing"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/demo"
	"example.org/vigil/observe"
)

// Tolerances of the night's checks.
const (
	// moonEdgeTolDeg: the Moon's altitude at the ends of a MoonUp span,
	// found by linear interpolation between samples 5 min apart, against
	// ephem's own altitude there. The curvature of the altitude over 5 min
	// leaves well under 0.01°.
	moonEdgeTolDeg = 0.02
	// moonRiseTol: a MoonUp span's start against ephem.NightOf's moonrise
	// (a root finder, to about a second). 0.02° of altitude at the Moon's
	// fastest climb (about 0.25°/min) is 5 s.
	moonRiseTol = 10 * time.Second
)

func TestSkyLevel(t *testing.T) {
	// USNO, "Rise, Set, and Twilight Definitions": −0.8333° (sunset),
	// −6° (civil), −12° (nautical), −18° (astronomical).
	cases := []struct {
		sunAltDeg float64
		want      int
	}{
		{10, 0}, {-0.8333, 0}, {-0.84, 1}, {-6, 1}, {-6.01, 2}, {-12, 2}, {-12.01, 3}, {-18, 3}, {-18.01, 4}, {-60, 4},
	}
	for _, tc := range cases {
		if got := SkyLevel(tc.sunAltDeg); got != tc.want {
			t.Errorf("SkyLevel(%g°) = %d, want %d", tc.sunAltDeg, got, tc.want)
		}
	}
}

func TestMoonUpFromSamples(t *testing.T) {
	t0 := time.Date(2026, 12, 1, 16, 0, 0, 0, time.UTC)
	at := func(alts ...float64) *NightData {
		nd := &NightData{From: t0, To: t0.Add(time.Duration(len(alts)-1) * time.Hour)}
		for i, a := range alts {
			nd.Samples = append(nd.Samples, SkySample{At: t0.Add(time.Duration(i) * time.Hour), MoonAltDeg: a})
		}
		return nd
	}
	h := func(x float64) time.Time { return t0.Add(time.Duration(x * float64(time.Hour))) }
	cases := []struct {
		name string
		nd   *NightData
		want []TimeSpan
	}{
		{"down all night", at(-10, -5, -1), nil},
		{"up all night", at(5, 20, 10), []TimeSpan{{h(0), h(2)}}},
		// a rise between −9.875 and +10.125 at the half-way point
		{"rises", at(-20, -9.875, 10.125, 30), []TimeSpan{{h(1.5), h(3)}}},
		{"sets", at(30, 10.125, -9.875), []TimeSpan{{h(0), h(1.5)}}},
		{"sets and rises again", at(10.125, -9.875, -9.875, 10.125), []TimeSpan{{h(0), h(0.5)}, {h(2.5), h(3)}}},
	}
	for _, tc := range cases {
		got := tc.nd.MoonUp()
		if len(got) != len(tc.want) {
			t.Errorf("%s: got %d spans %v, want %v", tc.name, len(got), got, tc.want)
			continue
		}
		for i := range got {
			if d := got[i].From.Sub(tc.want[i].From).Abs() + got[i].To.Sub(tc.want[i].To).Abs(); d > time.Second {
				t.Errorf("%s: span %d = %v–%v, want %v–%v", tc.name, i, got[i].From, got[i].To, tc.want[i].From, tc.want[i].To)
			}
		}
	}
}

func planTestNight(t *testing.T, date time.Time) *NightData {
	t.Helper()
	nd, err := PlanNight(context.Background(), PlanRequest{Site: demo.Site(), Date: date, Targets: smallTargets()})
	if err != nil {
		t.Fatal(err)
	}
	return nd
}

// The Moon's span above the horizon, from the samples, against ephem's
// altitudes and ephem.NightOf's moonrise and moonset.
func TestPlanNightMoonAgreesWithEphem(t *testing.T) {
	site := demo.Site()
	for _, date := range []time.Time{
		time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC),  // Moon rises after midnight
		time.Date(2026, 12, 20, 0, 0, 0, 0, time.UTC), // Moon sets in the evening
	} {
		nd := planTestNight(t, date)
		up := nd.MoonUp()
		if len(up) == 0 {
			t.Errorf("%s: no Moon in the night", date.Format(time.DateOnly))
		}
		for _, u := range up {
			for _, edge := range []time.Time{u.From, u.To} {
				if edge.Equal(nd.From) || edge.Equal(nd.To) {
					continue // the span's end is the strip's end, not a crossing
				}
				at, _ := ephem.FromTime(edge)
				alt := ephem.NewSky(site.Site, at).MoonGeocentric().AltDeg
				if d := math.Abs(alt - MoonUpDeg); d > moonEdgeTolDeg {
					t.Errorf("%s: Moon at %s is at %.3f°, want %.3f° ± %.2f°", date.Format(time.DateOnly), edge, alt, MoonUpDeg, moonEdgeTolDeg)
				}
			}
		}
		for _, ev := range []ephem.Event{nd.Sky.Moonrise, nd.Sky.Moonset} {
			if !ev.OK {
				continue
			}
			best := time.Duration(math.MaxInt64)
			for _, u := range up {
				best = min(best, u.From.Sub(ev.At.Time()).Abs(), u.To.Sub(ev.At.Time()).Abs())
			}
			if best > moonRiseTol {
				t.Errorf("%s: ephem.NightOf's Moon crossing %s is %v from the nearest MoonUp edge, want ≤ %v",
					date.Format(time.DateOnly), ev.At, best, moonRiseTol)
			}
		}
	}
}

func TestPlanNightShape(t *testing.T) {
	nd := planTestNight(t, time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC))
	if !nd.Sky.Sunset.OK || !nd.From.Equal(nd.Sky.Sunset.At.Time().Add(-time.Hour)) || !nd.To.Equal(nd.Sky.Sunrise.At.Time().Add(time.Hour)) {
		t.Errorf("span %v–%v: want an hour before sunset %v to an hour after sunrise %v", nd.From, nd.To, nd.Sky.Sunset, nd.Sky.Sunrise)
	}
	for i, s := range nd.Samples {
		if want := nd.From.Add(time.Duration(i) * observe.ChartStep); !s.At.Equal(want) || s.At.After(nd.To) {
			t.Fatalf("sample %d at %v, want %v within the span", i, s.At, want)
		}
	}
	if lvl := SkyLevel(nd.Samples[0].SunAltDeg); lvl != 0 {
		t.Errorf("an hour before sunset the sky is level %d, want 0 (day)", lvl)
	}
	if len(nd.Events) == 0 {
		t.Fatal("no event in the night for three stars with periods under a day")
	}
	count := 0
	for i, e := range nd.Events {
		if i > 0 && e.UTC.Before(nd.Events[i-1].UTC) {
			t.Errorf("event %d at %v is before the one before it", i, e.UTC)
		}
		in := !e.UTC.Time().Before(nd.From) && !e.UTC.Time().After(nd.To)
		if !in && e.Window.UsableFraction == 0 {
			t.Errorf("event %d (%s at %v) is outside the night and unusable, so should not be listed", i, e.Target, e.UTC)
		}
		st := nd.Star(e.Target)
		if c := catchOf(e); c > st.Catch {
			t.Errorf("%s: summary catch %v is worse than that of its event at %v (%v)", e.Target, st.Catch, e.UTC, c)
		}
	}
	for _, tg := range smallTargets() {
		count += nd.Star(tg.Name).Count
	}
	if count != len(nd.Events) {
		t.Errorf("the star summaries count %d events, the night lists %d", count, len(nd.Events))
	}
}

func catchOf(e observe.Event) Catch {
	switch {
	case e.Window.Whole:
		return CatchWhole
	case e.Window.UsableFraction > 0:
		return CatchPartly
	}
	return CatchNot
}

func TestPlanNightCancelled(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	_, err := PlanNight(ctx, PlanRequest{Site: demo.Site(), Date: time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC), Targets: smallTargets()})
	if !errors.Is(err, context.Canceled) {
		t.Errorf("PlanNight with a cancelled context: got %v, want context.Canceled", err)
	}
}
