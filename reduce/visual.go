package reduce

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"
)

// VisualEstimate is a visual estimate of the variable V against comparison
// stars, as written at the eyepiece. Each Step says that V is Steps steps
// fainter than the star Comp (Steps < 0: brighter).
//
// Two forms are read (ParseEstimate):
//
//   - the fractional (interpolation) method, "A 2 V 3 B": V lies between A
//     and B, 2 parts of 5 from A; and
//   - the step method of Argelander, "A 3 V, V 2 B" (V is 3 steps fainter
//     than A and 2 steps brighter than B) or with one star, "A 3 V" or
//     "V 2 B", which needs the observer's step value in magnitudes.
//
// With two stars both forms give m_V = m_A + (m_B − m_A) a/(a + b), the
// interpolation of the fractional method, which for steps is the step value
// (m_B − m_A)/(a + b) derived from the two stars (methods.md §9;
// Hoffmeister, Richter & Wenzel 1985, Variable Stars, Springer [citation
// from memory]).
type VisualEstimate struct {
	Text       string // as given
	Fractional bool   // written "A a V b B"
	Steps      []VisualStep
}

// VisualStep is one relation of an estimate: V is Steps steps fainter than
// Comp.
type VisualStep struct {
	Comp  string
	Steps float64
}

// ParseEstimate reads a visual estimate: "A 2 V 3 B" (fractional), "A 3 V,
// V 2 B" (two steps; the clauses may be separated by a comma or a
// semicolon), "A 3 V" or "V 2 B" (one step). The variable is the token "V"
// (either case); a comparison label is any other word without blanks (also
// a number, as charts label stars by magnitude); step counts and parts are
// numbers of 0 or more.
func ParseEstimate(s string) (VisualEstimate, error) {
	est := VisualEstimate{Text: s}
	bad := func(why string) (VisualEstimate, error) {
		return VisualEstimate{}, fmt.Errorf("reduce: estimate %q: %s; expected \"A 2 V 3 B\" (fractional), \"A 3 V, V 2 B\" or \"A 3 V\" (steps)", s, why)
	}
	clauses := strings.FieldsFunc(s, func(r rune) bool { return r == ',' || r == ';' })
	if len(clauses) == 0 {
		return bad("it is empty")
	}
	if len(clauses) > 2 {
		return bad("it has more than two clauses")
	}
	for _, cl := range clauses {
		tok := strings.Fields(cl)
		isV := func(t string) bool { return strings.EqualFold(t, "V") }
		num := func(t string) (float64, bool) {
			v, err := strconv.ParseFloat(t, 64)
			return v, err == nil && v >= 0 && finite(v)
		}
		label := func(t string) bool { return !isV(t) }
		switch len(tok) {
		case 5: // A a V b B
			a, okA := num(tok[1])
			b, okB := num(tok[3])
			if len(clauses) != 1 || !label(tok[0]) || !okA || !isV(tok[2]) || !okB || !label(tok[4]) {
				return bad(fmt.Sprintf("cannot read %q", strings.TrimSpace(cl)))
			}
			if a+b == 0 {
				return bad("the parts a and b are both 0")
			}
			est.Fractional = true
			est.Steps = []VisualStep{{tok[0], a}, {tok[4], -b}}
		case 3: // A n V or V n B
			n, ok := num(tok[1])
			switch {
			case ok && label(tok[0]) && isV(tok[2]):
				est.Steps = append(est.Steps, VisualStep{tok[0], n})
			case ok && isV(tok[0]) && label(tok[2]):
				est.Steps = append(est.Steps, VisualStep{tok[2], -n})
			default:
				return bad(fmt.Sprintf("cannot read %q", strings.TrimSpace(cl)))
			}
		default:
			return bad(fmt.Sprintf("cannot read %q", strings.TrimSpace(cl)))
		}
	}
	if len(est.Steps) == 2 && est.Steps[0].Comp == est.Steps[1].Comp {
		return bad("it compares V twice with the same star")
	}
	return est, nil
}

