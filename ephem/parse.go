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

// parseSexagesimal reads "[sign]A[sep]B[sep]C" or a decimal number. Fields
// are separated by ':' or blanks, or marked by unit letters that must come in
// order, each after its own field: "hms" kind takes h m s ("5h30m00s"), "dms"
// kind takes d or ° for degrees, m ′ ' for minutes and s ″ " for seconds; the
// last field may omit its mark ("5h30"). B and C must be in [0, 60); only the
// last field may have a fraction. neg reports a leading minus sign, which
// matters for "-00:30".
func parseSexagesimal(s, kind string) (v float64, neg bool, err error) {
	in := strings.TrimSpace(s)
	if in == "" {
		return 0, false, fmt.Errorf("empty value")
	}
	switch {
	case strings.HasPrefix(in, "-"):
		neg, in = true, in[1:]
	case strings.HasPrefix(in, "+"):
		in = in[1:]
	case strings.HasPrefix(in, "−"): // U+2212 minus sign
		neg, in = true, in[len("−"):]
	}
	in = strings.TrimSpace(in)
	if in == "" {
		return 0, false, fmt.Errorf("a sign without a number")
	}
	unitOf := func(r rune) int {
		if kind == "hms" {
			switch r {
			case 'h', 'H':
				return 0
			case 'm', 'M':
				return 1
			case 's', 'S':
				return 2
			}
			return -1
		}
		switch r {
		case 'd', 'D', '°':
			return 0
		case 'm', 'M', '′', '\'':
			return 1
		case 's', 'S', '″', '"':
			return 2
		}
		return -1
	}
	type field struct {
		text string
		unit int // 0, 1, 2, or -1 when unmarked
	}
	var fields []field
	var cur strings.Builder
	colon, marked := false, false
	flush := func(unit int) {
		fields = append(fields, field{text: cur.String(), unit: unit})
		cur.Reset()
	}
	for _, r := range in {
		switch {
		case r >= '0' && r <= '9' || r == '.':
			cur.WriteRune(r)
		case r == ':' || r == ' ' || r == '\t':
			if r == ':' {
				colon = true
				if cur.Len() == 0 {
					return 0, false, fmt.Errorf("empty field before ':'")
				}
			}
			if cur.Len() > 0 {
				flush(-1)
			}
		case unitOf(r) >= 0:
			if cur.Len() == 0 {
				return 0, false, fmt.Errorf("unit mark %q without a number before it", string(r))
			}
			marked = true
			flush(unitOf(r))
		default:
			return 0, false, fmt.Errorf("unexpected character %q: want a number or fields like 05:30:00.0", string(r))
		}
	}
	if cur.Len() > 0 {
		flush(-1)
	} else if colon && strings.HasSuffix(in, ":") {
		return 0, false, fmt.Errorf("empty field after ':'")
	}
	if len(fields) == 0 || len(fields) > 3 {
		return 0, false, fmt.Errorf("want a number or up to three fields like 05:30:00.0")
	}
	if marked {
		if colon {
			return 0, false, fmt.Errorf("mixes ':' with unit marks")
		}
		for i := range fields {
			if fields[i].unit < 0 {
				if i != len(fields)-1 || i == 0 {
					return 0, false, fmt.Errorf("field %q has no unit mark", fields[i].text)
				}
				fields[i].unit = fields[i-1].unit + 1
			}
			want := 0
			if i > 0 {
				want = fields[i-1].unit + 1
			}
			if fields[i].unit != want || fields[i].unit > 2 {
				return 0, false, fmt.Errorf("unit marks out of order: want %s", map[string]string{"hms": "h, m, s", "dms": "d (or °), m, s"}[kind])
			}
		}
	}
	for i, f := range fields {
		p, err := strconv.ParseFloat(f.text, 64)
		if err != nil || math.IsNaN(p) || math.IsInf(p, 0) {
			return 0, false, fmt.Errorf("field %q is not a number", f.text)
		}
		if i < len(fields)-1 && strings.Contains(f.text, ".") {
			return 0, false, fmt.Errorf("only the last field may have a fraction, not %q", f.text)
		}
		if i > 0 && p >= 60 {
			return 0, false, fmt.Errorf("minutes and seconds must be below 60, not %q", f.text)
		}
		v += p / math.Pow(60, float64(i))
	}
	if neg {
		v = -v
	}
	return v, neg, nil
}
