package chart

import (
	"image/color"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Palette holds every colour a chart uses, so that a theme (the night-red
// one, say) swaps them in one place.
type Palette struct {
	Background, Foreground, Grid color.Color
	KeyBackground                color.Color // behind the key
	// The sky behind the curves, from light to dark: daylight, civil,
	// nautical and astronomical twilight, and night. Each must be darker
	// than the one before, so that darker reads as a darker sky.
	Day, Civil, Nautical, Astronomical, Night color.Color
	Moon                                      color.Color
	MinAlt                                    color.Color // the site's lowest useful altitude
	Window                                    color.Color // its alpha is the translucency of window marks
	Stars                                     []color.Color

	// The charts of measurements (light curve, phase curve, O−C diagram,
	// periodogram) draw their series of points in the Stars colours, in
	// turn, and use these. A nil field falls back to a shade of
	// Foreground (see theme.go), so a palette made before they existed
	// still draws every chart.
	Fits      []color.Color // fitted curves in turn: the extremum fit; O−C quadratic, linear, light-time
	Selection color.Color   // translucent fill of a time range picked for a fit
	Sigma     color.Color   // translucent fill of the ±σ band about a fitted time
	Shade     color.Color   // faint fill of a repeated region (phases outside 0–1)
	Faint     color.Color   // a secondary curve behind the data (the spectral window)
	Flag      color.Color   // marks on doubtful points (an ambiguous cycle count)
}

// DefaultPalette is for daytime screens and print: a light background, the
// sky as a ramp of neutral greys (which print as they show), and distinct,
// colour-blind-safe line colours (Okabe & Ito 2008, "Color Universal
// Design"), each star also with its own dash pattern (starDashes) for
// greyscale print.
func DefaultPalette() Palette {
	grey := func(v uint8) color.Color { return color.Gray{Y: v} }
	return Palette{
		Background: color.White, Foreground: color.Black,
		Grid:          color.NRGBA{A: 40}, // darkens every shade alike
		KeyBackground: color.White,
		Day:           grey(255), Civil: grey(243), Nautical: grey(232), Astronomical: grey(221), Night: grey(210),
		Moon:   color.RGBA{R: 80, G: 80, B: 80, A: 255},
		MinAlt: color.RGBA{R: 170, G: 30, B: 30, A: 255},
		Window: color.NRGBA{A: 80},
		// The darker colours first: most charts show a few stars.
		Stars: []color.Color{
			color.RGBA{R: 0, G: 114, B: 178, A: 255},   // blue
			color.RGBA{R: 213, G: 94, B: 0, A: 255},    // vermilion
			color.RGBA{R: 0, G: 158, B: 115, A: 255},   // bluish green
			color.RGBA{R: 204, G: 121, B: 167, A: 255}, // reddish purple
			color.RGBA{A: 255},                         // black
			color.RGBA{R: 230, G: 159, B: 0, A: 255},   // orange
			color.RGBA{R: 86, G: 180, B: 233, A: 255},  // sky blue
		},
		Fits: []color.Color{
			color.RGBA{A: 255},                         // black
			color.RGBA{R: 204, G: 121, B: 167, A: 255}, // reddish purple
			color.RGBA{R: 0, G: 158, B: 115, A: 255},   // bluish green
		},
		Selection: color.NRGBA{R: 230, G: 159, B: 0, A: 60}, // orange, a light grey in print
		Sigma:     color.NRGBA{A: 38},
		Shade:     color.NRGBA{A: 14},
		Faint:     color.Gray{Y: 150},
		Flag:      color.RGBA{R: 170, G: 30, B: 30, A: 255},
	}
}

// NightRedPalette keeps dark adaptation at the telescope: deep reds on
// black, nothing bright (no channel but red, and red at most 200 of 255).
// The sky darkens from a deep red by day to black at night; the stars differ
// by shade and, above all, by dash pattern.
//
// Every colour, the translucent ones too, has red at most 200 before it is
// blended: blending over what is drawn below is a weighted mean (Porter &
// Duff 1984, "source over"), so no overlap can then exceed 200 (a mark of
// red 255 at alpha 90 over a red-200 curve made 219). The translucent
// marks' alpha is raised to match, so that over black they show as before
// (red 200 at alpha a·255/200 gives the red of 255 at alpha a).
func NightRedPalette() Palette {
	red := func(v uint8) color.Color { return color.RGBA{R: v, A: 255} }
	return Palette{
		Background: color.Black, Foreground: red(185), Grid: redMark(28),
		KeyBackground: color.Black,
		Day:           red(58), Civil: red(42), Nautical: red(28), Astronomical: red(15), Night: color.Black,
		Moon: red(120), MinAlt: red(140), Window: redMark(90),
		Stars:     []color.Color{red(200), red(150), red(185), red(135), red(170), red(160), red(140)},
		Fits:      []color.Color{red(190), red(150), red(140)},
		Selection: redMark(45), Sigma: redMark(50), Shade: redMark(16),
		Faint: red(85), Flag: red(200),
	}
}

// nightMaxRed is the brightest red NightRedPalette draws (of 255).
const nightMaxRed = 200

// redMark returns the translucent night-red mark that shows over black as
// red v: red nightMaxRed at alpha v·255/nightMaxRed (v ≤ nightMaxRed).
func redMark(v uint8) color.Color {
	return color.NRGBA{R: nightMaxRed, A: uint8((int(v)*255 + nightMaxRed/2) / nightMaxRed)}
}

// star returns the colour of the i-th star.
func (p Palette) star(i int) color.Color { return p.Stars[i%len(p.Stars)] }

// sky returns the shade of level i: 0 day, 1 civil, 2 nautical,
// 3 astronomical twilight, 4 night.
func (p Palette) sky(i int) color.Color {
	return [...]color.Color{p.Day, p.Civil, p.Nautical, p.Astronomical, p.Night}[i]
}

// starDashes are the dash patterns (points, on and off) of the stars'
// curves, in turn: solid, long dashes, dash-dot, short dashes, dots,
// dash-dot-dot. With the seven colours of DefaultPalette they tell 42
// stars in a row apart; in greyscale or night red the patterns alone tell
// six.
var starDashes = [][]float64{nil, {7, 3}, {7, 2.5, 1.5, 2.5}, {3, 2.5}, {1.2, 2}, {7, 2, 1.2, 2, 1.2, 2}}

// starLine returns the line style of the i-th star: its colour, and a dash
// pattern that changes with i alongside the colour (i mod len(starDashes)),
// so that neighbours in the list differ in both.
func (p Palette) starLine(i int) draw.LineStyle {
	d := starDashes[i%len(starDashes)]
	sty := draw.LineStyle{Color: p.star(i), Width: vg.Points(2)}
	for _, v := range d {
		sty.Dashes = append(sty.Dashes, vg.Points(v))
	}
	return sty
}
