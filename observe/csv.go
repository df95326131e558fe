package observe

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/safefile"
	"example.org/vigil/internal/table"
)

// csvColumns are the catalogue's columns in the order WriteTargetsCSV
// writes them (see ReadTargetsCSV).
var csvColumns = []string{"name", "ra", "dec", "pm_ra", "pm_dec", "class", "kind", "epoch", "timescale",
	"period", "q", "epoch_err", "period_err", "secondary", "mag_bright", "mag_faint", "comps", "checks",
	"last_timing", "notes"}

// ReadTargetsCSV reads a target catalogue from r; name is used in errors.
//
// The catalogue is CSV, one row per target, a header row naming the
// columns (any order, any case), '#' comment lines, unknown columns ignored,
// empty cells are missing values:
//
//	column       required  meaning
//	name         yes       target name, unique in the file
//	ra           yes       right ascension, hours: decimal (5.5) or sexagesimal (05:30:00.0); ICRS/J2000
//	dec          yes       declination, degrees: decimal or sexagesimal (-05:23:28)
//	pm_ra        no        proper motion μα cos δ, mas/yr (empty: 0)
//	pm_dec       no        proper motion μδ, mas/yr (empty: 0)
//	class        no        pulsating, eclipsing or other (empty: other)
//	kind         no        what epoch marks: max or min (empty: min for eclipsing, else max)
//	epoch        yes       T0, full Julian date on timescale
//	timescale    no        hjd (HJD, UTC scale) or bjd (BJD_TDB) (empty: bjd)
//	period       yes       P, days, > 0
//	q            no        quadratic term Q, days: T = T0 + P·E + Q·E² (empty: 0)
//	epoch_err    no        σ(T0), days (empty: unknown, 0)
//	period_err   no        σ(P), days (empty: unknown, 0)
//	secondary    no        true/false: also predict secondary minima at E + 0.5 (empty: false)
//	mag_bright   no        brightest magnitude of the range
//	mag_faint    no        faintest magnitude of the range
//	comps        no        comparison stars, "ID=V" or "ID=V/B-V", separated by ';'
//	checks       no        check stars, same format
//	last_timing  no        Julian date (ephemeris scale) of the latest timing (empty: none)
//	notes        no        free text
//
// Comparison stars sit in one cell rather than in a second file keyed by
// target name: a catalogue then stays one file that is edited, imported,
// exported and shared whole, the all-or-nothing import has one file to
// check, and a target rarely has more than a handful of comparison stars.
// Example: "C1=11.200/0.600; C2=12.050" (C2 has no B−V).
//
// testdata/targets_example.csv is a documented example. The whole import
// is refused when any row is bad: the error (a *table.Error) names the
// file, line, column and what was expected.
func ReadTargetsCSV(r io.Reader, name string) ([]Target, error) {
	tab, err := table.Read(r, name)
	if err != nil {
		return nil, err
	}
	return targetsFromTable(tab)
}

// ReadTargetsCSVFile reads a target catalogue from the file at path.
func ReadTargetsCSVFile(path string) ([]Target, error) {
	tab, err := table.ReadFile(path)
	if err != nil {
		return nil, err
	}
	return targetsFromTable(tab)
}

func targetsFromTable(tab *table.Table) ([]Target, error) {
	if err := tab.Require("name", "ra", "dec", "epoch", "period"); err != nil {
		return nil, err
	}
	out := make([]Target, 0, tab.Len())
	seen := map[string]int{}
	for i := 0; i < tab.Len(); i++ {
		r := tab.Row(i)
		t, err := targetFromRow(r)
		if err != nil {
			return nil, err
		}
		key := strings.ToLower(t.Name)
		if line, dup := seen[key]; dup {
			return nil, r.Errorf("name", "target %q repeats the one on line %d", t.Name, line)
		}
		seen[key] = r.Line()
		out = append(out, t)
	}
	return out, nil
}

