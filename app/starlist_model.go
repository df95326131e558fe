package app

import (
	"strings"

	"example.org/vigil/observe"
)

// StarRow is one row of the star list.
type StarRow struct {
	Name   string
	Detail string // the class and the catch: "eclipsing · whole"
	Next   string // the star's best extremum tonight, local time: "min 01:30"
	Catch  Catch
}

// FilterTargets returns the targets in which every word of query appears
// (any case) in the name, the class or the notes; all of them for a blank
// query.
func FilterTargets(ts []observe.Target, query string) []observe.Target {
	words := strings.Fields(strings.ToLower(query))
	if len(words) == 0 {
		return ts
	}
	var out []observe.Target
	for _, t := range ts {
		hay := strings.ToLower(t.Name + " " + classText(t.Class) + " " + t.Notes)
		all := true
		for _, w := range words {
			if !strings.Contains(hay, w) {
				all = false
				break
			}
		}
		if all {
			out = append(out, t)
		}
	}
	return out
}

// StarRows returns the star list's rows for the targets, with their night
// from nd (nil while the night is being planned).
func StarRows(ts []observe.Target, nd *NightData) []StarRow {
	rows := make([]StarRow, len(ts))
	for i, t := range ts {
		r := StarRow{Name: t.Name, Detail: classText(t.Class)}
		switch {
		case nd == nil:
			r.Next = "…"
		case nd.Err != nil:
			r.Next = ""
		default:
			st := nd.Star(t.Name)
			r.Catch = st.Catch
			r.Detail += " · " + catchText(st.Catch)
			r.Next = "—"
			if st.Count > 0 {
				r.Next = extremumText(st.Best) + " " + clockText(st.Best.UTC.Time(), nd.Request.Site.Location())
			}
		}
		rows[i] = r
	}
	return rows
}

// starListEmpty says why the star list is empty and what to do.
func starListEmpty(total int, query string) string {
	if total == 0 {
		return "No stars yet: add one or import a catalogue."
	}
	return "No star matches “" + query + "”."
}
