package ephem

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"
	"time"
)

// Parser tests. The expected values of the valid forms follow from the
// definitions of the units (1 h = 60 min = 3600 s; 1° = 60′ = 3600″) and, for
// instants, from Meeus 1998, eq. 7.1 (checked in meeus_test.go).

// tolParsedDeg is the tolerance on a parsed angle or hour value: exact up to
// float64 rounding.
const tolParsedDeg = 1e-12

// checkParseError checks that err is not nil, quotes the input and contains
// each of the wanted phrases (what was expected).
func checkParseError(t *testing.T, fn, in string, err error, wants ...string) {
	t.Helper()
	if err == nil {
		t.Errorf("%s(%q): no error, want one", fn, in)
		return
	}
	msg := err.Error()
	// A blank input may be quoted or called empty.
	quoted := strings.Contains(msg, fmt.Sprintf("%q", in))
	if strings.TrimSpace(in) == "" {
		if !quoted && !strings.Contains(msg, "empty") {
			t.Errorf("%s(%q) error %q neither quotes the input nor says it is empty", fn, in, msg)
		}
	} else if !quoted {
		t.Errorf("%s(%q) error %q does not quote the input", fn, in, msg)
	}
	for _, w := range wants {
		if !strings.Contains(msg, w) {
			t.Errorf("%s(%q) error %q does not say %q", fn, in, msg, w)
		}
	}
	if msg != "" && strings.ToLower(msg[:1]) != msg[:1] {
		t.Errorf("%s(%q) error %q starts with a capital", fn, in, msg)
	}
	if strings.HasSuffix(msg, ".") {
		t.Errorf("%s(%q) error %q ends with a period", fn, in, msg)
	}
}

func TestParseInstant(t *testing.T) {
	valid := []struct {
		in  string
		iso string // the instant, as String writes it
	}{
		{"2026-12-01T03:00:00Z", "2026-12-01T03:00:00Z"},
		{"2026-12-01T03:00:00.250Z", "2026-12-01T03:00:00.25Z"},
		{"2026-12-01T04:00:00+01:00", "2026-12-01T03:00:00Z"},
		{"2026-11-30T17:00:00-10:00", "2026-12-01T03:00:00Z"},
		{"2026-12-01T03:00Z", "2026-12-01T03:00:00Z"},
		{"2026-12-01 03:00:00", "2026-12-01T03:00:00Z"},
		{"2026-12-01T03:00:00", "2026-12-01T03:00:00Z"},
		{"2026-12-01T03:00", "2026-12-01T03:00:00Z"},
		{"2026-12-01 03:00", "2026-12-01T03:00:00Z"},
		{"2026-12-01 03:00:00.5", "2026-12-01T03:00:00.5Z"},
		{"2026-12-01 04:00+01:00", "2026-12-01T03:00:00Z"},
		{"2026-12-01", "2026-12-01T00:00:00Z"},
		{"  2026-12-01T03:00:00Z\t", "2026-12-01T03:00:00Z"},
		{"JD2461375.625", "2026-12-01T03:00:00Z"},
		{"jd 2461375.625", "2026-12-01T03:00:00Z"},
		{"MJD61375.125", "2026-12-01T03:00:00Z"},
		{"mjd61375.125", "2026-12-01T03:00:00Z"},
		{"2016-12-31T23:59:59Z", "2016-12-31T23:59:59Z"},
		{"1620-01-01T00:00:00Z", "1620-01-01T00:00:00Z"},
		{"2199-12-31T23:59:59Z", "2199-12-31T23:59:59Z"},
	}
	for _, c := range valid {
		tm, err := ParseInstant(c.in)
		if err != nil {
			t.Errorf("ParseInstant(%q): %v, want %s", c.in, err, c.iso)
			continue
		}
		if got := tm.String(); got != c.iso {
			t.Errorf("ParseInstant(%q) = %s, want %s", c.in, got, c.iso)
		}
	}
	bad := []struct {
		name, in string
		wants    []string
		outOfRng bool
	}{
		{"empty", "", []string{"empty", "want ISO 8601"}, false},
		{"blank", "   ", []string{"empty"}, false},
		{"words", "tomorrow night", []string{"want ISO 8601"}, false},
		{"month 13", "2026-13-01", []string{"want ISO 8601"}, false},
		{"day 31 in November", "2026-11-31", []string{"want ISO 8601"}, false},
		{"hour 24", "2026-12-01T24:00:00Z", []string{"want ISO 8601"}, false},
		{"leap second", "2016-12-31T23:59:60Z", []string{"leap second", ":60"}, false},
		{"JD not a number", "JD24613x", []string{"not a number", "JD"}, false},
		{"JD NaN", "JDNaN", []string{"not a number"}, false},
		{"JD Inf", "JD+Inf", []string{"not a number"}, false},
		{"MJD empty", "MJD", []string{"not a number", "MJD"}, false},
		{"JD out of range", "JD2524593.5", []string{"Julian date"}, true},
		{"before 1620", "1619-12-31T23:59:59Z", nil, true},
		{"2200", "2200-01-01", nil, true},
	}
	for _, c := range bad {
		_, err := ParseInstant(c.in)
		checkParseError(t, "ParseInstant", c.in, err, c.wants...)
		if c.outOfRng != errors.Is(err, ErrOutOfRange) {
			t.Errorf("%s: ParseInstant(%q) error %v: errors.Is(ErrOutOfRange) = %v, want %v", c.name, c.in, err, !c.outOfRng, c.outOfRng)
		}
	}
}

