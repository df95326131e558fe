package reduce

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/table"
)

func TestPhaseFold(t *testing.T) {
	// δ Cep, Max = 2436075.445 + 5.366341 E (GCVS, methods.md §6): the
	// maximum E = 4583 falls at 2460669.3858 [C], so its phase is 0.
	eph := ephem.Ephemeris{Epoch: 2436075.445, PeriodDays: 5.366341, Scale: ephem.HJD}
	P := 5.366341
	pts := []Point{
		{T: 2460669.3858 + 0.6*P, Mag: 4.3, Err: 0.01},
		{T: 2460669.3858 + 0.1*P, Mag: 3.5, Err: 0.01},
		{T: math.NaN(), Mag: 4}, // dropped
		{T: 2460669.3858 - 0.15*P, Mag: 4.1, Err: 0.01},
	}
	got, err := PhaseFold(pts, eph)
	if err != nil {
		t.Fatal(err)
	}
	// The check value carries 4 decimals: ±0.00005 d is ±9.3e-6 in phase.
	const tol = 1e-5
	want := []struct{ phase, mag float64 }{{0.1, 3.5}, {0.6, 4.3}, {0.85, 4.1}}
	if len(got) != len(want) {
		t.Fatalf("got %d points, want %d", len(got), len(want))
	}
	for i, w := range want {
		if d := got[i].Phase - w.phase; math.Abs(d) > tol || got[i].Mag != w.mag {
			t.Errorf("point %d: got phase %.7f mag %.2f, want %.2f, %.2f (methods.md §6 [C]), diff %.2g, tol %g", i, got[i].Phase, got[i].Mag, w.phase, w.mag, d, tol)
		}
	}
	if _, err := PhaseFold(pts, ephem.Ephemeris{Epoch: 2460000, PeriodDays: -1, Scale: ephem.HJD}); err == nil {
		t.Error("negative period: got no error")
	}
}

// TestBinning: weighted and equal-weight bin means by the ensemble rule,
// values computed by hand from the formulas [C].
func TestBinning(t *testing.T) {
	pts := []Point{
		{T: 2460000.01, Mag: 10.0, Err: 0.1}, {T: 2460000.03, Mag: 10.3, Err: 0.2}, // bin 0: weighted
		{T: 2460000.51, Mag: 10.0}, {T: 2460000.52, Mag: 10.2}, {T: 2460000.59, Mag: 10.4}, // bin 5: equal weights
		{T: 2460000.95, Mag: 9.9, Err: 0.05}, // bin 9: one point keeps its error
		{T: 2460001.05, Mag: 9.8},            // bin 10: one point, no error
	}
	bins, err := BinInTime(pts, 0.1, 2460000.0)
	if err != nil {
		t.Fatal(err)
	}
	want := []MagBin{
		// (10.0/0.01 + 10.3/0.04)/(100 + 25) = 10.06; 1/sqrt(125) = 0.0894427
		{X: 2460000.02, Lo: 2460000.0, Hi: 2460000.1, Mag: 10.06, Err: 0.0894427, N: 2},
		// mean 10.2; s = 0.2, s/√3 = 0.1154701
		{X: 2460000.54, Lo: 2460000.5, Hi: 2460000.6, Mag: 10.2, Err: 0.1154701, N: 3},
		{X: 2460000.95, Lo: 2460000.9, Hi: 2460001.0, Mag: 9.9, Err: 0.05, N: 1},
		{X: 2460001.05, Lo: 2460001.0, Hi: 2460001.1, Mag: 9.8, Err: math.NaN(), N: 1},
	}
	checkBins(t, "time", bins, want)

	folded := []PhasePoint{{Phase: 0.10, Mag: 10, Err: 0.1}, {Phase: 0.20, Mag: 10.3, Err: 0.2}, {Phase: 0.99, Mag: 11}, {Phase: 0.5, Mag: math.NaN()}}
	pb, err := BinInPhase(folded, 4)
	if err != nil {
		t.Fatal(err)
	}
	checkBins(t, "phase", pb, []MagBin{
		{X: 0.15, Lo: 0, Hi: 0.25, Mag: 10.06, Err: 0.0894427, N: 2},
		{X: 0.99, Lo: 0.75, Hi: 1, Mag: 11, Err: math.NaN(), N: 1},
	})

	if _, err := BinInTime(pts, 0, math.NaN()); err == nil {
		t.Error("zero bin width: got no error")
	}
	if _, err := BinInPhase(folded, 0); err == nil {
		t.Error("zero phase bins: got no error")
	}
	// Origin NaN: bins start at the earliest point.
	b2, _ := BinInTime(pts, 0.1, math.NaN())
	if b2[0].Lo != 2460000.01 {
		t.Errorf("origin at the first point: got %.5f, want 2460000.01", b2[0].Lo)
	}
}

