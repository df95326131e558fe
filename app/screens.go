package app

import (
	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/theme"
)

// Page is one page of the window, shown as a tab. A page is built once,
// when the window is, by its Screen's New function, and lives as long as
// the window.
//
// How a page is made (the Tonight page, tonight_model.go and
// tonight_view.go, is the worked example):
//
//   - <name>_model.go holds its state and commands in plain Go (no fyne):
//     inputs, derived outputs, calls into observe, reduce and the logbook.
//     It is tested without a window.
//   - <name>_view.go builds the widgets from the model and keeps the
//     interactive ones as fields, so that tests can tap and type them.
//   - It follows the session with w.Session.OnChange (ChangedSite,
//     ChangedNight, ChangedTargets, ChangedSelection, ChangedTheme,
//     ChangedPlan, ChangedRecords; listeners run on the UI thread) and
//     reads it there:
//     w.Session.Site(), Date(), Targets(), Selected(), Night() (the
//     current night's plan, nil while it is computed), Logbook().
//   - Anything that may take more than a few milliseconds (logbook reads
//     and writes, reductions, fits, searches, files) runs through
//     Run(w.Jobs, slot, name, fn, onDone): fn off the UI thread, onDone on
//     it; a new job in the same slot cancels the old one; a named job shows
//     in the status bar with its progress and a cancel button.
//   - Charts are w.NewChartView() given a ChartSource (which builds the
//     *plot.Plot or chart.Panels for the palette it is handed, off the UI
//     thread); they are redrawn on resize and rebuilt on theme change.
//     ChartView.OnPick and Area map drags and positions to data.
//   - After adding or deleting measurements or a night's details, call
//     w.RecordsChanged(): the pages showing records read them again,
//     without planning the night again. After changing sites or targets
//     (a star, its ephemeris or comparison stars, a timing), call
//     w.Reload() so that every page, the star list and the plan see it.
//   - Keyboard shortcuts go through w.AddKey(page, key, scope, fn), which
//     reaches the page whatever has the keyboard; entries are
//     newKeyEntry(w), which pass the window's keys on.
//   - A page that wants to know when it is brought to the front implements
//     Shown().
//   - Empty states say what to do next, in the page's own words.
type Page interface {
	// Content returns the page's widgets (the same object every time).
	Content() fyne.CanvasObject
}

// Screen is one entry of the table of pages.
type Screen struct {
	Name  string // short name for files and tests: "tonight"
	Title string // the tab's title
	Icon  fyne.Resource
	New   func(w *Window) Page
}

// Screens returns the table of pages in the order of their tabs. To add a
// page, add its one line here (and nothing else outside its own files):
//
//	{Name: "star", Title: "Star", Icon: theme.InfoIcon(), New: newStarPage},
//	{Name: "measure", Title: "Measurements", Icon: theme.DocumentCreateIcon(), New: newMeasurePage},
//	{Name: "timing", Title: "Timings", Icon: theme.HistoryIcon(), New: newTimingPage},
//	{Name: "log", Title: "Log", Icon: theme.DocumentPrintIcon(), New: newLogPage},
func Screens() []Screen {
	return []Screen{
		{Name: "tonight", Title: "Tonight", Icon: theme.CalendarIcon(), New: newTonightPage},
		{Name: "star", Title: "Star", Icon: theme.InfoIcon(), New: newStarPage},
		{Name: "measure", Title: "Measurements", Icon: theme.DocumentCreateIcon(), New: newMeasurePage},
		{Name: "timing", Title: "Timings", Icon: theme.HistoryIcon(), New: newTimingPage},
		{Name: "log", Title: "Log", Icon: theme.DocumentPrintIcon(), New: newLogPage},
	}
}
