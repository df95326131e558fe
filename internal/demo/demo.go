package demo

import (
	"errors"
	"fmt"
	"io/fs"
	"math/rand/v2"
	"os"
	"sort"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// seed seeds the demo's noise: the same seed gives the same logbook.
const seed = 20190105

// The span of the demo's own observations.
var (
	firstNight = time.Date(2019, 1, 1, 0, 0, 0, 0, time.UTC)
	lastNight  = time.Date(2026, 11, 30, 0, 0, 0, 0, time.UTC)
)

// Demo photometry: a nightly zero point near zeroPoint, the V-band
// extinction coefficient (common practice: 0.15–0.25 mag per air mass,
// methods sheet §15) and the frame-to-frame transparency jitter that every
// star of a frame shares (and differential photometry removes).
const (
	zeroPoint    = -21.3
	extinction   = 0.22
	transparency = 0.01
	sunLimitDeg  = -12 // runs start after nautical dusk
)

// Create makes a new logbook at path holding the demo scenario (see the
// package documentation) and opens it. It refuses to overwrite a file
// (logbook.ErrExists). The scenario is generated from a fixed seed: every
// call gives the same records.
func Create(path string) (*logbook.Logbook, error) {
	if _, err := os.Stat(path); err == nil {
		return nil, fmt.Errorf("demo: %s: %w: choose another name or remove it first", path, logbook.ErrExists)
	}
	sc, err := generate(seed)
	if err != nil {
		return nil, fmt.Errorf("demo: generating the scenario: %w", err)
	}
	return logbook.CreateDemo(path, sc.records())
}

// OpenOrCreate opens the logbook at path, or creates it with the demo
// scenario when there is no file there (the first run of the command line
// and the window). created says which.
func OpenOrCreate(path string) (lb *logbook.Logbook, created bool, err error) {
	if _, err := os.Stat(path); errors.Is(err, fs.ErrNotExist) {
		lb, err := Create(path)
		return lb, err == nil, err
	}
	lb, err = logbook.Open(path)
	return lb, false, err
}

// scenario is the generated demo, before it is written.
type scenario struct {
	targets   []logbook.DemoTarget
	stars     []demoStar
	sites     []observe.Site
	nights    []*logbook.DemoNight
	published []logbook.Timing
}

// records returns the scenario as the logbook stores it.
func (sc *scenario) records() *logbook.DemoRecords {
	d := &logbook.DemoRecords{Sites: sc.sites, Targets: sc.targets, Timings: sc.published}
	for _, n := range sc.nights {
		d.Nights = append(d.Nights, *n)
	}
	return d
}

// generate builds the demo scenario from seed.
func generate(seed uint64) (*scenario, error) {
	sites, err := demoSites()
	if err != nil {
		return nil, err
	}
	g := &generator{rng: rand.New(rand.NewPCG(seed, 0x5647_4c42)), frames: ephem.NewFrames(),
		nights: map[string]*logbook.DemoNight{}, zp: map[string]float64{}}
	sc := &scenario{sites: sites, stars: demoStars()}
	for i := range sc.stars {
		rec, err := sc.stars[i].record()
		if err != nil {
			return nil, err
		}
		sc.targets = append(sc.targets, rec)
	}
	for i := range sc.stars {
		s := &sc.stars[i]
		if err := g.runs(sites[0], s, s.runsPerSeason, 2019, 2026); err != nil {
			return nil, fmt.Errorf("%s: %w", s.name, err)
		}
		// The school's runs, spread over its years.
		for k := 0; k < s.schoolRuns; k++ {
			year := 2023 + k*4/s.schoolRuns
			if err := g.runs(sites[1], s, 1, year, year); err != nil {
				return nil, fmt.Errorf("%s: %w", s.name, err)
			}
		}
	}
	for i := range sc.stars {
		s := &sc.stars[i]
		var err error
		switch {
		case s.visual:
			err = g.visualSeries(sites[0], s)
		case s.nightly:
			err = g.nightlySeries(sites[0], s)
		}
		if err != nil {
			return nil, fmt.Errorf("%s: %w", s.name, err)
		}
		pub, err := g.publishedTimings(s)
		if err != nil {
			return nil, fmt.Errorf("%s: %w", s.name, err)
		}
		sc.published = append(sc.published, pub...)
	}
	for _, n := range g.nights {
		sort.SliceStable(n.Measurements, func(i, j int) bool { return n.Measurements[i].JDUTC < n.Measurements[j].JDUTC })
		sc.nights = append(sc.nights, n)
	}
	sort.Slice(sc.nights, func(i, j int) bool {
		a, b := sc.nights[i].Night, sc.nights[j].Night
		if !a.Date.Equal(b.Date) {
			return a.Date.Before(b.Date)
		}
		return a.Site < b.Site
	})
	return sc, nil
}
