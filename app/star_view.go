package app

import (
	"context"
	"fmt"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/observe"
)

// starMessagesHeight is the most height the outcome of an action and a
// question take above the page (they scroll beyond).
const starMessagesHeight = 110

// starView is the Star page: the selected star's position, class,
// ephemeris with its history, comparison and check stars and notes on the
// left (or the form editing them), the forecast of its coming nights and
// its period–luminosity distance on the right; above them the star's name
// and the buttons that edit, add, delete, import and export stars.
type starView struct {
	w      *Window
	target observe.Target // the star on show; Name "" for none
	data   StarData       // what the logbook holds of it beyond the target
	info   StarInfo

	title, summary      *widget.Label
	edit, adopt, del    *widget.Button
	add, imp, exp       *widget.Button
	message             *widget.Label // the outcome of the last action
	confirm             *starConfirm
	empty               *widget.Label
	position, kind, eph *fyne.Container // key/value lines
	historyBox          *fyne.Container // one entry per ephemeris adopted, newest first
	notes               *widget.Label
	details             *container.Scroll
	form                *starFormPanel
	comps               *starCompsPanel
	forecast            *starForecastPanel
	distance            *starDistancePanel
	body                *container.Split
	top                 *fyne.Container // the name, actions, message and question
	root                fyne.CanvasObject
	pendingSelect       string // a star to select once the logbook is read again (after a rename or an addition)
	historyRows         [][]string
}

func newStarPage(w *Window) Page {
	v := &starView{w: w}
	v.title = widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	v.title.SizeName = theme.SizeNameSubHeadingText
	v.summary = widget.NewLabel("")
	v.summary.Truncation = fyne.TextTruncateEllipsis
	v.edit = widget.NewButtonWithIcon("Edit", theme.DocumentCreateIcon(), func() { v.form.open(starFormEdit) })
	v.adopt = widget.NewButtonWithIcon("New ephemeris", theme.HistoryIcon(), func() { v.form.open(starFormAdopt) })
	v.del = widget.NewButtonWithIcon("Delete…", theme.DeleteIcon(), v.askDelete)
	v.add = widget.NewButtonWithIcon("New star", theme.ContentAddIcon(), func() { v.form.open(starFormNew) })
	v.imp = widget.NewButtonWithIcon("Import…", theme.FolderOpenIcon(), v.chooseImport)
	v.exp = widget.NewButtonWithIcon("Export…", theme.DocumentSaveIcon(), v.chooseExport)
	v.message = widget.NewLabel("")
	v.message.Wrapping = fyne.TextWrapWord
	v.message.Hide()
	v.confirm = newStarConfirm()
	v.empty = widget.NewLabel("")
	v.empty.Wrapping = fyne.TextWrapWord
	v.empty.Alignment = fyne.TextAlignCenter

	v.position = container.New(layout.NewFormLayout())
	v.kind = container.New(layout.NewFormLayout())
	v.eph = container.New(layout.NewFormLayout())
	v.historyBox = container.NewVBox()
	v.notes = widget.NewLabel("")
	v.notes.Wrapping = fyne.TextWrapWord
	v.comps = newStarCompsPanel(v)
	v.details = container.NewVScroll(container.NewVBox(
		starSection("Position"), v.position,
		starSection("What it is"), v.kind,
		starSection("Current ephemeris"), v.eph,
		starSection("Ephemeris history (newest first)"), v.historyBox,
		starSection("Comparison and check stars"), v.comps.root,
		starSection("Notes"), v.notes,
	))
	v.form = newStarFormPanel(v)
	v.forecast = newStarForecastPanel(v)
	v.distance = newStarDistancePanel(v)

	// The forecast over the distance, which takes the height it needs up
	// to half the column and scrolls beyond.
	right := container.New(&starColumnLayout{bottom: v.distance.root, frac: 0.5},
		v.forecast.root, container.NewVScroll(v.distance.root))
	v.body = container.NewHSplit(container.NewStack(v.details, v.form.root), right)
	v.body.Offset = 0.37
	// The star's name with what can be done to it; the catalogue's actions
	// on the right.
	head := container.NewBorder(nil, nil, nil, container.NewHBox(v.add, v.imp, v.exp), v.title)
	sub := container.NewBorder(nil, nil, nil, container.NewHBox(v.edit, v.adopt, v.del), v.summary)
	v.top = container.NewVBox(head, sub, capHeight(container.NewVBox(v.message, v.confirm.root), starMessagesHeight), widget.NewSeparator())
	v.confirm.changed = v.relayout
	v.root = container.NewBorder(v.top, nil, nil, nil,
		container.NewStack(container.NewVScroll(container.NewPadded(v.empty)), v.body))
	w.Session.OnChange(v.changed)
	return v
}

// Content implements Page.
func (v *starView) Content() fyne.CanvasObject { return v.root }