func targetFromRow(r table.Row) (Target, error) {
	t := Target{Name: r.String("name"), MagBright: math.NaN(), MagFaint: math.NaN(), Notes: r.String("notes")}
	if t.Name == "" {
		return t, r.Errorf("name", "%w: every target needs a name", table.ErrMissing)
	}
	var err error
	if t.Star.RAHours, err = ephem.ParseRA(r.String("ra")); err != nil {
		return t, r.Wrap("ra", err)
	}
	if t.Star.DecDeg, err = ephem.ParseDec(r.String("dec")); err != nil {
		return t, r.Wrap("dec", err)
	}
	opt := func(col string, dst *float64, missing float64) error {
		v, ok, err := r.Float(col)
		if err != nil {
			return err
		}
		if ok {
			*dst = v
		} else {
			*dst = missing
		}
		return nil
	}
	for _, f := range []struct {
		col     string
		dst     *float64
		missing float64
	}{
		{"pm_ra", &t.Star.PMRA, 0}, {"pm_dec", &t.Star.PMDec, 0}, {"q", &t.Ephemeris.Q, 0},
		{"epoch_err", &t.Ephemeris.EpochErr, 0}, {"period_err", &t.Ephemeris.PeriodErr, 0},
		{"mag_bright", &t.MagBright, math.NaN()}, {"mag_faint", &t.MagFaint, math.NaN()},
		{"last_timing", &t.LastTimingJD, 0},
	} {
		if err := opt(f.col, f.dst, f.missing); err != nil {
			return t, err
		}
	}
	if t.Ephemeris.Epoch, err = r.MustFloat("epoch"); err != nil {
		return t, err
	}
	if t.Ephemeris.PeriodDays, err = r.MustFloat("period"); err != nil {
		return t, err
	}
	t.Ephemeris.Scale = ephem.BJDTDB
	if s := r.String("timescale"); s != "" {
		if t.Ephemeris.Scale, err = ephem.ParseTimeScale(s); err != nil {
			return t, r.Wrap("timescale", err)
		}
	}
	if s := r.String("class"); s != "" {
		if t.Class, err = ParseClass(s); err != nil {
			return t, r.Wrap("class", err)
		}
	}
	t.Kind = Max
	if t.Class == Eclipsing {
		t.Kind = Min
	}
	if s := r.String("kind"); s != "" {
		if t.Kind, err = ParseKind(s); err != nil {
			return t, r.Wrap("kind", err)
		}
	}
	if s := r.String("secondary"); s != "" {
		b, perr := strconv.ParseBool(strings.ToLower(s))
		if perr != nil {
			switch strings.ToLower(s) {
			case "yes", "y":
				b, perr = true, nil
			case "no", "n":
				b, perr = false, nil
			}
		}
		if perr != nil {
			return t, r.Errorf("secondary", "%q: want true or false", s)
		}
		t.Secondary = b
	}
	if t.Comps, err = ParseComps(r.String("comps")); err != nil {
		return t, r.Wrap("comps", err)
	}
	if t.Checks, err = ParseComps(r.String("checks")); err != nil {
		return t, r.Wrap("checks", err)
	}
	if err := t.Validate(); err != nil {
		return t, r.Wrap(columnOf(err), err)
	}
	return t, nil
}

// columnOf guesses which column a Validate error is about, for its position.
func columnOf(err error) string {
	s := err.Error()
	for _, m := range []struct{ word, col string }{
		{"right ascension", "ra"}, {"declination", "dec"}, {"proper motion in RA", "pm_ra"},
		{"proper motion in Dec", "pm_dec"}, {"epoch uncertainty", "epoch_err"}, {"period uncertainty", "period_err"},
		{"epoch", "epoch"}, {"period", "period"}, {"quadratic", "q"}, {"magnitude range", "mag_faint"},
		{"magnitude", "mag_bright"}, {"last timing", "last_timing"}, {"comparison", "comps"},
	} {
		if strings.Contains(s, m.word) {
			return m.col
		}
	}
	return ""
}

