package main

import (
	"math"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
	"time"
)

// predictRefDir holds the planner's reference predictions, written with
// astropy by observe/testdata/predict/make_predict.py.
var predictRefDir = filepath.Join("..", "..", "observe", "testdata", "predict")

// predictRefSource names the reference beside every comparison.
const predictRefSource = "astropy 5.2.1 via observe/testdata/predict/make_predict.py"

// Tolerances for vigil predict.
const (
	// predictUTCTol: the contract's "utc within 2 s" of an outside
	// computation of the instant an extremum is seen (the engine claims
	// 0.04 s against the same table, observe package doc).
	predictUTCTol = 2 * time.Second
	// refEphemerisTol: events.csv prints T0 + P·E + Q·E² to 1e-8 d (half a
	// unit, plus float64 rounding of a JD near 2.46e6, 4.7e-10 d).
	refEphemerisTol = 0.5e-8 + 1e-9
	// quotedEphemerisTol: methods.md §6 quotes T to 1e-4 d (half a unit).
	quotedEphemerisTol = 0.5e-4
	// jdRoundingTol: float64 rounding of T0 + P·cycle near JD 2.46e6,
	// whose last bit is 4.7e-10 d (40 µs).
	jdRoundingTol = 1e-9
	// sigmaRoundingTol: float64 rounding of sqrt(σT0² + (E·σP)²), days.
	sigmaRoundingTol = 1e-12
	// lightTimeMaxDays bounds |JD − HJD| and |JD_TDB − BJD_TDB|: the light
	// time across the Earth's orbit, at most 0.0058 d (methods.md §7),
	// plus TT − UTC (69.184 s since 2017) for BJD_TDB.
	lightTimeMaxDays = 0.0058 + 70*second
)

// predictRefRows reads a CSV table of predictRefDir ('#' comments, header).
func predictRefRows(t *testing.T, name string) []map[string]string {
	t.Helper()
	return refRows(t, filepath.Join(predictRefDir, name))
}

// refCaseArgs returns the vigil predict flags of one star of events.csv:
// place, proper motion, site, ephemeris and kind.
func refCaseArgs(row map[string]string) []string {
	args := []string{"predict", "--json",
		"--ra", row["ra_h"], "--dec", row["dec_deg"], "--pm-ra", row["pmra_masyr"], "--pm-dec", row["pmdec_masyr"],
		"--lat", row["lat_deg"], "--lon", row["lon_deg"], "--elev", row["elev_m"],
		"--epoch", row["epoch"], "--period", row["period"], "--q", row["q"],
		"--timescale", row["timescale"], "--kind", row["kind"]}
	if row["secondary"] == "true" {
		args = append(args, "--secondary")
	}
	return args
}

// refCases groups the rows of events.csv by star, in file order.
func refCases(t *testing.T) (names []string, rows map[string][]map[string]string) {
	rows = map[string][]map[string]string{}
	for _, row := range predictRefRows(t, "events.csv") {
		n := row["name"]
		if _, ok := rows[n]; !ok {
			names = append(names, n)
		}
		rows[n] = append(rows[n], row)
	}
	return names, rows
}

// refNumber reads a number of a reference row.
func refNumber(t *testing.T, row map[string]string, col string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(row[col], 64)
	if err != nil {
		t.Fatalf("reference column %s: %v", col, err)
	}
	return v
}

// jdFlag writes a Julian date (UTC) as an instant flag, in full: ParseFloat
// gives back the same float64.
func jdFlag(jd float64) string { return "JD" + strconv.FormatFloat(jd, 'f', -1, 64) }

