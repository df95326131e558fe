package report

import (
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"example.org/vigil/internal/safefile"
)

// Write writes the log to path in the format its extension names: a PDF for
// ".pdf", plain text for ".txt" (any case). The file is written whole or not
// at all (internal/safefile): on any error an older file at path stays as it
// was.
func (l *NightLog) Write(path string) error {
	var write func(io.Writer) error
	switch ext := strings.ToLower(filepath.Ext(path)); ext {
	case ".pdf":
		write = l.WritePDF
	case ".txt":
		write = l.WriteText
	default:
		return fmt.Errorf("report: %s: extension %q: want .pdf or .txt", path, filepath.Ext(path))
	}
	// Lay the log out first, so that bad input fails before any file is made.
	if err := l.check(); err != nil {
		return fmt.Errorf("report: %s: %w", path, err)
	}
	if err := safefile.Write(path, write); err != nil {
		return fmt.Errorf("report: %w", err)
	}
	return nil
}
