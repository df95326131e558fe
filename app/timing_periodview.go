package app

import (
	"context"
	"errors"
	"fmt"
	"strings"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/app/chart"
	"example.org/vigil/ephem"
	"example.org/vigil/reduce"
)

// The search's method choices.
const (
	timingLS  = "Lomb–Scargle"
	timingPDM = "phase dispersion (PDM)"
)

// timingPeriodPane searches the star's measurements for a period: the
// range of periods, method and oversampling; the search with its progress
// and a cancel button; the periodogram, the peaks, and the curve folded on
// a chosen peak, which can be adopted.
type timingPeriodPane struct {
	v       *timingView
	min     *keyEntry
	max     *keyEntry
	over    *keyEntry
	method  *widget.Select
	search  *widget.Button
	cancel  *widget.Button
	bar     *widget.ProgressBar
	msg     *widget.Label
	errs    map[string]*widget.Label
	chart   *ChartView
	phase   *ChartView
	summary *widget.Label
	peaks   *keyTable
	fold    *widget.Button
	adopt   *widget.Button
	root    fyne.CanvasObject

	data   *TimingData
	result *reduce.PeriodResult
	n      int // points searched
	peak   int // the selected peak; -1 for none
	folded *ephem.Ephemeris
}

func newTimingPeriodPane(v *timingView) *timingPeriodPane {
	p := &timingPeriodPane{v: v, peak: -1, errs: map[string]*widget.Label{}}
	p.min, p.max, p.over = newKeyEntry(v.w), newKeyEntry(v.w), newKeyEntry(v.w)
	p.method = widget.NewSelect([]string{timingLS, timingPDM}, nil)
	p.method.SetSelected(timingLS)
	p.search = widget.NewButtonWithIcon("Search", theme.SearchIcon(), p.start)
	p.search.Importance = widget.HighImportance
	p.cancel = widget.NewButtonWithIcon("Cancel", theme.CancelIcon(), func() { v.w.Jobs.Cancel(timingSlotSearch) })
	p.cancel.Disable()
	p.bar = widget.NewProgressBar()
	p.bar.Hide()
	p.msg = widget.NewLabel("")
	p.msg.Wrapping = fyne.TextWrapWord
	p.chart = v.w.NewChartView()
	p.phase = v.w.NewChartView()
	p.summary = widget.NewLabel("")
	p.summary.Wrapping = fyne.TextWrapWord
	p.peaks = newKeyTable(v.w, func() (int, int) { return p.peakCount(), len(TimingPeakColumns) }, p.newCell, p.updateCell)
	p.peaks.CreateHeader = func() fyne.CanvasObject {
		return widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	}
	p.peaks.UpdateHeader = func(id widget.TableCellID, o fyne.CanvasObject) {
		if id.Col >= 0 && id.Col < len(TimingPeakColumns) {
			o.(*widget.Label).SetText(p.peakHeading(id.Col))
		}
	}
	for i, wd := range []float32{30, 92, 108, 60, 250} {
		p.peaks.SetColumnWidth(i, wd)
	}
	p.peaks.OnSelected = func(id widget.TableCellID) {
		p.peak = id.Row
		p.fold.Enable()
		if p.result != nil && id.Row >= 0 && id.Row < len(p.result.Peaks) {
			c := TimingPeakCells(*p.result)[id.Row]
			msg := fmt.Sprintf("Peak %s: P = %s d", c[0], c[1])
			if c[4] != "" {
				msg += " (" + c[4] + ")"
			}
			p.msg.SetText(msg + ". “Fold on this period” shows the light curve folded on it.")
		}
	}
	p.fold = widget.NewButton("Fold on this period", p.foldOn)
	p.fold.Disable()
	p.adopt = widget.NewButton("Adopt this period…", p.askAdopt)
	p.adopt.Disable()

	field := func(name string, e *keyEntry, width float32) fyne.CanvasObject {
		p.errs[name] = timingErrLabel()
		return timingSized(e, width)
	}
	row := container.NewHBox(timingBold("Periods from"), field("min", p.min, 100), timingBold("to"), field("max", p.max, 100),
		widget.NewLabel("d"), timingBold("Method"), timingSized(p.method, 200), timingBold("Oversampling"), field("oversample", p.over, 60))
	errs := container.NewVBox(p.errs["min"], p.errs["max"], p.errs["oversample"])
	run := container.NewBorder(nil, nil, container.NewHBox(p.search, p.cancel), nil, container.NewStack(p.bar, p.msg))
	top := container.NewVBox(row, errs, run)
	charts := container.NewVSplit(p.chart, p.phase)
	charts.Offset = 0.55
	peaks := container.NewBorder(timingBold("Peaks, best first"), container.NewHBox(layout.NewSpacer(), p.fold, p.adopt), nil, nil, p.peaks)
	right := container.NewVSplit(container.NewVScroll(p.summary), peaks)
	right.Offset = 0.3
	split := container.NewHSplit(charts, right)
	split.Offset = 0.55
	p.root = container.NewBorder(top, nil, nil, nil, split)
	p.setData(nil, false)
	return p
}

