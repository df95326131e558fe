package app

import (
	"image/color"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/canvas"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/observe"
)

// starList is the left column: a search box over the list of stars, each
// with its best extremum tonight and whether it can be caught.
type starList struct {
	w       *Window
	search  *keyEntry
	list    *keyList
	empty   *widget.Label
	shown   []observe.Target // the targets that pass the search
	rows    []StarRow
	syncing bool // selecting a row to follow the session, not the user
}

func newStarList(w *Window) *starList {
	l := &starList{w: w}
	l.search = newKeyEntry(w)
	l.search.SetPlaceHolder("Find a star (Ctrl+F)")
	l.search.ActionItem = widget.NewIcon(theme.SearchIcon())
	l.search.OnChanged = func(string) { l.update() }
	l.list = newKeyList(w, func() int { return len(l.rows) }, newStarRow, l.updateRow)
	l.list.OnSelected = func(id widget.ListItemID) {
		if !l.syncing && id >= 0 && id < len(l.rows) {
			w.Session.Select(l.rows[id].Name)
		}
	}
	l.empty = widget.NewLabel("")
	l.empty.Wrapping = fyne.TextWrapWord
	l.empty.Alignment = fyne.TextAlignCenter
	w.Session.OnChange(func(c Change) {
		if c&(ChangedTargets|ChangedPlan|ChangedSelection|ChangedTheme) != 0 {
			l.update()
		}
	})
	return l
}

func (l *starList) content() fyne.CanvasObject {
	return container.NewBorder(l.search, nil, nil, nil, container.NewStack(l.list, container.NewVBox(l.empty)))
}

// update filters the targets, refills the rows and selects the session's
// star when it is shown.
func (l *starList) update() {
	s := l.w.Session
	l.shown = FilterTargets(s.Targets(), l.search.Text)
	l.rows = StarRows(l.shown, s.Night())
	l.empty.SetText(starListEmpty(len(s.Targets()), l.search.Text))
	l.empty.Hidden = len(l.rows) > 0
	l.empty.Refresh()
	l.syncing = true
	l.list.UnselectAll()
	for i, r := range l.rows {
		if r.Name == s.Selected() {
			l.list.Select(i)
		}
	}
	l.syncing = false
	l.list.Refresh()
}

// starRow is one row of the list: the catch mark, the name over the class
// and catch, and the time of the best extremum on the right.
type starRow struct {
	widget.BaseWidget
	name, detail, next *canvas.Text
	mark               *catchMark
}

func newStarRow() fyne.CanvasObject {
	r := &starRow{name: canvas.NewText("", color.Black), detail: canvas.NewText("", color.Black),
		next: canvas.NewText("", color.Black), mark: newCatchMark()}
	r.name.TextStyle.Bold = true
	r.detail.TextSize = theme.CaptionTextSize()
	r.next.Alignment = fyne.TextAlignTrailing
	r.ExtendBaseWidget(r)
	return r
}

// CreateRenderer implements fyne.Widget.
func (r *starRow) CreateRenderer() fyne.WidgetRenderer {
	text := container.New(layout.NewCustomPaddedLayout(0, 0, 4, 0), container.NewVBox(r.name, r.detail))
	return widget.NewSimpleRenderer(container.NewBorder(nil, nil, container.NewCenter(r.mark), container.NewCenter(r.next), text))
}

// updateRow fills row id of the list.
func (l *starList) updateRow(id widget.ListItemID, o fyne.CanvasObject) {
	if id >= len(l.rows) {
		return
	}
	r, row := l.rows[id], o.(*starRow)
	fg, muted := theme.Color(theme.ColorNameForeground), theme.Color(theme.ColorNamePlaceHolder)
	row.name.Text, row.name.Color = r.Name, fg
	row.detail.Text, row.detail.Color = r.Detail, muted
	row.next.Text, row.next.Color = r.Next, fg
	row.mark.set(r.Catch, l.w.Shades())
	row.name.Refresh()
	row.detail.Refresh()
	row.next.Refresh()
}

// catchMark is the small round mark of a star's catch: a filled disc
// (whole), a ring with a dot (partly), an empty ring (not), nothing (no
// extremum tonight). Shape tells them apart as well as colour.
type catchMark struct {
	widget.BaseWidget
	ring, dot *canvas.Circle
}

func newCatchMark() *catchMark {
	m := &catchMark{ring: canvas.NewCircle(color.Transparent), dot: canvas.NewCircle(color.Transparent)}
	m.ring.StrokeWidth = 1.5
	m.ExtendBaseWidget(m)
	return m
}

// set shows catch c in the theme's shades.
func (m *catchMark) set(c Catch, sh Shades) {
	m.ring.FillColor, m.dot.FillColor, m.ring.StrokeColor = color.Transparent, color.Transparent, color.Transparent
	switch c {
	case CatchWhole:
		m.ring.FillColor, m.ring.StrokeColor = sh.Whole, sh.Whole
	case CatchPartly:
		m.ring.StrokeColor, m.dot.FillColor = sh.Partly, sh.Partly
	case CatchNot:
		m.ring.StrokeColor = sh.NotCaught
	}
	m.ring.Refresh()
	m.dot.Refresh()
}

// MinSize is a small square.
func (m *catchMark) MinSize() fyne.Size { return fyne.NewSize(14, 14) }

// CreateRenderer implements fyne.Widget.
func (m *catchMark) CreateRenderer() fyne.WidgetRenderer {
	return &markRenderer{m: m}
}

type markRenderer struct{ m *catchMark }

func (r *markRenderer) Layout(s fyne.Size) {
	d := min(s.Width, s.Height) - 2
	r.m.ring.Move(fyne.NewPos((s.Width-d)/2, (s.Height-d)/2))
	r.m.ring.Resize(fyne.NewSize(d, d))
	r.m.dot.Move(fyne.NewPos(s.Width/2-d/4, s.Height/2-d/4))
	r.m.dot.Resize(fyne.NewSize(d/2, d/2))
}
func (r *markRenderer) MinSize() fyne.Size           { return r.m.MinSize() }
func (r *markRenderer) Refresh()                     { r.m.ring.Refresh(); r.m.dot.Refresh() }
func (r *markRenderer) Objects() []fyne.CanvasObject { return []fyne.CanvasObject{r.m.ring, r.m.dot} }
func (r *markRenderer) Destroy()                     {}
