package reduce

import (
	"math"
	"strings"
	"testing"
)

func TestDistanceDeltaCephei(t *testing.T) {
	// methods.md §13 [C, inputs S]: δ Cep, P = 5.366341 d (GCVS), ⟨V⟩ =
	// 3.94, A_V = 0.23 (Benedict et al. 2002, AJ 124, 1695) with Benedict et
	// al. (2007): log P = 0.729678, M_V = −3.3931, μ0 = 7.1031, d = 263 pc;
	// against the HST parallax π = 3.66 ± 0.15 mas (273 pc, Benedict et al.
	// 2002) within ±10%.
	const magTol = 0.00005 // the check values have 4 decimals
	res, err := Distance(5.366341, 3.94, 0.23, "")
	if err != nil {
		t.Fatalf("Distance: %v", err)
	}
	if d := res.AbsMag - (-3.3931); math.Abs(d) > magTol {
		t.Errorf("M_V = %.5f, want −3.3931 (methods.md §13), diff %.2g", res.AbsMag, d)
	}
	if d := res.Modulus - 7.1031; math.Abs(d) > magTol {
		t.Errorf("μ0 = %.5f, want 7.1031 (methods.md §13), diff %.2g", res.Modulus, d)
	}
	if d := res.DistancePc - 263; math.Abs(d) > 0.5 {
		t.Errorf("d = %.2f pc, want 263 (methods.md §13)", res.DistancePc)
	}
	parallaxPc := 1000 / 3.66
	if r := res.DistancePc / parallaxPc; r < 0.9 || r > 1.1 {
		t.Errorf("d = %.1f pc vs parallax distance %.1f pc (Benedict et al. 2002): ratio %.3f, want within 10%%", res.DistancePc, parallaxPc, r)
	}
	// The error propagates the relation's stated σ (±0.12 slope, ±0.02
	// zero point) through d = 10^((μ0 + 5)/5): σ_d = d·ln10/5·σ_M.
	x := math.Log10(5.366341) - 1
	sigM := math.Hypot(0.12*x, 0.02)
	if d := res.AbsMagErr - sigM; math.Abs(d) > 1e-12 {
		t.Errorf("σ(M_V) = %.6f, want %.6f from Benedict et al. (2007)", res.AbsMagErr, sigM)
	}
	if d := res.DistanceErrPc - res.DistancePc*math.Ln10/5*sigM; math.Abs(d) > 1e-9 {
		t.Errorf("σ(d) = %.4f pc, want %.4f", res.DistanceErrPc, res.DistancePc*math.Ln10/5*sigM)
	}
	if res.Relation.Name != DefaultPLRelation || !strings.Contains(res.Relation.Reference, "AJ 133, 1810") {
		t.Errorf("relation %q (%s), want the default with its reference", res.Relation.Name, res.Relation.Reference)
	}
	if len(res.Warnings) != 0 {
		t.Errorf("warnings %q for a period inside the calibration", res.Warnings)
	}
}

func TestPLRelations(t *testing.T) {
	// Each relation at a period where its published form gives M directly.
	const tol = 1e-12
	cases := []struct {
		name, source string
		period       float64
		want         float64
	}{
		{"benedict2007", "Benedict et al. 2007: −4.05 at log P = 1", 10, -4.05},
		{"lanoix1999", "Lanoix et al. 1999 abstract: −2.77 log P − 1.44", 10, -4.21},
		{"lanoix1999", "Lanoix et al. 1999: zero point at log P = 0", 1, -1.44},
		{"BENEDICT2007", "names are case-insensitive", 100, -2.43 - 4.05},
	}
	for _, tc := range cases {
		r, err := LookupPLRelation(tc.name)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		if m, _ := r.AbsMag(tc.period); math.Abs(m-tc.want) > tol {
			t.Errorf("%s at P = %g d: M = %.6f, want %.6f (%s)", tc.name, tc.period, m, tc.want, tc.source)
		}
	}
	if PLRelations()[0].Name != DefaultPLRelation {
		t.Errorf("first relation %q, want the default %q", PLRelations()[0].Name, DefaultPLRelation)
	}
}

func TestDistanceBadInput(t *testing.T) {
	cases := []struct {
		name             string
		period, mag, ext float64
		relation, want   string
	}{
		{"zero period", 0, 4, 0, "", "period 0"},
		{"NaN magnitude", 5, math.NaN(), 0, "", "mean magnitude NaN"},
		{"negative extinction", 5, 4, -0.1, "", "extinction -0.1"},
		{"unknown relation", 5, 4, 0, "leavitt1912", `"leavitt1912": want one of benedict2007, lanoix1999`},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Distance(tc.period, tc.mag, tc.ext, tc.relation)
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("err = %v, want one containing %q", err, tc.want)
			}
		})
	}
	res, err := Distance(1.2, 8, 0, "")
	if err != nil || len(res.Warnings) != 1 || !strings.Contains(res.Warnings[0], "extrapolated") {
		t.Errorf("P = 1.2 d: err %v, warnings %q; want an extrapolation warning", err, res.Warnings)
	}
}

func TestIntensityMean(t *testing.T) {
	// methods.md §13 [C]: intensity mean of V = 3.5 and 4.4 (equal weights)
	// = 3.8593, against a magnitude mean of 3.95.
	const tol = 0.00005
	got, err := IntensityMean([]float64{3.5, 4.4})
	if err != nil || math.Abs(got-3.8593) > tol {
		t.Errorf("IntensityMean(3.5, 4.4) = %.5f, %v; want 3.8593 (methods.md §13)", got, err)
	}
	// A phased curve of 40 even phases whose flux is a sinusoid about
	// 10^(−0.4·4): numpy's mean flux gives ⟨V⟩ = 4.0, the trapezoid rule
	// is exact there (make_timing_refs.py).
	refs := timingRefs(t)
	var ph, mag []float64
	for _, r := range timingReadCSV(t, "intensity_phased.csv") {
		ph = append(ph, timingFloat(t, r, "phase"))
		mag = append(mag, timingFloat(t, r, "mag"))
	}
	want := timingRef(t, refs, "intensity_phased_mean")
	for _, c := range []struct {
		name string
		fn   func() (float64, error)
	}{
		{"IntensityMean", func() (float64, error) { return IntensityMean(mag) }},
		{"IntensityMeanPhased", func() (float64, error) { return IntensityMeanPhased(ph, mag) }},
		{"IntensityMeanPhased shifted phases", func() (float64, error) {
			shifted := make([]float64, len(ph))
			for i, p := range ph {
				shifted[i] = p + 3.37 // whole cycles and an offset: the same curve
			}
			return IntensityMeanPhased(shifted, mag)
		}},
	} {
		got, err := c.fn()
		if err != nil || math.Abs(got-want) > 1e-12 {
			t.Errorf("%s = %.12f, %v; want %.12f (numpy)", c.name, got, err, want)
		}
	}
	if _, err := IntensityMeanPhased([]float64{0.1, 0.2, 0.3}, []float64{4, 4.1, 4.2}); err == nil || !strings.Contains(err.Error(), "gap") {
		t.Errorf("phases 0.1–0.3 only: err = %v, want a gap error", err)
	}
	if _, err := IntensityMean(nil); err == nil {
		t.Errorf("IntensityMean(nil): want an error")
	}
}
