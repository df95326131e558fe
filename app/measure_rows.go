package app

import (
	"context"
	"errors"
	"fmt"
	"slices"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/observe/logbook"
)

// The night's rows in the table, adding and deleting them, and the charts
// and summary that follow them.

// measureWidths are the widths of the table's columns by kind.
var measureWidths = map[MeasureColumn]float32{
	MeasureColClock: 74, MeasureColEstimate: 120, MeasureColInst: 132, MeasureColFilter: 52,
	MeasureColNumber: 68, MeasureColJD: 112,
}

// measureDeleteWidth is the width of the last column, the delete buttons.
const measureDeleteWidth = 40

func (v *measureView) size() (int, int) {
	if len(v.tbl.Rows) == 0 {
		return 0, 0
	}
	return len(v.tbl.Rows), len(v.tbl.Columns) + 1
}

// measureCell is a cell: a text, or in the last column a delete button.
type measureCell struct {
	widget.BaseWidget
	label *widget.Label
	del   *widget.Button
}

func (c *measureCell) CreateRenderer() fyne.WidgetRenderer {
	return widget.NewSimpleRenderer(container.NewStack(c.label, c.del))
}

func (v *measureView) newCell() fyne.CanvasObject {
	c := &measureCell{label: widget.NewLabel(""), del: widget.NewButtonWithIcon("", theme.DeleteIcon(), nil)}
	c.label.Truncation = fyne.TextTruncateClip
	c.del.Importance = widget.LowImportance
	c.ExtendBaseWidget(c)
	return c
}

func (v *measureView) updateCell(id widget.TableCellID, o fyne.CanvasObject) {
	c := o.(*measureCell)
	if id.Row >= len(v.tbl.Rows) {
		return
	}
	if id.Col == len(v.tbl.Columns) {
		c.label.Hide()
		c.del.Show()
		mid := v.tbl.Rows[id.Row].M.ID
		c.del.OnTapped = func() { v.deleteID(mid) }
		return
	}
	c.del.Hide()
	c.label.Show()
	if id.Col < len(v.tbl.Columns) {
		c.label.TextStyle.Bold = v.tbl.Columns[id.Col] == "Mag"
		c.label.SetText(v.tbl.Rows[id.Row].Cells[id.Col])
		c.label.Refresh()
	}
}

// showTable lays out the night's rows, or says what to do when there are
// none.
func (v *measureView) showTable() {
	if v.req == nil || v.data == nil {
		return
	}
	rows := v.data.Tonight()
	v.tbl = BuildMeasureTable(v.req.Target, v.req.Site.Location(), rows, v.form.visual())
	for i, k := range v.tbl.Kinds {
		v.grid.SetColumnWidth(i, measureWidths[k])
	}
	v.grid.SetColumnWidth(len(v.tbl.Columns), measureDeleteWidth)
	v.rowsHead.SetText(fmt.Sprintf("%s this night, the latest first", plural(len(rows), "row", "rows")))
	v.empty.SetText(fmt.Sprintf("No measurements for %s tonight: type one above (Ctrl+N) or import a file.", v.req.Target.Name))
	v.empty.Hidden = len(rows) > 0
	v.grid.Hidden = len(rows) == 0
	v.grid.Refresh()
	v.grid.ScrollToTop() // the latest row
}

// addRow reduces the row typed and stores it in the night (making the
// night's record first when needed).
func (v *measureView) addRow() {
	if v.adding || v.req == nil || v.data == nil {
		return
	}
	e := v.form.entry()
	r, details, lb := *v.req, v.nightDetails(), v.w.Session.Logbook()
	v.adding = true
	v.form.add.Disable()
	v.seq++
	type added struct {
		red   MeasureReduced
		m     logbook.Measurement
		night logbook.Night
	}
	Run(v.w.Jobs, fmt.Sprintf("measure-add#%d", v.seq), "", func(context.Context, Progress) (added, error) {
		red, err := ReduceEntry(e, r.Target, &r.Site, r.Date)
		if err != nil {
			return added{}, err
		}
		m, n, err := AddMeasureRow(lb, r, details, red.M)
		return added{red, m, n}, err
	}, func(a added, err error) {
		v.adding = false
		v.form.add.Enable()
		var ee MeasureEntryError
		switch {
		case errors.As(err, &ee):
			v.form.showErrors(ee)
			return
		case err != nil:
			v.form.showErrors(MeasureEntryError{{Msg: "This row could not be stored: " + err.Error()}})
			return
		}
		v.form.cleared(e)
		a.red.M = a.m
		v.form.showResult(a.red)
		if v.req != nil && v.req.Key() == r.Key() && v.data != nil {
			v.data.Night = a.night
			v.data.All = measureInsert(v.data.All, a.m) // the row shows at once
			v.showTable()
		}
		// The pages showing records (this one's charts and summary too)
		// read them again; the night is not planned again.
		v.w.RecordsChanged()
	})
}

// measureInsert adds m to ms, kept in time order.
func measureInsert(ms []logbook.Measurement, m logbook.Measurement) []logbook.Measurement {
	i, _ := slices.BinarySearchFunc(ms, m.JDUTC, func(x logbook.Measurement, jd float64) int {
		switch {
		case x.JDUTC < jd:
			return -1
		case x.JDUTC > jd:
			return 1
		}
		return 0
	})
	return slices.Insert(slices.Clone(ms), i, m)
}

// deleteID removes the row of the measurement with this ID from the
// logbook; Undo puts it back.
func (v *measureView) deleteID(id int64) {
	i := slices.IndexFunc(v.tbl.Rows, func(r MeasureTableRow) bool { return r.M.ID == id })
	if i < 0 || v.req == nil {
		return
	}
	m, r, lb := v.tbl.Rows[i].M, *v.req, v.w.Session.Logbook()
	v.seq++
	Run(v.w.Jobs, fmt.Sprintf("measure-delete#%d", v.seq), "", func(context.Context, Progress) (struct{}, error) {
		return struct{}{}, lb.DeleteMeasurement(m.ID)
	}, func(_ struct{}, err error) {
		if err != nil {
			v.status.SetText("The row could not be deleted: " + err.Error())
			return
		}
		v.deleted = &m
		v.status.SetText("Deleted the row of " + MeasureRowText(m, &r.Site) + ".")
		v.undo.Show()
		if v.req != nil && v.req.Key() == r.Key() && v.data != nil {
			v.data.All = slices.DeleteFunc(slices.Clone(v.data.All), func(x logbook.Measurement) bool { return x.ID == m.ID })
			v.showTable()
		}
		v.w.RecordsChanged()
	})
}

// undoDelete stores the row deleted last again.
func (v *measureView) undoDelete() {
	if v.deleted == nil {
		return
	}
	m, lb := *v.deleted, v.w.Session.Logbook()
	m.ID = 0
	v.deleted = nil
	v.undo.Hide()
	v.seq++
	Run(v.w.Jobs, fmt.Sprintf("measure-undo#%d", v.seq), "", func(context.Context, Progress) ([]int64, error) {
		return lb.AddMeasurements([]logbook.Measurement{m})
	}, func(_ []int64, err error) {
		if err != nil {
			v.status.SetText("The row could not be put back: " + err.Error())
			return
		}
		v.status.SetText("The row is back.")
		v.w.RecordsChanged()
	})
}
