package app

import (
	"context"
	"fmt"
	"strconv"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/observe"
)

// starForecastWidths are the widths of the forecast table's columns.
var starForecastWidths = map[string]float32{"Night of": 98, "Local": 54, "UTC": 52, "Max/min": 66, "± σ": 76,
	"Altitude": 66, "Verdict": 230, "Usable": 62}

// starForecastPanel is the forecast of the star's coming nights at the
// current site: its extrema with their verdicts and uncertainties.
type starForecastPanel struct {
	v     *starView
	data  *StarForecastData // nil while it is computed
	err   error
	model StarForecastModel
	key   string // what the forecast on show was made for
	row   int

	nights  *widget.Select
	all     *widget.Check
	summary *widget.Label
	caution *widget.Label
	sigma   *widget.Label
	table   *keyTable
	detail  *widget.Label
	empty   *widget.Label
	box     *fyne.Container
	root    fyne.CanvasObject
}

func newStarForecastPanel(v *starView) *starForecastPanel {
	p := &starForecastPanel{v: v, row: -1}
	var opts []string
	for _, n := range StarForecastLengths {
		opts = append(opts, fmt.Sprintf("%d nights", n))
	}
	p.nights = widget.NewSelect(opts, nil)
	p.nights.SetSelectedIndex(0)
	p.nights.OnChanged = func(string) { p.update() }
	p.all = widget.NewCheck("every extremum", func(bool) { p.build() })
	p.summary = widget.NewLabel("")
	p.summary.Wrapping = fyne.TextWrapWord
	p.caution = newSunCaution(observe.SolarWarningText)
	p.sigma = widget.NewLabel("")
	p.sigma.Wrapping = fyne.TextWrapWord
	p.detail = widget.NewLabel("")
	p.detail.Wrapping = fyne.TextWrapWord
	p.detail.Hide()
	p.empty = widget.NewLabel("")
	p.empty.Wrapping = fyne.TextWrapWord
	p.empty.Alignment = fyne.TextAlignCenter
	p.table = newKeyTable(v.w, func() (int, int) { return len(p.model.Rows), len(p.model.Columns) }, p.newCell, p.updateCell)
	// the verdict, with its reasons, takes the room the others leave
	p.table.widths = func(total float32) []float32 {
		base := make([]float32, len(p.model.Columns))
		verdict := -1
		for i, c := range p.model.Columns {
			base[i] = starForecastWidths[c]
			if c == "Verdict" {
				verdict = i
			}
		}
		return stretchColumn(base, verdict, total)
	}
	p.table.CreateHeader = func() fyne.CanvasObject {
		return widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	}
	p.table.UpdateHeader = func(id widget.TableCellID, o fyne.CanvasObject) {
		if id.Col >= 0 && id.Col < len(p.model.Columns) {
			o.(*widget.Label).SetText(p.model.Columns[id.Col])
		}
	}
	p.table.OnSelected = func(id widget.TableCellID) {
		p.row = id.Row
		p.detail.SetText(p.model.Detail(id.Row))
		p.detail.Hidden = p.detail.Text == ""
		p.box.Refresh()
	}
	head := container.NewBorder(nil, nil, starSection("Coming nights"), container.NewHBox(p.all, p.nights))
	p.box = container.NewBorder(container.NewVBox(head, p.summary, p.caution), container.NewVBox(p.detail, p.sigma), nil, nil,
		container.NewStack(p.table, container.NewVScroll(container.NewPadded(p.empty))))
	p.root = p.box
	return p
}

// newCell makes a cell; a text too long for it ends in an ellipsis (the
// row's detail under the table, on a tap, has it whole).
func (p *starForecastPanel) newCell() fyne.CanvasObject {
	t := widget.NewRichText(&widget.TextSegment{})
	t.Truncation = fyne.TextTruncateEllipsis
	return t
}

