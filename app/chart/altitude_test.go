package chart

import (
	"bytes"
	"flag"
	"fmt"
	"image"
	"image/color"
	"image/png"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/recorder"
	"gonum.org/v1/plot/vg/vgimg"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

var outDir = flag.String("outdir", "", "also write the demo charts (PNG, both palettes, and a greyscale copy) to this directory")

// chartCase is an invented site, night and list of invented targets.
type chartCase struct {
	name          string
	site          string
	lat, lon      float64
	tz            string
	date          time.Time
	targets       int
	wantUTCRow    bool
	wantZoneLabel string
}

var chartCases = []chartCase{
	{"berlin", "Lindenhof (invented)", 50.1, 8.7, "Europe/Berlin", time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC), 3, true, "Europe/Berlin: CET, UTC+1"},
	{"london", "Thameside (invented)", 51.5, -0.1, "Europe/London", time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC), 3, false, "Europe/London: GMT = UTC"},
	{"utc", "Nullmeridian (invented)", 51.5, -0.1, "UTC", time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC), 2, false, "time (UTC)"},
	// The night of the change to summer time (01:00 UTC, 2026-03-29).
	{"dst", "Lindenhof (invented)", 50.1, 8.7, "Europe/Berlin", time.Date(2026, 3, 28, 0, 0, 0, 0, time.UTC), 3, true, "CET, UTC+1 / CEST, UTC+2"},
	// A zone offset by 5 h 45 min: local whole hours are not UTC's.
	{"kathmandu", "Himal (invented)", 27.7, 85.3, "Asia/Kathmandu", time.Date(2026, 11, 10, 0, 0, 0, 0, time.UTC), 2, true, "UTC+5:45"},
	// Twelve targets, and a northern summer night without astronomical
	// darkness.
	{"many", "Lindenhof (invented)", 50.1, 8.7, "Europe/Berlin", time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC), 12, true, "CET"},
	{"summer", "Nordkapp (invented)", 60, 10, "Europe/Oslo", time.Date(2026, 6, 20, 0, 0, 0, 0, time.UTC), 3, true, "CEST, UTC+2"},
}

// demoTargets returns n invented targets spread in right ascension.
func demoTargets(n int) []observe.Target {
	kinds := []struct {
		class observe.Class
		kind  observe.Kind
		p     float64
	}{{observe.Pulsating, observe.Max, 0.3712345}, {observe.Eclipsing, observe.Min, 1.2345678}, {observe.Pulsating, observe.Max, 0.281}}
	names := []string{"Alder Var", "Cedar Ecl", "Hazel Var", "Rowan Var", "Sorrel Ecl", "Teasel Var", "Birch Var",
		"Juniper Ecl", "Larch Var", "Maple Var", "Willow Ecl", "Yew Var"}
	out := make([]observe.Target, n)
	for i := range out {
		k := kinds[i%len(kinds)]
		star := ephem.Star{RAHours: math.Mod(5.5+2.3*float64(i), 24), DecDeg: 30 - 9*float64(i%7) + 31*float64(i%2)}
		eph := ephem.Ephemeris{Epoch: 2461000.31 + 0.07*float64(i), PeriodDays: k.p * (1 + 0.1*float64(i)), Scale: ephem.BJDTDB, EpochErr: 0.001}
		out[i] = observe.NewTarget(names[i%len(names)], star, k.class, eph, k.kind)
	}
	return out
}

func (cc chartCase) chart(t *testing.T) observe.Chart {
	t.Helper()
	site, err := observe.NewSite(cc.site, cc.lat, cc.lon, 120, cc.tz, 20,
		observe.Horizon{{AzDeg: 0, AltDeg: 12}, {AzDeg: 100, AltDeg: 25}, {AzDeg: 200, AltDeg: 8}, {AzDeg: 290, AltDeg: 18}})
	if err != nil {
		t.Fatal(err)
	}
	p, err := observe.NewPlanner(site, observe.DefaultConstraints())
	if err != nil {
		t.Fatal(err)
	}
	c, err := p.Chart(demoTargets(cc.targets), cc.date)
	if err != nil {
		t.Fatal(err)
	}
	return c
}

