// Package nufft computes one-dimensional type-1 non-uniform fast Fourier
// transforms (non-uniform points to uniform modes),
//
//	F[k] = Σ_j c_j · exp(+2πi·k·u_j),  k = −K/2 … K−1−K/2,
//
// for points u_j given in cycles, by spreading with the "exponential of
// semicircle" (ES) kernel of Barnett, Magland & af Klinteberg (2019), SIAM J.
// Sci. Comput. 41, C479, onto an upsampled uniform grid, one FFT of that grid
// (gonum's dsp/fourier, radix 2 or 4), and division by the kernel's Fourier
// transform (deconvolution).
//
// The error of every output mode is bounded by the plan's tolerance times
// Σ_j |c_j| (the ℓ1 norm of the strengths); the package tests measure it
// against direct sums. Points may lie anywhere on the real line: only their
// fractional part matters, since k is an integer.
package nufft

import (
	"fmt"
	"math"
	"math/bits"
	"sync"
)

const (
	// minUpsample is the smallest ratio of fine-grid size to mode count;
	// Barnett et al. (2019, §4 [section from memory]) use 1.25 as their
	// low-upsampling option.
	minUpsample = 1.25
	// maxWidth caps the kernel width in fine-grid cells.
	maxWidth = 32
	// minTol is the smallest tolerance a plan accepts: below it rounding
	// in the FFT dominates and a wider kernel buys nothing.
	minTol = 1e-13
	// MaxModes is the largest mode count a plan accepts (fine grids up to
	// 2^25 cells, 512 MiB of complex128).
	MaxModes = 1 << 24
)

// Plan holds the fixed parts of type-1 transforms with K modes: the fine
// grid size, the kernel and its Fourier-transform correction. A Plan is
// read-only after NewPlan and may be used by several goroutines at once.
type Plan struct {
	modes int       // K
	grid  int       // fine grid size M, a power of 2
	width int       // kernel width w, in fine-grid cells
	beta  float64   // ES kernel shape β
	tol   float64   // requested tolerance
	corr  []float64 // 1/ψ̂(k) for k = 0 … K/2+1
	fft   *fftPlan
	pool  sync.Pool // fine grids of M complex values
}

func (p *Plan) getGrid() []complex128 {
	if g, ok := p.pool.Get().(*[]complex128); ok {
		return *g
	}
	return make([]complex128, p.grid)
}

func (p *Plan) putGrid(g []complex128) { p.pool.Put(&g) }

// NewPlan prepares type-1 transforms with the given number of output modes
// and relative tolerance tol (error per mode over Σ|c_j|). The kernel width
// w and shape β follow Barnett, Magland & af Klinteberg (2019, §4.1
// [section from memory]):
// w = ⌈ln(10/ε) / (π·√(1 − 1/σ))⌉ (one digit of margin, as they use at
// σ = 2) and β = 0.97·π·(1 − 1/(2σ))·w, where σ is
// the upsampling ratio of the fine grid (a power of 2, at least 1.25·K).
func NewPlan(modes int, tol float64) (*Plan, error) {
	if modes < 1 || modes > MaxModes {
		return nil, fmt.Errorf("nufft: mode count %d is outside [1, %d]", modes, MaxModes)
	}
	if !(tol >= minTol && tol < 0.1) {
		return nil, fmt.Errorf("nufft: tolerance %g is outside [%g, 0.1)", tol, minTol)
	}
	grid := 1 << bits.Len(uint(math.Ceil(minUpsample*float64(modes))-1))
	var width int
	for {
		sigma := float64(grid) / float64(modes)
		width = int(math.Ceil(math.Log(10/tol) / (math.Pi * math.Sqrt(1-1/sigma))))
		width = max(width, 2)
		if width <= maxWidth && grid >= 2*width {
			break
		}
		grid *= 2
	}
	sigma := float64(grid) / float64(modes)
	p := &Plan{
		modes: modes,
		grid:  grid,
		width: width,
		beta:  0.97 * math.Pi * (1 - 1/(2*sigma)) * float64(width),
		tol:   tol,
	}
	p.corr = p.correction(modes/2 + 2)
	p.fft = newFFTPlan(grid)
	return p, nil
}

