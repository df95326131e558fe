package app

import (
	"image/png"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// The capture mode on the test driver (whose Capture paints in software):
// every page in every theme, listed in the index, night red in deep red.
func TestCaptureMode(t *testing.T) {
	w, q := openWindow(t, smallLogbook(t))
	defer func(d time.Duration) { settleFrame = d }(settleFrame)
	settleFrame = 10 * time.Millisecond
	dir := t.TempDir()
	done := make(chan error, 1)
	go func() { done <- w.capture(dir) }()
	var err error
	for running := true; running; {
		select {
		case f := <-q.ch:
			f()
		case err = <-done:
			running = false
		case <-time.After(60 * time.Second):
			t.Fatal("the capture mode did not finish in 60 s")
		}
	}
	settle(t, w, q)
	if err != nil {
		t.Fatal(err)
	}
	index, err := os.ReadFile(filepath.Join(dir, ShotsIndex))
	if err != nil {
		t.Fatal(err)
	}
	names := strings.Fields(string(index))
	// every page, and the Timings page's O−C and period-search views
	if want := (len(Screens()) + 2) * len(Themes); len(names) != want {
		t.Fatalf("index lists %d shots, want %d: %v", len(names), want, names)
	}
	for _, n := range names {
		f, err := os.Open(filepath.Join(dir, n))
		if err != nil {
			t.Errorf("shot %s: %v", n, err)
			continue
		}
		img, err := png.Decode(f)
		f.Close()
		if err != nil || img.Bounds().Dx() != 1280 || img.Bounds().Dy() != 800 {
			t.Errorf("shot %s: %v, bounds %v; want a 1280 × 800 PNG", n, err, img.Bounds())
			continue
		}
		if strings.HasSuffix(n, "-night-red.png") {
			r, g, b, _ := img.At(640, 20).RGBA()
			if g != 0 || b != 0 || r > nightMaxRed*0x101 {
				t.Errorf("shot %s: the header is not deep red at (640, 20): %d %d %d", n, r>>8, g>>8, b>>8)
			}
		}
	}
	if w.Session.Theme() != ThemeLight {
		t.Errorf("theme after the shots: %v, want the one it started with", w.Session.Theme())
	}
}

func TestScreensTable(t *testing.T) {
	w, _ := openWindow(t, smallLogbook(t))
	seen := map[string]bool{}
	for i, s := range Screens() {
		if s.Name == "" || s.Title == "" || s.Icon == nil || s.New == nil || seen[s.Name] {
			t.Errorf("screen %d %+v: want a unique name, a title, an icon and a constructor", i, s)
		}
		seen[s.Name] = true
		if w.tabs.Items[i].Text != s.Title || w.Page(s.Name) == nil {
			t.Errorf("tab %d is %q, want the page %q", i, w.tabs.Items[i].Text, s.Title)
		}
	}
	if w.Page("nothing") != nil {
		t.Error("Page of an unknown name is not nil")
	}
}

func TestEnvOptions(t *testing.T) {
	t.Setenv(ShotsEnv, "/tmp/x")
	t.Setenv(ShotsGrabEnv, "import -window vigil")
	t.Setenv(ThemeEnv, "night-red")
	o := EnvOptions()
	if o.ShotsDir != "/tmp/x" || o.ShotsGrab != "import -window vigil" || o.Theme != ThemeNightRed {
		t.Errorf("EnvOptions: got %+v", o)
	}
}
