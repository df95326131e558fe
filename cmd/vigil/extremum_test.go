package main

import (
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// Tolerances for vigil extremum.
const (
	// eclipseT0 is the true time of minimum of the eclipse of methods.md
	// §10, the centre of its Gaussian.
	eclipseT0 = 2460000.4321
	// kvwTol and polyTol: methods.md §10 [C] expects Kwee & van Woerden to
	// recover T0 within 2 s and a low-order polynomial within 10 s, noise-free
	// or with the stated perturbation.
	kvwTol  = 2 * second
	polyTol = 10 * second
	// numpyTimeTol: the same least-squares fit in the same window as numpy's
	// polyfit (make_timing_refs.py); only float64 rounding separates them,
	// far below the 0.0002 d of careful CCD timings (methods.md §15).
	numpyTimeTol = 0.001 * second
	// numpySigmaRelTol: relative tolerance on the covariance-propagated
	// sigma against numpy's, float64 rounding only.
	numpySigmaRelTol = 1e-6
)

func TestExtremumPublishedValues(t *testing.T) {
	const source = "methods.md §10 [C]"
	for _, tc := range []struct {
		name, file, method string
		tol                float64
	}{
		{"noise-free, Kwee & van Woerden", "extremum_eclipse.csv", "kvw", kvwTol},
		{"perturbed, Kwee & van Woerden", "extremum_eclipse_perturbed.csv", "kvw", kvwTol},
		{"noise-free, polynomial", "extremum_eclipse.csv", "poly", polyTol},
		{"perturbed, polynomial", "extremum_eclipse_perturbed.csv", "poly", polyTol},
	} {
		t.Run(tc.name, func(t *testing.T) {
			m := mustJSON(t, "extremum", "--input", filepath.Join("testdata", tc.file), "--kind", "min", "--method", tc.method, "--json")
			near(t, "time", number(t, m, "time"), eclipseT0, tc.tol, "d", source)
			if s := number(t, m, "sigma"); !(s > 0) || math.IsInf(s, 0) {
				t.Errorf("sigma = %v d, want finite and > 0 (%s)", s, source)
			}
			if m["method"] != tc.method || m["kind"] != "min" {
				t.Errorf("method %v, kind %v; want %s, min", m["method"], m["kind"], tc.method)
			}
			if n := number(t, m, "n"); n < 7 || n > 61 {
				t.Errorf("n = %v points used, want 7 to 61 (the file has 61)", n)
			}
		})
	}
}

// TestExtremumAgainstNumpy times the noisy eclipse of make_timing_refs.py in
// the windows it used, with the polynomial degrees it used, and compares
// the time and the covariance sigma with numpy's polyfit.
func TestExtremumAgainstNumpy(t *testing.T) {
	refs := timingRefs(t)
	noisy := filepath.Join(timingTestdata, "eclipse_noisy.csv")
	// The same points without the err column: the unweighted fit.
	text, err := os.ReadFile(noisy)
	if err != nil {
		t.Fatal(err)
	}
	var b strings.Builder
	for _, line := range strings.Split(strings.TrimSpace(string(text)), "\n") {
		if strings.HasPrefix(line, "#") {
			continue
		}
		f := strings.Split(line, ",")
		b.WriteString(f[0] + "," + f[1] + "\n")
	}
	noErr := writeTemp(t, "eclipse_noisy_no_err.csv", b.String())

	const source = "numpy polyfit, testdata/timing/refs.csv"
	for _, tc := range []struct {
		name, key, suffix, file, degree string
		weighted                        bool
	}{
		{"parabola, weighted", "eclipse_poly2", "", noisy, "2", true},
		{"quartic, weighted", "eclipse_poly4", "", noisy, "4", true},
		{"parabola, unweighted", "eclipse_poly2", "_unweighted", noErr, "2", false},
		{"quartic, unweighted", "eclipse_poly4", "_unweighted", noErr, "4", false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			m := mustJSON(t, "extremum", "--input", tc.file, "--kind", "min", "--degree", tc.degree,
				"--window-from", fmtRef(ref(t, refs, tc.key+"_from")), "--window-to", fmtRef(ref(t, refs, tc.key+"_to")), "--json")
			near(t, "time", number(t, m, "time"), ref(t, refs, tc.key+tc.suffix+"_time"), numpyTimeTol, "d", source)
			want := ref(t, refs, tc.key+tc.suffix+"_sigma")
			near(t, "sigma_method", number(t, m, "sigma_method"), want, numpySigmaRelTol*want, "d", source)
			if n, want := number(t, m, "n"), ref(t, refs, tc.key+"_n"); n != want {
				t.Errorf("n = %v, want %v (%s)", n, want, source)
			}
			if m["weighted"] != tc.weighted {
				t.Errorf("weighted = %v, want %v", m["weighted"], tc.weighted)
			}
			// Sigma is the bootstrap's for poly (spec/cli.md).
			if m["sigma_from"] != "bootstrap" || number(t, m, "sigma") != number(t, m, "sigma_bootstrap") {
				t.Errorf("sigma %v from %v, sigma_bootstrap %v: want the bootstrap's", m["sigma"], m["sigma_from"], m["sigma_bootstrap"])
			}
		})
	}
}

// fmtRef writes a reference number as a command-line value, in full.
func fmtRef(x float64) string { return strconv.FormatFloat(x, 'f', -1, 64) }

