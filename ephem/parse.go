package ephem

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"
)

// ParseInstant reads an instant as the command line and the window accept it:
//
//   - ISO 8601 in UTC or with an offset: "2026-12-01T03:00:00Z",
//     "2026-12-01T03:00:00.250Z", "2026-12-01T04:00:00+01:00",
//     "2026-12-01T03:00Z", "2026-12-01 03:00:00" (no zone means UTC),
//     "2026-12-01" (0h UTC);
//   - a Julian date on the UTC scale with a "JD" prefix: "JD2461375.625";
//   - a modified Julian date with an "MJD" prefix: "MJD61375.125".
//
// The error quotes the text and says what was expected.
func ParseInstant(s string) (Time, error) {
	in := strings.TrimSpace(s)
	if in == "" {
		return Time{}, fmt.Errorf("ephem: instant is empty: want ISO 8601 UTC (2026-12-01T03:00:00Z) or JD2461375.625")
	}
	up := strings.ToUpper(in)
	for _, p := range []struct {
		prefix string
		offset float64
	}{{"MJD", 2400000.5}, {"JD", 0}} {
		if strings.HasPrefix(up, p.prefix) {
			num := strings.TrimSpace(in[len(p.prefix):])
			v, err := strconv.ParseFloat(num, 64)
			if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
				return Time{}, fmt.Errorf("ephem: instant %q: %q after %s is not a number", s, num, p.prefix)
			}
			t, err := FromJDUTC(v + p.offset)
			if err != nil {
				return Time{}, fmt.Errorf("ephem: instant %q: Julian date %.6f is %w", s, v+p.offset, ErrOutOfRange)
			}
			return t, nil
		}
	}
	layouts := []string{
		time.RFC3339Nano,
		"2006-01-02T15:04Z07:00",
		"2006-01-02T15:04:05.999999999",
		"2006-01-02T15:04:05",
		"2006-01-02T15:04",
		"2006-01-02 15:04:05.999999999Z07:00",
		"2006-01-02 15:04:05.999999999",
		"2006-01-02 15:04Z07:00",
		"2006-01-02 15:04",
		"2006-01-02",
	}
	var firstErr error
	for _, l := range layouts {
		tt, err := time.Parse(l, in)
		if err == nil {
			t, err := FromTime(tt)
			if err != nil {
				return Time{}, fmt.Errorf("ephem: instant %q is %w", s, ErrOutOfRange)
			}
			return t, nil
		}
		if firstErr == nil {
			firstErr = err
		}
	}
	if strings.Contains(in, ":60") {
		return Time{}, fmt.Errorf("ephem: instant %q: a leap second (:60) cannot be given; use the instant just before or after it", s)
	}
	return Time{}, fmt.Errorf("ephem: instant %q: want ISO 8601 UTC such as 2026-12-01T03:00:00Z, or a Julian date such as JD2461375.625", s)
}

// ParseDate reads a calendar date "YYYY-MM-DD" inside the supported range.
func ParseDate(s string) (time.Time, error) {
	d, err := time.Parse("2006-01-02", strings.TrimSpace(s))
	if err != nil {
		var y, m, dd int
		if n, _ := fmt.Sscanf(strings.TrimSpace(s), "%4d-%2d-%2d", &y, &m, &dd); n == 3 && len(strings.TrimSpace(s)) == 10 {
			return time.Time{}, fmt.Errorf("ephem: date %q: no such day in the calendar", s)
		}
		return time.Time{}, fmt.Errorf("ephem: date %q: want YYYY-MM-DD, e.g. 2026-12-01", s)
	}
	if _, err := FromTime(d); err != nil {
		return time.Time{}, fmt.Errorf("ephem: date %q is %w", s, ErrOutOfRange)
	}
	// The night of the last supported date runs into the next day.
	if _, err := FromTime(d.AddDate(0, 0, 2)); err != nil {
		return time.Time{}, fmt.Errorf("ephem: date %q is %w", s, ErrOutOfRange)
	}
	return d, nil
}

// ParseRA reads a right ascension in hours, decimal ("5.5") or sexagesimal
// ("05:30:00.0", "5 30 0", "5h30m00s"), and returns hours in [0, 24).
func ParseRA(s string) (float64, error) {
	v, neg, err := parseSexagesimal(s, "hms")
	if err != nil {
		return 0, fmt.Errorf("ephem: right ascension %q: %v", s, err)
	}
	if neg || v < 0 || v >= 24 {
		return 0, fmt.Errorf("ephem: right ascension %q: hours must be in [0, 24)", s)
	}
	return v, nil
}

