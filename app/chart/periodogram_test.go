package chart

import (
	"math"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/plot/plotter"

	"example.org/vigil/reduce"
)

// The best frequency of the methods.md §12 series: methods.md §12 gives
// the refined GLS maximum at 1.666590 c/d (astropy-checked), to within one
// grid step (0.0005 c/d). PDM's minimum is flat-bottomed (θ stays at
// methods.md's θ(0.6 d) = 0.03691 while no point changes bin), so its
// tolerance is a tenth of the peak width 1/T.
const (
	methods60BestFreq = 1.666590
	methods60Step     = 0.0005
	pdmWidthFraction  = 0.1
)

func TestPeriodogram(t *testing.T) {
	for _, c := range []struct {
		method     string
		peaks      int
		wantMarked int
		yLabel     string
		fap        bool
	}{
		{reduce.MethodLS, 0, 1 + DefaultMarkedPeaks, "GLS power", true},
		{reduce.MethodLS, -1, 1, "GLS power", true},
		{reduce.MethodPDM, 2, 3, "PDM θ", false},
	} {
		t.Run(c.method+strconv.Itoa(c.peaks), func(t *testing.T) {
			r := methods60Search(t, c.method)
			pal := DarkPalette()
			p, parts, err := periodogram(PeriodogramData{Result: r, Peaks: c.peaks, PeriodAxis: true}, pal)
			if err != nil {
				t.Fatal(err)
			}
			if p.Y.Label.Text != c.yLabel || !strings.Contains(p.X.Label.Text, "cycles per day") {
				t.Errorf("axes %q against %q", p.Y.Label.Text, p.X.Label.Text)
			}
			if got := strings.Contains(p.Title.Text, "FAP of the best peak"); got != c.fap {
				t.Errorf("title %q: names the FAP %v, want %v", p.Title.Text, got, c.fap)
			}
			if parts.power.Len() != len(r.Freqs) || !sameColour(parts.power.Color, pal.Stars[0]) {
				t.Errorf("power curve of %d points in %v, want %d in %v", parts.power.Len(), parts.power.Color, len(r.Freqs), pal.Stars[0])
			}
			// The window, scaled to the highest peak (θ = 1 for PDM).
			top, wmax := 1.0, 0.0
			if c.method == reduce.MethodLS {
				top = 0
				for _, v := range r.Power {
					top = math.Max(top, v)
				}
			}
			for _, w := range r.Window {
				wmax = math.Max(wmax, w)
			}
			for i, q := range parts.window.XYs {
				if want := r.Window[i] / wmax * top; math.Abs(q.Y-want) > 1e-12 || q.X != r.Freqs[i] {
					t.Errorf("window at %v: %v, want %v", q.X, q.Y, want)
					break
				}
			}
			if !sameColour(parts.window.Color, pal.Faint) {
				t.Errorf("window drawn in %v, want the faint colour %v", parts.window.Color, pal.Faint)
			}
			// The marked peaks: the best first, at the check value.
			if len(parts.marked) != c.wantMarked {
				t.Fatalf("%d peaks marked, want %d", len(parts.marked), c.wantMarked)
			}
			tol := methods60Step
			if c.method == reduce.MethodPDM {
				tol = pdmWidthFraction / r.SpanDays
			}
			if best := parts.marked[0]; best != r.Peaks[0] || math.Abs(best.FreqPerDay-methods60BestFreq) > tol {
				t.Errorf("first mark %+v, want the best peak %+v near %v c/d (methods.md §12)", best, r.Peaks[0], methods60BestFreq)
			}
			for i, q := range parts.peaks.XYs {
				pk := parts.marked[i]
				above := q.Y > pk.Power
				if q.X != pk.FreqPerDay || above != (c.method == reduce.MethodLS) || q.Y < p.Y.Min || q.Y > p.Y.Max {
					t.Errorf("peak %d (%+v) marked at %v: want it above a GLS peak, below a PDM dip, inside the plot", i+1, pk, q)
				}
				if parts.labels.Labels[i] != strconv.Itoa(i+1) {
					t.Errorf("peak %d labelled %q", i+1, parts.labels.Labels[i])
				}
			}
			// The period scale: each label is the period at its frequency.
			if len(parts.periods.ticks) < 5 {
				t.Errorf("%d period ticks", len(parts.periods.ticks))
			}
			for i, tk := range parts.periods.ticks {
				per, err := strconv.ParseFloat(tk.Label, 64)
				if err != nil || math.Abs(1/per-tk.Value) > 1e-12 || tk.Value < p.X.Min || tk.Value > p.X.Max {
					t.Errorf("period tick %q at %v c/d (1/P = %v), axis [%v, %v]", tk.Label, tk.Value, 1/per, p.X.Min, p.X.Max)
				}
				if i > 0 && tk.Value-parts.periods.ticks[i-1].Value < 0.06*(p.X.Max-p.X.Min)-1e-12 {
					t.Errorf("period ticks %q and %q crowd", parts.periods.ticks[i-1].Label, tk.Label)
				}
			}
			keyOutside(t, c.method, p, 0)
		})
	}
}

