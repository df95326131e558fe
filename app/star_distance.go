package app

import (
	"fmt"
	"math"
	"strings"

	"example.org/vigil/observe"
	"example.org/vigil/reduce"
)

// LightYearsPerParsec converts parsecs to light years: a parsec is
// 648000/π au (IAU 2015 Resolution B2), the au 149 597 870 700 m (IAU 2012
// Resolution B2), the light year c × 365.25 d (IAU: the Julian year), c =
// 299 792 458 m/s; 3.2615637771674… (astropy 1 pc → lyr: 3.2615637771674333).
const LightYearsPerParsec = 648000 / math.Pi * 149597870700 / (299792458 * 86400 * 365.25)

// StarDistanceNote says to which stars the period–luminosity distance
// applies.
const StarDistanceNote = "For classical (type I, fundamental-mode) Cepheids only. RR Lyrae, δ Scuti and type II " +
	"Cepheids, and stars pulsating in an overtone, do not follow these relations."

// StarDistanceApplies reports whether the Star page offers a
// period–luminosity distance for t: a pulsating star (the relations
// themselves hold for classical Cepheids only, StarDistanceNote).
func StarDistanceApplies(t observe.Target) bool { return t.Class == observe.Pulsating }

// StarDistanceForm is the text of the distance panel.
type StarDistanceForm struct {
	MeanV, AV, Relation string // Relation: a reduce.PLRelation's Name ("" for the default)
}

// StarDistance is the distance panel's result: the lines to show, or what
// is wrong with a field (StarFieldErrors keyed "mean_v", "a_v").
type StarDistance struct {
	Result   reduce.DistanceResult
	OK       bool
	Lines    []StarLine
	Warnings []string
	Errors   StarFieldErrors
}

// The distance panel's fields, as keys of StarDistance.Errors.
const (
	StarFieldMeanV = "mean_v"
	StarFieldAV    = "a_v"
)

// StarDistanceOf computes the period–luminosity distance of t from its
// current period and the form (reduce.Distance): the mean V (intensity
// mean, mag), the extinction A_V (mag, empty: 0) and the relation.
func StarDistanceOf(t observe.Target, f StarDistanceForm) StarDistance {
	d := StarDistance{Errors: StarFieldErrors{}}
	mag := starUnits{"": 1, "mag": 1}
	mean := starQuantity(d.Errors, StarFieldMeanV, f.MeanV, "mean V", "mag", mag, -30, 40, math.NaN())
	av := starQuantity(d.Errors, StarFieldAV, f.AV, "A_V", "mag", mag, 0, 20, 0)
	if d.Errors[StarFieldMeanV] == "" && math.IsNaN(mean) {
		d.Errors[StarFieldMeanV] = "mean V: want the star's intensity-mean V magnitude, e.g. 8.42 " +
			"(the mean of its fluxes over a whole cycle, not of its magnitudes)"
	}
	if len(d.Errors) > 0 {
		return d
	}
	res, err := reduce.Distance(t.Ephemeris.PeriodDays, mean, av, f.Relation)
	if err != nil {
		d.Errors[StarFieldForm] = starErrText(err)
		return d
	}
	d.Result, d.OK, d.Warnings = res, true, res.Warnings
	rel := res.Relation
	d.Lines = []StarLine{
		{"Period", fmt.Sprintf("%s d (the current ephemeris)", numText(t.Ephemeris.PeriodDays))},
		{"Absolute magnitude", fmt.Sprintf("M_%s = %.2f ± %.2f mag", rel.Band, res.AbsMag, res.AbsMagErr)},
		{"Distance modulus", fmt.Sprintf("m − A − M = %.2f mag", res.Modulus)},
		{"Distance", fmt.Sprintf("%s ± %s pc  (%s ± %s light years)", starRound(res.DistancePc), starRound(res.DistanceErrPc),
			starRound(res.DistancePc*LightYearsPerParsec), starRound(res.DistanceErrPc*LightYearsPerParsec))},
		{"Relation", fmt.Sprintf("%s: M = %.2f (log P − %g) %+.2f, %s band", rel.Name, rel.Slope, rel.Pivot, rel.ZeroPoint, rel.Band)},
		{"Reference", rel.Reference},
		{"Error", "from the relation's stated uncertainties only; the width of the instability strip " +
			"(about 0.1–0.2 mag) and the error of A_V usually weigh more"},
	}
	return d
}

// starRound writes a distance to three significant figures, whole numbers
// with thin groups of thousands: "2 880", "71.4".
func starRound(v float64) string {
	if v == 0 || math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Sprintf("%.0f", v)
	}
	digits := 3 - int(math.Floor(math.Log10(math.Abs(v)))) - 1
	if digits > 0 {
		return fmt.Sprintf("%.*f", digits, v)
	}
	p := math.Pow(10, float64(-digits))
	s := fmt.Sprintf("%.0f", math.Round(v/p)*p)
	var b strings.Builder
	for i, r := range s {
		if i > 0 && (len(s)-i)%3 == 0 {
			b.WriteRune(' ')
		}
		b.WriteRune(r)
	}
	return b.String()
}
