package app

import (
	"context"
	"fmt"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/ephem"
	"example.org/vigil/observe/logbook"
)

// The form for a published timing, in a dialog of the O−C tab, and the
// words asking before a timing is deleted.

// newPublishedForm builds the form for a published timing, with a label
// for each field's error under it.
func (p *timingOCPane) newPublishedForm() fyne.CanvasObject {
	p.pubJD = widget.NewEntry()
	p.pubJD.SetPlaceHolder("2452407.3297")
	p.pubScale = widget.NewSelect([]string{ephem.HJD.Label(), ephem.BJDTDB.Label()}, nil)
	p.pubScale.SetSelected(ephem.HJD.Label())
	p.pubSigma = widget.NewEntry()
	p.pubSigma.SetPlaceHolder("0.0004, or empty if not known")
	p.pubKind = widget.NewSelect([]string{"max", "min"}, nil)
	p.pubSecondary = widget.NewCheck("secondary", nil)
	p.pubSource = widget.NewEntry()
	p.pubSource.SetPlaceHolder("journal, volume, page (year)")
	p.pubAdd = widget.NewButtonWithIcon("Add the timing", theme.ContentAddIcon(), p.addPublished)
	p.pubErrs = map[string]*widget.Label{}
	field := func(name string, o fyne.CanvasObject) fyne.CanvasObject {
		p.pubErrs[name] = timingErrLabel()
		return container.NewVBox(o, p.pubErrs[name])
	}
	kind := container.NewBorder(nil, nil, nil, p.pubSecondary, p.pubKind)
	p.pubErrs["secondary"] = timingErrLabel()
	form := container.New(layout.NewFormLayout(),
		widget.NewLabel("Time (JD)"), field("jd", p.pubJD),
		widget.NewLabel("Scale"), field("scale", p.pubScale),
		widget.NewLabel("σ (d)"), field("sigma", p.pubSigma),
		widget.NewLabel("Extremum"), field("kind", container.NewVBox(kind, p.pubErrs["secondary"])),
		widget.NewLabel("Source"), field("source", p.pubSource),
	)
	cancel := widget.NewButton("Cancel", func() {
		if p.pubDialog != nil {
			p.pubDialog.Hide()
		}
	})
	note := widget.NewLabel("The time of the extremum as published, on its scale; the O−C converts it to the star's.")
	note.Wrapping = fyne.TextWrapWord
	return container.NewVBox(note, form, container.NewHBox(layout.NewSpacer(), cancel, p.pubAdd))
}

// openPublished shows the form for a published timing in a dialog.
func (p *timingOCPane) openPublished() {
	if p.v.data == nil {
		return
	}
	for _, l := range p.pubErrs {
		timingSetErr(l, "")
	}
	p.pubDialog = dialog.NewCustomWithoutButtons("Add a published timing of "+p.v.data.Target.Name, p.pubForm, p.v.w.Win)
	p.pubDialog.Resize(fyne.NewSize(520, p.pubForm.MinSize().Height+80))
	p.pubDialog.Show()
}

// addPublished checks the form and stores the published timing.
func (p *timingOCPane) addPublished() {
	if p.v.data == nil {
		return
	}
	in := TimingPublishedInput{JD: p.pubJD.Text, Scale: p.pubScale.Selected, Sigma: p.pubSigma.Text, Kind: p.pubKind.Selected,
		Secondary: p.pubSecondary.Checked, Source: p.pubSource.Text}
	t, errs := TimingParsePublished(in, p.v.data.Target.Name)
	for name, l := range p.pubErrs {
		timingSetErr(l, errs[name])
	}
	p.pubForm.Refresh() // lay the rows out again around the messages shown or hidden
	if p.pubDialog != nil {
		p.pubDialog.Resize(fyne.NewSize(520, p.pubForm.MinSize().Height+80))
	}
	if errs != nil {
		return
	}
	lb := p.v.w.Session.Logbook()
	p.pubAdd.Disable()
	Run(p.v.w.Jobs, timingSlotWrite, "Adding the timing", func(context.Context, Progress) (int64, error) {
		return lb.AddTiming(t)
	}, func(_ int64, err error) {
		p.pubAdd.Enable()
		if err != nil {
			p.v.say("The published timing was not added", err)
			return
		}
		p.pubJD.SetText("")
		p.pubSigma.SetText("")
		p.pubSource.SetText("")
		p.pubSecondary.SetChecked(false)
		if p.pubDialog != nil {
			p.pubDialog.Hide()
		}
		p.v.say(fmt.Sprintf("Added the published timing %s %.5f from %s.", t.Scale.Label(), t.JD, t.Source), nil)
		p.v.w.Reload()
	})
}

// timingDeleteText asks whether to delete a timing.
func timingDeleteText(t logbook.Timing) string {
	what := t.Origin.String() + " timing"
	if t.Source != "" {
		what += " from " + t.Source
	}
	return fmt.Sprintf("Delete the %s at %s %.5f? It cannot be undone.", what, t.Scale.Label(), t.JD)
}
