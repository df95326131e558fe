package chart

import (
	"bytes"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"

	"example.org/vigil/ephem"
	"example.org/vigil/reduce"
)

// ocTol is the tolerance on a drawn O−C (days): far below a pixel.
const ocTol = 1e-12

func TestOCDiagram(t *testing.T) {
	a, pub := demoOC(t)
	lta, lt := demoLightTime(t)
	pal := DefaultPalette()
	for _, c := range []struct {
		name     string
		d        OCData
		wantFits []string
	}{
		{"parabola", OCData{Analysis: a, Published: pub}, []string{FitLinear, FitQuadratic}},
		{"light-time", OCData{Analysis: lta, LightTime: lt}, []string{FitLinear, FitQuadratic, FitLightTime}},
	} {
		t.Run(c.name, func(t *testing.T) {
			p, parts, err := ocDiagram(c.d, pal)
			if err != nil {
				t.Fatal(err)
			}
			rows := c.d.Analysis.Rows
			// Timings by class, counted here from the rows.
			var want [4]int
			nErr, nAmb := 0, 0
			for i, r := range rows {
				k := 0
				if c.d.Published != nil && c.d.Published[i] {
					k = 2
				}
				if r.Cycle != math.Floor(r.Cycle) {
					k++
				}
				want[k]++
				if r.SigmaDays > 0 {
					nErr++
				}
				if r.Ambiguous {
					nAmb++
				}
			}
			for k, sc := range parts.classes {
				got := 0
				if sc != nil {
					got = sc.Len()
				}
				if got != want[k] {
					t.Errorf("class %d: %d markers, want %d", k, got, want[k])
				}
			}
			if parts.bars == nil || parts.bars.Len() != nErr {
				t.Errorf("error bars %v, want %d", parts.bars, nErr)
			}
			gotAmb := 0
			if parts.ambiguous != nil {
				gotAmb = parts.ambiguous.Len()
			}
			if gotAmb != nAmb {
				t.Errorf("%d timings ringed, want the %d ambiguous", gotAmb, nAmb)
			}
			// The curves are the analysis's fits.
			if len(parts.fits) != len(c.wantFits) {
				t.Errorf("fits drawn %v, want %v", parts.fits, c.wantFits)
			}
			fits := map[string]func(float64) float64{FitLinear: c.d.Analysis.Linear.OC}
			if q := c.d.Analysis.Quadratic; q != nil {
				fits[FitQuadratic] = q.OC
			}
			if c.d.LightTime != nil {
				fits[FitLightTime] = func(e float64) float64 { return c.d.LightTime.OC(c.d.Analysis.Ephemeris.At(e)) }
			}
			for _, name := range c.wantFits {
				l := parts.fits[name]
				if l == nil {
					t.Errorf("no %s fit drawn", name)
					continue
				}
				for _, q := range l.XYs {
					if math.Abs(q.Y-fits[name](q.X)) > ocTol {
						t.Errorf("%s fit at E = %v: %v, want %v", name, q.X, q.Y, fits[name](q.X))
						break
					}
				}
				if wide := name == c.d.Analysis.Preferred; wide != (l.Width > vg.Points(2)) {
					t.Errorf("%s fit %v wide; preferred %q", name, l.Width, c.d.Analysis.Preferred)
				}
			}
			// The minutes scale: each label is its tick's O−C in minutes.
			for _, tk := range parts.minutes.ticks {
				if tk.Label == "" {
					continue
				}
				if v, err := strconv.ParseFloat(tk.Label, 64); err != nil || math.Abs(v-tk.Value*1440) > 1e-6 {
					t.Errorf("minutes tick %q at %v d = %v min", tk.Label, tk.Value, tk.Value*1440)
				}
			}
			// The calendar scale: a year's tick at the cycle of 1 January.
			if parts.years == nil || len(parts.years.ticks) < 2 {
				t.Fatalf("calendar ticks %v, want some", parts.years)
			}
			for _, tk := range parts.years.ticks {
				y, err := strconv.Atoi(tk.Label)
				if err != nil {
					t.Errorf("year tick %q", tk.Label)
					continue
				}
				jd := c.d.Analysis.Ephemeris.At(tk.Value)
				if want := ephem.CalendarToJD(y, 1, 1); math.Abs(jd-want) > 1e-6 {
					t.Errorf("tick %q at E = %v, JD %v: want JD %v", tk.Label, tk.Value, jd, want)
				}
			}
			keyOutside(t, c.name, p, parts.minutes.depth(p))
		})
	}
}

