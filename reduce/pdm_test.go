package reduce

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
)

// pdmThetaTol bounds the difference between two evaluations of θ from the
// same bins (rounding only).
const pdmThetaTol = 1e-12

// TestPDMMethodsCheckValues: methods.md §12 [C], 10 equal bins, phase =
// periodFrac(t/P), no covers. The series' times lie on a lattice, so at many
// periods some phases are exactly on a bin edge; PDM puts them in the bin
// above (exact arithmetic, as pdm.csv's rational phases do). methods.md's
// Θ(0.6), Θ(1.5) and Θ(0.375) agree with that; its Θ(0.75) = 0.14945 and
// Θ(0.45) = 1.09610 put edge points below their edges (floating-point
// rounding), so they are not used: exact arithmetic gives 0.19513 and
// 1.08077 (pdm.csv, checked in TestPDMAgainstNumpy).
func TestPDMMethodsCheckValues(t *testing.T) {
	const tol = 5e-6 // methods.md quotes 5 decimals
	cases := []struct {
		period, want float64
	}{
		{0.6, 0.03691},
		{1.5, 0.11150},
		{0.375, 0.18919},
	}
	for _, tc := range cases {
		t.Run(fmt.Sprint(tc.period), func(t *testing.T) {
			got, err := PDMTheta(periodMethods60(), tc.period, 10, 1)
			if err != nil {
				t.Fatal(err)
			}
			if d := math.Abs(got - tc.want); d > tol {
				t.Errorf("θ(%g) = %.6f, want %.5f (methods.md §12), diff %.2g, tol %.0g", tc.period, got, tc.want, d, tol)
			}
		})
	}
}

// TestPDMAgainstNumpy compares PDMTheta with an independent numpy
// implementation (testdata/period/pdm.csv, exact rational phases for the
// lattice series methods60), with covers.
func TestPDMAgainstNumpy(t *testing.T) {
	c, s := readPeriodTable(t, "pdm.csv")
	for i, name := range s["name"] {
		period, bins, covers, want := c["period"][i], int(c["bins"][i]), int(c["covers"][i]), c["theta"][i]
		t.Run(fmt.Sprintf("%s P=%.5g %d×%d", name, period, bins, covers), func(t *testing.T) {
			got, err := PDMTheta(readPeriodCurve(t, name), period, bins, covers)
			if err != nil {
				t.Fatal(err)
			}
			if d := math.Abs(got - want); d > pdmThetaTol {
				t.Errorf("θ = %.12f, numpy %.12f, diff %.2g, tol %.0g", got, want, d, pdmThetaTol)
			}
		})
	}
}

// TestPDMGridEqualsDirect checks that the stepped fixed-point phases of
// PDM give the same θ as PDMTheta's direct phases at every frequency,
// across chunk boundaries and with covers.
func TestPDMGridEqualsDirect(t *testing.T) {
	cases := []struct {
		name         string
		pts          []Point
		grid         FreqGrid
		bins, covers int
	}{
		{"methods60, 10 bins", periodMethods60(), FreqGrid{Start: 0.05, Step: 0.0005, N: 3000}, 10, 1},
		{"nightly JDs, 5 bins × 2 covers", periodNightly(700, 90, 0.37, 0.1, 0.02, 21), FreqGrid{Start: 0.02, Step: 0.0021, N: 2500}, 5, 2},
		{"high frequencies, 8 × 3", periodUniform(300, 2458000, 20, false, 22), FreqGrid{Start: 50, Step: 0.01, N: 2100}, 8, 3},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			theta, err := PDM(context.Background(), tc.pts, tc.grid, tc.bins, tc.covers, nil)
			if err != nil {
				t.Fatal(err)
			}
			bad := 0
			for k, got := range theta {
				want, err := PDMTheta(tc.pts, 1/tc.grid.Freq(k), tc.bins, tc.covers)
				if err != nil {
					t.Fatal(err)
				}
				if d := math.Abs(got - want); d > pdmThetaTol && bad < 10 {
					bad++
					t.Errorf("f = %.9g: grid θ %.12f, direct θ %.12f, diff %.2g, tol %.0g", tc.grid.Freq(k), got, want, d, pdmThetaTol)
				}
			}
		})
	}
}

// TestPDMNoPeriod checks θ ≈ 1 for white noise (Stellingwerf 1978: the
// expected θ without a period is 1, with scatter of order √(2M/N)).
func TestPDMNoPeriod(t *testing.T) {
	r := rand.New(rand.NewPCG(23, 24))
	pts := make([]Point, 3000)
	for i := range pts {
		pts[i] = Point{T: 2459000 + 100*r.Float64(), Mag: 10 + 0.05*r.NormFloat64()}
	}
	theta, err := PDM(context.Background(), pts, FreqGrid{Start: 3, Step: 0.1, N: 50}, 10, 1, nil)
	if err != nil {
		t.Fatal(err)
	}
	const tol = 0.1 // ≈ 5·√(2·10/3000)
	for k, th := range theta {
		if math.Abs(th-1) > tol {
			t.Errorf("θ(%g c/d) = %.4f for noise, want 1 ± %g", 3+0.1*float64(k), th, tol)
		}
	}
}

func ExamplePDMTheta() {
	// methods.md §12: the 60-point series folded on its true period 0.6 d
	// and on a wrong one, 10 bins, no covers.
	var pts []Point
	for i := range 60 {
		t := float64(i/6) + 0.25 + 0.04*float64(i%6)
		pts = append(pts, Point{T: t, Mag: 10 + 0.30*math.Sin(2*math.Pi*t/0.6) + 0.01*float64((37*i%17)-8)/8})
	}
	for _, p := range []float64{0.6, 0.45} {
		theta, err := PDMTheta(pts, p, 10, 1)
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("θ(%.2f d) = %.5f\n", p, theta)
	}
	// Output:
	// θ(0.60 d) = 0.03691
	// θ(0.45 d) = 1.08077
}
