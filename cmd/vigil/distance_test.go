package main

import (
	"math"
	"strings"
	"testing"
)

// Tolerances for vigil distance.
const (
	// quotedAbsMagTol: methods.md §13 quotes M_V and μ0 to 1e-4 mag.
	quotedAbsMagTol = 0.5e-4
	// quotedDistanceTol: methods.md §13 quotes d = 263 pc (to 1 pc).
	quotedDistanceTol = 0.5
	// parallaxFraction: methods.md §13 accepts ±10% against the 273 pc of
	// the HST parallax of Benedict et al. (2002).
	parallaxFraction = 0.10
)

// distanceDeltaCep is vigil distance for δ Cep with the numbers of
// methods.md §13: P = 5.366341 d (GCVS), ⟨V⟩ = 3.94, A_V = 0.23.
var distanceDeltaCep = []string{"distance", "--period", "5.366341", "--mean-mag", "3.94", "--extinction", "0.23", "--json"}

func TestDistancePublishedValues(t *testing.T) {
	m := mustJSON(t, distanceDeltaCep...)
	const source = "methods.md §13 [C, inputs S]"
	near(t, "abs_mag", number(t, m, "abs_mag"), -3.3931, quotedAbsMagTol, "mag", source)
	near(t, "modulus", number(t, m, "modulus"), 7.1031, quotedAbsMagTol, "mag", source)
	near(t, "distance_pc", number(t, m, "distance_pc"), 263, quotedDistanceTol, "pc", source)
	near(t, "distance_pc vs the parallax", number(t, m, "distance_pc"), 273, parallaxFraction*273, "pc",
		"Benedict et al. 2002, AJ 124, 1695: π = 3.66 mas, via methods.md §13")

	// d = 10^((m − M − A + 5)/5) pc (spec/cli.md) from the abs_mag given.
	d := math.Pow(10, (3.94-number(t, m, "abs_mag")-0.23+5)/5)
	near(t, "distance_pc from abs_mag", number(t, m, "distance_pc"), d, 1e-9*d, "pc", "spec/cli.md")
	// The error from the stated uncertainties of Benedict et al. (2007):
	// slope ±0.12, zero point ±0.02, independent, at log P − 1.
	x := math.Log10(5.366341) - 1
	sigmaM := math.Hypot(0.12*x, 0.02)
	near(t, "distance_err_pc", number(t, m, "distance_err_pc"), d*math.Ln10/5*sigmaM, 1e-9*d, "pc",
		"Benedict et al. 2007, AJ 133, 1810, propagated: σ_d = d·ln10/5·σ_M")
	if rel, _ := m["relation"].(string); !strings.Contains(rel, "Benedict et al. 2007, AJ 133, 1810") || !strings.Contains(rel, "−2.43 (log P − 1) − 4.05") {
		t.Errorf("relation = %q, want the Benedict et al. (2007) calibration, its formula and its reference", rel)
	}
	if m["relation_name"] != "benedict2007" {
		t.Errorf("relation_name = %v, want benedict2007 (the default of spec/cli.md)", m["relation_name"])
	}
}

// TestDistanceOptions checks --relation, the default extinction and the
// warning for a period outside the calibrating stars.
func TestDistanceOptions(t *testing.T) {
	noExt := mustJSON(t, "distance", "--period", "5.366341", "--mean-mag", "3.94", "--json")
	withExt := mustJSON(t, distanceDeltaCep...)
	// A_V = 0.23 mag dims by a factor 10^(0.23/5) in distance.
	ratio := number(t, noExt, "distance_pc") / number(t, withExt, "distance_pc")
	near(t, "distance ratio for A_V = 0.23", ratio, math.Pow(10, 0.23/5), 1e-12, "", "d = 10^((m − M − A + 5)/5)")
	if number(t, noExt, "extinction") != 0 {
		t.Errorf("extinction = %v without --extinction, want the default 0", noExt["extinction"])
	}

	l := mustJSON(t, "distance", "--period", "5.366341", "--mean-mag", "3.94", "--extinction", "0.23", "--relation", "LANOIX1999", "--json")
	// Lanoix, Paturel & Garnier (1999), as vigil/reduce carries it:
	// M_V = −2.77 log P − 1.44.
	near(t, "abs_mag, lanoix1999", number(t, l, "abs_mag"), -2.77*math.Log10(5.366341)-1.44, 1e-12, "mag", "reduce.PLRelations")
	if l["relation_name"] != "lanoix1999" || !strings.Contains(l["relation"].(string), "Lanoix, Paturel & Garnier 1999") {
		t.Errorf("relation %q (%v), want lanoix1999 with its reference", l["relation"], l["relation_name"])
	}

	short := mustJSON(t, "distance", "--period", "1.5", "--mean-mag", "8", "--json")
	if w, _ := short["warnings"].([]any); len(w) == 0 || !strings.Contains(w[0].(string), "extrapolated") {
		t.Errorf("P = 1.5 d: warnings %v, want one saying the relation is extrapolated", short["warnings"])
	}
	if _, ok := withExt["warnings"]; ok {
		t.Errorf("δ Cep: warnings %v, want none (5.37 d lies among the calibrators)", withExt["warnings"])
	}
}

func TestDistanceGolden(t *testing.T) {
	r := vigil(distanceDeltaCep...)
	if r.code != 0 {
		t.Fatalf("exit %d, stderr %q", r.code, r.stderr)
	}
	compareGolden(t, "distance_delta_cep", r.stdout)
}

func TestDistanceTable(t *testing.T) {
	r := vigil(distanceDeltaCep[:len(distanceDeltaCep)-1]...)
	if r.code != 0 || r.stderr != "" {
		t.Fatalf("exit %d, stderr %q", r.code, r.stderr)
	}
	for _, want := range []string{"P = 5.366341 d", "⟨V⟩ = 3.940", "A_V = 0.230", "Benedict et al. 2007", "-3.3931", "7.1031", "263.4 ± 4.6 pc"} {
		if !strings.Contains(r.stdout, want) {
			t.Errorf("table lacks %q:\n%s", want, r.stdout)
		}
	}
}

// FuzzDistance checks that no command line of vigil distance panics, prints
// anything but one JSON object on success, or fails other than with status
// 2 and one line.
func FuzzDistance(f *testing.F) {
	f.Add("5.366341", "3.94", "0.23", "benedict2007")
	f.Add("0", "-40", "0", "lanoix1999")
	f.Add("1e5", "40", "1e300", "")
	f.Add("NaN", "Inf", "-0", "x")
	f.Fuzz(func(t *testing.T, period, mean, ext, rel string) {
		args := []string{"distance", "--period=" + period, "--mean-mag=" + mean, "--extinction=" + ext, "--relation=" + rel, "--json"}
		checkOutcome(t, args, vigil(args...))
	})
}
