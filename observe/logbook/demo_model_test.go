package logbook

import (
	"bufio"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
)

// Tolerances in physical units.
const (
	second   = 1.0 / 86400 // days
	millimag = 0.001       // magnitudes
)

// TestPolyFit checks the least-squares polynomial against the worked
// example of Meeus (1998), p. 40: seven points fitted exactly by
// y = −x² − 2x + 2.
func TestPolyFit(t *testing.T) {
	x := []float64{-4, -3, -2, -1, 0, 1, 2}
	y := []float64{-6, -1, 2, 3, 2, -1, -6}
	c, cov, err := polyFit(x, y, 2)
	if err != nil {
		t.Fatal(err)
	}
	want := []float64{2, -2, -1} // Meeus 1998, p. 40 [methods sheet §11, L]
	const tol = 1e-12
	for i := range want {
		if math.Abs(c[i]-want[i]) > tol {
			t.Errorf("coefficient %d: got %v, want %v (diff %g, tol %g)", i, c[i], want[i], c[i]-want[i], tol)
		}
		if math.Abs(cov[i][i]) > tol {
			t.Errorf("variance of coefficient %d: got %v, want 0 for an exact fit", i, cov[i][i])
		}
	}
	for _, bad := range []struct {
		name string
		x, y []float64
		deg  int
	}{
		{"too few points", []float64{1, 2, 3}, []float64{1, 2, 3}, 2},
		{"all at one x", []float64{1, 1, 1, 1, 1}, []float64{1, 2, 3, 4, 5}, 2},
		{"degree 0", []float64{1, 2, 3}, []float64{1, 2, 3}, 0},
	} {
		if _, _, err := polyFit(bad.x, bad.y, bad.deg); err == nil {
			t.Errorf("%s: got no error", bad.name)
		}
	}
}

// methodsPoints and pulsatorPoints make the points of the cases in
// testdata/polyextremum.csv (see polyextremum.py, which makes the same).
func methodsPoints(perturbed bool) (ts, ms []float64) {
	const t0 = 2460000.4321
	var all, mags []float64
	for k := 0; k <= 60; k++ {
		tk := 2460000.3700 + 0.002*float64(k)
		m := 10 + 0.5*math.Exp(-math.Pow((tk-t0)/0.02, 2))
		if perturbed {
			m += 0.003 * float64((37*k)%17-8) / 8
		}
		all, mags = append(all, tk), append(mags, m)
	}
	best := 0
	for i := range mags {
		if mags[i] > mags[best] {
			best = i
		}
	}
	for i := range all {
		if math.Abs(all[i]-all[best]) <= 0.0101 {
			ts, ms = append(ts, all[i]), append(ms, mags[i])
		}
	}
	return ts, ms
}

func pulsatorPoints(perturbed bool) (ts, ms []float64) {
	for k := 0; k <= 60; k++ {
		tk := 2459500.1000 + 0.0015*float64(k)
		u := (tk - 2459500.1450) / 0.5
		m := 11 - 0.4*math.Cos(2*math.Pi*u) + 0.06*math.Sin(4*math.Pi*u)
		if perturbed {
			m += 0.004 * float64((29*k)%13-6) / 6
		}
		ts, ms = append(ts, tk), append(ms, m)
	}
	return ts, ms
}