func TestPeriodogramBadInput(t *testing.T) {
	r := methods60Search(t, reduce.MethodLS)
	noMethod := r
	noMethod.Method = ""
	short := r
	short.Power = r.Power[:10]
	badWindow := r
	badWindow.Window = r.Window[:10]
	allNaN := r
	allNaN.Power = make([]float64, len(r.Freqs))
	for i := range allNaN.Power {
		allNaN.Power[i] = math.NaN()
	}
	for _, c := range []struct {
		name string
		r    reduce.PeriodResult
		want string
	}{
		{"no method", noMethod, `method ""`},
		{"powers short", short, "10 powers"},
		{"window short", badWindow, "10 window values"},
		{"no finite power", allNaN, "finite powers"},
		{"empty", reduce.PeriodResult{Method: reduce.MethodPDM}, "0 frequencies"},
	} {
		p, err := Periodogram(PeriodogramData{Result: c.r}, DefaultPalette())
		if err == nil || p != nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: plot %v, error %v: want an error naming %q", c.name, p != nil, err, c.want)
		}
	}
}

// TestEnvelope: a long curve thinned keeps its order, its extremes and
// only points of its own, at most two per run.
func TestEnvelope(t *testing.T) {
	const n, runs = 1_000_003, 5000
	xys := make(plotter.XYs, n)
	rng := rand.New(rand.NewPCG(9, 10))
	imax, imin := 0, 0
	for i := range xys {
		xys[i] = plotter.XY{X: float64(i) * 1e-3, Y: rng.Float64()}
		if xys[i].Y > xys[imax].Y {
			imax = i
		}
		if xys[i].Y < xys[imin].Y {
			imin = i
		}
	}
	got := envelope(xys, runs)
	if len(got) > 2*runs || len(got) < runs {
		t.Errorf("%d points kept, want %d to %d", len(got), runs, 2*runs)
	}
	seenMax, seenMin := false, false
	for i, q := range got {
		k := int(math.Round(q.X * 1e3))
		if k < 0 || k >= n || xys[k] != q {
			t.Errorf("point %d %v is not one of the curve's", i, q)
			break
		}
		if i > 0 && !(q.X > got[i-1].X) {
			t.Errorf("points %d and %d out of order: %v, %v", i-1, i, got[i-1], q)
			break
		}
		seenMax, seenMin = seenMax || k == imax, seenMin || k == imin
	}
	if !seenMax || !seenMin {
		t.Errorf("highest point kept %v, lowest %v: want both", seenMax, seenMin)
	}
	if short := xys[:2*runs]; len(envelope(short, runs)) != len(short) {
		t.Errorf("a curve of %d points thinned, want it whole", len(short))
	}
}
