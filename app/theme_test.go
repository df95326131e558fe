package app

import (
	"fmt"
	"image"
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

// straightDeepRed reports whether c, as drawn before blending (not
// premultiplied), has no green or blue and red of at most nightMaxRed.
// Blending is a weighted mean of the colours blended (Porter & Duff 1984,
// "source over"), so colours that all pass can only ever blend into
// pixels that pass: a translucent mark R 255 at alpha 90 passes
// nightSafe over black (R 90) yet lifts a red-200 curve under it to 219.
func straightDeepRed(c color.Color) bool {
	n := color.NRGBAModel.Convert(c).(color.NRGBA)
	return n.A == 0 || (n.G == 0 && n.B == 0 && n.R <= nightMaxRed)
}

// assertNightRed fails for every pixel of img (the window, captured) that
// is not deep red (nightSafe), leaving out those skip names (nil: none).
func assertNightRed(t testing.TB, what string, img image.Image, skip func(x, y int) bool) {
	t.Helper()
	b := img.Bounds()
	bad := 0
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			if skip != nil && skip(x, y) {
				continue
			}
			var r, g, bl, a uint32
			switch im := img.(type) {
			case *image.NRGBA:
				r, g, bl, a = im.NRGBAAt(x, y).RGBA()
			case *image.RGBA:
				r, g, bl, a = im.RGBAAt(x, y).RGBA()
			default:
				r, g, bl, a = im.At(x, y).RGBA()
			}
			if a == 0 || (g == 0 && bl == 0 && r <= nightMaxRed*0x101) {
				continue
			}
			if bad < 5 {
				t.Errorf("%s: pixel (%d, %d) = R %d G %d B %d (premultiplied) is not deep red (G = B = 0, R ≤ %d)",
					what, x, y, r>>8, g>>8, bl>>8, nightMaxRed)
			}
			bad++
		}
	}
	if bad > 0 {
		t.Errorf("%s: %d pixels of %d are not deep red", what, bad, b.Dx()*b.Dy())
	}
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
	// The night charts obey the window's rule too, every colour before it
	// is blended, translucent ones included: then no mark drawn over
	// another can make a pixel brighter.
	p := chart.NightRedPalette()
	named := map[string]color.Color{"Background": p.Background, "Foreground": p.Foreground, "Grid": p.Grid,
		"KeyBackground": p.KeyBackground, "Day": p.Day, "Civil": p.Civil, "Nautical": p.Nautical,
		"Astronomical": p.Astronomical, "Night": p.Night, "Moon": p.Moon, "MinAlt": p.MinAlt, "Window": p.Window,
		"Selection": p.Selection, "Sigma": p.Sigma, "Shade": p.Shade, "Faint": p.Faint, "Flag": p.Flag}
	for i, c := range p.Stars {
		named[fmt.Sprintf("Stars[%d]", i)] = c
	}
	for i, c := range p.Fits {
		named[fmt.Sprintf("Fits[%d]", i)] = c
	}
	for name, c := range named {
		if c == nil || !straightDeepRed(c) {
			t.Errorf("night red chart colour %s = %#v: want G = B = 0 and R ≤ %d before blending", name, c, nightMaxRed)
		}
	}
}
