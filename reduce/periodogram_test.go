package reduce

import (
	"context"
	"encoding/csv"
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// periodRefDir holds the tables made by testdata/period/make_reference.py.
var periodRefDir = filepath.Join("..", "testdata", "period")

// readPeriodTable reads a reference CSV ('#' comments, one header row) into
// columns by name; empty cells are NaN and non-numeric cells are kept as
// text in strs.
func readPeriodTable(t *testing.T, name string) (cols map[string][]float64, strs map[string][]string) {
	t.Helper()
	f, err := os.Open(filepath.Join(periodRefDir, name))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.Comment = '#'
	rows, err := r.ReadAll()
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	if len(rows) < 2 {
		t.Fatalf("%s: no data rows", name)
	}
	cols = map[string][]float64{}
	strs = map[string][]string{}
	for _, row := range rows[1:] {
		for i, h := range rows[0] {
			strs[h] = append(strs[h], row[i])
			v := math.NaN()
			if row[i] != "" {
				if x, err := strconv.ParseFloat(row[i], 64); err == nil {
					v = x
				}
			}
			cols[h] = append(cols[h], v)
		}
	}
	return cols, strs
}

// readPeriodCurve reads testdata/period/data_<name>.csv as points.
func readPeriodCurve(t *testing.T, name string) []Point {
	t.Helper()
	c, _ := readPeriodTable(t, "data_"+name+".csv")
	pts := make([]Point, len(c["time"]))
	for i := range pts {
		pts[i] = Point{T: c["time"][i], Mag: c["mag"][i], Err: c["err"][i]}
	}
	return pts
}

// periodMethods60 is the N = 60 series of methods.md §12: t_i = ⌊i/6⌋ + 0.25 +
// 0.04 (i mod 6), y_i = 10 + 0.30 sin(2π t_i/0.6) + 0.01((37 i mod 17) − 8)/8.
func periodMethods60() []Point {
	pts := make([]Point, 60)
	for i := range pts {
		t := float64(i/6) + 0.25 + 0.04*float64(i%6)
		pts[i] = Point{T: t, Mag: 10 + 0.30*math.Sin(2*math.Pi*t/0.6) + 0.01*float64((37*i%17)-8)/8, Err: math.NaN()}
	}
	return pts
}

func TestPeriodSearchGrid(t *testing.T) {
	pts := periodMethods60() // span 9.2 d, median spacing 0.04 d
	cases := []struct {
		name      string
		s         PeriodSearch
		wantStart float64
		wantEnd   float64
		wantN     int
	}{
		// 1/20 … 1/0.2 c/d with step ≤ 1/(5·9.2): ⌈4.95·46⌉ + 1 = 229 + 1.
		{"oversample 5", PeriodSearch{MinPeriod: 0.2, MaxPeriod: 20}, 0.05, 5, 229},
		{"oversample 10", PeriodSearch{MinPeriod: 0.2, MaxPeriod: 20, Oversample: 10}, 0.05, 5, 457},
		{"NFreq override", PeriodSearch{MinPeriod: 0.2, MaxPeriod: 20, NFreq: 9901}, 0.05, 5, 9901},
		// Defaults: max period = span 9.2 d, min period = 2 × 0.04 d.
		{"defaults", PeriodSearch{}, 1 / 9.2, 1 / 0.08, int(math.Ceil((1/0.08-1/9.2)*5*9.2)) + 1},
	}
	const freqTol = 1e-12 // cycles per day
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			g, err := tc.s.Grid(pts)
			if err != nil {
				t.Fatal(err)
			}
			if g.N != tc.wantN || math.Abs(g.Start-tc.wantStart) > freqTol || math.Abs(g.Freq(g.N-1)-tc.wantEnd) > freqTol {
				t.Errorf("grid %g + k·%g, k < %d (ends %g); want %g … %g in %d", g.Start, g.Step, g.N, g.Freq(g.N-1), tc.wantStart, tc.wantEnd, tc.wantN)
			}
			if over := tc.s.Oversample; tc.s.NFreq == 0 {
				if over == 0 {
					over = DefaultOversample
				}
				if g.Step > 1/(over*9.2)*(1+1e-12) {
					t.Errorf("step %g is coarser than 1/(%g·T) = %g", g.Step, over, 1/(over*9.2))
				}
			}
		})
	}
}

