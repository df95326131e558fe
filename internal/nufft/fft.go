package nufft

import (
	"math"
	"math/bits"

	"gonum.org/v1/gonum/dsp/fourier"
)

// maxDirectFFT is the largest length handed whole to gonum's radix-2/4
// FFT. Those routines make each stage's twiddle factors by repeated
// multiplication, so their rounding error grows with the length (about
// 1e-11 of the output scale at 2^17); longer transforms are split.
const maxDirectFFT = 1 << 10

// twiddles gives W_N^m = exp(−2πi·m/N) for 0 ≤ m < N as the product of two
// table entries of about √N values each (m split into high and low bits),
// each entry from math.Sincos, so every twiddle is good to a few ulps.
type twiddles struct {
	loBits uint
	loMask int
	lo     []complex128 // exp(−2πi·lo/N)
	hi     []complex128 // exp(−2πi·hi·2^loBits/N)
}

// newTwiddles returns the twiddle tables for a power-of-2 length n.
func newTwiddles(n int) twiddles {
	p := uint(bits.TrailingZeros(uint(n)))
	t := twiddles{loBits: (p + 1) / 2}
	t.loMask = 1<<t.loBits - 1
	t.lo = make([]complex128, 1<<t.loBits)
	for i := range t.lo {
		s, c := math.Sincos(-2 * math.Pi * float64(i) / float64(n))
		t.lo[i] = complex(c, s)
	}
	t.hi = make([]complex128, n>>t.loBits)
	for i := range t.hi {
		s, c := math.Sincos(-2 * math.Pi * float64(i<<t.loBits) / float64(n))
		t.hi[i] = complex(c, s)
	}
	return t
}

// at returns W_N^m for 0 ≤ m < N.
func (t *twiddles) at(m int) complex128 { return t.lo[m&t.loMask] * t.hi[m>>t.loBits] }

// fftPlan computes the forward DFT X[k] = Σ_n x[n]·exp(−2πi·n·k/N) of a
// power-of-2 length N. Above maxDirectFFT it first splits the transform
// by one decimation-in-frequency step of radix P = 4 or 8 (Gentleman &
// Sande 1966, AFIPS Proc. 29, 563 [from memory]): with n = n' + b·N/P,
//
//	X[P·m + r] = Σ_n' [W_N^(n'·r) · Σ_b x[n' + b·N/P]·W_P^(b·r)] · W_(N/P)^(n'·m),
//
// so P independent transforms of length N/P, a power of 4 (P is chosen so),
// which may run in parallel (see top and subTransform); with P = 8 rather
// than 2 for odd powers of 2 they are also a quarter the size, which
// spreads the work more evenly over the cores. Each of those is
// done by the four-step method (fourStep) when it is longer than
// maxDirectFFT, else by gonum whole. After top and every subTransform,
// X[P·m + r] is in part r (see part), at position m of the sub-transform's
// output, (m mod N1)·N2 + ⌊m/N1⌋ (N2 = 1 when it went to gonum whole).
type fftPlan struct {
	n     int
	parts int // P: 1 (no split), 4 or 8
	log2P uint
	tw    twiddles  // W_N^m for the split (unused when P = 1)
	sub   *fourStep // transforms of length N/P
}

// newFFTPlan returns the plan for a power-of-2 length n: P = 1 up to
// maxDirectFFT, else P = 4 or 8 so that N/P is a power of 4.
func newFFTPlan(n int) *fftPlan {
	f := &fftPlan{n: n, parts: 1}
	if n > maxDirectFFT {
		if bits.TrailingZeros(uint(n))%2 == 1 {
			f.parts, f.log2P = 8, 3
		} else {
			f.parts, f.log2P = 4, 2
		}
		f.tw = newTwiddles(n)
	}
	f.sub = newFourStep(n / f.parts)
	return f
}

