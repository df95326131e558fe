package app

import (
	"context"
	"fmt"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/observe"
)

// The roles of the comparison star editor.
const (
	starRoleComp  = "comparison"
	starRoleCheck = "check"
)

// starCompsPanel is the table of the star's comparison and check stars
// with an editor under it: tap a row to change or remove it, or fill the
// editor and add a new one. Every change is saved through the logbook
// (AddComp, SetComps, DeleteComp).
type starCompsPanel struct {
	v    *starView
	rows []StarComp
	sel  int // the row being edited, -1 for none

	table             *widget.Table
	tableBox          *fyne.Container
	empty             *widget.Label
	emptyBox          *container.ThemeOverride
	id, vmag, bv      *keyEntry
	role              *widget.Select
	errs              map[string]*widget.Label
	add, save, remove *widget.Button
	formErr           *widget.Label
	root              *fyne.Container
}

func newStarCompsPanel(v *starView) *starCompsPanel {
	p := &starCompsPanel{v: v, sel: -1, errs: map[string]*widget.Label{}}
	p.table = widget.NewTableWithHeaders(
		func() (int, int) { return len(p.rows), len(StarCompColumns) },
		func() fyne.CanvasObject { l := widget.NewLabel(""); l.Truncation = fyne.TextTruncateEllipsis; return l },
		func(id widget.TableCellID, o fyne.CanvasObject) {
			text := ""
			if id.Row < len(p.rows) && id.Col < len(StarCompColumns) {
				text = p.rows[id.Row].Cells()[id.Col]
			}
			o.(*widget.Label).SetText(text)
		})
	p.table.ShowHeaderColumn = false
	p.table.UpdateHeader = func(id widget.TableCellID, o fyne.CanvasObject) {
		if id.Col >= 0 && id.Col < len(StarCompColumns) {
			o.(*widget.Label).SetText(StarCompColumns[id.Col])
		}
	}
	for i, wd := range []float32{90, 80, 90, 110} {
		p.table.SetColumnWidth(i, wd)
	}
	p.table.OnSelected = func(id widget.TableCellID) { p.pick(id.Row) }
	p.tableBox = container.New(&starHeightLayout{rows: 1}, p.table)
	p.empty = widget.NewLabel("None yet: add the stars you compare this one with below.")
	p.empty.Wrapping = fyne.TextWrapWord

	entry := func(key, hint string) *keyEntry {
		e := newKeyEntry(v.w)
		e.SetPlaceHolder(hint)
		e.OnChanged = func(string) { p.clearErr(key) }
		e.OnSubmitted = func(string) { // Enter adds, or saves the row picked
			if p.sel >= 0 {
				p.saveComp()
			} else {
				p.addComp()
			}
		}
		return e
	}
	p.id = entry(StarFieldCompID, "label, e.g. C1")
	p.vmag = entry(StarFieldCompV, "V (mag)")
	p.bv = entry(StarFieldCompBV, "B−V (mag)")
	p.role = widget.NewSelect([]string{starRoleComp, starRoleCheck}, nil)
	p.role.SetSelected(starRoleComp)
	withErr := func(key string, o fyne.CanvasObject) fyne.CanvasObject {
		l := widget.NewLabel("")
		l.Wrapping = fyne.TextWrapWord
		l.Importance = widget.DangerImportance
		l.Hide()
		p.errs[key] = l
		return container.NewVBox(o, l)
	}
	p.add = widget.NewButtonWithIcon("Add", theme.ContentAddIcon(), p.addComp)
	p.save = widget.NewButtonWithIcon("Save changes", theme.DocumentSaveIcon(), p.saveComp)
	p.remove = widget.NewButtonWithIcon("Remove", theme.ContentRemoveIcon(), p.removeComp)
	p.formErr = widget.NewLabel("")
	p.formErr.Wrapping = fyne.TextWrapWord
	p.formErr.Importance = widget.DangerImportance
	p.formErr.Hide()
	editor := container.New(layout.NewGridLayoutWithColumns(2),
		withErr(StarFieldCompID, p.id), withErr(StarFieldCompV, p.vmag), withErr(StarFieldCompBV, p.bv), p.role)
	p.emptyBox = quiet(p.empty)
	p.root = container.NewVBox(p.tableBox, p.emptyBox, editor,
		container.NewHBox(p.add, p.save, p.remove), p.formErr)
	p.pick(-1)
	return p
}

// update shows the star's comparison and check stars. The editor keeps
// what is typed in it unless the stars changed.
func (p *starCompsPanel) update(rows []StarComp) {
	if starSameComps(p.rows, rows) && len(rows) > 0 {
		return
	}
	p.rows = rows
	p.tableBox.Layout.(*starHeightLayout).rows = len(rows)
	p.tableBox.Hidden = len(rows) == 0
	p.empty.Hidden = len(rows) > 0
	p.emptyBox.Hidden = p.empty.Hidden
	p.table.UnselectAll()
	p.pick(-1)
	p.table.Refresh()
	p.root.Refresh()
}

