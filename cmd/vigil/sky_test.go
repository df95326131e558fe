package main

import (
	"fmt"
	"math"
	"strings"
	"testing"
)

// Physical tolerances for vigil sky.
const (
	arcsec = 1.0 / 3600  // degrees
	second = 1.0 / 86400 // days

	// quotedAngleTol: methods.md quotes the δ Cep altitude and azimuth to
	// 0.001° (half a unit: 1.8″); the engine claims a few arcseconds
	// (ephem package doc).
	quotedAngleTol = 0.0005 + 5*arcsec
	// quotedJDTol: HJD and BJD_TDB quoted to 1e-7 d (half a unit: 4 ms); the
	// engine claims a few hundredths of a second.
	quotedJDTol = 0.5e-7 + 0.05*second

	// starTol: star altitude, azimuth (on the sky) and hour angle (on the
	// sky) against astropy; "a few arcseconds above 10°" (ephem package doc).
	starTol = 5 * arcsec
	// refractedTol: Sæmundsson (1986) against astropy's ERFA refraction
	// for the same 10 °C and 1010 hPa, above refractionMinAltDeg; the two
	// models differ by about 1% of a refraction of under 3′ there.
	refractedTol        = 5 * arcsec
	refractionMinAltDeg = 15
	// sunTol, moonTol: the Sun and Moon from Meeus's low-precision theories
	// (chapters 25 and 47; about 0.01° and 10″ in longitude) against
	// astropy's built-in ephemeris.
	sunTol  = 30 * arcsec
	moonTol = 30 * arcsec
	// illumTol: the Moon's illuminated fraction, "to 0.001" (ephem package
	// doc).
	illumTol = 0.001
	// jdTol: HJD and BJD_TDB against astropy, "a few hundredths of a
	// second" (ephem package doc).
	jdTol = 0.1 * second
	// airmassSecantTol: Pickering (2002) against the plane-parallel sec z
	// above 30° of altitude: 0.34% apart at 30° (methods.md §4 checks [C]).
	airmassSecantTol = 0.005
)

// deltaCep is the end-to-end check of methods.md §3 and §7: δ Cep (ICRS
// 22h29m10.26502s, +58°24′54.7139″) from φ = +50°, λ = +10° E, h = 0 m at
// 2024-12-21 20:00:00 UTC.
var deltaCep = []string{"sky", "--lat", "50", "--lon", "10", "--elev", "0",
	"--ra", "22:29:10.26502", "--dec", "+58:24:54.7139", "--at", "2024-12-21T20:00:00Z", "--json"}

func TestSkyPublishedValues(t *testing.T) {
	m := mustJSON(t, deltaCep...)
	const source = "astropy 5.2.1 [A] via methods.md §3/§7"
	for _, tc := range []struct {
		field string
		want  float64
		tol   float64
		unit  string
	}{
		{"jd_utc", 2460666.3333333, 0.5e-7, "d"},
		{"alt_deg", 53.502, quotedAngleTol, "°"},
		{"az_deg", 308.359, quotedAngleTol, "°"},
		{"hjd", 2460666.3341993, quotedJDTol, "d"},
		{"bjd_tdb", 2460666.3349804, quotedJDTol, "d"},
	} {
		got := number(t, m, tc.field)
		if d := got - tc.want; !(math.Abs(d) <= tc.tol) {
			t.Errorf("δ Cep %s: got %.7f, want %.7f (%s), diff %.3g %s, tol %.3g %s", tc.field, got, tc.want, source, d, tc.unit, tc.tol, tc.unit)
		}
	}
}

