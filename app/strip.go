package app

import (
	"image"
	"image/color"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/canvas"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/observe"
)

// Sizes of the twilight strip (Fyne units).
const (
	stripSkyH  = 16 // the sky bar
	stripGap   = 2
	stripMoonH = 5  // the Moon's bar under it
	stripTextH = 12 // the text size of the times
)

// twilightStrip draws the night from an hour before sunset to an hour after
// sunrise: the sky shaded by the Sun's altitude (day, civil, nautical and
// astronomical twilight, night), the Moon's time above the horizon as a bar
// beneath, the local times of sunset, the dark span and sunrise, and a mark
// at the present moment when it falls in the night.
type twilightStrip struct {
	widget.BaseWidget
	nd     *NightData
	now    time.Time
	shades func() Shades
}

// setNow moves the mark of the present moment (redrawn once a minute).
func (s *twilightStrip) setNow(now time.Time) {
	if now.Truncate(time.Minute).Equal(s.now.Truncate(time.Minute)) {
		return
	}
	s.now = now
	s.Refresh()
}

func newTwilightStrip(shades func() Shades) *twilightStrip {
	s := &twilightStrip{shades: shades}
	s.ExtendBaseWidget(s)
	return s
}

// set shows the night nd (nil: nothing yet).
func (s *twilightStrip) set(nd *NightData) {
	s.nd = nd
	s.Refresh()
}

// labels returns the times written under the strip: sunset, the dark span
// and sunrise, each with its instant (UTC) and alignment.
func (s *twilightStrip) labels() []stripLabel {
	nd := s.nd
	if nd == nil || nd.Err != nil {
		return nil
	}
	loc := nd.Request.Site.Location()
	sky := nd.Sky
	var out []stripLabel
	if sky.Sunset.OK {
		out = append(out, stripLabel{"sunset " + clockText(sky.Sunset.At.Time(), loc), sky.Sunset.At.Time(), fyne.TextAlignLeading})
	}
	tw := nd.Plan.Twilights
	if tw.DarkFrom.OK && tw.DarkTo.OK {
		mid := tw.DarkFrom.At.Time().Add(tw.DarkTo.At.Time().Sub(tw.DarkFrom.At.Time()) / 2)
		txt := "dark " + clockText(tw.DarkFrom.At.Time(), loc) + "–" + clockText(tw.DarkTo.At.Time(), loc)
		out = append(out, stripLabel{txt, mid, fyne.TextAlignCenter})
	}
	if sky.Sunrise.OK {
		out = append(out, stripLabel{clockText(sky.Sunrise.At.Time(), loc) + " sunrise", sky.Sunrise.At.Time(), fyne.TextAlignTrailing})
	}
	switch {
	case sky.SunAlwaysUp:
		out = append(out, stripLabel{"the Sun does not set", nd.From.Add(nd.To.Sub(nd.From) / 2), fyne.TextAlignCenter})
	case len(out) == 0:
		out = append(out, stripLabel{"no full darkness", nd.From.Add(nd.To.Sub(nd.From) / 2), fyne.TextAlignCenter})
	}
	return out
}

type stripLabel struct {
	text  string
	at    time.Time
	align fyne.TextAlign
}

// MinSize leaves room for the bars and one line of times.
func (s *twilightStrip) MinSize() fyne.Size {
	return fyne.NewSize(240, stripSkyH+stripGap+stripMoonH+stripGap+stripTextH+4)
}

// CreateRenderer implements fyne.Widget.
func (s *twilightStrip) CreateRenderer() fyne.WidgetRenderer {
	r := &stripRenderer{s: s, edge: canvas.NewRectangle(color.Transparent), now: canvas.NewRectangle(color.Transparent)}
	r.sky = canvas.NewRaster(r.drawSky)
	r.edge.StrokeWidth = 1
	r.Refresh()
	return r
}

type stripRenderer struct {
	s     *twilightStrip
	sky   *canvas.Raster
	edge  *canvas.Rectangle
	now   *canvas.Rectangle // the present moment
	moon  []*canvas.Rectangle
	texts []*canvas.Text
	at    []stripLabel
}

// x returns the horizontal position of instant t in a strip w wide.
func (r *stripRenderer) x(t time.Time, w float32) float32 {
	nd := r.s.nd
	span := nd.To.Sub(nd.From)
	if span <= 0 {
		return 0
	}
	return w * float32(t.Sub(nd.From)) / float32(span)
}

