package main

import (
	"fmt"
	"io"
	"os"
	"runtime"

	fyneapp "fyne.io/fyne/v2/app"

	"example.org/vigil/app"
	"example.org/vigil/internal/demo"
	"example.org/vigil/internal/quietlog"
)

// appID identifies vigil to the desktop (preferences, window grouping).
const appID = "vigil.desktop"

// openWindow opens the window on the logbook at path ("" for the default,
// defaultLogbookPath), creating it with the demo scenario when it does not
// exist yet, and returns the exit status when the window closes. Tests
// replace it: they run without a display.
var openWindow = func(path string, stderr io.Writer) int {
	if runtime.GOOS == "linux" && os.Getenv("DISPLAY") == "" && os.Getenv("WAYLAND_DISPLAY") == "" {
		fmt.Fprintln(stderr, "vigil: no display to open the window on (DISPLAY is not set); every command works without one: vigil help")
		return exitUsage
	}
	if path == "" {
		p, err := defaultLogbookPath()
		if err != nil {
			fmt.Fprintf(stderr, "vigil: finding the default logbook: %s\n", oneLine(err.Error()))
			return exitFail
		}
		path = p
	}
	lb, _, err := demo.OpenOrCreate(path)
	if err != nil {
		fmt.Fprintf(stderr, "vigil: %s\n", oneLine(openError(path, err).Error()))
		return exitUsage
	}
	defer lb.Close()
	quietlog.Restore()
	app.New(fyneapp.NewWithID(appID), lb, app.EnvOptions()).ShowAndRun()
	return exitOK
}
