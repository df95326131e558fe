package main

import (
	"io"
	"strings"
	"testing"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/demo"
)

// TestBadInput checks the contract for bad input (spec/cli.md,
// "Conventions"): exit status 2, exactly one line on stderr naming the flag
// at fault (and quoting the value, where there is one), nothing on stdout.
func TestBadInput(t *testing.T) {
	// sky returns a good vigil sky command line with the flags in extra
	// replaced ("-" drops one) or added; an odd last element is appended
	// as it is.
	sky := func(extra ...string) []string {
		names := []string{"--lat", "--lon", "--ra", "--dec", "--at"}
		vals := map[string]string{"--lat": "50", "--lon": "10", "--ra": "22.5", "--dec": "58", "--at": "2024-12-21T20:00:00Z"}
		for i := 0; i+1 < len(extra); i += 2 {
			if _, ok := vals[extra[i]]; !ok {
				names = append(names, extra[i])
			}
			vals[extra[i]] = extra[i+1]
		}
		out := []string{"sky", "--json"}
		for _, k := range names {
			if v := vals[k]; v != "-" {
				out = append(out, k, v)
			}
		}
		if len(extra)%2 == 1 {
			out = append(out, extra[len(extra)-1])
		}
		return out
	}
	night := func(extra ...string) []string {
		return append([]string{"night", "--lat", "50", "--lon", "10", "--json"}, extra...)
	}
	for _, tc := range []struct {
		name string
		args []string
		want []string // substrings of the one stderr line
	}{
		{"latitude 95", sky("--lat", "95"), []string{"vigil sky: ", "--lat", `"95"`, "[-90, 90]"}},
		{"longitude 400", sky("--lon", "400"), []string{"--lon", `"400"`, "east positive"}},
		{"malformed sexagesimal Dec", sky("--dec", "12:70:00"), []string{"--dec", `"12:70:00"`, "below 60"}},
		{"malformed sexagesimal RA", sky("--ra", "5:3x:00"), []string{"--ra", `"5:3x:00"`}},
		{"RA 24", sky("--ra", "24"), []string{"--ra", `"24"`, "[0, 24)"}},
		{"RA 25:00:00", sky("--ra", "25:00:00"), []string{"flag --ra: ephem: right ascension \"25:00:00\": hours must be in [0, 24)"}},
		{"Dec 91", sky("--dec", "91"), []string{"--dec", `"91"`}},
		{"unknown flag", sky("--timescale"), []string{"--timescale", "unknown flag"}},
		{"unknown flag, one dash", sky("-frobnicate"), []string{"--frobnicate", "unknown flag"}},
		{"missing required --ra", sky("--ra", "-"), []string{"--ra", "missing", "required"}},
		{"missing required --lat", sky("--lat", "-"), []string{"--lat", "missing", "--site"}},
		{"missing required --lon", []string{"night", "--lat", "50"}, []string{"--lon", "missing"}},
		{"missing required --at", sky("--at", "-"), []string{"--at", "missing", "required"}},
		{"missing required --date", []string{"night", "--lat", "50", "--lon", "10"}, []string{"--date", "missing", "required"}},
		{"instant before the supported range", sky("--at", "1500-01-01T00:00:00Z"), []string{"--at", `"1500-01-01T00:00:00Z"`, "supported range"}},
		{"instant after the supported range", sky("--at", "JD2600000"), []string{"--at", `"JD2600000"`, "supported range"}},
		{"--at JDabc", sky("--at", "JDabc"), []string{"--at", `"JDabc"`, "not a number"}},
		{"--at not an instant", sky("--at", "yesterday"), []string{"--at", `"yesterday"`, "ISO 8601"}},
		{"--at without a value", sky("--at"), []string{"--at", "needs INSTANT"}},
		{"no such date", night("--date", "2024-02-30"), []string{"vigil night: ", "--date", `"2024-02-30"`, "no such day"}},
		{"malformed date", night("--date", "2024/02/03"), []string{"vigil night: ", "--date", `"2024/02/03"`, "YYYY-MM-DD"}},
		{"date with a time", night("--date", "2024-03-20T20:00:00Z"), []string{"--date", `"2024-03-20T20:00:00Z"`}},
		{"date out of range", night("--date", "2200-01-01"), []string{"--date", `"2200-01-01"`, "supported range"}},
		{"elevation not a number", sky("--elev", "high"), []string{"--elev", `"high"`, "metres"}},
		{"elevation too high", sky("--elev", "12000"), []string{"--elev", "12000", "metres"}},
		{"switch with a bad value", sky("--json=maybe"), []string{"--json", `"maybe"`}},
		{"stray argument", sky("tonight"), []string{`unexpected argument "tonight"`}},
		{"unknown site", []string{"night", "--site", "Ridge Top", "--json"}, []string{"--site", `"Ridge Top"`, "logbook", "Ashgrove Hill Observatory (demo)"}},
		{"site and coordinates", []string{"night", "--site", "demo", "--lat", "50", "--json"}, []string{"--site", "--lat", "not both"}},
		{"bad flag syntax", sky("---lat"), []string{"---lat", "syntax"}},
		{"unknown command", []string{"skyy", "--lat", "50"}, []string{"vigil: ", `"skyy"`, "sky, night"}},
		{"unknown top-level flag", []string{"--frob"}, []string{`"--frob"`, "sky, night"}},
		{"help for an unknown command", []string{"help", "frob"}, []string{`"frob"`, "sky, night"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			wantFailure(t, tc.args, vigil(tc.args...), tc.want...)
		})
	}
}

