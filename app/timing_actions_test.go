package app

import (
	"strings"
	"testing"
	"time"

	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/widget"
)

// The O−C tab of Ashgrove V4 prefers the quadratic; adopting it (after the
// confirmation showing both ephemerides) stores it, keeps the old in the
// history, and the session's star predicts from it.
func TestTimingViewAdopt(t *testing.T) {
	w, q, v, lb := timingOpen(t, "Ashgrove V4", 1)
	p := v.oc
	if p.study == nil || p.study.Analysis == nil || p.fitChoice.Selected != "quadratic" {
		t.Fatalf("O−C: study %v, fit chosen %q", p.study != nil, p.fitChoice.Selected)
	}
	if !strings.Contains(p.summary.Text, "Preferred: the quadratic ephemeris") || !strings.Contains(p.summary.Text, "the period grows by") {
		t.Errorf("summary:\n%s", p.summary.Text)
	}
	if p.chart.Image() == nil {
		t.Error("no O−C chart drawn")
	}
	hist, _ := lb.EphemerisHistory("Ashgrove V4")
	old := v.data.Target.Ephemeris
	want, err := p.study.Candidate("quadratic")
	if err != nil {
		t.Fatal(err)
	}
	test.Tap(p.adoptBtn)
	if v.confirm == nil {
		t.Fatal("no confirmation asked")
	}
	v.confirm.Confirm()
	settle(t, w, q)
	after, _ := lb.EphemerisHistory("Ashgrove V4")
	if len(after) != len(hist)+1 || after[len(after)-1].Ephemeris != want || after[len(after)-2].Ephemeris != old {
		t.Errorf("history after adopting: %d entries (before %d); current %+v, want %+v", len(after), len(hist), after[len(after)-1].Ephemeris, want)
	}
	if !strings.HasPrefix(after[len(after)-1].Source, "quadratic O−C fit of 39 timings, 2026-12-01") {
		t.Errorf("source %q", after[len(after)-1].Source)
	}
	if tg, _ := w.Session.Target("Ashgrove V4"); tg.Ephemeris != want {
		t.Errorf("the session's star after adopting: %+v", tg.Ephemeris)
	}
	if v.data.Target.Ephemeris != want || !strings.HasPrefix(v.note.Text, "Adopted for Ashgrove V4") {
		t.Errorf("page after adopting: %+v, note %q", v.data.Target.Ephemeris, v.note.Text)
	}
}

// A published timing: a missing source is named at its field; complete,
// it is stored and listed; then it can be deleted.
func TestTimingViewPublishedAddDelete(t *testing.T) {
	w, q, v, lb := timingOpen(t, "Ashgrove V4", 1)
	p := v.oc
	count := len(p.rows)
	test.Tap(p.pubOpen)
	test.Type(p.pubJD, "2452410.19700")
	test.Type(p.pubSigma, "0.0005")
	test.Tap(p.pubAdd)
	if l := p.pubErrs["source"]; !l.Visible() || !strings.Contains(l.Text, "needs its source") {
		t.Errorf("no source: %q (visible %v)", l.Text, l.Visible())
	}
	test.Type(p.pubSource, "Invented Circular 7, 1 (2003)")
	test.Tap(p.pubAdd)
	settle(t, w, q)
	if p.pubErrs["source"].Visible() || len(p.rows) != count+1 {
		t.Fatalf("after adding: source error %v, %d rows (before %d)", p.pubErrs["source"].Visible(), len(p.rows), count)
	}
	row := -1
	for i, r := range p.rows {
		if r.Timing.Source == "Invented Circular 7, 1 (2003)" {
			row = i
		}
	}
	if row < 0 || p.rows[row].Cells[1] != "HJD_UTC" || !p.rows[row].InOC {
		t.Fatalf("the published timing's row: %d %v", row, p.rows)
	}
	p.table.Select(widget.TableCellID{Row: row, Col: 0})
	test.Tap(p.del)
	if v.confirm == nil {
		t.Fatal("no confirmation before deleting")
	}
	v.confirm.Confirm()
	settle(t, w, q)
	ts, _ := lb.TimingsOf("Ashgrove V4")
	if len(ts) != count || len(p.rows) != count {
		t.Errorf("after deleting: %d in the logbook, %d rows; want %d", len(ts), len(p.rows), count)
	}
}

// The period search runs as a named job (in the status bar with its
// progress and cancel button); it finds the period, folds on a peak; the
// status bar's cancel button stops a long one, as does choosing another
// star.
func TestTimingViewPeriodSearch(t *testing.T) {
	w, q, v, _ := timingOpen(t, "Ashgrove V1", 2)
	p := v.per
	test.Tap(p.search)
	settle(t, w, q)
	if p.result == nil || p.peaks.Length == nil {
		t.Fatalf("no result: %q", p.msg.Text)
	}
	rows, _ := p.peaks.Length()
	if rows != len(p.result.Peaks) || p.chart.Image() == nil || !strings.Contains(p.summary.Text, "Best: P = 0.56723") {
		t.Errorf("%d peak rows, summary %q", rows, p.summary.Text)
	}
	p.peaks.Select(widget.TableCellID{Row: 0, Col: 1})
	test.Tap(p.fold)
	settle(t, w, q)
	if p.folded == nil || p.phase.Image() == nil || p.adopt.Disabled() {
		t.Errorf("fold: ephemeris %v, adopt disabled %v, %q", p.folded, p.adopt.Disabled(), p.msg.Text)
	}

	// A long search: its job is listed by name; the status bar's cancel
	// button stops it.
	w.status.showAfter = 0
	p.min.SetText("0.02")
	p.max.SetText("10")
	p.over.SetText("50")
	p.method.SetSelected(timingPDM)
	test.Tap(p.search)
	if !w.Jobs.Busy(timingSlotSearch) || p.cancel.Disabled() || !p.bar.Visible() {
		t.Fatalf("search not running: busy %v, cancel disabled %v", w.Jobs.Busy(timingSlotSearch), p.cancel.Disabled())
	}
	deadline := time.Now().Add(10 * time.Second)
	for w.status.jobs[timingSlotSearch] == nil {
		if time.Now().After(deadline) {
			t.Fatal("the status bar never showed the search")
		}
		select {
		case f := <-q.ch:
			f()
		case <-time.After(5 * time.Millisecond):
		}
	}
	if got := w.status.jobs[timingSlotSearch].name.Text; got != "Period search of Ashgrove V1" {
		t.Errorf("status bar job: %q", got)
	}
	test.Tap(w.status.jobs[timingSlotSearch].cancel)
	settle(t, w, q)
	if p.msg.Text != "The search was cancelled." || p.bar.Visible() || !p.cancel.Disabled() {
		t.Errorf("after cancelling: %q, bar visible %v", p.msg.Text, p.bar.Visible())
	}

	// The page's own cancel button, and a change of star, stop it too.
	test.Tap(p.search)
	test.Tap(p.cancel)
	settle(t, w, q)
	if p.msg.Text != "The search was cancelled." {
		t.Errorf("after the page's cancel: %q", p.msg.Text)
	}
	test.Tap(p.search)
	w.Session.Select("Ashgrove V3")
	settle(t, w, q)
	if w.Jobs.Busy(timingSlotSearch) || p.result != nil || v.data.Target.Name != "Ashgrove V3" {
		t.Errorf("after choosing another star: busy %v, old result kept %v", w.Jobs.Busy(timingSlotSearch), p.result != nil)
	}
}
