package app

import (
	"bytes"
	"context"
	"errors"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"example.org/vigil/app/report"
	"example.org/vigil/internal/demo"
)

// The page count read from the page tree matches the page objects of the
// file (ISO 32000-1:2008, 7.7.3.3: one /Type /Page dictionary a page).
func TestLogPDFPages(t *testing.T) {
	for _, paper := range []report.Paper{report.A4, report.Letter} {
		rl := logPlanned(t, demo.Site(), smallTargets(), logTestDate)
		rl.Paper = paper
		var b bytes.Buffer
		if err := rl.WritePDF(&b); err != nil {
			t.Fatal(err)
		}
		objects := len(regexp.MustCompile(`/Type\s*/Page\b[^s]`).FindAll(b.Bytes(), -1))
		if got := logPDFPages(b.Bytes()); got != objects || got < 2 {
			t.Errorf("%v: %d pages read, %d page objects in the file", paper, got, objects)
		}
	}
	if got := logPDFPages([]byte("not a PDF")); got != 0 {
		t.Errorf("pages of a non-PDF: %d, want 0", got)
	}
}

func TestLogFileName(t *testing.T) {
	for _, tc := range []struct{ site, ext, want string }{
		{demo.SiteName, "pdf", "vigil-log-ashgrove-hill-observatory-demo-2026-12-01.pdf"},
		{"Test South", "txt", "vigil-log-test-south-2026-12-01.txt"},
		{"  Mt. Élan / 2 ", "pdf", "vigil-log-mt-lan-2-2026-12-01.pdf"},
		{"***", "pdf", "vigil-log-2026-12-01.pdf"},
	} {
		if got := LogFileName(tc.site, logTestDate, tc.ext); got != tc.want {
			t.Errorf("LogFileName(%q, %q) = %q, want %q", tc.site, tc.ext, got, tc.want)
		}
	}
}

