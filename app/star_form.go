package app

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

// The fields of the Star page's forms, as keys of StarFieldErrors.
const (
	StarFieldName      = "name"
	StarFieldRA        = "ra"
	StarFieldDec       = "dec"
	StarFieldPMRA      = "pm_ra"
	StarFieldPMDec     = "pm_dec"
	StarFieldClass     = "class"
	StarFieldKind      = "kind"
	StarFieldMagBright = "mag_bright"
	StarFieldMagFaint  = "mag_faint"
	StarFieldT0        = "epoch"
	StarFieldScale     = "timescale"
	StarFieldPeriod    = "period"
	StarFieldQ         = "q"
	StarFieldEpochErr  = "epoch_err"
	StarFieldPeriodErr = "period_err"
	StarFieldSource    = "source"
	StarFieldCompID    = "comp_id"
	StarFieldCompV     = "comp_v"
	StarFieldCompBV    = "comp_bv"
	StarFieldCompRole  = "comp_role"
	StarFieldForm      = "" // a fault of the whole form
)

// StarFieldErrors maps a form's fields (StarField...) to what is wrong with
// what was typed there, in words saying what is expected.
type StarFieldErrors map[string]string

// StarForm is the text of the star form: what the user typed.
type StarForm struct {
	Name, RA, Dec, PMRA, PMDec string
	Class, Kind                string // "pulsating", "max", as ParseClass and ParseKind read them
	Secondary                  bool
	MagBright, MagFaint, Notes string
}

// StarEphemForm is the text of the ephemeris form.
type StarEphemForm struct {
	T0, Scale, Period, Q, EpochErr, PeriodErr, Source string
}

// StarFormOf fills the star form from target t.
func StarFormOf(t observe.Target) StarForm {
	opt := func(v float64) string {
		if math.IsNaN(v) {
			return ""
		}
		return numText(v)
	}
	return StarForm{
		Name: t.Name, RA: ephem.FormatRA(t.Star.RAHours), Dec: ephem.FormatDec(t.Star.DecDeg),
		PMRA: numText(t.Star.PMRA), PMDec: numText(t.Star.PMDec),
		Class: t.Class.String(), Kind: t.Kind.String(), Secondary: t.Secondary,
		MagBright: opt(t.MagBright), MagFaint: opt(t.MagFaint), Notes: t.Notes,
	}
}

// StarEphemFormOf fills the ephemeris form from e; the source is left empty.
func StarEphemFormOf(e ephem.Ephemeris) StarEphemForm {
	return StarEphemForm{T0: jdText(e.Epoch), Scale: e.Scale.Label(), Period: numText(e.PeriodDays),
		Q: numText(e.Q), EpochErr: numText(e.EpochErr), PeriodErr: numText(e.PeriodErr)}
}

// Target returns base with the form's fields applied (its ephemeris,
// comparison stars and last timing are kept), or what is wrong with each
// field. The position is read by ephem.ParseRA and ParseDec, the class and
// kind by observe.ParseClass and ParseKind, so a mistyped value gets the
// same words as on the command line.
func (f StarForm) Target(base observe.Target) (observe.Target, StarFieldErrors) {
	t := base
	errs := StarFieldErrors{}
	t.Name = strings.TrimSpace(f.Name)
	switch {
	case t.Name == "":
		errs[StarFieldName] = "the star needs a name"
	case strings.HasPrefix(t.Name, "#"):
		errs[StarFieldName] = fmt.Sprintf("name %q: want a name that does not start with '#'", t.Name)
	}
	var err error
	if t.Star.RAHours, err = ephem.ParseRA(f.RA); err != nil {
		errs[StarFieldRA] = starErrText(err)
	}
	if t.Star.DecDeg, err = ephem.ParseDec(f.Dec); err != nil {
		errs[StarFieldDec] = starErrText(err)
	}
	pm := starUnits{"": 1, "mas/yr": 1, "mas/a": 1}
	t.Star.PMRA = starQuantity(errs, StarFieldPMRA, f.PMRA, "proper motion in RA (μα cos δ)", "mas/yr", pm, -20000, 20000, 0)
	t.Star.PMDec = starQuantity(errs, StarFieldPMDec, f.PMDec, "proper motion in Dec (μδ)", "mas/yr", pm, -20000, 20000, 0)
	if t.Class, err = observe.ParseClass(f.Class); err != nil {
		errs[StarFieldClass] = starErrText(err)
	}
	if t.Kind, err = observe.ParseKind(f.Kind); err != nil {
		errs[StarFieldKind] = starErrText(err)
	}
	t.Secondary = f.Secondary
	mag := starUnits{"": 1, "mag": 1}
	t.MagBright = starQuantity(errs, StarFieldMagBright, f.MagBright, "brightest magnitude", "mag", mag, -30, 40, math.NaN())
	t.MagFaint = starQuantity(errs, StarFieldMagFaint, f.MagFaint, "faintest magnitude", "mag", mag, -30, 40, math.NaN())
	if errs[StarFieldMagBright] == "" && errs[StarFieldMagFaint] == "" && t.MagBright > t.MagFaint {
		errs[StarFieldMagFaint] = fmt.Sprintf("faintest magnitude %q: want a number not smaller than the brightest (%s); "+
			"magnitudes grow as stars fade", f.MagFaint, numText(t.MagBright))
	}
	t.Notes = strings.TrimSpace(f.Notes)
	if len(errs) == 0 {
		if err := t.Validate(); err != nil {
			errs[StarFieldForm] = starErrText(err)
		}
	}
	if len(errs) > 0 {
		return base, errs
	}
	return t, nil
}

