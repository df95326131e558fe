package app

import (
	"fmt"
	"math"
	"strings"
	"testing"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
	"example.org/vigil/reduce"
)

// The demo invents Ashgrove V4 with a period that grows, Q = 5×10⁻⁹ d
// (internal/demo's package documentation), and published timings on HJD:
// converted to the ephemeris's BJD_TDB they join the diagram, the
// quadratic ephemeris is preferred, and its Q is the demo's.
func TestTimingOCAshgroveV4PrefersQuadratic(t *testing.T) {
	t.Parallel()
	lb := timingDemo(t)
	d := timingLoad(t, lb, "Ashgrove V4")
	s := TimingStudyOC(d.Target, d.Timings)
	if s.Analysis == nil {
		t.Fatalf("no O−C analysis: %v", s.Err)
	}
	hjd := 0
	for _, tm := range d.Timings {
		if tm.Scale == ephem.HJD {
			hjd++
		}
	}
	if hjd == 0 || s.Converted != hjd || len(s.Used) != len(d.Timings) {
		t.Errorf("converted %d of %d HJD timings; %d of %d on the diagram", s.Converted, hjd, len(s.Used), len(d.Timings))
	}
	a := s.Analysis
	if a.Preferred != "quadratic" || a.Quadratic == nil {
		t.Fatalf("preferred %q (%s), want quadratic", a.Preferred, a.PreferredBy)
	}
	const demoQ = 5e-9 // d, internal/demo's documentation
	q := a.Quadratic
	if diff := q.Q - demoQ; math.Abs(diff) > 3*q.QErr {
		t.Errorf("Q = %.3g ± %.2g d, the demo's %.3g: diff %.2g, tol 3σ = %.2g", q.Q, q.QErr, demoQ, diff, 3*q.QErr)
	}
	sum := strings.Join(s.Summary(), "\n")
	for _, want := range []string{"Preferred: the quadratic ephemeris (F-test", "the period grows by", "converted to BJD_TDB",
		"s per year", "Periodic term (light-time orbit, circular, over the quadratic ephemeris)"} {
		if !strings.Contains(sum, want) {
			t.Errorf("summary lacks %q:\n%s", want, sum)
		}
	}
	// The table: every timing, newest first, with its cycle and O−C
	// against the current ephemeris (reduce.CycleOf).
	if len(s.Rows) != len(d.Timings) {
		t.Fatalf("%d rows for %d timings", len(s.Rows), len(d.Timings))
	}
	last := d.Timings[len(d.Timings)-1]
	row := s.Rows[0]
	if row.Timing.ID != last.ID {
		t.Errorf("first row is timing %d, want the newest, %d", row.Timing.ID, last.ID)
	}
	e, oc := reduce.CycleOf(d.Target.Ephemeris, last.JD, last.Secondary)
	if row.Cells[4] != fmt.Sprintf("%g", e) || row.Cells[5] != fmt.Sprintf("%+.5f", oc) || row.Cells[6] != fmt.Sprintf("%+.1f", oc*1440) {
		t.Errorf("row %v: want cycle %g, O−C %+.5f d, %+.1f min", row.Cells, e, oc, oc*1440)
	}
}

// The demo's W UMa-like Ashgrove V5 has a 6.2-year light-time wave of
// ±0.0062 d (internal/demo's documentation): the fitted orbit finds it.
func TestTimingOCLightTime(t *testing.T) {
	t.Parallel()
	lb := timingDemo(t)
	d := timingLoad(t, lb, "Ashgrove V5")
	s := TimingStudyOC(d.Target, d.Timings)
	if s.LightTime == nil {
		t.Fatalf("no light-time fit: %v", s.LightTimeErr)
	}
	const (
		demoP3Yr  = 6.2    // internal/demo
		demoAmpD  = 0.0062 // internal/demo
		tolP3Yr   = 0.2    // the demo states two digits
		tolAmpDay = 0.0003 // the same
	)
	lt := s.LightTime
	if d := lt.PeriodDays/365.25 - demoP3Yr; math.Abs(d) > tolP3Yr {
		t.Errorf("P3 = %.2f yr, want %.1f: diff %.2f, tol %.2f", lt.PeriodDays/365.25, demoP3Yr, d, tolP3Yr)
	}
	if d := lt.SemiAmplitudeDays - demoAmpD; math.Abs(d) > tolAmpDay {
		t.Errorf("semi-amplitude %.5f d, want %.4f: diff %.5f, tol %.4f", lt.SemiAmplitudeDays, demoAmpD, d, tolAmpDay)
	}
	if !s.ShowLightTime() || !strings.Contains(strings.Join(s.Summary(), " "), "significant at the 0.01 level") {
		t.Errorf("the significant orbit is not drawn or not called significant: %v", s.Summary())
	}

	// Too few timings for any fit: the reason, in words.
	few := TimingStudyOC(d.Target, d.Timings[:2])
	if few.Analysis != nil || !strings.Contains(strings.Join(few.Summary(), " "), "needs at least 3") {
		t.Errorf("two timings: %v", few.Summary())
	}
	if none := TimingStudyOC(d.Target, nil); !strings.HasPrefix(none.Summary()[0], "No timings yet") {
		t.Errorf("no timings: %v", none.Summary())
	}
}

