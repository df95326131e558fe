package reduce

import (
	"context"
	"fmt"
	"math"
	"math/bits"
	"runtime"
	"sync"
	"sync/atomic"
)

const (
	// DefaultPDMBins is the number of phase bins Periodogram uses for PDM
	// by default (Stellingwerf 1978 used 5 or 10).
	DefaultPDMBins = 10
	// MaxPDMCovers caps the covers (Stellingwerf 1978 used 2).
	MaxPDMCovers = 10
	// pdmChunk is how many trial frequencies a worker takes at a time:
	// the unit of progress reports and cancellation.
	pdmChunk = 1024
	// pdmEdgeNudge (2^-30 cycle, about 1e-9) is added to every phase
	// before binning. Computed phases carry rounding errors far smaller
	// than this (for the usual f·t), so a phase that is exactly on a bin
	// edge in exact arithmetic, as happens for times on a regular lattice,
	// lands in the bin above the edge, as floor(exact phase) puts it,
	// instead of on whichever side rounding leaves it.
	pdmEdgeNudge = uint64(1) << 34
)

// PDM returns Stellingwerf's (1978, ApJ 224, 953) phase-dispersion
// statistic θ of pts at every frequency of grid (cycles per day). The
// phases φ = periodFrac(f·t) of the times as given are split into bins equal
// bins, and each of covers sets of bins is shifted by 1/(bins·covers) in
// phase; over all the sets' non-empty bins,
//
//	s² = Σ_j (n_j − 1)·s_j² / (Σ_j n_j − M),  θ = s² / σ²,
//
// with s_j² the variance of the magnitudes in bin j, M the number of
// non-empty bins and σ² the sample variance of all N magnitudes
// (Stellingwerf 1978, eqs. 1–3 [from memory]). A phase within about 1e-9
// cycle below a bin edge counts as on the edge (see pdmEdgeNudge). θ ≈ 1 where there is no
// period and dips towards 0 at the period and its integer multiples.
// PDM weighs every point equally, as Stellingwerf does; errors are ignored.
//
// Each point's phase is carried as a 64-bit fixed-point fraction and
// stepped from one frequency to the next by an integer addition, so no
// sort is needed and the bin of a point is one multiplication. Frequencies
// are shared among GOMAXPROCS workers; progress, if not nil, is called from
// the calling goroutine, and cancelling ctx stops within one chunk of 1024
// frequencies per worker.
func PDM(ctx context.Context, pts []Point, grid FreqGrid, bins, covers int, progress func(done, total int)) ([]float64, error) {
	d, err := newPeriodData(pts)
	if err != nil {
		return nil, err
	}
	if err := grid.validate(); err != nil {
		return nil, err
	}
	return d.pdm(ctx, grid, bins, covers, progress)
}

// PDMTheta returns Stellingwerf's θ of pts at one trial period in days
// (see PDM).
func PDMTheta(pts []Point, periodDays float64, bins, covers int) (float64, error) {
	d, err := newPeriodData(pts)
	if err != nil {
		return 0, err
	}
	if !(periodDays > 0) || math.IsInf(periodDays, 0) {
		return 0, fmt.Errorf("trial period %v: want a finite period > 0 days", periodDays)
	}
	if err := d.checkPDMBins(bins, covers); err != nil {
		return 0, err
	}
	f := 1 / periodDays
	nb := uint64(bins * covers)
	cnt := make([]float64, nb)
	sum := make([]float64, nb)
	off := pdmFixed(periodFrac(f*d.t0)) + pdmEdgeNudge
	for j, t := range d.dt {
		b, _ := bits.Mul64(off+pdmFixed(periodFrac(f*t)), nb)
		cnt[b]++
		sum[b] += d.y[j]
	}
	return d.pdmTheta(cnt, sum, bins, covers), nil
}

func (d *periodData) checkPDMBins(bins, covers int) error {
	if bins < 2 || bins >= len(d.dt) {
		return fmt.Errorf("PDM bins %d: want 2 to %d (fewer than the %d points)", bins, len(d.dt)-1, len(d.dt))
	}
	if covers < 1 || covers > MaxPDMCovers {
		return fmt.Errorf("PDM covers %d: want 1 to %d", covers, MaxPDMCovers)
	}
	return nil
}

// pdmFixed returns x in [0, 1) as a 64-bit binary fraction.
func pdmFixed(x float64) uint64 { return uint64(math.Ldexp(x, 64)) }

