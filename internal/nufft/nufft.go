// Package nufft computes one-dimensional type-1 non-uniform fast Fourier
// transforms (non-uniform points to uniform modes),
//
//	F[k] = Σ_j c_j · exp(+2πi·k·u_j),  k = −K/2 … K−1−K/2,
//
// for points u_j given in cycles, by spreading with the "exponential of
// semicircle" (ES) kernel of Barnett, Magland & af Klinteberg (2019), SIAM J.
// Sci. Comput. 41, C479 (evaluated as a piecewise polynomial, fitKernel),
// onto an upsampled uniform grid, one FFT of that grid (split into parts
// that run in parallel, each done with gonum's dsp/fourier radix-2/4
// routines), and division by the kernel's Fourier transform
// (deconvolution).
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
	modes int        // K
	grid  int        // fine grid size M, a power of 2
	width int        // kernel width w, in fine-grid cells
	beta  float64    // ES kernel shape β
	tol   float64    // requested tolerance
	ker   kernelPoly // the kernel as piecewise polynomials (fitKernel)
	corr  []float64  // 1/ψ̂(k) for k = 0 … K/2+1
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
	p.ker = p.fitKernel()
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
// outside. The exponent is computed as −β·z²/(1 + √(1−z²)), which is the
// same number without the cancellation of √(1−z²) − 1 near z = 0.
func (p *Plan) es(z float64) float64 {
	s := 1 - z*z
	if s <= 0 {
		return 0
	}
	return math.Exp(-p.beta * z * z / (1 + math.Sqrt(s)))
}

const (
	// kernelSamples is how many evenly spaced offsets per cell fitKernel
	// checks its polynomials at.
	kernelSamples = 64
	// kernelRound is the error allowed in the polynomial kernel on top of
	// the kernel's own truncation (below): a few times the rounding error
	// of evaluating φ itself, about 1e-16 of its peak value 1.
	kernelRound = 4e-15
	// maxKernelDeg caps the polynomial degree; the fits of every width the
	// plans use reach kernelRound well below it.
	maxKernelDeg = 24
)

// kernelPoly holds the weights of the w cells a point touches as
// polynomials of its offset t ∈ [−1/2, 1/2] (see fitKernel), split into
// even and odd parts, E_q(t) = Σ_i even[q·ne + i]·t^(2(ne−1−i)) and
// O_q(t) = t·Σ_i odd[q·no + i]·t^(2(no−1−i)), for q < ⌈w/2⌉.
type kernelPoly struct {
	w, deg    int
	ne, no    int // coefficients per cell in even, odd
	even, odd []float64
}

// fitKernel returns the piecewise polynomial that spread evaluates
// instead of φ by Horner's rule (a piecewise polynomial kernel, as
// Barnett et al. 2019 also discuss [from memory]): a point at fine-grid
// position x touches cells l0 … l0+w−1, l0 = ⌈x − w/2⌉, and the weight of cell l0+q is φ(z_q), z_q = (t +
// (w−1)/2 − q)·2/w, where t = x − l0 − (w−1)/2 ∈ (−1/2, 1/2]. On that
// interval each weight is a smooth function of t, interpolated at deg+1
// Chebyshev points and turned into monomial coefficients, so that spread
// needs about w·deg/2 multiply-adds per point by Horner's rule instead of
// w exponentials and square roots. Since φ is even, z_(w−1−q)(t) =
// −z_q(−t), so cell w−1−q's polynomial is cell q's at −t: the even and odd
// parts E_q(t) ± O_q(t) of ⌈w/2⌉ polynomials give all w weights. The
// degree is the smallest that keeps the largest error at kernelSamples
// offsets per cell below 2·exp(−β) + kernelRound: exp(−β) is the size of
// the kernel where it is cut off at |z| = 1, an error the method already
// has, and the square root in φ makes the outermost cells converge no
// better than that.
func (p *Plan) fitKernel() kernelPoly {
	w := p.width
	target := 2*math.Exp(-p.beta) + kernelRound
	for deg := 3; ; deg++ {
		k := kernelPoly{w: w, deg: deg, ne: deg/2 + 1, no: (deg + 1) / 2}
		nq := (w + 1) / 2
		k.even = make([]float64, nq*k.ne)
		k.odd = make([]float64, nq*k.no)
		a := make([]float64, deg+1)
		for q := range nq {
			chebMonomial(a, func(s float64) float64 {
				return p.es((s/2 + float64(w-1)/2 - float64(q)) * 2 / float64(w))
			})
			for m, am := range a {
				c := am * math.Ldexp(1, m) // s = 2t
				if m%2 == 0 {
					k.even[q*k.ne+k.ne-1-m/2] = c
				} else {
					k.odd[q*k.no+k.no-1-m/2] = c
				}
			}
		}
		if deg == maxKernelDeg || p.kernelError(&k) <= target {
			return k
		}
	}
}

