package app

import (
	"fmt"
	"strings"
	"time"

	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// Change is a set of things that changed in a Session. Listeners registered
// with Session.OnChange receive it.
type Change uint

// The things a Session reports changing.
const (
	ChangedSites     Change = 1 << iota // the list of sites (after a reload)
	ChangedSite                         // the current site
	ChangedNight                        // the night's date
	ChangedTargets                      // the list of targets (after a reload)
	ChangedSelection                    // the selected target
	ChangedTheme                        // the theme choice
	ChangedPlan                         // the night's plan arrived or was cleared (Session.Night)
	// ChangedRecords: the logbook's records (measurements, nights, timings)
	// may have changed, and nothing the plan depends on (RecordsChanged;
	// Apply sends it with the targets, as a read may bring both).
	ChangedRecords
)

// Snapshot is what the window reads from the logbook in one go (off the UI
// thread: LoadSnapshot) and hands to Session.Apply.
type Snapshot struct {
	Sites   []observe.Site
	Targets []observe.Target
	Demo    bool
}

// LoadSnapshot reads the sites, targets and demo flag of the logbook.
func LoadSnapshot(lb *logbook.Logbook) (Snapshot, error) {
	var s Snapshot
	var err error
	if s.Sites, err = lb.Sites(); err != nil {
		return s, fmt.Errorf("reading the sites of %s: %w", lb.Path(), err)
	}
	if s.Targets, err = lb.Targets(); err != nil {
		return s, fmt.Errorf("reading the targets of %s: %w", lb.Path(), err)
	}
	if s.Demo, err = lb.IsDemo(); err != nil {
		return s, fmt.Errorf("reading %s: %w", lb.Path(), err)
	}
	return s, nil
}

// Session is the state every page shares: the open logbook, its sites and
// the current one, the night's date, the targets and the selected one, the
// theme, and the plan of the current night once it has been computed.
//
// A Session is not safe for concurrent use: the window touches it only on
// the UI thread, and jobs work on copies of what they need. Listeners run
// on the caller's goroutine, after the change.
type Session struct {
	lb        *logbook.Logbook
	now       func() time.Time
	snap      Snapshot
	site      int // index into snap.Sites; -1 when there is none
	date      time.Time
	selected  string
	theme     ThemeChoice
	night     *NightData
	gen       int // counts changes of site, date and targets (PlanRequest)
	listeners []func(Change)
}

// NewSession returns a session on the logbook, with now as its clock (nil
// means time.Now). It holds no sites or targets until Reload or Apply.
func NewSession(lb *logbook.Logbook, now func() time.Time) *Session {
	if now == nil {
		now = time.Now
	}
	return &Session{lb: lb, now: now, site: -1}
}

// OnChange registers f to be called after every change, with what changed.
func (s *Session) OnChange(f func(Change)) { s.listeners = append(s.listeners, f) }

func (s *Session) notify(c Change) {
	if c == 0 {
		return
	}
	for _, f := range s.listeners {
		f(c)
	}
}

// Reload reads the logbook again (LoadSnapshot) and applies it. It blocks
// on the file: the window calls LoadSnapshot in a job and Apply on the UI
// thread instead.
func (s *Session) Reload() error {
	snap, err := LoadSnapshot(s.lb)
	if err != nil {
		return err
	}
	s.Apply(snap)
	return nil
}

// Apply replaces the sites and targets by those of snap. The current site
// and the selection are kept when their names are still there; otherwise
// the first site is taken and nothing is selected. The first time a site
// is set, the night becomes tonight at that site (Tonight).
func (s *Session) Apply(snap Snapshot) {
	oldSite, hadSite := s.Site()
	s.snap = snap
	c := ChangedSites | ChangedTargets
	s.site = -1
	if len(snap.Sites) > 0 {
		s.site = 0
	}
	for i, st := range snap.Sites {
		if hadSite && strings.EqualFold(st.Name, oldSite.Name) {
			s.site = i
		}
	}
	if st, ok := s.Site(); ok != hadSite || (ok && st.Name != oldSite.Name) {
		c |= ChangedSite
	}
	if s.date.IsZero() {
		if st, ok := s.Site(); ok {
			s.date = Tonight(s.now(), &st)
			c |= ChangedNight
		}
	}
	if _, ok := s.Target(s.selected); !ok && s.selected != "" {
		s.selected = ""
		c |= ChangedSelection
	}
	s.night = nil
	s.gen++
	s.notify(c | ChangedPlan | ChangedRecords)
}

// RecordsChanged tells the listeners that records were added to the
// logbook or deleted from it (measurements, a night's details) without
// touching its sites or targets: the pages that show records read them
// again, and the night is not planned again (a plan depends on the sites
// and targets only).
func (s *Session) RecordsChanged() { s.notify(ChangedRecords) }

// Tonight returns the civil date (0h UTC) of the night under way or coming
// at the site at instant now: the local date, or the day before until
// local noon (so that at 2 a.m. "tonight" is the night that began the
// evening before).
func Tonight(now time.Time, site *observe.Site) time.Time {
	local := now.In(site.Location())
	y, m, d := local.Date()
	if local.Hour() < 12 {
		d--
	}
	return time.Date(y, m, d, 0, 0, 0, 0, time.UTC)
}

// Logbook returns the open logbook.
func (s *Session) Logbook() *logbook.Logbook { return s.lb }

// Now returns the session clock's time.
func (s *Session) Now() time.Time { return s.now() }

// IsDemo reports whether the logbook holds the demo scenario.
func (s *Session) IsDemo() bool { return s.snap.Demo }

// Sites returns the logbook's sites in order of name (do not modify).
func (s *Session) Sites() []observe.Site { return s.snap.Sites }

// Site returns the current site; ok is false when the logbook has none.
func (s *Session) Site() (site observe.Site, ok bool) {
	if s.site < 0 || s.site >= len(s.snap.Sites) {
		return observe.Site{}, false
	}
	return s.snap.Sites[s.site], true
}

// SetSite makes the site named name (any case) current. It reports an
// error naming the site when the logbook has none of that name.
func (s *Session) SetSite(name string) error {
	for i, st := range s.snap.Sites {
		if strings.EqualFold(st.Name, name) {
			if i != s.site {
				s.site = i
				s.night = nil
				s.gen++
				s.notify(ChangedSite | ChangedPlan)
			}
			return nil
		}
	}
	return fmt.Errorf("site %q: not in the logbook", name)
}

// Date returns the civil date (0h UTC) the current night begins on; zero
// before a site is known.
func (s *Session) Date() time.Time { return s.date }

// SetDate makes the night of date (its year, month and day) current.
func (s *Session) SetDate(date time.Time) {
	y, m, d := date.Date()
	date = time.Date(y, m, d, 0, 0, 0, 0, time.UTC)
	if date.Equal(s.date) {
		return
	}
	s.date = date
	s.night = nil
	s.gen++
	s.notify(ChangedNight | ChangedPlan)
}

// NextNight moves to the following night.
func (s *Session) NextNight() { s.SetDate(s.date.AddDate(0, 0, 1)) }

// PrevNight moves to the night before.
func (s *Session) PrevNight() { s.SetDate(s.date.AddDate(0, 0, -1)) }

// Targets returns the logbook's targets in order of name (do not modify).
func (s *Session) Targets() []observe.Target { return s.snap.Targets }

// Target returns the target named name (any case).
func (s *Session) Target(name string) (observe.Target, bool) {
	for _, t := range s.snap.Targets {
		if strings.EqualFold(t.Name, name) {
			return t, true
		}
	}
	return observe.Target{}, false
}

// Selected returns the name of the selected target, "" for none.
func (s *Session) Selected() string { return s.selected }

// Select makes the target named name (any case) the selected one; "" or an
// unknown name clears the selection.
func (s *Session) Select(name string) {
	t, ok := s.Target(name)
	if !ok {
		t.Name = ""
	}
	if t.Name == s.selected {
		return
	}
	s.selected = t.Name
	s.notify(ChangedSelection)
}

// Theme returns the theme choice.
func (s *Session) Theme() ThemeChoice { return s.theme }

// SetTheme changes the theme choice.
func (s *Session) SetTheme(t ThemeChoice) {
	if t == s.theme {
		return
	}
	s.theme = t
	s.notify(ChangedTheme)
}

// Night returns the plan of the current night, nil while it is being
// computed (or when there is no site).
func (s *Session) Night() *NightData { return s.night }

// PlanRequest returns what the plan of the current night needs: the
// site, the date and a copy of the targets, stamped so that SetNight can
// tell a late result. ok is false when there is no site.
func (s *Session) PlanRequest() (r PlanRequest, ok bool) {
	st, ok := s.Site()
	if !ok {
		return r, false
	}
	ts := append([]observe.Target(nil), s.snap.Targets...)
	return PlanRequest{Site: st, Date: s.date, Targets: ts, gen: s.gen}, true
}

// SetNight stores the plan of the current night. A plan made for an earlier
// site, date or list of targets (a late result) is dropped and SetNight
// returns false.
func (s *Session) SetNight(nd *NightData) bool {
	if nd == nil || nd.Request.gen != s.gen {
		return false
	}
	s.night = nd
	s.notify(ChangedPlan)
	return true
}
