package reduce

import (
	"errors"
	"math"
	"math/rand/v2"
	"sort"
	"strings"
	"testing"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/table"
)

// photoMagTol is the tolerance on magnitudes computed by the same formula
// elsewhere (a worked example printed to 5 decimals, or numpy): 1e-5 mag.
const photoMagTol = 1e-5

// photoRefTol is the tolerance against numpy on the same inputs: a
// micromagnitude, far above float64 rounding of sums of a few terms.
const photoRefTol = 1e-6

// Target and site of the synthetic photometry (make_reduce.py: TARGET, SITE).
var (
	synthStar = ephem.Star{RAHours: 22.486184728, DecDeg: 58.415198306}
	synthSite = &ephem.Site{Name: "synthetic", LatDeg: 50, LonDeg: 10}
)

func near(got, want, tol float64) bool {
	if math.IsNaN(want) {
		return math.IsNaN(got)
	}
	return math.Abs(got-want) <= tol
}

// methodsEnsemble is the ensemble check of methods.md §8: three comparison
// stars (V, v) and the target v = −7.512, the check star v = −7.668.
func methodsEnsemble(withErr bool) (*Photometry, []Exposure) {
	p := &Photometry{
		Comps: []Comp{{"A", 11.200}, {"B", 12.050}, {"C", 10.700}},
		Check: &Comp{"K", 11.650},
		Star:  synthStar,
	}
	e := NewExposure(2460666.4, 3)
	e.Target.Mag = -7.512
	e.Check.Mag = -7.668
	for j, v := range []float64{-8.120, -7.262, -8.628} {
		e.Comps[j].Mag = v
	}
	if withErr {
		for j, s := range []float64{0.005, 0.010, 0.005} {
			e.Comps[j].Err = s
		}
	}
	return p, []Exposure{e}
}

// TestEnsembleWorkedExample reproduces the ensemble check values of
// methods.md §8 (the weighted ensemble of Honeycutt 1992, PASP 104, 435;
// numbers computed there from the formula [C]).
func TestEnsembleWorkedExample(t *testing.T) {
	cases := []struct {
		name                  string
		withErr               bool
		mag, zpErr, checkMag  float64
		source                string
		weighted              bool
		zpErrSource, chSource string
	}{
		{name: "equal weights", withErr: false, mag: 11.808, zpErr: 0.0046188, checkMag: 11.652, weighted: false,
			source: "methods.md §8 [C]: unweighted V = 11.808", zpErrSource: "s/√3 with s = 0.008 mag, by hand from the contract's formula [C]",
			chSource: "methods.md §8 [C]: check star 11.652"},
		{name: "weighted 1/σ²", withErr: true, mag: 11.81067, zpErr: 0.00333, checkMag: 11.65467, weighted: true,
			source: "methods.md §8 [C]: V = 11.81067, σ_Z = 0.00333", zpErrSource: "methods.md §8 [C]",
			chSource: "−7.668 + Z = 19.32267 from methods.md §8 [C]"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p, exps := methodsEnsemble(c.withErr)
			red, err := p.Reduce(exps)
			if err != nil {
				t.Fatal(err)
			}
			if len(red.Rows) != 1 || len(red.Rejected) != 0 {
				t.Fatalf("got %d rows, %d rejected; want 1 row, none rejected", len(red.Rows), len(red.Rejected))
			}
			r := red.Rows[0]
			tolZ := 0.5e-5 // the check values carry 5 decimals
			if !near(r.Mag, c.mag, photoMagTol) {
				t.Errorf("mag: got %.6f, want %.5f (%s), diff %.2g, tol %g", r.Mag, c.mag, c.source, r.Mag-c.mag, photoMagTol)
			}
			if !near(r.ZeroPointErr, c.zpErr, tolZ) {
				t.Errorf("σ_zp: got %.6f, want %.5f (%s), tol %g", r.ZeroPointErr, c.zpErr, c.zpErrSource, tolZ)
			}
			if !near(r.CheckMag, c.checkMag, photoMagTol) {
				t.Errorf("check: got %.6f, want %.5f (%s), tol %g", r.CheckMag, c.checkMag, c.chSource, photoMagTol)
			}
			if r.Weighted != c.weighted || r.NComps != 3 {
				t.Errorf("weighted %v with %d comps, want %v with 3", r.Weighted, r.NComps, c.weighted)
			}
			if r.Err != r.ZeroPointErr { // no target error: err = σ_zp
				t.Errorf("err %.6f differs from σ_zp %.6f with no target error", r.Err, r.ZeroPointErr)
			}
		})
	}
}