// TestHelp checks that --help on every command lists every flag with its
// unit and default, on stdout, with exit status 0.
func TestHelp(t *testing.T) {
	siteFlags := []string{"--lat DEG", "--lon DEG", "EAST positive", "--elev METRES", "metres", "(default 0)", "--site NAME", "--json", "--help"}
	for _, tc := range []struct {
		name string
		args []string
		want []string
	}{
		{"sky --help", []string{"sky", "--help"}, append([]string{"Usage:\n  vigil sky", "--ra HOURS", "right ascension in hours", "--dec DEG", "declination in degrees", "--at INSTANT", "JD2461375.625", "or now", "(required)", "airless"}, siteFlags...)},
		{"sky -h", []string{"sky", "-h"}, []string{"--ra HOURS"}},
		{"sky -help among other flags", []string{"sky", "--lat", "50", "-help"}, []string{"--ra HOURS"}},
		{"help sky", []string{"help", "sky"}, []string{"--ra HOURS", "--at INSTANT"}},
		{"night --help", []string{"night", "--help"}, append([]string{"Usage:\n  vigil night", "--date YYYY-MM-DD", "or tonight", "(required)", "local mean noon", "-0.8333", "+0.125"}, siteFlags...)},
		{"help night", []string{"help", "night"}, []string{"--date YYYY-MM-DD"}},
		{"help", []string{"help"}, []string{"Commands:", "sky ", "night ", "EAST positive", "JD2461375.625"}},
		{"--help", []string{"--help"}, []string{"Commands:", "sky ", "night "}},
		{"-h", []string{"-h"}, []string{"Commands:"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r := vigil(tc.args...)
			if r.code != exitOK || r.stderr != "" {
				t.Fatalf("exit %d, stderr %q; want 0 and nothing", r.code, r.stderr)
			}
			for _, want := range tc.want {
				if !strings.Contains(r.stdout, want) {
					t.Errorf("help lacks %q:\n%s", want, r.stdout)
				}
			}
		})
	}
	// Every subcommand has a help that names every one of its flags.
	for _, c := range commands {
		r := vigil(c.name, "--help")
		if r.code != exitOK || !strings.Contains(r.stdout, "Flags:") {
			t.Errorf("vigil %s --help: exit %d, output %q", c.name, r.code, r.stdout)
		}
	}
}

