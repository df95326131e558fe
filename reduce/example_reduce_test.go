package reduce_test

import (
	"fmt"
	"strings"

	"example.org/vigil/ephem"
	"example.org/vigil/reduce"
)

// The single-comparison check of methods.md §8 (extinction and colour
// term after Henden & Kaitchuck 1982): V_var = 11.7822.
func ExampleTransform_Differential() {
	tr := reduce.Transform{ExtinctionK: 0.20, ColorCoeff: -0.050}
	variable := reduce.Measured{Inst: -7.512, Airmass: 1.512, Color: 1.100}
	comp := reduce.Measured{Inst: -8.120, Airmass: 1.508, Color: 0.600}
	fmt.Printf("V = %.4f\n", tr.Differential(variable, comp, 11.200))
	// Output: V = 11.7822
}

// The weighted ensemble of methods.md §8: three comparison stars with
// errors 0.005, 0.010 and 0.005 mag give Z = 19.32267, V = 11.81067 and
// σ_Z = 0.00333; the check star reads 11.655 against its catalogue 11.650.
func ExamplePhotometry_Reduce() {
	p := reduce.Photometry{
		Comps: []reduce.Comp{{ID: "A", Mag: 11.200}, {ID: "B", Mag: 12.050}, {ID: "C", Mag: 10.700}},
		Check: &reduce.Comp{ID: "K", Mag: 11.650},
		Star:  ephem.Star{RAHours: 22.486184728, DecDeg: 58.415198306},
	}
	e := reduce.NewExposure(2460666.3333333, 3)
	e.Target.Mag, e.Check.Mag = -7.512, -7.668
	e.Comps[0] = reduce.Inst{Mag: -8.120, Err: 0.005}
	e.Comps[1] = reduce.Inst{Mag: -7.262, Err: 0.010}
	e.Comps[2] = reduce.Inst{Mag: -8.628, Err: 0.005}
	red, err := p.Reduce([]reduce.Exposure{e})
	if err != nil {
		fmt.Println(err)
		return
	}
	r := red.Rows[0]
	fmt.Printf("V = %.5f ± %.5f (zero point %.5f from %d stars, weighted %v)\n", r.Mag, r.Err, r.ZeroPoint, r.NComps, r.Weighted)
	fmt.Printf("check star %.3f\n", r.CheckMag)
	// Output:
	// V = 11.81067 ± 0.00333 (zero point 19.32267 from 3 stars, weighted true)
	// check star 11.655
}

// The visual estimates of methods.md §9, with A = 6.2 and B = 6.8: the
// fractional method "A 2 V 3 B" gives 6.44, the step method "A 3 V, V 2 B"
// a step value of 0.12 mag and 6.56.
func ExampleParseEstimate() {
	chart := map[string]float64{"A": 6.2, "B": 6.8}
	for _, s := range []string{"A 2 V 3 B", "A 3 V, V 2 B"} {
		est, err := reduce.ParseEstimate(s)
		if err != nil {
			fmt.Println(err)
			return
		}
		mag, step, err := est.Magnitude(chart, 0)
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("%-13s → %.2f (step %.2f mag)\n", s, mag, step)
	}
	// Output:
	// A 2 V 3 B     → 6.44 (step 0.12 mag)
	// A 3 V, V 2 B  → 6.56 (step 0.12 mag)
}

// δ Cep seen from φ = +50°, λ = +10° E at 2024-12-21 20:00 UTC: astropy
// gives HJD_UTC 2460666.3341993 and BJD_TDB 2460666.3349804 (methods.md §7).
func ExampleConvertTimes() {
	star := ephem.Star{RAHours: 22.486184728, DecDeg: 58.415198306}
	site := &ephem.Site{LatDeg: 50, LonDeg: 10}
	hjd, bjd, err := reduce.ConvertTimes([]float64{2460666.3333333}, star, site)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("HJD_UTC %.6f\nBJD_TDB %.6f\n", hjd[0], bjd[0])
	// Output:
	// HJD_UTC 2460666.334199
	// BJD_TDB 2460666.334980
}

