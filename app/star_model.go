package app

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// StarData is what the Star page reads from the logbook about one star
// beyond the session's copy of the target: the history of its ephemerides
// and its intensity-mean V.
type StarData struct {
	Name     string
	History  []logbook.AdoptedEphemeris // in order of adoption: the last is current
	MeanMagV float64                    // NaN when not known
}

// LoadStarData reads the ephemeris history and the mean V of the target
// named name.
func LoadStarData(lb *logbook.Logbook, name string) (StarData, error) {
	d := StarData{Name: name, MeanMagV: math.NaN()}
	var err error
	if d.History, err = lb.EphemerisHistory(name); err != nil {
		return d, fmt.Errorf("reading the ephemerides of %q: %w", name, err)
	}
	if d.MeanMagV, err = lb.MeanMagV(name); err != nil {
		return d, fmt.Errorf("reading the mean V of %q: %w", name, err)
	}
	return d, nil
}

// StarLine is one line of a panel of the Star page: what it is and its value.
type StarLine struct{ Key, Value string }

// StarHistoryColumns name the fields of an entry of the ephemeris history
// (StarInfo.History).
var StarHistoryColumns = []string{"Adopted (UTC)", "Source", "T0", "P (d)", "Q (d)"}

// StarCompColumns are the headings of the comparison and check stars table.
var StarCompColumns = []string{"Label", "V (mag)", "B−V (mag)", "Role"}

// StarComp is one row of the comparison and check stars table.
type StarComp struct {
	Comp  observe.Comp
	Check bool
}

// StarInfo is what the Star page shows of one star, as texts: its position,
// what it is, its current ephemeris with the source, the history of its
// ephemerides (newest first), its comparison and check stars and its notes.
type StarInfo struct {
	Name      string
	Summary   string // "pulsating · T0 marks maximum light · 10.1–10.9 mag"
	Position  []StarLine
	Kind      []StarLine
	Ephemeris []StarLine
	History   [][]string // cells in the order of StarHistoryColumns, newest (the current one) first
	Comps     []StarComp // comparison stars, then check stars
	Notes     string
}

// BuildStarInfo describes target t with what the logbook holds of it (d;
// an empty History when it has not been read yet) at instant now (for the
// age of the last timing).
func BuildStarInfo(t observe.Target, d StarData, now time.Time) StarInfo {
	in := StarInfo{Name: t.Name, Notes: t.Notes}
	in.Summary = strings.Join([]string{classText(t.Class), "T0 marks " + kindWords(t.Kind), rangeText(t.MagBright, t.MagFaint)}, " · ")
	in.Position = []StarLine{
		{"Right ascension", fmt.Sprintf("%s   (%.6f h, %.5f°)", ephem.FormatRA(t.Star.RAHours), t.Star.RAHours, 15*t.Star.RAHours)},
		{"Declination", fmt.Sprintf("%s   (%+.6f°)", ephem.FormatDec(t.Star.DecDeg), t.Star.DecDeg)},
		{"Frame", "ICRS, equinox and epoch J2000.0"},
		{"Proper motion", pmText(t.Star)},
	}
	sec := "not predicted"
	if t.Secondary {
		sec = "predicted too, half a cycle after each primary (E + 0.5)"
	}
	in.Kind = []StarLine{
		{"Class", classText(t.Class)},
		{"T0 marks", kindWords(t.Kind)},
		{"Secondary minima", sec},
		{"Magnitude range", rangeText(t.MagBright, t.MagFaint)},
	}
	if t.Class == observe.Pulsating {
		in.Kind = append(in.Kind, StarLine{"Mean V", magOrUnknown(d.MeanMagV, "not known (needed for the distance)")})
	}
	e := t.Ephemeris
	in.Ephemeris = []StarLine{
		{"T0", fmt.Sprintf("%s %s", jdText(e.Epoch), e.Scale.Label())},
		{"σ(T0)", daysErrText(e.EpochErr)},
		{"Period P", periodText(e.PeriodDays)},
		{"σ(P)", daysErrText(e.PeriodErr)},
		{"Q", qText(e)},
	}
	if n := len(d.History); n > 0 {
		cur := d.History[n-1]
		in.Ephemeris = append(in.Ephemeris,
			StarLine{"Source", orDash(cur.Source)},
			StarLine{"Adopted", cur.Adopted.UTC().Format("2006-01-02 15:04") + " UTC"})
		for i := n - 1; i >= 0; i-- {
			h := d.History[i]
			in.History = append(in.History, []string{h.Adopted.UTC().Format("2006-01-02 15:04"), orDash(h.Source),
				jdText(h.Epoch) + " " + h.Scale.Label(), numText(h.PeriodDays), numText(h.Q)})
		}
	}
	in.Ephemeris = append(in.Ephemeris, StarLine{"Last timing", lastTimingText(t, now)})
	for _, c := range t.Comps {
		in.Comps = append(in.Comps, StarComp{Comp: c})
	}
	for _, c := range t.Checks {
		in.Comps = append(in.Comps, StarComp{Comp: c, Check: true})
	}
	return in
}