// TestPredictAgainstAstropy predicts every star of events.csv over the span
// of its reference events and compares each event: cycle, ephemeris time,
// the UTC instant it is seen, the star's and the Sun's altitude, and the
// contract's observable rule applied to astropy's altitudes.
func TestPredictAgainstAstropy(t *testing.T) {
	names, byName := refCases(t)
	worst := 0.0
	for _, name := range names {
		rows := byName[name]
		t.Run(name, func(t *testing.T) {
			first, last := refNumber(t, rows[0], "utc_jd"), refNumber(t, rows[len(rows)-1], "utc_jd")
			// A minute either side: every reference event, and no other
			// (the shortest period is 0.14 d).
			args := append(refCaseArgs(rows[0]), "--from", jdFlag(first-60*second), "--to", jdFlag(last+60*second))
			evs := list(t, mustJSON(t, args...), "events")
			if len(evs) != len(rows) {
				t.Fatalf("%d events, want %d (%s)", len(evs), len(rows), predictRefSource)
			}
			for i, row := range rows {
				ev := evs[i]
				cycle := refNumber(t, row, "cycle")
				if got := number(t, ev, "cycle"); got != cycle {
					t.Errorf("event %d: cycle %v, want %v (%s)", i, got, cycle, predictRefSource)
					continue
				}
				what := "cycle " + row["cycle"]
				near(t, what+" ephemeris_time", number(t, ev, "ephemeris_time"), refNumber(t, row, "ephemeris_time"), refEphemerisTol, "d", predictRefSource)
				got, _ := instant(t, ev, "utc")
				want, err := time.Parse(time.RFC3339Nano, row["utc_iso"])
				if err != nil {
					t.Fatal(err)
				}
				if d := got.Sub(want); d.Abs() > predictUTCTol {
					t.Errorf("%s utc: got %s, want %s (%s), diff %v, tol %v", what, got.Format(time.RFC3339Nano), row["utc_iso"], predictRefSource, d, predictUTCTol)
				}
				worst = math.Max(worst, math.Abs(number(t, ev, "jd_utc")-refNumber(t, row, "utc_jd"))/second)
				alt, sun := refNumber(t, row, "alt_deg"), refNumber(t, row, "sun_alt_deg")
				near(t, what+" alt_deg", number(t, ev, "alt_deg"), alt, starTol, "°", predictRefSource)
				near(t, what+" sun_alt_deg", number(t, ev, "sun_alt_deg"), sun, sunTol, "°", predictRefSource)
				wantKind := row["kind"]
				if strings.HasSuffix(row["cycle"], ".5") {
					wantKind = "min"
				}
				if ev["kind"] != wantKind || ev["secondary"] != strings.HasSuffix(row["cycle"], ".5") {
					t.Errorf("%s: kind %v, secondary %v; want %s, %v", what, ev["kind"], ev["secondary"], wantKind, strings.HasSuffix(row["cycle"], ".5"))
				}
				// The contract's rule with the defaults --min-alt 20 and
				// --sun-alt -12, on astropy's altitudes; skipped where a
				// value lies within its tolerance of the limit.
				if math.Abs(alt-20) > starTol && math.Abs(sun+12) > sunTol {
					if want := alt > 20 && sun < -12; ev["observable"] != want {
						t.Errorf("%s: observable %v, want %v (alt %.4f° > 20°, Sun %.4f° < -12° by %s)", what, ev["observable"], want, alt, sun, predictRefSource)
					}
				}
			}
		})
	}
	t.Logf("largest |utc − astropy| %.3f s", worst)
}

// TestPredictWindowsAgainstAstropy lists the events of each span of
// windows.csv, whose ends lie midway between two events.
func TestPredictWindowsAgainstAstropy(t *testing.T) {
	_, byName := refCases(t)
	for _, w := range predictRefRows(t, "windows.csv") {
		t.Run(w["name"], func(t *testing.T) {
			args := append(refCaseArgs(byName[w["name"]][0]), "--from", w["from"], "--to", w["to"])
			var got []string
			for _, ev := range list(t, mustJSON(t, args...), "events") {
				got = append(got, strconv.FormatFloat(number(t, ev, "cycle"), 'f', 1, 64))
			}
			if g := strings.Join(got, ";"); g != w["cycles"] {
				t.Errorf("cycles %s, want %s (%s, windows.csv)", g, w["cycles"], predictRefSource)
			}
		})
	}
}

// TestPredictSpanEdges checks [from, to) exactly: with --from at an event's
// own instant and --to at the next one's, that event and no other is
// listed.
func TestPredictSpanEdges(t *testing.T) {
	names, byName := refCases(t)
	for _, name := range names {
		rows := byName[name]
		t.Run(name, func(t *testing.T) {
			base := slices.Clip(refCaseArgs(rows[0]))
			first, last := refNumber(t, rows[0], "utc_jd"), refNumber(t, rows[len(rows)-1], "utc_jd")
			evs := list(t, mustJSON(t, append(base, "--from", jdFlag(first-60*second), "--to", jdFlag(last+60*second))...), "events")
			for i := 0; i+1 < len(evs); i++ {
				from, to := number(t, evs[i], "jd_utc"), number(t, evs[i+1], "jd_utc")
				got := list(t, mustJSON(t, append(base, "--from", jdFlag(from), "--to", jdFlag(to))...), "events")
				if len(got) != 1 || number(t, got[0], "cycle") != number(t, evs[i], "cycle") || number(t, got[0], "jd_utc") != from {
					var cycles []float64
					for _, g := range got {
						cycles = append(cycles, number(t, g, "cycle"))
					}
					t.Errorf("--from %s --to %s: cycles %v, want [%v] (the event at --from in, the one at --to out)", jdFlag(from), jdFlag(to), cycles, number(t, evs[i], "cycle"))
				}
			}
		})
	}
}

