package app

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/widget"
)

// logOverlayButton returns the button labelled label in the dialog on top
// of the window, failing the test when there is none.
func logOverlayButton(t *testing.T, w *Window, label string) *widget.Button {
	t.Helper()
	top := w.Win.Canvas().Overlays().Top()
	if top == nil {
		t.Fatalf("no dialog open, looking for its %q button", label)
	}
	for _, o := range test.LaidOutObjects(top) {
		if b, ok := o.(*widget.Button); ok && b.Text == label && b.Visible() {
			return b
		}
	}
	t.Fatalf("the dialog on top has no %q button", label)
	return nil
}

// logCloseDialogs closes every dialog the page opened.
func logCloseDialogs(w *Window, v *logView) {
	if v.dlg != nil {
		v.dlg.Hide()
	}
	for w.Win.Canvas().Overlays().Top() != nil {
		w.Win.Canvas().Overlays().Remove(w.Win.Canvas().Overlays().Top())
	}
}

// Save as PDF through the file dialog (Ctrl+S too), and as text: the files
// are written whole and the page says where.
func TestLogPageSaves(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	v := logPage(t, w, q)
	dir := t.TempDir()
	v.lastDir = dir

	for _, tc := range []struct {
		name  string
		open  func()
		file  string
		start string
		kind  string
	}{
		{"Save as PDF", func() { test.Tap(v.savePDF) }, "vigil-log-ashgrove-hill-observatory-demo-2026-12-01.pdf", "%PDF-", "PDF, A4"},
		{"Save as text", func() { test.Tap(v.saveText) }, "vigil-log-ashgrove-hill-observatory-demo-2026-12-01.txt", "Observing log: ", "plain text"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			tc.open()
			if _, ok := v.dlg.(*dialog.FileDialog); !ok {
				t.Fatalf("no file dialog open: %T", v.dlg)
			}
			test.Tap(logOverlayButton(t, w, "Save"))
			settle(t, w, q)
			path := filepath.Join(dir, tc.file)
			b, err := os.ReadFile(path)
			if err != nil {
				t.Fatal(err)
			}
			if !bytes.HasPrefix(b, []byte(tc.start)) {
				t.Errorf("%s starts %q, want %q", tc.file, b[:min(len(b), 20)], tc.start)
			}
			if want := "Saved (" + tc.kind + "): " + path; v.status.Text != want {
				t.Errorf("status %q, want %q", v.status.Text, want)
			}
			logCloseDialogs(w, v)
		})
	}

	// Ctrl+S opens the PDF's dialog while the page is in front, and from
	// another page brings the Log page to the front first (keys_test.go
	// tries it with the keyboard in an entry); not while a dialog is open.
	v.dlg = nil
	w.Win.Canvas().(fyne.Shortcutable).TypedShortcut(keySaveLog)
	if _, ok := v.dlg.(*dialog.FileDialog); !ok {
		t.Errorf("Ctrl+S on the Log page: dialog %T, want the file dialog", v.dlg)
	}
	v.dlg = nil
	w.Win.Canvas().(fyne.Shortcutable).TypedShortcut(keySaveLog)
	if v.dlg != nil {
		t.Errorf("Ctrl+S with the save dialog open opened another: %T", v.dlg)
	}
	logCloseDialogs(w, v)
	w.ShowPage("tonight")
	v.dlg = nil
	w.Win.Canvas().(fyne.Shortcutable).TypedShortcut(keySaveLog)
	settle(t, w, q)
	if _, ok := v.dlg.(*dialog.FileDialog); !ok || w.frontPage() != "log" {
		t.Errorf("Ctrl+S on the Tonight page: page %q in front, dialog %T; want the Log page and the file dialog", w.frontPage(), v.dlg)
	}
	logCloseDialogs(w, v)
}

// A bad name or a place that cannot be written: a dialog says why in
// plain words, and nothing is written (the empty file the dialog made is
// removed).
func TestLogPageSaveErrors(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	v := logPage(t, w, q)
	dir := t.TempDir()
	for _, tc := range []struct {
		name, file, ext, want string
		fromDialog            bool
	}{
		{"other extension", "night.doc", "pdf", `"night.doc" does not end in .pdf`, true},
		{"no such folder", filepath.Join("missing", "night.pdf"), "pdf", "does not exist", false},
		{"text as .pdf", "night.pdf", "txt", `"night.pdf" does not end in .txt`, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			path := filepath.Join(dir, tc.file)
			if tc.fromDialog { // the dialog has made the file, empty
				if err := os.WriteFile(path, nil, 0o644); err != nil {
					t.Fatal(err)
				}
			}
			v.saveTo(v.preview, path, tc.ext, tc.fromDialog)
			settle(t, w, q)
			if v.notice.Title != "The log was not saved" || !strings.Contains(v.notice.Text, tc.want) {
				t.Errorf("notice %+v, want one containing %q", v.notice, tc.want)
			}
			if w.Win.Canvas().Overlays().Top() == nil {
				t.Error("no dialog on show")
			}
			if _, err := os.Stat(path); !os.IsNotExist(err) {
				t.Errorf("%s exists after the error (%v)", tc.file, err)
			}
			if v.status.Text != "The log was not saved." {
				t.Errorf("status %q", v.status.Text)
			}
			logCloseDialogs(w, v)
		})
	}
}

// Print asks first, then hands the PDF to the print command and shows its
// reply; without a print command it says what to do.
func TestLogPagePrints(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	v := logPage(t, w, q)
	f := &logFakePrint{found: map[string]bool{"lp": true}, reply: "request id is Desk-3 (1 file(s))"}
	v.printer = f.printer(t.TempDir())

	test.Tap(v.print)
	settle(t, w, q)
	test.Tap(logOverlayButton(t, w, "Print"))
	settle(t, w, q)
	if f.cmd != "/fake/bin/lp" || len(f.args) != 3 || f.args[0] != "-t" ||
		filepath.Base(f.args[2]) != "vigil-log-ashgrove-hill-observatory-demo-2026-12-01.pdf" || string(f.pdfStart) != "%PDF-" {
		t.Errorf("print command %q %q (file starting %q)", f.cmd, f.args, f.pdfStart)
	}
	if v.notice.Title != "Sent to the printer" || v.notice.Text != "Request id is Desk-3 (1 file(s))" {
		t.Errorf("notice %+v", v.notice)
	}
	logCloseDialogs(w, v)

	// Cancel in the question: nothing printed.
	f.cmd = ""
	test.Tap(v.print)
	settle(t, w, q)
	test.Tap(logOverlayButton(t, w, "Cancel"))
	settle(t, w, q)
	if f.cmd != "" {
		t.Errorf("printed after Cancel: %q", f.cmd)
	}

	// No print command.
	f.found = nil
	test.Tap(v.print)
	settle(t, w, q)
	if v.notice.Title != "Cannot print" || v.notice.Text != "No print command found: save as PDF and print it from your PDF viewer" {
		t.Errorf("without a print command: %+v", v.notice)
	}
	if f.cmd != "" {
		t.Errorf("ran %q without a print command", f.cmd)
	}
}
