package chart

import (
	"fmt"
	"math"
	"time"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"example.org/vigil/ephem"
	"example.org/vigil/reduce"
)

// Series is one star's light curve on a chart.
type Series struct {
	Name string
	// Points: T is a Julian date on the chart's time scale, Mag the
	// magnitude, Err its one-sigma error (0 or NaN when unknown). Points
	// with a NaN time or magnitude are missing and left out.
	Points []reduce.Point
	// OffsetMag is added to every magnitude, to set a check or comparison
	// star apart from the target; the key says so.
	OffsetMag float64
}

// TimeRange is an interval [From, To] of Julian dates.
type TimeRange struct{ From, To float64 }

// LightCurveData is what LightCurve draws.
type LightCurveData struct {
	Title string
	// Scale is the time scale of every time given: ephem.HJD, ephem.BJDTDB,
	// or 0 for the Julian date UTC of mid-exposure (as Reduction.Points
	// gives for any other scale).
	Scale    ephem.TimeScale
	MagLabel string   // the magnitude axis label; "" means "magnitude"
	Series   []Series // the target first, then check and comparison stars
	// Binned are optional means of the target in bins of time (X a Julian
	// date), drawn over its points.
	Binned []reduce.MagBin
	// Selection is an optional time range the user picked for a fit.
	Selection *TimeRange
	// Timing is an optional fitted extremum: its polynomial (when
	// Curve is set) over the points used, and a vertical mark at its time
	// with the ±σ band.
	Timing *reduce.Timing
	// Clock, when set, labels the time axis in clock time of that zone
	// (and UTC beside it when they differ), for one night: it needs times
	// in JD UTC (Scale 0), since HJD and BJD run up to 8.3 minutes off the
	// clock, and a span of at most MaxClockSpanDays.
	Clock *time.Location
}

// MaxClockSpanDays is the longest light curve drawn against clock time.
const MaxClockSpanDays = 2

// jdUnixEpoch is the Julian date of 1970-01-01T00:00:00 UTC.
const jdUnixEpoch = 2440587.5

// LightCurve draws magnitude against time: each series as markers of its
// own shape and colour with vertical error bars where errors are known,
// the magnitude axis inverted (brighter up, as observers draw it), binned
// means over the target, a picked time range shaded, and a fitted extremum
// as its curve, a vertical line at its time and a shaded ±σ band. The time
// axis shows the Julian date less a round offset named in its label, or
// clock time for one night (LightCurveData.Clock). The key sits right of
// the plot. Missing (NaN) points are dropped first; a chart with no point
// left is an error.
func LightCurve(d LightCurveData, pal Palette) (*plot.Plot, error) {
	p, _, err := lightCurve(d, pal)
	return p, err
}

// lightCurveParts are the plotters of a light curve, for the tests.
type lightCurveParts struct {
	series []*plotter.Scatter
	bars   []*plotter.YErrorBars // per series; nil when it has no error
	binned *plotter.Scatter
	fit    *plotter.Line
	mark   *plotter.Line
	band   *plotter.Polygon // the ±σ band
	sel    *plotter.Polygon
}