// TestPolyExtremum compares polyExtremum with numpy (testdata/
// polyextremum.csv) and, for the methods sheet's check data, with the
// published true time.
func TestPolyExtremum(t *testing.T) {
	f, err := os.Open("testdata/polyextremum.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	points := map[string]func() ([]float64, []float64){
		"methods-clean":       func() ([]float64, []float64) { return methodsPoints(false) },
		"methods-perturbed":   func() ([]float64, []float64) { return methodsPoints(true) },
		"pulsator-deg3":       func() ([]float64, []float64) { return pulsatorPoints(true) },
		"pulsator-deg4":       func() ([]float64, []float64) { return pulsatorPoints(true) },
		"pulsator-deg2-clean": func() ([]float64, []float64) { return pulsatorPoints(false) },
	}
	// numpy solves by SVD, we by the normal equations: they agree far below
	// a millisecond. The formal errors agree to a part in a thousand.
	const tolTime = 0.001 * second
	const tolSigma = 1e-3 // relative
	sc := bufio.NewScanner(f)
	n := 0
	for sc.Scan() {
		line := sc.Text()
		if strings.HasPrefix(line, "#") || strings.HasPrefix(line, "case,") || line == "" {
			continue
		}
		c := strings.Split(line, ",")
		deg, _ := strconv.Atoi(c[1])
		wantT, _ := strconv.ParseFloat(c[4], 64)
		wantS, _ := strconv.ParseFloat(c[5], 64)
		ts, ms := points[c[0]]()
		gotT, gotS, err := polyExtremum(ts, ms, deg, c[2] == "max")
		if err != nil {
			t.Errorf("%s: %v", c[0], err)
			continue
		}
		n++
		if d := gotT - wantT; math.Abs(d) > tolTime {
			t.Errorf("%s: t_ext got %.9f, want %.9f (numpy), diff %.3g s, tol %.3g s", c[0], gotT, wantT, d/second, tolTime/second)
		}
		if d := gotS/wantS - 1; math.Abs(d) > tolSigma {
			t.Errorf("%s: sigma got %.6g, want %.6g (numpy), relative diff %.2g, tol %g", c[0], gotS, wantS, d, tolSigma)
		}
	}
	if n != len(points) {
		t.Errorf("checked %d cases of testdata/polyextremum.csv, want %d", n, len(points))
	}
	// The methods sheet §10: a parabola recovers T0 = 2460000.4321 within
	// 0.5 s noise-free and 6 s perturbed; its test bound is 10 s.
	for _, tc := range []struct {
		name      string
		perturbed bool
		tol       float64
	}{{"noise-free", false, 0.5 * second}, {"perturbed", true, 10 * second}} {
		ts, ms := methodsPoints(tc.perturbed)
		got, sigma, err := polyExtremum(ts, ms, 2, false)
		if err != nil {
			t.Fatal(err)
		}
		if d := got - 2460000.4321; math.Abs(d) > tc.tol || !(sigma > 0) {
			t.Errorf("methods sheet §10, %s: got %.6f (σ %.2g), want 2460000.4321, diff %.2f s, tol %.1f s", tc.name, got, sigma, d/second, tc.tol/second)
		}
	}
	// No extremum of the asked kind inside the points.
	ts, ms := methodsPoints(false)
	if _, _, err := polyExtremum(ts, ms, 2, true); err == nil {
		t.Errorf("a minimum timed as a maximum: got no error")
	}
	if _, _, err := polyExtremum(ts[:3], ms[:3], 2, false); err == nil {
		t.Errorf("three points for a parabola: got no error")
	}
}

// TestEnsemble checks the ensemble zero point against the methods sheet
// §8 check values [C].
func TestEnsemble(t *testing.T) {
	cat := []float64{11.200, 12.050, 10.700}
	inst := []float64{-8.120, -7.262, -8.628}
	for _, tc := range []struct {
		name      string
		sigma     []float64
		target    float64
		want      float64
		wantSigma float64
		tol       float64 // half the last digit the sheet prints
	}{
		{"unweighted", nil, -7.512, 11.808, math.NaN(), 0.0005},
		{"weighted", []float64{0.005, 0.010, 0.005}, -7.512, 11.81067, 0.00333, 0.000005},
		{"check star", nil, -7.668, 11.652, math.NaN(), 0.0005},
	} {
		got, sz, err := ensemble(tc.target, cat, inst, tc.sigma)
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(got-tc.want) > tc.tol {
			t.Errorf("%s (methods sheet §8): got V = %.5f, want %.5f, diff %.2g, tol %g", tc.name, got, tc.want, got-tc.want, tc.tol)
		}
		if !math.IsNaN(tc.wantSigma) && math.Abs(sz-tc.wantSigma) > 0.000005 {
			t.Errorf("%s (methods sheet §8): got σ_Z = %.5f, want %.5f", tc.name, sz, tc.wantSigma)
		}
	}
	if _, _, err := ensemble(-7, nil, nil, nil); err == nil {
		t.Errorf("no comparison stars: got no error")
	}
	if _, _, err := ensemble(-7, cat, inst, []float64{0.01, 0, 0.01}); err == nil {
		t.Errorf("a zero error: got no error")
	}
}

// TestFractionalEstimate checks the visual estimate against the methods
// sheet §9 check value [C]: A = 6.2, B = 6.8, "A 2 V 3 B" gives 6.44.
func TestFractionalEstimate(t *testing.T) {
	if got := fractionalEstimate(6.2, 2, 3, 6.8); math.Abs(got-6.44) > 1e-12 {
		t.Errorf("A 2 V 3 B: got %v, want 6.44 (methods sheet §9)", got)
	}
}

