package main

import (
	"fmt"
	"os"
	"strings"
)

// This file holds vigil logbook, the group of commands that look after the
// logbook file: info and check in logbook_info.go, export and import in
// logbook_csv.go, backup and restore in logbook_backup.go. Each uses the logbook package's
// own API; none reads the file otherwise.

var logbookCommand = command{
	name:    "logbook",
	summary: "look after the logbook: info, check, CSV export and import, JSON backup and restore",
	run:     runLogbook,
}

// logbookCommands are the commands of vigil logbook, in the order its help
// shows them.
var logbookCommands = []command{
	{name: "info", summary: "the logbook's path, schema version, whether it holds the demo, rows per table", run: runLogbookInfo},
	{name: "check", summary: "SQLite's full consistency check of the file and the foreign-key check", run: runLogbookCheck},
	{name: "export", summary: "every table as CSV into a directory, or one table into a file", run: runLogbookExport},
	{name: "import", summary: "CSV tables from a directory, or one table from a file, all or nothing", run: runLogbookImport},
	{name: "backup", summary: "the whole logbook as one JSON file", run: runLogbookBackup},
	{name: "restore", summary: "a new logbook from a JSON backup, identical to the one backed up", run: runLogbookRestore},
}

// runLogbook runs one command of the group: vigil logbook NAME [flags].
func runLogbook(e *env, args []string) error {
	if len(args) == 0 {
		return fmt.Errorf("missing command: want one of %s (see %s --help)", logbookCommandNames(), e.cmd)
	}
	name := args[0]
	switch name {
	case "help", "-h", "-help", "--help":
		if len(args) > 1 && name == "help" {
			c, ok := lookupLogbook(args[1])
			if !ok {
				return unknownLogbookCommand(e, args[1])
			}
			e.cmd += " " + c.name
			return c.run(e, []string{"--help"})
		}
		writeLogbookHelp(e)
		return nil
	}
	c, ok := lookupLogbook(name)
	if !ok {
		return unknownLogbookCommand(e, name)
	}
	e.cmd += " " + c.name
	return c.run(e, args[1:])
}

// lookupLogbook finds a command of the group by name.
func lookupLogbook(name string) (command, bool) {
	for _, c := range logbookCommands {
		if c.name == name {
			return c, true
		}
	}
	return command{}, false
}

// logbookCommandNames lists the group's commands, comma-separated.
func logbookCommandNames() string {
	names := make([]string, len(logbookCommands))
	for i, c := range logbookCommands {
		names[i] = c.name
	}
	return strings.Join(names, ", ")
}

// unknownLogbookCommand is the error for a name that is no command of the
// group.
func unknownLogbookCommand(e *env, name string) error {
	if strings.HasPrefix(name, "-") {
		return fmt.Errorf("unknown flag %q before any command: want one of the commands %s (see %s --help)", name, logbookCommandNames(), e.cmd)
	}
	return fmt.Errorf("unknown command %q: want one of %s (see %s --help)", name, logbookCommandNames(), e.cmd)
}

// writeLogbookHelp prints the help of the group.
func writeLogbookHelp(e *env) {
	w := e.stdout
	fmt.Fprintf(w, `Usage:
  %[1]s COMMAND [flags]
  %[1]s help COMMAND    the flags of one command (same as %[1]s COMMAND --help)

The logbook is one SQLite file holding the observing sites, the targets with
the history of their ephemerides, comparison stars, nights with their plans,
measurements and timings. A logbook that does not exist yet is created with
the demo scenario in it (an import into a new path starts empty instead: it
would remove the demo anyway). CSV files hold one table each, with a header
row; records refer to each other by name (site, target) and by site and date
(night). An import only adds, in one transaction: every row or none, and an
error names the file, line and column. Importing into the demo logbook
removes the demo first. The JSON backup holds every table, column and row and
restores to an identical logbook.

Commands:
`, e.cmd)
	for _, c := range logbookCommands {
		fmt.Fprintf(w, "  %-8s %s\n", c.name, c.summary)
	}
	fmt.Fprintf(w, `
Flags:
  --logbook PATH  the logbook file, on every command (%s)
  --json          print one JSON object instead of text, on every command
  --help          print this help and exit
`, logbookNote)
}

// sameFile reports whether the paths a and b name one existing file.
func sameFile(a, b string) bool {
	fa, err := os.Stat(a)
	if err != nil {
		return false
	}
	fb, err := os.Stat(b)
	return err == nil && os.SameFile(fa, fb)
}
