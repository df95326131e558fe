package ephem

import (
	"fmt"
	"math"
)

// FormatRA writes a right ascension in hours as "hh:mm:ss.ss".
func FormatRA(hours float64) string {
	h := math.Mod(hours, 24)
	if h < 0 {
		h += 24
	}
	a, b, c := splitSexagesimal(h, 2)
	if a == 24 {
		a = 0
	}
	return fmt.Sprintf("%02d:%02d:%05.2f", a, b, c)
}

// FormatDec writes an angle in degrees as "±dd:mm:ss.s" (declination,
// latitude).
func FormatDec(deg float64) string {
	sign := "+"
	if deg < 0 || (deg == 0 && math.Signbit(deg)) {
		sign = "-"
	}
	a, b, c := splitSexagesimal(math.Abs(deg), 1)
	return fmt.Sprintf("%s%02d:%02d:%04.1f", sign, a, b, c)
}

// FormatDuration writes a span in days as "h:mm" (or "h:mm:ss" with seconds).
func FormatDuration(days float64, seconds bool) string {
	sign := ""
	if days < 0 {
		sign = "-"
		days = -days
	}
	if seconds {
		s := int64(math.Round(days * secPerDay))
		return fmt.Sprintf("%s%d:%02d:%02d", sign, s/3600, s/60%60, s%60)
	}
	m := int64(math.Round(days * 1440))
	return fmt.Sprintf("%s%d:%02d", sign, m/60, m%60)
}

// splitSexagesimal splits a non-negative value into whole units, minutes and
// seconds rounded to prec decimals, carrying a rounded 60 upwards.
func splitSexagesimal(v float64, prec int) (int, int, float64) {
	scale := math.Pow(10, float64(prec))
	total := math.Round(v*3600*scale) / scale // seconds, rounded
	a := int(total / 3600)
	rem := total - float64(a)*3600
	b := int(rem / 60)
	c := rem - float64(b)*60
	if c < 0 {
		c = 0
	}
	return a, b, c
}
