package chart

import (
	"fmt"
	"image/color"
	"math"
	"reflect"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
)

// paletteColours returns every colour of a palette, named by its field
// (found by reflection, so that a field added later is covered too).
func paletteColours(p Palette) map[string]color.Color {
	out := map[string]color.Color{}
	v := reflect.ValueOf(p)
	colorType := reflect.TypeOf((*color.Color)(nil)).Elem()
	for i := 0; i < v.NumField(); i++ {
		f, name := v.Field(i), v.Type().Field(i).Name
		switch {
		case f.Type() == colorType && !f.IsNil():
			out[name] = f.Interface().(color.Color)
		case f.Kind() == reflect.Slice && f.Type().Elem() == colorType:
			for j := 0; j < f.Len(); j++ {
				out[fmt.Sprintf("%s[%d]", name, j)] = f.Index(j).Interface().(color.Color)
			}
		}
	}
	return out
}

var allPalettes = []struct {
	name string
	pal  Palette
}{{"default", DefaultPalette()}, {"dark", DarkPalette()}, {"night red", NightRedPalette()}}

// TestPalettesForMeasurements: every palette fills every field; the sky
// darkens; stars and fits stand out of the background (minLineContrast);
// the dark palette's sky is neutral; night red has no channel but red and
// nothing above 200 of 255.
func TestPalettesForMeasurements(t *testing.T) {
	nFields := len(paletteColours(DefaultPalette()))
	for _, pc := range allPalettes {
		pal := pc.pal
		cols := paletteColours(pal)
		if len(cols) != nFields {
			t.Errorf("%s: %d colours, want %d as the default palette has (a field left nil?)", pc.name, len(cols), nFields)
		}
		for i := 1; i < 5; i++ {
			if !(luminance(pal.sky(i)) < luminance(pal.sky(i-1))) {
				t.Errorf("%s: sky shade %d (luminance %.3f) not darker than shade %d (%.3f)", pc.name, i, luminance(pal.sky(i)), i-1, luminance(pal.sky(i-1)))
			}
		}
		lines := map[string]color.Color{}
		for i := range pal.Stars {
			lines[fmt.Sprintf("star %d", i)] = pal.Stars[i]
		}
		for i := range pal.Fits {
			lines[fmt.Sprintf("fit %d", i)] = pal.Fits[i]
		}
		lines["flag"], lines["foreground"] = pal.Flag, pal.Foreground
		for name, c := range lines {
			if got := contrast(c, pal.Background); got < minLineContrast {
				t.Errorf("%s: %s %v has contrast %.2f against the background, want at least %v", pc.name, name, c, got, minLineContrast)
			}
		}
	}
	dark := DarkPalette()
	for i := 0; i < 5; i++ {
		if r, g, b, _ := dark.sky(i).RGBA(); r != g || g != b {
			t.Errorf("dark sky shade %d is not neutral: %v", i, dark.sky(i))
		}
	}
	for name, c := range paletteColours(NightRedPalette()) {
		n := color.NRGBAModel.Convert(c).(color.NRGBA)
		if n.G != 0 || n.B != 0 || n.R > maxNightRed && n.A > 128 {
			t.Errorf("night red %s = %v: want red only, at most %d", name, n, maxNightRed)
		}
	}
}

// maxNightRed is the brightest red the night palette may draw (of 255).
const maxNightRed = 200

func TestPaletteNamed(t *testing.T) {
	for _, c := range []struct {
		name string
		want Palette
		ok   bool
	}{
		{"", DefaultPalette(), true}, {"default", DefaultPalette(), true}, {"Light", DefaultPalette(), true},
		{"dark", DarkPalette(), true}, {" DARK ", DarkPalette(), true},
		{"night-red", NightRedPalette(), true}, {"red", NightRedPalette(), true},
		{"blue", Palette{}, false}, {"night red", Palette{}, false},
	} {
		got, err := PaletteNamed(c.name)
		if (err == nil) != c.ok {
			t.Errorf("PaletteNamed(%q): error %v, want ok = %v", c.name, err, c.ok)
			continue
		}
		if err != nil {
			if !strings.Contains(err.Error(), strconv.Quote(c.name)) || !strings.Contains(err.Error(), "night-red") {
				t.Errorf("PaletteNamed(%q): error %q, want it to quote the name and list the choices", c.name, err)
			}
			continue
		}
		if !reflect.DeepEqual(got, c.want) {
			t.Errorf("PaletteNamed(%q) is not the palette wanted", c.name)
		}
	}
}