// TestSkyAgainstAstropy runs vigil sky for every row of
// testdata/astropy_sky.csv (written by testdata/astropy_cli.py) and compares
// each JSON field with astropy's value.
func TestSkyAgainstAstropy(t *testing.T) {
	worst := map[string]float64{}
	for _, row := range readReference(t, "astropy_sky.csv") {
		t.Run(row["name"], func(t *testing.T) {
			m := mustJSON(t, "sky", "--lat", row["lat"], "--lon", row["lon"], "--elev", row["elev"],
				"--ra", row["ra"], "--dec", row["dec"], "--at", row["at"], "--json")
			ref := func(key string) float64 {
				var v float64
				if _, err := fmt.Sscan(row[key], &v); err != nil {
					t.Fatalf("reference %s = %q: %v", key, row[key], err)
				}
				return v
			}
			alt := number(t, m, "alt_deg")
			check := func(field string, diff, tol float64, unit string) {
				worst[field] = math.Max(worst[field], math.Abs(diff))
				if !(math.Abs(diff) <= tol) {
					t.Errorf("%s: got %v, astropy %s, diff %.3g %s, tol %.3g %s (source: testdata/astropy_sky.csv)",
						field, m[field], row[field], diff, unit, tol, unit)
				}
			}
			check("alt_deg", alt-ref("alt_deg"), starTol, "°")
			// Azimuth and hour angle as arcs on the sky, which stay finite
			// near the zenith and the pole.
			dAz := math.Remainder(number(t, m, "az_deg")-ref("az_deg"), 360)
			check("az_deg", dAz*math.Cos(alt*math.Pi/180), starTol, "° on the sky")
			dHA := math.Remainder(number(t, m, "hour_angle_h")-ref("hour_angle_h"), 24)
			check("hour_angle_h", dHA*15*math.Cos(number(t, m, "dec_app_deg")*math.Pi/180), starTol, "° on the sky")
			if alt > refractionMinAltDeg {
				check("alt_refracted_deg", number(t, m, "alt_refracted_deg")-ref("alt_refracted_deg"), refractedTol, "°")
			}
			check("hjd", number(t, m, "hjd")-ref("hjd"), jdTol, "d")
			check("bjd_tdb", number(t, m, "bjd_tdb")-ref("bjd_tdb"), jdTol, "d")
			check("sun_alt_deg", number(t, m, "sun_alt_deg")-ref("sun_alt_deg"), sunTol, "°")
			check("sun_sep_deg", number(t, m, "sun_sep_deg")-ref("sun_sep_deg"), sunTol, "°")
			check("moon_alt_deg", number(t, m, "moon_alt_deg")-ref("moon_alt_deg"), moonTol, "°")
			check("moon_sep_deg", number(t, m, "moon_sep_deg")-ref("moon_sep_deg"), moonTol, "°")
			check("moon_illum", number(t, m, "moon_illum")-ref("moon_illum"), illumTol, "")
		})
	}
	for field, w := range worst {
		t.Logf("largest difference from astropy: %-18s %.3g", field, w)
	}
}

