package app

import (
	"fmt"
	"math"
	"strings"
	"time"

	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// MeasureStarEntry is one star's instrumental magnitude and error as typed.
type MeasureStarEntry struct {
	Label    string // the star's ID among the target's comparison and check stars
	Mag, Err string
}

// MeasureEntry is one row of the Measurements page's entry grid as typed:
// the time, and either a visual estimate or instrumental magnitudes.
type MeasureEntry struct {
	Visual bool
	Time   string
	UTC    bool // the time is read in UTC, not in the site's zone

	Estimate string // visual: "C1 2 V 3 C2"
	Step     string // visual: the observer's step value (mag), for one-star step estimates

	Target MeasureStarEntry   // instrumental: the variable
	Comps  []MeasureStarEntry // each comparison star, in the target's order
	Check  MeasureStarEntry   // the check star (Label "" when the target has none)

	Filter, Airmass, Exposure string
}

// The fields of an entry that an error can point at; a star's fields are
// MeasureMagField(label) and MeasureErrField(label).
const (
	MeasureFieldTime     = "time"
	MeasureFieldEstimate = "estimate"
	MeasureFieldStep     = "step"
	MeasureFieldTarget   = "target"
	MeasureFieldTargetE  = "target_err"
	MeasureFieldFilter   = "filter"
	MeasureFieldAirmass  = "airmass"
	MeasureFieldExposure = "exposure"
	MeasureFieldComps    = "comps" // the comparison stars as a whole
)

// MeasureMagField and MeasureErrField name the magnitude and error fields
// of the comparison or check star labelled label.
func MeasureMagField(label string) string { return "mag:" + label }
func MeasureErrField(label string) string { return "err:" + label }

// MeasureFieldError is what is wrong with one field of an entry.
type MeasureFieldError struct {
	Field string
	Msg   string
}

// MeasureEntryError lists what is wrong with an entry, field by field, so
// that the page can show each message beside its field.
type MeasureEntryError []MeasureFieldError

func (e MeasureEntryError) Error() string {
	var parts []string
	for _, f := range e {
		parts = append(parts, f.Msg)
	}
	return strings.Join(parts, "; ")
}

// Of returns the message about field, "" when there is none.
func (e MeasureEntryError) Of(field string) string {
	for _, f := range e {
		if f.Field == field {
			return f.Msg
		}
	}
	return ""
}

// MeasureReduced is a typed row reduced: the measurement to store (raw
// inputs and reduced values) and notes from the reduction (comparison
// stars left out, warnings).
type MeasureReduced struct {
	M     logbook.Measurement
	Notes []string
	// CheckMag is the check star reduced like the target (NaN when it was
	// not measured), CheckID its label.
	CheckMag float64
	CheckID  string
}

// MeasurePhotometry returns the differential set-up of the target at the
// site: its comparison stars with their catalogue V, its first check star,
// its position and the site (reduce.Photometry; no transformation).
func MeasurePhotometry(t observe.Target, site *observe.Site) reduce.Photometry {
	p := reduce.Photometry{Star: t.Star}
	if site != nil {
		p.Site = &site.Site
	}
	for _, c := range t.Comps {
		p.Comps = append(p.Comps, reduce.Comp{ID: c.ID, Mag: c.V})
	}
	if len(t.Checks) > 0 {
		p.Check = &reduce.Comp{ID: t.Checks[0].ID, Mag: t.Checks[0].V}
	}
	return p
}

// MeasureChart returns the magnitudes a visual estimate is read against:
// every comparison and check star of the target by its label.
func MeasureChart(t observe.Target) map[string]float64 {
	ch := map[string]float64{}
	for _, c := range append(append([]observe.Comp(nil), t.Comps...), t.Checks...) {
		ch[c.ID] = c.V
	}
	return ch
}

// ReduceEntry reads a typed row for the star t at the site in the night of
// date and reduces it: a visual estimate by reduce.ReduceVisual against the
// star's chart (MeasureChart), or instrumental magnitudes by
// reduce.Photometry.Reduce (MeasurePhotometry: the ensemble of Honeycutt
// 1992), with HJD_UTC and BJD_TDB for the site (reduce.ConvertTimes). The
// error is a MeasureEntryError naming every field at fault.
func ReduceEntry(e MeasureEntry, t observe.Target, site *observe.Site, date time.Time) (MeasureReduced, error) {
	var errs MeasureEntryError
	bad := func(field, format string, args ...any) {
		errs = append(errs, MeasureFieldError{field, fmt.Sprintf(format, args...)})
	}
	loc := site.Location()
	if e.UTC {
		loc = time.UTC
	}
	at, err := ParseMeasureTime(e.Time, loc, date, site)
	if err != nil {
		bad(MeasureFieldTime, "%v", err)
	}
	jd := math.NaN()
	if err == nil {
		jd = measureJD(at)
	}
	m := logbook.Measurement{Target: t.Name, ExposureS: math.NaN(), Airmass: math.NaN(), InstMag: math.NaN(),
		InstErr: math.NaN(), Mag: math.NaN(), MagErr: math.NaN(), HJD: math.NaN(), BJDTDB: math.NaN()}
	m.Filter = strings.TrimSpace(e.Filter)
	if m.Airmass, err = measureNumber(e.Airmass, 1, 40, true); err != nil {
		bad(MeasureFieldAirmass, "air mass %v: expected a number from 1 (overhead) to 40, or nothing", err)
	}
	if m.ExposureS, err = measureNumber(e.Exposure, 0, 86400, true); err != nil || m.ExposureS == 0 {
		bad(MeasureFieldExposure, "exposure %v: expected a length in seconds above 0, or nothing", measureQuoteOr(err, e.Exposure))
	}
	m.JDUTC = jd
	if e.Visual {
		measureReduceVisual(e, t, &m, bad)
	} else {
		measureReadInst(e, t, &m, bad)
	}
	if len(errs) > 0 {
		return MeasureReduced{}, errs
	}
	if e.Visual {
		hjd, bjd, err := reduce.ConvertTimes([]float64{m.JDUTC}, t.Star, &site.Site)
		if err != nil {
			return MeasureReduced{}, MeasureEntryError{{MeasureFieldTime, err.Error()}}
		}
		m.HJD, m.BJDTDB = hjd[0], bjd[0]
		return MeasureReduced{M: m, CheckMag: math.NaN()}, nil
	}
	return measureReduceInst(t, site, m)
}
