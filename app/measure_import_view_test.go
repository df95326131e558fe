package app

import (
	"math"
	"strings"
	"testing"

	"fyne.io/fyne/v2/test"
)

// The import dialog: the columns the guess cannot place are chosen by
// hand, the preview says what will be stored, and Import stores every row.
func TestMeasureImportDialog(t *testing.T) {
	w, q, v, lb := measurePage(t)
	path := measureWrite(t, measureCSV)
	v.startImport(path)
	settle(t, w, q)
	p := v.imp
	if p == nil {
		t.Fatal("no import dialog")
	}
	// The guess finds the filter ("band") but not the rest of these names.
	if p.filter.Selected != "band" || p.target.Selected != measureNone {
		t.Errorf("guessed filter %q, target %q", p.filter.Selected, p.target.Selected)
	}
	if !p.doImport.Disabled() || !strings.Contains(measureNotesText(p.pv.Notes(3, nil)), "choose the column that holds the time") {
		t.Errorf("before the mapping: import enabled %v, notes %v", !p.doImport.Disabled(), p.pv.Notes(3, nil))
	}
	p.timeCol.SetSelected("mid")
	p.exposure.SetSelected("expo")
	p.target.SetSelected("vmag")
	for l, col := range map[string]string{"C1": "cmp_a", "C2": "cmp_b", "C3": "cmp_c", "K": "chk"} {
		p.stars[l][0].SetSelected(col)
	}
	settle(t, w, q)
	notes := measureNotesText(p.pv.Notes(p.im.Rows, p.nights))
	if !strings.Contains(notes, "3 frames of 3 rows reduced, on 2 nights: night of Tue 1 – Wed 2 Dec 2026 (2 frames, a new night record)") {
		t.Errorf("preview: %s", notes)
	}
	if p.doImport.Disabled() || p.doImport.Text != "Import 3 frames" {
		t.Fatalf("import button: %q, disabled %v", p.doImport.Text, p.doImport.Disabled())
	}
	test.Tap(p.doImport)
	settle(t, w, q)
	ms := measureStored(t, lb)
	if len(ms) != 3 || math.Abs(ms[0].Mag-11.808) > measureTol3 {
		t.Fatalf("stored %d rows (first %v), want 3 of 11.808 mag", len(ms), ms)
	}
	if v.imp != nil || v.status.Text != "Imported 3 frames from frames.csv." {
		t.Errorf("after the import: dialog open %v, status %q", v.imp != nil, v.status.Text)
	}
	if len(v.tbl.Rows) != 2 {
		t.Errorf("the night shows %d rows, want the 2 of 1–2 December", len(v.tbl.Rows))
	}
}

// A bad cell: the preview names file, line and column, Import stays off,
// and nothing is stored.
func TestMeasureImportDialogBadCell(t *testing.T) {
	w, q, v, lb := measurePage(t)
	bad := strings.Replace(measureCSV, "-7.262,-8.628,-7.668,V\n2461377", "-7.262,-8.628,-7.66.8,V\n2461377", 1)
	path := measureWrite(t, bad)
	v.startImport(path)
	settle(t, w, q)
	p := v.imp
	p.timeCol.SetSelected("mid")
	p.target.SetSelected("vmag")
	p.stars["C1"][0].SetSelected("cmp_a")
	p.stars["K"][0].SetSelected("chk")
	settle(t, w, q)
	// Line 4 of the file; 50 bytes of "2461376.390000,60,-7.512,0.5,-8.120,-7.262,-8.628," before the cell.
	want := "Nothing can be imported: " + path + ": line 4, column 51 (chk)"
	if got := measureNotesText(p.pv.Notes(p.im.Rows, p.nights)); !strings.HasPrefix(got, want) {
		t.Errorf("preview: %q; want it to start with %q", got, want)
	}
	if !p.doImport.Disabled() {
		t.Error("Import is enabled for a file with a bad cell")
	}
	p.store() // as a stray press would
	settle(t, w, q)
	if n := len(measureStored(t, lb)); n != 0 {
		t.Errorf("%d rows stored from a file with a bad cell", n)
	}
	test.Tap(p.cancel)
	if v.imp != nil {
		t.Error("Cancel did not close the dialog")
	}
}

// In night red, no pixel of the Measurements page with its rows, form,
// messages and charts has green or blue, or red above 200.
func TestMeasureNightRed(t *testing.T) {
	w, q, v := measureDemoWindow(t, "Ashgrove V1")
	w.Session.SetTheme(ThemeNightRed)
	v.form.time.SetText("25:61")
	v.addRow()
	settle(t, w, q)
	if !v.form.problems.Visible() {
		t.Fatal("the bad time shows no message")
	}
	measureAssertNightRed(t, w, v)
}