// kernelError returns the largest difference between the polynomial
// kernel and φ at kernelSamples+1 evenly spaced t per cell.
func (p *Plan) kernelError(k *kernelPoly) float64 {
	w := p.width
	ker := make([]float64, w)
	var worst float64
	for i := 0; i <= kernelSamples; i++ {
		t := -0.5 + float64(i)/kernelSamples
		k.eval(ker, t)
		for q, v := range ker {
			want := p.es((t + float64(w-1)/2 - float64(q)) * 2 / float64(w))
			worst = max(worst, math.Abs(v-want))
		}
	}
	return worst
}

// eval sets ker[q], q = 0 … w−1, to the weights at offset t. It runs
// Horner's rule on two cells at a time: four independent chains keep the
// floating-point units busier than one cell's two.
func (k *kernelPoly) eval(ker []float64, t float64) {
	w, ne, no := k.w, k.ne, k.no // ne = no or no+1
	ker = ker[:w]
	t2 := t * t
	nq := (w + 1) / 2
	q := 0
	for ; q+1 < nq; q += 2 {
		ev0, ev1 := k.even[q*ne:][:ne], k.even[(q+1)*ne:][:ne]
		od0, od1 := k.odd[q*no:][:no], k.odd[(q+1)*no:][:no]
		e0, e1, o0, o1 := ev0[0], ev1[0], od0[0], od1[0]
		for i := 1; i < no; i++ {
			e0 = e0*t2 + ev0[i]
			e1 = e1*t2 + ev1[i]
			o0 = o0*t2 + od0[i]
			o1 = o1*t2 + od1[i]
		}
		if ne > no {
			e0 = e0*t2 + ev0[ne-1]
			e1 = e1*t2 + ev1[ne-1]
		}
		o0 *= t
		o1 *= t
		ker[w-1-q] = e0 - o0
		ker[q] = e0 + o0
		ker[w-2-q] = e1 - o1
		ker[q+1] = e1 + o1
	}
	if q < nq {
		ev, od := k.even[q*ne:][:ne], k.odd[q*no:][:no]
		e, o := ev[0], od[0]
		for _, c := range ev[1:] {
			e = e*t2 + c
		}
		for _, c := range od[1:] {
			o = o*t2 + c
		}
		o *= t
		ker[w-1-q] = e - o
		ker[q] = e + o
	}
}

