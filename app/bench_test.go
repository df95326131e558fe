package app

import (
	"fmt"
	"math/rand/v2"
	"os"
	"path/filepath"
	"runtime/debug"
	"sync"
	"testing"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"

	"example.org/vigil/internal/demo"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// benchDir holds the logbooks the benchmarks share (made once: the demo
// takes seconds to generate); TestMain removes it.
var (
	benchDir     string
	benchDirOnce sync.Once
)

func TestMain(m *testing.M) {
	// The view tests allocate much (text shaping, images): collecting less
	// often saves a quarter of their time, at some memory.
	debug.SetGCPercent(400)
	code := m.Run()
	if benchDir != "" {
		os.RemoveAll(benchDir)
	}
	os.Exit(code)
}

// benchLogbook returns the path of a logbook made once by make.
func benchLogbook(b *testing.B, name string, make func(path string) error) string {
	b.Helper()
	benchDirOnce.Do(func() {
		var err error
		if benchDir, err = os.MkdirTemp("", "vigil-app-bench"); err != nil {
			b.Fatal(err)
		}
	})
	path := filepath.Join(benchDir, name)
	if _, err := os.Stat(path); err != nil {
		if err := make(path); err != nil {
			b.Fatal(err)
		}
	}
	return path
}

func openBench(b *testing.B, path string) *logbook.Logbook {
	b.Helper()
	lb, err := logbook.Open(path)
	if err != nil {
		b.Fatal(err)
	}
	b.Cleanup(func() { lb.Close() })
	return lb
}

// BenchmarkFirstFrame measures the window from New on the demo logbook to
// its first complete frame: the night planned, the table filled, the chart
// drawn and the whole window painted (test driver, Canvas().Capture()).
// The goal is 1.5 s. "shell-ms" is the time to the first frame painted
// before the night's plan arrives.
func BenchmarkFirstFrame(b *testing.B) {
	lb := openBench(b, benchLogbook(b, "demo.db", func(p string) error {
		lb, err := demo.Create(p)
		if err == nil {
			err = lb.Close()
		}
		return err
	}))
	var shell time.Duration
	for b.Loop() {
		fa := test.NewApp()
		q := newUIQueue()
		start := time.Now()
		w := New(fa, lb, Options{Now: func() time.Time { return testNow }, Post: q.post, Size: fyne.NewSize(1280, 800)})
		if w.Win.Canvas().Capture() == nil {
			b.Fatal("no first frame")
		}
		shell += time.Since(start)
		settle(b, w, q)
		if w.Win.Canvas().Capture() == nil || opaque(tonight(b, w).chart.Image()) == 0 {
			b.Fatal("no complete frame")
		}
		b.StopTimer()
		fa.Quit()
		b.StartTimer()
	}
	b.ReportMetric(float64(shell.Milliseconds())/float64(b.N), "shell-ms")
}

// manyTargets returns n invented stars spread over the sky with periods
// from 0.1 to 10 days (a fixed seed: the same stars every run).
func manyTargets(n int) []observe.Target {
	rng := rand.New(rand.NewPCG(7, 11))
	out := make([]observe.Target, n)
	for i := range out {
		class := []observe.Class{observe.Pulsating, observe.Eclipsing, observe.Other}[i%3]
		out[i] = invented(fmt.Sprintf("Bench %03d", i+1), class, 24*rng.Float64(), -30+110*rng.Float64(),
			2461000+rng.Float64()*10, 0.1+9.9*rng.Float64())
	}
	return out
}

// many200Logbook opens the benchmarks' logbook of the demo site and 200
// invented stars (manyTargets), made once and kept between runs.
func many200Logbook(b *testing.B) *logbook.Logbook {
	return openBench(b, benchLogbook(b, "many200.db", func(p string) error {
		lb, err := logbook.Create(p)
		if err != nil {
			return err
		}
		defer lb.Close()
		if err := lb.AddSite(demo.Site()); err != nil {
			return err
		}
		for _, t := range manyTargets(200) {
			if err := lb.AddTarget(t, "invented for the benchmarks"); err != nil {
				return err
			}
		}
		return nil
	}))
}

// BenchmarkNextNight200 measures one step to the next night with 200 stars:
// the plan of the night, the table and the star list refilled, the
// altitude chart built and drawn. The goal is 100 ms.
func BenchmarkNextNight200(b *testing.B) {
	lb := many200Logbook(b)
	fa := test.NewApp()
	defer fa.Quit()
	q := newUIQueue()
	w := New(fa, lb, Options{Now: func() time.Time { return testNow }, Post: q.post, Size: fyne.NewSize(1280, 800)})
	settle(b, w, q)
	v := tonight(b, w)
	events := 0
	for b.Loop() {
		before := v.chart.Image()
		test.Tap(w.header.next)
		settle(b, w, q)
		if v.chart.Image() == before || len(v.model.Rows) == 0 {
			b.Fatal("the next night was not planned and drawn")
		}
		events += len(v.model.Rows)
	}
	b.ReportMetric(float64(events)/float64(b.N), "events/night")
}
