package app

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"math"
	"path/filepath"
	"slices"
	"strings"
	"testing"
	"time"

	"example.org/vigil/app/report"
	"example.org/vigil/ephem"
	"example.org/vigil/internal/demo"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// logTestDate is the night of the Log tests: 1–2 December 2026 (testNow).
var logTestDate = time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)

// logOCTol is the tolerance on an O−C computed from Julian dates near
// 2.46e6: a few ulps of such a date (2.46e6 · 2⁻⁵² ≈ 5e-10 d).
const logOCTol = 1e-8 // days

// logOCShift is the O−C built into the test's timing, days.
const logOCShift = 0.0030

// logPlanned is the planned part of the log of the night of date at site
// for targets, as `vigil log` makes it: report.ForNight under the
// planner's default constraints.
func logPlanned(t *testing.T, site observe.Site, targets []observe.Target, date time.Time) report.NightLog {
	t.Helper()
	p, err := observe.NewPlanner(site, observe.DefaultConstraints())
	if err != nil {
		t.Fatal(err)
	}
	rl, err := report.ForNight(p, targets, date)
	if err != nil {
		t.Fatal(err)
	}
	return rl
}

// logText is the text report.NightLog.WriteText gives for rl.
func logText(t *testing.T, rl report.NightLog) string {
	t.Helper()
	var b bytes.Buffer
	if err := rl.WriteText(&b); err != nil {
		t.Fatal(err)
	}
	return b.String()
}

// logJD is the Julian date (UTC) of 1 or 2 December 2026 at hh:mm UTC
// (the 2nd for hh < 12).
func logJD(t *testing.T, hh, mm int) float64 {
	t.Helper()
	day := 1
	if hh < 12 {
		day = 2
	}
	at, err := ephem.FromTime(time.Date(2026, 12, day, hh, mm, 0, 0, time.UTC))
	if err != nil {
		t.Fatal(err)
	}
	return at.JDUTC()
}

// logMeasurement is a measurement with every number missing (NaN).
func logMeasurement(target string, night int64, jd float64) logbook.Measurement {
	n := math.NaN()
	return logbook.Measurement{Target: target, NightID: night, JDUTC: jd, ExposureS: n, Airmass: n, InstMag: n,
		InstErr: n, Mag: n, MagErr: n, HJD: n, BJDTDB: n}
}

// logRecordedBook returns smallLogbook with a record of the night of
// logTestDate at the demo site: the observer and the rest of the record,
// three measurements of Test Alpha (an ensemble one, a visual one, one not
// yet reduced) and two timings (one with an O−C of logOCShift against the
// star's ephemeris, one on another time scale). It also returns the log
// that night should give, built by hand.
func logRecordedBook(t *testing.T) (*logbook.Logbook, report.NightLog) {
	t.Helper()
	lb := smallLogbook(t)
	site := demo.Site()
	night := logbook.Night{Site: site.Name, Date: logTestDate, Observer: "T. Tester (invented)",
		Equipment: "invented 200 mm reflector", Conditions: "clear, calm", Notes: "test night"}
	id, err := lb.AddNight(night)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		id    string
		check bool
	}{{"C1", false}, {"C2", false}, {"K1", true}} {
		if err := lb.AddComp("Test Alpha", observe.Comp{ID: c.id, V: 10, BV: math.NaN()}, c.check); err != nil {
			t.Fatal(err)
		}
	}
	jd1, jd2, jd3 := logJD(t, 20, 15), logJD(t, 21, 0), logJD(t, 22, 30)
	ensemble := logMeasurement("Test Alpha", id, jd1)
	ensemble.Filter, ensemble.InstMag, ensemble.Mag, ensemble.MagErr = "V", -5.2, 10.512, 0.011
	ensemble.Comps = []logbook.RawMag{{Label: "C1", InstMag: -5.6, InstErr: math.NaN()}, {Label: "C2", InstMag: -5.1, InstErr: math.NaN()}}
	ensemble.Checks = []logbook.RawMag{{Label: "K1", InstMag: -4.9, InstErr: math.NaN()}}
	visual := logMeasurement("Test Alpha", id, jd2)
	visual.Filter, visual.Visual, visual.Mag = "vis", "C1 2 V 3 C2", 10.7
	raw := logMeasurement("Test Alpha", id, jd3)
	raw.Filter, raw.InstMag = "V", -5.0
	if _, err := lb.AddMeasurements([]logbook.Measurement{ensemble, visual, raw}); err != nil {
		t.Fatal(err)
	}
	alpha := smallTargets()[0]
	eph := alpha.Ephemeris
	tOC := eph.Epoch + 3*eph.PeriodDays + logOCShift // cycle 3, observed late by logOCShift
	tHJD := logJD(t, 23, 0)
	for _, tm := range []logbook.Timing{
		{Target: "Test Alpha", JD: tOC, Scale: ephem.BJDTDB, SigmaDays: 0.0012, Kind: observe.Max, Origin: logbook.Own, Method: "poly", NightID: id},
		{Target: "Test Alpha", JD: tHJD, Scale: ephem.HJD, SigmaDays: math.NaN(), Kind: observe.Max, Origin: logbook.Own, Method: "visual", NightID: id},
	} {
		if _, err := lb.AddTiming(tm); err != nil {
			t.Fatal(err)
		}
	}

	want := logPlanned(t, site, smallTargets(), logTestDate)
	want.Observer = night.Observer
	at1, _ := ephem.FromJDUTC(jd1)
	at2, _ := ephem.FromJDUTC(jd2)
	want.Measurements = []report.Measurement{
		{Time: at1, Target: "Test Alpha", Band: "V", Mag: 10.512, MagErr: 0.011, Comp: "C1+C2", Check: "K1"},
		{Time: at2, Target: "Test Alpha", Band: "vis", Mag: 10.7, MagErr: math.NaN(), Comp: "visual: C1 2 V 3 C2"},
	}
	want.Timings = []report.Timing{ // in time order, as the logbook gives them
		{Target: "Test Alpha", Kind: observe.Max, JD: tHJD, Scale: ephem.HJD, SigmaDays: math.NaN(), Method: "visual", OCDays: math.NaN()},
		{Target: "Test Alpha", Kind: observe.Max, JD: tOC, Scale: ephem.BJDTDB, SigmaDays: 0.0012, Method: "poly", OCDays: logOCShift},
	}
	return lb, want
}