// setData shows the star; same keeps the fields and the result when the
// star is the one on show.
func (p *timingPeriodPane) setData(d *TimingData, same bool) {
	p.data = d
	if same {
		return
	}
	p.result, p.peak, p.folded = nil, -1, nil
	p.peaks.UnselectAll()
	p.peaks.Refresh()
	p.fold.Disable()
	p.adopt.Disable()
	p.summary.SetText("")
	p.msg.SetText("")
	for _, l := range p.errs {
		timingSetErr(l, "")
	}
	if d == nil {
		p.search.Disable()
		p.chart.SetEmpty("")
		p.phase.SetEmpty("")
		return
	}
	in := TimingPeriodDefaults(d.Target.Ephemeris.PeriodDays)
	p.min.SetText(in.Min)
	p.max.SetText(in.Max)
	p.over.SetText(in.Oversample)
	if len(d.Points) < reduce.MinPeriodPoints {
		p.search.Disable()
		p.chart.SetEmpty(fmt.Sprintf("%s has %s: a period search needs at least %d. Type or import measurements on the Measurements page.",
			d.Target.Name, plural(len(d.Points), "reduced measurement", "reduced measurements"), reduce.MinPeriodPoints))
	} else {
		p.search.Enable()
		p.chart.SetEmpty(fmt.Sprintf("Set the range of periods and press Search: the periodogram of all %d measurements of %s (%s) appears here.",
			len(d.Points), d.Target.Name, plural(len(d.Nights), "night", "nights")))
	}
	p.phase.SetEmpty("Pick a peak and press “Fold on this period” to see the light curve folded on it.")
}

// start checks the fields and runs the search as a named job: its progress
// and a cancel button show in the status bar as well as here.
func (p *timingPeriodPane) start() {
	if p.data == nil {
		return
	}
	method := reduce.MethodLS
	if p.method.Selected == timingPDM {
		method = reduce.MethodPDM
	}
	s, errs := TimingParsePeriod(TimingPeriodInput{Min: p.min.Text, Max: p.max.Text, Oversample: p.over.Text, Method: method})
	names := map[string]string{"min": "Shortest period", "max": "Longest period", "oversample": "Oversampling"}
	for name, l := range p.errs {
		msg := errs[name]
		if msg != "" {
			msg = names[name] + ": " + msg
		}
		timingSetErr(l, msg)
	}
	if errs != nil {
		return
	}
	pts, name := p.data.Points, p.data.Target.Name
	p.msg.SetText("")
	p.msg.Hide()
	p.bar.SetValue(0)
	p.bar.Show()
	p.cancel.Enable()
	p.search.Disable()
	started := time.Now()
	Run(p.v.w.Jobs, timingSlotSearch, "Period search of "+name, func(ctx context.Context, pr Progress) (reduce.PeriodResult, error) {
		return TimingSearch(ctx, pts, s, pr)
	}, func(r reduce.PeriodResult, err error) {
		p.bar.Hide()
		p.msg.Show()
		p.cancel.Disable()
		p.search.Enable()
		switch {
		case errors.Is(err, context.Canceled):
			p.msg.SetText("The search was cancelled.")
			return
		case err != nil:
			p.msg.SetText("The search failed: " + err.Error())
			return
		}
		p.msg.SetText("Searched in " + timingDuration(time.Since(started)) + ".")
		p.show(&r, len(pts))
	})
}

// jobsChanged moves the page's progress bar with the search's job.
func (p *timingPeriodPane) jobsChanged() {
	for _, j := range p.v.w.Jobs.Running() {
		if j.Slot == timingSlotSearch && j.Total > 0 {
			p.bar.SetValue(float64(j.Done) / float64(j.Total))
		}
	}
}

