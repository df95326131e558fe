package chart

import (
	"context"
	"encoding/csv"
	"image"
	"image/color"
	"image/png"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"

	"example.org/vigil/ephem"
	"example.org/vigil/reduce"
)

// The demo data of the measurement charts: invented stars, synthetic
// measurements from stated models with seeded noise.

// eclipseNight is one night of an invented eclipsing binary around a
// primary minimum, in JD UTC: a Gaussian dip of 0.62 mag at eclipseT0 on a
// 12.35 mag plateau, 0.008 mag noise; a check star and a comparison star's
// instrumental magnitudes beside it. A few exposures are lost to cloud
// (NaN) and a few lack an error.
const (
	eclipseT0    = 2461010.4321
	eclipseDepth = 0.62
	eclipseWidth = 0.028 // days, the Gaussian's σ·√2
)

func eclipseNight() (target, check, comp []reduce.Point) {
	rng := rand.New(rand.NewPCG(1, 2))
	for k := 0; k < 100; k++ {
		t := 2461010.30 + 0.0025*float64(k)
		x := (t - eclipseT0) / eclipseWidth
		m := 12.35 + eclipseDepth*math.Exp(-x*x) + 0.008*rng.NormFloat64()
		e := 0.006 + 0.006*rng.Float64()
		switch {
		case k == 17 || k == 18 || k == 63:
			m = math.NaN() // cloud
		case k%29 == 5:
			e = math.NaN() // no error recorded
		}
		target = append(target, reduce.Point{T: t, Mag: m, Err: e})
		check = append(check, reduce.Point{T: t, Mag: 11.84 + 0.009*rng.NormFloat64(), Err: 0.008})
		comp = append(comp, reduce.Point{T: t, Mag: -2.10 + 0.02*math.Sin(float64(k)/15) + 0.006*rng.NormFloat64(), Err: 0.005})
	}
	return target, check, comp
}

// eclipseTiming times the demo minimum in a picked window.
func eclipseTiming(t *testing.T, pts []reduce.Point, sel TimeRange) reduce.Timing {
	t.Helper()
	tm, err := reduce.Extremum(pts, reduce.ExtremumOptions{Kind: reduce.Minimum, From: sel.From, To: sel.To, Bootstrap: 200, Seed: 7})
	if err != nil {
		t.Fatal(err)
	}
	return tm
}

// demoEB is an invented eclipsing binary on BJD_TDB: P = 0.8123457 d,
// primary minimum 0.70 mag deep, secondary 0.25 mag, a little ellipsoidal
// variation, observed on 40 nights over a season.
var demoEB = ephem.Ephemeris{Epoch: 2461000.3412, PeriodDays: 0.8123457, Scale: ephem.BJDTDB}

func ebMag(phase float64) float64 {
	d := func(c, w float64) float64 {
		x := math.Remainder(phase-c, 1) / w
		return math.Exp(-x * x)
	}
	return 11.80 + 0.70*d(0, 0.045) + 0.25*d(0.5, 0.05) - 0.03*math.Cos(4*math.Pi*phase)
}

func ebSeason() []reduce.Point {
	rng := rand.New(rand.NewPCG(3, 4))
	var pts []reduce.Point
	for night := 0; night < 40; night++ {
		start := demoEB.Epoch + 1.6*float64(night) + 0.3*rng.Float64()
		for k := 0; k < 40; k++ {
			t := start + 0.004*float64(k)
			pts = append(pts, reduce.Point{T: t, Mag: ebMag(demoEB.Phase(t)) + 0.01*rng.NormFloat64(), Err: 0.008 + 0.004*rng.Float64()})
		}
	}
	return pts
}

