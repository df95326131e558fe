package nufft

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"
)

// directType1 is the O(N·K) sum the transform approximates, with each
// phase k·u reduced to [0, 1) cycles, without rounding, before the sine and
// cosine. Only the
// modes whose index i (0 … K−1) passes keep are computed; the others are 0.
func directType1(u []float64, c []complex128, modes int, keep func(i int) bool) []complex128 {
	out := make([]complex128, modes)
	lo := -(modes / 2)
	for i := range out {
		if !keep(i) {
			continue
		}
		k := float64(lo + i)
		var s complex128
		for j, uj := range u {
			// k·u_j = ph + r exactly (k is an integer): reduce ph, then add
			// the rounding residual r, so the phase is exact to ~1e-17.
			ph := k * uj
			r := math.FMA(k, uj, -ph)
			ph = ph - math.Floor(ph) + r
			sn, cs := math.Sincos(2 * math.Pi * ph)
			s += c[j] * complex(cs, sn)
		}
		out[i] = s
	}
	return out
}

func TestType1AgainstDirectSum(t *testing.T) {
	cases := []struct {
		name   string
		points int
		modes  int
		tol    float64
		spread float64 // points lie in [0, spread) cycles
	}{
		{"one mode", 20, 1, 1e-12, 1},
		{"odd modes, wide points", 300, 257, 1e-12, 7.3},
		{"even modes, clustered points", 500, 1000, 1e-12, 0.1},
		{"tolerance 1e-6", 400, 3000, 1e-6, 1},
		{"tolerance 1e-9", 400, 3001, 1e-9, 1},
		{"tolerance 1e-13", 400, 2048, 1e-13, 1},
		{"large grid (edges and every 17th mode)", 2000, 100000, 1e-12, 0.2},
		{"four-step FFT, power of 4 factors", 1000, 200000, 1e-10, 1},
		{"2^20 modes (a periodogram block)", 300, 1 << 20, 1e-12, 0.2},
		{"grid just above a power of two", 200, 6554, 1e-12, 1}, // 1.25·6554 > 8192
		{"negative points", 300, 999, 1e-12, -3},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			r := rand.New(rand.NewPCG(uint64(tc.points), uint64(tc.modes)))
			u := make([]float64, tc.points)
			c := make([]complex128, tc.points)
			var l1 float64
			for j := range u {
				u[j] = r.Float64() * tc.spread
				c[j] = complex(r.NormFloat64(), r.NormFloat64())
				l1 += cmplx.Abs(c[j])
			}
			p, err := NewPlan(tc.modes, tc.tol)
			if err != nil {
				t.Fatal(err)
			}
			got := make([]complex128, tc.modes)
			if err := p.Type1([][]complex128{got}, u, [][]complex128{c}); err != nil {
				t.Fatal(err)
			}
			keep := func(i int) bool {
				return tc.modes < 5000 || i < 300 || i >= tc.modes-300 || i%(17+tc.modes/20000) == 0
			}
			want := directType1(u, c, tc.modes, keep)
			var worst float64
			for k := range got {
				if !keep(k) {
					continue
				}
				worst = max(worst, cmplx.Abs(got[k]-want[k])/l1)
			}
			if worst > tc.tol {
				t.Errorf("K=%d M=%d w=%d: max |F−F_direct|/Σ|c| = %.3g, tol %.3g", tc.modes, p.GridSize(), p.Width(), worst, tc.tol)
			}
			t.Logf("K=%d M=%d w=%d: max relative error %.3g (tol %.0g)", tc.modes, p.GridSize(), p.Width(), worst, tc.tol)
		})
	}
}

func TestType1SharedPointsMatchSeparateCalls(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 8))
	const n, modes = 200, 500
	u := make([]float64, n)
	a := make([]complex128, n)
	b := make([]complex128, n)
	for j := range u {
		u[j] = r.Float64()
		a[j] = complex(r.NormFloat64(), 0)
		b[j] = complex(0, r.NormFloat64())
	}
	p, err := NewPlan(modes, 1e-12)
	if err != nil {
		t.Fatal(err)
	}
	both := [][]complex128{make([]complex128, modes), make([]complex128, modes)}
	if err := p.Type1(both, u, [][]complex128{a, b}); err != nil {
		t.Fatal(err)
	}
	for s, c := range [][]complex128{a, b} {
		one := make([]complex128, modes)
		if err := p.Type1([][]complex128{one}, u, [][]complex128{c}); err != nil {
			t.Fatal(err)
		}
		for k := range one {
			if one[k] != both[s][k] {
				t.Errorf("vector %d mode %d: shared %v, alone %v", s, k, both[s][k], one[k])
				break
			}
		}
	}
}