// chebMonomial sets a[m] (m = 0 … n−1, n = len(a)) to the monomial
// coefficients of the polynomial of degree n−1 that interpolates f at the
// n Chebyshev points cos(π(i + 1/2)/n) of [−1, 1]: the Chebyshev series
// Σ c_k T_k(s) from the discrete cosine sums (Press et al. 2007, Numerical
// Recipes 3rd ed., eq. 5.8.7 [from memory]), expanded with
// T_{k+1} = 2s·T_k − T_{k−1}, whose integer coefficients are exact in
// float64 for the degrees used here.
func chebMonomial(a []float64, f func(s float64) float64) {
	n := len(a)
	c := make([]float64, n)
	for i := range n {
		th := math.Pi * (float64(i) + 0.5) / float64(n)
		v := f(math.Cos(th))
		for k := range c {
			c[k] += v * math.Cos(float64(k)*th)
		}
	}
	for k := range c {
		c[k] *= 2 / float64(n)
	}
	c[0] /= 2
	clear(a)
	prev := make([]float64, n) // T_{k−1}
	cur := make([]float64, n)  // T_k
	next := make([]float64, n)
	prev[0] = 1
	for m := range a {
		a[m] += c[0] * prev[m]
	}
	if n == 1 {
		return
	}
	cur[1] = 1
	for k := 1; k < n; k++ {
		for m := range a {
			a[m] += c[k] * cur[m]
		}
		for m := range next {
			next[m] = -prev[m]
			if m > 0 {
				next[m] += 2 * cur[m-1]
			}
		}
		prev, cur, next = cur, next, prev
	}
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
	for j, uj := range u {
		if math.IsNaN(uj) || math.IsInf(uj, 0) {
			return fmt.Errorf("nufft: point %d is %v", j, uj)
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
	p.spread(grids, u, c)
	// Each grid's FFT splits into independent parts (fftPlan.top): one
	// goroutine per part, each also reading off its own modes.
	var wg sync.WaitGroup
	for s, g := range grids {
		wg.Go(func() {
			scratch := p.getGrid()
			defer p.putGrid(scratch)
			p.fft.top(g, scratch)
			var parts sync.WaitGroup
			for r := 1; r < p.fft.parts; r++ {
				parts.Go(func() { p.finish(dst[s], g, scratch, r) })
			}
			p.finish(dst[s], g, scratch, 0)
			parts.Wait()
		})
	}
	wg.Wait()
	return nil
}

// finish runs part r of the FFT of g (after top) and deconvolves the
// modes it holds.
func (p *Plan) finish(dst, g, scratch []complex128, r int) {
	p.fft.subTransform(g, scratch, r)
	p.deconvolve(dst, g, r)
}

// spread adds each point's strengths, weighted by the kernel, to the w
// fine-grid cells nearest it (periodically). The points must be finite.
func (p *Plan) spread(grids [][]complex128, u []float64, c [][]complex128) {
	m := float64(p.grid)
	mask := p.grid - 1
	w := p.width
	half := float64(w) / 2
	ker := make([]float64, w)
	for j, uj := range u {
		pos := (uj - math.Floor(uj)) * m // in [0, M]
		l0 := math.Ceil(pos - half)
		p.ker.eval(ker, pos-l0-(half-0.5))
		i0 := int(l0)
		for s, g := range grids {
			cj := c[s][j]
			re, im := real(cj), imag(cj)
			if i0 >= 0 && i0+w <= len(g) {
				gs := g[i0 : i0+w]
				for q, kq := range ker {
					gs[q] += complex(re*kq, im*kq)
				}
				continue
			}
			for q, kq := range ker {
				g[(i0+q)&mask] += complex(re*kq, im*kq)
			}
		}
	}
}

// deconvolve sets dst[k + K/2] = X[−k mod M]/ψ̂(k) for the modes k whose
// FFT bin −k mod M lies in part r of the split FFT of g. It walks the bins
// in the order the FFT stores them, in tiles, so that reads and writes
// both stay in cache.
func (p *Plan) deconvolve(dst, g []complex128, r int) {
	f := p.fft
	part := f.part(g, r)
	n1, n2 := f.sub.n1, f.sub.n2 // bin P·(a + N1·c) + r is at part[a·N2 + c]
	np := f.parts
	lo := -(p.modes / 2)
	m := p.grid
	hiBin := m - (p.modes + lo - 1) // bins from here hold k = M − bin > 0
	corr := p.corr
	const blk = 16
	for a0 := 0; a0 < n1; a0 += blk {
		a1 := min(a0+blk, n1)
		for c0 := 0; c0 < n2; c0 += blk {
			for c := c0; c < min(c0+blk, n2); c++ {
				b := np*(a0+n1*c) + r
				for a := a0; a < a1; a, b = a+1, b+np {
					var k, ak int
					switch {
					case b <= -lo:
						k, ak = -b, b
					case b >= hiBin:
						k = m - b
						ak = k
					default:
						continue
					}
					v := part[a*n2+c]
					cr := corr[ak]
					dst[k-lo] = complex(real(v)*cr, imag(v)*cr)
				}
			}
		}
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
