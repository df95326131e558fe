package main

import (
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"
)

// planTargets is the invented catalogue of the plan and chart tests.
const planTargets = "testdata/plan_targets.csv"

// planLastTiming is the last_timing column of plan_targets.csv (JD on each
// target's ephemeris scale; absent: never timed).
var planLastTiming = map[string]float64{"Rowan Var": 2460300.5}

// seenAgreeTol: plan and predict solve the instant an extremum is seen
// over different spans of the same sky table; the planner claims 1 ms
// against ephem.SeenAt for each (observe package doc), so two of them agree
// within 2 ms.
const seenAgreeTol = 2e-3 * second

// wholeWindowTolDays is the planner's tolerance (days, 0.09 s) below which
// a window counts as wholly usable (observe, eventTol).
const wholeWindowTolDays = 1e-6

// planTwilightFields pairs the plan's twilights with vigil night's fields.
var planTwilightFields = []string{"sunset", "sunrise", "civil_dusk", "civil_dawn", "nautical_dusk", "nautical_dawn", "astro_dusk", "astro_dawn"}

// TestPlanTwilightsAgainstAstropy compares the night's twilights with
// testdata/astropy_night.csv (astropy 5.2.1, written by
// testdata/astropy_cli.py), and the dark span at the default --sun-alt -12
// with nautical dusk and dawn.
func TestPlanTwilightsAgainstAstropy(t *testing.T) {
	for _, row := range readReference(t, "astropy_night.csv") {
		t.Run(row["name"], func(t *testing.T) {
			m := mustJSON(t, "plan", "--targets", planTargets, "--lat", row["lat"], "--lon", row["lon"], "--elev", row["elev"],
				"--date", row["date"], "--json")
			nights := list(t, m, "nights")
			if len(nights) != 1 || nights[0]["date"] != row["date"] {
				t.Fatalf("nights %v, want one, of %s", m["nights"], row["date"])
			}
			tw := object(t, nights[0], "twilights")
			at := func(field string) (time.Time, bool) {
				if tw[field] == nil {
					return time.Time{}, false
				}
				return instant(t, object(t, tw, field), "utc")
			}
			for _, field := range planTwilightFields {
				got, ok := at(field)
				if row[field] == "" {
					if ok {
						t.Errorf("%s: got %s, want null (astropy: no such event that night)", field, got.Format(time.RFC3339))
					}
					continue
				}
				want, err := time.Parse(time.RFC3339Nano, row[field])
				if err != nil {
					t.Fatal(err)
				}
				if d := got.Sub(want); !ok || d.Abs() > sunEventTol {
					t.Errorf("%s: got %s (present %v), want %s (testdata/astropy_night.csv), diff %v, tol %v", field, got.Format(time.RFC3339Nano), ok, row[field], d, sunEventTol)
				}
			}
			for _, pair := range [][2]string{{"dark_from", "nautical_dusk"}, {"dark_to", "nautical_dawn"}} {
				dark, ok1 := at(pair[0])
				naut, ok2 := at(pair[1])
				if ok1 != ok2 || dark.Sub(naut).Abs() > sunEventTol {
					t.Errorf("%s %s, %s %s: want the same instant with --sun-alt -12", pair[0], dark.Format(time.RFC3339Nano), pair[1], naut.Format(time.RFC3339Nano))
				}
			}
		})
	}
}

