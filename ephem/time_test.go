package ephem

import (
	"encoding/json"
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"
	"time"
)

// tolRoundTripSec is the tolerance on a time-scale round trip: 1 ms, far
// below what any timing in vigil needs, and 25 times the 40 µs that a
// float64 Julian date resolves.
const tolRoundTripSec = 1e-3

// roundTripInstants returns instants spread over the supported range
// 1620–2199: a regular grid, random instants (fixed seed), and instants a
// second either side of every leap second and of the range ends.
func roundTripInstants(t *testing.T) []Time {
	t.Helper()
	var out []Time
	add := func(jd float64) {
		tm, err := FromJDUTC(jd)
		if err != nil {
			t.Fatalf("FromJDUTC(%.6f): %v", jd, err)
		}
		out = append(out, tm)
	}
	for jd := minJD; jd < maxJD; jd += 97.3 {
		add(jd)
	}
	r := rand.New(rand.NewPCG(1, 2))
	for i := 0; i < 2000; i++ {
		add(minJD + r.Float64()*(maxJD-minJD))
	}
	for _, s := range leapTable {
		add(s.jd - timeSecDay)
		add(s.jd - 1e-3*timeSecDay)
		add(s.jd)
		add(s.jd + timeSecDay)
	}
	add(minJD)
	add(minJD + timeSecDay)
	add(maxJD - timeSecDay)
	return out
}

// jd1972 is 1972-01-01T00:00:00Z, where ΔT from Meeus's table 10.A (42.20 s)
// hands over to TAI − UTC + 32.184 s (42.184 s). TT as a function of UTC
// folds back there by about 0.02 s, so a TT instant in the first 0.02 s of
// 1972 has two UTC instants; FromJDTT may return either. For those the
// round trip is checked on TT.
const jd1972 = 2441317.5

// checkRoundTrip checks that back (= the inverse of scale applied to tm)
// returns tm, or, in the 1972 fold, an instant with the same reading on that
// scale.
func checkRoundTrip(t *testing.T, scale string, tm, back Time, read func(Time) float64) (diff float64) {
	t.Helper()
	d := back.Sub(tm) * secPerDay
	if tm.JDUTC() >= jd1972 && tm.JDUTC() < jd1972+0.05/secPerDay {
		d = (read(back) - read(tm)) * secPerDay
	}
	if math.Abs(d) > tolRoundTripSec {
		t.Errorf("UTC→%s→UTC at %s: got %s, diff %.6f s, tol %.3f s", scale, tm, back, d, tolRoundTripSec)
	}
	return d
}

func TestTTRoundTrip(t *testing.T) {
	worst := 0.0
	for _, tm := range roundTripInstants(t) {
		back, err := FromJDTT(tm.JDTT())
		if err != nil {
			t.Errorf("FromJDTT(JDTT of %s = %.8f): %v", tm, tm.JDTT(), err)
			continue
		}
		worst = math.Max(worst, math.Abs(checkRoundTrip(t, "TT", tm, back, Time.JDTT)))
	}
	t.Logf("worst UTC→TT→UTC error %.1f µs", worst*1e6)
}

func TestTDBRoundTrip(t *testing.T) {
	worst := 0.0
	for _, tm := range roundTripInstants(t) {
		back, err := FromJDTDB(tm.JDTDB())
		if err != nil {
			t.Errorf("FromJDTDB(JDTDB of %s = %.8f): %v", tm, tm.JDTDB(), err)
			continue
		}
		worst = math.Max(worst, math.Abs(checkRoundTrip(t, "TDB", tm, back, Time.JDTDB)))
	}
	t.Logf("worst UTC→TDB→UTC error %.1f µs", worst*1e6)
}