// TestSkyFieldRules checks the contract's rules that do not depend on a
// reference value: ranges, airmass null below the horizon, airmass against
// the secant, and which warnings appear.
func TestSkyFieldRules(t *testing.T) {
	site := []string{"--lat", "50", "--lon", "10"}
	for _, tc := range []struct {
		name       string
		args       []string
		airmassNil bool
		warnings   []string // substrings, in order; none means the field is absent
	}{
		{name: "δ Cep high in the evening", args: deltaCep},
		{name: "star below the horizon: airmass null",
			args:       append(append([]string{"sky"}, site...), "--ra", "12", "--dec", "-80", "--at", "2024-12-21T20:00:00Z", "--json"),
			airmassNil: true},
		{name: "Sun up and near the star: caution",
			args:     []string{"sky", "--lat", "40", "--lon", "15", "--elev", "300", "--ra", "4.3760", "--dec", "+20.004", "--at", "2025-05-20T11:00:00Z", "--json"},
			warnings: []string{"solar filter"}},
		{name: "after the leap-second table's validity: warning",
			args:     append(append([]string{"sky"}, site...), "--ra", "22.5", "--dec", "58", "--at", "2150-01-15T20:00:00Z", "--json"),
			warnings: []string{"leap-second table is complete only to"}},
		{name: "before 1972: warning",
			args:     append(append([]string{"sky"}, site...), "--ra", "22.5", "--dec", "58", "--at", "1960-01-15T20:00:00Z", "--json"),
			warnings: []string{"before 1972"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			m := mustJSON(t, tc.args...)
			for _, key := range []string{"jd_utc", "alt_deg", "alt_refracted_deg", "az_deg", "airmass", "hour_angle_h",
				"hjd", "bjd_tdb", "sun_alt_deg", "moon_alt_deg", "moon_sep_deg", "moon_illum"} {
				if _, ok := m[key]; !ok {
					t.Errorf("contract field %q missing", key)
				}
			}
			alt, refr := number(t, m, "alt_deg"), number(t, m, "alt_refracted_deg")
			if az := number(t, m, "az_deg"); !(az >= 0 && az < 360) {
				t.Errorf("az_deg = %v: want [0, 360)", az)
			}
			if ha := number(t, m, "hour_angle_h"); !(ha >= -12 && ha < 12) {
				t.Errorf("hour_angle_h = %v: want [-12, 12)", ha)
			}
			if k := number(t, m, "moon_illum"); !(k >= 0 && k <= 1) {
				t.Errorf("moon_illum = %v: want [0, 1]", k)
			}
			if refr < alt {
				t.Errorf("alt_refracted_deg %v below alt_deg %v: refraction lifts", refr, alt)
			}
			if tc.airmassNil != (m["airmass"] == nil) {
				t.Errorf("airmass = %v at refracted altitude %v: want null exactly when below 0", m["airmass"], refr)
			}
			if refr > 30 {
				x := number(t, m, "airmass")
				sec := 1 / math.Sin(refr*math.Pi/180)
				if d := (x - sec) / sec; math.Abs(d) > airmassSecantTol {
					t.Errorf("airmass %v vs sec z %v: relative diff %.3g, tol %.3g (methods.md §4)", x, sec, d, airmassSecantTol)
				}
			}
			raw, present := m["warnings"]
			if len(tc.warnings) == 0 {
				if present {
					t.Errorf("warnings = %v: want the field omitted", raw)
				}
				return
			}
			list, _ := raw.([]any)
			if len(list) != len(tc.warnings) {
				t.Fatalf("warnings = %v: want %d, containing %q", raw, len(tc.warnings), tc.warnings)
			}
			for i, want := range tc.warnings {
				if s, _ := list[i].(string); !strings.Contains(s, want) {
					t.Errorf("warning %d = %q: want it to contain %q", i, s, want)
				}
			}
		})
	}
}

// TestSkyFlagForms checks that -flag and --flag=value spell the same
// command, and that --site demo is the demo site's coordinates.
func TestSkyFlagForms(t *testing.T) {
	want := vigil(deltaCep...)
	for _, args := range [][]string{
		{"sky", "-lat", "50", "-lon", "10", "-ra", "22:29:10.26502", "-dec", "+58:24:54.7139", "-at", "2024-12-21T20:00:00Z", "-json"},
		{"sky", "--lat=50", "--lon=10", "--ra=22h29m10.26502s", "--dec=58d24m54.7139s", "--at=2024-12-21T21:00:00+01:00", "--json"},
	} {
		got := vigil(args...)
		if got.code != 0 {
			t.Errorf("vigil %s: exit %d, stderr %q", strings.Join(args, " "), got.code, got.stderr)
			continue
		}
		for _, d := range diffJSONText(t, got.stdout, want.stdout) {
			t.Errorf("vigil %s: %s", strings.Join(args, " "), d)
		}
	}
	// A Julian date on the UTC scale is read as such.
	if m := mustJSON(t, "sky", "--lat", "50", "--lon", "10", "--ra", "1", "--dec", "1", "--at", "JD2461375.625", "--json"); m["utc"] != "2026-12-01T03:00:00Z" || m["jd_utc"] != 2461375.625 {
		t.Errorf("--at JD2461375.625: utc %v, jd_utc %v; want 2026-12-01T03:00:00Z (spec/cli.md), 2461375.625", m["utc"], m["jd_utc"])
	}
	demo := vigil("sky", "--site", "demo", "--ra", "5.5", "--dec", "-5", "--at", "2026-12-01T22:00:00Z", "--json")
	byCoords := vigil("sky", "--lat", "52.1172", "--lon", "-1.4538", "--elev", "140", "--ra", "5.5", "--dec", "-5", "--at", "2026-12-01T22:00:00Z", "--json")
	if demo.code != 0 || byCoords.code != 0 {
		t.Fatalf("--site demo: exit %d %q; by coordinates: exit %d %q", demo.code, demo.stderr, byCoords.code, byCoords.stderr)
	}
	for _, d := range diffJSONText(t, demo.stdout, byCoords.stdout) {
		t.Errorf("--site demo vs --lat 52.1172 --lon -1.4538 --elev 140: %s", d)
	}
}

