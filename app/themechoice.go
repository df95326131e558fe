package app

import (
	"fmt"
	"strings"
)

// ThemeChoice is one of the window's three looks.
type ThemeChoice int

// The themes, in the order the theme selector lists them.
const (
	ThemeLight ThemeChoice = iota
	ThemeDark
	ThemeNightRed
)

// Themes lists every theme choice in the selector's order.
var Themes = []ThemeChoice{ThemeLight, ThemeDark, ThemeNightRed}

// String returns the theme's name as the selector shows it.
func (t ThemeChoice) String() string {
	switch t {
	case ThemeDark:
		return "Dark"
	case ThemeNightRed:
		return "Night red"
	}
	return "Light"
}

// Slug returns the theme's name for file names: light, dark, night-red.
func (t ThemeChoice) Slug() string {
	return strings.ReplaceAll(strings.ToLower(t.String()), " ", "-")
}

// ParseTheme reads a theme name: light, dark, night-red (also "night red",
// "red", "night"), in any case.
func ParseTheme(s string) (ThemeChoice, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "light", "":
		return ThemeLight, nil
	case "dark":
		return ThemeDark, nil
	case "night-red", "night red", "red", "night":
		return ThemeNightRed, nil
	}
	return ThemeLight, fmt.Errorf("theme %q: want light, dark or night-red", s)
}