// TestIntensityMean checks the intensity mean against the methods sheet
// §13 check value [C]: V = 3.5 and 4.4 with equal weights give 3.8593.
func TestIntensityMean(t *testing.T) {
	got := intensityMeanOf((math.Pow(10, -0.4*3.5) + math.Pow(10, -0.4*4.4)) / 2)
	if math.Abs(got-3.8593) > 0.00005 {
		t.Errorf("intensity mean of 3.5 and 4.4: got %.5f, want 3.8593 (methods sheet §13)", got)
	}
	// A light curve's intensity mean lies between its extremes, nearer the
	// bright end than the magnitude mean.
	s := lightShape{kind: shapePulsator, base: 8.92, amp: 0.79, width: 0.8}
	im := s.intensityMean(4000)
	mm := 0.0
	for i := 0; i < 4000; i++ {
		mm += s.magAt((float64(i) + 0.5) / 4000)
	}
	mm /= 4000
	if !(im > 8.92 && im < mm) {
		t.Errorf("intensity mean %v: want between the maximum 8.92 and the magnitude mean %v", im, mm)
	}
}

// TestEventTime checks the quadratic ephemeris against the methods sheet
// §11 synthetic values [C]: T0 = 2450000.0, P = 0.4 d, Q = 2×10⁻¹⁰ d give
// O−C against the linear elements of 0.005, 0.020, 0.080 d at E = 5000,
// 10000, 20000; and the light-time term against its definition.
func TestEventTime(t *testing.T) {
	e := trueElements{epoch: 2450000.0, periodDays: 0.4, q: 2e-10}
	for _, tc := range []struct{ cycle, oc float64 }{{5000, 0.005}, {10000, 0.020}, {20000, 0.080}} {
		got := e.eventTime(tc.cycle) - (e.epoch + e.periodDays*tc.cycle)
		if math.Abs(got-tc.oc) > 1e-9 {
			t.Errorf("E = %v: O−C got %v, want %v (methods sheet §11)", tc.cycle, got, tc.oc)
		}
	}
	l := lightTime{amplitudeDays: 0.0062, periodDays: 2263, zeroJD: 2458500}
	for _, tc := range []struct{ jd, want float64 }{
		{2458500, 0}, {2458500 + 2263.0/4, 0.0062}, {2458500 + 2263.0/2, 0}, {2458500 + 3*2263.0/4, -0.0062},
	} {
		if got := l.at(tc.jd); math.Abs(got-tc.want) > 1e-12 {
			t.Errorf("light time at %v: got %v, want %v (quarter periods of a sine)", tc.jd, got, tc.want)
		}
	}
	// phaseAt inverts eventTime: every extremum is at phase 0.
	w := trueElements{epoch: 2459000.18731, periodDays: 0.3691234, ltt: l}
	for _, c := range []float64{-30000, -1, 0, 1, 777, 30000} {
		if ph := w.phaseAt(w.eventTime(c)); math.Abs(ph) > 1e-9 {
			t.Errorf("cycle %v: phase of its extremum %v, want 0", c, ph)
		}
	}
}

// TestLightShapes checks each light curve's extremes: maximum light at
// phase 0 for pulsators, the primary minimum at phase 0 and the secondary
// at 0.5 for binaries.
func TestLightShapes(t *testing.T) {
	for _, tc := range []struct {
		name            string
		s               lightShape
		at0, at05, tol  float64
		extremeAt0IsMin bool // phase 0 is the smallest magnitude (maximum light)
	}{
		{"pulsator", lightShape{kind: shapePulsator, base: 11.35, amp: 1.03, width: 0.9}, 11.35, math.NaN(), 1e-12, true},
		{"sine", lightShape{kind: shapeSine, base: 10.41, amp: 0.31}, 10.41, 10.72, 1e-12, true},
		{"algol", lightShape{kind: shapeAlgol, base: 9.82, amp: 1.23, depth2: 0.08, width: 0.022}, 11.05, 9.90, 1e-9, false},
		{"contact", lightShape{kind: shapeContact, base: 10.95, amp: 0.67, depth2: 0.55}, 11.62, 11.50, 1e-12, false},
	} {
		if got := tc.s.magAt(0); math.Abs(got-tc.at0) > tc.tol {
			t.Errorf("%s at phase 0: got %v, want %v", tc.name, got, tc.at0)
		}
		if !math.IsNaN(tc.at05) {
			if got := tc.s.magAt(0.5); math.Abs(got-tc.at05) > tc.tol {
				t.Errorf("%s at phase 0.5: got %v, want %v", tc.name, got, tc.at05)
			}
		}
		for i := 1; i < 1000; i++ {
			m := tc.s.magAt(float64(i)/1000 - 0.5)
			if tc.extremeAt0IsMin && m < tc.s.magAt(0)-1e-12 || !tc.extremeAt0IsMin && m > tc.s.magAt(0)+1e-12 {
				t.Errorf("%s: phase %v (%v) is more extreme than phase 0 (%v)", tc.name, float64(i)/1000-0.5, m, tc.s.magAt(0))
				break
			}
		}
		if d := tc.s.magAt(0.3) - tc.s.magAt(1.3); math.Abs(d) > 1e-12 {
			t.Errorf("%s: not periodic (%v)", tc.name, d)
		}
	}
}
