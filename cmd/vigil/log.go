package main

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"time"

	"example.org/vigil/app/report"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

var logCommand = command{
	name:    "log",
	summary: "the observing log of one night from the logbook, as PDF or plain text",
	run:     runLog,
}

// logResponse is the answer of vigil log with --json.
type logResponse struct {
	Out            string `json:"out"`             // the file written
	Format         string `json:"format"`          // pdf or txt
	Paper          string `json:"paper,omitempty"` // A4 or Letter, for a PDF
	Logbook        string `json:"logbook"`         // the logbook read
	LogbookCreated bool   `json:"logbook_created"` // made by this run, with the demo scenario
	Site           string `json:"site"`            // the site's name
	SiteChoice     string `json:"site_choice"`     // site (named by --site), only or first (of the logbook's sites)
	Date           string `json:"date"`            // the date the night begins on
	Targets        int    `json:"targets"`         // the logbook's targets, planned
	Events         int    `json:"events"`          // planned extrema in the log
	NightRecorded  bool   `json:"night_recorded"`  // the logbook holds a record of the night
	Observer       string `json:"observer"`        // from the record, "" when none
	Measurements   int    `json:"measurements"`    // in the log
	Unreduced      int    `json:"unreduced"`       // measurements without a reduced magnitude, left out
	Timings        int    `json:"timings"`         // in the log
	OCGiven        int    `json:"oc_given"`        // timings with an O−C against the current ephemeris
	SiteInLogbook  bool   `json:"site_in_logbook"` // false for the demo site when the logbook no longer holds it
}

// logAbout is the description of vigil log.
const logAbout = `The observing log of one night at a site of the logbook, written as a PDF
(A4 or US Letter) when --out ends in .pdf, or as plain text with the same
content in aligned columns when it ends in .txt. The log holds the site, the
night's twilights and Moon, the predicted extrema of the logbook's targets
(each with its current ephemeris) planned under the default constraints (the
Sun below -12°, the star above the site's lowest altitude and clear of its
horizon profile, 15° from the Moon while it is up, a coverage window of ±0.1 P
up to ±3 h), the altitude chart (PDF; hourly altitudes in the text), ruled
lines for notes, and what the logbook records of that night: the observer, the
reduced measurements (unreduced ones are left out and counted) and the
timings, each with its O−C against the target's current ephemeris when both
are on the same time scale and mark the same kind of extremum.
The site is --site, or else the logbook's only site, or the first of its
sites in order of name; the output says which. The file is written whole or
not at all. With --json: {out, format, paper, logbook, logbook_created, site,
site_choice, date, targets, events, night_recorded, observer, measurements,
unreduced, timings, oc_given, site_in_logbook}.`

func runLog(e *env, args []string) error {
	f := newFlags(e.cmd,
		"--date YYYY-MM-DD|tonight [--site NAME] [--logbook PATH] --out FILE.pdf|FILE.txt [--paper a4|letter] [--json]",
		logAbout)
	dateText := f.required("date", "YYYY-MM-DD", "the date the night begins on, or tonight: the site's local date, the day before until local noon")
	siteName := f.value("site", "NAME", "", "a site of the logbook: its name, in any case, or a part of it that only one site's name contains; demo is the demo site", "optional; default the logbook's only or first site")
	book := addLogbookFlag(e, f)
	outText := f.required("out", "FILE", "the file to write: FILE.pdf for a PDF, FILE.txt for plain text")
	paperText := f.value("paper", "a4|letter", "a4", "page size of the PDF: a4 or letter (US Letter)", "")
	asJSON := f.toggle("json", "print one JSON object instead of a summary")
	if err := f.parse(args, e.stdout); err != nil {
		return err
	}

	// The output first: a bad name fails before the logbook is opened.
	out, err := get(f, "out", *outText, parseLogOut)
	if err != nil {
		return err
	}
	format := logFormat(out)
	paper, err := get(f, "paper", *paperText, parsePaper)
	if err != nil {
		return err
	}
	if f.given("paper") && format != "pdf" {
		return &flagError{flag: "paper", err: fmt.Errorf("applies to a PDF only: --out %q is plain text", out)}
	}
	if f.given("site") && strings.TrimSpace(*siteName) == "" {
		return &flagError{flag: "site", err: fmt.Errorf("empty value: want the name of a site of the logbook, or %s", demoSiteAlias)}
	}

	lb, err := book.open()
	if err != nil {
		return err
	}
	var site observe.Site
	choice, which := "site", ""
	if f.given("site") {
		site, err = findSite(lb, strings.TrimSpace(*siteName))
	} else {
		var n int
		site, n, err = defaultSite(lb)
		choice, which = "first", whichSite(n)
		if n == 1 {
			choice = "only"
		}
	}
	if err != nil {
		return err
	}
	obs := placeObserver(site)
	date, err := get(f, "date", *dateText, parseDateFlag(e.now, obs))
	if err != nil {
		return err
	}
	targets, err := lb.Targets()
	if err != nil {
		return fmt.Errorf("reading the targets of the logbook %q: %w", lb.Path(), err)
	}
	p, err := observe.NewPlanner(site, observe.DefaultConstraints())
	if err != nil {
		return fmt.Errorf("the site %q of the logbook %q: %w", site.Name, lb.Path(), err)
	}
	rl, err := report.ForNight(p, targets, date)
	if err != nil {
		return &flagError{flag: "date", err: fmt.Errorf("%q: %w", *dateText, err)}
	}
	rl.Paper = paper

	resp := logResponse{Out: out, Format: format, Logbook: lb.Path(), LogbookCreated: book.created,
		Site: site.Name, SiteChoice: choice, Date: date.Format(time.DateOnly),
		Targets: len(targets), Events: len(rl.Plan.Events)}
	if format == "pdf" {
		resp.Paper = paper.String()
	}
	resp.SiteInLogbook = true
	if _, err := lb.Site(site.Name); errors.Is(err, logbook.ErrNotFound) {
		resp.SiteInLogbook = false
	}
	nl, err := lb.NightLog(site.Name, date)
	switch {
	case errors.Is(err, logbook.ErrNotFound):
		// No record of that night: the log is the plan alone.
	case err != nil:
		return fmt.Errorf("reading the night of %s at %q from the logbook %q: %w", resp.Date, site.Name, lb.Path(), err)
	default:
		resp.NightRecorded = true
		c := rl.AddRecord(nl, targets)
		resp.Observer = nl.Night.Observer
		resp.Measurements, resp.Unreduced, resp.Timings, resp.OCGiven = c.Measurements, c.Unreduced, c.Timings, c.OCGiven
	}

	if err := rl.Validate(); err != nil {
		return fmt.Errorf("the night of %s at %q: %w", resp.Date, site.Name, err)
	}
	if err := rl.Write(out); err != nil {
		return &flagError{flag: "out", err: err}
	}
	if *asJSON {
		return writeJSON(e.stdout, resp)
	}
	writeLogSummary(e, resp, which)
	return nil
}

