package chart

import (
	"fmt"
	"math"
	"sort"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"example.org/vigil/reduce"
)

// DefaultMarkedPeaks is how many peaks besides the best a periodogram
// marks unless told otherwise.
const DefaultMarkedPeaks = 3

// PeriodogramData is what Periodogram draws.
type PeriodogramData struct {
	Title  string
	Result reduce.PeriodResult // as reduce.Periodogram returns it
	// Peaks is how many of Result.Peaks besides the best are marked: 0
	// means DefaultMarkedPeaks, a negative number none.
	Peaks int
	// PeriodAxis adds a scale of periods (days) along the top.
	PeriodAxis bool
}

// periodogramParts are the plotters of a periodogram, for the tests.
type periodogramParts struct {
	power, window *plotter.Line
	peaks         *plotter.Scatter
	labels        *plotter.Labels
	periods       *edgeAxis
	marked        []reduce.Peak
}

// Periodogram draws a period search against frequency (cycles per day):
// the generalised Lomb–Scargle power (Zechmeister & Kürster 2009, A&A
// 496, 577; higher is better) or Stellingwerf's (1978, ApJ 224, 953) PDM θ
// (lower is better); the spectral window of the sampling (Deeming 1975,
// Ap&SS 36, 137) as a faint curve behind it, scaled to the height of the
// highest peak (to θ = 1 for PDM), so that the aliases a true signal makes
// at ±1 c/d show; the best peak and the next ones numbered, each named in
// the key with its period and, where it is one, as an alias or harmonic of
// the best (reduce.AliasNote); optionally a period scale along the top;
// and Baluev's (2008) false-alarm probability of the best peak in the
// title. Curves of more than 10 000 frequencies are drawn through the
// lowest and highest value of each of 5000 runs, which keeps every peak.
func Periodogram(d PeriodogramData, pal Palette) (*plot.Plot, error) {
	p, _, err := periodogram(d, pal)
	return p, err
}

func periodogram(d PeriodogramData, pal Palette) (*plot.Plot, *periodogramParts, error) {
	if err := pal.check(); err != nil {
		return nil, nil, err
	}
	r := d.Result
	pdm := false
	switch r.Method {
	case reduce.MethodLS:
	case reduce.MethodPDM:
		pdm = true
	default:
		return nil, nil, fmt.Errorf("chart: periodogram: method %q: want %q or %q", r.Method, reduce.MethodLS, reduce.MethodPDM)
	}
	if len(r.Freqs) < 2 || len(r.Power) != len(r.Freqs) {
		return nil, nil, fmt.Errorf("chart: periodogram: %d frequencies and %d powers: want two or more of each, as many powers as frequencies", len(r.Freqs), len(r.Power))
	}
	if len(r.Window) != 0 && len(r.Window) != len(r.Freqs) {
		return nil, nil, fmt.Errorf("chart: periodogram: %d window values for %d frequencies: want one per frequency or none", len(r.Window), len(r.Freqs))
	}
	var power plotter.XYs
	xr, yr := newExtent(), newExtent()
	for i, f := range r.Freqs {
		xr.add(f)
		if v := r.Power[i]; !math.IsNaN(v) && !math.IsInf(v, 0) && !math.IsNaN(f) && !math.IsInf(f, 0) {
			power = append(power, plotter.XY{X: f, Y: v})
			yr.add(v)
		}
	}
	if len(power) < 2 {
		return nil, nil, fmt.Errorf("chart: periodogram: fewer than two finite powers")
	}
	// Room above the highest peak (below the deepest PDM minimum) for
	// the peaks' marks.
	ylo, yhi := 0.0, yr.hi*1.12
	yLabel := "GLS power"
	if pdm {
		yLabel, yhi = "PDM θ", math.Max(yr.hi, 1)*1.06
		ylo = math.Min(0, yr.lo) - 0.1*yhi
	}
	title := d.Title
	if title == "" {
		title = map[bool]string{false: "Lomb–Scargle periodogram", true: "phase dispersion minimisation"}[pdm]
	}
	if !pdm && !math.IsNaN(r.FAP) {
		title += " — FAP of the best peak " + formatFAP(r.FAP)
	}
	p := newPlot(pal, title, "frequency (cycles per day)", yLabel)
	key := newSideKey(pal, p.Legend.TextStyle)
	parts := &periodogramParts{}
	addGrid(p, pal)

	// The window, behind, scaled to the best peak (θ = 1 for PDM).
	if len(r.Window) > 0 {
		top := yr.hi
		if pdm {
			top = 1
		}
		wmax := 0.0
		for _, w := range r.Window {
			if !math.IsNaN(w) && !math.IsInf(w, 0) {
				wmax = math.Max(wmax, w)
			}
		}
		var xys plotter.XYs
		for i, w := range r.Window {
			if wmax > 0 && !math.IsNaN(w) && !math.IsInf(w, 0) && !math.IsNaN(r.Freqs[i]) {
				xys = append(xys, plotter.XY{X: r.Freqs[i], Y: w / wmax * top})
			}
		}
		if len(xys) > 1 {
			l, err := line(envelope(xys, lineBuckets), draw.LineStyle{Color: pal.faint(), Width: vg.Points(0.8)})
			if err != nil {
				return nil, nil, err
			}
			p.Add(l)
			parts.window = l
			key.add("spectral window (scaled)", l)
		}
	}
	var err error
	if parts.power, err = line(envelope(power, lineBuckets), draw.LineStyle{Color: pal.star(0), Width: vg.Points(1)}); err != nil {
		return nil, nil, err
	}
	p.Add(parts.power)
	key.add(yLabel, parts.power)

	// The marked peaks, numbered from the best.
	n := d.Peaks
	if n == 0 {
		n = DefaultMarkedPeaks
	}
	for i, pk := range r.Peaks {
		if i > max(n, 0) {
			break
		}
		if pk.FreqPerDay > 0 && !math.IsNaN(pk.Power) && !math.IsInf(pk.Power, 0) {
			parts.marked = append(parts.marked, pk)
		}
	}
	if len(parts.marked) > 0 {
		if err := markPeaks(p, key, parts, r, pdm, yhi-ylo, pal); err != nil {
			return nil, nil, err
		}
	}
	p.X.Min, p.X.Max = xr.lo, xr.hi
	p.Y.Min, p.Y.Max = ylo, yhi
	if d.PeriodAxis {
		parts.periods = newEdgeAxis(p, pal, true, "period (d)", periodTicks(xr.lo, xr.hi))
		p.Add(parts.periods)
	}
	p.Add(key)
	return p, parts, nil
}

