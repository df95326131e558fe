package app

import (
	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"
)

// starKeyWidth is the width of the keys of the key/value lines, the same
// in every panel so that their values line up.
const starKeyWidth = 144

// starKeyLayout gives a key at least starKeyWidth.
type starKeyLayout struct{}

func (starKeyLayout) MinSize(objs []fyne.CanvasObject) fyne.Size {
	m := objs[0].MinSize()
	return fyne.NewSize(max(m.Width, starKeyWidth), m.Height)
}

func (starKeyLayout) Layout(objs []fyne.CanvasObject, size fyne.Size) {
	objs[0].Move(fyne.NewPos(0, 0))
	objs[0].Resize(size)
}

// starHeightLayout gives its one object the height of a table of rows
// rows under a header row (at most starMaxRows), and the width it is given.
type starHeightLayout struct{ rows int }

// starMaxRows is the most rows a table of the details shows without
// scrolling.
const starMaxRows = 8

func (l *starHeightLayout) MinSize(objs []fyne.CanvasObject) fyne.Size {
	row := widget.NewLabel("").MinSize().Height + theme.SeparatorThicknessSize()
	n := min(max(l.rows, 1), starMaxRows) + 1
	w := float32(0)
	if len(objs) > 0 {
		w = objs[0].MinSize().Width
	}
	return fyne.NewSize(w, float32(n)*row+theme.Padding())
}

func (l *starHeightLayout) Layout(objs []fyne.CanvasObject, size fyne.Size) {
	for _, o := range objs {
		o.Move(fyne.NewPos(0, 0))
		o.Resize(size)
	}
}

// starConfirm is a question asked on the page itself, with a button that
// goes ahead (in the danger colour) and one that does not.
type starConfirm struct {
	text    *widget.Label
	yes, no *widget.Button
	root    *fyne.Container
	onYes   func()
	changed func() // lays the page out again when the question shows or goes
}

func newStarConfirm() *starConfirm {
	c := &starConfirm{}
	c.text = widget.NewLabel("")
	c.text.Wrapping = fyne.TextWrapWord
	c.text.Importance = widget.DangerImportance
	c.yes = widget.NewButton("", func() {
		f := c.onYes
		c.hide()
		if f != nil {
			f()
		}
	})
	c.yes.Importance = widget.DangerImportance
	c.no = widget.NewButton("Cancel", c.hide)
	c.changed = func() {}
	c.root = container.NewBorder(nil, nil, nil, container.NewHBox(c.yes, c.no), c.text)
	c.root.Hide()
	return c
}

// ask shows the question with the button yes, which runs onYes.
func (c *starConfirm) ask(question, yes string, onYes func()) {
	c.text.SetText(question)
	c.yes.SetText(yes)
	c.onYes = onYes
	c.root.Show()
	c.changed()
}

func (c *starConfirm) hide() {
	c.onYes = nil
	if c.root.Visible() {
		c.root.Hide()
		c.changed()
	}
}

// starColumnLayout stacks two objects: the second (a scroller around
// bottom) gets the height bottom needs, at most frac of the whole, and the
// first the rest.
type starColumnLayout struct {
	bottom fyne.CanvasObject
	frac   float32
}

func (l *starColumnLayout) MinSize(objs []fyne.CanvasObject) fyne.Size {
	var s fyne.Size
	for _, o := range objs {
		m := o.MinSize()
		s.Width = max(s.Width, m.Width)
		s.Height += m.Height
	}
	return s
}

func (l *starColumnLayout) Layout(objs []fyne.CanvasObject, size fyne.Size) {
	if len(objs) != 2 {
		return
	}
	h := float32(0)
	if l.bottom.Visible() {
		h = min(l.bottom.MinSize().Height, l.frac*size.Height)
	}
	objs[0].Move(fyne.NewPos(0, 0))
	objs[0].Resize(fyne.NewSize(size.Width, size.Height-h))
	objs[1].Move(fyne.NewPos(0, size.Height-h))
	objs[1].Resize(fyne.NewSize(size.Width, h))
}
