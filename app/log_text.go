package app

import (
	"image/color"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"
)

// logNightWords names the night of date in running text: "night of Tue 1
// – Wed 2 Dec 2026".
func logNightWords(date time.Time) string {
	t := nightTitle(date)
	return "n" + t[1:]
}

// logCautionStyle marks the lines of the text preview that carry the Sun
// caution: bold, in the theme's error colour (read when drawn, so it
// follows the theme).
type logCautionStyle struct{}

func (logCautionStyle) Style() fyne.TextStyle        { return fyne.TextStyle{Bold: true, Monospace: true} }
func (logCautionStyle) TextColor() color.Color       { return theme.Color(theme.ColorNameError) }
func (logCautionStyle) BackgroundColor() color.Color { return color.Transparent }

// logSmallText is the current theme with a smaller text, so that more of
// the log's lines show whole in the preview.
type logSmallText struct{}

// logPreviewTextSize is the preview's text size (Fyne's default is 14).
const logPreviewTextSize = 12

func (logSmallText) current() fyne.Theme { return fyne.CurrentApp().Settings().Theme() }
func (t logSmallText) Color(n fyne.ThemeColorName, v fyne.ThemeVariant) color.Color {
	return t.current().Color(n, v)
}
func (t logSmallText) Font(s fyne.TextStyle) fyne.Resource     { return t.current().Font(s) }
func (t logSmallText) Icon(n fyne.ThemeIconName) fyne.Resource { return t.current().Icon(n) }
func (t logSmallText) Size(n fyne.ThemeSizeName) float32 {
	if n == theme.SizeNameText {
		return logPreviewTextSize
	}
	return t.current().Size(n)
}

// logNewGrid returns an empty text grid that scrolls both ways.
func logNewGrid() *widget.TextGrid {
	g := widget.NewTextGrid()
	g.Scroll = container.ScrollBoth
	return g
}
