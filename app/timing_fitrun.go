package app

import (
	"context"
	"errors"
	"fmt"
	"strconv"

	"fyne.io/fyne/v2/widget"

	"example.org/vigil/app/chart"
	"example.org/vigil/reduce"
)

// Fitting the extremum in a job, showing and keeping it, and drawing the
// night's light curve with the range and the fit.

// fit times the extremum in a job.
func (p *timingFitPane) fit() {
	n, ok := p.current()
	if !ok {
		return
	}
	sel, err := p.parseRange(n)
	if err != nil {
		p.rng.Importance = widget.DangerImportance
		p.rng.SetText("The range: " + err.Error())
		return
	}
	p.sel = sel
	req := TimingFitRequest{Points: n.Points, Kind: p.kindValue(), Method: p.methodValue()}
	if d, err := strconv.Atoi(p.degree.Selected); err == nil {
		req.Degree = d
	}
	if sel != nil {
		req.From, req.To = sel.From, sel.To
	}
	p.result, p.kept = nil, false
	p.head.SetText("Fitting…")
	p.head.Show()
	p.root.Refresh()
	Run(p.v.w.Jobs, timingSlotFit, "Fitting the "+timingExtremumWord(req.Kind), func(context.Context, Progress) (reduce.Timing, error) {
		return TimingFit(req)
	}, func(tm reduce.Timing, err error) {
		if errors.Is(err, context.Canceled) {
			p.showResult()
			return
		}
		if err != nil {
			p.rng.Importance = widget.DangerImportance
			p.rng.SetText(TimingRefusal(err, req.Kind))
			p.showResult()
			p.redraw()
			return
		}
		p.rng.Importance = widget.MediumImportance
		p.rng.SetText(p.rangeHint(n))
		p.result = &tm
		p.showResult()
		p.redraw()
	})
}

// showResult writes the fit, or, with none, what the band under the chart
// will hold.
func (p *timingFitPane) showResult() {
	n, ok := p.current()
	if p.result == nil || !ok {
		p.head.SetText("")
		p.head.Hide()
		p.detail.Importance = widget.LowImportance
		p.detail.SetText("")
		if ok {
			p.detail.SetText("No fit yet: Fit times the extremum from the points picked, or from the whole night; " +
				"its time with its error and its O−C show here, and Keep adds it to the star's timings.")
		}
		p.detail.Hidden = !ok
		p.keep.Disable()
		p.root.Refresh()
		return
	}
	r := TimingDescribeFit(*p.result, p.data.Target, n)
	p.head.SetText(r.Headline)
	p.detail.Importance = widget.MediumImportance
	p.detail.SetText(r.When + "\n" + r.How + "\n" + r.OC)
	p.head.Show()
	p.detail.Show()
	p.root.Refresh()
	if p.kept {
		p.keep.Disable()
	} else {
		p.keep.Enable()
	}
}

// keepTiming stores the fit as the star's own timing of the night.
func (p *timingFitPane) keepTiming() {
	n, ok := p.current()
	if p.result == nil || !ok || p.kept {
		return
	}
	rec := TimingRecord(*p.result, p.data.Target, n)
	lb := p.v.w.Session.Logbook()
	p.keep.Disable()
	Run(p.v.w.Jobs, timingSlotWrite, "Saving the timing", func(context.Context, Progress) (int64, error) {
		return lb.AddTiming(rec)
	}, func(id int64, err error) {
		if err != nil {
			p.keep.Enable()
			p.v.say("The timing was not kept", err)
			return
		}
		p.kept = true
		p.v.say(fmt.Sprintf("Kept the %s at %s %.5f as an own timing of %s; the O−C diagram includes it.",
			timingExtremumWord(p.result.Kind), rec.Scale.Label(), rec.JD, rec.Target), nil)
		p.v.w.Reload()
	})
}

// redraw draws the night's light curve with the range and the fit.
func (p *timingFitPane) redraw() {
	n, ok := p.current()
	if !ok {
		return
	}
	d := chart.LightCurveData{
		Title:    fmt.Sprintf("%s, night of %s", p.data.Target.Name, n.Night.Date.Format("2 Jan 2006")),
		Scale:    p.data.Target.Ephemeris.Scale,
		MagLabel: "magnitude",
		Series:   []chart.Series{{Name: p.data.Target.Name, Points: n.Points}},
	}
	if n.Filter != "" {
		d.MagLabel = n.Filter + " magnitude"
	}
	if p.sel != nil {
		s := *p.sel
		d.Selection = &s
	}
	if p.result != nil {
		tm := *p.result
		d.Timing = &tm
	}
	p.chart.SetSource(func(ctx context.Context, pal chart.Palette) (Drawable, error) {
		pl, err := chart.LightCurve(d, pal)
		if err != nil {
			return nil, err
		}
		if off, ok := timingAxisOffset(pl); ok {
			p.offMu.Lock()
			p.offset = off
			p.offMu.Unlock()
		}
		return pl, nil
	})
}
