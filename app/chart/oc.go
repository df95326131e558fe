package chart

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"example.org/vigil/reduce"
)

// The fits an O−C residual panel can be taken against (OCData.Residuals).
const (
	FitLinear    = "linear"
	FitQuadratic = "quadratic"
	FitLightTime = "light-time"
)

// OCData is what OCDiagram and OCWithResiduals draw.
type OCData struct {
	Title    string
	Analysis reduce.OCAnalysis // as reduce.OC returns it
	// Published marks the timings taken from the literature rather than
	// the observer's own, one per Analysis.Rows; nil means all are own.
	Published []bool
	// LightTime is an optional light-time orbit fitted to the diagram
	// (reduce.LightTime), drawn as a third curve.
	LightTime *reduce.LightTimeFit
	// Residuals names the fit the residual panel is taken against:
	// FitLinear, FitQuadratic, FitLightTime, or "" for the one the
	// analysis prefers (Analysis.Preferred).
	Residuals string
}

// ocPoint is one timing as drawn.
type ocPoint struct {
	cycle, oc, sigma     float64
	published, secondary bool
	ambiguous            bool
}

// ocParts are the plotters of an O−C diagram, for the tests.
type ocParts struct {
	classes   []*plotter.Scatter // own primary, own secondary, published primary, published secondary (nil when empty)
	bars      *plotter.YErrorBars
	ambiguous *plotter.Scatter
	fits      map[string]*plotter.Line
	minutes   *edgeAxis
	years     *edgeAxis
}

// OCDiagram draws an O−C diagram (Sterken 2005, ASP Conf. Ser. 335, 3):
// O−C in days against the cycle number E, with a second scale in minutes
// on the right and calendar dates (of the analysis's ephemeris) along the
// top; each timing with its σ as an error bar and a marker by kind (own
// filled, published open; primary minimum or maximum a circle, secondary
// minimum a square); timings whose cycle count may be wrong ringed; and the
// linear and quadratic ephemeris fits (the preferred one wider) and a
// light-time orbit, when given, as curves. The key sits right of the plot.
func OCDiagram(d OCData, pal Palette) (*plot.Plot, error) {
	p, _, err := ocDiagram(d, pal)
	return p, err
}

// ocPoints returns the timings as drawn, checking the input.
func ocPoints(d OCData) ([]ocPoint, error) {
	a := d.Analysis
	if len(a.Rows) == 0 {
		return nil, fmt.Errorf("chart: O−C diagram: no timings")
	}
	if !(a.Ephemeris.PeriodDays > 0) {
		return nil, fmt.Errorf("chart: O−C diagram: ephemeris period %v: want the analysis's positive period", a.Ephemeris.PeriodDays)
	}
	if d.Published != nil && len(d.Published) != len(a.Rows) {
		return nil, fmt.Errorf("chart: O−C diagram: %d published flags for %d timings: want one per timing or none", len(d.Published), len(a.Rows))
	}
	var out []ocPoint
	for i, r := range a.Rows {
		if math.IsNaN(r.Cycle) || math.IsNaN(r.OCDays) {
			continue
		}
		if math.IsInf(r.Cycle, 0) || math.IsInf(r.OCDays, 0) {
			return nil, fmt.Errorf("chart: O−C diagram, timing %d: cycle %v, O−C %v: want finite numbers", i, r.Cycle, r.OCDays)
		}
		q := ocPoint{cycle: r.Cycle, oc: r.OCDays, sigma: r.SigmaDays, ambiguous: r.Ambiguous}
		q.secondary = math.Abs(r.Cycle-math.Round(r.Cycle)) > 0.25
		q.published = d.Published != nil && d.Published[i]
		out = append(out, q)
	}
	if len(out) == 0 {
		return nil, fmt.Errorf("chart: O−C diagram: no timing with both a cycle and an O−C")
	}
	if lt := d.LightTime; lt != nil && !(lt.PeriodDays > 0) {
		return nil, fmt.Errorf("chart: O−C diagram: light-time fit with orbital period %v: want a fit from reduce.LightTime", lt.PeriodDays)
	}
	return out, nil
}

// ocFits returns the curves to draw, by name, as functions of the cycle.
func ocFits(d OCData) map[string]func(e float64) float64 {
	a := d.Analysis
	fits := map[string]func(float64) float64{}
	if a.Linear.Period > 0 {
		fits[FitLinear] = a.Linear.OC
	}
	if a.Quadratic != nil && a.Quadratic.Period > 0 {
		fits[FitQuadratic] = a.Quadratic.OC
	}
	if lt := d.LightTime; lt != nil {
		fits[FitLightTime] = func(e float64) float64 { return lt.OC(a.Ephemeris.At(e)) }
	}
	return fits
}

