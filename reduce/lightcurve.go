package reduce

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/safefile"
)

// PhasePoint is a light-curve point folded on an ephemeris: its phase in
// [0, 1), its time (on the ephemeris' scale), magnitude and error.
type PhasePoint struct {
	Phase float64
	T     float64
	Mag   float64
	Err   float64
}

// PhaseFold folds the points on the ephemeris, phase = frac((T − T0)/P) as
// ephem.Ephemeris.Phase computes it (with the quadratic term when set), and
// returns them sorted by phase. The points' times must be on the
// ephemeris' scale (Reduction.Points(eph.Scale)). Points with a NaN time or
// magnitude are dropped.
func PhaseFold(points []Point, eph ephem.Ephemeris) ([]PhasePoint, error) {
	if err := eph.Validate(); err != nil {
		return nil, fmt.Errorf("reduce: folding: %w", err)
	}
	out := make([]PhasePoint, 0, len(points))
	for _, p := range points {
		if !finite(p.T) || !finite(p.Mag) {
			continue
		}
		out = append(out, PhasePoint{Phase: eph.Phase(p.T), T: p.T, Mag: p.Mag, Err: p.Err})
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].Phase < out[j].Phase })
	return out, nil
}

// MagBin is one bin of a binned light curve: the mean position X of its
// points (time or phase), the bin's edges [Lo, Hi), the mean magnitude and
// its error, and the number of points.
type MagBin struct {
	X, Lo, Hi float64
	Mag, Err  float64
	N         int
}

// BinInTime bins the points in consecutive bins of widthDays starting at
// originJD (NaN: at the earliest point). Empty bins are left out. See
// binMean for the mean and its error.
func BinInTime(points []Point, widthDays, originJD float64) ([]MagBin, error) {
	if !(widthDays > 0) || math.IsInf(widthDays, 0) {
		return nil, fmt.Errorf("reduce: bin width %v days: expected a positive number", widthDays)
	}
	xs := make([]float64, 0, len(points))
	pts := make([]Point, 0, len(points))
	for _, p := range points {
		if finite(p.T) && finite(p.Mag) {
			xs = append(xs, p.T)
			pts = append(pts, p)
		}
	}
	if math.IsNaN(originJD) {
		originJD = math.Inf(1)
		for _, x := range xs {
			originJD = math.Min(originJD, x)
		}
	}
	if !finite(originJD) && len(xs) > 0 {
		return nil, fmt.Errorf("reduce: bin origin %v: expected a Julian date", originJD)
	}
	return binBy(xs, pts, func(x float64) int64 { return int64(math.Floor((x - originJD) / widthDays)) },
		func(k int64) (float64, float64) {
			lo := originJD + float64(k)*widthDays
			return lo, lo + widthDays
		}), nil
}

// BinInPhase bins folded points in nBins equal bins of phase over [0, 1).
// Empty bins are left out.
func BinInPhase(points []PhasePoint, nBins int) ([]MagBin, error) {
	if nBins < 1 {
		return nil, fmt.Errorf("reduce: %d phase bins: expected 1 or more", nBins)
	}
	xs := make([]float64, 0, len(points))
	pts := make([]Point, 0, len(points))
	for _, p := range points {
		if finite(p.Phase) && finite(p.Mag) {
			xs = append(xs, p.Phase)
			pts = append(pts, Point{T: p.T, Mag: p.Mag, Err: p.Err})
		}
	}
	n := float64(nBins)
	return binBy(xs, pts, func(x float64) int64 { return min(int64(math.Floor(x*n)), int64(nBins-1)) },
		func(k int64) (float64, float64) { return float64(k) / n, float64(k+1) / n }), nil
}

// binBy groups the points by the bin key of their x and averages each bin.
func binBy(xs []float64, pts []Point, key func(float64) int64, edges func(int64) (float64, float64)) []MagBin {
	groups := map[int64][]int{}
	var keys []int64
	for i, x := range xs {
		k := key(x)
		if _, ok := groups[k]; !ok {
			keys = append(keys, k)
		}
		groups[k] = append(groups[k], i)
	}
	sort.Slice(keys, func(i, j int) bool { return keys[i] < keys[j] })
	bins := make([]MagBin, 0, len(keys))
	for _, k := range keys {
		idx := groups[k]
		b := MagBin{N: len(idx)}
		b.Lo, b.Hi = edges(k)
		mags, errs := make([]float64, len(idx)), make([]float64, len(idx))
		for j, i := range idx {
			b.X += xs[i]
			mags[j], errs[j] = pts[i].Mag, knownErr(pts[i].Err)
		}
		b.X /= float64(len(idx))
		b.Mag, b.Err = binMean(mags, errs)
		bins = append(bins, b)
	}
	return bins
}

