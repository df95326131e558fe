package app

import (
	"math"
	"strings"
	"testing"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/observe/logbook"
)

// measurePage opens the window on a small logbook holding measureTestStar
// too, selects that star and brings the Measurements page to the front.
func measurePage(t *testing.T) (*Window, *uiQueue, *measureView, *logbook.Logbook) {
	t.Helper()
	lb := smallLogbook(t)
	if err := lb.AddTarget(measureTestStar(), "invented for the tests"); err != nil {
		t.Fatal(err)
	}
	w, q := openWindow(t, lb)
	v, ok := w.Page("measure").(*measureView)
	if !ok {
		t.Fatal("the window has no Measurements page")
	}
	w.Session.Select("Test Ensemble")
	w.ShowPage("measure")
	settle(t, w, q)
	return w, q, v, lb
}

// measureStored returns the star's measurements in the logbook.
func measureStored(t *testing.T, lb *logbook.Logbook) []logbook.Measurement {
	t.Helper()
	ms, err := lb.MeasurementsOf("Test Ensemble", 0)
	if err != nil {
		t.Fatal(err)
	}
	return ms
}

// measureEnter presses Enter in a field.
func measureEnter(f *measureField) { f.TypedKey(&fyne.KeyEvent{Name: fyne.KeyReturn}) }

func TestMeasurePageEmptyStates(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	v := w.Page("measure").(*measureView)
	if !v.pageMsg.Visible() || v.content.Visible() || !strings.Contains(v.pageEmpty.Text, "Select a star in the list") {
		t.Errorf("with no star selected: message %q (shown %v), page shown %v", v.pageEmpty.Text, v.pageMsg.Visible(), v.content.Visible())
	}
	w.Session.Select("Test Alpha")
	settle(t, w, q)
	if v.pageMsg.Visible() || !v.content.Visible() {
		t.Fatal("the page did not show for the selected star")
	}
	want := "No measurements for Test Alpha tonight: type one above (Ctrl+N) or import a file."
	if !v.empty.Visible() || v.empty.Text != want || v.grid.Visible() {
		t.Errorf("empty table: %q (shown %v), table shown %v; want %q", v.empty.Text, v.empty.Visible(), v.grid.Visible(), want)
	}
	if msg := v.light.Message(); !strings.Contains(msg, "No measurements for Test Alpha tonight") {
		t.Errorf("light curve message: %q", msg)
	}
	// Test Alpha has no comparison stars: the form says where to add them.
	test.Type(v.form.time, "21:00")
	v.addRow()
	settle(t, w, q)
	if !strings.Contains(v.form.problems.Text, "Test Alpha has no comparison stars to estimate against: add them on the Star page") {
		t.Errorf("a row for a star without comparison stars: %q", v.form.problems.Text)
	}
}

// A visual estimate typed with the keyboard only: Ctrl+N, the time, Enter,
// the estimate, Enter. It is reduced (methods.md §9 fractional method),
// stored in a new night record with the observer typed, and shown.
func TestMeasureTypeVisualRow(t *testing.T) {
	w, q, v, lb := measurePage(t)
	v.form.mode.SetSelected(measureModeVisual)
	test.Type(v.observer, "Test Observer")
	w.Win.Canvas().(fyne.Shortcutable).TypedShortcut(measureKeyNew)
	if w.Win.Canvas().Focused() != v.form.time {
		t.Fatalf("Ctrl+N focused %v, want the time field", w.Win.Canvas().Focused())
	}
	test.Tap(v.form.now)
	if v.form.time.Text != "18:00:00" || v.form.echo.Text != "18:00:00 GMT = 18:00:00 UTC, Tue 1 Dec" {
		t.Errorf("Now (the clock at 18:00 UTC): time %q, echo %q", v.form.time.Text, v.form.echo.Text)
	}
	v.form.time.SetText("")
	test.Type(v.form.time, "21:14")
	if v.form.echo.Text != "21:14:00 GMT = 21:14:00 UTC, Tue 1 Dec" {
		t.Errorf("time echo: %q", v.form.echo.Text)
	}
	measureEnter(v.form.time)
	if w.Win.Canvas().Focused() != v.form.estimate {
		t.Fatalf("Enter in the time moved to %v, want the estimate", w.Win.Canvas().Focused())
	}
	test.Type(v.form.estimate, "C1 2 V 3 C2")
	measureEnter(v.form.estimate)
	settle(t, w, q)

	// C1 = 11.200, C2 = 12.050: 11.200 + 0.850 × 2/5 = 11.540 (methods.md §9).
	ms := measureStored(t, lb)
	const tol = 1e-9
	if len(ms) != 1 || math.Abs(ms[0].Mag-11.54) > tol || ms[0].Visual != "C1 2 V 3 C2" {
		t.Fatalf("stored: %+v; want one row of 11.540 mag from the estimate", ms)
	}
	n, err := lb.NightByID(ms[0].NightID)
	if err != nil || n.Observer != "Test Observer" || !n.Date.Equal(measureNight) {
		t.Errorf("night record: %+v (%v)", n, err)
	}
	if got := measureCellText(t, v, 0, "Mag"); got != "11.540" {
		t.Errorf("table Mag cell: %q", got)
	}
	if !strings.HasPrefix(v.form.result.Text, "Added 21:14:00 GMT: 11.540 mag from the estimate C1 2 V 3 C2") {
		t.Errorf("result: %q", v.form.result.Text)
	}
	if v.form.time.Text != "" || v.form.estimate.Text != "" || w.Win.Canvas().Focused() != v.form.time {
		t.Errorf("after the add: time %q, estimate %q, focus %v; want both empty and the time focused", v.form.time.Text, v.form.estimate.Text, w.Win.Canvas().Focused())
	}
	if v.light.Message() != "" || v.light.Image() == nil {
		t.Errorf("the light curve was not drawn: %q", v.light.Message())
	}
}

