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
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"vigil/ephem"
	"vigil/internal/safefile"
	"vigil/observe"
)

// Altitude draws the altitude chart of one night: altitude (airless,
// degrees) against time, labelled in local time and UTC; the sky shaded by
// the Sun's altitude (day, civil, nautical and astronomical twilight,
// night); the Moon's altitude dashed; the site's lowest useful altitude; each
// target's curve; and at each predicted extremum a marker (▲ maximum,
// ▼ minimum; filled when observable) over its coverage window, drawn as a
// translucent band and a bar along the foot of the chart.
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
	title := fmt.Sprintf("%s — night of %s", c.Site, c.Date.Format("2006-01-02"))
	title += fmt.Sprintf("   (Moon %.0f%% lit)", 100*c.MoonIllum)
	p.Title.Text = title
	p.Title.TextStyle.Color = pal.Foreground
	p.Title.TextStyle.Font.Size = vg.Points(13)
	for _, a := range []*plot.Axis{&p.X, &p.Y} {
		a.Color = pal.Foreground
		a.Label.TextStyle.Color = pal.Foreground
		a.Tick.Color = pal.Foreground
		a.Tick.Label.Color = pal.Foreground
		a.Tick.Label.Font.Size = vg.Points(10)
	}
	p.X.Label.Text = fmt.Sprintf("time: local (%s) above, UTC below", loc)
	p.Y.Label.Text = "altitude (°, airless)"
	p.X.Min, p.X.Max = 0, xmax
	p.Y.Min, p.Y.Max = 0, 90
	p.X.Tick.Marker = hourTicks{from: c.From, loc: loc}
	p.Y.Tick.Marker = plot.TickerFunc(func(min, max float64) []plot.Tick {
		var ts []plot.Tick
		for v := 0.0; v <= 90; v += 10 {
			ts = append(ts, plot.Tick{Value: v, Label: fmt.Sprintf("%.0f", v)})
		}
		return ts
	})

	// The sky behind everything.
	for _, b := range skyBands(c, pal) {
		poly, err := plotter.NewPolygon(plotter.XYs{{X: x(b.from), Y: 0}, {X: x(b.to), Y: 0}, {X: x(b.to), Y: 90}, {X: x(b.from), Y: 90}})
		if err != nil {
			return nil, err
		}
		poly.Color = b.col
		poly.LineStyle.Width = 0
		p.Add(poly)
	}
	grid := plotter.NewGrid()
	grid.Vertical.Color, grid.Horizontal.Color = pal.Grid, pal.Grid
	grid.Vertical.Width, grid.Horizontal.Width = vg.Points(0.4), vg.Points(0.4)
	p.Add(grid)

	// Coverage windows, under the curves.
	for _, e := range c.Events {
		lo, hi := math.Max(0, x(e.Window.Start.Time())), math.Min(xmax, x(e.Window.End.Time()))
		if !(hi > lo) {
			continue
		}
		poly, err := plotter.NewPolygon(plotter.XYs{{X: lo, Y: 0}, {X: hi, Y: 0}, {X: hi, Y: 90}, {X: lo, Y: 90}})
		if err != nil {
			return nil, err
		}
		poly.Color = translucent(pal.star(e.TargetIndex), pal.Window)
		poly.LineStyle.Width = 0
		p.Add(poly)
		// A solid bar along the foot, one row per target.
		y0 := 0.4 + 1.6*float64(e.TargetIndex%8)
		bar, err := plotter.NewPolygon(plotter.XYs{{X: lo, Y: y0}, {X: hi, Y: y0}, {X: hi, Y: y0 + 1.2}, {X: lo, Y: y0 + 1.2}})
		if err != nil {
			return nil, err
		}
		bar.Color = pal.star(e.TargetIndex)
		bar.LineStyle.Width = 0
		p.Add(bar)
	}

	// The lowest useful altitude.
	if c.MinAltDeg > 0 {
		l, err := plotter.NewLine(plotter.XYs{{X: 0, Y: c.MinAltDeg}, {X: xmax, Y: c.MinAltDeg}})
		if err != nil {
			return nil, err
		}
		l.Color, l.Width, l.Dashes = pal.MinAlt, vg.Points(1), []vg.Length{vg.Points(2), vg.Points(3)}
		p.Add(l)
		p.Legend.Add(fmt.Sprintf("lowest useful altitude %.0f°", c.MinAltDeg), l)
	}

	// The Moon and the stars: only the parts above the horizon.
	addCurve := func(cv observe.Curve, col color.Color, width vg.Length, dashes []vg.Length) error {
		first := true
		for _, seg := range aboveHorizon(cv, x) {
			l, err := plotter.NewLine(seg)
			if err != nil {
				return err
			}
			l.Color, l.Width, l.Dashes = col, width, dashes
			p.Add(l)
			if first {
				p.Legend.Add(cv.Name, l)
				first = false
			}
		}
		return nil
	}
	if err := addCurve(c.Moon, pal.Moon, vg.Points(1.5), []vg.Length{vg.Points(6), vg.Points(3)}); err != nil {
		return nil, err
	}
	for i, s := range c.Stars {
		if err := addCurve(s, pal.star(i), vg.Points(2), nil); err != nil {
			return nil, err
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
		sc.GlyphStyle.Color = pal.star(e.TargetIndex)
		sc.GlyphStyle.Radius = vg.Points(5)
		sc.GlyphStyle.Shape = marker(e.Kind, e.Observable)
		p.Add(sc)
	}
	p.Legend.Top = true
	p.Legend.TextStyle.Color = pal.Foreground
	p.Legend.TextStyle.Font.Size = vg.Points(10)
	return p, nil
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
	shades := []color.Color{pal.Day, pal.Civil, pal.Nautical, pal.Astronomical, pal.Night}
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
			out = append(out, band{start, at, shades[cur]})
			start = at
			if l > cur {
				cur++
			} else {
				cur--
			}
		}
	}
	return append(out, band{start, ts[len(ts)-1], shades[cur]})
}

