package report

import (
	"math"
	"strings"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// RecordCounts says what AddRecord took from the logbook's record of a night,
// and what it left out.
type RecordCounts struct {
	Measurements int // reduced measurements in the log
	Unreduced    int // measurements without a reduced magnitude (or a readable time), left out
	Timings      int // timings in the log
	OCGiven      int // timings with an O−C against their target's current ephemeris
}

// AddRecord adds the logbook's record of the night to the log: the observer,
// the reduced measurements (comparison and check stars by label, a visual
// estimate as written) and the timings, each with its O−C against its
// target's current ephemeris (TimingOC). `vigil log` and the window's Log
// page both make the log this way.
func (n *NightLog) AddRecord(rec logbook.NightLog, targets []observe.Target) RecordCounts {
	var c RecordCounts
	n.Observer = rec.Night.Observer
	for _, m := range rec.Measurements {
		at, err := ephem.FromJDUTC(m.JDUTC)
		if math.IsNaN(m.Mag) || err != nil {
			c.Unreduced++
			continue
		}
		comp := rawLabels(m.Comps)
		if comp == "" && m.Visual != "" {
			comp = "visual: " + m.Visual
		}
		n.Measurements = append(n.Measurements, Measurement{Time: at, Target: m.Target, Band: m.Filter,
			Mag: m.Mag, MagErr: m.MagErr, Comp: comp, Check: rawLabels(m.Checks)})
	}
	for _, t := range rec.Timings {
		oc := math.NaN()
		if i := observe.FindTarget(targets, t.Target); i >= 0 {
			oc = TimingOC(targets[i], t)
		}
		if !math.IsNaN(oc) {
			c.OCGiven++
		}
		n.Timings = append(n.Timings, Timing{Target: t.Target, Kind: t.Kind, Secondary: t.Secondary,
			JD: t.JD, Scale: t.Scale, SigmaDays: t.SigmaDays, Method: t.Method, OCDays: oc})
	}
	c.Measurements, c.Timings = len(n.Measurements), len(n.Timings)
	return c
}

// TimingOC returns the O−C of a timing against the target's current
// ephemeris, t − T(E) with E the nearest cycle (the nearest half-integer for
// a secondary minimum; reduce.CycleOf), or NaN when the two are on different
// time scales or mark different kinds of extremum.
func TimingOC(tg observe.Target, t logbook.Timing) float64 {
	eph := tg.Ephemeris
	if eph.Scale != t.Scale || tg.Kind != t.Kind || !(eph.PeriodDays > 0) {
		return math.NaN()
	}
	_, oc := reduce.CycleOf(eph, t.JD, t.Secondary)
	return oc
}

// rawLabels joins the labels of comparison or check stars with "+".
func rawLabels(ms []logbook.RawMag) string {
	labels := make([]string, len(ms))
	for i, m := range ms {
		labels[i] = m.Label
	}
	return strings.Join(labels, "+")
}
