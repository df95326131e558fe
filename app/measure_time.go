package app

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"
	"time"

	"example.org/vigil/ephem"
	"example.org/vigil/observe"
)

// The Measurements page's reading of typed times (no fyne: tested without
// a window).

// measureClockRE matches a clock time: "21:14", "21:14:30", "21:14:30.5",
// also with "h" or "." between hours and minutes ("21h14", "21.14").
var measureClockRE = regexp.MustCompile(`^(\d{1,2})[:h.](\d{2})(?::(\d{2}(?:\.\d+)?))?$`)

// measureLocalRE matches a date and clock time without a zone:
// "2026-12-01 21:14", "2026-12-01T21:14:30".
var measureLocalRE = regexp.MustCompile(`^(\d{4})-(\d{2})-(\d{2})[ T](\d{1,2}):(\d{2})(?::(\d{2}(?:\.\d+)?))?$`)

// measureNightSpan returns the night that begins on date (its year, month and
// day) at the site: from local noon of date to local noon of the next day.
// Every measurement of the night falls in it (as Tonight counts nights).
func measureNightSpan(date time.Time, site *observe.Site) (from, to time.Time) {
	loc := site.Location()
	y, m, d := date.Date()
	return time.Date(y, m, d, 12, 0, 0, 0, loc), time.Date(y, m, d+1, 12, 0, 0, 0, loc)
}

// ParseMeasureTime reads the time of a measurement typed for the night of
// date at the site, with clock times and dates read in loc (the site's
// zone or UTC):
//
//   - a clock time, "21:14", "21:14:30" or "21:14:30.5": the moment of the
//     night showing that clock in loc (evening or morning, whichever falls
//     in the night);
//   - a date and clock time without a zone, "2026-12-01 21:14", in loc;
//   - any instant ephem.ParseInstant reads: ISO 8601 with a zone
//     ("2026-12-01T21:14:00Z"), "JD2461376.38", "MJD61375.88".
//
// The instant must lie in the night (measureNightSpan). The error quotes the text
// and says what is expected, naming the zone.
func ParseMeasureTime(s string, loc *time.Location, date time.Time, site *observe.Site) (time.Time, error) {
	s = strings.TrimSpace(s)
	from, to := measureNightSpan(date, site)
	zone := measureZoneText(loc, from)
	y, mo, d := date.Date()
	ex := time.Date(y, mo, d, 21, 14, 0, 0, time.UTC)
	exJD := float64(ex.Unix())/86400 + 2440587.5 // the Unix epoch is JD 2440587.5 (Meeus 1998, ch. 7)
	want := fmt.Sprintf("expected a clock time such as 21:14 or 21:14:30 (%s), a date and time such as %s 21:14, or an instant such as %s or JD%.3f",
		zone, date.Format(time.DateOnly), ex.Format("2006-01-02T15:04:05Z"), exJD)
	if s == "" {
		return time.Time{}, fmt.Errorf("time is empty: %s, or press Now", want)
	}
	var t time.Time
	if m := measureClockRE.FindStringSubmatch(s); m != nil {
		h, mi, sec, ok := measureClockParts(m[1], m[2], m[3])
		if !ok {
			return time.Time{}, fmt.Errorf("time %q: %s", s, want)
		}
		// The clock shows the typed time once a day: take the day that puts
		// it in the night.
		y, mo, d := from.In(loc).Date()
		for k := -1; k <= 2; k++ {
			c := time.Date(y, mo, d+k, h, mi, 0, 0, loc).Add(sec)
			if !c.Before(from) && c.Before(to) {
				return c, nil
			}
		}
		return time.Time{}, fmt.Errorf("time %q (%s) does not fall in the %s", s, zone, measureNightWords(date))
	}
	if m := measureLocalRE.FindStringSubmatch(s); m != nil {
		h, mi, sec, ok := measureClockParts(m[4], m[5], m[6])
		y, _ := strconv.Atoi(m[1])
		mo, _ := strconv.Atoi(m[2])
		d, _ := strconv.Atoi(m[3])
		if !ok || mo < 1 || mo > 12 || d < 1 || d > 31 {
			return time.Time{}, fmt.Errorf("time %q: %s", s, want)
		}
		t = time.Date(y, time.Month(mo), d, h, mi, 0, 0, loc).Add(sec)
		if t.Day() != d { // 31 November and the like
			return time.Time{}, fmt.Errorf("time %q: there is no such date: %s", s, want)
		}
	} else {
		et, err := ephem.ParseInstant(s)
		if err != nil {
			return time.Time{}, fmt.Errorf("time %q: %s", s, want)
		}
		t = et.Time().Round(time.Millisecond) // a Julian date carries about 40 µs
	}
	if t.Before(from) || !t.Before(to) {
		return time.Time{}, fmt.Errorf("time %q is %s, not in the %s: step to that night first (Alt+← or Alt+→)",
			s, t.In(loc).Format("15:04 Mon 2 Jan 2006")+" "+measureZoneText(loc, t), measureNightWords(date))
	}
	return t, nil
}

// measureClockParts reads hours, minutes and optional seconds, checking ranges.
func measureClockParts(hs, ms, ss string) (h, m int, sec time.Duration, ok bool) {
	h, _ = strconv.Atoi(hs)
	m, _ = strconv.Atoi(ms)
	if h > 23 || m > 59 {
		return 0, 0, 0, false
	}
	if ss != "" {
		v, err := strconv.ParseFloat(ss, 64)
		if err != nil || v >= 60 {
			return 0, 0, 0, false
		}
		sec = time.Duration(v * float64(time.Second))
	}
	return h, m, sec, true
}

// measureZoneText names the zone of loc at t: "GMT, Europe/London", or "UTC".
func measureZoneText(loc *time.Location, t time.Time) string {
	abbr := t.In(loc).Format("MST")
	if loc == time.UTC || loc.String() == "UTC" {
		return "UTC"
	}
	return abbr + ", " + loc.String()
}

// measureNightWords names the night of date: "night of Tue 1 – Wed 2 Dec 2026".
func measureNightWords(date time.Time) string {
	return strings.ToLower(nightTitle(date)[:1]) + nightTitle(date)[1:]
}

// measureNowText writes the clock time of now in loc as the time field takes it
// ("21:14:05"), for the Now button.
func measureNowText(now time.Time, loc *time.Location) string { return now.In(loc).Format("15:04:05") }

// measureTimeEcho writes an instant as the page confirms a typed time: local and
// UTC side by side, "21:14:05 GMT = 21:14:05 UTC, Tue 1 Dec".
func measureTimeEcho(t time.Time, site *observe.Site) string {
	loc := site.Location()
	l := t.In(loc)
	u := t.UTC()
	return fmt.Sprintf("%s %s = %s UTC, %s", l.Format("15:04:05"), l.Format("MST"), u.Format("15:04:05"), u.Format("Mon 2 Jan"))
}
