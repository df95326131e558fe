package app

import (
	"fmt"
	"path/filepath"
	"strings"
	"testing"

	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/app/report"
	"example.org/vigil/internal/demo"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// logPage returns the window's Log page, brought to the front and ready.
func logPage(t *testing.T, w *Window, q *uiQueue) *logView {
	t.Helper()
	v, ok := w.Page("log").(*logView)
	if !ok {
		t.Fatal("the window has no Log page")
	}
	w.ShowPage("log")
	settle(t, w, q)
	return v
}

// The page shows the text of the night's log, the same text the model
// builds (and WriteText gives: log_model_test.go), its summary and its
// chart; the buttons are ready.
func TestLogPageShowsNight(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	v := logPage(t, w, q)
	if v.preview == nil {
		t.Fatalf("no log on show: summary %q, status %q", v.summary.Text, v.status.Text)
	}
	want := logText(t, logPlanned(t, demo.Site(), smallTargets(), logTestDate))
	if got := v.text.Text(); got != strings.TrimSuffix(want, "\n") && got != want {
		t.Errorf("text on show differs from WriteText:\n%s", logFirstDiff(got, want))
	}
	if !strings.Contains(v.summary.Text, "planned of the logbook's 3 stars") {
		t.Errorf("summary: %q", v.summary.Text)
	}
	for _, b := range []*widget.Button{v.savePDF, v.saveText, v.print} {
		if b.Disabled() {
			t.Errorf("%q is disabled with a log on show", b.Text)
		}
	}
	v.views.SelectIndex(1) // the chart's tab
	settle(t, w, q)
	if v.chart.Image() == nil || v.chart.Message() != "" {
		t.Errorf("chart not drawn: message %q", v.chart.Message())
	}
	if v.recordNote.Text != logNoRecord || !v.record.Hidden {
		t.Errorf("record of a night not recorded: note %q, fields shown %v", v.recordNote.Text, !v.record.Hidden)
	}
}

// Changing the night builds the log of the new night; while another page
// is in front the log waits until the Log page is shown.
func TestLogPageFollowsNight(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	v := logPage(t, w, q)
	for _, tc := range []struct {
		step        func()
		date, night string
	}{
		{w.Session.NextNight, "2026-12-02", "night of Wed 2026-12-02 to Thu 2026-12-03"},
		{func() { test.Tap(w.header.prev) }, "2026-12-01", "night of Tue 2026-12-01 to Wed 2026-12-02"},
	} {
		tc.step()
		settle(t, w, q)
		if v.preview == nil || v.preview.Request.Date.Format("2006-01-02") != tc.date {
			t.Fatalf("after stepping: log of %v, want %s", v.preview, tc.date)
		}
		if !strings.Contains(v.text.Text(), tc.night) {
			t.Errorf("the text on show does not name the %s", tc.night)
		}
	}

	w.ShowPage("tonight")
	settle(t, w, q)
	w.Session.NextNight()
	settle(t, w, q)
	if v.preview != nil || !v.stale {
		t.Errorf("with the Log page behind: log %v, stale %v; want none, stale", v.preview != nil, v.stale)
	}
	w.ShowPage("log")
	settle(t, w, q)
	if v.preview == nil || v.preview.Request.Date.Format("2006-01-02") != "2026-12-02" {
		t.Errorf("after coming back: log of %v, want 2026-12-02", v.preview)
	}

	// Another site: its name heads the log.
	w.header.site.SetSelected("Test South")
	settle(t, w, q)
	if v.preview == nil || !strings.HasPrefix(v.text.Text(), "Observing log: Test South") {
		t.Errorf("after choosing Test South the text begins %q", v.text.Text()[:min(40, len(v.text.Text()))])
	}
}

// A record added to the logbook shows once the window reads it again:
// its fields (read only) and, in the text, the observer and measurements.
func TestLogPageFollowsLogbook(t *testing.T) {
	lb, want := logRecordedBook(t)
	w, q := openWindow(t, lb)
	v := logPage(t, w, q)
	if got, w := v.text.Text(), logText(t, want); got != strings.TrimSuffix(w, "\n") && got != w {
		t.Errorf("text of the recorded night:\n%s", logFirstDiff(got, w))
	}
	rec := v.record.String()
	for _, s := range []string{"Observer: T. Tester (invented)", "Equipment: invented 200 mm reflector", "Conditions: clear, calm", "Notes: test night"} {
		if !strings.Contains(rec, s) {
			t.Errorf("record %q lacks %q", rec, s)
		}
	}
	if !strings.HasSuffix(rec, logRecordHint) || v.recordNote.Visible() {
		t.Errorf("record %q: want the hint at its end (and no other note: %q)", rec, v.recordNote.Text)
	}

	// The observer changes in the logbook (as the Measurements page does).
	n, err := lb.Night(demo.SiteName, logTestDate)
	if err != nil {
		t.Fatal(err)
	}
	n.Observer = "R. Other (invented)"
	if err := lb.UpdateNight(n); err != nil {
		t.Fatal(err)
	}
	w.Reload()
	settle(t, w, q)
	if !strings.Contains(v.text.Text(), "R. Other (invented)") || !strings.Contains(v.record.String(), "Observer: R. Other (invented)") {
		t.Errorf("after the logbook changed: record %q", v.record.String())
	}
}

// The Sun caution of a planned event shows above the text and marks its
// lines in it.
func TestLogPageSunCaution(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	v := logPage(t, w, q)
	if v.caution.Visible() {
		t.Errorf("caution shown for a night without one: %q", v.caution.Text)
	}
	rl := logPlanned(t, demo.Site(), smallTargets(), logTestDate)
	rl.Plan.Events[0].SolarWarning = true
	text := logText(t, rl)
	v.preview = &LogPreview{Request: LogRequest{Site: demo.Site(), Date: logTestDate}, Log: rl, Text: text,
		Cautions: logCautionLines(text), Targets: 3, PDFPages: 5}
	v.show()
	if !v.caution.Visible() || !strings.Contains(v.caution.Text, observe.SolarWarningText) {
		t.Errorf("caution banner: visible %v, %q", v.caution.Visible(), v.caution.Text)
	}
	if len(v.preview.Cautions) == 0 {
		t.Fatal("no caution lines found")
	}
	for _, row := range v.preview.Cautions {
		if _, ok := v.text.Rows[row].Style.(logCautionStyle); !ok {
			t.Errorf("line %d %q is not marked", row+1, v.text.RowText(row))
		}
	}
	if _, ok := v.text.Rows[0].Style.(logCautionStyle); ok {
		t.Error("the title line is marked as a caution")
	}
}

// The paper choice builds the PDF again on the other size and says so.
func TestLogPagePaper(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	v := logPage(t, w, q)
	v.paperChoice.SetSelected("US Letter")
	settle(t, w, q)
	if v.preview == nil || v.preview.Request.Paper != report.Letter || !strings.Contains(v.summary.Text, "on US Letter") {
		t.Errorf("after choosing US Letter: summary %q", v.summary.Text)
	}
}

// With no site there is no night to log: the page says what to do and the
// buttons wait.
func TestLogPageNoSite(t *testing.T) {
	lb, err := logbook.Create(filepath.Join(t.TempDir(), "empty.db"))
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { lb.Close() })
	w, q := openWindow(t, lb)
	v := logPage(t, w, q)
	if v.summary.Text != logNoSite {
		t.Errorf("summary %q", v.summary.Text)
	}
	for _, b := range []*widget.Button{v.savePDF, v.saveText, v.print} {
		if !b.Disabled() {
			t.Errorf("%q enabled with no log", b.Text)
		}
	}
	// A site with no stars: the log of the night still prints, and says so.
	if err := lb.AddSite(demo.Site()); err != nil {
		t.Fatal(err)
	}
	w.Reload()
	settle(t, w, q)
	if v.preview == nil || !v.empty.Visible() || !strings.Contains(v.empty.Text, "still prints") {
		t.Errorf("a site without stars: empty note %q (visible %v)", v.empty.Text, v.empty.Visible())
	}
	if v.savePDF.Disabled() {
		t.Error("Save as PDF disabled for an empty night")
	}
}