// deltaCepPredict is δ Cep (place as in sky_test.go) with the ephemeris of
// methods.md §6 [C], Max = 2436075.445 + 5.366341 E on HJD, from 50° N,
// 10° E.
var deltaCepPredict = []string{"predict", "--json", "--ra", "22:29:10.26502", "--dec", "+58:24:54.7139",
	"--lat", "50", "--lon", "10", "--epoch", "2436075.445", "--period", "5.366341", "--timescale", "hjd"}

// TestPredictPublishedValues checks the first maximum after JD 2460666.0 of
// δ Cep and η Aql (methods.md §6 [C]).
func TestPredictPublishedValues(t *testing.T) {
	const source = "methods.md §6 [C]"
	etaAql := []string{"predict", "--json", "--ra", "19:52:28.37", "--dec", "+01:00:20.4", // η Aql [from memory]
		"--lat", "50", "--lon", "10", "--epoch", "2436084.656", "--period", "7.176641", "--timescale", "hjd"}
	for _, tc := range []struct {
		name     string
		args     []string
		from, to string
		cycle    float64
		T        float64
	}{
		{"δ Cep after JD 2460666.0", deltaCepPredict, "JD2460666.0", "JD2460676.0", 4583, 2460669.3858},
		{"δ Cep, --from just before", deltaCepPredict, "JD2460669.37", "JD2460669.40", 4583, 2460669.3858},
		{"η Aql after JD 2460666.0", etaAql, "JD2460666.0", "JD2460676.0", 3426, 2460671.8281},
	} {
		t.Run(tc.name, func(t *testing.T) {
			evs := list(t, mustJSON(t, append(tc.args, "--from", tc.from, "--to", tc.to)...), "events")
			if len(evs) == 0 {
				t.Fatalf("no events from %s to %s, want cycle %v first (%s)", tc.from, tc.to, tc.cycle, source)
			}
			ev := evs[0]
			if got := number(t, ev, "cycle"); got != tc.cycle {
				t.Errorf("first cycle %v, want %v (%s)", got, tc.cycle, source)
			}
			near(t, "ephemeris_time", number(t, ev, "ephemeris_time"), tc.T, quotedEphemerisTol, "d", source)
			// The instant at the telescope differs from the HJD by the
			// light time to the Sun at most.
			near(t, "jd_utc − ephemeris_time", number(t, ev, "jd_utc"), number(t, ev, "ephemeris_time"), lightTimeMaxDays, "d", "methods.md §7")
			if ev["kind"] != "max" || ev["secondary"] != false {
				t.Errorf("kind %v, secondary %v; want max, false", ev["kind"], ev["secondary"])
			}
		})
	}
}

// TestPredictSecondary checks the half-integer cycles of --secondary: the
// primary minima alone without it; with it, minima at E and E + 0.5
// alternating, each at T0 + P·cycle (an exact ephemeris: Sterken 2005).
func TestPredictSecondary(t *testing.T) {
	const t0, p = 2448500.25, 1.2345678 // Cedar Ecl of events.csv (invented)
	args := []string{"predict", "--json", "--ra", "13.05", "--dec", "61.2", "--lat", "40", "--lon", "-105", "--elev", "1600",
		"--epoch", "2448500.25", "--period", "1.2345678", "--timescale", "hjd", "--kind", "min",
		"--from", "2025-07-14T00:00:00Z", "--to", "2025-07-24T00:00:00Z"}
	primary := list(t, mustJSON(t, args...), "events")
	both := list(t, mustJSON(t, append(args, "--secondary")...), "events")
	if len(primary) < 7 || len(both) < 2*len(primary)-1 || len(both) > 2*len(primary)+1 {
		t.Fatalf("%d primary events and %d with --secondary: want about 8 and twice that in 10 days of P = %g d", len(primary), len(both), p)
	}
	prev := math.Inf(-1)
	for i, ev := range both {
		c := number(t, ev, "cycle")
		half := c != math.Floor(c)
		if half && c-math.Floor(c) != 0.5 {
			t.Errorf("event %d: cycle %v, want a whole or half-integer", i, c)
		}
		if i > 0 && c != prev+0.5 {
			t.Errorf("event %d: cycle %v after %v, want the next half cycle", i, c, prev)
		}
		prev = c
		if ev["secondary"] != half || ev["kind"] != "min" {
			t.Errorf("cycle %v: secondary %v, kind %v; want %v, min", c, ev["secondary"], ev["kind"], half)
		}
		near(t, "ephemeris_time", number(t, ev, "ephemeris_time"), t0+p*c, jdRoundingTol, "d", "T0 + P·cycle")
	}
	for i, ev := range primary {
		if c := number(t, ev, "cycle"); c != math.Floor(c) {
			t.Errorf("without --secondary, event %d: cycle %v, want whole cycles only", i, c)
		}
	}
}

