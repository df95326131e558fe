package report

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata")

// TestWriteTextGolden compares the text log of fixed nights with the files
// in testdata (refresh with go test ./app/report -update, then read the
// diff). Their numbers come from observe and ephem, which are checked
// against astropy in their own packages; what this pins is the layout.
func TestWriteTextGolden(t *testing.T) {
	cases := []struct {
		name, golden string
		fx           fixture
	}{
		{"every event, measured", "hilltop_2024-12-21.txt", hilltop},
		{"midnight sun, no events", "fjord_2025-06-21.txt", fjord},
		{"no darkness, no targets", "moor_2025-06-21.txt", moor},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			var buf bytes.Buffer
			if err := tc.fx.build(t).WriteText(&buf); err != nil {
				t.Fatalf("WriteText: %v", err)
			}
			path := filepath.Join("testdata", tc.golden)
			if *update {
				if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
					t.Fatal(err)
				}
			}
			want, err := os.ReadFile(path)
			if err != nil {
				t.Fatalf("golden file: %v (run with -update to make it)", err)
			}
			if got := buf.String(); got != string(want) {
				g, w := strings.Split(got, "\n"), strings.Split(string(want), "\n")
				for i := 0; i < max(len(g), len(w)); i++ {
					gl, wl := "<none>", "<none>"
					if i < len(g) {
						gl = g[i]
					}
					if i < len(w) {
						wl = w[i]
					}
					if gl != wl {
						t.Errorf("%s line %d:\n got %q\nwant %q", path, i+1, gl, wl)
						break
					}
				}
			}
		})
	}
}

// printRounding is how far a printed clock time may be from the exact
// instant: half a minute of rounding, plus the few seconds by which ephem's
// Sun agrees with astropy (ephem's tests).
const printRounding = 30*time.Second + 5*time.Second

// TestTwilightsAgainstAstropy reads the twilight table of the printed log
// and compares it with astropy's Sun events quoted in the methods sheet
// (§5: φ = +50°, λ = +10° E, 2024-12-21, astropy 5.2.1).
func TestTwilightsAgainstAstropy(t *testing.T) {
	var buf bytes.Buffer
	if err := hilltop.build(t).WriteText(&buf); err != nil {
		t.Fatal(err)
	}
	text := buf.String()
	cases := []struct {
		row, utc, source string
	}{
		{"sunset (Sun −0.83°)", "15:20:27", "methods sheet §5, astropy"},
		{"civil dusk (−6°)", "15:58:59", "methods sheet §5, astropy"},
		{"nautical dusk (−12°)", "16:40:35", "methods sheet §5, astropy"},
		{"astronomical dusk (−18°)", "17:20:04", "methods sheet §5, astropy"},
	}
	for _, tc := range cases {
		re := regexp.MustCompile(`(?m)^  ` + regexp.QuoteMeta(tc.row) + ` +(\d\d:\d\d) +(\d\d:\d\d)$`)
		m := re.FindStringSubmatch(text)
		if m == nil {
			t.Errorf("%s: no such row in the twilight table", tc.row)
			continue
		}
		local, _ := time.Parse("15:04", m[1])
		utc, _ := time.Parse("15:04", m[2])
		want, _ := time.Parse("15:04:05", tc.utc)
		if d := utc.Sub(want); d < -printRounding || d > printRounding {
			t.Errorf("%s: printed %s UTC, want %s (%s): diff %v, tol %v", tc.row, m[2], tc.utc, tc.source, d, printRounding)
		}
		// Europe/Berlin keeps CET, UTC+1, in December (IANA tz database).
		if d := local.Sub(utc); d != time.Hour {
			t.Errorf("%s: local %s vs UTC %s: differ by %v, want 1h (CET)", tc.row, m[1], m[2], d)
		}
	}
}

// TestEmptyNights checks what a night without darkness or without events
// says instead of its tables.
func TestEmptyNights(t *testing.T) {
	cases := []struct {
		name string
		fx   fixture
		want []string
	}{
		{"midnight sun", fjord, []string{
			"midnight sun): no astronomical darkness tonight.",
			"No planned extrema tonight.",
			"No measurements recorded.",
			"No timings recorded.",
		}},
		{"Sun stays above −12°", moor, []string{
			"No astronomical darkness tonight: the Sun stays above −18°.",
			"  astronomical dusk (−18°)          —        —",
			"No planned extrema tonight.",
			"  longitude        −3.2000° (EAST +)",
		}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			var buf bytes.Buffer
			if err := tc.fx.build(t).WriteText(&buf); err != nil {
				t.Fatalf("WriteText: %v", err)
			}
			for _, w := range tc.want {
				if !strings.Contains(buf.String(), w) {
					t.Errorf("the text log lacks %q", w)
				}
			}
			if strings.Contains(buf.String(), "Notes at the eyepiece\n") && strings.Count(buf.String(), "time (local)") != 1 {
				t.Errorf("forms: got %d, want only the whole night's", strings.Count(buf.String(), "time (local)"))
			}
		})
	}
}

// TestClockAcrossDSTChange prints a night in which Europe/Berlin goes back
// from CEST to CET (the last Sunday of October at 01:00 UTC, EU Directive
// 2000/84/EC): every local time then carries its zone's name.
func TestClockAcrossDSTChange(t *testing.T) {
	fx := hilltop
	fx.date, fx.measured = date(2025, 10, 25), false
	var buf bytes.Buffer
	if err := fx.build(t).WriteText(&buf); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		row    string
		offset time.Duration
	}{
		{"sunset (Sun −0.83°)", 2 * time.Hour}, // before the change: CEST
		{"sunrise (−0.83°)", time.Hour},        // after it: CET
	}
	if !strings.Contains(buf.String(), "local CEST/CET") {
		t.Errorf("no column head naming both zones, %q", "local CEST/CET")
	}
	for _, tc := range cases {
		re := regexp.MustCompile(`(?m)^  ` + regexp.QuoteMeta(tc.row) + ` +(\d\d:\d\d) (CES?T) +(\d\d:\d\d)$`)
		m := re.FindStringSubmatch(buf.String())
		if m == nil {
			t.Errorf("%s: no row with a local time and its zone", tc.row)
			continue
		}
		local, _ := time.Parse("15:04", m[1])
		utc, _ := time.Parse("15:04", m[3])
		if d := local.Sub(utc); d != tc.offset {
			t.Errorf("%s: local %s %s vs UTC %s: differ by %v, want %v", tc.row, m[1], m[2], m[3], d, tc.offset)
		}
	}
}
