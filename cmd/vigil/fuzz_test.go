package main

import (
	"encoding/json"
	"strings"
	"testing"
)

// checkOutcome checks the contract for any command line: success prints one
// JSON object and nothing on stderr; failure exits 2 with one stderr line and
// nothing on stdout. A panic fails the fuzzer by itself.
func checkOutcome(t *testing.T, args []string, r result) {
	t.Helper()
	switch r.code {
	case exitOK:
		var m map[string]any
		if err := json.Unmarshal([]byte(r.stdout), &m); err != nil || r.stderr != "" {
			t.Errorf("vigil %q: exit 0 with stdout %q (%v), stderr %q", args, r.stdout, err, r.stderr)
		}
	case exitUsage:
		if r.stdout != "" || strings.Count(r.stderr, "\n") != 1 || !strings.HasSuffix(r.stderr, "\n") {
			t.Errorf("vigil %q: exit 2 with stdout %q, stderr %q: want nothing and one line", args, r.stdout, r.stderr)
		}
	default:
		t.Errorf("vigil %q: exit %d, want 0 or 2", args, r.code)
	}
}

func FuzzSky(f *testing.F) {
	f.Add("50", "10", "22:29:10.26502", "+58:24:54.7139", "2024-12-21T20:00:00Z")
	f.Add("-90", "180", "0", "-90", "JD2312752.5")
	f.Add("90", "-180", "23:59:59.999", "90", "2199-12-31T23:59:59Z")
	f.Add("52:07:01.9", "-1 27 13.7", "5h30m", "-5°23′28″", "MJD61375.125")
	f.Fuzz(func(t *testing.T, lat, lon, ra, dec, at string) {
		args := []string{"sky", "--lat=" + lat, "--lon=" + lon, "--ra=" + ra, "--dec=" + dec, "--at=" + at, "--json"}
		checkOutcome(t, args, vigil(args...))
	})
}

func FuzzNight(f *testing.F) {
	f.Add("51.4779", "-0.0015", "2024-03-20")
	f.Add("-90", "180", "1620-01-01")
	f.Add("90", "-179.9", "2199-12-29")
	f.Add("78.2", "15.6", "2025-06-21")
	f.Fuzz(func(t *testing.T, lat, lon, date string) {
		args := []string{"night", "--lat=" + lat, "--lon=" + lon, "--date=" + date, "--json"}
		checkOutcome(t, args, vigil(args...))
	})
}
