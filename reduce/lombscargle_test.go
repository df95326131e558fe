package reduce

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"sync"
	"testing"
)

const (
	// lsPowerTol is the largest difference allowed between the fast GLS
	// power and the exact one (direct sums or astropy), at any frequency.
	lsPowerTol = 1e-6
	// lsDirectTol is the largest difference allowed between vigil's direct
	// sums and astropy's exact compiled sums: both are float64 evaluations
	// of the same least-squares power.
	lsDirectTol = 1e-9
	// lsWindowTol bounds the spectral window's difference from numpy's.
	lsWindowTol = 1e-10
)

// periodNightly returns n points of a sinusoid of the given period (days)
// and semi-amplitude (mag) observed on about 70% of `nights` nights, in a
// window of 3–6 hours each night, on JDs from 2460000.6, with errors of
// noise·(0.5 … 1.5) mag and Gaussian noise of that size.
func periodNightly(n, nights int, period, amp, noise float64, seed uint64) []Point {
	r := rand.New(rand.NewPCG(seed, 99))
	var on []int
	for night := range nights {
		if r.Float64() < 0.7 {
			on = append(on, night)
		}
	}
	pts := make([]Point, n)
	for i := range pts {
		night := on[r.IntN(len(on))]
		t := 2460000.6 + float64(night) + r.Float64()*(0.125+0.125*r.Float64())
		e := noise * (0.5 + r.Float64())
		pts[i] = Point{T: t, Mag: 12 + amp*math.Sin(2*math.Pi*t/period) + e*r.NormFloat64(), Err: e}
	}
	return pts
}

// periodUniform returns n points at uniform random times over span days
// from t0, with equal weights (Err NaN) unless weighted.
func periodUniform(n int, t0, span float64, weighted bool, seed uint64) []Point {
	r := rand.New(rand.NewPCG(seed, 7))
	pts := make([]Point, n)
	for i := range pts {
		t := t0 + span*r.Float64()
		e := math.NaN()
		if weighted {
			e = 0.01 + 0.05*r.Float64()
		}
		pts[i] = Point{T: t, Mag: 10 + 0.1*math.Sin(2*math.Pi*t*1.2345) + 0.05*r.NormFloat64(), Err: e}
	}
	return pts
}

// periodTrend returns n points at uniform random times over span days from t0,
// rising 1 mag over the span, with 0.02 mag of noise and equal weights: its
// power is near 1 at the lowest frequencies, where the fit is worst
// conditioned.
func periodTrend(n int, t0, span float64, seed uint64) []Point {
	r := rand.New(rand.NewPCG(seed, 3))
	pts := make([]Point, n)
	for i := range pts {
		x := r.Float64()
		pts[i] = Point{T: t0 + span*x, Mag: 11 + x + 0.02*r.NormFloat64(), Err: math.NaN()}
	}
	return pts
}

// TestGLSMethodsCheckValues: methods.md §12 [C], GLS also astropy [A].
func TestGLSMethodsCheckValues(t *testing.T) {
	const tol = 5e-7 // methods.md quotes 6 decimals
	cases := []struct {
		name string
		freq float64
		want float64
	}{
		{"f = 1/0.6", 1 / 0.6, 0.999170},
		{"f = 2/3 (alias)", 2.0 / 3, 0.824984},
		{"f = 8/3 (alias)", 8.0 / 3, 0.830447},
		{"f = 0.5", 0.5, 0.033177},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			got, err := LombScarglePower(periodMethods60(), tc.freq)
			if err != nil {
				t.Fatal(err)
			}
			if d := math.Abs(got - tc.want); d > tol {
				t.Errorf("p(%g) = %.7f, want %.6f (methods.md §12), diff %.2g, tol %.0g", tc.freq, got, tc.want, d, tol)
			}
		})
	}
}

var periodRefNames = []string{"methods60", "nightly", "highfreq", "lowfreq"}

