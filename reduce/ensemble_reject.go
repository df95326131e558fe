package reduce

import (
	"errors"
	"fmt"
	"math"
	"runtime"
	"sort"
	"strings"
	"sync"
	"sync/atomic"
)

// RejectRule says when a comparison star that disagrees with the rest of the
// ensemble is left out. It compares the stars in pairs over all exposures:
// for stars i and j measured together in n exposures, d = Z_i − Z_j gives
// their offset (the median of d) and their scatter (1.4826 times the median
// absolute deviation of d: the standard deviation for normal errors,
// robust against a few wild values). A star is a suspect when
//
//   - its offset from every other star exceeds max(OffsetMag, Sigma × the
//     offset's standard error) — a wrong catalogue magnitude or a wrong
//     star; or
//   - its scatter against every other star, over at least MinScatterRows
//     exposures, exceeds max(ScatterMag, ScatterFactor × the median scatter
//     of the pairs of the other stars, ScatterFactor × the scatter the
//     quoted errors explain) — a variable, saturated or blended star.
//
// The worst suspect is left out and the test repeated on the remaining
// stars while at least three remain and the suspects are fewer than half of
// them; when they are not, no star is left out and a warning says the
// comparison stars disagree with no majority. Two stars alone can never
// tell which of them is wrong.
//
// The thresholds of DefaultRejectRule are deliberately wide (common
// practice: catalogue sequences agree to a few hundredths of a magnitude and
// CCD differential photometry reaches 0.005–0.02 mag, methods.md §15), so
// that ordinary data never lose a star (noise up to 0.05 mag per star,
// catalogue errors of 0.015 mag); the tests check both that and that a star
// off by 0.3 mag or varying by ±0.15 mag is found.
type RejectRule struct {
	OffsetMag      float64 // smallest offset that can reject (mag)
	ScatterMag     float64 // smallest scatter that can reject (mag)
	ScatterFactor  float64 // how many times the others' scatter
	Sigma          float64 // how many standard errors an offset must reach
	MinScatterRows int     // fewest exposures for the scatter test
}

// DefaultRejectRule returns the rule Photometry uses unless told otherwise:
// offsets beyond 0.10 mag and 5 standard errors, scatter beyond 0.07 mag and
// three times that of the other stars, over at least 5 exposures.
func DefaultRejectRule() RejectRule {
	return RejectRule{OffsetMag: 0.10, ScatterMag: 0.07, ScatterFactor: 3, Sigma: 5, MinScatterRows: 5}
}

func (r RejectRule) validate() error {
	if !(r.OffsetMag > 0) || !(r.ScatterMag > 0) || !(r.ScatterFactor >= 1) || !(r.Sigma > 0) || r.MinScatterRows < 2 ||
		math.IsInf(r.OffsetMag+r.ScatterMag+r.ScatterFactor+r.Sigma, 0) {
		return errors.New("reduce: rejection rule: expected positive limits, a scatter factor of 1 or more and MinScatterRows of 2 or more")
	}
	return nil
}

// Rejection is a comparison star left out of the ensemble, and why.
type Rejection struct {
	ID     string
	Reason string
	// OffsetMag is the smallest offset (median of Z_i − Z_j) from another
	// star still in the ensemble, ScatterMag the smallest scatter against
	// one (NaN when too few exposures to measure it).
	OffsetMag, ScatterMag float64
}

// ensemblePair holds what two comparison stars say about each other over
// the exposures both were measured in.
type ensemblePair struct {
	n        int
	offset   float64 // median of Z_i − Z_j
	scatter  float64 // 1.4826 MAD of Z_i − Z_j; NaN below two exposures
	expected float64 // RMS of sqrt(e_i² + e_j²) when every error is known, else 0
}

