package app

import (
	"testing"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/dialog"
)

// pressShortcut sends s as the desktop driver does (fyne
// internal/driver/glfw, window.triggersShortcut, v2.7.1): to the focused
// widget when it takes shortcuts, else to the canvas.
func pressShortcut(w *Window, s fyne.Shortcut) {
	c := w.Win.Canvas()
	if f, ok := c.Focused().(fyne.Shortcutable); ok {
		f.TypedShortcut(s)
		return
	}
	c.(fyne.Shortcutable).TypedShortcut(s)
}

// pressKey sends the key name as the desktop driver does (window.
// processKeyPressed): to the focused widget, else to the canvas.
func pressKey(w *Window, name fyne.KeyName) {
	c := w.Win.Canvas()
	ev := &fyne.KeyEvent{Name: name}
	if f := c.Focused(); f != nil {
		f.TypedKey(ev)
		return
	}
	c.OnTypedKey()(ev)
}

// Every key of the window and its pages reaches its page whatever has the
// keyboard: here always an entry, of another page than the key's, or the
// star search. A page's key brings its page to the front; nothing is typed
// into the entry that had the keyboard.
func TestKeysReachTheirPage(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	w.Session.Select("Test Alpha")
	settle(t, w, q)
	mv := w.Page("measure").(*measureView)
	tv := timingPage(t, w)
	sv := starPage(t, w)
	lv := w.Page("log").(*logView)
	day := func() string { return w.Session.Date().Format(time.DateOnly) }

	steps := []struct {
		name  string
		front string                // the page in front before the key
		focus func() fyne.Focusable // the entry with the keyboard
		press func()
		page  string        // the page in front after
		check func() string // "" when the key did its work, else what is wrong
	}{
		{"Ctrl+N in the star search", "tonight", func() fyne.Focusable { return w.stars.search },
			func() { pressShortcut(w, measureKeyNew) }, "measure",
			func() string {
				if w.Win.Canvas().Focused() != fyne.Focusable(mv.form.time) {
					return "the keyboard is not in the new row's time field"
				}
				return ""
			}},
		{"Ctrl+N in the Timings page's range field", "timing", func() fyne.Focusable { tv.tabs.SelectIndex(0); return tv.fit.from },
			func() { pressShortcut(w, measureKeyNew) }, "measure",
			func() string {
				if w.Win.Canvas().Focused() != fyne.Focusable(mv.form.time) {
					return "the keyboard is not in the new row's time field"
				}
				return ""
			}},
		{"Ctrl+S in the Measurements page's observer field", "measure", func() fyne.Focusable { return mv.observer },
			func() { lv.dlg = nil; pressShortcut(w, keySaveLog) }, "log",
			func() string {
				if _, ok := lv.dlg.(*dialog.FileDialog); !ok {
					return "no file dialog for the PDF"
				}
				logCloseDialogs(w, lv)
				return ""
			}},
		{"Ctrl+F in the Star page's form", "star", func() fyne.Focusable { sv.form.open(starFormEdit); return sv.form.entries[StarFieldName] },
			func() { pressShortcut(w, keyFind) }, "star",
			func() string {
				defer sv.form.close()
				if w.Win.Canvas().Focused() != fyne.Focusable(w.stars.search) {
					return "the keyboard is not in the star search"
				}
				return ""
			}},
		{"Alt+Right in the period search's field", "timing", func() fyne.Focusable { tv.tabs.SelectIndex(2); return tv.per.min },
			func() { pressShortcut(w, keyNextNight) }, "timing",
			func() string { return wantDay(day(), "2026-12-02") }},
		{"Alt+Left in the Measurements page's conditions field", "measure", func() fyne.Focusable { return mv.conditions },
			func() { pressShortcut(w, keyPrevNight) }, "measure",
			func() string { return wantDay(day(), "2026-12-01") }},
		{"Page Down in the Measurements page's equipment field", "measure", func() fyne.Focusable { return mv.equipment },
			func() { pressKey(w, fyne.KeyPageDown) }, "measure",
			func() string { return wantDay(day(), "2026-12-02") }},
		{"Page Up in the Star page's form", "star", func() fyne.Focusable { sv.form.open(starFormEdit); return sv.form.entries[StarFieldRA] },
			func() { pressKey(w, fyne.KeyPageUp) }, "star",
			func() string { defer sv.form.close(); return wantDay(day(), "2026-12-01") }},
		{"Page Down after choosing the site", "tonight", func() fyne.Focusable { return w.header.site },
			func() { pressKey(w, fyne.KeyPageDown) }, "tonight",
			func() string { return wantDay(day(), "2026-12-02") }},
	}
	for _, st := range steps {
		w.ShowPage(st.front)
		settle(t, w, q)
		f := st.focus()
		w.Win.Canvas().Focus(f)
		var before string
		if e, ok := f.(*keyEntry); ok {
			before = e.Text
		}
		st.press()
		settle(t, w, q)
		if got := w.frontPage(); got != st.page {
			t.Errorf("%s: page %q in front, want %q", st.name, got, st.page)
		}
		if msg := st.check(); msg != "" {
			t.Errorf("%s: %s", st.name, msg)
		}
		if e, ok := f.(*keyEntry); ok && e.Text != before {
			t.Errorf("%s: the entry's text went from %q to %q", st.name, before, e.Text)
		}
	}
}

// wantDay says what is wrong when the night is not want.
func wantDay(got, want string) string {
	if got != want {
		return "the night is " + got + ", want " + want
	}
	return ""
}

// A page's key that works only while it is in front wins there over
// another page's key that works from anywhere, and leaves it alone
// elsewhere: two pages can use the same key.
func TestKeyOfThePageInFrontWins(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	lv := w.Page("log").(*logView)
	star := 0
	w.AddKey("star", keySaveLog, KeyOnFront, func() { star++ })
	w.ShowPage("star")
	settle(t, w, q)
	lv.dlg = nil
	pressShortcut(w, keySaveLog)
	settle(t, w, q)
	if star != 1 || lv.dlg != nil || w.frontPage() != "star" {
		t.Errorf("Ctrl+S on the Star page: its binding ran %d times, log dialog %T, page %q in front; want 1, none, star", star, lv.dlg, w.frontPage())
	}
	w.ShowPage("tonight")
	settle(t, w, q)
	pressShortcut(w, keySaveLog)
	settle(t, w, q)
	if _, ok := lv.dlg.(*dialog.FileDialog); star != 1 || !ok || w.frontPage() != "log" {
		t.Errorf("Ctrl+S on the Tonight page: the Star page's binding ran %d times, log dialog %T, page %q in front; want 1, the file dialog, log", star, lv.dlg, w.frontPage())
	}
	// With the dialog open, the keys wait.
	night := w.Session.Date()
	pressShortcut(w, keyNextNight)
	pressKey(w, fyne.KeyPageDown)
	if !w.Session.Date().Equal(night) {
		t.Errorf("the night keys moved the night to %v behind an open dialog", w.Session.Date())
	}
	logCloseDialogs(w, lv)
}