// TestDeltaTContinuous: ΔT is a smooth function of time (Meeus 1998, ch. 10:
// table 10.A is to be interpolated), so it must not step between two
// instants a millisecond apart; a step would make TT(UTC) jump and break the
// UTC→TT→UTC round trip. The rows sit at 12:00 UTC, where the library's
// whole-day interpolation (deltat.Interp10A) changes its day.
func TestDeltaTContinuous(t *testing.T) {
	// tolStepSec: over 1 ms ΔT changes by under 1e-10 s; allow the float64
	// resolution of a JD (40 µs) times the table's steepest slope, 4.5 s/yr.
	const tolStepSec = 1e-6
	for _, iso := range []string{
		"1625-06-01T12:00:00Z", "1650-03-01T12:00:00Z", "1870-06-01T12:00:00Z",
		"1910-06-01T12:00:00Z", "1955-06-01T12:00:00Z", "1955-06-01T00:00:00Z",
	} {
		tm, err := ParseInstant(iso)
		if err != nil {
			t.Fatal(err)
		}
		a, b := DeltaT(tm.Add(-500*time.Microsecond)), DeltaT(tm.Add(500*time.Microsecond))
		back, err := FromJDTT(tm.JDTT())
		if err != nil {
			t.Fatal(err)
		}
		rt := back.Sub(tm) * secPerDay
		if math.Abs(b-a) > tolStepSec || math.Abs(rt) > tolRoundTripSec {
			t.Errorf("%s: ΔT steps by %.6f s across 1 ms (tol %g); UTC→TT→UTC off by %.6f s (tol %g)", iso, b-a, tolStepSec, rt, tolRoundTripSec)
		}
	}
}

// TestTDBMinusTT checks the bound of the periodic term: |TDB − TT| stays
// below 1.7 ms (amplitude 1.657 ms + 0.014 ms, the standard two-term series).
func TestTDBMinusTT(t *testing.T) {
	const bound = 1.672e-3 // s
	for _, tm := range roundTripInstants(t) {
		d := (tm.JDTDB() - tm.JDTT()) * secPerDay
		// The float64 difference of two JDs is good to about 40 µs.
		if math.Abs(d) > bound+50e-6 {
			t.Errorf("TDB − TT at %s = %.6f s, want |TDB − TT| ≤ %.6f s", tm, d, bound)
		}
	}
}

// TestTAIMinusUTC walks every step of the leap-second table: TAI − UTC is the
// new value from 0h UTC of the date and the old one a second before. The
// values are IERS Bulletin C's, as listed in /work/shared/methods.md §2
// ([A]: cross-checked against the table in astropy 5.2.1 / ERFA). Exact
// equality is safe: the table holds whole seconds, and both instants are
// whole seconds, which a float64 JD keeps on the right side of the step.
func TestTAIMinusUTC(t *testing.T) {
	steps := []struct {
		date string
		sec  float64
	}{
		{"1972-01-01", 10}, {"1972-07-01", 11}, {"1973-01-01", 12}, {"1974-01-01", 13},
		{"1975-01-01", 14}, {"1976-01-01", 15}, {"1977-01-01", 16}, {"1978-01-01", 17},
		{"1979-01-01", 18}, {"1980-01-01", 19}, {"1981-07-01", 20}, {"1982-07-01", 21},
		{"1983-07-01", 22}, {"1985-07-01", 23}, {"1988-01-01", 24}, {"1990-01-01", 25},
		{"1991-01-01", 26}, {"1992-07-01", 27}, {"1993-07-01", 28}, {"1994-07-01", 29},
		{"1996-01-01", 30}, {"1997-07-01", 31}, {"1999-01-01", 32}, {"2006-01-01", 33},
		{"2009-01-01", 34}, {"2012-07-01", 35}, {"2015-07-01", 36}, {"2017-01-01", 37},
	}
	const source = "IERS Bulletin C (methods.md §2, [A])"
	for i, s := range steps {
		t.Run(s.date, func(t *testing.T) {
			at, err := ParseInstant(s.date)
			if err != nil {
				t.Fatal(err)
			}
			if got, ok := TAIMinusUTC(at); !ok || got != s.sec {
				t.Errorf("TAIMinusUTC(%s) = %v, %v; want %v, true (%s)", at, got, ok, s.sec, source)
			}
			before := at.Add(-time.Second)
			wantOK := i > 0
			wantBefore := s.sec - 1
			if !wantOK {
				wantBefore = 0
			}
			if got, ok := TAIMinusUTC(before); ok != wantOK || got != wantBefore {
				t.Errorf("TAIMinusUTC(%s) = %v, %v; want %v, %v (%s)", before, got, ok, wantBefore, wantOK, source)
			}
		})
	}
	named := []struct {
		name, iso string
		sec       float64
	}{
		{"last second of 2016", "2016-12-31T23:59:59Z", 36},
		{"half a second before the 2016 leap second", "2016-12-31T23:59:59.5Z", 36},
		{"first second of 2017", "2017-01-01T00:00:00Z", 37},
		{"2016-06-01", "2016-06-01T00:00:00Z", 36},
		{"2017-01-01 noon", "2017-01-01T12:00:00Z", 37},
		{"2026", "2026-12-01T03:00:00Z", 37},
	}
	for _, c := range named {
		tm, err := ParseInstant(c.iso)
		if err != nil {
			t.Fatal(err)
		}
		if got, ok := TAIMinusUTC(tm); !ok || got != c.sec {
			t.Errorf("%s: TAIMinusUTC(%s) = %v, %v; want %v, true (%s)", c.name, c.iso, got, ok, c.sec, source)
		}
	}
}

