package app

import (
	"context"
	"errors"
	"math"
	"strings"
	"testing"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/demo"
	"example.org/vigil/observe"
)

// event makes an extremum for the model tests at UTC hh:mm on 1 December
// 2026 (after midnight for hh < 12: the morning of the 2nd).
func event(target string, hh, mm int, usable float64, whole bool, score float64) observe.Event {
	day := 1
	if hh < 12 {
		day = 2
	}
	at, err := ephem.FromTime(time.Date(2026, 12, day, hh, mm, 0, 0, time.UTC))
	if err != nil {
		panic(err)
	}
	e := observe.Event{Target: target, Kind: observe.Max, UTC: at, AltDeg: 45, Airmass: 1.41, MoonAltDeg: -5,
		MoonSepDeg: 80, Score: score, SigmaDays: 3.0 / 1440}
	e.Window = observe.Coverage{Start: at.AddDays(-0.05), End: at.AddDays(0.05), UsableFraction: usable, Whole: whole}
	if usable < 1 {
		e.Window.Reasons = observe.Twilight
	}
	return e
}

// modelNight is a night of three stars with hand-made events.
func modelNight() (*NightData, []observe.Target) {
	ts := smallTargets()
	nd := &NightData{Request: PlanRequest{Site: demo.Site(), Date: time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)}}
	nd.Events = []observe.Event{
		event("Test Alpha", 17, 30, 0.4, false, 0.2),
		event("Test Beta", 21, 14, 1, true, 0.9),
		event("Test Gamma", 23, 5, 0, false, 0),
		event("Test Alpha", 2, 40, 1, true, 0.7),
	}
	nd.Events[2].MoonAltDeg = 20
	nd.Events[2].MoonSepDeg = 12.4
	nd.Events[2].Reasons = observe.MoonTooClose
	nd.Events[2].Window.Reasons = observe.MoonTooClose | observe.TooLow
	nd.Events[2].Airmass = math.NaN()
	nd.Plan.Events = nd.Events
	return nd, ts
}

func TestTonightRows(t *testing.T) {
	nd, ts := modelNight()
	m := BuildTonight(true, ts, nd, "")
	if len(m.Rows) != 4 {
		t.Fatalf("rows: got %d, want 4", len(m.Rows))
	}
	// GMT = UTC at the demo site in December.
	want := [][]string{
		{"17:30", "17:30", "Test Alpha", "max", "45°", "1.41", "down", "partly: twilight", "40%"},
		{"21:14", "21:14", "Test Beta", "max", "45°", "1.41", "down", "whole window", "100%"},
		{"23:05", "23:05", "Test Gamma", "max", "45°", "—", "12°", "no: too low, Moon too close", "0%"},
		{"02:40", "02:40", "Test Alpha", "max", "45°", "1.41", "down", "whole window", "100%"},
	}
	for i, r := range m.Rows {
		if strings.Join(r.Cells, "|") != strings.Join(want[i], "|") {
			t.Errorf("row %d:\n got %q\nwant %q", i, r.Cells, want[i])
		}
	}
	if got, want := m.Summary, "4 extrema in the night: 2 whole, 1 partly, 1 not observable"; got != want {
		t.Errorf("summary: got %q, want %q", got, want)
	}
}

func TestTonightChartStars(t *testing.T) {
	nd, ts := modelNight()
	cases := []struct {
		selected string
		want     string
	}{
		// Ranked by score: Beta 0.9, Alpha 0.7 (and 0.2); Gamma has no usable window.
		{"", "Test Beta,Test Alpha"},
		{"test gamma", "Test Gamma,Test Beta,Test Alpha"},
		{"Test Alpha", "Test Alpha,Test Beta"},
	}
	for _, tc := range cases {
		m := BuildTonight(true, ts, nd, tc.selected)
		var names []string
		for _, t := range m.Chart {
			names = append(names, t.Name)
		}
		if got := strings.Join(names, ","); got != tc.want {
			t.Errorf("chart stars with %q selected: got %s, want %s", tc.selected, got, tc.want)
		}
	}
}

func TestTonightSunCaution(t *testing.T) {
	nd, ts := modelNight()
	nd.Events[0].SolarWarning = true
	m := BuildTonight(true, ts, nd, "")
	if m.Cautions != 1 || !m.Rows[0].Caution {
		t.Fatalf("cautions: got %d (row 0 %v), want 1 on row 0", m.Cautions, m.Rows[0].Caution)
	}
	if !strings.HasPrefix(m.Rows[0].Cells[7], "SUN NEAR") {
		t.Errorf("verdict of a Sun-caution row: got %q, want it to start with SUN NEAR", m.Rows[0].Cells[7])
	}
	if !strings.Contains(m.Summary, "1 event near the Sun") {
		t.Errorf("summary %q does not count the event near the Sun", m.Summary)
	}
	if d := m.Detail(0); !strings.Contains(d, observe.SolarWarningText) {
		t.Errorf("detail of a Sun-caution row lacks observe.SolarWarningText: %q", d)
	}
	if d := m.Detail(1); strings.Contains(d, "DANGER") {
		t.Errorf("detail of a row without the caution mentions it: %q", d)
	}
}

func TestTonightDetail(t *testing.T) {
	nd, ts := modelNight()
	m := BuildTonight(true, ts, nd, "")
	want := "Test Alpha: max at 17:30 local (17:30 UTC), cycle 0, predicted to ±3 min. Window 16:18–18:42: 40% usable (twilight)."
	if got := m.Detail(0); got != want {
		t.Errorf("detail:\n got %q\nwant %q", got, want)
	}
	if m.RowOf("test beta") != 1 || m.RowOf("Nobody") != -1 {
		t.Errorf("RowOf: Test Beta at %d (want 1), Nobody at %d (want -1)", m.RowOf("test beta"), m.RowOf("Nobody"))
	}
}

// Every state without rows says what is going on or what to do.
func TestTonightEmptyStates(t *testing.T) {
	nd, ts := modelNight()
	quiet := &NightData{Request: nd.Request}
	cases := []struct {
		name    string
		hasSite bool
		ts      []observe.Target
		nd      *NightData
		want    string
	}{
		{"no site", false, ts, nil, "no observing site"},
		{"no stars", true, nil, nil, "No stars yet: add one or import a catalogue"},
		{"planning", true, ts, nil, "Planning the night"},
		{"cancelled", true, ts, &NightData{Err: context.Canceled}, "Planning was cancelled"},
		{"failed", true, ts, &NightData{Err: errors.New(`target "X": period must be > 0`)}, `could not be planned: target "X"`},
		{"nothing tonight", true, ts, quiet, "None of the 3 stars has a maximum or minimum in this night"},
	}
	for _, tc := range cases {
		m := BuildTonight(tc.hasSite, tc.ts, tc.nd, "")
		if len(m.Rows) != 0 || !strings.Contains(m.Summary, tc.want) {
			t.Errorf("%s: %d rows, summary %q; want no rows and a summary containing %q", tc.name, len(m.Rows), m.Summary, tc.want)
		}
	}
}
