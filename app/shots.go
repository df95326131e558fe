package app

import (
	"fmt"
	"image"
	"image/png"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"time"

	"example.org/vigil/internal/safefile"
)

// The environment variables EnvOptions reads.
const (
	// ShotsEnv names the directory of the capture mode (Options.ShotsDir).
	ShotsEnv = "VIGIL_SHOTS"
	// ShotsGrabEnv names a command that saves the window's pixels to the
	// file named as its last argument (Options.ShotsGrab), e.g.
	// "import -window vigil" (ImageMagick).
	ShotsGrabEnv = "VIGIL_SHOTS_GRAB"
	// ThemeEnv names the theme to start with: light, dark or night-red.
	ThemeEnv = "VIGIL_THEME"
	// ShotsStarEnv and ShotsDateEnv choose the star and the night the
	// capture mode shows (Options.ShotsStar, Options.ShotsDate).
	ShotsStarEnv = "VIGIL_SHOTS_STAR"
	ShotsDateEnv = "VIGIL_SHOTS_DATE"
)

// EnvOptions returns the options the environment asks for (ShotsEnv,
// ShotsGrabEnv, ThemeEnv; an unknown theme is reported on stderr and the
// light one used).
func EnvOptions() Options {
	t, err := ParseTheme(os.Getenv(ThemeEnv))
	if err != nil {
		fmt.Fprintf(os.Stderr, "vigil: %s: %v\n", ThemeEnv, err)
	}
	return Options{Theme: t, ShotsDir: os.Getenv(ShotsEnv), ShotsGrab: os.Getenv(ShotsGrabEnv),
		ShotsStar: os.Getenv(ShotsStarEnv), ShotsDate: os.Getenv(ShotsDateEnv)}
}

// settleFrame is how long the capture mode lets the window paint after the
// work of a step is done (a variable for the tests).
var settleFrame = 400 * time.Millisecond

// ShotName returns the file name of the screenshot of page in theme:
// "<page>-<theme>.png", e.g. tonight-night-red.png.
func ShotName(page string, t ThemeChoice) string { return page + "-" + t.Slug() + ".png" }

// captureAll runs the capture mode on its own goroutine: once the first
// frame is up, it brings every page to the front in every theme, saves the
// window as dir/<page>-<theme>.png (ShotName), lists them in
// dir/shots.txt (ShotsIndex) and quits. A failure is printed on stderr,
// leaves no index, and quits too.
func (w *Window) captureAll(dir string) {
	err := w.capture(dir)
	if err != nil {
		fmt.Fprintln(os.Stderr, "vigil: screenshots:", err)
	}
	w.onUI(func() { w.App.Quit() })
}

func (w *Window) capture(dir string) error {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return err
	}
	if w.opt.ShotsDate != "" {
		d, err := time.Parse("2006-01-02", w.opt.ShotsDate)
		if err != nil {
			return fmt.Errorf("%s %q: want a date YYYY-MM-DD", ShotsDateEnv, w.opt.ShotsDate)
		}
		w.onUI(func() { w.Session.SetDate(d) })
	}
	if w.opt.ShotsStar != "" {
		w.onUI(func() { w.Session.Select(w.opt.ShotsStar) })
	}
	w.waitIdle()
	start := w.Session.Theme()
	defer w.onUI(func() { w.Session.SetTheme(start) })
	var names []string
	for _, t := range Themes {
		w.onUI(func() { w.Session.SetTheme(t) })
		for _, s := range Screens() {
			w.onUI(func() { w.ShowPage(s.Name) })
			w.waitIdle()
			if err := w.shoot(filepath.Join(dir, ShotName(s.Name, t))); err != nil {
				return err
			}
			names = append(names, ShotName(s.Name, t))
			sv, ok := w.Page(s.Name).(shotViews)
			if !ok {
				continue
			}
			views := sv.ShotViews()
			for _, view := range views {
				w.onUI(view.Show)
				w.waitIdle()
				if view.Then != nil {
					w.onUI(view.Then)
					w.waitIdle()
				}
				name := ShotName(s.Name+"-"+view.Slug, t)
				if err := w.shoot(filepath.Join(dir, name)); err != nil {
					return err
				}
				names = append(names, name)
			}
			if len(views) > 0 {
				w.onUI(sv.ShotViewsDone)
			}
		}
	}
	// The list of shots, written last: its presence says all were taken.
	return safefile.Write(filepath.Join(dir, ShotsIndex), func(f io.Writer) error {
		_, err := io.WriteString(f, strings.Join(names, "\n")+"\n")
		return err
	})
}

// shotViews is a page with views of its own (tabs inside the page) that
// the capture mode shoots besides the page as it opens.
type shotViews interface {
	// ShotViews lists the views to shoot after the page itself.
	ShotViews() []ShotView
	// ShotViewsDone puts the page back as it opens.
	ShotViewsDone()
}

// ShotView is one view of a page for the capture mode: Show brings it to
// the front; its shot is saved as <page>-<Slug>-<theme>.png.
type ShotView struct {
	Slug string
	Show func()
	// Then, when set, runs once the work Show started is done.
	Then func()
}

// ShotsIndex is the file the capture mode writes last in its directory,
// naming every screenshot it took, one a line.
const ShotsIndex = "shots.txt"

// shoot saves the window as it shows now to path: through Options.ShotsGrab
// when set, else through the canvas's Capture. Fyne's GL driver reads the
// front buffer, which some software OpenGL stacks (Mesa under Xvfb) leave
// empty: an image with no opaque pixel is an error that says what to do.
func (w *Window) shoot(path string) error {
	if w.opt.ShotsGrab != "" {
		args := strings.Fields(w.opt.ShotsGrab)
		out, err := exec.Command(args[0], append(args[1:], path)...).CombinedOutput()
		if err != nil {
			return fmt.Errorf("%s %s: %v: %s", w.opt.ShotsGrab, path, err, out)
		}
		return nil
	}
	var img image.Image
	w.onUI(func() { img = w.Win.Canvas().Capture() })
	if img == nil || blank(img) {
		return fmt.Errorf("the window's canvas gave an empty image for %s (as the GL driver does under Xvfb): set %s to a screen grabber, e.g. %q",
			filepath.Base(path), ShotsGrabEnv, "import -window vigil")
	}
	return writePNG(path, img)
}

// blank reports whether img has no opaque pixel on a coarse grid.
func blank(img image.Image) bool {
	b := img.Bounds()
	for y := b.Min.Y; y < b.Max.Y; y += 8 {
		for x := b.Min.X; x < b.Max.X; x += 8 {
			if _, _, _, a := img.At(x, y).RGBA(); a > 0 {
				return false
			}
		}
	}
	return true
}

// onUI runs f on the UI thread and waits for it.
func (w *Window) onUI(f func()) {
	done := make(chan struct{})
	w.opt.Post(func() { f(); close(done) })
	<-done
}

// waitIdle waits until no job is left and the window has painted.
func (w *Window) waitIdle() {
	for {
		time.Sleep(settleFrame)
		idle := false
		w.onUI(func() { idle = w.Jobs.Idle() })
		if idle {
			time.Sleep(settleFrame)
			return
		}
	}
}

// writePNG writes img to path as PNG, whole or not at all.
func writePNG(path string, img image.Image) error {
	return safefile.Write(path, func(f io.Writer) error { return png.Encode(f, img) })
}
