package app

import (
	"image/color"
	"slices"
	"strings"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/canvas"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"
)

// statusBar is the bottom row: the logbook in use (with a badge when it
// holds the demo), the UTC and local clocks, problems, and the running jobs
// with their progress and a cancel button each.
type statusBar struct {
	w        *Window
	file     *widget.Label
	demo     *fyne.Container
	demoBg   *canvas.Rectangle
	demoText *canvas.Text
	clocks   *widget.Label
	problem  *widget.Label
	jobBox   *fyne.Container
	jobs     map[string]*jobRow
	problems map[string]string
	root     *fyne.Container
	// showAfter keeps quick jobs out of sight: a job shows once it has run
	// this long (the clock's tick brings it in).
	showAfter time.Duration
}

// jobRow shows one running job.
type jobRow struct {
	box    *fyne.Container
	name   *widget.Label
	bar    *widget.ProgressBar
	spin   *widget.ProgressBarInfinite
	cancel *widget.Button
}

func newStatusBar(w *Window) *statusBar {
	s := &statusBar{w: w, jobs: map[string]*jobRow{}, problems: map[string]string{}, showAfter: 400 * time.Millisecond}
	s.file = widget.NewLabel("")
	s.file.Truncation = fyne.TextTruncateEllipsis
	s.demoBg = canvas.NewRectangle(color.Transparent)
	s.demoBg.CornerRadius = 4
	s.demoText = canvas.NewText(" demo ", color.Black)
	s.demoText.TextStyle.Bold = true
	s.demoText.TextSize = theme.CaptionTextSize()
	s.demo = container.NewCenter(container.NewStack(s.demoBg, container.NewPadded(s.demoText)))
	s.clocks = widget.NewLabel("")
	s.clocks.TextStyle.Monospace = true
	s.problem = widget.NewLabel("")
	s.problem.Importance = widget.DangerImportance
	s.problem.Truncation = fyne.TextTruncateEllipsis
	s.jobBox = container.NewHBox()
	left := container.NewHBox(widget.NewIcon(theme.StorageIcon()), s.demo)
	right := container.NewHBox(s.jobBox, s.clocks)
	mid := container.NewGridWithColumns(2, s.file, s.problem)
	s.root = container.NewVBox(widget.NewSeparator(), container.NewBorder(nil, nil, left, right, mid))
	w.Jobs.OnChange(s.updateJobs)
	w.Session.OnChange(func(c Change) {
		if c&(ChangedSites|ChangedSite|ChangedTheme) != 0 {
			s.update()
		}
	})
	s.update()
	return s
}

func (s *statusBar) content() fyne.CanvasObject { return s.root }

// update shows the logbook, the badge and the clocks.
func (s *statusBar) update() {
	lb := s.w.Session.Logbook()
	s.file.SetText(lb.Path())
	s.demo.Hidden = !s.w.Session.IsDemo()
	s.demoBg.FillColor = theme.Color(theme.ColorNamePrimary)
	s.demoText.Color = theme.Color(theme.ColorNameForegroundOnPrimary)
	s.demo.Refresh()
	s.tick()
}

// tick sets the clocks: UTC, and local time at the site.
func (s *statusBar) tick() {
	now := s.w.Session.Now()
	txt := "UTC " + now.UTC().Format("15:04:05")
	if st, ok := s.w.Session.Site(); ok {
		loc := st.Location()
		if loc != time.UTC {
			txt += "   local " + now.In(loc).Format("15:04:05 MST")
		}
	}
	s.clocks.SetText(txt)
	s.w.header.strip.setNow(now)
	s.updateJobs()
}

// startClock ticks the clocks every second until stop is called.
func (s *statusBar) startClock() (stop func()) {
	t := time.NewTicker(time.Second)
	done := make(chan struct{})
	go func() {
		for {
			select {
			case <-t.C:
				s.w.opt.Post(s.tick)
			case <-done:
				return
			}
		}
	}()
	return func() { t.Stop(); close(done) }
}

// setProblem shows err as the problem of area ("" and nil clear it).
func (s *statusBar) setProblem(area string, err error) {
	if err == nil {
		delete(s.problems, area)
	} else {
		s.problems[area] = err.Error()
	}
	var keys []string
	for k := range s.problems {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	var msgs []string
	for _, k := range keys {
		msgs = append(msgs, s.problems[k])
	}
	s.problem.SetText(strings.Join(msgs, "; "))
	s.root.Refresh()
}

// updateJobs shows the named running jobs.
func (s *statusBar) updateJobs() {
	running := s.w.Jobs.Running()
	seen := map[string]bool{}
	var objs []fyne.CanvasObject
	for _, j := range running {
		if time.Since(j.Started) < s.showAfter {
			continue
		}
		seen[j.Slot] = true
		r := s.jobs[j.Slot]
		if r == nil {
			r = s.newJobRow(j.Slot)
			s.jobs[j.Slot] = r
		}
		r.name.SetText(j.Name)
		if j.Total > 0 {
			r.bar.SetValue(float64(j.Done) / float64(j.Total))
			r.bar.Show()
			r.spin.Hide()
		} else {
			r.bar.Hide()
			r.spin.Show()
		}
		objs = append(objs, r.box)
	}
	for slot, r := range s.jobs {
		if !seen[slot] {
			r.spin.Stop()
			delete(s.jobs, slot)
		}
	}
	s.jobBox.Objects = objs
	s.root.Refresh() // lay the row out again for the jobs and the clocks
}

func (s *statusBar) newJobRow(slot string) *jobRow {
	r := &jobRow{name: widget.NewLabel(""), bar: widget.NewProgressBar(), spin: widget.NewProgressBarInfinite()}
	r.cancel = widget.NewButtonWithIcon("", theme.CancelIcon(), func() { s.w.Jobs.Cancel(slot) })
	r.cancel.Importance = widget.LowImportance
	bars := container.NewGridWrap(fyne.NewSize(120, r.bar.MinSize().Height), container.NewStack(r.bar, r.spin))
	r.box = container.NewHBox(r.name, container.NewCenter(bars), r.cancel)
	return r
}
