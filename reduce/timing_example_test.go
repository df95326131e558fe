package reduce_test

import (
	"fmt"
	"math"

	"example.org/vigil/ephem"
	"example.org/vigil/reduce"
)

// The synthetic eclipse of methods.md §10 (true minimum JD 2460000.4321),
// timed by Kwee & van Woerden (1956) with the original three folds over all
// 61 points, as in the check values there (K = 28 pairs).
func ExampleExtremum() {
	var pts []reduce.Point
	for k := range 61 {
		t := 2460000.3700 + 0.002*float64(k)
		m := 10 + 0.5*math.Exp(-math.Pow((t-2460000.4321)/0.02, 2))
		pts = append(pts, reduce.Point{T: t, Mag: m, Err: math.NaN()})
	}
	tm, err := reduce.Extremum(pts, reduce.ExtremumOptions{
		Kind: reduce.Minimum, Method: reduce.MethodKvW, Folds: 3, WindowDays: 1,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("minimum at JD %.5f (%s, %d points, K = %d)\n", tm.Time, tm.Method, tm.N, tm.Pairs)
	fmt.Printf("off the truth by %.1f s\n", math.Abs(tm.Time-2460000.4321)*86400)
	// Output:
	// minimum at JD 2460000.43210 (kvw, 61 points, K = 28)
	// off the truth by 0.1 s
}

// The synthetic timings of methods.md §11: T = T0 + P·E + Q·E² with
// T0 = 2450000.0, P = 0.4 d, Q = 2e-10 d, against the linear elements.
func ExampleOC_quadratic() {
	eph := ephem.Ephemeris{Epoch: 2450000.0, PeriodDays: 0.4, Scale: ephem.BJDTDB}
	var timings []reduce.Timing
	for e := 0.0; e <= 20000; e += 5000 {
		timings = append(timings, reduce.Timing{Time: eph.At(e) + 2e-10*e*e})
	}
	a, err := reduce.OC(eph, timings, reduce.OCOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, r := range a.Rows {
		fmt.Printf("E = %5.0f  O−C = %.3f d\n", r.Cycle, r.OCDays)
	}
	q := a.Quadratic
	fmt.Printf("Q = %.2g d, dP/dt = %.2g d/d = %.5f s/yr\n", q.Q, q.DPdt, q.DPdtSecPerYear)
	fmt.Println("preferred:", a.Preferred)
	// Output:
	// E =     0  O−C = 0.000 d
	// E =  5000  O−C = 0.005 d
	// E = 10000  O−C = 0.020 d
	// E = 15000  O−C = 0.045 d
	// E = 20000  O−C = 0.080 d
	// Q = 2e-10 d, dP/dt = 1e-09 d/d = 0.03156 s/yr
	// preferred: quadratic
}

// δ Cep (methods.md §13): P = 5.366341 d, ⟨V⟩ = 3.94, A_V = 0.23, with the
// default relation of Benedict et al. (2007). Its HST parallax gives 273 pc.
func ExampleDistance() {
	d, err := reduce.Distance(5.366341, 3.94, 0.23, "")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("M_V = %.4f, d = %.0f ± %.0f pc\n", d.AbsMag, d.DistancePc, d.DistanceErrPc)
	fmt.Println(d.Relation.Reference)
	// Output:
	// M_V = -3.3931, d = 263 ± 5 pc
	// Benedict et al. 2007, AJ 133, 1810 (HST parallaxes, V band)
}

// The intensity mean of V = 3.5 and 4.4 (methods.md §13) is brighter than
// their magnitude mean, 3.95.
func ExampleIntensityMean() {
	m, _ := reduce.IntensityMean([]float64{3.5, 4.4})
	fmt.Printf("%.4f\n", m)
	// Output: 3.8593
}
