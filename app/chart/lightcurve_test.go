package chart

import (
	"math"
	"strings"
	"testing"
	"time"

	"gonum.org/v1/plot/plotter"

	"example.org/vigil/ephem"
	"example.org/vigil/reduce"
)

// jdTol is the tolerance on a drawn time, in the axis's unit (days or
// hours): far below a pixel, above rounding.
const jdTol = 1e-9

func TestLightCurve(t *testing.T) {
	target, check, comp := eclipseNight()
	sel := TimeRange{From: 2461010.395, To: 2461010.470}
	tm := eclipseTiming(t, target, sel)
	kvw, err := reduce.Extremum(target, reduce.ExtremumOptions{Kind: reduce.Minimum, Method: reduce.MethodKvW, From: sel.From, To: sel.To})
	if err != nil {
		t.Fatal(err)
	}
	season := ebSeason()[:400]
	bins, err := reduce.BinInTime(season, 0.02, 2461000)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name      string
		d         LightCurveData
		wantLabel []string // in the x axis label
		hours     bool     // x in hours since a whole UTC hour
	}{
		{"one night, clock time", LightCurveData{Clock: berlin, Selection: &sel, Timing: &tm,
			Series: []Series{{Name: "target", Points: target}, {Name: "check", Points: check, OffsetMag: 1.3}, {Name: "comp", Points: comp, OffsetMag: 15.5}}},
			[]string{"Europe/Berlin: CET, UTC+1", "UTC below", "night of 2025-11-30"}, true},
		{"season on BJD", LightCurveData{Scale: ephem.BJDTDB, Binned: bins, Series: []Series{{Name: "target", Points: season}}},
			[]string{"BJD_TDB − 2461000 (days)"}, false},
		{"one night on JD", LightCurveData{Series: []Series{{Name: "target", Points: target}}, Timing: &tm},
			[]string{"JD_UTC − 2461010 (days)"}, false},
		{"Kwee–van Woerden, no curve", LightCurveData{Series: []Series{{Name: "target", Points: target}}, Timing: &kvw, Selection: &sel},
			[]string{"JD_UTC − 2461010 (days)"}, false},
	} {
		t.Run(c.name, func(t *testing.T) {
			pal := DefaultPalette()
			p, parts, err := lightCurve(c.d, pal)
			if err != nil {
				t.Fatal(err)
			}
			for _, w := range c.wantLabel {
				if !strings.Contains(p.X.Label.Text, w) {
					t.Errorf("x label %q, want it to hold %q", p.X.Label.Text, w)
				}
			}
			if !isInverted(p) {
				t.Errorf("magnitude axis not inverted: scale %T, min %v max %v", p.Y.Scale, p.Y.Min, p.Y.Max)
			}
			if !sameColour(p.BackgroundColor, pal.Background) {
				t.Errorf("background %v, want the palette's %v", p.BackgroundColor, pal.Background)
			}
			if len(parts.series) != len(c.d.Series) {
				t.Fatalf("%d series drawn, want %d", len(parts.series), len(c.d.Series))
			}
			// x of a Julian date, independently of the chart's mapping: the
			// first labelled tick gives the origin.
			x0 := parts.series[0].XYs[0].X
			jd0 := firstFinite(c.d.Series[0].Points).T
			unit := 1.0
			if c.hours {
				unit = 24
			}
			x := func(jd float64) float64 { return x0 + (jd-jd0)*unit }
			for i, s := range c.d.Series {
				var wantXY plotter.XYs
				nErr := 0
				for _, q := range s.Points {
					if math.IsNaN(q.T) || math.IsNaN(q.Mag) {
						continue
					}
					wantXY = append(wantXY, plotter.XY{X: x(q.T), Y: q.Mag + s.OffsetMag})
					if q.Err > 0 {
						nErr++
					}
				}
				sc := parts.series[i]
				if sc.Len() != len(wantXY) {
					t.Errorf("series %d: %d points drawn, want %d (NaN dropped)", i, sc.Len(), len(wantXY))
					continue
				}
				for j := range wantXY {
					if math.Abs(sc.XYs[j].X-wantXY[j].X) > jdTol*unit || sc.XYs[j].Y != wantXY[j].Y {
						t.Errorf("series %d point %d at %v, want %v", i, j, sc.XYs[j], wantXY[j])
						break
					}
				}
				got := 0
				if parts.bars[i] != nil {
					got = parts.bars[i].Len()
				}
				if got != nErr {
					t.Errorf("series %d: %d error bars, want one per point with an error (%d)", i, got, nErr)
				}
				if !sameColour(sc.GlyphStyle.Color, pal.Stars[i]) {
					t.Errorf("series %d drawn in %v, want star colour %v", i, sc.GlyphStyle.Color, pal.Stars[i])
				}
				if i > 0 && sc.GlyphStyle.Shape == parts.series[0].GlyphStyle.Shape {
					t.Errorf("series %d has the target's marker shape", i)
				}
			}
			if c.d.Binned != nil && (parts.binned == nil || parts.binned.Len() != len(c.d.Binned)) {
				t.Errorf("binned means drawn: %v, want %d", parts.binned, len(c.d.Binned))
			}
			if s := c.d.Selection; s != nil {
				if parts.sel == nil {
					t.Errorf("no selection drawn")
				} else if lo, hi := xSpan(parts.sel.XYs[0]); math.Abs(lo-x(s.From)) > jdTol*unit || math.Abs(hi-x(s.To)) > jdTol*unit {
					t.Errorf("selection from %v to %v, want %v to %v", lo, hi, x(s.From), x(s.To))
				} else if !sameColour(parts.sel.Color, pal.Selection) {
					t.Errorf("selection fill %v, want %v", parts.sel.Color, pal.Selection)
				}
			}
			if tm := c.d.Timing; tm != nil {
				if parts.mark == nil || math.Abs(parts.mark.XYs[0].X-x(tm.Time)) > jdTol*unit {
					t.Errorf("fitted time marked at %v, want %v", parts.mark, x(tm.Time))
				}
				if lo, hi := xSpan(parts.band.XYs[0]); math.Abs(hi-lo-2*tm.Sigma*unit) > jdTol*unit {
					t.Errorf("±σ band %v wide, want %v", hi-lo, 2*tm.Sigma*unit)
				}
				if (parts.fit == nil) != (tm.Curve == nil) {
					t.Errorf("fitted curve drawn %v, timing has one %v", parts.fit != nil, tm.Curve != nil)
				} else if parts.fit != nil {
					for _, q := range parts.fit.XYs {
						jd := jd0 + (q.X-x0)/unit
						if jd < tm.WindowFrom-1e-6 || jd > tm.WindowTo+1e-6 || math.Abs(q.Y-tm.Curve.At(jd)) > 1e-6 {
							t.Errorf("fit point %v: want the polynomial (%v) inside the window [%v, %v]", q, tm.Curve.At(jd), tm.WindowFrom, tm.WindowTo)
							break
						}
					}
				}
			}
			keyOutside(t, c.name, p, 0)
		})
	}
}

