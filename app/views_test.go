package app

import (
	"context"
	"errors"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/demo"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

func TestSelectionFollowsListAndTable(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	v := tonight(t, w)
	chartBefore := v.chart.Image()

	// A star picked in the list selects its first row in the table and
	// leads the chart. Pick one the chart does not lead with already.
	pick := 0
	for pick < len(w.stars.rows) && len(v.model.Chart) > 0 && w.stars.rows[pick].Name == v.model.Chart[0].Name {
		pick++
	}
	name := w.stars.rows[pick].Name
	w.stars.list.Select(pick)
	settle(t, w, q)
	if got := w.Session.Selected(); got != name {
		t.Fatalf("selected after tapping the list: got %q, want %q", got, name)
	}
	if v.row != v.model.RowOf(name) || v.row < 0 {
		t.Errorf("table row %d selected, want %s's first row %d", v.row, name, v.model.RowOf(name))
	}
	if len(v.model.Chart) == 0 || v.model.Chart[0].Name != name {
		t.Errorf("chart stars %v: want %s first", v.model.Chart, name)
	}
	if v.chart.Image() == chartBefore {
		t.Error("the chart was not redrawn for the selected star")
	}
	if !strings.HasPrefix(v.detail.Text, name+": ") || !v.detail.Visible() {
		t.Errorf("detail: got %q (visible %v), want %s's extremum", v.detail.Text, v.detail.Visible(), name)
	}

	// A row picked in the table selects its star in the list.
	row := v.model.RowOf("Test Beta")
	if row < 0 {
		t.Fatal("Test Beta has no event in the night")
	}
	v.table.Select(widget.TableCellID{Row: row, Col: 0})
	settle(t, w, q)
	if got := w.Session.Selected(); got != "Test Beta" {
		t.Errorf("selected after tapping the table: got %q, want Test Beta", got)
	}
	if v.row != row {
		t.Errorf("table row %d after tapping row %d", v.row, row)
	}
	if !strings.HasPrefix(v.detail.Text, "Test Beta: ") {
		t.Errorf("detail: got %q, want Test Beta's extremum", v.detail.Text)
	}
}

func TestSiteChangeReplans(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	v := tonight(t, w)
	w.header.site.SetSelected("Test South")
	settle(t, w, q)
	nd := w.Session.Night()
	if nd == nil || nd.Request.Site.Name != "Test South" {
		t.Fatalf("plan after choosing Test South: %v", nd)
	}
	// Johannesburg is UTC+2 all year: local times run two hours ahead.
	e := nd.Events[0]
	wantLocal := e.UTC.Time().Add(2 * time.Hour).Round(time.Minute).Format("15:04")
	if got := tableCell(t, v, 0, 0); got != wantLocal {
		t.Errorf("local time at Test South: got %q, want %q (UTC %s + 2 h)", got, wantLocal, tableCell(t, v, 0, 1))
	}
	if !strings.Contains(w.status.clocks.Text, "local 20:00:00 SAST") {
		t.Errorf("status clocks at Test South: got %q, want local 20:00:00 SAST", w.status.clocks.Text)
	}
}

func TestThemeSwitch(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	v := tonight(t, w)
	for _, th := range []ThemeChoice{ThemeNightRed, ThemeDark, ThemeLight} {
		w.header.theme.SetSelected(th.String())
		settle(t, w, q)
		if w.Session.Theme() != th {
			t.Errorf("theme after choosing %q: got %v", th, w.Session.Theme())
		}
		bg := Palette(th).Background
		r, g, b, _ := v.chart.Image().At(2, 2).RGBA()
		wr, wg, wb, _ := bg.RGBA()
		if r>>8 != wr>>8 || g>>8 != wg>>8 || b>>8 != wb>>8 {
			t.Errorf("%v: chart corner (%d, %d, %d), want the palette's background (%d, %d, %d)", th, r>>8, g>>8, b>>8, wr>>8, wg>>8, wb>>8)
		}
	}
}

// In night red, no pixel of the whole window (header, list, table, the
// altitude chart with its translucent windows over the curves, status
// bar, a selected row) may have green or blue, or red above nightMaxRed.
func TestNightRedWindowHasNoWhite(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	w.Session.SetTheme(ThemeNightRed)
	w.stars.list.Select(1)
	settle(t, w, q)
	assertNightRed(t, "Tonight", w.Win.Canvas().Capture(), nil)
}

func TestStatusBarJobs(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	w.status.showAfter = 0
	release := make(chan struct{})
	var got error
	Run(w.Jobs, "search", "Period search", func(ctx context.Context, p Progress) (int, error) {
		p(1, 4)
		select {
		case <-ctx.Done():
			return 0, ctx.Err()
		case <-release:
			return 1, nil
		}
	}, func(_ int, err error) { got = err })
	// Run the queue until the status bar shows the job.
	deadline := time.Now().Add(10 * time.Second)
	for w.status.jobs["search"] == nil || w.status.jobs["search"].bar.Value != 0.25 {
		if time.Now().After(deadline) {
			t.Fatal("the status bar never showed the job at 1 of 4")
		}
		select {
		case f := <-q.ch:
			f()
		case <-time.After(5 * time.Millisecond):
		}
	}
	r := w.status.jobs["search"]
	if r.name.Text != "Period search" {
		t.Errorf("job name in the status bar: got %q", r.name.Text)
	}
	test.Tap(r.cancel)
	settle(t, w, q)
	close(release)
	if !errors.Is(got, context.Canceled) {
		t.Errorf("the job's onDone after its cancel button: got %v, want context.Canceled", got)
	}
	if len(w.status.jobBox.Objects) != 0 {
		t.Errorf("the status bar still shows %d jobs", len(w.status.jobBox.Objects))
	}
}

func TestEmptyLogbookSaysWhatToDo(t *testing.T) {
	lb, err := logbook.Create(filepath.Join(t.TempDir(), "empty.db"))
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { lb.Close() })
	w, q := openWindow(t, lb)
	v := tonight(t, w)
	if !v.empty.Visible() || !strings.Contains(v.empty.Text, "no observing site") {
		t.Errorf("Tonight with no site: %q (visible %v)", v.empty.Text, v.empty.Visible())
	}
	if w.header.date.Text != "No site" || !w.header.next.Disabled() {
		t.Errorf("header with no site: %q, ▶ disabled %v", w.header.date.Text, w.header.next.Disabled())
	}
	if err := lb.AddSite(demo.Site()); err != nil {
		t.Fatal(err)
	}
	w.Reload()
	settle(t, w, q)
	if !strings.Contains(v.empty.Text, "No stars yet") || !strings.Contains(w.stars.empty.Text, "No stars yet") {
		t.Errorf("with a site and no stars: page %q, list %q", v.empty.Text, w.stars.empty.Text)
	}
}

