package app

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"strings"
	"time"

	"example.org/vigil/app/report"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// LogRequest is what the observing log of one night needs: the site, the
// civil date the night begins on, and the page size of its PDF.
type LogRequest struct {
	Site  observe.Site
	Date  time.Time // 0h UTC of the date
	Paper report.Paper
}

// LogPreview is the observing log of one night as the Log page shows it:
// the log itself (ready to write), its plain text, where the Sun caution
// stands in that text, the size of its PDF, and the logbook's record of
// the night.
type LogPreview struct {
	Request LogRequest
	Log     report.NightLog
	// Text is the log as report.NightLog.WriteText writes it.
	Text string
	// Cautions are the lines of Text (from 0) that carry the Sun caution.
	Cautions []int
	// PDFPages and PDFBytes describe the PDF on Request.Paper.
	PDFPages, PDFBytes int
	// Record is the logbook's record of the night (observer, equipment,
	// conditions, notes); nil when the logbook holds none.
	Record  *logbook.Night
	Counts  report.RecordCounts
	Targets int // the logbook's targets, all planned
}

// LogSteps is how many steps BuildLogPreview reports through its progress.
const LogSteps = 4

// BuildLogPreview makes the observing log of the night of r.Date at r.Site
// as `vigil log` does: the logbook's targets planned by report.ForNight
// under observe.DefaultConstraints, then the logbook's record of that
// night, if any (report.NightLog.AddRecord). It writes the log as text and as a PDF in
// memory (the PDF for its page count, and so that a log that cannot be
// made fails here rather than when saved). It reads the logbook: run it in
// a job. It gives up with ctx's error when ctx is cancelled between steps.
func BuildLogPreview(ctx context.Context, lb *logbook.Logbook, r LogRequest, progress Progress) (*LogPreview, error) {
	if progress == nil {
		progress = func(int, int) {}
	}
	day := r.Date.Format(time.DateOnly)
	targets, err := lb.Targets()
	if err != nil {
		return nil, fmt.Errorf("reading the targets of the logbook %q: %w", lb.Path(), err)
	}
	p, err := observe.NewPlanner(r.Site, observe.DefaultConstraints())
	if err != nil {
		return nil, fmt.Errorf("the site %q: %w", r.Site.Name, err)
	}
	rl, err := report.ForNight(p, targets, r.Date)
	if err != nil {
		return nil, fmt.Errorf("the night of %s at %q: %w", day, r.Site.Name, logPlain(err))
	}
	rl.Paper = r.Paper
	lp := &LogPreview{Request: r, Targets: len(targets)}
	progress(1, LogSteps)
	if err := ctx.Err(); err != nil {
		return nil, err
	}

	nl, err := lb.NightLog(r.Site.Name, r.Date)
	switch {
	case errors.Is(err, logbook.ErrNotFound):
		// No record of that night: the log is the plan alone.
	case err != nil:
		return nil, fmt.Errorf("reading the night of %s at %q from the logbook %q: %w", day, r.Site.Name, lb.Path(), err)
	default:
		night := nl.Night
		lp.Record = &night
		lp.Counts = rl.AddRecord(nl, targets)
	}
	if err := rl.Validate(); err != nil {
		return nil, fmt.Errorf("the night of %s at %q: %w", day, r.Site.Name, logPlain(err))
	}
	lp.Log = rl
	progress(2, LogSteps)

	var buf bytes.Buffer
	if err := rl.WriteText(&buf); err != nil {
		return nil, logPlain(err)
	}
	lp.Text = buf.String()
	lp.Cautions = logCautionLines(lp.Text)
	progress(3, LogSteps)
	if err := ctx.Err(); err != nil {
		return nil, err
	}

	buf.Reset()
	if err := rl.WritePDF(&buf); err != nil {
		return nil, logPlain(err)
	}
	lp.PDFBytes = buf.Len()
	lp.PDFPages = logPDFPages(buf.Bytes())
	progress(4, LogSteps)
	return lp, ctx.Err()
}

