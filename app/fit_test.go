package app

import (
	"fmt"
	"strings"
	"testing"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"
)

// screenSize is the screen the window must fit: a common laptop's.
var screenSize = fyne.NewSize(1280, 800)

// windowMinSize returns the smallest the window can be: its content's
// minimum, with the padding the driver puts around a padded content.
func windowMinSize(w *Window) fyne.Size {
	m := w.Win.Content().MinSize()
	if w.Win.Padded() {
		m = m.AddWidthHeight(2*theme.Padding(), 2*theme.Padding())
	}
	return m
}

// pageSizes lists every page's minimum size, for the failure messages.
func pageSizes(w *Window) string {
	var parts []string
	for _, s := range Screens() {
		m := w.Page(s.Name).Content().MinSize()
		parts = append(parts, fmt.Sprintf("%s %.0f × %.0f", s.Name, m.Width, m.Height))
	}
	return strings.Join(parts, ", ")
}

// A window asking for more than the screen grows past it (the real window
// did: 1280 × 979), cutting off the status bar. Every page, in front or
// behind, in every state it reaches with the demo's busiest star (its
// forms open, its messages shown, each tab of the Timings page), asks for
// no more than 1280 × 800.
func TestWindowFitsTheScreen(t *testing.T) {
	w, q := openWindow(t, demoLogbook(t))
	check := func(state string) {
		t.Helper()
		if m := windowMinSize(w); m.Width > screenSize.Width || m.Height > screenSize.Height {
			t.Errorf("%s: the window needs %.0f × %.0f, more than the screen's %.0f × %.0f (pages: %s)",
				state, m.Width, m.Height, screenSize.Width, screenSize.Height, pageSizes(w))
		}
	}
	check("opened")
	w.Session.SetDate(time.Date(2026, 11, 5, 0, 0, 0, 0, time.UTC))
	w.Session.Select("Ashgrove V4")
	settle(t, w, q)
	// The pages behind have not been laid out yet: their minimum must not
	// assume a zero width.
	check("Ashgrove V4 selected, pages not yet shown")
	for _, s := range Screens() {
		w.ShowPage(s.Name)
		settle(t, w, q)
		check(s.Name + " page in front")
	}

	tv := timingPage(t, w)
	w.ShowPage("timing")
	for i, item := range tv.tabs.Items {
		tv.tabs.SelectIndex(i)
		settle(t, w, q)
		check("Timings, tab " + item.Text)
	}
	tv.say(strings.Repeat("A long note of what was done, running over many lines. ", 30), nil)
	check("Timings with a long note")

	sv := starPage(t, w)
	w.ShowPage("star")
	for _, m := range []starFormMode{starFormEdit, starFormNew, starFormAdopt} {
		sv.form.open(m)
		settle(t, w, q)
		check(fmt.Sprintf("Star page, form %d", m))
		sv.form.close()
	}
	sv.say(strings.Repeat("A long message about the last action. ", 40), true)
	sv.confirm.ask(strings.Repeat("A long question? ", 30), "Delete", func() {})
	check("Star page with a long message and a question")
	sv.confirm.hide()

	mv := w.Page("measure").(*measureView)
	w.ShowPage("measure")
	settle(t, w, q)
	test.Type(mv.form.time, "25:99")
	test.Tap(mv.form.add)
	settle(t, w, q)
	if !mv.form.problems.Visible() {
		t.Fatal("a bad time shows no problem under the row")
	}
	mv.form.problems.SetText(strings.Repeat("what is wrong with this row, at length; ", 40))
	mv.relayout()
	check("Measurements with a long problem under the row")
	mv.form.mode.SetSelected(measureModeVisual)
	settle(t, w, q)
	check("Measurements, visual estimate")
}

// The key/value panels of the Star page (position, what it is, the
// ephemeris) are separate form layouts: their values line up only when
// every key fits the width they share (starKeyWidth); a wider key pushed
// its panel's values right of the others'.
func TestStarKeysLineUp(t *testing.T) {
	test.NewApp()
	lb := demoLogbook(t)
	targets, err := lb.Targets()
	if err != nil {
		t.Fatal(err)
	}
	for _, tg := range targets {
		d, err := LoadStarData(lb, tg.Name)
		if err != nil {
			t.Fatal(err)
		}
		in := BuildStarInfo(tg, d, testNow)
		for _, lines := range [][]StarLine{in.Position, in.Kind, in.Ephemeris} {
			for _, l := range lines {
				if w := widget.NewLabel(l.Key).MinSize().Width; w > starKeyWidth {
					t.Errorf("%s: key %q is %.0f wide, more than starKeyWidth %d", tg.Name, l.Key, w, starKeyWidth)
				}
			}
		}
	}
}