func TestPeriodSearchBadInput(t *testing.T) {
	good := periodMethods60()
	with := func(i int, p Point) []Point {
		pts := append([]Point(nil), good...)
		pts[i] = p
		return pts
	}
	flat := append([]Point(nil), good...)
	for i := range flat {
		flat[i].Mag = 10.5
	}
	sameT := append([]Point(nil), good...)
	for i := range sameT {
		sameT[i].T = 2460000.5
	}
	cases := []struct {
		name string
		pts  []Point
		s    PeriodSearch
		want string // part of the error message
	}{
		{"no points", nil, PeriodSearch{}, "at least 5 points, got 0"},
		{"four points", good[:4], PeriodSearch{}, "at least 5 points, got 4"},
		{"NaN time", with(7, Point{T: math.NaN(), Mag: 10}), PeriodSearch{}, "point 7: time NaN"},
		{"infinite time", with(3, Point{T: math.Inf(1), Mag: 10}), PeriodSearch{}, "point 3: time +Inf"},
		{"NaN magnitude", with(9, Point{T: 1, Mag: math.NaN()}), PeriodSearch{}, "point 9: mag NaN"},
		{"negative error", with(2, Point{T: 1, Mag: 10, Err: -0.01}), PeriodSearch{}, "point 2: err -0.01"},
		{"infinite error", with(2, Point{T: 1, Mag: 10, Err: math.Inf(1)}), PeriodSearch{}, "point 2: err +Inf"},
		{"all times equal", sameT, PeriodSearch{}, "all 60 times are 2.4600005e+06"},
		{"all magnitudes equal", flat, PeriodSearch{}, "all 60 magnitudes are 10.5"},
		{"min period ≥ max", good, PeriodSearch{MinPeriod: 2, MaxPeriod: 1}, "min period 2 ≥ max period 1"},
		{"min period = max", good, PeriodSearch{MinPeriod: 1, MaxPeriod: 1}, "min period 1 ≥ max period 1"},
		{"negative min period", good, PeriodSearch{MinPeriod: -1, MaxPeriod: 1}, "min period -1"},
		{"NaN max period", good, PeriodSearch{MinPeriod: 1, MaxPeriod: math.NaN()}, "max period NaN"},
		{"grid too large", good, PeriodSearch{MinPeriod: 1e-6, MaxPeriod: 10}, "more than 10000000"},
		{"NFreq too large", good, PeriodSearch{MinPeriod: 0.1, MaxPeriod: 10, NFreq: MaxFreqs + 1}, "frequency count 10000001"},
		{"NFreq one", good, PeriodSearch{MinPeriod: 0.1, MaxPeriod: 10, NFreq: 1}, "frequency count 1"},
		{"oversample below 1", good, PeriodSearch{MinPeriod: 0.1, MaxPeriod: 10, Oversample: 0.5}, "oversampling 0.5"},
		{"unknown method", good, PeriodSearch{Method: "fft", MinPeriod: 0.1, MaxPeriod: 10}, `method "fft"`},
		{"negative peak count", good, PeriodSearch{MinPeriod: 0.1, MaxPeriod: 10, NPeaks: -2}, "peak count -2"},
		{"PDM one bin", good, PeriodSearch{Method: MethodPDM, MinPeriod: 0.1, MaxPeriod: 10, Bins: 1}, "PDM bins 1"},
		{"PDM bins ≥ points", good, PeriodSearch{Method: MethodPDM, MinPeriod: 0.1, MaxPeriod: 10, Bins: 60}, "PDM bins 60"},
		{"PDM covers", good, PeriodSearch{Method: MethodPDM, MinPeriod: 0.1, MaxPeriod: 10, Covers: 11}, "PDM covers 11"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Periodogram(context.Background(), tc.pts, tc.s)
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("Periodogram error %v; want one containing %q", err, tc.want)
			}
		})
	}
}

