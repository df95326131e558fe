package app

import (
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/ephem"
)

// starFormMode says what the Star page's form is doing.
type starFormMode int

const (
	starFormClosed starFormMode = iota
	starFormEdit                // editing the star on show (not its ephemeris)
	starFormNew                 // adding a star, with its first ephemeris
	starFormAdopt               // adopting a new ephemeris for the star on show
)

// The options of the form's choices, in words ParseClass, ParseKind and
// ParseTimeScale read.
var (
	starClassOptions = []string{"pulsating", "eclipsing", "other"}
	starKindOptions  = []string{"maximum", "minimum"}
	starScaleOptions = []string{ephem.BJDTDB.Label(), ephem.HJD.Label()}
)

// starFormPanel is the form that edits a star, adds one or adopts a new
// ephemeris, in place of the details. Each field has its error under it.
type starFormPanel struct {
	v       *starView
	mode    starFormMode
	editing string // the star edited or given a new ephemeris

	heading, intro     *widget.Label
	entries            map[string]*keyEntry
	errs               map[string]*widget.Label
	labels             map[string]string // each field's label, by key
	order              []string          // the fields' keys in the form's order
	class, kind, scale *widget.Select
	secondary          *widget.Check
	starBox, ephemBox  *fyne.Container
	formErr            *widget.Label
	save, cancel       *widget.Button
	scroll             *container.Scroll // the fields
	root               *fyne.Container   // the fields over the buttons
}

func newStarFormPanel(v *starView) *starFormPanel {
	f := &starFormPanel{v: v, entries: map[string]*keyEntry{}, errs: map[string]*widget.Label{}, labels: map[string]string{}}
	f.heading = widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	f.heading.Importance = widget.HighImportance
	f.intro = widget.NewLabel("")
	f.intro.Wrapping = fyne.TextWrapWord
	f.class = widget.NewSelect(starClassOptions, func(s string) {
		f.clearErr(StarFieldClass)
		if f.mode == starFormNew { // an eclipse is timed at minimum light
			if s == "eclipsing" {
				f.kind.SetSelected("minimum")
			} else {
				f.kind.SetSelected("maximum")
			}
		}
	})
	f.kind = widget.NewSelect(starKindOptions, func(string) { f.clearErr(StarFieldKind) })
	f.scale = widget.NewSelect(starScaleOptions, func(string) { f.clearErr(StarFieldScale) })
	f.secondary = widget.NewCheck("also predict secondary minima (at E + 0.5)", nil)
	notes := newKeyMultiLineEntry(v.w)
	notes.SetMinRowsVisible(3)
	f.entries["notes"] = notes

	var rows []fyne.CanvasObject
	for _, r := range [][]fyne.CanvasObject{
		f.row(StarFieldName, "Name", "e.g. Ashgrove V9"),
		f.row(StarFieldRA, "RA (h)", "05:30:00.0 or 5.5 (hours, ICRS/J2000)"),
		f.row(StarFieldDec, "Dec (°)", "+30:00:00 or 30.0 (degrees)"),
		f.row(StarFieldPMRA, "μα cos δ", "0 (mas/yr)"),
		f.row(StarFieldPMDec, "μδ", "0 (mas/yr)"),
		f.rowOf(StarFieldClass, "Class", f.class),
		f.rowOf(StarFieldKind, "T0 marks", f.kind),
		{widget.NewLabel(""), f.secondary},
		f.row(StarFieldMagBright, "Brightest", "e.g. 10.1 (mag)"),
		f.row(StarFieldMagFaint, "Faintest", "e.g. 10.9 (mag)"),
		f.rowOf("notes", "Notes", notes),
	} {
		rows = append(rows, r...)
	}
	f.starBox = container.New(layout.NewFormLayout(), rows...)
	rows = nil
	for _, r := range [][]fyne.CanvasObject{
		f.row(StarFieldT0, "T0", "full Julian date, e.g. 2460000.1234"),
		f.rowOf(StarFieldScale, "Time scale", f.scale),
		f.row(StarFieldPeriod, "Period P", "0.5671 (days) or 13.6 h"),
		f.row(StarFieldQ, "Q", "0 (days; T = T0 + P·E + Q·E²)"),
		f.row(StarFieldEpochErr, "σ(T0)", "days; empty when not known"),
		f.row(StarFieldPeriodErr, "σ(P)", "days; empty when not known"),
		f.row(StarFieldSource, "Source", "a publication, or e.g. own O−C fit 2026"),
	} {
		rows = append(rows, r...)
	}
	f.ephemBox = container.New(layout.NewFormLayout(), rows...)
	f.formErr = widget.NewLabel("")
	f.formErr.Wrapping = fyne.TextWrapWord
	f.formErr.Importance = widget.DangerImportance
	f.formErr.Hide()
	f.save = widget.NewButtonWithIcon("Save", theme.ConfirmIcon(), f.submit)
	f.save.Importance = widget.HighImportance
	f.cancel = widget.NewButtonWithIcon("Cancel", theme.CancelIcon(), f.close)
	// The fields scroll; what is wrong with the form as a whole, and Save
	// and Cancel, stay in sight under them.
	f.scroll = container.NewVScroll(container.NewVBox(f.heading, f.intro, f.starBox, f.ephemBox))
	f.root = container.NewBorder(nil, container.NewVBox(widget.NewSeparator(),
		capHeight(f.formErr, starMessagesHeight), container.NewHBox(f.save, f.cancel)), nil, nil, f.scroll)
	f.root.Hide()
	return f
}