// TestEnsembleLimitingCases checks the formulas against their limits: one
// comparison star is V = v − c + C with err = sqrt(target_err² + c_err²)
// (spec/cli.md), an ensemble whose other stars are missing equals it, and
// equal errors make the weighted mean the plain mean with σ = σ_i/√n.
func TestEnsembleLimitingCases(t *testing.T) {
	one := &Photometry{Comps: []Comp{{"A", 11.2}}, Star: synthStar}
	e := NewExposure(2460666.4, 1)
	e.Target = Inst{Mag: -7.512, Err: 0.004}
	e.Comps[0] = Inst{Mag: -8.120, Err: 0.003}
	red, err := one.Reduce([]Exposure{e})
	if err != nil {
		t.Fatal(err)
	}
	wantMag := -7.512 - (-8.120) + 11.2 // V = v − c + C, spec/cli.md
	wantErr := math.Sqrt(0.004*0.004 + 0.003*0.003)
	if r := red.Rows[0]; !near(r.Mag, wantMag, 1e-12) || !near(r.Err, wantErr, 1e-12) {
		t.Errorf("one comparison: got %.6f ± %.6f, want %.6f ± %.6f (V = v − c + C)", r.Mag, r.Err, wantMag, wantErr)
	}

	// The same star inside an ensemble whose other members were not measured.
	ens := &Photometry{Comps: []Comp{{"B", 12.05}, {"A", 11.2}, {"C", 10.7}}, Star: synthStar}
	e3 := NewExposure(2460666.4, 3)
	e3.Target, e3.Comps[1] = e.Target, e.Comps[0]
	red3, err := ens.Reduce([]Exposure{e3})
	if err != nil {
		t.Fatal(err)
	}
	if a, b := red.Rows[0], red3.Rows[0]; a.Mag != b.Mag || a.Err != b.Err || b.NComps != 1 {
		t.Errorf("ensemble of one: got %.9f ± %.9f (%d comps), want %.9f ± %.9f", b.Mag, b.Err, b.NComps, a.Mag, a.Err)
	}

	// Equal errors: weights equal, σ_zp = σ/√n.
	for _, sigma := range []float64{0.002, 0.01, 0.05} {
		z := []float64{19.320, 19.312, 19.328, 19.331}
		e := []float64{sigma, sigma, sigma, sigma}
		zpW, sW, n, weighted := ensembleZeroPoint(z, e, make([]bool, 4))
		zpU, _, _, _ := ensembleZeroPoint(z, []float64{0, 0, 0, 0}, make([]bool, 4))
		if !weighted || n != 4 || !near(zpW, zpU, 1e-12) || !near(sW, sigma/2, 1e-12) {
			t.Errorf("equal errors %.3f: weighted %.9f ± %.9f, plain mean %.9f, want equal means and σ %.6f", sigma, zpW, sW, zpU, sigma/2)
		}
	}
}