func lightCurve(d LightCurveData, pal Palette) (*plot.Plot, *lightCurveParts, error) {
	if err := pal.check(); err != nil {
		return nil, nil, err
	}
	if len(d.Series) == 0 {
		return nil, nil, fmt.Errorf("chart: light curve: no series given")
	}
	// Clean the data and find the ranges.
	xr, yr := newExtent(), newExtent()
	series := make([][]reduce.Point, len(d.Series))
	n := 0
	for i, s := range d.Series {
		if math.IsNaN(s.OffsetMag) || math.IsInf(s.OffsetMag, 0) {
			return nil, nil, fmt.Errorf("chart: light curve, series %q: offset %v: want a finite number", s.Name, s.OffsetMag)
		}
		pts, err := cleanPoints(fmt.Sprintf("series %q", s.Name), s.Points)
		if err != nil {
			return nil, nil, err
		}
		for _, q := range pts {
			xr.add(q.T)
			e := 0.0
			if hasErr(q.Err) {
				e = q.Err
			}
			yr.add(q.Mag+s.OffsetMag-e, q.Mag+s.OffsetMag+e)
		}
		series[i], n = pts, n+len(pts)
	}
	if n == 0 {
		return nil, nil, fmt.Errorf("chart: light curve: no point with both a time and a magnitude")
	}
	var bins []reduce.MagBin
	for _, b := range d.Binned {
		if !math.IsNaN(b.X) && !math.IsNaN(b.Mag) && !math.IsInf(b.X, 0) && !math.IsInf(b.Mag, 0) {
			bins = append(bins, b)
		}
	}
	if s := d.Selection; s != nil {
		if !(s.To > s.From) || math.IsInf(s.To-s.From, 0) {
			return nil, nil, fmt.Errorf("chart: light curve: selection from %v to %v: want a finite range with from < to", s.From, s.To)
		}
		xr.add(s.From, s.To)
	}
	tm := d.Timing
	var fitXY plotter.XYs // in Julian dates until x is known
	if tm != nil {
		if math.IsNaN(tm.Time) || math.IsInf(tm.Time, 0) {
			return nil, nil, fmt.Errorf("chart: light curve: fitted time %v: want a Julian date", tm.Time)
		}
		xr.add(tm.Time)
		if hasErr(tm.Sigma) {
			xr.add(tm.Time-tm.Sigma, tm.Time+tm.Sigma)
		}
		if tm.Curve != nil && tm.WindowTo > tm.WindowFrom {
			const steps = 200
			for k := 0; k <= steps; k++ {
				t := tm.WindowFrom + (tm.WindowTo-tm.WindowFrom)*float64(k)/steps
				if m := tm.Curve.At(t); !math.IsNaN(m) && !math.IsInf(m, 0) {
					fitXY = append(fitXY, plotter.XY{X: t, Y: m})
					yr.add(m)
				}
			}
		}
	}
	ylo, yhi := yr.padded(0.06, 0.05)

	ax, err := newTimeAxis(d.Scale, d.Clock, xr.lo, xr.hi)
	if err != nil {
		return nil, nil, err
	}
	x := ax.x
	magLabel := d.MagLabel
	if magLabel == "" {
		magLabel = "magnitude"
	}
	p := newPlot(pal, d.Title, ax.label, magLabel)
	invertMag(p)
	if ax.ticks != nil {
		p.X.Tick.Marker = ax.ticks
	}
	key := newSideKey(pal, p.Legend.TextStyle)
	parts := &lightCurveParts{}

	// Behind the data: the selection, the ±σ band, the grid.
	if s := d.Selection; s != nil {
		if parts.sel, err = rect(x(s.From), ylo, x(s.To), yhi, pal.selection(), draw.LineStyle{}); err != nil {
			return nil, nil, err
		}
		p.Add(parts.sel)
		key.add(fmt.Sprintf("picked for the fit: %s", ax.span(s.From, s.To)), swatch{fill: pal.selection()})
	}
	if tm != nil && hasErr(tm.Sigma) {
		if parts.band, err = rect(x(tm.Time-tm.Sigma), ylo, x(tm.Time+tm.Sigma), yhi, pal.sigma(), draw.LineStyle{}); err != nil {
			return nil, nil, err
		}
		p.Add(parts.band)
	}
	addGrid(p, pal)

	// The series, error bars under the markers.
	for i, s := range d.Series {
		xys := make(plotter.XYs, len(series[i]))
		errs := make([]float64, len(series[i]))
		for j, q := range series[i] {
			xys[j] = plotter.XY{X: x(q.T), Y: q.Mag + s.OffsetMag}
			errs[j] = q.Err
		}
		glyph := pal.seriesGlyph(i, vg.Points(2.4))
		var sc *plotter.Scatter
		var bars *plotter.YErrorBars
		if len(xys) > 0 {
			if sc, bars, err = marks(xys, errs, glyph); err != nil {
				return nil, nil, err
			}
			if bars != nil {
				p.Add(bars)
			}
			p.Add(sc)
		}
		parts.series = append(parts.series, sc)
		parts.bars = append(parts.bars, bars)
		name := s.Name
		if s.OffsetMag != 0 {
			name = fmt.Sprintf("%s %+.2f mag", s.Name, s.OffsetMag)
		}
		if len(xys) == 0 {
			name += " (no data)"
		}
		key.add(name, &plotter.Scatter{GlyphStyle: glyph})
	}
	if len(bins) > 0 {
		xys := make(plotter.XYs, len(bins))
		errs := make([]float64, len(bins))
		for j, b := range bins {
			xys[j], errs[j] = plotter.XY{X: x(b.X), Y: b.Mag}, b.Err
		}
		glyph := draw.GlyphStyle{Color: pal.fit(0), Radius: vg.Points(4), Shape: draw.RingGlyph{}}
		sc, bars, err := marks(xys, errs, glyph)
		if err != nil {
			return nil, nil, err
		}
		if bars != nil {
			bars.LineStyle.Width = vg.Points(1.2)
			p.Add(bars)
		}
		p.Add(sc)
		parts.binned = sc
		key.add(fmt.Sprintf("%s, binned means", d.Series[0].Name), sc)
	}

	// The fitted extremum.
	if tm != nil {
		kind := "maximum"
		if tm.Kind == reduce.Minimum {
			kind = "minimum"
		}
		if len(fitXY) > 1 {
			for k := range fitXY {
				fitXY[k].X = x(fitXY[k].X)
			}
			if parts.fit, err = line(fitXY, pal.fitLine(0, 1.8)); err != nil {
				return nil, nil, err
			}
			p.Add(parts.fit)
			key.add(fmt.Sprintf("fitted polynomial, degree %d", tm.Degree), parts.fit)
		}
		sty := pal.fitLine(1, 1.4)
		if parts.mark, err = line(plotter.XYs{{X: x(tm.Time), Y: ylo}, {X: x(tm.Time), Y: yhi}}, sty); err != nil {
			return nil, nil, err
		}
		p.Add(parts.mark)
		key.add(fmt.Sprintf("%s %s", kind, ax.instant(tm.Time)), parts.mark)
		if parts.band != nil {
			key.add(fmt.Sprintf("±1σ = %s", formatSigma(tm.Sigma)), swatch{fill: pal.sigma()})
		}
	}
	p.Add(key)

	xlo, xhi := xr.padded(0.03, 1.0/1440)
	p.X.Min, p.X.Max = x(xlo), x(xhi)
	p.Y.Min, p.Y.Max = ylo, yhi
	return p, parts, nil
}

// formatSigma writes an uncertainty in days, with seconds or minutes in
// brackets.
func formatSigma(d float64) string {
	s := d * 86400
	if s < 600 {
		return fmt.Sprintf("%.5f d (%.0f s)", d, s)
	}
	return fmt.Sprintf("%.4f d (%.1f min)", d, s/60)
}
