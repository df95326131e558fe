package app

import (
	"image/color"
	"reflect"
	"testing"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/theme"

	"example.org/vigil/app/chart"
)

// nightMaxRed is the brightest red the night theme may show (of 255): the
// rule of chart.NightRedPalette, kept by the whole window.
const nightMaxRed = 200

// allColorNames are every colour name of Fyne's theme (fyne.io/fyne/v2/theme,
// v2.7.1), and one that no theme knows.
var allColorNames = []fyne.ThemeColorName{
	theme.ColorNameBackground, theme.ColorNameButton, theme.ColorNameDisabledButton, theme.ColorNameDisabled,
	theme.ColorNameError, theme.ColorNameFocus, theme.ColorNameForeground, theme.ColorNameForegroundOnError,
	theme.ColorNameForegroundOnPrimary, theme.ColorNameForegroundOnSuccess, theme.ColorNameForegroundOnWarning,
	theme.ColorNameHeaderBackground, theme.ColorNameHover, theme.ColorNameHyperlink, theme.ColorNameInputBackground,
	theme.ColorNameInputBorder, theme.ColorNameMenuBackground, theme.ColorNameOverlayBackground,
	theme.ColorNamePlaceHolder, theme.ColorNamePressed, theme.ColorNamePrimary, theme.ColorNameScrollBar,
	theme.ColorNameScrollBarBackground, theme.ColorNameSelection, theme.ColorNameSeparator, theme.ColorNameShadow,
	theme.ColorNameSuccess, theme.ColorNameWarning,
	"a colour a later Fyne may add",
}

// nightSafe reports whether c, as it lights a black screen (premultiplied),
// has no green or blue and red of at most nightMaxRed.
func nightSafe(c color.Color) bool {
	r, g, b, a := c.RGBA()
	return a == 0 || (g == 0 && b == 0 && r <= nightMaxRed*0x101)
}

func TestNightThemeIsDeepRed(t *testing.T) {
	th := NewTheme(ThemeNightRed)
	for _, n := range allColorNames {
		for _, v := range []fyne.ThemeVariant{theme.VariantLight, theme.VariantDark} {
			if c := th.Color(n, v); !nightSafe(c) {
				t.Errorf("night red colour %q (variant %d) = %#v: want G = B = 0 and R ≤ %d, or transparent", n, v, c, nightMaxRed)
			}
		}
	}
	if got := th.Color(theme.ColorNameBackground, theme.VariantLight); got != color.Black {
		t.Errorf("night red background = %#v, want black", got)
	}
	sh := ShadesOf(ThemeNightRed)
	for i, c := range append(sh.Sky[:], sh.Moon, sh.Edge, sh.Whole, sh.Partly, sh.NotCaught) {
		if !nightSafe(c) {
			t.Errorf("night red shade %d = %#v: not deep red", i, c)
		}
	}
}

// Every theme covers every name with a colour of its own (no nil), and the
// light and dark themes are Fyne's variants whatever the desktop prefers.
func TestThemesForceTheirVariant(t *testing.T) {
	cases := []struct {
		choice  ThemeChoice
		variant fyne.ThemeVariant
	}{{ThemeLight, theme.VariantLight}, {ThemeDark, theme.VariantDark}}
	for _, tc := range cases {
		th := NewTheme(tc.choice)
		for _, n := range allColorNames[:len(allColorNames)-1] {
			want := theme.DefaultTheme().Color(n, tc.variant)
			for _, asked := range []fyne.ThemeVariant{theme.VariantLight, theme.VariantDark} {
				if got := th.Color(n, asked); got != want {
					t.Errorf("%v theme, %q asked as variant %d: got %#v, want the default theme's %#v", tc.choice, n, asked, got, want)
				}
			}
		}
	}
}

func TestPaletteMatchesTheme(t *testing.T) {
	cases := []struct {
		choice ThemeChoice
		want   chart.Palette
	}{
		{ThemeLight, chart.DefaultPalette()},
		{ThemeDark, chart.DarkPalette()},
		{ThemeNightRed, chart.NightRedPalette()},
	}
	for _, tc := range cases {
		if got := Palette(tc.choice); !reflect.DeepEqual(got, tc.want) {
			t.Errorf("Palette(%v) is not the chart package's palette for it", tc.choice)
		}
	}
	// The night charts obey the window's rule too.
	p := chart.NightRedPalette()
	for i, c := range append([]color.Color{p.Background, p.Foreground, p.Grid, p.KeyBackground, p.Day, p.Civil,
		p.Nautical, p.Astronomical, p.Night, p.Moon, p.MinAlt, p.Window}, p.Stars...) {
		if !nightSafe(c) {
			t.Errorf("night red chart colour %d = %#v is not deep red", i, c)
		}
	}
}