// Ephemeris reads the ephemeris form: T0 a full Julian date on the scale
// chosen (ephem.ParseTimeScale), P in days (or with a unit: h, min, s), Q
// and the uncertainties in days (empty: 0, unknown for the uncertainties).
// Each field is checked by ephem.Ephemeris.Validate, so the words are those
// of the command line.
func (f StarEphemForm) Ephemeris() (ephem.Ephemeris, StarFieldErrors) {
	errs := StarFieldErrors{}
	var e ephem.Ephemeris
	var err error
	if e.Scale, err = ephem.ParseTimeScale(f.Scale); err != nil {
		errs[StarFieldScale] = starErrText(err)
	}
	days := starUnits{"": 1, "d": 1}
	period := starUnits{"": 1, "d": 1, "h": 1.0 / 24, "min": 1.0 / 1440, "s": 1.0 / 86400}
	e.Epoch = starQuantity(errs, StarFieldT0, f.T0, "epoch T0", "JD", starUnits{"": 1}, 0, 3e6, math.NaN())
	e.PeriodDays = starQuantity(errs, StarFieldPeriod, f.Period, "period", "d", period, 0, 1e5, math.NaN())
	if errs[StarFieldT0] == "" && math.IsNaN(e.Epoch) {
		errs[StarFieldT0] = "epoch T0: want a full Julian date such as 2460000.1234 (required)"
	}
	if errs[StarFieldPeriod] == "" && math.IsNaN(e.PeriodDays) {
		errs[StarFieldPeriod] = "period: want a positive number of days such as 0.5671, or with a unit: 13.6 h (required)"
	}
	e.Q = starQuantity(errs, StarFieldQ, f.Q, "quadratic term Q", "d", days, -1, 1, 0)
	e.EpochErr = starQuantity(errs, StarFieldEpochErr, f.EpochErr, "σ(T0)", "d", days, 0, 1e5, 0)
	e.PeriodErr = starQuantity(errs, StarFieldPeriodErr, f.PeriodErr, "σ(P)", "d", days, 0, 1e5, 0)
	// Each field alone against ephem's own checks, with the others set to
	// values that pass.
	ok := ephem.Ephemeris{Epoch: 2451545, PeriodDays: 1, Scale: ephem.BJDTDB}
	check := func(field string, e1 ephem.Ephemeris) {
		if errs[field] == "" {
			if err := e1.Validate(); err != nil {
				errs[field] = starErrText(err)
			}
		}
	}
	one := ok
	one.Epoch = e.Epoch
	check(StarFieldT0, one)
	one = ok
	one.PeriodDays = e.PeriodDays
	check(StarFieldPeriod, one)
	if len(errs) == 0 {
		check(StarFieldQ, e) // Q against P and T0: the period must not reach zero
	}
	if len(errs) > 0 {
		return ephem.Ephemeris{}, errs
	}
	return e, nil
}

// StarCompForm is the text of the comparison star editor.
type StarCompForm struct {
	ID, V, BV string
	Check     bool
}

