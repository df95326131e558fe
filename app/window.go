package app

import (
	"context"
	"errors"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"

	"example.org/vigil/app/chart"
	"example.org/vigil/observe/logbook"
)

// Options say how the window starts.
type Options struct {
	// Now is the clock (nil: time.Now); tests pin it.
	Now func() time.Time
	// Theme is the theme to start with.
	Theme ThemeChoice
	// Post runs a function on the UI thread (nil: fyne.Do). Tests pass one
	// that queues, and run the queue on the test's goroutine.
	Post func(func())
	// Size is the window's initial size (zero: 1280 × 800).
	Size fyne.Size
	// ShotsDir, when set, turns on the capture mode: after the first frame
	// the window saves a PNG of every page in every theme there (ShotName,
	// ShotsIndex) and quits.
	ShotsDir string
	// ShotsGrab, when set, is the command that saves the window's pixels
	// in capture mode, given the file as its last argument (see
	// EnvOptions); otherwise the canvas's own Capture is used.
	ShotsGrab string
	// ShotsStar and ShotsDate, when set, choose the star selected and the
	// night shown before the capture mode starts, so that the pages show a
	// star with data (ShotsDate is a date YYYY-MM-DD).
	ShotsStar string
	ShotsDate string
}

// WindowTitle is the main window's title (a screen grabber finds the window
// by it: "import -window vigil").
const WindowTitle = "vigil"

// Window is vigil's main window: the header (site, night, twilight strip,
// Moon, theme), the star list, the pages as tabs, and the status bar.
// Pages reach the shared state through Session, run work through Jobs and
// draw charts with NewChartView.
type Window struct {
	App     fyne.App
	Win     fyne.Window
	Session *Session
	Jobs    *Jobs

	opt    Options
	charts []*ChartView
	header *header
	stars  *starList
	status *statusBar
	tabs   *container.AppTabs
	pages  []Page
	// themed marks the pages shown in the current theme (see rethemeShown).
	themed map[int]bool
	// keys are the shortcuts of the window and its pages (AddKey).
	keys []keyBinding
	// plans counts the plans of the night started (replan).
	plans int
}

// New builds the window on the open logbook lb (the caller opens it, e.g.
// with demo.OpenOrCreate) and starts planning the current night. It reads
// the logbook's sites and targets before returning (a few milliseconds);
// a failure shows in the window rather than stopping it.
func New(fa fyne.App, lb *logbook.Logbook, opt Options) *Window {
	if opt.Post == nil {
		opt.Post = fyne.Do
	}
	if opt.Size.IsZero() {
		opt.Size = fyne.NewSize(1280, 800)
	}
	w := &Window{App: fa, opt: opt}
	w.Session = NewSession(lb, opt.Now)
	w.Session.theme = opt.Theme
	w.Jobs = NewJobs(opt.Post)
	fa.Settings().SetTheme(NewTheme(opt.Theme))
	// The theme goes to Fyne and the charts before any other listener
	// hears of the change, so that they all read the new colours.
	w.Session.OnChange(w.applyTheme)

	w.Win = fa.NewWindow(WindowTitle)
	w.header = newHeader(w)
	w.stars = newStarList(w)
	w.status = newStatusBar(w)
	w.tabs = container.NewAppTabs()
	for _, s := range Screens() {
		p := s.New(w)
		w.pages = append(w.pages, p)
		w.tabs.Append(container.NewTabItemWithIcon(s.Title, s.Icon, p.Content()))
	}
	w.tabs.OnSelected = func(*container.TabItem) { w.pageShown() }
	split := container.NewHSplit(w.stars.content(), w.tabs)
	split.Offset = 0.2
	w.Win.SetContent(container.NewBorder(w.header.content(), w.status.content(), nil, nil, split))
	w.Win.Resize(opt.Size)
	w.bindKeys()
	w.Win.SetOnClosed(w.Jobs.CancelAll)

	w.Session.OnChange(w.changed)
	if err := w.Session.Reload(); err != nil {
		w.status.setProblem("logbook", err)
	}
	return w
}

// ShowAndRun shows the window, starts the clocks, and runs the application
// until the window is closed (or, in capture mode, until the shots are
// taken).
func (w *Window) ShowAndRun() {
	stop := w.status.startClock()
	defer stop()
	if w.opt.ShotsDir != "" {
		go w.captureAll(w.opt.ShotsDir)
	}
	w.Win.ShowAndRun()
}