// TestPredictObservableRule checks the contract's rule on every event of a
// long span, with limits other than the defaults: observable exactly when
// alt_deg > --min-alt and sun_alt_deg < --sun-alt, with reasons empty then.
// The Moon plays no part (the star passes near it in 60 days).
func TestPredictObservableRule(t *testing.T) {
	const minAlt, sunAlt = 30.0, -6.0
	// An invented star on the ecliptic, so that the Moon passes it.
	m := mustJSON(t, "predict", "--json", "--ra", "6.5", "--dec", "23", "--lat", "35", "--lon", "-110",
		"--epoch", "2460000.1", "--period", "0.2718", "--from", "2026-10-01T00:00:00Z", "--to", "2026-11-30T00:00:00Z",
		"--min-alt", "30", "--sun-alt", "-6")
	evs := list(t, m, "events")
	var yes, moonNear int
	for _, ev := range evs {
		alt, sun := number(t, ev, "alt_deg"), number(t, ev, "sun_alt_deg")
		want := alt > minAlt && sun < sunAlt
		if ev["observable"] != want {
			t.Errorf("cycle %v: observable %v with alt %.4f° and Sun %.4f°, want %v", ev["cycle"], ev["observable"], alt, sun, want)
		}
		if reasons := ev["reasons"].([]any); (len(reasons) == 0) != want {
			t.Errorf("cycle %v: reasons %v with observable %v", ev["cycle"], reasons, want)
		}
		if want {
			yes++
			if number(t, ev, "moon_alt_deg") > 0 && number(t, ev, "moon_sep_deg") < 15 {
				moonNear++
			}
		}
	}
	if yes == 0 || yes == len(evs) || number(t, m, "n_observable") != float64(yes) || number(t, m, "n") != float64(len(evs)) {
		t.Errorf("%d of %d events observable, n_observable %v, n %v: want some of each, counted", yes, len(evs), m["n_observable"], m["n"])
	}
	if moonNear == 0 {
		t.Errorf("no observable event with the Moon up within 15°: the span was meant to show that the Moon plays no part")
	}
	if number(t, m, "min_alt_deg") != minAlt || number(t, m, "sun_alt_limit_deg") != sunAlt {
		t.Errorf("min_alt_deg %v, sun_alt_limit_deg %v: want %v, %v", m["min_alt_deg"], m["sun_alt_limit_deg"], minAlt, sunAlt)
	}
}

// TestPredictSigma checks sigma_days = sqrt(σT0² + (E·σP)²) (Sterken 2005,
// error propagation of T0 + P·E), and null without the errors.
func TestPredictSigma(t *testing.T) {
	args := append(deltaCepPredict, "--from", "JD2460666.0", "--to", "JD2460676.0")
	if ev := list(t, mustJSON(t, args...), "events")[0]; ev["sigma_days"] != nil {
		t.Errorf("sigma_days %v without --epoch-err or --period-err, want null", ev["sigma_days"])
	}
	ev := list(t, mustJSON(t, append(args, "--epoch-err", "0.002", "--period-err", "0.000004")...), "events")[0]
	e := number(t, ev, "cycle")
	near(t, "sigma_days", number(t, ev, "sigma_days"), math.Hypot(0.002, e*0.000004), sigmaRoundingTol, "d", "sqrt(σT0² + (E·σP)²)")
}