// measureCellText returns the cell of column name in table row i.
func measureCellText(t *testing.T, v *measureView, i int, name string) string {
	t.Helper()
	for j, c := range v.tbl.Columns {
		if c == name && i < len(v.tbl.Rows) {
			cell := v.newCell()
			v.updateCell(widget.TableCellID{Row: i, Col: j}, cell)
			return cell.(*measureCell).label.Text
		}
	}
	t.Fatalf("no column %q or row %d in %v", name, i, v.tbl.Columns)
	return ""
}

// Instrumental magnitudes typed into the grid give the methods.md §8
// ensemble value, with the check star beside it.
func TestMeasureTypeInstrumentalRow(t *testing.T) {
	w, q, v, lb := measurePage(t)
	f := v.form
	test.Type(f.time, "21:14:05")
	test.Type(f.target.mag, "-7.512")
	for i, m := range []string{"-8.120", "-7.262", "-8.628"} {
		test.Type(f.comps[i].mag, m)
	}
	test.Type(f.check.mag, "-7.668")
	test.Type(f.filter, "V")
	test.Tap(f.add)
	settle(t, w, q)
	ms := measureStored(t, lb)
	if len(ms) != 1 || math.Abs(ms[0].Mag-11.808) > measureTol3 {
		t.Fatalf("stored: %+v; want one row of 11.808 mag (methods.md §8)", ms)
	}
	if !strings.Contains(f.result.Text, "against 3 comparison stars · check K 11.652 (catalogue 11.650)") {
		t.Errorf("result: %q", f.result.Text)
	}
	if got := measureCellText(t, v, 0, "Target"); got != "−7.512" {
		t.Errorf("Target cell: %q", got)
	}
	if !strings.Contains(measureNotesText(v.an.Summary()), "Check star K (catalogue 11.650 mag): mean 11.652 mag") {
		t.Errorf("summary: %v", v.an.Summary())
	}
}

// A bad time and a word for a magnitude: each field is marked, the
// messages say what is expected, and nothing is stored.
func TestMeasureBadRowStoresNothing(t *testing.T) {
	w, q, v, lb := measurePage(t)
	f := v.form
	test.Type(f.time, "25:61")
	test.Type(f.target.mag, "abc")
	test.Type(f.comps[0].mag, "-8.1")
	test.Tap(f.add)
	settle(t, w, q)
	if n := len(measureStored(t, lb)); n != 0 {
		t.Errorf("%d rows stored from a bad entry", n)
	}
	if nights, _ := lb.Nights(""); len(nights) != 0 {
		t.Errorf("a night record was made for a bad entry: %+v", nights)
	}
	for field, want := range map[string]string{
		MeasureFieldTime:   `time "25:61": expected a clock time such as 21:14`,
		MeasureFieldTarget: `target "abc" is not a number: expected its instrumental magnitude`,
	} {
		if !strings.Contains(f.marks[field], want) || !strings.Contains(f.problems.Text, want) {
			t.Errorf("field %s: mark %q, messages %q; want %q", field, f.marks[field], f.problems.Text, want)
		}
	}
	if w.Win.Canvas().Focused() != f.time {
		t.Errorf("focus after the error: %v, want the time field", w.Win.Canvas().Focused())
	}
	// Typing again clears the field's mark.
	test.Type(f.target.mag, "x")
	if _, marked := f.marks[MeasureFieldTarget]; marked {
		t.Error("the target's mark stayed after it was edited")
	}
}

