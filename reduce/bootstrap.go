package reduce

import (
	"math"
	"math/rand/v2"
	"slices"
)

// timingBootstrapStream is the second word of the PCG state, fixed so that
// ExtremumOptions.Seed alone decides the resamples.
const timingBootstrapStream = 0x76696769_6c54696d

// timingBootstrap draws nboot resamples of n cases with replacement (Efron
// 1979, Ann. Stat. 7, 1; "bootstrapping pairs", Efron & Tibshirani 1993,
// ch. 9), hands each to estimate as sorted indices, and returns the sample
// standard deviation of the estimates that succeeded, their number and the
// number that failed. The draws come from a PCG generator seeded with seed,
// so the result is repeatable. sd is NaN when fewer than half the resamples
// (or fewer than 2) succeed.
func timingBootstrap(n, nboot int, seed uint64, estimate func(idx []int) (float64, bool)) (sd float64, ok, failed int) {
	rng := rand.New(rand.NewPCG(seed, timingBootstrapStream))
	idx := make([]int, n)
	// Welford's running mean and variance.
	mean, m2 := 0.0, 0.0
	for range nboot {
		for i := range idx {
			idx[i] = rng.IntN(n)
		}
		slices.Sort(idx)
		v, good := estimate(idx)
		if !good || math.IsNaN(v) || math.IsInf(v, 0) {
			failed++
			continue
		}
		ok++
		d := v - mean
		mean += d / float64(ok)
		m2 += d * (v - mean)
	}
	if ok < 2 || 2*ok < nboot {
		return math.NaN(), ok, failed
	}
	return math.Sqrt(m2 / float64(ok-1)), ok, failed
}
