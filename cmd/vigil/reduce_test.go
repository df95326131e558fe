package main

import (
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// Tolerances for vigil reduce.
const (
	millimag = 0.001 // magnitudes

	// quotedMagTol: methods.md §8 quotes V and σ_Z to 1e-5 mag (half a unit
	// is 0.005 mmag) and 11.808 / 11.652 to 1e-3 mag.
	quotedMagTol5 = 0.005 * millimag
	quotedMagTol3 = 0.5 * millimag
	// formulaMagTol: values the test recomputes from the rule of
	// spec/cli.md; only float64 rounding separates them.
	formulaMagTol = 1e-9 * millimag
	// geocentricTol: HJD and BJD_TDB for the Earth's centre and for a site
	// on its surface differ by at most 21 ms (methods.md §7, Eastman et al.
	// 2010).
	geocentricTol = 0.021 * second
)

// reduceEnsemble is vigil reduce on testdata/reduce_ensemble.csv, the
// ensemble of methods.md §8 at the instant and site of the δ Cep check of
// methods.md §7.
var reduceEnsemble = []string{"reduce", "--input", "testdata/reduce_ensemble.csv",
	"--comp", "A=11.200", "--comp", "B=12.050", "--comp", "C=10.700", "--check", "K=11.650",
	"--ra", "22:29:10.26502", "--dec", "+58:24:54.7139", "--lat", "50", "--lon", "10", "--elev", "0", "--json"}

func TestReducePublishedValues(t *testing.T) {
	m := mustJSON(t, reduceEnsemble...)
	rows := list(t, m, "rows")
	if len(rows) != 3 {
		t.Fatalf("%d rows, want 3 (lines 10, 11 and 13 of reduce_ensemble.csv)", len(rows))
	}
	// The equal-weight error is the standard error of the mean of
	// Z_i = 19.320, 19.312, 19.328 (methods.md §8): s = 0.008, s/√3.
	sem := 0.008 / math.Sqrt(3)
	for _, tc := range []struct {
		name   string
		row    int
		field  string
		want   float64
		tol    float64
		unit   string
		source string
	}{
		{"weighted ensemble V", 0, "mag", 11.81067, quotedMagTol5, "mag", "methods.md §8 [C]"},
		{"weighted ensemble err = σ_Z", 0, "err", 0.00333, quotedMagTol5, "mag", "methods.md §8 [C], no target_err"},
		{"weighted check star", 0, "check_mag", 19.32267 - 7.668, quotedMagTol5, "mag", "methods.md §8 [C]: Z = 19.32267 plus v_K"},
		{"HJD_UTC", 0, "hjd", 2460666.3341993, quotedJDTol, "d", "astropy 5.2.1 [A] via methods.md §7"},
		{"BJD_TDB", 0, "bjd_tdb", 2460666.3349804, quotedJDTol, "d", "astropy 5.2.1 [A] via methods.md §7"},
		{"jd_utc echoed", 0, "jd_utc", 2460666.3333333, 0, "d", "the input"},
		{"equal-weight V", 1, "mag", 11.808, quotedMagTol3, "mag", "methods.md §8 [C], unweighted"},
		{"equal-weight check star", 1, "check_mag", 11.652, quotedMagTol3, "mag", "methods.md §8 [C], unweighted"},
		{"equal-weight err = s/√n", 1, "err", sem, formulaMagTol, "mag", "spec/cli.md rule on methods.md §8 numbers"},
		// Line 13 lacks B: A and C alone, Z = (19.320 + 19.328)/2, σ = 0.005/√2.
		{"missing comparison star left out: V", 2, "mag", -7.512 + (19.320+19.328)/2, formulaMagTol, "mag", "spec/cli.md rule on methods.md §8 numbers"},
		{"missing comparison star left out: err", 2, "err", 0.005 / math.Sqrt2, formulaMagTol, "mag", "spec/cli.md rule: 1/sqrt(Σ 1/err_i²)"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			near(t, tc.field, number(t, rows[tc.row], tc.field), tc.want, tc.tol, tc.unit, tc.source)
		})
	}

	// n, skipped and which rows were skipped (lines 12 and 14).
	if n, skipped := number(t, m, "n"), number(t, m, "skipped"); n != 3 || skipped != 2 {
		t.Errorf("n = %v, skipped = %v; want 3 and 2", n, skipped)
	}
	var lines []float64
	for _, s := range list(t, m, "skipped_rows") {
		lines = append(lines, number(t, s, "line"))
	}
	if len(lines) != 2 || lines[0] != 12 || lines[1] != 14 {
		t.Errorf("skipped lines %v, want [12 14]", lines)
	}
	// check_mean and check_std are the mean and the sample standard
	// deviation (n − 1) of the rows' check_mag (spec/cli.md).
	var sum, ss float64
	for _, r := range rows {
		sum += number(t, r, "check_mag")
	}
	mean := sum / float64(len(rows))
	for _, r := range rows {
		d := number(t, r, "check_mag") - mean
		ss += d * d
	}
	near(t, "check_mean", number(t, m, "check_mean"), mean, formulaMagTol, "mag", "mean of check_mag")
	near(t, "check_std", number(t, m, "check_std"), math.Sqrt(ss/float64(len(rows)-1)), formulaMagTol, "mag", "sample SD of check_mag")
}

