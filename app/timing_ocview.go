package app

import (
	"context"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/app/chart"
)

// timingWidths are the widths of the timings table's columns.
var timingWidths = []float32{118, 84, 96, 88, 70, 90, 90, 80, 70, 240}

// The residual panel's choices.
const timingResPreferred = "the preferred fit"

// timingOCPane shows the O−C diagram with its fits and what they say, the
// choice of a fit to adopt, the table of the star's timings (with delete)
// and the form for a published timing.
type timingOCPane struct {
	v         *timingView
	chart     *ChartView
	residuals *widget.Select
	summary   *widget.Label
	fitChoice *widget.Select
	adoptBtn  *widget.Button
	table     *keyTable
	tableMsg  *widget.Label
	del       *widget.Button
	root      fyne.CanvasObject

	pubJD, pubSigma, pubSource *widget.Entry
	pubScale, pubKind          *widget.Select
	pubSecondary               *widget.Check
	pubAdd, pubOpen            *widget.Button
	pubErrs                    map[string]*widget.Label
	pubForm                    fyne.CanvasObject
	pubDialog                  *dialog.CustomDialog

	study *TimingStudy
	rows  []TimingRow
	row   int // the selected row; -1 for none
}

func newTimingOCPane(v *timingView) *timingOCPane {
	p := &timingOCPane{v: v, row: -1}
	p.chart = v.w.NewChartView()
	p.residuals = widget.NewSelect([]string{timingResPreferred, chart.FitLinear, chart.FitQuadratic, chart.FitLightTime},
		func(string) { p.redraw() })
	p.residuals.SetSelected(timingResPreferred)
	p.summary = widget.NewLabel("")
	p.summary.Wrapping = fyne.TextWrapWord
	p.fitChoice = widget.NewSelect([]string{"linear", "quadratic"}, nil)
	p.adoptBtn = widget.NewButton("Adopt this ephemeris…", p.askAdopt)
	p.adoptBtn.Importance = widget.HighImportance
	p.table = newKeyTable(v.w, func() (int, int) { return len(p.rows), len(TimingColumns) }, p.newCell, p.updateCell)
	p.table.CreateHeader = func() fyne.CanvasObject {
		return widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	}
	p.table.UpdateHeader = func(id widget.TableCellID, o fyne.CanvasObject) {
		if id.Col >= 0 && id.Col < len(TimingColumns) {
			o.(*widget.Label).SetText(TimingColumns[id.Col])
		}
	}
	for i, wd := range timingWidths {
		p.table.SetColumnWidth(i, wd)
	}
	p.table.OnSelected = func(id widget.TableCellID) {
		p.row = id.Row
		p.del.Enable()
	}
	p.tableMsg = widget.NewLabel("")
	p.tableMsg.Wrapping = fyne.TextWrapWord
	p.tableMsg.Alignment = fyne.TextAlignCenter
	p.del = widget.NewButtonWithIcon("Delete the selected timing", theme.DeleteIcon(), p.deleteRow)
	p.del.Disable()

	p.pubForm = p.newPublishedForm()
	p.pubOpen = widget.NewButtonWithIcon("Add a published timing…", theme.ContentAddIcon(), p.openPublished)
	chartBox := container.NewBorder(container.NewHBox(layout.NewSpacer(), widget.NewLabel("Residuals from"), timingSized(p.residuals, 170)),
		nil, nil, nil, p.chart)
	tableBox := container.NewBorder(container.NewHBox(timingBold("The star's timings"), layout.NewSpacer(), p.pubOpen, p.del), nil, nil, nil,
		container.NewStack(p.table, container.NewCenter(p.tableMsg)))
	left := container.NewVSplit(chartBox, tableBox)
	left.Offset = 0.6

	adopt := container.NewVBox(timingBold("Adopt a fitted ephemeris"),
		container.NewBorder(nil, nil, widget.NewLabel("Fit"), nil, p.fitChoice), p.adoptBtn)
	right := container.NewBorder(timingBold("What the O−C says"), container.NewVBox(widget.NewSeparator(), adopt),
		nil, nil, container.NewVScroll(p.summary))
	split := container.NewHSplit(left, right)
	split.Offset = 0.64
	p.root = split
	p.setData(nil)
	return p
}