func TestFreqGridBadInput(t *testing.T) {
	pts := periodMethods60()
	cases := []struct {
		name string
		g    FreqGrid
		want string
	}{
		{"empty", FreqGrid{Start: 1, Step: 0.1, N: 0}, "grid of 0 frequencies"},
		{"too many", FreqGrid{Start: 1, Step: 0.1, N: MaxFreqs + 1}, "grid of 10000001 frequencies"},
		{"negative start", FreqGrid{Start: -1, Step: 0.1, N: 10}, "start -1"},
		{"zero step", FreqGrid{Start: 1, Step: 0, N: 10}, "step 0"},
		{"NaN step", FreqGrid{Start: 1, Step: math.NaN(), N: 10}, "step NaN"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			ctx := context.Background()
			_, _, err1 := LombScargle(ctx, pts, tc.g, nil)
			_, err2 := PDM(ctx, pts, tc.g, 10, 1, nil)
			_, err3 := SpectralWindow(ctx, pts, tc.g)
			for i, err := range []error{err1, err2, err3} {
				if err == nil || !strings.Contains(err.Error(), tc.want) {
					t.Errorf("call %d: error %v; want one containing %q", i, err, tc.want)
				}
			}
		})
	}
}

func TestFindPeaks(t *testing.T) {
	g := FreqGrid{Start: 1, Step: 0.1, N: 12}
	power := []float64{0.5, 0.1, 0.3, 0.2, 0.9, 0.85, 0.2, 0.4, 0.35, 0.1, 0.2, math.NaN()}
	cases := []struct {
		name  string
		lower bool
		sep   float64
		n     int
		want  []float64 // frequencies, best first
	}{
		// Maxima: 0.9 at k=4, 0.5 at k=0 (edge), 0.4 at k=7, 0.3 at k=2, 0.2 at k=10.
		{"maxima", false, 0.05, 10, []float64{1.4, 1.0, 1.7, 1.2, 2.0}},
		{"maxima, at most 2", false, 0.05, 2, []float64{1.4, 1.0}},
		// With sep 0.25 the maxima at 1.2 (0.2 from 1.4) and 1.0 (kept; 0.4 away) …
		{"maxima, separated", false, 0.25, 10, []float64{1.4, 1.0, 1.7, 2.0}},
		// Minima: 0.1 at k=1, 0.1 at k=9, 0.2 at k=3, 0.2 at k=6.
		{"minima", true, 0.05, 10, []float64{1.1, 1.9, 1.3, 1.6}},
	}
	const tol = 1e-12
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			got := findPeaks(g, power, tc.n, tc.sep, tc.lower)
			var gotF []float64
			for _, p := range got {
				gotF = append(gotF, p.FreqPerDay)
				if math.Abs(p.PeriodDays*p.FreqPerDay-1) > tol {
					t.Errorf("peak at %g c/d has period %g d", p.FreqPerDay, p.PeriodDays)
				}
			}
			ok := len(gotF) == len(tc.want)
			for i := 0; ok && i < len(gotF); i++ {
				ok = math.Abs(gotF[i]-tc.want[i]) < tol
			}
			if !ok {
				t.Errorf("peaks at %v; want %v", gotF, tc.want)
			}
		})
	}
}

// TestBaluevFAPAgainstAstropy compares BaluevFAP with astropy's
// false_alarm_probability(method='baluev') on the same light curves
// (testdata/period/fap.csv, made by make_reference.py).
func TestBaluevFAPAgainstAstropy(t *testing.T) {
	const relTol = 1e-9 // both evaluate the same closed form in float64
	c, s := readPeriodTable(t, "fap.csv")
	for i, name := range s["name"] {
		// astropy moves fmax onto its own grid; compare at the value it used.
		z, fmax, want := c["z"][i], c["fmax_used"][i], c["fap"][i]
		t.Run(fmt.Sprintf("%s z=%.4g", name, z), func(t *testing.T) {
			got, err := BaluevFAP(readPeriodCurve(t, name), z, fmax)
			if err != nil {
				t.Fatal(err)
			}
			if d := math.Abs(got-want) / want; !(d <= relTol) {
				t.Errorf("BaluevFAP(z=%g, fmax=%g) = %.10g, astropy %.10g, relative diff %.2g, tol %.0g", z, fmax, got, want, d, relTol)
			}
		})
	}
	if _, err := BaluevFAP(periodMethods60(), 1.5, 5); err == nil {
		t.Errorf("BaluevFAP(z=1.5): no error")
	}
	if _, err := BaluevFAP(periodMethods60(), 0.5, 0); err == nil {
		t.Errorf("BaluevFAP(fmax=0): no error")
	}
}