func TestParseDate(t *testing.T) {
	for _, c := range []struct {
		in   string
		want time.Time
	}{
		{"2026-12-01", time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)},
		{" 2024-02-29 ", time.Date(2024, 2, 29, 0, 0, 0, 0, time.UTC)},
		{"1620-01-01", time.Date(1620, 1, 1, 0, 0, 0, 0, time.UTC)},
		{"2199-12-29", time.Date(2199, 12, 29, 0, 0, 0, 0, time.UTC)},
	} {
		got, err := ParseDate(c.in)
		if err != nil || !got.Equal(c.want) {
			t.Errorf("ParseDate(%q) = %v, %v; want %v", c.in, got, err, c.want)
		}
	}
	for _, c := range []struct {
		in       string
		wants    []string
		outOfRng bool
	}{
		{"", []string{"want YYYY-MM-DD"}, false},
		{"2026-12-01T03:00:00Z", []string{"want YYYY-MM-DD"}, false},
		{"2023-02-29", []string{"no such day"}, false},
		{"2026-04-31", []string{"no such day"}, false},
		{"01.12.2026", []string{"want YYYY-MM-DD"}, false},
		{"1619-12-31", nil, true},
		{"2199-12-31", nil, true},
	} {
		_, err := ParseDate(c.in)
		checkParseError(t, "ParseDate", c.in, err, c.wants...)
		if c.outOfRng != errors.Is(err, ErrOutOfRange) {
			t.Errorf("ParseDate(%q) error %v: errors.Is(ErrOutOfRange) = %v, want %v", c.in, err, !c.outOfRng, c.outOfRng)
		}
	}
}

// parserCase is one row of a sexagesimal-parser table: a valid input with
// its value, or a bad one (want NaN) with the phrases its error must hold.
type parserCase struct {
	in    string
	want  float64
	wants []string
}

func runParserTable(t *testing.T, fn string, parse func(string) (float64, error), cases []parserCase) {
	t.Helper()
	for _, c := range cases {
		t.Run(c.in, func(t *testing.T) {
			got, err := parse(c.in)
			if math.IsNaN(c.want) {
				checkParseError(t, fn, c.in, err, c.wants...)
				return
			}
			if err != nil {
				t.Errorf("%s(%q): %v, want %v", fn, c.in, err, c.want)
				return
			}
			if d := got - c.want; math.Abs(d) > tolParsedDeg*math.Max(1, math.Abs(c.want)) {
				t.Errorf("%s(%q) = %.12f, want %.12f, diff %.3g", fn, c.in, got, c.want, d)
			}
		})
	}
}

var nan = math.NaN()

