// Package chart draws vigil's charts with gonum/plot. It takes plain data
// from observe and reduce, returns a *plot.Plot, and imports no GUI toolkit:
// the window renders the plot, the command line saves it (PNG, SVG or PDF).
package chart

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"path/filepath"
	"strings"
	"time"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/safefile"
	"example.org/vigil/observe"
)

// Altitude draws the altitude chart of one night: altitude (airless,
// degrees) against time; the sky shaded by the Sun's altitude from light
// (day) to dark (night) through civil, nautical and astronomical twilight;
// the Moon's altitude dashed; the site's lowest useful altitude dotted; each
// target's curve in its own colour and dash pattern, labelled at its highest
// point and drawn wider inside its coverage windows; at each predicted
// extremum a marker (▲ maximum, ▼ minimum; filled when observable); and the
// coverage windows as bars along the foot of the chart, one row per target
// (solid when the whole window is usable, outlined otherwise). The key sits
// to the right of the plot, hiding nothing. The time axis is labelled in
// local time, with UTC in a second row when the site's zone differs from it.
// Shapes, dashes and shades carry every distinction, so the chart reads in
// greyscale print as well as in colour.
func Altitude(c observe.Chart, pal Palette) (*plot.Plot, error) {
	if len(c.Sun.Times) < 2 || !c.To.After(c.From) {
		return nil, fmt.Errorf("chart: the night's data are empty")
	}
	if len(pal.Stars) == 0 {
		return nil, fmt.Errorf("chart: the palette has no star colours")
	}
	loc := c.Location
	if loc == nil {
		loc = time.UTC
	}
	x := func(t time.Time) float64 { return t.Sub(c.From).Hours() }
	xmax := x(c.To)

	p := plot.New()
	p.BackgroundColor = pal.Background
	p.Title.Text = fmt.Sprintf("%s — night of %s   (Moon %.0f%% lit)", c.Site, c.Date.Format("2006-01-02"), 100*c.MoonIllum)
	p.Title.TextStyle.Color = pal.Foreground
	p.Title.TextStyle.Font.Size = vg.Points(13)
	for _, a := range []*plot.Axis{&p.X, &p.Y} {
		a.Color = pal.Foreground
		a.Label.TextStyle.Color = pal.Foreground
		a.Tick.Color = pal.Foreground
		a.Tick.Label.Color = pal.Foreground
		a.Tick.Label.Font.Size = vg.Points(10)
	}
	ticks := newHourTicks(c.From, c.To, loc)
	p.X.Label.Text = ticks.label()
	p.Y.Label.Text = "altitude (°, airless)"
	p.X.Min, p.X.Max = 0, xmax
	p.Y.Min, p.Y.Max = 0, 90
	p.X.Tick.Marker = ticks
	p.Y.Tick.Marker = plot.TickerFunc(func(min, max float64) []plot.Tick {
		var ts []plot.Tick
		for v := 0.0; v <= 90; v += 10 {
			ts = append(ts, plot.Tick{Value: v, Label: fmt.Sprintf("%.0f", v)})
		}
		return ts
	})
	key := newSideKey(pal, p.Legend.TextStyle)

	// The sky behind everything, then the grid.
	for _, b := range skyBands(c, pal) {
		poly, err := rect(x(b.from), 0, x(b.to), 90, b.col, draw.LineStyle{})
		if err != nil {
			return nil, err
		}
		p.Add(poly)
	}
	grid := plotter.NewGrid()
	grid.Vertical.Color, grid.Horizontal.Color = pal.Grid, pal.Grid
	grid.Vertical.Width, grid.Horizontal.Width = vg.Points(0.5), vg.Points(0.5)
	p.Add(grid)

	// The lowest useful altitude.
	if c.MinAltDeg > 0 {
		l, err := plotter.NewLine(plotter.XYs{{X: 0, Y: c.MinAltDeg}, {X: xmax, Y: c.MinAltDeg}})
		if err != nil {
			return nil, err
		}
		l.Color, l.Width, l.Dashes = pal.MinAlt, vg.Points(1), []vg.Length{vg.Points(1.5), vg.Points(2.5)}
		p.Add(l)
		key.add(fmt.Sprintf("lowest useful altitude %.0f°", c.MinAltDeg), l)
	}

	// Coverage windows as bars along the foot.
	for _, b := range footBars(c, xmax) {
		poly, err := rect(b.x0, b.y0, b.x1, b.y1, nil, draw.LineStyle{})
		if err != nil {
			return nil, err
		}
		col := pal.star(b.target)
		if b.whole {
			poly.Color = col
		} else {
			poly.Color = translucent(col, pal.Window)
			poly.LineStyle = draw.LineStyle{Color: col, Width: vg.Points(1)}
		}
		p.Add(poly)
	}

	// The Moon and the stars, only the parts above the horizon: first a
	// halo of the background colour under every curve (it keeps the light
	// colours clear of the grey night, on screen and in print), then a wide
	// faint trace of each curve inside its coverage windows, then the
	// curves.
	moonStyle := draw.LineStyle{Color: pal.Moon, Width: vg.Points(1.2), Dashes: []vg.Length{vg.Points(4), vg.Points(4)}}
	curves := append([]observe.Curve{c.Moon}, c.Stars...)
	styles := []draw.LineStyle{moonStyle}
	for i := range c.Stars {
		styles = append(styles, pal.starLine(i))
	}
	add := func(seg plotter.XYs, sty draw.LineStyle) (*plotter.Line, error) {
		l, err := plotter.NewLine(seg)
		if err != nil {
			return nil, err
		}
		l.LineStyle = sty
		p.Add(l)
		return l, nil
	}
	for i, cv := range curves {
		halo := draw.LineStyle{Color: pal.Background, Width: styles[i].Width + vg.Points(2)}
		for _, seg := range aboveHorizon(cv, x, c.From, c.To) {
			if _, err := add(seg, halo); err != nil {
				return nil, err
			}
		}
	}
	for _, e := range c.Events {
		if e.TargetIndex < 0 || e.TargetIndex >= len(c.Stars) {
			continue
		}
		trace := draw.LineStyle{Color: translucent(pal.star(e.TargetIndex), pal.Window), Width: vg.Points(7)}
		for _, seg := range aboveHorizon(c.Stars[e.TargetIndex], x, e.Window.Start.Time(), e.Window.End.Time()) {
			if _, err := add(seg, trace); err != nil {
				return nil, err
			}
		}
	}
	for i, cv := range curves {
		var thumb plot.Thumbnailer = &plotter.Line{LineStyle: styles[i]} // also when never up
		for _, seg := range aboveHorizon(cv, x, c.From, c.To) {
			if _, err := add(seg, styles[i]); err != nil {
				return nil, err
			}
		}
		key.add(cv.Name, thumb)
	}
	if len(c.Stars) <= maxDirectLabels {
		for _, labels := range []func() (*plotter.Labels, error){
			func() (*plotter.Labels, error) { return peakLabels(c, x, pal) },
			func() (*plotter.Labels, error) { return barLabels(c, xmax, pal) },
		} {
			l, err := labels()
			if err != nil {
				return nil, err
			}
			if l != nil {
				p.Add(l)
			}
		}
	}

	// Markers at the extrema.
	for _, e := range c.Events {
		t := e.UTC.Time()
		if t.Before(c.From) || t.After(c.To) || e.AltDeg < 0 {
			continue
		}
		sc, err := plotter.NewScatter(plotter.XYs{{X: x(t), Y: e.AltDeg}})
		if err != nil {
			return nil, err
		}
		sc.GlyphStyle = markerStyle(e.Kind, e.Observable, pal.star(e.TargetIndex))
		p.Add(sc)
	}

	// The key: marks, then the sky's shades.
	for _, m := range []struct {
		name string
		kind observe.Kind
		obs  bool
	}{
		{"maximum, observable", observe.Max, true},
		{"maximum, not observable", observe.Max, false},
		{"minimum, observable", observe.Min, true},
		{"minimum, not observable", observe.Min, false},
	} {
		key.add(m.name, &plotter.Scatter{GlyphStyle: markerStyle(m.kind, m.obs, pal.Foreground)})
	}
	key.add("window, all usable", swatch{fill: pal.Foreground})
	key.add("window, partly usable", swatch{fill: translucent(pal.Foreground, pal.Window),
		line: draw.LineStyle{Color: pal.Foreground, Width: vg.Points(1)}})
	for i, name := range []string{"day", "civil twilight", "nautical twilight", "astronomical twilight", "night"} {
		key.add(name, swatch{fill: pal.sky(i), line: draw.LineStyle{Color: pal.Grid, Width: vg.Points(0.5)}})
	}
	p.Add(key)
	return p, nil
}