// drawn reports whether obj is among the objects Fyne draws for the
// window's content: those reached through containers and widget renderers.
// A box that only embeds a container is laid out but never walked, so its
// texts never show (the Log page's summary went missing so).
func drawn(w *Window, obj fyne.CanvasObject) bool {
	for _, o := range test.LaidOutObjects(w.Win.Content()) {
		if o == obj {
			return true
		}
	}
	return false
}

// Every text kept in a box of capped height is drawn, not only laid out:
// the Log page's summary, the Star page's message, the problems under a
// measurement row and the Timings page's note.
func TestCappedTextsAreDrawn(t *testing.T) {
	w, q := openWindow(t, demoLogbook(t))
	w.Session.SetDate(time.Date(2026, 11, 5, 0, 0, 0, 0, time.UTC))
	w.Session.Select("Ashgrove V4")
	settle(t, w, q)

	lv := logPage(t, w, q)
	if lv.summary.Text == "" || !drawn(w, lv.summary) {
		t.Errorf("Log page: the summary %q is not drawn", lv.summary.Text)
	}

	sv := starPage(t, w)
	w.ShowPage("star")
	settle(t, w, q)
	sv.say("A message about the last action.", false)
	if !drawn(w, sv.message) {
		t.Error("Star page: the message is not drawn")
	}

	mv := w.Page("measure").(*measureView)
	w.ShowPage("measure")
	settle(t, w, q)
	test.Type(mv.form.time, "25:99")
	test.Tap(mv.form.add)
	settle(t, w, q)
	if !mv.form.problems.Visible() || !drawn(w, mv.form.problems) {
		t.Errorf("Measurements: the problem %q under the row is not drawn", mv.form.problems.Text)
	}

	tv := timingPage(t, w)
	w.ShowPage("timing")
	settle(t, w, q)
	tv.say("A note of what was done.", nil)
	if !drawn(w, tv.note) {
		t.Error("Timings page: the note is not drawn")
	}
}

// The Star page's forecast table gives its verdict column the room the
// other columns leave: the columns fill the table's width, the verdict
// never narrower than its own width, and a wider table widens the verdict.
func TestStarForecastVerdictTakesTheRoom(t *testing.T) {
	w, q := openWindow(t, demoLogbook(t))
	w.Session.SetDate(time.Date(2026, 11, 5, 0, 0, 0, 0, time.UTC))
	w.Session.Select("Ashgrove V4")
	sv := starPage(t, w)
	w.ShowPage("star")
	settle(t, w, q)
	p := sv.forecast
	if len(p.model.Rows) == 0 {
		t.Fatalf("no forecast rows: %q", p.model.Summary)
	}
	verdict := -1
	for i, c := range p.model.Columns {
		if c == "Verdict" {
			verdict = i
		}
	}
	if verdict < 0 || len(p.table.applied) != len(p.model.Columns) {
		t.Fatalf("columns %v, widths applied %v", p.model.Columns, p.table.applied)
	}
	check := func(width float32) float32 {
		t.Helper()
		p.table.Resize(fyne.NewSize(width, p.table.Size().Height))
		var sum float32
		for _, x := range p.table.applied {
			sum += x
		}
		got := p.table.applied[verdict]
		if got < starForecastWidths["Verdict"] {
			t.Errorf("table %.0f wide: verdict column %.0f, narrower than its own %.0f", width, got, starForecastWidths["Verdict"])
		}
		if slack := width - sum; got > starForecastWidths["Verdict"] && (slack < 0 || slack > 40) {
			t.Errorf("table %.0f wide: columns take %.0f, leaving %.0f", width, sum, slack)
		}
		return got
	}
	check(400) // too narrow for all: the verdict keeps its own width
	narrow, wide := check(700), check(1100)
	if wide-narrow != 400 {
		t.Errorf("verdict column %.0f in a 700-wide table, %.0f in a 1100-wide one: want it to take the extra 400", narrow, wide)
	}
}