func TestMeasureDeleteAndUndo(t *testing.T) {
	w, q, v, lb := measurePage(t)
	v.form.mode.SetSelected(measureModeVisual)
	for _, tm := range []string{"21:00", "22:00"} {
		test.Type(v.form.time, tm)
		test.Type(v.form.estimate, "C1 1 V 1 C2")
		test.Tap(v.form.add)
		settle(t, w, q)
	}
	if n := len(measureStored(t, lb)); n != 2 || len(v.tbl.Rows) != 2 {
		t.Fatalf("%d rows stored, %d shown; want 2", n, len(v.tbl.Rows))
	}
	// The latest first: row 0 is 22:00.
	cell := v.newCell().(*measureCell)
	v.updateCell(widget.TableCellID{Row: 0, Col: len(v.tbl.Columns)}, cell)
	test.Tap(cell.del)
	settle(t, w, q)
	ms := measureStored(t, lb)
	if len(ms) != 1 || measureJDTime(ms[0].JDUTC).Hour() != 21 || len(v.tbl.Rows) != 1 {
		t.Fatalf("after deleting the 22:00 row: %d stored, %d shown", len(ms), len(v.tbl.Rows))
	}
	if !v.undo.Visible() || !strings.HasPrefix(v.status.Text, "Deleted the row of 22:00:00 GMT") {
		t.Errorf("status %q, undo shown %v", v.status.Text, v.undo.Visible())
	}
	test.Tap(v.undo)
	settle(t, w, q)
	if n := len(measureStored(t, lb)); n != 2 || len(v.tbl.Rows) != 2 || v.undo.Visible() {
		t.Errorf("after Undo: %d stored, %d shown, undo shown %v", n, len(v.tbl.Rows), v.undo.Visible())
	}
}

func TestMeasureSaveNight(t *testing.T) {
	w, q, v, lb := measurePage(t)
	test.Type(v.observer, "Test Observer")
	test.Type(v.conditions, "clear, Moon down")
	test.Tap(v.saveNight)
	settle(t, w, q)
	n, err := lb.Night(demoSiteName(w), measureNight)
	if err != nil || n.Observer != "Test Observer" || n.Conditions != "clear, Moon down" {
		t.Fatalf("night after Save: %+v (%v)", n, err)
	}
	v.conditions.SetText("cloud after midnight")
	test.Tap(v.saveNight)
	settle(t, w, q)
	if n2, _ := lb.Night(demoSiteName(w), measureNight); n2.ID != n.ID || n2.Conditions != "cloud after midnight" {
		t.Errorf("night after a second Save: %+v (was %+v)", n2, n)
	}
}

// demoSiteName returns the window's current site.
func demoSiteName(w *Window) string {
	s, _ := w.Session.Site()
	return s.Name
}

// measureAssertNightRed fails for every pixel of the window that is not
// deep red, the page's charts included.
func measureAssertNightRed(t *testing.T, w *Window, v *measureView) {
	t.Helper()
	if v.light.Image() == nil || v.phase.Image() == nil {
		t.Error("the charts are not drawn")
	}
	assertNightRed(t, "Measurements", w.Win.Canvas().Capture(), nil)
}

// measureDemoWindow opens the window on the demo's busiest night of star,
// with the Measurements page in front.
func measureDemoWindow(t *testing.T, star string) (*Window, *uiQueue, *measureView) {
	t.Helper()
	lb := measureDemo(t)
	r, _ := measureBusiestNight(t, lb, star)
	w, q := openWindow(t, lb)
	_ = w.Session.SetSite(r.Site.Name)
	w.Session.SetDate(r.Date)
	w.Session.Select(r.Target.Name)
	w.ShowPage("measure")
	settle(t, w, q)
	v := w.Page("measure").(*measureView)
	if len(v.tbl.Rows) == 0 || v.light.Image() == nil || v.phase.Image() == nil {
		t.Fatalf("the page is not full: %d rows, charts drawn %v %v", len(v.tbl.Rows), v.light.Image() != nil, v.phase.Image() != nil)
	}
	return w, q, v
}

// A page hidden while the theme changes shows the new theme when it comes
// to the front (Window.rethemeShown): Fyne re-themes only what is on show.
func TestMeasureThemeWhileHidden(t *testing.T) {
	w, q, v := measureDemoWindow(t, "Ashgrove V1")
	w.ShowPage("tonight")
	settle(t, w, q)
	w.Session.SetTheme(ThemeNightRed)
	settle(t, w, q)
	w.ShowPage("measure")
	settle(t, w, q)
	measureAssertNightRed(t, w, v)
}