// TestPeriodogramMethodsAliases runs the whole search on the methods.md §12
// grid, 0.05–5 c/d in steps of 0.0005 (methods.md §12 [C], GLS also
// astropy [A]): the maximum at 1.6665 c/d, refined to 1.666590 c/d
// (P = 0.600028 d), then the 1 c/d aliases 2.6655, 0.6675 and 3.6655.
func TestPeriodogramMethodsAliases(t *testing.T) {
	res, err := Periodogram(context.Background(), periodMethods60(), PeriodSearch{MinPeriod: 0.2, MaxPeriod: 20, NFreq: 9901})
	if err != nil {
		t.Fatal(err)
	}
	const (
		refinedTol = 1e-6   // c/d: methods.md quotes 6 decimals
		gridTol    = 1e-9   // c/d: grid frequencies
		powerTol   = 5e-5   // methods.md quotes the alias powers to 4 decimals
		bestTol    = 1.5e-6 // methods.md quotes 0.999169 at 1.6665 (6 decimals)
	)
	if d := math.Abs(res.Best.FreqPerDay - 1.666590); d > refinedTol {
		t.Errorf("best frequency %.7f c/d, want 1.666590, diff %.2g, tol %.0g", res.Best.FreqPerDay, d, refinedTol)
	}
	if d := math.Abs(res.Best.PeriodDays - 0.600028); d > refinedTol {
		t.Errorf("best period %.7f d, want 0.600028, diff %.2g, tol %.0g", res.Best.PeriodDays, d, refinedTol)
	}
	k := int(math.Round((1.6665 - res.Grid.Start) / res.Grid.Step))
	if d := math.Abs(res.Power[k] - 0.999169); d > bestTol {
		t.Errorf("grid power at 1.6665 c/d %.7f, want 0.999169, diff %.2g, tol %.1g", res.Power[k], d, bestTol)
	}
	aliases := []struct{ f, p float64 }{{2.6655, 0.8308}, {0.6675, 0.8253}, {3.6655, 0.4611}}
	if len(res.Peaks) < 1+len(aliases) {
		t.Fatalf("%d peaks, want at least %d", len(res.Peaks), 1+len(aliases))
	}
	for i, a := range aliases {
		pk := res.Peaks[i+1]
		// The refined alias lies within one grid step of the grid peak.
		if d := math.Abs(pk.FreqPerDay - a.f); d > res.Grid.Step+gridTol {
			t.Errorf("peak %d at %.5f c/d, want %.4f (methods.md §12), diff %.2g", i+1, pk.FreqPerDay, a.f, d)
		}
		if d := pk.Power - a.p; d < -powerTol || d > 2e-3 {
			t.Errorf("peak %d power %.5f, want %.4f or slightly above (refined off the grid), diff %.2g", i+1, pk.Power, a.p, d)
		}
	}
	if !(res.FAP >= 0 && res.FAP < 1e-50) {
		t.Errorf("FAP of a 0.9992 peak from 60 points = %g, want a tiny probability", res.FAP)
	}
	if res.Method != MethodLS || len(res.Freqs) != 9901 || len(res.Power) != 9901 || len(res.Window) != 9901 {
		t.Errorf("method %q, %d freqs, %d powers, %d window values; want ls and 9901 each", res.Method, len(res.Freqs), len(res.Power), len(res.Window))
	}
}