// Cells returns the cells of a comparison star's row, in the order of
// StarCompColumns.
func (c StarComp) Cells() []string {
	role := "comparison"
	if c.Check {
		role = "check"
	}
	return []string{c.Comp.ID, fmt.Sprintf("%.3f", c.Comp.V), magOrUnknown(c.Comp.BV, "—"), role}
}

// kindWords says what an ephemeris's epoch marks.
func kindWords(k observe.Kind) string {
	if k == observe.Min {
		return "minimum light"
	}
	return "maximum light"
}

// rangeText writes a magnitude range, "10.10–10.90 mag", saying which end
// is not known.
func rangeText(bright, faint float64) string {
	switch {
	case math.IsNaN(bright) && math.IsNaN(faint):
		return "range not known"
	case math.IsNaN(faint):
		return fmt.Sprintf("brightest %.2f mag, faintest not known", bright)
	case math.IsNaN(bright):
		return fmt.Sprintf("faintest %.2f mag, brightest not known", faint)
	}
	return fmt.Sprintf("%.2f–%.2f mag", bright, faint)
}

// magOrUnknown writes a magnitude to three decimals, or none when NaN.
func magOrUnknown(v float64, none string) string {
	if math.IsNaN(v) {
		return none
	}
	return fmt.Sprintf("%.3f", v)
}

// pmText writes a proper motion in mas/yr, or says there is none.
func pmText(s ephem.Star) string {
	if s.PMRA == 0 && s.PMDec == 0 {
		return "none given"
	}
	return fmt.Sprintf("μα cos δ %+.2f mas/yr, μδ %+.2f mas/yr", s.PMRA, s.PMDec)
}

// numText writes a number exactly: the shortest text that reads back to it.
func numText(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// jdText writes a Julian date exactly, in fixed notation.
func jdText(jd float64) string { return strconv.FormatFloat(jd, 'f', -1, 64) }

// periodText writes a period in days, with hours beside a short one.
func periodText(p float64) string {
	if p < 2 {
		return fmt.Sprintf("%s d (%.4f h)", numText(p), 24*p)
	}
	return numText(p) + " d"
}

// daysErrText writes an uncertainty in days with its size in minutes or
// seconds, or says it is not known (0).
func daysErrText(d float64) string {
	switch {
	case d == 0 || math.IsNaN(d):
		return "not known"
	case d*86400 < 60:
		return fmt.Sprintf("± %s d (%.2g s)", numText(d), d*86400)
	}
	return fmt.Sprintf("± %s d (%.3g min)", numText(d), d*1440)
}

// qText writes the quadratic term and the period change it means, dP/dt =
// 2Q/P (Sterken 2005), in seconds per year.
func qText(e ephem.Ephemeris) string {
	if e.Q == 0 {
		return "0 (linear ephemeris)"
	}
	return fmt.Sprintf("%s d (period change dP/dt = 2Q/P = %+.3g s/yr)", numText(e.Q), 2*e.Q/e.PeriodDays*reduce.SecondsPerYear)
}

// lastTimingText writes the star's latest timing: its Julian date, the day
// it fell on and how long ago that was at now.
func lastTimingText(t observe.Target, now time.Time) string {
	jd := t.LastTimingJD
	if jd == 0 {
		return "none yet"
	}
	s := fmt.Sprintf("%.5f %s", jd, t.Ephemeris.Scale.Label())
	// The scale's offset from UTC (a minute or so) does not matter for
	// the day.
	if at, err := ephem.FromJDUTC(jd); err == nil {
		days := now.Sub(at.Time()).Hours() / 24
		s += fmt.Sprintf(", %s", at.Time().UTC().Format("2 Jan 2006"))
		if days >= 0 {
			s += fmt.Sprintf(", %.0f days ago", days)
		}
	}
	return s
}

// orDash returns s, or "—" when it is empty.
func orDash(s string) string {
	if strings.TrimSpace(s) == "" {
		return "—"
	}
	return s
}

// starEmptyText says what the Star page can show when it has no star: the
// logbook has none, or none is selected.
func starEmptyText(total int) string {
	if total == 0 {
		return "No stars yet: add one or import a catalogue (CSV or VOTable)."
	}
	return "No star selected. Pick one in the list on the left to see its position, ephemeris, " +
		"comparison stars and coming nights, or add a new one or import a catalogue."
}
