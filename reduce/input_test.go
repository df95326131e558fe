package reduce

import (
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/table"
)

// writeTemp writes content to a file in a fresh temporary directory.
func writeTemp(t *testing.T, name, content string) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(path, []byte(content), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

// TestReadBadInput: every fault of a photometry table is a table.Error
// naming the file, line and column (spec/cli.md, issue 4: bad input).
func TestReadBadInput(t *testing.T) {
	two := &Photometry{Comps: []Comp{{"A", 11}, {"B", 12}}, Star: synthStar}
	ext := &Photometry{Comps: []Comp{{"A", 11}}, Star: synthStar, Transform: Transform{ExtinctionK: 0.2}}
	for _, c := range []struct {
		name       string
		p          *Photometry
		cols       Columns
		csv        string
		line, col  int
		colName    string
		wantInText string
	}{
		{"missing comparison column", two, Columns{}, "jd_utc,target,A\n2460000.5,-8,-9\n", 1, 0, "", `missing column "B"`},
		{"missing time column", two, Columns{}, "jd,target,A,B\n2460000.5,-8,-9,-8\n", 1, 0, "", `missing column "jd_utc"`},
		{"non-numeric magnitude", two, Columns{}, "jd_utc,target,A,B\n2460000.5,-8,-9,-8\n2460000.6,-8,x9,-8\n", 3, 14, "A", `"x9" is not a number`},
		{"non-numeric time", two, Columns{}, "jd_utc,target,A,B\nnoon,-8,-9,-8\n", 2, 1, "jd_utc", `"noon" is not a number`},
		{"empty time", two, Columns{}, "jd_utc,target,A,B\n,-8,-9,-8\n", 2, 1, "jd_utc", "empty"},
		{"time out of range", two, Columns{}, "jd_utc,target,A,B\n1000000.5,-8,-9,-8\n", 2, 1, "jd_utc", "outside the supported range"},
		{"MJD read as JD", two, Columns{}, "jd_utc,target,A,B\n60000.5,-8,-9,-8\n", 2, 1, "jd_utc", "outside the supported range"},
		{"negative error", two, Columns{}, "jd_utc,target,A,A_err,B\n2460000.5,-8,-9,-0.01,-8\n", 2, 17, "A_err", "expected a one-sigma error"},
		{"airmass below 1", two, Columns{}, "jd_utc,target,airmass,A,B\n2460000.5,-8,0.9,-9,-8\n", 2, 14, "airmass", "airmass 0.9"},
		{"bad ISO instant", two, Columns{Time: "when", TimeFormat: TimeISO}, "when,target,A,B\n2024-13-01T00:00Z,-8,-9,-8\n", 2, 1, "when", "2024-13-01"},
		{"negative exposure length", two, Columns{Time: "start", ExposureSec: "exp"}, "start,exp,target,A,B\n2460000.5,-30,-8,-9,-8\n", 2, 11, "exp", "exposure length"},
		{"mapped column missing", two, Columns{TargetErr: "var_err"}, "jd_utc,target,A,B\n2460000.5,-8,-9,-8\n", 1, 0, "", `missing column "var_err"`},
		{"extinction without airmass column", ext, Columns{}, "jd_utc,target,A\n2460000.5,-8,-9\n", 1, 0, "", "extinction correction needs the airmass"},
		{"extinction with an empty airmass cell", ext, Columns{}, "jd_utc,target,airmass,A,A_airmass\n2460000.5,-8,,-9,1.2\n", 2, 14, "airmass", "extinction correction needs it"},
		{"ragged row", two, Columns{}, "jd_utc,target,A,B\n2460000.5,-8,\"-9\n", 2, 0, "", "quote"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := c.p.Read(strings.NewReader(c.csv), "phot.csv", c.cols)
			var te *table.Error
			if !errors.As(err, &te) {
				t.Fatalf("got %v, want a *table.Error", err)
			}
			if te.File != "phot.csv" || te.Line != c.line || (c.col != 0 && te.Column != c.col) || te.Name != c.colName || !strings.Contains(err.Error(), c.wantInText) {
				t.Errorf("got %q (line %d, column %d, name %q); want line %d, column %d, name %q, saying %q",
					err, te.Line, te.Column, te.Name, c.line, c.col, c.colName, c.wantInText)
			}
		})
	}
}