// TestPlanAgreesWithPredict checks that, with the Moon check off and every
// event kept (--moon-sep 0 --all), a night plan lists for each target the
// events vigil predict lists over the same night, with the same instant and
// the same observable verdict: predict's is the contract's rule, checked
// against astropy in TestPredictAgainstAstropy.
func TestPlanAgreesWithPredict(t *testing.T) {
	type target struct{ name, ra, dec, epoch, period, q, scale, kind string }
	// The rows of plan_targets.csv, as predict flags.
	targets := []target{
		{"Rowan Var", "04:12:30.0", "+38:15:00", "2459500.4321", "0.5123456", "0", "bjd", "max"},
		{"Willow Ecl", "06:45:10.0", "+22:40:00", "2458800.2200", "0.8765432", "0", "hjd", "min"},
		{"Hawthorn Cep", "01:55:00.0", "+61:10:00", "2455000.600", "4.123456", "0", "hjd", "max"},
		{"Sorrel Quad", "03:20:00", "+05:00:00", "2457000.1", "0.3141592", "1e-10", "bjd", "max"},
		{"Larch Ecl", "23:40:00", "+45:30:00", "2459100.35", "1.5", "0", "bjd", "min"},
	}
	secondary := map[string]bool{"Willow Ecl": true, "Larch Ecl": true}
	m := mustJSON(t, "plan", "--targets", planTargets, "--lat", "50.1", "--lon", "8.7", "--elev", "100", "--date", "2026-12-01",
		"--nights", "3", "--moon-sep", "0", "--all", "--json")
	byTarget := map[string][]map[string]any{}
	nights := list(t, m, "nights")
	start, _ := instant(t, object(t, nights[0], "start"), "utc")
	end, _ := instant(t, object(t, nights[len(nights)-1], "end"), "utc")
	for _, n := range nights {
		for _, ev := range list(t, n, "events") {
			byTarget[ev["target"].(string)] = append(byTarget[ev["target"].(string)], ev)
		}
	}
	for _, tg := range targets {
		t.Run(tg.name, func(t *testing.T) {
			args := []string{"predict", "--json", "--ra", tg.ra, "--dec", tg.dec, "--lat", "50.1", "--lon", "8.7", "--elev", "100",
				"--epoch", tg.epoch, "--period", tg.period, "--q", tg.q, "--timescale", tg.scale, "--kind", tg.kind,
				"--from", start.Format(time.RFC3339Nano), "--to", end.Format(time.RFC3339Nano)}
			if secondary[tg.name] {
				args = append(args, "--secondary")
			}
			want := list(t, mustJSON(t, args...), "events")
			got := byTarget[tg.name]
			if len(got) != len(want) {
				t.Fatalf("plan lists %d events, predict %d", len(got), len(want))
			}
			for i := range want {
				if got[i]["cycle"] != want[i]["cycle"] || got[i]["observable"] != want[i]["observable"] || got[i]["kind"] != want[i]["kind"] {
					t.Errorf("event %d: plan cycle %v observable %v kind %v; predict %v, %v, %v", i,
						got[i]["cycle"], got[i]["observable"], got[i]["kind"], want[i]["cycle"], want[i]["observable"], want[i]["kind"])
				}
				near(t, "jd_utc", number(t, got[i], "jd_utc"), number(t, want[i], "jd_utc"), seenAgreeTol, "d", "vigil predict")
				near(t, "ephemeris_time", number(t, got[i], "ephemeris_time"), number(t, want[i], "ephemeris_time"), jdRoundingTol, "d", "vigil predict")
			}
		})
	}
}

