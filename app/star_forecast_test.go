package app

import (
	"context"
	"math"
	"strings"
	"testing"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/demo"
	"example.org/vigil/observe"
	"example.org/vigil/reduce"
)

func TestStarForecast(t *testing.T) {
	site := demo.Site()
	tg := smallTargets()[0] // P = 0.37 d: two or three maxima a day
	date := time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)
	d, err := ForecastStar(context.Background(), site, tg, date, 14)
	if err != nil {
		t.Fatal(err)
	}
	if len(d.Plans) != 14 || d.Next != nil {
		t.Fatalf("plans: %d (next %v), want 14 and no next", len(d.Plans), d.Next)
	}
	all := BuildStarForecast(d, true)
	some := BuildStarForecast(d, false)
	var total, usable, whole int
	for _, n := range d.Plans {
		for _, e := range n.Events {
			total++
			if e.Window.UsableFraction > 0 {
				usable++
			}
			if e.Window.Whole {
				whole++
			}
		}
	}
	// 14 nights of a 0.37 d star: about 14/0.37 = 38 maxima.
	if total < 30 || len(all.Rows) != total || len(some.Rows) != usable || some.Hidden != total-usable {
		t.Errorf("rows: all %d, usable %d (hidden %d); events %d, usable %d", len(all.Rows), len(some.Rows), some.Hidden, total, usable)
	}
	if !strings.Contains(some.Summary, "In the 14 nights from Tue 1 Dec 2026 at "+site.Name) ||
		!strings.Contains(some.Summary, "whole") {
		t.Errorf("summary: %q", some.Summary)
	}
	// σ = √(σT0² + (E·σP)²) (ephem.Ephemeris.Sigma; Sterken 2005), shown
	// in the ± σ column, growing with E.
	e0 := tg.Ephemeris
	prev := 0.0
	for i, r := range all.Rows {
		e := r.Event
		want := math.Hypot(e0.EpochErr, e.Cycle*e0.PeriodErr)
		const tolDays = 1e-12
		if math.Abs(e.SigmaDays-want) > tolDays || r.Cells[all.Col("± σ")] != sigmaText(want) {
			t.Errorf("row %d, E = %g: σ %g d (cell %q), want %g d", i, e.Cycle, e.SigmaDays, r.Cells[all.Col("± σ")], want)
		}
		if e.SigmaDays < prev {
			t.Errorf("row %d: σ %g d shrank from %g d though E grew", i, e.SigmaDays, prev)
		}
		prev = e.SigmaDays
		// GMT = UTC in December at the demo site.
		if r.Cells[1] != r.Cells[2] || r.Cells[2] != utcText(e.UTC.Time()) {
			t.Errorf("row %d: local %q, UTC %q, want both %q", i, r.Cells[1], r.Cells[2], utcText(e.UTC.Time()))
		}
	}
	if all.Col("Max/min") != -1 || len(all.Columns) != len(StarForecastColumns)-1 {
		t.Errorf("columns of a star without secondary minima: %q", all.Columns)
	}
	// An eclipsing star with secondary minima gets the Max/min column,
	// with the secondaries half a cycle after the primaries.
	ecl := smallTargets()[1]
	ecl.Secondary = true
	de, err := ForecastStar(context.Background(), site, ecl, date, 14)
	if err != nil {
		t.Fatal(err)
	}
	me := BuildStarForecast(de, true)
	var primary, secondary int
	for _, r := range me.Rows {
		switch r.Cells[me.Col("Max/min")] {
		case "min":
			primary++
			if r.Event.Cycle != math.Trunc(r.Event.Cycle) {
				t.Errorf("a primary minimum at E = %g", r.Event.Cycle)
			}
		case "min II":
			secondary++
			if r.Event.Cycle-math.Floor(r.Event.Cycle) != 0.5 {
				t.Errorf("a secondary minimum at E = %g, want E + 0.5", r.Event.Cycle)
			}
		}
	}
	// 14 nights / 0.81 d: about 17 of each.
	if me.Col("Max/min") < 0 || primary < 15 || secondary < 15 {
		t.Errorf("eclipsing star: columns %q, %d primary and %d secondary minima", me.Columns, primary, secondary)
	}
	if !strings.Contains(all.SigmaNote, "grows with the cycles E since T0") {
		t.Errorf("σ note: %q", all.SigmaNote)
	}
	if d := all.Detail(0); !strings.Contains(d, "cycle E = ") || !strings.Contains(d, "predicted to ±") {
		t.Errorf("detail: %q", d)
	}
}

