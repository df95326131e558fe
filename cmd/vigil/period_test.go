package main

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// periodTestdata holds the shared period-search tables written with astropy
// and numpy by testdata/period/make_reference.py at the top of the module.
var periodTestdata = filepath.Join("..", "..", "testdata", "period")

// The light curves of make_reference.py.
var (
	methods60 = filepath.Join(periodTestdata, "data_methods60.csv") // methods.md §12, N = 60, equal weights
	nightly   = filepath.Join(periodTestdata, "data_nightly.csv")   // N = 356, gappy nightly sampling, weighted
	highfreq  = filepath.Join(periodTestdata, "data_highfreq.csv")  // N = 300, a 40.3721 c/d signal, weighted
)

// methods60Grid is the grid of methods.md §12: 0.05 to 5 c/d in steps of
// 0.0005 (9901 frequencies).
var methods60Grid = []string{"--min-period", "0.2", "--max-period", "20", "--nfreq", "9901"}

// Tolerances for vigil period.
const (
	// quoted6 and quoted4: half a unit in the last decimal methods.md §12
	// quotes (6 decimals for the refined maximum, 4 for the alias powers).
	quoted6 = 0.5e-6
	quoted4 = 0.5e-4
	// methods60Step is the grid step of methods.md §12, c/d: a peak refined
	// off the grid lies within one step of the grid's peak.
	methods60Step = 0.0005
	// refineGain bounds how much refining a grid peak raises its power: half
	// a step (0.00025 c/d) off the top of a main lobe of width 1/T
	// (T = 9.2 d) costs at most (π·T·Δf)²/3 ≈ 1.8e-5 of the power
	// (the sinc² lobe's second-order expansion).
	refineGain = 2e-5
	// glsPowerTol: the refined peaks' power against astropy's at its own
	// refined peaks. Both are the same exact sums in float64 (the engine
	// refines peaks by direct sums, reduce.Periodogram's doc), and the
	// power is flat at a maximum, so only rounding separates them.
	glsPowerTol = 1e-9
	// refinedFreqTol, c/d: over the 146-day span of the nightly series a
	// frequency error of 1e-7 c/d shifts the phase by 1.5e-5 cycle.
	refinedFreqTol = 1e-7
	// fapRelTol: relative, on astropy's Baluev FAP at astropy's refined
	// power. ln FAP moves by (N−3)/2 · Δz/(1−z) for a power error Δz: with
	// Δz = glsPowerTol that is at most 3.4e-5 (N = 60, z = 0.99917).
	fapRelTol = 1e-4
	// pdmThetaTol: θ against numpy's exact-arithmetic θ (pdm.csv); both
	// count the same points in the same bins, so float64 rounding only.
	pdmThetaTol = 1e-12
)

// cell reads one number of a reference row.
func cell(t *testing.T, row map[string]string, col string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(row[col], 64)
	if err != nil {
		t.Fatalf("reference row %v: column %s: %v", row, col, err)
	}
	return v
}

// peakField returns a number of peaks[i] of an answer.
func peakField(t *testing.T, m map[string]any, i int, key string) float64 {
	t.Helper()
	pks := list(t, m, "peaks")
	if i >= len(pks) {
		t.Fatalf("%d peaks, want at least %d", len(pks), i+1)
	}
	return number(t, pks[i], key)
}