// TestExtremumOptions checks the bootstrap flags, the seed and missing cells.
func TestExtremumOptions(t *testing.T) {
	file := "testdata/extremum_eclipse_perturbed.csv"
	base := mustJSON(t, "extremum", "--input", file, "--kind", "min", "--json")
	again := mustJSON(t, "extremum", "--input", file, "--kind", "min", "--json")
	if base["sigma"] != again["sigma"] || base["time"] != again["time"] {
		t.Errorf("the same data and seed gave sigma %v then %v: want the same answer", base["sigma"], again["sigma"])
	}
	other := mustJSON(t, "extremum", "--input", file, "--kind", "min", "--seed", "7", "--json")
	if other["time"] != base["time"] || other["sigma_bootstrap"] == base["sigma_bootstrap"] {
		t.Errorf("--seed 7: time %v (want %v), sigma_bootstrap %v (want a new draw, not %v)", other["time"], base["time"], other["sigma_bootstrap"], base["sigma_bootstrap"])
	}
	// Both bootstrap draws estimate the same spread: within a factor 1.5
	// for 1000 resamples (the SD of an SD is about 1/sqrt(2·1000) ≈ 2%).
	if r := number(t, other, "sigma_bootstrap") / number(t, base, "sigma_bootstrap"); r < 1/1.5 || r > 1.5 {
		t.Errorf("sigma_bootstrap ratio between seeds %.3f, want within a factor 1.5", r)
	}
	off := mustJSON(t, "extremum", "--input", file, "--kind", "min", "--bootstrap", "0", "--json")
	if off["sigma_bootstrap"] != nil || off["sigma_from"] != "method" || off["sigma"] != off["sigma_method"] || number(t, off, "bootstrap") != 0 {
		t.Errorf("--bootstrap 0: sigma %v from %v, sigma_method %v, sigma_bootstrap %v; want the method's own and no bootstrap",
			off["sigma"], off["sigma_from"], off["sigma_method"], off["sigma_bootstrap"])
	}
	kvw := mustJSON(t, "extremum", "--input", file, "--kind", "min", "--method", "kvw", "--folds", "3", "--json")
	if number(t, kvw, "folds") != 3 || kvw["degree"] != nil || kvw["sigma"] != kvw["sigma_method"] {
		t.Errorf("kvw --folds 3: folds %v, degree %v, sigma %v vs sigma_method %v", kvw["folds"], kvw["degree"], kvw["sigma"], kvw["sigma_method"])
	}

	// Empty mag cells are missing points, not zero: blank two of them far
	// from the minimum and the time stays within the method's tolerance.
	text, err := os.ReadFile("testdata/extremum_eclipse.csv")
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(string(text), "\n")
	for _, i := range []int{5, 60} { // data rows 3 and 58
		f := strings.Split(lines[i], ",")
		lines[i] = f[0] + ","
	}
	holes := writeTemp(t, "holes.csv", strings.Join(lines, "\n"))
	m := mustJSON(t, "extremum", "--input", holes, "--kind", "min", "--method", "kvw", "--json")
	near(t, "time with two empty mag cells", number(t, m, "time"), eclipseT0, kvwTol, "d", "methods.md §10 [C]")
	if number(t, m, "missing_mag") != 2 || number(t, m, "rows") != 61 {
		t.Errorf("missing_mag %v, rows %v; want 2 and 61", m["missing_mag"], m["rows"])
	}
}

func TestExtremumGolden(t *testing.T) {
	for _, tc := range []struct {
		name string
		args []string
	}{
		{"extremum_perturbed_kvw", []string{"extremum", "--input", "testdata/extremum_eclipse_perturbed.csv", "--kind", "min", "--method", "kvw", "--json"}},
		{"extremum_perturbed_poly", []string{"extremum", "--input", "testdata/extremum_eclipse_perturbed.csv", "--kind", "min", "--json"}},
		{"extremum_noisy_poly4_window", []string{"extremum", "--input", filepath.Join(timingTestdata, "eclipse_noisy.csv"), "--kind", "min",
			"--degree", "4", "--window-from", "2460000.412", "--window-to", "2460000.452", "--json"}},
		{"extremum_cepheid_max", []string{"extremum", "--input", filepath.Join(timingTestdata, "cepheid_max.csv"), "--json"}},
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

func TestExtremumTable(t *testing.T) {
	r := vigil("extremum", "--input", "testdata/extremum_eclipse_perturbed.csv", "--kind", "min", "--method", "kvw")
	if r.code != 0 || r.stderr != "" {
		t.Fatalf("exit %d, stderr %q", r.code, r.stderr)
	}
	for _, want := range []string{"Time of minimum (largest magnitude)", "Kwee & van Woerden (1956), 5 trial times", "2460000.4320",
		"Uncertainty", " s (method)", "Points used", "of 61 rows"} {
		if !strings.Contains(r.stdout, want) {
			t.Errorf("table lacks %q:\n%s", want, r.stdout)
		}
	}
}

// FuzzExtremum feeds vigil extremum arbitrary files and options: it must
// answer with one JSON object or fail with status 2 and one line, never
// panic.
func FuzzExtremum(f *testing.F) {
	eclipse, err := os.ReadFile("testdata/extremum_eclipse_perturbed.csv")
	if err != nil {
		f.Fatal(err)
	}
	f.Add(string(eclipse), "min", "kvw", "auto")
	f.Add(string(eclipse), "max", "poly", "0.01")
	f.Add("time,mag,err\n1,2,3\n4,5,-6\n", "min", "poly", "auto")
	f.Add("time,mag\n2460000.1,10\n2460000.1,10\n2460000.1,10\n2460000.1,10\n2460000.1,10\n2460000.1,10\n2460000.1,10\n", "min", "kvw", "auto")
	f.Add("# only a comment\n", "max", "poly", "1e300")
	f.Fuzz(func(t *testing.T, text, kind, method, window string) {
		path := filepath.Join(t.TempDir(), "in.csv")
		if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		args := []string{"extremum", "--input", path, "--kind=" + kind, "--method=" + method, "--window=" + window, "--bootstrap=20", "--json"}
		checkOutcome(t, args, vigil(args...))
	})
}
