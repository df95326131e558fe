package chart

import "image/color"

// Palette holds every colour a chart uses, so that a theme (the night-red
// one, say) swaps them in one place.
type Palette struct {
	Background, Foreground, Grid color.Color
	// The sky behind the curves: daylight, civil, nautical and astronomical
	// twilight, and night.
	Day, Civil, Nautical, Astronomical, Night color.Color
	Moon                                      color.Color
	MinAlt                                    color.Color // the site's lowest useful altitude
	Window                                    color.Color // its alpha is the coverage windows' translucency
	Stars                                     []color.Color
}

// DefaultPalette is for daytime screens and print: a light background and
// distinct, colour-blind-safe line colours (Okabe & Ito 2008, "Color
// Universal Design").
func DefaultPalette() Palette {
	return Palette{
		Background: color.White, Foreground: color.Black, Grid: color.Gray{Y: 215},
		Day:          color.RGBA{R: 255, G: 251, B: 232, A: 255},
		Civil:        color.RGBA{R: 234, G: 238, B: 247, A: 255},
		Nautical:     color.RGBA{R: 214, G: 221, B: 238, A: 255},
		Astronomical: color.RGBA{R: 194, G: 204, B: 229, A: 255},
		Night:        color.RGBA{R: 176, G: 188, B: 220, A: 255},
		Moon:         color.RGBA{R: 90, G: 90, B: 90, A: 255},
		MinAlt:       color.RGBA{R: 180, G: 30, B: 30, A: 255},
		Window:       color.NRGBA{R: 255, G: 255, B: 255, A: 38},
		Stars: []color.Color{
			color.RGBA{R: 230, G: 159, B: 0, A: 255},
			color.RGBA{R: 0, G: 114, B: 178, A: 255},
			color.RGBA{R: 0, G: 158, B: 115, A: 255},
			color.RGBA{R: 204, G: 121, B: 167, A: 255},
			color.RGBA{R: 213, G: 94, B: 0, A: 255},
			color.RGBA{R: 86, G: 180, B: 233, A: 255},
			color.RGBA{R: 120, G: 94, B: 240, A: 255},
			color.RGBA{R: 0, G: 0, B: 0, A: 255},
		},
	}
}

// NightRedPalette keeps dark adaptation at the telescope: dim reds on black.
func NightRedPalette() Palette {
	red := func(v uint8) color.Color { return color.RGBA{R: v, A: 255} }
	return Palette{
		Background: color.Black, Foreground: red(200), Grid: red(50),
		Day: red(70), Civil: red(50), Nautical: red(34), Astronomical: red(20), Night: color.Black,
		Moon: red(140), MinAlt: red(255), Window: color.NRGBA{R: 255, A: 50},
		Stars: []color.Color{red(255), red(200), red(160), red(230), red(180), red(140)},
	}
}

// star returns the colour of the i-th star.
func (p Palette) star(i int) color.Color { return p.Stars[i%len(p.Stars)] }
