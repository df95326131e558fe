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

	"example.org/vigil/observe/logbook"
)

// The scope choices and the phase binning choices of the charts.
var (
	measureScopes = []string{"This night", "All nights"}
	measureBins   = []string{"No bins", "10 bins", "20 bins", "50 bins"}
)

// measureView is the Measurements page: the night's record, the entry grid
// (a new row over the night's rows), the import, the light curve and the
// folded curve, and the check star's summary.
type measureView struct {
	w    *Window
	req  *MeasureRequest // nil with no star or no site
	data *MeasureData    // nil while loading
	tbl  MeasureTable
	an   *MeasureAnalysis
	form *measureForm

	title      *widget.Label
	observer   *keyEntry
	equipment  *keyEntry
	conditions *keyEntry
	saveNight  *widget.Button
	importBtn  *widget.Button
	grid       *keyTable
	rowsHead   *widget.Label
	status     *widget.Label
	undo       *widget.Button
	empty      *widget.Label // instead of the table
	pageEmpty  *widget.Label // instead of the whole page
	summary    *widget.RichText
	scope      *widget.RadioGroup
	bins       *widget.Select
	light      *ChartView
	phase      *ChartView
	content    fyne.CanvasObject
	pageMsg    fyne.CanvasObject
	root       fyne.CanvasObject

	nightKey string               // the request whose night fields are on show
	deleted  *logbook.Measurement // the last row deleted, for Undo
	adding   bool
	seq      int // numbers the jobs of adds and deletes
	imp      *measureImportView
}

func newMeasurePage(w *Window) Page {
	v := &measureView{w: w}
	v.form = newMeasureForm(v)
	v.title = widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	v.title.Truncation = fyne.TextTruncateEllipsis
	v.observer, v.equipment, v.conditions = newKeyEntry(w), newKeyEntry(w), newKeyEntry(w)
	v.observer.PlaceHolder, v.equipment.PlaceHolder, v.conditions.PlaceHolder = "observer", "telescope, camera, filter", "sky, seeing, Moon"
	v.saveNight = widget.NewButtonWithIcon("Save night", theme.DocumentSaveIcon(), v.saveNightDetails)
	v.importBtn = widget.NewButtonWithIcon("Import CSV…", theme.FolderOpenIcon(), v.chooseImport)
	v.rowsHead = widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	v.status = widget.NewLabel("")
	v.status.Truncation = fyne.TextTruncateEllipsis
	v.undo = widget.NewButtonWithIcon("Undo", theme.ContentUndoIcon(), v.undoDelete)
	v.undo.Hide()
	v.empty = widget.NewLabel("")
	v.empty.Wrapping = fyne.TextWrapWord
	v.empty.Alignment = fyne.TextAlignCenter
	v.pageEmpty = widget.NewLabel("")
	v.pageEmpty.Wrapping = fyne.TextWrapWord
	v.pageEmpty.Alignment = fyne.TextAlignCenter
	v.summary = widget.NewRichText()
	v.summary.Wrapping = fyne.TextWrapWord
	v.grid = newKeyTable(w, v.size, v.newCell, v.updateCell)
	v.grid.CreateHeader = func() fyne.CanvasObject {
		return widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	}
	v.grid.UpdateHeader = func(id widget.TableCellID, o fyne.CanvasObject) {
		txt := ""
		if id.Col >= 0 && id.Col < len(v.tbl.Columns) {
			txt = v.tbl.Columns[id.Col]
		}
		o.(*widget.Label).SetText(txt)
	}
	v.scope = widget.NewRadioGroup(measureScopes, func(string) { v.analyse() })
	v.scope.Horizontal, v.scope.Required = true, true
	v.scope.SetSelected(measureScopes[0])
	v.bins = widget.NewSelect(measureBins, func(string) { v.showCharts() })
	v.bins.SetSelected(measureBins[0])
	v.light, v.phase = w.NewChartView(), w.NewChartView()

	night := container.NewBorder(nil, nil, widget.NewLabel("Night:"), v.saveNight,
		&fyne.Container{Layout: measureWeights{1, 1.7, 1.3}, Objects: []fyne.CanvasObject{v.observer, v.equipment, v.conditions}})
	top := container.NewVBox(v.title, night, widget.NewSeparator(), v.form.box, widget.NewSeparator())
	rowsBar := container.NewBorder(nil, nil, v.rowsHead, container.NewHBox(v.undo, v.importBtn), v.status)
	rows := container.NewBorder(rowsBar, nil, nil, nil,
		container.NewStack(v.grid, container.NewVScroll(container.NewPadded(v.empty))))
	left := container.NewVSplit(rows, container.NewVScroll(v.summary))
	left.Offset = 0.68
	chartBar := container.NewHBox(v.scope, layout.NewSpacer(), widget.NewLabel("Phase:"), v.bins)
	charts := container.NewVSplit(v.light, v.phase)
	right := container.NewBorder(chartBar, nil, nil, nil, charts)
	split := container.NewHSplit(left, right)
	split.Offset = 0.5
	v.content = container.NewBorder(top, nil, nil, nil, split)
	v.pageMsg = container.NewVScroll(container.NewPadded(v.pageEmpty))
	v.root = container.NewStack(v.content, v.pageMsg)

	w.AddKey("measure", measureKeyNew, KeyAnywhere, v.newRow)
	w.Session.OnChange(v.changed)
	v.load()
	return v
}

