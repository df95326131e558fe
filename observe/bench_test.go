package observe

import (
	"math"
	"math/rand/v2"
	"testing"
	"time"

	"example.org/vigil/ephem"
)

// benchCatalogue returns n invented targets spread uniformly over the sky,
// periods log-uniform from 0.2 to 30 days, half on each time scale, a third
// eclipsing with secondary minima.
func benchCatalogue(n int) []Target {
	r := rand.New(rand.NewPCG(3, 14))
	out := make([]Target, n)
	for i := range out {
		p := 0.2 * math.Pow(150, r.Float64())
		scale := ephem.HJD
		if i%2 == 1 {
			scale = ephem.BJDTDB
		}
		class, kind := Pulsating, Max
		if i%3 == 0 {
			class, kind = Eclipsing, Min
		}
		star := ephem.Star{RAHours: 24 * r.Float64(), DecDeg: math.Asin(2*r.Float64()-1) * rad2deg}
		eph := ephem.Ephemeris{Epoch: 2460000 + p*r.Float64(), PeriodDays: p, Scale: scale,
			EpochErr: 0.001, PeriodErr: 1e-6}
		out[i] = NewTarget("bench", star, class, eph, kind)
		out[i].Secondary = class == Eclipsing
	}
	return out
}

// benchSite is an invented site with a horizon profile of trees and a roof.
func benchSite(b testing.TB) Site {
	s, err := NewSite("Bench Hill", 50, 10, 300, "Europe/Berlin", 20,
		Horizon{{0, 15}, {90, 25}, {140, 35}, {200, 10}, {300, 30}})
	if err != nil {
		b.Fatal(err)
	}
	return s
}

// BenchmarkForecast10k forecasts 30 nights for 10,000 targets at one site:
// every extremum with its verdict, coverage window and score.
func BenchmarkForecast10k(b *testing.B) {
	targets := benchCatalogue(10000)
	p, err := NewPlanner(benchSite(b), DefaultConstraints())
	if err != nil {
		b.Fatal(err)
	}
	date := time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)
	// Every extremum is evaluated; the plans keep those with a usable part
	// of their window. Count both (the count of all, once, untimed).
	all := *p
	all.c.KeepAll = true
	plans, err := all.Forecast(targets, date, 30)
	if err != nil {
		b.Fatal(err)
	}
	extrema := 0
	for _, n := range plans {
		extrema += len(n.Events)
	}
	b.ReportAllocs()
	events := 0
	for b.Loop() {
		plans, err := p.Forecast(targets, date, 30)
		if err != nil {
			b.Fatal(err)
		}
		events = 0
		for _, n := range plans {
			events += len(n.Events)
		}
	}
	b.ReportMetric(float64(extrema), "extrema")
	b.ReportMetric(float64(events), "kept")
}