// maxDirectLabels is the most stars whose names are written on the chart
// beside their curves; with more, the key alone names them.
const maxDirectLabels = 10

// rect returns a filled (fill not nil) and/or outlined rectangle.
func rect(x0, y0, x1, y1 float64, fill color.Color, line draw.LineStyle) (*plotter.Polygon, error) {
	poly, err := plotter.NewPolygon(plotter.XYs{{X: x0, Y: y0}, {X: x1, Y: y0}, {X: x1, Y: y1}, {X: x0, Y: y1}})
	if err != nil {
		return nil, err
	}
	poly.Color = fill
	poly.LineStyle = line
	return poly, nil
}

// band is a stretch of sky of one shade.
type band struct {
	from, to time.Time
	col      color.Color
}

// skyBands splits the span by the Sun's altitude at the twilight limits
// (USNO definitions: −0.8333°, −6°, −12°, −18°), with the crossing instants
// interpolated between the samples.
func skyBands(c observe.Chart, pal Palette) []band {
	limits := []float64{ephem.SunriseAltDeg, ephem.CivilAltDeg, ephem.NauticalAltDeg, ephem.AstronomicalAltDeg}
	level := func(alt float64) int {
		i := 0
		for i < len(limits) && alt < limits[i] {
			i++
		}
		return i
	}
	ts, alt := c.Sun.Times, c.Sun.AltDeg
	var out []band
	start, cur := ts[0], level(alt[0])
	for i := 1; i < len(ts); i++ {
		l := level(alt[i])
		for cur != l {
			// Cross one limit at a time, toward l.
			var lim float64
			if l > cur {
				lim = limits[cur]
			} else {
				lim = limits[cur-1]
			}
			f := (lim - alt[i-1]) / (alt[i] - alt[i-1])
			at := ts[i-1].Add(time.Duration(f * float64(ts[i].Sub(ts[i-1]))))
			out = append(out, band{start, at, pal.sky(cur)})
			start = at
			if l > cur {
				cur++
			} else {
				cur--
			}
		}
	}
	return append(out, band{start, ts[len(ts)-1], pal.sky(cur)})
}

