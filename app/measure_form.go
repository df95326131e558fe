package app

import (
	"fmt"
	"strings"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/driver/desktop"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/observe"
)

// measureKeyNew starts a new row of the entry grid (Ctrl+N).
var measureKeyNew = &desktop.CustomShortcut{KeyName: fyne.KeyN, Modifier: fyne.KeyModifierShortcutDefault}

// The words of the entry's two modes.
const (
	measureModeInst   = "Instrumental magnitudes"
	measureModeVisual = "Visual estimate"
)

// measureField is an entry of the entry grid: Enter moves to the next
// field (or adds the row from the last), Ctrl+N starts a new row, and the
// window's keys (nights, find) pass on to the window.
type measureField struct {
	widget.Entry
	f    *measureForm
	name string // the field an error points at (MeasureField...)
}

func (f *measureForm) newField(name, placeholder string) *measureField {
	e := &measureField{f: f, name: name}
	e.ExtendBaseWidget(e)
	e.PlaceHolder = placeholder
	e.AlwaysShowValidationError = true // an error marks the field as soon as it is set
	e.OnSubmitted = func(string) { f.next(e) }
	e.OnChanged = func(string) { f.edited(e) }
	return e
}

// TypedShortcut implements fyne.Shortcutable: the window's keys (and the
// pages', Ctrl+N among them) go to the window.
func (e *measureField) TypedShortcut(s fyne.Shortcut) {
	if !e.f.v.w.shortcut(s) {
		e.Entry.TypedShortcut(s)
	}
}

// TypedKey implements fyne.Focusable.
func (e *measureField) TypedKey(k *fyne.KeyEvent) {
	if !e.f.v.w.typedKey(k) {
		e.Entry.TypedKey(k)
	}
}

// measureStarFields are one star's magnitude and error fields.
type measureStarFields struct {
	label    string
	mag, err *measureField
	box      fyne.CanvasObject
}

// measureMessagesHeight is the most height the entry row's messages take.
const measureMessagesHeight = 96

// measureForm is the entry grid's new row: the time with its zone and Now,
// the mode, then either the visual estimate or the instrumental magnitudes
// of the target, each comparison star and the check star, with filter, air
// mass and exposure; Add, and what is wrong or what the last row gave.
type measureForm struct {
	v        *measureView
	mode     *widget.RadioGroup
	time     *measureField
	now      *widget.Button
	zone     *widget.Select
	echo     *widget.Label
	estimate *measureField
	step     *measureField
	chart    *widget.Label // the chart's labels and magnitudes
	target   measureStarFields
	comps    []measureStarFields
	check    *measureStarFields
	filter   *measureField
	airmass  *measureField
	exposure *measureField
	add      *widget.Button
	problems *widget.Label
	result   *widget.Label
	instRow  *fyne.Container
	visRow   *fyne.Container
	box      *fyne.Container

	starKey string            // the labels the star fields were built for
	marks   map[string]string // the fields marked at fault, with their messages
}

func newMeasureForm(v *measureView) *measureForm {
	f := &measureForm{v: v, marks: map[string]string{}}
	f.mode = widget.NewRadioGroup([]string{measureModeInst, measureModeVisual}, func(string) { f.modeChanged() })
	f.mode.Horizontal = true
	f.mode.Required = true
	f.time = f.newField(MeasureFieldTime, "21:14:05")
	f.now = widget.NewButtonWithIcon("Now", theme.HistoryIcon(), f.fillNow)
	f.zone = widget.NewSelect([]string{"Local", "UTC"}, func(string) { f.edited(f.time) })
	f.echo = widget.NewLabel("")
	f.estimate = f.newField(MeasureFieldEstimate, "C1 2 V 3 C2")
	f.step = f.newField(MeasureFieldStep, "step")
	f.chart = widget.NewLabel("")
	f.chart.Truncation = fyne.TextTruncateEllipsis
	f.filter = f.newField(MeasureFieldFilter, "V")
	f.airmass = f.newField(MeasureFieldAirmass, "—")
	f.exposure = f.newField(MeasureFieldExposure, "—")
	f.add = widget.NewButtonWithIcon("Add row", theme.ContentAddIcon(), v.addRow)
	f.add.Importance = widget.HighImportance
	f.problems = widget.NewLabel("")
	f.problems.Importance = widget.DangerImportance
	f.problems.Wrapping = fyne.TextWrapWord
	f.problems.Hide()
	f.result = widget.NewLabel("")
	f.result.Wrapping = fyne.TextWrapWord
	f.result.Hide()

	f.instRow = &fyne.Container{Layout: &measureFlow{}}
	f.visRow = container.NewBorder(nil, nil,
		container.NewHBox(widget.NewLabel("Estimate"), measureSized(f.estimate, 220), widget.NewLabel("Step"), measureSized(f.step, 64),
			widget.NewLabel("mag")), nil, quiet(f.chart))
	f.echo.Truncation = fyne.TextTruncateEllipsis
	timeRow := container.NewBorder(nil, nil, container.NewHBox(widget.NewLabel("Time"), measureSized(f.time, 110), f.now, f.zone), nil, quiet(f.echo))
	top := container.NewBorder(nil, nil, f.mode, nil, timeRow)
	// What is wrong, or what the last row gave, under the row: at most
	// about four lines high (it scrolls beyond), so that a long message
	// never pushes the page taller than the screen.
	f.box = container.NewVBox(top, f.instRow, f.visRow, capHeight(container.NewVBox(f.problems, f.result), measureMessagesHeight))
	f.mode.SetSelected(measureModeInst)
	f.zone.SetSelected("Local")
	return f
}