// row makes an entry row for field key.
func (f *starFormPanel) row(key, label, hint string) []fyne.CanvasObject {
	e := newKeyEntry(f.v.w)
	e.SetPlaceHolder(hint)
	e.OnChanged = func(string) { f.clearErr(key) }
	e.OnSubmitted = func(string) { f.submit() } // Enter saves
	f.entries[key] = e
	return f.rowOf(key, label, e)
}

// rowOf makes a row of any field, with its error label under it.
func (f *starFormPanel) rowOf(key, label string, field fyne.CanvasObject) []fyne.CanvasObject {
	l := widget.NewLabel("")
	l.Wrapping = fyne.TextWrapWord
	l.Importance = widget.DangerImportance
	l.Hide()
	f.errs[key] = l
	f.labels[key] = label
	f.order = append(f.order, key)
	return []fyne.CanvasObject{widget.NewLabel(label), container.NewVBox(field, l)}
}

// clearErr hides the error of field key (the user is changing it).
func (f *starFormPanel) clearErr(key string) {
	if l := f.errs[key]; l != nil && l.Visible() {
		l.SetText("")
		l.Hide()
	}
}

// showErrs puts each fault under its field; faults of the whole form (and
// of fields the form does not show) go under the form.
func (f *starFormPanel) showErrs(errs StarFieldErrors) {
	for k := range f.errs {
		f.clearErr(k)
	}
	var rest, marked []string
	for k, msg := range errs {
		if l := f.errs[k]; l != nil && k != StarFieldForm {
			l.SetText(msg)
			l.Show()
		} else {
			rest = append(rest, msg)
		}
	}
	// The fields at fault may have scrolled out of sight: say which they
	// are beside the buttons.
	for _, k := range f.order {
		if _, bad := errs[k]; bad && f.errs[k] != nil && k != StarFieldForm {
			marked = append(marked, f.labels[k])
		}
	}
	if len(marked) > 0 {
		rest = append([]string{"Not saved: see the message under " + starJoin(marked) + "."}, rest...)
	}
	f.formErr.SetText(strings.Join(rest, "\n"))
	f.formErr.Hidden = len(rest) == 0
	f.root.Refresh()
}

// starJoin joins names as words do: "RA (h)", "RA (h) and Dec (°)",
// "Name, RA (h) and Dec (°)".
func starJoin(names []string) string {
	if len(names) < 2 {
		return strings.Join(names, "")
	}
	return strings.Join(names[:len(names)-1], ", ") + " and " + names[len(names)-1]
}

// open shows the form in mode, filled from the star on show (or empty for
// a new star).
func (f *starFormPanel) open(mode starFormMode) {
	v := f.v
	if mode != starFormNew && v.target.Name == "" {
		return
	}
	v.confirm.hide()
	f.mode, f.editing = mode, v.target.Name
	for _, e := range f.entries {
		e.SetText("")
	}
	f.showErrs(nil)
	t := v.target
	switch mode {
	case starFormEdit:
		f.heading.SetText("Edit " + t.Name)
		f.intro.SetText("Position, class, magnitudes and notes. The ephemeris changes only with “New ephemeris”, which keeps the old one in the history.")
		f.fillStar(StarFormOf(t))
	case starFormNew:
		f.heading.SetText("New star")
		f.intro.SetText("Where it is, what it is, and its ephemeris: the times of its maxima or minima, T(E) = T0 + P·E + Q·E².")
		f.class.SetSelected("pulsating")
		f.kind.SetSelected("maximum")
		f.secondary.SetChecked(false)
		f.scale.SetSelected(ephem.BJDTDB.Label())
	case starFormAdopt:
		f.heading.SetText("New ephemeris for " + t.Name)
		f.intro.SetText("The planner predicts from it once saved; the current one stays in the history. T0 is a full Julian date on the scale chosen.")
		f.fillEphem(StarEphemFormOf(t.Ephemeris))
	}
	f.starBox.Hidden = mode == starFormAdopt
	f.ephemBox.Hidden = mode == starFormEdit
	f.root.Show()
	f.scroll.ScrollToTop()
	v.details.Hide()
	v.refresh()
	v.forecast.build()
	if mode == starFormAdopt {
		v.w.Win.Canvas().Focus(f.entries[StarFieldT0])
	} else {
		v.w.Win.Canvas().Focus(f.entries[StarFieldName])
	}
}

// close puts the details back in place of the form.
func (f *starFormPanel) close() {
	if f.mode == starFormClosed {
		return
	}
	wasNew := f.mode == starFormNew
	f.mode = starFormClosed
	f.root.Hide()
	f.v.details.Show()
	f.v.refresh()
	if wasNew {
		f.v.forecast.build()
	}
}
