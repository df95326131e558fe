package chart

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"example.org/vigil/ephem"
)

// edgeAxis is a second scale along the top or the right edge of the
// plotting area (calendar years over cycle numbers, periods over
// frequencies, minutes beside days). Its ticks are placed at values of the
// plot's own axis on that side, so it follows that axis's range and scale;
// it declares glyph boxes so that the plot makes room for it.
type edgeAxis struct {
	top   bool        // along the top (ticks at x values); else along the right (y values)
	ticks []plot.Tick // an empty label marks a minor tick
	label string
	line  draw.LineStyle
	text  text.Style // tick labels
	title text.Style // the axis label
}

// Tick lengths and the gap between a tick and its label.
const (
	edgeTickLen = 5
	edgeTickPad = 2
)

// newEdgeAxis returns an edge axis in the palette's colours, its text
// styled like the plot's own axes.
func newEdgeAxis(p *plot.Plot, pal Palette, top bool, label string, ticks []plot.Tick) *edgeAxis {
	a := &edgeAxis{top: top, ticks: ticks, label: label, text: p.X.Tick.Label, title: p.X.Label.TextStyle}
	a.line = draw.LineStyle{Color: pal.Foreground, Width: vg.Points(0.5)}
	a.text.XAlign, a.text.YAlign = draw.XCenter, draw.YBottom
	if !top {
		a.text.XAlign, a.text.YAlign = draw.XLeft, draw.YCenter
	}
	a.title.XAlign, a.title.YAlign = draw.XCenter, draw.YBottom
	return a
}

// inRange returns the ticks inside the range of axis ax.
func inRange(ticks []plot.Tick, ax plot.Axis) []plot.Tick {
	lo, hi := math.Min(ax.Min, ax.Max), math.Max(ax.Min, ax.Max)
	var out []plot.Tick
	for _, t := range ticks {
		if t.Value >= lo && t.Value <= hi {
			out = append(out, t)
		}
	}
	return out
}

func (a *edgeAxis) axis(p *plot.Plot) plot.Axis {
	if a.top {
		return p.X
	}
	return p.Y
}

// labelSize returns the widest and tallest tick label.
func (a *edgeAxis) labelSize(ticks []plot.Tick) (w, h vg.Length) {
	for _, t := range ticks {
		if t.Label != "" {
			w, h = max(w, a.text.Width(t.Label)), max(h, a.text.Height(t.Label))
		}
	}
	return w, h
}

// depth returns how far the axis reaches out from the plotting area.
func (a *edgeAxis) depth(p *plot.Plot) vg.Length {
	w, h := a.labelSize(inRange(a.ticks, a.axis(p)))
	d := vg.Points(edgeTickLen + edgeTickPad)
	if a.top {
		d += h
	} else {
		d += w
	}
	if a.label != "" {
		d += vg.Points(edgeTickPad) + a.title.Height(a.label)
	}
	return d
}

// Plot implements plot.Plotter: the edge line, the ticks, their labels and
// the axis label, outside the data canvas c.
func (a *edgeAxis) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	ticks := inRange(a.ticks, a.axis(p))
	w, h := a.labelSize(ticks)
	tl, pad := vg.Points(edgeTickLen), vg.Points(edgeTickPad)
	if a.top {
		y := c.Max.Y
		c.StrokeLine2(a.line, c.Min.X, y, c.Max.X, y)
		for _, t := range ticks {
			x, l := trX(t.Value), tl
			if t.Label == "" {
				l = tl / 2
			}
			c.StrokeLine2(a.line, x, y, x, y+l)
			c.FillText(a.text, vg.Point{X: x, Y: y + tl + pad}, t.Label)
		}
		if a.label != "" {
			c.FillText(a.title, vg.Point{X: c.Center().X, Y: y + tl + pad + h + pad}, a.label)
		}
		return
	}
	x := c.Max.X
	c.StrokeLine2(a.line, x, c.Min.Y, x, c.Max.Y)
	for _, t := range ticks {
		y, l := trY(t.Value), tl
		if t.Label == "" {
			l = tl / 2
		}
		c.StrokeLine2(a.line, x, y, x+l, y)
		c.FillText(a.text, vg.Point{X: x + tl + pad, Y: y}, t.Label)
	}
	if a.label != "" {
		sty := a.title
		sty.Rotation = -math.Pi / 2 // reads top to bottom, facing the plot
		c.FillText(sty, vg.Point{X: x + tl + pad + w + pad, Y: c.Center().Y}, a.label)
	}
}

