package logbook

import (
	"fmt"
	"math"
	"strings"
	"time"
	"unicode/utf8"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

// Night is one observing night at a site: who observed, with what, under
// which sky. Its measurements, timings and plan refer to it by ID.
type Night struct {
	ID         int64     // set by the logbook
	Site       string    // the site's name
	Date       time.Time // the civil date the night begins on (0h UTC of it), as observe.NightPlan.Date
	Observer   string
	Equipment  string
	Conditions string
	Notes      string
}

// PlanItem is one target planned for a night, in the order of the plan.
type PlanItem struct {
	Target string
	Note   string
}

// RawMag is the instrumental magnitude of one comparison or check star in a
// frame, with its error (NaN when not known).
type RawMag struct {
	Label   string // the star's ID among the target's comparison and check stars
	InstMag float64
	InstErr float64
}

// Measurement is one observation of a target: the raw inputs as taken
// (instrumental magnitudes of the target, its comparison and check stars,
// filter and air mass; or a visual estimate) and, once reduced, the
// magnitude with its error and the time on the heliocentric and barycentric
// scales. Every missing number is NaN (NULL in the file), never 0.
type Measurement struct {
	ID        int64 // set by the logbook
	Target    string
	NightID   int64
	JDUTC     float64 // mid-exposure (or the moment of a visual estimate), Julian date UTC
	ExposureS float64 // seconds
	Filter    string  // e.g. "V", "B", "CV" (clear), "vis" for the eye
	Airmass   float64
	InstMag   float64 // the target's instrumental magnitude
	InstErr   float64
	Comps     []RawMag // comparison stars' instrumental magnitudes
	Checks    []RawMag // check stars'
	Visual    string   // a visual estimate as written at the eyepiece, e.g. "C1 2 V 3 C2"
	Mag       float64  // reduced magnitude
	MagErr    float64
	HJD       float64 // heliocentric Julian date, UTC scale
	BJDTDB    float64 // barycentric Julian date, TDB scale
	Notes     string
	ImportID  int64 // the import that brought it in; 0 when typed in
}

// Origin says where a timing comes from.
type Origin int

// The origins of a timing.
const (
	Own       Origin = iota + 1 // from the user's own data
	Published                   // typed in from a publication
)

// String returns "own" or "published".
func (o Origin) String() string {
	switch o {
	case Own:
		return "own"
	case Published:
		return "published"
	}
	return fmt.Sprintf("Origin(%d)", int(o))
}

// ParseOrigin reads "own" or "published" (any case).
func ParseOrigin(s string) (Origin, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "own":
		return Own, nil
	case "published":
		return Published, nil
	}
	return 0, fmt.Errorf("origin %q: want own or published", s)
}

// Timing is one observed time of an extremum (an O−C point): the Julian date
// on its time scale, its uncertainty, what it marks, how it was found and
// where it comes from.
type Timing struct {
	ID        int64 // set by the logbook
	Target    string
	JD        float64         // the time of the extremum, Julian date on Scale
	Scale     ephem.TimeScale // HJD (UTC) or BJD_TDB
	SigmaDays float64         // uncertainty; NaN when not known
	Kind      observe.Kind    // maximum or minimum light
	Secondary bool            // a secondary minimum (at a half-integer cycle)
	Origin    Origin
	Method    string // e.g. "kvw", "poly", "visual"
	Source    string // for a published timing, the publication (required)
	NightID   int64  // the night it was observed on; 0 for none (published timings)
	Filter    string
	Observer  string
	Notes     string
	ImportID  int64 // the import that brought it in; 0 when typed in
}

// AdoptedEphemeris is one entry of a target's ephemeris history: the
// elements, when the user adopted them and where they came from.
type AdoptedEphemeris struct {
	ephem.Ephemeris
	Adopted time.Time // UTC, to the second
	Source  string
}

// NightLog is what the logbook knows of one night: the night, its site, the
// targets planned, and the measurements and timings taken.
type NightLog struct {
	Night        Night
	Site         observe.Site
	Plan         []PlanItem
	Measurements []Measurement // in time order
	Timings      []Timing      // in time order
}

// Limits of what the logbook accepts, beyond each type's own Validate.
const (
	minJD         = 2.0e6 // full Julian dates only (as ephem.Ephemeris.Validate)
	maxJD         = 2.6e6
	maxAbsMag     = 40  // instrumental magnitudes carry an arbitrary zero point
	maxMagErr     = 10  // magnitudes
	maxAirmass    = 40  // Pickering (2002) gives 38.75 at the horizon
	maxExposureS  = 1e6 // seconds
	maxSigmaDays  = 1e3
	minNightYear  = 1620 // ephem's supported range
	maxNightYear  = 2199
	maxTextLength = 10000 // bytes in a name or free-text field
)

