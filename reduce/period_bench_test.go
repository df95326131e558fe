package reduce

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
)

// periodBenchCurve returns n uneven points of a 0.3137-day pulsator
// observed on about 2/3 of `nights` nights, 3–6 hours a night, with
// per-point errors (weights), on JDs from 2460000.5.
func periodBenchCurve(n, nights int) []Point {
	r := rand.New(rand.NewPCG(2026, uint64(n)))
	var on []int
	for night := range nights {
		if r.Float64() < 0.67 {
			on = append(on, night)
		}
	}
	pts := make([]Point, n)
	for i := range pts {
		night := on[r.IntN(len(on))]
		t := 2460000.5 + float64(night) + 0.05 + r.Float64()*(0.125+0.125*r.Float64())
		e := 0.005 + 0.02*r.Float64()
		pts[i] = Point{T: t, Mag: 12 + 0.2*math.Sin(2*math.Pi*t/0.3137) + e*r.NormFloat64(), Err: e}
	}
	return pts
}

// periodBenchGrid returns nf frequencies from one peak width, 1/(5T) apart.
func periodBenchGrid(pts []Point, nf int) FreqGrid {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, p := range pts {
		lo, hi = min(lo, p.T), max(hi, p.T)
	}
	step := 1 / (5 * (hi - lo))
	return FreqGrid{Start: step, Step: step, N: nf}
}

// BenchmarkLombScargle10k is the exact generalised Lomb–Scargle
// periodogram of 10,000 uneven points (about 1000 nights) over 100,000
// frequencies (0.0002 to 20 cycles per day).
func BenchmarkLombScargle10k(b *testing.B) {
	pts := periodBenchCurve(10_000, 1000)
	grid := periodBenchGrid(pts, 100_000)
	ctx := context.Background()
	b.ReportAllocs()
	for b.Loop() {
		if _, _, err := LombScargle(ctx, pts, grid, nil); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkLombScargle covers several sizes, points × frequencies.
func BenchmarkLombScargle(b *testing.B) {
	ctx := context.Background()
	for _, sz := range []struct{ n, nf int }{{1000, 10_000}, {10_000, 10_000}, {1000, 1_000_000}, {100_000, 100_000}} {
		pts := periodBenchCurve(sz.n, 1000)
		grid := periodBenchGrid(pts, sz.nf)
		b.Run(fmt.Sprintf("N=%d/K=%d", sz.n, sz.nf), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, _, err := LombScargle(ctx, pts, grid, nil); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkPDM10k is Stellingwerf's θ for the same 10,000 points over the
// same 100,000 frequencies, 10 bins, no covers.
func BenchmarkPDM10k(b *testing.B) {
	pts := periodBenchCurve(10_000, 1000)
	grid := periodBenchGrid(pts, 100_000)
	ctx := context.Background()
	b.ReportAllocs()
	for b.Loop() {
		if _, err := PDM(ctx, pts, grid, 10, 1, nil); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkPeriodogram10k is the whole search the window runs: the GLS
// periodogram, its window, ten refined peaks and the FAP.
func BenchmarkPeriodogram10k(b *testing.B) {
	pts := periodBenchCurve(10_000, 1000)
	ctx := context.Background()
	s := PeriodSearch{MinPeriod: 0.05, MaxPeriod: 100}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Periodogram(ctx, pts, s); err != nil {
			b.Fatal(err)
		}
	}
}
