package app

import (
	"strings"
	"testing"
	"time"

	"example.org/vigil/internal/demo"
	"example.org/vigil/observe"
)

// The rule of Tonight: the night under way or coming is that of the local
// date, or of the day before until local noon (common practice: a night is
// named by the evening it begins on).
func TestTonight(t *testing.T) {
	tokyo, err := observe.NewSite("Test East", 35.7, 139.7, 40, "Asia/Tokyo", 15, nil)
	if err != nil {
		t.Fatal(err)
	}
	london := demo.Site()
	cases := []struct {
		name string
		now  string
		site observe.Site
		want string
	}{
		{"London morning belongs to the night before", "2026-12-01T10:00:00Z", london, "2026-11-30"},
		{"London afternoon is tonight", "2026-12-01T13:00:00Z", london, "2026-12-01"},
		{"London just before local midnight", "2026-12-01T23:59:00Z", london, "2026-12-01"},
		{"London summer time: 11:30 BST is 10:30 UTC", "2026-07-01T10:30:00Z", london, "2026-06-30"},
		{"London summer time: 12:30 BST is 11:30 UTC", "2026-07-01T11:30:00Z", london, "2026-07-01"},
		{"Tokyo 11:00 local is 02:00 UTC", "2026-12-01T02:00:00Z", tokyo, "2026-11-30"},
		{"Tokyo 13:00 local is 04:00 UTC", "2026-12-01T04:00:00Z", tokyo, "2026-12-01"},
		{"Tokyo 01:00 local is the previous UTC day", "2026-11-30T16:00:00Z", tokyo, "2026-11-30"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			now, err := time.Parse(time.RFC3339, tc.now)
			if err != nil {
				t.Fatal(err)
			}
			if got := Tonight(now, &tc.site).Format(time.DateOnly); got != tc.want {
				t.Errorf("Tonight(%s at %s) = %s, want %s", tc.now, tc.site.Name, got, tc.want)
			}
		})
	}
}

// recorder collects the changes a session reports.
type recorder struct{ got []Change }

func (r *recorder) listen(c Change) { r.got = append(r.got, c) }

func (r *recorder) last() Change {
	if len(r.got) == 0 {
		return 0
	}
	return r.got[len(r.got)-1]
}

func TestSessionReloadPicksSiteAndNight(t *testing.T) {
	s := NewSession(smallLogbook(t), func() time.Time { return testNow })
	var rec recorder
	s.OnChange(rec.listen)
	if _, ok := s.Site(); ok {
		t.Error("a new session has a site before Reload")
	}
	if err := s.Reload(); err != nil {
		t.Fatal(err)
	}
	st, ok := s.Site()
	if !ok || st.Name != demo.SiteName {
		t.Errorf("site after Reload: got %q (%v), want %q (first in order of name)", st.Name, ok, demo.SiteName)
	}
	if got, want := s.Date().Format(time.DateOnly), "2026-12-01"; got != want {
		t.Errorf("night after Reload: got %s, want %s", got, want)
	}
	if len(s.Targets()) != len(smallTargets()) {
		t.Errorf("targets after Reload: got %d, want %d", len(s.Targets()), len(smallTargets()))
	}
	want := ChangedSites | ChangedTargets | ChangedSite | ChangedNight | ChangedPlan | ChangedRecords
	if rec.last() != want {
		t.Errorf("change reported by Reload: got %b, want %b", rec.last(), want)
	}
}

// RecordsChanged reports the records alone: nothing the plan depends on.
func TestSessionRecordsChanged(t *testing.T) {
	s := NewSession(smallLogbook(t), func() time.Time { return testNow })
	if err := s.Reload(); err != nil {
		t.Fatal(err)
	}
	var rec recorder
	s.OnChange(rec.listen)
	gen := s.gen
	s.RecordsChanged()
	if rec.last() != ChangedRecords || s.gen != gen {
		t.Errorf("RecordsChanged reported %b (plan stamp %d to %d); want %b alone, the stamp kept", rec.last(), gen, s.gen, ChangedRecords)
	}
}

