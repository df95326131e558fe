// Package app is vigil's window, built with Fyne: a thin layer over
// observe, reduce, ephem and the logbook, in which an observer plans a
// night, keeps measurements and timings, and follows a star's O−C.
//
// # Layout
//
// The header holds the site, the night (◀ ▶, Alt+Left and Alt+Right, Page
// Up and Page Down), a twilight strip from an hour before sunset to an hour
// after sunrise with the Moon's time above the horizon, the Moon's
// illumination and the theme (light, dark, night red). The star list on the
// left (Ctrl+F finds a star) shows each star's best extremum of the night
// and whether its coverage window can be observed whole, partly or not.
// The pages are tabs, listed in one table (Screens); the status bar shows
// the logbook, the UTC and local clocks, and the background work with
// progress and cancel buttons.
//
// # Structure
//
// Session (state.go) is the state every page shares; Jobs (jobs.go) runs
// all slow work off the UI thread and delivers results on it; NewTheme and
// Palette (theme.go) give the three looks, for Fyne and for the charts;
// ChartView (chartview.go) shows a gonum/plot chart drawn at its size.
// Each page is a <name>_model.go in plain Go, tested without a window, and
// a <name>_view.go of widgets; see Page for how to add one.
//
// The package imports fyne but not its GL driver: New takes a fyne.App, so
// the tests run on Fyne's test driver without a display, and the command
// line (cmd/vigil) makes the real application.
package app