// show puts a search's result on the pane.
func (p *timingPeriodPane) show(r *reduce.PeriodResult, n int) {
	p.result, p.n, p.peak, p.folded = r, n, -1, nil
	p.summary.SetText(strings.Join(TimingPeriodSummary(*r, n), "\n"))
	p.peaks.UnselectAll()
	p.peaks.Refresh()
	p.fold.Disable()
	p.adopt.Disable()
	res, title := *r, p.data.Target.Name+": period search"
	p.chart.SetSource(func(_ context.Context, pal chart.Palette) (Drawable, error) {
		return chart.Periodogram(chart.PeriodogramData{Title: title, Result: res, PeriodAxis: true}, pal)
	})
	p.phase.SetEmpty("Pick a peak and press “Fold on this period” to see the light curve folded on it.")
}

func (p *timingPeriodPane) peakCount() int {
	if p.result == nil {
		return 0
	}
	return len(p.result.Peaks)
}

func (p *timingPeriodPane) peakHeading(col int) string {
	if col == 3 && p.result != nil && p.result.Method == reduce.MethodPDM {
		return "θ"
	}
	return TimingPeakColumns[col]
}

// timingDuration writes how long a search took: "0.4 s", or "42 ms" under
// a tenth of a second (where "0.0 s" would read as nothing done).
func timingDuration(d time.Duration) string {
	if d < 100*time.Millisecond {
		return fmt.Sprintf("%d ms", max(d.Milliseconds(), 1))
	}
	return fmt.Sprintf("%.1f s", d.Seconds())
}

func (p *timingPeriodPane) newCell() fyne.CanvasObject {
	l := widget.NewLabel("")
	l.Truncation = fyne.TextTruncateEllipsis
	return l
}

func (p *timingPeriodPane) updateCell(id widget.TableCellID, o fyne.CanvasObject) {
	text := ""
	if p.result != nil && id.Row >= 0 && id.Row < len(p.result.Peaks) {
		text = TimingPeakCells(*p.result)[id.Row][id.Col]
	}
	o.(*widget.Label).SetText(text)
}

// foldOn folds the measurements on the chosen peak's period, with an
// epoch from the folded curve (TimingFromPeak), and draws them.
func (p *timingPeriodPane) foldOn() {
	if p.result == nil || p.peak < 0 || p.peak >= len(p.result.Peaks) || p.data == nil {
		return
	}
	period, pts, tg := p.result.Peaks[p.peak].PeriodDays, p.data.Points, p.data.Target
	type folding struct {
		eph    ephem.Ephemeris
		points []reduce.PhasePoint
		bins   []reduce.MagBin
	}
	Run(p.v.w.Jobs, timingSlotFold, "", func(context.Context, Progress) (folding, error) {
		var f folding
		var err error
		if f.eph, err = TimingFromPeak(pts, period, tg); err != nil {
			return f, err
		}
		if f.points, err = reduce.PhaseFold(pts, f.eph); err != nil {
			return f, err
		}
		f.bins, err = reduce.BinInPhase(f.points, 50)
		return f, err
	}, func(f folding, err error) {
		if errors.Is(err, context.Canceled) {
			return
		}
		if err != nil {
			p.msg.SetText("The curve cannot be folded on this period: " + err.Error())
			return
		}
		p.folded = &f.eph
		p.adopt.Enable()
		p.msg.SetText("Folded on " + TimingEphemerisText(tg.Kind, f.eph) + ".")
		eph := f.eph
		d := chart.PhaseData{Title: fmt.Sprintf("%s folded on P = %.7f d", tg.Name, period), Points: f.points,
			Name: tg.Name, Binned: f.bins, Ephemeris: &eph}
		p.phase.SetSource(func(_ context.Context, pal chart.Palette) (Drawable, error) { return chart.PhaseCurve(d, pal) })
	})
}

// askAdopt offers the folded ephemeris for adoption.
func (p *timingPeriodPane) askAdopt() {
	if p.folded == nil || p.result == nil {
		return
	}
	what := "period search (" + p.result.Method + ")"
	p.v.askAdopt(*p.folded, fmt.Sprintf("%s of %d measurements, %s", what, p.n, p.v.w.Session.Now().UTC().Format(time.DateOnly)))
}
