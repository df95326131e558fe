package observe

import (
	"fmt"
	"math"
	"time"

	"example.org/vigil/ephem"
)

// Chart holds what an altitude chart of one night shows, as plain values
// (app/chart draws it): the altitude of the chosen targets and of the Moon
// against time, the twilights, and the predicted extrema with their
// coverage windows.
type Chart struct {
	Site     string
	Location *time.Location // for local-time labels
	Date     time.Time      // the civil date the night begins on
	// From and To are the span to draw (UTC): an hour before sunset to an
	// hour after sunrise, or the whole night when the Sun does not set.
	From, To  time.Time
	MinAltDeg float64 // the site's lowest useful altitude
	SunAltDeg float64 // the planner's Sun limit
	Twilights Twilights
	Sun       Curve // for the twilight shading
	Moon      Curve
	MoonIllum float64 // at the middle of the span
	Stars     []Curve
	// Events are the extrema of the chosen targets in the span, with
	// TargetIndex pointing into Stars.
	Events []Event
}

// Curve is an altitude curve sampled in time.
type Curve struct {
	Name   string
	Times  []time.Time // UTC
	AltDeg []float64   // airless
}

// ChartStep is the sampling step of the chart's curves.
const ChartStep = 5 * time.Minute

// Chart returns the altitude chart of the night of date for the targets
// (at most 20, so that the chart stays readable).
func (p *Planner) Chart(targets []Target, date time.Time) (Chart, error) {
	if len(targets) > 20 {
		return Chart{}, fmt.Errorf("observe: chart of %d targets: at most 20", len(targets))
	}
	c := p.c
	c.KeepAll = true
	q := &Planner{site: p.site, c: c}
	plan, err := q.Night(targets, date)
	if err != nil {
		return Chart{}, err
	}
	tw := plan.Twilights
	from, to := plan.Start.JDUTC(), plan.End.JDUTC()
	if tw.Sunset.OK {
		from = math.Max(from, tw.Sunset.At.JDUTC()-1.0/24)
	}
	if tw.Sunrise.OK {
		to = math.Min(to, tw.Sunrise.At.JDUTC()+1.0/24)
	}
	tb, err := p.table(from, to)
	if err != nil {
		return Chart{}, err
	}
	ch := Chart{Site: p.site.Name, Location: p.site.Location(), Date: plan.Date,
		From: mustTime(from).Time(), To: mustTime(to).Time(), MinAltDeg: p.site.MinAltDeg,
		SunAltDeg: p.c.SunAltDeg, Twilights: tw}
	mid := tb.sky((from + to) / 2)
	ch.MoonIllum = mid.MoonIllumination()
	step := ChartStep.Hours() / 24
	n := int(math.Ceil((to-from)/step)) + 1
	times := make([]time.Time, n)
	skies := make([]ephem.Sky, n)
	for i := range times {
		skies[i] = tb.sky(math.Min(from+float64(i)*step, to))
		times[i] = skies[i].Time().Time()
	}
	curve := func(name string, alt func(s *ephem.Sky) float64) Curve {
		cv := Curve{Name: name, Times: times, AltDeg: make([]float64, n)}
		for i := range skies {
			cv.AltDeg[i] = alt(&skies[i])
		}
		return cv
	}
	ch.Sun = curve("Sun", (*ephem.Sky).SunAltDeg)
	ch.Moon = curve("Moon", func(s *ephem.Sky) float64 { return s.Moon().AltDeg })
	for i := range targets {
		v := targets[i].Star.Vec()
		ch.Stars = append(ch.Stars, curve(targets[i].Name, func(s *ephem.Sky) float64 { return s.StarAltDeg(&v) }))
	}
	for _, e := range plan.Events {
		if e.Window.End.JDUTC() > from && e.Window.Start.JDUTC() < to {
			ch.Events = append(ch.Events, e)
		}
	}
	return ch, nil
}
