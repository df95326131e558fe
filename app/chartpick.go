package app

import (
	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/theme"
)

// PlotArea says where the plotting area of a chart lies in its view and
// which data it spans, so that a position in the view maps to data (for a
// linear axis, such as a light curve's time).
type PlotArea struct {
	// Min is the top-left corner of the plotting area in the view, Max its
	// bottom-right corner (Fyne units).
	Min, Max fyne.Position
	// The data at the edges: XMin at Min.X, XMax at Max.X, YMin at the
	// bottom, YMax at the top (before any inverted scale).
	XMin, XMax, YMin, YMax float64
}

// X returns the data x at horizontal position px of the view (linear
// axis), and whether px lies over the plotting area.
func (a PlotArea) X(px float32) (x float64, inside bool) {
	w := a.Max.X - a.Min.X
	if w <= 0 {
		return a.XMin, false
	}
	f := float64((px - a.Min.X) / w)
	return a.XMin + f*(a.XMax-a.XMin), f >= 0 && f <= 1
}

// PosX returns the horizontal position in the view of data x (linear axis).
func (a PlotArea) PosX(x float64) float32 {
	if a.XMax == a.XMin {
		return a.Min.X
	}
	return a.Min.X + float32((x-a.XMin)/(a.XMax-a.XMin))*(a.Max.X-a.Min.X)
}

// clampX keeps a horizontal position within the plotting area.
func (a PlotArea) clampX(px float32) float32 { return min(max(px, a.Min.X), a.Max.X) }

// Dragged shades the range being dragged over the plotting area.
func (c *ChartView) Dragged(e *fyne.DragEvent) {
	if c.OnPick == nil || !c.hasArea {
		return
	}
	if !c.drag {
		c.drag = true
		c.dragX = c.area.clampX(e.Position.X - e.Dragged.DX)
	}
	x := c.area.clampX(e.Position.X)
	c.overlay.FillColor = theme.Color(theme.ColorNameSelection)
	c.overlay.Move(fyne.NewPos(min(x, c.dragX), c.area.Min.Y))
	c.overlay.Resize(fyne.NewSize(abs32(x-c.dragX), c.area.Max.Y-c.area.Min.Y))
	c.overlay.Show()
	c.overlay.Refresh()
}

// DragEnd reports the range dragged (OnPick); a drag of under 3 units is
// taken for a slip and dropped.
func (c *ChartView) DragEnd() {
	if !c.drag {
		return
	}
	c.drag = false
	x0, x1 := c.overlay.Position().X, c.overlay.Position().X+c.overlay.Size().Width
	if x1-x0 < 3 {
		c.overlay.Hide()
		return
	}
	from, _ := c.area.X(x0)
	to, _ := c.area.X(x1)
	if c.OnPick != nil {
		c.OnPick(from, to)
	}
}

func abs32(v float32) float32 {
	if v < 0 {
		return -v
	}
	return v
}