// TestPeriodMethodsQuoted runs the search of methods.md §12 on its N = 60
// series and grid: the refined maximum, then the 1 c/d aliases.
func TestPeriodMethodsQuoted(t *testing.T) {
	const source = "methods.md §12 [C], GLS also astropy [A]"
	m := mustJSON(t, append([]string{"period", "--input", methods60, "--json"}, methods60Grid...)...)
	for _, tc := range []struct {
		name      string
		got, want float64
		tol       float64
		unit      string
	}{
		{"best_period (refined)", number(t, m, "best_period"), 0.600028, quoted6, "d"},
		{"best_frequency (refined)", number(t, m, "best_frequency"), 1.666590, quoted6, "c/d"},
		{"peaks[0].period", peakField(t, m, 0, "period"), 0.600028, quoted6, "d"},
		// The maximum is at least the power at 1/0.6 c/d, 0.999170, and at the
		// grid's 1.6665 c/d, 0.999169; refining gains at most refineGain.
		{"peaks[0].power", peakField(t, m, 0, "power"), 0.999170, quoted6 + refineGain, ""},
		{"peaks[1].frequency (+1 c/d alias)", peakField(t, m, 1, "frequency"), 2.6655, methods60Step, "c/d"},
		{"peaks[1].power", peakField(t, m, 1, "power"), 0.8308, quoted4 + refineGain, ""},
		{"peaks[2].frequency (−1 c/d alias)", peakField(t, m, 2, "frequency"), 0.6675, methods60Step, "c/d"},
		{"peaks[2].power", peakField(t, m, 2, "power"), 0.8253, quoted4 + refineGain, ""},
		{"peaks[3].frequency (+2 c/d alias)", peakField(t, m, 3, "frequency"), 3.6655, methods60Step, "c/d"},
		{"peaks[3].power", peakField(t, m, 3, "power"), 0.4611, quoted4 + refineGain, ""},
	} {
		near(t, tc.name, tc.got, tc.want, tc.tol, tc.unit, source)
	}
	if p := peakField(t, m, 0, "power"); p < 0.999170-quoted6 {
		t.Errorf("best power %.7f is below the power at 1/0.6 c/d, 0.999170 (%s): the maximum cannot be", p, source)
	}
	pks := list(t, m, "peaks")
	if len(pks) < 5 {
		t.Errorf("%d peaks, want at least 5 (spec/cli.md)", len(pks))
	}
	for i, want := range map[int]string{1: "+1 c/d", 2: "-1 c/d", 3: "+2 c/d"} {
		if h, _ := pks[i]["hint"].(string); !strings.Contains(h, "daily alias") || !strings.Contains(h, want) {
			t.Errorf("peaks[%d].hint = %q, want a daily alias at %s (%s)", i, h, want, source)
		}
	}
	if _, ok := pks[0]["hint"]; ok {
		t.Errorf("peaks[0] has hint %v: the best peak is the reference, want none", pks[0]["hint"])
	}
	if m["method"] != "ls" || m["power_better"] != "higher" || m["weighted"] != false || number(t, m, "grid_size") != 9901 {
		t.Errorf("method %v, power_better %v, weighted %v, grid_size %v; want ls, higher, false, 9901", m["method"], m["power_better"], m["weighted"], m["grid_size"])
	}
	near(t, "freq_min", number(t, m, "freq_min"), 0.05, 1e-12, "c/d", source)
	near(t, "freq_max", number(t, m, "freq_max"), 5, 1e-12, "c/d", source)
	near(t, "freq_step", number(t, m, "freq_step"), methods60Step, 1e-12, "c/d", source)
}