// The ephemeris offered for adoption is the fit's, its epoch moved to a
// whole cycle: it predicts the fit's times, with an epoch error no larger
// than the fit's at cycle 0.
func TestTimingCandidate(t *testing.T) {
	t.Parallel()
	lb := timingDemo(t)
	d := timingLoad(t, lb, "Ashgrove V4")
	s := TimingStudyOC(d.Target, d.Timings)
	a := s.Analysis
	const tolDays = 1e-9 // rounding of Julian dates near 2.46e6
	for _, fit := range []string{"linear", "quadratic"} {
		eph, err := s.Candidate(fit)
		if err != nil {
			t.Fatal(err)
		}
		shift := math.Round((eph.Epoch - a.Ephemeris.Epoch) / a.Ephemeris.PeriodDays)
		errAt0 := a.Linear.EpochErr
		for _, e := range []float64{-3000, 0, 200, 1000} {
			var want float64
			if fit == "linear" {
				want = a.Linear.Epoch + a.Linear.Period*e
			} else {
				q := a.Quadratic
				want = q.Epoch + q.Period*e + q.Q*e*e
				errAt0 = q.EpochErr
			}
			if got := eph.At(e - shift); math.Abs(got-want) > tolDays {
				t.Errorf("%s: T(%g) = %.8f, the fit gives %.8f", fit, e, got, want)
			}
		}
		if eph.EpochErr > errAt0 || eph.Scale != ephem.BJDTDB {
			t.Errorf("%s: σ(T0) %.2g d, the fit's at cycle 0 %.2g d; scale %v", fit, eph.EpochErr, errAt0, eph.Scale)
		}
	}
	if _, err := (TimingStudy{}).Candidate("linear"); err == nil {
		t.Error("a study without an analysis offered an ephemeris")
	}
}

// Adopting stores the new ephemeris as current and keeps the old one in
// the star's history.
func TestTimingAdoptKeepsHistory(t *testing.T) {
	t.Parallel()
	lb := timingDemo(t)
	d := timingLoad(t, lb, "Ashgrove V4")
	before, err := lb.EphemerisHistory("Ashgrove V4")
	if err != nil {
		t.Fatal(err)
	}
	s := TimingStudyOC(d.Target, d.Timings)
	eph, err := s.Candidate(s.Analysis.Preferred)
	if err != nil {
		t.Fatal(err)
	}
	src := TimingAdoptSource("quadratic O−C fit", len(s.Used), time.Date(2026, 12, 1, 18, 0, 0, 0, time.UTC))
	if src != "quadratic O−C fit of 39 timings, 2026-12-01" {
		t.Errorf("source %q", src)
	}
	msg := TimingAdoptMessage(d.Target, eph, src)
	if !strings.Contains(msg, "Now:  "+TimingEphemerisText(d.Target.Kind, d.Target.Ephemeris)) ||
		!strings.Contains(msg, "New:  "+TimingEphemerisText(d.Target.Kind, eph)) || !strings.Contains(msg, "stays in the star's history") {
		t.Errorf("confirmation:\n%s", msg)
	}
	if err := lb.AdoptEphemeris("Ashgrove V4", eph, src); err != nil {
		t.Fatal(err)
	}
	after, err := lb.EphemerisHistory("Ashgrove V4")
	if err != nil {
		t.Fatal(err)
	}
	if len(after) != len(before)+1 {
		t.Fatalf("history: %d entries after adopting, %d before", len(after), len(before))
	}
	if got := after[len(after)-1]; got.Ephemeris != eph || got.Source != src {
		t.Errorf("current: %+v, want %+v from %q", got, eph, src)
	}
	if got, want := after[len(after)-2], before[len(before)-1]; got.Ephemeris != want.Ephemeris {
		t.Errorf("the old ephemeris in the history: %+v, want %+v", got.Ephemeris, want.Ephemeris)
	}
	tg, err := lb.Target("Ashgrove V4")
	if err != nil || tg.Ephemeris != eph {
		t.Errorf("the target's ephemeris after adopting: %+v (%v)", tg.Ephemeris, err)
	}
}

// Timings of the other kind of extremum stay off the diagram, and the
// summary says so.
func TestTimingOCLeavesOutOtherKind(t *testing.T) {
	t.Parallel()
	lb := timingDemo(t)
	d := timingLoad(t, lb, "Ashgrove V1") // timed at maxima
	odd := d.Timings[0]
	odd.ID, odd.Kind = 0, observe.Min
	timings := append([]logbook.Timing{odd}, d.Timings...)
	s := TimingStudyOC(d.Target, timings)
	if len(s.Used) != len(d.Timings) {
		t.Errorf("%d on the diagram, want %d", len(s.Used), len(d.Timings))
	}
	if sum := strings.Join(s.Summary(), " "); !strings.Contains(sum, "Left off the diagram: 1 timing of the other kind (the ephemeris marks maxima)") {
		t.Errorf("summary: %s", sum)
	}
	for _, r := range s.Rows {
		if r.Timing.Kind == odd.Kind && (r.InOC || r.Cells[5] != "—") {
			t.Errorf("the minimum's row %v is on the diagram", r.Cells)
		}
	}
}
