package chart

import (
	"fmt"
	"image/color"
	"io"
	"path/filepath"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"

	"example.org/vigil/internal/safefile"
)

// Panels is a column of plots drawn one above the other on one page (an
// O−C diagram over its residuals), their plotting areas aligned left and
// right so that a shared x axis lines up.
type Panels struct {
	Plots []*plot.Plot
	// Heights are the panels' shares of the page height, top first; nil
	// means equal shares.
	Heights []float64
}

// Draw draws the panels on c, top first. The window renders them through
// this, as it renders a single plot through plot.Plot.Draw.
func (s Panels) Draw(c draw.Canvas) {
	if len(s.Plots) == 0 {
		return
	}
	// One background under all, so that the margins the alignment leaves
	// and the seams between panels take it.
	if bg := s.Plots[0].BackgroundColor; bg != nil {
		c.SetColor(bg)
		c.Fill(c.Rectangle.Path())
	}
	for i, t := range s.layout(c) {
		s.Plots[i].Draw(t)
	}
}

// layout returns the canvas of each panel: its share of c's height, top
// first, padded left and right so that every plotting area spans the same
// width as the one with the widest margins.
func (s Panels) layout(c draw.Canvas) []draw.Canvas {
	total := 0.0
	for i := range s.Plots {
		total += s.share(i)
	}
	tiles := make([]draw.Canvas, len(s.Plots))
	top := c.Max.Y
	for i := range s.Plots {
		h := (c.Max.Y - c.Min.Y) * vg.Length(s.share(i)/total)
		tiles[i] = c
		tiles[i].Max.Y, tiles[i].Min.Y = top, top-h
		top -= h
	}
	var left, right vg.Length
	for i, p := range s.Plots {
		d := p.DataCanvas(tiles[i])
		left, right = max(left, d.Min.X-tiles[i].Min.X), max(right, tiles[i].Max.X-d.Max.X)
	}
	for i, p := range s.Plots {
		d := p.DataCanvas(tiles[i])
		tiles[i].Min.X += left - (d.Min.X - tiles[i].Min.X)
		tiles[i].Max.X -= right - (tiles[i].Max.X - d.Max.X)
	}
	return tiles
}

// share returns panel i's share of the height.
func (s Panels) share(i int) float64 {
	if i < len(s.Heights) && s.Heights[i] > 0 {
		return s.Heights[i]
	}
	return 1
}

// SavePanels writes the panels to path, w by h, in the format its
// extension names: .png, .svg or .pdf. The file is written whole or not at
// all.
func SavePanels(s Panels, path string, w, h vg.Length) error {
	if len(s.Plots) == 0 {
		return fmt.Errorf("chart: %s: no panels to draw", path)
	}
	ext := strings.ToLower(strings.TrimPrefix(filepath.Ext(path), "."))
	switch ext {
	case "png", "svg", "pdf":
	default:
		return fmt.Errorf("chart: %s: format %q: want .png, .svg or .pdf", path, filepath.Ext(path))
	}
	var c vg.CanvasWriterTo
	if ext == "png" {
		// On the plots' background, not white: the last column and row of
		// pixels are only partly covered when w and h are not whole pixels.
		bg := s.Plots[0].BackgroundColor
		if bg == nil {
			bg = color.White
		}
		c = vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(w, h), vgimg.UseBackgroundColor(bg))}
	} else {
		var err error
		if c, err = draw.NewFormattedCanvas(w, h, ext); err != nil {
			return fmt.Errorf("chart: %s: %w", path, err)
		}
	}
	s.Draw(draw.New(c))
	return safefile.Write(path, func(out io.Writer) error {
		_, err := c.WriteTo(out)
		return err
	})
}
