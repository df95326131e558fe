// Command vigil plans and reduces observations of variable stars. Without
// arguments it opens the window on the default logbook (vigil --logbook PATH:
// on that one). With a subcommand it answers on the command line, as fixed by
// the command-line contract (flags, JSON fields, exit status):
//
//	vigil sky       where a star stands at one instant
//	vigil night     the dark hours at a site
//	vigil predict   the coming maxima or minima of one star, and which can be observed
//	vigil plan      the extrema of a list of targets over one night or several, ranked
//	vigil chart     the altitude chart of one night, as PNG, SVG or PDF
//	vigil log       the observing log of one night from the logbook, as PDF or plain text
//	vigil tonight   tonight at a site in plain text: twilights, Moon, local time and UTC
//	vigil reduce    differential photometry to calibrated magnitudes
//	vigil period    period search by Lomb–Scargle or phase dispersion
//	vigil extremum  the time of one maximum or minimum
//	vigil oc        O−C against an ephemeris, and what it says about the period
//	vigil distance  the period–luminosity distance of a Cepheid
//	vigil logbook   the logbook file: info, check, CSV export and import, JSON backup and restore
//	vigil help [COMMAND]
//
// Every subcommand takes --help. Bad input exits with status 2 and one line on
// stderr naming the flag at fault; nothing is written on stdout then.
//
// # The logbook
//
// Every command that reads or writes stored data takes --logbook PATH
// (default vigil/vigil.db in the user's configuration directory,
// logbook.DefaultPath). A logbook that does not exist yet is created with the
// demo scenario in it (demo.OpenOrCreate); a file that is not a logbook, or
// was written by a newer vigil, is refused with a message naming --logbook
// and left as it is. The logbook is opened only when a step needs it: a run
// with --lat and --lon never opens or makes one.
//
// --site NAME, on every command with site flags, names a site of the
// logbook: its exact name, else the one equal to it in any case, else the
// only one whose name contains it; "demo" is the demo's observatory
// (demo.Site) and needs no logbook. A named site brings its time zone, and to
// plan and chart its lowest useful altitude and horizon profile. plan and
// chart take the logbook's targets when --targets is not given; vigil log
// takes them always, with the night's record (observer, measurements,
// timings). vigil tonight prints tonight at a site in plain text.
//
// This package only wires flags to the engine (vigil/ephem and the packages
// above it) and prints: it computes nothing itself.
package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"strings"
	"time"

	_ "example.org/vigil/internal/quietlog" // before Fyne initialises: see the package
)

