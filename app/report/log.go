package report

import (
	"fmt"
	"math"
	"sort"
	"strings"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

// NightLog is everything the observing log of one night prints. ForNight
// fills the planned part; the caller adds who observes and, after the night,
// what was measured.
type NightLog struct {
	Site observe.Site
	// Night holds the twilights, the Moon's rise and set within the dark
	// hours and its illuminated fraction (ephem.NightOf for Site.Site).
	Night ephem.Night
	// Plan holds the planned extrema in time order (observe.Planner.Night)
	// and Constraints the limits their verdicts were made under.
	Plan        observe.NightPlan
	Constraints observe.Constraints
	// Chart is the night's altitude chart (observe.Planner.Chart); nil
	// leaves it out.
	Chart *observe.Chart

	Observer string // optional, printed in the header block

	// Measurements and Timings are what was taken during the night, each
	// printed in the order given (the caller sorts them).
	Measurements []Measurement
	Timings      []Timing

	Paper Paper // page size of the PDF; the zero value is A4
}

// Measurement is one magnitude measured during the night.
type Measurement struct {
	Time   ephem.Time // mid-exposure
	Target string
	Band   string  // filter or band, e.g. "V"; "" when not recorded
	Mag    float64 // magnitude
	MagErr float64 // its 1σ error, mag; NaN when not known
	Comp   string  // the comparison star(s) used, e.g. "C1" or "C1+C2"
	Check  string  // the check star, "" when none
}

// Timing is the time of one extremum measured from the night's data.
type Timing struct {
	Target    string
	Kind      observe.Kind // maximum or minimum light
	Secondary bool         // a secondary minimum
	JD        float64      // the extremum's Julian date on Scale
	Scale     ephem.TimeScale
	SigmaDays float64 // 1σ of JD, days; NaN when not known
	Method    string  // how it was timed, e.g. "kvw" or "poly"
	OCDays    float64 // O−C against the target's ephemeris, days; NaN when not given
}

// Paper is the page size of the PDF.
type Paper int

// The page sizes.
const (
	A4     Paper = iota // 210 × 297 mm
	Letter              // US Letter, 8.5 × 11 in
)

// String returns "A4" or "Letter".
func (p Paper) String() string {
	switch p {
	case A4:
		return "A4"
	case Letter:
		return "Letter"
	}
	return fmt.Sprintf("Paper(%d)", int(p))
}

// ParsePaper reads "a4" or "letter" (any case).
func ParsePaper(s string) (Paper, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "a4":
		return A4, nil
	case "letter", "us-letter", "usletter":
		return Letter, nil
	}
	return 0, fmt.Errorf("report: paper %q: want a4 or letter", s)
}

// ChartMaxTargets is the most targets ForNight puts on the altitude chart
// (as many as the default palette has distinct colours).
const ChartMaxTargets = 8

// ForNight plans the night of date (its year, month and day) for the targets
// with p and returns the planned part of its log: the site, the night's
// twilights and Moon (ephem.NightOf), the plan, the planner's constraints,
// and the altitude chart of the targets that have an event in the night (at
// most ChartMaxTargets, those with the best-scored events first).
func ForNight(p *observe.Planner, targets []observe.Target, date time.Time) (NightLog, error) {
	site := p.Site()
	night, err := ephem.NightOf(site.Site, date)
	if err != nil {
		return NightLog{}, fmt.Errorf("report: night of %s: %w", date.Format(time.DateOnly), err)
	}
	plan, err := p.Night(targets, date)
	if err != nil {
		return NightLog{}, fmt.Errorf("report: night of %s: %w", date.Format(time.DateOnly), err)
	}
	var chosen []observe.Target
	seen := map[int]bool{}
	for _, e := range plan.Ranked() {
		if !seen[e.TargetIndex] && len(chosen) < ChartMaxTargets {
			seen[e.TargetIndex] = true
			chosen = append(chosen, targets[e.TargetIndex])
		}
	}
	sort.SliceStable(chosen, func(i, j int) bool { return chosen[i].Name < chosen[j].Name })
	ch, err := p.Chart(chosen, date)
	if err != nil {
		return NightLog{}, fmt.Errorf("report: chart of %s: %w", date.Format(time.DateOnly), err)
	}
	return NightLog{Site: site, Night: night, Plan: plan, Constraints: p.Constraints(), Chart: &ch}, nil
}

// Validate reports the first field of l that cannot be printed: a site that
// does not check, a plan of another date than the night, a measurement or a
// timing with a missing or impossible value.
func (l *NightLog) Validate() error {
	if err := l.check(); err != nil {
		return fmt.Errorf("report: %w", err)
	}
	return nil
}

// check is Validate without the package's prefix.
func (l *NightLog) check() error {
	s := l.Site
	if err := s.Validate(); err != nil {
		return fmt.Errorf("site: %w", err)
	}
	if l.Night.Date.IsZero() || !l.Night.Start.Valid() || !l.Night.End.Valid() {
		return fmt.Errorf("the night is not set: want ephem.NightOf of the site and date")
	}
	if !l.Plan.Date.IsZero() && !sameDate(l.Plan.Date, l.Night.Date) {
		return fmt.Errorf("plan of %s for the night of %s: want the same date",
			l.Plan.Date.Format(time.DateOnly), l.Night.Date.Format(time.DateOnly))
	}
	if l.Paper != A4 && l.Paper != Letter {
		return fmt.Errorf("paper %d: want A4 or Letter", int(l.Paper))
	}
	for i, m := range l.Measurements {
		where := fmt.Sprintf("measurement %d (%q)", i+1, m.Target)
		switch {
		case !m.Time.Valid():
			return fmt.Errorf("%s: time not set: want a valid instant", where)
		case strings.TrimSpace(m.Target) == "":
			return fmt.Errorf("measurement %d: target name empty", i+1)
		case !finite(m.Mag):
			return fmt.Errorf("%s: magnitude %v: want a finite number", where, m.Mag)
		case !math.IsNaN(m.MagErr) && !(m.MagErr >= 0 && finite(m.MagErr)):
			return fmt.Errorf("%s: magnitude error %v: want ≥ 0, or NaN when not known", where, m.MagErr)
		}
	}
	for i, t := range l.Timings {
		where := fmt.Sprintf("timing %d (%q)", i+1, t.Target)
		switch {
		case strings.TrimSpace(t.Target) == "":
			return fmt.Errorf("timing %d: target name empty", i+1)
		case t.Kind != observe.Max && t.Kind != observe.Min:
			return fmt.Errorf("%s: kind %d: want max or min", where, int(t.Kind))
		case t.Scale != ephem.HJD && t.Scale != ephem.BJDTDB:
			return fmt.Errorf("%s: time scale %d: want HJD or BJD", where, int(t.Scale))
		case !(t.JD > 0 && finite(t.JD)):
			return fmt.Errorf("%s: Julian date %v: want a positive finite number", where, t.JD)
		case !math.IsNaN(t.SigmaDays) && !(t.SigmaDays >= 0 && finite(t.SigmaDays)):
			return fmt.Errorf("%s: sigma %v d: want ≥ 0, or NaN when not known", where, t.SigmaDays)
		case math.IsInf(t.OCDays, 0):
			return fmt.Errorf("%s: O−C %v d: want a finite number, or NaN when not given", where, t.OCDays)
		}
	}
	return nil
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

func sameDate(a, b time.Time) bool {
	ay, am, ad := a.Date()
	by, bm, bd := b.Date()
	return ay == by && am == bm && ad == bd
}
