package report

import (
	"fmt"
	"math"
	"strconv"
	"time"

	"example.org/vigil/observe"
)

// eventTable lists the planned extrema in time order.
func eventTable(events []observe.Event, ck clock) table {
	t := table{empty: "No planned extrema tonight.", cols: []col{
		{head: "#", right: true, mm: 6}, {head: "target", mm: 22}, {head: "kind", mm: 10},
		{head: ck.headLocal(), unit: "hh:mm", right: true, mm: 14}, {head: "UTC", unit: "hh:mm", right: true, mm: 11},
		{head: "±1σ", unit: "min", right: true, mm: 10}, {head: "alt", unit: "°", right: true, mm: 8},
		{head: "az", unit: "°", right: true, mm: 8}, {head: "airmass", unit: "X", right: true, mm: 13},
		{head: "Moon sep", unit: "°", right: true, mm: 15}, {head: "observable", unit: "at extremum", mm: 18},
		{head: "usable", unit: "% of window", right: true, mm: 17}, {head: "reasons", mm: 36}}}
	for i, e := range events {
		moon := fmt.Sprintf("%.0f", e.MoonSepDeg)
		if e.MoonAltDeg < 0 {
			moon += "*"
		}
		verdict := "no"
		if e.Observable {
			verdict = "yes"
		}
		t.rows = append(t.rows, []string{strconv.Itoa(i + 1), e.Target, kindText(e.Kind, e.Secondary),
			ck.local(e.UTC.Time(), false), ck.utc(e.UTC.Time(), false), sigmaMinutes(e.SigmaDays),
			signed("%.0f", e.AltDeg), fmt.Sprintf("%.0f", e.AzDeg), num("%.2f", e.Airmass), moon, verdict,
			fmt.Sprintf("%.0f", 100*e.Window.UsableFraction), reasonsText(e)})
	}
	return t
}

// eventNotes is the notes form of the n-th planned event.
func eventNotes(n int, e observe.Event, ck clock) notes {
	title := fmt.Sprintf("%d. %s %s at %s %s (%s UTC)", n, e.Target, kindText(e.Kind, e.Secondary),
		ck.local(e.UTC.Time(), false), ck.zone, ck.utc(e.UTC.Time(), false))
	if e.SigmaDays > 0 {
		title += fmt.Sprintf(" ±%s min", sigmaMinutes(e.SigmaDays))
	}
	detail := fmt.Sprintf("E = %s, predicted %.5f %s; alt %.0f°, az %.0f°; window %s to %s %s, %.0f%% usable",
		strconv.FormatFloat(e.Cycle, 'f', -1, 64), e.EphemerisJD, e.Scale.Label(), e.AltDeg, e.AzDeg,
		ck.local(e.Window.Start.Time(), false), ck.local(e.Window.End.Time(), false), ck.zone,
		100*e.Window.UsableFraction)
	if e.SolarWarning {
		detail += ". " + observe.SolarWarningText
	}
	return notes{title: title, detail: detail, labels: noteLabels, lines: 2}
}

// measurementTable lists the magnitudes measured, in the order given.
func measurementTable(ms []Measurement, ck clock) table {
	t := table{title: "Measurements", empty: "No measurements recorded.", blank: 10, cols: []col{
		{head: "#", right: true, mm: 7}, {head: ck.headLocal(), unit: "hh:mm:ss", right: true, mm: 18},
		{head: "UTC", unit: "hh:mm:ss", right: true, mm: 16}, {head: "target", mm: 30},
		{head: "band", mm: 10}, {head: "mag", unit: "mag", right: true, mm: 14},
		{head: "±1σ", unit: "mag", right: true, mm: 12}, {head: "comparison", mm: 42}, {head: "check", mm: 37}}}
	for i, m := range ms {
		band := m.Band
		if band == "" {
			band = dash
		}
		check := m.Check
		if check == "" {
			check = dash
		}
		t.rows = append(t.rows, []string{strconv.Itoa(i + 1), ck.local(m.Time.Time(), true),
			ck.utc(m.Time.Time(), true), m.Target, band, num("%.3f", m.Mag), num("%.3f", m.MagErr), m.Comp, check})
	}
	return t
}

// timingTable lists the extrema timed, in the order given.
func timingTable(ts []Timing) table {
	t := table{title: "Timings of extrema", empty: "No timings recorded.", blank: 5, cols: []col{
		{head: "#", right: true, mm: 7}, {head: "target", mm: 30}, {head: "kind", mm: 12},
		{head: "time", unit: "JD", right: true, mm: 26}, {head: "scale", mm: 18},
		{head: "±1σ", unit: "d", right: true, mm: 16}, {head: "±1σ", unit: "min", right: true, mm: 12},
		{head: "method", mm: 25}, {head: "O−C", unit: "d", right: true, mm: 18}, {head: "O−C", unit: "min", right: true, mm: 15}}}
	for i, m := range ts {
		sig, sigMin := dash, dash
		if !math.IsNaN(m.SigmaDays) {
			sig, sigMin = fmt.Sprintf("%.5f", m.SigmaDays), fmt.Sprintf("%.1f", 1440*m.SigmaDays)
		}
		oc, ocMin := dash, dash
		if !math.IsNaN(m.OCDays) {
			oc, ocMin = signed("%+.5f", m.OCDays), signed("%+.1f", 1440*m.OCDays)
		}
		method := m.Method
		if method == "" {
			method = dash
		}
		t.rows = append(t.rows, []string{strconv.Itoa(i + 1), m.Target, kindText(m.Kind, m.Secondary),
			fmt.Sprintf("%.5f", m.JD), m.Scale.Label(), sig, sigMin, method, oc, ocMin})
	}
	return t
}

// hourlyTable gives the altitudes of the chart's Sun, Moon and stars at each
// whole local hour of its span, interpolated linearly between the chart's
// samples (observe.ChartStep apart).
func hourlyTable(c observe.Chart, ck clock) table {
	t := table{title: "Altitudes by the hour (°, airless; — below the horizon)", empty: "No chart data.",
		cols: []col{{head: ck.headLocal(), unit: "hh:mm", right: true}, {head: "UTC", unit: "hh:mm", right: true},
			{head: "Sun", unit: "°", right: true}, {head: "Moon", unit: "°", right: true}}}
	for _, s := range c.Stars {
		t.cols = append(t.cols, col{head: s.Name, unit: "°", right: true})
	}
	start := c.From.In(ck.loc).Truncate(time.Hour)
	for h := start; !h.After(c.To); h = h.Add(time.Hour) {
		if h.Before(c.From) {
			continue
		}
		row := []string{ck.local(h, false), ck.utc(h, false), signed("%.0f", altAt(c.Sun, h))}
		for _, cv := range append([]observe.Curve{c.Moon}, c.Stars...) {
			a := altAt(cv, h)
			if a < 0 || math.IsNaN(a) {
				row = append(row, dash)
			} else {
				row = append(row, fmt.Sprintf("%.0f", a))
			}
		}
		t.rows = append(t.rows, row)
	}
	return t
}

// altAt interpolates a curve linearly at t; NaN outside its span.
func altAt(cv observe.Curve, t time.Time) float64 {
	for i := 1; i < len(cv.Times); i++ {
		a, b := cv.Times[i-1], cv.Times[i]
		if t.Before(a) || t.After(b) {
			continue
		}
		span := b.Sub(a)
		if span <= 0 {
			return cv.AltDeg[i]
		}
		f := float64(t.Sub(a)) / float64(span)
		return cv.AltDeg[i-1] + f*(cv.AltDeg[i]-cv.AltDeg[i-1])
	}
	return math.NaN()
}