func main() {
	os.Exit(run(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
}

// Exit statuses.
const (
	exitOK    = 0
	exitFail  = 1 // could not write the output
	exitUsage = 2 // bad input or bad flags
)

// command is one subcommand: its name, the one-line summary shown by
// `vigil help`, and the function that runs it. A subcommand lives in a file
// of its own (sky.go, night.go, ...) and is listed once in commands.
type command struct {
	name    string
	summary string
	run     func(e *env, args []string) error
}

// commands lists the subcommands in the order `vigil help` shows them.
var commands = []command{
	skyCommand,
	nightCommand,
	predictCommand,
	planCommand,
	chartCommand,
	logCommand,
	reduceCommand,
	periodCommand,
	extremumCommand,
	ocCommand,
	distanceCommand,
	logbookCommand,
	tonightCommand,
}

// clock tells the time; tests replace it to pin "now" and "tonight".
var clock = time.Now

// env is what a subcommand may use. stdout is a buffer that run copies to the
// real output only when the subcommand succeeded, so that a failed run
// writes nothing there.
type env struct {
	cmd    string // "vigil sky", for messages
	stdin  io.Reader
	stdout *bytes.Buffer
	now    func() time.Time
	closes []func(failed bool) error // run when the command is done (an open logbook)
}

// atExit arranges for close to run when the command is done, whether it
// succeeded (failed is false) or not.
func (e *env) atExit(close func(failed bool) error) { e.closes = append(e.closes, close) }

// run executes the command line args (without the program name) and returns
// the exit status.
func run(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	std := streams{stdin, stdout, stderr}
	if len(args) == 0 {
		return openWindow("", stderr)
	}
	if path, ok, err := topLevelLogbook(args); ok || err != nil {
		if err != nil {
			fmt.Fprintf(stderr, "vigil: %s\n", oneLine(err.Error()))
			return exitUsage
		}
		return openWindow(path, stderr)
	}
	name := args[0]
	switch name {
	case "help", "-h", "-help", "--help":
		if len(args) > 1 && name == "help" {
			c, ok := lookup(args[1])
			if !ok {
				fmt.Fprintln(stderr, unknownCommand(args[1]))
				return exitUsage
			}
			// `vigil help sky` is `vigil sky --help`.
			return std.finish("vigil "+c.name, func(e *env) error { return c.run(e, []string{"--help"}) })
		}
		return std.finish("vigil", func(e *env) error { writeHelp(e.stdout); return nil })
	}
	c, ok := lookup(name)
	if !ok {
		fmt.Fprintln(stderr, unknownCommand(name))
		return exitUsage
	}
	return std.finish("vigil "+c.name, func(e *env) error { return c.run(e, args[1:]) })
}

// streams are the standard streams of one run.
type streams struct {
	stdin          io.Reader
	stdout, stderr io.Writer
}

// finish runs f with a buffered stdout and either copies the buffer out
// (success) or prints the error as one line on stderr and discards it.
func (s streams) finish(cmd string, f func(e *env) error) int {
	e := &env{cmd: cmd, stdin: s.stdin, stdout: new(bytes.Buffer), now: clock}
	err := f(e)
	failed := err != nil && !errors.Is(err, errHelp)
	for i := len(e.closes) - 1; i >= 0; i-- {
		if cerr := e.closes[i](failed); cerr != nil && err == nil {
			err = fmt.Errorf("closing: %w", cerr)
		}
	}
	if err != nil && !errors.Is(err, errHelp) {
		// e.cmd, which a command group sets to the name of its command.
		fmt.Fprintf(s.stderr, "%s: %s\n", e.cmd, oneLine(err.Error()))
		return exitUsage
	}
	if _, err := s.stdout.Write(e.stdout.Bytes()); err != nil {
		fmt.Fprintf(s.stderr, "%s: writing the output: %s\n", cmd, oneLine(err.Error()))
		return exitFail
	}
	return exitOK
}

// oneLine folds a message onto one line, so that stderr always gets exactly
// one line per failure.
func oneLine(s string) string {
	return strings.Join(strings.Fields(s), " ")
}

// lookup finds a subcommand by name.
func lookup(name string) (command, bool) {
	for _, c := range commands {
		if c.name == name {
			return c, true
		}
	}
	return command{}, false
}

// commandNames returns the subcommand names, comma-separated.
func commandNames() string {
	names := make([]string, len(commands))
	for i, c := range commands {
		names[i] = c.name
	}
	return strings.Join(names, ", ")
}

// unknownCommand is the one-line message for a name that is no subcommand.
func unknownCommand(name string) string {
	if strings.HasPrefix(name, "-") {
		return fmt.Sprintf("vigil: unknown flag %q before any command: want one of the commands %s (see vigil help)", name, commandNames())
	}
	return fmt.Sprintf("vigil: unknown command %q: want one of %s (see vigil help)", name, commandNames())
}

// writeHelp prints the top-level help: what vigil does and its commands.
func writeHelp(w io.Writer) {
	fmt.Fprint(w, `vigil plans and reduces observations of variable stars.

Usage:
  vigil                 opens the window on the default logbook
  vigil --logbook PATH  opens the window on that logbook
  vigil COMMAND [flags] answer on the command line
  vigil help COMMAND    the flags of one command (same as vigil COMMAND --help)

Commands:
`)
	for _, c := range commands {
		fmt.Fprintf(w, "  %-8s %s\n", c.name, c.summary)
	}
	fmt.Fprint(w, `
Conventions: latitude north positive and longitude EAST positive, in degrees;
right ascension in hours (5.5 or 05:30:00), declination in degrees (-05:23:28),
ICRS / J2000; instants in ISO 8601 UTC (2026-12-01T03:00:00Z) or as a Julian
date with a JD prefix (JD2461375.625); altitudes are airless unless a name says
refracted; azimuth from north through east. --json prints one JSON object.
Bad input exits with status 2 and one line on stderr naming the flag.
The logbook: --logbook PATH on every command that reads or writes stored
data (default vigil/vigil.db in the user's configuration directory); one that
does not exist yet is created with the demo scenario in it. --site NAME names
one of its sites; --site demo is the demo site and needs no logbook.
`)
}

// errHelp is returned by a flag parse that printed the help instead of
// running the command: run then writes the help and exits 0.
var errHelp = errors.New("help printed")
