package app

import (
	"errors"
	"fmt"
	"strconv"
	"strings"

	"fyne.io/fyne/v2/widget"
	"gonum.org/v1/plot"

	"example.org/vigil/app/chart"
)

// The range of a fit: picked by dragging across the light curve or typed
// (a Julian date on the star's scale or a local clock time), checked, and
// written in clock time.

// rangeHint says what the range is, in clock time, or how to pick one.
func (p *timingFitPane) rangeHint(n TimingNight) string {
	loc := n.Loc()
	data := fmt.Sprintf("%s from %s to %s local (%s–%s UTC)", plural(len(n.Points), "point", "points"),
		n.FirstUTC.In(loc).Format("15:04"), n.LastUTC.In(loc).Format("15:04 MST"), utcText(n.FirstUTC), utcText(n.LastUTC))
	if p.sel == nil {
		return data + ". Drag across the chart, or type the ends, to pick the points around the extremum; with no range the fit finds it."
	}
	tg := p.data.Target
	s := fmt.Sprintf("%s. Picked %s %.5f to %.5f", data, tg.Ephemeris.Scale.Label(), p.sel.From, p.sel.To)
	from, err1 := timingSeen(p.sel.From, tg.Ephemeris.Scale, tg.Star, n.Site)
	to, err2 := timingSeen(p.sel.To, tg.Ephemeris.Scale, tg.Star, n.Site)
	if err1 == nil && err2 == nil {
		s += fmt.Sprintf(", seen %s–%s local (%s–%s UTC)", from.In(loc).Format("15:04:05"), to.In(loc).Format("15:04:05"),
			from.UTC().Format("15:04:05"), to.UTC().Format("15:04:05"))
	}
	return s + "."
}

// picked takes a range dragged across the light curve.
func (p *timingFitPane) picked(from, to float64) {
	p.offMu.Lock()
	off := p.offset
	p.offMu.Unlock()
	p.picking = true
	p.from.SetText(strconv.FormatFloat(from+off, 'f', 5, 64))
	p.to.SetText(strconv.FormatFloat(to+off, 'f', 5, 64))
	p.picking = false
	p.rangeTyped()
}

// wholeNight drops the range: the fit then finds the extremum.
func (p *timingFitPane) wholeNight() {
	p.picking = true
	p.from.SetText("")
	p.to.SetText("")
	p.picking = false
	p.rangeTyped()
}

// parseRange reads the typed range: both ends empty is no range.
func (p *timingFitPane) parseRange(n TimingNight) (*chart.TimeRange, error) {
	f, t := strings.TrimSpace(p.from.Text), strings.TrimSpace(p.to.Text)
	if f == "" && t == "" {
		return nil, nil
	}
	if f == "" || t == "" {
		return nil, errors.New("give both ends of the range, or neither to let the fit find the extremum")
	}
	from, err := TimingParseRangeEnd(f, p.data.Target, n)
	if err != nil {
		return nil, fmt.Errorf("from %v", err)
	}
	to, err := TimingParseRangeEnd(t, p.data.Target, n)
	if err != nil {
		return nil, fmt.Errorf("to %v", err)
	}
	if !(to > from) {
		return nil, fmt.Errorf("the range ends (%.5f) before it starts (%.5f): want the later time second", to, from)
	}
	return &chart.TimeRange{From: from, To: to}, nil
}

// rangeTyped follows the range fields: the hint, or the error beside them.
func (p *timingFitPane) rangeTyped() {
	n, ok := p.current()
	if p.picking || !ok {
		return
	}
	sel, err := p.parseRange(n)
	if err != nil {
		p.rng.Importance = widget.DangerImportance
		p.rng.SetText("The range: " + err.Error())
		return
	}
	changed := (sel == nil) != (p.sel == nil) || (sel != nil && *sel != *p.sel)
	p.sel = sel
	p.rng.Importance = widget.MediumImportance
	p.rng.SetText(p.rangeHint(n))
	if changed {
		p.result, p.kept = nil, false
		p.showResult()
		p.redraw()
	}
}

// timingAxisOffset reads the Julian date a light curve's time axis counts
// from, which its label names: "BJD_TDB − 2461350 (days)".
func timingAxisOffset(pl *plot.Plot) (float64, bool) {
	_, after, ok := strings.Cut(pl.X.Label.Text, " − ")
	if !ok {
		return 0, false
	}
	num, _, _ := strings.Cut(after, " ")
	v, err := strconv.ParseFloat(num, 64)
	return v, err == nil
}
