package ephem

import (
	_ "embed"
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"

	"github.com/soniakeys/meeus/v3/deltat"
)

//go:embed data/leapseconds.txt
var leapSecondsText string

// leapStep is one line of the leap-second table: from JD (UTC) on, TAI − UTC
// is offset seconds.
type leapStep struct {
	jd     float64
	offset float64
}

var (
	leapTable      []leapStep
	leapValidUntil time.Time
)

func init() {
	steps, until, err := parseLeapSeconds(leapSecondsText)
	if err != nil {
		panic("ephem: embedded leap-second table: " + err.Error())
	}
	leapTable, leapValidUntil = steps, until
}

// parseLeapSeconds reads the leap-second table format of data/leapseconds.txt.
func parseLeapSeconds(text string) ([]leapStep, time.Time, error) {
	var steps []leapStep
	var until time.Time
	for i, line := range strings.Split(text, "\n") {
		line = strings.TrimSpace(line)
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		f := strings.Fields(line)
		if len(f) != 2 {
			return nil, until, fmt.Errorf("line %d: want 2 fields, got %d", i+1, len(f))
		}
		if f[0] == "valid-until" {
			d, err := time.Parse("2006-01-02", f[1])
			if err != nil {
				return nil, until, fmt.Errorf("line %d: %v", i+1, err)
			}
			until = d
			continue
		}
		d, err := time.Parse("2006-01-02", f[0])
		if err != nil {
			return nil, until, fmt.Errorf("line %d: %v", i+1, err)
		}
		n, err := strconv.Atoi(f[1])
		if err != nil {
			return nil, until, fmt.Errorf("line %d: %v", i+1, err)
		}
		jd := unixEpochJD + float64(d.Unix())/secPerDay
		if len(steps) > 0 && jd <= steps[len(steps)-1].jd {
			return nil, until, fmt.Errorf("line %d: dates out of order", i+1)
		}
		steps = append(steps, leapStep{jd: jd, offset: float64(n)})
	}
	if len(steps) == 0 || until.IsZero() {
		return nil, until, fmt.Errorf("table is empty or has no valid-until line")
	}
	return steps, until, nil
}

// LeapSecondsValidUntil returns the date up to which the embedded leap-second
// table is known to be complete. Instants after it are converted assuming no
// further leap second; see LeapSecondsStale.
func LeapSecondsValidUntil() time.Time { return leapValidUntil }

// LeapSecondsStale reports whether t lies after the date up to which the
// leap-second table is known to be complete. TT and TDB computed for such an
// instant may be off by a whole second if a leap second was inserted since.
func LeapSecondsStale(t Time) bool {
	return t.jd >= unixEpochJD+float64(leapValidUntil.Unix())/secPerDay
}

// TAIMinusUTC returns TAI − UTC in seconds at t, from the IERS leap-second
// table (10 s from 1972-01-01, 37 s since 2017-01-01). ok is false before
// 1972, when UTC was not a whole number of seconds from TAI.
func TAIMinusUTC(t Time) (sec float64, ok bool) {
	return taiMinusUTC(t.jd)
}

func taiMinusUTC(jd float64) (float64, bool) {
	if jd < leapTable[0].jd {
		return 0, false
	}
	// The table is short (28 rows): a backwards scan is fastest for modern dates.
	for i := len(leapTable) - 1; i >= 0; i-- {
		if jd >= leapTable[i].jd {
			return leapTable[i].offset, true
		}
	}
	return 0, false
}

// DeltaT returns ΔT = TT − UT1 in seconds at t. Before 1972 it is interpolated
// in Meeus's table 10.A (1620–2010, Meeus 1998, p. 79); from 1972 on it is
// taken as TT − UTC, since vigil sets UT1 = UTC (|UT1 − UTC| < 0.9 s).
func DeltaT(t Time) float64 { return ttMinusUTC(t.jd) }

// ttMinusUTC returns TT − UTC in seconds at Julian date jd (UTC).
func ttMinusUTC(jd float64) float64 {
	if off, ok := taiMinusUTC(jd); ok {
		return off + 32.184
	}
	return deltaTTable(jd)
}

// deltaTTable returns ΔT (s) from Meeus's table 10.A at Julian date jd,
// interpolated linearly between the values at consecutive 0h UTC: the
// library's interpolation works in whole days, and this keeps ΔT continuous.
func deltaTTable(jd float64) float64 {
	d0 := math.Floor(jd-0.5) + 0.5 // 0h UTC on or before jd
	a := float64(deltat.Interp10A(d0))
	b := float64(deltat.Interp10A(d0 + 1))
	return a + (b-a)*(jd-d0)
}