// TestReadTimeFormats: the same instant written as JD UTC, MJD UTC, ISO
// 8601 (UTC, with an offset), and as a start plus exposure length.
func TestReadTimeFormats(t *testing.T) {
	p := &Photometry{Comps: []Comp{{"A", 11}}, Star: synthStar}
	const want = 2460666.3333333333 // 2024-12-21T20:00:00Z (Meeus 1998, eq. 7.1: JD of 2024 Dec 21.8333)
	for _, c := range []struct {
		name string
		cols Columns
		csv  string
	}{
		{"jd_utc", Columns{}, "jd_utc,target,A\n2460666.3333333333,-8,-9\n"},
		{"mjd", Columns{Time: "mjd", TimeFormat: TimeMJD}, "mjd,target,A\n60665.8333333333,-8,-9\n"},
		{"iso Z", Columns{Time: "date_obs", TimeFormat: TimeISO}, "date_obs,target,A\n2024-12-21T20:00:00Z,-8,-9\n"},
		{"iso with offset", Columns{Time: "date_obs", TimeFormat: TimeISO}, "date_obs,target,A\n2024-12-21T21:00:00+01:00,-8,-9\n"},
		{"start plus 120 s", Columns{Time: "start", ExposureSec: "exptime"}, "start,exptime,target,A\n2460666.3326388889,120,-8,-9\n"},
	} {
		t.Run(c.name, func(t *testing.T) {
			exps, err := p.Read(strings.NewReader(c.csv), "t.csv", c.cols)
			if err != nil {
				t.Fatal(err)
			}
			// float64 resolves a JD near 2.46e6 to 40 µs; allow 1 ms.
			if d := (exps[0].JDUTC - want) * secondsPerDay; math.Abs(d) > 1e-3 {
				t.Errorf("got JD %.9f, want %.9f, diff %.4f s, tol 0.001 s", exps[0].JDUTC, want, d)
			}
		})
	}
	if f, err := ParseTimeFormat("MJD_UTC"); err != nil || f != TimeMJD {
		t.Errorf("ParseTimeFormat(MJD_UTC): got %v, %v", f, err)
	}
	if _, err := ParseTimeFormat("hjd"); err == nil {
		t.Error("ParseTimeFormat(hjd): got no error; HJD input is not accepted")
	}
}

// TestReadColumnMapping reads a table laid out as another program writes
// it, with the column mapping, and checks the values and missing cells.
func TestReadColumnMapping(t *testing.T) {
	p := &Photometry{Comps: []Comp{{"C1", 11}, {"C2", 12}}, Check: &Comp{"K", 11.5}, Star: synthStar}
	cols := Columns{
		Time: "JD", Target: "Var_Mag", TargetErr: "Var_Err", Filter: "Band",
		Stars: map[string]StarColumns{"C1": {Mag: "Comp1_Mag", Err: "Comp1_Err"}, "K": {Mag: "Chk"}},
	}
	csv := "# exported photometry\nJD, Var_Mag, Var_Err, Comp1_Mag, Comp1_Err, C2, Chk, Band, Notes\n" +
		"2460000.5, -8.1, 0.01, -9.0, 0.005, -8.0, -8.5, V, clear\n" +
		"2460000.6, , , -9.1, , , -8.4, V, cloud\n"
	exps, err := p.Read(strings.NewReader(csv), "other.csv", cols)
	if err != nil {
		t.Fatal(err)
	}
	if len(exps) != 2 || exps[0].Line != 3 || exps[1].Line != 4 {
		t.Fatalf("got %d exposures (lines %d..), want 2 from lines 3 and 4", len(exps), exps[0].Line)
	}
	e := exps[0]
	if e.Target != (Inst{-8.1, 0.01, math.NaN()}) && !(e.Target.Mag == -8.1 && e.Target.Err == 0.01 && math.IsNaN(e.Target.Airmass)) {
		t.Errorf("target: got %+v", e.Target)
	}
	if e.Comps[0].Mag != -9.0 || e.Comps[0].Err != 0.005 || e.Comps[1].Mag != -8.0 || !math.IsNaN(e.Comps[1].Err) || e.Check.Mag != -8.5 || e.Filter != "V" {
		t.Errorf("row 1: got %+v", e)
	}
	e = exps[1]
	if !math.IsNaN(e.Target.Mag) || !math.IsNaN(e.Comps[1].Mag) || e.Comps[0].Mag != -9.1 {
		t.Errorf("row 2 (empty cells are missing, never 0): got %+v", e)
	}
	// A mapping for a star the set-up does not have is a mistake.
	cols.Stars["C9"] = StarColumns{Mag: "x"}
	if _, err := p.Read(strings.NewReader(csv), "other.csv", cols); err == nil || !strings.Contains(err.Error(), `"C9"`) {
		t.Errorf("mapping an unknown star: got %v", err)
	}
}