// GlyphBoxes implements plot.GlyphBoxer: one box per tick label and one
// for the axis label, so that the plot leaves room for them.
func (a *edgeAxis) GlyphBoxes(p *plot.Plot) []plot.GlyphBox {
	ax := a.axis(p)
	ticks := inRange(a.ticks, ax)
	d := a.depth(p)
	var out []plot.GlyphBox
	for _, t := range ticks {
		if t.Label == "" {
			continue
		}
		tw, th := a.text.Width(t.Label), a.text.Height(t.Label)
		if a.top {
			out = append(out, plot.GlyphBox{X: ax.Norm(t.Value), Y: 1,
				Rectangle: vg.Rectangle{Min: vg.Point{X: -tw / 2}, Max: vg.Point{X: tw / 2, Y: d}}})
		} else {
			out = append(out, plot.GlyphBox{X: 1, Y: ax.Norm(t.Value),
				Rectangle: vg.Rectangle{Min: vg.Point{Y: -th / 2}, Max: vg.Point{X: d, Y: th / 2}}})
		}
	}
	if a.label != "" {
		lw := a.title.Width(a.label)
		if a.top {
			out = append(out, plot.GlyphBox{X: 0.5, Y: 1, Rectangle: vg.Rectangle{Min: vg.Point{X: -lw / 2}, Max: vg.Point{X: lw / 2, Y: d}}})
		} else {
			out = append(out, plot.GlyphBox{X: 1, Y: 0.5, Rectangle: vg.Rectangle{Min: vg.Point{Y: -lw / 2}, Max: vg.Point{X: d, Y: lw / 2}}})
		}
	}
	return out
}

// shiftedKey is a side key moved dx further right, to clear a right edge
// axis.
type shiftedKey struct {
	*sideKey
	dx vg.Length
}

// Plot implements plot.Plotter.
func (k shiftedKey) Plot(c draw.Canvas, p *plot.Plot) {
	c.Max.X += k.dx
	k.sideKey.Plot(c, p)
}

// GlyphBoxes implements plot.GlyphBoxer.
func (k shiftedKey) GlyphBoxes(p *plot.Plot) []plot.GlyphBox {
	bs := k.sideKey.GlyphBoxes(p)
	for i := range bs {
		bs[i].Min.X += k.dx
		bs[i].Max.X += k.dx
	}
	return bs
}

// minuteTicks returns ticks at round numbers of minutes, at most n
// labelled, for an axis in days from lo to hi.
func minuteTicks(lo, hi float64, n int) []plot.Tick {
	ts := niceTicks{n}.Ticks(lo*1440, hi*1440)
	for i := range ts {
		ts[i].Value /= 1440
	}
	return ts
}

// calendarTicks returns ticks at the first of a month every few months
// (or every few years) of the cycles xlo to xhi of ephemeris eph, at
// least two and about six labelled, with the axis label; none when the
// span is too short for two.
func calendarTicks(eph ephem.Ephemeris, xlo, xhi float64) ([]plot.Tick, string) {
	jd0, jd1 := eph.At(xlo), eph.At(xhi)
	if jd1 < jd0 {
		jd0, jd1 = jd1, jd0
	}
	const daysPerMonth = 365.25 / 12
	months := (jd1 - jd0) / daysPerMonth
	step := 0
	for _, s := range []int{1, 2, 3, 6, 12, 24, 60, 120, 240, 600, 1200, 6000} {
		if months/float64(s) <= 7 {
			step = s
			break
		}
	}
	if step == 0 {
		return nil, ""
	}
	y, m, _ := ephem.JDToCalendar(jd0)
	i := y*12 + m - 1
	i = (i/step + 1) * step // the first multiple of step after jd0's month
	var ts []plot.Tick
	for ; ; i += step {
		y, mo := i/12, i%12+1
		jd := ephem.CalendarToJD(y, mo, 1)
		if jd > jd1 {
			break
		}
		label := fmt.Sprintf("%d", y)
		if step < 12 {
			label = fmt.Sprintf("%d-%02d", y, mo)
		}
		ts = append(ts, plot.Tick{Value: eph.Cycle(jd), Label: label})
	}
	if len(ts) < 2 {
		return nil, ""
	}
	return ts, fmt.Sprintf("date (%s)", eph.Scale.Label())
}
