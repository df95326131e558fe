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

// fftPlan computes the forward DFT X[k] = Σ_n x[n]·exp(−2πi·n·k/N) of a
// power-of-2 length N by the four-step method (Bailey 1990, J.
// Supercomputing 4, 23 [from memory]): with N = N1·N2, n = N2·n1 + n2 and
// k = k1 + N1·k2,
//
//	X[k1 + N1·k2] = Σ_n2 W_N^(n2·k1) · [Σ_n1 x[N2·n1 + n2]·W_N1^(n1·k1)] · W_N2^(n2·k2),
//
// so N2 transforms of length N1 and N1 of length N2, each short enough for
// gonum's radix-2/4 FFT to stay accurate, with each twiddle W_N^(n2·k1)
// the product of two entries of tables of about √N values (a few ulps).
type fftPlan struct {
	n, n1, n2 int
	log1      uint         // log2(N1)
	loBits    uint         // twiddle m = hi<<loBits | lo
	twLo      []complex128 // exp(−2πi·lo/N)
	twHi      []complex128 // exp(−2πi·hi·2^loBits/N)
}

func newFFTPlan(n int) *fftPlan {
	f := &fftPlan{n: n, n1: n, n2: 1}
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
	f.loBits = (p + 1) / 2
	lo := 1 << f.loBits
	f.twLo = make([]complex128, lo)
	for i := range f.twLo {
		s, c := math.Sincos(-2 * math.Pi * float64(i) / float64(n))
		f.twLo[i] = complex(c, s)
	}
	f.twHi = make([]complex128, n>>f.loBits)
	for i := range f.twHi {
		s, c := math.Sincos(-2 * math.Pi * float64(i<<f.loBits) / float64(n))
		f.twHi[i] = complex(c, s)
	}
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

// transform overwrites x with its DFT, using scratch (length N) as work
// space. The result is left in a permuted order: read X[k] as x[f.at(k)].
func (f *fftPlan) transform(x, scratch []complex128) {
	if f.n2 == 1 {
		radix(x)
		return
	}
	n1, n2 := f.n1, f.n2
	// Step 1: scratch[n2][n1] = x[n1][n2] (transpose, blocked for cache).
	transpose(scratch, x, n1, n2)
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

// at returns where transform leaves X[k], for 0 ≤ k < N.
func (f *fftPlan) at(k int) int {
	if f.n2 == 1 {
		return k
	}
	return (k&(f.n1-1))*f.n2 + k>>f.log1
}

// twiddleTranspose writes x[k1][n2] = scratch[n2][k1]·W_N^(n2·k1), with
// the twiddle exp(−2πi·m/N), m = n2·k1 < N, as the product of two table
// entries (m split into high and low bits).
func (f *fftPlan) twiddleTranspose(x, scratch []complex128) {
	const blk = 32
	rows, cols := f.n2, f.n1 // scratch is n2 × n1
	loMask := 1<<f.loBits - 1
	for r0 := 0; r0 < rows; r0 += blk {
		r1 := min(r0+blk, rows)
		for c0 := 0; c0 < cols; c0 += blk {
			c1 := min(c0+blk, cols)
			for r := r0; r < r1; r++ {
				s := scratch[r*cols : (r+1)*cols]
				for c := c0; c < c1; c++ {
					m := r * c
					x[c*rows+r] = s[c] * f.twLo[m&loMask] * f.twHi[m>>f.loBits]
				}
			}
		}
	}
}

// transpose writes dst[c][r] = src[r][c] for an rows×cols src.
func transpose(dst, src []complex128, rows, cols int) {
	const blk = 32
	for r0 := 0; r0 < rows; r0 += blk {
		r1 := min(r0+blk, rows)
		for c0 := 0; c0 < cols; c0 += blk {
			c1 := min(c0+blk, cols)
			for r := r0; r < r1; r++ {
				s := src[r*cols : (r+1)*cols]
				for c := c0; c < c1; c++ {
					dst[c*rows+r] = s[c]
				}
			}
		}
	}
}
