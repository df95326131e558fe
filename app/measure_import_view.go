package app

import (
	"context"
	"fmt"
	"path/filepath"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/storage"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/reduce"
)

// The import of a photometry file with its column-mapping step: a dialog
// showing the file's header and first rows, a choice of column for each
// quantity, the preview of the reduction, and Import.

// measureNone is the choice of no column.
const measureNone = "(none)"

// measureTimeKinds name the time formats, in the order of reduce's.
var measureTimeKinds = []string{"Julian date (UTC)", "Modified Julian date (UTC)", "Date and time (ISO 8601)"}

// measureImportView is the open import dialog.
type measureImportView struct {
	v      *measureView
	im     *MeasureImport
	req    MeasureRequest
	dlg    dialog.Dialog
	sample *widget.Table

	timeCol, timeKind, exposure *widget.Select
	target, targetErr           *widget.Select
	filter, airmass             *widget.Select
	stars                       map[string][2]*widget.Select // mag and error by label
	only                        *widget.Entry
	preview                     *widget.RichText
	doImport, cancel            *widget.Button

	pv      MeasurePreview
	nights  []MeasureImportNight
	pending bool // a preview is being computed
	busy    bool // the import is being stored
}

// chooseImport asks for the file to import.
func (v *measureView) chooseImport() {
	if v.req == nil {
		return
	}
	fd := dialog.NewFileOpen(func(rc fyne.URIReadCloser, err error) {
		if err != nil || rc == nil {
			return
		}
		path := rc.URI().Path()
		rc.Close()
		v.startImport(path)
	}, v.w.Win)
	fd.SetFilter(storage.NewExtensionFileFilter([]string{".csv", ".txt", ".CSV"}))
	fd.Resize(fyne.NewSize(820, 560))
	fd.Show()
}

// startImport reads the file at path and opens the mapping step.
func (v *measureView) startImport(path string) {
	if v.req == nil {
		return
	}
	r := *v.req
	Run(v.w.Jobs, "measure-open", "Reading "+filepath.Base(path), func(context.Context, Progress) (*MeasureImport, error) {
		return OpenMeasureImport(path)
	}, func(im *MeasureImport, err error) {
		if err != nil {
			v.status.SetText("The file cannot be read: " + err.Error())
			return
		}
		v.showImport(im, r)
	})
}

// showImport opens the mapping dialog for im, with a first guess of the
// columns.
func (v *measureView) showImport(im *MeasureImport, r MeasureRequest) {
	p := &measureImportView{v: v, im: im, req: r, stars: map[string][2]*widget.Select{}}
	v.imp = p
	opts := append([]string{measureNone}, im.Header...)
	sel := func() *widget.Select {
		s := widget.NewSelect(opts, func(string) { p.update() })
		s.PlaceHolder = measureNone
		return s
	}
	p.timeCol, p.exposure, p.target, p.targetErr, p.filter, p.airmass = sel(), sel(), sel(), sel(), sel(), sel()
	p.timeKind = widget.NewSelect(measureTimeKinds, func(string) { p.update() })
	p.only = widget.NewEntry()
	p.only.PlaceHolder = "every frame"
	p.only.OnChanged = func(string) { p.update() }
	// Two columns of label and choice: what a quantity is on the left, its
	// error (or how it is written) on the right, row against row.
	left := []fyne.CanvasObject{measureRight("Time"), p.timeCol, measureRight("Exposure (s)"), p.exposure,
		measureRight("Target"), p.target}
	right := []fyne.CanvasObject{measureRight("written as"), p.timeKind, measureRight("Filter"), p.filter,
		measureRight("its error"), p.targetErr}
	var labels, names []string
	for _, c := range r.Target.Comps {
		labels, names = append(labels, c.ID), append(names, fmt.Sprintf("%s (V %.3f)", c.ID, c.V))
	}
	if len(r.Target.Checks) > 0 {
		k := r.Target.Checks[0]
		labels, names = append(labels, k.ID), append(names, fmt.Sprintf("%s check (V %.3f)", k.ID, k.V))
	}
	for i, l := range labels {
		pair := [2]*widget.Select{sel(), sel()}
		p.stars[l] = pair
		left = append(left, measureRight(names[i]), pair[0])
		right = append(right, measureRight("its error"), pair[1])
	}
	left = append(left, measureRight("Air mass"), p.airmass)
	right = append(right, measureRight("Only the filter"), p.only)

	p.sample = widget.NewTable(func() (int, int) { return len(im.Sample), len(im.Header) },
		func() fyne.CanvasObject { l := widget.NewLabel(""); l.Truncation = fyne.TextTruncateClip; return l },
		func(id widget.TableCellID, o fyne.CanvasObject) { o.(*widget.Label).SetText(im.Sample[id.Row][id.Col]) })
	p.sample.ShowHeaderRow = true
	p.sample.CreateHeader = func() fyne.CanvasObject {
		return widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	}
	p.sample.UpdateHeader = func(id widget.TableCellID, o fyne.CanvasObject) {
		if id.Col >= 0 {
			o.(*widget.Label).SetText(im.Header[id.Col])
		}
	}
	for i := range im.Header {
		p.sample.SetColumnWidth(i, 104)
	}
	p.preview = widget.NewRichText()
	p.preview.Wrapping = fyne.TextWrapWord
	p.cancel = widget.NewButton("Cancel", p.close)
	p.doImport = widget.NewButtonWithIcon("Import", theme.DownloadIcon(), p.store)
	p.doImport.Importance = widget.HighImportance
	p.doImport.Disable()

	head := widget.NewLabel(fmt.Sprintf("%s · %s · the first rows:", im.Name, plural(im.Rows, "row", "rows")))
	head.Truncation = fyne.TextTruncateEllipsis
	top := container.NewVBox(head,
		&fyne.Container{Layout: measureMin{fyne.NewSize(200, 150)}, Objects: []fyne.CanvasObject{p.sample}},
		widget.NewLabelWithStyle("Which column holds what", fyne.TextAlignLeading, fyne.TextStyle{Bold: true}),
		container.NewGridWithColumns(2, container.New(layout.NewFormLayout(), left...), container.New(layout.NewFormLayout(), right...)),
		widget.NewSeparator())
	buttons := container.NewHBox(layout.NewSpacer(), p.cancel, p.doImport)
	content := container.NewBorder(top, buttons, nil, nil, container.NewVScroll(p.preview))
	p.dlg = dialog.NewCustomWithoutButtons("Import measurements of "+r.Target.Name, content, v.w.Win)
	p.dlg.Resize(fyne.NewSize(960, 740))

	p.apply(im.GuessMapping(labels))
	p.dlg.Show()
	p.update()
}