// relayout lays the page out again after a part changed height (the
// messages under the entry row).
func (v *measureView) relayout() {
	if c, ok := v.content.(*fyne.Container); ok {
		c.Refresh()
	}
}

// Content implements Page.
func (v *measureView) Content() fyne.CanvasObject { return v.root }

// changed follows the session: another star, night or site, the logbook
// read again, or records written (the rows, charts and summary follow).
func (v *measureView) changed(c Change) {
	if c&(ChangedSelection|ChangedNight|ChangedSite|ChangedSites|ChangedTargets|ChangedRecords) != 0 {
		v.load()
	}
}

// load reads the star's measurements and the night's record again.
func (v *measureView) load() {
	s := v.w.Session
	site, hasSite := s.Site()
	t, hasStar := s.Target(s.Selected())
	if !hasSite || !hasStar {
		v.req, v.data, v.an = nil, nil, nil
		v.w.Jobs.Cancel("measure-load")
		v.w.Jobs.Cancel("measure-analysis")
		msg := "Select a star in the list to type its measurements at the eyepiece or import them from a file."
		switch {
		case !hasSite:
			msg = "This logbook has no observing site yet: measurements belong to a night at a site. Import a sites.csv first."
		case len(s.Targets()) == 0:
			msg = "No stars yet: add one or import a catalogue, then select it to type or import its measurements."
		}
		v.pageEmpty.SetText(msg)
		v.pageMsg.Show()
		v.content.Hide()
		return
	}
	r := MeasureRequest{Target: t, Site: site, Date: s.Date()}
	if v.req == nil || v.req.Key() != r.Key() {
		v.data, v.an = nil, nil
		v.tbl = MeasureTable{}
		v.grid.Refresh()
		v.status.SetText("")
		v.undo.Hide()
		v.deleted = nil
		v.form.result.Hide()
	}
	v.req = &r
	v.pageMsg.Hide()
	v.content.Show()
	v.title.SetText(fmt.Sprintf("%s · %s at %s", t.Name, nightTitle(r.Date), site.Name))
	v.form.setStar(t, site, r.Date)
	if v.data == nil {
		v.rowsHead.SetText("Loading…")
	}
	lb := s.Logbook()
	Run(v.w.Jobs, "measure-load", "", func(context.Context, Progress) (MeasureData, error) {
		return LoadMeasure(lb, r)
	}, func(d MeasureData, err error) {
		if err != nil {
			v.rowsHead.SetText("")
			v.status.SetText("The measurements could not be read: " + err.Error())
			return
		}
		v.data = &d
		if v.nightKey != r.Key() {
			v.nightKey = r.Key()
			v.observer.SetText(d.Night.Observer)
			v.equipment.SetText(d.Night.Equipment)
			v.conditions.SetText(d.Night.Conditions)
		}
		v.showTable()
		v.analyse()
	})
}

// nightDetails returns the night's record as the fields give it.
func (v *measureView) nightDetails() logbook.Night {
	var n logbook.Night
	if v.data != nil {
		n = v.data.Night
	}
	n.Observer = strings.TrimSpace(v.observer.Text)
	n.Equipment = strings.TrimSpace(v.equipment.Text)
	n.Conditions = strings.TrimSpace(v.conditions.Text)
	return n
}

// saveNightDetails stores the night's observer, equipment and conditions.
func (v *measureView) saveNightDetails() {
	if v.req == nil {
		return
	}
	r, details, lb := *v.req, v.nightDetails(), v.w.Session.Logbook()
	Run(v.w.Jobs, "measure-night", "", func(context.Context, Progress) (logbook.Night, error) {
		return SaveMeasureNight(lb, r, details)
	}, func(n logbook.Night, err error) {
		if err != nil {
			v.status.SetText("The night could not be saved: " + err.Error())
			return
		}
		if v.data != nil && v.req.Key() == r.Key() {
			v.data.Night = n
		}
		v.status.SetText("Night details saved.")
		v.w.RecordsChanged()
	})
}

// newRow starts a new row (Ctrl+N): the page comes to the front and the
// cursor goes to the time field.
func (v *measureView) newRow() {
	v.w.ShowPage("measure")
	if v.req == nil {
		return
	}
	if v.form.result.Visible() || v.form.problems.Visible() {
		v.form.cleared(v.form.entry())
	}
	v.w.Win.Canvas().Focus(v.form.time)
}