// TestPlanInvariants checks a ranked forecast and the same in time order:
// events of each night inside it; in time order, or best first with ranks
// 1..n; local times in the zone; verdicts that agree with the fields; and
// the score recomputed from its documented formula,
// S = C·(1+B)·(1+A+U)/6 (observe package doc; common practice).
func TestPlanInvariants(t *testing.T) {
	const scoreTol = 1e-12 // float64 rounding of a product of a few numbers in [0, 2]
	args := []string{"plan", "--targets", planTargets, "--lat", "50.1", "--lon", "8.7", "--tz", "Europe/Berlin",
		"--date", "2026-10-24", "--nights", "3", "--json"}
	for _, ranked := range []bool{false, true} {
		a := args
		if ranked {
			a = append(a[:len(a):len(a)], "--rank")
		}
		m := mustJSON(t, a...)
		if m["ranked"] != ranked || number(t, m, "targets") != 5 || object(t, m, "site")["time_zone"] != "Europe/Berlin" {
			t.Errorf("ranked %v, targets %v, site %v", m["ranked"], m["targets"], m["site"])
		}
		nights := list(t, m, "nights")
		total := 0
		defer func() {
			if total < 5 {
				t.Errorf("ranked %v: %d events in 3 nights, want at least 5 to check", ranked, total)
			}
		}()
		if len(nights) != 3 {
			t.Fatalf("%d nights, want 3", len(nights))
		}
		for ni, n := range nights {
			start, _ := instant(t, object(t, n, "start"), "utc")
			end, _ := instant(t, object(t, n, "end"), "utc")
			evs := list(t, n, "events")
			if number(t, n, "n") != float64(len(evs)) {
				t.Errorf("night %d: n %v, %d events", ni, n["n"], len(evs))
			}
			total += len(evs)
			ranks := map[float64]bool{}
			var prevT time.Time
			prevScore := math.Inf(1)
			for i, ev := range evs {
				at, _ := instant(t, ev, "utc")
				if at.Before(start) || !at.Before(end) {
					t.Errorf("night %d: event at %s outside [%s, %s)", ni, at.Format(time.RFC3339), start.Format(time.RFC3339), end.Format(time.RFC3339))
				}
				local, err := time.Parse(time.RFC3339Nano, ev["local"].(string))
				// 2026-10-25 01:00 UTC: CEST (+02:00) becomes CET (+01:00).
				wantOff := 7200
				if !at.Before(time.Date(2026, 10, 25, 1, 0, 0, 0, time.UTC)) {
					wantOff = 3600
				}
				if _, off := local.Zone(); err != nil || !local.Equal(at.Truncate(time.Millisecond)) && local.Sub(at).Abs() > time.Millisecond || off != wantOff {
					t.Errorf("local %v (%v) for utc %s: want the same instant at UTC+%d s", ev["local"], err, at.Format(time.RFC3339Nano), wantOff)
				}
				score, rank := number(t, ev, "score"), number(t, ev, "rank")
				ranks[rank] = true
				if ranked {
					if rank != float64(i+1) || score > prevScore {
						t.Errorf("night %d, --rank: event %d has rank %v and score %v after %v", ni, i, rank, score, prevScore)
					}
					prevScore = score
				} else if at.Before(prevT) {
					t.Errorf("night %d: event %d at %s before the one listed before it", ni, i, at.Format(time.RFC3339))
				}
				prevT = at
				checkVerdict(t, ev)
				checkScore(t, ev, scoreTol)
			}
			for r := 1; r <= len(evs); r++ {
				if !ranks[float64(r)] {
					t.Errorf("night %d: ranks %v, want 1 to %d", ni, ranks, len(evs))
					break
				}
			}
		}
	}
}

// checkVerdict checks that an event's verdict agrees with its fields.
func checkVerdict(t *testing.T, ev map[string]any) {
	t.Helper()
	w := object(t, ev, "window")
	obs, whole, frac := ev["observable"] == true, w["whole"] == true, number(t, w, "usable_fraction")
	full := 2 * number(t, w, "half_width_days")
	var want string
	switch {
	case whole:
		want = "whole"
	case obs:
		want = "extremum"
	case frac > 0:
		want = "part"
	default:
		want = "none"
	}
	if ev["verdict"] != want || frac < 0 || frac > 1 || (whole && (!obs || frac*full < full-wholeWindowTolDays)) || (len(ev["reasons"].([]any)) == 0) != obs {
		t.Errorf("%v cycle %v: verdict %v, observable %v, whole %v, usable %v, reasons %v: want verdict %s and consistent fields",
			ev["target"], ev["cycle"], ev["verdict"], obs, whole, frac, ev["reasons"], want)
	}
}

// checkScore recomputes S = C·(1+B)·(1+A+U)/6: C the usable fraction, B 1
// for a whole window, A = min(age/365 d, 1) for the age of the last timing
// (1 when never timed), U = min(σ/w, 1) for the ephemeris's uncertainty
// against the window's half-width (observe package doc, common practice).
func checkScore(t *testing.T, ev map[string]any, tol float64) {
	t.Helper()
	w := object(t, ev, "window")
	c := number(t, w, "usable_fraction")
	b := 0.0
	if w["whole"] == true {
		b = 1
	}
	a := 1.0
	if last, ok := planLastTiming[ev["target"].(string)]; ok {
		a = math.Max(0, math.Min((number(t, ev, "ephemeris_time")-last)/365, 1))
	}
	u := 0.0
	if ev["sigma_days"] != nil {
		u = math.Min(number(t, ev, "sigma_days")/number(t, w, "half_width_days"), 1)
	}
	want := c * (1 + b) * (1 + a + u) / 6
	if c <= 0 {
		want = 0
	}
	near(t, ev["target"].(string)+" score", number(t, ev, "score"), want, tol, "", "C·(1+B)·(1+A+U)/6")
}