// Magnitude returns the variable's magnitude from the estimate, the
// comparison stars' magnitudes by label (chart), and the observer's step
// value in magnitudes (used only by a one-star step estimate; else it may
// be 0). It also returns the step value used: derived from the two stars
// (m_B − m_A)/(a + b), or stepMag. An estimate that contradicts the chart
// (V fainter than A and brighter than B, with B brighter than A) is an
// error.
func (e VisualEstimate) Magnitude(chart map[string]float64, stepMag float64) (mag, step float64, err error) {
	magOf := func(label string) (float64, error) {
		m, ok := chart[label]
		if !ok {
			known := make([]string, 0, len(chart))
			for k := range chart {
				known = append(known, k)
			}
			slices.Sort(known)
			return 0, fmt.Errorf("reduce: estimate %q: comparison star %q is not on the chart (known: %s)", e.Text, label, strings.Join(known, ", "))
		}
		if !finite(m) {
			return 0, fmt.Errorf("reduce: estimate %q: comparison star %q has no magnitude", e.Text, label)
		}
		return m, nil
	}
	switch len(e.Steps) {
	case 1:
		s := e.Steps[0]
		m, err := magOf(s.Comp)
		if err != nil {
			return 0, 0, err
		}
		if s.Steps == 0 {
			return m, stepMag, nil
		}
		if !(stepMag > 0) || !finite(stepMag) {
			return 0, 0, fmt.Errorf("reduce: estimate %q compares V with one star: give the step value in magnitudes (e.g. 0.1), not %v", e.Text, stepMag)
		}
		return m + s.Steps*stepMag, stepMag, nil
	case 2:
		a, b := e.Steps[0], e.Steps[1]
		ma, err := magOf(a.Comp)
		if err != nil {
			return 0, 0, err
		}
		mb, err := magOf(b.Comp)
		if err != nil {
			return 0, 0, err
		}
		// V = ma + a.Steps·s = mb + b.Steps·s.
		if e.Fractional {
			// m_A + (m_B − m_A)·a/(a+b), the interpolation as written; it
			// holds whichever of A and B is the brighter.
			return ma + (mb-ma)*a.Steps/(a.Steps-b.Steps), math.Abs(mb-ma) / (a.Steps - b.Steps), nil
		}
		if a.Steps == b.Steps {
			return 0, 0, fmt.Errorf("reduce: estimate %q puts V the same number of steps from both stars: the step value cannot be derived", e.Text)
		}
		s := (mb - ma) / (a.Steps - b.Steps)
		if s < 0 || (s == 0 && ma != mb) {
			return 0, 0, fmt.Errorf("reduce: estimate %q contradicts the chart: %s is %.2f and %s is %.2f", e.Text, a.Comp, ma, b.Comp, mb)
		}
		return ma + a.Steps*s, s, nil
	}
	return math.NaN(), 0, fmt.Errorf("reduce: estimate %q has no comparison", e.Text)
}

// VisualObservation is one visual estimate at an instant (Julian date,
// UTC), with an optional one-sigma error (0 or NaN: unknown; common
// practice puts single estimates at 0.1–0.2 mag, methods.md §15).
type VisualObservation struct {
	JDUTC    float64
	Estimate string
	Err      float64
}

// ReduceVisual turns visual estimates into a light curve on the Julian date
// UTC (convert the times with ConvertTimes). chart holds the comparison
// stars' magnitudes by label, stepMag the observer's step value (needed by
// one-star step estimates only). The error names the first estimate at
// fault by its index.
func ReduceVisual(obs []VisualObservation, chart map[string]float64, stepMag float64) ([]Point, error) {
	pts := make([]Point, len(obs))
	for i, o := range obs {
		if !finite(o.JDUTC) {
			return nil, fmt.Errorf("reduce: estimate %d: time %v is not a number", i+1, o.JDUTC)
		}
		if o.Err < 0 {
			return nil, fmt.Errorf("reduce: estimate %d: error %v is negative", i+1, o.Err)
		}
		est, err := ParseEstimate(o.Estimate)
		if err == nil {
			pts[i].Mag, _, err = est.Magnitude(chart, stepMag)
		}
		if err != nil {
			return nil, fmt.Errorf("reduce: estimate %d: %s", i+1, strings.TrimPrefix(err.Error(), "reduce: "))
		}
		pts[i].T, pts[i].Err = o.JDUTC, o.Err
	}
	return pts, nil
}