// A long-period star with no maximum in the nights: the summary names the
// next one, T0 + P·E for the first whole E after the nights.
func TestStarForecastNextAfter(t *testing.T) {
	site := demo.Site()
	date := time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)
	start, _ := ephem.FromTime(date)
	// The maximum fell 20 days before the night: with P = 300 d the next
	// is 280 days on.
	tg := invented("Test Slow", observe.Pulsating, 3, 40, start.JDTDB()-20, 300)
	d, err := ForecastStar(context.Background(), site, tg, date, 14)
	if err != nil {
		t.Fatal(err)
	}
	if d.Next == nil {
		t.Fatal("no next maximum found")
	}
	if d.Next.Cycle != 1 || d.Next.EphemerisJD != tg.Ephemeris.Epoch+300 {
		t.Errorf("next: E = %g at %v, want E = 1 at T0 + 300 d", d.Next.Cycle, d.Next.EphemerisJD)
	}
	m := BuildStarForecast(d, false)
	if len(m.Rows) != 0 || !strings.Contains(m.Summary, ", no maximum falls (P = 300 d). The next is predicted for "+
		d.Next.UTC.Time().In(site.Location()).Format("Mon 2 Jan 2006")) {
		t.Errorf("summary: %q", m.Summary)
	}
}

func TestStarForecastSunCaution(t *testing.T) {
	nd, _ := modelNight()
	d := StarForecastData{Site: demo.Site(), Target: smallTargets()[0], Date: nd.Request.Date, Nights: 1,
		Plans: []observe.NightPlan{{Date: nd.Request.Date, Events: nd.Events}}}
	d.Plans[0].Events[0].SolarWarning = true
	m := BuildStarForecast(d, true)
	if m.Cautions != 1 || !m.Rows[0].Caution || !strings.HasPrefix(m.Rows[0].Cells[m.Col("Verdict")], "SUN NEAR") {
		t.Errorf("cautions %d, row 0 %+v", m.Cautions, m.Rows[0])
	}
	if !strings.Contains(m.Detail(0), observe.SolarWarningText) || strings.Contains(m.Detail(1), "DANGER") {
		t.Errorf("details: %q / %q", m.Detail(0), m.Detail(1))
	}
}

func TestStarDistance(t *testing.T) {
	tg := invented("Test Ceph", observe.Pulsating, 22.5, 58, 2460000.5, 5.366249)
	for _, rel := range reduce.PLRelations() {
		d := StarDistanceOf(tg, StarDistanceForm{MeanV: "3.954", AV: "0.23 mag", Relation: rel.Name})
		want, err := reduce.Distance(5.366249, 3.954, 0.23, rel.Name)
		if err != nil || !d.OK {
			t.Fatalf("%s: %v %v", rel.Name, err, d.Errors)
		}
		if d.Result.DistancePc != want.DistancePc || d.Result.AbsMag != want.AbsMag {
			t.Errorf("%s: got %+v, want %+v", rel.Name, d.Result, want)
		}
		var dist string
		for _, l := range d.Lines {
			if l.Key == "Distance" {
				dist = l.Value
			}
		}
		wantText := starRound(want.DistancePc) + " ± " + starRound(want.DistanceErrPc) + " pc"
		if !strings.HasPrefix(dist, wantText) {
			t.Errorf("%s: distance line %q, want it to start %q", rel.Name, dist, wantText)
		}
	}
	for _, tc := range []struct {
		form  StarDistanceForm
		field string
	}{
		{StarDistanceForm{MeanV: ""}, StarFieldMeanV},
		{StarDistanceForm{MeanV: "bright"}, StarFieldMeanV},
		{StarDistanceForm{MeanV: "4", AV: "-1"}, StarFieldAV},
		{StarDistanceForm{MeanV: "4", Relation: "nosuch"}, StarFieldForm},
	} {
		if d := StarDistanceOf(tg, tc.form); d.OK || d.Errors[tc.field] == "" {
			t.Errorf("%+v: OK %v, errors %v; want a fault on %q", tc.form, d.OK, d.Errors, tc.field)
		}
	}
	if StarDistanceApplies(invented("Test Ecl", observe.Eclipsing, 1, 1, 2460000.5, 2)) {
		t.Error("the distance is offered for an eclipsing star")
	}
}

func TestLightYearsPerParsec(t *testing.T) {
	// astropy 6 (python3-astropy): (1*u.pc).to(u.lyr).value = 3.2615637771674333.
	const astropy = 3.2615637771674333
	const tolRel = 1e-15
	if d := math.Abs(LightYearsPerParsec-astropy) / astropy; d > tolRel {
		t.Errorf("ly per pc: got %.17g, want %.17g (astropy), relative diff %.2g", LightYearsPerParsec, astropy, d)
	}
	for _, tc := range []struct {
		v    float64
		want string
	}{{3370.4, "3 370"}, {54.96, "55.0"}, {10994.2, "11 000"}, {0.1234, "0.123"}, {273, "273"}, {1234567, "1 230 000"}} {
		if got := starRound(tc.v); got != tc.want {
			t.Errorf("starRound(%v): got %q, want %q", tc.v, got, tc.want)
		}
	}
}