// measureRight is a label for the mapping grid, set against its choice.
func measureRight(s string) *widget.Label {
	return widget.NewLabelWithStyle(s, fyne.TextAlignTrailing, fyne.TextStyle{})
}

// apply shows the mapping m in the choices.
func (p *measureImportView) apply(m MeasureMapping) {
	set := func(s *widget.Select, col string) {
		if col == "" {
			col = measureNone
		}
		s.Selected = col
		s.Refresh()
	}
	set(p.timeCol, m.Time)
	p.timeKind.Selected = measureTimeKinds[m.TimeFormat]
	p.timeKind.Refresh()
	set(p.exposure, m.Exposure)
	set(p.target, m.Target)
	set(p.targetErr, m.TargetErr)
	set(p.filter, m.Filter)
	set(p.airmass, m.Airmass)
	for l, pair := range p.stars {
		set(pair[0], m.Stars[l].Mag)
		set(pair[1], m.Stars[l].Err)
	}
	p.only.Text = m.OnlyFilter
	p.only.Refresh()
}

// mapping reads the choices.
func (p *measureImportView) mapping() MeasureMapping {
	col := func(s *widget.Select) string {
		if s.Selected == measureNone {
			return ""
		}
		return s.Selected
	}
	m := MeasureMapping{Time: col(p.timeCol), Exposure: col(p.exposure), Target: col(p.target), TargetErr: col(p.targetErr),
		Filter: col(p.filter), Airmass: col(p.airmass), OnlyFilter: p.only.Text, Stars: map[string]MeasureStarColumns{}}
	for i, k := range measureTimeKinds {
		if p.timeKind.Selected == k {
			m.TimeFormat = reduce.TimeFormat(i)
		}
	}
	for l, pair := range p.stars {
		if c := col(pair[0]); c != "" {
			m.Stars[l] = MeasureStarColumns{Mag: c, Err: col(pair[1])}
		}
	}
	return m
}

// update reduces the file as now mapped, off the UI thread, and shows what
// an import would do.
func (p *measureImportView) update() {
	if p.preview == nil || p.doImport == nil {
		return // still being built
	}
	m, im, r, lb := p.mapping(), p.im, p.req, p.v.w.Session.Logbook()
	p.pending = true
	p.doImport.Disable()
	type result struct {
		pv     MeasurePreview
		nights []MeasureImportNight
	}
	Run(p.v.w.Jobs, "measure-preview", "", func(context.Context, Progress) (result, error) {
		pv := im.Preview(r, m)
		if pv.Err != nil {
			return result{pv: pv}, nil
		}
		ns, err := pv.Nights(lb, r.Site.Name)
		return result{pv, ns}, err
	}, func(res result, err error) {
		p.pending = false
		if err != nil {
			res.pv.Err = err
		}
		p.pv, p.nights = res.pv, res.nights
		p.showPreview(p.pv.Notes(p.im.Rows, p.nights))
		if p.pv.Err == nil && !p.busy {
			p.doImport.SetText(fmt.Sprintf("Import %s", plural(len(p.pv.Measurements), "frame", "frames")))
			p.doImport.Enable()
		}
	})
}

// showPreview shows the notes, warnings in the error colour.
func (p *measureImportView) showPreview(notes []MeasureNote) {
	var segs []widget.RichTextSegment
	for _, n := range notes {
		st := widget.RichTextStyleParagraph
		switch {
		case n.Warn:
			st.ColorName = theme.ColorNameError
		case n.Calm:
			st.ColorName = theme.ColorNamePlaceHolder
		}
		segs = append(segs, &widget.TextSegment{Text: n.Text, Style: st})
	}
	p.preview.Segments = segs
	p.preview.Refresh()
}

// store imports the frames previewed, all or none.
func (p *measureImportView) store() {
	if p.pending || p.busy || p.pv.Err != nil {
		return
	}
	p.busy = true
	p.doImport.Disable()
	p.doImport.SetText("Importing…")
	pv, r, lb, details := p.pv, p.req, p.v.w.Session.Logbook(), p.v.nightDetails()
	Run(p.v.w.Jobs, "measure-import", "", func(context.Context, Progress) (int, error) {
		return StoreMeasureImport(lb, r, details, pv)
	}, func(n int, err error) {
		p.busy = false
		if err != nil {
			p.showPreview([]MeasureNote{{Text: "Nothing was imported: " + err.Error(), Warn: true}})
			p.doImport.SetText("Import")
			return
		}
		p.close()
		p.v.status.SetText(fmt.Sprintf("Imported %s from %s.", plural(n, "frame", "frames"), filepath.Base(p.im.Name)))
		p.v.w.RecordsChanged()
	})
}

// close closes the dialog.
func (p *measureImportView) close() {
	p.dlg.Hide()
	if p.v.imp == p {
		p.v.imp = nil
	}
}
