package reduce

// The fast path of LombScargle: the GLS sums on an evenly spaced grid by
// type-1 non-uniform FFTs (internal/nufft), with direct sums wherever the
// fit is too ill conditioned for the transforms' accuracy.

import (
	"context"
	"math"
	"runtime"
	"sync"
	"sync/atomic"

	"example.org/vigil/internal/nufft"
)

func (d *periodData) spectralWindow(ctx context.Context, g FreqGrid) ([]float64, error) {
	_, window, _, err := d.lsGrid(ctx, g, nil, true, lsDirectWork, lsBlock)
	return window, err
}

func (d *periodData) lombScargle(ctx context.Context, g FreqGrid, progress func(done, total int)) (power, window []float64, err error) {
	power, window, _, err = d.lsGrid(ctx, g, progress, false, lsDirectWork, lsBlock)
	return power, window, err
}

// lsGrid fills power (unless windowOnly) and window over g: by direct sums
// when N·K ≤ directWork, else by fast transforms over blocks of at most
// block frequencies. It also returns how many frequencies the fast path
// handed to direct sums.
func (d *periodData) lsGrid(ctx context.Context, g FreqGrid, progress func(done, total int), windowOnly bool, directWork, block int) (power, window []float64, fallbacks int, err error) {
	if progress == nil {
		progress = func(int, int) {}
	}
	window = make([]float64, g.N)
	if !windowOnly {
		power = make([]float64, g.N)
	}
	progress(0, g.N)
	if len(d.dt)*g.N <= directWork {
		for k := range g.N {
			if k%256 == 0 {
				if err := ctx.Err(); err != nil {
					return nil, nil, 0, err
				}
			}
			d.lsDirectAt(g.Freq(k), k, power, window)
		}
		progress(g.N, g.N)
		return power, window, 0, nil
	}
	for k0 := 0; k0 < g.N; k0 += block {
		if err := ctx.Err(); err != nil {
			return nil, nil, 0, err
		}
		n := min(block, g.N-k0)
		var pw []float64
		if !windowOnly {
			pw = power[k0 : k0+n]
		}
		nf, err := d.lsBlock(g.Freq(k0), g.Step, n, pw, window[k0:k0+n])
		if err != nil {
			return nil, nil, 0, err
		}
		fallbacks += nf
		progress(k0+n, g.N)
	}
	return power, window, fallbacks, nil
}

// lsDirectAt fills power[k] (when power is not nil) and window[k] at f by
// direct sums.
func (d *periodData) lsDirectAt(f float64, k int, power, window []float64) {
	s := d.glsDirect(f)
	window[k] = s.win
	if power != nil {
		power[k] = s.power(d.yy)
	}
}

// lsBuffers are lsBlock's work arrays, kept in lsPool between calls: the
// transforms' outputs alone are 48 bytes per frequency.
type lsBuffers struct {
	u1, u2     []float64
	a, ay, a2  []complex128
	f1, fy, f2 []complex128
}

var lsPool sync.Pool

// getLSBuffers returns work arrays for np points and n frequencies.
func getLSBuffers(np, n int) *lsBuffers {
	b, _ := lsPool.Get().(*lsBuffers)
	if b == nil {
		b = new(lsBuffers)
	}
	growF := func(x []float64, n int) []float64 {
		if cap(x) < n {
			return make([]float64, n)
		}
		return x[:n]
	}
	growC := func(x []complex128, n int) []complex128 {
		if cap(x) < n {
			return make([]complex128, n)
		}
		return x[:n]
	}
	b.u1, b.u2 = growF(b.u1, np), growF(b.u2, np)
	b.a, b.ay, b.a2 = growC(b.a, np), growC(b.ay, np), growC(b.a2, np)
	b.f1, b.fy, b.f2 = growC(b.f1, n), growC(b.fy, n), growC(b.f2, n)
	return b
}

// lsChunk is how many frequencies a worker of lsBlock's power loop takes
// at a time: small enough to even out the work (direct sums included)
// between cores, large enough to make the hand-out cost nothing.
const lsChunk = 4096

