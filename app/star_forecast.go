package app

import (
	"context"
	"fmt"
	"math"
	"time"

	"example.org/vigil/observe"
)

// StarForecastLengths are the lengths of the forecast on offer, in nights;
// the first is the one shown at first.
var StarForecastLengths = []int{14, 7, 30, 60}

// StarForecastData is the forecast of one star at one site: the plans of
// the nights from Date on, and, when no extremum falls in them, the first
// one after them.
type StarForecastData struct {
	Site   observe.Site
	Target observe.Target
	Date   time.Time // the civil date the first night begins on
	Nights int
	Plans  []observe.NightPlan
	// Next is the first extremum after the last night, when none falls in
	// the nights (looked for up to observe.MaxSpanDays ahead); nil when
	// there is one in the nights, or none ahead either.
	Next *observe.Event
}

// ForecastStar forecasts the extrema of target t at site for nights nights
// from the night of date (observe.Planner.Forecast with only this target,
// under PlanConstraints: every extremum is kept, with its verdict).
func ForecastStar(ctx context.Context, site observe.Site, t observe.Target, date time.Time, nights int) (StarForecastData, error) {
	d := StarForecastData{Site: site, Target: t, Date: date, Nights: nights}
	p, err := observe.NewPlanner(site, PlanConstraints())
	if err != nil {
		return d, fmt.Errorf("site %q: %w", site.Name, err)
	}
	if d.Plans, err = p.Forecast([]observe.Target{t}, date, nights); err != nil {
		return d, fmt.Errorf("forecast of %q: %w", t.Name, err)
	}
	if err := ctx.Err(); err != nil {
		return d, err
	}
	for _, n := range d.Plans {
		if len(n.Events) > 0 {
			return d, nil
		}
	}
	if len(d.Plans) > 0 {
		from := d.Plans[len(d.Plans)-1].End
		evs, err := p.Predict(t, from, from.AddDays(observe.MaxSpanDays))
		if err != nil {
			return d, fmt.Errorf("the next extremum of %q: %w", t.Name, err)
		}
		if len(evs) > 0 {
			d.Next = &evs[0]
		}
	}
	return d, ctx.Err()
}

// StarForecastColumns are the headings of the forecast table; "Max/min" is
// left out for a star whose extrema are all of one kind (no secondary
// minima).
var StarForecastColumns = []string{"Night of", "Local", "UTC", "Max/min", "± σ", "Altitude", "Usable", "Verdict"}

// StarForecastRow is one extremum of the forecast and its cells, in the
// order of StarForecastModel.Columns.
type StarForecastRow struct {
	Event   observe.Event
	Night   time.Time // the civil date its night begins on
	Cells   []string
	Caution bool // the Sun is up and near the star (observe.SolarWarningText)
}

// StarForecastModel is what the forecast panel shows: the extrema in time
// order (those that can be caught, or all), a summary, and how the
// predictions' uncertainty grows.
type StarForecastModel struct {
	Columns   []string // the table's headings (of StarForecastColumns)
	Rows      []StarForecastRow
	Summary   string
	SigmaNote string
	Cautions  int // rows with Caution
	Hidden    int // extrema left out because no part of their window can be observed
	Loc       *time.Location
}