// TestPredictGolden compares whole answers with golden files
// (go test ./cmd/vigil -run Golden -update rewrites them).
func TestPredictGolden(t *testing.T) {
	for _, tc := range []struct {
		name string
		args []string
	}{
		{"predict_delta_cep_demo", []string{"predict", "--json", "--ra", "22:29:10.26502", "--dec", "+58:24:54.7139", "--site", "demo",
			"--epoch", "2436075.445", "--period", "5.366341", "--timescale", "hjd", "--epoch-err", "0.002", "--period-err", "0.000004",
			"--from", "2026-11-01T00:00:00Z", "--to", "2026-12-01T00:00:00Z"}},
		{"predict_secondary", []string{"predict", "--json", "--ra", "13.05", "--dec", "61.2", "--lat", "40", "--lon", "-105", "--elev", "1600",
			"--epoch", "2448500.25", "--period", "1.2345678", "--timescale", "hjd", "--kind", "min", "--secondary",
			"--from", "2025-07-14T00:00:00Z", "--to", "2025-07-17T00:00:00Z"}},
		{"predict_quadratic_bjd", []string{"predict", "--json", "--ra", "18.6", "--dec", "-12", "--lat", "-23.5", "--lon", "25", "--elev", "50",
			"--epoch", "2457000", "--period", "0.6180339", "--q", "2e-9", "--min-alt", "10", "--sun-alt", "-18",
			"--from", "2026-06-01T00:00:00Z", "--to", "2026-06-03T00:00:00Z"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r := vigil(tc.args...)
			if r.code != exitOK || r.stderr != "" {
				t.Fatalf("exit %d, stderr %q", r.code, r.stderr)
			}
			compareGolden(t, tc.name, r.stdout)
		})
	}
}

// TestPredictTable checks the table for people: one row per event, the
// local time with a zone, and the verdict.
func TestPredictTable(t *testing.T) {
	args := []string{"predict", "--ra", "22:29:10.26502", "--dec", "+58:24:54.7139", "--site", "demo",
		"--epoch", "2436075.445", "--period", "5.366341", "--timescale", "hjd", "--from", "2026-11-01T00:00:00Z", "--to", "2026-12-01T00:00:00Z"}
	r := vigil(args...)
	if r.code != exitOK || r.stderr != "" {
		t.Fatalf("exit %d, stderr %q", r.code, r.stderr)
	}
	m := mustJSON(t, append(args, "--json")...)
	evs := list(t, m, "events")
	for _, want := range []string{"HJD_UTC", "Local", "Europe/London", "Observable", "of " + strconv.Itoa(len(evs)) + " observable"} {
		if !strings.Contains(r.stdout, want) {
			t.Errorf("table lacks %q:\n%s", want, r.stdout)
		}
	}
	for _, ev := range evs {
		if !strings.Contains(r.stdout, strconv.FormatFloat(number(t, ev, "ephemeris_time"), 'f', 5, 64)) {
			t.Errorf("table lacks the event at %v:\n%s", ev["ephemeris_time"], r.stdout)
		}
	}
}