// TestGLSDirectAgainstAstropy checks vigil's direct sums at every
// tabulated frequency (testdata/period/gls_*.csv) against numpy's SVD least
// squares (power_lstsq) to lsDirectTol, and against astropy's exact method
// to lsPowerTol: astropy's own sums lose up to 2e-7 where f·T ≪ 1.
func TestGLSDirectAgainstAstropy(t *testing.T) {
	for _, name := range periodRefNames {
		t.Run(name, func(t *testing.T) {
			d, err := newPeriodData(readPeriodCurve(t, name))
			if err != nil {
				t.Fatal(err)
			}
			ref, _ := readPeriodTable(t, "gls_"+name+".csv")
			var worstLSQ, worstAstropy float64
			for i, f := range ref["freq"] {
				got := d.glsDirect(f).power(d.yy)
				dl := math.Abs(got - ref["power_lstsq"][i])
				da := math.Abs(got - ref["power"][i])
				worstLSQ, worstAstropy = max(worstLSQ, dl), max(worstAstropy, da)
				if dl > lsDirectTol {
					t.Errorf("f = %.9g: direct %.12f, numpy least squares %.12f, diff %.2g, tol %.0g", f, got, ref["power_lstsq"][i], dl, lsDirectTol)
				}
				if da > lsPowerTol {
					t.Errorf("f = %.9g: direct %.12f, astropy %.12f, diff %.2g, tol %.0g", f, got, ref["power"][i], da, lsPowerTol)
				}
			}
			t.Logf("%d frequencies: max |direct − least squares| = %.2g, max |direct − astropy| = %.2g", len(ref["freq"]), worstLSQ, worstAstropy)
		})
	}
}

// TestLombScargleAgainstAstropy checks the fast periodogram against
// astropy's exact one on the reference grids.
func TestLombScargleAgainstAstropy(t *testing.T) {
	for _, name := range periodRefNames {
		t.Run(name, func(t *testing.T) {
			d, err := newPeriodData(readPeriodCurve(t, name))
			if err != nil {
				t.Fatal(err)
			}
			ref, _ := readPeriodTable(t, "gls_"+name+".csv")
			fr := ref["freq"]
			g := FreqGrid{Start: fr[0], Step: (fr[len(fr)-1] - fr[0]) / float64(len(fr)-1), N: len(fr)}
			// Force the fast path (no direct-sum shortcut for small grids).
			power, _, fallbacks, err := d.lsGrid(context.Background(), g, nil, false, 0, lsBlock)
			if err != nil {
				t.Fatal(err)
			}
			var worst, worstLSQ float64
			for i, want := range ref["power"] {
				diff := math.Abs(power[i] - want)
				dl := math.Abs(power[i] - ref["power_lstsq"][i])
				worst, worstLSQ = max(worst, diff), max(worstLSQ, dl)
				if diff > lsPowerTol || dl > lsPowerTol {
					t.Errorf("f = %.9g: fast %.9f, astropy %.9f (diff %.2g), least squares %.9f (diff %.2g), tol %.0g",
						fr[i], power[i], want, diff, ref["power_lstsq"][i], dl, lsPowerTol)
				}
			}
			t.Logf("%d frequencies (%d by direct sums): max |fast − astropy| = %.2g, max |fast − least squares| = %.2g",
				len(fr), fallbacks, worst, worstLSQ)
		})
	}
}