// Modes returns the number of output modes K.
func (p *Plan) Modes() int { return p.modes }

// GridSize returns the fine (upsampled) grid size M.
func (p *Plan) GridSize() int { return p.grid }

// Width returns the kernel width in fine-grid cells.
func (p *Plan) Width() int { return p.width }

// Tol returns the tolerance the plan was made for.
func (p *Plan) Tol() float64 { return p.tol }

// es evaluates the ES kernel φ(z) = exp(β(√(1−z²) − 1)) on |z| ≤ 1
// (Barnett et al. 2019, eq. 1.8 [equation number from memory]), and 0
// outside.
func (p *Plan) es(z float64) float64 {
	s := 1 - z*z
	if s <= 0 {
		return 0
	}
	return math.Exp(p.beta * (math.Sqrt(s) - 1))
}

// correction returns 1/ψ̂(k) for k = 0 … n−1, where ψ(v) = φ(2v/w) is the
// kernel in fine-grid cells and ψ̂(k) = ∫ψ(v)·cos(2πkv/M) dv
// = w·∫₀¹ φ(z)·cos(πkwz/M) dz, by Gauss–Legendre quadrature with
// ⌈2 + 1.5w⌉ nodes on [0, 1], as Barnett et al. (2019, §3.1.1 [from memory]) do (the
// integrand is smooth, and at most w/(4σ) periods of the cosine fit in the
// interval). The cosines come from a complex rotation,
// restarted from math.Sincos every 256 steps so rounding cannot build up.
func (p *Plan) correction(n int) []float64 {
	q := 2 + (3*p.width+1)/2
	z := make([]float64, q)
	wt := make([]float64, q)
	gaussLegendre(z, wt)
	ft := make([]float64, n)
	alpha := math.Pi * float64(p.width) / float64(p.grid)
	const restart = 256
	for i := range z {
		a := alpha * z[i]
		step := complex(math.Cos(a), math.Sin(a))
		f := wt[i] * p.es(z[i]) * float64(p.width)
		var rot complex128
		for k := 0; k < n; k++ {
			if k%restart == 0 {
				s, c := math.Sincos(a * float64(k))
				rot = complex(c, s)
			}
			ft[k] += f * real(rot)
			rot *= step
		}
	}
	for k := range ft {
		ft[k] = 1 / ft[k]
	}
	return ft
}

// Type1 computes, for each strength vector c[s], the K modes
// dst[s][k + K/2] = Σ_j c[s][j]·exp(+2πi·k·u[j]), k = −K/2 … K−1−K/2.
// All strength vectors share the points u (in cycles); sharing saves the
// kernel evaluations. dst[s] must have length K and c[s] length len(u).
// Type1 uses two fine grids per strength vector, kept in a pool for the
// next call, and runs the FFTs in parallel.
func (p *Plan) Type1(dst [][]complex128, u []float64, c [][]complex128) error {
	if len(dst) != len(c) {
		return fmt.Errorf("nufft: %d outputs for %d strength vectors", len(dst), len(c))
	}
	for s := range c {
		if len(c[s]) != len(u) {
			return fmt.Errorf("nufft: strength vector %d has %d values for %d points", s, len(c[s]), len(u))
		}
		if len(dst[s]) != p.modes {
			return fmt.Errorf("nufft: output %d has length %d, want %d modes", s, len(dst[s]), p.modes)
		}
	}
	grids := make([][]complex128, len(c))
	for s := range grids {
		grids[s] = p.getGrid()
		clear(grids[s])
	}
	defer func() {
		for _, g := range grids {
			p.putGrid(g)
		}
	}()
	if err := p.spread(grids, u, c); err != nil {
		return err
	}
	// The FFTs are independent: one goroutine each.
	var wg sync.WaitGroup
	for s := range grids {
		wg.Go(func() {
			scratch := p.getGrid()
			p.fft.transform(grids[s], scratch)
			p.putGrid(scratch)
			p.deconvolve(dst[s], grids[s])
		})
	}
	wg.Wait()
	return nil
}

