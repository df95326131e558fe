package reduce

import (
	"fmt"
	"math"
	"sort"
	"strings"
)

// PLRelation is a period–luminosity calibration of classical (type I,
// fundamental-mode) Cepheids: M = Slope·(log10 P − Pivot) + ZeroPoint, with
// P in days, in the photometric band Band.
type PLRelation struct {
	Name                    string // key for --relation
	Band                    string
	Slope, SlopeErr         float64
	Pivot                   float64 // log10 P about which the relation is written
	ZeroPoint, ZeroPointErr float64
	// MinPeriodDays, MaxPeriodDays: periods of the calibrating stars;
	// outside them the relation is extrapolated.
	MinPeriodDays, MaxPeriodDays float64
	Reference                    string
}

// DefaultPLRelation names the relation Distance uses when none is given.
const DefaultPLRelation = "benedict2007"

// plRelations lists the calibrations offered, each with coefficients read in
// the source named.
var plRelations = []PLRelation{
	{
		// Benedict et al. (2007), AJ 133, 1810: HST FGS parallaxes of ten
		// Galactic Cepheids, V band, M_V = −2.43(±0.12)(log P − 1) −
		// 4.05(±0.02). Calibrators from RT Aur (3.73 d) to ℓ Car (35.6 d)
		// [periods from memory].
		Name: "benedict2007", Band: "V",
		Slope: -2.43, SlopeErr: 0.12, Pivot: 1, ZeroPoint: -4.05, ZeroPointErr: 0.02,
		MinPeriodDays: 3.7, MaxPeriodDays: 35.6,
		Reference: "Benedict et al. 2007, AJ 133, 1810 (HST parallaxes, V band)",
	},
	{
		// Lanoix, Paturel & Garnier (1999), arXiv:astro-ph/9904298
		// (MNRAS 308, 969 [from memory]): HIPPARCOS parallaxes, slope
		// adopted from the LMC, ⟨M_V⟩ = −2.77 log P − 1.44 ± 0.05 as
		// given in the abstract (no error is stated for the adopted slope).
		Name: "lanoix1999", Band: "V",
		Slope: -2.77, SlopeErr: 0, Pivot: 0, ZeroPoint: -1.44, ZeroPointErr: 0.05,
		Reference: "Lanoix, Paturel & Garnier 1999, arXiv:astro-ph/9904298 (HIPPARCOS parallaxes, V band)",
	},
}

// PLRelations returns the period–luminosity relations on offer, the default
// first.
func PLRelations() []PLRelation { return append([]PLRelation(nil), plRelations...) }

// LookupPLRelation returns the relation called name ("" for the default).
func LookupPLRelation(name string) (PLRelation, error) {
	if name == "" {
		name = DefaultPLRelation
	}
	var names []string
	for _, r := range plRelations {
		if strings.EqualFold(r.Name, name) {
			return r, nil
		}
		names = append(names, r.Name)
	}
	return PLRelation{}, fmt.Errorf("reduce: period–luminosity relation %q: want one of %s", name, strings.Join(names, ", "))
}

// AbsMag returns the absolute magnitude at period P (days) and its
// uncertainty from the relation's stated errors, taken as independent:
// σ² = ((log P − Pivot)·σ_slope)² + σ_zero².
func (r PLRelation) AbsMag(periodDays float64) (mag, sigma float64) {
	x := math.Log10(periodDays) - r.Pivot
	return r.Slope*x + r.ZeroPoint, math.Hypot(x*r.SlopeErr, r.ZeroPointErr)
}

// DistanceResult is a period–luminosity distance.
type DistanceResult struct {
	AbsMag, AbsMagErr float64 // M from the relation, mag
	Modulus           float64 // μ0 = m − A − M, mag
	DistancePc        float64
	DistanceErrPc     float64 // from AbsMagErr: d·ln10/5·σ_M
	Relation          PLRelation
	Warnings          []string
}