// A build cancelled from the status bar says how to get the log, and
// showing the page again builds it.
func TestLogPageCancelled(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	v := logPage(t, w, q)
	v.stale, v.preview = true, nil
	v.Shown()
	w.Jobs.Cancel("log") // as the status bar's cancel button does; delivered on settle
	settle(t, w, q)
	if !v.stale || v.preview != nil || !strings.Contains(v.status.Text, "cancelled") {
		t.Errorf("after a cancel: stale %v, log %v, status %q", v.stale, v.preview != nil, v.status.Text)
	}
	v.Shown()
	settle(t, w, q)
	if v.stale || v.preview == nil || v.status.Text != "" {
		t.Errorf("shown again: stale %v, log %v, status %q", v.stale, v.preview != nil, v.status.Text)
	}
}

// In night red no pixel of the window with the Log page in front has
// green or blue, or red above nightMaxRed, charts included,
// with a Sun caution on show, the theme changed while another page was in
// front, on the text's tab and on the chart's.
func TestLogPageNightRed(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	v := logPage(t, w, q)
	rl := v.preview.Log
	rl.Plan.Events = append(rl.Plan.Events[:0:0], rl.Plan.Events...)
	rl.Plan.Events[0].SolarWarning = true
	text := logText(t, rl)
	v.preview = &LogPreview{Request: v.preview.Request, Log: rl, Text: text, Cautions: logCautionLines(text), Targets: 3}
	v.show()
	w.ShowPage("tonight")
	settle(t, w, q)
	w.Session.SetTheme(ThemeNightRed)
	settle(t, w, q)
	w.ShowPage("log")
	settle(t, w, q)
	for tab := range 2 {
		v.views.SelectIndex(tab)
		settle(t, w, q)
		if tab == 1 && (v.chart.Image() == nil || opaque(v.chart.Image()) == 0) {
			t.Fatal("the chart is not drawn")
		}
		assertNightRed(t, fmt.Sprintf("tab %d", tab), w.Win.Canvas().Capture(), nil)
	}
}