// TestLeapSecondStepInTT: across the 2016 leap second, one second of UTC
// (23:59:59 to 00:00:00) is two seconds of TT, and TT − UTC is 69.184 s after
// it (TT = TAI + 32.184 s, IAU 1991; methods.md §2 [A]).
func TestLeapSecondStepInTT(t *testing.T) {
	a, _ := ParseInstant("2016-12-31T23:59:59Z")
	b, _ := ParseInstant("2017-01-01T00:00:00Z")
	if d := (b.JDTT() - a.JDTT()) * secPerDay; math.Abs(d-2) > tolRoundTripSec {
		t.Errorf("TT elapsed from %s to %s = %.6f s, want 2 s (1 s + leap second), tol %.3f s", a, b, d, tolRoundTripSec)
	}
	for _, c := range []struct {
		iso  string
		want float64
	}{
		{"2016-12-31T23:59:59Z", 68.184},
		{"2017-01-01T00:00:00Z", 69.184},
		{"2024-06-01T00:00:00Z", 69.184},
		{"1987-04-10T00:00:00Z", 55.184}, // TAI − UTC = 23 s from 1985-07-01
	} {
		tm, _ := ParseInstant(c.iso)
		if d := (tm.JDTT()-tm.JDUTC())*secPerDay - c.want; math.Abs(d) > tolRoundTripSec {
			t.Errorf("TT − UTC at %s = %.6f s, want %.3f s, diff %.6f s, tol %.3f s", c.iso, c.want+d, c.want, d, tolRoundTripSec)
		}
		if d := DeltaT(tm) - c.want; math.Abs(d) > 1e-9 {
			t.Errorf("DeltaT(%s) = %.6f s, want TT − UTC = %.3f s", c.iso, DeltaT(tm), c.want)
		}
	}
}

// tolDeltaTTable is the tolerance on ΔT at a node of Meeus's table 10.A: the
// table gives 0.1 s, and the interpolation runs on the fraction of the year
// (Jan 1.0 is 1/365 of a year past the node).
const tolDeltaTTable = 0.1

func TestDeltaTBefore1972(t *testing.T) {
	const source = "Meeus 1998, table 10.A, p. 79 (as transcribed in meeus/v3 deltat)"
	for _, c := range []struct {
		iso  string
		want float64
	}{
		{"1620-01-01T00:00:00Z", 121.0},
		{"1700-01-01T00:00:00Z", 7.0},
		{"1800-01-01T00:00:00Z", 13.1},
		{"1900-01-01T00:00:00Z", -2.8},
		{"1950-01-01T00:00:00Z", 29.1},
		{"1970-01-01T00:00:00Z", 40.2},
	} {
		tm, err := ParseInstant(c.iso)
		if err != nil {
			t.Fatal(err)
		}
		if _, ok := TAIMinusUTC(tm); ok {
			t.Errorf("TAIMinusUTC(%s) ok, want false before 1972", c.iso)
		}
		if d := DeltaT(tm) - c.want; math.Abs(d) > tolDeltaTTable {
			t.Errorf("DeltaT(%s) = %.3f s, want %.1f s (%s), diff %.3f s, tol %.1f s", c.iso, DeltaT(tm), c.want, source, d, tolDeltaTTable)
		}
	}
	// Sane everywhere before 1972: table 10.A runs from −6.5 s to 121 s.
	for jd := minJD; jd < 2441317.5; jd += 10 {
		tm := mustJD(jd)
		if dt := DeltaT(tm); math.IsNaN(dt) || dt < -7 || dt > 122 {
			t.Errorf("DeltaT(%s) = %v s, want within [−7, 122] s (%s)", tm, dt, source)
		}
	}
	// At 1972-01-01 the table's ΔT hands over to TAI − UTC + 32.184 s. They
	// differ by UT1 − UTC, kept under 0.9 s by the definition of UTC (common
	// practice).
	a, _ := ParseInstant("1971-12-31T23:59:59Z")
	b, _ := ParseInstant("1972-01-01T00:00:00Z")
	if d := DeltaT(b) - DeltaT(a); math.Abs(d) > 0.9 {
		t.Errorf("ΔT jumps by %.3f s at 1972-01-01 (%.3f s to %.3f s), want under 0.9 s", d, DeltaT(a), DeltaT(b))
	}
}

