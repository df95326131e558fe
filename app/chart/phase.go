package chart

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"example.org/vigil/ephem"
	"example.org/vigil/reduce"
)

// The phase axis runs from PhaseFrom to PhaseTo: one cycle with a fifth
// of the neighbouring cycles on either side, so that an extremum near
// phase 0 shows whole (common practice).
const (
	PhaseFrom = -0.2
	PhaseTo   = 1.2
)

// PhaseData is what PhaseCurve draws.
type PhaseData struct {
	Title string
	// Points are folded measurements (reduce.PhaseFold): phases in [0, 1].
	// Points with a NaN phase or magnitude are missing and left out.
	Points []reduce.PhasePoint
	Name   string // the points' name in the key; "" means "measurements"
	// Binned are optional means in bins of phase (reduce.BinInPhase: X a
	// phase in [0, 1]).
	Binned []reduce.MagBin
	// Ephemeris, when set, is named in the phase axis label.
	Ephemeris *ephem.Ephemeris
	MagLabel  string // "" means "magnitude"
}

// PhaseCurve draws magnitude against phase from PhaseFrom to PhaseTo,
// each point drawn again one cycle on where that falls inside the range
// (the repeated stretches faintly shaded), with error bars where errors
// are known, the magnitude axis inverted (brighter up), and binned means
// with their errors over the points. The key sits right of the plot.
// A phase outside [0, 1] is an error, as is a chart with no point left.
func PhaseCurve(d PhaseData, pal Palette) (*plot.Plot, error) {
	p, _, err := phaseCurve(d, pal)
	return p, err
}

// phaseParts are the plotters of a phase curve, for the tests.
type phaseParts struct {
	points, binned   *plotter.Scatter
	bars, binnedBars *plotter.YErrorBars
	shades           []*plotter.Polygon
}

// repeat returns the positions at which phase φ is drawn: φ itself and
// φ ± 1 where they fall inside [PhaseFrom, PhaseTo].
func repeat(phi float64) []float64 {
	out := []float64{phi}
	if phi-1 >= PhaseFrom {
		out = append(out, phi-1)
	}
	if phi+1 <= PhaseTo {
		out = append(out, phi+1)
	}
	return out
}

// phaseMarks returns the points of phases phi with magnitudes and errors
// at every position they are drawn.
func phaseMarks(what string, phi, mag, errs []float64) (plotter.XYs, []float64, error) {
	var xys plotter.XYs
	var es []float64
	for i := range phi {
		if math.IsNaN(phi[i]) || math.IsNaN(mag[i]) {
			continue
		}
		if !(phi[i] >= 0 && phi[i] <= 1) || math.IsInf(mag[i], 0) {
			return nil, nil, fmt.Errorf("chart: phase curve, %s %d: phase %v, magnitude %v: want a phase in [0, 1] and a finite magnitude", what, i, phi[i], mag[i])
		}
		for _, x := range repeat(phi[i]) {
			xys = append(xys, plotter.XY{X: x, Y: mag[i]})
			es = append(es, errs[i])
		}
	}
	return xys, es, nil
}

func phaseCurve(d PhaseData, pal Palette) (*plot.Plot, *phaseParts, error) {
	if err := pal.check(); err != nil {
		return nil, nil, err
	}
	n := len(d.Points)
	phi, mag, errs := make([]float64, n), make([]float64, n), make([]float64, n)
	for i, q := range d.Points {
		phi[i], mag[i], errs[i] = q.Phase, q.Mag, q.Err
	}
	xys, es, err := phaseMarks("point", phi, mag, errs)
	if err != nil {
		return nil, nil, err
	}
	if len(xys) == 0 {
		return nil, nil, fmt.Errorf("chart: phase curve: no point with both a phase and a magnitude")
	}
	n = len(d.Binned)
	phi, mag, errs = make([]float64, n), make([]float64, n), make([]float64, n)
	for i, b := range d.Binned {
		phi[i], mag[i], errs[i] = b.X, b.Mag, b.Err
	}
	bxys, bes, err := phaseMarks("bin", phi, mag, errs)
	if err != nil {
		return nil, nil, err
	}
	yr := newExtent()
	for i, q := range xys {
		e := 0.0
		if hasErr(es[i]) {
			e = es[i]
		}
		yr.add(q.Y-e, q.Y+e)
	}
	for _, q := range bxys {
		yr.add(q.Y)
	}
	ylo, yhi := yr.padded(0.06, 0.05)

	label := "phase"
	if e := d.Ephemeris; e != nil {
		label = fmt.Sprintf("phase (P = %.7g d, T0 = %s %.5f", e.PeriodDays, e.Scale.Label(), e.Epoch)
		if e.Q != 0 {
			label += fmt.Sprintf(", Q = %.3g d", e.Q)
		}
		label += ")"
	}
	magLabel := d.MagLabel
	if magLabel == "" {
		magLabel = "magnitude"
	}
	p := newPlot(pal, d.Title, label, magLabel)
	invertMag(p)
	p.X.Tick.Marker = plot.TickerFunc(func(min, max float64) []plot.Tick {
		var ts []plot.Tick
		for k := -2; k <= 12; k++ {
			v := float64(k) / 10
			t := plot.Tick{Value: v}
			if k%2 == 0 {
				t.Label = fmt.Sprintf("%.1f", v)
			}
			ts = append(ts, t)
		}
		return ts
	})
	key := newSideKey(pal, p.Legend.TextStyle)
	parts := &phaseParts{}
	for _, r := range [][2]float64{{PhaseFrom, 0}, {1, PhaseTo}} {
		sh, err := rect(r[0], ylo, r[1], yhi, pal.shade(), draw.LineStyle{})
		if err != nil {
			return nil, nil, err
		}
		p.Add(sh)
		parts.shades = append(parts.shades, sh)
	}
	addGrid(p, pal)

	name := d.Name
	if name == "" {
		name = "measurements"
	}
	glyph := pal.seriesGlyph(0, vg.Points(2.2))
	if parts.points, parts.bars, err = marks(xys, es, glyph); err != nil {
		return nil, nil, err
	}
	if parts.bars != nil {
		p.Add(parts.bars)
	}
	p.Add(parts.points)
	key.add(name, parts.points)
	if len(bxys) > 0 {
		glyph := draw.GlyphStyle{Color: pal.fit(0), Radius: vg.Points(4), Shape: draw.RingGlyph{}}
		if parts.binned, parts.binnedBars, err = marks(bxys, bes, glyph); err != nil {
			return nil, nil, err
		}
		if parts.binnedBars != nil {
			parts.binnedBars.LineStyle.Width = vg.Points(1.2)
			p.Add(parts.binnedBars)
		}
		p.Add(parts.binned)
		key.add(fmt.Sprintf("means of %d phase bins", len(d.Binned)), parts.binned)
	}
	key.add("phases repeated", swatch{fill: pal.shade(), line: draw.LineStyle{Color: pal.Grid, Width: vg.Points(0.5)}})
	p.Add(key)
	p.X.Min, p.X.Max = PhaseFrom, PhaseTo
	p.Y.Min, p.Y.Max = ylo, yhi
	return p, parts, nil
}