// A star next to the Sun with a maximum before sunset: the row, the
// banner and the detail carry the Sun caution.
func TestSunCautionShows(t *testing.T) {
	lb := smallLogbook(t)
	// The Sun on 1 December stands near RA 16.5 h, Dec −21.8° [from
	// memory; the caution needs only a star within 15° of it]; the maximum
	// falls at 15:00 UTC, an hour before sunset at the demo site.
	at := time.Date(2026, 12, 1, 15, 0, 0, 0, time.UTC)
	et, _ := ephem.FromTime(at)
	near := invented("Test Sunward", observe.Pulsating, 16.5, -21.8, et.JDTDB(), 10)
	if err := lb.AddTarget(near, "invented for the tests"); err != nil {
		t.Fatal(err)
	}
	w, q := openWindow(t, lb)
	v := tonight(t, w)
	row := v.model.RowOf("Test Sunward")
	if row < 0 {
		t.Fatal("the star by the Sun has no row")
	}
	if !v.model.Rows[row].Caution || !v.caution.Visible() || v.caution.Text != observe.SolarWarningText {
		t.Errorf("Sun caution: row %v, banner visible %v with %q", v.model.Rows[row].Caution, v.caution.Visible(), v.caution.Text)
	}
	if got := tableCell(t, v, row, 7); !strings.HasPrefix(got, "SUN NEAR") {
		t.Errorf("verdict cell: got %q, want SUN NEAR first", got)
	}
	w.Session.Select("Test Sunward")
	settle(t, w, q)
	if !strings.Contains(v.detail.Text, observe.SolarWarningText) {
		t.Errorf("detail of the row: %q, want the Sun caution", v.detail.Text)
	}
}

func TestChartViewPicksDataRange(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	v := tonight(t, w)
	a, ok := v.chart.Area()
	if !ok {
		t.Fatal("no plotting area after the chart was drawn")
	}
	var from, to float64
	v.chart.OnPick = func(f, t float64) { from, to = f, t }
	// Drag from a quarter to three quarters of the plotting area.
	x0 := a.Min.X + (a.Max.X-a.Min.X)/4
	x1 := a.Min.X + 3*(a.Max.X-a.Min.X)/4
	y := (a.Min.Y + a.Max.Y) / 2
	// test.Drag sends one drag event at its position, having moved by the
	// delta: the drag ends at x1.
	abs := fyne.CurrentApp().Driver().AbsolutePositionForObject(v.chart)
	test.Drag(w.Win.Canvas(), abs.AddXY(x1, y), x1-x0, 0)
	settle(t, w, q)
	span := a.XMax - a.XMin
	const tolFrac = 0.01 // of the axis: a pixel or two of rounding
	if d := from - (a.XMin + span/4); d > tolFrac*span || d < -tolFrac*span {
		t.Errorf("picked from %.3f, want %.3f", from, a.XMin+span/4)
	}
	if d := to - (a.XMin + 3*span/4); d > tolFrac*span || d < -tolFrac*span {
		t.Errorf("picked to %.3f, want %.3f", to, a.XMin+3*span/4)
	}
}
