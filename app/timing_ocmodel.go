package app

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// TimingColumns are the headings of the table of a star's timings.
var TimingColumns = []string{"Time", "Scale", "σ", "Extremum", "Cycle", "O−C (d)", "O−C (min)", "Origin", "Method", "Source"}

// TimingRow is one timing in the table: the record and its cells, in the
// order of TimingColumns.
type TimingRow struct {
	Timing logbook.Timing
	Cells  []string
	InOC   bool // on the O−C diagram
}

// TimingConvert returns a Julian date on scale from as a Julian date on
// scale to, for light from the star: the UTC instant at which the event is
// seen from the Earth's centre (ephem.Frame.SeenAt), then that instant's
// HJD_UTC or BJD_TDB (Eastman, Siverd & Gaudi 2010, PASP 122, 935). Taking
// the Earth's centre for an observer whose place is not known costs at most
// 21 ms (ephem.Frame.HJD).
func TimingConvert(jd float64, from, to ephem.TimeScale, star ephem.Star) (float64, error) {
	if from == to {
		return jd, nil
	}
	approx, err := ephem.FromJDUTC(jd) // within 10 minutes of the instant
	if err != nil {
		return math.NaN(), err
	}
	f := ephem.NewFrame(approx)
	v := star.Vec()
	at, err := f.SeenAt(from, jd, &v, nil)
	if err != nil {
		return math.NaN(), err
	}
	switch to {
	case ephem.HJD:
		return f.HJD(&v, at), nil
	case ephem.BJDTDB:
		return f.BJDTDB(&v, at), nil
	}
	return math.NaN(), fmt.Errorf("time scale %d: want HJD or BJD_TDB", int(to))
}

// TimingStudy is the O−C diagram of a star's timings with its fits and
// what they say, and the table of the timings.
type TimingStudy struct {
	Target observe.Target
	Rows   []TimingRow // every timing, newest first
	// Used are the timings on the diagram, in time order (the analysis's
	// rows follow them); Published marks the published ones.
	Used      []logbook.Timing
	Published []bool
	Converted int      // timings brought to the ephemeris's scale
	LeftOut   []string // why timings were left off the diagram
	Analysis  *reduce.OCAnalysis
	Err       error // why there is no analysis
	LightTime *reduce.LightTimeFit
	// LightTimeErr says why there is no light-time fit.
	LightTimeErr error
}

// TimingStudyOC makes the O−C study of the star's timings against its
// current ephemeris (reduce.OC, Sterken 2005): timings of the kind of
// extremum its ephemeris marks, those on the other time scale converted to
// the ephemeris's (TimingConvert), with the linear and quadratic fits and,
// when the timings span enough cycles of it, a light-time orbit
// (reduce.LightTime, circular).
func TimingStudyOC(tg observe.Target, timings []logbook.Timing) TimingStudy {
	s := TimingStudy{Target: tg}
	eph := tg.Ephemeris
	var used []reduce.Timing
	secondary := false
	otherKind := 0
	for _, t := range timings {
		row := TimingRow{Timing: t}
		jd, err := TimingConvert(t.JD, t.Scale, eph.Scale, tg.Star)
		cycle, oc := math.NaN(), math.NaN()
		switch {
		case t.Kind != tg.Kind:
			otherKind++
		case err != nil:
			s.LeftOut = append(s.LeftOut, fmt.Sprintf("the %s timing at JD %.5f could not be converted to %s: %v",
				t.Scale.Label(), t.JD, eph.Scale.Label(), err))
		default:
			cycle, oc = reduce.CycleOf(eph, jd, t.Secondary)
			row.InOC = true
			if t.Scale != eph.Scale {
				s.Converted++
			}
			secondary = secondary || t.Secondary
			s.Used = append(s.Used, t)
			s.Published = append(s.Published, t.Origin == logbook.Published)
			used = append(used, reduce.Timing{Time: jd, Sigma: t.SigmaDays})
		}
		row.Cells = timingCells(t, cycle, oc)
		s.Rows = append([]TimingRow{row}, s.Rows...)
	}
	if otherKind > 0 {
		s.LeftOut = append(s.LeftOut, fmt.Sprintf("%s of the other kind (the ephemeris marks %s)",
			plural(otherKind, "timing", "timings"), timingKindPlural(tg.Kind)))
	}
	if len(used) < 3 {
		s.Err = fmt.Errorf("%s on the diagram: an ephemeris fit needs at least 3", plural(len(used), "timing", "timings"))
		return s
	}
	a, err := reduce.OC(eph, used, reduce.OCOptions{Secondary: secondary})
	if err != nil {
		s.Err = err
		return s
	}
	s.Analysis = &a
	// The orbit goes on top of the ephemeris the data prefer.
	lt, err := reduce.LightTime(a, reduce.LightTimeOptions{Quadratic: a.Preferred == "quadratic"})
	if err != nil {
		s.LightTimeErr = err
	} else {
		s.LightTime = &lt
	}
	return s
}

// timingKindPlural names what an ephemeris marks: "maxima" or "minima".
func timingKindPlural(k observe.Kind) string {
	if k == observe.Min {
		return "minima"
	}
	return "maxima"
}

