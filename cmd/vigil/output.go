package main

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strings"
	"text/tabwriter"
	"time"

	"example.org/vigil/ephem"
)

// writeJSON prints v as one indented JSON object. The encoder builds the
// whole text before writing, so an error leaves w untouched.
func writeJSON(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetEscapeHTML(false) // texts such as "p < 0.01" stay readable
	enc.SetIndent("", "  ")
	if err := enc.Encode(v); err != nil {
		return fmt.Errorf("encoding the answer as JSON: %w", err)
	}
	return nil
}

// optional turns a value that may not exist into a JSON number or null.
func optional(x float64, ok bool) *float64 {
	if !ok || math.IsNaN(x) || math.IsInf(x, 0) {
		return nil
	}
	return &x
}

// table writes aligned columns for people, separated by two blanks.
type table struct{ tw *tabwriter.Writer }

func newTable(w io.Writer) *table {
	return &table{tw: tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)}
}

// row writes one row; cells must not contain tabs.
func (t *table) row(cells ...string) { fmt.Fprintln(t.tw, strings.Join(cells, "\t")) }

// flush writes the rows out.
func (t *table) flush() { t.tw.Flush() }

// utcText writes an instant for people, in UTC to the second.
func utcText(t ephem.Time) string {
	return t.Time().Round(time.Second).Format("2006-01-02 15:04:05") + " UTC"
}

// localText writes an instant for people in the zone, to the second, with
// the weekday and the zone's abbreviation (GMT, BST).
func localText(t ephem.Time, zone *time.Location) string {
	return t.Time().Round(time.Second).In(zone).Format("Mon 02 Jan 15:04:05 MST")
}

// eventCells returns the table cells of an event that may not happen: UTC,
// and local time when the zone is known.
func eventCells(e ephem.Event, zone *time.Location) []string {
	if !e.OK {
		if zone != nil {
			return []string{"—", "—"}
		}
		return []string{"—"}
	}
	if zone != nil {
		return []string{utcText(e.At), localText(e.At, zone)}
	}
	return []string{utcText(e.At)}
}

// siteText describes a site for a table heading.
func siteText(s ephem.Site) string {
	ew := "E"
	if s.LonDeg < 0 {
		ew = "W"
	}
	text := fmt.Sprintf("latitude %s (%.4f° N), longitude %s (%.4f° %s), elevation %.0f m",
		ephem.FormatDec(s.LatDeg), s.LatDeg, ephem.FormatDec(s.LonDeg), math.Abs(s.LonDeg), ew, s.ElevM)
	if s.Name != "" {
		text = s.Name + ": " + text
	}
	return text
}

// zoneNote says which clocks a table's times are on.
func zoneNote(zone *time.Location) string {
	if zone == nil {
		return "Times in UTC (the local time zone is not known from --lat/--lon)."
	}
	return fmt.Sprintf("Times in UTC and local civil time (%s).", zone)
}
