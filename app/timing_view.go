package app

import (
	"context"
	"errors"
	"fmt"
	"strings"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// timingNoteHeight is the most height the note of the last change takes
// (it scrolls beyond).
const timingNoteHeight = 80

// timingView is the Timings page: for the selected star, the fit of an
// extremum on a night's light curve, the O−C diagram of its timings with
// their table, and the period search, each on its own tab.
type timingView struct {
	w         *Window
	title     *widget.Label // the star and its ephemeris
	source    *widget.Label // when the ephemeris was adopted, and from what
	sourceBox *container.ThemeOverride
	note      *widget.Label // what the last change to the logbook did
	empty     *widget.Label // shown instead of the tabs with no star
	emptyBox  *container.Scroll
	tabs      *container.AppTabs
	root      fyne.CanvasObject

	fit *timingFitPane
	oc  *timingOCPane
	per *timingPeriodPane

	data    *TimingData // the star on show; nil while none is loaded
	loading string      // the star being read
	confirm *dialog.ConfirmDialog
}

func newTimingPage(w *Window) Page {
	v := &timingView{w: w}
	v.title = widget.NewLabel("")
	v.title.TextStyle.Bold = true
	v.title.Truncation = fyne.TextTruncateEllipsis
	v.source = widget.NewLabel("")
	v.source.Wrapping = fyne.TextWrapWord
	v.sourceBox = quiet(v.source)
	v.source.Hide()
	v.sourceBox.Hide()
	v.note = widget.NewLabel("")
	v.note.Wrapping = fyne.TextWrapWord
	v.note.Importance = widget.SuccessImportance
	v.note.Hide()
	v.empty = widget.NewLabel("")
	v.empty.Wrapping = fyne.TextWrapWord
	v.empty.Alignment = fyne.TextAlignCenter
	v.fit = newTimingFitPane(v)
	v.oc = newTimingOCPane(v)
	v.per = newTimingPeriodPane(v)
	v.tabs = container.NewAppTabs(
		container.NewTabItem("Fit an extremum", v.fit.root),
		container.NewTabItem("O−C diagram", v.oc.root),
		container.NewTabItem("Period search", v.per.root),
	)
	v.tabs.OnSelected = func(*container.TabItem) { v.restyle() }
	// The star and its ephemeris on one line, where the ephemeris came
	// from wrapped under it (a source can be long: a publication).
	head := container.NewVBox(container.New(&timingHeadLayout{}, v.title, v.sourceBox), capHeight(v.note, timingNoteHeight))
	// The empty state sits in a scroller (a wrapped text in a narrow pane
	// keeps a small minimum), hidden whole when the tabs show: a hidden
	// label in a shown scroller would still take the drags meant for the
	// light curve.
	v.emptyBox = container.NewVScroll(container.NewPadded(v.empty))
	v.root = container.NewBorder(head, nil, nil, nil, container.NewStack(v.tabs, v.emptyBox))
	w.Session.OnChange(v.changed)
	w.Jobs.OnChange(v.per.jobsChanged)
	v.showStar()
	return v
}

// Content implements Page.
func (v *timingView) Content() fyne.CanvasObject { return v.root }

// changed follows the session: a new star (or the logbook read again)
// reloads the star's data; a new night moves the fit to it.
func (v *timingView) changed(c Change) {
	switch {
	case c&(ChangedSelection|ChangedTargets|ChangedRecords) != 0:
		v.load()
	case c&(ChangedNight|ChangedSite) != 0:
		v.fit.followNight()
	}
}

// restyle applies the theme again when a tab is brought to the front:
// Fyne restyles only what shows when the theme changes, and a tab hidden
// then would keep some of the old theme's colours (a table's lines, a
// chooser's arrow), which in night red would be bright.
func (v *timingView) restyle() {
	v.w.App.Settings().SetTheme(NewTheme(v.w.Session.Theme()))
}

// load reads the selected star's measurements and timings in a job; the
// work of the star shown before is cancelled when the star changes.
func (v *timingView) load() {
	name := v.w.Session.Selected()
	if v.data == nil || !strings.EqualFold(v.data.Target.Name, name) {
		for _, slot := range []string{timingSlotFit, timingSlotSearch, timingSlotFold, timingSlotOC} {
			v.w.Jobs.Cancel(slot)
		}
		v.data = nil
		v.note.Hide()
	}
	v.loading = name
	if name == "" {
		v.w.Jobs.Cancel(timingSlotLoad)
		v.showStar()
		return
	}
	if v.data == nil {
		v.showStar() // "reading…" until the data arrive
	}
	lb := v.w.Session.Logbook()
	Run(v.w.Jobs, timingSlotLoad, "Reading the star's measurements and timings", func(context.Context, Progress) (*TimingData, error) {
		return LoadTimingData(lb, name)
	}, func(d *TimingData, err error) {
		if errors.Is(err, context.Canceled) || !strings.EqualFold(v.loading, name) {
			return
		}
		if err != nil {
			v.data = nil
			v.empty.SetText(fmt.Sprintf("The measurements and timings of %s cannot be read: %v", name, err))
			v.showEmpty(true)
			return
		}
		same := v.data != nil && strings.EqualFold(v.data.Target.Name, d.Target.Name)
		v.data = d
		v.showStar()
		v.fit.setData(d, same)
		v.oc.setData(d)
		v.per.setData(d, same)
	})
}

// showStar shows the star's name and ephemeris, or what to do with no star.
func (v *timingView) showStar() {
	switch {
	case v.w.Session.Selected() == "":
		msg := "Select a star in the list to time its maxima and minima, follow its O−C diagram and search its period."
		if len(v.w.Session.Targets()) == 0 {
			msg = "No stars yet: add one or import a catalogue, then select it to time its maxima and minima here."
		}
		v.empty.SetText(msg)
		v.showEmpty(true)
	case v.data == nil:
		v.empty.SetText("Reading " + v.w.Session.Selected() + "…")
		v.showEmpty(true)
	default:
		d := v.data
		v.title.SetText(fmt.Sprintf("%s · %s · %s", d.Target.Name, classText(d.Target.Class), TimingEphemerisText(d.Target.Kind, d.Target.Ephemeris)))
		v.source.SetText(TimingSourceText(d.Adopted))
		v.source.Hidden = v.source.Text == ""
		v.sourceBox.Hidden = v.source.Hidden
		v.showEmpty(false)
	}
}

func (v *timingView) showEmpty(empty bool) {
	v.empty.Hidden = !empty
	if empty {
		v.emptyBox.Show()
	} else {
		v.emptyBox.Hide()
	}
	v.tabs.Hidden = empty
	v.title.Hidden = empty
	v.source.Hidden = empty || v.source.Text == ""
	v.sourceBox.Hidden = v.source.Hidden
	v.root.Refresh()
}

// say shows what the last change to the logbook did (or why it failed).
func (v *timingView) say(msg string, err error) {
	v.note.Importance = widget.SuccessImportance
	if err != nil {
		v.note.Importance = widget.DangerImportance
		msg += ": " + err.Error()
	}
	v.note.SetText(msg)
	v.note.Show()
	v.root.Refresh()
}

// askAdopt asks, showing the old and the new elements, before eph is
// adopted as the star's ephemeris from source.
func (v *timingView) askAdopt(eph ephem.Ephemeris, source string) {
	if v.data == nil {
		return
	}
	tg := v.data.Target
	v.confirm = dialog.NewConfirm("Adopt this ephemeris", TimingAdoptMessage(tg, eph, source), func(ok bool) {
		if ok {
			v.adopt(tg, eph, source)
		}
	}, v.w.Win)
	v.confirm.SetConfirmText("Adopt")
	v.confirm.Show()
}

// confirmDelete asks before deleting a timing, then deletes it.
func (v *timingView) confirmDelete(t logbook.Timing) {
	v.confirm = dialog.NewConfirm("Delete a timing", timingDeleteText(t), func(ok bool) {
		if !ok {
			return
		}
		lb := v.w.Session.Logbook()
		Run(v.w.Jobs, timingSlotWrite, "Deleting the timing", func(context.Context, Progress) (struct{}, error) {
			return struct{}{}, lb.DeleteTiming(t.ID)
		}, func(_ struct{}, err error) {
			if err != nil {
				v.say("The timing was not deleted", err)
				return
			}
			v.say(fmt.Sprintf("Deleted the timing at %s %.5f.", t.Scale.Label(), t.JD), nil)
			v.w.Reload()
		})
	}, v.w.Win)
	v.confirm.SetConfirmText("Delete")
	v.confirm.Show()
}

// adopt stores eph as the star's current ephemeris (the old one stays in
// its history) and reads the logbook again, so that the planner predicts
// from it.
func (v *timingView) adopt(tg observe.Target, eph ephem.Ephemeris, source string) {
	lb, name := v.w.Session.Logbook(), tg.Name
	Run(v.w.Jobs, timingSlotWrite, "Adopting the ephemeris", func(context.Context, Progress) (struct{}, error) {
		return struct{}{}, lb.AdoptEphemeris(name, eph, source)
	}, func(_ struct{}, err error) {
		if err != nil {
			v.say("The ephemeris was not adopted", err)
			return
		}
		v.say(fmt.Sprintf("Adopted for %s: %s. The planner now predicts from it; the old one stays in the star's history.",
			name, TimingEphemerisText(tg.Kind, eph)), nil)
		v.w.Reload()
	})
}

// TimingSourceText says when the star's current ephemeris was adopted and
// from what, "" when the logbook does not know.
func TimingSourceText(a logbook.AdoptedEphemeris) string {
	switch {
	case a.Adopted.IsZero() && a.Source == "":
		return ""
	case a.Adopted.IsZero():
		return "Ephemeris from " + a.Source
	case a.Source == "":
		return "Ephemeris adopted " + a.Adopted.Format(time.DateOnly)
	}
	return fmt.Sprintf("Ephemeris adopted %s from %s", a.Adopted.Format(time.DateOnly), a.Source)
}

// timingHeadLayout stacks the title and the source line closer than a
// VBox would (they read as one heading).
type timingHeadLayout struct{}

func (timingHeadLayout) MinSize(objs []fyne.CanvasObject) fyne.Size {
	var s fyne.Size
	for _, o := range objs {
		if o.Visible() {
			m := o.MinSize()
			s.Width = max(s.Width, m.Width)
			s.Height += m.Height
		}
	}
	if len(objs) == 2 && objs[0].Visible() && objs[1].Visible() {
		s.Height -= theme.InnerPadding()
	}
	return s
}

func (timingHeadLayout) Layout(objs []fyne.CanvasObject, size fyne.Size) {
	y := float32(0)
	for i, o := range objs {
		if !o.Visible() {
			continue
		}
		if i > 0 && y > 0 {
			y -= theme.InnerPadding()
		}
		o.Resize(fyne.NewSize(size.Width, o.Size().Height)) // a wrapped text's height follows its width
		h := o.MinSize().Height
		o.Move(fyne.NewPos(0, y))
		o.Resize(fyne.NewSize(size.Width, h))
		y += h
	}
}

// timingSized gives obj a fixed width (and its own height).
func timingSized(obj fyne.CanvasObject, width float32) fyne.CanvasObject {
	return container.NewGridWrap(fyne.NewSize(width, obj.MinSize().Height), obj)
}

// timingBold is a label in bold.
func timingBold(s string) *widget.Label {
	return widget.NewLabelWithStyle(s, fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
}

// timingErrLabel is a label for the error of one field, hidden until set.
func timingErrLabel() *widget.Label {
	l := widget.NewLabel("")
	l.Importance = widget.DangerImportance
	l.Wrapping = fyne.TextWrapWord
	l.Hide()
	return l
}

// timingSetErr shows msg under a field, or hides the label when msg is "".
func timingSetErr(l *widget.Label, msg string) {
	l.SetText(msg)
	l.Hidden = msg == ""
	l.Refresh()
}

// ShotViews implements shotViews: the O−C diagram and the period search
// (run on the default range, its best peak folded), besides the fit of an
// extremum the page opens on.
func (v *timingView) ShotViews() []ShotView {
	return []ShotView{
		{Slug: "oc", Show: func() { v.tabs.SelectIndex(1) }},
		{Slug: "period", Show: func() {
			// a search of the default range, run once for all themes
			v.tabs.SelectIndex(2)
			if v.per.result == nil && !v.per.search.Disabled() {
				v.per.start()
			}
		}, Then: func() {
			// the best peak picked and the light curve folded on it
			if v.per.result != nil && v.per.peakCount() > 0 && v.per.peak < 0 {
				v.per.peaks.Select(widget.TableCellID{Row: 0, Col: 1})
				if !v.per.fold.Disabled() {
					v.per.foldOn()
				}
			}
		}},
	}
}

// ShotViewsDone implements shotViews: back to the fit of an extremum.
func (v *timingView) ShotViewsDone() { v.tabs.SelectIndex(0) }
