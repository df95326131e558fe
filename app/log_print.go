package app

import (
	"context"
	"errors"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"

	"example.org/vigil/app/report"
)

// ErrNoPrintCommand is the answer of LogPrinter.Print when neither lp nor
// lpr is on the PATH.
var ErrNoPrintCommand = errors.New("no print command found: save as PDF and print it from your PDF viewer")

// LogPrinter sends the observing log to the system's print queue through
// its print command: lp (POSIX; CUPS), or else lpr (BSD; CUPS). Its
// functions are fields so that tests print nothing.
type LogPrinter struct {
	// LookPath finds a command on the PATH (exec.LookPath).
	LookPath func(name string) (string, error)
	// Run runs the command and returns what it printed on stdout and
	// stderr together.
	Run func(ctx context.Context, cmd string, args ...string) ([]byte, error)
	// TempDir is where the PDF is written for the command ("": the
	// system's temporary directory).
	TempDir string
}

// NewLogPrinter returns the printer that runs the system's commands.
func NewLogPrinter() LogPrinter {
	return LogPrinter{LookPath: exec.LookPath, Run: func(ctx context.Context, cmd string, args ...string) ([]byte, error) {
		return exec.CommandContext(ctx, cmd, args...).CombinedOutput()
	}}
}

// Command returns the print command on the PATH and its name ("lp" or
// "lpr"), or ErrNoPrintCommand.
func (p LogPrinter) Command() (path, name string, err error) {
	for _, name := range []string{"lp", "lpr"} {
		if path, err := p.LookPath(name); err == nil {
			return path, name, nil
		}
	}
	return "", "", ErrNoPrintCommand
}

// Print writes the log as a PDF to a file in a new temporary directory
// named by file, sends it to the default printer with the print command
// (lp -t TITLE FILE, or lpr -J TITLE FILE), and removes the file once the
// command has returned (lp and lpr hand the file to the print spooler
// before they do). It returns the command's reply ("request id is …"), or
// a sentence saying the log was sent when the command printed nothing.
func (p LogPrinter) Print(ctx context.Context, rl report.NightLog, file, title string) (string, error) {
	cmd, name, err := p.Command()
	if err != nil {
		return "", err
	}
	dir, err := os.MkdirTemp(p.TempDir, "vigil-print-")
	if err != nil {
		return "", fmt.Errorf("no room for the PDF to print: %w", err)
	}
	defer os.RemoveAll(dir)
	path := filepath.Join(dir, file)
	if err := rl.Write(path); err != nil {
		return "", logPlain(err)
	}
	if err := ctx.Err(); err != nil {
		return "", err
	}
	args := []string{"-t", title, path}
	if name == "lpr" {
		args = []string{"-J", title, path}
	}
	out, err := p.Run(ctx, cmd, args...)
	reply := strings.TrimSpace(string(out))
	if err != nil {
		if ctx.Err() != nil {
			return "", ctx.Err()
		}
		if reply == "" {
			reply = err.Error()
		}
		return "", fmt.Errorf("%s did not take the log: %s", name, reply)
	}
	if reply == "" {
		reply = "The log was sent to the default printer with " + name + "."
	}
	return reply, nil
}
