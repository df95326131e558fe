package report

import "example.org/vigil/observe"

// doc is the log laid out once as a list of blocks, which the text and the
// PDF writers both render, so that the two carry the same content.
type doc struct {
	title    string // "Observing log: Hilltop Yard"
	subtitle string // "night of Sat 2024-12-21 to Sun 2024-12-22"
	blocks   []block
}

// block is one piece of the log: heading, para, fields, table, pair,
// caution, notes, chartBlock or pageBreak.
type block interface{ isBlock() }

// heading starts a section.
type heading struct{ text string }

// para is a paragraph of running text; small ones are legends under a table.
type para struct {
	text  string
	small bool
}

// fields is a list of labelled values.
type fields struct {
	title string
	rows  [][2]string
}

// col is a column of a table: its head, its unit (the second line of the
// head, "" for none), and its width in the PDF (mm on A4, scaled to the
// page).
type col struct {
	head, unit string
	right      bool
	mm         float64
}

// table is a table with units in its head. With no rows, the text writer
// prints empty and the PDF writer blank ruled rows to fill in by hand.
type table struct {
	title string
	cols  []col
	rows  [][]string
	empty string
	blank int
}

// pair sets two blocks side by side in the PDF, one after the other in text.
type pair struct {
	left, right block
	split       float64 // the left block's share of the width
}

// caution is a warning set off from the text (the Sun caution).
type caution struct {
	title, text string
}

// notes is a form to fill in at the eyepiece: labelled fields each on a
// ruled line, then blank ruled lines.
type notes struct {
	title, detail string
	labels        []string
	lines         int
}

// chartBlock is the altitude chart: the picture in the PDF, the altitudes
// by the hour in the text.
type chartBlock struct {
	chart  *observe.Chart
	events []observe.Event // the planned events, numbered from 1 in this order
	hourly table
}

// pageBreak starts a new page in the PDF.
type pageBreak struct{}

func (heading) isBlock()    {}
func (para) isBlock()       {}
func (fields) isBlock()     {}
func (table) isBlock()      {}
func (pair) isBlock()       {}
func (caution) isBlock()    {}
func (notes) isBlock()      {}
func (chartBlock) isBlock() {}
func (pageBreak) isBlock()  {}
