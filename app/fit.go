package app

import (
	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
)

// The window must fit a 1280 × 800 screen whatever its pages show: a text
// that may run to many lines (a message, a night's notes) sits in a box of
// bounded height, and scrolls beyond it, rather than making the page, and
// with it the window, taller than the screen.

// capBox shows content in a vertical scroller whose minimum height is the
// content's own up to a cap. It is shown exactly when its content is, so
// that a box of hidden messages takes no room (nor a padding) in a VBox.
type capBox struct {
	*fyne.Container
	content fyne.CanvasObject
}

// capHeight returns content in a capBox of at most h pixels.
func capHeight(content fyne.CanvasObject, h float32) *capBox {
	s := container.NewVScroll(content)
	return &capBox{Container: &fyne.Container{Layout: capLayout{content, h}, Objects: []fyne.CanvasObject{s}}, content: content}
}

// Visible reports whether the content shows (a box whose every part is
// hidden has no height).
func (b *capBox) Visible() bool {
	return !b.Hidden && b.content.Visible() && b.content.MinSize().Height > 0
}

// relayout lays the content out again after it changed height.
func (b *capBox) relayout() {
	b.Container.Layout.Layout(b.Objects, b.Size())
	b.Objects[0].Refresh()
}

// capLayout gives its scroller the content's minimum height, at most h.
type capLayout struct {
	content fyne.CanvasObject
	h       float32
}

func (l capLayout) MinSize([]fyne.CanvasObject) fyne.Size {
	if !l.content.Visible() {
		return fyne.Size{}
	}
	m := l.content.MinSize()
	return fyne.NewSize(m.Width, min(m.Height, l.h))
}

func (l capLayout) Layout(objs []fyne.CanvasObject, s fyne.Size) {
	for _, o := range objs {
		o.Move(fyne.NewPos(0, 0))
		o.Resize(s)
	}
}
