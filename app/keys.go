package app

import (
	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/driver/desktop"
	"fyne.io/fyne/v2/widget"
)

// The window's keys: the previous and next night (Alt+Left, Alt+Right, also
// Page Up and Page Down), and Ctrl+F to find a star.
var (
	keyPrevNight = &desktop.CustomShortcut{KeyName: fyne.KeyLeft, Modifier: fyne.KeyModifierAlt}
	keyNextNight = &desktop.CustomShortcut{KeyName: fyne.KeyRight, Modifier: fyne.KeyModifierAlt}
	keyFind      = &desktop.CustomShortcut{KeyName: fyne.KeyF, Modifier: fyne.KeyModifierShortcutDefault}
)

// bindKeys registers the window's shortcuts on its canvas.
func (w *Window) bindKeys() {
	c := w.Win.Canvas()
	c.AddShortcut(keyPrevNight, func(fyne.Shortcut) { w.Session.PrevNight() })
	c.AddShortcut(keyNextNight, func(fyne.Shortcut) { w.Session.NextNight() })
	c.AddShortcut(keyFind, func(fyne.Shortcut) { c.Focus(w.stars.search) })
	c.SetOnTypedKey(func(e *fyne.KeyEvent) { w.typedKey(e) })
}

// shortcut runs a window shortcut that a focused widget passed on; it
// reports whether s was one.
func (w *Window) shortcut(s fyne.Shortcut) bool {
	switch s.ShortcutName() {
	case keyPrevNight.ShortcutName():
		w.Session.PrevNight()
	case keyNextNight.ShortcutName():
		w.Session.NextNight()
	case keyFind.ShortcutName():
		w.Win.Canvas().Focus(w.stars.search)
	default:
		return false
	}
	return true
}

// typedKey handles the keys that no focused widget took: Page Up and Page
// Down step through the nights.
func (w *Window) typedKey(e *fyne.KeyEvent) bool {
	switch e.Name {
	case fyne.KeyPageUp:
		w.Session.PrevNight()
	case fyne.KeyPageDown:
		w.Session.NextNight()
	default:
		return false
	}
	return true
}

// keyEntry is an entry that passes the window's keys on to the window
// (Fyne gives them to the focused widget only), so that the nights can be
// stepped through while typing a search.
type keyEntry struct {
	widget.Entry
	w *Window
}

func newKeyEntry(w *Window) *keyEntry {
	e := &keyEntry{w: w}
	e.ExtendBaseWidget(e)
	return e
}

// TypedShortcut implements fyne.Shortcutable.
func (e *keyEntry) TypedShortcut(s fyne.Shortcut) {
	if !e.w.shortcut(s) {
		e.Entry.TypedShortcut(s)
	}
}

// TypedKey implements fyne.Focusable.
func (e *keyEntry) TypedKey(k *fyne.KeyEvent) {
	if !e.w.typedKey(k) {
		e.Entry.TypedKey(k)
	}
}

// keyList is a list that passes Page Up and Page Down on to the window when
// it has the keyboard (a list uses the arrows only).
type keyList struct {
	widget.List
	w *Window
}

func newKeyList(w *Window, length func() int, create func() fyne.CanvasObject, update func(widget.ListItemID, fyne.CanvasObject)) *keyList {
	l := &keyList{w: w}
	l.Length, l.CreateItem, l.UpdateItem = length, create, update
	l.ExtendBaseWidget(l)
	return l
}

// TypedKey implements fyne.Focusable.
func (l *keyList) TypedKey(k *fyne.KeyEvent) {
	if !l.w.typedKey(k) {
		l.List.TypedKey(k)
	}
}

// keyTable is a table with a header row that passes Page Up and Page Down
// on to the window when it has the keyboard.
type keyTable struct {
	widget.Table
	w *Window
}

func newKeyTable(w *Window, length func() (int, int), create func() fyne.CanvasObject, update func(widget.TableCellID, fyne.CanvasObject)) *keyTable {
	t := &keyTable{w: w}
	t.Length, t.CreateCell, t.UpdateCell = length, create, update
	t.ShowHeaderRow = true
	t.ExtendBaseWidget(t)
	return t
}

// TypedKey implements fyne.Focusable.
func (t *keyTable) TypedKey(k *fyne.KeyEvent) {
	if !t.w.typedKey(k) {
		t.Table.TypedKey(k)
	}
}