// drawSky paints the sky bar, column by column, from the Sun's altitude
// interpolated between the samples.
func (r *stripRenderer) drawSky(w, h int) image.Image {
	img := image.NewNRGBA(image.Rect(0, 0, w, h))
	nd := r.s.nd
	if nd == nil || len(nd.Samples) < 2 {
		return img
	}
	sh := r.s.shades()
	n := len(nd.Samples)
	for x := 0; x < w; x++ {
		t := (float64(x) + 0.5) / float64(w) * float64(nd.To.Sub(nd.From))
		f := min(t/float64(observe.ChartStep), float64(n-1))
		i := min(int(f), n-2)
		alt := nd.Samples[i].SunAltDeg + (f-float64(i))*(nd.Samples[i+1].SunAltDeg-nd.Samples[i].SunAltDeg)
		c := sh.Sky[SkyLevel(alt)]
		for y := 0; y < h; y++ {
			img.Set(x, y, c)
		}
	}
	return img
}

func (r *stripRenderer) Layout(size fyne.Size) {
	r.sky.Move(fyne.NewPos(0, 0))
	r.sky.Resize(fyne.NewSize(size.Width, stripSkyH))
	r.edge.Resize(fyne.NewSize(size.Width, stripSkyH))
	r.now.Hidden = true
	if r.s.nd == nil || r.s.nd.Err != nil {
		return
	}
	if nd := r.s.nd; !r.s.now.Before(nd.From) && !r.s.now.After(nd.To) {
		r.now.Hidden = false
		r.now.Move(fyne.NewPos(r.x(r.s.now, size.Width)-1, -2))
		r.now.Resize(fyne.NewSize(2, stripSkyH+stripGap+stripMoonH+2))
	}
	for i, u := range r.s.nd.MoonUp() {
		if i < len(r.moon) {
			x0, x1 := r.x(u.From, size.Width), r.x(u.To, size.Width)
			r.moon[i].Move(fyne.NewPos(x0, stripSkyH+stripGap))
			r.moon[i].Resize(fyne.NewSize(max(x1-x0, 1), stripMoonH))
		}
	}
	right := float32(-1e9) // the right end of the last text placed
	y := float32(stripSkyH + stripGap + stripMoonH + stripGap)
	for i, l := range r.at {
		t := r.texts[i]
		w := t.MinSize().Width
		x := r.x(l.at, size.Width)
		switch l.align {
		case fyne.TextAlignCenter:
			x -= w / 2
		case fyne.TextAlignTrailing:
			x -= w
		}
		x = min(max(x, 0), size.Width-w)
		t.Move(fyne.NewPos(x, y))
		t.Resize(fyne.NewSize(w, stripTextH+2))
		t.Hidden = x < right+6 // no room: the times would overlap
		if !t.Hidden {
			right = x + w
		}
	}
}

func (r *stripRenderer) MinSize() fyne.Size { return r.s.MinSize() }

// Refresh rebuilds the bars and texts for the night and theme on show.
func (r *stripRenderer) Refresh() {
	sh := r.s.shades()
	fg := theme.Color(theme.ColorNameForeground)
	r.edge.StrokeColor = sh.Edge
	r.now.FillColor = fg
	r.moon, r.texts = nil, nil
	r.at = r.s.labels()
	if nd := r.s.nd; nd != nil && nd.Err == nil {
		for range nd.MoonUp() {
			m := canvas.NewRectangle(sh.Moon)
			m.CornerRadius = 2
			r.moon = append(r.moon, m)
		}
	}
	for _, l := range r.at {
		t := canvas.NewText(l.text, fg)
		t.TextSize = stripTextH
		r.texts = append(r.texts, t)
	}
	r.Layout(r.s.Size())
	r.sky.Refresh()
	canvas.Refresh(r.edge)
	canvas.Refresh(r.now)
}

func (r *stripRenderer) Objects() []fyne.CanvasObject {
	objs := []fyne.CanvasObject{r.sky, r.edge}
	for _, m := range r.moon {
		objs = append(objs, m)
	}
	for _, t := range r.texts {
		objs = append(objs, t)
	}
	return append(objs, r.now)
}

func (r *stripRenderer) Destroy() {}
