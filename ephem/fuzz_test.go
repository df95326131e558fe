package ephem

import (
	"fmt"
	"math"
	"strings"
	"testing"
)

// Fuzz targets for the parsers that read user input (flags, CSV cells, text
// boxes). Run one with, e.g.,
//
//	go test ./ephem/ -run '^$' -fuzz '^FuzzParseInstant$' -fuzztime 60s
//
// Seeds are added below and kept in testdata/fuzz/<target>/; plain go test
// runs the seeds only.

// checkQuotedError checks that a rejection quotes the input (or, for blank
// input, says it is empty), as every parser error must.
func checkQuotedError(t *testing.T, fn, in string, err error) {
	t.Helper()
	msg := err.Error()
	if strings.Contains(msg, fmt.Sprintf("%q", in)) {
		return
	}
	if strings.TrimSpace(in) == "" && strings.Contains(msg, "empty") {
		return
	}
	t.Errorf("%s(%q) error %q neither quotes the input nor says it is empty", fn, in, msg)
}

var instantSeeds = []string{
	"2026-12-01T03:00:00Z", "2026-12-01T03:00:00.250Z", "2026-12-01T04:00:00+01:00",
	"2026-12-01T03:00Z", "2026-12-01 03:00:00", "2026-12-01", "JD2461375.625",
	"MJD61375.125", "jd 2461375.625", "2016-12-31T23:59:60Z", "1620-01-01", "2200-01-01",
	"JDNaN", "JD1e308", "", "   ", "2026-13-01", "MJD-1e9", "2026-12-01T03:00:00.123456789-14:00",
}

func FuzzParseInstant(f *testing.F) {
	for _, s := range instantSeeds {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		tm, err := ParseInstant(s)
		if err != nil {
			checkQuotedError(t, "ParseInstant", s, err)
			return
		}
		jd := tm.JDUTC()
		if !tm.Valid() || math.IsNaN(jd) || math.IsInf(jd, 0) || jd < minJD || jd >= maxJD {
			t.Fatalf("ParseInstant(%q) = JD %v, want a valid instant in [%v, %v)", s, jd, minJD, maxJD)
		}
		for _, v := range []float64{tm.JDTT(), tm.JDTDB()} {
			if math.IsNaN(v) || math.Abs(v-jd) > 200.0/secPerDay {
				t.Fatalf("ParseInstant(%q): JDUTC %v, JDTT %v, JDTDB %v: want TT and TDB within 200 s of UTC", s, jd, tm.JDTT(), tm.JDTDB())
			}
		}
		// What String writes (to the millisecond), ParseInstant reads back.
		back, err := ParseInstant(tm.String())
		if err != nil {
			t.Fatalf("ParseInstant(%q) = %s, which does not parse back: %v", s, tm, err)
		}
		if d := math.Abs(back.Sub(tm)) * secPerDay; d > 0.6e-3 {
			t.Fatalf("ParseInstant(%q) = %s, read back %.3f ms away", s, tm, d*1e3)
		}
	})
}

var sexagesimalSeeds = []string{
	"5.5", "05:30:00.0", "5 30 0", "5h30m00s", "-05:23:28", "-5d23m28s", "-5°23′28″",
	"−5°23'28\"", "+90", "-90:00:00", "23:59:59.999", "24", "12:60:00", "12.5:30:00",
	"NaN", "Inf", "1e1", "", "-", "--5", "359:59:59.99", "-180", "0x1p-2", "1_0",
	"00:00:00.0000000001", "9999999999999999999999", "5:", ".5",
}

func FuzzParseRA(f *testing.F) {
	for _, s := range sexagesimalSeeds {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		h, err := ParseRA(s)
		if err != nil {
			checkQuotedError(t, "ParseRA", s, err)
			return
		}
		if math.IsNaN(h) || math.IsInf(h, 0) || h < 0 || h >= 24 {
			t.Fatalf("ParseRA(%q) = %v, want hours in [0, 24)", s, h)
		}
		// FormatRA prints 0.01 s; reading it back must land within 0.01 s
		// (modulo 24 h, as 23:59:59.999 prints as 00:00:00.00).
		f := FormatRA(h)
		back, err := ParseRA(f)
		if err != nil {
			t.Fatalf("ParseRA(%q) = %v; FormatRA gives %q, which does not parse back: %v", s, h, f, err)
		}
		if d := math.Abs(wrapDiffHours(back, h)) * 3600; d > 0.01 {
			t.Fatalf("ParseRA(%q) = %v; FormatRA gives %q, read back %.4f s away, want ≤ 0.01 s", s, h, f, d)
		}
	})
}

func FuzzParseDec(f *testing.F) {
	for _, s := range sexagesimalSeeds {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		d, err := ParseDec(s)
		if err != nil {
			checkQuotedError(t, "ParseDec", s, err)
		} else {
			if math.IsNaN(d) || d < -90 || d > 90 {
				t.Fatalf("ParseDec(%q) = %v, want degrees in [-90, 90]", s, d)
			}
			f := FormatDec(d)
			back, err := ParseDec(f)
			if err != nil {
				t.Fatalf("ParseDec(%q) = %v; FormatDec gives %q, which does not parse back: %v", s, d, f, err)
			}
			if diff := math.Abs(back-d) * 3600; diff > 0.05+1e-9 {
				t.Fatalf("ParseDec(%q) = %v; FormatDec gives %q, read back %.4f″ away, want ≤ 0.05″", s, d, f, diff)
			}
		}
		lat, err := ParseLatitude(s)
		if err != nil {
			checkQuotedError(t, "ParseLatitude", s, err)
		} else if math.IsNaN(lat) || lat < -90 || lat > 90 {
			t.Fatalf("ParseLatitude(%q) = %v, want degrees in [-90, 90]", s, lat)
		}
	})
}

func FuzzParseLongitude(f *testing.F) {
	for _, s := range sexagesimalSeeds {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		lon, err := ParseLongitude(s)
		if err != nil {
			checkQuotedError(t, "ParseLongitude", s, err)
			return
		}
		if math.IsNaN(lon) || lon <= -180 || lon > 180 {
			t.Fatalf("ParseLongitude(%q) = %v, want degrees in (-180, 180]", s, lon)
		}
		if _, err := NewSite("fuzz", 0, lon, 0); err != nil {
			t.Fatalf("ParseLongitude(%q) = %v, which NewSite rejects: %v", s, lon, err)
		}
	})
}