// pdmTheta returns θ from the counts and magnitude sums of the
// bins·covers narrow bins of width 1/(bins·covers): bin j of cover c is
// the narrow bins j·covers + c … j·covers + c + covers − 1 (cyclically).
// Σ_bin (n − 1)s² = Σ_bin Σ y² − S²/n, so only counts and sums are needed.
func (d *periodData) pdmTheta(cnt, sum []float64, bins, covers int) float64 {
	nb := bins * covers
	sy, syy := d.sy, d.syy
	n := float64(len(d.y))
	var q float64
	nonEmpty := 0
	for c := range covers {
		for j := range bins {
			var nn, ss float64
			for m := range covers {
				f := (j*covers + c + m) % nb
				nn += cnt[f]
				ss += sum[f]
			}
			if nn > 0 {
				q += ss * ss / nn
				nonEmpty++
			}
		}
	}
	s2 := (float64(covers)*syy - q) / (float64(covers)*n - float64(nonEmpty))
	sigma2 := (syy - sy*sy/n) / (n - 1)
	return s2 / sigma2
}

func (d *periodData) pdm(ctx context.Context, g FreqGrid, bins, covers int, progress func(done, total int)) ([]float64, error) {
	if err := d.checkPDMBins(bins, covers); err != nil {
		return nil, err
	}
	if progress == nil {
		progress = func(int, int) {}
	}
	theta := make([]float64, g.N)
	chunks := (g.N + pdmChunk - 1) / pdmChunk
	workers := min(runtime.GOMAXPROCS(0), chunks)
	var next atomic.Int64
	done := make(chan int)
	var wg sync.WaitGroup
	for range workers {
		wg.Go(func() {
			w := newPDMWorker(d, bins, covers)
			for {
				c := int(next.Add(1)) - 1
				if c >= chunks || ctx.Err() != nil {
					return
				}
				k0 := c * pdmChunk
				k1 := min(k0+pdmChunk, g.N)
				w.run(g, k0, k1, theta)
				done <- k1 - k0
			}
		})
	}
	go func() { wg.Wait(); close(done) }()
	progress(0, g.N)
	total := 0
	for n := range done {
		total += n
		progress(total, g.N)
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	return theta, nil
}

// pdmLanes is how many trial frequencies a worker bins in one pass over
// the points: each point's phase, magnitude and step are loaded once for
// all of them, and the lanes' bin updates do not wait on one another.
const pdmLanes = 4

// pdmWorker holds one worker's phases and bin sums.
type pdmWorker struct {
	d       *periodData
	bins    int
	covers  int
	ph, inc []uint64 // periodFrac(f·(t − t0)) and periodFrac(step·(t − t0)), fixed point
	cnt     [pdmLanes][]float64
	sum     [pdmLanes][]float64
}

func newPDMWorker(d *periodData, bins, covers int) *pdmWorker {
	n := len(d.dt)
	w := &pdmWorker{d: d, bins: bins, covers: covers, ph: make([]uint64, n), inc: make([]uint64, n)}
	for l := range pdmLanes {
		w.cnt[l] = make([]float64, bins*covers)
		w.sum[l] = make([]float64, bins*covers)
	}
	return w
}

// run fills theta[k0:k1]. Phases start exact at f_k0 and then step by
// periodFrac(step·(t − t0)) modulo 1, which integer overflow does exactly; the
// offset periodFrac(f·t0) is recomputed for each frequency.
func (w *pdmWorker) run(g FreqGrid, k0, k1 int, theta []float64) {
	f0 := g.Freq(k0)
	for j, t := range w.d.dt {
		w.ph[j] = pdmFixed(periodFrac(f0 * t))
		w.inc[j] = pdmFixed(periodFrac(g.Step * t))
	}
	nb := uint64(w.bins * w.covers)
	n := len(w.ph)
	ph, inc, y := w.ph[:n], w.inc[:n], w.d.y[:n]
	c0, c1, c2, c3 := w.cnt[0], w.cnt[1], w.cnt[2], w.cnt[3]
	s0, s1, s2, s3 := w.sum[0], w.sum[1], w.sum[2], w.sum[3]
	for k := k0; k < k1; k += pdmLanes {
		lanes := min(pdmLanes, k1-k)
		var off [pdmLanes]uint64
		for l := range pdmLanes {
			clear(w.cnt[l])
			clear(w.sum[l])
			off[l] = pdmFixed(periodFrac(g.Freq(k+l)*w.d.t0)) + pdmEdgeNudge
		}
		// Lanes past k1 bin harmlessly into their own arrays.
		for j, p := range ph {
			d, yj := inc[j], y[j]
			b0, _ := bits.Mul64(off[0]+p, nb)
			b1, _ := bits.Mul64(off[1]+p+d, nb)
			b2, _ := bits.Mul64(off[2]+p+2*d, nb)
			b3, _ := bits.Mul64(off[3]+p+3*d, nb)
			c0[b0]++
			s0[b0] += yj
			c1[b1]++
			s1[b1] += yj
			c2[b2]++
			s2[b2] += yj
			c3[b3]++
			s3[b3] += yj
			ph[j] = p + pdmLanes*d
		}
		for l := range lanes {
			theta[k+l] = w.d.pdmTheta(w.cnt[l], w.sum[l], w.bins, w.covers)
		}
	}
}
