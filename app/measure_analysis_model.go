package app

import (
	"context"
	"fmt"
	"math"
	"strings"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// MeasureScope says which measurements the charts and the check star's
// summary take: the night's or every night's.
type MeasureScope int

// The scopes.
const (
	MeasureThisNight MeasureScope = iota
	MeasureAllNights
)

// MeasureAnalysis is what the Measurements page draws and sums up for a
// scope: the light curve, the folded curve and the check star.
type MeasureAnalysis struct {
	Request MeasureRequest
	Scope   MeasureScope
	// Target is the light curve: T is the Julian date UTC of mid-exposure
	// for one night (drawn in clock time), BJD_TDB across nights.
	Target []reduce.Point
	Nights int    // nights the points come from
	Filter string // the filter every point shares, "" when they differ
	// Check is the check star reduced with the target (Red), on Target's
	// time scale; CheckID names it.
	Check   []reduce.Point
	CheckID string
	// Phase is the light curve folded on the star's current ephemeris
	// (reduce.PhaseFold), PhaseErr why it could not be.
	Phase    []reduce.PhasePoint
	PhaseErr error
	// Red is the instrumental measurements of the scope reduced together
	// (reduce.Photometry.Reduce, in the filter most of them share): its
	// Check summary, Rejected comparison stars and Warnings. Nil when there
	// are none; RedErr says why it failed.
	Red    *reduce.Reduction
	RedErr error
	Frames int // instrumental measurements in the scope
	Visual int // visual estimates in the scope
}

// AnalyseMeasure builds the analysis of the scope from the data: the
// points with a reduced magnitude, their times on the scope's scale
// (reduce.ConvertTimes, geocentric, for a measurement stored without them),
// the fold on the star's ephemeris, and the joint reduction of the
// instrumental measurements with its check star.
func AnalyseMeasure(ctx context.Context, d MeasureData, scope MeasureScope) (MeasureAnalysis, error) {
	a := MeasureAnalysis{Request: d.Request, Scope: scope}
	ms := d.All
	if scope == MeasureThisNight {
		ms = d.Tonight()
	}
	ms, err := measureFillTimes(ms, d.Request)
	if err != nil {
		return a, err
	}
	nights := map[int64]bool{}
	filters := map[string]int{}
	var inst []logbook.Measurement
	eph := d.Request.Target.Ephemeris
	var onEph []reduce.Point
	for _, m := range ms {
		if m.Visual != "" {
			a.Visual++
		}
		if !math.IsNaN(m.InstMag) && len(m.Comps) > 0 {
			inst = append(inst, m)
		}
		if math.IsNaN(m.Mag) {
			continue
		}
		nights[m.NightID] = true
		filters[strings.ToLower(m.Filter)]++
		t := m.JDUTC
		if scope == MeasureAllNights {
			t = m.BJDTDB
		}
		a.Target = append(a.Target, reduce.Point{T: t, Mag: m.Mag, Err: m.MagErr})
		te := m.BJDTDB
		if eph.Scale == ephem.HJD {
			te = m.HJD
		}
		onEph = append(onEph, reduce.Point{T: te, Mag: m.Mag, Err: m.MagErr})
	}
	a.Nights, a.Frames = len(nights), len(inst)
	if len(filters) == 1 {
		for _, m := range ms {
			if !math.IsNaN(m.Mag) {
				a.Filter = m.Filter
				break
			}
		}
	}
	if err := ctx.Err(); err != nil {
		return a, err
	}
	if len(onEph) > 0 {
		a.Phase, a.PhaseErr = reduce.PhaseFold(onEph, eph)
	}
	if len(inst) > 0 {
		a.Red, a.RedErr = measureJointReduction(inst, d.Request)
	}
	if a.Red != nil && a.Red.Check != nil {
		a.CheckID = a.Red.Check.ID
		for _, r := range a.Red.Rows {
			t := r.JDUTC
			if scope == MeasureAllNights {
				t = r.BJDTDB
			}
			a.Check = append(a.Check, reduce.Point{T: t, Mag: r.CheckMag, Err: r.CheckErr})
		}
	}
	return a, ctx.Err()
}

// measureFillTimes returns ms with the HJD and BJD_TDB that a measurement
// lacks computed from its JD UTC (geocentric: at most 21 ms off the site's).
func measureFillTimes(ms []logbook.Measurement, r MeasureRequest) ([]logbook.Measurement, error) {
	var idx []int
	var jd []float64
	for i, m := range ms {
		if (math.IsNaN(m.HJD) || math.IsNaN(m.BJDTDB)) && !math.IsNaN(m.JDUTC) {
			idx = append(idx, i)
			jd = append(jd, m.JDUTC)
		}
	}
	if len(idx) == 0 {
		return ms, nil
	}
	hjd, bjd, err := reduce.ConvertTimes(jd, r.Target.Star, nil)
	if err != nil {
		return nil, err
	}
	out := append([]logbook.Measurement(nil), ms...)
	for k, i := range idx {
		out[i].HJD, out[i].BJDTDB = hjd[k], bjd[k]
	}
	return out, nil
}

// measureJointReduction reduces instrumental measurements together with the
// star's comparison and check stars (MeasurePhotometry), in the filter most
// of them share.
func measureJointReduction(ms []logbook.Measurement, r MeasureRequest) (*reduce.Reduction, error) {
	p := MeasurePhotometry(r.Target, &r.Site)
	count := map[string]int{}
	for _, m := range ms {
		count[strings.ToLower(strings.TrimSpace(m.Filter))]++
	}
	best := ""
	for f, n := range count {
		if n > count[best] || (n == count[best] && f < best) {
			best = f
		}
	}
	if len(count) > 1 {
		p.Filter = best
	}
	exps := make([]reduce.Exposure, len(ms))
	for i, m := range ms {
		e := reduce.NewExposure(m.JDUTC, len(p.Comps))
		e.Filter = m.Filter
		e.Target = reduce.Inst{Mag: m.InstMag, Err: m.InstErr, Airmass: m.Airmass}
		for j, c := range p.Comps {
			for _, raw := range m.Comps {
				if strings.EqualFold(raw.Label, c.ID) {
					e.Comps[j] = reduce.Inst{Mag: raw.InstMag, Err: raw.InstErr, Airmass: math.NaN()}
				}
			}
		}
		if p.Check != nil {
			for _, raw := range m.Checks {
				if strings.EqualFold(raw.Label, p.Check.ID) {
					e.Check = reduce.Inst{Mag: raw.InstMag, Err: raw.InstErr, Airmass: math.NaN()}
				}
			}
		}
		exps[i] = e
	}
	return p.Reduce(exps)
}

// MeasureNote is one line of the check star's summary; Warn marks a
// warning, Calm a note of context, shown quietly.
type MeasureNote struct {
	Text string
	Warn bool
	Calm bool
}

// measureLeapWarning reports whether w is the reduction's warning that
// exposures fall after the date up to which the leap-second table is known
// complete (ephem.LeapSecondsStale): it holds for every exposure after
// that date, and says nothing wrong about the data.
func measureLeapWarning(w string) bool { return strings.Contains(w, "leap-second table") }

// measureLeapNote says once, as a note, what the end of the leap-second
// table means for the times of later exposures.
func measureLeapNote() MeasureNote {
	return MeasureNote{Calm: true, Text: fmt.Sprintf(
		"Note: the leap-second table is known complete up to %s; later times assume no leap second since. "+
			"HJD (UTC) is unaffected; BJD_TDB would be 1 s off if one has been added.",
		ephem.LeapSecondsValidUntil().Format("2 January 2006"))}
}

// Summary says in words what the check star and the comparison stars show
// over the scope (reduce.CheckSummary, Reduction.Rejected and Warnings),
// or what to do to see it.
func (a MeasureAnalysis) Summary() []MeasureNote {
	t := a.Request.Target
	var out []MeasureNote
	note := func(warn bool, format string, args ...any) {
		out = append(out, MeasureNote{Text: fmt.Sprintf(format, args...), Warn: warn})
	}
	where := "in this night"
	if a.Scope == MeasureAllNights {
		where = "over all nights"
	}
	where1 := strings.ToUpper(where[:1]) + where[1:]
	switch {
	case a.Frames == 0 && a.Visual > 0:
		note(false, "Visual estimates only %s: the check star's scatter needs instrumental magnitudes.", where)
		return out
	case a.Frames == 0:
		return out
	case a.RedErr != nil:
		note(true, "The instrumental measurements %s cannot be reduced together: %v", where, a.RedErr)
		return out
	}
	r := a.Red
	filter := ""
	if r.Filter != "" {
		filter = " in " + r.Filter
	}
	note(false, "%s: %s reduced together%s with %s.", where1, plural(len(r.Rows), "frame", "frames"), filter, measureCompList(t.Comps))
	if r.OtherFilter > 0 {
		note(false, "%s in other filters left out of this summary.", plural(r.OtherFilter, "frame", "frames"))
	}
	if c := r.Check; c != nil && c.N > 0 {
		std := "— (one frame)"
		if !math.IsNaN(c.Std) {
			std = fmt.Sprintf("%.3f mag", c.Std)
		}
		note(false, "Check star %s (catalogue %.3f mag): mean %.3f mag, scatter %s (sample standard deviation, n = %d), offset %s mag from the catalogue.",
			c.ID, c.CatalogMag, c.Mean, std, c.N, measureSigned(c.OffsetMag))
	} else if r.Check == nil {
		note(false, "%s has no check star: add one on the Star page to see the night's real scatter.", t.Name)
	}
	for _, rj := range r.Rejected {
		note(true, "Comparison star %s left out: %s", rj.ID, rj.Reason)
	}
	leap := false
	for _, w := range r.Warnings {
		if measureLeapWarning(w) {
			leap = true
			continue
		}
		note(true, "%s%s.", strings.ToUpper(w[:1]), strings.TrimSuffix(w[1:], "."))
	}
	note(false, "A warning shows when the check star is more than %.2f mag off its catalogue value or scatters by more than %.2f mag (common practice).",
		reduce.CheckOffsetWarnMag, reduce.CheckScatterWarnMag)
	if leap {
		out = append(out, measureLeapNote())
	}
	return out
}

// measureCompList names the comparison stars: "C1, C2 and C3".
func measureCompList(cs []observe.Comp) string {
	var ids []string
	for _, c := range cs {
		ids = append(ids, c.ID)
	}
	switch len(ids) {
	case 0:
		return "no comparison star"
	case 1:
		return "comparison star " + ids[0]
	}
	return "comparison stars " + strings.Join(ids[:len(ids)-1], ", ") + " and " + ids[len(ids)-1]
}

// measureSigned writes a magnitude difference with its sign: "+0.006", "−0.012".
func measureSigned(v float64) string {
	if math.Abs(v) < 0.0005 {
		return "0.000"
	}
	return strings.Replace(fmt.Sprintf("%+.3f", v), "-", "−", 1)
}
