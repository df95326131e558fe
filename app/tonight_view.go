package app

import (
	"context"
	"strings"
	"sync"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/app/chart"
	"example.org/vigil/observe"
)

// tonightWidths are the widths of the Tonight table's columns.
var tonightWidths = []float32{58, 58, 150, 84, 76, 76, 64, 250, 66}

// tonightView is the Tonight page: the night's extrema of every star in a
// table, the detail of the chosen one, and the altitude chart beside them.
type tonightView struct {
	w       *Window
	model   TonightModel
	summary *widget.Label
	caution *widget.Label
	table   *keyTable
	detail  *widget.Label
	empty   *widget.Label
	chart   *ChartView
	left    *fyne.Container // the table with its texts above and below
	root    fyne.CanvasObject

	row      int    // the table's selected row, -1 for none
	syncing  bool   // selecting a row to follow the session
	chartKey string // the site, night and stars of the chart on show
}

func newTonightPage(w *Window) Page {
	v := &tonightView{w: w, row: -1}
	v.summary = widget.NewLabel("")
	v.summary.Truncation = fyne.TextTruncateEllipsis
	v.caution = newSunCaution(observe.SolarWarningText)
	v.detail = widget.NewLabel("")
	v.detail.Wrapping = fyne.TextWrapWord
	v.empty = widget.NewLabel("")
	v.empty.Wrapping = fyne.TextWrapWord
	v.empty.Alignment = fyne.TextAlignCenter
	v.table = newKeyTable(w, v.size, v.newCell, v.updateCell)
	v.table.CreateHeader = func() fyne.CanvasObject {
		return widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	}
	v.table.UpdateHeader = func(id widget.TableCellID, o fyne.CanvasObject) {
		if id.Col >= 0 && id.Col < len(TonightColumns) {
			o.(*widget.Label).SetText(TonightColumns[id.Col])
		}
	}
	for i, wd := range tonightWidths {
		v.table.SetColumnWidth(i, wd)
	}
	v.table.OnSelected = v.selected
	v.chart = w.NewChartView()

	// The empty-state text sits in a scroller, whose small fixed minimum
	// keeps a wrapped text from claiming the height it needs when narrow
	// (which the split would keep after the window has grown).
	v.left = container.NewBorder(container.NewVBox(v.summary, v.caution), v.detail, nil, nil,
		container.NewStack(v.table, container.NewVScroll(container.NewPadded(v.empty))))
	// The table above the chart: at a laptop's width both then show whole
	// (every column, and the night's full time axis).
	split := container.NewVSplit(v.left, v.chart)
	split.Offset = 0.5
	v.root = split
	w.Session.OnChange(v.changed)
	return v
}

// Content implements Page.
func (v *tonightView) Content() fyne.CanvasObject { return v.root }

func (v *tonightView) size() (int, int) { return len(v.model.Rows), len(TonightColumns) }

// newCell makes a cell: rich text, so that a row can be muted in the
// theme's placeholder colour (still readable) rather than greyed out.
func (v *tonightView) newCell() fyne.CanvasObject {
	t := widget.NewRichText(&widget.TextSegment{})
	t.Truncation = fyne.TextTruncateClip
	return t
}

func (v *tonightView) updateCell(id widget.TableCellID, o fyne.CanvasObject) {
	t := o.(*widget.RichText)
	seg := t.Segments[0].(*widget.TextSegment)
	seg.Text, seg.Style = "", widget.RichTextStyleInline
	if id.Row < len(v.model.Rows) && id.Col < len(TonightColumns) {
		r := v.model.Rows[id.Row]
		seg.Text = r.Cells[id.Col]
		seg.Style.TextStyle.Bold = id.Col == 2
		switch {
		case r.Caution && (id.Col == 2 || id.Col == 7):
			seg.Style.ColorName = theme.ColorNameError
		case r.Event.Window.UsableFraction == 0:
			seg.Style.ColorName = theme.ColorNamePlaceHolder // nothing to catch: keep it quiet
		}
	}
	t.Refresh()
}

