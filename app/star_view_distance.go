package app

import (
	"context"
	"fmt"
	"math"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/observe"
	"example.org/vigil/reduce"
)

// starDistancePanel is the period–luminosity distance of a pulsating
// star: its mean V (kept in the logbook), the extinction and the relation
// chosen, and the result.
type starDistancePanel struct {
	v        *starView
	out      StarDistance
	meanV    *keyEntry
	av       *keyEntry
	relation *widget.Select
	meanErr  *widget.Label
	avErr    *widget.Label
	saveMean *widget.Button
	headline *widget.Label // the distance, or what it needs
	result   *fyne.Container
	warn     *widget.Label
	note     *widget.Label
	off      *widget.Label
	box      *fyne.Container
	root     *fyne.Container
	shownFor string // the star and mean V the entries were filled from
}

func newStarDistancePanel(v *starView) *starDistancePanel {
	p := &starDistancePanel{v: v}
	p.meanV = newKeyEntry(v.w)
	p.meanV.SetPlaceHolder("intensity-mean V (mag)")
	p.meanV.OnChanged = func(string) { p.compute() }
	p.av = newKeyEntry(v.w)
	p.av.SetPlaceHolder("0 (mag; empty: none)")
	p.av.OnChanged = func(string) { p.compute() }
	var names []string
	for _, r := range reduce.PLRelations() {
		names = append(names, r.Name)
	}
	p.relation = widget.NewSelect(names, nil)
	p.relation.SetSelected(reduce.DefaultPLRelation)
	p.relation.OnChanged = func(string) { p.compute() }
	errLabel := func() *widget.Label {
		l := widget.NewLabel("")
		l.Wrapping = fyne.TextWrapWord
		l.Importance = widget.DangerImportance
		l.Hide()
		return l
	}
	p.meanErr, p.avErr = errLabel(), errLabel()
	p.saveMean = widget.NewButtonWithIcon("Keep mean V", theme.DocumentSaveIcon(), p.keepMean)
	p.result = container.New(layout.NewFormLayout())
	p.warn = widget.NewLabel("")
	p.warn.Wrapping = fyne.TextWrapWord
	p.warn.Importance = widget.WarningImportance
	p.warn.Hide()
	p.note = widget.NewLabel(StarDistanceNote)
	p.note.Wrapping = fyne.TextWrapWord
	p.off = widget.NewLabel("")
	p.off.Wrapping = fyne.TextWrapWord
	inputs := container.New(layout.NewFormLayout(),
		widget.NewLabel("Mean V (mag)"), container.NewVBox(container.NewBorder(nil, nil, nil, p.saveMean, p.meanV), p.meanErr),
		widget.NewLabel("Extinction A_V"), container.NewVBox(p.av, p.avErr),
		widget.NewLabel("Relation"), p.relation)
	p.headline = widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	p.headline.Wrapping = fyne.TextWrapWord
	p.box = container.NewVBox(p.headline, inputs, p.result, p.warn, quiet(p.note))
	p.root = container.NewVBox(widget.NewSeparator(), starSection("Distance from the period–luminosity relation"), p.box, p.off)
	return p
}

// update shows the panel for a pulsating star, filled with its mean V
// from the logbook, or says why there is no distance.
func (p *starDistancePanel) update() {
	t := p.v.target
	if t.Name == "" || t.Class == observe.Eclipsing || p.v.form.mode == starFormNew {
		p.root.Hide()
		return
	}
	p.root.Show()
	if !StarDistanceApplies(t) {
		p.box.Hide()
		p.off.SetText(fmt.Sprintf("%s is %s: the period–luminosity distance applies to classical Cepheids only.", t.Name, starArticle(classText(t.Class))))
		p.off.Show()
		return
	}
	p.off.Hide()
	p.box.Show()
	key := fmt.Sprint(t.Name, p.v.data.Name, p.v.data.MeanMagV)
	if key != p.shownFor {
		p.shownFor = key
		if strings.EqualFold(p.v.data.Name, t.Name) && !math.IsNaN(p.v.data.MeanMagV) {
			p.meanV.SetText(fmt.Sprintf("%.3f", p.v.data.MeanMagV))
		} else {
			p.meanV.SetText("")
		}
	}
	p.compute()
}

// starArticle writes a class with its article: "an eclipsing star".
func starArticle(class string) string {
	if class == "other" {
		return "not a pulsating star"
	}
	if strings.ContainsAny(class[:1], "aeiou") {
		return "an " + class + " star"
	}
	return "a " + class + " star"
}

// compute works the distance out from the entries (reduce.Distance takes
// microseconds: no job).
func (p *starDistancePanel) compute() {
	t := p.v.target
	if t.Name == "" || !StarDistanceApplies(t) {
		return
	}
	p.out = StarDistanceOf(t, StarDistanceForm{MeanV: p.meanV.Text, AV: p.av.Text, Relation: p.relation.Selected})
	show := func(l *widget.Label, key string) {
		l.SetText(p.out.Errors[key])
		l.Hidden = l.Text == "" || (key == StarFieldMeanV && strings.TrimSpace(p.meanV.Text) == "")
	}
	show(p.meanErr, StarFieldMeanV)
	show(p.avErr, StarFieldAV)
	var lines []StarLine
	head := ""
	switch {
	case p.out.OK:
		for _, l := range p.out.Lines {
			if l.Key == "Distance" {
				head = "Distance " + l.Value
			} else {
				lines = append(lines, l)
			}
		}
	case p.out.Errors[StarFieldForm] != "":
		head = p.out.Errors[StarFieldForm]
	case strings.TrimSpace(p.meanV.Text) == "":
		head = "Type the star's intensity-mean V magnitude to work its distance out."
	default:
		head = "Correct the fields below to work the distance out."
	}
	p.headline.SetText(head)
	starFillLines(p.result, lines)
	p.warn.SetText(strings.Join(p.out.Warnings, "\n"))
	p.warn.Hidden = len(p.out.Warnings) == 0
	p.root.Refresh()
}

// keepMean stores the typed mean V as the star's (logbook.SetMeanMagV).
func (p *starDistancePanel) keepMean() {
	name := p.v.target.Name
	if name == "" {
		return
	}
	v := math.NaN()
	if strings.TrimSpace(p.meanV.Text) != "" {
		errs := StarFieldErrors{}
		v = starQuantity(errs, StarFieldMeanV, p.meanV.Text, "mean V", "mag", starUnits{"": 1, "mag": 1}, -30, 40, math.NaN())
		if msg := errs[StarFieldMeanV]; msg != "" {
			p.meanErr.SetText(msg)
			p.meanErr.Show()
			return
		}
	}
	lb := p.v.w.Session.Logbook()
	Run(p.v.w.Jobs, "star-mean", "Saving the mean V", func(context.Context, Progress) (struct{}, error) {
		return struct{}{}, lb.SetMeanMagV(name, v)
	}, func(_ struct{}, err error) {
		if err != nil {
			p.v.say("The mean V was not saved: "+starErrText(err), true)
			return
		}
		if math.IsNaN(v) {
			p.v.say(fmt.Sprintf("Cleared the mean V of %s.", name), false)
		} else {
			p.v.say(fmt.Sprintf("Kept %.3f mag as the mean V of %s.", v, name), false)
		}
		p.v.w.RecordsChanged() // a record of the star's: nothing to plan again
	})
}
