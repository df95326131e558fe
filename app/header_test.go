package app

import (
	"strings"
	"testing"
	"time"

	"fyne.io/fyne/v2"

	"example.org/vigil/internal/demo"
)

func TestMoonSummary(t *testing.T) {
	t0 := time.Date(2026, 12, 1, 15, 0, 0, 0, time.UTC)
	h := func(x float64) time.Time { return t0.Add(time.Duration(x * float64(time.Hour))) }
	night := func(illum float64, alts ...float64) *NightData {
		nd := &NightData{From: t0, To: h(float64(len(alts) - 1))}
		nd.Request.Site = demo.Site() // Europe/London: GMT = UTC in December
		nd.Sky.MoonIllum = illum
		for i, a := range alts {
			nd.Samples = append(nd.Samples, SkySample{At: h(float64(i)), MoonAltDeg: a})
		}
		return nd
	}
	cases := []struct {
		name string
		nd   *NightData
		want string
	}{
		{"planning", nil, "Moon —"},
		{"down", night(0.02, -10, -20, -5), "Moon 2% · down all night"},
		{"up", night(0.99, 10, 40, 10), "Moon 99% · up all night"},
		// crossings half-way between samples (see TestMoonUpFromSamples)
		{"rises", night(0.42, -9.875, 10.125, 30), "Moon 42% · rises 15:30"},
		{"sets", night(0.5, 30, 10.125, -9.875), "Moon 50% · sets 16:30"},
		{"rises and sets", night(0.6, -9.875, 10.125, 10.125, -9.875), "Moon 60% · up 15:30–17:30"},
	}
	for _, tc := range cases {
		if got := moonSummary(tc.nd); got != tc.want {
			t.Errorf("%s: got %q, want %q", tc.name, got, tc.want)
		}
	}
}

// The strip writes ephem.NightOf's sunset and sunrise and the planner's
// dark span in the site's local time.
func TestStripLabels(t *testing.T) {
	w, _ := openWindow(t, smallLogbook(t))
	nd := w.Session.Night()
	loc := nd.Request.Site.Location()
	var texts []string
	for _, l := range w.header.strip.labels() {
		texts = append(texts, l.text)
	}
	got := strings.Join(texts, " | ")
	tw := nd.Plan.Twilights
	want := "sunset " + clockText(nd.Sky.Sunset.At.Time(), loc) +
		" | dark " + clockText(tw.DarkFrom.At.Time(), loc) + "–" + clockText(tw.DarkTo.At.Time(), loc) +
		" | " + clockText(nd.Sky.Sunrise.At.Time(), loc) + " sunrise"
	if got != want {
		t.Errorf("strip labels: got %q, want %q", got, want)
	}
	// All three fit side by side at the window's width.
	w.header.strip.Resize(fyne.NewSize(320, w.header.strip.MinSize().Height))
	r := w.header.strip.CreateRenderer().(*stripRenderer)
	r.Layout(w.header.strip.Size())
	for i, tx := range r.texts {
		if tx.Hidden {
			t.Errorf("strip label %q is hidden at 320 wide", r.at[i].text)
		}
	}
	// The mark of the present moment (the pinned 18:00 UTC) sits at its
	// share of the strip.
	want18 := 320 * float32(testNow.Sub(nd.From)) / float32(nd.To.Sub(nd.From))
	if r.now.Hidden || r.now.Position().X+1 < want18-0.5 || r.now.Position().X+1 > want18+0.5 {
		t.Errorf("now mark at x = %.1f (hidden %v), want %.1f", r.now.Position().X+1, r.now.Hidden, want18)
	}
}