// TestEnsembleAgainstNumpy reduces testdata/reduce/ensemble_input.csv and
// compares every row with numpy's reduction by the contract's formulas and
// astropy's HJD and BJD_TDB (ensemble_expected.csv, make_reduce.py).
func TestEnsembleAgainstNumpy(t *testing.T) {
	p := &Photometry{
		Comps: []Comp{{"C1", 11.200}, {"C2", 12.050}, {"C3", 10.700}, {"C4", 11.640}, {"C5", 12.310}},
		Check: &Comp{"K", 11.650},
		Star:  synthStar, Site: synthSite,
	}
	red, err := p.ReduceFile(reduceTestdata("ensemble_input.csv"), Columns{})
	if err != nil {
		t.Fatal(err)
	}
	want := loadReduceTable(t, "ensemble_expected.csv")
	if len(red.Rows) != want.Len() {
		t.Fatalf("got %d rows, want %d (numpy)", len(red.Rows), want.Len())
	}
	if len(red.Rejected) != 0 || len(red.Warnings) != 0 {
		t.Errorf("ordinary data: got rejections %v, warnings %q; want none", red.Rejected, red.Warnings)
	}
	for i, r := range red.Rows {
		w := want.Row(i)
		for _, c := range []struct {
			name      string
			got, want float64
			tol       float64
		}{
			{"jd_utc", r.JDUTC, mustFloat(t, w, "jd_utc"), 0},
			{"mag", r.Mag, mustFloat(t, w, "mag"), photoRefTol},
			{"err", r.Err, mustFloat(t, w, "err"), photoRefTol},
			{"hjd_utc (s)", r.HJD * secondsPerDay, mustFloat(t, w, "hjd_utc") * secondsPerDay, lightTimeTolSec},
			{"bjd_tdb (s)", r.BJDTDB * secondsPerDay, mustFloat(t, w, "bjd_tdb") * secondsPerDay, lightTimeTolSec},
		} {
			if !near(c.got, c.want, c.tol) {
				t.Errorf("row %d (line %d) %s: got %.9f, want %.9f (numpy/astropy), diff %.3g, tol %g", i, r.Line, c.name, c.got, c.want, c.got-c.want, c.tol)
			}
		}
		wc, _, _ := w.Float("check_mag")
		if !near(r.CheckMag, wc, photoRefTol) {
			t.Errorf("row %d check_mag: got %.9f, want %.9f (numpy)", i, r.CheckMag, wc)
		}
	}
	sum := loadReduceTable(t, "ensemble_summary.csv").Row(0)
	if got, want := red.Check.Mean, mustFloat(t, sum, "check_mean"); !near(got, want, photoRefTol) {
		t.Errorf("check_mean: got %.9f, want %.9f (numpy)", got, want)
	}
	if got, want := red.Check.Std, mustFloat(t, sum, "check_std"); !near(got, want, photoRefTol) {
		t.Errorf("check_std: got %.9f, want %.9f (numpy, ddof=1)", got, want)
	}
	if got, want := len(red.Skipped), int(mustFloat(t, sum, "skipped")); got != want {
		t.Errorf("skipped: got %d, want %d (numpy)", got, want)
	}
}

// TestEnsembleRejectsWrongCatalogue: comparison star C3 whose catalogue
// magnitude is 0.30 mag off is left out, and the light curve equals numpy's
// reduction with the other four (badcomp_expected.csv).
func TestEnsembleRejectsWrongCatalogue(t *testing.T) {
	p := &Photometry{
		Comps: []Comp{{"C1", 11.200}, {"C2", 12.050}, {"C3", 10.700}, {"C4", 11.640}, {"C5", 12.310}},
		Check: &Comp{"K", 11.650},
		Star:  synthStar,
	}
	red, err := p.ReduceFile(reduceTestdata("badcomp_input.csv"), Columns{})
	if err != nil {
		t.Fatal(err)
	}
	if len(red.Rejected) != 1 || red.Rejected[0].ID != "C3" || !strings.Contains(red.Rejected[0].Reason, "differs") {
		t.Fatalf("got rejections %+v, want C3 for its offset", red.Rejected)
	}
	if off := red.Rejected[0].OffsetMag; math.Abs(off-0.30) > 0.02 {
		t.Errorf("C3 offset: got %.3f mag, want about 0.30 (the error put in)", off)
	}
	want := loadReduceTable(t, "badcomp_expected.csv")
	if len(red.Rows) != want.Len() {
		t.Fatalf("got %d rows, want %d", len(red.Rows), want.Len())
	}
	for i, r := range red.Rows {
		w := want.Row(i)
		if wm, we := mustFloat(t, w, "mag"), mustFloat(t, w, "err"); !near(r.Mag, wm, photoRefTol) || !near(r.Err, we, photoRefTol) {
			t.Errorf("row %d: got %.9f ± %.9f, want %.9f ± %.9f (numpy without C3)", i, r.Mag, r.Err, wm, we)
		}
	}
	// KeepAllComps keeps C3, and the light curve moves.
	p.KeepAllComps = true
	all, err := p.ReduceFile(reduceTestdata("badcomp_input.csv"), Columns{})
	if err != nil {
		t.Fatal(err)
	}
	if len(all.Rejected) != 0 || math.Abs(all.Rows[0].Mag-red.Rows[0].Mag) < 0.01 {
		t.Errorf("KeepAllComps: rejected %v, mag %.4f vs %.4f without C3; want C3 kept and a shift", all.Rejected, all.Rows[0].Mag, red.Rows[0].Mag)
	}
}

