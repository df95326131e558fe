package app

import (
	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/widget"
)

// The window must fit a 1280 × 800 screen whatever its pages show: a text
// that may run to many lines (a message, a night's notes) sits in a box of
// bounded height, and scrolls beyond it, rather than making the page, and
// with it the window, taller than the screen.

// capBox shows content in a vertical scroller whose minimum height is the
// content's own up to a cap. It is shown exactly when its content is, so
// that a box of hidden messages takes no room (nor a padding) in a VBox.
//
// It is a widget with its own renderer: Fyne draws the children of a
// *fyne.Container and of a widget's renderer only, so a struct that merely
// embeds a container would be laid out but never drawn.
type capBox struct {
	widget.BaseWidget
	content fyne.CanvasObject
	scroll  *container.Scroll
	h       float32
}

// capHeight returns content in a capBox of at most h pixels.
func capHeight(content fyne.CanvasObject, h float32) *capBox {
	b := &capBox{content: content, scroll: container.NewVScroll(content), h: h}
	b.ExtendBaseWidget(b)
	return b
}

// Visible reports whether the content shows (a box whose every part is
// hidden has no height).
func (b *capBox) Visible() bool {
	return b.BaseWidget.Visible() && b.content.Visible() && b.content.MinSize().Height > 0
}

// MinSize is the content's minimum, at most h high; nothing when hidden.
func (b *capBox) MinSize() fyne.Size {
	if !b.content.Visible() {
		return fyne.Size{}
	}
	m := b.content.MinSize()
	return fyne.NewSize(m.Width, min(m.Height, b.h))
}

// relayout lays the content out again after it changed height.
func (b *capBox) relayout() {
	b.Refresh()
}

// CreateRenderer implements fyne.Widget.
func (b *capBox) CreateRenderer() fyne.WidgetRenderer {
	return &capRenderer{b: b}
}

// capRenderer draws a capBox's scroller over the whole box.
type capRenderer struct{ b *capBox }

func (r *capRenderer) Layout(s fyne.Size) {
	r.b.scroll.Move(fyne.NewPos(0, 0))
	r.b.scroll.Resize(s)
}

func (r *capRenderer) MinSize() fyne.Size { return r.b.MinSize() }

func (r *capRenderer) Refresh() {
	r.Layout(r.b.Size())
	r.b.scroll.Refresh()
}

func (r *capRenderer) Objects() []fyne.CanvasObject { return []fyne.CanvasObject{r.b.scroll} }

func (r *capRenderer) Destroy() {}