// ParseDec reads a declination in degrees, decimal ("-5.39") or sexagesimal
// ("-05:23:28", "-5 23 28", "-5d23m28s", "-5°23′28″"), in [-90, 90].
func ParseDec(s string) (float64, error) {
	v, _, err := parseSexagesimal(s, "dms")
	if err != nil {
		return 0, fmt.Errorf("ephem: declination %q: %v", s, err)
	}
	if v < -90 || v > 90 {
		return 0, fmt.Errorf("ephem: declination %q: degrees must be in [-90, 90]", s)
	}
	return v, nil
}

// ParseLatitude reads a latitude in degrees (north positive), decimal or
// sexagesimal, in [-90, 90].
func ParseLatitude(s string) (float64, error) {
	v, _, err := parseSexagesimal(s, "dms")
	if err != nil {
		return 0, fmt.Errorf("ephem: latitude %q: %v", s, err)
	}
	if v < -90 || v > 90 {
		return 0, fmt.Errorf("ephem: latitude %q: degrees must be in [-90, 90] (north positive)", s)
	}
	return v, nil
}

// ParseLongitude reads a longitude in degrees, EAST positive, decimal or
// sexagesimal, in [-180, 360); it returns the value normalised to (-180, 180].
func ParseLongitude(s string) (float64, error) {
	v, _, err := parseSexagesimal(s, "dms")
	if err != nil {
		return 0, fmt.Errorf("ephem: longitude %q: %v", s, err)
	}
	if v < -180 || v >= 360 {
		return 0, fmt.Errorf("ephem: longitude %q: degrees must be in [-180, 360), east positive", s)
	}
	return normLonDeg(v), nil
}

func normLonDeg(v float64) float64 {
	if v > 180 {
		v -= 360
	}
	if v == -180 {
		v = 180
	}
	return v
}

// parseSexagesimal reads "[sign]A[sep]B[sep]C" or a decimal number. Separators
// are ':' or blanks, or unit letters: "hms" for hours (h m s) and "dms" for
// degrees (d ° m ′ ' s ″ "). B and C must be in [0, 60); the fraction is only
// allowed on the last field. neg reports a leading minus sign, which matters
// for "-00:30".
func parseSexagesimal(s, kind string) (v float64, neg bool, err error) {
	in := strings.TrimSpace(s)
	if in == "" {
		return 0, false, fmt.Errorf("empty value")
	}
	switch in[0] {
	case '-':
		neg = true
		in = in[1:]
	case '+':
		in = in[1:]
	default:
		if strings.HasPrefix(in, "−") { // U+2212 minus sign
			neg = true
			in = in[len("−"):]
		}
	}
	in = strings.TrimSpace(in)
	if in == "" || in[0] == '-' || in[0] == '+' {
		return 0, false, fmt.Errorf("misplaced sign")
	}
	// Turn unit marks into blanks, remembering if any appeared.
	repl := strings.NewReplacer(":", " ", "h", " ", "H", " ", "d", " ", "D", " ", "°", " ",
		"m", " ", "M", " ", "′", " ", "'", " ", "s", " ", "S", " ", "″", " ", "\"", " ")
	if kind == "hms" {
		repl = strings.NewReplacer(":", " ", "h", " ", "H", " ", "m", " ", "M", " ", "s", " ", "S", " ")
	}
	fields := strings.Fields(repl.Replace(in))
	if len(fields) == 0 || len(fields) > 3 {
		return 0, false, fmt.Errorf("want a number or up to three fields like 05:30:00.0")
	}
	parts := make([]float64, len(fields))
	for i, f := range fields {
		if strings.ContainsAny(f, "+-eEnNiI_xXpP") {
			return 0, false, fmt.Errorf("field %q is not a plain number", f)
		}
		p, err := strconv.ParseFloat(f, 64)
		if err != nil || math.IsNaN(p) || math.IsInf(p, 0) {
			return 0, false, fmt.Errorf("field %q is not a number", f)
		}
		if i < len(fields)-1 && strings.Contains(f, ".") {
			return 0, false, fmt.Errorf("only the last field may have a fraction, not %q", f)
		}
		if i > 0 && p >= 60 {
			return 0, false, fmt.Errorf("minutes and seconds must be below 60, not %q", f)
		}
		parts[i] = p
	}
	v = parts[0]
	if len(parts) > 1 {
		v += parts[1] / 60
	}
	if len(parts) > 2 {
		v += parts[2] / 3600
	}
	if neg {
		v = -v
	}
	return v, neg, nil
}