// ParseComps reads comparison or check stars in the cell format
// "ID=V" or "ID=V/B-V", separated by ';' (blanks ignored). An empty cell
// gives none.
func ParseComps(s string) ([]Comp, error) {
	var out []Comp
	if strings.TrimSpace(s) == "" {
		return nil, nil
	}
	for _, item := range strings.Split(s, ";") {
		item = strings.TrimSpace(item)
		if item == "" {
			continue
		}
		id, mags, ok := strings.Cut(item, "=")
		if !ok || strings.TrimSpace(id) == "" {
			return nil, fmt.Errorf("comparison star %q: want ID=V or ID=V/B-V", item)
		}
		c := Comp{ID: strings.TrimSpace(id), BV: math.NaN()}
		v, bv, hasBV := strings.Cut(mags, "/")
		var err error
		if c.V, err = strconv.ParseFloat(strings.TrimSpace(v), 64); err != nil {
			return nil, fmt.Errorf("comparison star %q: V %q is not a number", c.ID, strings.TrimSpace(v))
		}
		if hasBV {
			if c.BV, err = strconv.ParseFloat(strings.TrimSpace(bv), 64); err != nil {
				return nil, fmt.Errorf("comparison star %q: B-V %q is not a number", c.ID, strings.TrimSpace(bv))
			}
		}
		if err := c.validate(); err != nil {
			return nil, err
		}
		out = append(out, c)
	}
	return out, nil
}

// FormatComps writes comparison stars in the cell format ParseComps reads.
func FormatComps(cs []Comp) string {
	parts := make([]string, len(cs))
	for i, c := range cs {
		parts[i] = c.ID + "=" + fmtFloat(c.V)
		if !math.IsNaN(c.BV) {
			parts[i] += "/" + fmtFloat(c.BV)
		}
	}
	return strings.Join(parts, "; ")
}

// fmtFloat writes the shortest text that reads back to the same float64.
// fmtFloat writes v exactly and without an exponent, as people type
// coordinates, epochs and periods (2459000.1234, not 2.4590001234e+06).
func fmtFloat(v float64) string { return strconv.FormatFloat(v, 'f', -1, 64) }

// optFloat writes v, or an empty cell when v equals missing (or is NaN).
func optFloat(v, missing float64) string {
	if math.IsNaN(v) || v == missing {
		return ""
	}
	return fmtFloat(v)
}

// WriteTargetsCSV writes the targets in the catalogue format, every column
// present, so that ReadTargetsCSV returns them unchanged.
func WriteTargetsCSV(w io.Writer, targets []Target) error {
	for i := range targets {
		if err := targets[i].Validate(); err != nil {
			return fmt.Errorf("target %d: %w", i+1, err)
		}
	}
	cw := csv.NewWriter(w)
	if err := cw.Write(csvColumns); err != nil {
		return err
	}
	for _, t := range targets {
		sec := ""
		if t.Secondary {
			sec = "true"
		}
		notes := strings.TrimSpace(t.Notes) // the reader trims cells
		rec := []string{t.Name, fmtFloat(t.Star.RAHours), fmtFloat(t.Star.DecDeg),
			optFloat(t.Star.PMRA, 0), optFloat(t.Star.PMDec, 0), t.Class.String(), t.Kind.String(),
			fmtFloat(t.Ephemeris.Epoch), t.Ephemeris.Scale.String(), fmtFloat(t.Ephemeris.PeriodDays),
			optFloat(t.Ephemeris.Q, 0), optFloat(t.Ephemeris.EpochErr, 0), optFloat(t.Ephemeris.PeriodErr, 0),
			sec, optFloat(t.MagBright, math.NaN()), optFloat(t.MagFaint, math.NaN()),
			FormatComps(t.Comps), FormatComps(t.Checks), optFloat(t.LastTimingJD, 0), notes}
		if err := cw.Write(rec); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// WriteTargetsCSVFile writes the catalogue to path whole or not at all
// (internal/safefile): a failed export leaves any old file as it was.
func WriteTargetsCSVFile(path string, targets []Target) error {
	if len(targets) == 0 {
		return errors.New("observe: exporting targets: the list is empty")
	}
	return safefile.Write(path, func(w io.Writer) error { return WriteTargetsCSV(w, targets) })
}