// TestNightRedCharts draws every demo chart in night red and checks every
// pixel: red only, none above maxNightRed. It also draws each in a
// palette with only Background, Foreground and Stars set (fills and fits
// fall back to shades of the foreground), and in every palette checks that
// the corner shows the palette's background.
func TestNightRedCharts(t *testing.T) {
	bare := Palette{Background: color.White, Foreground: color.Black, Stars: DefaultPalette().Stars}
	for _, dc := range demoCharts(t) {
		for _, pc := range append(allPalettes, struct {
			name string
			pal  Palette
		}{"bare", bare}) {
			d, err := dc.make(pc.pal)
			if err != nil {
				t.Errorf("%s, %s palette: %v", dc.name, pc.name, err)
				continue
			}
			img := render(d, pc.pal.Background, 12*vg.Centimeter, 8*vg.Centimeter)
			b := img.Bounds()
			want := color.NRGBAModel.Convert(pc.pal.Background).(color.NRGBA)
			if got := color.NRGBAModel.Convert(img.At(b.Min.X+1, b.Max.Y-2)).(color.NRGBA); got != want {
				t.Errorf("%s, %s palette: corner %v, want the background %v", dc.name, pc.name, got, want)
			}
			if pc.name != "night red" {
				continue
			}
			bad := 0
			for y := b.Min.Y; y < b.Max.Y; y++ {
				for x := b.Min.X; x < b.Max.X; x++ {
					r, g, bl, _ := img.At(x, y).RGBA()
					if g>>8 != 0 || bl>>8 != 0 || r>>8 > maxNightRed {
						if bad == 0 {
							t.Errorf("%s, night red: pixel (%d, %d) = %v, %v, %v: want red only, at most %d", dc.name, x, y, r>>8, g>>8, bl>>8, maxNightRed)
						}
						bad++
					}
				}
			}
			if bad > 1 {
				t.Errorf("%s, night red: %d pixels in all are not deep red", dc.name, bad)
			}
		}
	}
}

// TestNiceTicks: labels at round steps (1, 2 or 5 × 10^k), at most n,
// inside the range, written with the step's decimals and no "-0".
func TestNiceTicks(t *testing.T) {
	for _, c := range []struct {
		lo, hi float64
		n      int
		want   []string
	}{
		{12.25, 13.55, 8, []string{"12.4", "12.6", "12.8", "13.0", "13.2", "13.4"}},
		{-0.08, 0.05, 8, []string{"-0.08", "-0.06", "-0.04", "-0.02", "0.00", "0.02", "0.04"}},
		{0, 1, 5, []string{"0.0", "0.2", "0.4", "0.6", "0.8", "1.0"}},
		{-1.3, 31.2, 8, []string{"0", "5", "10", "15", "20", "25", "30"}},
		{-1500, 31000, 8, []string{"0", "5000", "10000", "15000", "20000", "25000", "30000"}},
	} {
		var got []string
		for _, tk := range (niceTicks{c.n}).Ticks(c.lo, c.hi) {
			if tk.Value < c.lo-1e-12 || tk.Value > c.hi+1e-12 {
				t.Errorf("[%v, %v]: tick at %v outside", c.lo, c.hi, tk.Value)
			}
			if tk.Label != "" {
				got = append(got, tk.Label)
				if v, err := strconv.ParseFloat(tk.Label, 64); err != nil || math.Abs(v-tk.Value) > 1e-9*(c.hi-c.lo) {
					t.Errorf("[%v, %v]: label %q at %v", c.lo, c.hi, tk.Label, tk.Value)
				}
			}
		}
		if strings.Join(got, " ") != strings.Join(c.want, " ") {
			t.Errorf("[%v, %v], n = %d: labels %q, want %q", c.lo, c.hi, c.n, got, c.want)
		}
	}
}

// keyOutside checks that p's side key lies right of the plotting area by
// at least gap, inside the canvas, and that the plot's own legend (drawn
// over the data) is empty.
func keyOutside(t *testing.T, name string, p *plot.Plot, gap vg.Length) {
	t.Helper()
	dc := draw.New(vgimg.New(26*vg.Centimeter, 15*vg.Centimeter))
	data := p.DataCanvas(dc)
	n := 0
	for _, b := range p.GlyphBoxes(p) {
		if b.X != 1 || b.Y != 1 || b.Max.Y != 0 || !(b.Min.Y < 0) {
			continue
		}
		n++
		left, right := data.Max.X+b.Min.X, data.Max.X+b.Max.X
		if left < data.Max.X+gap || right > dc.Max.X+0.5 || data.Max.Y+b.Min.Y < dc.Min.Y {
			t.Errorf("%s: key from %.1f to %.1f pt (%.1f high), plotting area ends at %.1f (+ %.1f), canvas at %.1f",
				name, left, right, -b.Min.Y, data.Max.X, gap, dc.Max.X)
		}
	}
	if n != 1 {
		t.Errorf("%s: %d keys right of the plot, want 1", name, n)
	}
	if s := legendText(p); s != "" {
		t.Errorf("%s: the plot's own legend holds %q", name, s)
	}
}

// isInverted says whether p's y axis puts smaller values higher.
func isInverted(p *plot.Plot) bool {
	_, ok := p.Y.Scale.(plot.InvertedScale)
	return ok && p.Y.Norm(p.Y.Min) > p.Y.Norm(p.Y.Max)
}

// sameColour compares colours by their RGBA values.
func sameColour(a, b color.Color) bool {
	if a == nil || b == nil {
		return a == b
	}
	r1, g1, b1, a1 := a.RGBA()
	r2, g2, b2, a2 := b.RGBA()
	return r1 == r2 && g1 == g2 && b1 == b2 && a1 == a2
}