// TestPlanVOTable reads targets from a VOTable: the same star gives the
// same events as from the CSV catalogue; a VOTable silent about the time
// scale is refused unless --votable-timescale says it.
func TestPlanVOTable(t *testing.T) {
	base := []string{"plan", "--site", "demo", "--date", "2026-12-01", "--nights", "2", "--json"}
	events := func(m map[string]any, name string) []map[string]any {
		var out []map[string]any
		for _, n := range list(t, m, "nights") {
			for _, ev := range list(t, n, "events") {
				if ev["target"] == name {
					out = append(out, ev)
				}
			}
		}
		return out
	}
	vot := mustJSON(t, append(base, "--targets", "testdata/plan_targets.vot")...)
	csv := mustJSON(t, append(base, "--targets", planTargets)...)
	a, b := events(vot, "Rowan Var"), events(csv, "Rowan Var")
	if len(a) == 0 || len(a) != len(b) {
		t.Fatalf("Rowan Var: %d events from the VOTable, %d from the CSV: want the same, some", len(a), len(b))
	}
	for i := range a {
		if a[i]["cycle"] != b[i]["cycle"] || a[i]["jd_utc"] != b[i]["jd_utc"] || a[i]["timescale"] != "bjd" {
			t.Errorf("event %d: VOTable cycle %v at %v (%v), CSV cycle %v at %v", i, a[i]["cycle"], a[i]["jd_utc"], a[i]["timescale"], b[i]["cycle"], b[i]["jd_utc"])
		}
	}

	text, err := os.ReadFile("testdata/plan_targets.vot")
	if err != nil {
		t.Fatal(err)
	}
	silent := writeTemp(t, "silent.vot", strings.Replace(string(text), ` ref="bary"`, "", 1))
	r := vigil(append(base, "--targets", silent)...)
	if r.code != exitUsage || r.stdout != "" || !strings.Contains(r.stderr, "silent.vot: line 12") || !strings.Contains(r.stderr, `FIELD "Epoch"`) || !strings.Contains(r.stderr, "--votable-timescale") {
		t.Errorf("VOTable without a time scale: exit %d, stderr %q; want 2 naming the file, line 12, the FIELD and --votable-timescale", r.code, r.stderr)
	}
	for _, scale := range []string{"hjd", "bjd"} {
		m := mustJSON(t, append(base, "--targets", silent, "--votable-timescale", scale)...)
		if ev := events(m, "Rowan Var"); len(ev) == 0 || ev[0]["timescale"] != scale {
			t.Errorf("--votable-timescale %s: events %v", scale, ev)
		}
	}
}

// TestPlanTonight checks --date tonight at the demo site: the night that
// is under way or comes next, by the site's civil time.
func TestPlanTonight(t *testing.T) {
	for _, tc := range []struct{ now, want string }{
		{"2026-12-01T21:00:00Z", "2026-12-01"},
		{"2026-12-02T03:00:00Z", "2026-12-01"},
		{"2026-12-02T12:30:00Z", "2026-12-02"},
	} {
		now, _ := time.Parse(time.RFC3339, tc.now)
		withClock(t, now)
		m := mustJSON(t, "plan", "--targets", planTargets, "--site", "demo", "--date", "tonight", "--json")
		if got := list(t, m, "nights")[0]["date"]; got != tc.want {
			t.Errorf("at %s: night of %v, want %s", tc.now, got, tc.want)
		}
	}
}