func TestSessionNavigation(t *testing.T) {
	s := NewSession(smallLogbook(t), func() time.Time { return testNow })
	if err := s.Reload(); err != nil {
		t.Fatal(err)
	}
	var rec recorder
	s.OnChange(rec.listen)
	steps := []struct {
		name     string
		do       func()
		wantDate string
		wantSite string
		want     Change
	}{
		{"next night", s.NextNight, "2026-12-02", demo.SiteName, ChangedNight | ChangedPlan},
		{"next night across the month", func() { s.SetDate(time.Date(2026, 12, 31, 15, 0, 0, 0, time.UTC)); s.NextNight() }, "2027-01-01", demo.SiteName, ChangedNight | ChangedPlan},
		{"previous night", s.PrevNight, "2026-12-31", demo.SiteName, ChangedNight | ChangedPlan},
		{"site by name in any case", func() { _ = s.SetSite("test SOUTH") }, "2026-12-31", "Test South", ChangedSite | ChangedPlan},
		{"the same site again reports nothing", func() { rec.got = nil; _ = s.SetSite("Test South") }, "2026-12-31", "Test South", 0},
	}
	for _, st := range steps {
		st.do()
		site, _ := s.Site()
		if got := s.Date().Format(time.DateOnly); got != st.wantDate {
			t.Errorf("%s: date got %s, want %s", st.name, got, st.wantDate)
		}
		if site.Name != st.wantSite {
			t.Errorf("%s: site got %q, want %q", st.name, site.Name, st.wantSite)
		}
		if rec.last() != st.want {
			t.Errorf("%s: change got %b, want %b", st.name, rec.last(), st.want)
		}
	}
	err := s.SetSite("Nowhere Hill")
	if err == nil || !strings.Contains(err.Error(), `"Nowhere Hill"`) {
		t.Errorf("SetSite of an unknown site: got %v, want an error quoting the name", err)
	}
}

func TestSessionSelection(t *testing.T) {
	s := NewSession(smallLogbook(t), func() time.Time { return testNow })
	if err := s.Reload(); err != nil {
		t.Fatal(err)
	}
	cases := []struct{ name, sel, want string }{
		{"exact name", "Test Beta", "Test Beta"},
		{"any case gives the stored name", "test gamma", "Test Gamma"},
		{"unknown name clears", "Nobody", ""},
		{"empty clears", "", ""},
	}
	for _, tc := range cases {
		s.Select(tc.sel)
		if s.Selected() != tc.want {
			t.Errorf("%s: Select(%q) gives %q, want %q", tc.name, tc.sel, s.Selected(), tc.want)
		}
	}
}

// A plan computed for an earlier night must not replace the current one.
func TestSessionDropsLatePlans(t *testing.T) {
	s := NewSession(smallLogbook(t), func() time.Time { return testNow })
	if err := s.Reload(); err != nil {
		t.Fatal(err)
	}
	old, ok := s.PlanRequest()
	if !ok {
		t.Fatal("no plan request with a site")
	}
	s.NextNight()
	if s.SetNight(&NightData{Request: old}) {
		t.Error("SetNight accepted a plan made before the night changed")
	}
	cur, _ := s.PlanRequest()
	if !s.SetNight(&NightData{Request: cur}) || s.Night() == nil {
		t.Error("SetNight refused the plan of the current night")
	}
	if err := s.Reload(); err != nil {
		t.Fatal(err)
	}
	if s.Night() != nil || s.SetNight(&NightData{Request: cur}) {
		t.Error("a reload of the targets must drop the plan and refuse the one made before it")
	}
}

func TestParseTheme(t *testing.T) {
	cases := []struct {
		in   string
		want ThemeChoice
		ok   bool
	}{
		{"", ThemeLight, true}, {"Light", ThemeLight, true}, {"dark", ThemeDark, true},
		{"night-red", ThemeNightRed, true}, {"Night red", ThemeNightRed, true}, {"RED", ThemeNightRed, true},
		{"sepia", ThemeLight, false},
	}
	for _, tc := range cases {
		got, err := ParseTheme(tc.in)
		if got != tc.want || (err == nil) != tc.ok {
			t.Errorf("ParseTheme(%q) = %v, %v; want %v, ok %v", tc.in, got, err, tc.want, tc.ok)
		}
		if err != nil && !strings.Contains(err.Error(), `"sepia"`) {
			t.Errorf("ParseTheme error %q does not quote the input", err)
		}
	}
	for _, th := range Themes {
		if back, err := ParseTheme(th.Slug()); err != nil || back != th {
			t.Errorf("ParseTheme(%q) = %v, %v; want %v", th.Slug(), back, err, th)
		}
	}
}
