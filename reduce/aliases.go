package reduce

import (
	"cmp"
	"fmt"
	"math"
	"slices"
)

// SiderealDaysPerSolarDay is the number of sidereal days in a solar day
// (1.0027379; methods.md §12 quotes 1.0027, the further digits [from
// memory]). Ground-based sampling repeats once a solar or a sidereal day, so
// aliases lie k·1 or k·1.0027 cycles per day from the true frequency.
const SiderealDaysPerSolarDay = 1.0027379

// AliasNote says how a peak at frequency f (cycles per day) relates to the
// best peak at best, within one peak width 1/spanDays: a harmonic or a
// subharmonic (a Lomb–Scargle search finds P/2 for an eclipsing binary with
// equal minima; PDM prefers multiples of P), or a daily alias of ground-based
// sampling (methods.md §12, pitfalls). It returns "" when none fits.
func AliasNote(f, best, spanDays float64) string {
	tol := 1 / spanDays
	for n := 2; n <= 3; n++ {
		if math.Abs(f-float64(n)*best) <= tol {
			return fmt.Sprintf("%d × best frequency (period / %d)", n, n)
		}
		if math.Abs(f-best/float64(n)) <= tol {
			return fmt.Sprintf("best frequency / %d (period × %d)", n, n)
		}
	}
	for _, k := range []int{1, -1, 2, -2, 3, -3} {
		for _, day := range []float64{1, SiderealDaysPerSolarDay} {
			if math.Abs(f-best-float64(k)*day) <= tol {
				return fmt.Sprintf("daily alias: best frequency %+d c/d", k)
			}
		}
	}
	return ""
}

// WindowPeaks returns up to n of the strongest interior local maxima of the
// spectral window on the search grid, each at least one peak width 1/T from
// every stronger one: the frequency offsets at which the sampling makes
// aliases of a true signal. Power holds the window's value.
func (r PeriodResult) WindowPeaks(n int) []Peak {
	w := r.Window
	var cand []int
	for k := 1; k+1 < len(w); k++ {
		if w[k] > w[k-1] && w[k] >= w[k+1] {
			cand = append(cand, k)
		}
	}
	slices.SortStableFunc(cand, func(a, b int) int { return cmp.Compare(w[b], w[a]) })
	out := []Peak{}
	for _, k := range cand {
		f := r.Freqs[k]
		if slices.ContainsFunc(out, func(p Peak) bool { return math.Abs(p.FreqPerDay-f) < 1/r.SpanDays }) {
			continue
		}
		out = append(out, Peak{FreqPerDay: f, PeriodDays: 1 / f, Power: w[k]})
		if len(out) == n {
			break
		}
	}
	return out
}
