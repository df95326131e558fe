package app

import (
	"context"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"unicode"
	"unicode/utf8"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/driver/desktop"
	"fyne.io/fyne/v2/storage"
	"fyne.io/fyne/v2/widget"
)

// keySaveLog saves the observing log as a PDF (Ctrl+S), from any page: the
// Log page comes to the front.
var keySaveLog = &desktop.CustomShortcut{KeyName: fyne.KeyS, Modifier: fyne.KeyModifierShortcutDefault}

// logNotice is a message the Log page showed in a dialog.
type logNotice struct{ Title, Text string }

// logDialog is the part of a Fyne dialog the page keeps.
type logDialog interface{ Hide() }

// saveShortcut answers Ctrl+S (the window has brought the page to the
// front): the PDF's save dialog, at once when the log is ready, else as
// soon as it is.
func (v *logView) saveShortcut() {
	if !v.onFront() {
		return
	}
	if v.preview == nil {
		v.saveAsked = true
		return
	}
	v.askSave("pdf")
}

// askSave opens the file-save dialog for the log as ext ("pdf" or "txt"),
// offering vigil-log-<site>-<date>.<ext> in the folder of the last save.
func (v *logView) askSave(ext string) {
	lp := v.preview
	if lp == nil {
		return
	}
	d := dialog.NewFileSave(func(wc fyne.URIWriteCloser, err error) {
		if err != nil {
			v.tell("The log was not saved", "The file cannot be opened for writing: "+err.Error())
			return
		}
		if wc == nil {
			return // cancelled
		}
		// Fyne's dialog opens the file itself; the log is written through
		// report's whole-or-nothing Write instead, so close it first.
		path := wc.URI().Path()
		_ = wc.Close()
		v.saveTo(lp, path, ext, true)
	}, v.w.Win)
	d.SetFileName(LogFileName(lp.Request.Site.Name, lp.Request.Date, ext))
	d.SetFilter(storage.NewExtensionFileFilter([]string{"." + ext}))
	if ext == "pdf" {
		d.SetTitleText("Save the observing log as PDF (" + logPaperName(lp.Request.Paper) + ")")
	} else {
		d.SetTitleText("Save the observing log as plain text")
	}
	d.SetConfirmText("Save")
	if v.lastDir != "" {
		if l, err := storage.ListerForURI(storage.NewFileURI(v.lastDir)); err == nil {
			d.SetLocation(l)
		}
	}
	v.dlg = d
	d.Show()
}

// saveTo writes the log to path as ext in the "log-save" job, then says
// where it went, or why it was not saved. fromDialog says that the file
// dialog has made the file already (empty): it is removed when the log
// cannot be written, so that nothing is left.
func (v *logView) saveTo(lp *LogPreview, path, ext string, fromDialog bool) {
	rl := lp.Log
	kind := logFormatName(ext, lp.Request.Paper)
	v.status.SetText("Saving the log to " + path + "…")
	Run(v.w.Jobs, "log-save", "Saving the observing log", func(context.Context, Progress) (struct{}, error) {
		err := SaveLog(rl, path, ext)
		if err != nil && fromDialog {
			if fi, serr := os.Stat(path); serr == nil && fi.Mode().IsRegular() && fi.Size() == 0 {
				_ = os.Remove(path)
			}
		}
		return struct{}{}, err
	}, func(_ struct{}, err error) {
		if err != nil {
			v.status.SetText("The log was not saved.")
			v.tell("The log was not saved", err.Error())
			return
		}
		v.lastDir = filepath.Dir(path)
		v.status.SetText("Saved (" + kind + "): " + path)
	})
}

// askPrint looks for the print command in the "log-print" job, then asks
// before printing, or says what to do when there is none.
func (v *logView) askPrint() {
	lp := v.preview
	if lp == nil {
		return
	}
	p := v.printer
	Run(v.w.Jobs, "log-print", "", func(context.Context, Progress) (string, error) {
		_, name, err := p.Command()
		return name, err
	}, func(name string, err error) {
		if err != nil {
			v.tell("Cannot print", err.Error())
			return
		}
		msg := fmt.Sprintf("Send the observing log of the %s (%s on %s) to the default printer with %s?",
			logNightWords(lp.Request.Date), plural(lp.PDFPages, "page", "pages"), logPaperName(lp.Request.Paper), name)
		d := dialog.NewCustomConfirm("Print the log", "Print", "Cancel", logDialogText(msg), func(ok bool) {
			if ok {
				v.printNow(lp)
			}
		}, v.w.Win)
		v.dlg = d
		d.Show()
	})
}

// printNow prints the log in the "log-print" job and shows the print
// command's reply.
func (v *logView) printNow(lp *LogPreview) {
	p, rl := v.printer, lp.Log
	file := LogFileName(lp.Request.Site.Name, lp.Request.Date, "pdf")
	title := "Observing log " + lp.Request.Site.Name + " " + lp.Request.Date.Format("2006-01-02")
	v.status.SetText("Printing…")
	Run(v.w.Jobs, "log-print", "Printing the observing log", func(ctx context.Context, _ Progress) (string, error) {
		return p.Print(ctx, rl, file, title)
	}, func(reply string, err error) {
		switch {
		case errors.Is(err, context.Canceled):
			v.status.SetText("Printing was cancelled.")
		case err != nil:
			v.status.SetText("The log was not printed.")
			v.tell("The log was not printed", err.Error())
		default:
			v.status.SetText("Sent to the printer: " + reply)
			v.tell("Sent to the printer", reply)
		}
	})
}

// tell shows a message in a dialog (an error in plain words, or the print
// command's reply), and keeps it for the tests.
func (v *logView) tell(title, text string) {
	if r, n := utf8.DecodeRuneInString(text); n > 0 {
		text = string(unicode.ToUpper(r)) + text[n:] // a sentence, though errors begin in lower case
	}
	v.notice = logNotice{Title: title, Text: text}
	d := dialog.NewCustom(title, "OK", logDialogText(text), v.w.Win)
	v.dlg = d
	d.Show()
}

// logDialogText is the body of a dialog: the text wrapped at a width that
// suits a dialog.
func logDialogText(s string) fyne.CanvasObject {
	l := widget.NewLabel(strings.TrimSpace(s))
	l.Wrapping = fyne.TextWrapWord
	return container.New(logWidthLayout{width: 460}, l)
}

// logWidthLayout gives its one object a fixed width and the height it then
// needs (a wrapped label grows taller as it narrows).
type logWidthLayout struct{ width float32 }

// Layout implements fyne.Layout.
func (l logWidthLayout) Layout(objs []fyne.CanvasObject, size fyne.Size) {
	for _, o := range objs {
		o.Move(fyne.NewPos(0, 0))
		o.Resize(size)
	}
}

// MinSize implements fyne.Layout.
func (l logWidthLayout) MinSize(objs []fyne.CanvasObject) fyne.Size {
	var h float32
	for _, o := range objs {
		o.Resize(fyne.NewSize(l.width, o.Size().Height))
		h = max(h, o.MinSize().Height)
	}
	return fyne.NewSize(l.width, h)
}
