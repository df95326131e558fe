package app

import (
	"image/color"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"example.org/vigil/app/chart"
)

// appTheme is one of the window's looks over Fyne's default theme: the
// light or the dark variant forced whatever the desktop prefers, or night
// red, which changes only the colours (nightColor).
type appTheme struct{ choice ThemeChoice }

// NewTheme returns the Fyne theme of a theme choice.
func NewTheme(c ThemeChoice) fyne.Theme { return appTheme{choice: c} }

// Color returns the colour called n; the variant the desktop asks for is
// ignored, since the user chose the look.
func (t appTheme) Color(n fyne.ThemeColorName, _ fyne.ThemeVariant) color.Color {
	switch t.choice {
	case ThemeDark:
		return theme.DefaultTheme().Color(n, theme.VariantDark)
	case ThemeNightRed:
		return nightColor(n)
	}
	return theme.DefaultTheme().Color(n, theme.VariantLight)
}

// Font returns the default theme's font.
func (appTheme) Font(s fyne.TextStyle) fyne.Resource { return theme.DefaultTheme().Font(s) }

// Icon returns the default theme's icon (drawn in the theme's colours).
func (appTheme) Icon(n fyne.ThemeIconName) fyne.Resource { return theme.DefaultTheme().Icon(n) }

// Size returns the default theme's size.
func (appTheme) Size(n fyne.ThemeSizeName) float32 { return theme.DefaultTheme().Size(n) }

// quietTheme is the window's theme with the colour of disabled text
// replaced by that of secondary text (the placeholder's). Fyne draws a
// low-importance label in the disabled colour, which all but vanishes
// (#e3e3e3 on white in the light theme, #39393a on #171717 in the dark):
// a quiet note must still be read.
type quietTheme struct{}

func (quietTheme) base() fyne.Theme { return fyne.CurrentApp().Settings().Theme() }

// Color returns the current theme's colour n, the placeholder's for the
// disabled colour.
func (q quietTheme) Color(n fyne.ThemeColorName, v fyne.ThemeVariant) color.Color {
	if n == theme.ColorNameDisabled {
		n = theme.ColorNamePlaceHolder
	}
	return q.base().Color(n, v)
}

func (q quietTheme) Font(s fyne.TextStyle) fyne.Resource     { return q.base().Font(s) }
func (q quietTheme) Icon(n fyne.ThemeIconName) fyne.Resource { return q.base().Icon(n) }
func (q quietTheme) Size(n fyne.ThemeSizeName) float32       { return q.base().Size(n) }

// quiet makes l a quiet note (low importance, drawn in the colour of
// secondary text) and returns what to put in the layout in its place.
// Hide the returned object with the label, or it keeps a padding.
func quiet(l *widget.Label) *container.ThemeOverride {
	l.Importance = widget.LowImportance
	return container.NewThemeOverride(l, quietTheme{})
}

// red returns an opaque red of value v; redA a translucent one (not
// premultiplied).
func red(v uint8) color.Color     { return color.NRGBA{R: v, A: 255} }
func redA(v, a uint8) color.Color { return color.NRGBA{R: v, A: a} }

// nightColors are the night-red theme's colours: deep reds on black,
// nothing in green or blue and red at most 200 of 255, so that the screen
// does not spoil dark adaptation (common practice: dim red light at the
// telescope). Every colour of Fyne's theme is here; nightColor gives any
// other name the foreground's red.
var nightColors = map[fyne.ThemeColorName]color.Color{
	theme.ColorNameBackground:          color.Black,
	theme.ColorNameForeground:          red(185),
	theme.ColorNameButton:              red(38),
	theme.ColorNameDisabledButton:      red(20),
	theme.ColorNameDisabled:            red(105),
	theme.ColorNameError:               red(200),
	theme.ColorNameFocus:               redA(200, 110),
	theme.ColorNameForegroundOnError:   color.Black,
	theme.ColorNameForegroundOnPrimary: color.Black,
	theme.ColorNameForegroundOnSuccess: color.Black,
	theme.ColorNameForegroundOnWarning: color.Black,
	theme.ColorNameHeaderBackground:    red(24),
	theme.ColorNameHover:               redA(200, 30),
	theme.ColorNameHyperlink:           red(200),
	theme.ColorNameInputBackground:     red(16),
	theme.ColorNameInputBorder:         red(60),
	theme.ColorNameMenuBackground:      red(14),
	theme.ColorNameOverlayBackground:   red(10),
	theme.ColorNamePlaceHolder:         red(130),
	theme.ColorNamePressed:             redA(200, 60),
	theme.ColorNamePrimary:             red(150),
	theme.ColorNameScrollBar:           redA(150, 160),
	theme.ColorNameScrollBarBackground: redA(60, 90),
	theme.ColorNameSelection:           redA(200, 70),
	theme.ColorNameSeparator:           red(40),
	theme.ColorNameShadow:              color.NRGBA{A: 180},
	theme.ColorNameSuccess:             red(160),
	theme.ColorNameWarning:             red(190),
}

// nightColor returns the night-red colour called n.
func nightColor(n fyne.ThemeColorName) color.Color {
	if c, ok := nightColors[n]; ok {
		return c
	}
	return nightColors[theme.ColorNameForeground]
}

// Palette returns the chart palette that goes with a theme choice:
// chart.DefaultPalette, chart.DarkPalette or chart.NightRedPalette.
func Palette(c ThemeChoice) chart.Palette {
	switch c {
	case ThemeDark:
		return chart.DarkPalette()
	case ThemeNightRed:
		return chart.NightRedPalette()
	}
	return chart.DefaultPalette()
}

// Shades are the window's own drawing colours beyond Fyne's: the twilight
// strip's sky from day to night (indexed by SkyLevel), the Moon's bar and
// the catch marks of the star list.
type Shades struct {
	Sky                      [5]color.Color
	Moon, Edge               color.Color
	Whole, Partly, NotCaught color.Color
}

// ShadesOf returns the drawing colours of a theme choice. In night red they
// come from chart.NightRedPalette, so that the strip and the charts agree.
func ShadesOf(c ThemeChoice) Shades {
	rgb := func(r, g, b uint8) color.Color { return color.NRGBA{R: r, G: g, B: b, A: 255} }
	switch c {
	case ThemeDark:
		return Shades{
			Sky:  [5]color.Color{rgb(120, 160, 200), rgb(70, 105, 150), rgb(45, 70, 110), rgb(30, 45, 75), rgb(16, 22, 40)},
			Moon: rgb(225, 205, 140), Edge: rgb(90, 95, 110),
			Whole: rgb(0, 158, 115), Partly: rgb(230, 159, 0), NotCaught: rgb(120, 120, 120),
		}
	case ThemeNightRed:
		p := chart.NightRedPalette()
		return Shades{
			Sky:  [5]color.Color{p.Day, p.Civil, p.Nautical, p.Astronomical, p.Night},
			Moon: p.Moon, Edge: red(60),
			Whole: red(190), Partly: red(130), NotCaught: red(70),
		}
	}
	return Shades{
		Sky:  [5]color.Color{rgb(170, 205, 235), rgb(110, 150, 205), rgb(60, 95, 160), rgb(35, 55, 110), rgb(18, 28, 60)},
		Moon: rgb(200, 160, 40), Edge: rgb(150, 160, 175),
		Whole: rgb(0, 130, 95), Partly: rgb(200, 120, 0), NotCaught: rgb(150, 150, 150),
	}
}