func ocDiagram(d OCData, pal Palette) (*plot.Plot, *ocParts, error) {
	if err := pal.check(); err != nil {
		return nil, nil, err
	}
	pts, err := ocPoints(d)
	if err != nil {
		return nil, nil, err
	}
	a := d.Analysis
	xr, yr := newExtent(), newExtent()
	for _, q := range pts {
		xr.add(q.cycle)
		e := 0.0
		if hasErr(q.sigma) {
			e = q.sigma
		}
		yr.add(q.oc-e, q.oc+e)
	}
	xlo, xhi := xr.padded(0.04, 0.5)
	fits := ocFits(d)
	curves := map[string]plotter.XYs{}
	for name, f := range fits {
		const steps = 400
		var xys plotter.XYs
		for k := 0; k <= steps; k++ {
			e := xlo + (xhi-xlo)*float64(k)/steps
			if v := f(e); !math.IsNaN(v) && !math.IsInf(v, 0) {
				xys = append(xys, plotter.XY{X: e, Y: v})
				yr.add(v)
			}
		}
		curves[name] = xys
	}
	ylo, yhi := yr.padded(0.08, 0.0005)

	p := newPlot(pal, d.Title, "cycle E", "O−C (d)")
	key := newSideKey(pal, p.Legend.TextStyle)
	parts := &ocParts{fits: map[string]*plotter.Line{}}
	addGrid(p, pal)
	zero, err := line(plotter.XYs{{X: xlo, Y: 0}, {X: xhi, Y: 0}}, draw.LineStyle{Color: pal.Foreground, Width: vg.Points(0.6)})
	if err != nil {
		return nil, nil, err
	}
	p.Add(zero)

	// The fits, under the points: quadratic, linear, light-time.
	preferred := a.Preferred
	for i, name := range []string{FitQuadratic, FitLinear, FitLightTime} {
		xys := curves[name]
		if len(xys) < 2 {
			continue
		}
		width := 1.3
		if name == preferred {
			width = 2.2
		}
		l, err := line(xys, pal.fitLine(i, width))
		if err != nil {
			return nil, nil, err
		}
		p.Add(l)
		parts.fits[name] = l
		key.add(fitName(d, name), l)
	}

	if err := addOCMarks(p, key, pts, pal, func(q ocPoint) float64 { return q.oc }, parts); err != nil {
		return nil, nil, err
	}

	p.X.Min, p.X.Max = xlo, xhi
	p.Y.Min, p.Y.Max = ylo, yhi
	parts.minutes = newEdgeAxis(p, pal, false, "O−C (min)", minuteTicks(ylo, yhi, 8))
	p.Add(parts.minutes)
	if ticks, label := calendarTicks(a.Ephemeris, xlo, xhi); len(ticks) > 0 {
		parts.years = newEdgeAxis(p, pal, true, label, ticks)
		p.Add(parts.years)
	}
	p.Add(shiftedKey{key, parts.minutes.depth(p)})
	return p, parts, nil
}

// addOCMarks adds the timings at (cycle, y(q)): error bars, markers by
// kind, rings on the ambiguous ones, and their key entries when key is set.
func addOCMarks(p *plot.Plot, key *sideKey, pts []ocPoint, pal Palette, y func(ocPoint) float64, parts *ocParts) error {
	var bars errXYs
	for _, q := range pts {
		if hasErr(q.sigma) {
			bars.XYs = append(bars.XYs, plotter.XY{X: q.cycle, Y: y(q)})
			bars.errs = append(bars.errs, q.sigma)
		}
	}
	if len(bars.XYs) > 0 {
		b, err := plotter.NewYErrorBars(bars)
		if err != nil {
			return err
		}
		b.LineStyle = draw.LineStyle{Color: pal.Foreground, Width: vg.Points(0.6)}
		b.CapWidth = vg.Points(3)
		p.Add(b)
		parts.bars = b
	}
	names := []string{"own, primary", "own, secondary", "published, primary", "published, secondary"}
	parts.classes = make([]*plotter.Scatter, 4)
	var flagged plotter.XYs
	for c := range 4 {
		var xys plotter.XYs
		for _, q := range pts {
			if (q.published == (c >= 2)) && (q.secondary == (c%2 == 1)) {
				xys = append(xys, plotter.XY{X: q.cycle, Y: y(q)})
			}
		}
		if len(xys) == 0 {
			continue
		}
		sc, err := plotter.NewScatter(xys)
		if err != nil {
			return err
		}
		sc.GlyphStyle = ocGlyph(pal, c)
		p.Add(sc)
		parts.classes[c] = sc
		if key != nil {
			key.add(names[c], sc)
		}
	}
	for _, q := range pts {
		if q.ambiguous {
			flagged = append(flagged, plotter.XY{X: q.cycle, Y: y(q)})
		}
	}
	if len(flagged) > 0 {
		sc, err := plotter.NewScatter(flagged)
		if err != nil {
			return err
		}
		sc.GlyphStyle = draw.GlyphStyle{Color: pal.flag(), Radius: vg.Points(7), Shape: draw.RingGlyph{}}
		p.Add(sc)
		parts.ambiguous = sc
		if key != nil {
			key.add("cycle count doubtful", sc)
		}
	}
	return nil
}

// ocGlyph returns the marker of class c: own (0, 1) filled in the first
// star colour, published (2, 3) open in the second; primary (even) a
// circle, secondary (odd) a square.
func ocGlyph(pal Palette, c int) draw.GlyphStyle {
	shapes := []draw.GlyphDrawer{draw.CircleGlyph{}, draw.BoxGlyph{}, draw.RingGlyph{}, draw.SquareGlyph{}}
	return draw.GlyphStyle{Color: pal.star(c / 2), Radius: vg.Points(3.2), Shape: shapes[c]}
}

// fitName is the key's name of a fitted curve.
func fitName(d OCData, name string) string {
	a := d.Analysis
	var s string
	switch name {
	case FitLinear:
		s = fmt.Sprintf("linear: P = %.8f ± %.8f d", a.Linear.Period, a.Linear.PeriodErr)
	case FitQuadratic:
		q := a.Quadratic
		s = fmt.Sprintf("quadratic: dP/dt = %.3g ± %.2g s/yr", q.DPdtSecPerYear, q.DPdtErrSecPerYear)
	case FitLightTime:
		lt := d.LightTime
		s = fmt.Sprintf("light-time: P3 = %.0f d, A = %.4f d", lt.PeriodDays, lt.AmplitudeDays)
	}
	if name == a.Preferred {
		s += " (preferred)"
	}
	return s
}
