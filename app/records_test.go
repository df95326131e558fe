package app

import (
	"strings"
	"testing"

	"fyne.io/fyne/v2/test"
)

// A measurement typed at the eyepiece is a record, not a change to what
// the night's plan depends on: it reaches the pages that show records (the
// Timings page's points, the Log page's count) without planning the night
// again. A change to the targets still plans it again.
func TestMeasurementDoesNotReplan(t *testing.T) {
	w, q, v, _ := measurePage(t)
	tv := timingPage(t, w)
	lv := w.Page("log").(*logView)
	if tv.data == nil || len(tv.data.Points) != 0 {
		t.Fatalf("the Timings page before: %v", tv.data)
	}
	plans, night := w.plans, w.Session.Night()
	if night == nil {
		t.Fatal("no plan before the row")
	}

	f := v.form
	test.Type(f.time, "21:14:05")
	test.Type(f.target.mag, "-7.512")
	for i, m := range []string{"-8.120", "-7.262", "-8.628"} {
		test.Type(f.comps[i].mag, m)
	}
	test.Tap(f.add)
	settle(t, w, q)
	if len(v.tbl.Rows) != 1 {
		t.Fatalf("the row was not added: %d rows", len(v.tbl.Rows))
	}
	if w.plans != plans || w.Session.Night() != night {
		t.Errorf("adding a measurement planned the night %d more times (plan kept: %v); want none", w.plans-plans, w.Session.Night() == night)
	}
	if tv.data == nil || len(tv.data.Points) != 1 {
		t.Errorf("the Timings page did not read the new measurement: %v", tv.data)
	}
	w.ShowPage("log")
	settle(t, w, q)
	if lv.preview == nil || !strings.Contains(lv.preview.Summary(), "recorded: 1 measurement,") {
		t.Errorf("the Log page after the row: %v", lv.preview)
	}

	// Deleting it is a record too.
	w.ShowPage("measure")
	v.deleteID(v.tbl.Rows[0].M.ID)
	settle(t, w, q)
	if w.plans != plans || len(v.tbl.Rows) != 0 || len(tv.data.Points) != 0 {
		t.Errorf("after the delete: %d more plans, %d rows, %d points on the Timings page; want 0, 0, 0", w.plans-plans, len(v.tbl.Rows), len(tv.data.Points))
	}

	// The logbook read again (after a change to a star) plans again.
	w.Reload()
	settle(t, w, q)
	if w.plans != plans+1 || w.Session.Night() == nil {
		t.Errorf("reading the logbook again planned %d times; want once", w.plans-plans)
	}
}
