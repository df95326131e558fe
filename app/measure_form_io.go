package app

import (
	"fmt"
	"math"
	"strings"

	"fyne.io/fyne/v2/widget"
)

// The entry grid's new row: reading it, marking errors, clearing it.

// entry returns the row as typed.
func (f *measureForm) entry() MeasureEntry {
	e := MeasureEntry{Visual: f.visual(), Time: f.time.Text, UTC: f.zone.Selected == "UTC",
		Estimate: f.estimate.Text, Step: f.step.Text,
		Filter: f.filter.Text, Airmass: f.airmass.Text, Exposure: f.exposure.Text}
	if e.Visual {
		return e
	}
	if f.target.mag != nil {
		e.Target = MeasureStarEntry{Mag: f.target.mag.Text, Err: f.target.err.Text}
	}
	for _, s := range f.comps {
		e.Comps = append(e.Comps, MeasureStarEntry{Label: s.label, Mag: s.mag.Text, Err: s.err.Text})
	}
	if f.check != nil {
		e.Check = MeasureStarEntry{Label: f.check.label, Mag: f.check.mag.Text, Err: f.check.err.Text}
	}
	return e
}

// fields returns every field of the form.
func (f *measureForm) fields() []*measureField {
	out := []*measureField{f.time, f.estimate, f.step, f.filter, f.airmass, f.exposure}
	if f.target.mag != nil {
		out = append(out, f.target.mag, f.target.err)
	}
	for _, s := range f.comps {
		out = append(out, s.mag, s.err)
	}
	if f.check != nil {
		out = append(out, f.check.mag, f.check.err)
	}
	return out
}

// field returns the field an error names (the first comparison star's
// magnitude for the comparison stars as a whole), nil for none.
func (f *measureForm) field(name string) *measureField {
	if name == MeasureFieldComps && len(f.comps) > 0 {
		name = MeasureMagField(f.comps[0].label)
	}
	for _, x := range f.fields() {
		if x.name == name {
			return x
		}
	}
	return nil
}

// showErrors marks each field at fault and lists the messages under the
// row, then puts the cursor in the first field at fault.
func (f *measureForm) showErrors(errs MeasureEntryError) {
	f.clearProblems()
	var lines []string
	var first *measureField
	for _, e := range errs {
		lines = append(lines, e.Msg)
		if x := f.field(e.Field); x != nil {
			x.SetValidationError(fmt.Errorf("%s", e.Msg))
			f.marks[x.name] = e.Msg
			if first == nil {
				first = x
			}
		}
	}
	f.problems.SetText(strings.Join(lines, "\n"))
	f.problems.Show()
	f.result.Hide()
	f.v.relayout()
	if first != nil {
		f.v.w.Win.Canvas().Focus(first)
	}
}

// clearProblems removes every mark and message.
func (f *measureForm) clearProblems() {
	for _, x := range f.fields() {
		x.SetValidationError(nil)
	}
	clear(f.marks)
	if f.problems.Visible() {
		f.problems.SetText("")
		f.problems.Hide()
		f.v.relayout()
	}
}

// edited follows a change of a field: its mark goes, and the time field
// echoes what it reads as (local and UTC) or what is wrong with it.
func (f *measureForm) edited(e *measureField) {
	e.SetValidationError(nil)
	delete(f.marks, e.name)
	if e != f.time || f.v.req == nil {
		return
	}
	r := f.v.req
	if strings.TrimSpace(f.time.Text) == "" {
		f.echo.SetText("")
		return
	}
	t, err := ParseMeasureTime(f.time.Text, f.loc(), r.Date, &r.Site)
	if err != nil {
		f.echo.SetText("") // Add says what is wrong
		return
	}
	f.echo.SetText(measureTimeEcho(t, &r.Site))
}

// cleared empties the row after it was stored, keeping the mode, zone,
// filter, air mass, exposure and step (the same from row to row at the
// eyepiece), unless it was edited meanwhile; the cursor goes back to the
// time.
func (f *measureForm) cleared(was MeasureEntry) {
	if !measureSameEntry(f.entry(), was) {
		return
	}
	f.time.SetText("")
	f.estimate.SetText("")
	for _, s := range append([]measureStarFields{f.target}, f.comps...) {
		if s.mag != nil {
			s.mag.SetText("")
			s.err.SetText("")
		}
	}
	if f.check != nil {
		f.check.mag.SetText("")
		f.check.err.SetText("")
	}
	f.clearProblems()
	f.echo.SetText("")
	f.v.w.Win.Canvas().Focus(f.time)
}

// measureSameEntry reports whether two entries hold the same text.
func measureSameEntry(a, b MeasureEntry) bool {
	return fmt.Sprintf("%+v", a) == fmt.Sprintf("%+v", b)
}

// showResult says what the row stored gave.
func (f *measureForm) showResult(r MeasureReduced) {
	req := f.v.req
	if req == nil {
		return
	}
	s := "Added " + MeasureRowText(r.M, &req.Site)
	if !math.IsNaN(r.CheckMag) {
		for _, c := range req.Target.Checks {
			if c.ID == r.CheckID {
				s += fmt.Sprintf(" · check %s %.3f (catalogue %.3f)", c.ID, r.CheckMag, c.V)
			}
		}
	}
	for _, n := range r.Notes {
		s += "\n" + n
	}
	f.result.Importance = widget.SuccessImportance
	if len(r.Notes) > 0 {
		f.result.Importance = widget.WarningImportance
	}
	f.result.SetText(s)
	f.result.Show()
	f.v.relayout()
}
