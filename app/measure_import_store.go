package app

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"time"

	"example.org/vigil/observe/logbook"
)

// Storing an import, and saying what it would do (no fyne).

// MeasureImportNight is one night an import adds frames to.
type MeasureImportNight struct {
	Date   time.Time
	Frames int
	New    bool // the logbook has no record of it yet
}

// Nights lists the nights of the frames in date order, marking those the
// logbook lacks (lb nil: none marked).
func (pv MeasurePreview) Nights(lb *logbook.Logbook, site string) ([]MeasureImportNight, error) {
	var out []MeasureImportNight
	for _, d := range pv.Dates {
		if k := len(out); k > 0 && out[k-1].Date.Equal(d) {
			out[k-1].Frames++
			continue
		}
		found := false
		for i := range out {
			if out[i].Date.Equal(d) {
				out[i].Frames++
				found = true
			}
		}
		if !found {
			out = append(out, MeasureImportNight{Date: d, Frames: 1})
		}
	}
	for i := range out {
		if lb == nil {
			continue
		}
		_, err := lb.Night(site, out[i].Date)
		switch {
		case errors.Is(err, logbook.ErrNotFound):
			out[i].New = true
		case err != nil:
			return nil, err
		}
	}
	for i := 1; i < len(out); i++ { // few nights: insertion sort by date
		for j := i; j > 0 && out[j].Date.Before(out[j-1].Date); j-- {
			out[j], out[j-1] = out[j-1], out[j]
		}
	}
	return out, nil
}

// StoreMeasureImport stores the previewed frames: the records of the nights
// the logbook lacks first (with the observer and equipment of details, and
// its conditions for the night of r only), then every measurement in one transaction
// (logbook.AddMeasurements). When that fails nothing is stored: the nights
// just made are removed again. It returns the number of frames stored.
func StoreMeasureImport(lb *logbook.Logbook, r MeasureRequest, details logbook.Night, pv MeasurePreview) (int, error) {
	if pv.Err != nil {
		return 0, pv.Err
	}
	ids := map[time.Time]int64{}
	var made []int64
	undo := func() {
		for _, id := range made {
			_ = lb.DeleteNight(id)
		}
	}
	ms := append([]logbook.Measurement(nil), pv.Measurements...)
	for i := range ms {
		d := pv.Dates[i]
		id, ok := ids[d]
		if !ok {
			nd := details
			if !d.Equal(r.Date) {
				nd.Conditions = ""
			}
			n, created, err := MeasureNight(lb, MeasureRequest{Target: r.Target, Site: r.Site, Date: d}, nd)
			if err != nil {
				undo()
				return 0, err
			}
			if created {
				made = append(made, n.ID)
			}
			id, ids[d] = n.ID, n.ID
		}
		ms[i].NightID = id
	}
	if _, err := lb.AddMeasurements(ms); err != nil {
		undo()
		return 0, err
	}
	return len(ms), nil
}

// Notes says in words what the import would do: the frames and their
// nights, the rows skipped and why, the frames of other filters, the
// comparison stars left out and why, the check star, and the warnings; or
// why it cannot be done.
func (pv MeasurePreview) Notes(rows int, nights []MeasureImportNight) []MeasureNote {
	var out []MeasureNote
	note := func(warn bool, format string, args ...any) {
		out = append(out, MeasureNote{Text: fmt.Sprintf(format, args...), Warn: warn})
	}
	if pv.Err != nil {
		note(true, "Nothing can be imported: %v", pv.Err)
		return out
	}
	var ns []string
	for _, n := range nights {
		s := fmt.Sprintf("%s (%s", measureNightWords(n.Date), plural(n.Frames, "frame", "frames"))
		if n.New {
			s += ", a new night record"
		}
		ns = append(ns, s+")")
	}
	note(false, "%s of %s reduced, on %s: %s.", plural(len(pv.Measurements), "frame", "frames"), plural(rows, "row", "rows"),
		plural(len(nights), "night", "nights"), strings.Join(ns, "; "))
	r := pv.Red
	const most = 8
	for i, s := range r.Skipped {
		if i == most {
			note(true, "… and %d more rows skipped.", len(r.Skipped)-most)
			break
		}
		note(true, "Line %d skipped: %s.", s.Line, s.Reason)
	}
	if r.OtherFilter > 0 {
		note(false, "%s in other filters than %s left out.", plural(r.OtherFilter, "frame", "frames"), r.Filter)
	}
	for _, rj := range r.Rejected {
		note(true, "Comparison star %s left out: %s", rj.ID, rj.Reason)
	}
	if c := r.Check; c != nil && c.N > 0 {
		std := "—"
		if !math.IsNaN(c.Std) {
			std = fmt.Sprintf("%.3f mag", c.Std)
		}
		note(false, "Check star %s: mean %.3f mag, scatter %s (n = %d), offset %s mag from the catalogue %.3f.",
			c.ID, c.Mean, std, c.N, measureSigned(c.OffsetMag), c.CatalogMag)
	}
	leap := false
	for _, w := range r.Warnings {
		if measureLeapWarning(w) {
			leap = true
			continue
		}
		note(true, "%s%s.", strings.ToUpper(w[:1]), strings.TrimSuffix(w[1:], "."))
	}
	if leap {
		out = append(out, measureLeapNote())
	}
	return out
}
