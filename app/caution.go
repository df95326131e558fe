package app

import (
	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/widget"
)

// newSunCaution returns the label, hidden until a page shows it, that warns
// never to point an instrument at or near the Sun without a proper solar
// filter (observe.SolarWarningText): bold, in the theme's colour for
// danger, wrapped. The Tonight, Star and Log pages show it when an event of
// theirs has the Sun up and near the star.
func newSunCaution(text string) *widget.Label {
	l := widget.NewLabel(text)
	l.Importance = widget.DangerImportance
	l.TextStyle.Bold = true
	l.Wrapping = fyne.TextWrapWord
	l.Hide()
	return l
}
