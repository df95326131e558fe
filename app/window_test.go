package app

import (
	"image"
	"strings"
	"testing"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/driver/desktop"
	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/widget"
)

func TestWindowOpensOnTonight(t *testing.T) {
	w, _ := openWindow(t, smallLogbook(t))
	v := tonight(t, w)
	if got, want := w.header.date.Text, "Night of Tue 1 – Wed 2 Dec 2026"; got != want {
		t.Errorf("header date: got %q, want %q", got, want)
	}
	nd := w.Session.Night()
	if nd == nil {
		t.Fatal("no plan once the jobs have settled")
	}
	if len(v.model.Rows) != len(nd.Events) || len(nd.Events) == 0 {
		t.Fatalf("table rows %d, night events %d: want the same, more than none", len(v.model.Rows), len(nd.Events))
	}
	// The table shows the model: the first visible row's time and star.
	if got, want := tableCell(t, v, 0, 2), nd.Events[0].Target; got != want {
		t.Errorf("table row 0, star: got %q, want %q", got, want)
	}
	if got, want := tableCell(t, v, 0, 0), clockText(nd.Events[0].UTC.Time(), nd.Request.Site.Location()); got != want {
		t.Errorf("table row 0, local time: got %q, want %q", got, want)
	}
	if !strings.HasPrefix(w.header.moon.Text, "Moon ") || !strings.Contains(w.header.moon.Text, "%") {
		t.Errorf("header Moon: got %q, want the Moon's illumination", w.header.moon.Text)
	}
	if got, want := len(w.stars.rows), len(smallTargets()); got != want {
		t.Errorf("star list rows: got %d, want %d", got, want)
	}
	if got := w.status.clocks.Text; got != "UTC 18:00:00   local 18:00:00 GMT" {
		t.Errorf("status clocks: got %q, want the pinned time in UTC and at the site", got)
	}
	if w.status.demo.Visible() {
		t.Error("the demo badge shows on a logbook that is not the demo")
	}
	if opaque(v.chart.Image()) == 0 {
		t.Error("the altitude chart was not drawn")
	}
}

// tableCell returns the text of a visible cell of the Tonight table.
func tableCell(t *testing.T, v *tonightView, row, col int) string {
	t.Helper()
	o := v.newCell()
	v.updateCell(widget.TableCellID{Row: row, Col: col}, o)
	return o.(*widget.RichText).String()
}

// opaque counts the opaque pixels of img on a coarse grid.
func opaque(img image.Image) int {
	if img == nil {
		return 0
	}
	n := 0
	b := img.Bounds()
	for y := b.Min.Y; y < b.Max.Y; y += 5 {
		for x := b.Min.X; x < b.Max.X; x += 5 {
			if _, _, _, a := img.At(x, y).RGBA(); a > 0 {
				n++
			}
		}
	}
	return n
}

func TestNightButtonsAndKeys(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	v := tonight(t, w)
	canvas := w.Win.Canvas()
	steps := []struct {
		name string
		do   func()
		want string // the night's date
	}{
		{"▶ button", func() { test.Tap(w.header.next) }, "2026-12-02"},
		{"◀ button", func() { test.Tap(w.header.prev) }, "2026-12-01"},
		{"Alt+Right", func() { canvas.(fyne.Shortcutable).TypedShortcut(keyNextNight) }, "2026-12-02"},
		{"Page Down", func() { canvas.OnTypedKey()(&fyne.KeyEvent{Name: fyne.KeyPageDown}) }, "2026-12-03"},
		{"Page Up", func() { canvas.OnTypedKey()(&fyne.KeyEvent{Name: fyne.KeyPageUp}) }, "2026-12-02"},
		{"Alt+Left while typing a search", func() {
			canvas.Focus(w.stars.search)
			w.stars.search.TypedShortcut(&desktop.CustomShortcut{KeyName: fyne.KeyLeft, Modifier: fyne.KeyModifierAlt})
		}, "2026-12-01"},
		{"Page Down while typing a search", func() { w.stars.search.TypedKey(&fyne.KeyEvent{Name: fyne.KeyPageDown}) }, "2026-12-02"},
		{"Page Down in the star list", func() { w.stars.list.TypedKey(&fyne.KeyEvent{Name: fyne.KeyPageDown}) }, "2026-12-03"},
		{"Page Up in the table", func() { v.table.TypedKey(&fyne.KeyEvent{Name: fyne.KeyPageUp}) }, "2026-12-02"},
	}
	for _, st := range steps {
		chartBefore := v.chart.Image()
		st.do()
		settle(t, w, q)
		nd := w.Session.Night()
		if nd == nil || nd.Request.Date.Format(time.DateOnly) != st.want {
			t.Fatalf("%s: planned night %v, want %s", st.name, nd, st.want)
		}
		date, _ := time.Parse(time.DateOnly, st.want)
		if got := w.header.date.Text; got != nightTitle(date) {
			t.Errorf("%s: header date %q, want %q", st.name, got, nightTitle(date))
		}
		if len(v.model.Rows) != len(nd.Events) || tableCell(t, v, 0, 2) != nd.Events[0].Target {
			t.Errorf("%s: the table does not show the new night's events", st.name)
		}
		if v.chart.Image() == chartBefore {
			t.Errorf("%s: the chart was not redrawn for the new night", st.name)
		}
	}
	if w.stars.search.Text != "" {
		t.Errorf("the night keys typed %q into the search box", w.stars.search.Text)
	}
}

func TestFindKeyFocusesSearch(t *testing.T) {
	w, _ := openWindow(t, smallLogbook(t))
	w.Win.Canvas().(fyne.Shortcutable).TypedShortcut(keyFind)
	if w.Win.Canvas().Focused() != w.stars.search {
		t.Errorf("Ctrl+F focused %v, want the search box", w.Win.Canvas().Focused())
	}
}

func TestSearchFilters(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	cases := []struct {
		typed string
		want  []string
		empty string
	}{
		{"gam", []string{"Test Gamma"}, ""},
		{"eclipsing", []string{"Test Beta"}, ""},
		{"zz", nil, "No star matches “zz”."},
		{"", []string{"Test Alpha", "Test Beta", "Test Gamma"}, ""},
	}
	for _, tc := range cases {
		w.stars.search.SetText("")
		test.Type(w.stars.search, tc.typed)
		settle(t, w, q)
		var got []string
		for _, r := range w.stars.rows {
			got = append(got, r.Name)
		}
		if strings.Join(got, ",") != strings.Join(tc.want, ",") {
			t.Errorf("search %q: list %v, want %v", tc.typed, got, tc.want)
		}
		if tc.empty != "" && (!w.stars.empty.Visible() || w.stars.empty.Text != tc.empty) {
			t.Errorf("search %q: empty text %q (visible %v), want %q", tc.typed, w.stars.empty.Text, w.stars.empty.Visible(), tc.empty)
		}
		if tc.empty == "" && w.stars.empty.Visible() {
			t.Errorf("search %q: the empty text shows over a list of %d", tc.typed, len(got))
		}
	}
}