// The log of a night without a record is the plan alone: its text is what
// report.NightLog.WriteText gives for the plan of report.ForNight, and it
// names the site, the night and every planned star.
func TestLogPreviewDemoNight(t *testing.T) {
	lb := demoLogbook(t)
	targets, err := lb.Targets()
	if err != nil {
		t.Fatal(err)
	}
	site := demo.Site()
	var steps []int
	lp, err := BuildLogPreview(context.Background(), lb, LogRequest{Site: site, Date: logTestDate},
		func(done, total int) { steps = append(steps, done) })
	if err != nil {
		t.Fatal(err)
	}
	want := logPlanned(t, site, targets, logTestDate)
	if got, w := lp.Text, logText(t, want); got != w {
		t.Errorf("the preview's text differs from WriteText of the same night:\n%s", logFirstDiff(got, w))
	}
	if lp.Record != nil {
		t.Errorf("record %+v for a night the demo does not hold", lp.Record)
	}
	if len(lp.Log.Plan.Events) == 0 {
		t.Fatal("no planned extrema on the demo's night of 1 December 2026")
	}
	for _, s := range []string{"Observing log: " + demo.SiteName, "night of Tue 2026-12-01 to Wed 2026-12-02"} {
		if !strings.Contains(lp.Text, s) {
			t.Errorf("the text lacks %q", s)
		}
	}
	for _, e := range lp.Log.Plan.Events {
		if !strings.Contains(lp.Text, e.Target) {
			t.Errorf("the text lacks the planned star %q", e.Target)
		}
	}
	if want := []int{1, 2, 3, 4}; !slices.Equal(steps, want) {
		t.Errorf("progress steps %v, want %v", steps, want)
	}
	// The page count itself is checked against the file in TestLogPDFPages.
	if lp.PDFPages < 1 || lp.PDFBytes < 1000 {
		t.Errorf("PDF: %d pages, %d bytes", lp.PDFPages, lp.PDFBytes)
	}
	for _, s := range []string{"8 extrema planned of the logbook's 8 stars", "no record of this night yet",
		"PDF: " + plural(lp.PDFPages, "page", "pages") + " on A4"} {
		if !strings.Contains(lp.Summary(), s) {
			t.Errorf("summary %q lacks %q", lp.Summary(), s)
		}
	}
}

