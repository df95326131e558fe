package app

import (
	"fmt"
	"strings"
	"sync"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/app/chart"
	"example.org/vigil/reduce"
)

// The choices of the fit's method and degree.
const (
	timingPoly = "polynomial"
	timingKvW  = "Kwee–van Woerden"
	timingAuto = "from the data"
)

// timingFitPane times an extremum on a night's light curve: the night, the
// range (dragged on the chart or typed), kind, method and degree, the fit
// and its result, and "Keep" to store it as the star's timing.
type timingFitPane struct {
	v      *timingView
	night  *widget.Select
	kind   *widget.RadioGroup
	method *widget.Select
	degree *widget.Select
	from   *keyEntry
	to     *keyEntry
	whole  *widget.Button
	fitBtn *widget.Button
	keep   *widget.Button
	rng    *widget.Label // the range in clock time, or why it is refused
	chart  *ChartView
	head   *widget.Label // the fitted time, or what is being done
	detail *widget.Label // when it was seen, how it was fitted, its O−C
	root   fyne.CanvasObject

	data     *TimingData
	nightIdx int // index in data.Nights; -1 for none
	sel      *chart.TimeRange
	result   *reduce.Timing
	kept     bool
	picking  bool // entries being filled from a drag

	offMu  sync.Mutex
	offset float64 // the light curve's axis shows the time less this
}

func newTimingFitPane(v *timingView) *timingFitPane {
	p := &timingFitPane{v: v, nightIdx: -1}
	p.night = widget.NewSelect(nil, p.nightChosen)
	p.night.PlaceHolder = "no night with measurements"
	p.kind = widget.NewRadioGroup([]string{"maximum", "minimum"}, p.kindChosen)
	p.kind.Horizontal = true
	p.kind.Required = true
	p.method = widget.NewSelect([]string{timingPoly, timingKvW}, func(string) { p.methodChosen() })
	p.degree = widget.NewSelect([]string{timingAuto, "2", "3", "4"}, func(string) { p.clearResult() })
	p.degree.SetSelected(timingAuto)
	p.from = newKeyEntry(v.w)
	p.from.SetPlaceHolder("JD or 22:30")
	p.to = newKeyEntry(v.w)
	p.to.SetPlaceHolder("JD or 01:15")
	p.from.OnChanged = func(string) { p.rangeTyped() }
	p.to.OnChanged = func(string) { p.rangeTyped() }
	p.whole = widget.NewButton("Whole night", p.wholeNight)
	p.fitBtn = widget.NewButton("Fit", p.fit)
	p.fitBtn.Importance = widget.HighImportance
	p.keep = widget.NewButton("Keep", p.keepTiming)
	p.keep.Disable()
	p.rng = widget.NewLabel("")
	p.rng.Wrapping = fyne.TextWrapWord
	p.chart = v.w.NewChartView()
	p.chart.OnPick = p.picked
	p.head = widget.NewLabel("")
	p.head.TextStyle.Bold = true
	p.head.Wrapping = fyne.TextWrapWord
	p.detail = widget.NewLabel("")
	p.detail.Wrapping = fyne.TextWrapWord

	row1 := container.NewBorder(nil, nil, timingBold("Night"), nil, p.night)
	row2 := container.NewHBox(timingBold("Extremum"), p.kind, timingBold("Method"), timingSized(p.method, 190),
		timingBold("Degree"), timingSized(p.degree, 150))
	row3 := container.NewHBox(timingBold("Fit from"), timingSized(p.from, 150), timingBold("to"), timingSized(p.to, 150),
		p.whole, p.fitBtn, p.keep)
	top := container.NewVBox(row1, row2, row3, p.rng)
	// The result scrolls in a band of fixed height under the chart, so
	// that its wrapped lines never push the chart about.
	result := container.NewVScroll(container.NewVBox(p.head, quiet(p.detail)))
	result.SetMinSize(fyne.NewSize(0, 118))
	p.root = container.NewBorder(top, result, nil, nil, p.chart)
	p.setData(nil, false)
	return p
}

