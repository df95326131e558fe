package app

import (
	"strings"
	"testing"
	"time"

	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/ephem"
)

// The leap-second table is known complete to ephem.LeapSecondsValidUntil
// (2026-07-01): every exposure after it carries that caveat. It is said
// once, under the check star's summary, in the quiet colour of secondary
// text; not as a warning, and not under every row typed. Before that date
// it is not said at all.
func TestMeasureLeapSecondNoteIsCalm(t *testing.T) {
	cases := []struct {
		date time.Time
		note bool
	}{
		{testNow, true}, // the night of 1 December 2026
		{time.Date(2026, 3, 10, 0, 0, 0, 0, time.UTC), false},
	}
	w, q, v, _ := measurePage(t)
	for _, tc := range cases {
		w.Session.SetDate(tc.date)
		settle(t, w, q)
		at, _ := ephem.FromTime(tc.date.Add(21 * time.Hour))
		if got := ephem.LeapSecondsStale(at); got != tc.note {
			t.Fatalf("%s: ephem.LeapSecondsStale %v; the case wants %v", tc.date.Format(time.DateOnly), got, tc.note)
		}
		f := v.form
		test.Type(f.time, "21:14:05")
		test.Type(f.target.mag, "-7.512")
		for i, m := range []string{"-8.120", "-7.262", "-8.628"} {
			test.Type(f.comps[i].mag, m)
		}
		test.Type(f.check.mag, "-7.668")
		test.Tap(f.add)
		settle(t, w, q)
		day := tc.date.Format(time.DateOnly)
		if !f.result.Visible() || strings.Contains(f.result.Text, "leap") || f.result.Importance != widget.SuccessImportance {
			t.Errorf("%s: the row's result %q (importance %v): want it added, without the leap-second caveat, not as a warning",
				day, f.result.Text, f.result.Importance)
		}
		if v.an == nil {
			t.Fatalf("%s: no analysis", day)
		}
		var leap []MeasureNote
		for _, n := range v.an.Summary() {
			if strings.Contains(n.Text, "leap-second") {
				leap = append(leap, n)
			}
		}
		switch {
		case !tc.note && len(leap) > 0:
			t.Errorf("%s: a leap-second note before the table's end: %+v", day, leap)
		case tc.note && (len(leap) != 1 || !leap[0].Calm || leap[0].Warn):
			t.Errorf("%s: leap-second notes %+v; want one, calm, not a warning", day, leap)
		}
		for _, s := range v.summary.Segments {
			ts := s.(*widget.TextSegment)
			want := theme.ColorNameError
			if strings.Contains(ts.Text, "leap-second") {
				want = theme.ColorNamePlaceHolder
			} else if ts.Style.ColorName != theme.ColorNameError {
				continue
			}
			if ts.Style.ColorName != want {
				t.Errorf("%s: summary line %q in %q, want %q", day, ts.Text, ts.Style.ColorName, want)
			}
		}
	}
}
