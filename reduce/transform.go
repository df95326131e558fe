package reduce

import (
	"fmt"
	"math"

	"example.org/vigil/ephem"
)

// Transform holds the two optional corrections of standard differential
// photometry (Henden & Kaitchuck 1982, Astronomical Photometry; Harris,
// Fitzgerald & Reed 1981, PASP 93, 507): first-order extinction
// over the differential airmass, and a colour term with the comparison
// star's colour. With comparison star C (catalogue magnitude C, colour
// index CI_C, instrumental magnitude c, airmass X_C) the star of
// instrumental magnitude v, airmass X and colour index CI has
//
//	V = C + (v − c) − k′ (X − X_C) + ε (CI − CI_C)
//
// where k′ is the first-order extinction coefficient of the filter (mag per
// airmass) and ε the transformation coefficient of the system (V − v =
// ε CI + ζ). The colour index is any one index (often B − V) on the standard
// system, the same for every star. Second-order extinction k″ X CI is left
// out: differentially it is usually negligible.
//
// The zero Transform corrects nothing. A coefficient of exactly 0 switches
// its correction off.
type Transform struct {
	// ExtinctionK is k′ in magnitudes per airmass; 0: no extinction
	// correction. Airmasses come from the data (Inst.Airmass) or, where
	// the data lack them, from the star's position seen from
	// Photometry.Site (Pickering 2002 airmass of the refracted altitude).
	ExtinctionK float64
	// ColorCoeff is ε; 0: no colour term.
	ColorCoeff float64
	// TargetColor and CheckColor are the colour indices of the target and
	// the check star (used when ColorCoeff is not 0).
	TargetColor float64
	CheckColor  float64
	// CompColor holds the catalogue colour index of each comparison star
	// by its ID (every comparison star needs one when ColorCoeff is not 0).
	CompColor map[string]float64
	// Positions holds J2000 positions of comparison and check stars by ID,
	// to compute the airmasses the data lack (needs Photometry.Site).
	Positions map[string]ephem.Star
}

// Measured is one star as the transformation needs it in one exposure: its
// instrumental magnitude, its airmass and its colour index (standard
// system). Airmass and colour are used only when their coefficient is set.
type Measured struct {
	Inst    float64
	Airmass float64
	Color   float64
}

// Differential returns the standard magnitude of a star from one comparison
// star of catalogue magnitude compMag: V = C + (v − c) − k′ (X − X_C) +
// ε (CI − CI_C) (Henden & Kaitchuck 1982; see Transform). With the zero
// Transform it is the plain V = v − c + C.
func (tr Transform) Differential(star, comp Measured, compMag float64) float64 {
	return star.Inst + tr.primedZeroPoint(compMag, comp.Inst, comp.Airmass, comp.Color) +
		tr.starTerm(star.Airmass, star.Color)
}

// primedZeroPoint returns one comparison star's zero point without the
// terms of the star being measured: Z′ = C − c + k′ X_C − ε CI_C. A star of
// instrumental magnitude v, airmass X and colour CI then has
// V = v + Z′ + starTerm(X, CI), and the ensemble averages Z′.
func (tr Transform) primedZeroPoint(compMag, compInst, compAirmass, compColor float64) float64 {
	z := compMag - compInst
	if tr.ExtinctionK != 0 {
		z += tr.ExtinctionK * compAirmass
	}
	if tr.ColorCoeff != 0 {
		z -= tr.ColorCoeff * compColor
	}
	return z
}

// starTerm returns −k′ X + ε CI for the star being measured.
func (tr Transform) starTerm(airmass, color float64) float64 {
	var s float64
	if tr.ExtinctionK != 0 {
		s -= tr.ExtinctionK * airmass
	}
	if tr.ColorCoeff != 0 {
		s += tr.ColorCoeff * color
	}
	return s
}

// Limits of the coefficients accepted: k′ of a few tenths is usual in V,
// up to about one in U at a poor site; |ε| is a few hundredths for a good
// filter match (methods.md §15, common practice). Larger values are typing
// errors.
const (
	maxExtinctionK = 3
	maxColorCoeff  = 1
)

// validate checks the coefficients and that every star has the colour the
// colour term needs.
func (tr Transform) validate(comps []Comp, check *Comp) error {
	if math.IsNaN(tr.ExtinctionK) || tr.ExtinctionK < 0 || tr.ExtinctionK > maxExtinctionK {
		return fmt.Errorf("reduce: extinction coefficient %v: expected k′ in [0, %d] mag per airmass", tr.ExtinctionK, maxExtinctionK)
	}
	if math.IsNaN(tr.ColorCoeff) || math.Abs(tr.ColorCoeff) > maxColorCoeff {
		return fmt.Errorf("reduce: colour coefficient %v: expected ε within ±%d", tr.ColorCoeff, maxColorCoeff)
	}
	for id, s := range tr.Positions {
		if err := s.Validate(); err != nil {
			return fmt.Errorf("reduce: position of star %q: %w", id, err)
		}
	}
	if tr.ColorCoeff == 0 {
		return nil
	}
	if !finite(tr.TargetColor) {
		return fmt.Errorf("reduce: target colour index %v: expected a number for the colour term", tr.TargetColor)
	}
	for _, c := range comps {
		if ci, ok := tr.CompColor[c.ID]; !ok || !finite(ci) {
			return fmt.Errorf("reduce: comparison star %q has no colour index: the colour term needs one for every comparison star", c.ID)
		}
	}
	if check != nil && !finite(tr.CheckColor) {
		return fmt.Errorf("reduce: check star colour index %v: expected a number for the colour term", tr.CheckColor)
	}
	return nil
}

// photoAirmass returns the airmass given in the data, or else the one of
// the star's position seen in the view sky.
func photoAirmass(given float64, v *ephem.StarVec, sky *ephem.Sky) (float64, error) {
	if given > 0 {
		return given, nil
	}
	if v == nil || sky == nil {
		return 0, fmt.Errorf("no airmass: the extinction correction needs it (give the airmass, or the star's position and a site)")
	}
	x, ok := airmassAt(sky, v)
	if !ok {
		return 0, fmt.Errorf("the star is below the horizon of the site: no airmass")
	}
	return x, nil
}

// airmassAt returns the airmass toward the star seen in the view sky: the
// Pickering (2002) airmass of the refracted altitude (ephem.Airmass). ok is
// false below the horizon.
func airmassAt(sky *ephem.Sky, v *ephem.StarVec) (x float64, ok bool) {
	return ephem.Airmass(ephem.RefractedAltDeg(sky.StarAltDeg(v)))
}

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