// synthPhotometry makes n exposures of m comparison stars with catalogue
// errors catErr[j], noise sigma[j] and an optional variation var(j, k)
// added to star j in exposure k; errors are quoted when withErr.
func synthPhotometry(rng *rand.Rand, n int, catalog, catErr, sigma []float64, withErr bool, missing float64, vary func(j, k int) float64) []Exposure {
	exps := make([]Exposure, n)
	for k := range exps {
		e := NewExposure(2460666.3+0.003*float64(k), len(catalog))
		z := 20.1 + 0.03*math.Sin(float64(k)/9)
		e.Target = Inst{Mag: 12 - z + rng.NormFloat64()*0.01, Err: 0.01}
		for j := range catalog {
			if rng.Float64() < missing {
				continue
			}
			v := catalog[j] + catErr[j] - z + rng.NormFloat64()*sigma[j]
			if vary != nil {
				v += vary(j, k)
			}
			e.Comps[j].Mag = v
			if withErr {
				e.Comps[j].Err = sigma[j]
			}
		}
		exps[k] = e
	}
	return exps
}

// TestEnsembleRejectsVariableComp: a comparison star varying by ±0.15 mag
// is left out for its scatter, with 3 and with 5 comparison stars.
func TestEnsembleRejectsVariableComp(t *testing.T) {
	for _, m := range []int{3, 5} {
		for _, withErr := range []bool{false, true} {
			rng := rand.New(rand.NewPCG(uint64(m), 7))
			catalog := []float64{11.2, 12.0, 10.7, 11.6, 12.3}[:m]
			sigma := []float64{0.005, 0.008, 0.004, 0.01, 0.012}[:m]
			exps := synthPhotometry(rng, 60, catalog, make([]float64, m), sigma, withErr, 0.05, func(j, k int) float64 {
				if j == 1 {
					return 0.15 * math.Sin(float64(k)/5)
				}
				return 0
			})
			p := &Photometry{Star: synthStar}
			for j := range catalog {
				p.Comps = append(p.Comps, Comp{ID: string(rune('A' + j)), Mag: catalog[j]})
			}
			red, err := p.Reduce(exps)
			if err != nil {
				t.Fatal(err)
			}
			if len(red.Rejected) != 1 || red.Rejected[0].ID != "B" || !strings.Contains(red.Rejected[0].Reason, "scatters") {
				t.Errorf("%d comps, errors %v: got rejections %+v, want B for its scatter", m, withErr, red.Rejected)
			}
		}
	}
}

// TestEnsembleOrdinaryDataKeepAllComps: 400 sets of ordinary data (3 to 7
// comparison stars, 1 to 200 exposures, noise 0.002–0.05 mag, catalogue
// errors of σ = 0.015 mag, 10% missing cells, errors quoted or not) never
// lose a star nor raise a warning (common practice for the noise and
// catalogue errors, methods.md §15).
func TestEnsembleOrdinaryDataKeepAllComps(t *testing.T) {
	rng := rand.New(rand.NewPCG(2024, 12))
	for set := range 400 {
		m := 3 + rng.IntN(5)
		n := 1 + rng.IntN(200)
		catalog, catErr, sigma := make([]float64, m), make([]float64, m), make([]float64, m)
		p := &Photometry{Star: synthStar}
		for j := range m {
			catalog[j] = 10 + 3*rng.Float64()
			catErr[j] = math.Max(-0.04, math.Min(0.04, 0.015*rng.NormFloat64()))
			sigma[j] = 0.002 + 0.048*rng.Float64()
			p.Comps = append(p.Comps, Comp{ID: string(rune('A' + j)), Mag: catalog[j]})
		}
		withErr := rng.IntN(2) == 0
		exps := synthPhotometry(rng, n, catalog, catErr, sigma, withErr, 0.1, nil)
		red, err := p.Reduce(exps)
		if err != nil {
			t.Fatal(err)
		}
		if len(red.Rejected) != 0 || len(red.Warnings) != 0 {
			t.Errorf("set %d (%d comps, %d exposures, errors %v, σ %.3f, catalogue errors %.3f): got rejections %+v, warnings %q; want none",
				set, m, n, withErr, sigma, catErr, red.Rejected, red.Warnings)
		}
	}
}

