package main

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// Tolerances for vigil oc.
const (
	// ocExactTol: O−C of exact synthetic timings typed to 1e-3 d; float64
	// holds a Julian date near 2.45e6 to about 5e-10 d, so the O−C are exact
	// to a few 1e-10 d.
	ocExactTol = 0.001 * second
	// numpyRelTol: relative tolerance on fitted parameters, errors and χ²
	// against numpy's polyfit on the same timings (make_timing_refs.py);
	// float64 rounding only.
	numpyRelTol = 1e-6
	// quotedSecPerYearTol: methods.md §11 quotes dP/dt = 0.03156 s/yr
	// (half a unit of the last digit).
	quotedSecPerYearTol = 0.5e-5
)

// ocQuadraticArgs runs vigil oc on the synthetic quadratic timings of
// methods.md §11, against the linear elements T0 = 2450000.0, P = 0.4 d.
var ocQuadraticArgs = []string{"oc", "--input", "testdata/oc_quadratic.csv", "--epoch", "2450000.0", "--period", "0.4", "--json"}

func TestOCPublishedValues(t *testing.T) {
	const source = "methods.md §11 [C]"
	m := mustJSON(t, ocQuadraticArgs...)
	rows := list(t, m, "rows")
	if len(rows) != 5 {
		t.Fatalf("%d rows, want 5", len(rows))
	}
	for i, want := range []struct{ cycle, oc float64 }{
		{0, 0}, {5000, 0.005}, {10000, 0.020}, {15000, 0.045}, {20000, 0.080},
	} {
		if c := number(t, rows[i], "cycle"); c != want.cycle {
			t.Errorf("row %d: cycle %v, want %v", i, c, want.cycle)
		}
		near(t, "oc_days at E = "+fmtRef(want.cycle), number(t, rows[i], "oc_days"), want.oc, ocExactTol, "d", source)
	}
	q := object(t, m, "quadratic")
	near(t, "q", number(t, q, "q"), 2.0e-10, 1e-6*2.0e-10, "d", source)
	near(t, "dpdt", number(t, q, "dpdt"), 1.0e-9, 1e-6*1.0e-9, "d/d", source)
	near(t, "dpdt_s_per_yr", number(t, q, "dpdt_s_per_yr"), 0.03156, quotedSecPerYearTol, "s/yr", source)
	near(t, "quadratic epoch", number(t, q, "epoch"), 2450000.0, ocExactTol, "d", source)
	near(t, "quadratic period", number(t, q, "period"), 0.4, ocExactTol/20000, "d", source+" (over 20000 cycles)")
	// dpdt = 2Q/P with the fitted P (spec/cli.md).
	near(t, "dpdt = 2q/period", number(t, q, "dpdt"), 2*number(t, q, "q")/number(t, q, "period"), 1e-9*1e-9, "d/d", "spec/cli.md")
	if m["preferred"] != "quadratic" || !strings.Contains(m["preferred_by"].(string), "F-test") {
		t.Errorf("preferred %v by %q; want quadratic by an F-test", m["preferred"], m["preferred_by"])
	}
	if m["weighted"] != false {
		t.Errorf("weighted = %v without a sigma column, want false", m["weighted"])
	}
	for _, r := range rows {
		if v, ok := r["sigma"]; !ok || v != nil {
			t.Errorf("sigma = %v (present %v) without a sigma column, want null", v, ok)
		}
	}
}

// TestOCAgainstNumpy fits the noisy quadratic timings of make_timing_refs.py
// with their sigmas (weighted, formal errors) and without (unweighted, χ²
// in days² and errors scaled by sqrt(χ²/dof)), as spec/cli.md fixes the two
// rules, and compares every number with numpy's.
func TestOCAgainstNumpy(t *testing.T) {
	refs := timingRefs(t)
	const source = "numpy polyfit, testdata/timing/refs.csv"
	for _, tc := range []struct {
		name, file, key string
		weighted        bool
	}{
		{"weighted by 1/sigma²", "oc_noisy.csv", "oc_weighted", true},
		{"unweighted", "oc_unweighted.csv", "oc_unweighted", false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			m := mustJSON(t, "oc", "--input", filepath.Join(timingTestdata, tc.file), "--epoch", "2450000.0", "--period", "0.4", "--timescale", "hjd", "--json")
			if m["weighted"] != tc.weighted {
				t.Errorf("weighted = %v, want %v", m["weighted"], tc.weighted)
			}
			for _, fit := range []struct {
				name   string
				fields map[string]string // JSON field → refs.csv suffix
			}{
				{"linear", map[string]string{"epoch": "epoch", "period": "period", "epoch_err": "epoch_err", "period_err": "period_err",
					"chi2": "chi2", "dof": "dof", "cov_epoch_period": "cov_epoch_period"}},
				{"quadratic", map[string]string{"epoch": "epoch", "period": "period", "epoch_err": "epoch_err", "period_err": "period_err",
					"q": "q", "q_err": "q_err", "dpdt": "dpdt", "dpdt_err": "dpdt_err", "chi2": "chi2", "dof": "dof"}},
			} {
				o := object(t, m, fit.name)
				for field, suffix := range fit.fields {
					want := ref(t, refs, tc.key+"_"+fit.name+"_"+suffix)
					tol := numpyRelTol * math.Abs(want)
					if field == "epoch" {
						tol = numpyRelTol * second // a Julian date: relative to a day, not to 2.45e6
					}
					near(t, fit.name+"."+field, number(t, o, field), want, tol, "", source)
				}
			}
			want := ref(t, refs, tc.key+"_ftest_f")
			near(t, "f_test_f", number(t, m, "f_test_f"), want, numpyRelTol*want, "", source)
			if m["preferred"] != "quadratic" {
				t.Errorf("preferred = %v, want quadratic (F = %.0f)", m["preferred"], want)
			}
			// --timescale labels the answer.
			if eph := object(t, m, "ephemeris"); eph["timescale"] != "hjd" {
				t.Errorf("ephemeris.timescale = %v, want hjd", eph["timescale"])
			}
		})
	}
}

