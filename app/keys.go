package app

import (
	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/driver/desktop"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"
)

// The window's keys: the previous and next night (Alt+Left, Alt+Right, also
// Page Up and Page Down), and Ctrl+F to find a star. Pages add theirs with
// AddKey (Ctrl+N: a new measurement row; Ctrl+S: save the log).
var (
	keyPrevNight = &desktop.CustomShortcut{KeyName: fyne.KeyLeft, Modifier: fyne.KeyModifierAlt}
	keyNextNight = &desktop.CustomShortcut{KeyName: fyne.KeyRight, Modifier: fyne.KeyModifierAlt}
	keyFind      = &desktop.CustomShortcut{KeyName: fyne.KeyF, Modifier: fyne.KeyModifierShortcutDefault}
)

// KeyScope says from where a page's shortcut works.
type KeyScope int

const (
	// KeyAnywhere works from every page: its page comes to the front
	// first (Ctrl+N starts a measurement row from any page).
	KeyAnywhere KeyScope = iota
	// KeyOnFront works only while its page is in front, and there wins
	// over a KeyAnywhere binding of the same key of another page.
	KeyOnFront
)

// keyBinding is one shortcut of the registry.
type keyBinding struct {
	page  string // Screen.Name of the page; "" for the window's own keys
	name  string // the shortcut's name (fyne.Shortcut.ShortcutName)
	scope KeyScope
	run   func()
}

// AddKey registers run as the answer to the shortcut key for the page
// called page (its Screen.Name). Fyne gives a shortcut to the widget that
// has the keyboard, and a canvas holds one handler per key, so that a
// page's key was lost while an entry of another page had the keyboard, or
// replaced by another page's: the window keeps every binding here, hears
// every shortcut (from the canvas, and from its entries, tables and lists,
// which pass on what they do not use), and gives each to the page it
// belongs to (keyShortcut).
func (w *Window) AddKey(page string, key fyne.Shortcut, scope KeyScope, run func()) {
	name := key.ShortcutName()
	w.keys = append(w.keys, keyBinding{page: page, name: name, scope: scope, run: run})
	w.Win.Canvas().AddShortcut(key, func(s fyne.Shortcut) { w.shortcut(s) })
}

// bindKeys registers the window's own shortcuts.
func (w *Window) bindKeys() {
	w.AddKey("", keyPrevNight, KeyAnywhere, w.Session.PrevNight)
	w.AddKey("", keyNextNight, KeyAnywhere, w.Session.NextNight)
	w.AddKey("", keyFind, KeyAnywhere, func() { w.Win.Canvas().Focus(w.stars.search) })
	w.Win.Canvas().SetOnTypedKey(func(e *fyne.KeyEvent) { w.typedKey(e) })
}

// frontPage returns the Screen.Name of the page in front.
func (w *Window) frontPage() string {
	i := w.tabs.SelectedIndex()
	if s := Screens(); i >= 0 && i < len(s) {
		return s[i].Name
	}
	return ""
}

// dialogOpen reports whether a dialog or a pop-up is over the window: the
// window's keys then wait, and the dialog's fields keep theirs.
func (w *Window) dialogOpen() bool { return w.Win.Canvas().Overlays().Top() != nil }

// shortcut runs the binding of shortcut s, and reports whether there was
// one: the page in front's own, else the window's, else another page's
// KeyAnywhere binding, bringing that page to the front first. Nothing runs
// while a dialog is open.
func (w *Window) shortcut(s fyne.Shortcut) bool {
	if s == nil || w.dialogOpen() {
		return false
	}
	name, front := s.ShortcutName(), w.frontPage()
	var window, other *keyBinding
	for i := range w.keys {
		b := &w.keys[i]
		switch {
		case b.name != name:
		case b.page == front && b.page != "":
			b.run()
			return true
		case b.page == "" && window == nil:
			window = b
		case b.scope == KeyAnywhere && other == nil:
			other = b
		}
	}
	switch {
	case window != nil:
		window.run()
	case other != nil:
		w.ShowPage(other.page)
		other.run()
	default:
		return false
	}
	return true
}

// typedKey handles the keys that no focused widget took: Page Up and Page
// Down step through the nights.
func (w *Window) typedKey(e *fyne.KeyEvent) bool {
	if w.dialogOpen() {
		return false
	}
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
// stepped through, a star found or a row started while typing anywhere.
// Every entry of the pages is one. A multi-line entry keeps Page Up and
// Page Down, which move through its text.
type keyEntry struct {
	widget.Entry
	w *Window
}

func newKeyEntry(w *Window) *keyEntry {
	e := &keyEntry{w: w}
	e.ExtendBaseWidget(e)
	return e
}

// newKeyMultiLineEntry returns a multi-line keyEntry that wraps words.
func newKeyMultiLineEntry(w *Window) *keyEntry {
	e := newKeyEntry(w)
	e.MultiLine = true
	e.Wrapping = fyne.TextWrapWord
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
	if e.MultiLine && (k.Name == fyne.KeyPageUp || k.Name == fyne.KeyPageDown) {
		e.Entry.TypedKey(k)
		return
	}
	if !e.w.typedKey(k) {
		e.Entry.TypedKey(k)
	}
}

// keySelect is a choice that passes Page Up and Page Down on to the window
// when it has the keyboard (as it keeps it after a choice is made: the
// site, then the next night).
type keySelect struct {
	widget.Select
	w *Window
}

func newKeySelect(w *Window, options []string, changed func(string)) *keySelect {
	s := &keySelect{w: w}
	s.Options, s.OnChanged = options, changed
	s.PlaceHolder = "(choose one)"
	s.ExtendBaseWidget(s)
	return s
}

// TypedKey implements fyne.Focusable.
func (s *keySelect) TypedKey(k *fyne.KeyEvent) {
	if !s.w.typedKey(k) {
		s.Select.TypedKey(k)
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
	// widths, when set, gives the columns' widths for a table of the
	// given width; they are applied on every change of width (fitWidths).
	widths  func(total float32) []float32
	applied []float32 // the widths applied last
}

// Resize implements fyne.CanvasObject: with widths set, the columns are
// fitted to the new width first.
func (t *keyTable) Resize(s fyne.Size) {
	if t.widths != nil && s.Width != t.Size().Width {
		t.fitWidths(s.Width)
	}
	t.Table.Resize(s)
}

// fitWidths sets the columns' widths from t.widths for a table total wide.
func (t *keyTable) fitWidths(total float32) {
	t.applied = t.widths(total)
	for i, w := range t.applied {
		t.SetColumnWidth(i, w)
	}
}

// stretchColumn returns the widths base with column i widened to take what
// is left of total, if anything is: a long last column (a verdict with its
// reasons) then shows whole when the table has the room.
func stretchColumn(base []float32, i int, total float32) []float32 {
	out := append([]float32(nil), base...)
	if i < 0 || i >= len(out) {
		return out
	}
	// each column is followed by a divider; the scroll bar overlays the
	// last column's edge
	rest := total - float32(len(out))*theme.SeparatorThicknessSize() - theme.ScrollBarSize()
	for j, w := range out {
		if j != i {
			rest -= w
		}
	}
	out[i] = max(out[i], rest)
	return out
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