// ensembleReject applies the rule to the zero points z (n×m, NaN missing)
// with errors e (0 unknown) of m comparison stars named ids. left marks the
// stars left out.
func ensembleReject(ids []string, z, e []float64, n int, rule RejectRule) (left []bool, rej []Rejection, warn string) {
	m := len(ids)
	left = make([]bool, m)
	pairs := ensemblePairs(z, e, n, m)
	pair := func(i, j int) ensemblePair {
		if i > j {
			p := pairs[j*m+i]
			p.offset = -p.offset
			return p
		}
		return pairs[i*m+j]
	}
	active := func() []int {
		var a []int
		for i := range m {
			if !left[i] {
				a = append(a, i)
			}
		}
		return a
	}
	type suspect struct {
		i                     int
		score                 float64
		reason                string
		minOffset, minScatter float64
	}
	for {
		act := active()
		if len(act) < 3 {
			return left, rej, ""
		}
		var sus []suspect
		for _, i := range act {
			var others []float64 // scatters of the pairs without i
			for a, j := range act {
				for _, k := range act[a+1:] {
					if p := pair(j, k); j != i && k != i && p.n >= rule.MinScatterRows && finite(p.scatter) {
						others = append(others, p.scatter)
					}
				}
			}
			sref := 0.0
			if len(others) > 0 {
				sort.Float64s(others)
				sref = ensembleMedianSorted(others)
			}
			nOff, nSc := 0, 0
			offScore, scScore := math.Inf(1), math.Inf(1)
			minOff, minSc := math.Inf(1), math.Inf(1)
			var offLim, scLim float64
			for _, j := range act {
				p := pair(i, j)
				if j == i || p.n == 0 {
					continue
				}
				sd := p.expected
				if finite(p.scatter) {
					sd = math.Max(sd, p.scatter)
				}
				lim := math.Max(rule.OffsetMag, rule.Sigma*1.2533*sd/math.Sqrt(float64(p.n))) // SE of a median: √(π/2) σ/√n
				nOff++
				if s := math.Abs(p.offset) / lim; s < offScore {
					offScore, offLim = s, lim
				}
				minOff = math.Min(minOff, math.Abs(p.offset))
				if p.n >= rule.MinScatterRows && finite(p.scatter) {
					lim := math.Max(rule.ScatterMag, rule.ScatterFactor*math.Max(sref, p.expected))
					nSc++
					if s := p.scatter / lim; s < scScore {
						scScore, scLim = s, lim
					}
					minSc = math.Min(minSc, p.scatter)
				}
			}
			if nSc == 0 {
				minSc = math.NaN()
			}
			s := suspect{i: i, minOffset: minOff, minScatter: minSc}
			if nOff >= 2 && offScore > 1 {
				s.score = offScore
				s.reason = fmt.Sprintf("its zero point differs from that of every other comparison star by %.3f mag or more (median over the exposures; limit %.3f mag): wrong catalogue magnitude or wrong star?", minOff, offLim)
			}
			if nSc >= 2 && scScore > 1 && scScore > s.score {
				s.score = scScore
				s.reason = fmt.Sprintf("its zero point scatters by %.3f mag or more against every other comparison star (robust standard deviation; limit %.3f mag, the others agree to %.3f mag): variable, saturated or blended?", minSc, scLim, sref)
			}
			if s.score > 0 {
				sus = append(sus, s)
			}
		}
		if len(sus) == 0 {
			return left, rej, ""
		}
		if 2*len(sus) >= len(act) {
			names := make([]string, len(sus))
			for k, s := range sus {
				names[k] = fmt.Sprintf("%q", ids[s.i])
			}
			return left, rej, fmt.Sprintf("comparison stars %s each disagree with the others and no majority agrees: none was left out; check their identifications and catalogue magnitudes", strings.Join(names, ", "))
		}
		worst := sus[0]
		for _, s := range sus[1:] {
			if s.score > worst.score {
				worst = s
			}
		}
		left[worst.i] = true
		rej = append(rej, Rejection{ID: ids[worst.i], Reason: worst.reason, OffsetMag: worst.minOffset, ScatterMag: worst.minScatter})
	}
}

