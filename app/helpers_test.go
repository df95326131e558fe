package app

import (
	"os"
	"path/filepath"
	"sync"
	"testing"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"

	"example.org/vigil/ephem"
	"example.org/vigil/internal/demo"
	"example.org/vigil/observe"
	"example.org/vigil/observe/logbook"
)

// testNow is the pinned clock of the view tests: 1 December 2026, 18:00
// UTC, in the evening at the demo site (Europe/London, GMT then), so
// "tonight" is the night of 1–2 December.
var testNow = time.Date(2026, 12, 1, 18, 0, 0, 0, time.UTC)

// uiQueue stands in for fyne.Do in the view tests: jobs post into it from
// their goroutines and the test runs the functions on its own goroutine
// (settle), as the UI thread would.
type uiQueue struct{ ch chan func() }

func newUIQueue() *uiQueue { return &uiQueue{ch: make(chan func(), 4096)} }

func (q *uiQueue) post(f func()) { q.ch <- f }

// settle runs the queue until every job of the window has returned and
// been delivered.
func settle(t testing.TB, w *Window, q *uiQueue) {
	t.Helper()
	settleJobs(t, w.Jobs, q)
}

// settleJobs runs the queue until every job has returned and been
// delivered.
func settleJobs(t testing.TB, jobs *Jobs, q *uiQueue) {
	t.Helper()
	deadline := time.After(60 * time.Second)
	for {
		select {
		case f := <-q.ch:
			f()
			continue
		default:
		}
		if jobs.Idle() && len(q.ch) == 0 {
			return
		}
		select {
		case f := <-q.ch:
			f()
		case <-time.After(5 * time.Millisecond):
		case <-deadline:
			t.Fatalf("the jobs did not finish within 60 s: %v", jobs.Running())
		}
	}
}

// invented returns an invented target: class, RA (hours), Dec (degrees),
// an ephemeris of period p days with T0 at JD epoch (BJD_TDB).
func invented(name string, class observe.Class, raH, decDeg, epoch, p float64) observe.Target {
	kind := observe.Max
	if class == observe.Eclipsing {
		kind = observe.Min
	}
	eph := ephem.Ephemeris{Epoch: epoch, PeriodDays: p, Scale: ephem.BJDTDB, EpochErr: 0.001, PeriodErr: 1e-6}
	return observe.NewTarget(name, ephem.Star{RAHours: raH, DecDeg: decDeg}, class, eph, kind)
}

// smallTargets are three invented stars placed for December evenings at
// the demo site, with short periods so that each has extrema every night.
func smallTargets() []observe.Target {
	return []observe.Target{
		invented("Test Alpha", observe.Pulsating, 2.5, 40, 2461375.4, 0.37),
		invented("Test Beta", observe.Eclipsing, 5.2, 30, 2461375.6, 0.81),
		invented("Test Gamma", observe.Pulsating, 22.8, 55, 2461375.5, 0.23),
	}
}

// smallLogbook makes a logbook in a temporary directory with the demo's
// main site, a second site in the southern hemisphere and smallTargets.
func smallLogbook(t testing.TB) *logbook.Logbook {
	t.Helper()
	lb, err := logbook.Create(filepath.Join(t.TempDir(), "small.db"))
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { lb.Close() })
	south, err := observe.NewSite("Test South", -33.9, 18.4, 20, "Africa/Johannesburg", 15, nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range []observe.Site{demo.Site(), south} {
		if err := lb.AddSite(s); err != nil {
			t.Fatal(err)
		}
	}
	for _, tg := range smallTargets() {
		if err := lb.AddTarget(tg, "invented for the tests"); err != nil {
			t.Fatal(err)
		}
	}
	return lb
}

// demoMaster is the demo logbook made once per test run (generating it
// takes half a second), which demoLogbook copies for each test.
var demoMaster struct {
	once sync.Once
	path string
	err  error
}

// demoLogbook returns a fresh copy of the demo logbook (internal/demo) in
// the test's temporary directory: the test may change it freely.
func demoLogbook(t testing.TB) *logbook.Logbook {
	t.Helper()
	demoMaster.once.Do(func() {
		benchDirOnce.Do(func() { benchDir, demoMaster.err = os.MkdirTemp("", "vigil-app-bench") })
		if demoMaster.err != nil {
			return
		}
		demoMaster.path = filepath.Join(benchDir, "demo-master.db")
		lb, err := demo.Create(demoMaster.path)
		if err == nil {
			err = lb.Close() // a closed logbook has its log folded into the file
		}
		demoMaster.err = err
	})
	if demoMaster.err != nil {
		t.Fatalf("the demo logbook: %v", demoMaster.err)
	}
	data, err := os.ReadFile(demoMaster.path)
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "demo.db")
	if err := os.WriteFile(path, data, 0o600); err != nil {
		t.Fatal(err)
	}
	lb, err := logbook.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { lb.Close() })
	return lb
}

// openWindow builds the window on lb with the pinned clock and the test
// queue, at 1280 × 800, and lets the first night be planned and drawn.
func openWindow(t testing.TB, lb *logbook.Logbook) (*Window, *uiQueue) {
	t.Helper()
	fa := test.NewApp()
	t.Cleanup(fa.Quit)
	q := newUIQueue()
	w := New(fa, lb, Options{Now: func() time.Time { return testNow }, Post: q.post, Size: fyne.NewSize(1280, 800)})
	settle(t, w, q)
	return w, q
}

// tonight returns the window's Tonight page.
func tonight(t testing.TB, w *Window) *tonightView {
	t.Helper()
	v, ok := w.Page("tonight").(*tonightView)
	if !ok {
		t.Fatal("the window has no Tonight page")
	}
	return v
}