// writeLogSummary says what vigil log wrote, for people.
func writeLogSummary(e *env, r logResponse, which string) {
	w := e.stdout
	d, _ := time.Parse(time.DateOnly, r.Date)
	kind := "plain text"
	if r.Format == "pdf" {
		kind = "PDF, " + r.Paper
	}
	fmt.Fprintf(w, "Wrote the observing log of the night of %s at %s to %s (%s).\n", d.Format("Monday 2 January 2006"), r.Site, r.Out, kind)
	switch {
	case which != "":
		fmt.Fprintf(w, "Site: %s, %s.\n", r.Site, which)
	case !r.SiteInLogbook:
		fmt.Fprintf(w, "Site: the demo site, which the logbook no longer holds.\n")
	}
	fmt.Fprintf(w, "Planned: %s of the logbook's %s.\n", count(r.Events, "extremum", "extrema"), count(r.Targets, "target", "targets"))
	if !r.NightRecorded {
		fmt.Fprintln(w, "The logbook holds no record of this night: the log has the plan and empty forms.")
	} else {
		observer := r.Observer
		if observer == "" {
			observer = "not named"
		}
		fmt.Fprintf(w, "Recorded: observer %s; %s", observer, count(r.Measurements, "measurement", "measurements"))
		if r.Unreduced > 0 {
			fmt.Fprintf(w, " (%d not yet reduced, left out)", r.Unreduced)
		}
		fmt.Fprintf(w, "; %s (%d with O−C).\n", count(r.Timings, "timing", "timings"), r.OCGiven)
	}
	created := ""
	if r.LogbookCreated {
		created = ", created now with the demo scenario"
	}
	fmt.Fprintf(w, "Logbook: %s%s.\n", r.Logbook, created)
}

// count writes n with the noun in the singular or plural.
func count(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return fmt.Sprintf("%d %s", n, many)
}

// logFormat is the format a file name asks for: pdf or txt, or "".
func logFormat(path string) string {
	switch ext := strings.ToLower(filepath.Ext(path)); ext {
	case ".pdf", ".txt":
		return ext[1:]
	}
	return ""
}

// parseLogOut checks the name of the log file: its extension says the
// format, and its directory must exist.
func parseLogOut(s string) (string, error) {
	if strings.TrimSpace(s) == "" {
		return "", fmt.Errorf("empty value: want a file name ending in .pdf or .txt")
	}
	if logFormat(s) == "" {
		return "", fmt.Errorf("%q: the extension %q names no format: want .pdf (a PDF) or .txt (plain text)", s, filepath.Ext(s))
	}
	if base := filepath.Base(s); strings.HasPrefix(base, ".") && strings.Count(base, ".") == 1 {
		return "", fmt.Errorf("%q: want a file name before the extension, such as night%s", s, filepath.Ext(s))
	}
	if fi, err := os.Stat(filepath.Dir(s)); err != nil || !fi.IsDir() {
		return "", fmt.Errorf("%q: the directory %q does not exist: want a file in an existing directory", s, filepath.Dir(s))
	}
	if fi, err := os.Stat(s); err == nil && fi.IsDir() {
		return "", fmt.Errorf("%q is a directory: want a file name ending in .pdf or .txt", s)
	}
	return s, nil
}

// parsePaper reads --paper.
func parsePaper(s string) (report.Paper, error) {
	p, err := report.ParsePaper(s)
	if err != nil {
		return 0, fmt.Errorf("%q: want a4 or letter", s)
	}
	return p, nil
}