// TestLombScargleFastEqualsDirect compares the fast periodogram with
// direct sums at every frequency, over many kinds of sampling and grid.
func TestLombScargleFastEqualsDirect(t *testing.T) {
	cases := []struct {
		name  string
		pts   []Point
		grid  FreqGrid
		block int
	}{
		{"uniform random, equal weights", periodUniform(2000, 2459000.5, 50, false, 1),
			FreqGrid{Start: 0.004, Step: 0.004, N: 12500}, lsBlock},
		{"nightly gaps, weights, JD 2.46e6", periodNightly(2000, 200, 0.2345, 0.1, 0.02, 2),
			FreqGrid{Start: 0.001, Step: 0.001, N: 20000}, lsBlock},
		{"grid far from 0 (100–101 c/d)", periodUniform(1000, 2455000, 20, true, 3),
			FreqGrid{Start: 100, Step: 1e-4, N: 10001}, lsBlock},
		{"very high frequencies (1000–1010 c/d)", periodUniform(500, 2458000, 5, true, 4),
			FreqGrid{Start: 1000, Step: 0.001, N: 10001}, lsBlock},
		{"from near 0, ill conditioned (T = 1000 d)", periodUniform(500, 2450000, 1000, false, 5),
			FreqGrid{Start: 1e-7, Step: 2e-5, N: 5000}, lsBlock},
		{"strong trend from near 0, ill conditioned", periodTrend(1000, 2450000, 1000, 9),
			FreqGrid{Start: 1e-6, Step: 1e-5, N: 5000}, lsBlock},
		{"one night, many frequencies", periodUniform(100, 2460100.3, 0.3, true, 6),
			FreqGrid{Start: 1, Step: 0.01, N: 19901}, lsBlock},
		{"blocks of 7000, odd count", periodNightly(500, 60, 0.7, 0.05, 0.01, 7),
			FreqGrid{Start: 0.01, Step: 0.003, N: 30001}, 7000},
		{"six points", periodUniform(6, 2460000, 3, false, 8),
			FreqGrid{Start: 0.05, Step: 0.001, N: 40000}, lsBlock},
		// The whole problem of BenchmarkLombScargle10k (fine grid 2^17,
		// kernel width 20, FFT split into parts).
		{"benchmark size, 10000 points", periodBenchCurve(10_000, 1000),
			periodBenchGrid(periodBenchCurve(10_000, 1000), 100_000), lsBlock},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			d, err := newPeriodData(tc.pts)
			if err != nil {
				t.Fatal(err)
			}
			power, window, fallbacks, err := d.lsGrid(context.Background(), tc.grid, nil, false, 0, tc.block)
			if err != nil {
				t.Fatal(err)
			}
			checked := func(k int) bool {
				// -short: the worst-conditioned start and every 11th
				return !testing.Short() || k < 500 || k%11 == 0
			}
			// The direct sums, N·K sines and cosines, shared out between
			// the cores.
			want := make([]float64, tc.grid.N)
			wantW := make([]float64, tc.grid.N)
			var wg sync.WaitGroup
			workers := runtime.GOMAXPROCS(0)
			for part := range workers {
				wg.Go(func() {
					for k := part; k < tc.grid.N; k += workers {
						if checked(k) {
							s := d.glsDirect(tc.grid.Freq(k))
							want[k], wantW[k] = s.power(d.yy), s.win
						}
					}
				})
			}
			wg.Wait()
			var worst, worstW float64
			bad := 0
			for k := range tc.grid.N {
				if !checked(k) {
					continue
				}
				f := tc.grid.Freq(k)
				diff := math.Abs(power[k] - want[k])
				worst = max(worst, diff)
				worstW = max(worstW, math.Abs(window[k]-wantW[k]))
				if diff > lsPowerTol && bad < 10 {
					bad++
					t.Errorf("f = %.9g: fast %.9f, direct %.9f, diff %.2g, tol %.0g", f, power[k], want[k], diff, lsPowerTol)
				}
			}
			if worstW > lsWindowTol {
				t.Errorf("max window difference %.2g, tol %.0g", worstW, lsWindowTol)
			}
			t.Logf("N=%d K=%d: max |fast − direct| = %.2g (window %.2g), %d frequencies by direct sums",
				len(tc.pts), tc.grid.N, worst, worstW, fallbacks)
		})
	}
}

// TestSpectralWindowAgainstNumpy compares the window of the nightly
// reference light curve with numpy's (testdata/period/window_nightly.csv):
// 1 at f = 0 and peaks near 1, 2, 3 c/d.
func TestSpectralWindowAgainstNumpy(t *testing.T) {
	ref, _ := readPeriodTable(t, "window_nightly.csv")
	fr := ref["freq"]
	g := FreqGrid{Start: fr[0], Step: (fr[len(fr)-1] - fr[0]) / float64(len(fr)-1), N: len(fr)}
	got, err := SpectralWindow(context.Background(), readPeriodCurve(t, "nightly"), g)
	if err != nil {
		t.Fatal(err)
	}
	for i, want := range ref["window"] {
		if d := math.Abs(got[i] - want); d > lsWindowTol {
			t.Errorf("W(%g) = %.12f, numpy %.12f, diff %.2g, tol %.0g", fr[i], got[i], want, d, lsWindowTol)
		}
	}
	if math.Abs(got[0]-1) > lsWindowTol {
		t.Errorf("W(0) = %.12f, want 1", got[0])
	}
}

