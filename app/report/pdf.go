package report

import (
	"bytes"
	"fmt"
	"io"
	"math"

	"codeberg.org/go-fonts/liberation/liberationsansbold"
	"codeberg.org/go-fonts/liberation/liberationsansregular"
	"codeberg.org/go-pdf/fpdf"
)

// Page layout of the PDF, in millimetres and points.
const (
	marginMM     = 14.0 // left and right
	topMM        = 18.0 // below the running head
	bottomMM     = 16.0 // above the running foot
	bodyPt       = 9.0
	smallPt      = 7.5
	tablePt      = 8.0
	headingPt    = 12.0
	ruleMM       = 7.5 // height of a ruled line to write on
	chartAspect  = 0.6 // the chart's height over its width
	pairGapMM    = 6.0
	blockSpaceMM = 2.5 // space above a block
)

// WritePDF writes the log as a PDF (A4 portrait unless l.Paper says
// Letter): the header names the site and the night on every page, the foot
// numbers the pages. Nothing is written to w unless the whole document was
// made.
func (l *NightLog) WritePDF(w io.Writer) error { return l.writePDF(w, true) }

// writePDF writes the PDF with its page streams compressed or, for tests
// that search its text, not.
func (l *NightLog) writePDF(w io.Writer, compress bool) error {
	d, err := l.layout()
	if err != nil {
		return err
	}
	site := l.Site
	_ = site.Validate()
	ck := newClock(site.Location(), l.Night)
	size := "A4"
	if l.Paper == Letter {
		size = "Letter"
	}
	f := fpdf.NewCustom(&fpdf.InitType{OrientationStr: "P", UnitStr: "mm", SizeStr: size})
	f.SetCompression(compress)
	f.AddUTF8FontFromBytes("sans", "", liberationsansregular.TTF)
	f.AddUTF8FontFromBytes("sans", "B", liberationsansbold.TTF)
	f.SetMargins(marginMM, topMM, marginMM)
	f.SetAutoPageBreak(false, bottomMM)
	f.SetCellMargin(1)
	f.AliasNbPages("{nb}")
	f.SetTitle(d.title+", "+d.subtitle, true)
	f.SetSubject("observing log", true)
	f.SetCreator("vigil", true)
	if l.Observer != "" {
		f.SetAuthor(l.Observer, true)
	}
	p := &pdfWriter{f: f}
	p.pageW, p.pageH = f.GetPageSize()
	foot := fmt.Sprintf("Local times in %s (%s) with UTC beside them. Altitudes airless; azimuth from north "+
		"through east; longitude east positive.", orUTC(site.TimeZone), ck.zone)
	f.SetHeaderFunc(func() { p.runningHead(d) })
	f.SetFooterFunc(func() { p.runningFoot(foot) })

	f.AddPage()
	p.font("B", 16)
	f.CellFormat(p.width(), 8, d.title, "", 1, "L", false, 0, "")
	p.font("", 11)
	f.CellFormat(p.width(), 6, d.subtitle, "", 1, "L", false, 0, "")
	p.fresh = false
	for _, b := range d.blocks {
		p.block(b, marginMM, p.width())
		if p.err != nil {
			return p.err
		}
	}
	var buf bytes.Buffer
	if err := f.Output(&buf); err != nil {
		return fmt.Errorf("report: making the PDF: %w", err)
	}
	if _, err := w.Write(buf.Bytes()); err != nil {
		return fmt.Errorf("report: writing the PDF: %w", err)
	}
	return nil
}

func orUTC(tz string) string {
	if tz == "" {
		return "UTC"
	}
	return tz
}

// pdfWriter flows the blocks of a doc down the pages.
type pdfWriter struct {
	f            *fpdf.Fpdf
	pageW, pageH float64
	fresh        bool // nothing drawn yet on this page
	err          error
}

func (p *pdfWriter) width() float64 { return p.pageW - 2*marginMM }
func (p *pdfWriter) limit() float64 { return p.pageH - bottomMM }

func (p *pdfWriter) font(style string, pt float64) { p.f.SetFont("sans", style, pt) }

// lineMM is the height of a line of text in a font of pt points.
func lineMM(pt float64) float64 { return pt * 0.3528 * 1.3 }

// need starts a new page unless h millimetres fit below the current line.
func (p *pdfWriter) need(h float64) {
	if p.f.GetY()+h > p.limit() && !p.fresh {
		p.f.AddPage()
	}
}

func (p *pdfWriter) runningHead(d doc) {
	f := p.f
	p.fresh = true
	p.font("B", 8)
	f.SetXY(marginMM, 8)
	f.CellFormat(p.width()/2, 4, d.title, "", 0, "L", false, 0, "")
	p.font("", 8)
	f.CellFormat(p.width()/2, 4, d.subtitle, "", 0, "R", false, 0, "")
	f.SetLineWidth(0.2)
	f.SetDrawColor(0, 0, 0)
	f.Line(marginMM, 12.5, p.pageW-marginMM, 12.5)
	f.SetXY(marginMM, topMM)
}

