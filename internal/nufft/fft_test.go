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
	for _, n := range []int{8, 1024, 2048, 4096, 1 << 15, 1 << 17, 1 << 18} {
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
				t.Errorf("N=%d (N1=%d, N2=%d): max error %.3g of max |X| %.3g = %.2g, tol %.0g", n, f.n1, f.n2, worst, scale, worst/scale, relTol)
			}
		})
	}
}

func BenchmarkFFT(b *testing.B) {
	for _, n := range []int{1 << 16, 1 << 17, 1 << 18} {
		f := newFFTPlan(n)
		x := make([]complex128, n)
		s := make([]complex128, n)
		b.Run(fmt.Sprintf("fourstep/%d", n), func(b *testing.B) {
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
