package chart

import (
	"fmt"
	"image/color"
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// DarkPalette is for screens in a dim room: light neutral text on a
// charcoal background, the sky as a ramp of neutral greys from a mid grey
// by day to near the background at night, and the colours of Okabe & Ito
// (2008, "Color Universal Design") chosen for a dark ground (sky blue,
// orange and bluish green first), each at a contrast of at least 2:1
// against the background. Unlike NightRedPalette it does not protect dark
// adaptation.
func DarkPalette() Palette {
	grey := func(v uint8) color.Color { return color.Gray{Y: v} }
	return Palette{
		Background: grey(24), Foreground: grey(225),
		Grid:          color.NRGBA{R: 255, G: 255, B: 255, A: 34},
		KeyBackground: grey(24),
		Day:           grey(92), Civil: grey(74), Nautical: grey(58), Astronomical: grey(44), Night: grey(32),
		Moon:   grey(170),
		MinAlt: color.RGBA{R: 235, G: 110, B: 90, A: 255},
		Window: color.NRGBA{A: 100},
		Stars: []color.Color{
			color.RGBA{R: 86, G: 180, B: 233, A: 255},  // sky blue
			color.RGBA{R: 230, G: 159, B: 0, A: 255},   // orange
			color.RGBA{R: 0, G: 158, B: 115, A: 255},   // bluish green
			color.RGBA{R: 204, G: 121, B: 167, A: 255}, // reddish purple
			grey(225), // near white
			color.RGBA{R: 240, G: 228, B: 66, A: 255}, // yellow
			color.RGBA{R: 213, G: 94, B: 0, A: 255},   // vermilion
		},
		Fits: []color.Color{
			grey(240),
			color.RGBA{R: 240, G: 228, B: 66, A: 255},  // yellow
			color.RGBA{R: 204, G: 121, B: 167, A: 255}, // reddish purple
		},
		Selection: color.NRGBA{R: 230, G: 159, B: 0, A: 55},
		Sigma:     color.NRGBA{R: 255, G: 255, B: 255, A: 40},
		Shade:     color.NRGBA{R: 255, G: 255, B: 255, A: 14},
		Faint:     grey(115),
		Flag:      color.RGBA{R: 240, G: 100, B: 80, A: 255},
	}
}

// PaletteNames lists the names PaletteNamed takes, the default first.
var PaletteNames = []string{"default", "dark", "night-red"}

// PaletteNamed returns the palette called name: "default" (also "" and
// "light"), "dark" or "night-red" (also "red"), in any case.
func PaletteNamed(name string) (Palette, error) {
	switch strings.ToLower(strings.TrimSpace(name)) {
	case "", "default", "light":
		return DefaultPalette(), nil
	case "dark":
		return DarkPalette(), nil
	case "night-red", "red", "night":
		return NightRedPalette(), nil
	}
	return Palette{}, fmt.Errorf("chart: palette %q: want one of %s", name, strings.Join(PaletteNames, ", "))
}

// fit returns the colour of the i-th fitted curve (Foreground when the
// palette has none).
func (p Palette) fit(i int) color.Color {
	if len(p.Fits) == 0 {
		return p.Foreground
	}
	return p.Fits[i%len(p.Fits)]
}

// orFaint returns c, or Foreground at alpha a when c is nil: the fallback
// of the measurement charts' fills.
func (p Palette) orFaint(c color.Color, a uint8) color.Color {
	if c != nil {
		return c
	}
	return translucent(p.Foreground, color.NRGBA{A: a})
}

func (p Palette) selection() color.Color { return p.orFaint(p.Selection, 40) }
func (p Palette) sigma() color.Color     { return p.orFaint(p.Sigma, 40) }
func (p Palette) shade() color.Color     { return p.orFaint(p.Shade, 14) }
func (p Palette) faint() color.Color     { return p.orFaint(p.Faint, 110) }
func (p Palette) flag() color.Color {
	if p.Flag == nil {
		return p.Foreground
	}
	return p.Flag
}

// check reports a palette that cannot draw a measurement chart.
func (p Palette) check() error {
	if len(p.Stars) == 0 {
		return fmt.Errorf("chart: the palette has no star colours")
	}
	if p.Foreground == nil || p.Background == nil {
		return fmt.Errorf("chart: the palette has no foreground or background colour")
	}
	return nil
}

// newPlot returns an empty plot in the palette's colours with the title,
// axis labels and the faint grid of every measurement chart.
func newPlot(pal Palette, title, xLabel, yLabel string) *plot.Plot {
	p := plot.New()
	p.BackgroundColor = pal.Background
	p.Title.Text = title
	p.Title.TextStyle.Color = pal.Foreground
	p.Title.TextStyle.Font.Size = vg.Points(13)
	for _, a := range []*plot.Axis{&p.X, &p.Y} {
		a.Color = pal.Foreground
		a.Label.TextStyle.Color = pal.Foreground
		a.Label.TextStyle.Font.Size = vg.Points(11)
		a.Tick.Color = pal.Foreground
		a.Tick.Label.Color = pal.Foreground
		a.Tick.Label.Font.Size = vg.Points(10)
	}
	p.X.Label.Text, p.Y.Label.Text = xLabel, yLabel
	p.X.Tick.Marker, p.Y.Tick.Marker = niceTicks{8}, niceTicks{8}
	return p
}

// addGrid adds the faint grid (drawn before the data, so under them).
func addGrid(p *plot.Plot, pal Palette) {
	g := plotter.NewGrid()
	g.Vertical.Color, g.Horizontal.Color = pal.Grid, pal.Grid
	g.Vertical.Width, g.Horizontal.Width = vg.Points(0.5), vg.Points(0.5)
	p.Add(g)
}

// invertMag turns the plot's y axis into a magnitude axis: brighter
// (smaller) magnitudes up.
func invertMag(p *plot.Plot) {
	p.Y.Scale = plot.InvertedScale{Normalizer: p.Y.Scale}
}

// seriesGlyphs are the marker shapes of series of points in turn: filled
// circle, filled square, filled triangle, cross, plus, ring. Shape alone
// tells the series apart in greyscale print and in night red.
var seriesGlyphs = []draw.GlyphDrawer{draw.CircleGlyph{}, draw.BoxGlyph{}, draw.PyramidGlyph{}, draw.CrossGlyph{},
	draw.PlusGlyph{}, draw.RingGlyph{}}

// seriesGlyph returns the marker of the i-th series of points.
func (p Palette) seriesGlyph(i int, radius vg.Length) draw.GlyphStyle {
	return draw.GlyphStyle{Color: p.star(i), Radius: radius, Shape: seriesGlyphs[i%len(seriesGlyphs)]}
}

// fitLine returns the line style of the i-th fitted curve: its colour and
// a dash pattern of its own (solid, long dashes, dash-dot), wide enough to
// read over the points.
func (p Palette) fitLine(i int, width float64) draw.LineStyle {
	sty := draw.LineStyle{Color: p.fit(i), Width: vg.Points(width)}
	for _, v := range starDashes[i%3] {
		sty.Dashes = append(sty.Dashes, vg.Points(v))
	}
	return sty
}

// niceTicks labels round values, at steps of 1, 2 or 5 times a power of
// ten giving at most n labels, with unlabelled minor ticks between.
type niceTicks struct{ n int }

// Ticks implements plot.Ticker.
func (t niceTicks) Ticks(lo, hi float64) []plot.Tick {
	span := hi - lo
	if !(span > 0) || math.IsInf(span, 0) || t.n < 1 {
		return plot.DefaultTicks{}.Ticks(lo, hi)
	}
	pow := math.Pow(10, math.Floor(math.Log10(span/float64(t.n))))
	step, sub := pow, 5
	for _, m := range []struct {
		mult float64
		sub  int
	}{{1, 5}, {2, 4}, {5, 5}, {10, 5}} {
		step, sub = m.mult*pow, m.sub
		if span/step <= float64(t.n) {
			break
		}
	}
	dec := max(0, int(-math.Floor(math.Log10(step)+1e-9)))
	minor := step / float64(sub)
	var out []plot.Tick
	for k := math.Ceil(lo/minor - 1e-9); k*minor <= hi+1e-9*span; k++ {
		v := k * minor
		tk := plot.Tick{Value: v}
		if int(math.Round(k))%sub == 0 {
			tk.Label = strconv.FormatFloat(v, 'f', dec, 64)
			if strings.Trim(tk.Label, "-0.") == "" {
				tk.Label = strings.TrimPrefix(tk.Label, "-")
			}
		}
		out = append(out, tk)
	}
	return out
}