func TestAltitudeChart(t *testing.T) {
	c := chartCases[0].chart(t)
	p, err := Altitude(c, DefaultPalette())
	if err != nil {
		t.Fatal(err)
	}
	// Axis settings: the whole span in hours, altitude 0–90°.
	if want := c.To.Sub(c.From).Hours(); p.X.Min != 0 || math.Abs(p.X.Max-want) > 1e-9 || p.Y.Min != 0 || p.Y.Max != 90 {
		t.Errorf("axes x [%v, %v] y [%v, %v], want x [0, %v] y [0, 90]", p.X.Min, p.X.Max, p.Y.Min, p.Y.Max, want)
	}
	// The span runs from an hour before sunset to an hour after sunrise.
	if d := c.Twilights.Sunset.At.Time().Sub(c.From); (d - time.Hour).Abs() > time.Millisecond {
		t.Errorf("chart starts %v before sunset, want 1h", d)
	}
	if len(c.Events) == 0 {
		t.Errorf("no extrema in the demo night")
	}
	// The sky bands cover the span without gaps, and go from day to night
	// and back.
	bands := skyBands(c, DefaultPalette())
	for i := 1; i < len(bands); i++ {
		if !bands[i].from.Equal(bands[i-1].to) {
			t.Errorf("band %d starts %v, previous ends %v", i, bands[i].from, bands[i-1].to)
		}
	}
	if len(bands) != 9 {
		t.Errorf("%d sky bands, want 9 (day, civil, nautical, astronomical, night and back)", len(bands))
	}
	// Civil dusk falls where the bands say, within the sampling of the
	// Sun's curve (a few seconds, interpolated).
	if d := bands[1].to.Sub(c.Twilights.CivilDusk.At.Time()).Abs(); d > 10*time.Second {
		t.Errorf("civil band ends %v from civil dusk", d)
	}
	for _, ext := range []string{"png", "svg", "pdf"} {
		path := filepath.Join(t.TempDir(), "night."+ext)
		if err := Save(p, path, 24*vg.Centimeter, 14*vg.Centimeter); err != nil {
			t.Fatal(err)
		}
		data, err := os.ReadFile(path)
		magic := map[string]string{"png": "\x89PNG", "svg": "<?xml", "pdf": "%PDF"}[ext]
		if err != nil || !bytes.HasPrefix(data, []byte(magic)) {
			t.Errorf("%s: %d bytes, want a file starting %q (%v)", ext, len(data), magic, err)
		}
	}
	if err := Save(p, filepath.Join(t.TempDir(), "night.gif"), 10*vg.Centimeter, 10*vg.Centimeter); err == nil {
		t.Errorf("saving as .gif: no error, want one naming the format")
	}
	if *outDir != "" {
		writeDemoCharts(t)
	}
}

// TestTimeAxisZones: local time on the first row, UTC on a second only
// when the zone differs from it; the zone named in the axis label.
func TestTimeAxisZones(t *testing.T) {
	for _, cc := range chartCases {
		t.Run(cc.name, func(t *testing.T) {
			c := cc.chart(t)
			p, err := Altitude(c, DefaultPalette())
			if err != nil {
				t.Fatal(err)
			}
			if !strings.Contains(p.X.Label.Text, cc.wantZoneLabel) {
				t.Errorf("axis label %q, want it to name %q", p.X.Label.Text, cc.wantZoneLabel)
			}
			if got := strings.Contains(p.X.Label.Text, "UTC below"); got != cc.wantUTCRow {
				t.Errorf("axis label %q: says UTC below %v, want %v", p.X.Label.Text, got, cc.wantUTCRow)
			}
			n := 0
			for _, tk := range p.X.Tick.Marker.Ticks(p.X.Min, p.X.Max) {
				if tk.Label == "" {
					continue
				}
				n++
				at := c.From.Add(time.Duration(tk.Value * float64(time.Hour))).Round(time.Second)
				local, utc := at.In(c.Location).Format("15:04"), at.UTC().Format("15:04")
				want := local
				if cc.wantUTCRow {
					want += "\n" + utc
				}
				if tk.Label != want {
					t.Errorf("tick at %s: label %q, want %q", at.UTC().Format(time.RFC3339), tk.Label, want)
				}
				if !strings.HasSuffix(local, ":00") {
					t.Errorf("tick at %s: local %s is not a whole hour", at.UTC().Format(time.RFC3339), local)
				}
			}
			if n < 6 {
				t.Errorf("%d labelled ticks over %.1f h, want one every hour or two", n, p.X.Max)
			}
		})
	}
}

