package app

import (
	"context"
	"strconv"
	"strings"

	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"
)

// The light curve, the folded curve and the check star's summary of the
// scope chosen.

// scopeChosen returns the scope of the charts and summary.
func (v *measureView) scopeChosen() MeasureScope {
	if v.scope.Selected == measureScopes[1] {
		return MeasureAllNights
	}
	return MeasureThisNight
}

// binsChosen returns the number of phase bins chosen (0: none).
func (v *measureView) binsChosen() int {
	n, _ := strconv.Atoi(strings.Fields(v.bins.Selected + " 0")[0])
	return n
}

// analyse builds the charts' data and the summary off the UI thread.
func (v *measureView) analyse() {
	if v.data == nil {
		return
	}
	d, scope := *v.data, v.scopeChosen()
	Run(v.w.Jobs, "measure-analysis", "", func(ctx context.Context, _ Progress) (MeasureAnalysis, error) {
		return AnalyseMeasure(ctx, d, scope)
	}, func(a MeasureAnalysis, err error) {
		if err != nil {
			v.an = nil
			v.light.SetEmpty("The light curve cannot be drawn: " + err.Error())
			v.phase.SetEmpty("")
			v.setSummary([]MeasureNote{{Text: err.Error(), Warn: true}})
			return
		}
		v.an = &a
		v.showCharts()
		v.setSummary(a.Summary())
	})
}

// showCharts draws the analysis, or says what to do when it has no point.
func (v *measureView) showCharts() {
	a := v.an
	if a == nil || v.req == nil {
		return
	}
	if len(a.Target) == 0 {
		name := v.req.Target.Name
		if a.Scope == MeasureThisNight {
			v.light.SetEmpty("No measurements for " + name + " tonight: type one above or import a file, and its light curve appears here.")
			v.phase.SetEmpty("Choose All nights to fold every measurement of " + name + " on its ephemeris.")
		} else {
			v.light.SetEmpty("No measurements of " + name + " yet: type one above or import a file.")
			v.phase.SetEmpty("The folded light curve appears here once " + name + " has measurements.")
		}
		return
	}
	v.light.SetSource(measureLightSource(*a))
	v.phase.SetSource(measurePhaseSource(*a, v.binsChosen()))
}

// setSummary shows the check star's summary, warnings in the error colour,
// notes of context in the quiet colour of secondary text.
func (v *measureView) setSummary(notes []MeasureNote) {
	var segs []widget.RichTextSegment
	if len(notes) == 0 {
		notes = []MeasureNote{{Text: "The check star's mean and scatter show here once there are instrumental measurements."}}
	}
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
	v.summary.Segments = segs
	v.summary.Refresh()
}