// markPeaks adds a numbered marker at each of parts.marked (above a
// maximum, below a PDM minimum) and names them in the key.
func markPeaks(p *plot.Plot, key *sideKey, parts *periodogramParts, r reduce.PeriodResult, pdm bool, yspan float64, pal Palette) error {
	var xys plotter.XYs
	var names []string
	best := parts.marked[0].FreqPerDay
	off := 0.035 * yspan
	for i, pk := range parts.marked {
		y := pk.Power + off
		if pdm {
			y = pk.Power - off
		}
		xys = append(xys, plotter.XY{X: pk.FreqPerDay, Y: y})
		names = append(names, strconv.Itoa(i+1))
		entry := fmt.Sprintf("%d: P = %.6g d (%.6g c/d)", i+1, pk.PeriodDays, pk.FreqPerDay)
		if i == 0 {
			entry += ", best"
		} else if note := reduce.AliasNote(pk.FreqPerDay, best, r.SpanDays); note != "" && r.SpanDays > 0 {
			entry += ", " + note
		}
		key.add(entry, &plotter.Scatter{GlyphStyle: peakGlyph(pal, i, pdm)})
	}
	sc, err := plotter.NewScatter(xys)
	if err != nil {
		return err
	}
	sc.GlyphStyle = peakGlyph(pal, 1, pdm)
	sc.GlyphStyleFunc = func(i int) draw.GlyphStyle { return peakGlyph(pal, i, pdm) }
	p.Add(sc)
	parts.peaks = sc
	l, err := plotter.NewLabels(plotter.XYLabels{XYs: xys, Labels: names})
	if err != nil {
		return err
	}
	for k := range l.TextStyle {
		l.TextStyle[k].Color = pal.Foreground
		l.TextStyle[k].Font.Size = vg.Points(9)
		l.TextStyle[k].XAlign = text.XCenter
		l.TextStyle[k].YAlign = text.YBottom
		l.Offset = vg.Point{Y: vg.Points(6)}
		if pdm {
			l.TextStyle[k].YAlign = text.YTop
			l.Offset = vg.Point{Y: -vg.Points(6)}
		}
	}
	p.Add(l)
	parts.labels = l
	return nil
}

// peakGlyph is the marker of the i-th marked peak: a triangle pointing at
// it (down onto a maximum, up onto a PDM minimum), filled for the best.
func peakGlyph(pal Palette, i int, pdm bool) draw.GlyphStyle {
	sty := draw.GlyphStyle{Color: pal.fit(0), Radius: vg.Points(4)}
	switch {
	case pdm && i == 0:
		sty.Shape = draw.PyramidGlyph{}
	case pdm:
		sty.Shape = draw.TriangleGlyph{}
	default:
		sty.Shape = downGlyph{filled: i == 0}
	}
	return sty
}

// formatFAP writes a false-alarm probability.
func formatFAP(fap float64) string {
	switch {
	case fap < 1e-12:
		return "< 1e-12"
	case fap < 1e-3:
		return fmt.Sprintf("%.1e", fap)
	}
	return fmt.Sprintf("%.3f", fap)
}

// periodTicks returns ticks at round periods (days) for a frequency axis
// from flo to fhi (cycles per day): the roundest first (1, 2, 5 times a
// power of ten, then 3, 1.5, 2.5, 4, 7), each kept only if it lies at
// least 6% of the axis from every tick kept.
func periodTicks(flo, fhi float64) []plot.Tick {
	gap := 0.06 * (fhi - flo)
	var kept []plot.Tick
	for _, m := range []float64{1, 2, 5, 3, 1.5, 2.5, 4, 7} {
		for k := -4; k <= 5; k++ {
			per := m * math.Pow(10, float64(k))
			f := 1 / per
			if f < flo || f > fhi {
				continue
			}
			ok := true
			for _, t := range kept {
				if math.Abs(t.Value-f) < gap {
					ok = false
				}
			}
			if ok {
				kept = append(kept, plot.Tick{Value: f, Label: strconv.FormatFloat(per, 'g', 4, 64)})
			}
		}
	}
	sort.Slice(kept, func(i, j int) bool { return kept[i].Value < kept[j].Value })
	return kept
}
