package observe

import (
	"fmt"
	"math"
	"strings"

	"example.org/vigil/ephem"
)

// Constraints say when a star counts as observable, beyond the site's own
// lowest altitude and horizon profile, and how wide a coverage window
// around each extremum must be usable.
type Constraints struct {
	// SunAltDeg: the Sun's airless altitude must be below it (−12° is
	// nautical twilight, USNO definitions).
	SunAltDeg float64
	// MoonMinSepDeg: while the Moon is above the horizon, the star must be at
	// least this far from it. 0 turns the check off.
	MoonMinSepDeg float64
	// The coverage window runs from WindowDays before the extremum to
	// WindowDays after it. When WindowDays is 0 the half-width is
	// WindowFraction of the period, at most WindowMaxDays.
	WindowDays     float64
	WindowFraction float64
	WindowMaxDays  float64
	// KeepAll keeps, in night plans and forecasts, the events of which no
	// part of the window is usable (Predict always returns every event).
	KeepAll bool
}

// DefaultConstraints returns the defaults: the Sun below −12° (nautical
// twilight, as the command line's --sun-alt), the star at least 15° from
// the Moon while it is up (methods sheet §14–15: avoid targets within
// 15–30° of a bright Moon, common practice), and a coverage window of
// ±0.1 P capped at ±3 h (common practice: a timing wants both branches of
// the extremum, and a night seldom offers more than a few hours).
func DefaultConstraints() Constraints {
	return Constraints{SunAltDeg: -12, MoonMinSepDeg: 15, WindowFraction: 0.1, WindowMaxDays: 0.125}
}

// Limits on the work one call may ask for.
const (
	MaxSpanDays     = 400    // longest span of Predict and Forecast
	MaxWindowDays   = 0.5    // widest half-width of a coverage window
	maxEventsPerRun = 200000 // events of one target in one call
)

// Validate reports the first unusable field of c.
func (c Constraints) Validate() error {
	switch {
	case math.IsNaN(c.SunAltDeg) || c.SunAltDeg < -30 || c.SunAltDeg > 10:
		return fmt.Errorf("observe: Sun altitude limit %v: degrees must be in [-30, 10]", c.SunAltDeg)
	case math.IsNaN(c.MoonMinSepDeg) || c.MoonMinSepDeg < 0 || c.MoonMinSepDeg > 180:
		return fmt.Errorf("observe: Moon separation %v: degrees must be in [0, 180]", c.MoonMinSepDeg)
	case math.IsNaN(c.WindowDays) || c.WindowDays < 0 || c.WindowDays > MaxWindowDays:
		return fmt.Errorf("observe: coverage window ±%v d: the half-width must be in [0, %v] days", c.WindowDays, MaxWindowDays)
	case c.WindowDays == 0 && (math.IsNaN(c.WindowFraction) || !(c.WindowFraction > 0) || c.WindowFraction > 0.5):
		return fmt.Errorf("observe: coverage window fraction %v: want a fraction of the period in (0, 0.5], or a fixed half-width", c.WindowFraction)
	case c.WindowDays == 0 && (math.IsNaN(c.WindowMaxDays) || !(c.WindowMaxDays > 0) || c.WindowMaxDays > MaxWindowDays):
		return fmt.Errorf("observe: coverage window cap %v d: want a half-width in (0, %v] days", c.WindowMaxDays, MaxWindowDays)
	}
	return nil
}

// HalfWidthDays returns the half-width (days) of the coverage window for a
// star of period periodDays.
func (c Constraints) HalfWidthDays(periodDays float64) float64 {
	if c.WindowDays > 0 {
		return c.WindowDays
	}
	return math.Min(c.WindowFraction*periodDays, c.WindowMaxDays)
}

// maxHalfWidth returns the widest half-width any target can get.
func (c Constraints) maxHalfWidth() float64 {
	if c.WindowDays > 0 {
		return c.WindowDays
	}
	return c.WindowMaxDays
}

// Reasons is a set of reasons why a star cannot be observed.
type Reasons uint8

// The reasons an instant or a window is not usable.
const (
	TooLow        Reasons = 1 << iota // below the site's lowest useful altitude
	BehindHorizon                     // above it, but behind the horizon profile
	Twilight                          // the Sun above the limit, below the horizon
	Daylight                          // the Sun above the limit and the horizon (−0.8333°)
	MoonTooClose                      // the Moon is up and too near the star
)

var reasonText = []string{"too low", "behind the horizon profile", "twilight", "daylight", "Moon too close"}

// List returns the reasons as short texts, in a fixed order.
func (r Reasons) List() []string {
	var out []string
	for i, s := range reasonText {
		if r&(1<<i) != 0 {
			out = append(out, s)
		}
	}
	return out
}

// String returns the reasons joined by commas, or "" for none.
func (r Reasons) String() string { return strings.Join(r.List(), ", ") }

// SolarWarningText is shown with every event whose target stands near the
// Sun while the Sun is up (Event.SolarWarning).
const SolarWarningText = "DANGER: the Sun is up and this star is near it. Never point a telescope, " +
	"finder or binoculars at or near the Sun without a certified full-aperture solar filter " +
	"securely fitted: instant, permanent eye damage. Cap or remove the finder."

// SolarWarningSepDeg is the distance from the Sun within which the warning
// is given while the Sun is up (methods sheet §14: within about 15° of the
// Sun, common practice).
const SolarWarningSepDeg = 15.0

// validSpan checks a Predict or Forecast span.
func validSpan(from, to ephem.Time) error {
	switch {
	case !from.Valid() || !to.Valid():
		return fmt.Errorf("observe: span %v to %v: want two valid instants", from, to)
	case !from.Before(to):
		return fmt.Errorf("observe: span from %s to %s: from must be before to", from, to)
	case to.Sub(from) > MaxSpanDays:
		return fmt.Errorf("observe: span from %s to %s is %.1f days: at most %d days", from, to, to.Sub(from), MaxSpanDays)
	}
	return nil
}
