package chart

import (
	"math"
	"strings"
	"testing"

	"example.org/vigil/reduce"
)

func TestRepeat(t *testing.T) {
	for _, c := range []struct {
		phase float64
		want  []float64
	}{
		{0, []float64{0, 1}},
		{0.1, []float64{0.1, 1.1}},
		{0.2, []float64{0.2, 1.2}},
		{0.5, []float64{0.5}},
		{0.8, []float64{0.8, -0.2}},
		{0.95, []float64{0.95, -0.05}},
		{1, []float64{1, 0}},
	} {
		got := repeat(c.phase)
		if len(got) != len(c.want) {
			t.Errorf("phase %v drawn at %v, want %v", c.phase, got, c.want)
			continue
		}
		for i := range got {
			if math.Abs(got[i]-c.want[i]) > 1e-12 {
				t.Errorf("phase %v drawn at %v, want %v", c.phase, got, c.want)
			}
		}
	}
}

func TestPhaseCurve(t *testing.T) {
	folded, err := reduce.PhaseFold(ebSeason(), demoEB)
	if err != nil {
		t.Fatal(err)
	}
	folded[3].Mag = math.NaN() // missing
	folded[7].Err = 0          // unknown
	bins, err := reduce.BinInPhase(folded, 50)
	if err != nil {
		t.Fatal(err)
	}
	pal := NightRedPalette()
	p, parts, err := phaseCurve(PhaseData{Points: folded, Binned: bins, Ephemeris: &demoEB}, pal)
	if err != nil {
		t.Fatal(err)
	}
	if p.X.Min != PhaseFrom || p.X.Max != PhaseTo {
		t.Errorf("phase axis [%v, %v], want [%v, %v]", p.X.Min, p.X.Max, PhaseFrom, PhaseTo)
	}
	if !isInverted(p) {
		t.Errorf("magnitude axis not inverted")
	}
	for _, w := range []string{"P = 0.8123457 d", "BJD_TDB 2461000.34120"} {
		if !strings.Contains(p.X.Label.Text, w) {
			t.Errorf("phase label %q, want it to name %q", p.X.Label.Text, w)
		}
	}
	// Each point at its phase, and again a cycle on within [−0.2, 1.2].
	wantN, wantBars := 0, 0
	for _, q := range folded {
		if math.IsNaN(q.Mag) {
			continue
		}
		n := 1
		if q.Phase <= 0.2 || q.Phase >= 0.8 {
			n = 2
		}
		wantN += n
		if q.Err > 0 {
			wantBars += n
		}
	}
	if parts.points.Len() != wantN {
		t.Errorf("%d points drawn, want %d", parts.points.Len(), wantN)
	}
	if parts.bars == nil || parts.bars.Len() != wantBars {
		t.Errorf("error bars %v, want %d", parts.bars, wantBars)
	}
	for _, q := range parts.points.XYs {
		if q.X < PhaseFrom || q.X > PhaseTo {
			t.Errorf("point at phase %v outside the axis", q.X)
			break
		}
	}
	if parts.binned == nil || parts.binnedBars == nil || parts.binned.Len() < len(bins) {
		t.Errorf("binned means %v, want at least %d", parts.binned, len(bins))
	}
	if !sameColour(parts.points.GlyphStyle.Color, pal.Stars[0]) || !sameColour(parts.shades[0].Color, pal.Shade) {
		t.Errorf("points in %v, shades in %v: want the palette's star and shade colours", parts.points.GlyphStyle.Color, parts.shades[0].Color)
	}
	if len(parts.shades) != 2 {
		t.Errorf("%d shaded stretches, want 2 (the repeated phases)", len(parts.shades))
	}
	keyOutside(t, "phase curve", p, 0)
}

func TestPhaseCurveBadInput(t *testing.T) {
	for _, c := range []struct {
		name string
		d    PhaseData
		want string
	}{
		{"no points", PhaseData{}, "no point"},
		{"all missing", PhaseData{Points: []reduce.PhasePoint{{Phase: 0.1, Mag: math.NaN()}}}, "no point"},
		{"phase above 1", PhaseData{Points: []reduce.PhasePoint{{Phase: 0.1, Mag: 12}, {Phase: 1.5, Mag: 12}}}, "point 1: phase 1.5"},
		{"negative phase", PhaseData{Points: []reduce.PhasePoint{{Phase: -0.1, Mag: 12}}}, "point 0: phase -0.1"},
		{"infinite magnitude", PhaseData{Points: []reduce.PhasePoint{{Phase: 0.3, Mag: math.Inf(-1)}}}, "magnitude -Inf"},
		{"bad bin", PhaseData{Points: []reduce.PhasePoint{{Phase: 0.3, Mag: 12}}, Binned: []reduce.MagBin{{X: 2, Mag: 12}}}, "bin 0: phase 2"},
	} {
		p, err := PhaseCurve(c.d, DefaultPalette())
		if err == nil || p != nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: plot %v, error %v: want an error naming %q", c.name, p != nil, err, c.want)
		}
	}
}
