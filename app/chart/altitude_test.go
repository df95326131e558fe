package chart

import (
	"bytes"
	"flag"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"gonum.org/v1/plot/vg"

	"vigil/ephem"
	"vigil/observe"
)

var out = flag.String("out", "", "also write the demo chart to this file (.png, .svg or .pdf)")

// demoChart is the chart of an invented site and three invented stars.
func demoChart(t *testing.T) observe.Chart {
	t.Helper()
	site, err := observe.NewSite("Lindenhof (invented)", 50.1, 8.7, 120, "Europe/Berlin", 20,
		observe.Horizon{{AzDeg: 0, AltDeg: 12}, {AzDeg: 100, AltDeg: 25}, {AzDeg: 200, AltDeg: 8}, {AzDeg: 290, AltDeg: 18}})
	if err != nil {
		t.Fatal(err)
	}
	mk := func(name string, ra, dec, p float64, class observe.Class, kind observe.Kind) observe.Target {
		return observe.NewTarget(name, ephem.Star{RAHours: ra, DecDeg: dec}, class,
			ephem.Ephemeris{Epoch: 2461000.31, PeriodDays: p, Scale: ephem.BJDTDB, EpochErr: 0.001}, kind)
	}
	targets := []observe.Target{
		mk("Alder Var", 5.5, 30, 0.3712345, observe.Pulsating, observe.Max),
		mk("Cedar Ecl", 1.9, 61.2, 1.2345678, observe.Eclipsing, observe.Min),
		mk("Hazel Var", 9.3, 12, 0.281, observe.Pulsating, observe.Max),
	}
	p, err := observe.NewPlanner(site, observe.DefaultConstraints())
	if err != nil {
		t.Fatal(err)
	}
	c, err := p.Chart(targets, time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC))
	if err != nil {
		t.Fatal(err)
	}
	return c
}

func TestAltitudeChart(t *testing.T) {
	c := demoChart(t)
	p, err := Altitude(c, DefaultPalette())
	if err != nil {
		t.Fatal(err)
	}
	// Axis settings: the whole span in hours, altitude 0–90°.
	if want := c.To.Sub(c.From).Hours(); p.X.Min != 0 || math.Abs(p.X.Max-want) > 1e-9 || p.Y.Min != 0 || p.Y.Max != 90 {
		t.Errorf("axes x [%v, %v] y [%v, %v], want x [0, %v] y [0, 90]", p.X.Min, p.X.Max, p.Y.Min, p.Y.Max, want)
	}
	// The span runs from an hour before sunset to an hour after sunrise.
	if d := c.Twilights.Sunset.At.Time().Sub(c.From); d != time.Hour && (d-time.Hour).Abs() > time.Millisecond {
		t.Errorf("chart starts %v before sunset, want 1h", d)
	}
	if len(c.Events) == 0 {
		t.Errorf("no extrema in the demo night")
	}
	// Hour ticks carry local (CET, UTC+1) above UTC.
	var labels []string
	for _, tk := range p.X.Tick.Marker.Ticks(p.X.Min, p.X.Max) {
		if tk.Label != "" {
			labels = append(labels, tk.Label)
		}
	}
	if len(labels) < 8 || !strings.Contains(strings.Join(labels, "|"), "21:00\n20:00") {
		t.Errorf("hour labels %q: want local above UTC, e.g. \"21:00\\n20:00\"", labels)
	}
	// The sky bands cover the span without gaps, darkest at midnight.
	bands := skyBands(c, DefaultPalette())
	for i := 1; i < len(bands); i++ {
		if !bands[i].from.Equal(bands[i-1].to) {
			t.Errorf("band %d starts %v, previous ends %v", i, bands[i].from, bands[i-1].to)
		}
	}
	if len(bands) != 9 {
		t.Errorf("%d sky bands, want 9 (day, civil, nautical, astronomical, night and back)", len(bands))
	}
	// Civil dusk falls where the bands say, within the sampling of the
	// Sun's curve (a few seconds, interpolated).
	if d := bands[1].to.Sub(c.Twilights.CivilDusk.At.Time()).Abs(); d > 10*time.Second {
		t.Errorf("civil band ends %v from civil dusk", d)
	}
	for _, ext := range []string{"png", "svg", "pdf"} {
		path := filepath.Join(t.TempDir(), "night."+ext)
		if err := Save(p, path, 24*vg.Centimeter, 14*vg.Centimeter); err != nil {
			t.Fatal(err)
		}
		data, err := os.ReadFile(path)
		magic := map[string]string{"png": "\x89PNG", "svg": "<?xml", "pdf": "%PDF"}[ext]
		if err != nil || !bytes.HasPrefix(data, []byte(magic)) {
			t.Errorf("%s: %d bytes, want a file starting %q (%v)", ext, len(data), magic, err)
		}
	}
	if err := Save(p, filepath.Join(t.TempDir(), "night.gif"), 10*vg.Centimeter, 10*vg.Centimeter); err == nil {
		t.Errorf("saving as .gif: no error, want one naming the format")
	}
	if *out != "" {
		if err := Save(p, *out, 24*vg.Centimeter, 14*vg.Centimeter); err != nil {
			t.Fatal(err)
		}
		pr, _ := Altitude(c, NightRedPalette())
		if err := Save(pr, strings.TrimSuffix(*out, filepath.Ext(*out))+"_red"+filepath.Ext(*out), 24*vg.Centimeter, 14*vg.Centimeter); err != nil {
			t.Fatal(err)
		}
	}
}
