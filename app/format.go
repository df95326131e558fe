package app

import (
	"fmt"
	"math"
	"time"

	"example.org/vigil/observe"
)

// clockText writes an instant as clock time "15:04" in loc, to the nearest
// minute (an instant from a Julian date may fall a hair before the minute).
func clockText(t time.Time, loc *time.Location) string {
	return t.Round(time.Minute).In(loc).Format("15:04")
}

// utcText writes an instant as UTC clock time "15:04", to the nearest minute.
func utcText(t time.Time) string { return clockText(t, time.UTC) }

// nightTitle names the night that begins on date: "Night of Tue 1 – Wed 2
// Dec 2026", with the month and year written where they change.
func nightTitle(date time.Time) string {
	next := date.AddDate(0, 0, 1)
	switch {
	case date.Year() != next.Year():
		return "Night of " + date.Format("Mon 2 Jan 2006") + " – " + next.Format("Mon 2 Jan 2006")
	case date.Month() != next.Month():
		return "Night of " + date.Format("Mon 2 Jan") + " – " + next.Format("Mon 2 Jan 2006")
	}
	return "Night of " + date.Format("Mon 2") + " – " + next.Format("Mon 2 Jan 2006")
}

// extremumText names an event's extremum: "max", "min", or "min II" for a
// secondary minimum.
func extremumText(e observe.Event) string {
	if e.Secondary {
		return "min II"
	}
	return e.Kind.String()
}

// degText writes an angle in whole degrees, "—" when it is not known.
func degText(v float64) string {
	if math.IsNaN(v) {
		return "—"
	}
	return fmt.Sprintf("%.0f°", v)
}

// airmassText writes an air mass to two decimals, "—" below the horizon.
func airmassText(e observe.Event) string {
	if math.IsNaN(e.Airmass) || e.AltDeg <= 0 {
		return "—"
	}
	return fmt.Sprintf("%.2f", e.Airmass)
}

// moonText writes the Moon's distance from the star while it is up, or
// "Moon down".
func moonText(e observe.Event) string {
	if e.MoonAltDeg <= MoonUpDeg {
		return "down"
	}
	return degText(e.MoonSepDeg)
}

// percentText writes a fraction 0..1 as a whole percentage.
func percentText(f float64) string { return fmt.Sprintf("%.0f%%", 100*f) }

// verdictText says in a few words whether an event can be caught and why
// not: "whole window", "partly: twilight" or "no: too low, daylight".
func verdictText(e observe.Event) string {
	switch {
	case e.Window.Whole:
		return "whole window"
	case e.Window.UsableFraction > 0:
		return "partly: " + e.Window.Reasons.String()
	}
	r := e.Window.Reasons
	if r == 0 {
		r = e.Reasons
	}
	return "no: " + r.String()
}

// catchText writes a star's night for the star list: "whole", "partly",
// "not observable" or "no max/min tonight".
func catchText(c Catch) string {
	switch c {
	case CatchWhole:
		return "whole"
	case CatchPartly:
		return "partly"
	case CatchNot:
		return "not observable"
	}
	return "no max/min tonight"
}

// classText names a target's class for the star list.
func classText(c observe.Class) string {
	switch c {
	case observe.Pulsating:
		return "pulsating"
	case observe.Eclipsing:
		return "eclipsing"
	}
	return "variable"
}

// sigmaText writes an uncertainty in days as minutes: "±4 min", "±0.4 min",
// or in hours and minutes from an hour up: "±1 h 20 min".
func sigmaText(days float64) string {
	m := days * 1440
	switch {
	case m < 1:
		return fmt.Sprintf("±%.1f min", m)
	case m < 60:
		return fmt.Sprintf("±%.0f min", m)
	}
	total := math.Round(m)
	h := math.Floor(total / 60)
	return fmt.Sprintf("±%.0f h %.0f min", h, total-60*h)
}