// demoOC returns an O−C analysis with a parabola: timings of an invented
// binary (T0 = BJD 2450000.0, P = 0.4 d) whose period grows, Q = 4e-11 d,
// against elements 2e-7 d short: published timings up to cycle 18000
// with errors of 0.002–0.004 d, some of them secondary minima, and one
// wild old timing; the observer's own since cycle 26000, 0.0003–0.0008 d.
func demoOC(t *testing.T) (reduce.OCAnalysis, []bool) {
	t.Helper()
	rng := rand.New(rand.NewPCG(5, 6))
	eph := ephem.Ephemeris{Epoch: 2450000.0, PeriodDays: 0.4, Scale: ephem.BJDTDB}
	truth := func(e float64) float64 { return 2450000.003 + (0.4+2e-7)*e + 4e-11*e*e }
	var tms []reduce.Timing
	var pub []bool
	add := func(e, sigma float64, published bool) {
		tms = append(tms, reduce.Timing{Time: truth(e) + sigma*rng.NormFloat64(), Sigma: sigma})
		pub = append(pub, published)
	}
	for e := -1500.0; e < 18000; e += 700 + 400*rng.Float64() {
		c := math.Round(e)
		if rng.Float64() < 0.25 {
			c += 0.5
		}
		add(c, 0.002+0.002*rng.Float64(), true)
	}
	tms = append(tms, reduce.Timing{Time: truth(9400) + 0.128, Sigma: 0.01}) // a miscounted visual timing
	pub = append(pub, true)
	for e := 26000.0; e < 30500; e += 150 + 250*rng.Float64() {
		c := math.Round(e)
		if rng.Float64() < 0.3 {
			c += 0.5
		}
		add(c, 0.0003+0.0005*rng.Float64(), false)
	}
	a, err := reduce.OC(eph, tms, reduce.OCOptions{Secondary: true})
	if err != nil {
		t.Fatal(err)
	}
	return a, pub
}