// The record of a night goes into the log as `vigil log` puts it: the
// observer, the reduced measurements with their comparison and check
// stars (a visual estimate as written), the unreduced ones left out and
// counted, the timings with their O−C where the ephemeris is on the same
// scale.
func TestLogPreviewRecordedNight(t *testing.T) {
	lb, want := logRecordedBook(t)
	lp, err := BuildLogPreview(context.Background(), lb, LogRequest{Site: demo.Site(), Date: logTestDate, Paper: report.Letter}, nil)
	if err != nil {
		t.Fatal(err)
	}
	want.Paper = report.Letter
	if got, w := lp.Text, logText(t, want); got != w {
		t.Errorf("the preview's text differs from WriteText of the log built by hand:\n%s", logFirstDiff(got, w))
	}
	if got := lp.Counts; got != (report.RecordCounts{Measurements: 2, Unreduced: 1, Timings: 2, OCGiven: 1}) {
		t.Errorf("counts %+v, want 2 measurements, 1 unreduced, 2 timings, 1 with O−C", got)
	}
	if len(lp.Log.Timings) != 2 {
		t.Fatalf("%d timings in the log, want 2", len(lp.Log.Timings))
	}
	if oc := lp.Log.Timings[1].OCDays; math.Abs(oc-logOCShift) > logOCTol {
		t.Errorf("O−C %.10f d, want %.4f d ± %g (built into the timing)", oc, logOCShift, logOCTol)
	}
	if !math.IsNaN(lp.Log.Timings[0].OCDays) {
		t.Errorf("O−C of an HJD timing against a BJD_TDB ephemeris: %v, want none", lp.Log.Timings[0].OCDays)
	}
	fields := lp.RecordFields()
	wantFields := []LogField{{"Observer", "T. Tester (invented)"}, {"Equipment", "invented 200 mm reflector"},
		{"Conditions", "clear, calm"}, {"Notes", "test night"}}
	if len(fields) != len(wantFields) {
		t.Fatalf("record fields %v, want %v", fields, wantFields)
	}
	for i := range fields {
		if fields[i] != wantFields[i] {
			t.Errorf("record field %d: got %v, want %v", i, fields[i], wantFields[i])
		}
	}
	for _, s := range []string{"recorded: 2 measurements (1 not reduced, left out), 2 timings (1 with O−C)", "on US Letter"} {
		if !strings.Contains(lp.Summary(), s) {
			t.Errorf("summary %q lacks %q", lp.Summary(), s)
		}
	}
	if lp.Empty() != "" {
		t.Errorf("a night with a record says it is empty: %q", lp.Empty())
	}
}

// A night with nothing planned or recorded still gives a log, and says so.
func TestLogPreviewEmptyNight(t *testing.T) {
	lb, err := logbook.Create(filepath.Join(t.TempDir(), "empty.db"))
	if err != nil {
		t.Fatal(err)
	}
	defer lb.Close()
	if err := lb.AddSite(demo.Site()); err != nil {
		t.Fatal(err)
	}
	lp, err := BuildLogPreview(context.Background(), lb, LogRequest{Site: demo.Site(), Date: logTestDate}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if got, w := lp.Text, logText(t, logPlanned(t, demo.Site(), nil, logTestDate)); got != w {
		t.Errorf("the empty night's text differs from WriteText:\n%s", logFirstDiff(got, w))
	}
	if !strings.Contains(lp.Empty(), "still prints") || !strings.Contains(lp.Summary(), "No maximum or minimum") {
		t.Errorf("empty night: summary %q, empty %q", lp.Summary(), lp.Empty())
	}
	if lp.PDFPages < 1 {
		t.Errorf("the empty night's PDF has %d pages", lp.PDFPages)
	}
}

func TestLogPreviewCancelled(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	_, err := BuildLogPreview(ctx, smallLogbook(t), LogRequest{Site: demo.Site(), Date: logTestDate}, nil)
	if !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled build: got %v, want context.Canceled", err)
	}
}

// The lines marked as the Sun caution carry every word of the warning, and
// no line left unmarked carries its first words.
func TestLogCautionLines(t *testing.T) {
	rl := logPlanned(t, demo.Site(), smallTargets(), logTestDate)
	if len(rl.Plan.Events) < 2 {
		t.Fatal("too few planned extrema for the test")
	}
	rl.Plan.Events[1].SolarWarning = true
	text := logText(t, rl)
	lines := strings.Split(text, "\n")
	marked := map[int]bool{}
	var got []string
	for _, i := range logCautionLines(text) {
		marked[i] = true
		got = append(got, strings.TrimLeft(lines[i], "! "))
	}
	joined := strings.Join(strings.Fields(strings.Join(got, " ")), " ")
	warning := strings.Join(strings.Fields(observe.SolarWarningText), " ")
	// The box, the table's note and the form's detail: the warning twice.
	if n := strings.Count(joined, warning); n != 2 {
		t.Errorf("the marked lines hold the whole warning %d times, want 2 (box and form):\n%s", n, strings.Join(got, "\n"))
	}
	if !strings.Contains(joined, "SUN CAUTION") {
		t.Error("the table's SUN CAUTION is not marked")
	}
	head := strings.Join(strings.Fields(observe.SolarWarningText)[:4], " ")
	for i, l := range lines {
		if !marked[i] && (strings.Contains(l, head) || strings.HasPrefix(l, "!")) {
			t.Errorf("line %d carries the caution but is not marked: %q", i+1, l)
		}
	}
	if c := logCautionLines(logText(t, logPlanned(t, demo.Site(), smallTargets(), logTestDate))); len(c) != 0 {
		t.Errorf("a log without the caution has %d marked lines", len(c))
	}
}

// logFirstDiff shows where two texts first differ, line by line.
func logFirstDiff(got, want string) string {
	g, w := strings.Split(got, "\n"), strings.Split(want, "\n")
	for i := 0; i < max(len(g), len(w)); i++ {
		var a, b string
		if i < len(g) {
			a = g[i]
		}
		if i < len(w) {
			b = w[i]
		}
		if a != b {
			return fmt.Sprintf("line %d:\n got  %q\n want %q", i+1, a, b)
		}
	}
	return "(same lines)"
}
