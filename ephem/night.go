package ephem

import (
	"fmt"
	"time"
)

// Night holds the dark hours of one date at a site. The night of a date runs
// from local mean noon of that date to local mean noon of the next day (local
// mean time = UTC + longitude/15 h). An Event that does not happen in that
// span is not OK: at high latitudes in summer the Sun may never reach −18°,
// or never set at all.
type Night struct {
	Date       time.Time // the civil date the night begins on (0h UTC of it)
	Start, End Time      // local mean noon to local mean noon

	Sunset, Sunrise            Event // Sun's centre at −0.8333°, airless
	CivilDusk, CivilDawn       Event // −6°
	NauticalDusk, NauticalDawn Event // −12°
	AstroDusk, AstroDawn       Event // −18°
	Moonrise, Moonset          Event // Moon's centre at +0.125°, geocentric; within the dark span only
	MoonIllum                  float64
	MoonIllumAt                Time // the instant MoonIllum is computed for
	SunAlwaysUp, SunAlwaysDown bool // midnight sun / polar night (at −0.8333°)
}

// NightOf returns the night of date (its year, month and day are used) at
// the site. Dusk events are the first downward crossings in the span, dawn
// events the last upward ones. Moonrise and moonset are reported only within
// the dark span: sunset to sunrise, or the whole span in a polar night.
func NightOf(site Site, date time.Time) (Night, error) {
	if err := site.Validate(); err != nil {
		return Night{}, err
	}
	d := time.Date(date.Year(), date.Month(), date.Day(), 0, 0, 0, 0, time.UTC)
	noon := d.Add(12*time.Hour - time.Duration(site.LonDeg/15*float64(time.Hour)))
	start, err := FromTime(noon)
	if err != nil {
		return Night{}, fmt.Errorf("ephem: night of %s: %w", d.Format("2006-01-02"), err)
	}
	end := start.AddDays(1)
	if !end.Valid() {
		return Night{}, fmt.Errorf("ephem: night of %s is %w", d.Format("2006-01-02"), ErrOutOfRange)
	}
	n := Night{Date: d, Start: start, End: end}

	sun, err := newCurve(site, Sun, start, end, altitudeOf)
	if err != nil {
		return Night{}, err
	}
	pairs := []struct {
		alt        float64
		dusk, dawn *Event
	}{
		{SunriseAltDeg, &n.Sunset, &n.Sunrise},
		{CivilAltDeg, &n.CivilDusk, &n.CivilDawn},
		{NauticalAltDeg, &n.NauticalDusk, &n.NauticalDawn},
		{AstronomicalAltDeg, &n.AstroDusk, &n.AstroDawn},
	}
	for _, p := range pairs {
		for _, c := range sun.roots(p.alt) {
			if !c.Rising && !p.dusk.OK {
				*p.dusk = Event{At: c.At, OK: true}
			}
			if c.Rising {
				*p.dawn = Event{At: c.At, OK: true}
			}
		}
	}

	// The dark span: sunset (or the start, if the Sun is already down) to
	// sunrise (or the end, if the Sun is still down).
	darkFrom, darkTo := start, end
	downAtStart := sun.y[0] < SunriseAltDeg
	downAtEnd := sun.y[len(sun.y)-1] < SunriseAltDeg
	if n.Sunset.OK {
		darkFrom = n.Sunset.At
	} else if !downAtStart {
		darkFrom = Time{}
	}
	if n.Sunrise.OK {
		darkTo = n.Sunrise.At
	} else if !downAtEnd {
		darkTo = Time{}
	}
	if !n.Sunset.OK && !n.Sunrise.OK {
		n.SunAlwaysUp = !downAtStart
		n.SunAlwaysDown = downAtStart
	}
	if darkFrom.Valid() && darkTo.Valid() && darkFrom.Before(darkTo) {
		moon, err := newCurve(site, MoonCentre, darkFrom, darkTo, altitudeOf)
		if err != nil {
			return Night{}, err
		}
		for _, c := range moon.roots(MoonriseAltDeg) {
			if c.Rising && !n.Moonrise.OK {
				n.Moonrise = Event{At: c.At, OK: true}
			}
			if !c.Rising && !n.Moonset.OK {
				n.Moonset = Event{At: c.At, OK: true}
			}
		}
	}

	mid := start.AddDays(0.5)
	if n.Sunset.OK && n.Sunrise.OK {
		mid = mustJD((n.Sunset.At.jd + n.Sunrise.At.jd) / 2)
	}
	n.MoonIllumAt = mid
	n.MoonIllum = NewSky(site, mid).MoonIllumination()
	return n, nil
}
