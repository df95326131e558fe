package app

import (
	"context"
	"errors"
	"fmt"
	"image"
	"sync"
	"sync/atomic"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/canvas"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"

	"example.org/vigil/app/chart"
)

// Drawable is what a chart view shows: a *plot.Plot or chart.Panels.
type Drawable interface{ Draw(draw.Canvas) }

// ChartSource builds the chart for a palette. It runs off the UI thread (in
// a job), so it may compute what the chart needs; it should give up with
// ctx.Err() when ctx is cancelled.
type ChartSource func(ctx context.Context, pal chart.Palette) (Drawable, error)

// Charts are drawn at chartDPI on a canvas of scale 1 (a 10 pt label is
// then 13 px, beside Fyne's 14 px text). A view less than chartMinPt tall
// at that resolution is drawn at a lower one, down to chartMinDPI, so that
// a chart's side key still fits beside its plotting area.
const (
	chartDPI    = 96
	chartMinDPI = 64
	chartMinPt  = 280
)

var chartViews atomic.Int64 // numbers the views' job slots

// ChartView shows a chart drawn to an image at the view's size. The chart
// is built (SetSource, Rebuild) and drawn (also on every resize) off the UI
// thread through Jobs; the last image stays on show meanwhile. For a
// *plot.Plot, Area maps positions in the view to data, and OnPick reports a
// range of x dragged across the plotting area.
type ChartView struct {
	widget.BaseWidget

	// OnPick, when set, is called with the data x at both ends (from < to)
	// after a drag across the plotting area of a *plot.Plot.
	OnPick func(from, to float64)
	// OnDrawn, when set, is called on the UI thread after each new image.
	OnDrawn func()

	jobs    *Jobs
	slot    string
	palette func() chart.Palette

	src     ChartSource
	built   Drawable // the chart src built for the current palette
	drawn   fyne.Size
	area    PlotArea
	hasArea bool
	dragX   float32
	drag    bool
	drawMu  sync.Mutex // one drawing at a time: a plot is not safe to draw twice at once

	img     *canvas.Image
	overlay *canvas.Rectangle
	msg     *widget.Label
}

// NewChartView returns an empty chart view whose work runs in jobs, drawn
// in the palette that palette returns when it is built. Window.NewChartView
// also rebuilds it when the theme changes.
func NewChartView(jobs *Jobs, palette func() chart.Palette) *ChartView {
	c := &ChartView{jobs: jobs, palette: palette, slot: fmt.Sprintf("chart#%d", chartViews.Add(1))}
	c.img = canvas.NewImageFromImage(nil)
	c.img.FillMode = canvas.ImageFillContain
	// The image is drawn at the view's size in pixels, so it is shown
	// pixel for pixel: a smoothing filter would gain nothing, and its
	// overshoot at sharp edges (bicubic kernels) would lift a night-red
	// line of red 200 to 206.
	c.img.ScaleMode = canvas.ImageScalePixels
	c.overlay = canvas.NewRectangle(theme.Color(theme.ColorNameSelection))
	c.overlay.Hide()
	c.msg = widget.NewLabel("")
	c.msg.Alignment = fyne.TextAlignCenter
	c.msg.Wrapping = fyne.TextWrapWord
	c.ExtendBaseWidget(c)
	return c
}

// CreateRenderer implements fyne.Widget.
func (c *ChartView) CreateRenderer() fyne.WidgetRenderer {
	// The message spans the width (so that it wraps) in the middle.
	msg := container.NewVBox(layout.NewSpacer(), c.msg, layout.NewSpacer())
	return widget.NewSimpleRenderer(container.NewStack(c.img, container.NewWithoutLayout(c.overlay), msg))
}

// chartMinSize is the smallest a chart is drawn: a few labelled ticks on
// each axis. Pages give their charts the room left over, so that a page
// with two charts and a form still fits a 1280 × 800 screen.
var chartMinSize = fyne.NewSize(200, 110)

// MinSize keeps a chart readable.
func (c *ChartView) MinSize() fyne.Size { return chartMinSize }

// SetSource shows the chart src builds, in place of what was shown.
func (c *ChartView) SetSource(src ChartSource) {
	c.src, c.built = src, nil
	c.redraw()
}

// SetEmpty shows msg (what to do to get a chart) instead of a chart.
func (c *ChartView) SetEmpty(msg string) {
	c.src, c.built, c.hasArea = nil, nil, false
	c.jobs.Cancel(c.slot)
	c.img.Image = nil
	c.img.Refresh()
	c.msg.SetText(msg)
	c.msg.Show()
}

// Rebuild builds the chart again (after a theme change).
func (c *ChartView) Rebuild() {
	c.built = nil
	c.redraw()
}

