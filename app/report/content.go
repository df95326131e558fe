package report

import (
	"fmt"
	"sort"
	"strings"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

// layout checks the log and lays it out as blocks (see doc).
func (l *NightLog) layout() (doc, error) {
	if err := l.Validate(); err != nil {
		return doc{}, err
	}
	site := l.Site
	_ = site.Validate() // loads the time zone; checked by Validate
	loc := site.Location()
	ck := newClock(loc, l.Night)
	mid := l.Night.Start.AddDays(l.Night.End.Sub(l.Night.Start) / 2).Time()

	d := doc{title: "Observing log: " + site.Name, subtitle: "night of " + nightText(l.Night.Date)}
	add := func(b ...block) { d.blocks = append(d.blocks, b...) }

	add(pair{left: l.siteFields(zoneText(site, loc, mid)), right: l.twilightTable(ck), split: 0.5})
	add(para{text: l.darknessText(ck)}, para{text: l.moonText(ck)})

	events := append([]observe.Event(nil), l.Plan.Events...)
	sort.SliceStable(events, func(i, j int) bool { return events[i].UTC.Before(events[j].UTC) })
	if l.Chart != nil {
		add(heading{"Altitude chart"},
			chartBlock{chart: l.Chart, events: events, hourly: hourlyTable(*l.Chart, ck)},
			para{small: true, text: "Altitude (°, airless) against local time (upper labels) and UTC (lower " +
				"labels). Shading: daylight, civil, nautical and astronomical twilight, night. Dashed: the Moon " +
				"and the lowest useful altitude. ▲ maximum, ▼ minimum, filled when observable, numbered as the " +
				"planned extrema below; bars along the foot: coverage windows."})
	}

	add(heading{"Planned extrema"}, para{text: "Planned under: " + constraintsText(l.Constraints, site) + "."})
	add(eventTable(events, ck))
	if len(events) > 0 {
		add(para{small: true, text: "kind: max = maximum light, min = minimum light, min II = secondary " +
			"minimum. ±1σ: uncertainty of the prediction from the ephemeris errors (— not known). alt: " +
			"airless altitude; az: azimuth from north through east; airmass: — below the horizon. Moon sep: " +
			"* while the Moon is below the horizon. usable: the part of the coverage window about the " +
			"extremum in which the star is observable; reasons: why not, at the extremum and in the window."})
	}
	for i, e := range events {
		if e.SolarWarning {
			add(caution{title: fmt.Sprintf("Sun caution, event %d: %s %s at %s %s", i+1, e.Target,
				kindText(e.Kind, e.Secondary), ck.local(e.UTC.Time(), false), ck.zone), text: observe.SolarWarningText})
		}
	}

	add(heading{"Notes at the eyepiece"})
	var forms []block
	for i, e := range events {
		if e.Window.UsableFraction > 0 {
			forms = append(forms, eventNotes(i+1, e, ck))
		}
	}
	if len(forms) < len(events) {
		add(para{small: true, text: fmt.Sprintf("A form for the whole night, then one for each of the %d of "+
			"%d planned extrema with a usable part of their window.", len(forms), len(events))})
	}
	add(notes{title: "The whole night", labels: noteLabels, lines: 5})
	add(forms...)

	add(pageBreak{}, heading{"After the night"})
	add(measurementTable(l.Measurements, ck), timingTable(l.Timings))
	return d, nil
}

// noteLabels are the fields of a notes form.
var noteLabels = []string{"time (local)", "sky conditions", "seeing", "equipment", "observer"}

func (l *NightLog) siteFields(zone string) fields {
	s := l.Site
	horizon := "flat horizon"
	if len(s.Horizon) > 0 {
		horizon = fmt.Sprintf("horizon profile of %d points, up to %.0f°", len(s.Horizon), s.Horizon.MaxAltDeg())
	}
	f := fields{title: "Site", rows: [][2]string{
		{"site", s.Name},
		{"latitude", signed("%+.4f°", s.LatDeg) + " (north +)"},
		{"longitude", signed("%+.4f°", s.LonDeg) + " (EAST +)"},
		{"elevation", fmt.Sprintf("%.0f m", s.ElevM)},
		{"time zone", zone},
		{"lowest altitude", fmt.Sprintf("%.0f° (%s)", s.MinAltDeg, horizon)},
	}}
	if l.Observer != "" {
		f.rows = append(f.rows, [2]string{"observer", l.Observer})
	}
	return f
}

func (l *NightLog) twilightTable(ck clock) table {
	n := l.Night
	rows := []struct {
		name string
		e    ephem.Event
	}{
		{"sunset (Sun −0.83°)", n.Sunset}, {"civil dusk (−6°)", n.CivilDusk},
		{"nautical dusk (−12°)", n.NauticalDusk}, {"astronomical dusk (−18°)", n.AstroDusk},
		{"astronomical dawn (−18°)", n.AstroDawn}, {"nautical dawn (−12°)", n.NauticalDawn},
		{"civil dawn (−6°)", n.CivilDawn}, {"sunrise (−0.83°)", n.Sunrise},
		{"moonrise", n.Moonrise}, {"moonset", n.Moonset},
	}
	t := table{title: "The night", cols: []col{
		{head: "event", mm: 46}, {head: ck.headLocal(), unit: "hh:mm", right: true, mm: 22},
		{head: "UTC", unit: "hh:mm", right: true, mm: 18}}}
	for _, r := range rows {
		lt, ut := ck.event(r.e)
		t.rows = append(t.rows, []string{r.name, lt, ut})
	}
	return t
}

func (l *NightLog) darknessText(ck clock) string {
	n, tw := l.Night, l.Plan.Twilights
	var s string
	switch {
	case n.SunAlwaysUp:
		s = "The Sun does not set tonight (midnight sun): no astronomical darkness tonight."
	case !n.AstroDusk.OK && !n.SunAlwaysDown:
		s = "No astronomical darkness tonight: the Sun stays above −18°."
	case n.SunAlwaysDown:
		s = "The Sun does not rise (polar night)."
	default:
		s = fmt.Sprintf("Astronomical darkness from %s to %s %s (%s to %s UTC), %s h.",
			ck.local(n.AstroDusk.At.Time(), false), ck.local(n.AstroDawn.At.Time(), false), ck.zone,
			ck.utc(n.AstroDusk.At.Time(), false), ck.utc(n.AstroDawn.At.Time(), false),
			ephem.FormatDuration(n.AstroDawn.At.Sub(n.AstroDusk.At), false))
	}
	if tw.DarkFrom.OK && tw.DarkTo.OK {
		s += fmt.Sprintf(" Dark enough for the plan (Sun below %s): %s to %s %s (%s to %s UTC).",
			signed("%.0f°", l.Constraints.SunAltDeg),
			ck.local(tw.DarkFrom.At.Time(), false), ck.local(tw.DarkTo.At.Time(), false), ck.zone,
			ck.utc(tw.DarkFrom.At.Time(), false), ck.utc(tw.DarkTo.At.Time(), false))
	}
	return s
}

func (l *NightLog) moonText(ck clock) string {
	n := l.Night
	s := fmt.Sprintf("Moon: %.0f%% illuminated", 100*n.MoonIllum)
	if n.MoonIllumAt.Valid() {
		s += fmt.Sprintf(" (at %s %s, %s UTC)", ck.local(n.MoonIllumAt.Time(), false), ck.zone,
			ck.utc(n.MoonIllumAt.Time(), false))
	}
	s += ". Rise and set are listed only between sunset and sunrise; — means none in that span."
	return s
}

func constraintsText(c observe.Constraints, s observe.Site) string {
	parts := []string{"Sun below " + signed("%.0f°", c.SunAltDeg),
		fmt.Sprintf("star above %.0f°", s.MinAltDeg)}
	if len(s.Horizon) > 0 {
		parts[1] += " and the horizon profile"
	}
	if c.MoonMinSepDeg > 0 {
		parts = append(parts, fmt.Sprintf("at least %.0f° from the Moon while it is up", c.MoonMinSepDeg))
	}
	if c.WindowDays > 0 {
		parts = append(parts, fmt.Sprintf("coverage window ±%.1f h", 24*c.WindowDays))
	} else {
		parts = append(parts, fmt.Sprintf("coverage window ±%.2g of the period, at most ±%.1f h",
			c.WindowFraction, 24*c.WindowMaxDays))
	}
	return strings.Join(parts, ", ")
}
