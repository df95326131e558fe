package app

import (
	"fmt"
	"math"
	"path/filepath"
	"strings"
	"testing"

	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

func TestStarImportView(t *testing.T) {
	lb := smallLogbook(t)
	w, q, v := starOpen(t, lb, "")
	v.importFile(starBadCSV(t))
	settle(t, w, q)
	if !strings.Contains(v.message.Text, "Nothing was imported") || !strings.Contains(v.message.Text, "line 10, column 21 (dec)") ||
		v.message.Importance != widget.DangerImportance {
		t.Errorf("a bad file: %q", v.message.Text)
	}
	if n := len(w.Session.Targets()); n != 3 {
		t.Errorf("targets after a bad file: %d, want 3", n)
	}
	v.importFile(starExampleCSV)
	settle(t, w, q)
	if !strings.Contains(v.message.Text, "Added 4 stars from targets_example.csv") {
		t.Errorf("message: %q", v.message.Text)
	}
	if n := len(w.Session.Targets()); n != 7 {
		t.Errorf("targets after the import: %d, want 7", n)
	}
	// Export and read back.
	out := filepath.Join(t.TempDir(), "all.csv")
	v.exportFile(out)
	settle(t, w, q)
	back, err := observe.ReadTargetsCSVFile(out)
	if err != nil || len(back) != 7 || !strings.Contains(v.message.Text, "Wrote 7 stars") {
		t.Errorf("export: %d stars read back (%v); message %q", len(back), err, v.message.Text)
	}
}

// Importing into the demo logbook asks first, since it removes the demo.
func TestStarImportIntoDemoAsks(t *testing.T) {
	lb := demoLogbook(t)
	w, q, v := starOpen(t, lb, "")
	v.importFile(starExampleCSV)
	settle(t, w, q)
	if !v.confirm.root.Visible() || !strings.Contains(v.confirm.text.Text, "removes the demo first") {
		t.Fatalf("no question before removing the demo: %q", v.confirm.text.Text)
	}
	if n := len(w.Session.Targets()); n != 8 {
		t.Errorf("the demo's stars before the answer: %d, want 8", n)
	}
	test.Tap(v.confirm.yes)
	settle(t, w, q)
	if names := targetNames(t, lb); len(names) != 4 || names[0] != "Alder Var" {
		t.Errorf("stars after the import: %v, want the example's 4", names)
	}
}

func TestStarCompsEdit(t *testing.T) {
	lb := smallLogbook(t)
	w, q, v := starOpen(t, lb, "Test Gamma")
	p := v.comps
	if !p.empty.Visible() || p.tableBox.Visible() {
		t.Error("a star without comparison stars shows a table")
	}
	test.Type(p.id, "C1")
	test.Type(p.vmag, "eleven")
	test.Tap(p.add)
	settle(t, w, q)
	if !p.errs[StarFieldCompV].Visible() {
		t.Error("no error beside a V that is not a number")
	}
	if comps, _, _ := lb.Comps("Test Gamma"); len(comps) != 0 {
		t.Errorf("a bad comparison star was stored: %+v", comps)
	}
	p.vmag.SetText("11.204")
	test.Type(p.bv, "0.61")
	test.Tap(p.add)
	settle(t, w, q)
	test.Type(p.id, "K1")
	test.Type(p.vmag, "12.3")
	p.role.SetSelected(starRoleCheck)
	test.Tap(p.add)
	settle(t, w, q)
	comps, checks, err := lb.Comps("Test Gamma")
	if err != nil || len(comps) != 1 || len(checks) != 1 || comps[0].V != 11.204 || comps[0].BV != 0.61 || !math.IsNaN(checks[0].BV) {
		t.Fatalf("stored: %+v / %+v (%v)", comps, checks, err)
	}
	if len(p.rows) != 2 || strings.Join(p.rows[1].Cells(), "|") != "K1|12.300|—|check" {
		t.Errorf("table: %+v", p.rows)
	}
	// Change C1's V, then remove K1.
	p.table.Select(widget.TableCellID{Row: 0, Col: 0})
	if p.id.Text != "C1" || p.save.Disabled() {
		t.Fatalf("picking row 0: editor %q, save disabled %v", p.id.Text, p.save.Disabled())
	}
	p.vmag.SetText("11.25")
	test.Tap(p.save)
	settle(t, w, q)
	p.table.Select(widget.TableCellID{Row: 1, Col: 0})
	test.Tap(p.remove)
	settle(t, w, q)
	comps, checks, _ = lb.Comps("Test Gamma")
	if len(comps) != 1 || comps[0].V != 11.25 || len(checks) != 0 {
		t.Errorf("after the change and removal: %+v / %+v", comps, checks)
	}
	// A label already used is refused beside the label field.
	test.Type(p.id, "c1")
	test.Type(p.vmag, "12")
	test.Tap(p.add)
	if l := p.errs[StarFieldCompID]; !l.Visible() || !strings.Contains(l.Text, "already has one") {
		t.Errorf("a repeated label: %q", l.Text)
	}
}

// The demo's Cepheid-like star shows its distance, as reduce.Distance
// gives it from the stored mean V; an eclipsing star shows none.
func TestStarDistanceDemo(t *testing.T) {
	lb := demoLogbook(t)
	const name = "Ashgrove V2"
	w, q, v := starOpen(t, lb, name)
	mean, err := lb.MeanMagV(name)
	if err != nil || math.IsNaN(mean) {
		t.Fatalf("the demo's mean V of %s: %v (%v)", name, mean, err)
	}
	tg, _ := w.Session.Target(name)
	want, err := reduce.Distance(tg.Ephemeris.PeriodDays, math.Round(mean*1000)/1000, 0, "")
	if err != nil {
		t.Fatal(err)
	}
	p := v.distance
	if !p.box.Visible() || p.meanV.Text != fmt.Sprintf("%.3f", mean) || p.relation.Selected != reduce.DefaultPLRelation {
		t.Fatalf("panel: visible %v, mean V %q, relation %q", p.box.Visible(), p.meanV.Text, p.relation.Selected)
	}
	wantText := fmt.Sprintf("%s ± %s pc  (%s ± %s light years)", starRound(want.DistancePc), starRound(want.DistanceErrPc),
		starRound(want.DistancePc*LightYearsPerParsec), starRound(want.DistanceErrPc*LightYearsPerParsec))
	if got := p.headline.Text; got != "Distance "+wantText {
		t.Errorf("distance: got %q, want %q", got, "Distance "+wantText)
	}
	if got := starLine(p.result, "Reference"); got != want.Relation.Reference {
		t.Errorf("reference: %q", got)
	}
	if !strings.Contains(p.note.Text, "classical (type I, fundamental-mode) Cepheids only") {
		t.Errorf("note: %q", p.note.Text)
	}
	// Extinction moves the star closer: d ∝ 10^(−A/5).
	p.av.SetText("0.5")
	want5, _ := reduce.Distance(tg.Ephemeris.PeriodDays, math.Round(mean*1000)/1000, 0.5, "")
	if !strings.HasPrefix(p.headline.Text, "Distance "+starRound(want5.DistancePc)+" ± ") {
		t.Errorf("with A_V = 0.5: %q, want %s pc", p.headline.Text, starRound(want5.DistancePc))
	}
	p.av.SetText("-1")
	if !p.avErr.Visible() {
		t.Error("no error beside a negative A_V")
	}
	// Keep a new mean V.
	p.meanV.SetText("9.5")
	test.Tap(p.saveMean)
	settle(t, w, q)
	if got, _ := lb.MeanMagV(name); got != 9.5 {
		t.Errorf("mean V stored: %v, want 9.5", got)
	}
	w.Session.Select("Ashgrove V4")
	settle(t, w, q)
	if p.root.Visible() {
		t.Error("the distance is offered for an eclipsing star")
	}
	// A variable of another class gets a word on why there is none.
	other := invented("Test Other", observe.Other, 1, 50, 2460000.5, 3)
	if err := lb.AddTarget(other, "test"); err != nil {
		t.Fatal(err)
	}
	w.Reload()
	settle(t, w, q)
	w.Session.Select("Test Other")
	settle(t, w, q)
	if !p.root.Visible() || p.box.Visible() || !p.off.Visible() || !strings.Contains(p.off.Text, "classical Cepheids only") {
		t.Errorf("another class: panel %v, box %v, %q", p.root.Visible(), p.box.Visible(), p.off.Text)
	}
}

func TestStarEmptyStates(t *testing.T) {
	lb, err := logbook.Create(filepath.Join(t.TempDir(), "empty.db"))
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { lb.Close() })
	w, q, v := starOpen(t, lb, "")
	if !v.empty.Visible() || !strings.Contains(v.empty.Text, "No stars yet: add one or import a catalogue") {
		t.Errorf("no stars: %q", v.empty.Text)
	}
	if !v.edit.Disabled() || !v.del.Disabled() || v.add.Disabled() || v.imp.Disabled() || !v.exp.Disabled() {
		t.Error("with no star: want Edit, Delete and Export off, New star and Import on")
	}
	if err := lb.AddTarget(smallTargets()[0], "test"); err != nil {
		t.Fatal(err)
	}
	w.Reload()
	settle(t, w, q)
	if !strings.Contains(v.empty.Text, "No star selected") || v.exp.Disabled() {
		t.Errorf("a star, none selected: %q", v.empty.Text)
	}
	w.Session.Select("Test Alpha")
	settle(t, w, q)
	if v.empty.Visible() || !strings.Contains(v.forecast.empty.Text, "no observing site") {
		t.Errorf("no site: forecast says %q", v.forecast.empty.Text)
	}
}

// In night red no pixel of the Star page (with its form open) has green or
// blue, or red above nightMaxRed.
func TestStarNightRed(t *testing.T) {
	lb := smallLogbook(t)
	w, q, v := starOpen(t, lb, "Test Alpha")
	w.Session.SetTheme(ThemeNightRed)
	settle(t, w, q)
	check := func(what string) {
		t.Helper()
		assertNightRed(t, what, w.Win.Canvas().Capture(), nil)
	}
	check("details")
	test.Tap(v.edit)
	v.form.entries[StarFieldRA].SetText("25")
	test.Tap(v.form.save)
	check("form with an error")
}

// A theme chosen while the Star page is in front reaches the Tonight page
// too (its table's lines were left in the old theme's grey): no pixel has
// green or blue, or red above nightMaxRed.
func TestStarThemeReachesHiddenPage(t *testing.T) {
	lb := smallLogbook(t)
	w, q, _ := starOpen(t, lb, "Test Alpha")
	w.Session.SetTheme(ThemeNightRed)
	settle(t, w, q)
	w.ShowPage("tonight")
	settle(t, w, q)
	assertNightRed(t, "Tonight after a theme change on the Star page", w.Win.Canvas().Capture(), nil)
}
