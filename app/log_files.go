package app

import (
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"time"

	"example.org/vigil/app/report"
)

// logPagesRe finds the page count of a PDF: the /Count of its page tree
// (ISO 32000-1:2008, 7.7.3.2).
var logPagesRe = regexp.MustCompile(`/Type\s*/Pages\b[^>]*?/Count\s+(\d+)`)

// logPDFPages returns the number of pages of a PDF, 0 when it cannot tell.
func logPDFPages(pdf []byte) int {
	m := logPagesRe.FindSubmatch(pdf)
	if m == nil {
		return 0
	}
	n, _ := strconv.Atoi(string(m[1]))
	return n
}

// LogFileName is the file name the Log page offers for the log of the
// night of date at the site: vigil-log-<site>-<date>.<ext>, the site's
// name in lower case with every run of other characters than letters and
// digits made one hyphen ("vigil-log-ashgrove-hill-observatory-demo-
// 2026-12-01.pdf").
func LogFileName(site string, date time.Time, ext string) string {
	var b strings.Builder
	dash := false
	for _, r := range strings.ToLower(site) {
		if r < 0x80 && (r >= 'a' && r <= 'z' || r >= '0' && r <= '9') {
			if dash && b.Len() > 0 {
				b.WriteByte('-')
			}
			b.WriteRune(r)
			dash = false
		} else {
			dash = true
		}
	}
	name := "vigil-log-"
	if b.Len() > 0 {
		name += b.String() + "-"
	}
	return name + date.Format(time.DateOnly) + "." + ext
}

// logFormatName names a log file's format for people.
func logFormatName(ext string, paper report.Paper) string {
	if ext == "pdf" {
		return "PDF, " + logPaperName(paper)
	}
	return "plain text"
}

// logPaperName names a page size as the Log page offers it.
func logPaperName(p report.Paper) string {
	if p == report.Letter {
		return "US Letter"
	}
	return "A4"
}

// CheckLogPath checks a file name chosen to save the log as ext ("pdf" or
// "txt"): it must end in .ext (any case), name a file before the
// extension, and lie in an existing directory; it must not be a directory.
func CheckLogPath(path, ext string) error {
	want := "." + ext
	what := logFormatName(ext, report.A4)
	if ext == "pdf" {
		what = "a PDF"
	}
	switch {
	case strings.TrimSpace(path) == "":
		return fmt.Errorf("no file name given: want a name ending in %s", want)
	case !strings.EqualFold(filepath.Ext(path), want):
		return fmt.Errorf("%q does not end in %s: want a name ending in %s to save %s", filepath.Base(path), want, want, what)
	case len(filepath.Base(path)) == len(want):
		return fmt.Errorf("%q has no name before the extension: want a name such as night%s", filepath.Base(path), want)
	}
	if fi, err := os.Stat(filepath.Dir(path)); err != nil || !fi.IsDir() {
		return fmt.Errorf("the folder %q does not exist: want a file in an existing folder", filepath.Dir(path))
	}
	if fi, err := os.Stat(path); err == nil && fi.IsDir() {
		return fmt.Errorf("%q is a folder: want a file name ending in %s", path, want)
	}
	return nil
}

// SaveLog writes the log to path as ext ("pdf" or "txt") after CheckLogPath,
// whole or not at all (report.NightLog.Write): on any error nothing is
// written and an older file at path stays as it was.
func SaveLog(rl report.NightLog, path, ext string) error {
	if err := CheckLogPath(path, ext); err != nil {
		return err
	}
	if err := rl.Write(path); err != nil {
		return logPlain(err)
	}
	return nil
}

// logKB writes a size in bytes as kB (1000 bytes), at least 1.
func logKB(n int) string {
	return fmt.Sprintf("%d kB", max(1, (n+500)/1000))
}
