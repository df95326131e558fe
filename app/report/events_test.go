package report

import (
	"bytes"
	"encoding/csv"
	"math"
	"os"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"
)

// astropyEvents is observe's table of predicted extrema made with astropy
// (its header names the script, the version and the settings).
const astropyEvents = "../../observe/testdata/predict/events.csv"

// printDeg is how far a printed whole degree may be from the exact value:
// half a degree of rounding plus observe's agreement with astropy (well
// under an arcminute).
const printDeg = 0.5 + 0.02

// TestEventsAgainstAstropy prints the log of the night of 2025-08-13 at
// φ = +50°, λ = +10° E, 300 m and compares the rows of "Alder Var" in its
// table of planned extrema with astropy's instant, altitude and azimuth of
// the same extrema.
func TestEventsAgainstAstropy(t *testing.T) {
	fx := hilltop
	fx.date, fx.measured = date(2025, 8, 13), false
	l := fx.build(t)
	var buf bytes.Buffer
	if err := l.WriteText(&buf); err != nil {
		t.Fatal(err)
	}
	rows := eventRows(buf.String())

	want := readAstropy(t, "Alder Var", l.Night.Start.Time(), l.Night.End.Time())
	if len(want) < 2 {
		t.Fatalf("astropy table: %d events of Alder Var in the night, want at least 2", len(want))
	}
	got := rows["Alder Var"]
	if len(got) != len(want) {
		t.Fatalf("printed %d events of Alder Var, astropy has %d in the night", len(got), len(want))
	}
	for i, w := range want {
		g := got[i]
		utc, _ := time.Parse("15:04", g[4])
		exact := w.utc.Sub(w.utc.Truncate(24 * time.Hour))
		printed := utc.Sub(utc.Truncate(24 * time.Hour))
		if d := printed - exact; d < -printRounding || d > printRounding {
			t.Errorf("event %s: printed %s UTC, astropy %s: diff %v, tol %v", g[0], g[4], w.utc.Format(time.TimeOnly), d, printRounding)
		}
		for _, q := range []struct {
			name  string
			cell  string
			exact float64
		}{{"alt", g[6], w.alt}, {"az", g[7], w.az}} {
			v, err := strconv.ParseFloat(strings.Replace(q.cell, "−", "-", 1), 64)
			if err != nil {
				t.Errorf("event %s: %s cell %q: %v", g[0], q.name, q.cell, err)
				continue
			}
			if d := v - q.exact; math.Abs(d) > printDeg {
				t.Errorf("event %s: printed %s %s°, astropy %.4f°: diff %.3f°, tol %.2f°", g[0], q.name, q.cell, q.exact, d, printDeg)
			}
		}
	}
}

// eventRows splits the text log's table of planned extrema into cells (two
// or more spaces apart), by target.
func eventRows(text string) map[string][][]string {
	out := map[string][][]string{}
	in := false
	sep := regexp.MustCompile(` {2,}`)
	for _, line := range strings.Split(text, "\n") {
		switch {
		case strings.HasPrefix(line, "   #  target"):
			in = true
		case in && line == "":
			return out
		case in && strings.HasPrefix(strings.TrimSpace(line), "--"), in && strings.HasPrefix(strings.TrimSpace(line), "("):
		case in:
			cells := sep.Split(strings.TrimSpace(line), -1)
			out[cells[1]] = append(out[cells[1]], cells)
		}
	}
	return out
}

type astropyEvent struct {
	utc     time.Time
	alt, az float64
}

// readAstropy returns astropy's events of the named star at φ = +50°,
// λ = +10° E seen in [from, to).
func readAstropy(t *testing.T, name string, from, to time.Time) []astropyEvent {
	f, err := os.Open(astropyEvents)
	if err != nil {
		t.Fatalf("astropy table: %v", err)
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.Comment = '#'
	recs, err := r.ReadAll()
	if err != nil {
		t.Fatalf("astropy table: %v", err)
	}
	col := map[string]int{}
	for i, h := range recs[0] {
		col[h] = i
	}
	var out []astropyEvent
	for _, rec := range recs[1:] {
		if rec[col["name"]] != name || rec[col["lat_deg"]] != "50.0" || rec[col["lon_deg"]] != "10.0" {
			continue
		}
		utc, err1 := time.Parse(time.RFC3339Nano, rec[col["utc_iso"]])
		alt, err2 := strconv.ParseFloat(rec[col["alt_deg"]], 64)
		az, err3 := strconv.ParseFloat(rec[col["az_deg"]], 64)
		if err1 != nil || err2 != nil || err3 != nil {
			t.Fatalf("astropy table: row %v: %v %v %v", rec, err1, err2, err3)
		}
		if !utc.Before(from) && utc.Before(to) {
			out = append(out, astropyEvent{utc, alt, az})
		}
	}
	return out
}
