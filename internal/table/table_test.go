package table

import (
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestRead(t *testing.T) {
	in := "# a comment line\n" +
		"jd_utc, Target ,target_err,extra\n" +
		"2460000.5,10.5,0.01,x\n" +
		"\n" +
		"# another comment\n" +
		"2460000.6,,0.02\n"
	tb, err := Read(strings.NewReader(in), "obs.csv")
	if err != nil {
		t.Fatal(err)
	}
	if tb.Len() != 2 {
		t.Fatalf("rows = %d, want 2 (blank and comment lines skipped)", tb.Len())
	}
	if !tb.Has("TARGET") || !tb.Has(" target") || tb.Has("comp") {
		t.Errorf("Has: header lookup should ignore case and blanks, and know nothing of absent columns")
	}
	if got := tb.HeaderLine(); got != 2 {
		t.Errorf("header line = %d, want 2", got)
	}
	r0, r1 := tb.Row(0), tb.Row(1)
	if r0.Line() != 3 || r1.Line() != 6 {
		t.Errorf("lines = %d, %d, want 3, 6", r0.Line(), r1.Line())
	}
	if v, ok, err := r0.Float("target"); err != nil || !ok || v != 10.5 {
		t.Errorf("row 0 target = %v, %v, %v; want 10.5, true, nil", v, ok, err)
	}
	// An empty cell and a short row are missing values, never zero.
	if v, ok, err := r1.Float("target"); err != nil || ok || !math.IsNaN(v) {
		t.Errorf("empty cell = %v, %v, %v; want NaN, false, nil", v, ok, err)
	}
	if v, ok, err := r1.Float("extra"); err != nil || ok || !math.IsNaN(v) {
		t.Errorf("absent cell of a short row = %v, %v, %v; want NaN, false, nil", v, ok, err)
	}
	if _, err := r1.MustFloat("target"); !errors.Is(err, ErrMissing) {
		t.Errorf("MustFloat on an empty cell: err = %v, want ErrMissing", err)
	}
}

func TestErrorsNamePlace(t *testing.T) {
	for _, tc := range []struct {
		name string
		in   string
		col  string // column to read as a number in every row; "" to test Read only
		want string // the whole error text
	}{
		{"not a number", "time,mag\n1,2\n3,abc\n", "mag", `obs.csv: line 3, column 3 (mag): "abc" is not a number`},
		{"infinity is not a number", "time,mag\n1,Inf\n", "mag", `obs.csv: line 2, column 3 (mag): "Inf" is not a number`},
		{"NaN is not a number", "time,mag\n1,NaN\n", "mag", `obs.csv: line 2, column 3 (mag): "NaN" is not a number`},
		{"column found by name after unknown ones", "a,b,mag\n1,2,x3\n", "mag", `obs.csv: line 2, column 5 (mag): "x3" is not a number`},
		{"bare quote", "time,mag\n1,a\"b\n", "", `obs.csv: line 2, column 4: bare " in non-quoted-field`},
		{"repeated column", "time,mag,MAG\n", "", `obs.csv: line 1, column 10 (MAG): column name "MAG" repeats column 2`},
		{"no header", "# only a comment\n", "", `obs.csv: no header row: the first line that is not a comment must name the columns`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			tb, err := Read(strings.NewReader(tc.in), "obs.csv")
			if err == nil && tc.col != "" {
				for i := 0; i < tb.Len() && err == nil; i++ {
					_, _, err = tb.Row(i).Float(tc.col)
				}
			}
			if err == nil {
				t.Fatalf("no error, want %q", tc.want)
			}
			var te *Error
			if !errors.As(err, &te) {
				t.Errorf("error %T is not a *table.Error", err)
			}
			if err.Error() != tc.want {
				t.Errorf("error\n got %q\nwant %q", err.Error(), tc.want)
			}
		})
	}
}

func TestRequire(t *testing.T) {
	tb, err := Read(strings.NewReader("time,mag\n1,2\n"), "lc.csv")
	if err != nil {
		t.Fatal(err)
	}
	if err := tb.Require("time", "mag"); err != nil {
		t.Errorf("Require of present columns: %v", err)
	}
	err = tb.Require("time", "err")
	if !errors.Is(err, ErrMissing) || !strings.Contains(err.Error(), `lc.csv: line 1: missing column "err" (the header has: time, mag)`) {
		t.Errorf("Require of an absent column: %v", err)
	}
}

func TestReadFileMissing(t *testing.T) {
	path := filepath.Join(t.TempDir(), "nope.csv")
	_, err := ReadFile(path)
	var te *Error
	if !errors.As(err, &te) || te.File != path || !errors.Is(err, os.ErrNotExist) {
		t.Errorf("ReadFile of a missing file: %v", err)
	}
}