// timingCells writes a timing's cells (TimingColumns); cycle and oc are NaN
// when it is not on the diagram.
func timingCells(t logbook.Timing, cycle, oc float64) []string {
	sigma := "—"
	if t.SigmaDays > 0 {
		sigma = fmt.Sprintf("%s d", timingSigDigits(t.SigmaDays))
	}
	kind := t.Kind.String()
	if t.Secondary {
		kind = "min II"
	}
	source := t.Source
	if t.Origin == logbook.Own && source == "" {
		source = t.Observer
	}
	c, ocd, ocm := "—", "—", "—"
	if !math.IsNaN(cycle) {
		c = fmt.Sprintf("%g", cycle)
		ocd = fmt.Sprintf("%+.5f", oc)
		ocm = fmt.Sprintf("%+.1f", oc*1440)
	}
	return []string{fmt.Sprintf("%.5f", t.JD), t.Scale.Label(), sigma, kind, c, ocd, ocm, t.Origin.String(), t.Method, source}
}

// Summary says in plain words what the O−C diagram and its fits show.
func (s TimingStudy) Summary() []string {
	eph := s.Target.Ephemeris
	var out []string
	if len(s.Rows) == 0 {
		return []string{"No timings yet: fit an extremum above or add a published one."}
	}
	if s.Analysis == nil {
		out = append(out, "No O−C fit: "+s.Err.Error()+".")
		return append(out, s.leftOutText()...)
	}
	a := s.Analysis
	own := 0
	for _, p := range s.Published {
		if !p {
			own++
		}
	}
	head := fmt.Sprintf("O−C of %d timings (%d own, %d published) against the current ephemeris %s.",
		len(s.Used), own, len(s.Used)-own, TimingEphemerisText(s.Target.Kind, eph))
	if s.Converted > 0 {
		head += fmt.Sprintf(" %d on the other scale were converted to %s for the star's position, as seen from the Earth's centre (within 0.02 s).",
			s.Converted, eph.Scale.Label())
	}
	if a.Weighted {
		head += " The fits weigh each timing by 1/σ²."
	} else {
		head += " Some timings have no σ, so the fits weigh all alike and take the errors from the scatter."
	}
	out = append(out, head)
	out = append(out, fmt.Sprintf("Preferred: the %s ephemeris (%s).", a.Preferred, a.PreferredBy))
	out = append(out, s.leftOutText()...)
	l := a.Linear
	out = append(out, fmt.Sprintf("Linear fit: T0 = %s, P = %s d.", timingValErr(l.Epoch, l.EpochErr, 5), timingValErr(l.Period, l.PeriodErr, 7)))
	if q := a.Quadratic; q != nil {
		trend := "grows"
		if q.DPdt < 0 {
			trend = "shrinks"
		}
		out = append(out, fmt.Sprintf("Quadratic fit: T0 = %s, P = %s d, Q = %s d: the period %s by %s s per year (dP/dt = 2Q/P).",
			timingValErr(q.Epoch, q.EpochErr, 5), timingValErr(q.Period, q.PeriodErr, 7), timingSci(q.Q, q.QErr), trend,
			timingValErr(math.Abs(q.DPdtSecPerYear), q.DPdtErrSecPerYear, 3)))
	}
	amb := 0
	for _, r := range a.Rows {
		if r.Ambiguous {
			amb++
		}
	}
	if amb > 0 {
		out = append(out, fmt.Sprintf("Caution: the cycle count of %s may be wrong (ringed on the chart); check them before adopting a fit.",
			plural(amb, "timing", "timings")))
	}
	for _, w := range a.Warnings {
		if !strings.HasPrefix(w, "timing ") { // the per-timing ones are counted above
			out = append(out, "Caution: "+w+".")
		}
	}
	out = append(out, s.lightTimeText())
	return out
}

// leftOutText says which timings are not on the diagram.
func (s TimingStudy) leftOutText() []string {
	var out []string
	for _, w := range s.LeftOut {
		out = append(out, "Left off the diagram: "+w+".")
	}
	return out
}

// lightTimeText says what the light-time fit found, or why there is none.
func (s TimingStudy) lightTimeText() string {
	if s.LightTime == nil {
		why := "it did not converge"
		if s.LightTimeErr != nil {
			why = s.LightTimeErr.Error()
		}
		if errors.Is(s.LightTimeErr, reduce.ErrShortSpan) {
			why = fmt.Sprintf("the timings do not span %g cycles of any orbit worth trying (%v)", reduce.LightTimeMinCycles, s.LightTimeErr)
		}
		return "No periodic (light-time) term fitted: " + why + "."
	}
	f := s.LightTime
	verdict := "not significant"
	if f.FTestP < reduce.OCSignificance {
		verdict = fmt.Sprintf("significant at the %g level", reduce.OCSignificance)
	}
	on := "linear"
	if f.Quadratic {
		on = "quadratic"
	}
	return fmt.Sprintf("Periodic term (light-time orbit, circular, over the "+on+" ephemeris): P3 = %s d (%.2f yr), semi-amplitude %s d (%.1f min); F-test p = %.2g: %s.",
		timingValErr(f.PeriodDays, f.PeriodErr, 0), f.PeriodDays/365.25, timingValErr(f.SemiAmplitudeDays, f.AmplitudeErr, 5),
		f.SemiAmplitudeDays*1440, f.FTestP, verdict)
}

// ShowLightTime reports whether the light-time orbit is worth drawing: it
// was fitted and its terms are significant.
func (s TimingStudy) ShowLightTime() bool {
	return s.LightTime != nil && s.LightTime.FTestP < reduce.OCSignificance
}