// TestEnsembleNoMajority: three stars that each disagree (0, +0.3, −0.3
// mag) cannot tell which is wrong: none is left out and a warning says so;
// two stars are never judged.
func TestEnsembleNoMajority(t *testing.T) {
	for _, c := range []struct {
		name     string
		catErr   []float64
		wantWarn bool
	}{
		{"three disagreeing", []float64{0, 0.3, -0.3}, true},
		{"two, one off by a magnitude", []float64{0, 1}, false},
	} {
		t.Run(c.name, func(t *testing.T) {
			m := len(c.catErr)
			rng := rand.New(rand.NewPCG(5, 5))
			catalog := []float64{11, 11.5, 12}[:m]
			exps := synthPhotometry(rng, 30, catalog, c.catErr, []float64{0.005, 0.005, 0.005}[:m], false, 0, nil)
			p := &Photometry{Star: synthStar}
			for j := range m {
				p.Comps = append(p.Comps, Comp{ID: string(rune('A' + j)), Mag: catalog[j]})
			}
			red, err := p.Reduce(exps)
			if err != nil {
				t.Fatal(err)
			}
			if len(red.Rejected) != 0 || (len(red.Warnings) == 1) != c.wantWarn {
				t.Errorf("got rejections %+v, warnings %q; want none rejected, warning %v", red.Rejected, red.Warnings, c.wantWarn)
			}
		})
	}
}

// TestEnsembleSkips: rows without a target or without comparison stars are
// skipped and counted, with the reason.
func TestEnsembleSkips(t *testing.T) {
	p := &Photometry{Comps: []Comp{{"A", 11}, {"B", 12}, {"C", 10.5}}, Star: synthStar}
	rows := make([]Exposure, 4)
	for k := range rows {
		rows[k] = NewExposure(2460000.5+float64(k)*0.01, 3)
		rows[k].Target.Mag = -8
		for j, c := range []float64{-9, -8, -9.5} {
			rows[k].Comps[j].Mag = c
		}
	}
	rows[1].Target.Mag = math.NaN()
	for j := range 3 {
		rows[2].Comps[j].Mag = math.NaN()
	}
	red, err := p.Reduce(rows)
	if err != nil {
		t.Fatal(err)
	}
	if len(red.Rows) != 2 || len(red.Skipped) != 2 || red.Skipped[0].Index != 1 || red.Skipped[1].Index != 2 ||
		red.Skipped[0].Reason != "no target magnitude" || red.Skipped[1].Reason != "no comparison star measured" {
		t.Errorf("got %d rows, skipped %+v; want rows 0 and 3, skipped 1 (no target) and 2 (no comparison)", len(red.Rows), red.Skipped)
	}
}

func TestEnsembleFilters(t *testing.T) {
	p := &Photometry{Comps: []Comp{{"A", 11}}, Star: synthStar}
	mk := func(f string) Exposure {
		e := NewExposure(2460000.5, 1)
		e.Filter, e.Target.Mag, e.Comps[0].Mag = f, -8, -9
		return e
	}
	exps := []Exposure{mk("V"), mk("v "), mk("B"), mk("V")}
	_, err := p.Reduce(exps)
	var ee *ExposureError
	if !errors.As(err, &ee) || ee.Index != 2 || ee.Field != "filter" {
		t.Errorf("mixed filters: got %v, want an ExposureError at exposure index 2, field filter", err)
	}
	p.Filter = "V"
	red, err := p.Reduce(exps)
	if err != nil || len(red.Rows) != 3 || red.OtherFilter != 1 || red.Filter != "V" {
		t.Errorf("filter V: got %v, err %v; want 3 rows, 1 in another filter", red, err)
	}
}

// TestCheckStarWarnings: the check star draws a warning for a large offset
// or scatter (CheckOffsetWarnMag, CheckScatterWarnMag, common practice) and
// none for ordinary data.
func TestCheckStarWarnings(t *testing.T) {
	for _, c := range []struct {
		name             string
		offset, scatter  float64
		quotedErr        float64
		wantOff, wantSca bool
	}{
		{"ordinary", 0.01, 0.01, 0.01, false, false},
		{"catalogue off by 0.10 mag", 0.10, 0.01, 0.01, true, false},
		{"scatter 0.06 mag with 0.01 quoted", 0, 0.06, 0.01, false, true},
		{"scatter 0.06 mag with 0.05 quoted", 0, 0.06, 0.05, false, false},
		{"offset 0.06 within the noise", 0.06, 0.3, 0, false, true},
	} {
		t.Run(c.name, func(t *testing.T) {
			p := &Photometry{Comps: []Comp{{"A", 11}}, Check: &Comp{"K", 11.5}, Star: synthStar}
			var exps []Exposure
			for k := range 40 {
				e := NewExposure(2460000.5+0.01*float64(k), 1)
				e.Target.Mag, e.Comps[0].Mag = -8, -9
				// Alternating ± scatter keeps the sample exactly as wide as asked.
				e.Check = Inst{Mag: 11.5 - 20 + c.offset + c.scatter*float64(1-2*(k%2)), Err: c.quotedErr}
				exps = append(exps, e)
			}
			red, err := p.Reduce(exps)
			if err != nil {
				t.Fatal(err)
			}
			s := red.Check
			if s.OffsetLarge != c.wantOff || s.ScatterLarge != c.wantSca || len(red.Warnings) != btoi(c.wantOff)+btoi(c.wantSca) {
				t.Errorf("offset %.3f, std %.3f: got offset warning %v, scatter warning %v, warnings %q; want %v, %v",
					s.OffsetMag, s.Std, s.OffsetLarge, s.ScatterLarge, red.Warnings, c.wantOff, c.wantSca)
			}
		})
	}
}

