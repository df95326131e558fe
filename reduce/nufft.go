package reduce

// The fast path of LombScargle: the GLS sums on an evenly spaced grid by
// type-1 non-uniform FFTs (internal/nufft), with direct sums wherever the
// fit is too ill conditioned for the transforms' accuracy.

import (
	"context"
	"math"
	"sync"

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

// lsBlock fills n frequencies start + i·step, i = 0 … n−1. With
// f_c = start + ⌊n/2⌋·step and u_j = periodFrac(step·t_j) cycles,
//
//	Σ_j a_j·exp(2πi·(f_c + k·step)·t_j) = Σ_j [a_j·exp(2πi·f_c·t_j)]·exp(2πi·k·u_j),
//
// a type-1 transform over modes k = −⌊n/2⌋ … ; the sums at 2f use points
// periodFrac(2·step·t_j) and the factor exp(2πi·2f_c·t_j). It returns how many
// frequencies it recomputed by direct sums.
func (d *periodData) lsBlock(start, step float64, n int, power, window []float64) (int, error) {
	np := len(d.dt)
	fc := start + float64(n/2)*step
	u1 := make([]float64, np)
	u2 := make([]float64, np)
	a := make([]complex128, np)  // w·e^(iφ): C + iS
	ay := make([]complex128, np) // w·y·e^(iφ): YC + iYS
	a2 := make([]complex128, np) // w·e^(2iφ): C2 + iS2
	for j, t := range d.dt {
		u1[j] = periodFrac(step * t)
		u2[j] = periodFrac(2 * step * t)
		sn, cs := math.Sincos(2 * math.Pi * periodFrac(fc*t))
		e := complex(cs, sn)
		a[j] = complex(d.w[j], 0) * e
		ay[j] = complex(d.w[j]*d.y[j], 0) * e
		a2[j] = complex(d.w[j], 0) * e * e
	}
	plan, err := nufft.CachedPlan(n, lsNUFFTTol)
	if err != nil {
		return 0, err
	}
	f1 := [][]complex128{make([]complex128, n)}
	if power != nil {
		f1 = append(f1, make([]complex128, n))
	}
	f2 := []complex128(nil)
	var err1, err2 error
	var wg sync.WaitGroup
	if power != nil {
		f2 = make([]complex128, n)
		wg.Go(func() { err2 = plan.Type1([][]complex128{f2}, u2, [][]complex128{a2}) })
	}
	if power != nil {
		err1 = plan.Type1(f1, u1, [][]complex128{a, ay})
	} else {
		err1 = plan.Type1(f1, u1, [][]complex128{a})
	}
	wg.Wait()
	if err1 != nil {
		return 0, err1
	}
	if err2 != nil {
		return 0, err2
	}
	for i, v := range f1[0] {
		window[i] = real(v)*real(v) + imag(v)*imag(v)
	}
	if power == nil {
		return 0, nil
	}
	// Sum errors: the transforms' tolerance, plus rounding of phases up to
	// 2·f·T cycles (a few ulps each, as in the direct sums).
	fmax := math.Abs(start) + float64(n)*step
	eps := lsNUFFTTol + 2*math.Pi*8*lsFloat64Eps*2*fmax*d.span
	// Powers, and direct sums where the bound is too loose, in two halves.
	var fallbacks [2]int
	half := n / 2
	if n < 1<<14 {
		half = n
	}
	work := func(part, lo, hi int) {
		for i := lo; i < hi; i++ {
			s := glsSums{
				c: real(f1[0][i]), s: imag(f1[0][i]),
				yc: real(f1[1][i]), ys: imag(f1[1][i]),
				c2: real(f2[i]), s2: imag(f2[i]),
			}
			p, ok := s.powerChecked(d.yy, d.ya, eps)
			if !ok {
				d.lsDirectAt(start+float64(i)*step, i, power, window)
				fallbacks[part]++
				continue
			}
			power[i] = p
		}
	}
	wg.Go(func() { work(1, half, n) })
	work(0, 0, half)
	wg.Wait()
	return fallbacks[0] + fallbacks[1], nil
}