// footBar is one coverage window drawn along the foot of the chart: hours
// from the start (x0, x1) and altitudes (y0, y1) of its row.
type footBar struct {
	x0, x1, y0, y1 float64
	target         int
	whole          bool
}

// barLayout returns where the window bars go: row r (the target's index)
// spans [base + r·pitch, base + r·pitch + height] in altitude (degrees).
// One row per target, all below the lowest useful altitude (or below 10°
// when that is lower), at most maxBarPitchDeg apart.
func barLayout(c observe.Chart) (base, pitch, height float64) {
	const maxBarPitchDeg = 1.8
	room := math.Max(c.MinAltDeg, 10) * 0.9
	pitch = math.Min(maxBarPitchDeg, room/float64(max(1, len(c.Stars))))
	return pitch / 3, pitch, pitch * 2 / 3
}

// footBars returns the coverage windows of the chart's events, clipped to
// the span (xmax hours long), in rows by target.
func footBars(c observe.Chart, xmax float64) []footBar {
	base, pitch, height := barLayout(c)
	var out []footBar
	for _, e := range c.Events {
		lo := math.Max(0, e.Window.Start.Time().Sub(c.From).Hours())
		hi := math.Min(xmax, e.Window.End.Time().Sub(c.From).Hours())
		if !(hi > lo) {
			continue
		}
		y0 := base + pitch*float64(e.TargetIndex)
		out = append(out, footBar{lo, hi, y0, y0 + height, e.TargetIndex, e.Window.Whole})
	}
	return out
}

