package observe

import (
	"bytes"
	"errors"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"example.org/vigil/internal/table"
)

func TestReadTargetsExample(t *testing.T) {
	ts, err := ReadTargetsCSVFile("testdata/targets_example.csv")
	if err != nil {
		t.Fatal(err)
	}
	if len(ts) != 4 {
		t.Fatalf("got %d targets, want 4", len(ts))
	}
	// Values as written in testdata/targets_example.csv.
	a := ts[0]
	if a.Name != "Alder Var" || a.Star.RAHours != 5.5 || a.Star.DecDeg != 30 || a.Kind != Max || a.Class != Pulsating {
		t.Errorf("Alder Var read as %+v", a)
	}
	if len(a.Comps) != 2 || a.Comps[1].ID != "C2" || a.Comps[1].V != 11.003 || a.Comps[1].BV != 0.61 || len(a.Checks) != 1 {
		t.Errorf("Alder Var comps %+v checks %+v", a.Comps, a.Checks)
	}
	if c := ts[1]; c.Kind != Min || !c.Secondary || !math.IsNaN(c.Comps[0].BV) || c.LastTimingJD != 0 {
		t.Errorf("Cedar Ecl read as %+v", c)
	}
	if f := ts[2]; f.Kind != Max || f.Star.PMRA != 4000 || f.Notes != "fast proper motion, invented" {
		t.Errorf("Fir Fast read as %+v", f)
	}
	if e := ts[3]; e.Ephemeris.Q != 2e-9 || !math.IsNaN(e.MagBright) || e.Comps[0].BV != -0.05 {
		t.Errorf("Elm Quad read as %+v", e)
	}
}

// TestTargetsCSVRoundTrip: export, import, export again gives the same
// bytes and the same targets.
func TestTargetsCSVRoundTrip(t *testing.T) {
	ts, err := ReadTargetsCSVFile("testdata/targets_example.csv")
	if err != nil {
		t.Fatal(err)
	}
	ts = append(ts, benchCatalogue(50)...)
	for i := range ts[4:] {
		ts[4+i].Name = "Bench " + string(rune('A'+i%26)) + string(rune('a'+i/26))
	}
	var b1, b2 bytes.Buffer
	if err := WriteTargetsCSV(&b1, ts); err != nil {
		t.Fatal(err)
	}
	back, err := ReadTargetsCSV(bytes.NewReader(b1.Bytes()), "export.csv")
	if err != nil {
		t.Fatal(err)
	}
	if err := WriteTargetsCSV(&b2, back); err != nil {
		t.Fatal(err)
	}
	if b1.String() != b2.String() {
		t.Errorf("second export differs from the first:\n%s\n---\n%s", b1.String(), b2.String())
	}
	for i := range ts {
		if !sameTarget(ts[i], back[i]) {
			t.Errorf("target %d: got %+v want %+v", i, back[i], ts[i])
		}
	}
	// Through a file, written whole.
	path := filepath.Join(t.TempDir(), "cat.csv")
	if err := WriteTargetsCSVFile(path, ts); err != nil {
		t.Fatal(err)
	}
	data, _ := os.ReadFile(path)
	if string(data) != b1.String() {
		t.Errorf("file export differs from the stream export")
	}
}

// sameTarget compares two targets, NaN equal to NaN.
func sameTarget(a, b Target) bool {
	nan := func(x, y float64) bool { return x == y || (math.IsNaN(x) && math.IsNaN(y)) }
	if !nan(a.MagBright, b.MagBright) || !nan(a.MagFaint, b.MagFaint) || len(a.Comps) != len(b.Comps) || len(a.Checks) != len(b.Checks) {
		return false
	}
	for i := range a.Comps {
		if a.Comps[i].ID != b.Comps[i].ID || a.Comps[i].V != b.Comps[i].V || !nan(a.Comps[i].BV, b.Comps[i].BV) {
			return false
		}
	}
	for i := range a.Checks {
		if a.Checks[i].ID != b.Checks[i].ID || a.Checks[i].V != b.Checks[i].V || !nan(a.Checks[i].BV, b.Checks[i].BV) {
			return false
		}
	}
	a.MagBright, a.MagFaint, b.MagBright, b.MagFaint = 0, 0, 0, 0
	a.Comps, a.Checks, b.Comps, b.Checks = nil, nil, nil, nil
	return reflect.DeepEqual(a, b)
}