// setData shows a star's nights; same keeps the night, range and fit
// when the star is the one on show (the logbook was read again).
func (p *timingFitPane) setData(d *TimingData, same bool) {
	prevNight := int64(-1)
	if same && p.data != nil && p.nightIdx >= 0 {
		prevNight = p.data.Nights[p.nightIdx].Night.ID
	}
	p.data = d
	if d == nil {
		p.night.Options = nil
		p.nightIdx = -1
		p.showNight()
		return
	}
	opts := make([]string, len(d.Nights))
	idx := -1
	for i, n := range d.Nights {
		opts[i] = n.Label()
		if n.Night.ID == prevNight {
			idx = i
		}
	}
	p.night.Options = opts
	if idx < 0 {
		same = false
		site, _ := p.v.w.Session.Site()
		idx = d.DefaultNight(site.Name, p.v.w.Session.Date())
	}
	if !same {
		p.kind.SetSelected(timingKindChoice(TimingDefaultKind(d.Target)))
		p.setMethod(TimingDefaultMethod(d.Target, TimingDefaultKind(d.Target)))
	}
	p.selectNight(idx, same)
}

// followNight moves the fit to the session's new night when the star has
// data in it; the fit under way no longer matters.
func (p *timingFitPane) followNight() {
	if p.data == nil {
		return
	}
	site, _ := p.v.w.Session.Site()
	for i, n := range p.data.Nights {
		if strings.EqualFold(n.Night.Site, site.Name) && n.Night.Date.Equal(p.v.w.Session.Date()) && i != p.nightIdx {
			p.v.w.Jobs.Cancel(timingSlotFit)
			p.selectNight(i, false)
		}
	}
}

// selectNight shows night i; keep keeps the range and result.
func (p *timingFitPane) selectNight(i int, keep bool) {
	p.nightIdx = i
	if !keep {
		p.sel, p.result, p.kept = nil, nil, false
		p.picking = true
		p.from.SetText("")
		p.to.SetText("")
		p.picking = false
	}
	p.night.OnChanged = nil
	if i >= 0 {
		p.night.SetSelectedIndex(i)
	} else {
		p.night.ClearSelected()
	}
	p.night.OnChanged = p.nightChosen
	p.showNight()
}

func (p *timingFitPane) nightChosen(string) {
	if i := p.night.SelectedIndex(); i != p.nightIdx {
		p.v.w.Jobs.Cancel(timingSlotFit)
		p.selectNight(i, false)
	}
}

func timingKindChoice(k reduce.ExtremumKind) string {
	if k == reduce.Minimum {
		return "minimum"
	}
	return "maximum"
}

func (p *timingFitPane) kindValue() reduce.ExtremumKind {
	if p.kind.Selected == "minimum" {
		return reduce.Minimum
	}
	return reduce.Maximum
}

func (p *timingFitPane) kindChosen(string) {
	if p.data != nil {
		p.setMethod(TimingDefaultMethod(p.data.Target, p.kindValue()))
	}
	p.clearResult()
}

func (p *timingFitPane) setMethod(m reduce.ExtremumMethod) {
	if m == reduce.MethodKvW {
		p.method.SetSelected(timingKvW)
	} else {
		p.method.SetSelected(timingPoly)
	}
}

func (p *timingFitPane) methodValue() reduce.ExtremumMethod {
	if p.method.Selected == timingKvW {
		return reduce.MethodKvW
	}
	return reduce.MethodPoly
}

func (p *timingFitPane) methodChosen() {
	if p.methodValue() == reduce.MethodKvW {
		p.degree.Disable()
	} else {
		p.degree.Enable()
	}
	p.clearResult()
}

// clearResult drops a fit made with other choices.
func (p *timingFitPane) clearResult() {
	if p.result == nil {
		return
	}
	p.result, p.kept = nil, false
	p.showResult()
	p.redraw()
}

// showNight shows the chosen night's light curve and clears the result.
func (p *timingFitPane) showNight() {
	n, ok := p.current()
	for _, o := range []fyne.Disableable{p.from, p.to, p.whole, p.fitBtn, p.kind, p.method} {
		if ok {
			o.Enable()
		} else {
			o.Disable()
		}
	}
	if !ok {
		msg := "Select a star in the list."
		if p.data != nil {
			msg = fmt.Sprintf("No measurements of %s yet: type or import them on the Measurements page, then come back to time its %s.",
				p.data.Target.Name, timingExtremumWord(TimingDefaultKind(p.data.Target))+"s")
		}
		p.chart.SetEmpty(msg)
		p.rng.SetText("")
		p.result = nil
		p.showResult()
		return
	}
	p.rng.Importance = widget.MediumImportance
	p.rng.SetText(p.rangeHint(n))
	p.showResult()
	p.redraw()
}

// current returns the chosen night.
func (p *timingFitPane) current() (TimingNight, bool) {
	if p.data == nil || p.nightIdx < 0 || p.nightIdx >= len(p.data.Nights) {
		return TimingNight{}, false
	}
	return p.data.Nights[p.nightIdx], true
}