// TestGLSDegenerate checks the singular cases against an independent
// least-squares fit: daily sampling at f = 0.5 c/d, where cos ωt = ±1 and
// sin ωt = 0, so the only regressor is (−1)^t and p is the R² of
// y = a + b·(−1)^t; and f = 0, where nothing can be fitted.
func TestGLSDegenerate(t *testing.T) {
	var pts []Point
	var sp, sm, np, nm float64
	for i := range 40 {
		y := 10 + 0.1*float64(i%7) + 0.05*float64(1-2*(i%2))
		pts = append(pts, Point{T: 2460000 + float64(i), Mag: y})
		if i%2 == 0 {
			sp, np = sp+y, np+1
		} else {
			sm, nm = sm+y, nm+1
		}
	}
	// R² of the two-group fit: between-group over total sum of squares.
	mean := (sp + sm) / (np + nm)
	var tss float64
	for _, p := range pts {
		tss += (p.Mag - mean) * (p.Mag - mean)
	}
	bss := np*(sp/np-mean)*(sp/np-mean) + nm*(sm/nm-mean)*(sm/nm-mean)
	const tol = 1e-12
	cases := []struct {
		name string
		freq float64
		want float64
	}{
		{"f = 0", 0, 0},
		{"f = 0.5 c/d, daily sampling", 0.5, bss / tss},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			got, err := LombScarglePower(pts, tc.freq)
			if err != nil {
				t.Fatal(err)
			}
			if d := math.Abs(got - tc.want); !(d <= tol) {
				t.Errorf("p(%g) = %.15f, want %.15f, diff %.2g, tol %.0g", tc.freq, got, tc.want, d, tol)
			}
		})
	}
}

func ExampleLombScarglePower() {
	// methods.md §12: 60 points of a 0.6-day sinusoid over 10 nights; the
	// power at 1/0.6 c/d and at a 1 c/d alias.
	var pts []Point
	for i := range 60 {
		t := float64(i/6) + 0.25 + 0.04*float64(i%6)
		pts = append(pts, Point{T: t, Mag: 10 + 0.30*math.Sin(2*math.Pi*t/0.6) + 0.01*float64((37*i%17)-8)/8})
	}
	for _, f := range []float64{1 / 0.6, 8.0 / 3} {
		p, err := LombScarglePower(pts, f)
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("p(%.4f c/d) = %.6f\n", f, p)
	}
	// Output:
	// p(1.6667 c/d) = 0.999170
	// p(2.6667 c/d) = 0.830447
}

func ExampleLombScargle() {
	// A star with a 0.25-day period seen on 30 nights; the power peaks at
	// 4 cycles per day and the spectral window at 1 cycle per day.
	var pts []Point
	for night := range 30 {
		for k := range 8 {
			t := 2460000.6 + float64(night) + 0.02*float64(k) + 0.001*float64(night%3)
			pts = append(pts, Point{T: t, Mag: 12 + 0.2*math.Sin(2*math.Pi*t/0.25) + 0.01*math.Cos(float64(7*night+k))})
		}
	}
	grid := FreqGrid{Start: 0.01, Step: 0.005, N: 1999} // 0.01 … 10 c/d
	power, window, err := LombScargle(context.Background(), pts, grid, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	best, wpeak := 0, 0
	for k := range power {
		if power[k] > power[best] {
			best = k
		}
		if f := grid.Freq(k); f > 0.5 && f < 1.5 && window[k] > window[wpeak] {
			wpeak = k
		}
	}
	fmt.Printf("best %.3f c/d, power %.4f; window peak at %.3f c/d\n", grid.Freq(best), power[best], grid.Freq(wpeak))
	// Output:
	// best 4.000 c/d, power 0.9952; window peak at 1.000 c/d
}