// luminance returns the relative luminance of c, 0 (black) to 1 (white):
// sRGB decoded to linear light, weighted 0.2126, 0.7152, 0.0722 (WCAG 2.1,
// "relative luminance", after IEC 61966-2-1).
func luminance(c color.Color) float64 {
	n := color.NRGBAModel.Convert(c).(color.NRGBA)
	lin := func(v uint8) float64 {
		x := float64(v) / 255
		if x <= 0.04045 {
			return x / 12.92
		}
		return math.Pow((x+0.055)/1.055, 2.4)
	}
	return 0.2126*lin(n.R) + 0.7152*lin(n.G) + 0.0722*lin(n.B)
}

// contrast returns the contrast ratio of two colours, (L1 + 0.05)/(L2 +
// 0.05) with L1 the lighter (WCAG 2.1).
func contrast(a, b color.Color) float64 {
	la, lb := luminance(a), luminance(b)
	return (max(la, lb) + 0.05) / (min(la, lb) + 0.05)
}

// minLineContrast is the least contrast of a star's line against the halo
// of background colour drawn around it (2:1; WCAG asks 3:1 of graphics in
// general, which the Okabe–Ito orange and sky blue miss on white, so the
// dash patterns and direct labels carry identity too).
const minLineContrast = 2.0

func TestPalettes(t *testing.T) {
	for _, pc := range []struct {
		name string
		pal  Palette
	}{{"default", DefaultPalette()}, {"night red", NightRedPalette()}} {
		pal := pc.pal
		// Darker means a darker sky: day, civil, nautical, astronomical,
		// night, strictly.
		for i := 1; i < 5; i++ {
			if !(luminance(pal.sky(i)) < luminance(pal.sky(i-1))) {
				t.Errorf("%s: sky shade %d (luminance %.3f) not darker than shade %d (%.3f)", pc.name, i, luminance(pal.sky(i)), i-1, luminance(pal.sky(i-1)))
			}
		}
		// Every star stands out of its halo.
		for i := range pal.Stars {
			if c := contrast(pal.star(i), pal.Background); c < minLineContrast {
				t.Errorf("%s: star %d %v has contrast %.2f against the background, want at least %v", pc.name, i, pal.star(i), c, minLineContrast)
			}
		}
	}
	// The default sky is neutral grey, so that it prints as it shows.
	def := DefaultPalette()
	for i := 0; i < 5; i++ {
		r, g, b, _ := def.sky(i).RGBA()
		if r != g || g != b {
			t.Errorf("default sky shade %d is not neutral: %v", i, def.sky(i))
		}
	}
	// Night red: no channel but red, nothing brighter than 200 of 255.
	red := NightRedPalette()
	all := append([]color.Color{red.Background, red.Foreground, red.Grid, red.KeyBackground, red.Day, red.Civil,
		red.Nautical, red.Astronomical, red.Night, red.Moon, red.MinAlt, red.Window}, red.Stars...)
	for i, c := range all {
		n := color.NRGBAModel.Convert(c).(color.NRGBA)
		if n.G != 0 || n.B != 0 || n.R > 200 && n.A > 128 {
			t.Errorf("night red colour %d = %v: want red only, at most 200", i, n)
		}
	}
}

// TestStarStyles: the stars' curves differ in colour and dash pattern
// together, and by dash pattern alone among neighbours (greyscale print,
// night red).
func TestStarStyles(t *testing.T) {
	pal := DefaultPalette()
	type style struct {
		col    color.Color
		dashes string
	}
	key := func(i int) style {
		s := pal.starLine(i)
		return style{s.Color, fmt.Sprint(s.Dashes)}
	}
	n := len(pal.Stars) * len(starDashes)
	seen := map[style]int{}
	for i := 0; i < n; i++ {
		k := key(i)
		if j, ok := seen[k]; ok {
			t.Errorf("stars %d and %d share colour and dashes %v", j, i, k)
		}
		seen[k] = i
	}
	for i := 0; i+1 < len(starDashes); i++ {
		for j := i + 1; j < len(starDashes); j++ {
			if key(i).dashes == key(j).dashes {
				t.Errorf("stars %d and %d share the dash pattern %q", i, j, key(i).dashes)
			}
		}
	}
}

