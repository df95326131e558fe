package chart

import (
	"fmt"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
)

// OCWithResiduals draws the O−C diagram of OCDiagram over a panel of the
// timings' residuals from one fit (OCData.Residuals; by default the one
// the analysis prefers), a third of the height, sharing its cycle axis.
// Save it with SavePanels; the window draws it with Panels.Draw.
func OCWithResiduals(d OCData, pal Palette) (Panels, error) {
	top, res, _, err := ocWithResiduals(d, pal)
	if err != nil {
		return Panels{}, err
	}
	return Panels{Plots: []*plot.Plot{top, res}, Heights: []float64{2, 1}}, nil
}

// residualFit returns the name of the fit the residuals are taken
// against.
func residualFit(d OCData) (string, error) {
	name := d.Residuals
	if name == "" {
		name = d.Analysis.Preferred
		if name != FitQuadratic {
			name = FitLinear
		}
	}
	switch name {
	case FitLinear, FitQuadratic, FitLightTime:
	default:
		return "", fmt.Errorf("chart: O−C residuals against %q: want %q, %q or %q", name, FitLinear, FitQuadratic, FitLightTime)
	}
	if _, ok := ocFits(d)[name]; !ok {
		return "", fmt.Errorf("chart: O−C residuals against the %s fit: the analysis has none", name)
	}
	return name, nil
}

// ocWithResiduals returns the diagram, the residual panel and the
// residual panel's parts (for the tests).
func ocWithResiduals(d OCData, pal Palette) (*plot.Plot, *plot.Plot, *ocParts, error) {
	name, err := residualFit(d)
	if err != nil {
		return nil, nil, nil, err
	}
	top, _, err := ocDiagram(d, pal)
	if err != nil {
		return nil, nil, nil, err
	}
	pts, _ := ocPoints(d) // checked by ocDiagram
	f := ocFits(d)[name]
	yr := newExtent()
	for _, q := range pts {
		r, e := q.oc-f(q.cycle), 0.0
		if hasErr(q.sigma) {
			e = q.sigma
		}
		yr.add(r-e, r+e)
	}
	yr.add(0)
	ylo, yhi := yr.padded(0.1, 0.0005)
	res := newPlot(pal, "", "cycle E", fmt.Sprintf("O−C − %s (d)", name))
	res.Y.Tick.Marker = niceTicks{4} // a third of the height
	addGrid(res, pal)
	zero, err := line(plotter.XYs{{X: top.X.Min, Y: 0}, {X: top.X.Max, Y: 0}}, pal.fitLine(0, 1))
	if err != nil {
		return nil, nil, nil, err
	}
	res.Add(zero)
	parts := &ocParts{fits: map[string]*plotter.Line{name: zero}}
	if err := addOCMarks(res, nil, pts, pal, func(q ocPoint) float64 { return q.oc - f(q.cycle) }, parts); err != nil {
		return nil, nil, nil, err
	}
	res.X.Min, res.X.Max = top.X.Min, top.X.Max
	res.Y.Min, res.Y.Max = ylo, yhi
	parts.minutes = newEdgeAxis(res, pal, false, "min", minuteTicks(ylo, yhi, 4))
	res.Add(parts.minutes)
	// The upper panel's cycle numbers are the lower one's: label them once.
	top.X.Label.Text = ""
	top.X.Tick.Marker = blankLabels{top.X.Tick.Marker}
	return top, res, parts, nil
}

// blankLabels is a ticker whose major ticks carry no text (a blank, so
// that they stay major and full length).
type blankLabels struct{ plot.Ticker }

// Ticks implements plot.Ticker.
func (b blankLabels) Ticks(min, max float64) []plot.Tick {
	ts := b.Ticker.Ticks(min, max)
	for i := range ts {
		if ts[i].Label != "" {
			ts[i].Label = " "
		}
	}
	return ts
}