// binMean returns the mean magnitude of a bin and its error by the rule of
// the ensemble zero point (Photometry.Reduce): weighted by 1/err² with
// error 1/sqrt(Σ 1/err²) when every point has an error, else the plain
// mean with the standard error s/√n; a single point keeps its own error
// (NaN when unknown).
func binMean(mags, errs []float64) (mean, err float64) {
	left := make([]bool, len(mags))
	mean, err, n, _ := ensembleZeroPoint(mags, errs, left)
	if n == 1 && !(err > 0) {
		err = math.NaN()
	}
	return mean, err
}

// WriteCSV writes the reduction to path as CSV, whole or not at all
// (internal/safefile): one row per exposure reduced with jd_utc, hjd_utc,
// bjd_tdb, mag, err, zero_point, zero_point_err, n_comps, and check_mag,
// check_err when there is a check star. Missing values are empty cells.
func (r *Reduction) WriteCSV(path string) error {
	return safefile.Write(path, r.EncodeCSV)
}

// EncodeCSV writes the reduction as WriteCSV does, to w.
func (r *Reduction) EncodeCSV(w io.Writer) error {
	head := []string{"jd_utc", "hjd_utc", "bjd_tdb", "mag", "err", "zero_point", "zero_point_err", "n_comps"}
	if r.Check != nil {
		head = append(head, "check_mag", "check_err")
	}
	rows := make([][]string, len(r.Rows))
	for i, x := range r.Rows {
		rows[i] = []string{csvJD(x.JDUTC), csvJD(x.HJD), csvJD(x.BJDTDB), csvMag(x.Mag), csvMag(x.Err),
			csvMag(x.ZeroPoint), csvMag(x.ZeroPointErr), strconv.Itoa(x.NComps)}
		if r.Check != nil {
			rows[i] = append(rows[i], csvMag(x.CheckMag), csvMag(x.CheckErr))
		}
	}
	return writeCSVRows(w, head, rows)
}

// WritePointsCSV writes a light curve to path as CSV (time, mag, err),
// whole or not at all; timeName heads the time column and should name its
// scale, e.g. "bjd_tdb".
func WritePointsCSV(path, timeName string, points []Point) error {
	if timeName == "" {
		return errors.New("reduce: the time column needs a name that says its scale, e.g. \"bjd_tdb\"")
	}
	rows := make([][]string, len(points))
	for i, p := range points {
		rows[i] = []string{csvJD(p.T), csvMag(p.Mag), csvMag(p.Err)}
	}
	return safefile.Write(path, func(w io.Writer) error {
		return writeCSVRows(w, []string{timeName, "mag", "err"}, rows)
	})
}

// WritePhaseCSV writes a folded light curve to path as CSV (phase, time,
// mag, err), whole or not at all; timeName heads the time column.
func WritePhaseCSV(path, timeName string, points []PhasePoint) error {
	if timeName == "" {
		return errors.New("reduce: the time column needs a name that says its scale, e.g. \"bjd_tdb\"")
	}
	rows := make([][]string, len(points))
	for i, p := range points {
		rows[i] = []string{strconv.FormatFloat(p.Phase, 'f', 6, 64), csvJD(p.T), csvMag(p.Mag), csvMag(p.Err)}
	}
	return safefile.Write(path, func(w io.Writer) error {
		return writeCSVRows(w, []string{"phase", timeName, "mag", "err"}, rows)
	})
}

// WriteBinsCSV writes binned points to path as CSV (x, lo, hi, mag, err,
// n), whole or not at all; xName heads the x columns ("phase", "bjd_tdb",
// ...).
func WriteBinsCSV(path, xName string, bins []MagBin) error {
	if xName == "" {
		return errors.New("reduce: the bin column needs a name, e.g. \"phase\" or \"bjd_tdb\"")
	}
	rows := make([][]string, len(bins))
	for i, b := range bins {
		rows[i] = []string{csvJD(b.X), csvJD(b.Lo), csvJD(b.Hi), csvMag(b.Mag), csvMag(b.Err), strconv.Itoa(b.N)}
	}
	return safefile.Write(path, func(w io.Writer) error {
		return writeCSVRows(w, []string{xName, xName + "_lo", xName + "_hi", "mag", "err", "n"}, rows)
	})
}

func writeCSVRows(w io.Writer, head []string, rows [][]string) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(head); err != nil {
		return err
	}
	if err := cw.WriteAll(rows); err != nil {
		return err
	}
	return cw.Error()
}

// csvJD writes a Julian date (or phase) to 1e-8 day (under a millisecond);
// NaN is an empty cell.
func csvJD(x float64) string {
	if !finite(x) {
		return ""
	}
	return strconv.FormatFloat(x, 'f', 8, 64)
}

// csvMag writes a magnitude to 0.1 millimag; NaN is an empty cell.
func csvMag(x float64) string {
	if !finite(x) {
		return ""
	}
	return strconv.FormatFloat(x, 'f', 5, 64)
}