func (p *pdfWriter) runningFoot(text string) {
	f := p.f
	f.SetLineWidth(0.2)
	f.SetDrawColor(0, 0, 0)
	y := p.pageH - bottomMM + 4
	f.Line(marginMM, y, p.pageW-marginMM, y)
	p.font("", 7)
	f.SetXY(marginMM, y+1)
	f.CellFormat(p.width()-25, 4, text, "", 0, "L", false, 0, "")
	p.font("B", 8)
	f.CellFormat(25, 4, fmt.Sprintf("page %d of {nb}", f.PageNo()), "", 0, "R", false, 0, "")
}

// block draws b in the column from x, w wide, below the current line.
func (p *pdfWriter) block(b block, x, w float64) {
	f := p.f
	switch b := b.(type) {
	case pageBreak:
		if !p.fresh {
			f.AddPage()
		}
		return
	case heading:
		p.need(lineMM(headingPt) + 40) // keep a heading with what follows
		p.space(4)
		p.font("B", headingPt)
		f.SetX(x)
		f.CellFormat(w, lineMM(headingPt), b.text, "", 1, "L", false, 0, "")
		f.SetLineWidth(0.3)
		f.Line(x, f.GetY(), x+w, f.GetY())
		f.SetY(f.GetY() + 1)
	case para:
		pt := bodyPt
		if b.small {
			pt = smallPt
		}
		p.font("", pt)
		lines := f.SplitText(b.text, w)
		p.need(float64(len(lines))*lineMM(pt) + blockSpaceMM)
		p.space(blockSpaceMM)
		p.lines(x, w, lineMM(pt), lines, "L")
	case fields:
		p.fields(b, x, w)
	case table:
		p.table(b, x, w)
	case pair:
		p.need(math.Max(p.height(b.left, w*b.split-pairGapMM/2), p.height(b.right, w*(1-b.split)-pairGapMM/2)))
		y0 := f.GetY()
		wl := w*b.split - pairGapMM/2
		p.block(b.left, x, wl)
		y1 := f.GetY()
		f.SetY(y0)
		p.block(b.right, x+wl+pairGapMM, w-wl-pairGapMM)
		f.SetY(math.Max(y1, f.GetY()))
	case caution:
		p.caution(b, x, w)
	case notes:
		p.notes(b, x, w)
	case chartBlock:
		p.chart(b, x, w)
	}
	p.fresh = false
	if err := f.Error(); err != nil && p.err == nil {
		p.err = fmt.Errorf("report: making the PDF: %w", err)
	}
}

// space moves down by h unless at the top of a page.
func (p *pdfWriter) space(h float64) {
	if !p.fresh {
		p.f.SetY(p.f.GetY() + h)
	}
}

// lines writes lines of text one under the other from x, in the current font.
func (p *pdfWriter) lines(x, w, lh float64, lines []string, align string) {
	for _, s := range lines {
		p.f.SetX(x)
		p.f.CellFormat(w, lh, s, "", 2, align, false, 0, "")
	}
}

// height estimates how tall b is when drawn w wide (for keeping a block on
// one page).
func (p *pdfWriter) height(b block, w float64) float64 {
	switch b := b.(type) {
	case fields:
		return lineMM(10) + float64(len(b.rows))*lineMM(bodyPt) + blockSpaceMM
	case table:
		return p.tableHeight(b, w)
	}
	return 0
}

func (p *pdfWriter) caution(b caution, x, w float64) {
	f := p.f
	p.font("", bodyPt)
	lines := f.SplitText(b.text, w-6)
	p.font("B", bodyPt)
	title := f.SplitText(b.title, w-6)
	h := float64(len(lines)+len(title))*lineMM(bodyPt) + 5
	p.need(h + blockSpaceMM)
	p.space(blockSpaceMM)
	y := f.GetY()
	f.SetLineWidth(0.7)
	f.SetDrawColor(0, 0, 0)
	f.Rect(x, y, w, h, "D")
	f.SetY(y + 2.5)
	p.lines(x+3, w-6, lineMM(bodyPt), title, "L")
	p.font("", bodyPt)
	p.lines(x+3, w-6, lineMM(bodyPt), lines, "L")
	f.SetY(y + h)
}

func (p *pdfWriter) chart(b chartBlock, x, w float64) {
	f := p.f
	h := w * chartAspect
	p.need(h + blockSpaceMM)
	p.space(blockSpaceMM)
	img, err := chartPNG(*b.chart, b.events, w, h)
	if err != nil {
		p.err = err
		return
	}
	opt := fpdf.ImageOptions{ImageType: "PNG"}
	f.RegisterImageOptionsReader("altitude-chart", opt, bytes.NewReader(img))
	y := f.GetY()
	f.ImageOptions("altitude-chart", x, y, w, h, false, opt, 0, "")
	f.SetY(y + h)
}