// validJD reports whether jd is a full Julian date in the supported range.
func validJD(jd float64) bool { return jd >= minJD && jd <= maxJD }

// optional returns true when v is NaN (missing) or within [lo, hi].
func optional(v, lo, hi float64) bool { return math.IsNaN(v) || (v >= lo && v <= hi) }

// checkText refuses text that is too long or holds a NUL byte.
func checkText(what, s string) error {
	if len(s) > maxTextLength {
		return fmt.Errorf("%s is %d bytes long: at most %d", what, len(s), maxTextLength)
	}
	if !utf8.ValidString(s) {
		return fmt.Errorf("%s %q is not valid UTF-8 text", what, s)
	}
	if strings.ContainsRune(s, 0) {
		return fmt.Errorf("%s %q holds a NUL character", what, s)
	}
	return nil
}

// checkName refuses an empty name, leading or trailing blanks, and what
// checkText refuses.
func checkName(what, s string) error {
	if strings.TrimSpace(s) == "" {
		return fmt.Errorf("%s is empty: every %s needs one", what, what)
	}
	if strings.TrimSpace(s) != s {
		return fmt.Errorf("%s %q has leading or trailing blanks", what, s)
	}
	return checkText(what, s)
}

// fieldError is a fault in one field of a record; field is the name of its
// column in the CSV tables, so that an import can point at the cell.
type fieldError struct {
	field string
	err   error
}

func (e *fieldError) Error() string { return e.err.Error() }

func (e *fieldError) Unwrap() error { return e.err }

func fieldErr(field, format string, args ...any) error {
	return &fieldError{field: field, err: fmt.Errorf(format, args...)}
}

// Validate reports the first unusable field of m (the target and night
// are checked against the logbook when it is stored).
func (m *Measurement) Validate() error {
	switch {
	case strings.TrimSpace(m.Target) == "":
		return fieldErr("target", "measurement: target is empty")
	case !validJD(m.JDUTC):
		return fieldErr("jd_utc", "measurement: time JD(UTC) %v: want a full Julian date in [%g, %g]", m.JDUTC, minJD, maxJD)
	case !optional(m.ExposureS, 0, maxExposureS) || m.ExposureS == 0:
		return fieldErr("exposure_s", "measurement: exposure %v s: want a positive number of seconds, or none", m.ExposureS)
	case !optional(m.Airmass, 1, maxAirmass):
		return fieldErr("airmass", "measurement: air mass %v: want 1 to %d, or none", m.Airmass, maxAirmass)
	case !optional(m.InstMag, -maxAbsMag, maxAbsMag):
		return fieldErr("inst_mag", "measurement: instrumental magnitude %v: want within ±%d, or none", m.InstMag, maxAbsMag)
	case !optional(m.InstErr, 0, maxMagErr):
		return fieldErr("inst_err", "measurement: instrumental error %v: want 0 to %d mag, or none", m.InstErr, maxMagErr)
	case !optional(m.Mag, -maxAbsMag, maxAbsMag):
		return fieldErr("mag", "measurement: magnitude %v: want within ±%d, or none", m.Mag, maxAbsMag)
	case !optional(m.MagErr, 0, maxMagErr):
		return fieldErr("mag_err", "measurement: magnitude error %v: want 0 to %d mag, or none", m.MagErr, maxMagErr)
	case !optional(m.HJD, minJD, maxJD):
		return fieldErr("hjd", "measurement: HJD %v: want a full Julian date, or none", m.HJD)
	case !optional(m.BJDTDB, minJD, maxJD):
		return fieldErr("bjd_tdb", "measurement: BJD_TDB %v: want a full Julian date, or none", m.BJDTDB)
	case math.IsNaN(m.InstMag) && math.IsNaN(m.Mag) && strings.TrimSpace(m.Visual) == "":
		return fieldErr("", "measurement: no value: give an instrumental magnitude, a visual estimate or a reduced magnitude")
	case !math.IsNaN(m.InstErr) && math.IsNaN(m.InstMag):
		return fieldErr("inst_err", "measurement: an instrumental error %v without an instrumental magnitude", m.InstErr)
	case !math.IsNaN(m.MagErr) && math.IsNaN(m.Mag):
		return fieldErr("mag_err", "measurement: a magnitude error %v without a magnitude", m.MagErr)
	}
	for _, f := range []struct{ col, what, s string }{{"filter", "filter", m.Filter}, {"visual", "visual estimate", m.Visual},
		{"notes", "notes", m.Notes}} {
		if err := checkText(f.what, f.s); err != nil {
			return fieldErr(f.col, "measurement: %v", err)
		}
	}
	seen := map[string]bool{}
	for _, set := range []struct {
		col string
		ms  []RawMag
	}{{"comp_inst", m.Comps}, {"check_inst", m.Checks}} {
		for _, c := range set.ms {
			if err := checkName("comparison star label", c.Label); err != nil {
				return fieldErr(set.col, "measurement: %v", err)
			}
			key := strings.ToLower(c.Label)
			if seen[key] {
				return fieldErr(set.col, "measurement: comparison star %q appears twice", c.Label)
			}
			seen[key] = true
			if math.IsNaN(c.InstMag) || math.Abs(c.InstMag) > maxAbsMag {
				return fieldErr(set.col, "measurement: comparison star %q: instrumental magnitude %v: want within ±%d", c.Label, c.InstMag, maxAbsMag)
			}
			if !optional(c.InstErr, 0, maxMagErr) {
				return fieldErr(set.col, "measurement: comparison star %q: error %v: want 0 to %d mag, or none", c.Label, c.InstErr, maxMagErr)
			}
		}
	}
	return nil
}