// firstFinite returns the first point with a time and a magnitude.
func firstFinite(pts []reduce.Point) reduce.Point {
	for _, q := range pts {
		if !math.IsNaN(q.T) && !math.IsNaN(q.Mag) {
			return q
		}
	}
	return reduce.Point{}
}

// xSpan returns the smallest and largest x of a polygon's ring.
func xSpan(ring plotter.XYs) (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, q := range ring {
		lo, hi = math.Min(lo, q.X), math.Max(hi, q.X)
	}
	return lo, hi
}

// TestClockTicks: on a clock axis each labelled tick is a whole local hour
// with UTC below, at the instant its x stands for.
func TestClockTicks(t *testing.T) {
	target, _, _ := eclipseNight()
	p, parts, err := lightCurve(LightCurveData{Clock: berlin, Series: []Series{{Name: "t", Points: target}}}, DefaultPalette())
	if err != nil {
		t.Fatal(err)
	}
	// The first point's instant fixes the axis's origin.
	q := firstFinite(target)
	at0 := jdToTime(q.T).Add(-time.Duration(parts.series[0].XYs[0].X * float64(time.Hour)))
	n := 0
	for _, tk := range p.X.Tick.Marker.Ticks(p.X.Min, p.X.Max) {
		if tk.Label == "" {
			continue
		}
		n++
		at := at0.Add(time.Duration(tk.Value * float64(time.Hour))).Round(time.Second)
		if want := at.In(berlin).Format("15:04") + "\n" + at.UTC().Format("15:04"); tk.Label != want || at.Minute() != 0 {
			t.Errorf("tick at %v: label %q, want %q on a whole hour", at, tk.Label, want)
		}
	}
	if n < 4 {
		t.Errorf("%d labelled hours over %.1f h", n, p.X.Max-p.X.Min)
	}
}