// aboveHorizon returns the parts of a curve at or above 0°, each ending at
// the interpolated horizon crossing.
func aboveHorizon(cv observe.Curve, x func(time.Time) float64) []plotter.XYs {
	var out []plotter.XYs
	var cur plotter.XYs
	for i, a := range cv.AltDeg {
		if i > 0 && (a >= 0) != (cv.AltDeg[i-1] >= 0) {
			f := -cv.AltDeg[i-1] / (a - cv.AltDeg[i-1])
			tx := x(cv.Times[i-1]) + f*(x(cv.Times[i])-x(cv.Times[i-1]))
			cur = append(cur, plotter.XY{X: tx, Y: 0})
			if a < 0 {
				out = append(out, cur)
				cur = nil
			}
		}
		if a >= 0 {
			cur = append(cur, plotter.XY{X: x(cv.Times[i]), Y: a})
		}
	}
	if len(cur) > 1 {
		out = append(out, cur)
	}
	return out
}

// translucent returns the opaque colour c with the alpha of a.
func translucent(c, a color.Color) color.Color {
	n := color.NRGBAModel.Convert(c).(color.NRGBA)
	n.A = color.NRGBAModel.Convert(a).(color.NRGBA).A
	return n
}

// marker returns the glyph of an extremum: a triangle pointing up for a
// maximum and down for a minimum, filled when observable.
func marker(k observe.Kind, observable bool) draw.GlyphDrawer {
	switch {
	case k == observe.Max && observable:
		return draw.PyramidGlyph{}
	case k == observe.Max:
		return draw.TriangleGlyph{}
	case observable:
		return downGlyph{filled: true}
	}
	return downGlyph{}
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

// hourTicks labels whole local hours with the local and the UTC time.
type hourTicks struct {
	from time.Time
	loc  *time.Location
}

// Ticks implements plot.Ticker: a labelled tick every hour (every two over
// a long night), a minor one every half hour.
func (h hourTicks) Ticks(min, max float64) []plot.Tick {
	step := time.Hour
	if max-min > 16 {
		step = 2 * time.Hour
	}
	t0 := h.from.Add(time.Duration(min * float64(time.Hour))).In(h.loc)
	t := t0.Truncate(30 * time.Minute)
	var out []plot.Tick
	for ; ; t = t.Add(30 * time.Minute) {
		v := t.Sub(h.from).Hours()
		if v > max {
			break
		}
		if v < min {
			continue
		}
		label := ""
		if t.Minute() == 0 && t.Sub(t.Truncate(step)) == 0 {
			label = t.Format("15:04") + "\n" + t.UTC().Format("15:04")
		}
		out = append(out, plot.Tick{Value: v, Label: label})
	}
	return out
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
	wt, err := p.WriterTo(w, h, ext)
	if err != nil {
		return fmt.Errorf("chart: %s: %w", path, err)
	}
	return safefile.Write(path, func(out io.Writer) error {
		_, err := wt.WriteTo(out)
		return err
	})
}
