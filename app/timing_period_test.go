package app

import (
	"context"
	"errors"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"sync/atomic"
	"testing"

	"example.org/vigil/reduce"
)

// A search over the demo's measurements of a star finds the period of its
// ephemeris, to within a tenth of the peak's width.
func TestTimingSearchFindsPeriod(t *testing.T) {
	t.Parallel()
	lb := timingDemo(t)
	for _, tc := range []struct {
		star   string
		method string
	}{
		{"Ashgrove V1", reduce.MethodLS}, // RR Lyrae-like, timed nights over seven years
		{"Ashgrove V2", reduce.MethodLS}, // Cepheid-like, nightly frames
		{"Ashgrove V3", reduce.MethodPDM},
	} {
		d := timingLoad(t, lb, tc.star)
		p := d.Target.Ephemeris.PeriodDays
		in := TimingPeriodDefaults(p)
		in.Method = tc.method
		s, errs := TimingParsePeriod(in)
		if errs != nil {
			t.Fatalf("%s: defaults refused: %v", tc.star, errs)
		}
		var calls atomic.Int64
		r, err := TimingSearch(context.Background(), d.Points, s, func(done, total int) { calls.Add(1) })
		if err != nil {
			t.Fatalf("%s: %v", tc.star, err)
		}
		tol := 0.1 * p * p / r.SpanDays // a tenth of the peak width in period
		if diff := r.Best.PeriodDays - p; math.Abs(diff) > tol {
			t.Errorf("%s (%s): best period %.7f d, the ephemeris's %.7f: diff %.2g d, tol %.2g d", tc.star, tc.method, r.Best.PeriodDays, p, diff, tol)
		}
		if calls.Load() == 0 {
			t.Errorf("%s: no progress reported", tc.star)
		}
		cells := TimingPeakCells(r)
		if len(cells) != len(r.Peaks) || cells[0][4] != "best" {
			t.Errorf("%s: peak cells %v", tc.star, cells)
		}
		if sum := strings.Join(TimingPeriodSummary(r, len(d.Points)), " "); !strings.Contains(sum, "Best: P = ") {
			t.Errorf("%s: summary %q", tc.star, sum)
		}

		// The ephemeris made from the peak puts its extrema where the
		// star's own ephemeris does, within the folded fit's σ and the
		// current ephemeris's uncertainty there (3σ).
		eph, err := TimingFromPeak(d.Points, r.Best.PeriodDays, d.Target)
		if err != nil {
			t.Fatalf("%s: %v", tc.star, err)
		}
		cur := d.Target.Ephemeris
		e, oc := reduce.CycleOf(cur, eph.Epoch, false)
		tolOC := 3 * math.Hypot(eph.EpochErr, cur.Sigma(e))
		if math.Abs(oc) > tolOC {
			t.Errorf("%s: new T0 %.5f is %.5f d off the current ephemeris (cycle %g), tol %.5f d", tc.star, eph.Epoch, oc, e, tolOC)
		}
		if !(eph.PeriodErr > 0) || eph.PeriodDays != r.Best.PeriodDays || eph.Scale != cur.Scale {
			t.Errorf("%s: ephemeris %+v", tc.star, eph)
		}
	}
}

// Cancelling the search's job mid-way stops it: the periodogram returns
// the context's error and the job's onDone gets context.Canceled.
func TestTimingSearchCancel(t *testing.T) {
	t.Parallel()
	lb := timingDemo(t)
	d := timingLoad(t, lb, "Ashgrove V3")
	for _, method := range []string{reduce.MethodLS, reduce.MethodPDM} {
		in := TimingPeriodDefaults(d.Target.Ephemeris.PeriodDays)
		in.Method = method
		s, _ := TimingParsePeriod(in)
		jobs := NewJobs(func(f func()) { f() })
		started := make(chan struct{})
		var inner error
		var got error
		var progressAfter atomic.Int64
		Run(jobs, timingSlotSearch, "Period search", func(ctx context.Context, p Progress) (reduce.PeriodResult, error) {
			first := true
			r, err := TimingSearch(ctx, d.Points, s, func(done, total int) {
				p(done, total)
				if first {
					first = false
					close(started)
					<-ctx.Done() // hold the search here until it is cancelled
					return
				}
				progressAfter.Add(1)
			})
			inner = err
			return r, err
		}, func(_ reduce.PeriodResult, err error) { got = err })
		<-started
		jobs.Cancel(timingSlotSearch)
		jobs.Wait()
		if !errors.Is(got, context.Canceled) || !errors.Is(inner, context.Canceled) {
			t.Errorf("%s: onDone got %v, the search returned %v; want context.Canceled for both", method, got, inner)
		}
		if jobs.Busy(timingSlotSearch) {
			t.Errorf("%s: the search's slot is still busy", method)
		}
	}
}

