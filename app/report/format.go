package report

import (
	"fmt"
	"math"
	"strings"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

// dash stands in a cell for a value that does not exist or is not known.
const dash = "—"

// clock formats instants as local time and UTC for one night. When the
// site's zone changes its name within the night (a change of daylight saving
// time), every local time carries its zone's name.
type clock struct {
	loc   *time.Location
	zone  string // the zone's name for column heads, e.g. "CET" or "CEST/CET"
	mixed bool
}

func newClock(loc *time.Location, n ephem.Night) clock {
	a, _ := n.Start.Time().In(loc).Zone()
	b, _ := n.End.Time().In(loc).Zone()
	if a == b {
		return clock{loc: loc, zone: a}
	}
	return clock{loc: loc, zone: a + "/" + b, mixed: true}
}

// local writes t in the site's zone as "hh:mm", rounded to the minute (with
// seconds as "hh:mm:ss", rounded to the second).
func (c clock) local(t time.Time, seconds bool) string {
	l := round(t, seconds).In(c.loc)
	s := l.Format(layout(seconds))
	if c.mixed {
		z, _ := l.Zone()
		s += " " + z
	}
	return s
}

// utc writes t as UTC "hh:mm" (or "hh:mm:ss").
func (c clock) utc(t time.Time, seconds bool) string {
	return round(t, seconds).UTC().Format(layout(seconds))
}

// event writes a night's event as local time and UTC, or dashes when it does
// not happen.
func (c clock) event(e ephem.Event) (string, string) {
	if !e.OK {
		return dash, dash
	}
	return c.local(e.At.Time(), false), c.utc(e.At.Time(), false)
}

// headLocal is the head of a local-time column.
func (c clock) headLocal() string { return "local " + c.zone }

func round(t time.Time, seconds bool) time.Time {
	if seconds {
		return t.Round(time.Second)
	}
	return t.Round(time.Minute)
}

func layout(seconds bool) string {
	if seconds {
		return "15:04:05"
	}
	return "15:04"
}

// zoneText names the zone with its offset from UTC in the middle of the
// night: "Europe/Berlin (CET, UTC+01:00)".
func zoneText(s observe.Site, loc *time.Location, mid time.Time) string {
	name := s.TimeZone
	if name == "" {
		name = "UTC"
	}
	z, off := mid.In(loc).Zone()
	sign := "+"
	if off < 0 {
		sign, off = "−", -off
	}
	return fmt.Sprintf("%s (%s, UTC%s%02d:%02d)", name, z, sign, off/3600, off/60%60)
}

// nightText writes the dates a night spans: "Sat 2024-12-21 to Sun 2024-12-22".
func nightText(d time.Time) string {
	y, m, day := d.Date()
	a := time.Date(y, m, day, 12, 0, 0, 0, time.UTC)
	b := a.AddDate(0, 0, 1)
	return a.Format("Mon 2006-01-02") + " to " + b.Format("Mon 2006-01-02")
}

// signed writes v with an explicit sign, using the minus sign U+2212.
func signed(format string, v float64) string {
	s := fmt.Sprintf(format, v)
	return strings.Replace(s, "-", "−", 1)
}

// num writes v with the format, or a dash when v is NaN.
func num(format string, v float64) string {
	if math.IsNaN(v) {
		return dash
	}
	return strings.Replace(fmt.Sprintf(format, v), "-", "−", 1)
}

// kindText names an extremum: "max", "min" or "min II" (secondary).
func kindText(k observe.Kind, secondary bool) string {
	if secondary {
		return k.String() + " II"
	}
	return k.String()
}

// sigmaMinutes writes a prediction's 1σ in minutes; an ephemeris without
// errors gives a dash.
func sigmaMinutes(days float64) string {
	if !(days > 0) {
		return dash
	}
	return fmt.Sprintf("%.1f", days*1440)
}

// reasonsText says why an event is not usable: at the extremum, and in the
// rest of its coverage window.
func reasonsText(e observe.Event) string {
	var parts []string
	if e.SolarWarning {
		parts = append(parts, "SUN CAUTION")
	}
	if !e.Observable && e.Reasons != 0 {
		parts = append(parts, e.Reasons.String())
	}
	if e.Window.UsableFraction < 1 && e.Window.Reasons != 0 && e.Window.Reasons != e.Reasons {
		parts = append(parts, "window: "+e.Window.Reasons.String())
	}
	return strings.Join(parts, "; ")
}

// wrap splits text into lines of at most width runes at spaces.
func wrap(text string, width int) []string {
	var lines []string
	cur := ""
	for _, w := range strings.Fields(text) {
		switch {
		case cur == "":
			cur = w
		case len([]rune(cur))+1+len([]rune(w)) <= width:
			cur += " " + w
		default:
			lines = append(lines, cur)
			cur = w
		}
	}
	if cur != "" {
		lines = append(lines, cur)
	}
	return lines
}
