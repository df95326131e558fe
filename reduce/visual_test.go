package reduce

import (
	"math"
	"strings"
	"testing"
)

// visualTol is the tolerance on a visual magnitude: the check values of
// methods.md §9 carry two decimals, so 0.005 mag.
const visualTol = 0.005

// TestVisualEstimates reproduces methods.md §9 (fractional method; step
// method of Argelander, with the step value derived from the two stars;
// values computed there from the formulas [C]) and the one-star step case.
func TestVisualEstimates(t *testing.T) {
	chart := map[string]float64{"A": 6.2, "B": 6.8, "64": 6.4, "72": 7.2}
	for _, c := range []struct {
		in       string
		stepMag  float64
		mag      float64
		step     float64
		source   string
		fraction bool
	}{
		{"A 2 V 3 B", 0, 6.44, 0.12, "methods.md §9 [C]: A 2 V 3 B → 6.44", true},
		{"A 3 V, V 2 B", 0, 6.56, 0.12, "methods.md §9 [C]: steps → s = 0.12, V = 6.56", false},
		{"V 2 B; A 3 V", 0, 6.56, 0.12, "methods.md §9 [C], clauses swapped", false},
		{"a 3 v 2 b", 0, 6.56, 0.12, "", true}, // lower case labels are different stars
		{"B 3 V 2 A", 0, 6.44, 0.12, "fainter star first: 6.8 − 0.6·3/5, the same as A 2 V 3 B [C]", true},
		{"A 3 V", 0.1, 6.5, 0.1, "one step relation: m_A + 3 s [C]", false},
		{"V 2 B", 0.1, 6.6, 0.1, "one step relation: m_B − 2 s [C]", false},
		{"A 0 V", 0, 6.2, 0, "V equal to A", false},
		{"64 1 V 1 72", 0, 6.8, 0.4, "numeric labels, midway [C]", true},
	} {
		t.Run(c.in, func(t *testing.T) {
			chart := chart
			if c.in == "a 3 v 2 b" {
				chart = map[string]float64{"a": 6.2, "b": 6.8}
			}
			est, err := ParseEstimate(c.in)
			if err != nil {
				t.Fatal(err)
			}
			if est.Fractional != c.fraction {
				t.Errorf("fractional: got %v, want %v", est.Fractional, c.fraction)
			}
			mag, step, err := est.Magnitude(chart, c.stepMag)
			if err != nil {
				t.Fatal(err)
			}
			if !near(mag, c.mag, visualTol) || !near(step, c.step, 1e-9) {
				t.Errorf("got %.4f (step %.4f), want %.2f (step %.2f; %s), tol %g", mag, step, c.mag, c.step, c.source, visualTol)
			}
		})
	}
}

func TestVisualBadEstimates(t *testing.T) {
	chart := map[string]float64{"A": 6.2, "B": 6.8}
	for _, c := range []struct {
		in      string
		stepMag float64
		want    string
	}{
		{"", 0, "empty"},
		{"A 2 B 3 V", 0, "cannot read"},
		{"A two V", 0, "cannot read"},
		{"A -1 V", 0, "cannot read"},
		{"A 0 V 0 B", 0, "both 0"},
		{"A 2 V 3 B, V 1 B", 0, "cannot read"},
		{"A 1 V, A 2 V", 0, "same star"},
		{"A 1 V, B 2 V, V 1 B", 0, "more than two"},
		{"A 3 V", 0, "give the step value"},
		{"C 2 V 3 B", 0, `"C" is not on the chart`},
		{"B 3 V, V 2 A", 0, "contradicts the chart"},
		{"A 2 V, B 2 V", 0, "cannot be derived"},
	} {
		t.Run(c.in, func(t *testing.T) {
			est, err := ParseEstimate(c.in)
			if err == nil {
				_, _, err = est.Magnitude(chart, c.stepMag)
			}
			if err == nil || !strings.Contains(err.Error(), c.want) {
				t.Errorf("got %v, want an error saying %q", err, c.want)
			}
		})
	}
}

func TestReduceVisual(t *testing.T) {
	chart := map[string]float64{"A": 6.2, "B": 6.8}
	obs := []VisualObservation{
		{JDUTC: 2460000.5, Estimate: "A 2 V 3 B", Err: 0.1},
		{JDUTC: 2460001.5, Estimate: "A 3 V, V 2 B"},
	}
	pts, err := ReduceVisual(obs, chart, 0)
	if err != nil {
		t.Fatal(err)
	}
	if len(pts) != 2 || !near(pts[0].Mag, 6.44, visualTol) || pts[0].Err != 0.1 || !near(pts[1].Mag, 6.56, visualTol) || pts[1].T != 2460001.5 {
		t.Errorf("got %+v, want 6.44 ± 0.1 and 6.56 (methods.md §9)", pts)
	}
	obs[1].Estimate = "A 3 V"
	if _, err := ReduceVisual(obs, chart, 0); err == nil || !strings.HasPrefix(err.Error(), "reduce: estimate 2: ") {
		t.Errorf("got %v, want an error naming estimate 2", err)
	}
	obs[1] = VisualObservation{JDUTC: math.NaN(), Estimate: "A 0 V"}
	if _, err := ReduceVisual(obs, chart, 0); err == nil {
		t.Error("NaN time: got no error")
	}
}

// FuzzParseEstimate: any text gives an estimate or an error, never a panic,
// and an estimate's magnitude lies within the chart's span when it uses
// two stars.
func FuzzParseEstimate(f *testing.F) {
	for _, s := range []string{"A 2 V 3 B", "A 3 V, V 2 B", "V 1 A", "A 0 V 0 B", "A 1e308 V 1e308 B", ",,;", "A 2 v 3 a"} {
		f.Add(s)
	}
	chart := map[string]float64{"A": 6.2, "B": 6.8}
	f.Fuzz(func(t *testing.T, s string) {
		est, err := ParseEstimate(s)
		if err != nil {
			return
		}
		mag, _, err := est.Magnitude(chart, 0.1)
		if err == nil && len(est.Steps) == 2 && !(mag >= 6.2-1e-9 && mag <= 6.8+1e-9) && est.Fractional {
			t.Errorf("%q: fractional estimate %v outside the chart's span 6.2–6.8", s, mag)
		}
	})
}