// changed rebuilds the page when the session has something new for it.
func (v *tonightView) changed(c Change) {
	if c&(ChangedPlan|ChangedTargets|ChangedSite|ChangedSites|ChangedSelection) == 0 {
		return
	}
	s := v.w.Session
	_, hasSite := s.Site()
	v.model = BuildTonight(hasSite, s.Targets(), s.Night(), s.Selected())
	v.summary.SetText(v.model.Summary)
	v.summary.Hidden = len(v.model.Rows) == 0
	v.empty.SetText(v.model.Summary)
	v.empty.Hidden = len(v.model.Rows) > 0
	v.table.Hidden = len(v.model.Rows) == 0
	v.caution.Hidden = v.model.Cautions == 0

	if c&ChangedSelection == 0 || v.row < 0 || v.row >= len(v.model.Rows) ||
		!strings.EqualFold(v.model.Rows[v.row].Event.Target, s.Selected()) {
		v.selectRow(v.model.RowOf(s.Selected()))
	}
	v.left.Refresh() // lays the pane out again (texts shown or hidden) and refreshes the table
	if c&ChangedPlan != 0 {
		v.scrollToFirst()
	}
	v.updateChart()
}

// scrollToFirst brings the selected row, or else the night's first extremum
// that can be caught, to the top of the table.
func (v *tonightView) scrollToFirst() {
	i := v.row
	for j, r := range v.model.Rows {
		if i < 0 && r.Event.Window.UsableFraction > 0 {
			i = j
		}
	}
	rowH := v.newCell().MinSize().Height + theme.SeparatorThicknessSize()
	v.table.ScrollToOffset(fyne.NewPos(0, float32(max(i, 0))*rowH)) // the row at the top
}

// selectRow selects row i of the table (-1: none) without selecting a star.
func (v *tonightView) selectRow(i int) {
	v.syncing = true
	defer func() { v.syncing = false }()
	v.row = i
	if i < 0 {
		v.table.UnselectAll()
	} else {
		v.table.Select(widget.TableCellID{Row: i, Col: 2})
	}
	v.detail.SetText(v.model.Detail(i))
	v.detail.Hidden = i < 0
}

// selected follows a tap on the table: the row's star becomes the session's.
func (v *tonightView) selected(id widget.TableCellID) {
	if v.syncing || id.Row < 0 || id.Row >= len(v.model.Rows) {
		return
	}
	v.row = id.Row
	v.detail.SetText(v.model.Detail(id.Row))
	v.detail.Show()
	v.left.Refresh()
	v.w.Session.Select(v.model.Rows[id.Row].Event.Target)
}

// updateChart draws the altitude chart of the model's stars when they or
// the night changed.
func (v *tonightView) updateChart() {
	nd := v.w.Session.Night()
	if nd == nil || nd.Err != nil || len(v.model.Chart) == 0 {
		v.chartKey = ""
		msg := "The altitude chart of the night appears here once it is planned."
		if nd != nil && nd.Err == nil {
			msg = "No star can be observed tonight: select one in the list to see its altitude."
		}
		if _, ok := v.w.Session.Site(); !ok || len(v.w.Session.Targets()) == 0 {
			msg = "The altitude chart of the night shows here once the logbook has a site and stars."
		}
		v.chart.SetEmpty(msg)
		return
	}
	names := []string{nd.Request.Site.Name, nd.Request.Date.Format(time.DateOnly)}
	for _, t := range v.model.Chart {
		names = append(names, t.Name)
	}
	key := strings.Join(names, "\x00")
	if key == v.chartKey {
		return
	}
	v.chartKey = key
	v.chart.SetSource(altitudeSource(nd.Request.Site, nd.Request.Date, v.model.Chart))
}

// altitudeSource returns a chart source drawing the altitude chart of the
// stars at the site in the night of date (observe.Planner.Chart,
// chart.Altitude); the chart's data are computed once for every palette.
func altitudeSource(site observe.Site, date time.Time, stars []observe.Target) ChartSource {
	var mu sync.Mutex
	var data *observe.Chart
	return func(ctx context.Context, pal chart.Palette) (Drawable, error) {
		mu.Lock()
		defer mu.Unlock()
		if data == nil {
			p, err := observe.NewPlanner(site, PlanConstraints())
			if err != nil {
				return nil, err
			}
			c, err := p.Chart(stars, date)
			if err != nil {
				return nil, err
			}
			data = &c
		}
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		return chart.Altitude(*data, pal)
	}
}
