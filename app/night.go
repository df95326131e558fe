package app

import (
	"context"
	"fmt"
	"strings"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

// PlanRequest is what the plan of one night needs (Session.PlanRequest).
type PlanRequest struct {
	Site    observe.Site
	Date    time.Time // the civil date the night begins on, 0h UTC
	Targets []observe.Target
	gen     int
}

// Catch says how much of a star's best extremum tonight can be observed.
type Catch int

// The catches, worst first.
const (
	CatchNoEvent Catch = iota // no extremum falls in the night
	CatchNot                  // extrema fall in the night, none usable
	CatchPartly               // part of a coverage window is usable
	CatchWhole                // a whole coverage window and its extremum are usable
)

// String returns the catch in the star list's words (catchText).
func (c Catch) String() string { return catchText(c) }

// StarTonight sums up one star's night for the star list.
type StarTonight struct {
	Best  observe.Event // the extremum Catch refers to (when Count > 0)
	Catch Catch
	Count int // extrema in the night
}

// SkySample is where the Sun and the Moon stand at one instant: airless
// altitudes in degrees, the Sun's topocentric, the Moon's geocentric (as
// almanacs and ephem.NightOf count moonrise and moonset).
type SkySample struct {
	At                    time.Time
	SunAltDeg, MoonAltDeg float64
}

// NightData is the plan of one night at one site, computed off the UI
// thread by PlanNight and shared by the header, the star list and the pages
// through Session.Night.
type NightData struct {
	Request PlanRequest
	// Sky holds the twilights, moonrise and moonset (within the dark span)
	// and the Moon's illuminated fraction (ephem.NightOf).
	Sky ephem.Night
	// From and To bound what the window shows of the night (UTC): an hour
	// before sunset to an hour after sunrise, or noon to noon when the Sun
	// does not set or does not rise.
	From, To time.Time
	// Samples follow the Sun and the Moon through [From, To] every
	// observe.ChartStep, for the twilight strip.
	Samples []SkySample
	// Plan holds every extremum from noon to noon with its verdict
	// (observe.Constraints.KeepAll); Events those seen between From and To
	// or with some usable part, in time order.
	Plan   observe.NightPlan
	Events []observe.Event
	// Stars sums up each target's night, keyed by its lower-case name.
	Stars map[string]StarTonight
	// Err is set, and the rest empty, when the night could not be planned.
	Err error
}

// Star returns the summary of the target named name (any case).
func (nd *NightData) Star(name string) StarTonight {
	return nd.Stars[strings.ToLower(name)]
}

// MoonUpDeg is the geocentric altitude of the Moon's centre at which it
// counts as up, as ephem.NightOf counts moonrise (+0.125°: USNO, "Rise,
// Set, and Twilight Definitions").
const MoonUpDeg = 0.125

// SkyLevel returns how dark the sky is with the Sun at altitude altDeg:
// 0 day (above −0.8333°), 1 civil twilight (to −6°), 2 nautical (to −12°),
// 3 astronomical (to −18°), 4 night (USNO definitions).
func SkyLevel(sunAltDeg float64) int {
	switch {
	case sunAltDeg >= ephem.SunriseAltDeg:
		return 0
	case sunAltDeg >= -6:
		return 1
	case sunAltDeg >= -12:
		return 2
	case sunAltDeg >= -18:
		return 3
	}
	return 4
}

// PlanConstraints are the constraints of the window's plans: the planner's
// defaults (observe.DefaultConstraints), keeping the events that cannot be
// observed so that the table can say why.
func PlanConstraints() observe.Constraints {
	c := observe.DefaultConstraints()
	c.KeepAll = true
	return c
}

// PlanNight computes the night of r: its twilights and Moon (ephem.NightOf),
// the Sun's and Moon's altitudes through it, and every target's extrema with
// their verdicts (observe.Planner.Night under PlanConstraints). It gives up
// with ctx's error when ctx is cancelled between steps.
func PlanNight(ctx context.Context, r PlanRequest) (*NightData, error) {
	p, err := observe.NewPlanner(r.Site, PlanConstraints())
	if err != nil {
		return nil, fmt.Errorf("site %q: %w", r.Site.Name, err)
	}
	nd := &NightData{Request: r, Stars: map[string]StarTonight{}}
	if nd.Sky, err = ephem.NightOf(r.Site.Site, r.Date); err != nil {
		return nil, fmt.Errorf("night of %s at %q: %w", r.Date.Format(time.DateOnly), r.Site.Name, err)
	}
	nd.From, nd.To = nd.Sky.Start.Time(), nd.Sky.End.Time()
	if nd.Sky.Sunset.OK && nd.Sky.Sunrise.OK {
		nd.From = nd.Sky.Sunset.At.Time().Add(-time.Hour)
		nd.To = nd.Sky.Sunrise.At.Time().Add(time.Hour)
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	if err := nd.sample(); err != nil {
		return nil, err
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	if nd.Plan, err = p.Night(r.Targets, r.Date); err != nil {
		return nil, err
	}
	for _, e := range nd.Plan.Events {
		t := e.UTC.Time()
		if e.Window.UsableFraction > 0 || (!t.Before(nd.From) && !t.After(nd.To)) {
			nd.Events = append(nd.Events, e)
			nd.tally(e)
		}
	}
	return nd, ctx.Err()
}

// sample follows the Sun and the Moon through [From, To].
func (nd *NightData) sample() error {
	for t := nd.From; !t.After(nd.To); t = t.Add(observe.ChartStep) {
		at, err := ephem.FromTime(t)
		if err != nil {
			return err
		}
		sky := ephem.NewSky(nd.Request.Site.Site, at)
		nd.Samples = append(nd.Samples, SkySample{At: t, SunAltDeg: sky.SunAltDeg(), MoonAltDeg: sky.MoonGeocentric().AltDeg})
	}
	return nil
}

// tally adds an event to its star's summary: the star keeps its best
// extremum (whole before partly before not; the earlier of equals).
func (nd *NightData) tally(e observe.Event) {
	k := strings.ToLower(e.Target)
	s := nd.Stars[k]
	c := CatchNot
	switch {
	case e.Window.Whole:
		c = CatchWhole
	case e.Window.UsableFraction > 0:
		c = CatchPartly
	}
	if s.Count == 0 || c > s.Catch {
		s.Best, s.Catch = e, c
	}
	s.Count++
	nd.Stars[k] = s
}

// TimeSpan is a stretch of time [From, To).
type TimeSpan struct{ From, To time.Time }

// MoonUp returns the stretches of [From, To] in which the Moon is above the
// horizon (MoonUpDeg), from the samples, each crossing placed by linear
// interpolation between the samples around it. A stretch under way at
// either end of the span starts at From or ends at To.
func (nd *NightData) MoonUp() []TimeSpan {
	var out []TimeSpan
	for i, s := range nd.Samples {
		up := s.MoonAltDeg > MoonUpDeg
		wasUp := i > 0 && nd.Samples[i-1].MoonAltDeg > MoonUpDeg
		switch {
		case i == 0 && up:
			out = append(out, TimeSpan{From: nd.From})
		case up && !wasUp:
			out = append(out, TimeSpan{From: crossing(nd.Samples[i-1], s)})
		case !up && wasUp:
			out[len(out)-1].To = crossing(nd.Samples[i-1], s)
		}
		if up && i == len(nd.Samples)-1 {
			out[len(out)-1].To = nd.To
		}
	}
	return out
}

// crossing returns when the Moon passes MoonUpDeg between samples a and b.
func crossing(a, b SkySample) time.Time {
	f := (MoonUpDeg - a.MoonAltDeg) / (b.MoonAltDeg - a.MoonAltDeg)
	return a.At.Add(time.Duration(f * float64(b.At.Sub(a.At))))
}