func TestSkyGolden(t *testing.T) {
	for _, tc := range []struct {
		name string
		args []string
	}{
		{"sky_delta_cep", deltaCep},
		{"sky_below_horizon", []string{"sky", "--lat", "19.82", "--lon", "-155.47", "--elev", "4200", "--ra", "12:00:00", "--dec", "-60:00:00", "--at", "2026-03-03T08:00:00Z", "--json"}},
		{"sky_near_sun", []string{"sky", "--lat", "40", "--lon", "15", "--elev", "300", "--ra", "4.3760", "--dec", "+20.004", "--at", "2025-05-20T11:00:00Z", "--json"}},
		{"sky_demo_site", []string{"sky", "--site", "Ashgrove Hill Observatory (demo)", "--ra", "05:55:10.3", "--dec", "+07:24:25", "--at", "2025-12-01T22:00:00Z", "--json"}},
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

func TestSkyTable(t *testing.T) {
	args := deltaCep[:len(deltaCep)-1] // without --json
	r := vigil(args...)
	if r.code != 0 || r.stderr != "" {
		t.Fatalf("exit %d, stderr %q", r.code, r.stderr)
	}
	for _, want := range []string{"RA 22:29:10.27, Dec +58:24:54.7", "10.0000° E", "2024-12-21 20:00:00 UTC",
		"Altitude (airless)", "53.50", "308.35", "HJD_UTC", "BJD_TDB", "Airmass", "Moon"} {
		if !strings.Contains(r.stdout, want) {
			t.Errorf("table lacks %q:\n%s", want, r.stdout)
		}
	}
	// A Julian date on the UTC scale is read as such.
	if m := mustJSON(t, "sky", "--lat", "50", "--lon", "10", "--ra", "1", "--dec", "1", "--at", "JD2461375.625", "--json"); m["utc"] != "2026-12-01T03:00:00Z" || m["jd_utc"] != 2461375.625 {
		t.Errorf("--at JD2461375.625: utc %v, jd_utc %v; want 2026-12-01T03:00:00Z (spec/cli.md), 2461375.625", m["utc"], m["jd_utc"])
	}
	demo := vigil("sky", "--site", "demo", "--ra", "5.5", "--dec", "-5", "--at", "2150-07-01T22:00:00Z")
	for _, want := range []string{"Ashgrove Hill Observatory (demo)", "1.4538° W", "2150-07-01 22:00:00 UTC = Wed 01 Jul 23:00:00 BST", "Caution: the leap-second table"} {
		if !strings.Contains(demo.stdout, want) {
			t.Errorf("demo-site table lacks %q:\n%s", want, demo.stdout)
		}
	}
}

// diffJSONText compares two JSON texts as compareGolden does.
func diffJSONText(t *testing.T, got, want string) []string {
	t.Helper()
	var g, w any
	if err := jsonUnmarshal(got, &g); err != nil {
		t.Fatalf("got is not JSON: %v", err)
	}
	if err := jsonUnmarshal(want, &w); err != nil {
		t.Fatalf("want is not JSON: %v", err)
	}
	return diffJSON("", g, w)
}