// pick fills the editor with row i (-1: an empty editor for a new star).
func (p *starCompsPanel) pick(i int) {
	if i >= len(p.rows) {
		i = -1
	}
	p.sel = i
	p.id.SetText("")
	p.vmag.SetText("")
	p.bv.SetText("")
	p.role.SetSelected(starRoleComp)
	if i >= 0 {
		c := p.rows[i]
		cells := c.Cells()
		p.id.SetText(c.Comp.ID)
		p.vmag.SetText(numText(c.Comp.V))
		if cells[2] != "—" {
			p.bv.SetText(numText(c.Comp.BV))
		}
		if c.Check {
			p.role.SetSelected(starRoleCheck)
		}
	}
	for k := range p.errs {
		p.clearErr(k)
	}
	p.formErr.Hide()
	if i >= 0 {
		p.save.Enable()
		p.remove.Enable()
	} else {
		p.save.Disable()
		p.remove.Disable()
	}
}

func (p *starCompsPanel) clearErr(key string) {
	if l := p.errs[key]; l != nil && l.Visible() {
		l.Hide()
	}
}

// read checks the editor; the faults go under their fields.
func (p *starCompsPanel) read() (observe.Comp, bool, bool) {
	c, errs := StarCompForm{ID: p.id.Text, V: p.vmag.Text, BV: p.bv.Text, Check: p.role.Selected == starRoleCheck}.Comp()
	for k, l := range p.errs {
		if msg := errs[k]; msg != "" {
			l.SetText(msg)
			l.Show()
		} else {
			l.Hide()
		}
	}
	p.root.Refresh()
	return c, p.role.Selected == starRoleCheck, len(errs) == 0
}

// lists splits the table's rows into comparison and check stars, with row
// skip left out and, when c is given, put in its place (or at the end).
func (p *starCompsPanel) lists(skip int, c *observe.Comp, check bool) (comps, checks []observe.Comp) {
	put := func(x observe.Comp, isCheck bool) {
		if isCheck {
			checks = append(checks, x)
		} else {
			comps = append(comps, x)
		}
	}
	for i, r := range p.rows {
		if i == skip {
			if c != nil {
				put(*c, check)
			}
			continue
		}
		put(r.Comp, r.Check)
	}
	return comps, checks
}

// taken reports whether another row than skip has the label id (any case).
func (p *starCompsPanel) taken(id string, skip int) bool {
	for i, r := range p.rows {
		if i != skip && strings.EqualFold(r.Comp.ID, id) {
			return true
		}
	}
	return false
}

func (p *starCompsPanel) addComp() {
	c, check, ok := p.read()
	if !ok {
		return
	}
	if p.taken(c.ID, -1) {
		p.showErr(StarFieldCompID, fmt.Sprintf("label %q: the star already has one of that label; want another", c.ID))
		return
	}
	name := p.v.target.Name
	p.write(fmt.Sprintf("Added %s %s to %s.", roleWord(check), c.ID, name), func() error {
		return p.v.w.Session.Logbook().AddComp(name, c, check)
	})
}

func (p *starCompsPanel) saveComp() {
	if p.sel < 0 {
		return
	}
	c, check, ok := p.read()
	if !ok {
		return
	}
	if p.taken(c.ID, p.sel) {
		p.showErr(StarFieldCompID, fmt.Sprintf("label %q: the star already has one of that label; want another", c.ID))
		return
	}
	comps, checks := p.lists(p.sel, &c, check)
	name := p.v.target.Name
	p.write(fmt.Sprintf("Saved %s %s of %s.", roleWord(check), c.ID, name), func() error {
		return p.v.w.Session.Logbook().SetComps(name, comps, checks)
	})
}

func (p *starCompsPanel) removeComp() {
	if p.sel < 0 {
		return
	}
	r := p.rows[p.sel]
	name := p.v.target.Name
	p.write(fmt.Sprintf("Removed %s %s from %s.", roleWord(r.Check), r.Comp.ID, name), func() error {
		return p.v.w.Session.Logbook().DeleteComp(name, r.Comp.ID)
	})
}

func (p *starCompsPanel) showErr(key, msg string) {
	p.errs[key].SetText(msg)
	p.errs[key].Show()
	p.root.Refresh()
}

// write runs a change of the comparison stars in a job, then reads the
// logbook again.
func (p *starCompsPanel) write(done string, fn func() error) {
	Run(p.v.w.Jobs, "star-comps", "Saving the comparison stars", func(context.Context, Progress) (struct{}, error) {
		return struct{}{}, fn()
	}, func(_ struct{}, err error) {
		if err != nil {
			p.formErr.SetText("not saved: " + starErrText(err))
			p.formErr.Show()
			p.root.Refresh()
			return
		}
		p.v.say(done, false)
		p.v.w.Reload()
	})
}

// roleWord names a comparison star's role in a sentence.
func roleWord(check bool) string {
	if check {
		return "check star"
	}
	return "comparison star"
}

// starSameComps reports whether two tables of comparison stars read the
// same.
func starSameComps(a, b []StarComp) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if strings.Join(a[i].Cells(), "|") != strings.Join(b[i].Cells(), "|") {
			return false
		}
	}
	return true
}