// TestOCFewTimings checks that three timings give a linear fit only.
func TestOCFewTimings(t *testing.T) {
	three := writeTemp(t, "three.csv", "time\n2450000.000\n2452000.005\n2454000.020\n")
	m := mustJSON(t, "oc", "--input", three, "--epoch", "2450000", "--period", "0.4", "--json")
	if v, ok := m["quadratic"]; !ok || v != nil {
		t.Errorf("quadratic = %v (present %v) with 3 timings, want null", v, ok)
	}
	if m["preferred"] != "linear" || m["f_test_f"] != nil {
		t.Errorf("preferred %v, f_test_f %v; want linear and null", m["preferred"], m["f_test_f"])
	}
	if dof := number(t, object(t, m, "linear"), "dof"); dof != 1 {
		t.Errorf("linear dof = %v, want 3 − 2 = 1", dof)
	}
}

// TestOCSecondary checks --secondary: a minimum half a period after a
// primary one gets a half-integer cycle, and without the flag the nearest
// integer (spec/cli.md).
func TestOCSecondary(t *testing.T) {
	// Primary minima at E = 0, 100, 200 and secondaries at E = 50.5, 150.5 of
	// T = 2450000.0 + 0.4 E, exact in decimal.
	file := writeTemp(t, "secondary.csv", "time\n2450000.0\n2450020.2\n2450040.0\n2450060.2\n2450080.0\n")
	wantCycles := []float64{0, 50.5, 100, 150.5, 200}
	m := mustJSON(t, "oc", "--input", file, "--epoch", "2450000.0", "--period", "0.4", "--secondary", "--json")
	for i, r := range list(t, m, "rows") {
		if c := number(t, r, "cycle"); c != wantCycles[i] {
			t.Errorf("--secondary row %d: cycle %v, want %v", i, c, wantCycles[i])
		}
		near(t, "oc_days", number(t, r, "oc_days"), 0, ocExactTol, "d", "exact timings")
	}
	if m["secondary"] != true {
		t.Errorf("secondary = %v, want true", m["secondary"])
	}
	// Without --secondary a half-cycle timing is half a period off: its
	// cycle count is flagged as doubtful.
	m = mustJSON(t, "oc", "--input", file, "--epoch", "2450000.0", "--period", "0.4", "--json")
	rows := list(t, m, "rows")
	if oc := number(t, rows[1], "oc_days"); rows[1]["ambiguous"] != true || math.Abs(math.Abs(oc)-0.2) > ocExactTol {
		t.Errorf("without --secondary row 1: ambiguous %v, oc_days %v; want true, ±0.2", rows[1]["ambiguous"], rows[1]["oc_days"])
	}
}

func TestOCGolden(t *testing.T) {
	for _, tc := range []struct {
		name string
		args []string
	}{
		{"oc_noisy_weighted", []string{"oc", "--input", filepath.Join(timingTestdata, "oc_noisy.csv"), "--epoch", "2450000.0", "--period", "0.4", "--json"}},
		{"oc_noisy_unweighted_hjd", []string{"oc", "--input", filepath.Join(timingTestdata, "oc_unweighted.csv"), "--epoch", "JD2450000.0", "--period", "0.4", "--timescale", "hjd", "--json"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r := vigil(tc.args...)
			if r.code != 0 {
				t.Fatalf("exit %d, stderr %q", r.code, r.stderr)
			}
			compareGolden(t, tc.name, r.stdout)
		})
	}
}

func TestOCTable(t *testing.T) {
	r := vigil(ocQuadraticArgs[:len(ocQuadraticArgs)-1]...)
	if r.code != 0 || r.stderr != "" {
		t.Fatalf("exit %d, stderr %q", r.code, r.stderr)
	}
	for _, want := range []string{"BJD_TDB 2450000.000000 + 0.40000000·E", "O−C (d)", "20000", "+0.08000",
		"Linear fit (unweighted", "Quadratic fit", "dP/dt", "s/yr", "Preferred: quadratic"} {
		if !strings.Contains(r.stdout, want) {
			t.Errorf("table lacks %q:\n%s", want, r.stdout)
		}
	}
}

// FuzzOC feeds vigil oc arbitrary files and ephemerides: it must answer with
// one JSON object or fail with status 2 and one line, never panic.
func FuzzOC(f *testing.F) {
	f.Add("time\n2450000.000\n2452000.005\n2454000.020\n2456000.045\n2458000.080\n", "2450000.0", "0.4", false)
	f.Add("time,sigma\n2450000.0,0\n2450000.4,1e-300\n2450000.8,1e300\n2450001.2,\n", "2450000.0", "0.4", true)
	f.Add("time\n2450000.0\n2450000.0\n2450000.0\n", "JD2450000", "1e-9", false)
	f.Fuzz(func(t *testing.T, text, epoch, period string, secondary bool) {
		path := filepath.Join(t.TempDir(), "in.csv")
		if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		args := []string{"oc", "--input", path, "--epoch=" + epoch, "--period=" + period, "--json"}
		if secondary {
			args = append(args, "--secondary")
		}
		checkOutcome(t, args, vigil(args...))
	})
}