func checkBins(t *testing.T, what string, got, want []MagBin) {
	t.Helper()
	const tol = 1e-6 // mag and days: rounding of the hand values
	if len(got) != len(want) {
		t.Fatalf("%s bins: got %d, want %d: %+v", what, len(got), len(want), got)
	}
	for i, w := range want {
		g := got[i]
		if !near(g.X, w.X, tol) || !near(g.Lo, w.Lo, tol) || !near(g.Hi, w.Hi, tol) || !near(g.Mag, w.Mag, tol) || !near(g.Err, w.Err, tol) || g.N != w.N {
			t.Errorf("%s bin %d: got %+v, want %+v, tol %g", what, i, g, w, tol)
		}
	}
}

// TestWriteCSV writes a reduction and reads it back with internal/table:
// the values survive at the stated precision and missing values are empty
// cells. A file that cannot be written leaves nothing behind.
func TestWriteCSV(t *testing.T) {
	p, exps := methodsEnsemble(true)
	exps = append(exps, exps[0])
	exps[1].JDUTC += 0.01
	exps[1].Check.Mag = math.NaN()
	red, err := p.Reduce(exps)
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	path := filepath.Join(dir, "lc.csv")
	if err := red.WriteCSV(path); err != nil {
		t.Fatal(err)
	}
	tb, err := table.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if tb.Len() != 2 || !tb.Has("bjd_tdb") || !tb.Has("check_mag") {
		t.Fatalf("read back %d rows, header %v", tb.Len(), tb.Header)
	}
	for i, r := range red.Rows {
		row := tb.Row(i)
		bjd, _ := row.MustFloat("bjd_tdb")
		mag, _ := row.MustFloat("mag")
		chk, ok, _ := row.Float("check_mag")
		if !near(bjd, r.BJDTDB, 0.5e-8) || !near(mag, r.Mag, 0.5e-5) || ok != !math.IsNaN(r.CheckMag) || (ok && !near(chk, r.CheckMag, 0.5e-5)) {
			t.Errorf("row %d: read back bjd %.8f mag %.5f check %v %.5f; wrote %+v", i, bjd, mag, ok, chk, r)
		}
	}

	folded, _ := PhaseFold(red.Points(ephem.BJDTDB), ephem.Ephemeris{Epoch: 2460000, PeriodDays: 0.7, Scale: ephem.BJDTDB})
	bins, _ := BinInPhase(folded, 10)
	for _, w := range []func(string) error{
		func(p string) error { return WritePointsCSV(p, "bjd_tdb", red.Points(ephem.BJDTDB)) },
		func(p string) error { return WritePhaseCSV(p, "bjd_tdb", folded) },
		func(p string) error { return WriteBinsCSV(p, "phase", bins) },
	} {
		p := filepath.Join(dir, "out.csv")
		if err := w(p); err != nil {
			t.Errorf("writing: %v", err)
		}
		if _, err := table.ReadFile(p); err != nil {
			t.Errorf("reading back: %v", err)
		}
	}

	missing := filepath.Join(dir, "no", "such", "dir", "lc.csv")
	if err := red.WriteCSV(missing); err == nil {
		t.Error("writing into a missing directory: got no error")
	}
	if _, err := os.Stat(filepath.Dir(missing)); !os.IsNotExist(err) {
		t.Errorf("something was created: %v", err)
	}
	if err := WritePointsCSV(filepath.Join(dir, "x.csv"), "", nil); err == nil || !strings.Contains(err.Error(), "scale") {
		t.Errorf("unnamed time column: got %v", err)
	}
	if _, err := os.Stat(filepath.Join(dir, "x.csv")); !os.IsNotExist(err) {
		t.Error("a refused write left a file")
	}
}