// TestReadFileMissing: a file that is not there is an error naming it.
func TestReadFileMissing(t *testing.T) {
	p := &Photometry{Comps: []Comp{{"A", 11}}, Star: ephem.Star{}}
	path := filepath.Join(t.TempDir(), "none.csv")
	_, err := p.ReduceFile(path, Columns{})
	if err == nil || !strings.Contains(err.Error(), "none.csv") {
		t.Errorf("got %v, want an error naming none.csv", err)
	}
}

// TestReadEmptyTable: a header alone is no exposure and no error; no
// header at all is an error.
func TestReadEmptyTable(t *testing.T) {
	p := &Photometry{Comps: []Comp{{"A", 11}}, Check: &Comp{"K", 11.5}, Star: synthStar}
	exps, err := p.Read(strings.NewReader("# nothing observed\njd_utc,target,A,K\n"), "empty.csv", Columns{})
	if err != nil || len(exps) != 0 {
		t.Fatalf("got %d exposures, %v; want none and no error", len(exps), err)
	}
	red, err := p.Reduce(exps)
	if err != nil || len(red.Rows) != 0 || len(red.Skipped) != 0 || red.Check.N != 0 || !math.IsNaN(red.Check.Mean) {
		t.Errorf("got %+v, %v; want an empty reduction with no check statistics", red, err)
	}
	if _, err := p.Read(strings.NewReader("# only comments\n"), "c.csv", Columns{}); err == nil {
		t.Error("no header row: got no error")
	}
}

// FuzzReadPhotometry: any table is read or refused, never a panic, and
// what is read reduces (or is refused for mixing filters, the one check
// Reduce makes across rows).
func FuzzReadPhotometry(f *testing.F) {
	f.Add("jd_utc,target,target_err,A,A_err,K\n2460000.5,-8,0.01,-9,0.01,-8.5\n")
	f.Add("jd_utc,target,A\n2460000.5,,-9\n,-8,\n")
	f.Add("jd_utc,target,A,airmass\n2460000.5,-8,-9,0.5\n")
	f.Add("jd_utc,target,A\n\"2460000.5,-8,-9\n")
	p := &Photometry{Comps: []Comp{{"A", 11}}, Check: &Comp{"K", 11.5}, Star: synthStar, Site: synthSite}
	f.Fuzz(func(t *testing.T, text string) {
		exps, err := p.Read(strings.NewReader(text), "fuzz.csv", Columns{})
		if err != nil {
			var te *table.Error
			if !errors.As(err, &te) {
				t.Errorf("error %v is not a *table.Error", err)
			}
			return
		}
		var ee *ExposureError
		if _, err := p.Reduce(exps); err != nil && !(errors.As(err, &ee) && ee.Field == "filter") {
			t.Errorf("a table that was read did not reduce: %v", err)
		}
	})
}
