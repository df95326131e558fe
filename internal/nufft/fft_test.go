package nufft

import (
	"fmt"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/dsp/fourier"
)

// TestFourStepAgainstGonumCmplxFFT compares the split FFT with gonum's
// mixed-radix CmplxFFT, which computes its twiddles one by one and so stays
// accurate at any length.
func TestFourStepAgainstGonumCmplxFFT(t *testing.T) {
	// relTol bounds max|X − X_ref| / max|X_ref| for Gaussian input; gonum's
	// radix-2 FFT alone misses it by a factor of ten at 2^17.
	const relTol = 1e-13
	for _, n := range []int{8, 1024, 2048, 4096, 1 << 15, 1 << 16, 1 << 17, 1 << 18, 1 << 21} {
		t.Run(fmt.Sprint(n), func(t *testing.T) {
			r := rand.New(rand.NewPCG(uint64(n), 3))
			x := make([]complex128, n)
			for i := range x {
				x[i] = complex(r.NormFloat64(), r.NormFloat64())
			}
			want := fourier.NewCmplxFFT(n).Coefficients(nil, x)
			f := newFFTPlan(n)
			got := append([]complex128(nil), x...)
			f.transform(got, make([]complex128, n))
			var worst, scale float64
			for k := range want {
				worst = max(worst, cmplx.Abs(got[f.at(k)]-want[k]))
				scale = max(scale, cmplx.Abs(want[k]))
			}
			if worst/scale > relTol {
				t.Errorf("N=%d (P=%d, N1=%d, N2=%d): max error %.3g of max |X| %.3g = %.2g, tol %.0g", n, f.parts, f.sub.n1, f.sub.n2, worst, scale, worst/scale, relTol)
			}
			t.Logf("N=%d (P=%d, N1=%d, N2=%d): max error %.2g of max |X|", n, f.parts, f.sub.n1, f.sub.n2, worst/scale)
		})
	}
}

func BenchmarkFFT(b *testing.B) {
	for _, n := range []int{1 << 16, 1 << 17, 1 << 18} {
		f := newFFTPlan(n)
		x := make([]complex128, n)
		s := make([]complex128, n)
		b.Run(fmt.Sprintf("split/%d", n), func(b *testing.B) {
			for b.Loop() {
				f.transform(x, s)
			}
		})
		b.Run(fmt.Sprintf("gonumradix/%d", n), func(b *testing.B) {
			for b.Loop() {
				radix(x)
			}
		})
	}
}

func BenchmarkType1(b *testing.B) {
	const n, modes = 10000, 100000
	r := rand.New(rand.NewPCG(1, 1))
	u := make([]float64, n)
	c := make([]complex128, n)
	for j := range u {
		u[j] = r.Float64() * 0.2
		c[j] = complex(r.NormFloat64(), r.NormFloat64())
	}
	b.Run("plan", func(b *testing.B) {
		for b.Loop() {
			if _, err := NewPlan(modes, 1e-12); err != nil {
				b.Fatal(err)
			}
		}
	})
	p, err := NewPlan(modes, 1e-12)
	if err != nil {
		b.Fatal(err)
	}
	dst := [][]complex128{make([]complex128, modes)}
	b.Run("transform", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			if err := p.Type1(dst, u, [][]complex128{c}); err != nil {
				b.Fatal(err)
			}
		}
	})
}

// transform overwrites x with its DFT, using scratch (length N) as work
// space. The result is left in a permuted order: read X[k] as x[f.at(k)].
func (f *fftPlan) transform(x, scratch []complex128) {
	f.top(x, scratch)
	for r := range f.parts {
		f.subTransform(x, scratch, r)
	}
}

// at returns where transform leaves X[k], for 0 ≤ k < N.
func (f *fftPlan) at(k int) int {
	r := k & (f.parts - 1)
	return r*(f.n>>f.log2P) + f.sub.at(k>>f.log2P)
}

// at returns where fourStep.transformTransposed leaves X[k], for 0 ≤ k < N.
func (f *fourStep) at(k int) int {
	if f.n2 == 1 {
		return k
	}
	return (k&(f.n1-1))*f.n2 + k>>f.log1
}