// TestPredictBadInput checks the contract for bad input: exit 2, one stderr
// line naming the flag and quoting the value, nothing on stdout.
func TestPredictBadInput(t *testing.T) {
	good := map[string]string{"--ra": "22.5", "--dec": "58", "--lat": "50", "--lon": "10", "--epoch": "2436075.445",
		"--period": "5.366341", "--from": "2026-11-01T00:00:00Z", "--to": "2026-12-01T00:00:00Z"}
	order := []string{"--ra", "--dec", "--lat", "--lon", "--epoch", "--period", "--from", "--to"}
	// args returns the good command line with flags replaced ("-" drops
	// one) or added.
	args := func(extra ...string) []string {
		vals := map[string]string{}
		for k, v := range good {
			vals[k] = v
		}
		names := append([]string(nil), order...)
		for i := 0; i+1 < len(extra); i += 2 {
			if _, ok := vals[extra[i]]; !ok {
				names = append(names, extra[i])
			}
			vals[extra[i]] = extra[i+1]
		}
		out := []string{"predict", "--json"}
		for _, k := range names {
			if v := vals[k]; v != "-" {
				out = append(out, k, v)
			}
		}
		return out
	}
	for _, tc := range []struct {
		name string
		args []string
		want []string
	}{
		{"period 0", args("--period", "0"), []string{"vigil predict: ", "--period", `"0"`, "positive"}},
		{"period not a number", args("--period", "five"), []string{"--period", `"five"`}},
		{"from after to", args("--from", "2026-12-02T00:00:00Z"), []string{"--to", `"2026-12-01T00:00:00Z"`, "not after --from", `"2026-12-02T00:00:00Z"`}},
		{"from equal to to", args("--from", "2026-12-01T00:00:00Z"), []string{"--to", "not after --from"}},
		{"kind sideways", args("--kind", "sideways"), []string{"--kind", `"sideways"`, "max or min"}},
		{"timescale utc", args("--timescale", "utc"), []string{"--timescale", `"utc"`, "hjd", "bjd"}},
		{"epoch abc", args("--epoch", "abc"), []string{"--epoch", `"abc"`, "Julian date"}},
		{"epoch reduced", args("--epoch", "60000.5"), []string{"--epoch", `"60000.5"`, "full Julian date"}},
		{"span too long", args("--to", "2027-12-31T00:00:00Z"), []string{"--to", `"2027-12-31T00:00:00Z"`, "at most 400 days"}},
		{"too many events", args("--period", "0.0002"), []string{"--to", "at most 100000", "shorten the span"}},
		{"from not an instant", args("--from", "soon"), []string{"--from", `"soon"`}},
		{"missing --epoch", args("--epoch", "-"), []string{"--epoch", "missing", "required"}},
		{"missing --from", args("--from", "-"), []string{"--from", "missing"}},
		{"min-alt 95", args("--min-alt", "95"), []string{"--min-alt", `"95"`, "[-5, 90)"}},
		{"min-alt -10", args("--min-alt", "-10"), []string{"--min-alt", `"-10"`}},
		{"sun-alt 20", args("--sun-alt", "20"), []string{"--sun-alt", `"20"`, "[-30, 10]"}},
		{"negative epoch error", args("--epoch-err", "-0.1"), []string{"--epoch-err", `"-0.1"`, "0 or more"}},
		{"quadratic term stops the period", args("--q", "0.01"), []string{"--q", "quadratic term", "fall to zero"}},
		{"proper motion absurd", args("--pm-ra", "1e9"), []string{"--pm-ra", `"1e9"`}},
		{"RA 24", args("--ra", "24"), []string{"--ra", `"24"`}},
		{"unknown site", args("--lat", "-", "--lon", "-", "--site", "Ridge Top"), []string{"--site", `"Ridge Top"`}},
		{"secondary with a value", append(args(), "--secondary=perhaps"), []string{"--secondary", `"perhaps"`}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			wantFailure(t, tc.args, vigil(tc.args...), tc.want...)
		})
	}
}

// TestPredictHelp checks that --help lists every flag with its unit and
// default.
func TestPredictHelp(t *testing.T) {
	r := vigil("predict", "--help")
	if r.code != exitOK || r.stderr != "" {
		t.Fatalf("exit %d, stderr %q", r.code, r.stderr)
	}
	for _, want := range []string{"Usage:\n  vigil predict", "--ra HOURS", "--dec DEG", "--lat DEG", "--lon DEG", "EAST positive",
		"--elev METRES", "--site NAME", "--epoch JD", "--period DAYS", "--q DAYS", "--epoch-err DAYS", "--period-err DAYS",
		"--timescale hjd|bjd", "(default bjd)", "--kind max|min", "(default max)", "--secondary", "E + 0.5",
		"--from INSTANT", "--to INSTANT", "at most 400 days", "--min-alt DEG", "(default 20)", "--sun-alt DEG", "(default -12)",
		"--pm-ra MAS/YR", "--pm-dec MAS/YR", "--json", "[from, to)", "airless", "no Moon"} {
		if !strings.Contains(r.stdout, want) {
			t.Errorf("help lacks %q:\n%s", want, r.stdout)
		}
	}
}

func FuzzPredict(f *testing.F) {
	f.Add("2436075.445", "5.366341", "hjd", "max", "2026-11-01T00:00:00Z", "JD2461375.5", "20")
	f.Add("2448500.25", "0.0001", "bjd", "min", "1620-01-01T00:00:00Z", "2199-12-31T00:00:00Z", "-5")
	f.Add("2600000", "1e5", "BJD_TDB", "minimum", "JD2312752.5", "JD2312753", "89.999")
	f.Fuzz(func(t *testing.T, epoch, period, scale, kind, from, to, minAlt string) {
		args := []string{"predict", "--ra=1.5", "--dec=20", "--lat=50", "--lon=10", "--secondary",
			"--epoch=" + epoch, "--period=" + period, "--timescale=" + scale, "--kind=" + kind,
			"--from=" + from, "--to=" + to, "--min-alt=" + minAlt, "--json"}
		checkOutcome(t, args, vigil(args...))
	})
}