func TestLeapSecondsValidity(t *testing.T) {
	until := LeapSecondsValidUntil()
	if until.Before(time.Date(2017, 1, 1, 0, 0, 0, 0, time.UTC)) {
		t.Errorf("LeapSecondsValidUntil() = %s, want after the last leap second 2017-01-01", until)
	}
	early, _ := ParseInstant("2017-01-01")
	late, _ := ParseInstant("2150-01-01")
	if LeapSecondsStale(early) {
		t.Errorf("LeapSecondsStale(%s) = true, want false (before %s)", early, until.Format("2006-01-02"))
	}
	if !LeapSecondsStale(late) {
		t.Errorf("LeapSecondsStale(%s) = false, want true (after %s)", late, until.Format("2006-01-02"))
	}
}

func TestParseLeapSecondsRejects(t *testing.T) {
	for _, c := range []struct {
		name, text, want string
	}{
		{"empty", "# nothing\n", "empty"},
		{"no valid-until", "1972-01-01 10\n", "valid-until"},
		{"three fields", "1972-01-01 10 x\nvalid-until 2026-07-01\n", "line 1"},
		{"bad date", "1972-13-01 10\nvalid-until 2026-07-01\n", "line 1"},
		{"bad count", "1972-01-01 ten\nvalid-until 2026-07-01\n", "line 1"},
		{"out of order", "1972-07-01 11\n1972-01-01 10\nvalid-until 2026-07-01\n", "line 2: dates out of order"},
		{"bad valid-until", "1972-01-01 10\nvalid-until soon\n", "line 2"},
	} {
		_, _, err := parseLeapSeconds(c.text)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: parseLeapSeconds error = %v, want one containing %q", c.name, err, c.want)
		}
	}
}

func TestOutOfRange(t *testing.T) {
	at := func(y int, m time.Month, d int) time.Time { return time.Date(y, m, d, 0, 0, 0, 0, time.UTC) }
	cases := []struct {
		name string
		err  func() error
	}{
		{"FromJDUTC before 1620", func() error { _, err := FromJDUTC(minJD - 1e-6); return err }},
		{"FromJDUTC at 2200", func() error { _, err := FromJDUTC(maxJD); return err }},
		{"FromTime 1619-12-31", func() error { _, err := FromTime(at(1619, 12, 31)); return err }},
		{"FromTime 2200-01-01", func() error { _, err := FromTime(at(2200, 1, 1)); return err }},
		{"FromJDTT in 2300", func() error { _, err := FromJDTT(2561118.5); return err }},
		{"FromJDTDB in 1500", func() error { _, err := FromJDTDB(2268923.5); return err }},
		{"ParseInstant 2200", func() error { _, err := ParseInstant("2200-01-01T00:00:00Z"); return err }},
		{"ParseInstant JD before 1620", func() error { _, err := ParseInstant("JD2312752.4"); return err }},
		{"ParseInstant MJD after 2200", func() error { _, err := ParseInstant("MJD124593"); return err }},
		{"ParseDate 2199-12-31 (night runs past 2200)", func() error { _, err := ParseDate("2199-12-31"); return err }},
		{"ParseDate 1600-06-01", func() error { _, err := ParseDate("1600-06-01"); return err }},
		{"NightOf 2199-12-31", func() error {
			_, err := NightOf(Site{Name: "any", LatDeg: 50, LonDeg: 10}, at(2199, 12, 31))
			return err
		}},
		{"NightOf 1619-12-31", func() error {
			_, err := NightOf(Site{Name: "any", LatDeg: 50, LonDeg: 10}, at(1619, 12, 31))
			return err
		}},
		{"Crossings with a zero Time", func() error {
			_, err := Crossings(Site{Name: "any"}, Sun, Time{}, mustJD(J2000), 0)
			return err
		}},
		{"SeenAt HJD in 2200", func() error {
			_, err := SeenAt(HJD, maxJD+1, Star{RAHours: 1, DecDeg: 1}, Site{Name: "any"})
			return err
		}},
	}
	for _, c := range cases {
		err := c.err()
		if !errors.Is(err, ErrOutOfRange) {
			t.Errorf("%s: error = %v, want one wrapping ErrOutOfRange", c.name, err)
		}
	}
	// Not a number is a different error: it is not an instant at all.
	for _, jd := range []float64{math.NaN(), math.Inf(1), math.Inf(-1)} {
		if _, err := FromJDUTC(jd); err == nil || errors.Is(err, ErrOutOfRange) || !strings.Contains(err.Error(), "not a number") {
			t.Errorf("FromJDUTC(%v) error = %v, want \"not a number\"", jd, err)
		}
		if _, err := FromJDTT(jd); err == nil || !strings.Contains(err.Error(), "not a number") {
			t.Errorf("FromJDTT(%v) error = %v, want \"not a number\"", jd, err)
		}
		if _, err := FromJDTDB(jd); err == nil || !strings.Contains(err.Error(), "not a number") {
			t.Errorf("FromJDTDB(%v) error = %v, want \"not a number\"", jd, err)
		}
	}
	if (Time{}).Valid() {
		t.Error("the zero Time is valid, want invalid")
	}
}