// top does the radix-P split: afterwards part r of the data (see part)
// holds the input of sub-transform r, in scratch when the sub-transforms
// are four-step ones (already in the transposed order their first step
// wants, which saves a pass over the data), else in x. x and scratch have
// length N. It does nothing when P = 1.
func (f *fftPlan) top(x, scratch []complex128) {
	m := f.n >> f.log2P
	if f.parts == 1 {
		return
	}
	if f.sub.n2 == 1 {
		f.topRange(x, x, 0, m, 1, 0)
		return
	}
	// Source index i = N2·n1 + n2 goes to n2·N1 + n1: rows of n1 in blocks
	// so that both sides stay in cache.
	const blk = 32
	n1, n2 := f.sub.n1, f.sub.n2
	for a0 := 0; a0 < n1; a0 += blk {
		for c := 0; c < n2; c += blk {
			for a := a0; a < min(a0+blk, n1); a++ {
				f.topRange(scratch, x, a*n2+c, min(blk, n2-c), n1, c*n1+a)
			}
		}
	}
}

// topRange does the radix-P butterflies for source indices i = lo … lo+n−1
// of every part of src, writing the results for i = lo + j at dst[part +
// at + j·stride].
func (f *fftPlan) topRange(dst, src []complex128, lo, n, stride, at int) {
	m := f.n >> f.log2P
	switch f.parts {
	case 4:
		s0, s1, s2, s3 := src[lo:lo+n], src[m+lo:m+lo+n], src[2*m+lo:2*m+lo+n], src[3*m+lo:3*m+lo+n]
		d0, d1, d2, d3 := dst[at:], dst[m+at:], dst[2*m+at:], dst[3*m+at:]
		for j, a0 := range s0 {
			i := lo + j
			y0, y1, y2, y3 := dft4(a0, s1[j], s2[j], s3[j])
			k := j * stride
			d0[k] = y0
			d1[k] = y1 * f.tw.at(i)
			d2[k] = y2 * f.tw.at(2*i)
			d3[k] = y3 * f.tw.at(3*i)
		}
	case 8:
		// Y_r = E_(r mod 4) ± W_8^r·O_(r mod 4), from the 4-point DFTs E
		// of the even-numbered inputs and O of the odd-numbered ones.
		var sp, dp [8][]complex128
		for b := range sp {
			sp[b] = src[b*m+lo : b*m+lo+n]
			dp[b] = dst[b*m+at:]
		}
		for j, a0 := range sp[0] {
			i := lo + j
			e0, e1, e2, e3 := dft4(a0, sp[2][j], sp[4][j], sp[6][j])
			o0, o1, o2, o3 := dft4(sp[1][j], sp[3][j], sp[5][j], sp[7][j])
			o1 = complex(real(o1)+imag(o1), imag(o1)-real(o1)) * sqrtHalf  // ·W_8 = (1 − i)/√2
			o2 = complex(imag(o2), -real(o2))                              // ·W_8² = −i
			o3 = complex(imag(o3)-real(o3), -real(o3)-imag(o3)) * sqrtHalf // ·W_8³ = −(1 + i)/√2
			k := j * stride
			dp[0][k] = e0 + o0
			dp[1][k] = (e1 + o1) * f.tw.at(i)
			dp[2][k] = (e2 + o2) * f.tw.at(2*i)
			dp[3][k] = (e3 + o3) * f.tw.at(3*i)
			dp[4][k] = (e0 - o0) * f.tw.at(4*i)
			dp[5][k] = (e1 - o1) * f.tw.at(5*i)
			dp[6][k] = (e2 - o2) * f.tw.at(6*i)
			dp[7][k] = (e3 - o3) * f.tw.at(7*i)
		}
	}
}

// sqrtHalf is √½, the real and imaginary size of W_8 = (1 − i)/√2.
const sqrtHalf = 0.70710678118654752440084436210484903928483593768847

// dft4 returns the 4-point DFT Y_r = Σ_b v_b·(−i)^(b·r).
func dft4(v0, v1, v2, v3 complex128) (y0, y1, y2, y3 complex128) {
	s02, d02 := v0+v2, v0-v2
	s13, d13 := v1+v3, v1-v3
	jd13 := complex(imag(d13), -real(d13)) // −i·(v1 − v3)
	return s02 + s13, d02 + jd13, s02 - s13, d02 - jd13
}