// TestPeriodAgainstAstropy compares the refined peaks and the FAP of the
// best one with astropy's (testdata/period_refs.csv, made by
// period_make_refs.py: astropy's power maximised by scipy, Baluev's FAP by
// astropy at the search's highest frequency), equal weights and 1/err².
func TestPeriodAgainstAstropy(t *testing.T) {
	const source = "astropy [A], testdata/period_refs.csv"
	refs := refRows(t, filepath.Join("testdata", "period_refs.csv"))
	for _, tc := range []struct {
		name, file string
		args       []string
		weighted   bool
	}{
		{"methods60", methods60, methods60Grid, false},
		{"nightly", nightly, []string{"--min-period", "0.1", "--max-period", "10"}, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			m := mustJSON(t, append([]string{"period", "--input", tc.file, "--json"}, tc.args...)...)
			if m["weighted"] != tc.weighted {
				t.Errorf("weighted = %v, want %v", m["weighted"], tc.weighted)
			}
			used := 0
			for _, row := range refs {
				if row["name"] != tc.name {
					continue
				}
				used++
				rank := int(cell(t, row, "rank"))
				near(t, "freq_max", number(t, m, "freq_max"), cell(t, row, "fmax"), 1e-12, "c/d", source)
				near(t, fmt.Sprintf("peaks[%d].frequency", rank-1), peakField(t, m, rank-1, "frequency"), cell(t, row, "freq"), refinedFreqTol, "c/d", source)
				near(t, fmt.Sprintf("peaks[%d].period", rank-1), peakField(t, m, rank-1, "period"), 1/cell(t, row, "freq"), refinedFreqTol/math.Pow(cell(t, row, "freq"), 2), "d", source)
				near(t, fmt.Sprintf("peaks[%d].power", rank-1), peakField(t, m, rank-1, "power"), cell(t, row, "power"), glsPowerTol, "", source)
				if rank == 1 {
					want := cell(t, row, "fap")
					near(t, "best_period", number(t, m, "best_period"), 1/cell(t, row, "freq"), refinedFreqTol/math.Pow(cell(t, row, "freq"), 2), "d", source)
					near(t, "fap", number(t, m, "fap"), want, fapRelTol*want, "", source)
				}
			}
			if used < 5 {
				t.Fatalf("period_refs.csv has %d rows for %s, want at least 5: regenerate it", used, tc.name)
			}
		})
	}
}

// TestPeriodFAPAgainstAstropyGrid checks the FAP against astropy's Baluev
// FAP of the highest power on astropy's own grid (testdata/period/fap.csv,
// rows at the grid maximum), with the search's highest frequency set to the
// one astropy used. The CLI refines the peak off the grid to a power z' ≥ z,
// so its FAP is lower. For such tiny FAPs, FAP = s + τ with s ∝ (1−z)^((N−3)/2)
// and τ ∝ fmax·(1−z)^((N−4)/2)·√z (Baluev 2008, eq. 6, as in
// reduce.BaluevFAP's doc), so ln(FAP/FAP') lies between what the two terms
// alone give: a = (N−3)/2·x and b = (N−4)/2·x − ½ ln(z'/z) − ln(fmax'/fmax),
// x = ln((1−z)/(1−z')).
func TestPeriodFAPAgainstAstropyGrid(t *testing.T) {
	const source = "astropy [A], testdata/period/fap.csv"
	const slack = 1e-9 // float64 rounding of the logarithms
	files := map[string]struct {
		file      string
		n         float64
		maxPeriod string // --max-period: 1 / the lowest frequency of astropy's grid
	}{
		"methods60": {methods60, 60, "20"},
		"nightly":   {nightly, 356, "50"},
		"highfreq":  {highfreq, 300, fmtRef(1 / 40.0)},
	}
	refs := refRows(t, filepath.Join(periodTestdata, "fap.csv"))
	seen := map[string]bool{}
	for _, row := range refs {
		name := row["name"]
		if seen[name] { // the first row of each light curve is its grid maximum
			continue
		}
		seen[name] = true
		tc, ok := files[name]
		if !ok {
			t.Errorf("fap.csv names light curve %q, which this test does not know", name)
			continue
		}
		t.Run(name, func(t *testing.T) {
			z, fmax, want := cell(t, row, "z"), cell(t, row, "fmax_used"), cell(t, row, "fap")
			m := mustJSON(t, "period", "--input", tc.file, "--min-period", fmtRef(1/fmax), "--max-period", tc.maxPeriod, "--json")
			got, zr, fr := number(t, m, "fap"), number(t, m, "best_power"), number(t, m, "freq_max")
			if zr < z {
				t.Errorf("refined best power %.12f is below astropy's grid maximum %.12f (%s)", zr, z, source)
			}
			x := math.Log((1 - z) / (1 - zr))
			a := (tc.n - 3) / 2 * x
			b := (tc.n-4)/2*x - 0.5*math.Log(zr/z) - math.Log(fr/fmax)
			lo, hi := min(a, b)-slack, max(a, b)+slack
			if d := math.Log(want / got); !(d >= lo && d <= hi) {
				t.Errorf("fap %.10g, astropy %.10g at its grid maximum z = %.10f (%s): ln ratio %.6g, want in [%.6g, %.6g] for the refined z' = %.10f",
					got, want, z, source, d, lo, hi, zr)
			}
		})
	}
}