// TestTimeConversions checks FromTime against the Unix-epoch Julian date
// (JD 2440587.5 = 1970-01-01T00:00:00Z, methods.md §1) and the time.Time and
// string read-backs.
func TestTimeConversions(t *testing.T) {
	cases := []struct {
		name   string
		in     time.Time
		jd     float64
		iso    string
		source string
	}{
		{"Unix epoch", time.Date(1970, 1, 1, 0, 0, 0, 0, time.UTC), 2440587.5, "1970-01-01T00:00:00Z", "methods.md §1"},
		{"J2000.0 in UTC", time.Date(2000, 1, 1, 11, 58, 55, 816000000, time.UTC), 2451545.0 - 64.184/86400, "2000-01-01T11:58:55.816Z",
			"methods.md §1 [A]: J2000.0 = 11:58:55.816 UTC"},
		{"an offset zone", time.Date(2026, 12, 1, 4, 0, 0, 250000000, time.FixedZone("+01", 3600)), 2461375.625 + 0.25/86400,
			"2026-12-01T03:00:00.25Z", "Meeus 1998, eq. 7.1 (2026 Dec 1.125)"},
		{"before the Unix epoch", time.Date(1901, 3, 4, 6, 0, 0, 0, time.UTC), 2415447.75, "1901-03-04T06:00:00Z", "Meeus 1998, eq. 7.1 (1901 Mar 4.25)"},
	}
	for _, c := range cases {
		tm, err := FromTime(c.in)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if d := (tm.JDUTC() - c.jd) * secPerDay; math.Abs(d) > tolRoundTripSec {
			t.Errorf("%s: FromTime(%v).JDUTC() = %.8f, want %.8f (%s), diff %.6f s, tol %.3f s", c.name, c.in, tm.JDUTC(), c.jd, c.source, d, tolRoundTripSec)
		}
		if d := tm.Time().Sub(c.in); d.Abs() > 50*time.Microsecond {
			t.Errorf("%s: Time() = %v, want %v within 50 µs, diff %v", c.name, tm.Time(), c.in.UTC(), d)
		}
		if got := tm.String(); got != c.iso {
			t.Errorf("%s: String() = %q, want %q", c.name, got, c.iso)
		}
		if d := tm.MJDUTC() - (c.jd - 2400000.5); math.Abs(d) > 1e-9 {
			t.Errorf("%s: MJDUTC() = %.8f, want JD − 2400000.5 = %.8f", c.name, tm.MJDUTC(), c.jd-2400000.5)
		}
	}
	// Cross-check of the 2026 row: Meeus's calendar formula.
	if jd := CalendarToJD(2026, 12, 1.125); math.Abs(jd-2461375.625) > tolJD {
		t.Errorf("CalendarToJD(2026, 12, 1.125) = %.6f, want 2461375.625", jd)
	}
}