// logPlain drops the package prefix "report: " from an error of
// app/report, leaving the plain words.
func logPlain(err error) error {
	if err == nil {
		return nil
	}
	if s, ok := strings.CutPrefix(err.Error(), "report: "); ok {
		return errors.New(s)
	}
	return err
}

// logCautionLines returns the lines of the text log (from 0) that carry the
// Sun caution: its boxed notices (lines beginning "!"), the "SUN CAUTION"
// of the table of planned extrema, and the lines over which a form's
// detail wraps observe.SolarWarningText.
func logCautionLines(text string) []int {
	words := strings.Fields(observe.SolarWarningText)
	first, last := words[0], words[len(words)-1]
	var out []int
	inWarning := false // within a wrapped warning, after its first line
	for i, line := range strings.Split(text, "\n") {
		rest := line
		if !inWarning {
			_, after, found := strings.Cut(line, first)
			if !found {
				if strings.HasPrefix(line, "!") || strings.Contains(line, "SUN CAUTION") {
					out = append(out, i)
				}
				continue
			}
			rest = after
		}
		out = append(out, i)
		inWarning = !strings.Contains(rest, last) && strings.TrimSpace(line) != ""
	}
	return out
}

// Summary says in one line what the log holds: the planned extrema, what
// the logbook records of the night, and the size of the PDF. An empty
// night says that its log still prints.
func (lp *LogPreview) Summary() string {
	events := len(lp.Log.Plan.Events)
	var parts []string
	if events == 0 {
		parts = append(parts, fmt.Sprintf("No maximum or minimum of the logbook's %s falls in this night", plural(lp.Targets, "star", "stars")))
	} else {
		parts = append(parts, fmt.Sprintf("%s planned of the logbook's %s", plural(events, "extremum", "extrema"), plural(lp.Targets, "star", "stars")))
	}
	if lp.Record == nil {
		parts = append(parts, "no record of this night yet")
	} else {
		rec := fmt.Sprintf("recorded: %s", plural(lp.Counts.Measurements, "measurement", "measurements"))
		if lp.Counts.Unreduced > 0 {
			rec += fmt.Sprintf(" (%d not reduced, left out)", lp.Counts.Unreduced)
		}
		rec += fmt.Sprintf(", %s", plural(lp.Counts.Timings, "timing", "timings"))
		if lp.Counts.Timings > 0 {
			rec += fmt.Sprintf(" (%d with O−C)", lp.Counts.OCGiven)
		}
		parts = append(parts, rec)
	}
	pdf := fmt.Sprintf("PDF: %s on %s, %s", plural(lp.PDFPages, "page", "pages"), logPaperName(lp.Request.Paper), logKB(lp.PDFBytes))
	return strings.Join(parts, " · ") + " · " + pdf
}

// Empty says what an empty log still gives, "" when the log holds planned
// extrema or a record of the night.
func (lp *LogPreview) Empty() string {
	if len(lp.Log.Plan.Events) > 0 || (lp.Record != nil && lp.Counts.Measurements+lp.Counts.Timings > 0) {
		return ""
	}
	return "Nothing is planned or recorded for this night, but its log still prints: the site, the twilights " +
		"and the Moon, and blank forms to fill in at the eyepiece."
}

// LogField is one field of the night's record as the Log page shows it.
type LogField struct{ Name, Value string }

// RecordFields returns the logbook's record of the night: observer,
// equipment, conditions and notes, "—" for an empty one; nil when the
// logbook holds no record.
func (lp *LogPreview) RecordFields() []LogField {
	if lp.Record == nil {
		return nil
	}
	r := lp.Record
	out := []LogField{{"Observer", r.Observer}, {"Equipment", r.Equipment}, {"Conditions", r.Conditions}, {"Notes", r.Notes}}
	for i := range out {
		out[i].Value = strings.Join(strings.Fields(out[i].Value), " ")
		if out[i].Value == "" {
			out[i].Value = "—"
		}
	}
	return out
}