func (p *starForecastPanel) updateCell(id widget.TableCellID, o fyne.CanvasObject) {
	t := o.(*widget.RichText)
	seg := t.Segments[0].(*widget.TextSegment)
	seg.Text, seg.Style = "", widget.RichTextStyleInline
	if id.Row < len(p.model.Rows) && id.Col < len(p.model.Columns) {
		r := p.model.Rows[id.Row]
		seg.Text = r.Cells[id.Col]
		switch {
		case r.Caution && p.model.Columns[id.Col] == "Verdict":
			seg.Style.ColorName = theme.ColorNameError
		case r.Event.Window.UsableFraction == 0:
			seg.Style.ColorName = theme.ColorNamePlaceHolder
		case r.Event.Window.Whole:
			seg.Style.TextStyle.Bold = p.model.Columns[id.Col] == "Local"
		}
	}
	t.Refresh()
}

// nightsWanted returns the length of forecast chosen.
func (p *starForecastPanel) nightsWanted() int {
	n, err := strconv.Atoi(strings.Fields(p.nights.Selected + " 14")[0])
	if err != nil {
		return StarForecastLengths[0]
	}
	return n
}

// update starts the forecast of the star on show when what it depends on
// changed (site, night, star, its ephemeris, the length).
func (p *starForecastPanel) update() {
	s := p.v.w.Session
	site, hasSite := s.Site()
	t := p.v.target
	nights := p.nightsWanted()
	switch {
	case t.Name == "":
		p.key, p.data, p.err = "", nil, nil
		p.v.w.Jobs.Cancel("star-forecast")
		p.build()
		return
	case !hasSite:
		p.key, p.data, p.err = "", nil, nil
		p.v.w.Jobs.Cancel("star-forecast")
		p.build()
		return
	}
	key := fmt.Sprint(site.Name, site.Site, site.MinAltDeg, s.Date(), nights, t.Name, t.Star, t.Ephemeris, t.Kind, t.Secondary)
	if key == p.key {
		return
	}
	p.key, p.data, p.err = key, nil, nil
	p.build()
	date := s.Date()
	Run(p.v.w.Jobs, "star-forecast", "Forecast of "+t.Name, func(ctx context.Context, _ Progress) (StarForecastData, error) {
		return ForecastStar(ctx, site, t, date, nights)
	}, func(d StarForecastData, err error) {
		p.data, p.err = &d, err
		p.build()
	})
}

// build makes the table from the forecast at hand.
func (p *starForecastPanel) build() {
	s := p.v.w.Session
	_, hasSite := s.Site()
	msg := ""
	switch {
	case p.v.form.mode == starFormNew:
		msg = "The coming nights of the new star show here once it is saved."
	case p.v.target.Name == "":
		msg = "Select a star to see its coming nights."
	case !hasSite:
		msg = "This logbook has no observing site yet, so there are no nights to forecast. Import a sites.csv (vigil logbook import)."
	case p.err != nil:
		msg = "The nights could not be forecast: " + starErrText(p.err)
	case p.data == nil:
		msg = "Forecasting the coming nights…"
	}
	p.model = StarForecastModel{}
	if msg == "" {
		p.model = BuildStarForecast(*p.data, p.all.Checked)
		if len(p.model.Rows) == 0 {
			msg = p.model.Summary
		}
	}
	p.table.fitWidths(p.table.Size().Width)
	p.summary.SetText(p.model.Summary)
	p.summary.Hidden = len(p.model.Rows) == 0
	p.empty.SetText(msg)
	p.empty.Hidden = msg == ""
	p.table.Hidden = len(p.model.Rows) == 0
	p.caution.Hidden = p.model.Cautions == 0
	p.sigma.SetText(p.model.SigmaNote)
	p.sigma.Hidden = p.model.SigmaNote == ""
	p.row = -1
	p.table.UnselectAll()
	p.detail.SetText("")
	p.detail.Hide()
	p.table.ScrollToTop()
	p.box.Refresh()
}
