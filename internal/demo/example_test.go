package demo_test

import (
	"fmt"
	"os"
	"path/filepath"

	"example.org/vigil/internal/demo"
)

// The first run: a demo logbook of invented sites, stars and observations,
// flagged as a demo until the user clears it or imports real data.
func ExampleOpenOrCreate() {
	dir, _ := os.MkdirTemp("", "vigil-example-")
	defer os.RemoveAll(dir)
	lb, created, err := demo.OpenOrCreate(filepath.Join(dir, "vigil.db"))
	if err != nil {
		fmt.Println(err)
		return
	}
	defer lb.Close()
	demoFlag, _ := lb.IsDemo()
	fmt.Println("created:", created, "demo:", demoFlag)
	sites, _ := lb.Sites()
	for _, s := range sites {
		fmt.Printf("%s at %+.4f, %+.4f\n", s.Name, s.LatDeg, s.LonDeg)
	}
	targets, _ := lb.Targets()
	for _, t := range targets[:3] {
		fmt.Printf("%s, %s, P = %.7f d\n", t.Name, t.Class, t.Ephemeris.PeriodDays)
	}
	mean, _ := lb.MeanMagV("Ashgrove V2")
	fmt.Printf("Ashgrove V2 mean V: %.3f\n", mean)

	_ = lb.ClearDemo()
	demoFlag, _ = lb.IsDemo()
	targets, _ = lb.Targets()
	fmt.Println("after ClearDemo:", demoFlag, len(targets), "targets")
	// Output:
	// created: true demo: true
	// Ashgrove Hill Observatory (demo) at +52.1172, -1.4538
	// Bellbird Ridge School Observatory (demo) at -34.0521, +150.7411
	// Ashgrove V1, pulsating, P = 0.5672381 d
	// Ashgrove V2, pulsating, P = 5.7031240 d
	// Ashgrove V3, pulsating, P = 0.0871234 d
	// Ashgrove V2 mean V: 9.181
	// after ClearDemo: false 0 targets
}

// The demo site, the one definition the command line and the window share.
func ExampleSite() {
	s := demo.Site()
	fmt.Printf("%s: %+.4f° N, %+.4f° E, %.0f m, %s, lowest %.0f°\n", s.Name, s.LatDeg, s.LonDeg, s.ElevM, s.TimeZone, s.MinAltDeg)
	// Output:
	// Ashgrove Hill Observatory (demo): +52.1172° N, -1.4538° E, 140 m, Europe/London, lowest 20°
}