func TestTimeArithmetic(t *testing.T) {
	a, _ := ParseInstant("2026-12-01T03:00:00Z")
	b := a.Add(90 * time.Minute)
	if d := b.Sub(a); math.Abs(d-1.5/24) > 1e-9 {
		t.Errorf("Add(90 min).Sub = %.9f d, want %.9f d", d, 1.5/24)
	}
	if !a.Before(b) || !b.After(a) || a.After(b) || b.Before(a) {
		t.Errorf("Before/After wrong for %s and %s", a, b)
	}
	if c := a.AddDays(0.5); c.String() != "2026-12-01T15:00:00Z" {
		t.Errorf("AddDays(0.5) = %s, want 2026-12-01T15:00:00Z", c)
	}
	if c := a.AddDays(1e6); c.Valid() {
		t.Errorf("AddDays(1e6) = %v, want an invalid Time", c.JDUTC())
	}
}

func TestTimeJSON(t *testing.T) {
	a, _ := ParseInstant("2026-12-01T03:00:00.25Z")
	b, err := json.Marshal(struct{ T Time }{a})
	if err != nil {
		t.Fatal(err)
	}
	if string(b) != `{"T":"2026-12-01T03:00:00.25Z"}` {
		t.Errorf("json.Marshal = %s, want {\"T\":\"2026-12-01T03:00:00.25Z\"}", b)
	}
	var back struct{ T Time }
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	if d := back.T.Sub(a) * secPerDay; math.Abs(d) > tolRoundTripSec {
		t.Errorf("JSON round trip: %s, want %s, diff %.6f s", back.T, a, d)
	}
	if _, err := json.Marshal(struct{ T Time }{}); err == nil {
		t.Error("json.Marshal of a zero Time: no error, want one")
	}
	if err := json.Unmarshal([]byte(`{"T":"yesterday"}`), &back); err == nil || !strings.Contains(err.Error(), `"yesterday"`) {
		t.Errorf("json.Unmarshal of a bad instant: error = %v, want one quoting \"yesterday\"", err)
	}
}

// TestHeliocentricBound: the light time from the Earth to the Sun is at most
// 1.0167 AU × 499.005 s = 507.3 s = 0.005872 d (aphelion distance; AU light
// time of the IAU 2012 AU), so |HJD − JD| never exceeds it; the barycentre
// lies up to 0.0102 AU (2.2 solar radii) from the Sun's centre, which allows
// |BJD_TDB − JD_TDB| up to 1.0269 AU = 0.005931 d (common practice). And
// SeenAt undoes both to well under a second.
func TestHeliocentricBound(t *testing.T) {
	const (
		boundHJD = 0.005875 // d
		boundBJD = 0.005935 // d
	)
	const tolSeenAtSec = 1e-3
	site := Site{Name: "mid-latitude", LatDeg: 45, LonDeg: 7, ElevM: 300}
	r := rand.New(rand.NewPCG(3, 4))
	for i := 0; i < 200; i++ {
		star := Star{RAHours: r.Float64() * 24, DecDeg: math.Asin(2*r.Float64()-1) * rad2deg}
		tm := mustJD(2451545.0 + r.Float64()*36525)
		v := star.Vec()
		s := NewSky(site, tm)
		h := s.HJD(&v) - tm.JDUTC()
		b := s.BJDTDB(&v) - tm.JDTDB()
		if math.Abs(h) > boundHJD || math.Abs(b) > boundBJD {
			t.Errorf("%s star %+v: HJD − JD = %.6f d, BJD − JD_TDB = %.6f d, want within ±%.6f d and ±%.6f d",
				tm, star, h, b, boundHJD, boundBJD)
		}
		for _, ts := range []TimeScale{HJD, BJDTDB} {
			jd := s.JD(ts, &v)
			back, err := SeenAt(ts, jd, star, site)
			if err != nil {
				t.Errorf("SeenAt(%s, %.6f): %v", ts, jd, err)
				continue
			}
			if d := back.Sub(tm) * secPerDay; math.Abs(d) > tolSeenAtSec {
				t.Errorf("SeenAt(%s, %.6f) = %s, want %s, diff %.6f s, tol %.3f s", ts, jd, back, tm, d, tolSeenAtSec)
			}
		}
	}
	if _, err := SeenAt(TimeScale(9), 2460000, Star{}, site); err == nil || !strings.Contains(err.Error(), "time scale") {
		t.Errorf("SeenAt with an unknown scale: error = %v, want one naming the time scale", err)
	}
	if _, err := SeenAt(HJD, math.NaN(), Star{}, site); err == nil || !strings.Contains(err.Error(), "not a number") {
		t.Errorf("SeenAt(NaN): error = %v, want \"not a number\"", err)
	}
}
