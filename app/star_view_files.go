package app

import (
	"context"
	"fmt"
	"os"
	"path/filepath"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/storage"
)

// chooseImport asks for a catalogue file and imports it.
func (v *starView) chooseImport() {
	d := dialog.NewFileOpen(func(r fyne.URIReadCloser, err error) {
		if err != nil {
			v.say("Could not open the file: "+err.Error(), true)
			return
		}
		if r == nil {
			return // cancelled
		}
		path := r.URI().Path()
		r.Close()
		v.importFile(path)
	}, v.w.Win)
	d.SetTitleText("Import stars from a CSV or VOTable file")
	d.SetConfirmText("Import")
	d.SetFilter(storage.NewExtensionFileFilter([]string{".csv", ".txt", ".vot", ".votable", ".xml"}))
	d.Resize(v.dialogSize())
	d.Show()
}

// dialogSize is the size of the page's file dialogs: most of the window.
func (v *starView) dialogSize() fyne.Size {
	s := v.w.Win.Canvas().Size()
	return fyne.NewSize(max(s.Width*0.8, 600), max(s.Height*0.8, 400))
}

// importFile reads and checks the catalogue at path in a job and, when
// every row is good, stores it (asking first when that removes the demo).
// A bad row refuses the whole file, with the file, line and column said.
func (v *starView) importFile(path string) {
	v.say("", false)
	v.confirm.hide()
	base := filepath.Base(path)
	Run(v.w.Jobs, "star-import", "Reading "+base, func(context.Context, Progress) (StarImport, error) {
		return ReadStarFile(path)
	}, func(im StarImport, err error) {
		if err != nil {
			v.say("Nothing was imported. "+starErrText(err), true)
			return
		}
		if v.w.Session.IsDemo() {
			v.confirm.ask(fmt.Sprintf("%s holds %s. This logbook still holds the demo: importing removes the demo first "+
				"(its stars, observatories, nights, measurements and timings) and then adds them.",
				base, plural(len(im.Targets), "star", "stars")), "Remove the demo and import", func() { v.storeImport(im) })
			return
		}
		v.storeImport(im)
	})
}

// storeImport adds the stars read, all of them or none, in a job.
func (v *starView) storeImport(im StarImport) {
	lb := v.w.Session.Logbook()
	Run(v.w.Jobs, "star-import", "Importing stars", func(context.Context, Progress) (int, error) {
		return im.Store(lb)
	}, func(n int, err error) {
		if err != nil {
			v.say("Nothing was imported. "+starErrText(err), true)
			return
		}
		v.say(fmt.Sprintf("Added %s from %s: %s.", plural(n, "star", "stars"), filepath.Base(im.Path),
			strings.Join(im.Names(), ", ")), false)
		v.w.Reload()
	})
}

// chooseExport asks where to write the catalogue and writes it.
func (v *starView) chooseExport() {
	d := dialog.NewFileSave(func(wc fyne.URIWriteCloser, err error) {
		if err != nil {
			v.say("Could not write the file: "+err.Error(), true)
			return
		}
		if wc == nil {
			return // cancelled
		}
		path := wc.URI().Path()
		wc.Close()
		v.exportFile(path)
	}, v.w.Win)
	d.SetTitleText("Export every star to a CSV catalogue")
	d.SetConfirmText("Export")
	d.SetFileName("stars.csv")
	d.SetFilter(storage.NewExtensionFileFilter([]string{".csv"}))
	d.Resize(v.dialogSize())
	d.Show()
}

// exportFile writes every star of the logbook to the CSV file at path, in
// a job, whole or not at all.
func (v *starView) exportFile(path string) {
	v.say("", false)
	lb := v.w.Session.Logbook()
	Run(v.w.Jobs, "star-export", "Exporting the stars", func(context.Context, Progress) (int, error) {
		return ExportStars(lb, path)
	}, func(n int, err error) {
		if err != nil {
			// The save dialog made an empty file: do not leave it behind.
			if fi, e := os.Stat(path); e == nil && fi.Size() == 0 {
				os.Remove(path)
			}
			v.say("The stars were not exported: "+starErrText(err), true)
			return
		}
		v.say(fmt.Sprintf("Wrote %s to %s (CSV; imports back with Import…).", plural(n, "star", "stars"), path), false)
	})
}

// askDelete counts what goes with the star on show and asks whether to
// delete it.
func (v *starView) askDelete() {
	name := v.target.Name
	if name == "" {
		return
	}
	v.say("", false)
	v.form.close()
	lb := v.w.Session.Logbook()
	Run(v.w.Jobs, "star-delete", "", func(context.Context, Progress) (StarDeletion, error) {
		return CountStarRecords(lb, name)
	}, func(d StarDeletion, err error) {
		if err != nil {
			v.say(err.Error(), true)
			return
		}
		if !strings.EqualFold(name, v.target.Name) {
			return // another star was selected meanwhile
		}
		v.confirm.ask(d.Question(), "Delete "+name, func() { v.deleteStar(d) })
	})
}

// deleteStar deletes the star and everything about it, in a job.
func (v *starView) deleteStar(d StarDeletion) {
	lb := v.w.Session.Logbook()
	Run(v.w.Jobs, "star-delete", "Deleting "+d.Name, func(context.Context, Progress) (struct{}, error) {
		return struct{}{}, lb.DeleteTarget(d.Name)
	}, func(_ struct{}, err error) {
		if err != nil {
			v.say(d.Name+" was not deleted: "+starErrText(err), true)
			return
		}
		v.say(fmt.Sprintf("Deleted %s with its %s, %s and %s.", d.Name, plural(d.Ephemerides, "ephemeris", "ephemerides"),
			plural(d.Measurements, "measurement", "measurements"), plural(d.Timings, "timing", "timings")), false)
		v.w.Reload()
	})
}