// aboveHorizon returns the parts of a curve at or above 0° within
// [from, to], each ending at the interpolated horizon crossing or at the
// ends of the interval.
func aboveHorizon(cv observe.Curve, x func(time.Time) float64, from, to time.Time) []plotter.XYs {
	var out []plotter.XYs
	var cur plotter.XYs
	flush := func() {
		if len(cur) > 1 {
			out = append(out, cur)
		}
		cur = nil
	}
	pt := func(t time.Time, a float64) { cur = append(cur, plotter.XY{X: x(t), Y: a}) }
	// at returns the altitude at t between samples i-1 and i.
	at := func(i int, t time.Time) float64 {
		f := float64(t.Sub(cv.Times[i-1])) / float64(cv.Times[i].Sub(cv.Times[i-1]))
		return cv.AltDeg[i-1] + f*(cv.AltDeg[i]-cv.AltDeg[i-1])
	}
	for i, a := range cv.AltDeg {
		t := cv.Times[i]
		if i > 0 {
			t0 := cv.Times[i-1]
			if t0.Before(from) && !t.Before(from) && at(i, from) >= 0 { // enters the interval
				pt(from, at(i, from))
			}
			if (a >= 0) != (cv.AltDeg[i-1] >= 0) { // crosses the horizon
				f := -cv.AltDeg[i-1] / (a - cv.AltDeg[i-1])
				tc := t0.Add(time.Duration(f * float64(t.Sub(t0))))
				if !tc.Before(from) && !tc.After(to) {
					pt(tc, 0)
				}
				if a < 0 {
					flush()
				}
			}
			if !t0.After(to) && t.After(to) && at(i, to) >= 0 { // leaves it
				pt(to, at(i, to))
				flush()
			}
		}
		if a >= 0 && !t.Before(from) && !t.After(to) {
			pt(t, a)
		}
	}
	flush()
	return out
}

// peakLabels names the Moon and each star at the highest point of its
// curve (when it is up at all), in its colour.
func peakLabels(c observe.Chart, x func(time.Time) float64, pal Palette) (*plotter.Labels, error) {
	var xys plotter.XYs
	var names []string
	var cols []color.Color
	var align []float64
	for i, s := range append([]observe.Curve{c.Moon}, c.Stars...) {
		best := -1
		for j, a := range s.AltDeg {
			if a >= 0 && (best < 0 || a > s.AltDeg[best]) {
				best = j
			}
		}
		if best < 0 {
			continue
		}
		xys = append(xys, plotter.XY{X: x(s.Times[best]), Y: math.Min(s.AltDeg[best], 86)})
		names = append(names, s.Name)
		// At an end of the span the name runs inward from its point.
		switch best {
		case 0:
			align = append(align, 0)
		case len(s.AltDeg) - 1:
			align = append(align, -1)
		default:
			align = append(align, -0.5)
		}
		if i == 0 {
			cols = append(cols, pal.Moon)
		} else {
			cols = append(cols, pal.star(i-1))
		}
	}
	l, err := newLabels(xys, names, cols, 0, vg.Points(3))
	if l == nil || err != nil {
		return l, err
	}
	for k := range l.TextStyle {
		l.TextStyle[k].XAlign = text.XAlignment(align[k])
	}
	return l, nil
}

// barLabels names the row of each target's window bars, beside its first
// bar: to its left, or to its right when it starts near the left edge.
func barLabels(c observe.Chart, xmax float64, pal Palette) (*plotter.Labels, error) {
	var xys plotter.XYs
	var names []string
	var cols []color.Color
	var right []bool
	done := map[int]bool{}
	for _, b := range footBars(c, xmax) {
		if done[b.target] || b.target >= len(c.Stars) {
			continue
		}
		done[b.target] = true
		r := b.x0 < 0.12*xmax
		at := b.x0 - barLabelGapH
		if r {
			at = b.x1 + barLabelGapH
		}
		xys = append(xys, plotter.XY{X: at, Y: (b.y0 + b.y1) / 2})
		names = append(names, c.Stars[b.target].Name)
		cols = append(cols, pal.star(b.target))
		right = append(right, r)
	}
	l, err := newLabels(xys, names, cols, 0, 0)
	if l == nil || err != nil {
		return l, err
	}
	for k := range l.TextStyle {
		l.TextStyle[k].Font.Size = vg.Points(7)
		l.TextStyle[k].YAlign = -0.5 // centred on the bar
		l.TextStyle[k].XAlign = -1   // ending at the bar's start
		if right[k] {
			l.TextStyle[k].XAlign = 0 // starting at its end
		}
	}
	return l, nil
}