// TestWindowsAtFoot: coverage windows are drawn only as bars along the
// foot of the chart, one row per target, below the lowest useful altitude;
// nothing but the sky's bands fills the full height of the plot.
func TestWindowsAtFoot(t *testing.T) {
	for _, cc := range []chartCase{chartCases[0], chartCases[5]} {
		t.Run(cc.name, func(t *testing.T) {
			c := cc.chart(t)
			xmax := c.To.Sub(c.From).Hours()
			bars := footBars(c, xmax)
			want := 0
			for _, e := range c.Events {
				if e.Window.End.Time().After(c.From) && e.Window.Start.Time().Before(c.To) {
					want++
				}
			}
			if len(bars) != want || want == 0 {
				t.Errorf("%d bars, want one per window in the span (%d)", len(bars), want)
			}
			base, pitch, height := barLayout(c)
			if !(height > 0 && height < pitch) || base+pitch*float64(len(c.Stars)) > c.MinAltDeg {
				t.Errorf("%d rows of bars from %v° every %v° (%v° high): want them apart, below %v°", len(c.Stars), base, pitch, height, c.MinAltDeg)
			}
			for _, b := range bars {
				if math.Abs(b.y1-b.y0-height) > 1e-9 || b.y0 < 0 || b.y1 > c.MinAltDeg || b.x0 < 0 || b.x1 > xmax || !(b.x1 > b.x0) {
					t.Errorf("bar %+v: want a bar %v° high in [0, %v°], inside the span", b, height, c.MinAltDeg)
				}
				if row := int(math.Round((b.y0 - base) / pitch)); row != b.target {
					t.Errorf("bar of target %d in row %d, want its own row", b.target, row)
				}
			}
			p, err := Altitude(c, DefaultPalette())
			if err != nil {
				t.Fatal(err)
			}
			fills := fullHeightFills(t, p)
			if nb := len(skyBands(c, DefaultPalette())); fills != nb {
				t.Errorf("%d fills span the plot's height, want only the %d sky bands", fills, nb)
			}
		})
	}
}

// fullHeightFills draws p on a recording canvas and counts the filled
// shapes within the plotting area that reach from its foot to its top.
func fullHeightFills(t *testing.T, p *plot.Plot) int {
	t.Helper()
	rec := new(recorder.Canvas)
	dc := draw.NewCanvas(rec, 24*vg.Centimeter, 14*vg.Centimeter)
	p.Draw(dc)
	data := p.DataCanvas(dc)
	n := 0
	for _, a := range rec.Actions {
		f, ok := a.(*recorder.Fill)
		if !ok {
			continue
		}
		lo, hi := vg.Point{X: vg.Length(math.Inf(1)), Y: vg.Length(math.Inf(1))}, vg.Point{X: vg.Length(math.Inf(-1)), Y: vg.Length(math.Inf(-1))}
		for _, c := range f.Path {
			if c.Type == vg.MoveComp || c.Type == vg.LineComp {
				lo = vg.Point{X: min(lo.X, c.Pos.X), Y: min(lo.Y, c.Pos.Y)}
				hi = vg.Point{X: max(hi.X, c.Pos.X), Y: max(hi.Y, c.Pos.Y)}
			}
		}
		inside := lo.X >= data.Min.X-0.5 && hi.X <= data.Max.X+0.5
		if inside && lo.Y <= data.Min.Y+0.5 && hi.Y >= data.Max.Y-0.5 {
			n++
		}
	}
	return n
}

// TestKeyOutsidePlot: the key stands right of the plotting area, inside the
// canvas, and the plot's own legend (drawn over the curves) is unused.
func TestKeyOutsidePlot(t *testing.T) {
	for _, cc := range []chartCase{chartCases[0], chartCases[5]} {
		c := cc.chart(t)
		p, err := Altitude(c, NightRedPalette())
		if err != nil {
			t.Fatal(err)
		}
		dc := draw.New(vgimg.New(24*vg.Centimeter, 14*vg.Centimeter))
		data := p.DataCanvas(dc)
		var key *sideKey
		for _, b := range p.GlyphBoxes(p) {
			if b.X == 1 && b.Min.X >= 0 && b.Size().X > 0 && b.Size().Y > 0 && b.Min.Y < 0 {
				if key != nil {
					t.Errorf("%s: two boxes right of the plot", cc.name)
				}
				key = &sideKey{}
				right := data.Max.X + b.Min.X + b.Size().X
				if right > dc.Max.X+0.5 || data.Max.X+b.Min.X < data.Max.X {
					t.Errorf("%s: key from %v to %v, plot ends at %v, canvas at %v", cc.name, data.Max.X+b.Min.X, right, data.Max.X, dc.Max.X)
				}
				if data.Max.Y+b.Min.Y < dc.Min.Y {
					t.Errorf("%s: key %v high does not fit", cc.name, b.Size().Y)
				}
			}
		}
		if key == nil {
			t.Errorf("%s: no key right of the plot", cc.name)
		}
		// The built-in legend has nothing to draw: it would sit over the
		// curves.
		if s := legendText(p); s != "" {
			t.Errorf("%s: the plot's own legend holds %q", cc.name, s)
		}
	}
}