// TestKernelPolyAgainstES compares the piecewise polynomial that spread
// evaluates with the ES kernel φ(z) = exp(β(√(1−z²) − 1)) of Barnett,
// Magland & af Klinteberg (2019, eq. 1.8 [equation number from memory]),
// written here in that textbook form, at offsets other than those
// fitKernel checked, for plans of every kernel width from 2 to 22 cells.
func TestKernelPolyAgainstES(t *testing.T) {
	// kernelTestTol is added to the fit's design bound 2·exp(−β): it
	// covers kernelRound and the rounding of the textbook formula, whose
	// exponent β(√(1−z²) − 1) carries an absolute error of about β·1e-16.
	const kernelTestTol = 2e-14
	widths := map[int]bool{}
	for _, modes := range []int{1, 100, 6554, 52429, 100000} {
		for e := -13.0; e < -1; e += 0.5 { // tolerances 1e-13 … 10^-1.5
			tol := math.Pow(10, e)
			p, err := NewPlan(modes, tol)
			if err != nil {
				t.Fatal(err)
			}
			w := p.width
			if !widths[w] {
				t.Logf("w=%d (K=%d, tol %.1g, σ=%.2f): degree %d", w, modes, tol, float64(p.grid)/float64(modes), p.ker.deg)
			}
			widths[w] = true
			if p.ker.deg >= maxKernelDeg {
				t.Errorf("K=%d tol=%g w=%d: fit reached the degree cap %d", modes, tol, w, maxKernelDeg)
			}
			r := rand.New(rand.NewPCG(uint64(modes), uint64(w)))
			ker := make([]float64, w)
			bound := 2*math.Exp(-p.beta) + kernelTestTol
			var worst float64
			for range 2000 {
				x := (float64(w)/2 - 1) + r.Float64() // position past the first cell, (w/2 − 1, w/2]
				p.ker.eval(ker, x-float64(w-1)/2)
				for q, got := range ker {
					z := (x - float64(q)) * 2 / float64(w)
					want := math.Exp(p.beta * (math.Sqrt(1-z*z) - 1))
					worst = max(worst, math.Abs(got-want))
				}
			}
			if worst > bound {
				t.Errorf("K=%d tol=%g w=%d deg=%d: max |poly − φ| = %.3g, tol %.3g", modes, tol, w, p.ker.deg, worst, bound)
			}
		}
	}
	for w := 2; w <= 22; w++ {
		if !widths[w] {
			t.Errorf("no plan had kernel width %d", w)
		}
	}
}

func TestCorrectionAgainstFineQuadrature(t *testing.T) {
	// ψ̂(k) by the composite Simpson rule with 200000 cells: an independent
	// check of the Gauss–Legendre values the plan divides by.
	p, err := NewPlan(3300, 1e-12) // σ = 8192/3300 = 2.48
	if err != nil {
		t.Fatal(err)
	}
	const cells = 200000 // even
	const relTol = 1e-13
	for _, k := range []int{0, 1, 17, 999, 1600, 1651} {
		f := func(i int) float64 {
			z := float64(i) / cells
			return p.es(z) * math.Cos(math.Pi*float64(k*p.width)*z/float64(p.grid))
		}
		s := f(0) + f(cells)
		for i := 1; i < cells; i++ {
			s += float64(2+2*(i%2)) * f(i)
		}
		want := s / (3 * cells) * float64(p.width)
		got := 1 / p.corr[k]
		if d := math.Abs(got-want) / want; d > relTol {
			t.Errorf("ψ̂(%d) = %.15g, midpoint rule %.15g, relative diff %.2g > %.0g", k, got, want, d, relTol)
		}
	}
}

func TestBadInput(t *testing.T) {
	if _, err := NewPlan(0, 1e-12); err == nil {
		t.Errorf("NewPlan(0 modes): no error")
	}
	if _, err := NewPlan(MaxModes+1, 1e-12); err == nil {
		t.Errorf("NewPlan(MaxModes+1): no error")
	}
	for _, tol := range []float64{0, 1e-20, 0.5, math.NaN()} {
		if _, err := NewPlan(10, tol); err == nil {
			t.Errorf("NewPlan(tol %v): no error", tol)
		}
	}
	p, err := NewPlan(10, 1e-9)
	if err != nil {
		t.Fatal(err)
	}
	out := [][]complex128{make([]complex128, 10)}
	if err := p.Type1(out, []float64{0.1, math.NaN()}, [][]complex128{{1, 1}}); err == nil {
		t.Errorf("NaN point: no error")
	}
	if err := p.Type1(out, []float64{0.1}, [][]complex128{{1, 1}}); err == nil {
		t.Errorf("length mismatch: no error")
	}
	if err := p.Type1([][]complex128{make([]complex128, 9)}, []float64{0.1}, [][]complex128{{1}}); err == nil {
		t.Errorf("short output: no error")
	}
}

func TestGaussLegendre(t *testing.T) {
	// An n-point rule integrates polynomials of degree 2n−1 exactly:
	// ∫₀¹ z^d dz = 1/(d+1) (Abramowitz & Stegun 1964, §25.4.29).
	const tol = 1e-14
	for _, n := range []int{1, 2, 5, 26, 40} {
		z := make([]float64, n)
		w := make([]float64, n)
		gaussLegendre(z, w)
		for _, d := range []int{0, 1, 2*n - 1} {
			var s float64
			for i := range z {
				s += w[i] * math.Pow(z[i], float64(d))
			}
			if want := 1 / float64(d+1); math.Abs(s-want) > tol {
				t.Errorf("n=%d: ∫z^%d = %.16g, want %.16g, diff %.2g, tol %.0g", n, d, s, want, s-want, tol)
			}
		}
	}
}

func TestCachedPlan(t *testing.T) {
	a, err := CachedPlan(1234, 1e-10)
	if err != nil {
		t.Fatal(err)
	}
	b, _ := CachedPlan(1234, 1e-10)
	if a != b {
		t.Errorf("second CachedPlan(1234, 1e-10) made a new plan")
	}
	for m := 1; m <= cacheSize; m++ {
		if _, err := CachedPlan(m, 1e-10); err != nil {
			t.Fatal(err)
		}
	}
	c, _ := CachedPlan(1234, 1e-10)
	if c == a {
		t.Errorf("plan survived %d newer plans in a cache of %d", cacheSize, cacheSize)
	}
	if c.Modes() != 1234 || c.Tol() != 1e-10 {
		t.Errorf("cached plan has %d modes, tol %g; want 1234, 1e-10", c.Modes(), c.Tol())
	}
	if _, err := CachedPlan(0, 1e-10); err == nil {
		t.Errorf("CachedPlan(0 modes): no error")
	}
}