// Resize draws the chart again at the new size.
func (c *ChartView) Resize(s fyne.Size) {
	c.BaseWidget.Resize(s)
	if s != c.drawn {
		c.redraw()
	}
}

// Image returns the image on show (nil before the first).
func (c *ChartView) Image() image.Image { return c.img.Image }

// Message returns the text shown instead of a chart ("" when a chart shows).
func (c *ChartView) Message() string {
	if !c.msg.Visible() {
		return ""
	}
	return c.msg.Text
}

// Area returns how positions in the view map to the data of the plot on
// show; ok is false before one is drawn or for chart.Panels.
func (c *ChartView) Area() (PlotArea, bool) { return c.area, c.hasArea }

// drawResult is what a drawing job hands back.
type drawResult struct {
	built   Drawable
	img     image.Image
	area    PlotArea
	hasArea bool
	size    fyne.Size
}

// redraw starts a job that builds the chart when needed and draws it at
// the view's size.
func (c *ChartView) redraw() {
	size := c.Size()
	if c.src == nil || size.Width < 1 || size.Height < 1 {
		return
	}
	if c.img.Image == nil {
		c.msg.SetText("Drawing…")
		c.msg.Show()
	}
	src, built, pal, scale := c.src, c.built, c.palette(), c.scale()
	Run(c.jobs, c.slot, "", func(ctx context.Context, _ Progress) (drawResult, error) {
		c.drawMu.Lock() // wait for a drawing this one replaces
		defer c.drawMu.Unlock()
		r := drawResult{built: built, size: size}
		if r.built == nil {
			d, err := src(ctx, pal)
			if err != nil {
				return r, err
			}
			r.built = d
		}
		if err := ctx.Err(); err != nil {
			return r, err
		}
		var err error
		r.img, r.area, r.hasArea, err = render(r.built, size, scale)
		return r, err
	}, func(r drawResult, err error) {
		if errors.Is(err, context.Canceled) {
			return // SetEmpty took the chart away
		}
		if err != nil {
			c.img.Image = nil
			c.img.Refresh()
			c.msg.SetText("This chart cannot be drawn: " + err.Error())
			c.msg.Show()
			return
		}
		c.built, c.drawn = r.built, r.size
		c.area, c.hasArea = r.area, r.hasArea
		c.img.Image = r.img
		c.img.Refresh()
		c.msg.Hide()
		c.overlay.Hide()
		if c.OnDrawn != nil {
			c.OnDrawn()
		}
	})
}

// scale returns the scale of the canvas the view is on (1 before it is on
// one).
func (c *ChartView) scale() float32 {
	if cv := fyne.CurrentApp().Driver().CanvasForObject(c); cv != nil && cv.Scale() > 0 {
		return cv.Scale()
	}
	return 1
}

// render draws d into an image of size (Fyne units) at the canvas scale,
// and, for a *plot.Plot, works out where its plotting area lies. A plot
// left with no room for its plotting area is an error that says so.
func render(d Drawable, size fyne.Size, scale float32) (image.Image, PlotArea, bool, error) {
	w, h := max(int(size.Width*scale+0.5), 1), max(int(size.Height*scale+0.5), 1)
	dpi := chartDPI * scale
	if float32(h)*72/dpi < chartMinPt {
		dpi = max(float32(h)*72/chartMinPt, chartMinDPI*scale)
	}
	// vgimg draws into its own copy of the image it is given: read it back.
	vc := vgimg.NewWith(vgimg.UseImage(image.NewRGBA(image.Rect(0, 0, w, h))), vgimg.UseDPI(int(dpi+0.5)))
	dc := draw.New(vc)
	d.Draw(dc)
	img := vc.Image()
	p, ok := d.(*plot.Plot)
	if !ok {
		return img, PlotArea{}, false, nil
	}
	da := p.DataCanvas(dc)
	unit := float32(int(dpi+0.5)) / 72 / scale // Fyne units per point
	a := PlotArea{
		Min:  fyne.NewPos(float32(da.Min.X)*unit, size.Height-float32(da.Max.Y)*unit),
		Max:  fyne.NewPos(float32(da.Max.X)*unit, size.Height-float32(da.Min.Y)*unit),
		XMin: p.X.Min, XMax: p.X.Max, YMin: p.Y.Min, YMax: p.Y.Max,
	}
	if !(a.Max.X-a.Min.X >= 10 && a.Max.Y-a.Min.Y >= 10) { // also NaN
		return nil, a, false, errChartTooSmall
	}
	return img, a, true, nil
}

// errChartTooSmall says a chart's view is too small for it.
var errChartTooSmall = errors.New("there is not enough room: make the window or this pane larger")