// part returns part r of x, of length N/P.
func (f *fftPlan) part(x []complex128, r int) []complex128 {
	m := f.n >> f.log2P
	return x[r*m : (r+1)*m]
}

// subTransform runs sub-transform r after top, leaving its result in
// part r of x. Different r touch different parts of x and scratch, so
// they may run at the same time.
func (f *fftPlan) subTransform(x, scratch []complex128, r int) {
	if f.sub.n2 == 1 {
		radix(f.part(x, r))
		return
	}
	f.sub.transformTransposed(f.part(x, r), f.part(scratch, r))
}

// fourStep computes the forward DFT of a power-of-2 length N by the
// four-step method (Bailey 1990, J. Supercomputing 4, 23 [from memory]):
// with N = N1·N2, n = N2·n1 + n2 and k = k1 + N1·k2,
//
//	X[k1 + N1·k2] = Σ_n2 W_N^(n2·k1) · [Σ_n1 x[N2·n1 + n2]·W_N1^(n1·k1)] · W_N2^(n2·k2),
//
// so N2 transforms of length N1 and N1 of length N2, each short enough for
// gonum's radix-2/4 FFT to stay accurate, with each twiddle W_N^(n2·k1)
// from a twiddles table (a few ulps). Lengths up to maxDirectFFT have
// N2 = 1 and go to gonum whole.
type fourStep struct {
	n, n1, n2 int
	log1      uint // log2(N1)
	tw        twiddles
}

// newFourStep returns the four-step plan for a power-of-2 length n.
func newFourStep(n int) *fourStep {
	f := &fourStep{n: n, n1: n, n2: 1}
	if n <= maxDirectFFT {
		return f
	}
	// N1 a power of 4 near √N, so that its transforms are radix 4 (faster
	// than radix 2 in gonum); N2 is then a power of 4 too when N is.
	p := uint(bits.TrailingZeros(uint(n)))
	f.log1 = p / 2
	if f.log1%2 == 1 {
		if p%2 == 0 {
			f.log1--
		} else {
			f.log1++
		}
	}
	f.n1 = 1 << f.log1
	f.n2 = n / f.n1
	f.tw = newTwiddles(n)
	return f
}

// radix runs gonum's in-place radix-4 FFT when len(x) is a power of 4 and
// its radix-2 FFT otherwise.
func radix(x []complex128) {
	if bits.TrailingZeros(uint(len(x)))%2 == 0 {
		fourier.CoefficientsRadix4(x)
	} else {
		fourier.CoefficientsRadix2(x)
	}
}

// transformTransposed computes the DFT of the length-N data whose element
// N2·n1 + n2 is held in scratch[n2·N1 + n1] (step 1, the transposition,
// is done by fftPlan.top as it writes), leaving X[k1 + N1·k2] in
// x[k1·N2 + k2].
func (f *fourStep) transformTransposed(x, scratch []complex128) {
	n1, n2 := f.n1, f.n2
	// Step 2: length-N1 transforms of the rows of scratch.
	for r := 0; r < n2; r++ {
		radix(scratch[r*n1 : (r+1)*n1])
	}
	// Steps 3–4: twiddle by W_N^(n2·k1) while transposing back: x[k1][n2].
	f.twiddleTranspose(x, scratch)
	// Step 5: length-N2 transforms of the rows of x.
	for r := 0; r < n1; r++ {
		radix(x[r*n2 : (r+1)*n2])
	}
}

// twiddleTranspose writes x[k1][n2] = scratch[n2][k1]·W_N^(n2·k1).
func (f *fourStep) twiddleTranspose(x, scratch []complex128) {
	const blk = 32
	rows, cols := f.n2, f.n1 // scratch is n2 × n1
	for r0 := 0; r0 < rows; r0 += blk {
		r1 := min(r0+blk, rows)
		for c0 := 0; c0 < cols; c0 += blk {
			c1 := min(c0+blk, cols)
			for r := r0; r < r1; r++ {
				s := scratch[r*cols : (r+1)*cols]
				for c := c0; c < c1; c++ {
					x[c*rows+r] = s[c] * f.tw.at(r*c)
				}
			}
		}
	}
}