// TestPeriodPDM runs phase dispersion minimisation on the methods.md §12
// series. θ only changes when a point crosses a bin edge, so the grid's
// minimum, a few 0.001 c/d from 1/0.6, has θ(0.6) itself.
func TestPeriodPDM(t *testing.T) {
	theta := map[string]float64{}
	for _, row := range refRows(t, filepath.Join(periodTestdata, "pdm.csv")) {
		if row["name"] == "methods60" {
			theta[row["period"]+"/"+row["bins"]+"x"+row["covers"]] = cell(t, row, "theta")
		}
	}
	const numpy = "numpy, exact phases (testdata/period/pdm.csv)"
	for _, tc := range []struct {
		name        string
		args        []string
		bins, cover float64
		want        []struct {
			key    string // pdm.csv: period/bins x covers
			quoted float64
		}
	}{
		{"10 bins, no covers, methods.md grid", append([]string{"--method", "pdm", "--bins", "10", "--covers", "1"}, methods60Grid...), 10, 1,
			[]struct {
				key    string
				quoted float64
			}{{"0.6/10x1", 0.03691}, {"1.5/10x1", 0.11150}}},
		{"defaults (10 bins, no covers)", append([]string{"--method", "pdm"}, methods60Grid...), 10, 1,
			[]struct {
				key    string
				quoted float64
			}{{"0.6/10x1", 0.03691}}},
		{"5 bins × 2 covers, 0.5 to 0.75 d", []string{"--method", "pdm", "--bins", "5", "--covers", "2", "--min-period", "0.5", "--max-period", "0.75", "--nfreq", "401"}, 5, 2,
			[]struct {
				key    string
				quoted float64
			}{{"0.6/5x2", math.NaN()}}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			m := mustJSON(t, append([]string{"period", "--input", methods60, "--json"}, tc.args...)...)
			for i, w := range tc.want {
				ref, ok := theta[w.key]
				if !ok {
					t.Fatalf("pdm.csv has no θ for %s", w.key)
				}
				p := peakField(t, m, i, "power")
				near(t, fmt.Sprintf("peaks[%d].power θ (%s)", i, w.key), p, ref, pdmThetaTol, "", numpy)
				if !math.IsNaN(w.quoted) {
					near(t, fmt.Sprintf("peaks[%d].power θ (%s)", i, w.key), p, w.quoted, 0.5e-5, "", "methods.md §12 [C], 5 decimals")
				}
				// The peak lies within a tenth of a peak width 1/T (T = 9.2 d) of its period.
				period, _ := strconv.ParseFloat(strings.Split(w.key, "/")[0], 64)
				near(t, fmt.Sprintf("peaks[%d].frequency", i), peakField(t, m, i, "frequency"), 1/period, 0.1/9.2, "c/d", "the series' period 0.6 d and its −1 c/d alias 1.5 d")
			}
			near(t, "best_power", number(t, m, "best_power"), peakField(t, m, 0, "power"), 0, "", "peaks[0]")
			if m["fap"] != nil || m["fap_method"] != nil || m["method"] != "pdm" || m["power_better"] != "lower" || m["weighted"] != false {
				t.Errorf("fap %v, fap_method %v, method %v, power_better %v, weighted %v; want null, null, pdm, lower, false",
					m["fap"], m["fap_method"], m["method"], m["power_better"], m["weighted"])
			}
			if number(t, m, "bins") != tc.bins || number(t, m, "covers") != tc.cover {
				t.Errorf("bins %v, covers %v; want %v, %v", m["bins"], m["covers"], tc.bins, tc.cover)
			}
			pks := list(t, m, "peaks")
			for i := 1; i < len(pks); i++ {
				if number(t, pks[i], "power") < number(t, pks[i-1], "power") {
					t.Errorf("peaks[%d] θ %v below peaks[%d] θ %v: want lowest θ first", i, pks[i]["power"], i-1, pks[i-1]["power"])
				}
			}
		})
	}
}