// TestReduceOneComparison checks V = v − c + C with one comparison star
// (spec/cli.md) on the numbers of methods.md §8: −7.512 + 8.120 + 11.200.
func TestReduceOneComparison(t *testing.T) {
	m := mustJSON(t, "reduce", "--input", "testdata/reduce_ensemble.csv", "--comp", "A=11.200", "--ra", "22.486", "--dec", "58.415", "--json")
	rows := list(t, m, "rows")
	if len(rows) != 3 {
		t.Fatalf("%d rows, want 3 (line 14 has no A)", len(rows))
	}
	const source = "methods.md §8: V = v − c + C"
	for i, tc := range []struct {
		err float64
		why string
	}{
		{0.005, "A_err alone, no target_err"},
		{0, "missing errors count as 0"},
		{0.005, "A_err alone"},
	} {
		near(t, "V", number(t, rows[i], "mag"), 11.808, formulaMagTol, "mag", source)
		near(t, "err ("+tc.why+")", number(t, rows[i], "err"), tc.err, formulaMagTol, "mag", "spec/cli.md")
		if v, ok := rows[i]["check_mag"]; !ok || v != nil {
			t.Errorf("row %d: check_mag = %v (present %v), want null without --check", i, v, ok)
		}
	}
	for _, k := range []string{"check_mean", "check_std"} {
		if v, ok := m[k]; !ok || v != nil {
			t.Errorf("%s = %v (present %v), want null without --check", k, v, ok)
		}
	}
}

// TestReduceGeocentric checks that without a site the times are for the
// Earth's centre, within 21 ms of the topocentric ones.
func TestReduceGeocentric(t *testing.T) {
	topo := mustJSON(t, reduceEnsemble...)
	geoArgs := append([]string(nil), reduceEnsemble[:len(reduceEnsemble)-7]...) // without --lat --lon --elev --json
	geo := mustJSON(t, append(geoArgs, "--json")...)
	if geo["geocentric"] != true || topo["geocentric"] != false {
		t.Errorf("geocentric = %v without a site and %v with one; want true and false", geo["geocentric"], topo["geocentric"])
	}
	tr, gr := list(t, topo, "rows"), list(t, geo, "rows")
	for i := range tr {
		for _, k := range []string{"hjd", "bjd_tdb"} {
			near(t, k+" geocentric vs topocentric", number(t, gr[i], k), number(t, tr[i], k), geocentricTol, "d", "methods.md §7")
		}
		near(t, "mag", number(t, gr[i], "mag"), number(t, tr[i], "mag"), 0, "mag", "the site does not touch magnitudes")
	}
	// The demo site by name is the same as its coordinates.
	demo := mustJSON(t, append(geoArgs, "--site", "demo", "--json")...)
	byCoords := mustJSON(t, append(geoArgs, "--lat", "52.1172", "--lon", "-1.4538", "--elev", "140", "--json")...)
	near(t, "hjd, --site demo vs coordinates", number(t, list(t, demo, "rows")[0], "hjd"), number(t, list(t, byCoords, "rows")[0], "hjd"), 0, "d", "demo.go")
}

// TestReduceFilter checks --filter: the rows of one filter are reduced and
// the others left out; without it, mixed filters are refused at the first
// row that differs.
func TestReduceFilter(t *testing.T) {
	file := writeTemp(t, "filters.csv", "jd_utc,filter,target,A\n2460666.30,V,-7.512,-8.120\n2460666.31,B,-6.900,-7.800\n2460666.32,V,-7.500,-8.120\n")
	m := mustJSON(t, "reduce", "--input", file, "--comp", "A=11.200", "--ra", "22.5", "--dec", "58", "--filter", "v", "--json")
	rows := list(t, m, "rows")
	if len(rows) != 2 || m["filter"] != "v" {
		t.Fatalf("--filter v: %d rows, filter %v; want the 2 V rows", len(rows), m["filter"])
	}
	near(t, "V of the first V row", number(t, rows[0], "mag"), 11.808, formulaMagTol, "mag", "methods.md §8: V = v − c + C")
	near(t, "V of the second V row", number(t, rows[1], "mag"), 11.820, formulaMagTol, "mag", "V = v − c + C")
	r := vigil("reduce", "--input", file, "--comp", "A=11.200", "--ra", "22.5", "--dec", "58", "--json")
	if want := file + ": line 3, column 12 (filter)"; r.code != exitUsage || r.stdout != "" || !strings.Contains(r.stderr, want) {
		t.Errorf("mixed filters without --filter: exit %d, stdout %q, stderr %q; want 2, nothing, %q", r.code, r.stdout, r.stderr, want)
	}
}