// A comparison star as the command line takes it.
func ExampleParseComp() {
	c, err := reduce.ParseComp("A=11.20")
	fmt.Println(c.ID, c.Mag, err)
	_, err = reduce.ParseComp("B")
	fmt.Println(err)
	// Output:
	// A 11.2 <nil>
	// reduce: star "B" has no catalogue magnitude: expected ID=MAG, e.g. "A=11.20"
}

// Folding and binning: four points of a 0.5 d variable in two phase bins.
func ExampleBinInPhase() {
	eph := ephem.Ephemeris{Epoch: 2460000.0, PeriodDays: 0.5, Scale: ephem.BJDTDB}
	pts := []reduce.Point{
		{T: 2460000.05, Mag: 10.0, Err: 0.01}, // phase 0.1
		{T: 2460010.10, Mag: 10.2, Err: 0.02}, // phase 0.2
		{T: 2460000.30, Mag: 11.0},            // phase 0.6
		{T: 2460003.35, Mag: 11.2},            // phase 0.7
	}
	folded, _ := reduce.PhaseFold(pts, eph)
	bins, _ := reduce.BinInPhase(folded, 2)
	for _, b := range bins {
		fmt.Printf("phase %.2f–%.2f: %.3f ± %.3f (%d points)\n", b.Lo, b.Hi, b.Mag, b.Err, b.N)
	}
	// Output:
	// phase 0.00–0.50: 10.040 ± 0.009 (2 points)
	// phase 0.50–1.00: 11.100 ± 0.100 (2 points)
}

// The usual call chain: comparison stars from the command line's ID=MAG
// form, a table in the layout of `vigil reduce`, the reduction, and the
// light curve on BJD_TDB folded on an ephemeris. By hand [C]: the first
// row's zero points 19.320 ± 0.005 and 19.312 ± 0.010 average to 19.3184 ±
// 0.0045 (weights 1/σ²), so V = −7.512 + 19.3184 = 11.8064 ± 0.0060; the
// second row has star A only: 11.823 ± 0.0064.
func Example_photometry() {
	var p reduce.Photometry
	for _, s := range []string{"A=11.200", "B=12.050"} {
		c, err := reduce.ParseComp(s)
		if err != nil {
			fmt.Println(err)
			return
		}
		p.Comps = append(p.Comps, c)
	}
	p.Star = ephem.Star{RAHours: 22.486184728, DecDeg: 58.415198306}
	p.Site = &ephem.Site{LatDeg: 50, LonDeg: 10}
	csv := `jd_utc,target,target_err,A,A_err,B,B_err
2460666.30,-7.512,0.004,-8.120,0.005,-7.262,0.010
2460666.31,-7.498,0.004,-8.121,0.005,,
2460666.32,,,-8.119,0.005,-7.260,0.010
`
	exps, err := p.Read(strings.NewReader(csv), "night.csv", reduce.Columns{})
	if err != nil {
		fmt.Println(err)
		return
	}
	red, err := p.Reduce(exps)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, r := range red.Rows {
		fmt.Printf("BJD_TDB %.5f  V %.4f ± %.4f  (%d comps)\n", r.BJDTDB, r.Mag, r.Err, r.NComps)
	}
	for _, s := range red.Skipped {
		fmt.Printf("line %d skipped: %s\n", s.Line, s.Reason)
	}
	eph := ephem.Ephemeris{Epoch: 2460666.0, PeriodDays: 0.71, Scale: ephem.BJDTDB}
	folded, _ := reduce.PhaseFold(red.Points(eph.Scale), eph)
	fmt.Printf("first phase %.4f\n", folded[0].Phase)
	// Output:
	// BJD_TDB 2460666.30165  V 11.8064 ± 0.0060  (2 comps)
	// BJD_TDB 2460666.31165  V 11.8230 ± 0.0064  (1 comps)
	// line 4 skipped: no target magnitude
	// first phase 0.4249
}