// The search's fields: each fault named at its field.
func TestTimingParsePeriod(t *testing.T) {
	t.Parallel()
	good := TimingPeriodInput{Min: "0.2", Max: "1.5", Oversample: "5", Method: reduce.MethodLS}
	s, errs := TimingParsePeriod(good)
	if errs != nil || s.MinPeriod != 0.2 || s.MaxPeriod != 1.5 || s.Oversample != 5 || s.Method != reduce.MethodLS {
		t.Errorf("good input: %+v, %v", s, errs)
	}
	for _, tc := range []struct {
		edit  func(*TimingPeriodInput)
		field string
		want  string
	}{
		{func(in *TimingPeriodInput) { in.Min = "0" }, "min", "want a period in days"},
		{func(in *TimingPeriodInput) { in.Max = "long" }, "max", "want a period in days"},
		{func(in *TimingPeriodInput) { in.Max = "0.1" }, "max", "above the shortest"},
		{func(in *TimingPeriodInput) { in.Oversample = "0.5" }, "oversample", "from 1 to 100"},
		{func(in *TimingPeriodInput) { in.Method = "fft" }, "method", "fft"},
	} {
		in := good
		tc.edit(&in)
		_, errs := TimingParsePeriod(in)
		if !strings.Contains(errs[tc.field], tc.want) {
			t.Errorf("%+v: error at %s %q, want %q (all %v)", in, tc.field, errs[tc.field], tc.want, errs)
		}
	}
	if d := TimingPeriodDefaults(2.8673591); d.Min != "1.147" || d.Max != "7.168" {
		t.Errorf("defaults for P = 2.867 d: %+v, want 1.147 to 7.168 (P/2.5 to 2.5 P)", d)
	}
	if _, err := TimingSearch(context.Background(), make([]reduce.Point, 3), good2search(t, good), nil); err == nil {
		t.Error("a search of 3 points was not refused")
	}
}

func good2search(t *testing.T, in TimingPeriodInput) reduce.PeriodSearch {
	s, errs := TimingParsePeriod(in)
	if errs != nil {
		t.Fatal(errs)
	}
	return s
}

// TimingPeriodSigma's error of a frequency matches the scatter of the
// frequencies found in simulated light curves (a sinusoid with Gaussian
// noise, times bunched into nights, searched by reduce.Periodogram): the
// formula is the first-order error of a least-squares sinusoid's
// frequency, which such data attain.
func TestTimingPeriodSigmaMonteCarlo(t *testing.T) {
	t.Parallel()
	const (
		trials = 400
		n      = 150
		spanD  = 300.0
		p0     = 0.37
		amp    = 0.2
		noise  = 0.02
		// The scatter of 400 trials is known to 1/√800 = 3.5%, and the
		// first-order formula leaves out terms of higher order: over
		// other samplings the ratio ran from 0.92 to 1.21 (this one:
		// 1.15). A factor √2 or 2 wrong would show.
		tolFrac = 0.25
	)
	rng := rand.New(rand.NewPCG(1, 2))
	times := make([]float64, n)
	for i := range times {
		night := math.Floor(rng.Float64() * spanD)
		times[i] = 2460000 + night + 0.3*rng.Float64()
	}
	slices.Sort(times)
	var sum, sum2, predicted float64
	for range trials {
		pts := make([]reduce.Point, n)
		for i, tt := range times {
			pts[i] = reduce.Point{T: tt, Mag: 11 + amp*math.Sin(2*math.Pi*(tt-2460000)/p0) + noise*rng.NormFloat64(), Err: noise}
		}
		r, err := reduce.Periodogram(context.Background(), pts, reduce.PeriodSearch{MinPeriod: p0 * 0.999, MaxPeriod: p0 * 1.001, NFreq: 2000, NPeaks: 1})
		if err != nil {
			t.Fatal(err)
		}
		f := r.Best.FreqPerDay
		sum, sum2 = sum+f, sum2+f*f
		predicted += TimingPeriodSigma(pts, 1/f) * f * f // σ(f) = σ(P)/P²
	}
	mean := sum / trials
	scatter := math.Sqrt(sum2/trials - mean*mean)
	predicted /= trials
	if d := predicted/scatter - 1; math.Abs(d) > tolFrac {
		t.Errorf("σ(f): formula %.3g c/d, scatter of %d trials %.3g c/d: ratio off by %.2f, tol %.2f", predicted, trials, scatter, d, tolFrac)
	}
}
