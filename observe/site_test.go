package observe

import (
	"math"
	"strings"
	"testing"
	"time"

	"example.org/vigil/ephem"
)

func TestHorizonAltDeg(t *testing.T) {
	// Linear interpolation in azimuth, wrapping at 360° (values computed by
	// hand from the points: common practice for horizon profiles).
	h := Horizon{{30, 10}, {90, 40}, {300, 20}}
	for _, tc := range []struct {
		name     string
		az, want float64
		source   string
	}{
		{"on a point", 90, 40, "the point itself"},
		{"between", 60, 25, "halfway 30°→90°: (10+40)/2"},
		{"wrap after last", 330, 16.666666666666668, "300°→390°, a third of the way: 20 + (10−20)/3"},
		{"wrap before first", 0, 13.333333333333334, "300°→390° at 360°: 20 − 10·60/90"},
		{"az 360 is 0", 360, 13.333333333333334, "same as 0°"},
		{"negative az", -30, 16.666666666666668, "−30° is 330°: 20 − 10·30/90"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := h.AltDeg(tc.az); math.Abs(got-tc.want) > 1e-9 {
				t.Errorf("AltDeg(%v) got %v want %v (%s)", tc.az, got, tc.want, tc.source)
			}
		})
	}
	if got := (Horizon{{100, 12}}).AltDeg(250); got != 12 {
		t.Errorf("one point: got %v want 12 all round", got)
	}
}

func TestSiteBad(t *testing.T) {
	for _, tc := range []struct {
		name     string
		lat, lon float64
		tz       string
		minAlt   float64
		h        Horizon
		want     string
	}{
		{"bad time zone", 50, 10, "Mars/Olympus", 20, nil, `time zone "Mars/Olympus"`},
		{"latitude", 95, 10, "UTC", 20, nil, "latitude 95"},
		{"min alt", 50, 10, "UTC", 95, nil, "lowest useful altitude 95"},
		{"horizon out of order", 50, 10, "UTC", 20, Horizon{{10, 5}, {200, 10}, {100, 8}}, "azimuth 100 after 200"},
		{"horizon repeated azimuth", 50, 10, "UTC", 20, Horizon{{10, 5}, {10, 8}}, "azimuths must increase"},
		{"horizon azimuth 360", 50, 10, "UTC", 20, Horizon{{360, 5}}, "azimuth 360"},
		{"horizon altitude", 50, 10, "UTC", 20, Horizon{{10, 5}, {20, 91}}, "altitude 91"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := NewSite("Test Hill", tc.lat, tc.lon, 0, tc.tz, tc.minAlt, tc.h)
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("got error %v, want one mentioning %q", err, tc.want)
			}
		})
	}
	s, err := NewSite("Zoned", 50, 370-360, 0, "Europe/Berlin", 20, nil)
	if err != nil || s.Location().String() != "Europe/Berlin" {
		t.Errorf("valid site: %v, location %v", err, s.Location())
	}
}