// TestPeriodMissingCells blanks magnitudes and errors: empty cells are
// missing values, not zero.
func TestPeriodMissingCells(t *testing.T) {
	text, err := os.ReadFile(nightly)
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(string(text), "\n")
	// lines[4] is the first data row (three comment lines, the header).
	f := strings.Split(lines[10], ",")
	lines[10] = f[0] + ",," + f[2] // no magnitude: left out
	f = strings.Split(lines[20], ",")
	lines[20] = f[0] + "," + f[1] + "," // no error: equal weights for all
	holes := writeTemp(t, "holes.csv", strings.Join(lines, "\n"))
	m := mustJSON(t, "period", "--input", holes, "--min-period", "0.1", "--max-period", "10", "--json")
	if number(t, m, "n") != 355 || number(t, m, "rows") != 356 || number(t, m, "missing_mag") != 1 || m["weighted"] != false {
		t.Errorf("n %v, rows %v, missing_mag %v, weighted %v; want 355, 356, 1, false", m["n"], m["rows"], m["missing_mag"], m["weighted"])
	}
	// The nightly series was made with P = 0.3137 d (make_reference.py); a
	// tenth of a peak width 1/T, T = 146 d.
	near(t, "best_frequency", number(t, m, "best_frequency"), 1/0.3137, 0.1/146, "c/d", "make_reference.py: P = 0.3137 d")
}