// BuildStarForecast makes the forecast panel's model from d: every
// extremum when all is set, otherwise those with some usable part of their
// window.
func BuildStarForecast(d StarForecastData, all bool) StarForecastModel {
	m := StarForecastModel{Loc: d.Site.Location()}
	t := d.Target
	for _, c := range StarForecastColumns {
		if c != "Max/min" || t.Secondary {
			m.Columns = append(m.Columns, c)
		}
	}
	word := "maxima"
	if t.Kind == observe.Min {
		word = "minima"
	}
	var total, whole, partly int
	var maxSigma float64
	var maxCycle float64
	for _, n := range d.Plans {
		for _, e := range n.Events {
			total++
			switch {
			case e.Window.Whole:
				whole++
			case e.Window.UsableFraction > 0:
				partly++
			}
			if e.SigmaDays > maxSigma {
				maxSigma, maxCycle = e.SigmaDays, e.Cycle
			}
			if !all && e.Window.UsableFraction == 0 {
				m.Hidden++
				continue
			}
			verdict := verdictText(e)
			if e.SolarWarning {
				m.Cautions++
				verdict = "SUN NEAR: " + verdict
			}
			cells := map[string]string{
				"Night of": n.Date.Format("Mon 2 Jan"), "Local": clockText(e.UTC.Time(), m.Loc), "UTC": utcText(e.UTC.Time()),
				"Max/min": extremumText(e), "± σ": starSigmaCell(e.SigmaDays), "Altitude": degText(e.AltDeg),
				"Verdict": verdict, "Usable": percentText(e.Window.UsableFraction),
			}
			r := StarForecastRow{Event: e, Night: n.Date, Caution: e.SolarWarning}
			for _, c := range m.Columns {
				r.Cells = append(r.Cells, cells[c])
			}
			m.Rows = append(m.Rows, r)
		}
	}
	span := fmt.Sprintf("In the %d nights from %s at %s", d.Nights, d.Date.Format("Mon 2 Jan 2006"), d.Site.Name)
	switch {
	case total == 0 && d.Next != nil:
		e := d.Next
		m.Summary = fmt.Sprintf("%s, no %s falls (P = %s d). The next is predicted for %s local (%s UTC)",
			span, singular(word), numText(t.Ephemeris.PeriodDays), e.UTC.Time().In(m.Loc).Format("Mon 2 Jan 2006, 15:04"),
			utcText(e.UTC.Time()))
		if e.SigmaDays > 0 {
			m.Summary += ", " + sigmaText(e.SigmaDays)
		}
		m.Summary += "."
	case total == 0:
		m.Summary = fmt.Sprintf("%s, no %s falls.", span, singular(word))
	case whole+partly == 0:
		m.Summary = fmt.Sprintf("%s: %s, none of which can be observed from there.", span, plural(total, singular(word), word))
	default:
		m.Summary = fmt.Sprintf("%s: %s can be caught (%d whole, %d partly)", span, plural(whole+partly, singular(word), word), whole, partly)
		if n := total - whole - partly; n > 0 {
			m.Summary += fmt.Sprintf("; %d more cannot be observed", n)
		}
		m.Summary += "."
	}
	if m.Cautions > 0 {
		m.Summary += fmt.Sprintf(" %s near the Sun in daylight.", plural(m.Cautions, "extremum", "extrema"))
	}
	e := t.Ephemeris
	switch {
	case e.EpochErr == 0 && e.PeriodErr == 0:
		m.SigmaNote = "The ephemeris gives no uncertainties (σT0, σP), so how far off these times may be cannot be told: a new timing will show it."
	case total > 0:
		m.SigmaNote = fmt.Sprintf("Each time is uncertain by σ = √(σT0² + (E·σP)²), which grows with the cycles E since T0: "+
			"%s at E = %s here.", sigmaText(maxSigma), cycleText(maxCycle))
	}
	return m
}

// Col returns the index of the column headed name, -1 when it is not shown.
func (m StarForecastModel) Col(name string) int {
	for i, c := range m.Columns {
		if c == name {
			return i
		}
	}
	return -1
}

// Detail describes row i in full: when, which cycle, how uncertain, where
// the star stands, the window and why parts of it cannot be used, and the
// Sun caution where it applies.
func (m StarForecastModel) Detail(i int) string {
	if i < 0 || i >= len(m.Rows) {
		return ""
	}
	e := m.Rows[i].Event
	s := fmt.Sprintf("%s at %s local (%s UTC), cycle E = %s", extremumText(e),
		e.UTC.Time().In(m.Loc).Format("Mon 2 Jan 15:04"), utcText(e.UTC.Time()), cycleText(e.Cycle))
	if e.SigmaDays > 0 {
		s += ", predicted to " + sigmaText(e.SigmaDays)
	}
	s += fmt.Sprintf(". Altitude %s, air mass %s, Moon %s. Window %s–%s: %s usable", degText(e.AltDeg), airmassText(e),
		moonText(e), clockText(e.Window.Start.Time(), m.Loc), clockText(e.Window.End.Time(), m.Loc),
		percentText(e.Window.UsableFraction))
	if r := e.Window.Reasons.String(); r != "" {
		s += " (" + r + ")"
	}
	s += "."
	if e.SolarWarning {
		s += "\n" + observe.SolarWarningText
	}
	return s
}

// starSigmaCell writes a prediction's uncertainty for the table, "—" when
// the ephemeris gives none.
func starSigmaCell(days float64) string {
	if days <= 0 || math.IsNaN(days) {
		return "—"
	}
	return sigmaText(days)
}

// cycleText writes a cycle number: whole, or with .5 for a secondary
// minimum.
func cycleText(e float64) string {
	if e == math.Trunc(e) {
		return fmt.Sprintf("%.0f", e)
	}
	return fmt.Sprintf("%.1f", e)
}

// singular turns "maxima" and "minima" into "maximum" and "minimum".
func singular(word string) string {
	if word == "minima" {
		return "minimum"
	}
	return "maximum"
}
