package ephem

import (
	"fmt"
	"math"
	"time"
)

// Time is an instant. It is stored as its Julian date on the UTC scale and
// reads out on the UTC, TT and TDB scales. The zero Time is not valid; build
// one with FromTime, FromJDUTC or ParseInstant, which check the range.
type Time struct {
	jd float64 // Julian date, UTC scale
}

// The range of instants vigil computes for: from the start of Meeus's ΔT
// table (1620) to 2200, past which neither ΔT nor the low-precision theories
// of the Sun and Moon are worth trusting.
const (
	minJD = 2312752.5 // 1620-01-01 00:00 UTC (Meeus 1998, eq. 7.1)
	maxJD = 2524593.5 // 2200-01-01 00:00 UTC
)

const (
	unixEpochJD = 2440587.5 // 1970-01-01T00:00:00Z
	secPerDay   = 86400.0
	// J2000 is the Julian date of the epoch J2000.0, 2000 Jan 1 12h TT.
	J2000 = 2451545.0
)

// ErrOutOfRange is wrapped by every error about an instant outside the
// supported range 1620-01-01 to 2200-01-01.
var ErrOutOfRange = fmt.Errorf("outside the supported range 1620-01-01 to 2200-01-01")

// FromJDUTC returns the instant with Julian date jd on the UTC scale.
func FromJDUTC(jd float64) (Time, error) {
	if math.IsNaN(jd) || math.IsInf(jd, 0) {
		return Time{}, fmt.Errorf("ephem: Julian date %v is not a number", jd)
	}
	if jd < minJD || jd >= maxJD {
		return Time{}, fmt.Errorf("ephem: Julian date %.6f is %w", jd, ErrOutOfRange)
	}
	return Time{jd: jd}, nil
}

// FromTime returns the instant t (any location; it is converted to UTC).
// time.Time has no leap seconds: an instant inside a positive leap second
// cannot be expressed and is never produced.
func FromTime(t time.Time) (Time, error) {
	u := t.UTC()
	sec := u.Unix()
	ns := u.Nanosecond()
	// Split days and fraction so that the sum keeps the float64 resolution.
	days := math.Floor(float64(sec) / secPerDay)
	rem := float64(sec) - days*secPerDay + float64(ns)*1e-9
	jd := unixEpochJD + days + rem/secPerDay
	if jd < minJD || jd >= maxJD {
		return Time{}, fmt.Errorf("ephem: instant %s is %w", u.Format(time.RFC3339), ErrOutOfRange)
	}
	return Time{jd: jd}, nil
}

// mustJD builds a Time from a Julian date already known to be in range.
// Internal use only: searches and tables built from valid instants.
func mustJD(jd float64) Time { return Time{jd: jd} }

// Valid reports whether t was built by one of the checked constructors.
func (t Time) Valid() bool { return t.jd >= minJD && t.jd < maxJD }

// JDUTC returns the Julian date on the UTC scale.
func (t Time) JDUTC() float64 { return t.jd }

// MJDUTC returns the modified Julian date (JD − 2400000.5) on the UTC scale.
func (t Time) MJDUTC() float64 { return t.jd - 2400000.5 }

// JDTT returns the Julian ephemeris date on the TT scale: TT = UTC + (TAI−UTC)
// + 32.184 s from 1972 on, and TT = UT + ΔT before (Meeus 1998, ch. 10).
func (t Time) JDTT() float64 { return t.jd + ttMinusUTC(t.jd)/secPerDay }

// JDTDB returns the Julian date on the TDB scale. TDB − TT is the periodic
// term 0.001657 sin g + 0.000014 sin 2g s, g = 357.53° + 0.98560028° (JD −
// 2451545) (the standard two-term approximation, good to about 30 µs).
func (t Time) JDTDB() float64 {
	tt := t.JDTT()
	return tt + tdbMinusTT(tt)/secPerDay
}

// tdbMinusTT returns TDB − TT in seconds at Julian date jd (TT).
func tdbMinusTT(jdTT float64) float64 {
	g := (357.53 + 0.98560028*(jdTT-J2000)) * math.Pi / 180
	return 0.001657*math.Sin(g) + 0.000014*math.Sin(2*g)
}

// FromJDTT returns the instant whose TT Julian date is jdTT.
func FromJDTT(jdTT float64) (Time, error) {
	if math.IsNaN(jdTT) || math.IsInf(jdTT, 0) {
		return Time{}, fmt.Errorf("ephem: Julian date (TT) %v is not a number", jdTT)
	}
	u := jdTT - 69.184/secPerDay
	for i := 0; i < 3; i++ {
		u = jdTT - ttMinusUTC(clampJD(u))/secPerDay
	}
	return FromJDUTC(u)
}

// FromJDTDB returns the instant whose TDB Julian date is jdTDB.
func FromJDTDB(jdTDB float64) (Time, error) {
	if math.IsNaN(jdTDB) || math.IsInf(jdTDB, 0) {
		return Time{}, fmt.Errorf("ephem: Julian date (TDB) %v is not a number", jdTDB)
	}
	tt := jdTDB - tdbMinusTT(jdTDB)/secPerDay
	return FromJDTT(tt)
}

func clampJD(jd float64) float64 {
	return math.Max(minJD, math.Min(maxJD-1e-6, jd))
}

// Time returns t as a time.Time in UTC, rounded to the nearest microsecond
// (the float64 Julian date resolves about 40 µs).
func (t Time) Time() time.Time {
	d := t.jd - unixEpochJD
	days := math.Floor(d)
	us := math.Round((d - days) * secPerDay * 1e6)
	return time.Unix(int64(days)*86400, 0).Add(time.Duration(us) * time.Microsecond).UTC()
}

// AddDays returns t shifted by d days. The result is not range checked;
// callers that step outside the supported range get an invalid Time.
func (t Time) AddDays(d float64) Time { return Time{jd: t.jd + d} }

// Add returns t shifted by the duration d.
func (t Time) Add(d time.Duration) Time { return Time{jd: t.jd + d.Seconds()/secPerDay} }

// Sub returns t − u in days.
func (t Time) Sub(u Time) float64 { return t.jd - u.jd }

// Before reports whether t is earlier than u.
func (t Time) Before(u Time) bool { return t.jd < u.jd }

// After reports whether t is later than u.
func (t Time) After(u Time) bool { return t.jd > u.jd }

// String returns t as an ISO 8601 UTC string with seconds, and milliseconds
// when they are not zero: "2026-12-01T03:00:00Z", "2026-12-01T03:00:00.25Z".
func (t Time) String() string {
	return FormatISO(t.Time())
}

// FormatISO formats a UTC instant as ISO 8601 with the fraction of a second
// rounded to the millisecond and trailing zeros dropped.
func FormatISO(t time.Time) string {
	return t.UTC().Round(time.Millisecond).Format("2006-01-02T15:04:05.999Z07:00")
}

// MarshalText writes t as FormatISO does, so a Time encodes as a JSON string.
func (t Time) MarshalText() ([]byte, error) {
	if !t.Valid() {
		return nil, fmt.Errorf("ephem: marshalling an invalid Time")
	}
	return []byte(t.String()), nil
}

// UnmarshalText reads t as ParseInstant does.
func (t *Time) UnmarshalText(b []byte) error {
	v, err := ParseInstant(string(b))
	if err != nil {
		return err
	}
	*t = v
	return nil
}
