package app

import (
	"context"
	"errors"
	"strings"
	"sync/atomic"
	"testing"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"
	"gonum.org/v1/plot"

	"example.org/vigil/app/chart"
)

// lineSource draws a plain plot of y = x over [0, 10] and counts its builds.
func lineSource(builds *atomic.Int32) ChartSource {
	return func(_ context.Context, pal chart.Palette) (Drawable, error) {
		builds.Add(1)
		p := plot.New()
		p.BackgroundColor = pal.Background
		p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = 0, 10, 0, 10
		return p, nil
	}
}

func newTestChart(t *testing.T, pal func() chart.Palette) (*ChartView, *Jobs, *uiQueue) {
	t.Helper()
	test.NewApp()
	q := newUIQueue()
	jobs := NewJobs(q.post)
	c := NewChartView(jobs, pal)
	w := test.NewTempWindow(t, c)
	w.Resize(fyne.NewSize(400, 300))
	return c, jobs, q
}

func TestChartViewResizeRedrawsWithoutRebuilding(t *testing.T) {
	c, jobs, q := newTestChart(t, chart.DefaultPalette)
	var builds atomic.Int32
	c.SetSource(lineSource(&builds))
	settleJobs(t, jobs, q)
	first := c.Image()
	if first == nil || builds.Load() != 1 {
		t.Fatalf("after SetSource: image %v, builds %d; want an image from one build", first != nil, builds.Load())
	}
	c.Resize(fyne.NewSize(300, 200))
	settleJobs(t, jobs, q)
	if b := c.Image().Bounds(); b.Dx() != 300 || b.Dy() != 200 {
		t.Errorf("image after resizing to 300 × 200: %v", b)
	}
	if builds.Load() != 1 {
		t.Errorf("a resize rebuilt the chart (%d builds), want it drawn again only", builds.Load())
	}
	c.Rebuild()
	settleJobs(t, jobs, q)
	if builds.Load() != 2 {
		t.Errorf("Rebuild made %d builds in all, want 2", builds.Load())
	}
	a, ok := c.Area()
	if !ok || a.XMin != 0 || a.XMax != 10 {
		t.Fatalf("plotting area %+v (%v), want the plot's x range 0–10", a, ok)
	}
	// The middle of the plotting area maps to the middle of the range.
	if x, in := a.X((a.Min.X + a.Max.X) / 2); !in || x < 4.99 || x > 5.01 {
		t.Errorf("x at the middle of the area: %.3f (inside %v), want 5", x, in)
	}
	if px := a.PosX(10); px != a.Max.X {
		t.Errorf("PosX(10) = %.1f, want the area's right edge %.1f", px, a.Max.X)
	}
}

func TestChartViewMessages(t *testing.T) {
	c, jobs, q := newTestChart(t, chart.DefaultPalette)
	c.SetSource(func(context.Context, chart.Palette) (Drawable, error) {
		return nil, errors.New(`no point left in "V1"`)
	})
	settleJobs(t, jobs, q)
	if m := c.Message(); !strings.Contains(m, "cannot be drawn") || !strings.Contains(m, `"V1"`) || c.Image() != nil {
		t.Errorf("a failing source: message %q, image %v; want the error and no image", m, c.Image() != nil)
	}
	release := make(chan struct{})
	c.SetSource(func(ctx context.Context, _ chart.Palette) (Drawable, error) {
		<-release
		return nil, ctx.Err()
	})
	c.SetEmpty("Select a star.")
	close(release)
	settleJobs(t, jobs, q)
	if m := c.Message(); m != "Select a star." {
		t.Errorf("SetEmpty while drawing: message %q, want Select a star.", m)
	}
	// A view too short for a chart says so rather than drawing it broken.
	var builds atomic.Int32
	c.SetSource(lineSource(&builds))
	c.Resize(fyne.NewSize(400, 12))
	settleJobs(t, jobs, q)
	if m := c.Message(); !strings.Contains(m, "not enough room") {
		t.Errorf("a 12-unit-high chart: message %q, want it to ask for room", m)
	}
}
