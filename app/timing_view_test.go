package app

import (
	"strings"
	"testing"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// timingPage returns the window's Timings page.
func timingPage(t testing.TB, w *Window) *timingView {
	t.Helper()
	v, ok := w.Page("timing").(*timingView)
	if !ok {
		t.Fatal("the window has no Timings page")
	}
	return v
}

// timingOpen opens the window on the demo logbook with star selected and
// the Timings page in front, on its tab.
func timingOpen(t *testing.T, star string, tab int) (*Window, *uiQueue, *timingView, *logbook.Logbook) {
	t.Helper()
	lb := timingDemo(t)
	w, q := openWindow(t, lb)
	w.ShowPage("timing")
	w.Session.Select(star)
	v := timingPage(t, w)
	v.tabs.SelectIndex(tab)
	settle(t, w, q)
	if v.data == nil || v.data.Target.Name != star {
		t.Fatalf("the page did not load %s", star)
	}
	return w, q, v, lb
}

// With no star, and with a star that has neither measurements nor
// timings, every part says what to do next.
func TestTimingViewEmptyStates(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	v := timingPage(t, w)
	if !v.empty.Visible() || !strings.HasPrefix(v.empty.Text, "Select a star in the list") || v.tabs.Visible() {
		t.Errorf("no star: %q (visible %v), tabs visible %v", v.empty.Text, v.empty.Visible(), v.tabs.Visible())
	}
	w.Session.Select("Test Alpha")
	settle(t, w, q)
	if v.empty.Visible() || !strings.HasPrefix(v.title.Text, "Test Alpha · pulsating · Max = BJD_TDB") {
		t.Errorf("Test Alpha: title %q, empty shown %v", v.title.Text, v.empty.Visible())
	}
	if got := v.fit.chart.Message(); !strings.HasPrefix(got, "No measurements of Test Alpha yet") || !v.fit.fitBtn.Disabled() {
		t.Errorf("fit: chart says %q, Fit disabled %v", got, v.fit.fitBtn.Disabled())
	}
	if got := v.oc.chart.Message(); !strings.HasPrefix(got, "No timings yet: fit an extremum") {
		t.Errorf("O−C chart: %q", got)
	}
	if !strings.HasPrefix(v.oc.summary.Text, "No timings yet: fit an extremum") || !strings.HasPrefix(v.oc.tableMsg.Text, "No timings yet") {
		t.Errorf("O−C summary %q, table %q", v.oc.summary.Text, v.oc.tableMsg.Text)
	}
	if !v.oc.adoptBtn.Disabled() || !v.per.search.Disabled() || !strings.Contains(v.per.chart.Message(), "a period search needs at least 5") {
		t.Errorf("adopt disabled %v, search disabled %v, period chart %q", v.oc.adoptBtn.Disabled(), v.per.search.Disabled(), v.per.chart.Message())
	}
}

// Fit on the most recent night (the session's has no data), see the
// minimum and its fitted curve, keep it: the logbook and the O−C have it.
func TestTimingViewFitAndKeep(t *testing.T) {
	w, q, v, lb := timingOpen(t, "Ashgrove V4", 0)
	p := v.fit
	n, ok := p.current()
	if !ok || n.Night.ID != v.data.Nights[0].Night.ID || p.night.Selected != n.Label() {
		t.Fatalf("night chosen: %q, want the most recent, %q", p.night.Selected, v.data.Nights[0].Label())
	}
	if p.kind.Selected != "minimum" || p.method.Selected != timingKvW || !p.degree.Disabled() {
		t.Errorf("defaults: %s by %s, degree disabled %v", p.kind.Selected, p.method.Selected, p.degree.Disabled())
	}
	before := p.chart.Image()
	test.Tap(p.fitBtn)
	settle(t, w, q)
	want, err := TimingFit(TimingFitRequest{Points: n.Points, Kind: reduce.Minimum, Method: reduce.MethodKvW})
	if err != nil {
		t.Fatal(err)
	}
	if p.result == nil || p.result.Time != want.Time {
		t.Fatalf("result %v, want reduce.Extremum's %.6f", p.result, want.Time)
	}
	if r := TimingDescribeFit(want, v.data.Target, n); p.head.Text != r.Headline || !strings.Contains(p.detail.Text, r.When) {
		t.Errorf("result shown: %q / %q", p.head.Text, p.detail.Text)
	}
	if !strings.Contains(p.detail.Text, "local") || !strings.Contains(p.detail.Text, "UTC") || !strings.Contains(p.head.Text, " s)") {
		t.Errorf("result lacks local time, UTC or σ in seconds: %q %q", p.head.Text, p.detail.Text)
	}
	if p.chart.Image() == before {
		t.Error("the light curve was not redrawn with the fit")
	}
	timings := len(v.data.Timings)
	test.Tap(p.keep)
	settle(t, w, q)
	stored, err := lb.TimingsOf("Ashgrove V4")
	if err != nil {
		t.Fatal(err)
	}
	if len(stored) != timings+1 {
		t.Fatalf("%d timings after Keep, %d before", len(stored), timings)
	}
	found := false
	for _, tm := range stored {
		if tm.JD == want.Time && tm.Origin == logbook.Own && tm.NightID == n.Night.ID && tm.SigmaDays == want.Sigma {
			found = true
		}
	}
	if !found {
		t.Errorf("the kept timing %.6f is not in the logbook", want.Time)
	}
	if !p.keep.Disabled() || !strings.HasPrefix(v.note.Text, "Kept the minimum") {
		t.Errorf("after Keep: button disabled %v, note %q", p.keep.Disabled(), v.note.Text)
	}
	if len(v.oc.rows) != timings+1 || v.oc.study == nil || len(v.oc.study.Used) != timings+1 {
		t.Errorf("O−C after Keep: %d rows, study %v", len(v.oc.rows), v.oc.study != nil)
	}
	if p.result == nil {
		t.Error("the fit was dropped when the logbook was read again")
	}
}

// A range dragged across the chart fills the fields; one side of the
// minimum only is refused with the reason beside the range.
func TestTimingViewDragOneSided(t *testing.T) {
	w, q, v, _ := timingOpen(t, "Ashgrove V4", 0)
	p := v.fit
	a, ok := p.chart.Area()
	if !ok {
		t.Fatal("the light curve has no plotting area")
	}
	// The first fifth of the night: the light only fading towards the
	// minimum, which falls near the middle.
	x0 := a.Min.X + 2
	x1 := a.Min.X + (a.Max.X-a.Min.X)/5
	y := (a.Min.Y + a.Max.Y) / 2
	abs := fyne.CurrentApp().Driver().AbsolutePositionForObject(p.chart)
	test.Drag(w.Win.Canvas(), abs.AddXY(x1, y), x1-x0, 0)
	settle(t, w, q)
	if p.sel == nil || p.from.Text == "" || p.to.Text == "" {
		t.Fatalf("after the drag: range %v, fields %q %q", p.sel, p.from.Text, p.to.Text)
	}
	n, _ := p.current()
	if p.sel.From < n.Points[0].T-0.01 || p.sel.To > n.Points[len(n.Points)-1].T {
		t.Errorf("picked %.5f–%.5f, outside the night's data %.5f–%.5f", p.sel.From, p.sel.To, n.Points[0].T, n.Points[len(n.Points)-1].T)
	}
	if !strings.Contains(p.rng.Text, "Picked BJD_TDB") || !strings.Contains(p.rng.Text, "local") {
		t.Errorf("range hint: %q", p.rng.Text)
	}
	test.Tap(p.fitBtn)
	settle(t, w, q)
	if p.result != nil || p.rng.Importance != widget.DangerImportance || !strings.Contains(p.rng.Text, "do not cover both sides of the minimum") {
		t.Errorf("one-sided fit: result %v, range says %q", p.result, p.rng.Text)
	}

	// Typed ends: the later one first is refused, local clock times taken.
	p.from.SetText("04:00")
	p.to.SetText("23:30")
	if p.rng.Importance != widget.DangerImportance || !strings.Contains(p.rng.Text, "ends") {
		t.Errorf("reversed range: %q", p.rng.Text)
	}
	p.from.SetText("bad")
	if !strings.Contains(p.rng.Text, "want a Julian date on BJD_TDB") {
		t.Errorf("bad end: %q", p.rng.Text)
	}
	test.Tap(p.whole)
	if p.sel != nil || p.rng.Importance == widget.DangerImportance {
		t.Errorf("whole night: range %v, %q", p.sel, p.rng.Text)
	}
}

// In night red every pixel of the page, on each of its tabs with its
// charts drawn (the fit, the O−C, the periodogram and the folded curve),
// is deep red. The confirmation dialog too.
func TestTimingViewNightRed(t *testing.T) {
	w, q, v, _ := timingOpen(t, "Ashgrove V4", 0)
	// Every tab drawn in the light theme first, then the theme changed
	// with the first in front: the others must not keep light colours.
	for i := range v.tabs.Items {
		v.tabs.SelectIndex(i)
		settle(t, w, q)
	}
	v.tabs.SelectIndex(0)
	w.Session.SetTheme(ThemeNightRed)
	settle(t, w, q)
	test.Tap(v.fit.fitBtn)
	settle(t, w, q)
	check := func(name string, charts ...*ChartView) {
		t.Helper()
		for _, cv := range charts {
			if cv.Visible() && cv.Image() == nil {
				t.Errorf("%s: a chart is not drawn", name)
			}
		}
		assertNightRed(t, name, w.Win.Canvas().Capture(), nil)
	}
	if v.fit.chart.Image() == nil || v.fit.result == nil {
		t.Fatal("nothing fitted")
	}
	check("fit", v.fit.chart)
	v.tabs.SelectIndex(1)
	settle(t, w, q)
	check("O−C", v.oc.chart)
	test.Tap(v.oc.adoptBtn)
	settle(t, w, q)
	check("O−C with the confirmation", v.oc.chart)
	v.confirm.Hide()
	v.tabs.SelectIndex(2)
	settle(t, w, q)
	test.Tap(v.per.search)
	settle(t, w, q)
	v.per.peaks.Select(widget.TableCellID{Row: 1, Col: 1})
	test.Tap(v.per.fold)
	settle(t, w, q)
	check("period search", v.per.chart, v.per.phase)
}

// A theme chosen while the Timings page is in front reaches the Tonight
// page behind it too (Window.restyleShown): its table's lines keep no
// light colour in night red.
func TestTimingViewThemeBehindTabs(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	w.ShowPage("timing")
	settle(t, w, q)
	w.Session.SetTheme(ThemeNightRed)
	settle(t, w, q)
	w.ShowPage("tonight")
	settle(t, w, q)
	assertNightRed(t, "Tonight after a theme change behind it", w.Win.Canvas().Capture(), nil)
}