// spread adds each point's strengths, weighted by the kernel, to the w
// fine-grid cells nearest it (periodically).
func (p *Plan) spread(grids [][]complex128, u []float64, c [][]complex128) error {
	m := float64(p.grid)
	mask := p.grid - 1
	half := float64(p.width) / 2
	scale := 2 / float64(p.width)
	ker := make([]float64, p.width)
	for j, uj := range u {
		if math.IsNaN(uj) || math.IsInf(uj, 0) {
			return fmt.Errorf("nufft: point %d is %v", j, uj)
		}
		pos := (uj - math.Floor(uj)) * m // in [0, M]
		l0 := math.Ceil(pos - half)
		z0 := (pos - l0) * scale // z of the first cell, in (1−2/w, 1]
		for q := range ker {
			ker[q] = p.es(z0 - float64(q)*scale)
		}
		i0 := int(l0)
		for s, g := range grids {
			cj := c[s][j]
			for q, kq := range ker {
				g[(i0+q)&mask] += cj * complex(kq, 0)
			}
		}
	}
	return nil
}

// deconvolve reads mode k from FFT bin −k mod M and divides by ψ̂(k).
func (p *Plan) deconvolve(dst, g []complex128) {
	lo := -(p.modes / 2)
	mask := p.grid - 1
	for i := range dst {
		k := lo + i
		ak := k
		if ak < 0 {
			ak = -ak
		}
		dst[i] = g[p.fft.at((-k)&mask)] * complex(p.corr[ak], 0)
	}
}

// gaussLegendre fills x and wt with the len(x)-point Gauss–Legendre nodes
// and weights on [0, 1], by Newton's iteration on the Legendre polynomial
// P_n from the usual asymptotic starting guesses cos(π(i + 3/4)/(n + 1/2))
// (the rule itself: Abramowitz & Stegun 1964, eq. 25.4.29 [from memory]).
// It is used instead of gonum's integrate/quad Legendre, whose v0.17.0
// tables give wrong weights for n = 26 (their sum is 0.98945, not 1).
func gaussLegendre(x, wt []float64) {
	n := len(x)
	for i := 0; i < (n+1)/2; i++ {
		r := math.Cos(math.Pi * (float64(i) + 0.75) / (float64(n) + 0.5))
		var dp float64
		for iter := 0; iter < 100; iter++ {
			p0, p1 := 1.0, r
			for k := 2; k <= n; k++ {
				p0, p1 = p1, ((2*float64(k)-1)*r*p1-(float64(k)-1)*p0)/float64(k)
			}
			if n == 1 {
				p0, p1 = 1, r
			}
			dp = float64(n) * (r*p1 - p0) / (r*r - 1)
			dr := p1 / dp
			r -= dr
			if math.Abs(dr) < 1e-16 {
				break
			}
		}
		// Recompute the derivative at the converged root for the weight.
		p0, p1 := 1.0, r
		for k := 2; k <= n; k++ {
			p0, p1 = p1, ((2*float64(k)-1)*r*p1-(float64(k)-1)*p0)/float64(k)
		}
		if n == 1 {
			p0, p1 = 1, r
		}
		dp = float64(n) * (r*p1 - p0) / (r*r - 1)
		w := 2 / ((1 - r*r) * dp * dp)
		x[i], x[n-1-i] = (1-r)/2, (1+r)/2
		wt[i], wt[n-1-i] = w/2, w/2
	}
}