func TestParseRA(t *testing.T) {
	runParserTable(t, "ParseRA", ParseRA, []parserCase{
		{in: "5.5", want: 5.5},
		{in: "05:30:00.0", want: 5.5},
		{in: "5 30 0", want: 5.5},
		{in: "5h30m00s", want: 5.5},
		{in: "5H30M00S", want: 5.5},
		{in: "05:30", want: 5.5},
		{in: "22:29:10.26502", want: sexHours(22, 29, 10.26502)},
		{in: "+12:00:00", want: 12},
		{in: "0", want: 0},
		{in: "00:00:00", want: 0},
		{in: "23:59:59.999", want: sexHours(23, 59, 59.999)},
		{in: "  14 15 39.7  ", want: sexHours(14, 15, 39.7)},
		{in: "", want: nan, wants: []string{"empty"}},
		{in: "24:00:00", want: nan, wants: []string{"[0, 24)"}},
		{in: "24", want: nan, wants: []string{"[0, 24)"}},
		{in: "23:59:60", want: nan, wants: []string{"below 60"}},
		{in: "12:60:00", want: nan, wants: []string{"below 60", `"60"`}},
		{in: "12:75", want: nan, wants: []string{"below 60"}},
		{in: "-01:00:00", want: nan, wants: []string{"[0, 24)"}},
		{in: "-0:30", want: nan, wants: []string{"[0, 24)"}},
		{in: "12.5:30:00", want: nan, wants: []string{"only the last field", `"12.5"`}},
		{in: "12:30.5:00", want: nan, wants: []string{"only the last field"}},
		{in: "12:30:00:00", want: nan, wants: []string{"up to three fields"}},
		{in: "NaN", want: nan, wants: []string{"unexpected character"}},
		{in: "Inf", want: nan, wants: []string{"unexpected character"}},
		{in: "1e1", want: nan, wants: []string{"unexpected character"}},
		{in: "12:-30:00", want: nan, wants: []string{"unexpected character"}},
		{in: "--5", want: nan, wants: []string{"unexpected character"}},
		{in: "5°30′", want: nan, wants: []string{"unexpected character"}},
		{in: "5h30", want: 5.5},
		{in: "5h 30m 0s", want: 5.5},
		{in: "5h30:00", want: nan, wants: []string{"mixes"}},
		{in: "h5", want: nan, wants: []string{"without a number"}},
		{in: "12:", want: nan, wants: []string{"empty field"}},
		{in: "five", want: nan},
		{in: "5m", want: nan, wants: []string{"out of order"}},
		{in: "5s30h", want: nan, wants: []string{"out of order"}},
		{in: "12:ab:00", want: nan, wants: []string{"unexpected character"}},
	})
}

func TestParseDec(t *testing.T) {
	runParserTable(t, "ParseDec", ParseDec, []parserCase{
		{in: "-5.39", want: -5.39},
		{in: "-05:23:28", want: sexDeg(true, 5, 23, 28)},
		{in: "-5 23 28", want: sexDeg(true, 5, 23, 28)},
		{in: "-5d23m28s", want: sexDeg(true, 5, 23, 28)},
		{in: "-5°23′28″", want: sexDeg(true, 5, 23, 28)},
		{in: "−5°23'28\"", want: sexDeg(true, 5, 23, 28)}, // U+2212 minus sign
		{in: "+58:24:54.7139", want: sexDeg(false, 58, 24, 54.7139)},
		{in: "-00:30", want: -0.5},
		{in: "-0 0 36", want: -0.01},
		{in: "90", want: 90},
		{in: "-90:00:00", want: -90},
		{in: "0", want: 0},
		{in: "", want: nan, wants: []string{"empty"}},
		{in: "90:00:00.1", want: nan, wants: []string{"[-90, 90]"}},
		{in: "-91", want: nan, wants: []string{"[-90, 90]"}},
		{in: "10:60:00", want: nan, wants: []string{"below 60"}},
		{in: "10:30:60", want: nan, wants: []string{"below 60"}},
		{in: "10.5:30", want: nan, wants: []string{"only the last field"}},
		{in: "NaN", want: nan, wants: []string{"unexpected character"}},
		{in: "-Inf", want: nan, wants: []string{"unexpected character"}},
		{in: "5h30m", want: nan, wants: []string{"unexpected character \"h\""}},
		{in: "30m", want: nan, wants: []string{"out of order"}},
		{in: "-5m", want: nan, wants: []string{"out of order"}},
		{in: "5d30", want: 5.5},
		{in: "5d30s", want: nan, wants: []string{"out of order"}},
		{in: "+-5", want: nan, wants: []string{"unexpected character"}},
		{in: "-", want: nan, wants: []string{"sign without a number"}},
	})
}