// legendText draws the plot's own legend alone and returns the texts it
// wrote.
func legendText(p *plot.Plot) string {
	rec := new(recorder.Canvas)
	p.Legend.Draw(draw.NewCanvas(rec, 10*vg.Centimeter, 10*vg.Centimeter))
	var out []string
	for _, a := range rec.Actions {
		if f, ok := a.(*recorder.FillString); ok {
			out = append(out, f.String)
		}
	}
	return strings.Join(out, ", ")
}

// TestAboveHorizon: curves are cut at the horizon and at the ends of the
// interval asked for (the windows' traces).
func TestAboveHorizon(t *testing.T) {
	t0 := time.Date(2026, 12, 1, 18, 0, 0, 0, time.UTC)
	cv := observe.Curve{Name: "test"}
	for i, a := range []float64{-10, 10, 30, 10, -10, -30} {
		cv.Times = append(cv.Times, t0.Add(time.Duration(i)*time.Hour))
		cv.AltDeg = append(cv.AltDeg, a)
	}
	x := func(t time.Time) float64 { return t.Sub(t0).Hours() }
	for _, c := range []struct {
		name     string
		from, to time.Time
		want     plotter.XYs
	}{
		{"whole", t0, t0.Add(5 * time.Hour), plotter.XYs{{X: 0.5, Y: 0}, {X: 1, Y: 10}, {X: 2, Y: 30}, {X: 3, Y: 10}, {X: 3.5, Y: 0}}},
		{"window", t0.Add(90 * time.Minute), t0.Add(150 * time.Minute), plotter.XYs{{X: 1.5, Y: 20}, {X: 2, Y: 30}, {X: 2.5, Y: 20}}},
	} {
		segs := aboveHorizon(cv, x, c.from, c.to)
		if len(segs) != 1 {
			t.Errorf("%s: %d segments, want 1", c.name, len(segs))
			continue
		}
		if len(segs[0]) != len(c.want) {
			t.Errorf("%s: points %v, want %v", c.name, segs[0], c.want)
			continue
		}
		for i := range c.want {
			if math.Abs(segs[0][i].X-c.want[i].X) > 1e-9 || math.Abs(segs[0][i].Y-c.want[i].Y) > 1e-9 {
				t.Errorf("%s: point %d = %v, want %v", c.name, i, segs[0][i], c.want[i])
			}
		}
	}
}

// writeDemoCharts writes every case in both palettes, and a greyscale copy
// of the default one (as a printer would render it), to *outDir.
func writeDemoCharts(t *testing.T) {
	for _, cc := range chartCases {
		c := cc.chart(t)
		for _, pc := range []struct {
			suffix string
			pal    Palette
		}{{"", DefaultPalette()}, {"_red", NightRedPalette()}} {
			p, err := Altitude(c, pc.pal)
			if err != nil {
				t.Fatal(err)
			}
			path := filepath.Join(*outDir, "altitude_"+cc.name+pc.suffix+".png")
			if err := Save(p, path, 26*vg.Centimeter, 15*vg.Centimeter); err != nil {
				t.Fatal(err)
			}
			if pc.suffix == "" {
				if err := greyCopy(path, strings.TrimSuffix(path, ".png")+"_grey.png"); err != nil {
					t.Fatal(err)
				}
			}
		}
	}
}

// greyCopy writes a greyscale copy of a PNG.
func greyCopy(from, to string) error {
	f, err := os.Open(from)
	if err != nil {
		return err
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		return err
	}
	g := image.NewGray(img.Bounds())
	for y := img.Bounds().Min.Y; y < img.Bounds().Max.Y; y++ {
		for x := img.Bounds().Min.X; x < img.Bounds().Max.X; x++ {
			g.Set(x, y, img.At(x, y))
		}
	}
	out, err := os.Create(to)
	if err != nil {
		return err
	}
	defer out.Close()
	return png.Encode(out, g)
}
