package report

import (
	"bufio"
	"fmt"
	"io"
	"strings"
	"unicode/utf8"
)

// textWidth is the width of running text and forms in the text log
// (characters); tables may be wider.
const textWidth = 96

// WriteText writes the log as plain UTF-8 text with aligned columns: the
// same content as the PDF, with the altitude chart given as a table of
// altitudes by the hour.
func (l *NightLog) WriteText(w io.Writer) error {
	d, err := l.layout()
	if err != nil {
		return err
	}
	bw := bufio.NewWriter(w)
	tw := textWriter{w: bw}
	tw.line(d.title)
	tw.line(d.subtitle)
	tw.line(strings.Repeat("=", max(runes(d.title), runes(d.subtitle))))
	for _, b := range d.blocks {
		tw.block(b)
	}
	if err := bw.Flush(); err != nil {
		return fmt.Errorf("report: writing the text log: %w", err)
	}
	return nil
}

type textWriter struct{ w *bufio.Writer }

func (t textWriter) line(s string) {
	t.w.WriteString(strings.TrimRight(s, " "))
	t.w.WriteByte('\n')
}

func (t textWriter) block(b block) {
	switch b := b.(type) {
	case heading:
		t.line("")
		t.line(b.text)
		t.line(strings.Repeat("-", runes(b.text)))
	case para:
		t.line("")
		indent := ""
		if b.small {
			indent = "  "
		}
		for _, s := range wrap(b.text, textWidth-len(indent)) {
			t.line(indent + s)
		}
	case fields:
		t.line("")
		t.line(b.title)
		wl := 0
		for _, r := range b.rows {
			wl = max(wl, runes(r[0]))
		}
		for _, r := range b.rows {
			t.line("  " + pad(r[0], wl, false) + "  " + r[1])
		}
	case table:
		t.table(b)
	case pair:
		t.block(b.left)
		t.block(b.right)
	case caution:
		t.line("")
		bar := strings.Repeat("!", textWidth)
		t.line(bar)
		for _, s := range wrap(b.title+": "+b.text, textWidth-4) {
			t.line("! " + s)
		}
		t.line(bar)
	case notes:
		t.notes(b)
	case chartBlock:
		t.table(b.hourly)
	case pageBreak:
		t.line("")
	}
}

func (t textWriter) table(b table) {
	t.line("")
	if b.title != "" {
		t.line(b.title)
	}
	if len(b.rows) == 0 {
		t.line("  " + b.empty)
		return
	}
	width := make([]int, len(b.cols))
	for i, c := range b.cols {
		width[i] = max(runes(c.head), runes(unitText(c.unit)))
		for _, r := range b.rows {
			width[i] = max(width[i], runes(r[i]))
		}
	}
	row := func(cells func(i int) string) {
		parts := make([]string, len(b.cols))
		for i, c := range b.cols {
			parts[i] = pad(cells(i), width[i], c.right)
		}
		t.line("  " + strings.Join(parts, "  "))
	}
	row(func(i int) string { return b.cols[i].head })
	row(func(i int) string { return unitText(b.cols[i].unit) })
	row(func(i int) string { return strings.Repeat("-", width[i]) })
	for _, r := range b.rows {
		row(func(i int) string { return r[i] })
	}
}

func (t textWriter) notes(b notes) {
	t.line("")
	t.line(b.title)
	for _, s := range wrap(b.detail, textWidth-2) {
		t.line("  " + s)
	}
	wl := 0
	for _, s := range b.labels {
		wl = max(wl, runes(s))
	}
	for _, s := range b.labels {
		t.line("  " + pad(s, wl, false) + "  " + strings.Repeat("_", textWidth-wl-4))
	}
	for range b.lines {
		t.line("  " + strings.Repeat("_", textWidth-2))
	}
}

// unitText writes a unit for a column head: "(°)", or "" for none.
func unitText(u string) string {
	if u == "" {
		return ""
	}
	return "(" + u + ")"
}

func runes(s string) int { return utf8.RuneCountInString(s) }

// pad fills s with spaces to w runes, on the left when right-aligned.
func pad(s string, w int, right bool) string {
	n := w - runes(s)
	if n <= 0 {
		return s
	}
	if right {
		return strings.Repeat(" ", n) + s
	}
	return s + strings.Repeat(" ", n)
}
