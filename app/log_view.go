package app

import (
	"context"
	"errors"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/app/chart"
	"example.org/vigil/app/report"
	"example.org/vigil/observe"
)

// Log page texts that the tests look for.
const (
	logRecordHint = "(read only: edit it on the Measurements page)"
	logNoRecord   = "No record of this night in the logbook yet: start one on the Measurements page " +
		"(observer, equipment, conditions, notes), and its observer prints in the log."
	logNoSite = "This logbook has no observing site yet, so there is no night to log. Import a sites.csv " +
		"giving the site's latitude, longitude (east positive), time zone and lowest useful altitude."
)

// logTopTextHeight is the most height the texts above the log take.
const logTopTextHeight = 190

// logPapers are the page sizes offered, in the order shown.
var logPapers = []report.Paper{report.A4, report.Letter}

// logView is the Log page: the night's observing log as it prints, in
// plain text; the altitude chart it carries; the logbook's record of the
// night (read only); and the buttons that save it as PDF or text and print
// it.
type logView struct {
	w       *Window
	paper   report.Paper
	printer LogPrinter // replaced by tests

	preview *LogPreview // the log on show; nil when there is none
	stale   bool        // the log on show is not that of the session's night

	savePDF, saveText, print *widget.Button
	paperChoice              *widget.RadioGroup
	status                   *widget.Label // what was done last, or what is being done
	summary                  *widget.Label
	caution                  *widget.Label
	empty                    *widget.Label
	record                   *widget.RichText // observer, equipment, conditions, notes
	recordNote               *widget.Label
	text                     *widget.TextGrid // the text on show
	textBox                  *container.ThemeOverride
	chart                    *ChartView
	views                    *container.AppTabs // the text, or the chart
	top                      *fyne.Container
	topText                  *capBox // the texts above the log
	root                     *fyne.Container

	saveAsked bool      // Ctrl+S came while the log was being prepared
	lastDir   string    // the folder of the last save
	notice    logNotice // the last message shown in a dialog
	dlg       logDialog // the dialog on show, if any
}

func newLogPage(w *Window) Page {
	v := &logView{w: w, printer: NewLogPrinter(), stale: true}
	v.savePDF = widget.NewButtonWithIcon("Save as PDF…", theme.DocumentSaveIcon(), func() { v.askSave("pdf") })
	v.savePDF.Importance = widget.HighImportance
	v.saveText = widget.NewButtonWithIcon("Save as text…", theme.FileTextIcon(), func() { v.askSave("txt") })
	v.print = widget.NewButtonWithIcon("Print…", theme.DocumentPrintIcon(), v.askPrint)
	var names []string
	for _, p := range logPapers {
		names = append(names, logPaperName(p))
	}
	v.paperChoice = widget.NewRadioGroup(names, v.paperChosen)
	v.paperChoice.Horizontal = true
	v.paperChoice.Required = true
	v.paperChoice.SetSelected(logPaperName(v.paper))
	v.status = widget.NewLabel("")
	v.status.Truncation = fyne.TextTruncateEllipsis

	v.summary = widget.NewLabel("")
	v.summary.Wrapping = fyne.TextWrapWord
	v.caution = newSunCaution("")
	v.empty = widget.NewLabel("")
	v.empty.Wrapping = fyne.TextWrapWord
	v.empty.Hide()
	v.record = widget.NewRichText()
	v.record.Wrapping = fyne.TextWrapWord
	v.recordNote = widget.NewLabel("")
	v.recordNote.Wrapping = fyne.TextWrapWord

	v.text = logNewGrid()
	v.textBox = container.NewThemeOverride(v.text, logSmallText{})
	v.chart = w.NewChartView()

	tools := container.NewHBox(v.savePDF, v.saveText, v.print, widget.NewSeparator(),
		widget.NewLabel("Paper:"), v.paperChoice)
	// The texts above the log, at most logTopTextHeight high: the night's
	// notes may run long, and the page must fit the screen.
	v.topText = capHeight(container.NewVBox(v.summary, v.caution, v.empty, v.record, v.recordNote), logTopTextHeight)
	v.top = container.NewVBox(container.NewBorder(nil, nil, tools, nil, v.status), v.topText)
	// The text and the chart take turns in the page's whole width and
	// height: the text's lines then show whole, and so does the chart's
	// time axis.
	v.views = container.NewAppTabs(
		// A margin on the left, so that the text does not touch the edge.
		container.NewTabItem("The log as it prints (text)", container.New(layout.NewCustomPaddedLayout(0, 0, theme.InnerPadding(), 0), v.textBox)),
		container.NewTabItem("Its altitude chart (page 1 of the PDF)", v.chart))
	v.root = container.NewBorder(v.top, nil, nil, nil, v.views)

	w.Session.OnChange(v.changed)
	w.AddKey("log", keySaveLog, KeyAnywhere, v.saveShortcut)
	v.show()
	return v
}

// Content implements Page.
func (v *logView) Content() fyne.CanvasObject { return v.root }

// Shown builds the log when it is out of date, and takes the keyboard from
// any entry so that Ctrl+S reaches the window.
func (v *logView) Shown() {
	v.w.Win.Canvas().Unfocus()
	if v.stale {
		v.rebuild()
	}
}

// onFront reports whether the Log page is the page in front.
func (v *logView) onFront() bool {
	sel := v.w.tabs.Selected()
	return sel != nil && sel.Content == v.root
}

// changed marks the log out of date when the site, the night or the
// logbook changed, and builds it again when the page is in front.
func (v *logView) changed(c Change) {
	if c&(ChangedSite|ChangedSites|ChangedNight|ChangedTargets|ChangedRecords) == 0 {
		return
	}
	v.stale = true
	v.preview = nil
	v.w.Jobs.Cancel("log")
	if v.onFront() {
		v.rebuild()
	} else {
		v.show()
	}
}