func TestReadTargetsCSVBad(t *testing.T) {
	const head = "name,ra,dec,epoch,period,class,kind,timescale,comps,secondary\n"
	for _, tc := range []struct {
		name, in  string
		line, col int
		want      string
	}{
		{"period zero", head + "A,1,2,2460000.5,0,,,,,\n", 2, 17, "period 0"},
		{"period negative", head + "A,1,2,2460000.5,-1.5,,,,,\n", 2, 17, "period -1.5"},
		{"unknown class", head + "A,1,2,2460000.5,1,mira,,,,\n", 2, 19, `class "mira"`},
		{"unknown kind", head + "A,1,2,2460000.5,1,,peak,,,\n", 2, 20, `kind "peak"`},
		{"bad timescale", head + "A,1,2,2460000.5,1,,,tai,,\n", 2, 21, `time scale "tai"`},
		{"ra out of range", head + "A,25,2,2460000.5,1,,,,,\n", 2, 3, `"25"`},
		{"dec not a number", head + "A,1,north,2460000.5,1,,,,,\n", 2, 5, `"north"`},
		{"empty epoch", head + "A,1,2,,1,,,,,\n", 2, 7, "missing"},
		{"short epoch", head + "A,1,2,60000.5,1,,,,,\n", 2, 7, "full Julian date"},
		{"bad comp", head + "A,1,2,2460000.5,1,,,,C1:11.2,\n", 2, 22, `"C1:11.2"`},
		{"bad comp V", head + "A,1,2,2460000.5,1,,,,C1=bright,\n", 2, 22, `"bright"`},
		{"bad secondary", head + "A,1,2,2460000.5,1,,,,,maybe\n", 2, 23, `"maybe"`},
		{"duplicate", head + "A,1,2,2460000.5,1,,,,,\nA,1,2,2460000.5,1,,,,,\n", 3, 1, "repeats"},
		{"no name", head + ",1,2,2460000.5,1,,,,,\n", 2, 1, "name"},
		{"missing column", "name,ra,dec,epoch\nA,1,2,2460000.5\n", 1, 0, `column "period"`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			ts, err := ReadTargetsCSV(strings.NewReader(tc.in), "cat.csv")
			if err == nil {
				t.Fatalf("got %d targets and no error, want an error with %q", len(ts), tc.want)
			}
			var te *table.Error
			if !errors.As(err, &te) || te.File != "cat.csv" || te.Line != tc.line || te.Column != tc.col {
				t.Errorf("error %q: want cat.csv line %d column %d", err, tc.line, tc.col)
			}
			if !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %q does not mention %q", err, tc.want)
			}
			if ts != nil {
				t.Errorf("a refused import returned %d targets", len(ts))
			}
		})
	}
}

// TestFindTarget checks the lookup of a target by name: exact first, then
// the one equal ignoring case, and ambiguity and absence.
func TestFindTarget(t *testing.T) {
	ts := []Target{{Name: "Alder Var"}, {Name: "Cedar Ecl"}, {Name: "cedar ecl"}, {Name: "Fir Fast"}}
	for _, tc := range []struct {
		name string
		want int
	}{
		{"Alder Var", 0},
		{"alder var", 0},
		{"cedar ecl", 2}, // exact wins over a case-folded match
		{"CEDAR ECL", -2},
		{"Elm", -1},
	} {
		if got := FindTarget(ts, tc.name); got != tc.want {
			t.Errorf("FindTarget(%q) = %d, want %d", tc.name, got, tc.want)
		}
	}
}
