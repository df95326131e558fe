package app

import (
	"context"
	"fmt"
	"math"
	"strings"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

// fillStar fills the star part of the form.
func (f *starFormPanel) fillStar(s StarForm) {
	f.entries[StarFieldName].SetText(s.Name)
	f.entries[StarFieldRA].SetText(s.RA)
	f.entries[StarFieldDec].SetText(s.Dec)
	f.entries[StarFieldPMRA].SetText(s.PMRA)
	f.entries[StarFieldPMDec].SetText(s.PMDec)
	f.class.SetSelected(s.Class)
	f.kind.SetSelected(s.Kind + "imum")
	f.secondary.SetChecked(s.Secondary)
	f.entries[StarFieldMagBright].SetText(s.MagBright)
	f.entries[StarFieldMagFaint].SetText(s.MagFaint)
	f.entries["notes"].SetText(s.Notes)
	f.showErrs(nil)
}

// fillEphem fills the ephemeris part of the form.
func (f *starFormPanel) fillEphem(e StarEphemForm) {
	f.entries[StarFieldT0].SetText(e.T0)
	f.scale.SetSelected(e.Scale)
	f.entries[StarFieldPeriod].SetText(e.Period)
	f.entries[StarFieldQ].SetText(e.Q)
	f.entries[StarFieldEpochErr].SetText(e.EpochErr)
	f.entries[StarFieldPeriodErr].SetText(e.PeriodErr)
	f.entries[StarFieldSource].SetText(e.Source)
	f.showErrs(nil)
}

// starForm returns what the star part of the form holds.
func (f *starFormPanel) starForm() StarForm {
	return StarForm{
		Name: f.entries[StarFieldName].Text, RA: f.entries[StarFieldRA].Text, Dec: f.entries[StarFieldDec].Text,
		PMRA: f.entries[StarFieldPMRA].Text, PMDec: f.entries[StarFieldPMDec].Text,
		Class: f.class.Selected, Kind: f.kind.Selected, Secondary: f.secondary.Checked,
		MagBright: f.entries[StarFieldMagBright].Text, MagFaint: f.entries[StarFieldMagFaint].Text,
		Notes: f.entries["notes"].Text,
	}
}

// ephemForm returns what the ephemeris part of the form holds.
func (f *starFormPanel) ephemForm() StarEphemForm {
	return StarEphemForm{
		T0: f.entries[StarFieldT0].Text, Scale: f.scale.Selected, Period: f.entries[StarFieldPeriod].Text,
		Q: f.entries[StarFieldQ].Text, EpochErr: f.entries[StarFieldEpochErr].Text,
		PeriodErr: f.entries[StarFieldPeriodErr].Text, Source: f.entries[StarFieldSource].Text,
	}
}

// submit checks the form and, when every field reads, saves it through the
// logbook in a job; nothing is written while any field is at fault.
func (f *starFormPanel) submit() {
	v := f.v
	lb := v.w.Session.Logbook()
	var job func() error
	var done string
	switch f.mode {
	case starFormEdit:
		t, errs := f.starForm().Target(v.target)
		errs = f.nameTaken(strings.TrimSpace(f.entries[StarFieldName].Text), errs)
		if len(errs) > 0 {
			f.showErrs(errs)
			return
		}
		old := f.editing
		job = func() error { return lb.UpdateTarget(old, t) }
		done, v.pendingSelect = "Saved "+t.Name+".", t.Name
	case starFormNew:
		e, errs := f.ephemForm().Ephemeris()
		base := observe.Target{MagBright: math.NaN(), MagFaint: math.NaN(), Ephemeris: e}
		if len(errs) > 0 { // a stand-in, so that the star's own fields are checked too
			base.Ephemeris = ephem.Ephemeris{Epoch: 2451545, PeriodDays: 1, Scale: ephem.BJDTDB}
		}
		t, serrs := f.starForm().Target(base)
		errs = f.nameTaken(strings.TrimSpace(f.entries[StarFieldName].Text), errs)
		for k, m := range serrs {
			errs[k] = m
		}
		if len(errs) > 0 {
			f.showErrs(errs)
			return
		}
		src := strings.TrimSpace(f.entries[StarFieldSource].Text)
		if src == "" {
			src = StarSourceDefault
		}
		job = func() error { return lb.AddTarget(t, src) }
		done, v.pendingSelect = "Added "+t.Name+".", t.Name
	case starFormAdopt:
		e, src, errs := f.ephemForm().Adoption()
		if len(errs) > 0 {
			f.showErrs(errs)
			return
		}
		name := f.editing
		job = func() error { return lb.AdoptEphemeris(name, e, src) }
		done = fmt.Sprintf("Adopted a new ephemeris for %s (from %s); the one before is kept in the history.", name, src)
	default:
		return
	}
	f.save.Disable()
	Run(v.w.Jobs, "star-save", "Saving to the logbook", func(context.Context, Progress) (struct{}, error) {
		return struct{}{}, job()
	}, func(_ struct{}, err error) {
		f.save.Enable()
		if err != nil {
			v.pendingSelect = ""
			f.showErrs(StarFieldErrors{StarFieldForm: "not saved: " + starErrText(err)})
			return
		}
		f.close()
		v.say(done, false)
		v.w.Reload()
	})
}

// nameTaken adds a fault to the name field when another star of the
// logbook has the name (any case); it returns errs, made when nil.
func (f *starFormPanel) nameTaken(name string, errs StarFieldErrors) StarFieldErrors {
	if errs == nil {
		errs = StarFieldErrors{}
	}
	if name == "" {
		return errs
	}
	if t, ok := f.v.w.Session.Target(name); ok && (f.mode == starFormNew || !strings.EqualFold(t.Name, f.editing)) {
		errs[StarFieldName] = fmt.Sprintf("name %q: the logbook already has a star called %s; want another name", name, t.Name)
	}
	return errs
}