// setData shows the star's timings and works out the O−C diagram in a job
// (the light-time fit may take a moment).
func (p *timingOCPane) setData(d *TimingData) {
	p.study, p.rows, p.row = nil, nil, -1
	p.table.UnselectAll()
	p.del.Disable()
	if d == nil {
		p.chart.SetEmpty("")
		p.summary.SetText("")
		p.adoptBtn.Disable()
		p.pubOpen.Disable()
		p.table.Refresh()
		return
	}
	p.pubOpen.Enable()
	p.pubKind.SetSelected(d.Target.Kind.String())
	p.summary.SetText("Working out the O−C diagram…")
	tg, timings := d.Target, d.Timings
	Run(p.v.w.Jobs, timingSlotOC, "", func(context.Context, Progress) (TimingStudy, error) {
		return TimingStudyOC(tg, timings), nil
	}, func(s TimingStudy, err error) {
		if err != nil {
			return
		}
		p.show(&s)
	})
}

// show puts a study on the pane.
func (p *timingOCPane) show(s *TimingStudy) {
	p.study, p.rows = s, s.Rows
	p.summary.SetText(strings.Join(s.Summary(), "\n\n"))
	p.tableMsg.SetText("")
	p.tableMsg.Hidden = len(p.rows) > 0
	p.table.Hidden = len(p.rows) == 0
	if len(p.rows) == 0 {
		p.tableMsg.SetText("No timings yet: fit an extremum on the first tab, or add a published one (the button above).")
	}
	p.table.Refresh()
	if s.Analysis != nil {
		p.fitChoice.SetSelected(s.Analysis.Preferred)
		p.adoptBtn.Enable()
	} else {
		p.adoptBtn.Disable()
	}
	p.redraw()
}

// redraw draws the O−C diagram over the residuals of the chosen fit.
func (p *timingOCPane) redraw() {
	s := p.study
	if s == nil {
		return
	}
	if s.Analysis == nil {
		msg := "No timings yet: fit an extremum on the first tab, or add a published one (the button below)."
		if len(s.Rows) > 0 {
			msg = "No O−C diagram: " + s.Err.Error() + "."
		}
		p.chart.SetEmpty(msg)
		return
	}
	d := chart.OCData{Title: s.Target.Name + ": O−C", Analysis: *s.Analysis, Published: s.Published}
	if s.ShowLightTime() {
		lt := *s.LightTime
		d.LightTime = &lt
	}
	if r := p.residuals.Selected; r != timingResPreferred {
		d.Residuals = r
		if r == chart.FitLightTime && d.LightTime == nil {
			d.Residuals = ""
		}
	}
	p.chart.SetSource(func(_ context.Context, pal chart.Palette) (Drawable, error) {
		return chart.OCWithResiduals(d, pal)
	})
}

// newCell makes a cell: a label drawn quietly (quiet) when its timing is
// left out of the O−C.
func (p *timingOCPane) newCell() fyne.CanvasObject {
	l := widget.NewLabel("")
	l.Truncation = fyne.TextTruncateEllipsis
	q := quiet(l)
	l.Importance = widget.MediumImportance
	return q
}

func (p *timingOCPane) updateCell(id widget.TableCellID, o fyne.CanvasObject) {
	l := o.(*container.ThemeOverride).Content.(*widget.Label)
	text := ""
	if id.Row >= 0 && id.Row < len(p.rows) && id.Col < len(TimingColumns) {
		r := p.rows[id.Row]
		text = r.Cells[id.Col]
		l.Importance = widget.MediumImportance
		if !r.InOC {
			l.Importance = widget.LowImportance
		}
	}
	l.SetText(text)
}

// askAdopt asks before adopting the chosen fit.
func (p *timingOCPane) askAdopt() {
	s := p.study
	if s == nil || s.Analysis == nil {
		return
	}
	fit := p.fitChoice.Selected
	eph, err := s.Candidate(fit)
	if err != nil {
		p.v.say("This fit cannot be adopted", err)
		return
	}
	p.v.askAdopt(eph, TimingAdoptSource(fit+" O−C fit", len(s.Used), p.v.w.Session.Now()))
}

// deleteRow deletes the selected timing, after asking.
func (p *timingOCPane) deleteRow() {
	if p.row < 0 || p.row >= len(p.rows) {
		return
	}
	t := p.rows[p.row].Timing
	p.v.confirmDelete(t)
}