// ensemblePairs computes the statistics of every pair i < j, stored at
// [i*m+j], spreading the pairs over GOMAXPROCS goroutines. Each pair uses
// at most ensemblePairRows exposures, evenly spread: medians of that many
// differences are already good to a fraction of a millimagnitude.
func ensemblePairs(z, e []float64, n, m int) []ensemblePair {
	pairs := make([]ensemblePair, m*m)
	var todo [][2]int
	for i := range m {
		for j := i + 1; j < m; j++ {
			todo = append(todo, [2]int{i, j})
		}
	}
	stride := max(1, (n+ensemblePairRows-1)/ensemblePairRows)
	workers := min(runtime.GOMAXPROCS(0), len(todo))
	if n < photoMinChunk {
		workers = 1
	}
	var wg sync.WaitGroup
	var next atomic.Int64
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			buf := make([]float64, 0, n/stride+1)
			for {
				t := int(next.Add(1)) - 1
				if t >= len(todo) {
					return
				}
				i, j := todo[t][0], todo[t][1]
				pairs[i*m+j] = ensemblePairOf(z, e, n, m, i, j, stride, buf)
			}
		}()
	}
	wg.Wait()
	return pairs
}

// ensemblePairRows is the most exposures a pair's statistics use.
const ensemblePairRows = 20000

// ensemblePairOf computes the statistics of stars i and j over every
// stride-th exposure, using buf as scratch space.
func ensemblePairOf(z, e []float64, n, m, i, j, stride int, buf []float64) ensemblePair {
	buf = buf[:0]
	var se2 float64
	known := true
	for k := 0; k < n; k += stride {
		zi, zj := z[k*m+i], z[k*m+j]
		if math.IsNaN(zi) || math.IsNaN(zj) {
			continue
		}
		buf = append(buf, zi-zj)
		ei, ej := e[k*m+i], e[k*m+j]
		known = known && ei > 0 && ej > 0
		se2 += ei*ei + ej*ej
	}
	p := ensemblePair{n: len(buf), offset: math.NaN(), scatter: math.NaN()}
	if p.n > 0 {
		p.offset = ensembleMedian(buf)
		if known {
			p.expected = math.Sqrt(se2 / float64(p.n))
		}
	}
	if p.n >= 2 {
		for k, d := range buf {
			buf[k] = math.Abs(d - p.offset)
		}
		p.scatter = 1.4826 * ensembleMedian(buf) // MAD → σ for normal errors
	}
	return p
}

// ensembleMedian returns the median of x, reordering x (Hoare's selection,
// expected linear time).
func ensembleMedian(x []float64) float64 {
	n := len(x)
	h := n / 2
	ensembleSelect(x, h)
	if n%2 == 1 {
		return x[h]
	}
	// The lower middle is the largest of x[:h].
	lo := x[0]
	for _, v := range x[1:h] {
		lo = math.Max(lo, v)
	}
	return (lo + x[h]) / 2
}

// ensembleMedianSorted returns the median of sorted x.
func ensembleMedianSorted(x []float64) float64 {
	n := len(x)
	if n%2 == 1 {
		return x[n/2]
	}
	return (x[n/2-1] + x[n/2]) / 2
}

// ensembleSelect reorders x so that x[k] is the value it would have sorted,
// with no larger value before it and no smaller after it.
func ensembleSelect(x []float64, k int) {
	lo, hi := 0, len(x)-1
	for hi > lo {
		// Median of three as the pivot guards against sorted input.
		mid := lo + (hi-lo)/2
		if x[mid] < x[lo] {
			x[mid], x[lo] = x[lo], x[mid]
		}
		if x[hi] < x[lo] {
			x[hi], x[lo] = x[lo], x[hi]
		}
		if x[hi] < x[mid] {
			x[hi], x[mid] = x[mid], x[hi]
		}
		pivot := x[mid]
		i, j := lo, hi
		for i <= j {
			for x[i] < pivot {
				i++
			}
			for x[j] > pivot {
				j--
			}
			if i <= j {
				x[i], x[j] = x[j], x[i]
				i++
				j--
			}
		}
		switch {
		case k <= j:
			hi = j
		case k >= i:
			lo = i
		default:
			return
		}
	}
}