// TestJDToTime checks the conversion behind the clock axis.
func TestJDToTime(t *testing.T) {
	for _, c := range []struct {
		jd     float64
		want   time.Time
		source string
	}{
		{2451545.0, time.Date(2000, 1, 1, 12, 0, 0, 0, time.UTC), "Meeus 1998, ch. 7: J2000.0 = JD 2451545.0 = 2000 January 1.5"},
		{2440587.5, time.Date(1970, 1, 1, 0, 0, 0, 0, time.UTC), "the Unix epoch, JD 2440587.5 (common practice)"},
		{2436116.31, time.Date(1957, 10, 4, 19, 26, 24, 0, time.UTC), "Meeus 1998, Example 7.a: 1957 October 4.81 = JD 2436116.31"},
	} {
		if got := jdToTime(c.jd); got.Sub(c.want).Abs() > time.Millisecond {
			t.Errorf("JD %v: %v, want %v (%s)", c.jd, got, c.want, c.source)
		}
	}
}

func TestRoundOffset(t *testing.T) {
	for _, c := range []struct{ lo, hi, want float64 }{
		{2461010.30, 2461010.55, 2461010}, // within a day: the whole day
		{2461000.34, 2461014.97, 2461000}, // two weeks: tens of days
		{2461003.34, 2461008.97, 2461003}, // under ten days: whole days
		{2450000.2, 2462000.1, 2450000},   // decades: ten thousands
		{2461234.5, 2461334.5, 2461200},   // exactly 100 days: hundreds
	} {
		got := roundOffset(c.lo, c.hi)
		if got != c.want {
			t.Errorf("offset for [%v, %v] = %v, want %v", c.lo, c.hi, got, c.want)
		}
		if got > c.lo {
			t.Errorf("offset %v above the first time %v", got, c.lo)
		}
	}
}

func TestLightCurveBadInput(t *testing.T) {
	target, _, _ := eclipseNight()
	ok := []Series{{Name: "t", Points: target}}
	nan := math.NaN()
	for _, c := range []struct {
		name string
		d    LightCurveData
		pal  Palette
		want string
	}{
		{"no series", LightCurveData{}, DefaultPalette(), "no series"},
		{"all missing", LightCurveData{Series: []Series{{Name: "t", Points: []reduce.Point{{T: nan, Mag: 1}, {T: 1, Mag: nan}}}}}, DefaultPalette(), "no point"},
		{"infinite magnitude", LightCurveData{Series: []Series{{Name: "t", Points: []reduce.Point{{T: 2461000, Mag: 12}, {T: 2461000.1, Mag: math.Inf(1)}}}}}, DefaultPalette(), `series "t", point 1`},
		{"infinite offset", LightCurveData{Series: []Series{{Name: "c", Points: target, OffsetMag: math.Inf(1)}}}, DefaultPalette(), `"c": offset`},
		{"empty selection", LightCurveData{Series: ok, Selection: &TimeRange{2461010.4, 2461010.4}}, DefaultPalette(), "selection"},
		{"timing NaN", LightCurveData{Series: ok, Timing: &reduce.Timing{Time: nan}}, DefaultPalette(), "fitted time"},
		{"clock on BJD", LightCurveData{Series: ok, Scale: ephem.BJDTDB, Clock: berlin}, DefaultPalette(), "want JD UTC"},
		{"clock over a season", LightCurveData{Series: []Series{{Name: "t", Points: ebSeason()}}, Clock: berlin}, DefaultPalette(), "at most 2"},
		{"bad scale", LightCurveData{Series: ok, Scale: 7}, DefaultPalette(), "time scale 7"},
		{"no star colours", LightCurveData{Series: ok}, Palette{Background: DefaultPalette().Background, Foreground: DefaultPalette().Foreground}, "no star colours"},
	} {
		p, err := LightCurve(c.d, c.pal)
		if err == nil || p != nil || !strings.Contains(err.Error(), c.want) || !strings.HasPrefix(err.Error(), "chart: ") {
			t.Errorf("%s: plot %v, error %v: want an error naming %q", c.name, p != nil, err, c.want)
		}
	}
}