// starSection is the heading of a part of the details.
func starSection(title string) fyne.CanvasObject {
	l := widget.NewLabelWithStyle(title, fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	l.Importance = widget.HighImportance
	return l
}

// changed follows the session: the star on show, and its forecast.
func (v *starView) changed(c Change) {
	s := v.w.Session
	if c&ChangedTargets != 0 && v.pendingSelect != "" {
		if _, ok := s.Target(v.pendingSelect); ok {
			name := v.pendingSelect
			v.pendingSelect = ""
			s.Select(name) // notifies again, with the selection
		}
	}
	if c&(ChangedTargets|ChangedSelection|ChangedRecords) != 0 {
		v.show() // reads the star's history and mean V again
	}
	if c&(ChangedSite|ChangedSites|ChangedNight|ChangedTargets|ChangedSelection) != 0 {
		v.forecast.update()
	}
}

// show puts the session's selected star on the page, and reads its history
// and mean V from the logbook.
func (v *starView) show() {
	s := v.w.Session
	t, ok := s.Target(s.Selected())
	if !ok {
		t = observe.Target{}
	}
	if !strings.EqualFold(t.Name, v.target.Name) {
		v.form.close()
		v.confirm.hide()
		v.data = StarData{}
		v.comps.rows = nil // a new table, an empty editor
	}
	v.target = t
	v.refresh()
	if !ok {
		v.w.Jobs.Cancel("star-load")
		return
	}
	lb := s.Logbook()
	name := t.Name
	Run(v.w.Jobs, "star-load", "", func(context.Context, Progress) (StarData, error) {
		return LoadStarData(lb, name)
	}, func(d StarData, err error) {
		if err != nil {
			v.say(err.Error(), true)
			return
		}
		if strings.EqualFold(d.Name, v.target.Name) {
			v.data = d
			v.refresh()
		}
	})
}

// refresh redraws the page from v.target and v.data.
func (v *starView) refresh() {
	has := v.target.Name != ""
	v.info = BuildStarInfo(v.target, v.data, v.w.Session.Now())
	v.empty.SetText(starEmptyText(len(v.w.Session.Targets())))
	v.empty.Hidden = has || v.form.mode != starFormClosed
	v.body.Hidden = !v.empty.Hidden
	for _, b := range []*widget.Button{v.edit, v.adopt, v.del} {
		if has && v.form.mode != starFormNew {
			b.Enable()
		} else {
			b.Disable()
		}
	}
	v.exp.Disable()
	if len(v.w.Session.Targets()) > 0 {
		v.exp.Enable()
	}
	switch {
	case v.form.mode == starFormNew:
		v.title.SetText("New star")
		v.summary.SetText("Fill in the form and save: the star joins the list, with its ephemeris as the first of its history.")
		v.distance.update()
		return
	case !has:
		v.title.SetText("Stars")
		v.summary.SetText("Add a star, or import a catalogue of them from a CSV or VOTable file.")
		v.distance.update()
		return
	}
	v.title.SetText(v.info.Name)
	v.summary.SetText(v.info.Summary)
	starFillLines(v.position, v.info.Position)
	starFillLines(v.kind, v.info.Kind)
	starFillLines(v.eph, v.info.Ephemeris)
	v.historyRows = v.info.History
	v.fillHistory()
	v.notes.SetText(orDash(v.info.Notes))
	v.comps.update(v.info.Comps)
	v.distance.update()
	v.details.Refresh()
}

// fillHistory writes the ephemeris history, newest first: when it was
// adopted, its elements, and where it came from.
func (v *starView) fillHistory() {
	var objs []fyne.CanvasObject
	for i, h := range v.historyRows {
		when := h[0] + " UTC"
		if i == 0 {
			when += " · current"
		}
		head := widget.NewLabelWithStyle(when, fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
		body := widget.NewLabel(fmt.Sprintf("T0 %s · P %s d · Q %s d\nfrom: %s", h[2], h[3], h[4], h[1]))
		body.Wrapping = fyne.TextWrapWord
		objs = append(objs, container.NewVBox(head, body))
	}
	if len(objs) == 0 {
		objs = append(objs, widget.NewLabel("Reading…"))
	}
	v.historyBox.Objects = objs
	v.historyBox.Refresh()
}

// starFillLines puts key/value lines into a form-layout container.
func starFillLines(c *fyne.Container, lines []StarLine) {
	var objs []fyne.CanvasObject
	for _, l := range lines {
		k := widget.NewLabel(l.Key)
		key := container.New(starKeyLayout{}, k)
		val := widget.NewLabel(l.Value)
		val.Wrapping = fyne.TextWrapWord
		objs = append(objs, key, val)
	}
	c.Objects = objs
	c.Refresh()
}

// say shows the outcome of an action above the page; bad ones in the
// error colour.
func (v *starView) say(msg string, bad bool) {
	v.message.SetText(msg)
	v.message.Importance = widget.MediumImportance
	if bad {
		v.message.Importance = widget.DangerImportance
	}
	v.message.Hidden = msg == ""
	v.relayout()
}

// relayout lays the page out again after the texts above it changed height.
func (v *starView) relayout() {
	v.top.Refresh()
	if c, ok := v.root.(*fyne.Container); ok {
		c.Refresh()
	}
}
