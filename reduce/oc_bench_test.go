package reduce

import (
	"fmt"
	"math"
	"testing"
)

// ocBenchTimings returns n timings of a quadratic ephemeris with noise and σ.
func ocBenchTimings(n int) []Timing {
	noise := timingTestNoise(1)
	tm := make([]Timing, n)
	for i := range tm {
		e := float64(i) * 20000 / float64(n)
		e = math.Round(e)
		tm[i] = Timing{Time: 2450000.0 + 0.4*e + 2e-10*e*e + 0.0005*noise(), Sigma: 0.0005}
	}
	return tm
}

// BenchmarkOCFit10k is the goal of the issue: O−C rows, linear and quadratic
// fits and the F-test on 10,000 timings in under 10 ms.
func BenchmarkOCFit10k(b *testing.B) {
	tm := ocBenchTimings(10000)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := OC(ocLinearEph, tm, OCOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkOCFit(b *testing.B) {
	for _, n := range []int{100, 1000, 10000, 100000} {
		tm := ocBenchTimings(n)
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := OC(ocLinearEph, tm, OCOptions{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkExtremumBootstrap times one extremum with 1000 bootstrap
// resamples on a 200-point light curve (the eclipse of methods.md §10,
// sampled 0.0006 d apart, with noise).
func BenchmarkExtremumBootstrap(b *testing.B) {
	noise := timingTestNoise(2)
	pts := make([]Point, 200)
	for k := range pts {
		t := 2460000.3700 + 0.0006*float64(k)
		pts[k] = Point{T: t, Mag: 10 + 0.5*math.Exp(-math.Pow((t-eclipseT0)/0.02, 2)) + 0.005*noise(), Err: 0.005}
	}
	for _, m := range []ExtremumMethod{MethodPoly, MethodKvW} {
		b.Run(string(m), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Extremum(pts, ExtremumOptions{Kind: Minimum, Method: m, Bootstrap: 1000}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

func BenchmarkLightTime(b *testing.B) {
	tm, _ := ocReadTimings(b, "lighttime_circ.csv", true)
	a, err := OC(ltEphemeris, tm, OCOptions{})
	if err != nil {
		b.Fatal(err)
	}
	for _, ecc := range []bool{false, true} {
		b.Run(fmt.Sprintf("eccentric=%v", ecc), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := LightTime(a, LightTimeOptions{Eccentric: ecc}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