// Distance returns the distance of a classical Cepheid of period periodDays
// and intensity-mean apparent magnitude meanMag (see IntensityMean), dimmed
// by extinction magnitudes (A_V), from the period–luminosity relation named
// relation ("" for DefaultPLRelation): d = 10^((m − M − A + 5)/5) pc. The
// error comes from the relation's stated uncertainties alone; the intrinsic
// width of the instability strip (about 0.1–0.2 mag [from memory]) and the
// error of A usually dominate it. Type II Cepheids and overtone pulsators
// do not follow these relations.
func Distance(periodDays, meanMag, extinction float64, relation string) (DistanceResult, error) {
	switch {
	case math.IsNaN(periodDays) || math.IsInf(periodDays, 0) || periodDays <= 0:
		return DistanceResult{}, fmt.Errorf("reduce: period %v: want a positive number of days", periodDays)
	case math.IsNaN(meanMag) || math.IsInf(meanMag, 0) || math.Abs(meanMag) > 40:
		return DistanceResult{}, fmt.Errorf("reduce: mean magnitude %v: want a finite apparent magnitude", meanMag)
	case math.IsNaN(extinction) || math.IsInf(extinction, 0) || extinction < 0:
		return DistanceResult{}, fmt.Errorf("reduce: extinction %v: want A_V ≥ 0 magnitudes", extinction)
	}
	rel, err := LookupPLRelation(relation)
	if err != nil {
		return DistanceResult{}, err
	}
	res := DistanceResult{Relation: rel}
	res.AbsMag, res.AbsMagErr = rel.AbsMag(periodDays)
	res.Modulus = meanMag - extinction - res.AbsMag
	res.DistancePc = math.Pow(10, (res.Modulus+5)/5)
	res.DistanceErrPc = res.DistancePc * math.Ln10 / 5 * res.AbsMagErr
	if rel.MaxPeriodDays > 0 && (periodDays < rel.MinPeriodDays || periodDays > rel.MaxPeriodDays) {
		res.Warnings = append(res.Warnings, fmt.Sprintf(
			"period %.4g d is outside the calibrating stars of %s (%.4g to %.4g d): the relation is extrapolated",
			periodDays, rel.Name, rel.MinPeriodDays, rel.MaxPeriodDays))
	}
	return res, nil
}

// IntensityMean returns the intensity-mean magnitude of equally weighted
// magnitudes: −2.5 log10(mean 10^(−0.4 m)). For a Cepheid distance the
// magnitudes must sample the whole cycle evenly in phase (use
// IntensityMeanPhased otherwise); the plain mean of the magnitudes is
// fainter and biased.
func IntensityMean(mags []float64) (float64, error) {
	if len(mags) == 0 {
		return math.NaN(), fmt.Errorf("reduce: intensity mean of no magnitudes: want at least one")
	}
	s := 0.0
	for i, m := range mags {
		if math.IsNaN(m) || math.IsInf(m, 0) {
			return math.NaN(), &PointError{i, "mag", m, "a finite magnitude"}
		}
		s += math.Pow(10, -0.4*m)
	}
	return -2.5 * math.Log10(s/float64(len(mags))), nil
}

// IntensityMeanPhased returns the intensity-mean magnitude of a phased light
// curve, ⟨m⟩ = −2.5 log10 ∫₀¹ 10^(−0.4 m(φ)) dφ, integrating the flux over
// one cycle by the trapezoidal rule between the points sorted by phase (the
// fractional part of phase), wrapping from the last point to the first.
// Points with a NaN magnitude are skipped. It refuses curves with fewer than
// 3 points or a gap wider than IntensityMaxPhaseGap.
func IntensityMeanPhased(phase, mags []float64) (float64, error) {
	if len(phase) != len(mags) {
		return math.NaN(), fmt.Errorf("reduce: %d phases and %d magnitudes: want one phase per magnitude", len(phase), len(mags))
	}
	type pm struct{ p, f float64 }
	var pts []pm
	for i := range phase {
		switch {
		case math.IsNaN(phase[i]) || math.IsInf(phase[i], 0):
			return math.NaN(), &PointError{i, "phase", phase[i], "a finite phase"}
		case math.IsInf(mags[i], 0):
			return math.NaN(), &PointError{i, "mag", mags[i], "a finite magnitude"}
		case math.IsNaN(mags[i]):
			continue
		}
		pts = append(pts, pm{phase[i] - math.Floor(phase[i]), math.Pow(10, -0.4*mags[i])})
	}
	if len(pts) < 3 {
		return math.NaN(), fmt.Errorf("reduce: %d phased magnitudes: want at least 3 over the cycle", len(pts))
	}
	sort.Slice(pts, func(a, b int) bool { return pts[a].p < pts[b].p })
	integral := 0.0
	for i := range pts {
		a, b := pts[i], pts[(i+1)%len(pts)]
		gap := b.p - a.p
		if i == len(pts)-1 {
			gap += 1
		}
		if gap > IntensityMaxPhaseGap {
			return math.NaN(), fmt.Errorf("reduce: phases %.3f to %.3f leave a gap of %.3f: want no gap above %g of the cycle",
				a.p, a.p+gap, gap, IntensityMaxPhaseGap)
		}
		integral += gap * (a.f + b.f) / 2
	}
	return -2.5 * math.Log10(integral), nil
}

// IntensityMaxPhaseGap is the widest gap in phase IntensityMeanPhased
// bridges by a straight line in flux (common practice).
const IntensityMaxPhaseGap = 0.2
