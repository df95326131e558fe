package app

import (
	"context"
	"testing"

	"example.org/vigil/app/chart"
	"example.org/vigil/internal/demo"
)

// The Measurements page's work for the demo star with the most
// measurements (Ashgrove V4, some 1700 over all nights): reading them,
// the analysis (the joint reduction of every frame with its times), and
// building the light curve. Each runs in a job, off the UI thread.
func BenchmarkMeasure(b *testing.B) {
	lb := measureDemo(b)
	tg, err := lb.Target("Ashgrove V4")
	if err != nil {
		b.Fatal(err)
	}
	site, err := lb.Site(demo.SiteName)
	if err != nil {
		b.Fatal(err)
	}
	r := MeasureRequest{Target: tg, Site: site, Date: measureNight}
	d, err := LoadMeasure(lb, r)
	if err != nil {
		b.Fatal(err)
	}
	b.Run("load", func(b *testing.B) {
		for b.Loop() {
			if _, err := LoadMeasure(lb, r); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("analyse-all-nights", func(b *testing.B) {
		for b.Loop() {
			if _, err := AnalyseMeasure(context.Background(), d, MeasureAllNights); err != nil {
				b.Fatal(err)
			}
		}
	})
	a, err := AnalyseMeasure(context.Background(), d, MeasureAllNights)
	if err != nil {
		b.Fatal(err)
	}
	b.Run("light-curve", func(b *testing.B) {
		for b.Loop() {
			if _, err := measureLightSource(a)(context.Background(), chart.DefaultPalette()); err != nil {
				b.Fatal(err)
			}
		}
	})
}