func TestPeriodGolden(t *testing.T) {
	for _, tc := range []struct {
		name string
		args []string
	}{
		{"period_methods60_ls_window", append([]string{"period", "--input", methods60, "--window", "--json"}, methods60Grid...)},
		{"period_methods60_pdm", append([]string{"period", "--input", methods60, "--method", "pdm", "--peaks", "6", "--json"}, methods60Grid...)},
		{"period_nightly_ls", []string{"period", "--input", nightly, "--min-period", "0.1", "--max-period", "10", "--peaks", "7", "--json"}},
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

func TestPeriodTable(t *testing.T) {
	r := vigil(append([]string{"period", "--input", methods60, "--window"}, methods60Grid...)...)
	if r.code != 0 || r.stderr != "" {
		t.Fatalf("exit %d, stderr %q", r.code, r.stderr)
	}
	for _, want := range []string{"Period search of " + methods60, "generalised Lomb–Scargle", "0.600028 d (1.666590 c/d)",
		"False-alarm probability", "60 of 60 rows", "9901 frequencies", "Peaks, best first", "daily alias: best frequency +1 c/d",
		"Spectral window", "0.999500"} {
		if !strings.Contains(r.stdout, want) {
			t.Errorf("table lacks %q:\n%s", want, r.stdout)
		}
	}
}

// TestPeriodBadInput checks the contract for bad input (spec/cli.md,
// "Conventions"): exit status 2, one stderr line naming the flag, or the
// file, line and column, nothing on stdout.
func TestPeriodBadInput(t *testing.T) {
	badCell := writeTemp(t, "bad_cell.csv", "# a comment line\ntime,mag,err\n2460000.1,10.01,0.01\n2460000.2, abc ,0.01\n")
	negErr := writeTemp(t, "neg_err.csv", "time,mag,err\n2460000.1,10.01,0.01\n2460000.2,10.02,0.01\n2460000.3,10.03,-0.01\n2460000.4,10.0,0.01\n2460000.5,10.1,0.01\n")
	few := writeTemp(t, "few.csv", "time,mag\n2460000.1,10.01\n2460000.2,10.02\n2460000.3,\n2460000.4,10.05\n2460000.5,10.03\n")
	flat := writeTemp(t, "flat.csv", "time,mag\n2460000.1,10\n2460000.2,10\n2460000.3,10\n2460000.4,10\n2460000.5,10\n")
	oneTime := writeTemp(t, "one_time.csv", "time,mag\n2460000.1,10\n2460000.1,10.1\n2460000.1,10.2\n2460000.1,10\n2460000.1,10.3\n")
	noMag := writeTemp(t, "no_mag.csv", "time,flux\n2460000.1,1.0\n")
	noTime := writeTemp(t, "no_time.csv", "time,mag\n2460000.1,10.01\n,10.02\n")
	headerOnly := writeTemp(t, "header_only.csv", "# nothing measured yet\ntime,mag\n")
	args := func(file string, extra ...string) []string {
		return append([]string{"period", "--input", file, "--min-period", "0.2", "--max-period", "20", "--json"}, extra...)
	}
	for _, tc := range []struct {
		name string
		args []string
		want []string // substrings of the one stderr line
	}{
		{"missing --input", []string{"period", "--min-period", "0.2", "--max-period", "20"}, []string{"vigil period: ", "--input", "missing", "required"}},
		{"unreadable file", args("testdata/no_such_file.csv"), []string{"--input", `"testdata/no_such_file.csv"`, "no such file"}},
		{"missing --min-period", []string{"period", "--input", methods60, "--max-period", "20"}, []string{"--min-period", "missing", "required"}},
		{"missing --max-period", []string{"period", "--input", methods60, "--min-period", "0.2"}, []string{"--max-period", "missing", "required"}},
		{"--min-period above --max-period", []string{"period", "--input", methods60, "--min-period", "2", "--max-period", "1"}, []string{"--min-period", `"2"`, `"1"`, "not below"}},
		{"--min-period equal to --max-period", []string{"period", "--input", methods60, "--min-period", "1", "--max-period", "1"}, []string{"--min-period", "not below"}},
		{"--min-period 0", []string{"period", "--input", methods60, "--min-period", "0", "--max-period", "1"}, []string{"--min-period", `"0"`, "positive"}},
		{"--max-period not a number", []string{"period", "--input", methods60, "--min-period", "0.2", "--max-period", "long"}, []string{"--max-period", `"long"`, "not a number"}},
		{"--method fourier", args(methods60, "--method", "fourier"), []string{"--method", `"fourier"`, "ls", "pdm"}},
		{"--oversample 0.5", args(methods60, "--oversample", "0.5"), []string{"--oversample", `"0.5"`, "1 or more"}},
		{"--nfreq 1", args(methods60, "--nfreq", "1"), []string{"--nfreq", `"1"`, "from 2"}},
		{"--nfreq and --oversample", args(methods60, "--nfreq", "100", "--oversample", "10"), []string{"--nfreq", "not both"}},
		{"--peaks 0", args(methods60, "--peaks", "0"), []string{"--peaks", `"0"`, "from 1"}},
		{"--bins with ls", args(methods60, "--bins", "5"), []string{"--bins", "pdm only"}},
		{"--covers with ls", args(methods60, "--covers", "2"), []string{"--covers", "pdm only"}},
		{"--covers 11", args(methods60, "--method", "pdm", "--covers", "11"), []string{"--covers", `"11"`, "1 to 10"}},
		{"--bins 1", args(methods60, "--method", "pdm", "--bins", "1"), []string{"--bins", `"1"`, "2 to"}},
		{"--bins as many as points", args(methods60, "--method", "pdm", "--bins", "60"), []string{"--bins", "60 bins for 60 points", "fewer bins"}},
		{"grid too large", []string{"period", "--input", nightly, "--min-period", "0.00001", "--max-period", "10"}, []string{"--min-period", "frequencies, more than 10000000"}},
		{"--nfreq too large", args(methods60, "--nfreq", "10000001"), []string{"--nfreq", `"10000001"`}},
		{"unknown flag", args(methods60, "--frequency", "2"), []string{"--frequency", "unknown flag"}},
		{"non-numeric cell", args(badCell), []string{badCell + ": line 4, column 12 (mag)", `"abc"`, "not a number"}},
		{"negative err", args(negErr), []string{negErr + ": line 4, column 17 (err)", "-0.01", "positive error"}},
		{"too few points", args(few), []string{few + ": ", "at least 5 points, got 4"}},
		{"no variation", args(flat), []string{flat + ": ", "nothing varies"}},
		{"one time", args(oneTime), []string{oneTime + ": ", "time span"}},
		{"no mag column", args(noMag), []string{noMag + ": line 1", `missing column "mag"`}},
		{"empty time cell", args(noTime), []string{noTime + ": line 3, column 1 (time)", "missing"}},
		{"header only", args(headerOnly), []string{headerOnly + ": line 2", "no data rows"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			wantFailure(t, tc.args, vigil(tc.args...), tc.want...)
		})
	}
}

// TestPeriodHelp checks that --help lists every flag with its unit and
// default.
func TestPeriodHelp(t *testing.T) {
	want := []string{"Usage:\n  vigil period", "--input FILE", "time, mag, optional err", "--min-period DAYS", "--max-period DAYS",
		"period in days", "(required)", "--method ls|pdm", "(default ls)", "--oversample N", "peak width 1/T", "(default 5)",
		"--nfreq N", "(default auto)", "--peaks N", "(default 10)", "--bins N", "--covers N", "(default 1)", "--window", "--json", "--help",
		"1/err^2", "Zechmeister & Kürster 2009", "Stellingwerf 1978", "Baluev (2008", "cycles per day", "1 c/d"}
	for _, args := range [][]string{{"period", "--help"}, {"help", "period"}} {
		r := vigil(args...)
		if r.code != exitOK || r.stderr != "" {
			t.Fatalf("vigil %s: exit %d, stderr %q; want 0 and nothing", strings.Join(args, " "), r.code, r.stderr)
		}
		for _, w := range want {
			if !strings.Contains(r.stdout, w) {
				t.Errorf("vigil %s lacks %q:\n%s", strings.Join(args, " "), w, r.stdout)
			}
		}
	}
	if r := vigil("help"); !strings.Contains(r.stdout, "  period ") {
		t.Errorf("vigil help lacks the command period:\n%s", r.stdout)
	}
}

// FuzzPeriod feeds vigil period arbitrary files and options: it must answer
// with one JSON object or fail with status 2 and one line, never panic.
func FuzzPeriod(f *testing.F) {
	series, err := os.ReadFile(methods60)
	if err != nil {
		f.Fatal(err)
	}
	f.Add(string(series), "ls", "0.2", "20")
	f.Add(string(series), "pdm", "0.5", "0.75")
	f.Add("time,mag,err\n1,2,3\n4,5,-6\n", "ls", "0.1", "1")
	f.Add("time,mag\n1,10\n1,10.1\n1,10\n1,10.2\n1,10\n", "pdm", "0.1", "1")
	f.Add("time,mag\n1,10\n2,11\n3,10\n4,11\n5,1e308\n", "ls", "1e-300", "1e5")
	f.Fuzz(func(t *testing.T, text, method, minP, maxP string) {
		path := filepath.Join(t.TempDir(), "in.csv")
		if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		args := []string{"period", "--input", path, "--method=" + method, "--min-period=" + minP, "--max-period=" + maxP, "--nfreq=2000", "--json"}
		checkOutcome(t, args, vigil(args...))
	})
}