// lsBlock fills n frequencies start + i·step, i = 0 … n−1. With
// f_c = start + ⌊n/2⌋·step and u_j = periodFrac(step·t_j) cycles,
//
//	Σ_j a_j·exp(2πi·(f_c + k·step)·t_j) = Σ_j [a_j·exp(2πi·f_c·t_j)]·exp(2πi·k·u_j),
//
// a type-1 transform over modes k = −⌊n/2⌋ … ; the sums at 2f use points
// periodFrac(2·step·t_j) and the factor exp(2πi·2f_c·t_j). The transform
// at 2f runs alongside the two at f. It returns how many frequencies it
// recomputed by direct sums.
func (d *periodData) lsBlock(start, step float64, n int, power, window []float64) (int, error) {
	np := len(d.dt)
	fc := start + float64(n/2)*step
	plan, err := nufft.CachedPlan(n, lsNUFFTTol)
	if err != nil {
		return 0, err
	}
	b := getLSBuffers(np, n)
	defer lsPool.Put(b)
	u1, a, a2 := b.u1, b.a, b.a2
	for j, t := range d.dt {
		u1[j] = periodFrac(step * t)
		sn, cs := math.Sincos(2 * math.Pi * periodFrac(fc*t))
		a[j] = complex(d.w[j]*cs, d.w[j]*sn) // w·e^(iφ): C + iS
		a2[j] = complex(cs, sn)              // e^(iφ), for a2 below
	}
	if power == nil {
		if err := plan.Type1([][]complex128{b.f1}, u1, [][]complex128{a}); err != nil {
			return 0, err
		}
		for i, v := range b.f1 {
			window[i] = real(v)*real(v) + imag(v)*imag(v)
		}
		return 0, nil
	}
	var err2 error
	var wg sync.WaitGroup
	wg.Go(func() {
		u2 := b.u2
		for j, t := range d.dt {
			u2[j] = periodFrac(2 * step * t)
			a2[j] = a[j] * a2[j] // w·e^(2iφ): C2 + iS2
		}
		err2 = plan.Type1([][]complex128{b.f2}, u2, [][]complex128{a2})
	})
	for j := range d.dt {
		b.ay[j] = complex(real(a[j])*d.y[j], imag(a[j])*d.y[j]) // w·y·e^(iφ): YC + iYS
	}
	err1 := plan.Type1([][]complex128{b.f1, b.fy}, u1, [][]complex128{a, b.ay})
	wg.Wait()
	if err1 != nil {
		return 0, err1
	}
	if err2 != nil {
		return 0, err2
	}
	// Sum errors: the transforms' tolerance, plus rounding of phases up to
	// 2·f·T cycles (a few ulps each, as in the direct sums).
	fmax := math.Abs(start) + float64(n)*step
	eps := lsNUFFTTol + 2*math.Pi*8*lsFloat64Eps*2*fmax*d.span
	f1, fy, f2 := b.f1, b.fy, b.f2
	var next, fallbacks atomic.Int64
	work := func() {
		for {
			lo := int(next.Add(lsChunk)) - lsChunk
			if lo >= n {
				return
			}
			hi := min(lo+lsChunk, n)
			for i := lo; i < hi; i++ {
				v1, vy, v2 := f1[i], fy[i], f2[i]
				window[i] = real(v1)*real(v1) + imag(v1)*imag(v1)
				p, ok := glsPowerChecked(real(v1), imag(v1), real(vy), imag(vy), real(v2), imag(v2), d.yy, d.ya, eps)
				if !ok {
					d.lsDirectAt(start+float64(i)*step, i, power, window)
					fallbacks.Add(1)
					continue
				}
				power[i] = p
			}
		}
	}
	for range min(runtime.GOMAXPROCS(0), (n+lsChunk-1)/lsChunk) - 1 {
		wg.Go(work)
	}
	work()
	wg.Wait()
	return int(fallbacks.Load()), nil
}