// demoLightTime returns an O−C analysis with a light-time orbit (P3 =
// 4000 d, semi-amplitude 0.008 d) over three orbits, and its fit.
func demoLightTime(t *testing.T) (reduce.OCAnalysis, *reduce.LightTimeFit) {
	t.Helper()
	rng := rand.New(rand.NewPCG(7, 8))
	eph := ephem.Ephemeris{Epoch: 2450000.0, PeriodDays: 0.4, Scale: ephem.BJDTDB}
	var tms []reduce.Timing
	for e := 0.0; e < 30000; e += 250 + 300*rng.Float64() {
		c := math.Round(e)
		tt := eph.At(c) + 0.001 + 0.008*math.Cos(2*math.Pi*(eph.At(c)-2451000)/4000)
		tms = append(tms, reduce.Timing{Time: tt + 0.0008*rng.NormFloat64(), Sigma: 0.0008})
	}
	a, err := reduce.OC(eph, tms, reduce.OCOptions{})
	if err != nil {
		t.Fatal(err)
	}
	lt, err := reduce.LightTime(a, reduce.LightTimeOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return a, &lt
}

// methods60 reads the methods.md §12 series (testdata/period, made by
// make_reference.py).
func methods60(t *testing.T) []reduce.Point {
	t.Helper()
	f, err := os.Open(filepath.Join("..", "..", "testdata", "period", "data_methods60.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.Comment = '#'
	rows, err := r.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	var pts []reduce.Point
	for _, row := range rows[1:] { // after the header
		tt, err1 := strconv.ParseFloat(row[0], 64)
		m, err2 := strconv.ParseFloat(row[1], 64)
		if err1 != nil || err2 != nil {
			t.Fatalf("data_methods60.csv: row %v", row)
		}
		pts = append(pts, reduce.Point{T: tt, Mag: m, Err: math.NaN()})
	}
	return pts
}

// methods60Search runs the period search of methods.md §12: 0.05 to 5 c/d
// in steps of 0.0005.
func methods60Search(t *testing.T, method string) reduce.PeriodResult {
	t.Helper()
	r, err := reduce.Periodogram(context.Background(), methods60(t), reduce.PeriodSearch{
		Method: method, MinPeriod: 0.2, MaxPeriod: 20, NFreq: 9901})
	if err != nil {
		t.Fatal(err)
	}
	return r
}

var berlin = func() *time.Location {
	loc, err := time.LoadLocation("Europe/Berlin")
	if err != nil {
		panic(err)
	}
	return loc
}()

// drawer is a chart ready to draw: a *plot.Plot or Panels.
type drawer interface{ Draw(draw.Canvas) }

// demoChart builds one demo chart in a palette.
type demoChart struct {
	name string
	make func(Palette) (drawer, error)
}

// demoCharts returns the demo of every measurement chart.
func demoCharts(t *testing.T) []demoChart {
	t.Helper()
	target, check, comp := eclipseNight()
	sel := TimeRange{From: 2461010.395, To: 2461010.470}
	tm := eclipseTiming(t, target, sel)
	night := LightCurveData{
		Title: "Cedar Ecl (invented) — primary minimum, V", Clock: berlin, MagLabel: "V (mag)",
		Series: []Series{{Name: "Cedar Ecl", Points: target}, {Name: "check", Points: check, OffsetMag: 1.30},
			{Name: "comparison, instrumental", Points: comp, OffsetMag: 15.50}},
		Selection: &sel, Timing: &tm,
	}
	season := ebSeason()
	bins, err := reduce.BinInTime(season[:400], 0.02, 2461000)
	if err != nil {
		t.Fatal(err)
	}
	multi := LightCurveData{Title: "Cedar Ecl (invented) — ten nights", Scale: demoEB.Scale, MagLabel: "V (mag)",
		Series: []Series{{Name: "Cedar Ecl", Points: season[:400]}}, Binned: bins}
	folded, err := reduce.PhaseFold(season, demoEB)
	if err != nil {
		t.Fatal(err)
	}
	pbins, err := reduce.BinInPhase(folded, 50)
	if err != nil {
		t.Fatal(err)
	}
	phase := PhaseData{Title: "Cedar Ecl (invented) — 40 nights folded", Points: folded, Binned: pbins,
		Ephemeris: &demoEB, Name: "Cedar Ecl, V", MagLabel: "V (mag)"}
	a, pub := demoOC(t)
	oc := OCData{Title: "Larch Ecl (invented) — O−C, primary and secondary minima", Analysis: a, Published: pub}
	lta, lt := demoLightTime(t)
	ltd := OCData{Title: "Yew Ecl (invented) — O−C with a third body", Analysis: lta, LightTime: lt, Residuals: FitLightTime}
	ls, pdm := methods60Search(t, reduce.MethodLS), methods60Search(t, reduce.MethodPDM)
	plot := func(f func(Palette) (drawer, error)) func(Palette) (drawer, error) { return f }
	return []demoChart{
		{"lightcurve_night", plot(func(p Palette) (drawer, error) { return LightCurve(night, p) })},
		{"lightcurve_season", plot(func(p Palette) (drawer, error) { return LightCurve(multi, p) })},
		{"phase", plot(func(p Palette) (drawer, error) { return PhaseCurve(phase, p) })},
		{"oc", plot(func(p Palette) (drawer, error) { return OCDiagram(oc, p) })},
		{"oc_residuals", plot(func(p Palette) (drawer, error) { return OCWithResiduals(oc, p) })},
		{"oc_lighttime", plot(func(p Palette) (drawer, error) { return OCWithResiduals(ltd, p) })},
		{"periodogram_ls", plot(func(p Palette) (drawer, error) {
			return Periodogram(PeriodogramData{Title: "methods.md §12 series", Result: ls, PeriodAxis: true}, p)
		})},
		{"periodogram_pdm", plot(func(p Palette) (drawer, error) {
			return Periodogram(PeriodogramData{Title: "methods.md §12 series — PDM", Result: pdm, PeriodAxis: true}, p)
		})},
	}
}

// render draws a chart into an image w by h on background bg (as
// SavePanels does; the image's last column and row are only partly covered
// by the chart when w and h are not whole pixels).
func render(d drawer, bg color.Color, w, h vg.Length) image.Image {
	c := vgimg.NewWith(vgimg.UseWH(w, h), vgimg.UseBackgroundColor(bg))
	d.Draw(draw.New(c))
	return c.Image()
}

// TestWriteDemoMeasurementCharts writes every demo chart in the light,
// dark and night-red palettes to -outdir (skipped without it), to be
// looked at.
func TestWriteDemoMeasurementCharts(t *testing.T) {
	if *outDir == "" {
		t.Skip("no -outdir")
	}
	for _, dc := range demoCharts(t) {
		for _, pc := range []struct {
			suffix string
			pal    Palette
		}{{"", DefaultPalette()}, {"_dark", DarkPalette()}, {"_red", NightRedPalette()}} {
			d, err := dc.make(pc.pal)
			if err != nil {
				t.Fatalf("%s: %v", dc.name, err)
			}
			img := render(d, pc.pal.Background, 26*vg.Centimeter, 15*vg.Centimeter)
			path := filepath.Join(*outDir, dc.name+pc.suffix+".png")
			f, err := os.Create(path)
			if err != nil {
				t.Fatal(err)
			}
			if err := png.Encode(f, img); err != nil {
				t.Fatal(err)
			}
			f.Close()
			if pc.suffix == "" {
				if err := greyCopy(path, strings.TrimSuffix(path, ".png")+"_grey.png"); err != nil {
					t.Fatal(err)
				}
			}
		}
	}
}
