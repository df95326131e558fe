package chart

import (
	"fmt"
	"time"

	"gonum.org/v1/plot"
)

// hourTicks labels whole hours of the chart's time axis in local time and,
// when the site's zone differs from UTC anywhere in the span, in UTC on a
// second row.
type hourTicks struct {
	from    time.Time
	loc     *time.Location
	withUTC bool
	zone    string // the zone's abbreviation(s) and offset(s) in the span
}

// newHourTicks returns the ticks of the span [from, to] in zone loc.
func newHourTicks(from, to time.Time, loc *time.Location) hourTicks {
	h := hourTicks{from: from, loc: loc}
	var zones []string
	seen := map[string]bool{}
	// Sample the offset every half hour: a change of daylight-saving time
	// inside the night shows both zones.
	for t := from; !t.After(to.Add(30 * time.Minute)); t = t.Add(30 * time.Minute) {
		name, off := t.In(loc).Zone()
		if off != 0 {
			h.withUTC = true
		}
		z := fmt.Sprintf("%s, UTC%s", name, formatOffset(off))
		if off == 0 {
			z = name + " = UTC"
			if name == "UTC" {
				z = "UTC"
			}
		}
		if !seen[z] {
			seen[z] = true
			zones = append(zones, z)
		}
	}
	for i, z := range zones {
		if i > 0 {
			h.zone += " / "
		}
		h.zone += z
	}
	return h
}

// formatOffset writes a zone offset as "+1", "-5" or "+5:30".
func formatOffset(sec int) string {
	sign := "+"
	if sec < 0 {
		sign, sec = "-", -sec
	}
	if sec%3600 == 0 {
		return fmt.Sprintf("%s%d", sign, sec/3600)
	}
	return fmt.Sprintf("%s%d:%02d", sign, sec/3600, sec%3600/60)
}

// label returns the axis label, naming the zone of each row.
func (h hourTicks) label() string {
	name := h.loc.String()
	if !h.withUTC {
		if name == "UTC" {
			return "time (UTC)"
		}
		return fmt.Sprintf("local time (%s: %s)", name, h.zone)
	}
	return fmt.Sprintf("local time (%s: %s) above, UTC below", name, h.zone)
}

// Ticks implements plot.Ticker: a labelled tick every hour (every two over
// a long night), a minor one every half hour.
func (h hourTicks) Ticks(min, max float64) []plot.Tick {
	step := time.Hour
	if max-min > 16 {
		step = 2 * time.Hour
	}
	// From the local whole hour at or before min (zones may be offset
	// from UTC by 30 or 45 minutes).
	lt := h.from.Add(time.Duration(min * float64(time.Hour))).In(h.loc)
	t := time.Date(lt.Year(), lt.Month(), lt.Day(), lt.Hour(), 0, 0, 0, h.loc)
	var out []plot.Tick
	for ; ; t = t.Add(30 * time.Minute) {
		v := t.Sub(h.from).Hours()
		if v > max {
			break
		}
		if v < min {
			continue
		}
		label := ""
		if lt := t.In(h.loc); lt.Minute() == 0 && lt.Hour()%int(step/time.Hour) == 0 {
			label = lt.Format("15:04")
			if h.withUTC {
				label += "\n" + t.UTC().Format("15:04")
			}
		}
		out = append(out, plot.Tick{Value: v, Label: label})
	}
	return out
}