func btoi(b bool) int {
	if b {
		return 1
	}
	return 0
}

// TestReduceBadExposures: faults of typed-in exposures name the exposure
// and what was wrong.
func TestReduceBadExposures(t *testing.T) {
	p := &Photometry{Comps: []Comp{{"A", 11}, {"B", 12}}, Check: &Comp{"K", 11.5}, Star: synthStar}
	good := func() Exposure {
		e := NewExposure(2460000.5, 2)
		e.Target.Mag, e.Comps[0].Mag, e.Comps[1].Mag = -8, -9, -8
		return e
	}
	for _, c := range []struct {
		name  string
		edit  func(e *Exposure)
		field string
		want  string
	}{
		{"time out of range", func(e *Exposure) { e.JDUTC = 1e6 }, "jd_utc", "outside the supported range"},
		{"negative error", func(e *Exposure) { e.Comps[1].Err = -0.01 }, "B", "negative"},
		{"infinite magnitude", func(e *Exposure) { e.Target.Mag = math.Inf(1) }, "target", "instrumental magnitude"},
		{"airmass below 1", func(e *Exposure) { e.Check.Airmass = 0.5 }, "K", "airmass"},
		{"too few comparison cells", func(e *Exposure) { e.Comps = e.Comps[:1] }, "", "expected 2"},
	} {
		t.Run(c.name, func(t *testing.T) {
			exps := []Exposure{good(), good()}
			c.edit(&exps[1])
			_, err := p.Reduce(exps)
			var ee *ExposureError
			if !errors.As(err, &ee) || ee.Index != 1 || ee.Field != c.field || !strings.Contains(err.Error(), c.want) {
				t.Errorf("got %v, want an ExposureError at index 1, field %q, saying %q", err, c.field, c.want)
			}
		})
	}
	// Extinction without airmass, position or site.
	q := *p
	q.Transform.ExtinctionK = 0.2
	e := good()
	e.Target.Airmass = 1.2
	_, err := q.Reduce([]Exposure{e})
	if err == nil || !strings.Contains(err.Error(), "no airmass") {
		t.Errorf("extinction without comparison airmass: got %v, want a 'no airmass' error", err)
	}
}

// TestReduceFileErrorsNameTheCell: a fault Reduce finds in a file (mixed
// filters) comes back as a table.Error with file, line and column.
func TestReduceFileErrorsNameTheCell(t *testing.T) {
	p := &Photometry{Comps: []Comp{{"A", 11}}, Star: synthStar}
	path := writeTemp(t, "mixed.csv", "jd_utc,filter,target,A\n2460000.5,V,-8,-9\n2460000.6,B,-8,-9\n")
	_, err := p.ReduceFile(path, Columns{})
	var te *table.Error
	if !errors.As(err, &te) || te.File != path || te.Line != 3 || te.Column != 11 || te.Name != "filter" {
		t.Errorf("got %v (%+v), want %s: line 3, column 11 (filter)", err, te, path)
	}
}

// TestEnsembleMedian checks the selection-based median against sorting
// (package sort) on random, tied and sorted inputs.
func TestEnsembleMedian(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for _, n := range []int{1, 2, 3, 4, 5, 10, 11, 100, 1001} {
		for _, kind := range []string{"random", "ties", "sorted", "reversed"} {
			x := make([]float64, n)
			for i := range x {
				switch kind {
				case "random":
					x[i] = rng.NormFloat64()
				case "ties":
					x[i] = float64(rng.IntN(3))
				case "sorted":
					x[i] = float64(i)
				case "reversed":
					x[i] = float64(n - i)
				}
			}
			s := append([]float64(nil), x...)
			sort.Float64s(s)
			want := ensembleMedianSorted(s)
			if got := ensembleMedian(x); got != want {
				t.Errorf("n=%d %s: got %v, want %v (sort)", n, kind, got, want)
			}
		}
	}
}