// Validate reports the first unusable field of t (the target and night are
// checked against the logbook when it is stored).
func (t *Timing) Validate() error {
	switch {
	case strings.TrimSpace(t.Target) == "":
		return fieldErr("target", "timing: target is empty")
	case !validJD(t.JD):
		return fieldErr("jd", "timing: time %v: want a full Julian date in [%g, %g]", t.JD, minJD, maxJD)
	case t.Scale != ephem.HJD && t.Scale != ephem.BJDTDB:
		return fieldErr("timescale", "timing: time scale must be hjd (heliocentric, UTC) or bjd (barycentric, TDB)")
	case !optional(t.SigmaDays, 0, maxSigmaDays):
		return fieldErr("sigma_days", "timing: uncertainty %v days: want 0 to %g, or none", t.SigmaDays, float64(maxSigmaDays))
	case t.Kind != observe.Max && t.Kind != observe.Min:
		return fieldErr("kind", "timing: kind must be max or min")
	case t.Secondary && t.Kind != observe.Min:
		return fieldErr("secondary", "timing: a secondary extremum must be a minimum")
	case t.Origin != Own && t.Origin != Published:
		return fieldErr("origin", "timing: origin must be own or published")
	case t.Origin == Published && strings.TrimSpace(t.Source) == "":
		return fieldErr("source", "timing: a published timing needs its source (the publication)")
	case t.Origin == Published && t.NightID != 0:
		return fieldErr("date", "timing: a published timing belongs to no night of this logbook")
	}
	for _, f := range []struct{ col, s string }{{"method", t.Method}, {"source", t.Source}, {"filter", t.Filter},
		{"observer", t.Observer}, {"notes", t.Notes}} {
		if err := checkText(f.col, f.s); err != nil {
			return fieldErr(f.col, "timing: %v", err)
		}
	}
	return nil
}

// Validate reports the first unusable field of n (the site is checked
// against the logbook when it is stored).
func (n *Night) Validate() error {
	if err := checkName("site", n.Site); err != nil {
		return fieldErr("site", "night: %v", err)
	}
	if y := n.Date.Year(); y < minNightYear || y > maxNightYear {
		return fieldErr("date", "night: date %s: want a year from %d to %d", n.Date.Format("2006-01-02"), minNightYear, maxNightYear)
	}
	for _, f := range []struct{ col, s string }{{"observer", n.Observer}, {"equipment", n.Equipment},
		{"conditions", n.Conditions}, {"notes", n.Notes}} {
		if err := checkText(f.col, f.s); err != nil {
			return fieldErr(f.col, "night: %v", err)
		}
	}
	return nil
}

// dateKey writes the civil date of t (its year, month and day as it reads).
func dateKey(t time.Time) string { return t.Format("2006-01-02") }

// civilDate returns 0h UTC of t's year, month and day.
func civilDate(t time.Time) time.Time {
	y, m, d := t.Date()
	return time.Date(y, m, d, 0, 0, 0, 0, time.UTC)
}