// Comp reads the comparison star editor: an ID without '=', ';' or '/'
// (the cell format of observe.ParseComps), V in [-30, 40] mag, B−V within
// ±10 mag or empty.
func (f StarCompForm) Comp() (observe.Comp, StarFieldErrors) {
	errs := StarFieldErrors{}
	c := observe.Comp{ID: strings.TrimSpace(f.ID)}
	if c.ID == "" || strings.ContainsAny(c.ID, "=;/") {
		errs[StarFieldCompID] = fmt.Sprintf("label %q: want a short label without '=', ';' or '/', e.g. C1", f.ID)
	}
	mag := starUnits{"": 1, "mag": 1}
	c.V = starQuantity(errs, StarFieldCompV, f.V, "V", "mag", mag, -30, 40, math.NaN())
	if errs[StarFieldCompV] == "" && math.IsNaN(c.V) {
		errs[StarFieldCompV] = "V: want the star's catalogue V magnitude, e.g. 11.204"
	}
	c.BV = starQuantity(errs, StarFieldCompBV, f.BV, "B−V", "mag", mag, -10, 10, math.NaN())
	if len(errs) > 0 {
		return observe.Comp{}, errs
	}
	return c, nil
}

// starUnits maps the units a quantity may be typed with to the factor
// that turns it into the field's unit ("" is a bare number).
type starUnits map[string]float64

// starQuantity reads a number with an optional unit ("0.5671", "0.5671 d",
// "13.6 h") in [lo, hi], into the field's unit. An empty text gives empty.
// A fault is written to errs under field, naming what and the unit expected.
func starQuantity(errs StarFieldErrors, field, text, what, unit string, units starUnits, lo, hi, empty float64) float64 {
	s := strings.TrimSpace(text)
	if s == "" {
		return empty
	}
	num, u := s, ""
	if i := strings.LastIndexFunc(s, func(r rune) bool { return (r >= '0' && r <= '9') || r == '.' }); i >= 0 && i < len(s)-1 {
		num, u = strings.TrimSpace(s[:i+1]), strings.TrimSpace(s[i+1:])
	}
	want := "a number"
	switch unit {
	case "":
	case "JD":
		want = "a full Julian date such as 2460000.1234"
	default:
		want = "a number of " + unitWords(unit)
	}
	f, ok := units[u]
	v, err := strconv.ParseFloat(num, 64)
	if !ok || err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		msg := fmt.Sprintf("%s %q: want %s", what, text, want)
		if len(units) > 2 {
			var us []string
			for _, k := range []string{"d", "h", "min", "s"} {
				if _, ok := units[k]; ok {
					us = append(us, k)
				}
			}
			msg += " (or with a unit: " + strings.Join(us, ", ") + ")"
		}
		errs[field] = msg
		return empty
	}
	v *= f
	if v < lo || v > hi {
		errs[field] = fmt.Sprintf("%s %q: want %s from %s to %s", what, text, want, numText(lo), numText(hi))
		return empty
	}
	return v
}

// unitWords names a unit in words for the messages.
func unitWords(u string) string {
	switch u {
	case "d":
		return "days"
	case "mag":
		return "magnitudes"
	}
	return u
}

// starErrText is an error's message without the packages' prefixes
// ("ephem: ", "observe: "), at its start or after a colon.
func starErrText(err error) string {
	s := err.Error()
	for _, p := range []string{"ephem: ", "observe: ", "reduce: ", "logbook: "} {
		s = strings.TrimPrefix(s, p)
		s = strings.ReplaceAll(s, ": "+p, ": ")
	}
	return s
}

// StarSourceDefault is the source recorded for the ephemeris of a star
// added by hand when none is typed.
const StarSourceDefault = "entered by hand"

// Adoption reads the ephemeris form for adopting a new ephemeris: the
// elements (Ephemeris) and where they come from, which must be given.
func (f StarEphemForm) Adoption() (ephem.Ephemeris, string, StarFieldErrors) {
	e, errs := f.Ephemeris()
	src := strings.TrimSpace(f.Source)
	if src == "" {
		if errs == nil {
			errs = StarFieldErrors{}
		}
		errs[StarFieldSource] = "source: want where the ephemeris comes from, e.g. a publication or \"own O−C fit 2026\""
	}
	if len(errs) > 0 {
		return ephem.Ephemeris{}, "", errs
	}
	return e, src, nil
}