// TestTonightDate checks which night "tonight" is: the local date, or the
// day before until local noon. Local is civil time when the zone is known
// (the demo site: GMT in winter, BST = UTC+1 in summer), else local mean time
// UTC + longitude/15 h.
func TestTonightDate(t *testing.T) {
	demo := demoObserver()
	east := observer{site: siteAt(t, 50, 150)}
	for _, tc := range []struct {
		name string
		obs  observer
		now  string
		want string
	}{
		{"demo, winter evening", demo, "2026-12-01T17:27:00Z", "2026-12-01"},
		{"demo, winter small hours", demo, "2026-12-02T03:00:00Z", "2026-12-01"},
		{"demo, winter 11:59 GMT", demo, "2026-12-02T11:59:00Z", "2026-12-01"},
		{"demo, winter 12:00 GMT", demo, "2026-12-02T12:00:00Z", "2026-12-02"},
		{"demo, summer 11:30 UTC is 12:30 BST", demo, "2026-07-01T11:30:00Z", "2026-07-01"},
		{"demo, summer 10:30 UTC is 11:30 BST", demo, "2026-07-01T10:30:00Z", "2026-06-30"},
		{"150° E, 01:00 UTC is 11:00 local mean time", east, "2025-01-10T01:00:00Z", "2025-01-09"},
		{"150° E, 03:00 UTC is 13:00 local mean time", east, "2025-01-10T03:00:00Z", "2025-01-10"},
		{"150° E, 23:00 UTC is 09:00 next day", east, "2025-01-10T23:00:00Z", "2025-01-10"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			now, err := time.Parse(time.RFC3339, tc.now)
			if err != nil {
				t.Fatal(err)
			}
			if got := tonightDate(now, tc.obs).Format(time.DateOnly); got != tc.want {
				t.Errorf("tonightDate(%s) = %s, want %s", tc.now, got, tc.want)
			}
		})
	}
}

// TestTonight checks what `vigil tonight` prints: tonight's events at the
// demo site in local time and UTC, the same as vigil night reports.
func TestTonight(t *testing.T) {
	withClock(t, time.Date(2026, 7, 1, 21, 0, 0, 0, time.UTC))
	r := vigil("tonight")
	if r.code != exitOK || r.stderr != "" {
		t.Fatalf("exit %d, stderr %q", r.code, r.stderr)
	}
	m := mustJSON(t, "night", "--site", demo.SiteName, "--date", "2026-07-01", "--json")
	sunset, ok := instant(t, m, "sunset")
	if !ok {
		t.Fatal("no sunset at the demo site on 2026-07-01")
	}
	for _, want := range []string{
		"Tonight at Ashgrove Hill Observatory (demo)", "1.4538° W", "Night of Wednesday 1 July 2026", "Europe/London",
		sunset.Round(time.Second).Format("2006-01-02 15:04:05") + " UTC",
		sunset.Round(time.Second).Add(time.Hour).Format("15:04:05") + " BST", // BST = UTC + 1 h in July
		"Now, Wed 01 Jul 22:00:00 BST", "Moon at", "vigil help",
	} {
		if !strings.Contains(r.stdout, want) {
			t.Errorf("output lacks %q:\n%s", want, r.stdout)
		}
	}
}

// TestNoArgumentsOpensWindow checks that `vigil` alone, and `vigil --logbook
// PATH`, open the window (replaced here: tests have no display) on the
// default logbook and on PATH, and print nothing themselves.
func TestNoArgumentsOpensWindow(t *testing.T) {
	var opened []string
	saved := openWindow
	openWindow = func(path string, stderr io.Writer) int { opened = append(opened, path); return exitOK }
	t.Cleanup(func() { openWindow = saved })
	for _, tc := range []struct {
		args []string
		want string
	}{
		{nil, ""},
		{[]string{"--logbook", "/tmp/x.db"}, "/tmp/x.db"},
		{[]string{"--logbook=/tmp/y.db"}, "/tmp/y.db"},
	} {
		opened = nil
		r := vigil(tc.args...)
		if r.code != exitOK || r.stdout != "" || r.stderr != "" {
			t.Errorf("vigil %v: exit %d, stdout %q, stderr %q", tc.args, r.code, r.stdout, r.stderr)
		}
		if len(opened) != 1 || opened[0] != tc.want {
			t.Errorf("vigil %v opened the window on %q, want once on %q", tc.args, opened, tc.want)
		}
	}
}

func siteAt(t *testing.T, lat, lon float64) ephem.Site {
	t.Helper()
	s, err := ephem.NewSite("", lat, lon, 0)
	if err != nil {
		t.Fatal(err)
	}
	return s
}