// paperChosen builds the log again on the chosen paper.
func (v *logView) paperChosen(name string) {
	for _, p := range logPapers {
		if logPaperName(p) == name && p != v.paper {
			v.paper = p
			v.stale = true
			v.preview = nil
			v.rebuild()
		}
	}
}

// rebuild builds the log of the session's night in the "log" job.
func (v *logView) rebuild() {
	s := v.w.Session
	site, ok := s.Site()
	v.preview = nil
	if !ok {
		v.stale = false
		v.w.Jobs.Cancel("log")
		v.show()
		return
	}
	r := LogRequest{Site: site, Date: s.Date(), Paper: v.paper}
	lb := s.Logbook()
	v.stale = false
	v.show()
	Run(v.w.Jobs, "log", "Preparing the observing log", func(ctx context.Context, p Progress) (*LogPreview, error) {
		return BuildLogPreview(ctx, lb, r, p)
	}, func(lp *LogPreview, err error) {
		switch {
		case errors.Is(err, context.Canceled):
			v.stale = true
			v.status.SetText("Preparing the log was cancelled: step to another night, or come back to this page, to prepare it again.")
		case err != nil:
			v.status.SetText("")
			v.showProblem(err)
		default:
			v.preview = lp
			v.status.SetText("")
			v.show()
			if v.saveAsked && v.onFront() {
				v.askSave("pdf")
			}
		}
		v.saveAsked = false
	})
}

// show puts the log on show (or what stands in for it) into the widgets.
func (v *logView) show() {
	lp := v.preview
	_, hasSite := v.w.Session.Site()
	for _, b := range []*widget.Button{v.savePDF, v.saveText, v.print} {
		if lp == nil {
			b.Disable()
		} else {
			b.Enable()
		}
	}
	v.caution.Hide()
	v.empty.Hide()
	defer v.relayout()
	if lp == nil {
		v.setText("", nil)
		v.showRecord(nil)
		switch {
		case !hasSite:
			v.summary.SetText(logNoSite)
			v.chart.SetEmpty("The altitude chart of the log shows here once the logbook has a site.")
		default:
			v.summary.SetText("Preparing the observing log of the " + logNightWords(v.w.Session.Date()) + "…")
			v.chart.SetEmpty("The altitude chart of the log shows here once the log is ready.")
		}
		return
	}
	v.summary.SetText(lp.Summary())
	if e := lp.Empty(); e != "" {
		v.empty.SetText(e)
		v.empty.Show()
	}
	if len(lp.Cautions) > 0 {
		v.caution.SetText("Sun caution in this log (marked in the text below): " + observe.SolarWarningText)
		v.caution.Show()
	}
	v.setText(lp.Text, lp.Cautions)
	v.showRecord(lp)
	if lp.Log.Chart == nil {
		v.chart.SetEmpty("This log has no altitude chart.")
	} else {
		c := *lp.Log.Chart
		v.chart.SetSource(func(ctx context.Context, pal chart.Palette) (Drawable, error) { return chart.Altitude(c, pal) })
	}
}

// relayout lays the page out again after its texts changed (shown,
// hidden, rewrapped), without refreshing every widget in it.
func (v *logView) relayout() {
	v.root.Layout.Layout(v.root.Objects, v.root.Size())
	v.top.Layout.Layout(v.top.Objects, v.top.Size())
	v.topText.relayout()
}

// setText shows text in the text grid, scrolled to the top, with the
// caution rows marked.
func (v *logView) setText(text string, cautions []int) {
	if text == v.text.Text() && len(cautions) == 0 {
		return
	}
	v.text.SetText(text) // clears the styles of the rows too
	for _, row := range cautions {
		v.text.SetRowStyle(row, logCautionStyle{})
	}
	// A grid that has been laid out has its scroller (ScrollToTop needs it).
	if v.text.Size().Height > 0 {
		v.text.ScrollToTop()
	}
}

// showProblem says why the log cannot be made.
func (v *logView) showProblem(err error) {
	v.preview = nil
	v.show()
	v.summary.SetText("The observing log of this night cannot be made: " + err.Error())
	v.relayout()
	v.chart.SetEmpty("No log, so no chart.")
}

// showRecord shows the record of the night, read only.
func (v *logView) showRecord(lp *LogPreview) {
	v.record.Segments = nil
	switch {
	case lp == nil:
		v.recordNote.SetText("")
	case lp.Record == nil:
		v.recordNote.SetText(logNoRecord)
	default:
		v.recordNote.SetText("")
		// Two fields a line: observer and equipment, conditions and notes.
		for i, f := range lp.RecordFields() {
			value := widget.TextSegment{Text: f.Value + "     ", Style: widget.RichTextStyleInline}
			if i%2 == 1 { // the hint goes on a line of its own after the notes
				value.Style = widget.RichTextStyleParagraph
			}
			v.record.Segments = append(v.record.Segments,
				&widget.TextSegment{Text: f.Name + ": ", Style: widget.RichTextStyle{Inline: true, TextStyle: fyne.TextStyle{Bold: true}}},
				&value)
		}
		v.record.Segments = append(v.record.Segments, &widget.TextSegment{Text: logRecordHint,
			Style: widget.RichTextStyle{Inline: true, ColorName: theme.ColorNamePlaceHolder, TextStyle: fyne.TextStyle{Italic: true}}})
	}
	v.record.Hidden = len(v.record.Segments) == 0
	v.recordNote.Hidden = v.recordNote.Text == ""
	v.record.Refresh()
}
