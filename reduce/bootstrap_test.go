package reduce

import (
	"math"
	"testing"
)

func TestTimingBootstrapMean(t *testing.T) {
	// The bootstrap standard error of a sample mean tends, as the number of
	// resamples grows, to sqrt(Σ(x − x̄)²)/n (Efron & Tibshirani 1993, ch. 5
	// [from memory]; it follows from the variance of a draw with
	// replacement). With B = 4000 resamples the estimate scatters by about
	// 1/sqrt(2B) ≈ 1.1%; tolerance 4%.
	const relTol = 0.04
	x := make([]float64, 50)
	noise := timingTestNoise(7)
	mean := 0.0
	for i := range x {
		x[i] = 3 + 0.2*noise()
		mean += x[i] / float64(len(x))
	}
	ss := 0.0
	for _, v := range x {
		ss += (v - mean) * (v - mean)
	}
	want := math.Sqrt(ss) / float64(len(x))
	got, ok, failed := timingBootstrap(len(x), 4000, 11, func(idx []int) (float64, bool) {
		s := 0.0
		for _, i := range idx {
			s += x[i]
		}
		return s / float64(len(idx)), true
	})
	if ok != 4000 || failed != 0 {
		t.Errorf("resamples: %d good, %d failed, want 4000 and 0", ok, failed)
	}
	if d := got/want - 1; math.Abs(d) > relTol {
		t.Errorf("bootstrap SE of the mean = %.5f, want %.5f (rel diff %.3f, tol %g)", got, want, d, relTol)
	}
}

func TestTimingBootstrapFailures(t *testing.T) {
	// An estimate that fails whenever point 0 is drawn fails in about
	// 1 − (1 − 1/n)^n ≈ 63% of resamples: more than half, so no σ.
	sd, ok, failed := timingBootstrap(30, 500, 1, func(idx []int) (float64, bool) {
		return float64(idx[len(idx)-1]), idx[0] != 0
	})
	if !math.IsNaN(sd) {
		t.Errorf("σ = %v with %d of 500 resamples failed, want NaN", sd, failed)
	}
	if ok+failed != 500 || failed < 250 {
		t.Errorf("%d good + %d failed, want 500 with most failed", ok, failed)
	}
}
