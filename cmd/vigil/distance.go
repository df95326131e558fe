package main

import (
	"fmt"
	"io"
	"strings"

	"example.org/vigil/reduce"
)

var distanceCommand = command{
	name:    "distance",
	summary: "the period–luminosity distance of a classical Cepheid from its period and intensity-mean magnitude",
	run:     runDistance,
}

// distanceResponse is the answer of vigil distance. abs_mag, distance_pc,
// distance_err_pc and relation are the contract (spec/cli.md, "vigil
// distance"): do not rename or drop them.
type distanceResponse struct {
	AbsMag        float64  `json:"abs_mag"`         // M from the relation, mag
	DistancePc    float64  `json:"distance_pc"`     // 10^((m − M − A + 5)/5)
	DistanceErrPc *float64 `json:"distance_err_pc"` // from the relation's stated uncertainties alone
	Relation      string   `json:"relation"`        // the calibration, its formula and its reference

	RelationName      string   `json:"relation_name"` // the key --relation takes
	RelationReference string   `json:"relation_reference"`
	Band              string   `json:"band"`
	AbsMagErr         *float64 `json:"abs_mag_err"`
	Modulus           float64  `json:"modulus"` // μ0 = m − A − M, mag
	PeriodDays        float64  `json:"period"`
	MeanMag           float64  `json:"mean_mag"`
	Extinction        float64  `json:"extinction"`
	Warnings          []string `json:"warnings,omitempty"`
}

func runDistance(e *env, args []string) error {
	rels := reduce.PLRelations()
	var names []string
	for _, r := range rels {
		names = append(names, r.Name+": "+r.Reference)
	}
	f := newFlags(e.cmd,
		"--period DAYS --mean-mag MAG [--relation NAME] [--extinction MAG] [--json]",
		`The distance of a classical (type I, fundamental-mode) Cepheid from a
period-luminosity relation: M = slope*(log10 P - pivot) + zero point, then
d = 10^((m - M - A + 5)/5) pc. The default relation is the V-band
calibration of Benedict et al. (2007, AJ 133, 1810):
M_V = -2.43 (log P - 1) - 4.05. The error comes from the relation's stated
uncertainties alone: the width of the instability strip (0.1-0.2 mag) and
the error of the extinction usually dominate it. Type II Cepheids and
overtone pulsators do not follow these relations.`)
	periodText := f.required("period", "DAYS", "the pulsation period in days")
	meanText := f.required("mean-mag", "MAG", "the intensity-mean apparent magnitude over a whole cycle, in the relation's band (V), mag")
	relText := f.value("relation", "NAME", reduce.DefaultPLRelation, "the period–luminosity relation: "+strings.Join(names, "; "), "")
	extText := f.value("extinction", "MAG", "0", "the interstellar extinction A_V in magnitudes (e.g. 3.1 E(B−V))", "")
	asJSON := f.toggle("json", "print one JSON object instead of a table")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}

	period, err := get(f, "period", *periodText, parsePeriodDays)
	if err != nil {
		return err
	}
	mean, err := get(f, "mean-mag", *meanText, parseMagnitude)
	if err != nil {
		return err
	}
	rel, err := get(f, "relation", *relText, trimmed(reduce.LookupPLRelation))
	if err != nil {
		return err
	}
	ext, err := get(f, "extinction", *extText, parseExtinction)
	if err != nil {
		return err
	}
	// Every input passed its flag's parser, which checks what Distance
	// checks: a refusal here is about the period.
	d, err := reduce.Distance(period, mean, ext, rel.Name)
	if err != nil {
		return &flagError{flag: "period", err: err}
	}
	resp := distanceAnswer(d, period, mean, ext)
	if *asJSON {
		return writeJSON(e.stdout, resp)
	}
	writeDistanceTable(e.stdout, resp)
	return nil
}

// parseExtinction reads A_V: a number of magnitudes, 0 or more.
func parseExtinction(s string) (float64, error) {
	v, err := parseMagnitude(s)
	if err != nil {
		return 0, err
	}
	if v < 0 {
		return 0, fmt.Errorf("extinction %q: want A_V of 0 magnitudes or more", s)
	}
	return v, nil
}

// relationText writes a relation as its name, formula and reference:
// "benedict2007: M_V = −2.43 (log P − 1) − 4.05; Benedict et al. 2007, ...".
func relationText(r reduce.PLRelation) string {
	signed := func(x float64) string { // " + 1.2" or " − 1.2"
		if x < 0 {
			return fmt.Sprintf(" − %g", -x)
		}
		return fmt.Sprintf(" + %g", x)
	}
	slope := strings.Replace(fmt.Sprintf("%g", r.Slope), "-", "−", 1)
	logP := "log P"
	if r.Pivot != 0 {
		logP = "(log P" + signed(-r.Pivot) + ")"
	}
	return fmt.Sprintf("%s: M_%s = %s %s%s; %s", r.Name, r.Band, slope, logP, signed(r.ZeroPoint), r.Reference)
}

// distanceAnswer fills the answer of vigil distance.
func distanceAnswer(d reduce.DistanceResult, period, mean, ext float64) distanceResponse {
	return distanceResponse{
		AbsMag: d.AbsMag, DistancePc: d.DistancePc, DistanceErrPc: num(d.DistanceErrPc),
		Relation: relationText(d.Relation), RelationName: d.Relation.Name, RelationReference: d.Relation.Reference,
		Band: d.Relation.Band, AbsMagErr: num(d.AbsMagErr), Modulus: d.Modulus,
		PeriodDays: period, MeanMag: mean, Extinction: ext, Warnings: d.Warnings,
	}
}

// writeDistanceTable prints the answer of vigil distance for people.
func writeDistanceTable(w io.Writer, r distanceResponse) {
	fmt.Fprintf(w, "Period–luminosity distance of a classical Cepheid, P = %g d, ⟨%s⟩ = %.3f, A_%s = %.3f\n\n", r.PeriodDays, r.Band, r.MeanMag, r.Band, r.Extinction)
	t := newTable(w)
	t.row("Relation", r.Relation)
	t.row("Absolute magnitude", fmt.Sprintf("%.4f ± %s", r.AbsMag, ptrText("%.4f", r.AbsMagErr)))
	t.row("Distance modulus", fmt.Sprintf("%.4f (m − A − M)", r.Modulus))
	t.row("Distance", fmt.Sprintf("%.1f ± %s pc (from the relation's stated errors alone)", r.DistancePc, ptrText("%.1f", r.DistanceErrPc)))
	t.flush()
	for _, warn := range r.Warnings {
		fmt.Fprintf(w, "\nCaution: %s.\n", warn)
	}
}
