package app

import (
	"context"
	"errors"
	"fmt"
	"strings"
	"time"

	"example.org/vigil/observe"
)

// TonightColumns are the headings of the Tonight table.
var TonightColumns = []string{"Local", "UTC", "Star", "Extremum", "Altitude", "Air mass", "Moon", "Verdict", "Usable"}

// TonightRow is one line of the Tonight table: an extremum and its cells,
// in the order of TonightColumns.
type TonightRow struct {
	Event   observe.Event
	Cells   []string
	Caution bool // the Sun is up and near the star (observe.SolarWarningText)
}

// TonightModel is what the Tonight page shows for a night: the extrema of
// every star in time order, a summary line (or, with no rows, what to do),
// and the stars of the altitude chart.
type TonightModel struct {
	Rows     []TonightRow
	Summary  string
	Cautions int // rows with Caution
	Loc      *time.Location
	// Chart lists the stars of the altitude chart: the selected one first,
	// then the best-ranked others (ChartStars in all).
	Chart []observe.Target
}

// ChartStars is how many stars the Tonight page's altitude chart shows.
const ChartStars = 4

// BuildTonight makes the Tonight page's model from the session's state:
// whether a site is set, the targets, the night's plan (nil while it is
// computed) and the selected star.
func BuildTonight(hasSite bool, targets []observe.Target, nd *NightData, selected string) TonightModel {
	var m TonightModel
	switch {
	case !hasSite:
		m.Summary = "This logbook has no observing site yet, so there is no night to plan. " +
			"Import a sites.csv giving the site's latitude, longitude (east positive), time zone and lowest useful altitude."
		return m
	case len(targets) == 0:
		m.Summary = "No stars yet: add one or import a catalogue, and the night's maxima and minima will be listed here."
		return m
	case nd == nil:
		m.Summary = "Planning the night…"
		return m
	case errors.Is(nd.Err, context.Canceled):
		m.Summary = "Planning was cancelled. Step to another night (Alt+← or Alt+→) to plan again."
		return m
	case nd.Err != nil:
		m.Summary = "This night could not be planned: " + nd.Err.Error()
		return m
	}
	m.Loc = nd.Request.Site.Location()
	var whole, partly int
	for _, e := range nd.Events {
		r := TonightRow{Event: e, Caution: e.SolarWarning, Cells: []string{
			clockText(e.UTC.Time(), m.Loc), utcText(e.UTC.Time()), e.Target, extremumText(e),
			degText(e.AltDeg), airmassText(e), moonText(e), verdictText(e), percentText(e.Window.UsableFraction),
		}}
		if r.Caution {
			m.Cautions++
			r.Cells[7] = "SUN NEAR: " + r.Cells[7]
		}
		switch {
		case e.Window.Whole:
			whole++
		case e.Window.UsableFraction > 0:
			partly++
		}
		m.Rows = append(m.Rows, r)
	}
	if len(m.Rows) == 0 {
		m.Summary = fmt.Sprintf("None of the %d stars has a maximum or minimum in this night. "+
			"Try the next night (Alt+→ or Page Down).", len(targets))
	} else {
		m.Summary = fmt.Sprintf("%s in the night: %d whole, %d partly, %d not observable",
			plural(len(m.Rows), "extremum", "extrema"), whole, partly, len(m.Rows)-whole-partly)
		if m.Cautions > 0 {
			m.Summary += fmt.Sprintf(" · %s near the Sun in daylight", plural(m.Cautions, "event", "events"))
		}
	}
	m.Chart = chartStars(targets, nd, selected)
	return m
}

// chartStars picks the stars of the altitude chart: the selected one, then
// the others in the order of the plan's ranking (observe.NightPlan.Ranked),
// those with a usable window only.
func chartStars(targets []observe.Target, nd *NightData, selected string) []observe.Target {
	var out []observe.Target
	add := func(name string) {
		for _, t := range out {
			if strings.EqualFold(t.Name, name) {
				return
			}
		}
		for _, t := range targets {
			if strings.EqualFold(t.Name, name) && len(out) < ChartStars {
				out = append(out, t)
			}
		}
	}
	if selected != "" {
		add(selected)
	}
	for _, e := range nd.Plan.Ranked() {
		if e.Window.UsableFraction > 0 {
			add(e.Target)
		}
	}
	return out
}

// RowOf returns the first row of the star named name, -1 when it has none.
func (m TonightModel) RowOf(name string) int {
	for i, r := range m.Rows {
		if strings.EqualFold(r.Event.Target, name) {
			return i
		}
	}
	return -1
}

// Detail describes row i in full: when, what, the coverage window and why
// parts of it cannot be used, and the Sun caution where it applies.
func (m TonightModel) Detail(i int) string {
	if i < 0 || i >= len(m.Rows) {
		return ""
	}
	e := m.Rows[i].Event
	s := fmt.Sprintf("%s: %s at %s local (%s UTC), cycle %g", e.Target, extremumText(e),
		clockText(e.UTC.Time(), m.Loc), utcText(e.UTC.Time()), e.Cycle)
	if e.SigmaDays > 0 {
		s += ", predicted to " + sigmaText(e.SigmaDays)
	}
	s += fmt.Sprintf(". Window %s–%s: %s usable", clockText(e.Window.Start.Time(), m.Loc),
		clockText(e.Window.End.Time(), m.Loc), percentText(e.Window.UsableFraction))
	if r := e.Window.Reasons.String(); r != "" {
		s += " (" + r + ")"
	}
	s += "."
	if e.SolarWarning {
		s += "\n" + observe.SolarWarningText
	}
	return s
}

// plural writes n with the singular or plural noun.
func plural(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return fmt.Sprintf("%d %s", n, many)
}