// TestPlanGolden compares whole answers with golden files
// (go test ./cmd/vigil -run Golden -update rewrites them).
func TestPlanGolden(t *testing.T) {
	for _, tc := range []struct {
		name string
		args []string
	}{
		{"plan_demo_2026-12-01", []string{"plan", "--targets", planTargets, "--site", "demo", "--date", "2026-12-01", "--json"}},
		{"plan_berlin_ranked_dst_end", []string{"plan", "--targets", planTargets, "--lat", "50.1", "--lon", "8.7", "--tz", "Europe/Berlin",
			"--date", "2026-10-24", "--nights", "3", "--rank", "--moon-sep", "30", "--window-fraction", "0.2", "--window-max", "2", "--json"}},
		{"plan_southern_all", []string{"plan", "--targets", planTargets, "--lat", "-31.2754", "--lon", "149.0672", "--elev", "1150",
			"--tz", "Australia/Sydney", "--date", "2025-01-10", "--all", "--min-alt", "10", "--sun-alt", "-18", "--json"}},
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

// TestPlanTable checks the table for people: the night, its twilights in
// local time, and one row per event.
func TestPlanTable(t *testing.T) {
	args := []string{"plan", "--targets", planTargets, "--site", "demo", "--date", "2026-07-01"}
	r := vigil(args...)
	if r.code != exitOK || r.stderr != "" {
		t.Fatalf("exit %d, stderr %q", r.code, r.stderr)
	}
	m := mustJSON(t, append(args, "--json")...)
	n := list(t, m, "nights")[0]
	sunset, _ := instant(t, object(t, object(t, n, "twilights"), "sunset"), "utc")
	// BST = UTC + 1 h in July.
	for _, want := range []string{"Night of Wednesday 1 July 2026", "Europe/London", "Sunset " + sunset.Add(time.Hour).Round(time.Minute).Format("15:04"), "Verdict"} {
		if !strings.Contains(r.stdout, want) {
			t.Errorf("table lacks %q:\n%s", want, r.stdout)
		}
	}
	for _, ev := range list(t, n, "events") {
		at, _ := instant(t, ev, "utc")
		if !strings.Contains(r.stdout, at.Round(time.Second).Format("2006-01-02 15:04:05")+" UTC  "+ev["target"].(string)) {
			t.Errorf("table lacks the event of %v at %s:\n%s", ev["target"], at.Format(time.RFC3339), r.stdout)
		}
	}
}

// TestPlanBadInput checks the contract for bad input: exit 2, one stderr
// line naming the flag, or the file, line and column; nothing on stdout.
func TestPlanBadInput(t *testing.T) {
	plan := func(extra ...string) []string {
		return append([]string{"plan", "--lat", "50", "--lon", "10", "--date", "2026-12-01", "--json"}, extra...)
	}
	badRow := writeTemp(t, "bad_row.csv", "# invented\nname,ra,dec,epoch,period\nOak Var,1.5,20,2459000.1,0.5\nAsh Var,25:00:00,20,2459000.1,0.5\n")
	badPeriod := writeTemp(t, "bad_period.csv", "name,ra,dec,epoch,period\nOak Var,1.5,20,2459000.1,-0.5\n")
	twice := writeTemp(t, "twice.csv", "name,ra,dec,epoch,period\nOak Var,1.5,20,2459000.1,0.5\nOak Var,2.5,20,2459000.1,0.5\n")
	noEpoch := writeTemp(t, "no_epoch.csv", "name,ra,dec,period\nOak Var,1.5,20,0.5\n")
	empty := writeTemp(t, "empty.csv", "name,ra,dec,epoch,period\n")
	missing := filepath.Join(t.TempDir(), "nowhere.csv")
	for _, tc := range []struct {
		name string
		args []string
		want []string
	}{
		{"unreadable file", plan("--targets", missing), []string{"--targets", strconv.Quote(missing), "no such file"}},
		{"a directory", plan("--targets", t.TempDir()), []string{"--targets", "is a directory"}},
		{"bad row", plan("--targets", badRow), []string{badRow + ": line 4, column 9 (ra)", `"25:00:00"`, "[0, 24)"}},
		{"negative period", plan("--targets", badPeriod), []string{badPeriod + ": line 2", "(period)", `-0.5`}},
		{"name twice", plan("--targets", twice), []string{twice + ": line 3", "(name)", `"Oak Var"`}},
		{"no epoch column", plan("--targets", noEpoch), []string{noEpoch, "epoch"}},
		{"no targets", plan("--targets", empty), []string{empty, "no targets"}},
		{"unknown --site", []string{"plan", "--targets", planTargets, "--site", "Ridge Top", "--date", "2026-12-01"}, []string{"--site", `"Ridge Top"`}},
		{"--tz with --site", []string{"plan", "--targets", planTargets, "--site", "demo", "--tz", "UTC", "--date", "2026-12-01"}, []string{"--tz", "--site", "not both"}},
		{"unknown --tz", plan("--targets", planTargets, "--tz", "Mars/Olympus"), []string{"--tz", `"Mars/Olympus"`, "IANA"}},
		{"--tz Local", plan("--targets", planTargets, "--tz", "Local"), []string{"--tz", `"Local"`}},
		{"--nights 0", plan("--targets", planTargets, "--nights", "0"), []string{"--nights", `"0"`, "1 to 400"}},
		{"--nights 401", plan("--targets", planTargets, "--nights", "401"), []string{"--nights", `"401"`}},
		{"--date no such day", plan("--targets", planTargets, "--date", "2026-02-30"), []string{"--date", `"2026-02-30"`}},
		{"--window-fraction 0.7", plan("--targets", planTargets, "--window-fraction", "0.7"), []string{"--window-fraction", `"0.7"`, "0.5"}},
		{"--window-max 24", plan("--targets", planTargets, "--window-max", "24"), []string{"--window-max", `"24"`, "hours"}},
		{"--moon-sep -1", plan("--targets", planTargets, "--moon-sep", "-1"), []string{"--moon-sep", `"-1"`}},
		{"--min-alt 90", plan("--targets", planTargets, "--min-alt", "90"), []string{"--min-alt", `"90"`, "[-5, 90)"}},
		{"--votable-timescale with CSV", plan("--targets", planTargets, "--votable-timescale", "bjd"), []string{"--votable-timescale", "VOTable", planTargets}},
		{"bad --votable-timescale", plan("--targets", "testdata/plan_targets.vot", "--votable-timescale", "utc"), []string{"--votable-timescale", `"utc"`}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			wantFailure(t, tc.args, vigil(tc.args...), tc.want...)
		})
	}
}

// TestPlanHelp checks that --help lists every flag with its unit and
// default, and documents the JSON.
func TestPlanHelp(t *testing.T) {
	r := vigil("plan", "--help")
	if r.code != exitOK || r.stderr != "" {
		t.Fatalf("exit %d, stderr %q", r.code, r.stderr)
	}
	for _, want := range []string{"Usage:\n  vigil plan", "--targets FILE", "(required)", "VOTable", "--votable-timescale hjd|bjd",
		"--lat DEG", "--lon DEG", "EAST positive", "--elev METRES", "--site NAME", "--tz ZONE", "(default UTC)",
		"--date YYYY-MM-DD", "tonight", "--nights N", "(default 1)", "--min-alt DEG", "(default 20)", "--sun-alt DEG", "(default -12)",
		"--moon-sep DEG", "(default 15)", "--window-fraction F", "(default 0.1)", "--window-max HOURS", "(default 3)",
		"--rank", "--all", "--json", "nights [{date, start, end, twilights", "verdict", "score"} {
		if !strings.Contains(r.stdout, want) {
			t.Errorf("help lacks %q:\n%s", want, r.stdout)
		}
	}
}

func FuzzPlan(f *testing.F) {
	f.Add("50", "10", "2026-12-01", "1", "Europe/Berlin")
	f.Add("-90", "180", "1620-01-01", "400", "UTC")
	f.Add("78.2", "15.6", "2199-12-30", "3", "Asia/Kathmandu")
	f.Fuzz(func(t *testing.T, lat, lon, date, nights, tz string) {
		args := []string{"plan", "--targets=" + planTargets, "--lat=" + lat, "--lon=" + lon, "--date=" + date, "--nights=" + nights, "--tz=" + tz, "--json"}
		checkOutcome(t, args, vigil(args...))
	})
}