func TestOCWithResiduals(t *testing.T) {
	a, pub := demoOC(t)
	lta, lt := demoLightTime(t)
	for _, c := range []struct {
		name string
		d    OCData
		fit  func(e float64) float64
	}{
		{"preferred (quadratic)", OCData{Analysis: a, Published: pub}, a.Quadratic.OC},
		{"linear", OCData{Analysis: a, Published: pub, Residuals: FitLinear}, a.Linear.OC},
		{"light-time", OCData{Analysis: lta, LightTime: lt, Residuals: FitLightTime}, func(e float64) float64 { return lt.OC(lta.Ephemeris.At(e)) }},
	} {
		t.Run(c.name, func(t *testing.T) {
			top, res, parts, err := ocWithResiduals(c.d, DefaultPalette())
			if err != nil {
				t.Fatal(err)
			}
			n := 0
			for _, sc := range parts.classes {
				if sc == nil {
					continue
				}
				for _, q := range sc.XYs {
					r, ok := rowAt(c.d.Analysis.Rows, q.X)
					if !ok || math.Abs(q.Y-(r.OCDays-c.fit(r.Cycle))) > ocTol {
						t.Errorf("residual at E = %v: %v, want O−C − fit = %v", q.X, q.Y, r.OCDays-c.fit(r.Cycle))
					}
					n++
				}
			}
			if n != len(c.d.Analysis.Rows) {
				t.Errorf("%d residuals, want %d", n, len(c.d.Analysis.Rows))
			}
			if res.X.Min != top.X.Min || res.X.Max != top.X.Max {
				t.Errorf("residual cycles [%v, %v], diagram's [%v, %v]", res.X.Min, res.X.Max, top.X.Min, top.X.Max)
			}
			// The plotting areas line up.
			pn := Panels{Plots: []*plot.Plot{top, res}, Heights: []float64{2, 1}}
			dc := draw.New(vgimg.New(26*vg.Centimeter, 15*vg.Centimeter))
			tiles := pn.layout(dc)
			d0, d1 := top.DataCanvas(tiles[0]), res.DataCanvas(tiles[1])
			if math.Abs(float64(d0.Min.X-d1.Min.X)) > 0.01 || math.Abs(float64(d0.Max.X-d1.Max.X)) > 0.01 {
				t.Errorf("plotting areas from %v to %v and from %v to %v, want them aligned", d0.Min.X, d0.Max.X, d1.Min.X, d1.Max.X)
			}
			if h0, h1 := tiles[0].Max.Y-tiles[0].Min.Y, tiles[1].Max.Y-tiles[1].Min.Y; math.Abs(float64(h0-2*h1)) > 0.01 || tiles[1].Max.Y != tiles[0].Min.Y {
				t.Errorf("panels %v and %v high, want 2:1, one above the other", h0, h1)
			}
		})
	}
}

// rowAt returns the row of cycle e.
func rowAt(rows []reduce.OCRow, e float64) (reduce.OCRow, bool) {
	for _, r := range rows {
		if r.Cycle == e {
			return r, true
		}
	}
	return reduce.OCRow{}, false
}

func TestSavePanels(t *testing.T) {
	a, pub := demoOC(t)
	pn, err := OCWithResiduals(OCData{Analysis: a, Published: pub}, NightRedPalette())
	if err != nil {
		t.Fatal(err)
	}
	for _, ext := range []string{"png", "svg", "pdf"} {
		path := filepath.Join(t.TempDir(), "oc."+ext)
		if err := SavePanels(pn, path, 24*vg.Centimeter, 16*vg.Centimeter); err != nil {
			t.Fatal(err)
		}
		data, err := os.ReadFile(path)
		magic := map[string]string{"png": "\x89PNG", "svg": "<?xml", "pdf": "%PDF"}[ext]
		if err != nil || !bytes.HasPrefix(data, []byte(magic)) {
			t.Errorf("%s: %d bytes, want a file starting %q (%v)", ext, len(data), magic, err)
		}
	}
	for _, c := range []struct {
		name string
		pn   Panels
		path string
		want string
	}{
		{"gif", pn, "oc.gif", `format ".gif"`},
		{"no panels", Panels{}, "oc.png", "no panels"},
	} {
		path := filepath.Join(t.TempDir(), c.path)
		if err := SavePanels(c.pn, path, 10*vg.Centimeter, 10*vg.Centimeter); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want one naming %q", c.name, err, c.want)
		}
		if _, err := os.Stat(path); !os.IsNotExist(err) {
			t.Errorf("%s: %s written", c.name, path)
		}
	}
}

func TestOCBadInput(t *testing.T) {
	a, pub := demoOC(t)
	noEph := a
	noEph.Ephemeris = ephem.Ephemeris{}
	noQuad := a
	noQuad.Quadratic = nil
	for _, c := range []struct {
		name  string
		d     OCData
		resid bool
		want  string
	}{
		{"no timings", OCData{Analysis: reduce.OCAnalysis{Ephemeris: a.Ephemeris}}, false, "no timings"},
		{"no ephemeris", OCData{Analysis: noEph}, false, "ephemeris period 0"},
		{"published flags short", OCData{Analysis: a, Published: pub[:3]}, false, "3 published flags"},
		{"light-time fit empty", OCData{Analysis: a, LightTime: &reduce.LightTimeFit{}}, false, "orbital period 0"},
		{"residuals from an unknown fit", OCData{Analysis: a, Residuals: "cubic"}, true, `"cubic"`},
		{"residuals from a missing fit", OCData{Analysis: noQuad, Residuals: FitQuadratic}, true, "has none"},
		{"residuals from no light-time", OCData{Analysis: a, Residuals: FitLightTime}, true, "has none"},
	} {
		var err error
		if c.resid {
			_, err = OCWithResiduals(c.d, DefaultPalette())
		} else {
			_, err = OCDiagram(c.d, DefaultPalette())
		}
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want one naming %q", c.name, err, c.want)
		}
	}
}