// NewChartView returns a chart view drawn in the current theme's palette,
// rebuilt whenever the theme changes.
func (w *Window) NewChartView() *ChartView {
	c := NewChartView(w.Jobs, w.Palette)
	w.charts = append(w.charts, c)
	return c
}

// Palette returns the chart palette of the current theme (Palette).
func (w *Window) Palette() chart.Palette { return Palette(w.Session.Theme()) }

// Shades returns the drawing colours of the current theme (ShadesOf).
func (w *Window) Shades() Shades { return ShadesOf(w.Session.Theme()) }

// Page returns the page built from the screen called name (Screen.Name),
// nil when there is none.
func (w *Window) Page(name string) Page {
	for i, s := range Screens() {
		if s.Name == name && i < len(w.pages) {
			return w.pages[i]
		}
	}
	return nil
}

// ShowPage brings the page called name to the front.
func (w *Window) ShowPage(name string) {
	for i, s := range Screens() {
		if s.Name == name {
			w.tabs.SelectIndex(i)
		}
	}
}

// pageShown tells the page brought to the front, when it wants to know.
// The keyboard leaves a field of the page left behind (what is typed must
// not go into a page out of sight); the star search keeps it.
func (w *Window) pageShown() {
	w.rethemeShown()
	if c := w.Win.Canvas(); c.Focused() != nil && c.Focused() != fyne.Focusable(w.stars.search) {
		c.Unfocus()
	}
	i := w.tabs.SelectedIndex()
	if i >= 0 && i < len(w.pages) {
		if s, ok := w.pages[i].(interface{ Shown() }); ok {
			s.Shown()
		}
	}
}

// applyTheme gives Fyne and every chart the session's theme.
func (w *Window) applyTheme(c Change) {
	if c&ChangedTheme != 0 {
		w.App.Settings().SetTheme(NewTheme(w.Session.Theme()))
		for _, cv := range w.charts {
			cv.Rebuild()
		}
		w.themed = nil
		if w.tabs != nil {
			w.themed = map[int]bool{w.tabs.SelectedIndex(): true}
		}
	}
}

// rethemeShown gives the page brought to the front the current theme when
// it was hidden while the theme changed: Fyne re-themes only the widgets on
// show, so a hidden page's table dividers and select arrows would keep the
// old theme's colours (grey lines in night red). Applying the theme again
// re-themes the page now on show.
func (w *Window) rethemeShown() {
	i := w.tabs.SelectedIndex()
	if w.themed == nil || w.themed[i] {
		return
	}
	w.themed[i] = true
	w.App.Settings().SetTheme(NewTheme(w.Session.Theme()))
}

// changed plans the night again when the site, the night or the list of
// targets changed.
func (w *Window) changed(c Change) {
	if c&(ChangedSite|ChangedNight|ChangedTargets) != 0 {
		w.replan()
	}
}

// replan plans the current night in the "night" job; the result goes to
// Session.SetNight.
func (w *Window) replan() {
	r, ok := w.Session.PlanRequest()
	if !ok {
		w.Jobs.Cancel("night")
		return
	}
	w.plans++
	Run(w.Jobs, "night", "Planning the night", func(ctx context.Context, _ Progress) (*NightData, error) {
		return PlanNight(ctx, r)
	}, func(nd *NightData, err error) {
		if err != nil {
			nd = &NightData{Request: r, Err: err}
		}
		if w.Session.SetNight(nd) {
			if errors.Is(err, context.Canceled) {
				err = nil // the Tonight page says so; no problem to report
			}
			w.status.setProblem("night", err)
		}
	})
}

// RecordsChanged tells the pages that measurements or a night's details
// were written to the logbook (Session.RecordsChanged): those that show
// records read them again; the night is not planned again. After a change
// to the sites or the targets (a star, its ephemeris, its comparison stars,
// a timing, which moves the star's last timing and so its rank) call Reload.
func (w *Window) RecordsChanged() { w.Session.RecordsChanged() }

// Reload reads the logbook again in a job (after an import, say) and
// applies it to the session, which plans the night again.
func (w *Window) Reload() {
	lb := w.Session.Logbook()
	Run(w.Jobs, "logbook", "Reading the logbook", func(context.Context, Progress) (Snapshot, error) {
		return LoadSnapshot(lb)
	}, func(s Snapshot, err error) {
		w.status.setProblem("logbook", err)
		if err == nil {
			w.Session.Apply(s)
		}
	})
}