func TestReduceGolden(t *testing.T) {
	for _, tc := range []struct {
		name string
		args []string
	}{
		{"reduce_ensemble", reduceEnsemble},
		{"reduce_one_comp_geocentric", []string{"reduce", "--input", "testdata/reduce_ensemble.csv", "--comp", "A=11.200", "--ra", "22.486", "--dec", "58.415", "--json"}},
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

func TestReduceTable(t *testing.T) {
	r := vigil(reduceEnsemble[:len(reduceEnsemble)-1]...)
	if r.code != 0 || r.stderr != "" {
		t.Fatalf("exit %d, stderr %q", r.code, r.stderr)
	}
	for _, want := range []string{"RA 22:29:10.27, Dec +58:24:54.7", "A = 11.200, B = 12.050, C = 10.700", "check star K = 11.650",
		"10.0000° E", "HJD_UTC", "BJD_TDB", "11.8107", "3 weighted", "3 equal", "2 weighted",
		"3 rows reduced, 2 skipped", "skipped line 12: no target magnitude", "Check star K: mean 11.6542"} {
		if !strings.Contains(r.stdout, want) {
			t.Errorf("table lacks %q:\n%s", want, r.stdout)
		}
	}
}

// FuzzReduce feeds vigil reduce arbitrary files and comparison stars: it
// must answer with one JSON object or fail with status 2 and one line, never
// panic.
func FuzzReduce(f *testing.F) {
	ensemble, err := os.ReadFile("testdata/reduce_ensemble.csv")
	if err != nil {
		f.Fatal(err)
	}
	f.Add(string(ensemble), "A=11.2", "B=12.05", "K=11.65")
	f.Add("jd_utc,target,A,filter\n2460666.3,-7.5,-8.1,V\n2460666.4,-7.5,-8.1,B\n", "A=11.2", "a=1", "")
	f.Add("jd_utc,target,A,A_err\n1e300,-7.5,-8.1,-1\n", "A=11.2", "B=0", "C=")
	f.Fuzz(func(t *testing.T, text, comp1, comp2, check string) {
		path := filepath.Join(t.TempDir(), "in.csv")
		if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		args := []string{"reduce", "--input", path, "--comp=" + comp1, "--comp=" + comp2, "--ra", "22.5", "--dec", "58", "--json"}
		if check != "" {
			args = append(args, "--check="+check)
		}
		checkOutcome(t, args, vigil(args...))
	})
}

// TestReduceOut checks --out: the light curve as CSV, one row per reduced
// exposure with the same magnitudes and times as the JSON answer, and a bad
// path refused before any work, naming --out, with nothing written.
func TestReduceOut(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "lc.csv")
	args := append(append([]string{}, reduceEnsemble...), "--out", out)
	m := mustJSON(t, args...)
	b, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSpace(string(b)), "\n")
	rows := list(t, m, "rows")
	if len(lines) != len(rows)+1 {
		t.Fatalf("CSV has %d lines, want a header and %d rows:\n%s", len(lines), len(rows), b)
	}
	header := strings.Split(lines[0], ",")
	col := func(name string) int {
		for i, h := range header {
			if h == name {
				return i
			}
		}
		t.Fatalf("CSV header %q lacks %q", lines[0], name)
		return -1
	}
	for i, row := range rows {
		cells := strings.Split(lines[i+1], ",")
		// The CSV rounds magnitudes to 1e-5 mag and Julian dates to 1e-8 d
		// (0.9 ms): half a unit of the last place is the tolerance.
		for _, c := range []struct {
			csv, json string
			tol       float64
		}{{"mag", "mag", 5e-6}, {"bjd_tdb", "bjd_tdb", 5e-9}, {"hjd_utc", "hjd", 5e-9}} {
			got, err := strconv.ParseFloat(cells[col(c.csv)], 64)
			if err != nil || math.Abs(got-number(t, row, c.json)) > c.tol {
				t.Errorf("row %d %s = %q, want the JSON's %v", i, c.csv, cells[col(c.csv)], number(t, row, c.json))
			}
		}
	}
	for _, bad := range []struct{ path, want string }{
		{filepath.Join(dir, "lc.txt"), "ending in .csv"},
		{filepath.Join(dir, "missing", "lc.csv"), "does not exist"},
	} {
		args := append(append([]string{}, reduceEnsemble...), "--out", bad.path)
		wantFailure(t, args, vigil(args...), "--out", bad.want)
		if _, err := os.Stat(bad.path); err == nil {
			t.Errorf("a failed run wrote %s", bad.path)
		}
	}
}
