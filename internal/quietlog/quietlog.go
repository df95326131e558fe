// Package quietlog silences the standard logger while the program starts.
//
// Fyne's translation package, when it is initialised, logs "Fyne error:
// Error parsing user locale C" to stderr on every system whose locale is C or
// POSIX (common on servers and in containers): noise on every run of every
// command, which the command-line contract keeps for one line of error.
// Go initialises packages in the order of their import paths among those
// whose imports are ready (The Go Programming Language Specification,
// "Package initialization"), so this package, imported by cmd/vigil and
// sorting before "fyne.io/...", runs first and points the standard logger at
// io.Discard. The window calls Restore once it opens, so that the toolkit's
// later messages (driver errors) reach stderr again.
//
// It must import nothing but the standard library's io, log and os.
package quietlog

import (
	"io"
	"log"
	"os"
)

func init() { log.SetOutput(io.Discard) }

// Restore points the standard logger back at stderr.
func Restore() { log.SetOutput(os.Stderr) }
