package app

import (
	"errors"
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

// Reading a typed row's fields and reducing it (no fyne).

// measureQuoteOr returns the quoted text when err is nil (a value out of range
// read fine), else err itself (which quotes the text).
func measureQuoteOr(err error, s string) any {
	if err == nil {
		return strconv.Quote(strings.TrimSpace(s))
	}
	return err
}

// measureReduceVisual reads a visual estimate against the star's chart.
func measureReduceVisual(e MeasureEntry, t observe.Target, m *logbook.Measurement, bad func(string, string, ...any)) {
	step, err := measureNumber(e.Step, 0, 5, true)
	if err != nil || step == 0 {
		bad(MeasureFieldStep, "step value %v: expected your step in magnitudes, e.g. 0.1, or nothing", measureQuoteOr(err, e.Step))
		step = math.NaN()
	}
	if math.IsNaN(step) {
		step = 0
	}
	if len(t.Comps)+len(t.Checks) == 0 {
		bad(MeasureFieldEstimate, "%s has no comparison stars to estimate against: add them on the Star page", t.Name)
		return
	}
	est := strings.TrimSpace(e.Estimate)
	if est == "" {
		bad(MeasureFieldEstimate, "the estimate is empty: expected e.g. \"C1 2 V 3 C2\" (fractional) or \"C1 3 V, V 2 C2\" (steps)")
		return
	}
	jd := m.JDUTC
	if math.IsNaN(jd) {
		jd = 2451545 // the time is wrong (and said so): read the estimate all the same
	}
	pts, err := reduce.ReduceVisual([]reduce.VisualObservation{{JDUTC: jd, Estimate: est, Err: math.NaN()}}, MeasureChart(t), step)
	if err != nil {
		msg := strings.TrimPrefix(strings.TrimPrefix(err.Error(), "reduce: "), "estimate 1: ")
		field := MeasureFieldEstimate
		if strings.Contains(msg, "step value in magnitudes") {
			field = MeasureFieldStep
		}
		bad(field, "%s", msg)
		return
	}
	m.Visual = est
	if m.Filter == "" {
		m.Filter = "vis"
	}
	m.Mag, m.MagErr = pts[0].Mag, pts[0].Err
	if !(m.MagErr > 0) {
		m.MagErr = math.NaN()
	}
	return
}

// measureReadInst reads the instrumental magnitudes of a row into m.
func measureReadInst(e MeasureEntry, t observe.Target, m *logbook.Measurement, bad func(string, string, ...any)) {
	if len(t.Comps) == 0 {
		bad(MeasureFieldComps, "%s has no comparison stars: add them on the Star page, or type a visual estimate", t.Name)
		return
	}
	var err error
	if m.InstMag, err = measureNumber(e.Target.Mag, -100, 100, false); err != nil {
		bad(MeasureFieldTarget, "target %v: expected its instrumental magnitude, e.g. -7.512", err)
	}
	if m.InstErr, err = measureNumber(e.Target.Err, 0, 10, true); err != nil {
		bad(MeasureFieldTargetE, "target error %v: expected a one-sigma error in magnitudes from 0 to 10, e.g. 0.005, or nothing", err)
	}
	read := func(s MeasureStarEntry, what string) (logbook.RawMag, bool) {
		r := logbook.RawMag{Label: s.Label, InstMag: math.NaN(), InstErr: math.NaN()}
		var err error
		if r.InstMag, err = measureNumber(s.Mag, -100, 100, true); err != nil {
			bad(MeasureMagField(s.Label), "%s %s %v: expected its instrumental magnitude, e.g. -8.120, or nothing", what, s.Label, err)
		}
		if r.InstErr, err = measureNumber(s.Err, 0, 10, true); err != nil {
			bad(MeasureErrField(s.Label), "%s %s error %v: expected a one-sigma error from 0 to 10 mag, or nothing", what, s.Label, err)
		} else if !math.IsNaN(r.InstErr) && math.IsNaN(r.InstMag) && strings.TrimSpace(s.Mag) == "" {
			bad(MeasureMagField(s.Label), "%s %s has an error but no magnitude: type its instrumental magnitude", what, s.Label)
		}
		return r, !math.IsNaN(r.InstMag)
	}
	measured := 0
	for _, c := range e.Comps {
		if r, ok := read(c, "comparison star"); ok {
			m.Comps = append(m.Comps, r)
			measured++
		}
	}
	if e.Check.Label != "" {
		if r, ok := read(e.Check, "check star"); ok {
			m.Checks = append(m.Checks, r)
		}
	}
	if measured == 0 && len(e.Comps) > 0 {
		bad(MeasureMagField(e.Comps[0].Label), "no comparison star measured: type the instrumental magnitude of at least one")
	}
	return
}

// measureReduceInst reduces the instrumental magnitudes read into m.
func measureReduceInst(t observe.Target, site *observe.Site, m logbook.Measurement) (MeasureReduced, error) {
	var notes []string
	p := MeasurePhotometry(t, site)
	exp := reduce.NewExposure(m.JDUTC, len(p.Comps))
	exp.Filter = m.Filter
	exp.Target = reduce.Inst{Mag: m.InstMag, Err: m.InstErr, Airmass: m.Airmass}
	for j, c := range p.Comps {
		for _, r := range m.Comps {
			if r.Label == c.ID {
				exp.Comps[j] = reduce.Inst{Mag: r.InstMag, Err: r.InstErr, Airmass: math.NaN()}
			}
		}
	}
	if p.Check != nil {
		for _, r := range m.Checks {
			if r.Label == p.Check.ID {
				exp.Check = reduce.Inst{Mag: r.InstMag, Err: r.InstErr, Airmass: math.NaN()}
			}
		}
	}
	red, err := p.Reduce([]reduce.Exposure{exp})
	if err != nil {
		var ee *reduce.ExposureError
		if errors.As(err, &ee) {
			return MeasureReduced{}, MeasureEntryError{{measureFieldOf(ee.Field), strings.TrimPrefix(ee.Err.Error(), "reduce: ")}}
		}
		return MeasureReduced{}, MeasureEntryError{{MeasureFieldComps, strings.TrimPrefix(err.Error(), "reduce: ")}}
	}
	if len(red.Rows) == 0 {
		why := "it could not be reduced"
		if len(red.Skipped) > 0 {
			why = red.Skipped[0].Reason
		}
		return MeasureReduced{}, MeasureEntryError{{MeasureFieldComps, "this row cannot be reduced: " + why}}
	}
	r := red.Rows[0]
	m.Mag, m.MagErr, m.HJD, m.BJDTDB = r.Mag, r.Err, r.HJD, r.BJDTDB
	if !(m.MagErr > 0) {
		m.MagErr = math.NaN()
	}
	for _, rj := range red.Rejected {
		notes = append(notes, fmt.Sprintf("comparison star %s left out: %s", rj.ID, rj.Reason))
	}
	for _, w := range red.Warnings {
		if red.Check != nil && red.Check.N == 0 && strings.HasPrefix(w, "check star") && strings.Contains(w, "not measured") {
			continue // a typed row may leave the check star out
		}
		if measureLeapWarning(w) {
			continue // true of every row after the table's end: the summary says it once
		}
		notes = append(notes, w)
	}
	res := MeasureReduced{M: m, Notes: notes, CheckMag: r.CheckMag}
	if p.Check != nil {
		res.CheckID = p.Check.ID
	}
	return res, nil
}

// measureFieldOf maps a reduce.ExposureError field to an entry field.
func measureFieldOf(f string) string {
	switch f {
	case "jd_utc":
		return MeasureFieldTime
	case "target":
		return MeasureFieldTarget
	case "filter":
		return MeasureFieldFilter
	}
	return MeasureMagField(f)
}

// measureNumber reads a number typed in a field: blanks trimmed, a Unicode
// minus or a decimal comma accepted. Empty is NaN when optional. A number
// outside [lo, hi] is an error quoting it.
func measureNumber(s string, lo, hi float64, optional bool) (float64, error) {
	s = strings.TrimSpace(s)
	if s == "" {
		if optional {
			return math.NaN(), nil
		}
		return math.NaN(), errors.New(`"" (empty)`)
	}
	t := strings.TrimPrefix(strings.NewReplacer("−", "-", "–", "-").Replace(s), "+")
	if !strings.Contains(t, ".") {
		t = strings.Replace(t, ",", ".", 1)
	}
	v, err := strconv.ParseFloat(t, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return math.NaN(), fmt.Errorf("%q is not a number", s)
	}
	if v < lo || v > hi {
		return math.NaN(), fmt.Errorf("%q is out of range", s)
	}
	return v, nil
}

// measureJD returns the Julian date (UTC) of an instant within ephem's range.
func measureJD(t time.Time) float64 {
	et, err := ephem.FromTime(t)
	if err != nil {
		return math.NaN()
	}
	return et.JDUTC()
}
