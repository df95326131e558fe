package report

import (
	"bytes"
	"fmt"
	"image/color"
	"strconv"
	"time"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"

	"example.org/vigil/app/chart"
	"example.org/vigil/observe"
)

// chartDPI is the resolution of the chart in the PDF: 300 dots per inch,
// common practice for print.
const chartDPI = 300

// chartPNG draws the altitude chart (app/chart, default palette: light,
// for print) at its printed size, wMM by hMM, and returns it as PNG. Each
// marker of a planned event carries the event's number in the log's table,
// in black, so that the chart still reads when printed in grey.
func chartPNG(c observe.Chart, planned []observe.Event, wMM, hMM float64) ([]byte, error) {
	p, err := chart.Altitude(c, chart.DefaultPalette())
	if err != nil {
		return nil, fmt.Errorf("report: altitude chart: %w", err)
	}
	if err := numberEvents(p, c, planned); err != nil {
		return nil, fmt.Errorf("report: altitude chart: %w", err)
	}
	cv := vgimg.NewWith(vgimg.UseWH(vg.Length(wMM)*vg.Millimeter, vg.Length(hMM)*vg.Millimeter),
		vgimg.UseDPI(chartDPI), vgimg.UseBackgroundColor(color.White))
	p.Draw(draw.New(cv))
	var buf bytes.Buffer
	if _, err := (vgimg.PngCanvas{Canvas: cv}).WriteTo(&buf); err != nil {
		return nil, fmt.Errorf("report: altitude chart: %w", err)
	}
	return buf.Bytes(), nil
}

// numberEvents writes beside each marker of the chart the number of the
// planned event it shows (the same target within a minute). The time axis
// is mapped linearly from the chart's span onto the plot's X range.
func numberEvents(p *plot.Plot, c observe.Chart, planned []observe.Event) error {
	span := c.To.Sub(c.From)
	if span <= 0 {
		return nil
	}
	x := func(t time.Time) float64 {
		return p.X.Min + float64(t.Sub(c.From))/float64(span)*(p.X.Max-p.X.Min)
	}
	var xys plotter.XYs
	var labels []string
	for _, ce := range c.Events {
		t := ce.UTC.Time()
		if t.Before(c.From) || t.After(c.To) || ce.AltDeg < p.Y.Min || ce.AltDeg > p.Y.Max {
			continue
		}
		for i, e := range planned {
			d := e.UTC.Time().Sub(t)
			if e.Target == ce.Target && d < time.Minute && d > -time.Minute {
				xys = append(xys, plotter.XY{X: x(t), Y: ce.AltDeg})
				labels = append(labels, strconv.Itoa(i+1))
				break
			}
		}
	}
	if len(xys) == 0 {
		return nil
	}
	l, err := plotter.NewLabels(plotter.XYLabels{XYs: xys, Labels: labels})
	if err != nil {
		return err
	}
	for i := range l.TextStyle {
		l.TextStyle[i].Color = color.Black
		l.TextStyle[i].Font.Size = vg.Points(9)
		l.TextStyle[i].XAlign = draw.XCenter
	}
	l.Offset = vg.Point{X: 0, Y: vg.Points(7)}
	p.Add(l)
	return nil
}
