package chart

import (
	"fmt"
	"math"

	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"example.org/vigil/reduce"
)

// cleanPoints returns the points of a series with a time and a magnitude,
// dropping the missing ones (NaN) first; an infinite time or magnitude is an
// error naming the series and the point's index.
func cleanPoints(series string, pts []reduce.Point) ([]reduce.Point, error) {
	out := make([]reduce.Point, 0, len(pts))
	for i, p := range pts {
		if math.IsNaN(p.T) || math.IsNaN(p.Mag) {
			continue
		}
		if math.IsInf(p.T, 0) || math.IsInf(p.Mag, 0) {
			return nil, fmt.Errorf("chart: %s, point %d: time %v, magnitude %v: want finite numbers", series, i, p.T, p.Mag)
		}
		out = append(out, p)
	}
	return out, nil
}

// hasErr says whether e is a usable error bar: positive and finite (0 and
// NaN mean unknown).
func hasErr(e float64) bool { return e > 0 && !math.IsInf(e, 0) }

// errXYs are points with symmetric y errors, for plotter.NewYErrorBars.
type errXYs struct {
	plotter.XYs
	errs []float64
}

// YError implements plotter.YErrorer.
func (e errXYs) YError(i int) (float64, float64) { return e.errs[i], e.errs[i] }

// denseMarks is the number of points above which markers shrink and error
// bars lose their caps, so that a dense curve stays legible.
const denseMarks = 300

// marks returns a scatter of xys drawn with glyph, and vertical error bars
// in the glyph's colour for the points whose errs[i] is usable (nil when
// none is).
func marks(xys plotter.XYs, errs []float64, glyph draw.GlyphStyle) (*plotter.Scatter, *plotter.YErrorBars, error) {
	capWidth := vg.Points(3)
	if len(xys) > denseMarks {
		glyph.Radius *= 0.7
		capWidth = 0
	}
	sc, err := plotter.NewScatter(xys)
	if err != nil {
		return nil, nil, err
	}
	sc.GlyphStyle = glyph
	var withErr errXYs
	for i, e := range errs {
		if hasErr(e) {
			withErr.XYs = append(withErr.XYs, xys[i])
			withErr.errs = append(withErr.errs, e)
		}
	}
	if len(withErr.XYs) == 0 {
		return sc, nil, nil
	}
	bars, err := plotter.NewYErrorBars(withErr)
	if err != nil {
		return nil, nil, err
	}
	bars.LineStyle = draw.LineStyle{Color: glyph.Color, Width: vg.Points(0.7)}
	bars.CapWidth = capWidth
	return sc, bars, nil
}

// extent is the range of the values added to it.
type extent struct{ lo, hi float64 }

func newExtent() extent { return extent{math.Inf(1), math.Inf(-1)} }

// add widens the range to hold v, ignoring NaN.
func (e *extent) add(vs ...float64) {
	for _, v := range vs {
		if !math.IsNaN(v) {
			e.lo, e.hi = math.Min(e.lo, v), math.Max(e.hi, v)
		}
	}
}

// padded returns the range widened by frac of its width on each side,
// and to at least minHalf either side of its middle.
func (e extent) padded(frac, minHalf float64) (lo, hi float64) {
	mid, half := (e.lo+e.hi)/2, (e.hi-e.lo)/2
	half = math.Max(half*(1+2*frac), minHalf)
	return mid - half, mid + half
}

// line returns a line through xys in style sty.
func line(xys plotter.XYs, sty draw.LineStyle) (*plotter.Line, error) {
	l, err := plotter.NewLine(xys)
	if err != nil {
		return nil, err
	}
	l.LineStyle = sty
	return l, nil
}

// lineBuckets is the number of runs a long curve is thinned to by
// envelope: more than a printed page has dots across.
const lineBuckets = 5000

// envelope thins a curve sorted by x to at most two points per run of n
// equal runs (the lowest and the highest, in order of x), so that a
// periodogram of millions of frequencies draws quickly and keeps every
// peak and dip. Curves of at most 2n points are returned as they are.
func envelope(xys plotter.XYs, n int) plotter.XYs {
	if n < 1 || len(xys) <= 2*n {
		return xys
	}
	out := make(plotter.XYs, 0, 2*n)
	for b := range n {
		lo, hi := b*len(xys)/n, (b+1)*len(xys)/n
		imin, imax := lo, lo
		for i := lo; i < hi; i++ {
			if xys[i].Y < xys[imin].Y {
				imin = i
			}
			if xys[i].Y > xys[imax].Y {
				imax = i
			}
		}
		switch {
		case imin == imax:
			out = append(out, xys[imin])
		case imin < imax:
			out = append(out, xys[imin], xys[imax])
		default:
			out = append(out, xys[imax], xys[imin])
		}
	}
	return out
}