func TestPredictBadInput(t *testing.T) {
	site, _ := NewSite("Test Hill", 50, 10, 0, "UTC", 20, nil)
	good := NewTarget("Good", ephem.Star{RAHours: 1, DecDeg: 2}, Pulsating, ephem.Ephemeris{Epoch: 2460000.5, PeriodDays: 1, Scale: ephem.HJD}, Max)
	from, _ := ephem.FromTime(time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC))
	mod := func(f func(*Target)) Target { t := good; f(&t); return t }
	cons := func(f func(*Constraints)) Constraints { c := DefaultConstraints(); f(&c); return c }
	for _, tc := range []struct {
		name     string
		tg       Target
		from, to ephem.Time
		c        Constraints
		want     string
	}{
		{"from after to", good, from.AddDays(1), from, DefaultConstraints(), "from must be before to"},
		{"from equals to", good, from, from, DefaultConstraints(), "from must be before to"},
		{"span too long", good, from, from.AddDays(401), DefaultConstraints(), "at most 400 days"},
		{"period zero", mod(func(t *Target) { t.Ephemeris.PeriodDays = 0 }), from, from.AddDays(1), DefaultConstraints(), "period 0"},
		{"period negative", mod(func(t *Target) { t.Ephemeris.PeriodDays = -2 }), from, from.AddDays(1), DefaultConstraints(), "period -2"},
		{"unknown class", mod(func(t *Target) { t.Class = 7 }), from, from.AddDays(1), DefaultConstraints(), "unknown class"},
		{"unknown kind", mod(func(t *Target) { t.Kind = 0 }), from, from.AddDays(1), DefaultConstraints(), "unknown kind"},
		{"no time scale", mod(func(t *Target) { t.Ephemeris.Scale = 0 }), from, from.AddDays(1), DefaultConstraints(), "time scale"},
		{"too many events", mod(func(t *Target) { t.Ephemeris.PeriodDays = 0.0001 }), from, from.AddDays(30), DefaultConstraints(), "shorten the span"},
		{"window too long", good, from, from.AddDays(1), cons(func(c *Constraints) { c.WindowDays = 2 }), "half-width must be in [0, 0.5]"},
		{"window fraction", good, from, from.AddDays(1), cons(func(c *Constraints) { c.WindowFraction = 0 }), "coverage window fraction 0"},
		{"sun limit", good, from, from.AddDays(1), cons(func(c *Constraints) { c.SunAltDeg = 45 }), "Sun altitude limit 45"},
		{"invalid instant", good, ephem.Time{}, from, DefaultConstraints(), "valid instants"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			evs, err := Predict(site, tc.tg, tc.from, tc.to, tc.c)
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("got %d events and error %v, want an error mentioning %q", len(evs), err, tc.want)
			}
		})
	}
	p, _ := NewPlanner(site, DefaultConstraints())
	for _, n := range []int{0, -1, 401} {
		if _, err := p.Forecast([]Target{good}, time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC), n); err == nil || !strings.Contains(err.Error(), "nights") {
			t.Errorf("forecast of %d nights: error %v, want one about the number of nights", n, err)
		}
	}
	if _, err := p.Forecast([]Target{good, mod(func(t *Target) { t.Ephemeris.PeriodDays = 0 })}, time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC), 2); err == nil || !strings.Contains(err.Error(), "target 2") {
		t.Errorf("forecast with a bad target: error %v, want one naming target 2", err)
	}
}

// TestSunLimitAboveHorizon: with a Sun limit above the horizon, an extremum
// with the Sun between −0.8333° and the limit is observable (the command
// line's rule: the Sun below --sun-alt).
func TestSunLimitAboveHorizon(t *testing.T) {
	site, _ := NewSite("Test Hill", 50, 10, 0, "UTC", 0, nil)
	at, _ := ephem.FromTime(time.Date(2026, 6, 21, 3, 30, 0, 0, time.UTC)) // just after sunrise
	sun := ephem.NewSky(site.Site, at).Sun()
	star := ephem.Star{RAHours: math.Mod(sun.RAHours+12, 24), DecDeg: -sun.DecDeg + 60}
	tg := NewTarget("Dawn Star", star, Pulsating, ephem.Ephemeris{Epoch: ephem.HJDOf(at, star, site.Site), PeriodDays: 5, Scale: ephem.HJD}, Max)
	c := DefaultConstraints()
	c.MoonMinSepDeg = 0
	for _, tc := range []struct {
		limit float64
		want  bool
	}{{5, true}, {-12, false}} {
		c.SunAltDeg = tc.limit
		evs, err := Predict(site, tg, at.AddDays(-0.1), at.AddDays(0.1), c)
		if err != nil || len(evs) != 1 {
			t.Fatalf("got %d events, %v", len(evs), err)
		}
		e := evs[0]
		if e.Observable != tc.want || e.SunAltDeg < ephem.SunriseAltDeg || e.SunAltDeg > 5 {
			t.Errorf("Sun limit %v°, Sun at %.2f°, star at %.1f°: observable %v (%s), want %v",
				tc.limit, e.SunAltDeg, e.AltDeg, e.Observable, e.Reasons, tc.want)
		}
	}
}
