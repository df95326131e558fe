package app

import (
	"math"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/theme"
)

// measureWidth is a layout giving its objects a fixed width at their own
// height: the entry grid's narrow number fields.
type measureWidth struct{ w float32 }

func (l measureWidth) MinSize(objs []fyne.CanvasObject) fyne.Size {
	h := float32(0)
	for _, o := range objs {
		h = max(h, o.MinSize().Height)
	}
	return fyne.NewSize(l.w, h)
}

func (l measureWidth) Layout(objs []fyne.CanvasObject, s fyne.Size) {
	for _, o := range objs {
		o.Move(fyne.NewPos(0, 0))
		o.Resize(s)
	}
}

// measureSized returns o at width w.
func measureSized(o fyne.CanvasObject, w float32) fyne.CanvasObject {
	return &fyne.Container{Layout: measureWidth{w}, Objects: []fyne.CanvasObject{o}}
}

// measureFlow lays objects out left to right at their minimum size,
// starting a new line when the next would not fit: the entry grid's star
// fields, however many comparison stars a star has. Its minimum height is
// that of the lines at the width it was last given; before it has been laid
// out (a hidden page) it assumes one line, rather than one object a line,
// which would ask the window for hundreds of pixels it does not need.
type measureFlow struct{ width float32 }

func (l *measureFlow) lines(objs []fyne.CanvasObject, width float32) (rows [][]fyne.CanvasObject) {
	pad := theme.Padding()
	x := float32(0)
	for _, o := range objs {
		if !o.Visible() {
			continue
		}
		w := o.MinSize().Width
		if len(rows) == 0 || (x > 0 && x+w > width) {
			rows = append(rows, nil)
			x = 0
		}
		rows[len(rows)-1] = append(rows[len(rows)-1], o)
		x += w + pad
	}
	return rows
}

func (l *measureFlow) MinSize(objs []fyne.CanvasObject) fyne.Size {
	pad := theme.Padding()
	var minW, h float32
	for _, o := range objs {
		if o.Visible() {
			minW = max(minW, o.MinSize().Width)
		}
	}
	width := l.width
	if width <= 0 {
		width = float32(math.Inf(1))
	}
	if width < minW {
		width = minW
	}
	for i, row := range l.lines(objs, width) {
		rh := float32(0)
		for _, o := range row {
			rh = max(rh, o.MinSize().Height)
		}
		if i > 0 {
			h += pad
		}
		h += rh
	}
	return fyne.NewSize(minW, h)
}

func (l *measureFlow) Layout(objs []fyne.CanvasObject, s fyne.Size) {
	l.width = s.Width
	pad := theme.Padding()
	y := float32(0)
	for _, row := range l.lines(objs, s.Width) {
		x, rh := float32(0), float32(0)
		for _, o := range row {
			ms := o.MinSize()
			rh = max(rh, ms.Height)
		}
		for _, o := range row {
			ms := o.MinSize()
			o.Move(fyne.NewPos(x, y+(rh-ms.Height)/2))
			o.Resize(fyne.NewSize(ms.Width, ms.Height))
			x += ms.Width + pad
		}
		y += rh + pad
	}
}

// measureMin is a layout giving its objects at least a fixed size: the
// import's look at the file.
type measureMin struct{ size fyne.Size }

func (l measureMin) MinSize(objs []fyne.CanvasObject) fyne.Size {
	s := l.size
	for _, o := range objs {
		s = s.Max(fyne.NewSize(0, o.MinSize().Height))
	}
	return s
}

func (l measureMin) Layout(objs []fyne.CanvasObject, s fyne.Size) {
	for _, o := range objs {
		o.Move(fyne.NewPos(0, 0))
		o.Resize(s)
	}
}

// measureWeights lays objects out in a row, sharing the width in
// proportion to their weights (the night's fields: the equipment is the
// longest text), each at least its minimum width.
type measureWeights []float32

func (l measureWeights) MinSize(objs []fyne.CanvasObject) fyne.Size {
	var s fyne.Size
	for i, o := range objs {
		m := o.MinSize()
		if i > 0 {
			s.Width += theme.Padding()
		}
		s.Width += m.Width
		s.Height = max(s.Height, m.Height)
	}
	return s
}

func (l measureWeights) Layout(objs []fyne.CanvasObject, size fyne.Size) {
	pad := theme.Padding()
	total := float32(0)
	for i := range objs {
		total += l[i%len(l)]
	}
	free := size.Width - pad*float32(max(len(objs)-1, 0))
	x := float32(0)
	for i, o := range objs {
		w := free * l[i%len(l)] / total
		o.Move(fyne.NewPos(x, 0))
		o.Resize(fyne.NewSize(w, size.Height))
		x += w + pad
	}
}
