package app

import (
	"context"
	"strings"
	"testing"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// starPage returns the window's Star page.
func starPage(t testing.TB, w *Window) *starView {
	t.Helper()
	v, ok := w.Page("star").(*starView)
	if !ok {
		t.Fatal("the window has no Star page")
	}
	return v
}

// starOpen opens the window on lb with the star named name selected.
func starOpen(t *testing.T, lb *logbook.Logbook, name string) (*Window, *uiQueue, *starView) {
	t.Helper()
	w, q := openWindow(t, lb)
	v := starPage(t, w)
	w.ShowPage("star")
	if name != "" {
		w.Session.Select(name)
		settle(t, w, q)
		if v.target.Name != name {
			t.Fatalf("the page shows %q, want %q", v.target.Name, name)
		}
	}
	return w, q, v
}

// starLine returns the value shown beside key in a panel of key/value lines.
func starLine(c *fyne.Container, key string) string {
	for i := 0; i+1 < len(c.Objects); i += 2 {
		if c.Objects[i].(*fyne.Container).Objects[0].(*widget.Label).Text == key {
			return c.Objects[i+1].(*widget.Label).Text
		}
	}
	return ""
}

// starCell returns the text of a cell of the forecast table.
func starCell(v *starView, row, col int) string {
	o := v.forecast.newCell()
	v.forecast.updateCell(widget.TableCellID{Row: row, Col: col}, o)
	return o.(*widget.RichText).String()
}

func TestStarPageShowsStar(t *testing.T) {
	lb := smallLogbook(t)
	w, q, v := starOpen(t, lb, "Test Alpha")
	if v.title.Text != "Test Alpha" || !strings.Contains(v.summary.Text, "pulsating") {
		t.Errorf("title %q, summary %q", v.title.Text, v.summary.Text)
	}
	// Test Alpha sits at RA 2.5 h = 37.5° (1 h = 15°), Dec +40°.
	if got := starLine(v.position, "Right ascension"); got != "02:30:00.00   (2.500000 h, 37.50000°)" {
		t.Errorf("RA: %q", got)
	}
	if got := starLine(v.eph, "Source"); got != "invented for the tests" {
		t.Errorf("source of the ephemeris: %q", got)
	}
	if len(v.historyRows) != 1 || !strings.Contains(v.historyRows[0][1], "invented for the tests") {
		t.Errorf("history: %q", v.historyRows)
	}
	if v.empty.Visible() || !v.body.Visible() {
		t.Error("a selected star shows the empty state")
	}
	// The forecast lists the star's maxima of the coming 14 nights at the
	// demo site, as ForecastStar and BuildStarForecast make them.
	site, _ := w.Session.Site()
	tg, _ := w.Session.Target("Test Alpha")
	d, err := ForecastStar(context.Background(), site, tg, w.Session.Date(), 14)
	if err != nil {
		t.Fatal(err)
	}
	want := BuildStarForecast(d, false)
	if len(v.forecast.model.Rows) == 0 || len(v.forecast.model.Rows) != len(want.Rows) {
		t.Fatalf("forecast rows: %d, want %d (> 0)", len(v.forecast.model.Rows), len(want.Rows))
	}
	for c := range want.Columns {
		if got := starCell(v, 0, c); got != want.Rows[0].Cells[c] {
			t.Errorf("forecast row 0, column %q: got %q, want %q", want.Columns[c], got, want.Rows[0].Cells[c])
		}
	}
	if !strings.Contains(v.forecast.summary.Text, "In the 14 nights from Tue 1 Dec 2026") || !v.forecast.sigma.Visible() {
		t.Errorf("forecast summary %q, σ note %q", v.forecast.summary.Text, v.forecast.sigma.Text)
	}
	shown := len(v.forecast.model.Rows)
	test.Tap(v.forecast.all)
	if got := len(v.forecast.model.Rows); got != shown+want.Hidden {
		t.Errorf("rows with every extremum: %d, want %d + %d", got, shown, want.Hidden)
	}
	v.forecast.nights.SetSelected("7 nights")
	settle(t, w, q)
	if v.forecast.data == nil || v.forecast.data.Nights != 7 || !strings.Contains(v.forecast.summary.Text, "In the 7 nights") {
		t.Errorf("after choosing 7 nights: %q", v.forecast.summary.Text)
	}
	v.forecast.table.Select(widget.TableCellID{Row: 0, Col: 0})
	if !v.forecast.detail.Visible() || !strings.Contains(v.forecast.detail.Text, "cycle E = ") {
		t.Errorf("detail of a row: %q", v.forecast.detail.Text)
	}
}

func TestStarEditBadRAIsRefused(t *testing.T) {
	lb := smallLogbook(t)
	w, q, v := starOpen(t, lb, "Test Alpha")
	test.Tap(v.edit)
	if v.form.mode != starFormEdit || !v.form.root.Visible() || v.details.Visible() {
		t.Fatal("Edit did not open the form in place of the details")
	}
	ra := v.form.entries[StarFieldRA]
	ra.SetText("")
	test.Type(ra, "25:00:00")
	test.Tap(v.form.save)
	settle(t, w, q)
	_, want := ephem.ParseRA("25:00:00")
	if l := v.form.errs[StarFieldRA]; !l.Visible() || l.Text != starErrText(want) {
		t.Errorf("RA error beside the field: %q (visible %v), want %q", l.Text, l.Visible(), starErrText(want))
	}
	for k, l := range v.form.errs {
		if k != StarFieldRA && l.Visible() {
			t.Errorf("field %q shows an error too: %q", k, l.Text)
		}
	}
	got, err := lb.Target("Test Alpha")
	if err != nil || got.Star.RAHours != 2.5 {
		t.Errorf("the logbook's RA after a refused edit: %v (%v), want 2.5 h", got.Star.RAHours, err)
	}
	if v.form.mode != starFormEdit {
		t.Error("the form closed after a refused edit")
	}
	// Typing in the field clears its error.
	test.Type(ra, "x")
	if v.form.errs[StarFieldRA].Visible() {
		t.Error("the RA error stays while the field is being corrected")
	}
}

func TestStarEditSaved(t *testing.T) {
	lb := smallLogbook(t)
	w, q, v := starOpen(t, lb, "Test Alpha")
	test.Tap(v.edit)
	set := func(key, text string) {
		e := v.form.entries[key]
		e.SetText("")
		test.Type(e, text)
	}
	set(StarFieldName, "Test Alpha Prime")
	set(StarFieldRA, "03:15:00")
	set(StarFieldDec, "+41 30 00")
	set(StarFieldMagBright, "10.2")
	set(StarFieldMagFaint, "10.95 mag")
	set("notes", "edited in the window")
	test.Tap(v.form.save)
	settle(t, w, q)
	if _, err := lb.Target("Test Alpha"); err == nil {
		t.Error("the old name is still in the logbook after the rename")
	}
	got, err := lb.Target("Test Alpha Prime")
	if err != nil {
		t.Fatalf("the renamed star: %v", err)
	}
	// 03:15:00 = 3.25 h; +41 30 00 = 41.5°.
	if got.Star.RAHours != 3.25 || got.Star.DecDeg != 41.5 || got.MagBright != 10.2 || got.MagFaint != 10.95 ||
		got.Notes != "edited in the window" {
		t.Errorf("stored: %+v", got)
	}
	if got.Ephemeris != smallTargets()[0].Ephemeris {
		t.Errorf("the edit changed the ephemeris: %+v", got.Ephemeris)
	}
	// After the logbook is read again the page shows the renamed star.
	w.Reload()
	settle(t, w, q)
	if w.Session.Selected() != "Test Alpha Prime" || v.title.Text != "Test Alpha Prime" {
		t.Errorf("selected %q, title %q after the rename", w.Session.Selected(), v.title.Text)
	}
	if ra := starLine(v.position, "Right ascension"); !strings.HasPrefix(ra, "03:15:00.00") {
		t.Errorf("RA shown after the edit: %q", ra)
	}
	if v.notes.Text != "edited in the window" || v.form.mode != starFormClosed || !v.details.Visible() {
		t.Errorf("notes %q, form mode %d", v.notes.Text, v.form.mode)
	}
	if !strings.Contains(v.message.Text, "Saved Test Alpha Prime") {
		t.Errorf("message: %q", v.message.Text)
	}
}

// A name taken by another star is refused beside the name field.
func TestStarEditNameTaken(t *testing.T) {
	lb := smallLogbook(t)
	w, q, v := starOpen(t, lb, "Test Alpha")
	test.Tap(v.edit)
	v.form.entries[StarFieldName].SetText("test beta")
	test.Tap(v.form.save)
	settle(t, w, q)
	if l := v.form.errs[StarFieldName]; !l.Visible() || !strings.Contains(l.Text, "already has a star called Test Beta") {
		t.Errorf("name error: %q", l.Text)
	}
	if _, err := lb.Target("Test Alpha"); err != nil {
		t.Errorf("Test Alpha after a refused rename: %v", err)
	}
}

func TestStarAddAndDelete(t *testing.T) {
	lb := smallLogbook(t)
	w, q, v := starOpen(t, lb, "")
	test.Tap(v.add)
	if v.form.mode != starFormNew || !v.form.ephemBox.Visible() || !v.form.starBox.Visible() {
		t.Fatal("New star did not open the whole form")
	}
	for k, text := range map[string]string{
		StarFieldName: "Test Delta", StarFieldRA: "4.2", StarFieldDec: "35", StarFieldT0: "2461375.3",
		StarFieldPeriod: "1.1", StarFieldEpochErr: "0.002", StarFieldSource: "typed in a test",
	} {
		test.Type(v.form.entries[k], text)
	}
	v.form.class.SetSelected("eclipsing")
	if v.form.kind.Selected != "minimum" {
		t.Errorf("T0 marks %q for an eclipsing star, want minimum", v.form.kind.Selected)
	}
	test.Tap(v.form.save)
	settle(t, w, q)
	got, err := lb.Target("Test Delta")
	if err != nil {
		t.Fatalf("the new star: %v (form errors: %q)", err, v.form.formErr.Text)
	}
	if got.Star.RAHours != 4.2 || got.Class != observe.Eclipsing || got.Kind != observe.Min ||
		got.Ephemeris.Epoch != 2461375.3 || got.Ephemeris.PeriodDays != 1.1 || got.Ephemeris.Scale != ephem.BJDTDB {
		t.Errorf("stored: %+v", got)
	}
	if w.Session.Selected() != "Test Delta" || len(v.historyRows) != 1 || !strings.Contains(v.historyRows[0][1], "typed in a test") {
		t.Errorf("selected %q, history %q", w.Session.Selected(), v.historyRows)
	}
	if v.distance.root.Visible() {
		t.Error("the distance is offered for an eclipsing star")
	}

	// Delete it: the question names what goes with it.
	test.Tap(v.del)
	settle(t, w, q)
	if !v.confirm.root.Visible() || !strings.Contains(v.confirm.text.Text, "Delete Test Delta for good, with 1 ephemeris, "+
		"0 comparison and check stars, 0 measurements and 0 timings") {
		t.Fatalf("question: %q (visible %v)", v.confirm.text.Text, v.confirm.root.Visible())
	}
	test.Tap(v.confirm.yes)
	settle(t, w, q)
	if _, err := lb.Target("Test Delta"); err == nil {
		t.Error("Test Delta is still in the logbook")
	}
	if w.Session.Selected() != "" || !v.empty.Visible() || !strings.Contains(v.empty.Text, "No star selected") {
		t.Errorf("after the delete: selected %q, empty %q", w.Session.Selected(), v.empty.Text)
	}
	if !strings.Contains(v.message.Text, "Deleted Test Delta") {
		t.Errorf("message: %q", v.message.Text)
	}
}

// Cancel keeps the star.
func TestStarDeleteCancelled(t *testing.T) {
	lb := smallLogbook(t)
	w, q, v := starOpen(t, lb, "Test Beta")
	test.Tap(v.del)
	settle(t, w, q)
	test.Tap(v.confirm.no)
	settle(t, w, q)
	if _, err := lb.Target("Test Beta"); err != nil || v.confirm.root.Visible() {
		t.Errorf("after Cancel: %v, question visible %v", err, v.confirm.root.Visible())
	}
}

func TestStarAdoptEphemeris(t *testing.T) {
	lb := smallLogbook(t)
	w, q, v := starOpen(t, lb, "Test Beta")
	old := smallTargets()[1].Ephemeris
	test.Tap(v.adopt)
	if v.form.mode != starFormAdopt || v.form.starBox.Visible() {
		t.Fatal("New ephemeris did not open the ephemeris form alone")
	}
	if v.form.entries[StarFieldPeriod].Text != "0.81" {
		t.Errorf("the form starts from the current period: %q", v.form.entries[StarFieldPeriod].Text)
	}
	test.Tap(v.form.save) // no source
	if l := v.form.errs[StarFieldSource]; !l.Visible() {
		t.Error("no error beside an empty source")
	}
	v.form.entries[StarFieldPeriod].SetText("0.8100123")
	v.form.scale.SetSelected(ephem.HJD.Label())
	test.Type(v.form.entries[StarFieldSource], "own O−C fit (test)")
	test.Tap(v.form.save)
	settle(t, w, q)
	h, err := lb.EphemerisHistory("Test Beta")
	if err != nil || len(h) != 2 {
		t.Fatalf("history: %+v (%v), want 2 entries", h, err)
	}
	if h[0].Ephemeris != old || h[1].PeriodDays != 0.8100123 || h[1].Scale != ephem.HJD || h[1].Source != "own O−C fit (test)" {
		t.Errorf("history: %+v", h)
	}
	if len(v.historyRows) != 2 || v.historyRows[0][1] != "own O−C fit (test)" ||
		starLine(v.eph, "Period P") != "0.8100123 d (19.4403 h)" {
		t.Errorf("shown: history %q, period %q", v.historyRows, starLine(v.eph, "Period P"))
	}
	// The forecast follows the new ephemeris.
	if v.forecast.data == nil || v.forecast.data.Target.Ephemeris.PeriodDays != 0.8100123 {
		t.Error("the forecast was not made again from the new ephemeris")
	}
}