// TestPeriodogramRecoversKnownPeriod builds a gappy nightly light curve of
// a star with a known period and checks both methods give it back.
func TestPeriodogramRecoversKnownPeriod(t *testing.T) {
	const period = 0.43217 // days
	pts := periodNightly(800, 120, period, 0.2, 0.02, 11)
	for _, method := range []string{MethodLS, MethodPDM} {
		t.Run(method, func(t *testing.T) {
			res, err := Periodogram(context.Background(), pts, PeriodSearch{Method: method, MinPeriod: 0.1, MaxPeriod: 10})
			if err != nil {
				t.Fatal(err)
			}
			// Within a tenth of a peak width 1/T (T ≈ 120 d) in frequency.
			tol := 0.1 / 120.0
			if d := math.Abs(res.Best.FreqPerDay - 1/period); d > tol {
				t.Errorf("best frequency %.6f c/d, want %.6f, diff %.2g, tol %.2g", res.Best.FreqPerDay, 1/period, d, tol)
			}
			if len(res.Peaks) < 5 {
				t.Errorf("%d peaks, want at least 5", len(res.Peaks))
			}
		})
	}
}

func TestPeriodogramProgressAndCancel(t *testing.T) {
	pts := periodNightly(300, 40, 0.3, 0.1, 0.01, 5)
	for _, method := range []string{MethodLS, MethodPDM} {
		t.Run(method, func(t *testing.T) {
			var calls, last, total int
			monotonic := true
			_, err := Periodogram(context.Background(), pts, PeriodSearch{Method: method, MinPeriod: 0.05, MaxPeriod: 40,
				Progress: func(done, tot int) {
					calls++
					if done < last {
						monotonic = false
					}
					last, total = done, tot
				}})
			if err != nil {
				t.Fatal(err)
			}
			if calls < 2 || last != total || !monotonic {
				t.Errorf("progress: %d calls, last %d of %d, monotonic %v; want ≥ 2 calls ending at the total", calls, last, total, monotonic)
			}
			ctx, cancel := context.WithCancel(context.Background())
			cancel()
			if _, err := Periodogram(ctx, pts, PeriodSearch{Method: method, MinPeriod: 0.05, MaxPeriod: 40}); !errors.Is(err, context.Canceled) {
				t.Errorf("cancelled search: error %v, want context.Canceled", err)
			}
			// Cancel from the progress callback, part-way.
			ctx, cancel = context.WithCancel(context.Background())
			defer cancel()
			_, err = Periodogram(ctx, pts, PeriodSearch{Method: method, MinPeriod: 0.01, MaxPeriod: 40, NFreq: 3_000_000,
				Progress: func(done, tot int) {
					if done > 0 {
						cancel()
					}
				}})
			if !errors.Is(err, context.Canceled) {
				t.Errorf("search cancelled from progress: error %v, want context.Canceled", err)
			}
		})
	}
}

func ExamplePeriodogram() {
	// The synthetic series of methods.md §12: 60 points over 10 nights of
	// a 0.6-day sinusoid.
	var pts []Point
	for i := range 60 {
		t := float64(i/6) + 0.25 + 0.04*float64(i%6)
		pts = append(pts, Point{T: t, Mag: 10 + 0.30*math.Sin(2*math.Pi*t/0.6) + 0.01*float64((37*i%17)-8)/8})
	}
	res, err := Periodogram(context.Background(), pts, PeriodSearch{MinPeriod: 0.2, MaxPeriod: 20, NFreq: 9901})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("best period %.6f d, power %.6f\n", res.Best.PeriodDays, res.Best.Power)
	for _, p := range res.Peaks[1:4] {
		fmt.Printf("alias %.4f c/d, power %.4f\n", p.FreqPerDay, p.Power)
	}
	// Output:
	// best period 0.600028 d, power 0.999172
	// alias 2.6655 c/d, power 0.8308
	// alias 0.6677 c/d, power 0.8253
	// alias 3.6656 c/d, power 0.4611
}

func ExampleBaluevFAP() {
	// How likely is noise alone to give a GLS peak of power 0.3 in a search
	// up to 5 cycles per day of the 60 times of methods.md §12?
	var pts []Point
	for i := range 60 {
		t := float64(i/6) + 0.25 + 0.04*float64(i%6)
		pts = append(pts, Point{T: t, Mag: 10 + 0.30*math.Sin(2*math.Pi*t/0.6) + 0.01*float64((37*i%17)-8)/8})
	}
	for _, z := range []float64{0.3, 0.5} {
		fap, err := BaluevFAP(pts, z, 5)
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("FAP(%.1f) = %.3g\n", z, fap)
	}
	// Output:
	// FAP(0.3) = 0.00689
	// FAP(0.5) = 7.22e-07
}