// barLabelGapH is the gap (hours) between a bar and its label.
const barLabelGapH = 0.08

// newLabels returns labels at xys in the colours cols, 9 points, centred
// above their points by offset dy (nil when there are none).
func newLabels(xys plotter.XYs, names []string, cols []color.Color, dx, dy vg.Length) (*plotter.Labels, error) {
	if len(names) == 0 {
		return nil, nil
	}
	l, err := plotter.NewLabels(plotter.XYLabels{XYs: xys, Labels: names})
	if err != nil {
		return nil, err
	}
	for k := range l.TextStyle {
		l.TextStyle[k].Color = cols[k]
		l.TextStyle[k].Font.Size = vg.Points(9)
		l.TextStyle[k].XAlign = -0.5 // centred
		l.TextStyle[k].YAlign = 0    // above the point
	}
	l.Offset = vg.Point{X: dx, Y: dy}
	return l, nil
}

// translucent returns the opaque colour c with the alpha of a.
func translucent(c, a color.Color) color.Color {
	n := color.NRGBAModel.Convert(c).(color.NRGBA)
	n.A = color.NRGBAModel.Convert(a).(color.NRGBA).A
	return n
}

// markerStyle returns the glyph of an extremum: a triangle pointing up for
// a maximum and down for a minimum, filled when observable.
func markerStyle(k observe.Kind, observable bool, col color.Color) draw.GlyphStyle {
	sty := draw.GlyphStyle{Color: col, Radius: vg.Points(5)}
	switch {
	case k == observe.Max && observable:
		sty.Shape = draw.PyramidGlyph{}
	case k == observe.Max:
		sty.Shape = draw.TriangleGlyph{}
	default:
		sty.Shape = downGlyph{filled: observable}
	}
	return sty
}

// downGlyph is a triangle pointing down.
type downGlyph struct{ filled bool }

// DrawGlyph implements draw.GlyphDrawer.
func (g downGlyph) DrawGlyph(c *draw.Canvas, sty draw.GlyphStyle, pt vg.Point) {
	r := sty.Radius
	var p vg.Path
	p.Move(vg.Point{X: pt.X - r, Y: pt.Y + r*0.6})
	p.Line(vg.Point{X: pt.X + r, Y: pt.Y + r*0.6})
	p.Line(vg.Point{X: pt.X, Y: pt.Y - r})
	p.Close()
	c.SetColor(sty.Color)
	if g.filled {
		c.Fill(p)
		return
	}
	c.SetLineWidth(vg.Points(1.2))
	c.Stroke(p)
}

// Save writes the plot to path, w by h, in the format its extension names:
// .png, .svg or .pdf. The file is written whole or not at all.
func Save(p *plot.Plot, path string, w, h vg.Length) error {
	ext := strings.ToLower(strings.TrimPrefix(filepath.Ext(path), "."))
	switch ext {
	case "png", "svg", "pdf":
	default:
		return fmt.Errorf("chart: %s: format %q: want .png, .svg or .pdf", path, filepath.Ext(path))
	}
	var wt io.WriterTo
	if ext == "png" {
		// Draw on a canvas filled with the plot's own background, so that a
		// size that is not a whole number of pixels leaves no white seam.
		c := vgimg.NewWith(vgimg.UseWH(w, h), vgimg.UseBackgroundColor(p.BackgroundColor))
		p.Draw(draw.New(c))
		wt = vgimg.PngCanvas{Canvas: c}
	} else {
		var err error
		if wt, err = p.WriterTo(w, h, ext); err != nil {
			return fmt.Errorf("chart: %s: %w", path, err)
		}
	}
	return safefile.Write(path, func(out io.Writer) error {
		_, err := wt.WriteTo(out)
		return err
	})
}