// setStar builds the star fields for t (when its stars changed) and names
// the site's zone as it is in the night of date.
func (f *measureForm) setStar(t observe.Target, site observe.Site, date time.Time) {
	y, m, d := date.Date()
	midnight := time.Date(y, m, d+1, 0, 0, 0, 0, site.Location()) // the zone's name in the night (GMT or BST...)
	f.zone.Options = []string{"Local (" + midnight.Format("MST") + ")", "UTC"}
	if f.zone.Selected != "UTC" {
		f.zone.SetSelected(f.zone.Options[0])
	}
	f.zone.Refresh()
	var ids []string
	for _, c := range append(append([]observe.Comp(nil), t.Comps...), t.Checks...) {
		ids = append(ids, fmt.Sprintf("%s=%g", c.ID, c.V))
	}
	f.chart.SetText("chart: " + strings.Join(ids, " · "))
	if len(ids) == 0 {
		f.chart.SetText("no comparison stars: add them on the Star page")
	}
	f.estimate.PlaceHolder = "C1 2 V 3 C2"
	if len(t.Comps) >= 2 {
		f.estimate.PlaceHolder = t.Comps[0].ID + " 2 V 3 " + t.Comps[1].ID
	}
	f.estimate.Refresh()
	key := t.Name + "|" + strings.Join(ids, ",")
	if key == f.starKey {
		return
	}
	f.starKey = key
	star := func(label, title string) measureStarFields {
		s := measureStarFields{label: label}
		magName, errName := MeasureMagField(label), MeasureErrField(label)
		if label == "" {
			magName, errName = MeasureFieldTarget, MeasureFieldTargetE
		}
		s.mag = f.newField(magName, "mag")
		s.err = f.newField(errName, "±")
		s.box = container.NewHBox(widget.NewLabelWithStyle(title, fyne.TextAlignTrailing, fyne.TextStyle{Bold: label == ""}),
			measureSized(s.mag, 78), measureSized(s.err, 62))
		return s
	}
	f.target = star("", "Target")
	f.comps = nil
	objs := []fyne.CanvasObject{f.target.box}
	for _, c := range t.Comps {
		s := star(c.ID, c.ID)
		f.comps = append(f.comps, s)
		objs = append(objs, s.box)
	}
	f.check = nil
	if len(t.Checks) > 0 {
		s := star(t.Checks[0].ID, t.Checks[0].ID+" check")
		f.check = &s
		objs = append(objs, s.box)
	}
	objs = append(objs,
		container.NewHBox(widget.NewLabel("Filter"), measureSized(f.filter, 52)),
		container.NewHBox(widget.NewLabel("Air mass"), measureSized(f.airmass, 56)),
		container.NewHBox(widget.NewLabel("Exposure"), measureSized(f.exposure, 56), widget.NewLabel("s")),
	)
	f.instRow.Objects = objs
	// A star followed by eye opens on the visual estimate.
	if len(t.Comps) == 0 || (len(t.Checks) == 0 && len(t.Comps) > 4) {
		f.mode.SetSelected(measureModeVisual)
	}
	f.clearProblems()
	f.modeChanged()
}

// visual reports whether the form takes a visual estimate.
func (f *measureForm) visual() bool { return f.mode.Selected == measureModeVisual }

func (f *measureForm) modeChanged() {
	if f.instRow == nil {
		return
	}
	f.instRow.Hidden = f.visual()
	f.visRow.Hidden = !f.visual()
	f.placeAdd()
	f.clearProblems()
	f.v.relayout()
	if f.v.data != nil {
		f.v.showTable()
	}
}

// placeAdd puts the Add button at the end of the row on show.
func (f *measureForm) placeAdd() {
	objs := f.instRow.Objects
	if n := len(objs); n > 0 && objs[n-1] == f.add {
		f.instRow.Objects = objs[:n-1]
	}
	vis := f.visRow.Objects[1].(*fyne.Container) // the estimate's HBox (Border puts the centre first)
	if n := len(vis.Objects); n > 0 && vis.Objects[n-1] == f.add {
		vis.Objects = vis.Objects[:n-1]
	}
	if f.visual() {
		vis.Objects = append(vis.Objects, f.add)
	} else {
		f.instRow.Objects = append(f.instRow.Objects, f.add)
	}
}

// order returns the fields in the order Enter visits them.
func (f *measureForm) order() []*measureField {
	if f.visual() {
		return []*measureField{f.time, f.estimate}
	}
	out := []*measureField{f.time}
	if f.target.mag != nil {
		out = append(out, f.target.mag, f.target.err)
	}
	for _, s := range f.comps {
		out = append(out, s.mag, s.err)
	}
	if f.check != nil {
		out = append(out, f.check.mag, f.check.err)
	}
	return append(out, f.filter, f.airmass, f.exposure)
}

// next moves on from e: to the next field, or adds the row from the last
// (and from the visual step field).
func (f *measureForm) next(e *measureField) {
	o := f.order()
	for i, x := range o {
		if x == e && i+1 < len(o) {
			f.v.w.Win.Canvas().Focus(o[i+1])
			return
		}
	}
	f.v.addRow()
}

// fillNow puts the session's clock in the time field, in the chosen zone.
func (f *measureForm) fillNow() {
	if f.v.req == nil {
		return
	}
	f.time.SetText(measureNowText(f.v.w.Session.Now(), f.loc()))
}

// loc returns the zone the time field is read in.
func (f *measureForm) loc() *time.Location {
	if f.zone.Selected == "UTC" || f.v.req == nil {
		return time.UTC
	}
	return f.v.req.Site.Location()
}
