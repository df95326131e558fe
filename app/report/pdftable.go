package report

// Tables, labelled fields and notes forms in the PDF.

const (
	cellPadMM  = 0.7 // above and below the text of a table row
	blankRowMM = 7.5 // an empty row to fill in by hand
	greyRule   = 150 // grey level of the thin rules between rows
)

// colWidths scales the columns' widths to fill w.
func colWidths(t table, w float64) []float64 {
	sum := 0.0
	for _, c := range t.cols {
		sum += c.mm
	}
	out := make([]float64, len(t.cols))
	for i, c := range t.cols {
		out[i] = c.mm * w / sum
	}
	return out
}

// cellLines wraps every cell of a row to its column.
func (p *pdfWriter) cellLines(row []string, ws []float64) ([][]string, int) {
	out := make([][]string, len(row))
	n := 1
	for i, s := range row {
		out[i] = p.f.SplitText(s, ws[i])
		if len(out[i]) == 0 {
			out[i] = []string{""}
		}
		n = max(n, len(out[i]))
	}
	return out, n
}

func (t table) hasUnits() bool {
	for _, c := range t.cols {
		if c.unit != "" {
			return true
		}
	}
	return false
}

func (p *pdfWriter) headHeight(t table) float64 {
	h := lineMM(tablePt) + 2*cellPadMM
	if t.hasUnits() {
		h += lineMM(tablePt - 1)
	}
	return h
}

// tableHeight is the height of the whole table drawn w wide.
func (p *pdfWriter) tableHeight(t table, w float64) float64 {
	h := blockSpaceMM + p.headHeight(t)
	if t.title != "" {
		h += lineMM(10)
	}
	ws := colWidths(t, w)
	p.font("", tablePt)
	for _, r := range t.rows {
		_, n := p.cellLines(r, ws)
		h += float64(n)*lineMM(tablePt) + 2*cellPadMM
	}
	if len(t.rows) == 0 {
		h += float64(t.blank) * blankRowMM
	}
	return h
}

func (p *pdfWriter) table(t table, x, w float64) {
	f := p.f
	ws := colWidths(t, w)
	lh := lineMM(tablePt)
	first := p.headHeight(t) + 2*lh
	if t.title != "" {
		first += lineMM(10)
	}
	p.need(first + blockSpaceMM)
	p.space(blockSpaceMM)
	if t.title != "" {
		p.font("B", 10)
		f.SetX(x)
		f.CellFormat(w, lineMM(10), t.title, "", 2, "L", false, 0, "")
	}
	if len(t.rows) == 0 && t.blank == 0 {
		p.font("", bodyPt)
		f.SetX(x)
		f.CellFormat(w, lineMM(bodyPt), t.empty, "", 2, "L", false, 0, "")
		return
	}
	head := func() {
		y := f.GetY()
		p.font("B", tablePt)
		cx := x
		for i, c := range t.cols {
			f.SetXY(cx, y+cellPadMM)
			f.CellFormat(ws[i], lh, c.head, "", 0, align(c), false, 0, "")
			if c.unit != "" {
				p.font("", tablePt-1)
				f.SetXY(cx, y+cellPadMM+lh)
				f.CellFormat(ws[i], lineMM(tablePt-1), "("+c.unit+")", "", 0, align(c), false, 0, "")
				p.font("B", tablePt)
			}
			cx += ws[i]
		}
		y += p.headHeight(t)
		f.SetLineWidth(0.35)
		f.SetDrawColor(0, 0, 0)
		f.Line(x, y, x+w, y)
		f.SetXY(x, y)
	}
	head()
	rule := func(y float64) {
		f.SetLineWidth(0.1)
		f.SetDrawColor(greyRule, greyRule, greyRule)
		f.Line(x, y, x+w, y)
		f.SetDrawColor(0, 0, 0)
	}
	p.font("", tablePt)
	if len(t.rows) == 0 {
		// Ruled rows with the column bounds marked, to fill in by hand.
		top := f.GetY()
		columns := func() {
			cx := x
			for _, cw := range ws[:len(ws)-1] {
				cx += cw
				f.SetLineWidth(0.1)
				f.SetDrawColor(greyRule, greyRule, greyRule)
				f.Line(cx, top, cx, f.GetY())
			}
			f.SetDrawColor(0, 0, 0)
		}
		for range t.blank {
			if f.GetY()+blankRowMM > p.limit() {
				columns()
				f.AddPage()
				head()
				top = f.GetY()
			}
			y := f.GetY() + blankRowMM
			rule(y)
			f.SetY(y)
		}
		columns()
		return
	}
	for _, r := range t.rows {
		cells, n := p.cellLines(r, ws)
		h := float64(n)*lh + 2*cellPadMM
		if f.GetY()+h > p.limit() {
			f.AddPage()
			head()
			p.font("", tablePt)
		}
		y := f.GetY()
		cx := x
		for i, c := range t.cols {
			for k, s := range cells[i] {
				f.SetXY(cx, y+cellPadMM+float64(k)*lh)
				f.CellFormat(ws[i], lh, s, "", 0, align(c), false, 0, "")
			}
			cx += ws[i]
		}
		rule(y + h)
		f.SetXY(x, y+h)
	}
}

func align(c col) string {
	if c.right {
		return "R"
	}
	return "L"
}

func (p *pdfWriter) fields(b fields, x, w float64) {
	f := p.f
	p.need(p.height(b, w))
	p.space(blockSpaceMM)
	p.font("B", 10)
	f.SetX(x)
	f.CellFormat(w, lineMM(10), b.title, "", 2, "L", false, 0, "")
	p.font("", bodyPt)
	wl := 0.0
	for _, r := range b.rows {
		wl = max(wl, f.GetStringWidth(r[0])+4)
	}
	for _, r := range b.rows {
		f.SetX(x)
		p.font("B", bodyPt)
		f.CellFormat(wl, lineMM(bodyPt), r[0], "", 0, "L", false, 0, "")
		p.font("", bodyPt)
		f.CellFormat(w-wl, lineMM(bodyPt), r[1], "", 2, "L", false, 0, "")
	}
}

// notes draws a form: title, detail, a ruled line per label, blank lines.
func (p *pdfWriter) notes(b notes, x, w float64) {
	f := p.f
	p.font("", smallPt)
	detail := f.SplitText(b.detail, w)
	p.font("B", 9.5)
	h := lineMM(9.5) + float64(len(detail))*lineMM(smallPt) + float64(len(b.labels)+b.lines)*ruleMM
	p.need(h + 2*blockSpaceMM)
	p.space(2 * blockSpaceMM)
	f.SetX(x)
	f.CellFormat(w, lineMM(9.5), b.title, "", 2, "L", false, 0, "")
	p.font("", smallPt)
	p.lines(x, w, lineMM(smallPt), detail, "L")
	p.font("", tablePt)
	wl := 0.0
	for _, s := range b.labels {
		wl = max(wl, f.GetStringWidth(s)+3)
	}
	f.SetLineWidth(0.15)
	f.SetDrawColor(greyRule-40, greyRule-40, greyRule-40)
	for i := range len(b.labels) + b.lines {
		y := f.GetY() + ruleMM
		lx := x
		if i < len(b.labels) {
			f.SetXY(x, y-lineMM(tablePt)-0.3)
			f.CellFormat(wl, lineMM(tablePt), b.labels[i], "", 0, "L", false, 0, "")
			lx = x + wl
		}
		f.Line(lx, y, x+w, y)
		f.SetXY(x, y)
	}
	f.SetDrawColor(0, 0, 0)
}