func TestParseLatitude(t *testing.T) {
	runParserTable(t, "ParseLatitude", ParseLatitude, []parserCase{
		{in: "50", want: 50},
		{in: "38:55:17", want: sexDeg(false, 38, 55, 17)},
		{in: "-33 56 00", want: sexDeg(true, 33, 56, 0)},
		{in: "90", want: 90},
		{in: "-90", want: -90},
		{in: "", want: nan, wants: []string{"empty"}},
		{in: "90.0001", want: nan, wants: []string{"[-90, 90]", "north positive"}},
		{in: "-91", want: nan, wants: []string{"[-90, 90]"}},
		{in: "45:61", want: nan, wants: []string{"below 60"}},
		{in: "nan", want: nan, wants: []string{"unexpected character"}},
	})
}

func TestParseLongitude(t *testing.T) {
	runParserTable(t, "ParseLongitude", ParseLongitude, []parserCase{
		{in: "10", want: 10},
		{in: "-77:03:56", want: sexDeg(true, 77, 3, 56)}, // west of Greenwich
		{in: "-0.0015", want: -0.0015},
		{in: "180", want: 180},
		{in: "-180", want: 180}, // the same meridian, written (−180, 180]
		{in: "359", want: -1},
		{in: "359:59:24", want: -sexDeg(false, 0, 0, 36)},
		{in: "190", want: -170},
		{in: "", want: nan, wants: []string{"empty"}},
		{in: "360", want: nan, wants: []string{"[-180, 360)", "east positive"}},
		{in: "-180.5", want: nan, wants: []string{"[-180, 360)"}},
		{in: "10:60", want: nan, wants: []string{"below 60"}},
		{in: "10.5:30", want: nan, wants: []string{"only the last field"}},
		{in: "Inf", want: nan, wants: []string{"unexpected character"}},
		{in: "1e2", want: nan, wants: []string{"unexpected character"}},
	})
}

func TestParseTimeScale(t *testing.T) {
	for _, c := range []struct {
		in   string
		want TimeScale
	}{
		{"hjd", HJD}, {"HJD", HJD}, {"hjd_utc", HJD}, {" HJD_UTC ", HJD},
		{"bjd", BJDTDB}, {"BJD", BJDTDB}, {"bjd_tdb", BJDTDB}, {"Bjd_Tdb", BJDTDB},
	} {
		got, err := ParseTimeScale(c.in)
		if err != nil || got != c.want {
			t.Errorf("ParseTimeScale(%q) = %v, %v; want %v", c.in, got, err, c.want)
		}
	}
	for _, in := range []string{"", "jd", "mjd", "bjd_utc", "hjd_tdb", "tdb"} {
		_, err := ParseTimeScale(in)
		checkParseError(t, "ParseTimeScale", in, err, "want hjd", "bjd")
	}
	// String and Label round-trip through the parser.
	for _, ts := range []TimeScale{HJD, BJDTDB} {
		for _, s := range []string{ts.String(), ts.Label()} {
			if got, err := ParseTimeScale(s); err != nil || got != ts {
				t.Errorf("ParseTimeScale(%q) = %v, %v; want %v", s, got, err, ts)
			}
		}
	}
	if got := HJD.Label(); got != "HJD_UTC" {
		t.Errorf("HJD.Label() = %q, want HJD_UTC", got)
	}
	if got := BJDTDB.Label(); got != "BJD_TDB" {
		t.Errorf("BJDTDB.Label() = %q, want BJD_TDB", got)
	}
	if got := TimeScale(0).String(); got != "TimeScale(0)" {
		t.Errorf("TimeScale(0).String() = %q, want TimeScale(0)", got)
	}
}
