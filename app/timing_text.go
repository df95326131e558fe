package app

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
	"example.org/vigil/reduce"
)

// The page's words for times, uncertainties and O−C, and the reading of
// a fit's range.

// TimingParseRangeEnd reads one end of a range to fit: a full Julian date
// on the ephemeris's scale ("2461350.55"); a clock time at the night's
// site ("23:40", "01:05:30"; from noon to midnight on the night's date,
// after midnight on the next); or an instant as ephem.ParseInstant reads
// it ("2026-11-06T01:05Z", "JD2461350.55" on the UTC scale). Times of day
// and instants are converted to the ephemeris's scale for the star.
func TimingParseRangeEnd(s string, tg observe.Target, n TimingNight) (float64, error) {
	s = strings.TrimSpace(s)
	scale := tg.Ephemeris.Scale
	want := fmt.Sprintf("want a Julian date on %s such as 2461350.5512, a local time such as 23:40, or an instant such as 2026-11-06T01:05Z",
		scale.Label())
	if v, err := strconv.ParseFloat(s, 64); err == nil {
		if !(v > 1e6 && v < 1e7) {
			return 0, fmt.Errorf("%q: %s", s, want)
		}
		return v, nil
	}
	var at ephem.Time
	if strings.Trim(s, "0123456789:") == "" && strings.Count(s, ":") > 0 {
		var err error
		if at, err = timingClockTime(s, n); err != nil {
			return 0, fmt.Errorf("%q: %s", s, want)
		}
	} else {
		var err error
		if at, err = ephem.ParseInstant(s); err != nil {
			return 0, fmt.Errorf("%q: %s", s, want)
		}
	}
	var site *ephem.Site
	if n.Site != nil {
		site = &n.Site.Site
	}
	hjd, bjd, err := reduce.ConvertTimes([]float64{at.JDUTC()}, tg.Star, site)
	if err != nil {
		return 0, fmt.Errorf("%q: %v", s, err)
	}
	if scale == ephem.HJD {
		return hjd[0], nil
	}
	return bjd[0], nil
}

// timingClockTime reads a time of day at the night's site, "23:40" or
// "01:05:30": from noon on, on the night's date; before noon, on the next.
func timingClockTime(s string, n TimingNight) (ephem.Time, error) {
	layout := "15:04"
	if strings.Count(s, ":") == 2 {
		layout = "15:04:05"
	}
	c, err := time.Parse(layout, s)
	if err != nil {
		return ephem.Time{}, err
	}
	y, m, d := n.Night.Date.Date()
	if c.Hour() < 12 {
		d++
	}
	return ephem.FromTime(time.Date(y, m, d, c.Hour(), c.Minute(), c.Second(), 0, n.Loc()))
}

// timingSeenText writes when light from an event at jd on scale ts reached the
// site: local time and UTC, with the date; at the Earth's centre when the
// site is unknown.
func timingSeenText(jd float64, ts ephem.TimeScale, star ephem.Star, site *observe.Site) string {
	t, err := timingSeen(jd, ts, star, site)
	if err != nil {
		return "(no clock time: " + err.Error() + ")"
	}
	if site == nil {
		return "Seen from the Earth's centre at " + t.Format("15:04:05 UTC on Mon 2 Jan 2006") + "."
	}
	loc := site.Location()
	return fmt.Sprintf("Seen at %s local, %s UTC, on %s, at %s.", t.In(loc).Format("15:04:05 MST"),
		t.Format("15:04:05"), t.In(loc).Format("Mon 2 Jan 2006"), site.Name)
}

// timingSeen returns the instant (to the second) at which light from an
// event at jd on scale ts reaches the site (ephem.SeenAt), or the Earth's
// centre when the site is not known (ephem.Frame.SeenAt).
func timingSeen(jd float64, ts ephem.TimeScale, star ephem.Star, site *observe.Site) (time.Time, error) {
	if site != nil {
		at, err := ephem.SeenAt(ts, jd, star, site.Site)
		return at.Time().Round(time.Second), err
	}
	approx, err := ephem.FromJDUTC(jd)
	if err != nil {
		return time.Time{}, err
	}
	v := star.Vec()
	at, err := ephem.NewFrame(approx).SeenAt(ts, jd, &v, nil)
	return at.Time().Round(time.Second), err
}

// timingSigmaText writes an uncertainty in days and in seconds (or
// minutes from ten minutes up): "± 0.00004 d (±3.6 s)".
func timingSigmaText(days float64) string {
	if math.IsNaN(days) || days <= 0 {
		return "(σ unknown)"
	}
	s := days * 86400
	var alt string
	switch {
	case s < 10:
		alt = fmt.Sprintf("±%.1f s", s)
	case s < 600:
		alt = fmt.Sprintf("±%.0f s", s)
	default:
		alt = fmt.Sprintf("±%.1f min", s/60)
	}
	return fmt.Sprintf("± %s d (%s)", timingSigDigits(days), alt)
}

// timingSigDigits writes a positive number to two significant digits, without
// an exponent down to 1e-9.
func timingSigDigits(v float64) string {
	if v <= 0 || math.IsNaN(v) || math.IsInf(v, 0) {
		return "—"
	}
	dec := max(0, 1-int(math.Floor(math.Log10(v))))
	return strconv.FormatFloat(v, 'f', dec, 64)
}

// timingOCText writes an O−C in days and minutes: "+0.00325 d (+4.7 min)".
func timingOCText(days float64) string {
	if math.IsNaN(days) {
		return "—"
	}
	return fmt.Sprintf("%+.5f d (%+.1f min)", days, days*1440)
}

// timingCapitalise puts the first letter of s in upper case.
func timingCapitalise(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

// timingValErr writes a value and its error, both to the decimal of the
// error's second significant digit: "2.8673632 ± 0.0000004". An unknown
// error writes the value alone to dec decimals.
func timingValErr(v, e float64, dec int) string {
	if !(e > 0) || math.IsInf(e, 0) {
		return fmt.Sprintf("%.*f", dec, v)
	}
	dec = min(max(1-int(math.Floor(math.Log10(e))), 0), 12)
	return fmt.Sprintf("%.*f ± %.*f", dec, v, dec, e)
}

// timingSci writes a small number (and its error, when positive) in powers
// of ten: "(5.02 ± 0.31)×10⁻⁹".
func timingSci(v, e float64) string {
	if v == 0 {
		return "0"
	}
	exp := int(math.Floor(math.Log10(math.Abs(v))))
	m := v / math.Pow(10, float64(exp))
	pow := "×10" + timingSuperscript(exp)
	if e > 0 {
		return fmt.Sprintf("(%.2f ± %.2f)%s", m, e/math.Pow(10, float64(exp)), pow)
	}
	return fmt.Sprintf("%.3g%s", m, pow)
}

// timingSuperscript writes an integer in superscript digits.
func timingSuperscript(n int) string {
	const digits = "⁰¹²³⁴⁵⁶⁷⁸⁹"
	sup := []rune(digits)
	var b strings.Builder
	if n < 0 {
		b.WriteRune('⁻')
		n = -n
	}
	for _, c := range fmt.Sprint(n) {
		b.WriteRune(sup[c-'0'])
	}
	return b.String()
}
