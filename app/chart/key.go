package chart

import (
	"image/color"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// sideKey is the chart's key, drawn on its own background to the right of
// the plotting area: it declares a glyph box there, so that the plot makes
// room for it and it covers no curve.
type sideKey struct {
	leg        plot.Legend
	bg, border color.Color
	names      []string
}

// keyGap is the space between the plotting area and the key, keyPad the
// margin inside the key's box.
const (
	keyGap = 8
	keyPad = 5
)

func newSideKey(pal Palette, base text.Style) *sideKey {
	k := &sideKey{leg: plot.NewLegend(), bg: pal.KeyBackground, border: pal.Foreground}
	k.leg.TextStyle = base
	k.leg.TextStyle.Color = pal.Foreground
	k.leg.TextStyle.Font.Size = vg.Points(9)
	k.leg.Top, k.leg.Left = true, true
	k.leg.ThumbnailWidth = vg.Points(22)
	k.leg.Padding = vg.Points(1.5)
	return k
}

// add appends an entry.
func (k *sideKey) add(name string, thumbs ...plot.Thumbnailer) {
	k.leg.Add(name, thumbs...)
	k.names = append(k.names, name)
}

// size returns the width and height of the key's box.
func (k *sideKey) size() (w, h vg.Length) {
	sty := k.leg.TextStyle
	em := sty.Rectangle(" ").Max.X
	entry := vg.Length(0)
	for _, n := range k.names {
		r := sty.Rectangle(n)
		w = max(w, r.Max.X-r.Min.X)
		entry = max(entry, r.Max.Y)
	}
	n := vg.Length(len(k.names))
	h = n*entry + (n-1)*k.leg.Padding + sty.FontExtents().Descent + 2*keyPad
	w += k.leg.ThumbnailWidth + em + 2*keyPad
	return w, h
}

// Plot implements plot.Plotter: the box and the entries, right of c.
func (k *sideKey) Plot(c draw.Canvas, _ *plot.Plot) {
	w, h := k.size()
	box := vg.Rectangle{
		Min: vg.Point{X: c.Max.X + keyGap, Y: c.Max.Y - h},
		Max: vg.Point{X: c.Max.X + keyGap + w, Y: c.Max.Y},
	}
	c.SetColor(k.bg)
	c.Fill(box.Path())
	c.SetLineStyle(draw.LineStyle{Color: k.border, Width: vg.Points(0.5)})
	c.Stroke(box.Path())
	inner := draw.Canvas{Canvas: c.Canvas, Rectangle: vg.Rectangle{
		Min: vg.Point{X: box.Min.X + keyPad, Y: box.Min.Y + keyPad},
		Max: vg.Point{X: box.Max.X - keyPad, Y: box.Max.Y - keyPad},
	}}
	k.leg.Draw(inner)
}

// GlyphBoxes implements plot.GlyphBoxer: the key's box beyond the right
// edge of the plotting area (X = 1), its top level with the area's top.
func (k *sideKey) GlyphBoxes(_ *plot.Plot) []plot.GlyphBox {
	w, h := k.size()
	return []plot.GlyphBox{{X: 1, Y: 1, Rectangle: vg.Rectangle{
		Min: vg.Point{X: 0, Y: -h},
		Max: vg.Point{X: keyGap + w, Y: 0},
	}}}
}

// swatch is a key entry's patch: a rectangle filled and/or outlined.
type swatch struct {
	fill color.Color
	line draw.LineStyle
}

// Thumbnail implements plot.Thumbnailer.
func (s swatch) Thumbnail(c *draw.Canvas) {
	hh := (c.Max.Y - c.Min.Y) * 0.35
	y := (c.Min.Y + c.Max.Y) / 2
	r := vg.Rectangle{Min: vg.Point{X: c.Min.X, Y: y - hh}, Max: vg.Point{X: c.Max.X, Y: y + hh}}
	if s.fill != nil {
		c.SetColor(s.fill)
		c.Fill(r.Path())
	}
	if s.line.Width > 0 && s.line.Color != nil {
		c.SetLineStyle(s.line)
		c.Stroke(r.Path())
	}
}
