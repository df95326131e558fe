package demo

import (
	"math"
	"testing"
)

// Tolerances in physical units.
const (
	second   = 1.0 / 86400 // days
	millimag = 0.001       // magnitudes
)

// TestIntensityMeanOfShape checks the Cepheid-like light curve's
// intensity mean (reduce.IntensityMean of the sampled curve): it lies
// between the maximum and the magnitude mean, nearer the bright end (methods
// sheet §13: the magnitude mean is fainter and biased); and sampling more
// finely changes it by far less than the millimagnitude the catalogue
// prints.
func TestIntensityMeanOfShape(t *testing.T) {
	s := lightShape{kind: shapePulsator, base: 8.92, amp: 0.79, width: 0.8}
	im, err := s.intensityMean(meanSamples)
	if err != nil {
		t.Fatal(err)
	}
	mm := 0.0
	for i := 0; i < meanSamples; i++ {
		mm += s.magAt((float64(i) + 0.5) / meanSamples)
	}
	mm /= meanSamples
	if !(im > s.base && im < mm) {
		t.Errorf("intensity mean %v: want between the maximum %v and the magnitude mean %v", im, s.base, mm)
	}
	fine, err := s.intensityMean(8 * meanSamples)
	if err != nil {
		t.Fatal(err)
	}
	const tol = 1e-6 * millimag
	if d := fine - im; math.Abs(d) > tol {
		t.Errorf("intensity mean with %d and %d samples: %v and %v, diff %.2g mag, tol %.2g mag", meanSamples, 8*meanSamples, im, fine, d, tol)
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
