package main

import (
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// timingTestdata holds the shared timing tables written with numpy by
// testdata/timing/make_timing_refs.py at the top of the module.
var timingTestdata = filepath.Join("..", "..", "testdata", "timing")

// timingRefs reads testdata/timing/refs.csv (quantity,value), the reference
// numbers make_timing_refs.py computed with numpy.
func timingRefs(t *testing.T) map[string]float64 {
	t.Helper()
	refs := map[string]float64{}
	for _, row := range refRows(t, filepath.Join(timingTestdata, "refs.csv")) {
		v, err := strconv.ParseFloat(row["value"], 64)
		if err != nil {
			t.Fatalf("refs.csv: %s: %v", row["quantity"], err)
		}
		refs[row["quantity"]] = v
	}
	return refs
}

// ref returns one reference number, failing the test when refs.csv lacks it.
func ref(t *testing.T, refs map[string]float64, name string) float64 {
	t.Helper()
	v, ok := refs[name]
	if !ok {
		t.Fatalf("refs.csv has no %q: regenerate it with make_timing_refs.py", name)
	}
	return v
}

// writeTemp writes text to a file in a fresh temporary directory and
// returns its path.
func writeTemp(t *testing.T, name, text string) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

// object returns a JSON field as an object, failing the test when it is not.
func object(t *testing.T, m map[string]any, key string) map[string]any {
	t.Helper()
	o, ok := m[key].(map[string]any)
	if !ok {
		t.Fatalf("field %q = %v: want an object", key, m[key])
	}
	return o
}

// list returns a JSON field as a list of objects.
func list(t *testing.T, m map[string]any, key string) []map[string]any {
	t.Helper()
	a, ok := m[key].([]any)
	if !ok {
		t.Fatalf("field %q = %v: want a list", key, m[key])
	}
	out := make([]map[string]any, len(a))
	for i, v := range a {
		if out[i], ok = v.(map[string]any); !ok {
			t.Fatalf("%s[%d] = %v: want an object", key, i, v)
		}
	}
	return out
}

// near checks got against want within tol and reports the difference.
func near(t *testing.T, what string, got, want, tol float64, unit, source string) {
	t.Helper()
	if d := got - want; !(math.Abs(d) <= tol) {
		t.Errorf("%s: got %.10g, want %.10g (%s), diff %.3g %s, tol %.3g %s", what, got, want, source, d, unit, tol, unit)
	}
}

// TestTimingBadInput checks the contract for bad input to vigil reduce,
// extremum, oc and distance (spec/cli.md, "Conventions"): exit status 2,
// exactly one line on stderr naming the flag, or the file, line and column
// at fault, nothing on stdout.
func TestTimingBadInput(t *testing.T) {
	const ensemble = "testdata/reduce_ensemble.csv"
	eclipse := "testdata/extremum_eclipse.csv"
	reduceArgs := func(extra ...string) []string {
		return append([]string{"reduce", "--ra", "22.5", "--dec", "58", "--json"}, extra...)
	}
	// Files whose faults sit at a known line and column.
	badCell := writeTemp(t, "bad_cell.csv", "# a comment line\ntime,mag,err\n2460000.1,10.01,0.01\n2460000.2, abc ,0.01\n")
	negErr := writeTemp(t, "neg_err.csv", "time,mag,err\n2460000.1,10.01,0.01\n2460000.2,10.02,0.01\n2460000.3,10.03,-0.01\n")
	noMag := writeTemp(t, "no_mag.csv", "time,flux\n2460000.1,1.0\n")
	headerOnly := writeTemp(t, "header_only.csv", "# nothing measured yet\ntime,mag\n")
	noTime := writeTemp(t, "no_time.csv", "time,mag\n2460000.1,10.01\n,10.02\n")
	reduceBad := writeTemp(t, "reduce_bad.csv", "jd_utc,target,A\n2460666.3,-7.5,-8.1\n2460666.4,-7.5,x8.1\n")
	ocBadSigma := writeTemp(t, "oc_bad_sigma.csv", "time,sigma\n2450000.0,0.001\n2452000.005,-0.001\n2454000.02,0.001\n")
	ocReduced := writeTemp(t, "oc_reduced.csv", "time\n2450000.0\n52000.005\n2454000.02\n")
	ocTwo := writeTemp(t, "oc_two.csv", "time\n2450000.0\n2452000.005\n")
	ocNoTime := writeTemp(t, "oc_no_time.csv", "hjd,sigma\n2450000.0,0.001\n")
	for _, tc := range []struct {
		name string
		args []string
		want []string // substrings of the one stderr line
	}{
		// vigil reduce
		{"reduce: missing --input", reduceArgs("--comp", "A=11.2"), []string{"vigil reduce: ", "--input", "missing", "required"}},
		{"reduce: unreadable file", reduceArgs("--input", "testdata/no_such_file.csv", "--comp", "A=11.2"), []string{"--input", `"testdata/no_such_file.csv"`, "no such file"}},
		{"reduce: a directory", reduceArgs("--input", "testdata", "--comp", "A=11.2"), []string{"--input", `"testdata"`, "directory"}},
		{"reduce: missing --comp", reduceArgs("--input", ensemble), []string{"--comp", "missing", "required"}},
		{"reduce: --comp without =", reduceArgs("--input", ensemble, "--comp", "A11.2"), []string{"--comp", `"A11.2"`, "ID=MAG"}},
		{"reduce: --comp magnitude not a number", reduceArgs("--input", ensemble, "--comp", "A=bright"), []string{"--comp", `"bright"`, "not a number"}},
		{"reduce: --comp twice", reduceArgs("--input", ensemble, "--comp", "A=11.2", "--comp", "A=11.3"), []string{"--comp", `"A"`, "given twice"}},
		{"reduce: --comp twice, case ignored", reduceArgs("--input", ensemble, "--comp", "A=11.2", "--comp", "a=11.3"), []string{"--comp", "given twice"}},
		{"reduce: --check is a comparison star", reduceArgs("--input", ensemble, "--comp", "A=11.2", "--check", "A=11.2"), []string{"--check", `"A"`, "given twice"}},
		{"reduce: --check without =", reduceArgs("--input", ensemble, "--comp", "A=11.2", "--check", "K"), []string{"--check", `"K"`, "ID=MAG"}},
		{"reduce: missing --ra", []string{"reduce", "--input", ensemble, "--comp", "A=11.2", "--dec", "58"}, []string{"--ra", "missing"}},
		{"reduce: bad --dec", reduceArgs("--input", ensemble, "--comp", "A=11.2", "--dec", "95"), []string{"--dec", `"95"`}},
		{"reduce: --lat without --lon", reduceArgs("--input", ensemble, "--comp", "A=11.2", "--lat", "50"), []string{"--lon", "missing", "together"}},
		{"reduce: --elev alone", reduceArgs("--input", ensemble, "--comp", "A=11.2", "--elev", "300"), []string{"--lat", "missing", "--elev was given"}},
		{"reduce: --site and --lat", reduceArgs("--input", ensemble, "--comp", "A=11.2", "--site", "demo", "--lat", "50"), []string{"--site", "not both"}},
		{"reduce: star not in the file", reduceArgs("--input", ensemble, "--comp", "Z=11.2"), []string{ensemble + ": line 9", `missing column "Z"`}},
		{"reduce: non-numeric cell", reduceArgs("--input", reduceBad, "--comp", "A=11.2"), []string{reduceBad + ": line 3, column 16 (A)", `"x8.1"`, "not a number"}},
		{"reduce: nothing reducible", reduceArgs("--input", ensemble, "--comp", "B=12.05", "--filter", "V"), []string{ensemble, "no row in filter", "--filter"}},

		// vigil extremum
		{"extremum: missing --input", []string{"extremum", "--json"}, []string{"vigil extremum: ", "--input", "missing"}},
		{"extremum: unreadable file", []string{"extremum", "--input", "testdata/no_such_file.csv"}, []string{"--input", "no such file"}},
		{"extremum: non-numeric cell", []string{"extremum", "--input", badCell}, []string{badCell + ": line 4, column 12 (mag)", `"abc"`, "not a number"}},
		{"extremum: negative err", []string{"extremum", "--input", negErr}, []string{negErr + ": line 4, column 17 (err)", "-0.01", "positive error"}},
		{"extremum: no mag column", []string{"extremum", "--input", noMag}, []string{noMag + ": line 1", `missing column "mag"`}},
		{"extremum: header only", []string{"extremum", "--input", headerOnly}, []string{headerOnly + ": line 2", "no data rows"}},
		{"extremum: empty time cell", []string{"extremum", "--input", noTime}, []string{noTime + ": line 3, column 1 (time)", "missing"}},
		{"extremum: --kind sideways", []string{"extremum", "--input", eclipse, "--kind", "sideways"}, []string{"--kind", `"sideways"`, "max or min"}},
		{"extremum: --method spline", []string{"extremum", "--input", eclipse, "--method", "spline"}, []string{"--method", `"spline"`, "poly or kvw"}},
		{"extremum: one-sided data", []string{"extremum", "--input", "testdata/extremum_one_sided.csv", "--kind", "min"}, []string{"testdata/extremum_one_sided.csv: ", "both sides", "--kind min"}},
		{"extremum: wrong kind", []string{"extremum", "--input", eclipse, "--kind", "max"}, []string{eclipse, "both sides", "--kind max"}},
		{"extremum: --degree 5", []string{"extremum", "--input", eclipse, "--degree", "5"}, []string{"--degree", `"5"`, "2 to 4"}},
		{"extremum: --degree with kvw", []string{"extremum", "--input", eclipse, "--method", "kvw", "--degree", "3"}, []string{"--degree", "poly only"}},
		{"extremum: --folds with poly", []string{"extremum", "--input", eclipse, "--folds", "7"}, []string{"--folds", "kvw only"}},
		{"extremum: --folds 4", []string{"extremum", "--input", eclipse, "--method", "kvw", "--folds", "4"}, []string{"--folds", `"4"`, "odd"}},
		{"extremum: --window 0", []string{"extremum", "--input", eclipse, "--window", "0"}, []string{"--window", `"0"`, "above 0"}},
		{"extremum: --window-from alone", []string{"extremum", "--input", eclipse, "--window-from", "2460000.40"}, []string{"--window-to", "missing"}},
		{"extremum: window backwards", []string{"extremum", "--input", eclipse, "--window-from", "2460000.45", "--window-to", "2460000.41"}, []string{"--window-to", `"2460000.41"`, "after"}},
		{"extremum: --bootstrap -5", []string{"extremum", "--input", eclipse, "--bootstrap", "-5"}, []string{"--bootstrap", `"-5"`}},
		{"extremum: --seed x", []string{"extremum", "--input", eclipse, "--seed", "x"}, []string{"--seed", `"x"`}},

		// vigil oc
		{"oc: missing --input", []string{"oc", "--epoch", "2450000", "--period", "0.4"}, []string{"vigil oc: ", "--input", "missing"}},
		{"oc: --epoch not a number", []string{"oc", "--input", "testdata/oc_quadratic.csv", "--epoch", "yesterday", "--period", "0.4"}, []string{"--epoch", `"yesterday"`, "Julian date"}},
		{"oc: --epoch reduced", []string{"oc", "--input", "testdata/oc_quadratic.csv", "--epoch", "50000", "--period", "0.4"}, []string{"--epoch", `"50000"`, "full Julian date"}},
		{"oc: missing --epoch", []string{"oc", "--input", "testdata/oc_quadratic.csv", "--period", "0.4"}, []string{"--epoch", "missing"}},
		{"oc: --period 0", []string{"oc", "--input", "testdata/oc_quadratic.csv", "--epoch", "2450000", "--period", "0"}, []string{"--period", `"0"`, "positive"}},
		{"oc: --period -1", []string{"oc", "--input", "testdata/oc_quadratic.csv", "--epoch", "2450000", "--period", "-1"}, []string{"--period", `"-1"`, "positive"}},
		{"oc: --timescale utc", []string{"oc", "--input", "testdata/oc_quadratic.csv", "--epoch", "2450000", "--period", "0.4", "--timescale", "utc"}, []string{"--timescale", `"utc"`, "hjd", "bjd"}},
		{"oc: --period-err negative", []string{"oc", "--input", "testdata/oc_quadratic.csv", "--epoch", "2450000", "--period", "0.4", "--period-err", "-1e-6"}, []string{"--period-err", `"-1e-6"`}},
		{"oc: negative sigma", []string{"oc", "--input", ocBadSigma, "--epoch", "2450000", "--period", "0.4"}, []string{ocBadSigma + ": line 3, column 13 (sigma)", "-0.001", "positive uncertainty"}},
		{"oc: reduced Julian date in the file", []string{"oc", "--input", ocReduced, "--epoch", "2450000", "--period", "0.4"}, []string{ocReduced + ": line 3, column 1 (time)", "52000.005", "full Julian date"}},
		{"oc: two timings", []string{"oc", "--input", ocTwo, "--epoch", "2450000", "--period", "0.4"}, []string{ocTwo + ": ", "2 timings", "at least 3"}},
		{"oc: no time column", []string{"oc", "--input", ocNoTime, "--epoch", "2450000", "--period", "0.4"}, []string{ocNoTime + ": line 1", `missing column "time"`, "hjd, sigma"}},

		// vigil distance
		{"distance: --relation unknown", []string{"distance", "--period", "5.366341", "--mean-mag", "3.94", "--relation", "hubble1929"}, []string{"vigil distance: ", "--relation", `"hubble1929"`, "benedict2007"}},
		{"distance: --period 0", []string{"distance", "--period", "0", "--mean-mag", "3.94"}, []string{"--period", `"0"`, "positive"}},
		{"distance: --period not a number", []string{"distance", "--period", "five", "--mean-mag", "3.94"}, []string{"--period", `"five"`, "not a number"}},
		{"distance: --mean-mag not a number", []string{"distance", "--period", "5.366341", "--mean-mag", "bright"}, []string{"--mean-mag", `"bright"`}},
		{"distance: --mean-mag 99", []string{"distance", "--period", "5.366341", "--mean-mag", "99"}, []string{"--mean-mag", `"99"`, "±40"}},
		{"distance: negative extinction", []string{"distance", "--period", "5.366341", "--mean-mag", "3.94", "--extinction", "-0.2"}, []string{"--extinction", `"-0.2"`, "0 magnitudes or more"}},
		{"distance: missing --mean-mag", []string{"distance", "--period", "5.366341"}, []string{"--mean-mag", "missing", "required"}},
		{"distance: unknown flag", []string{"distance", "--period", "5.366341", "--mean-mag", "3.94", "--parallax", "3.66"}, []string{"--parallax", "unknown flag"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			wantFailure(t, tc.args, vigil(tc.args...), tc.want...)
		})
	}
}

// TestTimingHelp checks that --help on vigil reduce, extremum, oc and
// distance lists every flag with its unit and default.
func TestTimingHelp(t *testing.T) {
	for _, tc := range []struct {
		cmd  string
		want []string
	}{
		{"reduce", []string{"--input FILE", "--comp ID=MAG", "repeat for an ensemble", "--check ID=MAG", "--ra HOURS", "--dec DEG",
			"--lat DEG", "--lon DEG", "EAST positive", "--elev METRES", "(default 0)", "--site NAME", "times are geocentric", "--filter NAME",
			"--json", "(required)", "mag", "Honeycutt 1992", "1/err_i^2"}},
		{"extremum", []string{"--input FILE", "time, mag, optional err", "--kind max|min", "(default max)", "smallest magnitude", "--method poly|kvw", "(default poly)",
			"--window DAYS", "(default auto)", "--window-from JD", "--window-to JD", "--degree N", "--folds N", "(default 5)",
			"--bootstrap N", "(default 1000)", "--seed N", "(default 0)", "--json", "Kwee & van Woerden (1956)", "in days"}},
		{"oc", []string{"--input FILE", "time, optional sigma", "--epoch T0", "full Julian date", "--period DAYS", "in days", "--timescale hjd|bjd", "(default bjd)",
			"--secondary", "--epoch-err DAYS", "--period-err DAYS", "--json", "sqrt(chi2/dof)", "1/sigma^2", "dpdt = 2Q/P"}},
		{"distance", []string{"--period DAYS", "in days", "--mean-mag MAG", "intensity-mean", "--relation NAME", "(default benedict2007)", "lanoix1999",
			"--extinction MAG", "A_V in magnitudes", "(default 0)", "--json", "Benedict et al. (2007, AJ 133, 1810)", "d = 10^((m - M - A + 5)/5) pc"}},
	} {
		t.Run(tc.cmd, func(t *testing.T) {
			for _, args := range [][]string{{tc.cmd, "--help"}, {"help", tc.cmd}} {
				r := vigil(args...)
				if r.code != exitOK || r.stderr != "" {
					t.Fatalf("vigil %s: exit %d, stderr %q; want 0 and nothing", strings.Join(args, " "), r.code, r.stderr)
				}
				for _, want := range append(tc.want, "Usage:\n  vigil "+tc.cmd, "--help") {
					if !strings.Contains(r.stdout, want) {
						t.Errorf("vigil %s lacks %q:\n%s", strings.Join(args, " "), want, r.stdout)
					}
				}
			}
		})
	}
	// The top-level help lists the four commands.
	r := vigil("help")
	for _, name := range []string{"reduce ", "extremum ", "oc ", "distance "} {
		if !strings.Contains(r.stdout, "  "+name) {
			t.Errorf("vigil help lacks the command %q:\n%s", name, r.stdout)
		}
	}
}