// SaveLog writes a PDF or a text file whole, and for a bad name or a
// place that cannot be written says why and writes nothing.
func TestSaveLog(t *testing.T) {
	rl := logPlanned(t, demo.Site(), smallTargets(), logTestDate)
	dir := t.TempDir()
	notDir := filepath.Join(dir, "plain-file")
	if err := os.WriteFile(notDir, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name, path, ext string
		wantErr         string // "" for none
		start           string // the file's first bytes
	}{
		{"PDF", filepath.Join(dir, "night.pdf"), "pdf", "", "%PDF-"},
		{"PDF, upper case", filepath.Join(dir, "NIGHT.PDF"), "pdf", "", "%PDF-"},
		{"text", filepath.Join(dir, "night.txt"), "txt", "", "Observing log: " + demo.SiteName},
		{"text asked, .pdf given", filepath.Join(dir, "other.pdf"), "txt", `"other.pdf" does not end in .txt`, ""},
		{"no extension", filepath.Join(dir, "night"), "pdf", `"night" does not end in .pdf`, ""},
		{"other extension", filepath.Join(dir, "night.doc"), "pdf", `"night.doc" does not end in .pdf: want a name ending in .pdf to save a PDF`, ""},
		{"no name", filepath.Join(dir, ".pdf"), "pdf", "has no name before the extension", ""},
		{"no such folder", filepath.Join(dir, "missing", "night.pdf"), "pdf", "does not exist: want a file in an existing folder", ""},
		{"a file for a folder", filepath.Join(notDir, "night.pdf"), "pdf", "does not exist", ""},
		{"a folder", filepath.Join(dir, "sub.pdf"), "pdf", "is a folder", ""},
		{"empty", "", "pdf", "no file name given", ""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if tc.name == "a folder" {
				if err := os.Mkdir(tc.path, 0o755); err != nil {
					t.Fatal(err)
				}
			}
			err := SaveLog(rl, tc.path, tc.ext)
			if tc.wantErr != "" {
				if err == nil || !strings.Contains(err.Error(), tc.wantErr) {
					t.Fatalf("got error %v, want one containing %q", err, tc.wantErr)
				}
				if fi, serr := os.Stat(tc.path); tc.path != "" && serr == nil && !fi.IsDir() {
					t.Errorf("%s was written after an error", tc.path)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			b, err := os.ReadFile(tc.path)
			if err != nil {
				t.Fatal(err)
			}
			if !bytes.HasPrefix(b, []byte(tc.start)) {
				t.Errorf("%s starts %q, want %q", tc.path, b[:min(len(b), 20)], tc.start)
			}
			if tc.ext == "txt" && string(b) != logText(t, rl) {
				t.Error("the text file differs from WriteText")
			}
		})
	}
	// A place the system refuses to write (even to root): nothing is made,
	// and the error says so in plain words (no package prefix).
	if fi, err := os.Stat("/proc/self"); err == nil && fi.IsDir() {
		err := SaveLog(rl, "/proc/self/vigil-log-test.pdf", "pdf")
		if err == nil || strings.HasPrefix(err.Error(), "report:") {
			t.Errorf("saving into /proc: got %v, want a plain error", err)
		}
	}
	// An older file stays as it was when the new one cannot be made.
	old := filepath.Join(dir, "keep.txt")
	if err := os.WriteFile(old, []byte("older log"), 0o644); err != nil {
		t.Fatal(err)
	}
	bad := rl
	bad.Paper = report.Paper(7)
	if err := SaveLog(bad, old, "txt"); err == nil {
		t.Error("a log with an impossible paper was saved")
	}
	if b, _ := os.ReadFile(old); string(b) != "older log" {
		t.Errorf("the older file now holds %q", b)
	}
}

// logFakePrint is a print command that records what it was given.
type logFakePrint struct {
	found     map[string]bool // the commands on the fake PATH
	cmd       string
	args      []string
	pdfStart  []byte // the first bytes of the file it was given
	reply     string
	fail      error
	tempFiles []string
}

func (f *logFakePrint) printer(tmp string) LogPrinter {
	return LogPrinter{TempDir: tmp,
		LookPath: func(name string) (string, error) {
			if f.found[name] {
				return "/fake/bin/" + name, nil
			}
			return "", errors.New("not found")
		},
		Run: func(_ context.Context, cmd string, args ...string) ([]byte, error) {
			f.cmd, f.args = cmd, args
			if len(args) > 0 {
				b, _ := os.ReadFile(args[len(args)-1])
				f.pdfStart = b[:min(len(b), 5)]
				f.tempFiles = append(f.tempFiles, args[len(args)-1])
			}
			return []byte(f.reply), f.fail
		}}
}

func TestLogPrinter(t *testing.T) {
	rl := logPlanned(t, demo.Site(), smallTargets(), logTestDate)
	const file, title = "vigil-log-x-2026-12-01.pdf", "Observing log X 2026-12-01"
	for _, tc := range []struct {
		name      string
		found     []string
		reply     string
		fail      error
		wantCmd   string
		wantFlag  string
		wantReply string
		wantErr   string
	}{
		{"lp", []string{"lp", "lpr"}, "request id is Desk-12 (1 file(s))\n", nil, "/fake/bin/lp", "-t", "request id is Desk-12 (1 file(s))", ""},
		{"lpr only", []string{"lpr"}, "", nil, "/fake/bin/lpr", "-J", "The log was sent to the default printer with lpr.", ""},
		{"no command", nil, "", nil, "", "", "", ErrNoPrintCommand.Error()},
		{"refused", []string{"lp"}, "lp: Error - no default destination available.", errors.New("exit status 1"), "/fake/bin/lp", "-t", "",
			"lp did not take the log: lp: Error - no default destination available."},
	} {
		t.Run(tc.name, func(t *testing.T) {
			f := &logFakePrint{found: map[string]bool{}, reply: tc.reply, fail: tc.fail}
			for _, n := range tc.found {
				f.found[n] = true
			}
			tmp := t.TempDir()
			reply, err := f.printer(tmp).Print(context.Background(), rl, file, title)
			if tc.wantErr != "" {
				if err == nil || err.Error() != tc.wantErr {
					t.Errorf("error %v, want %q", err, tc.wantErr)
				}
			} else if err != nil || reply != tc.wantReply {
				t.Errorf("reply %q, error %v; want %q", reply, err, tc.wantReply)
			}
			if f.cmd != tc.wantCmd {
				t.Errorf("ran %q, want %q", f.cmd, tc.wantCmd)
			}
			if tc.wantCmd == "" {
				return
			}
			if len(f.args) != 3 || f.args[0] != tc.wantFlag || f.args[1] != title || filepath.Base(f.args[2]) != file ||
				!strings.HasPrefix(f.args[2], tmp+string(filepath.Separator)) {
				t.Errorf("arguments %q, want [%s %q %s/…/%s]", f.args, tc.wantFlag, title, tmp, file)
			}
			if string(f.pdfStart) != "%PDF-" {
				t.Errorf("the file given to the command starts %q, want %%PDF-", f.pdfStart)
			}
			if _, err := os.Stat(filepath.Dir(f.args[2])); !os.IsNotExist(err) {
				t.Errorf("the temporary PDF's folder is still there after printing (%v)", err)
			}
		})
	}
}

// NewLogPrinter runs the command it finds on the PATH: here a stand-in lp
// script that writes down its arguments and answers as a print spooler
// does.
func TestLogPrinterRunsCommand(t *testing.T) {
	if _, err := os.Stat("/bin/sh"); err != nil {
		t.Skip("no /bin/sh for the stand-in print command")
	}
	bin := t.TempDir()
	argsFile := filepath.Join(t.TempDir(), "args")
	script := "#!/bin/sh\nfor a in \"$@\"; do echo \"$a\"; done > " + argsFile + "\nhead -c 5 \"$3\" >> " + argsFile +
		"\necho 'request id is Stand-in-7 (1 file(s))'\n"
	if err := os.WriteFile(filepath.Join(bin, "lp"), []byte(script), 0o755); err != nil {
		t.Fatal(err)
	}
	t.Setenv("PATH", bin+string(os.PathListSeparator)+os.Getenv("PATH")) // the stand-in first
	rl := logPlanned(t, demo.Site(), smallTargets(), logTestDate)
	p := NewLogPrinter()
	p.TempDir = t.TempDir()
	reply, err := p.Print(context.Background(), rl, "night.pdf", "Night log")
	if err != nil || reply != "request id is Stand-in-7 (1 file(s))" {
		t.Fatalf("reply %q, error %v", reply, err)
	}
	b, err := os.ReadFile(argsFile)
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(string(b), "\n")
	if len(lines) < 4 || lines[0] != "-t" || lines[1] != "Night log" || filepath.Base(lines[2]) != "night.pdf" || lines[3] != "%PDF-" {
		t.Errorf("the stand-in lp got %q, want -t, the title, the PDF's path and a PDF", lines)
	}
	t.Setenv("PATH", t.TempDir())
	if _, err := NewLogPrinter().Print(context.Background(), rl, "night.pdf", "Night log"); err != ErrNoPrintCommand {
		t.Errorf("with no print command on the PATH: %v, want %v", err, ErrNoPrintCommand)
	}
}
